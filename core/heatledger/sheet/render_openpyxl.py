"""Render a :class:`~heatledger.sheet.plan.WorkbookPlan` to an .xlsx file with openpyxl.

Output is deterministic (fixed document timestamps and zip member dates, so the same plan
gives the same bytes) and written atomically (temporary file in the target folder, then
moved into place; an existing file is kept unless ``force=True``). Text values are always
written as text: a string starting with ``=``, ``+``, ``-`` or ``@`` is stored as an
inline string with the quote-prefix flag, never as a formula.
"""

from __future__ import annotations

import io
import os
import re
from array import array
from copy import copy
from pathlib import Path
from xml.etree.ElementTree import fromstring, tostring
from xml.sax.saxutils import escape
from zipfile import ZIP_DEFLATED, ZipFile, ZipInfo

from openpyxl import Workbook
from openpyxl.cell.cell import ILLEGAL_CHARACTERS_RE, Cell, MergedCell
from openpyxl.chart import BarChart, Reference, ScatterChart, Series
from openpyxl.chart.marker import Marker
from openpyxl.chart.shapes import GraphicalProperties
from openpyxl.styles import Alignment, Border, Font, NamedStyle, PatternFill, Side
from openpyxl.styles.cell_style import StyleArray
from openpyxl.styles.numbers import BUILTIN_FORMATS_MAX_SIZE, BUILTIN_FORMATS_REVERSE
from openpyxl.utils.cell import get_column_letter
from openpyxl.workbook.defined_name import DefinedName
from openpyxl.worksheet.datavalidation import DataValidation as XLDataValidation
from openpyxl.worksheet.merge import MergedCellRange
from openpyxl.worksheet.pagebreak import Break

from ..errors import HeatLedgerError
from .cell_xml import writer_class
from .files import ZIP_EPOCH, write_bytes_atomic
from .plan import STYLES, Chart, Style, WorkbookPlan, is_formula_like, split_ref

__all__ = ["render_workbook", "workbook_bytes", "write_workbook"]

_TOKENS = {"{page}": "&P", "{pages}": "&N", "{sheet}": "&A", "{date}": "&D"}


def render_workbook(plan: WorkbookPlan) -> Workbook:
    """Build an in-memory openpyxl workbook from ``plan``.

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook to render. [-]

    Returns
    -------
    openpyxl.Workbook
    """
    plan.validate()
    wb = Workbook()
    wb.remove(wb.active)
    # control characters make an invalid document (the project name is user text)
    wb.properties.title = _printable(plan.title)
    wb.properties.creator = _printable(plan.creator)
    wb.properties.lastModifiedBy = _printable(plan.creator)
    wb.properties.created = plan.timestamp
    wb.properties.modified = plan.timestamp
    wb.calculation.fullCalcOnLoad = True

    style_cache = _StyleCache(wb)
    charts = _ChartCache(wb)
    places: dict[str, tuple] = {}  # reference -> (row, column, coordinate), across sheets
    # every sheet exists before any is filled: a chart may show data of a later sheet
    worksheets = [wb.create_sheet(sheet.name) for sheet in plan.sheets]
    for sheet, ws in zip(plan.sheets, worksheets, strict=True):
        _write_cells(ws, sheet, style_cache, places)
        for rng in sheet.merges:
            _merge(ws, rng)
        for letters, width in sheet.column_widths.items():
            ws.column_dimensions[letters].width = width
        for row, height in sheet.row_heights.items():
            ws.row_dimensions[row].height = height
        for row in sheet.row_breaks:
            ws.row_breaks.append(Break(id=row))
        for col in sheet.col_breaks:
            ws.col_breaks.append(Break(id=col))
        if sheet.freeze:
            ws.freeze_panes = sheet.freeze
        if sheet.tab_color:
            ws.sheet_properties.tabColor = sheet.tab_color
        for dv in sheet.validations:
            if dv.kind == "any":  # an input message only
                rule = XLDataValidation(allow_blank=True)
            else:
                rule = XLDataValidation(type="list", formula1=dv.source, allow_blank=True,
                                        showDropDown=False, errorStyle=dv.error_style)
            rule.promptTitle = None
            if dv.prompt:
                rule.prompt = dv.prompt[:255]
                rule.showInputMessage = True
            if dv.error:
                rule.error = dv.error[:225]
                rule.errorTitle = "heatledger"
                rule.showErrorMessage = True
            ws.add_data_validation(rule)
            rule.add(dv.cells)
        for chart in sheet.charts:
            ws.add_chart(charts.get(chart), chart.anchor)
        for pic in sheet.pictures:
            ws.add_image(_image(pic), pic.anchor)
        _print_setup(ws, sheet.print_setup)
    for name, target in plan.defined_names.items():
        wb.defined_names[name] = DefinedName(name, attr_text=target)
    return wb


