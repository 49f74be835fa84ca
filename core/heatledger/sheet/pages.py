"""Printed pages that can be read: every sheet prints at a scale that keeps the body text at
three quarters of its size or more, and a sheet wider than that splits across pages at column
boundaries, with its label columns repeated on every page.

Why not "fit to one page width": a spreadsheet program shrinks the whole sheet until its
widest row fits, which put 4 pt text on a checker's A4 page. Here the scale is chosen first
(:data:`MIN_PRINT_SCALE`) and the page count follows from it.

The page width in column-width units (:data:`PAGE_WIDTH_CHARS`) was measured by printing
columns of known width through LibreOffice 7.4 with Carlito, the metric-compatible stand-in
for the workbook's font (Calibri), as Excel would lay them out. Where neither font is
installed, LibreOffice falls back to a wider font: the columns print wider and a sheet may
take more pages across, never smaller text.
"""

from __future__ import annotations

import math
from dataclasses import replace

from .addresses import col_letter, ref, split_ref
from .fit import DEFAULT_COLUMN_WIDTH, text_width
from .styles import STYLES

__all__ = ["MIN_PRINT_SCALE", "PAGE_WIDTH_CHARS", "CM_PER_CHAR", "paginate", "used_width",
           "contain_overflow"]

#: Smallest print scale: 10 pt body text prints at 7.3 pt, 9 pt notes at 6.6 pt, both at
#: least 65 % of the body font. [%]
MIN_PRINT_SCALE = 73
#: Printable width of A4 at 100 % (margins 0.5 in left and right), in column-width units
#: ("characters"), measured in LibreOffice 7.4 with Carlito: landscape 138, portrait 94;
#: 3 % kept spare.
PAGE_WIDTH_CHARS = {"landscape": 138.0 * 0.97, "portrait": 94.0 * 0.97}
#: Printed width of one column-width unit at 100 % (27.16 cm / 138). [cm]
CM_PER_CHAR = 27.16 / 138.0


#: Widest a label column is made to fit its texts before they wrap instead. [characters]
LABEL_COLUMN_CAP = 40.0
#: The wrapping style that stands in for an unwrapped one whose text would run off the page.
WRAPPED = {"hl note": "hl note wrap", "hl text": "hl text wrap", "hl label": "hl paragraph"}


def contain_overflow(sheet) -> int:
    """Keep every text whole and inside its printed page: wrap a text that a filled cell to
    its right would cut, wrap a text that would run on past the page edge (a spreadsheet
    prints such a run-on on pages of its own, a few words each), and cut back a merged range
    that crosses a column break. Run it after :func:`paginate` and run
    :func:`~heatledger.sheet.fit.fit_wrapped_rows` afterwards for the row heights.

    A text is merged across the empty cells to its right, up to the first filled cell or the
    page edge, and wrapped there; one with a filled neighbour wraps in its own column.

    Parameters
    ----------
    sheet : Sheet
        The sheet to adjust (styles and merges change in place). [-]

    Returns
    -------
    int
        Number of cells made to wrap. [-]
    """
    cells = sheet.cell_map()
    last = max((split_ref(r)[1] for r in cells), default=0)
    edges = sorted({*sheet.col_breaks, last})
    sheet.merges[:] = [m for m in (_cut_at_break(rng, edges) for rng in sheet.merges) if m]
    widths = [sheet.column_widths.get(col_letter(j), DEFAULT_COLUMN_WIDTH)
              for j in range(1, last + 1)]
    merged = _merged_cells(sheet.merges)
    changed = 0
    for c in cells.values():
        if c.formula is not None or not isinstance(c.value, str) or c.style not in WRAPPED:
            continue
        row, col = split_ref(c.ref)
        need = text_width(c.value, STYLES[c.style].size)
        edge = next(e for e in edges if e >= col)
        stop = next((j for j in range(col + 1, edge + 1)
                     if _filled(cells.get(ref(row, j))) or (row, j) in merged), edge + 1)
        if (row, col) in merged or need <= sum(widths[col - 1:stop - 1]):
            continue
        if stop - 1 > col and all(ref(row, j) not in cells for j in range(col + 1, stop)):
            sheet.merges.append(f"{ref(row, col)}:{ref(row, stop - 1)}")
            merged.update((row, j) for j in range(col, stop))
        c.style = WRAPPED[c.style]
        changed += 1
    return changed


