"""Backend-neutral plan of a calculation workbook.

A :class:`WorkbookPlan` describes every sheet, cell, style, defined name, chart and print
setting of a workbook without knowing how it will be written. Renderers turn a plan into a
file (:mod:`heatledger.sheet.render_openpyxl`) or into sheets of a workbook open in a
spreadsheet program (the add-in's renderer). The plan is plain data so both renderers can
walk it the same way:

- a cell is addressed by its sheet name and an A1 reference (``"B7"``);
- a cell holds either a value (number, text, bool, date) or a formula, a string in the
  file's English syntax with a leading ``=`` (``"=B7/1000/C7"``);
- text values are always text: a value that begins with ``=``, ``+``, ``-`` or ``@`` is
  never a formula (renderers must guard it, see :func:`is_formula_like`);
- styles are referred to by the names in :data:`STYLES` (our own palette);
- header and footer text may contain the tokens ``{page}``, ``{pages}``, ``{sheet}`` and
  ``{date}`` which each renderer translates to its program's codes.

The plan never imports a spreadsheet library.

How a renderer walks a plan (the openpyxl renderer does exactly this; a renderer for a
workbook open in a spreadsheet program follows the same steps):

1. For each :class:`Sheet` in ``plan.sheets``: create the sheet ``sheet.name``.
2. For each :class:`Cell` in ``sheet.cells()``: at ``cell.ref`` write ``cell.formula`` as a
   formula when it is not None, else ``cell.value``. A text value for which
   :func:`is_formula_like` is true must stay text (in a live workbook, prefix it with an
   apostrophe; in a file, store it as a string). Apply ``STYLES[cell.style]`` (font, fill,
   border, alignment) and ``cell.number_format or STYLES[cell.style].number_format``.
3. ``sheet.merges`` (ranges), ``sheet.column_widths`` (characters), ``sheet.row_heights``
   (points), ``sheet.freeze`` (top-left cell of the scrolling pane), ``sheet.validations``
   (drop-down lists), ``sheet.charts`` (ranges as ``'Sheet'!$A$1:$A$9``),
   ``sheet.print_setup`` and ``sheet.row_breaks``.
4. ``plan.defined_names``: workbook-level names.

Cells are written in the order of ``sheet.cells()``; no cell is written twice
(:meth:`WorkbookPlan.validate`).
"""

from __future__ import annotations

import datetime as _dt
import functools
import re
from collections.abc import Iterable, Iterator
from dataclasses import dataclass, field

from ..errors import HeatLedgerError

__all__ = [
    "Style",
    "STYLES",
    "Cell",
    "Block",
    "ChartSeries",
    "Chart",
    "PrintSetup",
    "DataValidation",
    "Sheet",
    "WorkbookPlan",
    "col_letter",
    "col_index",
    "ref",
    "split_ref",
    "absolute",
    "sheet_ref",
    "is_formula_like",
    "text_width",
    "fit_text_columns",
    "wrapped_lines",
    "fit_wrapped_rows",
    "FIXED_TIMESTAMP",
]

#: Document timestamp written into every file so identical input gives identical bytes.
FIXED_TIMESTAMP = _dt.datetime(2000, 1, 1, 0, 0, 0)

_REF_RE = re.compile(r"^\$?([A-Z]{1,3})\$?([1-9][0-9]*)$")
_FORMULA_LIKE = ("=", "+", "-", "@")
#: Width of a column a spreadsheet gives when none is set. [characters]
DEFAULT_COLUMN_WIDTH = 8.43
#: Widest a column is made to fit its text; longer texts are cut (or wrap where styled so).
MAX_FIT_WIDTH = 60.0


# --------------------------------------------------------------------------- addresses
@functools.lru_cache(maxsize=4096)
def col_letter(index: int) -> str:
    """Column letters of a 1-based column index (1 -> ``A``, 27 -> ``AA``).

    Parameters
    ----------
    index : int
        Column number, 1 for the first column. [-]

    Returns
    -------
    str

    Examples
    --------
    >>> col_letter(1), col_letter(26), col_letter(28)
    ('A', 'Z', 'AB')
    """
    if index < 1:
        raise HeatLedgerError(f"column index must be 1 or more; got {index}")
    out = ""
    while index:
        index, rem = divmod(index - 1, 26)
        out = chr(65 + rem) + out
    return out


#: Characters no sheet name may hold: Excel's forbidden []:*?/\\ and control characters.
_SHEET_NAME_BAD = re.compile(r"[\[\]:*?/\\\x00-\x1f\x7f]")


