"""The Fins sheet of the fill-in template: the demo's fins round-trip to the same results as
the TOML route, and a bad fin cell is named by sheet and cell (invented demo data)."""

from __future__ import annotations

import openpyxl
import pytest

from heatledger.cli import project_results
from heatledger.demo import demo_project
from heatledger.errors import ProjectError
from heatledger.sheet import template as tpl
from heatledger.sheet.render_openpyxl import write_workbook
from heatledger.sheet.template_fins import FIN_COLUMNS


@pytest.fixture
def filled(tmp_path):
    return write_workbook(tpl.template_plan(demo_project().raw), tmp_path / "filled.xlsx")


def _col(key):
    from heatledger.sheet.plan import col_letter

    return col_letter([k for k, _h, _t in FIN_COLUMNS["Fins"]].index(key) + 1)


def test_fins_round_trip_through_the_template(filled):
    demo = demo_project()
    project = tpl.project_from_template(filled)
    assert [e.name for e in project.fins] == [e.name for e in demo.fins]
    assert project_results(project)["fins"] == project_results(demo)["fins"]
    assert "Fins" in tpl.TEMPLATE_SHEETS


def test_bad_fin_cells_are_named_by_sheet_and_cell(filled, tmp_path):
    wb = openpyxl.load_workbook(filled)
    ws = wb["Fins"]
    ws[f"{_col('array_count')}4"] = 2.5
    path = tmp_path / "bad.xlsx"
    wb.save(path)
    with pytest.raises(ProjectError) as info:
        tpl.project_from_template(path)
    assert "whole number" in dict(info.value.problems)[f"Fins!{_col('array_count')}4"]
    wb = openpyxl.load_workbook(filled)
    wb["Fins"][f"{_col('length_mm')}4"] = -40.0
    wb["Fins"][f"{_col('corrected_length')}5"] = "maybe"
    wb.save(path)
    with pytest.raises(ProjectError) as info:
        tpl.project_from_template(path)
    got = dict(info.value.problems)
    assert "greater than zero" in got[f"Fins!{_col('length_mm')}4"]
    assert "true or false" in got[f"Fins!{_col('corrected_length')}5"]


def test_a_template_without_a_fins_sheet_still_reads(filled, tmp_path):
    wb = openpyxl.load_workbook(filled)
    del wb["Fins"]
    path = tmp_path / "old.xlsx"
    wb.save(path)
    assert tpl.project_from_template(path).fins == []
