"""The functions demo workbook written with XlsxWriter, whose spilling formulas are Excel 365
dynamic arrays: they grow and shrink with their input (add a layer and the table gets a row).

openpyxl writes only legacy array formulas (a fixed range); XlsxWriter writes the dynamic
array's cell metadata (``cm`` and ``xl/metadata.xml``) as Excel does. Excel before 365 reads
the same formula as a legacy array formula over the range it had when the file was written.
Only this workbook is written so; the audit stays on openpyxl.
"""

from __future__ import annotations

import io

import xlsxwriter

from heatledger.sheet.plan import STYLES, WorkbookPlan

__all__ = ["plan_to_xlsx"]

#: Border of a "thin" style (the audit's grey box) and of a "bottom" rule, as XlsxWriter
#: format properties.
_BORDERS = {"thin": {"border": 1, "border_color": "#9AA7AE"},
            "bottom": {"bottom": 2, "bottom_color": "#2E5A6B"}}


def plan_to_xlsx(plan: WorkbookPlan, dynamic: list[tuple[str, str]]) -> bytes:
    """Write ``plan`` as .xlsx bytes with XlsxWriter; ``dynamic`` gives the dynamic-array
    formulas of the first sheet.

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook (cells, styles, widths, row heights, tab colours, defined names). [-]
    dynamic : list of tuple
        ``(range the result fills when written, formula)``; the formula stands in the
        range's top-left cell. [-]

    Returns
    -------
    bytes
    """
    plan.validate()
    buf = io.BytesIO()
    book = xlsxwriter.Workbook(buf, {"in_memory": True, "strings_to_formulas": False,
                                     "strings_to_numbers": False, "strings_to_urls": False})
    book.set_properties({"title": plan.title, "author": plan.creator,
                         "created": plan.timestamp})
    formats: dict[tuple, object] = {}
    for i, sheet in enumerate(plan.sheets):
        ws = book.add_worksheet(sheet.name)
        if sheet.tab_color:
            ws.set_tab_color(f"#{sheet.tab_color}")
        for letters, width in sheet.column_widths.items():
            ws.set_column(f"{letters}:{letters}", width)
        for row, height in sheet.row_heights.items():
            ws.set_row(row - 1, height)
        for cell in sheet.cells():
            fmt = _format(book, formats, cell.style, cell.number_format)
            _write(ws, cell, fmt)
        if i == 0:
            for ref, formula in dynamic:
                ws.write_dynamic_array_formula(ref, formula)
    for name, target in plan.defined_names.items():
        book.define_name(name, f"={target}")
    book.close()
    return buf.getvalue()


def _write(ws, cell, fmt) -> None:
    """One cell: a formula, a number, a bool, a text (always text) or a styled blank."""
    if cell.formula is not None:
        ws.write_formula(cell.ref, cell.formula, fmt)
    elif isinstance(cell.value, bool):
        ws.write_boolean(cell.ref, cell.value, fmt)
    elif isinstance(cell.value, int | float):
        ws.write_number(cell.ref, cell.value, fmt)
    elif isinstance(cell.value, str) and cell.value:
        ws.write_string(cell.ref, cell.value, fmt)
    else:
        ws.write_blank(cell.ref, None, fmt)


def _format(book, cache: dict, style_name: str, number_format: str | None):
    """The XlsxWriter format of a named plan style and a number format (one per pair)."""
    key = (style_name, number_format)
    if key not in cache:
        s = STYLES[style_name]
        props = {"bold": s.bold, "italic": s.italic, "font_size": s.size,
                 "font_color": f"#{s.color}", "font_name": "Calibri", "valign": "vcenter",
                 "text_wrap": s.wrap, "num_format": number_format or s.number_format}
        if s.fill:
            props.update(pattern=1, bg_color=f"#{s.fill}")
        if s.align:
            props["align"] = s.align
        props.update(_BORDERS.get(s.border, {}))
        cache[key] = book.add_format(props)
    return cache[key]