def safe_sheet_name(text: str, used: set[str], *, reserved: Iterable[str] = ()) -> str:
    """A valid, unique sheet name made from ``text``; the name is added to ``used``.

    Forbidden characters (``[]:*?/\\`` and control characters) become spaces, runs of
    spaces one space; the name is cut to 31 characters and then loses leading and trailing
    apostrophes (a name ending in ``'`` makes a workbook that LibreOffice cannot open). A
    name already in ``used`` or ``reserved``, or Excel's own "History" (compared without
    case), gets ``~2``, ``~3``...

    Parameters
    ----------
    text : str
        The wanted name (a construction, room or fin name with its number). [-]
    used : set of str
        Lower-case names already taken; updated. [-]
    reserved : iterable of str
        Names kept for fixed sheets (``Cover``, ``Summary``...). [-]

    Examples
    --------
    >>> safe_sheet_name("07 Ground floor: slab/edge", set())
    '07 Ground floor slab edge'
    >>> safe_sheet_name("03 Roof over the old Gardeners' shed", set())  # cut at the '
    '03 Roof over the old Gardeners'
    >>> safe_sheet_name("'" * 40, set())
    'Sheet'
    """
    taken = used | {r.lower() for r in reserved} | {"history"}  # Excel keeps "History"

    def tidy(name: str) -> str:
        return name.rstrip().strip("'").rstrip()

    base = tidy(re.sub(r"\s+", " ", _SHEET_NAME_BAD.sub(" ", str(text))).strip()[:31]) \
        or "Sheet"
    name, k = base, 2
    while name.lower() in taken:
        suffix = f"~{k}"
        name = tidy(base[:31 - len(suffix)]) + suffix
        k += 1
    used.add(name.lower())
    return name


def col_index(letters: str) -> int:
    """1-based column index of column letters (``A`` -> 1).

    Parameters
    ----------
    letters : str
        Column letters, upper case. [-]

    Examples
    --------
    >>> col_index("AB")
    28
    """
    out = 0
    for ch in letters:
        out = out * 26 + (ord(ch) - 64)
    return out


def ref(row: int, col: int, *, absolute_ref: bool = False) -> str:
    """A1 reference of a 1-based row and column.

    Parameters
    ----------
    row : int
        Row number, 1 for the first row. [-]
    col : int
        Column number, 1 for column A. [-]
    absolute_ref : bool
        Write ``$B$7`` instead of ``B7``. [-]

    Examples
    --------
    >>> ref(7, 2), ref(7, 2, absolute_ref=True)
    ('B7', '$B$7')
    """
    if row < 1:
        raise HeatLedgerError(f"row must be 1 or more; got {row}")
    if absolute_ref:
        return f"${col_letter(col)}${row}"
    return f"{col_letter(col)}{row}"


@functools.lru_cache(maxsize=65536)
@functools.lru_cache(maxsize=65536)
def split_ref(a1: str) -> tuple[int, int]:
    """Row and column (1-based) of an A1 reference such as ``"B7"`` or ``"$B$7"``.

    Parameters
    ----------
    a1 : str
        The reference. [-]

    Examples
    --------
    >>> split_ref("$C$12")
    (12, 3)
    """
    m = _REF_RE.match(a1)
    if not m:
        raise HeatLedgerError(f"cell reference must look like 'B7'; got {a1!r}")
    return int(m.group(2)), col_index(m.group(1))


def absolute(a1: str) -> str:
    """``B7`` -> ``$B$7``.

    Parameters
    ----------
    a1 : str
        The reference. [-]
    """
    row, col = split_ref(a1)
    return ref(row, col, absolute_ref=True)


def sheet_ref(sheet: str, a1: str) -> str:
    """Reference to a cell or range on a named sheet, quoted: ``'EW1 wall'!$B$7``.

    Parameters
    ----------
    sheet : str
        Sheet name. [-]
    a1 : str
        Cell or range reference (``B7`` or ``B7:B9``); made absolute. [-]

    Examples
    --------
    >>> sheet_ref("Cover", "B3:B4")
    "'Cover'!$B$3:$B$4"
    """
    parts = a1.split(":")
    body = ":".join(absolute(p) for p in parts)
    quoted = sheet.replace("'", "''")
    return f"'{quoted}'!{body}"


def is_formula_like(text: object) -> bool:
    """True when ``text`` is a string a spreadsheet could take for a formula.

    Parameters
    ----------
    text : object
        A cell value. [-]

    Examples
    --------
    >>> is_formula_like("=1+1"), is_formula_like("-5 mm"), is_formula_like("wall")
    (True, True, False)
    """
    return isinstance(text, str) and text.startswith(_FORMULA_LIKE)