def _write_cells(ws, sheet, style_cache, places: dict) -> None:
    """The plan's cells of ``sheet`` as openpyxl cells of ``ws``, each value as its type
    (text always as text) with its shared style."""
    cells = ws._cells
    for cell in sheet.cells():
        place = places.get(cell.ref)
        if place is None:
            place = places[cell.ref] = _place(cell.ref)
        row, col, _ = place
        xc = _new_cell(ws, place)
        quote = False
        if cell.formula is not None:
            xc._value = cell.formula
            xc.data_type = "f"
        else:
            value = cell.value
            kind = type(value)
            if value is None:
                pass
            elif kind is str:
                # always text: never a formula, never an error code such as '#N/A'
                if not value.isprintable():  # control characters: none in printable text
                    value = ILLEGAL_CHARACTERS_RE.sub("", value)
                if len(value) > 32767:
                    value = value[:32767]
                xc._value = value
                xc.data_type = "s"
                quote = is_formula_like(value)
            elif kind is float or kind is int:
                xc._value = value
            elif kind is bool:
                xc._value = value
                xc.data_type = "b"
            else:
                xc.value = value
        xc._style, xc.style_id, xc.has_style = style_cache.get(cell.style,
                                                               cell.number_format, quote)
        cells[(row, col)] = xc


def _image(pic):
    """An openpyxl image of a plan's picture, sized on the page (96 pixels per inch)."""
    from openpyxl.drawing.image import Image  # needs Pillow, as the pictures' maker does

    img = Image(io.BytesIO(pic.png))
    img.width = round(pic.width_cm / 2.54 * 96)
    img.height = round(pic.height_cm / 2.54 * 96)
    return img


def workbook_bytes(plan: WorkbookPlan) -> bytes:
    """The .xlsx file of ``plan`` as bytes (deterministic).

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook to render. [-]

    Returns
    -------
    bytes
    """
    wb = render_workbook(plan)
    buf = io.BytesIO()
    archive = _FixedTimeZipFile(buf, "w", ZIP_DEFLATED, allowZip64=True)
    # ExcelWriter keeps the modified time we set; openpyxl's save_workbook would stamp now.
    # Its plain cells are written as text, as openpyxl writes them (sheet/cell_xml.py).
    wb.properties.modified = plan.timestamp
    writer_class()(wb, archive).save()
    return buf.getvalue()


def write_workbook(plan: WorkbookPlan, path: str | os.PathLike, *, force: bool = False) -> Path:
    """Render ``plan`` and write it to ``path`` atomically.

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook to write. [-]
    path : str or path-like
        Output .xlsx file. [-]
    force : bool
        Replace an existing file. [-]

    Returns
    -------
    pathlib.Path

    Raises
    ------
    HeatLedgerError
        If the file exists and ``force`` is false, or the plan is inconsistent.
    """
    target = Path(path)
    if target.suffix.lower() != ".xlsx":
        raise HeatLedgerError(f"output file must end in .xlsx; got {str(target)!r}")
    if target.exists() and not force:
        raise HeatLedgerError(
            f"output file {str(target)!r} exists; choose another name or use --force to "
            "replace it"
        )
    data = workbook_bytes(plan)  # everything that can fail happens before the disk is touched
    return write_bytes_atomic(target, data, force=force)


# --------------------------------------------------------------------------- helpers
class _FixedTimeZipFile(ZipFile):
    """A zip archive whose members all carry the same date (reproducible bytes)."""

    def writestr(self, zinfo_or_arcname, data, compress_type=None, compresslevel=None):
        if not isinstance(zinfo_or_arcname, ZipInfo):
            zinfo_or_arcname = ZipInfo(zinfo_or_arcname, date_time=ZIP_EPOCH)
            zinfo_or_arcname.compress_type = ZIP_DEFLATED
            zinfo_or_arcname.external_attr = 0o644 << 16
        else:
            zinfo_or_arcname.date_time = ZIP_EPOCH
        super().writestr(zinfo_or_arcname, data, compress_type, compresslevel)

    def write(self, filename, arcname=None, compress_type=None, compresslevel=None):
        # openpyxl streams each worksheet to a temporary file and adds it with write()
        with open(filename, "rb") as fh:
            self.writestr(str(arcname or filename), fh.read(), compress_type, compresslevel)


