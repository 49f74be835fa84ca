"""LibreOffice Calc as the judge: it recalculates what the renderer wrote.

These tests prove the judge itself works (stale cached values are replaced, text stays
text) before other tests rely on it for the audit workbook.
"""

from __future__ import annotations

import openpyxl
import pytest

from heatledger.sheet import render_openpyxl as rend
from heatledger.sheet.plan import WorkbookPlan
from tests.tolerances import RTOL_ROUND_OFF

HOSTILE_TEXT = ["=1+1", "+2", "-3 mm render", "@SUM(A1)", "=A1*1000"]


def judge_plan() -> WorkbookPlan:
    plan = WorkbookPlan(title="judge")
    sh = plan.add_sheet("Judge")
    blk = sh.block("b")
    blk.put("A1", 0.1, role="input")
    blk.put("A2", 0.04, role="input")
    blk.put("B1", formula="=A1/A2")  # 2.5, no cached value written
    blk.put("B2", formula="=ROUND(1/B1,1-INT(LOG10(ABS(1/B1))))")  # 0.4 to 2 s.f.
    blk.put("B3", formula="=SUMPRODUCT(A1:A2,A1:A2)")
    blk.put("B4", formula='=IF(ABS(B1-2.5)<=1E-9*MAX(1,ABS(2.5)),"OK","MISMATCH "&(B1-2.5))')
    blk.put("B5", formula="=hl_sentinel*2")
    for i, text in enumerate(HOSTILE_TEXT, start=1):
        blk.put(f"C{i}", text, role="input")
    plan.defined_names["hl_sentinel"] = "'Judge'!$A$1"
    return plan


@pytest.mark.calc
def test_sentinel_stale_values_are_recomputed(tmp_path, recalc, stale_value):
    path = rend.write_workbook(judge_plan(), tmp_path / "judge.xlsx")
    out = recalc(path)
    ws = openpyxl.load_workbook(out, data_only=True)["Judge"]
    values = [ws[f"B{i}"].value for i in range(1, 6)]
    assert stale_value not in values, "LibreOffice kept the planted cached values"
    # expected values: the arithmetic of the inputs the plan writes (no outside source needed)
    assert values[0] == pytest.approx(2.5, rel=RTOL_ROUND_OFF)
    assert values[1] == pytest.approx(0.4, rel=RTOL_ROUND_OFF)
    assert values[2] == pytest.approx(0.1**2 + 0.04**2, rel=RTOL_ROUND_OFF)
    assert values[3] == "OK"
    assert values[4] == pytest.approx(0.2, rel=RTOL_ROUND_OFF)


def test_without_recalculation_the_stale_value_would_show(tmp_path, stale_value, poison):
    """The planted value is really there before the judge runs (the test can fail)."""
    path = rend.write_workbook(judge_plan(), tmp_path / "judge.xlsx")
    assert poison(path) == 5
    ws = openpyxl.load_workbook(path, data_only=True)["Judge"]
    assert ws["B1"].value == stale_value


@pytest.mark.calc
def test_text_stays_text_in_libreoffice(tmp_path, recalc):
    path = rend.write_workbook(judge_plan(), tmp_path / "judge.xlsx")
    out = recalc(path)
    ws = openpyxl.load_workbook(out, data_only=True)["Judge"]
    for i, text in enumerate(HOSTILE_TEXT, start=1):
        assert ws[f"C{i}"].value == text
    ws_f = openpyxl.load_workbook(out)["Judge"]  # formulas as LibreOffice saved them
    for i in range(1, len(HOSTILE_TEXT) + 1):
        assert ws_f[f"C{i}"].data_type == "s"
    assert ws_f["B1"].data_type == "f"


@pytest.mark.parametrize("ci, outcome", [("true", "fail"), ("", "skip")])
def test_missing_libreoffice_skips_locally_and_fails_in_ci(monkeypatch, require_soffice, ci,
                                                           outcome):
    monkeypatch.setattr("shutil.which", lambda name: None)
    monkeypatch.setenv("CI", ci)
    expected = pytest.fail.Exception if outcome == "fail" else pytest.skip.Exception
    with pytest.raises(expected, match="libreoffice-calc-nogui"):
        require_soffice()