# --------------------------------------------------------------------------- styles
@dataclass(frozen=True)
class Style:
    """A named cell style of our own palette.

    Attributes
    ----------
    name : str
        Style name as stored in the file (``"hl input"`` ...).
    bold, italic : bool
        Font weight and slant.
    size : float
        Font size in points.
    color : str
        Font colour, ``RRGGBB``.
    fill : str or None
        Background colour, ``RRGGBB``; None for no fill.
    border : str or None
        ``"thin"`` for a thin grey box, ``"bottom"`` for a rule under the cell, None.
    align : str or None
        ``"left"``, ``"center"``, ``"right"`` or None.
    wrap : bool
        Wrap text in the cell.
    number_format : str
        Default number format of the style.
    """

    name: str
    bold: bool = False
    italic: bool = False
    size: float = 10.0
    color: str = "1F2A33"
    fill: str | None = None
    border: str | None = None
    align: str | None = None
    wrap: bool = False
    number_format: str = "General"


# Our own palette: slate text, pale sand for what the user types, pale teal for formulas,
# light grey for the engine's constants, and a pale green band for checks.
STYLES: dict[str, Style] = {
    s.name: s
    for s in (
        Style("hl title", bold=True, size=14, color="12303F"),
        Style("hl subtitle", bold=True, size=11, color="12303F", border="bottom"),
        Style("hl header", bold=True, color="FFFFFF", fill="2E5A6B", border="thin",
              align="center", wrap=True),
        Style("hl label", color="1F2A33"),
        Style("hl note", italic=True, size=9, color="5A6770", wrap=False),
        Style("hl note wrap", italic=True, size=9, color="5A6770", wrap=True),
        Style("hl input", color="3A2A00", fill="FBEFD0", border="thin"),
        Style("hl formula", color="0B3340", fill="DDEFF2", border="thin"),
        Style("hl engine", color="4A4A4A", fill="EEEEEE", border="thin"),
        Style("hl check", bold=True, color="1E5130", fill="DCEFD9", border="thin",
              align="center"),
        Style("hl text", color="1F2A33", border="thin"),
        Style("hl text wrap", color="1F2A33", border="thin", wrap=True),
        Style("hl paragraph", color="1F2A33", wrap=True),
        Style("hl warning", bold=True, color="7A1F12", wrap=True),
    )
}


# --------------------------------------------------------------------------- cells, blocks
@dataclass(slots=True)
class Cell:
    """One cell of the plan.

    Attributes
    ----------
    ref : str
        A1 reference on its sheet (``"B7"``).
    value : object
        A number, text, bool, :class:`datetime.date` or None. Text is always text.
    formula : str or None
        A formula in English syntax with a leading ``=``; when given, ``value`` is None.
    style : str
        Name of a style in :data:`STYLES`.
    number_format : str or None
        Number format overriding the style's (``"0.000"``, ``"0.00E+00"``).
    role : str
        What the cell is for: ``"input"``, ``"formula"``, ``"engine"``, ``"check"``,
        ``"label"``, ``"header"``, ``"note"``. Tests and the cover's check count use it.
    """

    ref: str
    value: object = None
    formula: str | None = None
    style: str = "hl label"
    number_format: str | None = None
    role: str = "label"

    def __post_init__(self) -> None:
        if self.formula is not None:
            if not (isinstance(self.formula, str) and self.formula.startswith("=")):
                raise HeatLedgerError(
                    f"formula of cell {self.ref} must be text starting with '='; "
                    f"got {self.formula!r}"
                )
            if self.value is not None:
                raise HeatLedgerError(f"cell {self.ref} cannot hold both a value and a formula")
        if self.style not in STYLES:
            raise HeatLedgerError(
                f"style of cell {self.ref} must be one of {', '.join(map(repr, STYLES))}; "
                f"got {self.style!r}"
            )
        split_ref(self.ref)


#: The style a cell takes from its role when none is given.
_ROLE_STYLES = {"formula": "hl formula", "input": "hl input", "engine": "hl engine",
                "check": "hl check", "header": "hl header", "note": "hl note"}


