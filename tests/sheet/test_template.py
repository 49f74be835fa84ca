"""The fill-in template: round trip to the same project as the TOML route, and bad input
reported all at once, each problem naming its sheet and cell."""

from __future__ import annotations

import zipfile

import openpyxl
import pytest

from heatledger.cli import project_results
from heatledger.demo import demo_project
from heatledger.errors import HeatLedgerError, ProjectError
from heatledger.sheet import template as tpl
from heatledger.sheet.render_openpyxl import write_workbook


@pytest.fixture(scope="module")
def demo():
    return demo_project()


@pytest.fixture
def filled(tmp_path, demo):
    return write_workbook(tpl.template_plan(demo.raw), tmp_path / "filled.xlsx")


def _results(project):
    """What the template carries: project information, design data and constructions (the
    template has no sheets for rooms and the building; those come from TOML only)."""
    out = project_results(project)
    return {k: out[k] for k in ("project", "design", "constructions")}


def test_filled_template_gives_the_same_project_as_the_toml(filled, demo):
    project = tpl.project_from_template(filled)
    assert _results(project) == _results(demo)
    assert project.source_bytes == filled.read_bytes()  # the cover hashes the template file


def test_empty_template_has_lists_and_no_constructions(tmp_path):
    path = write_workbook(tpl.template_plan(), tmp_path / "empty.xlsx")
    wb = openpyxl.load_workbook(path)
    assert wb.sheetnames == list(tpl.TEMPLATE_SHEETS)
    validations = wb["Layers"].data_validations.dataValidation
    assert {v.formula1 for v in validations} >= {"'Lists'!$C$2:$C$5"}
    data, _raw = tpl.read_template(path)
    assert data["constructions"] == []


def _edit(path, edits, delete_sheet=None, insert_col=None):
    wb = openpyxl.load_workbook(path)
    for (sheet, ref), value in edits.items():
        wb[sheet][ref] = value
    if delete_sheet:
        del wb[delete_sheet]
    if insert_col:
        wb[insert_col].insert_cols(1)
    wb.save(path)
    return path


def _problems(path):
    with pytest.raises(ProjectError) as info:
        tpl.project_from_template(path)
    return dict(info.value.problems), str(info.value)


def test_every_bad_cell_is_named_at_once(filled):
    # Layers rows start at row 4: row 5 is the demo's 2nd layer (bridged), row 4 the 1st
    _edit(filled, {("Layers", "E4"): -12.5,                 # negative thickness
                   ("Layers", "E6"): "twelve",              # text in a number cell
                   ("Layers", "D7"): "unobtainium board",   # unknown material
                   ("Constructions", "C5"): "forty-two"})   # text in the area column
    with pytest.raises(ProjectError) as info:
        tpl.project_from_template(filled)
    where = [w for w, _m in info.value.problems]
    assert "Layers!E6" in where and "Constructions!C5" in where
    # type problems are found by the reader first; fix them and the rest are reported next
    _edit(filled, {("Layers", "E6"): 12.0, ("Constructions", "C5"): 42.0})
    problems, text = _problems(filled)
    assert "Layers!E4" in problems and "greater than zero" in problems["Layers!E4"]
    assert "Layers!D7" in problems and "unobtainium" in problems["Layers!D7"]
    assert "Layers!E4" in text and "Layers!D7" in text


def test_missing_sheet_is_named(filled):
    _edit(filled, {}, delete_sheet="Layers")
    problems, _ = _problems(filled)
    assert "Layers!" in problems and "missing" in problems["Layers!"]


def test_shifted_header_is_named(filled):
    _edit(filled, {}, insert_col="Constructions")
    problems, _ = _problems(filled)
    assert "Constructions!A3" in problems
    assert "inserted or deleted" in problems["Constructions!A3"]


def test_layer_of_unknown_construction_is_named(filled):
    _edit(filled, {("Layers", "A4"): "EW9 no such wall"})
    problems, _ = _problems(filled)
    assert "Layers!A4" in problems and "EW9 no such wall" in problems["Layers!A4"]


def test_blank_rows_are_skipped(filled, demo):
    wb = openpyxl.load_workbook(filled)
    ws = wb["Layers"]
    ws.insert_rows(6, 3)  # three blank rows in the middle of the layer table
    wb.save(filled)
    assert _results(tpl.project_from_template(filled)) == _results(demo)


