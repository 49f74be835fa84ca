"""Render a calculation-sheet plan into the workbook open in Excel, through xlwings.

This is the second renderer of :class:`heatledger.sheet.plan.WorkbookPlan` (the first,
:mod:`heatledger.sheet.render_openpyxl`, writes a file): the same plan, so a sheet built
inside Excel and one generated headless hold the same cells and formulas.

What is written, through xlwings' public objects only (``Book.sheets``, ``Sheet.range``,
``Range.value/formula/number_format/font/color/wrap_text/horizontal_alignment/
vertical_alignment/borders/merge/column_width/row_height``, ``Sheet.freeze_panes``,
``Sheet.charts``, ``Book.names``):

- constants in one block write; every text is written with a leading apostrophe, so that
  Excel keeps it as text (a name starting with ``=`` never becomes a formula, ``"12"``
  never a number); formulas through ``Range.formula`` (English syntax), row by row;
- styles as runs of equal style in a row: font, fill, number format, wrap, alignment,
  thin box or bottom rule;
- merges, column widths, row heights, frozen panes, charts (type, title, first series with
  its x values; further series through the native chart object where the platform offers
  one), drop-down lists, defined names that do not exist yet in the book. Charts and
  drop-down lists are added once every sheet exists, since they may refer to later sheets.

Not written (xlwings has no portable call for them): print setup (orientation, fit to
page, header and footer), page breaks, tab colours and the prompt/error texts of drop-down
lists; in xlwings Lite/Server also the names, markers and colours of chart series and
series beyond the first. :class:`RenderReport` lists every one of them.

Nothing is written outside the book given; an existing sheet is never overwritten unless
``replace=True`` (otherwise the new sheet gets a free name such as ``"EW1 (2)"`` and the
plan's references to it are rewritten).
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field

from heatledger.errors import HeatLedgerError
from heatledger.sheet.plan import STYLES, Chart, Sheet, WorkbookPlan, col_letter, split_ref

__all__ = ["RenderReport", "render_plan", "TEXT_PREFIX"]

#: Prefix that makes Excel store what follows as text.
TEXT_PREFIX = "'"
_POINTS_PER_CM = 72.0 / 2.54
_MARKERS = {"circle": "circle", "diamond": "diamond", "square": "square", None: "none"}
_SHEET_REF = re.compile(r"^'((?:[^']|'')+)'!(.+)$")


@dataclass
class RenderReport:
    """What :func:`render_plan` wrote.

    Attributes
    ----------
    sheets : dict
        Plan sheet name -> name of the sheet written in the book.
    cells, formulas : int
        Cells written, and how many of them hold formulas.
    skipped : list of str
        Plan features not written, each with the reason.
    """

    sheets: dict = field(default_factory=dict)
    cells: int = 0
    formulas: int = 0
    skipped: list = field(default_factory=list)


def render_plan(plan: WorkbookPlan, book, *, replace: bool = False) -> RenderReport:
    """Write every sheet of ``plan`` into ``book`` (an ``xlwings.Book`` or a stand-in).

    Parameters
    ----------
    plan : WorkbookPlan
        The plan to render. [-]
    book : xlwings.Book
        The open workbook to write into. [-]
    replace : bool
        Clear and reuse a sheet of the same name instead of adding a new one. [-]

    Returns
    -------
    RenderReport

    Raises
    ------
    HeatLedgerError
        If the plan is inconsistent (checked before anything is written).
    """
    plan.validate()
    report = RenderReport()
    existing = [s.name for s in book.sheets]
    taken = {n.lower() for n in existing}
    for s in plan.sheets:
        if replace or s.name.lower() not in taken:
            report.sheets[s.name] = s.name
        else:
            report.sheets[s.name] = _free_name(s.name, taken)
        taken.add(report.sheets[s.name].lower())
    rename = {old: new for old, new in report.sheets.items() if old != new}
    app = getattr(book, "app", None)
    updating = _screen_updating(app)
    written = []
    try:
        for s in plan.sheets:
            target = report.sheets[s.name]
            if target.lower() in {n.lower() for n in existing}:
                sheet = book.sheets[target]
                sheet.clear()
            else:
                last = book.sheets[len(book.sheets) - 1] if len(book.sheets) else None
                sheet = book.sheets.add(target, after=last)
            _render_sheet(s, sheet, book, rename, report)
            written.append((s, sheet))
        # charts and drop-down lists may refer to sheets written later: add them last
        for s, sheet in written:
            for chart in s.charts:
                _chart(sheet, book, chart, rename, report)
            for dv in s.validations:
                _validation(sheet, book, dv, rename, report)
        _defined_names(plan, book, rename, report)
    finally:
        if updating is not None:
            app.screen_updating = updating
    return report


def _screen_updating(app):
    """Switch screen updating off while writing; return the setting to restore, or None.

    The in-browser and server runtimes cannot report the setting (they only pause updating
    until their next sync), so there is nothing to restore there."""
    if app is None:
        return None
    try:
        previous = app.screen_updating
    except Exception:  # noqa: BLE001 - a runtime that cannot read it
        previous = None
    try:
        app.screen_updating = False
    except Exception:  # noqa: BLE001 - a runtime that cannot set it either
        return None
    return previous


# --------------------------------------------------------------------------- one sheet
def _render_sheet(plan_sheet: Sheet, sheet, book, rename: dict, report: RenderReport) -> None:
    cells = plan_sheet.cell_map()
    if cells:
        positions = {ref: split_ref(ref) for ref in cells}
        n_rows = max(r for r, _ in positions.values())
        n_cols = max(c for _, c in positions.values())
        grid = [[None] * n_cols for _ in range(n_rows)]
        formulas: dict[int, dict[int, str]] = {}
        for ref, cell in cells.items():
            r, c = positions[ref]
            if cell.formula is not None:
                formulas.setdefault(r, {})[c] = _renamed(cell.formula, rename)
                report.formulas += 1
            else:
                grid[r - 1][c - 1] = _constant(cell.value)
        sheet.range(f"A1:{col_letter(n_cols)}{n_rows}").value = grid
        for r, row in sorted(formulas.items()):
            for c0, c1 in _runs(sorted(row)):
                sheet.range(f"{col_letter(c0)}{r}:{col_letter(c1)}{r}").formula = [
                    [row[c] for c in range(c0, c1 + 1)]]
        report.cells += len(cells)
        _styles(sheet, cells, positions)
    for rng in plan_sheet.merges:
        sheet.range(rng).merge()
    for letters, width in plan_sheet.column_widths.items():
        sheet.range(f"{letters}:{letters}").column_width = width
    for row, height in sorted(plan_sheet.row_heights.items()):
        sheet.range(f"{row}:{row}").row_height = height
    if plan_sheet.freeze:
        sheet.freeze_panes.freeze_at(plan_sheet.freeze)
    name = plan_sheet.name
    report.skipped.append(f"{name}: print setup (orientation, fit to page, header/footer) "
                          "has no portable xlwings call; set it in Page Layout")
    if plan_sheet.row_breaks:
        report.skipped.append(f"{name}: page breaks")
    if plan_sheet.tab_color:
        report.skipped.append(f"{name}: tab colour")


def _constant(value):
    if isinstance(value, str):
        # always text, never a formula, number or date; an empty text is an empty cell
        return TEXT_PREFIX + value if value else None
    return value


def _runs(columns):
    """Consecutive column numbers grouped as (first, last) pairs."""
    out = []
    for c in columns:
        if out and c == out[-1][1] + 1:
            out[-1][1] = c
        else:
            out.append([c, c])
    return [tuple(r) for r in out]


def _styles(sheet, cells: dict, positions: dict) -> None:
    """Apply styles as few rectangles as possible: runs of equal style along a row, then
    equal runs stacked in consecutive rows (one call sequence per rectangle)."""
    by_row: dict[int, dict[int, tuple]] = {}
    for ref, cell in cells.items():
        r, c = positions[ref]
        fmt = cell.number_format or STYLES[cell.style].number_format
        by_row.setdefault(r, {})[c] = (cell.style, fmt)
    runs: dict[tuple, list[int]] = {}
    for r, row in sorted(by_row.items()):
        cols = sorted(row)
        start = prev = cols[0]
        for c in cols[1:] + [None]:
            if c is not None and c == prev + 1 and row[c] == row[start]:
                prev = c
                continue
            runs.setdefault((start, prev, row[start]), []).append(r)
            if c is not None:
                start = prev = c
    rectangles = []
    for (c0, c1, key), rows in runs.items():
        top = last = rows[0]
        for r in rows[1:] + [None]:
            if r is not None and r == last + 1:
                last = r
                continue
            rectangles.append((top, c0, last, c1, key))
            if r is not None:
                top = last = r
    for top, c0, bottom, c1, (style, fmt) in sorted(rectangles):
        _apply_style(sheet.range(f"{col_letter(c0)}{top}:{col_letter(c1)}{bottom}"), style, fmt)


def _apply_style(rng, style_name: str, number_format: str) -> None:
    style = STYLES[style_name]
    rng.number_format = number_format
    font = rng.font
    font.name = "Calibri"
    font.size = style.size
    font.bold = style.bold
    font.italic = style.italic
    font.color = f"#{style.color}"
    if style.fill:
        rng.color = f"#{style.fill}"
    if style.wrap:
        rng.wrap_text = True
    if style.align:
        rng.horizontal_alignment = style.align
    rng.vertical_alignment = "center"
    if style.border == "thin":
        rng.borders.line_style = "continuous"
        rng.borders.weight = "thin"
        rng.borders.color = "#9AA7AE"
    elif style.border == "bottom":
        edge = rng.borders["edge_bottom"]
        edge.line_style = "continuous"
        edge.weight = "medium"
        edge.color = "#2E5A6B"


# --------------------------------------------------------------------------- charts etc.
def _chart(sheet, book, spec: Chart, rename: dict, report: RenderReport) -> None:
    if not spec.series:
        return
    anchor = sheet.range(spec.anchor)
    kind = "xy_scatter_lines" if spec.kind == "scatter" else "column_clustered"
    first = spec.series[0]
    chart = sheet.charts.add(anchor=anchor, width=spec.width_cm * _POINTS_PER_CM,
                             height=spec.height_cm * _POINTS_PER_CM, chart_type=kind,
                             source=_range(book, first.values, rename), plot_by="columns")
    chart.title = spec.title
    if first.categories:
        chart.set_x_axis_values(_range(book, first.categories, rename))
    styled = _try_series_look(chart, 0, first)
    if not styled:
        report.skipped.append(f"{sheet.name}: chart {spec.title!r} series names, markers and "
                              "colours (this runtime cannot inspect chart series "
                              "synchronously)")
    for s in spec.series[1:]:
        if not _add_series_native(chart, book, s, rename):
            report.skipped.append(f"{sheet.name}: chart {spec.title!r} series {s.title!r} "
                                  "(this platform's chart object cannot add a series)")
            continue
        if styled:
            _try_series_look(chart, -1, s)
    if spec.y_format and not _value_axis_format(chart, spec.y_format):
        report.skipped.append(f"{sheet.name}: chart {spec.title!r} value-axis number format "
                              f"{spec.y_format!r} (this platform's chart object has no axes)")


def _value_axis_format(chart, number_format: str) -> bool:
    """Set the value-axis number format through the native chart (classic xlwings)."""
    try:  # chart.api is (ChartObject, Chart); Axes(2) is the value axis (xlValue)
        chart.api[1].Axes(2).TickLabels.NumberFormat = number_format
        return True
    except Exception:  # noqa: BLE001 - a platform without the native call: report it
        return False


def _try_series_look(chart, index: int, spec) -> bool:
    try:
        series = chart.series
        _series_look(series[len(series) - 1 if index < 0 else index], spec)
    except (NotImplementedError, AttributeError, IndexError):
        return False
    return True


def _series_look(series, spec) -> None:
    options = {"name": spec.title, "marker_style": _MARKERS.get(spec.marker, "none")}
    if spec.color:
        options["line_color" if spec.line else "marker_foreground_color"] = f"#{spec.color}"
    series.set(**options)


def _add_series_native(chart, book, spec, rename) -> bool:
    """Add a series with its own x values through the native chart (Windows/macOS)."""
    add = getattr(chart, "add_series", None)  # the recording stand-in and future xlwings
    if callable(add):
        add(values=_range(book, spec.values, rename),
            x_values=_range(book, spec.categories, rename) if spec.categories else None)
        return True
    try:  # classic xlwings on Windows: chart.api is (ChartObject, Chart)
        native = chart.api[1]
        new = native.SeriesCollection().NewSeries()
        new.Values = _range(book, spec.values, rename).api
        if spec.categories:
            new.XValues = _range(book, spec.categories, rename).api
        return True
    except Exception:  # noqa: BLE001 - a platform without the native call: report it
        return False


def _validation(sheet, book, dv, rename, report) -> None:
    if dv.kind == "any":  # an input message only: xlwings sets lists, not messages
        report.skipped.append(f"{sheet.name}: input message on {dv.cells} (xlwings sets "
                              "drop-down lists only)")
        return
    target = sheet.range(dv.cells).data_validation
    try:
        source = (_range(book, dv.source, rename) if "!" in dv.source
                  else book.names[dv.source])
        target.set_list(source)
    except Exception as exc:  # noqa: BLE001 - report, do not stop the sheet
        report.skipped.append(f"{sheet.name}: drop-down list on {dv.cells} ({exc})")
        return
    if dv.prompt or dv.error:
        report.skipped.append(f"{sheet.name}: prompt and error texts of the drop-down list on "
                              f"{dv.cells} (xlwings sets the list only)")


def _defined_names(plan: WorkbookPlan, book, rename: dict, report: RenderReport) -> None:
    present = {n.name.lower() for n in book.names}
    for name, target in plan.defined_names.items():
        if name.lower() in present:
            report.skipped.append(f"defined name {name}: already in the workbook, kept")
            continue
        book.names.add(name, "=" + _renamed(target, rename))


def _range(book, reference: str, rename: dict):
    m = _SHEET_REF.match(_renamed(reference, rename))
    if not m:
        raise HeatLedgerError(f"range must look like 'Sheet'!$A$1:$A$9; got {reference!r}")
    sheet_name = m.group(1).replace("''", "'")
    return book.sheets[sheet_name].range(m.group(2).replace("$", ""))


def _renamed(text: str, rename: dict) -> str:
    for old, new in rename.items():
        text = text.replace(f"'{old.replace(chr(39), chr(39) * 2)}'!",
                            f"'{new.replace(chr(39), chr(39) * 2)}'!")
    return text


def _free_name(name: str, taken: set) -> str:
    for k in range(2, 1000):
        suffix = f" ({k})"
        candidate = name[:31 - len(suffix)] + suffix
        if candidate.lower() not in taken:
            return candidate
    raise HeatLedgerError(f"no free sheet name for {name!r}")