@dataclass
class Block:
    """A named group of cells on one sheet (a table, a header, a check strip).

    Attributes
    ----------
    name : str
        Identifier of the block, unique on its sheet (``"layers"``, ``"fv_nodes"``).
    cells : list of Cell
        The cells, in writing order.
    """

    name: str
    cells: list[Cell] = field(default_factory=list)

    def put(self, a1: str, value: object = None, *, formula: str | None = None,
            style: str | None = None, number_format: str | None = None,
            role: str | None = None) -> Cell:
        """Add a cell and return it.

        Parameters
        ----------
        a1 : str
            Cell reference. [-]
        value : object
            Constant value (number, text, bool, date). [-]
        formula : str, optional
            Formula with leading ``=``. [-]
        style : str, optional
            Style name; default by role (``hl formula`` for formulas, else ``hl label``). [-]
        number_format : str, optional
            Number format. [-]
        role : str, optional
            Role of the cell; default ``"formula"`` for formulas, else ``"label"``. [-]
        """
        if role is None:
            role = "formula" if formula is not None else "label"
        if style is None:
            style = _ROLE_STYLES.get(role, "hl label")
        cell = Cell(a1, value, formula, style, number_format, role)
        self.cells.append(cell)
        return cell


# --------------------------------------------------------------------------- charts, print
@dataclass(frozen=True)
class ChartSeries:
    """One data series of a chart; references are ``'Sheet'!$A$1:$A$9`` style.

    Attributes
    ----------
    title : str
        Legend text.
    values : str
        Range of the y values (scatter) or bar heights.
    categories : str or None
        Range of the x values (scatter) or bar labels.
    line : bool
        Draw a line between points (scatter only).
    marker : str or None
        ``"circle"``, ``"diamond"``, ``"square"`` or None.
    color : str or None
        ``RRGGBB``.
    """

    title: str
    values: str
    categories: str | None = None
    line: bool = True
    marker: str | None = None
    color: str | None = None


@dataclass(frozen=True)
class Chart:
    """A chart placed on a sheet.

    Attributes
    ----------
    kind : str
        ``"scatter"`` (x-y, for temperature through a construction) or ``"bar"``.
    title : str
        Chart title.
    anchor : str
        Top-left cell of the chart.
    series : tuple of ChartSeries
    x_title, y_title : str
        Axis titles with units.
    width_cm, height_cm : float
        Size on the page.
    y_format : str or None
        Number format of the value-axis labels (``"0.00"``); None leaves the renderer's
        default (the scatter charts' whole degrees, the bars' source format).
    """

    kind: str
    title: str
    anchor: str
    series: tuple[ChartSeries, ...]
    x_title: str = ""
    y_title: str = ""
    width_cm: float = 16.0
    height_cm: float = 8.0
    y_format: str | None = None

    def __post_init__(self) -> None:
        if self.kind not in ("scatter", "bar"):
            raise HeatLedgerError(f"chart kind must be one of 'scatter', 'bar'; got {self.kind!r}")


@dataclass(frozen=True)
class PrintSetup:
    """Page setup of a sheet.

    Attributes
    ----------
    orientation : str
        ``"portrait"`` or ``"landscape"``.
    paper : str
        Paper size; only ``"A4"`` is used.
    fit_width : int
        Pages across (1 = fit all columns on one page width).
    fit_height : int
        Pages down (0 = as many as needed).
    header : str
        Centre header text (tokens ``{page}``, ``{pages}``, ``{sheet}``, ``{date}``).
    footer_left, footer_right : str
        Footer texts.
    title_rows : str or None
        Rows repeated on every printed page, ``"1:4"``.
    """

    orientation: str = "portrait"
    paper: str = "A4"
    fit_width: int = 1
    fit_height: int = 0
    header: str = ""
    footer_left: str = ""
    footer_right: str = "page {page} of {pages}"
    title_rows: str | None = None


@dataclass(frozen=True)
class DataValidation:
    """A drop-down list on a range of input cells.

    Attributes
    ----------
    cells : str
        Range the rule applies to (``"C5:C200"``).
    source : str
        Either a comma-free range reference (``"'Lists'!$A$2:$A$40"``) or a defined name.
    prompt : str
        Help text shown when a cell is selected.
    error : str
        Message shown for a value not in the list.
    error_style : str
        ``"stop"`` (refuse other values) or ``"warning"`` (warn, allow).
    """

    cells: str
    source: str
    prompt: str = ""
    error: str = ""
    error_style: str = "stop"


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


def fit_text_columns(sheet: Sheet, *, cap: float = MAX_FIT_WIDTH) -> dict[str, float]:
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


def fit_wrapped_rows(sheet: Sheet) -> dict[int, float]:
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


