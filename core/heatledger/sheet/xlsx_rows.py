"""Rows of an untrusted worksheet, read to the sheet's real end and within a budget.

openpyxl's read-only worksheets stop at the row the sheet's ``<dimension>`` tag names (a tag
that ends early silently drops the last rows), make up every row missing in between (one cell
in row 1,048,576 gives a million empty rows), give a formula saved without its result as an
empty cell, and let a damaged part fail with any of a dozen exception types. The template
reader reads its sheets through :class:`SheetReader` instead. It walks the sheet's XML row by
row to its end with defusedxml, converts each cell with openpyxl's own cell parser (shared
strings, dates, booleans, inline text), notes formulas saved without a result, counts every
row of a sheet and every XML element of the workbook against a budget (blank rows and cells
that carry only formatting are work too), refuses rows stored out of order, and turns every
parse error into one line naming the file and the sheet.

It uses openpyxl 3.1's sheet parser and the source of its read-only worksheets (private
names); the template tests exercise every one of them.
"""

from __future__ import annotations

import zlib
from xml.etree.ElementTree import ParseError
from zipfile import BadZipFile

from defusedxml import DefusedXmlException
from defusedxml.ElementTree import iterparse
from openpyxl.worksheet._reader import CELL_TAG, FORMULA_TAG, ROW_TAG, VALUE_TAG, WorkSheetParser

from .._validate import quote
from ..errors import HeatLedgerError, ProjectError

__all__ = ["SheetReader", "reason", "LAST_ROW"]

#: Last row number a worksheet can have (ECMA-376 Part 1, 18.3.1.73; the spreadsheet
#: programs). [-]
LAST_ROW = 1_048_576