def test_over_large_file_is_refused(tmp_path, monkeypatch, filled):
    monkeypatch.setattr(tpl, "MAX_TEMPLATE_BYTES", 1000)
    with pytest.raises(HeatLedgerError, match="limit is 1000 bytes"):
        tpl.project_from_template(filled)


def test_zip_bomb_is_refused(tmp_path):
    path = tmp_path / "bomb.xlsx"
    with zipfile.ZipFile(path, "w", zipfile.ZIP_DEFLATED) as zf:
        zf.writestr("xl/workbook.xml", b"<" + b" " * (tpl.MAX_UNCOMPRESSED_BYTES + 10) + b"/>")
    with pytest.raises(HeatLedgerError, match="unpacks to"):
        tpl.project_from_template(path)


@pytest.mark.parametrize("content, message", [
    (b"this is not a workbook", "not an .xlsx workbook"),
    (b"", "not an .xlsx workbook"),
])
def test_malformed_file_is_refused(tmp_path, content, message):
    path = tmp_path / "bad.xlsx"
    path.write_bytes(content)
    with pytest.raises(HeatLedgerError, match=message):
        tpl.project_from_template(path)


def test_broken_xml_inside_the_zip_is_refused(tmp_path, filled):
    path = tmp_path / "broken.xlsx"
    with zipfile.ZipFile(filled) as src, zipfile.ZipFile(path, "w") as dst:
        for info in src.infolist():
            body = src.read(info.filename)
            if info.filename == "xl/workbook.xml":
                body = body[: len(body) // 2]
            dst.writestr(info, body)
    with pytest.raises(HeatLedgerError, match="broken.xlsx"):
        tpl.project_from_template(path)


def test_xml_entity_expansion_is_refused(tmp_path, filled):
    """defusedxml is active: a 'billion laughs' entity in a part is rejected, not expanded."""
    bomb = (b'<?xml version="1.0"?><!DOCTYPE lolz [<!ENTITY lol "lol">'
            b'<!ENTITY lol2 "&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;">]>'
            b'<workbook xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main">'
            b"&lol2;</workbook>")
    path = tmp_path / "entities.xlsx"
    with zipfile.ZipFile(filled) as src, zipfile.ZipFile(path, "w") as dst:
        for info in src.infolist():
            body = bomb if info.filename == "xl/workbook.xml" else src.read(info.filename)
            dst.writestr(info, body)
    with pytest.raises(HeatLedgerError, match="entities.xlsx"):
        tpl.project_from_template(path)


def test_project_sheet_problems_are_named(filled):
    ws = openpyxl.load_workbook(filled)["Project"]
    row = next(r for r in range(4, 20) if ws[f"A{r}"].value == "temp_outside")
    _edit(filled, {("Project", f"C{row}"): "minus seven", ("Project", "A20"): "colour"})
    problems, _ = _problems(filled)
    assert f"Project!C{row}" in problems and "number" in problems[f"Project!C{row}"]
    assert "Project!A20" in problems and "unknown key" in problems["Project!A20"]


def test_design_rule_from_the_project_is_mapped_to_its_cell(filled):
    ws = openpyxl.load_workbook(filled)["Project"]
    row = next(r for r in range(4, 20) if ws[f"A{r}"].value == "temp_outside")
    _edit(filled, {("Project", f"C{row}"): 30.0})  # warmer outside than inside
    problems, _ = _problems(filled)
    assert f"Project!C{row}" in problems


def test_material_lists_warn_but_allow_own_materials(tmp_path):
    path = write_workbook(tpl.template_plan(), tmp_path / "t.xlsx")
    rules = openpyxl.load_workbook(path)["Layers"].data_validations.dataValidation
    styles = {r.formula1: r.errorStyle for r in rules}
    n = len(tpl.default_library().names())
    assert styles[f"'Lists'!$A$2:$A${n + 1}"] == "warning"
    assert styles["'Lists'!$C$2:$C$5"] == "stop"


def test_reader_refuses_to_run_without_defusedxml(filled, monkeypatch):
    monkeypatch.setattr("openpyxl.xml.DEFUSEDXML", False)
    with pytest.raises(HeatLedgerError, match="defusedxml"):
        tpl.project_from_template(filled)


def test_too_many_rows_is_refused(filled, monkeypatch):
    monkeypatch.setattr(tpl, "MAX_ROWS", 3)  # the demo has 19 layer rows
    problems, _ = _problems(filled)
    assert any(w.startswith("Layers!A") and "more than 3 rows" in m for w, m in problems.items())
