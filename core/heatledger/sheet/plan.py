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
import re
from collections.abc import Iterable, Iterator
from dataclasses import dataclass, field

from ..errors import HeatLedgerError
from .addresses import (  # noqa: F401
    _FORMULA_LIKE,
    _REF_RE,
    _SHEET_NAME_BAD,
    absolute,
    col_index,
    col_letter,
    is_formula_like,
    ref,
    safe_sheet_name,
    sheet_ref,
    split_ref,
)
from .fit import (  # noqa: F401
    DEFAULT_COLUMN_WIDTH,
    MAX_FIT_WIDTH,
    fit_text_columns,
    fit_wrapped_rows,
    text_width,
    wrapped_lines,
)
from .styles import (  # noqa: F401
    STYLES,
    Style,
)

__all__ = [
    "Style",
    "STYLES",
    "Cell",
    "Block",
    "ChartSeries",
    "Chart",
    "Picture",
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
class Picture:
    """A picture (PNG) placed on a sheet, such as a temperature field.

    Attributes
    ----------
    png : bytes
        The image. [-]
    anchor : str
        Top-left cell. [-]
    width_cm, height_cm : float
        Size on the page. [cm]
    title : str
        What it shows (alternative text). [-]
    """

    png: bytes
    anchor: str
    width_cm: float
    height_cm: float
    title: str = ""


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
    scale : int or None
        Print scale in per cent; None fits ``fit_width`` pages across instead.
    title_columns : str or None
        Columns repeated at the left of every printed page, ``"A:B"``.
    """

    orientation: str = "portrait"
    paper: str = "A4"
    fit_width: int = 1
    fit_height: int = 0
    header: str = ""
    footer_left: str = ""
    footer_right: str = "page {page} of {pages}"
    title_rows: str | None = None
    scale: int | None = None
    title_columns: str | None = None


@dataclass(frozen=True)
class DataValidation:
    """A drop-down list on a range of input cells, or (``kind="any"``) an input message
    only.

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
    kind : str
        ``"list"`` (a drop-down of ``source``) or ``"any"`` (any value, the prompt shown as
        an input message).
    """

    cells: str
    source: str
    prompt: str = ""
    error: str = ""
    error_style: str = "stop"
    kind: str = "list"


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
    pictures : list of Picture
    print_setup : PrintSetup
    validations : list of DataValidation
    tab_color : str or None
    row_heights : dict
        Row number -> height in points (header rows with wrapped text).
    row_breaks : list of int
        Rows after which a printed page ends.
    col_breaks : list of int
        Columns (1-based count) after which a printed page ends.
    """

    name: str
    blocks: list[Block] = field(default_factory=list)
    merges: list[str] = field(default_factory=list)
    column_widths: dict[str, float] = field(default_factory=dict)
    freeze: str | None = None
    charts: list[Chart] = field(default_factory=list)
    pictures: list[Picture] = field(default_factory=list)
    print_setup: PrintSetup = field(default_factory=PrintSetup)
    validations: list[DataValidation] = field(default_factory=list)
    tab_color: str | None = None
    row_heights: dict[int, float] = field(default_factory=dict)
    row_breaks: list[int] = field(default_factory=list)
    col_breaks: list[int] = field(default_factory=list)

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
