"""A what-if is a what-if: an edited input turns the cover and the sheets to a what-if state,
not to failed checks; an untouched record says ALL CHECKS OK."""

from __future__ import annotations

import openpyxl
import pytest

from heatledger.demo import demo_project
from heatledger.sheet.audit import audit_plan
from heatledger.sheet.render_openpyxl import write_workbook
from heatledger.sheet.whatif import CHANGED_TEXT, RECORD_SHEET


def _texts(ws):
    return [v for row in ws.iter_rows(values_only=True) for v in row if isinstance(v, str)]


@pytest.mark.calc
def test_an_edited_input_is_a_what_if_and_an_untouched_record_is_ok(tmp_path, recalc):
    plan = audit_plan(demo_project())
    path = write_workbook(plan, tmp_path / "a.xlsx")
    wb = openpyxl.load_workbook(recalc(path), data_only=True)
    assert any(t == "ALL CHECKS OK" for t in _texts(wb["Cover"]))
    # edit the thickness of a construction layer (an input recorded on the Record sheet)
    edit = openpyxl.load_workbook(path)
    rec = edit[RECORD_SHEET]
    row = next(r for r in range(4, rec.max_row + 1)
               if str(rec[f"A{r}"].value).startswith("01 "))
    sheet, cell = rec[f"A{row}"].value, rec[f"B{row}"].value
    edit[sheet][cell].value = float(edit[sheet][cell].value) * 2.0
    edit.save(tmp_path / "what-if.xlsx")
    wb = openpyxl.load_workbook(recalc(tmp_path / "what-if.xlsx"), data_only=True)
    cover = _texts(wb["Cover"])
    assert any(t.startswith("WHAT-IF: 1 input(s) changed") for t in cover)
    assert not any(t.startswith("NOT ALL OK") for t in cover)
    assert wb[sheet]["J6"].value == CHANGED_TEXT
    assert wb[RECORD_SHEET][f"E{row}"].value == 1
