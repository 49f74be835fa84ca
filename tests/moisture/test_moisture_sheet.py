"""The moisture sheets recalculated by LibreOffice Calc: every check cell says OK, and the
sheet's own formulas reproduce the engine (the formulas are independent of the engine: they
are the standard's equations written as spreadsheet formulas)."""

from __future__ import annotations

import openpyxl
import pytest

from heatledger.demo import demo_project
from heatledger.sheet import audit
from heatledger.sheet.render_openpyxl import write_workbook


@pytest.mark.calc
def test_demo_moisture_sheets_recalculate_ok(tmp_path, recalc):
    project = demo_project()
    plan = audit.audit_plan(project)
    names = [s.name for s in plan.sheets if s.name.startswith("Moist ")]
    assert len(names) == len(project.moisture) == 3
    wb = openpyxl.load_workbook(recalc(write_workbook(plan, tmp_path / "a.xlsx")),
                                data_only=True)
    for name in names + ["Moisture"]:
        values = [c.value for row in wb[name].iter_rows() for c in row]
        bad = [v for v in values if isinstance(v, str) and (v.startswith("MISMATCH")
                                                            or v.startswith("#"))]
        assert not bad, (name, bad[:5])
    for name in names:
        ws = wb[name]
        assert ws["J6"].value == "ALL CHECKS OK", name
        assert ws["J4"].value == ws["J5"].value > 100
        # the sheet's own verdict formula agrees with the engine's class of result
        texts = [c.value for row in ws.iter_rows() for c in row if isinstance(c.value, str)]
        assert any(t in ("dries out", "does not dry out", "none") for t in texts)


def test_a_construction_that_never_condenses_has_a_sheet(tmp_path):
    raw = demo_project().raw
    del raw["climates"][0]["humidity_class"]
    raw["climates"][0]["rh_inside"] = 0.3  # a dry room (invented)
    raw["moisture"] = [dict(raw["moisture"][1], name="EW2 in a dry room")]
    from heatledger.project import project_from_dict

    project = project_from_dict(raw, source_bytes=b"x", source_name="p.toml")
    assert project.moisture[0].interstitial.start_month is None
    plan = audit.audit_plan(project)
    sheet = next(s for s in plan.sheets if s.name.startswith("Moist "))
    assert any(c.value == "none" for c in sheet.cells())
