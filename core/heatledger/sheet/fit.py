"""Column widths and row heights that fit the text of a sheet plan (no label cut, wrapped
notes tall enough).
"""

from __future__ import annotations

from .addresses import (
    col_letter,
    ref,
    split_ref,
)
from .styles import STYLES

__all__ = ["DEFAULT_COLUMN_WIDTH", "MAX_FIT_WIDTH", "text_width", "fit_text_columns",
           "wrapped_lines", "fit_wrapped_rows"]


#: Width of a column a spreadsheet gives when none is set. [characters]
DEFAULT_COLUMN_WIDTH = 8.43


#: Widest a column is made to fit its text; longer texts are cut (or wrap where styled so).
MAX_FIT_WIDTH = 60.0


# --------------------------------------------------------------------------- column widths
def text_width(text: str, size: float = 10.0) -> float:
    """Column width that shows ``text`` whole in a font of ``size`` points.

    Parameters
    ----------
    text : str
        The text of the cell. [-]
    size : float
        Font size. [pt]

    Returns
    -------
    float
        Width in characters of the default font (the unit of column widths), with a
        margin of 1.5 characters for the cell padding and wider fallback fonts.

    Examples
    --------
    >>> text_width("Heat flow")
    10.5
    """
    return round(len(text) * size / 10.0 + 1.5, 1)


def fit_text_columns(sheet, *, cap: float = MAX_FIT_WIDTH) -> dict[str, float]:
    """Widen the columns of ``sheet`` whose text a filled cell to its right would cut.

    A spreadsheet lets text run on into empty cells to its right but cuts it at the first
    filled one. For every unwrapped, unmerged text cell whose right-hand neighbour holds a
    value or formula, the column is made at least :func:`text_width` of the text, up to
    ``cap``. Widths are only ever increased.

    Parameters
    ----------
    sheet : Sheet
        The sheet to adjust (its ``column_widths`` are updated in place). [-]
    cap : float
        Widest a column is made. [characters]

    Returns
    -------
    dict
        Column letters -> new width, for the columns that were widened. [-]
    """
    cells = sheet.cell_map()
    merged: set[tuple[int, int]] = set()
    for rng in sheet.merges:
        first, _, last = rng.partition(":")
        r1, c1 = split_ref(first)
        r2, c2 = split_ref(last or first)
        merged.update((r, c) for r in range(r1, r2 + 1) for c in range(c1, c2 + 1))
    need: dict[str, float] = {}
    for c in cells.values():
        if c.formula is not None or not isinstance(c.value, str) or not c.value:
            continue
        style = STYLES[c.style]
        row, col = split_ref(c.ref)
        if style.wrap or (row, col) in merged:
            continue
        right = cells.get(ref(row, col + 1))
        if right is None or (right.formula is None and right.value in (None, "")):
            continue
        letters = col_letter(col)
        need[letters] = max(need.get(letters, 0.0), min(cap, text_width(c.value, style.size)))
    widened = {}
    for letters, width in need.items():
        if sheet.column_widths.get(letters, DEFAULT_COLUMN_WIDTH) < width:
            sheet.column_widths[letters] = width
            widened[letters] = width
    return widened


def wrapped_lines(text: str, width: float, size: float = 10.0, *, bold: bool = False) -> int:
    """Number of lines ``text`` takes when wrapped at word boundaries in ``width``.

    Parameters
    ----------
    text : str
        The text; explicit line breaks start new lines. [-]
    width : float
        Width of the cell (or merged range). [characters]
    size : float
        Font size. [pt]
    bold : bool
        Bold text, about an eighth wider. [-]

    Returns
    -------
    int

    Examples
    --------
    >>> wrapped_lines("U, 2 s.f. [W/(m2 K)]", 12.0, bold=True)
    2
    """
    # running text is narrower than the digit '0' that sets the unit: about 0.8 of it for a
    # 10 pt regular font and 0.9 for bold (measured on our cover in LibreOffice and Excel)
    per_char = size / 10.0 * (0.9 if bold else 0.8)
    capacity = max(1, int((width - 1.0) / per_char))
    lines = 0
    for para in str(text).split("\n"):
        used = -1
        lines += 1
        for word in para.split():
            n = len(word)
            if used >= 0 and used + 1 + n <= capacity:
                used += 1 + n
                continue
            if used >= 0:
                lines += 1  # the word starts a new line
            full, rest = divmod(n, capacity)  # a word longer than a line breaks inside
            if rest:
                lines, used = lines + full, rest
            else:
                lines, used = lines + full - 1, capacity
    return lines


def fit_wrapped_rows(sheet) -> dict[int, float]:
    """Make rows tall enough for the text of their wrapped cells (headers, paragraphs).

    Heights are only ever increased: ``13.5 pt`` per line of a 10 pt font plus 2 pt.

    Parameters
    ----------
    sheet : Sheet
        The sheet to adjust (its ``row_heights`` are updated in place). [-]

    Returns
    -------
    dict
        Row number -> new height, for the rows that were made taller. [pt]
    """
    spans: dict[tuple[int, int], tuple[int, int, int]] = {}
    for rng in sheet.merges:
        first, _, last = rng.partition(":")
        r1, c1 = split_ref(first)
        r2, c2 = split_ref(last or first)
        spans[(r1, c1)] = (c2, r2 - r1 + 1, c1)
    need: dict[int, float] = {}
    for c in sheet.cells():
        style = STYLES[c.style]
        if not style.wrap or c.formula is not None or not isinstance(c.value, str):
            continue
        row, col = split_ref(c.ref)
        last_col, n_rows, _ = spans.get((row, col), (col, 1, col))
        width = sum(sheet.column_widths.get(col_letter(j), DEFAULT_COLUMN_WIDTH)
                    for j in range(col, last_col + 1))
        lines = wrapped_lines(c.value, width, style.size, bold=style.bold)
        height = (13.5 * style.size / 10.0 * lines + 2.0) / n_rows
        if lines > 1 and height > need.get(row, 0.0):
            need[row] = height
    taller = {}
    for row, height in need.items():
        if sheet.row_heights.get(row, 15.0) < height:
            sheet.row_heights[row] = round(height, 1)
            taller[row] = round(height, 1)
    return taller