class SheetReader:
    """Reads the parts and the sheets' rows of one workbook, all against one budget.

    Parameters
    ----------
    source : str
        File name, for messages. [-]
    max_rows : int
        Largest number of rows stored in one sheet, blank ones included. [-]
    max_elements : int
        Largest number of XML elements read from the workbook (rows, cells, shared texts,
        styles and their parts, blank ones included). [-]
    """

    def __init__(self, source: str, max_rows: int, max_elements: int) -> None:
        self.source = source
        self.max_rows = max_rows
        self.max_elements = max_elements
        self.elements_left = max_elements

    def count_parts(self, zf, skip: str = "xl/worksheets/") -> None:
        """Count the XML elements of the parts a workbook loads whole (shared texts, styles,
        relationships...) before they are loaded; the worksheets (``skip``) are counted as
        their rows are read.

        Parameters
        ----------
        zf : zipfile.ZipFile
            The workbook's archive. [-]
        skip : str
            Folder of the parts not counted here. [-]

        Raises
        ------
        HeatLedgerError
            If the parts hold more than ``max_elements`` elements.
        """
        for name in zf.namelist():
            if name.startswith(skip) or not name.endswith((".xml", ".rels")):
                continue
            with zf.open(name) as src:
                for event, el in iterparse(src, events=("start", "end")):
                    if event == "end":
                        el.clear()
                        continue
                    self.elements_left -= 1
                    if self.elements_left < 0:
                        raise HeatLedgerError(
                            f"{quote(self.source)}: the part {quote(name)} holds more than "
                            f"{self.max_elements} XML elements; save the template again from "
                            "a spreadsheet program, or split the project")

    def rows(self, ws, first_row: int, ncols: int):
        """Yield every row of ``ws`` the file stores, from ``first_row`` on.

        Parameters
        ----------
        ws : openpyxl read-only worksheet
            A sheet of a workbook opened with ``read_only=True, data_only=True``. [-]
        first_row : int
            First row yielded; earlier rows are read and counted, not yielded. [-]
        ncols : int
            Columns kept, from column A. [-]

        Yields
        ------
        (int, list, list)
            The row number, the values of its first ``ncols`` cells (None for an empty cell)
            and the column numbers of the formulas among them whose result was not saved
            (read as None). Rows the file does not store are not yielded.

        Raises
        ------
        ProjectError
            If the sheet stores more than ``max_rows`` rows, or the sheets read so far more
            than ``max_elements`` elements.
        HeatLedgerError
            If the sheet's XML is damaged.
        """
        wb = ws.parent
        parser = WorkSheetParser(None, ws._shared_strings, data_only=True, epoch=wb.epoch,
                                 date_formats=wb._date_formats,
                                 timedelta_formats=wb._timedelta_formats)
        src = None
        try:
            src = ws._get_source()
            yield from self._walk(iterparse(src, events=("start", "end")), parser, ws.title,
                                  first_row, ncols)
        except HeatLedgerError:
            raise
        except Exception as exc:  # noqa: BLE001 - a damaged part fails in many ways
            raise HeatLedgerError(f"{quote(self.source)} is damaged and cannot be read (sheet "
                                  f"{quote(ws.title)}: {reason(exc)}); save the template "
                                  "again from a spreadsheet program") from None
        finally:
            if src is not None:
                src.close()

    def _walk(self, events, parser, sheet, first_row, ncols):
        stack: list = []
        row, rows_read, in_cell, values, unsaved = 0, 0, 0, None, []
        for event, el in events:
            if event == "start":
                self.elements_left -= 1
                if self.elements_left < 0:
                    raise self._too_big(sheet, max(row, 1), f"more than {self.max_elements} "
                                        "cells and other XML elements in the sheets read")
                stack.append(el)
                if el.tag == CELL_TAG:
                    in_cell += 1
                elif el.tag == ROW_TAG:
                    rows_read += 1
                    row = _row_number(el, row)
                    if rows_read > self.max_rows:
                        raise self._too_big(sheet, row, f"more than {self.max_rows} rows")
                    parser.row_counter, parser.col_counter = row, 0
                    values, unsaved = [None] * ncols, []
                continue
            stack.pop()
            if el.tag == CELL_TAG:
                in_cell -= 1
                cell = parser.parse_cell(el)
                col = cell["column"]
                if values is not None and 1 <= col <= ncols:
                    if cell["row"] != row:
                        raise ValueError(f"a cell of row {cell['row']} is stored in row {row}")
                    values[col - 1] = cell["value"]
                    if cell["value"] is None and _result_not_saved(el):
                        unsaved.append(col)
            elif el.tag == ROW_TAG:
                if row >= first_row:
                    yield row, values, unsaved
                values = None
            if stack and not in_cell:
                del stack[-1][-1]  # done with it: memory stays flat

    def _too_big(self, sheet: str, row: int, what: str) -> ProjectError:
        return ProjectError([(f"{sheet}!A{row}", f"{what} (blank rows and cells that only "
                              "carry formatting count too); delete the unused rows and columns "
                              "after the table, or split the project")], source=self.source)


def reason(exc: BaseException) -> str:
    """A short, one-line reason for a failure to read a workbook.

    Parameters
    ----------
    exc : BaseException
        What the zip or XML reader raised. [-]

    Returns
    -------
    str
    """
    text = " ".join(str(exc).split())[:100]
    if isinstance(exc, DefusedXmlException):
        kind = "XML declarations refused for safety"
    elif isinstance(exc, (BadZipFile, zlib.error)):
        kind = "the archive is corrupt"
    elif isinstance(exc, ParseError):
        kind = "broken XML"
    else:
        kind = {"RecursionError": "nested too deeply", "EOFError": "the file ends early"}.get(
            type(exc).__name__, type(exc).__name__)
    return f"{kind}: {text}" if text else kind


def _row_number(el, previous: int) -> int:
    text = el.get("r")
    row = previous + 1 if text is None else int(text)
    if not previous < row <= LAST_ROW:
        raise ValueError(f"row {text} is out of order")
    return row


def _result_not_saved(el) -> bool:
    """Whether a cell read as empty holds a formula whose result the file does not carry: no
    ``<v>``, or an empty one that is not a text result (``t="str"``: a formula giving "")."""
    if el.find(FORMULA_TAG) is None:
        return False
    return el.get("t") != "str" or el.find(VALUE_TAG) is None
