"""A filled-in template with problems on several sheets reports them all in one run, each
with its sheet and cell."""

from __future__ import annotations

import openpyxl
import pytest

from heatledger.demo import demo_project
from heatledger.errors import ProjectError
from heatledger.sheet.render_openpyxl import write_workbook
from heatledger.sheet.template import HEADER_ROW, project_from_template, template_plan


def _column(ws, head_start: str) -> str:
    for cell in ws[HEADER_ROW]:
        if isinstance(cell.value, str) and cell.value.startswith(head_start):
            return cell.column_letter
    raise KeyError(head_start)


def test_every_sheet_problem_in_one_run(tmp_path):
    path = write_workbook(template_plan(demo_project().raw), tmp_path / "t.xlsx")
    wb = openpyxl.load_workbook(path)
    first = HEADER_ROW + 1
    layers, elements, months = wb["Layers"], wb["Elements"], wb["Climate months"]
    d = _column(layers, "d [mm]")
    layers[f"{d}{first}"] = "twelve"                     # unreadable: text in a number cell
    area = _column(elements, "Area")
    elements[f"{area}{first}"] = -5                      # a rule of the heat-loss family
    rh = _column(months, "φ_e")
    months[f"{rh}{first}"] = 88                          # a likely percentage
    wb.save(tmp_path / "filled.xlsx")
    with pytest.raises(ProjectError) as err:
        project_from_template(tmp_path / "filled.xlsx")
    where = [w for w, _m in err.value.problems]
    assert f"Layers!{d}{first}" in where
    assert f"Elements!{area}{first}" in where
    assert f"Climate months!{rh}{first}" in where
    assert len(where) == len(set(where))  # no cell named twice