class _PlanCell(Cell):
    """An openpyxl cell whose style index and coordinate are fixed when it is rendered.

    openpyxl looks a cell's style up in the workbook's style list every time it writes the
    cell (``style_id``), tests its style array for any non-zero entry (``has_style``) and
    writes its coordinate from the row and column (``coordinate``); a rendered cell never
    moves and its style never changes, so each is worked out once (per style in
    :class:`_StyleCache`, per reference in :func:`render_workbook`) and kept in the slot
    that hides the property.
    """

    __slots__ = ("style_id", "has_style", "coordinate")


class _PlanMergedCell(MergedCell):
    """A cell covered by a merged range, with the style index, the style flag and the
    coordinate fixed like a :class:`_PlanCell`'s (it shares the top-left cell's style)."""

    __slots__ = ("style_id", "has_style", "coordinate")


def _place(a1: str) -> tuple:
    """Row, column and openpyxl's coordinate text of a plan reference. [-]"""
    row, col = split_ref(a1)
    return row, col, f"{get_column_letter(col)}{row}"


def _new_cell(ws, place: tuple) -> Cell:
    """An empty openpyxl cell with its slots set directly: what ``Cell(ws, row, col)`` does,
    without the descriptor and argument handling that cost a fifth of rendering."""
    xc = _PlanCell.__new__(_PlanCell)
    xc.parent = ws
    xc.row, xc.column, xc.coordinate = place
    xc._value = None
    xc._hyperlink = None
    xc._comment = None
    xc.data_type = "n"
    xc._style = None
    return xc


class _SharedStyle(StyleArray):
    """A style array shared by many cells, with its hash kept after the first use.

    openpyxl looks every styled cell's array up in the workbook's style list when it writes
    the file, hashing the nine numbers each time; a shared array is never changed once it
    is in use, so its hash is computed once.
    """

    __slots__ = ("_hash",)

    def __new__(cls, args):
        return array.__new__(cls, "i", args)

    def __hash__(self):
        try:
            return self._hash
        except AttributeError:
            self._hash = hash(tuple(self))
            return self._hash

    def __eq__(self, other):
        return self is other or array.__eq__(self, other)


class _StyleCache:
    """One openpyxl style array per (named style, number format, quote prefix)."""

    def __init__(self, wb: Workbook) -> None:
        self.wb = wb
        self.arrays: dict[tuple, StyleArray] = {}
        self.named: dict[str, NamedStyle] = {}

    def get(self, name: str, number_format: str | None, quote: bool) -> tuple:
        key = (name, number_format, quote)
        arr = self.arrays.get(key)
        if arr is None:
            ns = self.named.get(name)
            if ns is None:
                ns = _named_style(STYLES[name])
                self.wb.add_named_style(ns)
                self.named[name] = ns
            arr = _SharedStyle(ns.as_tuple())
            fmt = number_format or STYLES[name].number_format
            if fmt in BUILTIN_FORMATS_REVERSE:
                arr.numFmtId = BUILTIN_FORMATS_REVERSE[fmt]
            else:
                arr.numFmtId = self.wb._number_formats.add(fmt) + BUILTIN_FORMATS_MAX_SIZE
            if quote:
                arr.quotePrefix = 1
            arr = (arr, self.wb._cell_styles.add(arr), any(arr))
            self.arrays[key] = arr
        # one shared array per style, with its index in the workbook's style list: nothing
        # mutates a cell's style after rendering
        return arr


