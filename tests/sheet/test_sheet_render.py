"""Sheet plan and openpyxl renderer: determinism, atomic writes, text never a formula."""

from __future__ import annotations

import io
import time
import zipfile

import openpyxl
import pytest

from heatledger.errors import HeatLedgerError
from heatledger.sheet import render_openpyxl as rend
from heatledger.sheet.plan import Chart, ChartSeries, PrintSetup, WorkbookPlan, sheet_ref

HOSTILE_TEXT = ["=1+1", "+2", "-3 mm render", "@SUM(A1)", "=HYPERLINK(\"http://x\",\"y\")"]


def small_plan(note: str = "demo") -> WorkbookPlan:
    plan = WorkbookPlan(title="test plan")
    sh = plan.add_sheet("Data", column_widths={"A": 14, "B": 14}, freeze="A2",
                        print_setup=PrintSetup(header="heatledger {sheet}",
                                               footer_left="project & co"))
    blk = sh.block("table")
    blk.put("A1", "x [m]", role="header")
    blk.put("B1", "T [degC]", role="header")
    for i in range(2, 7):
        blk.put(f"A{i}", (i - 2) * 0.05, role="input", number_format="0.000")
        blk.put(f"B{i}", formula=f"=20-100*A{i}", number_format="0.00")
    for i, text in enumerate(HOSTILE_TEXT, start=2):
        blk.put(f"D{i}", text, role="input")
    blk.put("D1", note)
    sh.charts.append(Chart("scatter", "T through the wall", "F2",
                           (ChartSeries("T", sheet_ref("Data", "B2:B6"),
                                        sheet_ref("Data", "A2:A6"), marker="circle"),),
                           x_title="x [m]", y_title="T [degC]"))
    plan.defined_names["hl_first_x"] = sheet_ref("Data", "A2")
    return plan


def test_same_plan_gives_same_bytes_even_seconds_apart():
    first = rend.workbook_bytes(small_plan())
    time.sleep(2.1)  # zip member times have a 2 s resolution; make sure the clock moved
    second = rend.workbook_bytes(small_plan())
    assert first == second
    assert rend.workbook_bytes(small_plan("other")) != first


def test_document_timestamps_are_fixed():
    data = rend.workbook_bytes(small_plan())
    core = zipfile.ZipFile(io.BytesIO(data)).read("docProps/core.xml").decode()
    assert "2000-01-01T00:00:00Z" in core
    for info in zipfile.ZipFile(io.BytesIO(data)).infolist():
        assert info.date_time == (1980, 1, 1, 0, 0, 0)


def test_text_that_looks_like_a_formula_stays_text(tmp_path):
    path = rend.write_workbook(small_plan(), tmp_path / "t.xlsx")
    sheet_xml = zipfile.ZipFile(path).read("xl/worksheets/sheet1.xml").decode()
    assert sheet_xml.count("<f>") == 5  # only the five real formulas
    ws = openpyxl.load_workbook(path)["Data"]
    for i, text in enumerate(HOSTILE_TEXT, start=2):
        assert ws[f"D{i}"].value == text
        assert ws[f"D{i}"].data_type == "s"
    assert ws["B2"].value == "=20-100*A2"


def test_refuses_to_replace_existing_file(tmp_path):
    target = tmp_path / "out.xlsx"
    target.write_bytes(b"previous content")
    with pytest.raises(HeatLedgerError, match="exists.*--force"):
        rend.write_workbook(small_plan(), target)
    assert target.read_bytes() == b"previous content"
    rend.write_workbook(small_plan(), target, force=True)
    assert zipfile.is_zipfile(target)
    assert sorted(p.name for p in tmp_path.iterdir()) == ["out.xlsx"]


def test_error_while_writing_leaves_previous_file(tmp_path, monkeypatch):
    target = tmp_path / "out.xlsx"
    target.write_bytes(b"previous content")

    def broken_fsync(fd):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr("heatledger.fileio.os.fsync", broken_fsync)
    with pytest.raises(OSError, match="No space"):
        rend.write_workbook(small_plan(), target, force=True)
    assert target.read_bytes() == b"previous content"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["out.xlsx"]  # no temp file left


