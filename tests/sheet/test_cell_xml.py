"""The cells the renderer writes as text are what openpyxl itself writes for them.

The reference is openpyxl's own cell writer (``openpyxl.cell._writer.etree_write_cell``
through its standard-library XML writer) and its own workbook writer
(``openpyxl.writer.excel.ExcelWriter``): each cell kind a plan holds, and whole rendered
workbooks, must come out character for character the same.
"""

from __future__ import annotations

import io
from zipfile import ZIP_DEFLATED, ZipFile

import pytest
from openpyxl import Workbook
from openpyxl.cell.cell import MergedCell
from openpyxl.cell.rich_text import CellRichText, TextBlock
from openpyxl.cell.text import InlineFont
from openpyxl.comments import Comment
from openpyxl.styles import Font
from openpyxl.writer.excel import ExcelWriter
from openpyxl.xml.constants import SHEET_MAIN_NS
from openpyxl.xml.functions import xmlfile

from heatledger.demo import demo_project
from heatledger.sheet.audit import audit_plan
from heatledger.sheet.cell_xml import PlainCellsExcelWriter, cell_xml
from heatledger.sheet.render_openpyxl import _FixedTimeZipFile, render_workbook
from heatledger.sheet.template import template_plan

VALUES = [0, 1, -7, 2**60, 0.1, -0.0, 1e-300, 123456.789012345678, 1e22, True, False,
          "text", "a & b < c > d", "  leading", "trailing  ", "   ", "line\nbreak", "λ = 0.035",
          "", None, "=B7/1000", "=IF(A1<0,\"<0\",A1&\"x\")", "=SUM('EW1 wall'!$C$5:$C$9)"]


def openpyxl_xml(cell) -> str:
    """What openpyxl's own row writer writes for ``cell``."""
    buf = io.BytesIO()
    from openpyxl.cell._writer import etree_write_cell

    with xmlfile(buf) as xf:
        with xf.element("worksheet", xmlns=SHEET_MAIN_NS):
            with xf.element("sheetData"):
                if not (cell._value is None and not cell.has_style):
                    etree_write_cell(xf, cell.parent, cell, cell.has_style)
    text = buf.getvalue().decode()
    inner = text.split("<sheetData>", 1)[1].rsplit("</sheetData>", 1)[0]
    return inner


@pytest.mark.parametrize("styled", [False, True])
@pytest.mark.parametrize("value", VALUES, ids=repr)
def test_a_plain_cell_is_written_as_openpyxl_writes_it(value, styled):
    wb = Workbook()
    ws = wb.active
    cell = ws.cell(row=3, column=28)
    cell.value = value
    if styled:
        cell.font = Font(bold=True)
    assert cell_xml(cell) == openpyxl_xml(cell)


def test_a_merged_cell_is_written_as_openpyxl_writes_it():
    wb = Workbook()
    ws = wb.active
    ws["A1"] = "title"
    ws["A1"].font = Font(bold=True)
    mc = MergedCell(ws, 1, 2)
    mc._style = ws["A1"]._style
    assert cell_xml(mc) == openpyxl_xml(mc)
    assert cell_xml(MergedCell(ws, 1, 3)) == ""  # unstyled and empty: not written


def test_other_cells_are_left_to_openpyxl():
    wb = Workbook()
    ws = wb.active
    rich = ws.cell(row=1, column=1)
    rich.value = CellRichText([TextBlock(InlineFont(b=True), "bold"), " plain"])
    noted = ws.cell(row=2, column=1, value=1.0)
    noted.comment = Comment("a note", "heatledger")
    linked = ws.cell(row=3, column=1, value="link")
    linked.hyperlink = "https://example.org"
    import datetime

    dated = ws.cell(row=4, column=1, value=datetime.date(2026, 12, 3))
    for cell in (rich, noted, linked, dated):
        assert cell_xml(cell) is None


def _members(wb, writer_class) -> dict:
    buf = io.BytesIO()
    with _FixedTimeZipFile(buf, "w", ZIP_DEFLATED, allowZip64=True) as archive:
        writer_class(wb, archive).save()
    with ZipFile(io.BytesIO(buf.getvalue())) as z:
        return {n: z.read(n) for n in z.namelist()}


@pytest.mark.parametrize("make_plan", [lambda: audit_plan(demo_project()),
                                       lambda: template_plan(demo_project().raw)],
                         ids=["demo audit", "demo template"])
def test_a_rendered_workbook_is_the_same_as_openpyxl_writes_it(make_plan):
    plan = make_plan()
    ours = _members(render_workbook(plan), PlainCellsExcelWriter)
    reference = _members(render_workbook(plan), ExcelWriter)
    assert ours.keys() == reference.keys()
    for name in reference:
        assert ours[name] == reference[name], name


def test_another_openpyxl_series_writes_with_openpyxl_own_writer():
    from openpyxl.writer.excel import ExcelWriter

    from heatledger.sheet.cell_xml import PlainCellsExcelWriter, writer_class

    assert writer_class("3.1.5") is PlainCellsExcelWriter
    assert writer_class("3.2.0") is ExcelWriter and writer_class("4.0") is ExcelWriter