def _merge(ws, rng: str) -> None:
    """Merge ``rng``; the covered cells take the top-left cell's style.

    openpyxl's ``merge_cells`` re-derives edge borders cell by cell, which costs more than
    writing all other cells of a large workbook; the top-left style copied across gives the
    same look for our styles (fills and rules run the full width).
    """
    mcr = MergedCellRange(ws, rng)
    ws.merged_cells.add(mcr)
    top = ws._cells.get((mcr.min_row, mcr.min_col))
    style = top._style if top is not None else None
    cells = mcr.cells
    next(cells)
    if isinstance(top, _PlanCell):  # the top-left cell's shared style, index and flag
        fixed = (top._style, top.style_id, top.has_style)
        for row, col in cells:
            mc = _PlanMergedCell.__new__(_PlanMergedCell)
            mc.parent = ws
            mc.row, mc.column = row, col
            mc.coordinate = f"{get_column_letter(col)}{row}"
            mc._style, mc.style_id, mc.has_style = fixed
            ws._cells[row, col] = mc
        return
    for row, col in cells:
        mc = MergedCell(ws, row, col)
        if style is not None:
            mc._style = copy(style)
        ws._cells[row, col] = mc


def _named_style(style: Style) -> NamedStyle:
    thin = Side(style="thin", color="9AA7AE")
    if style.border == "thin":
        border = Border(left=thin, right=thin, top=thin, bottom=thin)
    elif style.border == "bottom":
        border = Border(bottom=Side(style="medium", color="2E5A6B"))
    else:
        border = Border()
    fill = (PatternFill(fill_type="solid", start_color=style.fill, end_color=style.fill)
            if style.fill else PatternFill())
    ns = NamedStyle(
        name=style.name,
        font=Font(name="Calibri", bold=style.bold, italic=style.italic, size=style.size,
                  color=style.color),
        fill=fill,
        border=border,
        alignment=Alignment(horizontal=style.align, vertical="center", wrap_text=style.wrap),
        number_format=style.number_format,
    )
    return ns


def _reference(wb: Workbook, text: str) -> Reference:
    m = re.match(r"^'((?:[^']|'')+)'!\$?([A-Z]+)\$?(\d+)(?::\$?([A-Z]+)\$?(\d+))?$", text)
    if not m:
        raise HeatLedgerError(f"chart range must look like 'Sheet'!$A$1:$A$9; got {text!r}")
    sheet = m.group(1).replace("''", "'")
    if sheet not in wb.sheetnames:
        raise HeatLedgerError(f"chart range refers to sheet {sheet!r}, which is not in the plan")
    first = f"{m.group(2)}{m.group(3)}"
    last = f"{m.group(4)}{m.group(5)}" if m.group(4) else first
    r1, c1 = split_ref(first)
    r2, c2 = split_ref(last)
    return Reference(wb[sheet], min_col=c1, min_row=r1, max_col=c2, max_row=r2)


def _chart(wb: Workbook, spec: Chart):
    if spec.kind == "scatter":
        ch = ScatterChart(scatterStyle="lineMarker")
        ch.style = 13
        for s in spec.series:
            xs = _reference(wb, s.categories) if s.categories else None
            ys = _reference(wb, s.values)
            ser = Series(ys, xs, title=_printable(s.title))
            if s.marker:
                ser.marker = Marker(symbol=s.marker, size=5 if s.line else 8)
                if s.color:
                    ser.marker.graphicalProperties = GraphicalProperties(solidFill=s.color)
                    ser.marker.graphicalProperties.line.solidFill = s.color
            else:
                ser.marker = Marker(symbol="none")
            ser.smooth = False  # straight segments between nodes, never a spline
            if s.line:
                if s.color:
                    ser.graphicalProperties.line.solidFill = s.color
                ser.graphicalProperties.line.width = 19050
            else:
                ser.graphicalProperties.line.noFill = True
            ch.series.append(ser)
        ch.x_axis.majorGridlines = None
        ch.x_axis.tickLblPos = "low"
        ch.y_axis.tickLblPos = "low"
        ch.x_axis.number_format = "0"
        ch.y_axis.number_format = "0"
    else:
        ch = BarChart()
        ch.type = "col"
        for s in spec.series:
            ys = _reference(wb, s.values)
            ser = Series(ys, title=_printable(s.title))
            if s.color:
                ser.graphicalProperties.solidFill = s.color
            ch.series.append(ser)
        if spec.series and spec.series[0].categories:
            ch.set_categories(_reference(wb, spec.series[0].categories))
    ch.x_axis.title = _printable(spec.x_title) or None
    ch.y_axis.title = _printable(spec.y_title) or None
    ch.x_axis.delete = False
    ch.y_axis.delete = False
    if spec.y_format:
        ch.y_axis.number_format = spec.y_format
    ch.title = _printable(spec.title)
    ch.width = spec.width_cm
    ch.height = spec.height_cm
    ch.legend.position = "b"
    return ch