def test_error_while_rendering_leaves_previous_file(tmp_path):
    target = tmp_path / "out.xlsx"
    target.write_bytes(b"previous content")
    plan = small_plan()
    plan.sheet("Data").charts.append(
        Chart("bar", "bad", "H20", (ChartSeries("x", "'Nowhere'!$A$1:$A$2"),)))
    with pytest.raises(HeatLedgerError, match="Nowhere"):
        rend.write_workbook(plan, target, force=True)
    assert target.read_bytes() == b"previous content"


def test_plan_rejects_bad_input():
    plan = WorkbookPlan()
    with pytest.raises(HeatLedgerError, match="sheet name"):
        plan.add_sheet("a/b")
    sh = plan.add_sheet("S")
    with pytest.raises(HeatLedgerError, match="starting with '='"):
        sh.block("b").put("A1", formula="1+1")
    sh.block("b").put("A1", 1)
    sh.block("c").put("A1", 2)
    with pytest.raises(HeatLedgerError, match="written twice"):
        plan.validate()


def test_print_setup_is_a4_fit_to_width(tmp_path):
    path = rend.write_workbook(small_plan(), tmp_path / "p.xlsx")
    ws = openpyxl.load_workbook(path)["Data"]
    assert int(ws.page_setup.paperSize) == 9  # ECMA-376 paper size code 9 = A4
    assert ws.page_setup.fitToWidth == 1
    assert ws.sheet_properties.pageSetUpPr.fitToPage
    assert "&&" in ws.oddFooter.left.text  # a literal ampersand is escaped
    assert ws.freeze_panes == "A2"


def test_plan_and_blocks_know_no_spreadsheet_library():
    """The plan and the construction blocks are backend-neutral (DEVELOPERS.md,
    "Architecture in a page")."""
    import ast
    from pathlib import Path

    import heatledger.sheet as pkg

    folder = Path(pkg.__file__).parent
    for name in ("plan.py", "blocks_construction.py"):
        tree = ast.parse((folder / name).read_text(encoding="utf-8"))
        imported = {alias.name.split(".")[0] for node in ast.walk(tree)
                    if isinstance(node, ast.Import) for alias in node.names}
        imported |= {(node.module or "").split(".")[0] for node in ast.walk(tree)
                     if isinstance(node, ast.ImportFrom) and node.level == 0}
        assert not imported & {"openpyxl", "xlwings"}, (name, imported)
    for path in folder.glob("*.py"):
        assert "import xlwings" not in path.read_text(encoding="utf-8"), path.name


def test_user_text_never_becomes_an_error_value(tmp_path):
    plan = WorkbookPlan()
    plan.add_sheet("S").block("b").put("A1", "#N/A")
    path = rend.write_workbook(plan, tmp_path / "e.xlsx")
    cell = openpyxl.load_workbook(path)["S"]["A1"]
    assert cell.value == "#N/A" and cell.data_type == "s"


def test_charts_of_one_shape_share_xml_but_keep_their_own_titles_and_ranges():
    # the renderer serialises the first chart of a shape and reuses its XML for the others
    # with their texts replaced: each must read exactly as a chart built in full
    import xml.etree.ElementTree as ET

    from openpyxl import Workbook

    from heatledger.demo import demo_project
    from heatledger.sheet.audit import audit_plan
    from heatledger.sheet.render_openpyxl import _chart, _ChartCache

    plan = audit_plan(demo_project())
    specs = [c for s in plan.sheets for c in s.charts if c.kind == "scatter"]
    assert len(specs) >= 3
    wb = Workbook()
    for sheet in plan.sheets:
        wb.create_sheet(sheet.name)
    cache = _ChartCache(wb)

    def texts(element):
        return [(el.tag.split("}")[-1], el.text) for el in element.iter()
                if el.tag.split("}")[-1] in ("f", "v", "t")]

    for spec in specs:
        cached = cache.get(spec)._write()
        full = _chart(wb, spec)._write()
        assert texts(ET.fromstring(ET.tostring(cached))) == texts(full)