# --------------------------------------------------------------------------- sheet, workbook
@dataclass
class Sheet:
    """One worksheet of the plan.

    Attributes
    ----------
    name : str
        Sheet name (at most 31 characters, none of ``[]:*?/\\``).
    blocks : list of Block
    merges : list of str
        Merged ranges (``"A1:F1"``), for titles and grouped headers.
    column_widths : dict
        Column letters -> width in characters.
    freeze : str or None
        Top-left cell of the scrolling area (``"A5"`` freezes rows 1-4).
    charts : list of Chart
    print_setup : PrintSetup
    validations : list of DataValidation
    tab_color : str or None
    row_heights : dict
        Row number -> height in points (header rows with wrapped text).
    row_breaks : list of int
        Rows after which a printed page ends.
    """

    name: str
    blocks: list[Block] = field(default_factory=list)
    merges: list[str] = field(default_factory=list)
    column_widths: dict[str, float] = field(default_factory=dict)
    freeze: str | None = None
    charts: list[Chart] = field(default_factory=list)
    print_setup: PrintSetup = field(default_factory=PrintSetup)
    validations: list[DataValidation] = field(default_factory=list)
    tab_color: str | None = None
    row_heights: dict[int, float] = field(default_factory=dict)
    row_breaks: list[int] = field(default_factory=list)

    def __post_init__(self) -> None:
        bad = _SHEET_NAME_BAD.search(self.name)
        if not self.name or len(self.name) > 31 or bad or self.name.startswith("'") \
                or self.name.endswith("'"):
            raise HeatLedgerError(
                "sheet name must be 1 to 31 characters without []:*?/\\ or control "
                f"characters, and must not start or end with an apostrophe; got {self.name!r}"
            )

    def block(self, name: str) -> Block:
        """Return the block called ``name``, creating it if needed.

        Parameters
        ----------
        name : str
            Block identifier. [-]
        """
        for b in self.blocks:
            if b.name == name:
                return b
        b = Block(name)
        self.blocks.append(b)
        return b

    def cells(self) -> Iterator[Cell]:
        """Every cell of the sheet, block by block."""
        for b in self.blocks:
            yield from b.cells

    def cell_map(self) -> dict[str, Cell]:
        """Cells by reference; raises if two cells share a reference."""
        out: dict[str, Cell] = {}
        for c in self.cells():
            if c.ref in out:
                raise HeatLedgerError(f"sheet {self.name!r}: cell {c.ref} is written twice")
            out[c.ref] = c
        return out


@dataclass
class WorkbookPlan:
    """The whole workbook.

    Attributes
    ----------
    title : str
        Document title (file properties).
    sheets : list of Sheet
    defined_names : dict
        Name -> reference (``"'Cover'!$C$20"``). Names are ours, start with ``hl_``.
    creator : str
        Document author (file properties).
    timestamp : datetime
        Created/modified time written into the file; fixed for reproducible bytes.
    index : dict
        Where key results are (construction name -> references), for tests and callers;
        not rendered.
    """

    title: str = ""
    sheets: list[Sheet] = field(default_factory=list)
    defined_names: dict[str, str] = field(default_factory=dict)
    creator: str = "heatledger"
    timestamp: _dt.datetime = FIXED_TIMESTAMP
    index: dict = field(default_factory=dict)

    def add_sheet(self, name: str, **kwargs) -> Sheet:
        """Append a new sheet and return it.

        Parameters
        ----------
        name : str
            Sheet name. [-]
        **kwargs
            Further :class:`Sheet` attributes. [-]
        """
        if any(s.name.lower() == name.lower() for s in self.sheets):
            raise HeatLedgerError(f"sheet name {name!r} is used twice")
        s = Sheet(name, **kwargs)
        self.sheets.append(s)
        return s

    def sheet(self, name: str) -> Sheet:
        """The sheet called ``name``.

        Parameters
        ----------
        name : str
            Sheet name. [-]
        """
        for s in self.sheets:
            if s.name == name:
                return s
        raise HeatLedgerError(
            f"sheet must be one of {', '.join(repr(s.name) for s in self.sheets)}; got {name!r}"
        )

    def cells_with_role(self, role: str) -> Iterable[tuple[str, Cell]]:
        """(sheet name, cell) for every cell with ``role``.

        Parameters
        ----------
        role : str
            Cell role (``"check"``, ``"formula"``, ...). [-]
        """
        for s in self.sheets:
            for c in s.cells():
                if c.role == role:
                    yield s.name, c

    def validate(self) -> None:
        """Raise :class:`HeatLedgerError` where a cell is written twice or a name is bad."""
        for s in self.sheets:
            s.cell_map()
        for name in self.defined_names:
            if not re.match(r"^[A-Za-z_][A-Za-z0-9_.]*$", name) or _REF_RE.match(name.upper()):
                raise HeatLedgerError(
                    f"defined name must be letters, digits, '_' or '.' and not look like a "
                    f"cell reference; got {name!r}"
                )