def _printable(text):
    """``text`` without the control characters XML 1.0 cannot hold (None stays None)."""
    return None if text is None else ILLEGAL_CHARACTERS_RE.sub("", str(text))


class _ChartCache:
    """Charts of one shape serialised once.

    openpyxl builds a chart from some hundred objects and serialises them when the file is
    written, which costs more than the cells of a construction sheet. Charts that differ only
    in their title, series titles and cell ranges (one per construction sheet) share the XML
    of the first of them, with those texts replaced; anything else builds in full.
    """

    def __init__(self, wb: Workbook) -> None:
        self.wb = wb
        self.first: dict[tuple, tuple[Chart, str]] = {}

    def get(self, spec: Chart):
        key = _chart_shape(spec)
        known = self.first.get(key)
        if known is not None:
            xml = _chart_xml_for(known, spec)
            if xml is not None:
                ch = (ScatterChart if spec.kind == "scatter" else BarChart)()
                ch.width, ch.height = spec.width_cm, spec.height_cm
                ch._write = lambda xml=xml: fromstring(xml)
                return ch
        ch = _chart(self.wb, spec)
        if known is None:
            self.first[key] = (spec, tostring(ch._write(), encoding="unicode"))
        return ch


def _chart_shape(spec: Chart) -> tuple:
    """Everything of a chart but its title, series titles and ranges."""
    return (spec.kind, spec.x_title, spec.y_title, spec.width_cm, spec.height_cm,
            spec.y_format, tuple((s.categories is not None, s.line, s.marker, s.color)
                                 for s in spec.series))


def _chart_xml_for(known: tuple, spec: Chart) -> str | None:
    """The first chart's XML with ``spec``'s texts, or None where a replacement would be
    ambiguous (the same old text standing for two new ones)."""
    old_spec, xml = known
    c = "c:" if "<c:f>" in xml else ""  # the chart namespace, prefixed or the default

    def el(tag: str, text: str) -> str:
        return f"<{tag}>{escape(text)}</{tag}>"

    pairs = [(el("a:t", _printable(old_spec.title)), el("a:t", _printable(spec.title)))]
    for old, new in zip(old_spec.series, spec.series, strict=True):
        pairs.append((el(c + "v", _printable(old.title)), el(c + "v", _printable(new.title))))
        pairs.append((el(c + "f", old.values), el(c + "f", new.values)))
        if old.categories is not None:
            pairs.append((el(c + "f", old.categories), el(c + "f", new.categories)))
    mapping: dict[str, str] = {}
    for old, new in pairs:
        if mapping.setdefault(old, new) != new or xml.count(old) == 0:
            return None
    pattern = re.compile("|".join(map(re.escape, mapping)))
    return pattern.sub(lambda m: mapping[m.group(0)], xml)


def _hf(text: str) -> str:
    out = _printable(text).replace("&", "&&")
    for token, code in _TOKENS.items():
        out = out.replace(token, code)
    return out


def _print_setup(ws, setup) -> None:
    ws.page_setup.paperSize = ws.PAPERSIZE_A4
    ws.page_setup.orientation = setup.orientation
    if setup.scale is None:
        ws.sheet_properties.pageSetUpPr.fitToPage = True
        ws.page_setup.fitToWidth = setup.fit_width
        ws.page_setup.fitToHeight = setup.fit_height
    else:
        ws.page_setup.scale = setup.scale
    ws.print_options.horizontalCentered = True
    ws.page_margins.left = ws.page_margins.right = 0.5
    ws.page_margins.top = ws.page_margins.bottom = 0.7
    if setup.header:
        ws.oddHeader.center.text = _hf(setup.header)
        ws.oddHeader.center.size = 9
    if setup.footer_left:
        ws.oddFooter.left.text = _hf(setup.footer_left)
        ws.oddFooter.left.size = 9
    if setup.footer_right:
        ws.oddFooter.right.text = _hf(setup.footer_right)
        ws.oddFooter.right.size = 9
    if setup.title_rows:
        ws.print_title_rows = setup.title_rows
    if setup.title_columns:
        ws.print_title_cols = setup.title_columns
