"""The cells of a rendered sheet written as openpyxl writes them, without its per-cell
element tree.

openpyxl builds an XML element for every cell and serialises it through its incremental
writer, which is most of the time a large audit takes to save. A rendered plan holds only
plain cells (a number, a text, a bool, a formula in text, or nothing), so their ``<c>``
elements are written here as text, character for character what openpyxl writes for them
(``tests/sheet/test_cell_xml.py`` compares both on every kind of cell, and the generated
workbooks are unchanged). Any other cell (a date, an array formula, rich text, a comment,
a hyperlink) and any other XML writer than openpyxl's standard-library one go openpyxl's
own way. Only :func:`heatledger.sheet.render_openpyxl.workbook_bytes` uses this.

The sheet writer mirrors openpyxl's own, so it is used only with the openpyxl series it was
compared against (:data:`MIRRORED_SERIES`); with any other release the workbook is written by
openpyxl's own writer, slower but never different.
"""

from __future__ import annotations

import openpyxl
from openpyxl.cell._writer import write_cell
from openpyxl.comments.comment_sheet import CommentRecord
from openpyxl.drawing.spreadsheet_drawing import SpreadsheetDrawing
from openpyxl.worksheet._writer import WorksheetWriter
from openpyxl.writer.excel import ExcelWriter

__all__ = ["PlainCellsExcelWriter", "cell_xml", "writer_class", "MIRRORED_SERIES"]

#: openpyxl release series whose worksheet writer the plain-cell writer mirrors.
MIRRORED_SERIES = "3.1."

_PLAIN_NUMBERS = (int, float, bool)
_TYPE_ATTR = {"s": ' t="inlineStr"', "f": "", "n": ' t="n"', "b": ' t="b"'}


def _escape(text: str) -> str:
    """``&``, ``<`` and ``>`` as entities (what openpyxl's writer does to element text)."""
    if "&" in text:
        text = text.replace("&", "&amp;")
    if "<" in text:
        text = text.replace("<", "&lt;")
    if ">" in text:
        text = text.replace(">", "&gt;")
    return text


def cell_xml(cell) -> str | None:
    """The ``<c>`` element of a plain cell as openpyxl writes it ("" for a cell it skips),
    or None for a cell openpyxl must write itself.

    Parameters
    ----------
    cell : openpyxl.cell.Cell or openpyxl.cell.cell.MergedCell
        A cell of a rendered sheet. [-]

    Returns
    -------
    str or None
        The element text. [-]
    """
    kind = cell.data_type
    attr = _TYPE_ATTR.get(kind)
    if attr is None or cell._comment is not None or cell.hyperlink:
        return None
    value = cell._value
    styled = cell.has_style
    if value is None:
        if not styled:
            return ""
        return f'<c r="{cell.coordinate}" s="{cell.style_id}"{attr} />'
    head = (f'<c r="{cell.coordinate}" s="{cell.style_id}"{attr}' if styled
            else f'<c r="{cell.coordinate}"{attr}')
    if kind == "s":
        if type(value) is not str:
            return None
        if not value:
            return head + " />"
        stripped = value.strip()
        space = ' xml:space="preserve"' if stripped and stripped != value else ""
        return f"{head}><is><t{space}>{_escape(value)}</t></is></c>"
    if kind == "f":
        if type(value) is not str or len(value) < 2:
            return None
        return f"{head}><f>{_escape(value[1:])}</f><v /></c>"
    if type(value) not in _PLAIN_NUMBERS or value != value or value in (
            float("inf"), float("-inf")):
        return None
    return f"{head}><v>{value:.16g}</v></c>"  # openpyxl: "%.16g" % value


class _PlainCellsSheetWriter(WorksheetWriter):
    """openpyxl's sheet writer with the plain cells of a row written by :func:`cell_xml`."""

    def write_row(self, xf, row, row_idx):
        write = getattr(xf, "_file", None)
        if not callable(write):  # another XML writer (lxml): openpyxl's own way
            return super().write_row(xf, row, row_idx)
        attrs = {"r": f"{row_idx}"}
        attrs.update(self.ws.row_dimensions.get(row_idx, {}))
        with xf.element("row", attrs):
            for cell in row:
                text = cell_xml(cell)
                if text is not None:
                    if text:
                        write(text)
                    continue
                # what openpyxl's WorksheetWriter.write_row does with any other cell
                if cell._comment is not None:
                    self.ws._comments.append(CommentRecord.from_cell(cell))
                if cell._value is None and not cell.has_style and not cell._comment:
                    continue
                write_cell(xf, self.ws, cell, cell.has_style)


class PlainCellsExcelWriter(ExcelWriter):
    """openpyxl's workbook writer whose worksheets write their plain cells as text.

    Parameters
    ----------
    workbook : openpyxl.Workbook
        The workbook. [-]
    archive : zipfile.ZipFile
        The archive written to. [-]
    """

    def write_worksheet(self, ws):
        """Write one worksheet (openpyxl's ``ExcelWriter.write_worksheet`` with the sheet
        writer above).

        Parameters
        ----------
        ws : openpyxl.worksheet.worksheet.Worksheet
            The sheet. [-]
        """
        if self.workbook.write_only:
            return super().write_worksheet(ws)
        ws._drawing = SpreadsheetDrawing()
        ws._drawing.charts = ws._charts
        ws._drawing.images = ws._images
        writer = _PlainCellsSheetWriter(ws)
        writer.write()
        ws._rels = writer._rels
        self._archive.write(writer.out, ws.path[1:])
        self.manifest.append(ws)
        writer.cleanup()


def writer_class(version: str | None = None) -> type:
    """The workbook writer to use: the plain-cell writer with the openpyxl series it mirrors,
    openpyxl's own ``ExcelWriter`` with any other release.

    Parameters
    ----------
    version : str, optional
        openpyxl's version (default the installed one). [-]

    Returns
    -------
    type
    """
    version = openpyxl.__version__ if version is None else version
    return PlainCellsExcelWriter if version.startswith(MIRRORED_SERIES) else ExcelWriter