def _merged_cells(merges) -> set[tuple[int, int]]:
    """(row, column) of every cell inside a merged range."""
    out = set()
    for rng in merges:
        first, _, end = rng.partition(":")
        (r1, c1), (r2, c2) = split_ref(first), split_ref(end or first)
        out.update((r, c) for r in range(r1, r2 + 1) for c in range(c1, c2 + 1))
    return out


def _filled(cell) -> bool:
    """Whether a cell shows something (a spreadsheet cuts a run-on text there)."""
    return cell is not None and (cell.formula is not None or cell.value not in (None, ""))


def _cut_at_break(rng: str, edges: list[int]) -> str | None:
    """A merged range ending at the page edge of its first column (None: one cell left)."""
    first, _, end = rng.partition(":")
    if not end:
        return rng
    (r1, c1), (r2, c2) = split_ref(first), split_ref(end)
    edge = next((e for e in edges if e >= c1), c2)
    if c2 <= edge:
        return rng
    return None if edge == c1 and r1 == r2 else f"{first}:{ref(r2, edge)}"


def used_width(sheet) -> list[float]:
    """Widths of the columns a sheet prints, from column A to the last one holding a cell,
    a merged range, a chart or a picture.

    Parameters
    ----------
    sheet : Sheet
        The sheet. [-]

    Returns
    -------
    list of float
        Width of each printed column. [characters]
    """
    last = 0
    for c in sheet.cells():
        last = max(last, split_ref(c.ref)[1])
    for rng in sheet.merges:
        last = max(last, split_ref(rng.partition(":")[2] or rng)[1])
    widths = [sheet.column_widths.get(col_letter(j), DEFAULT_COLUMN_WIDTH)
              for j in range(1, last + 1)]
    for item in [*sheet.charts, *sheet.pictures]:
        first = split_ref(item.anchor)[1]
        need = item.width_cm / CM_PER_CHAR
        j = first - 1
        while need > 0:
            while j >= len(widths):
                widths.append(sheet.column_widths.get(col_letter(len(widths) + 1),
                                                      DEFAULT_COLUMN_WIDTH))
            need -= widths[j]
            j += 1
    return widths


def paginate(sheet, *, title_columns: int = 0) -> None:
    """Choose the print scale and the column breaks of ``sheet`` (in place).

    A sheet that fits the page width at 100 % prints at 100 %; one that fits at a scale of
    :data:`MIN_PRINT_SCALE` or more prints at the largest scale that fits; a wider one prints
    at :data:`MIN_PRINT_SCALE` across several pages, with its first ``title_columns`` columns
    repeated on every page. The breaks a sheet declares (``sheet.col_breaks``, its design:
    say the sheet's own solve on one page, the engine's values and the checks on the next)
    are kept; a piece still too wide is broken after the last column that fits.

    Parameters
    ----------
    sheet : Sheet
        The sheet to set up (``print_setup`` and ``col_breaks`` are replaced). [-]
    title_columns : int
        Columns from A repeated at the left of every page of a split sheet. [-]
    """
    widths = used_width(sheet)
    page = PAGE_WIDTH_CHARS[sheet.print_setup.orientation]
    total = sum(widths)
    scale = min(100, math.floor(100.0 * page / total)) if total > 0 else 100
    setup = sheet.print_setup
    if scale >= MIN_PRINT_SCALE and not sheet.col_breaks:
        sheet.print_setup = replace(setup, scale=scale, title_columns=None)
        return
    titles = min(title_columns, len(widths) - 1)
    breaks = _breaks(widths, titles, page * 100.0 / MIN_PRINT_SCALE, sheet.col_breaks)
    cols = f"A:{col_letter(titles)}" if titles and breaks else None
    sheet.print_setup = replace(setup, scale=MIN_PRINT_SCALE, title_columns=cols)
    sheet.col_breaks = breaks


def _breaks(widths: list[float], titles: int, capacity: float, declared) -> list[int]:
    """Columns after which a page ends: the declared ones, and more where a piece between
    them is wider than ``capacity`` (the first ``titles`` columns print on every page)."""
    base = sum(widths[:titles])
    wanted = {b for b in declared if titles < b < len(widths)}
    breaks, used = [], base
    for j in range(titles, len(widths)):
        if used + widths[j] > capacity and used > base:
            breaks.append(j)
            used = base
        used += widths[j]
        if j + 1 in wanted and j + 1 < len(widths):
            breaks.append(j + 1)
            used = base
    return sorted(set(breaks))
