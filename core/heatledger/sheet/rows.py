"""The one writer of calculation-sheet rows: "label, live formula, engine value, check cell".

Every family's sheets are written with :class:`CheckRows`: a row cursor over one sheet of a
:class:`~heatledger.sheet.plan.WorkbookPlan` that puts a label, the live formula (or an
input), the engine's value as a constant and a check cell comparing the two at the sheet's
tolerance, and counts the checks it wrote. Where the columns sit is a :class:`RowLayout`;
each family keeps one layout for all its sheets.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from .plan import col_letter

__all__ = ["RowLayout", "CheckRows", "check_formula"]


@dataclass(frozen=True)
class RowLayout:
    """Columns of a value row and how headers and notes look.

    Parameters
    ----------
    label, value, engine, check, note : int
        Column numbers (1 = A) of the label, the formula or input, the engine's value, the
        check cell and the note. [-]
    default_format : str
        Number format of values when a row gives none. [-]
    note_style : str, optional
        Named style of notes (None: the note role's style). [-]
    header_height : float
        Height of a header row. [pt]
    title_merge : str
        Last column letter a section title is merged to (empty: no merge). [-]
    """

    label: int = 2
    value: int = 7
    engine: int = 11
    check: int = 12
    note: int = 14
    default_format: str = "0.0000"
    note_style: str | None = None
    header_height: float = 32.0
    title_merge: str = ""


def check_formula(formula_ref: str, engine_ref: str, tolerance_ref: str, *,
                  exact: bool = False) -> str:
    """The check cell's formula: "OK" when the live formula agrees with the engine.

    Parameters
    ----------
    formula_ref, engine_ref : str
        Cells of the live formula and of the engine's value. [-]
    tolerance_ref : str
        Cell (or number) of the relative tolerance. [-]
    exact : bool
        Compare for equality (text, whole numbers) instead of within the tolerance. [-]

    Returns
    -------
    str
        ``=IF(ABS(f-e)<=tol*MAX(1,ABS(e)),"OK","MISMATCH: differs by "&(f-e))``. [-]
    """
    if exact:
        return f'=IF({formula_ref}={engine_ref},"OK","MISMATCH: "&{formula_ref})'
    return (f'=IF(ABS({formula_ref}-{engine_ref})<={tolerance_ref}*MAX(1,ABS({engine_ref})),'
            f'"OK","MISMATCH: differs by "&({formula_ref}-{engine_ref}))')


class CheckRows:
    """Row cursor of one calculation sheet, writing checked rows and counting the checks.

    Parameters
    ----------
    sheet : Sheet
        The sheet of the plan to write. [-]
    tolerance_ref : str
        Cell holding the relative tolerance of the checks. [-]
    layout : RowLayout
        Where the columns of a value row are. [-]
    """

    def __init__(self, sheet, tolerance_ref: str, layout: RowLayout = RowLayout()) -> None:
        self.sheet = sheet
        self.tol = tolerance_ref
        self.layout = layout
        self.row = 1
        self.block = sheet.block("header")
        self.checks = 0
        self.section = 0

    def start(self, name: str, title: str | None = None) -> None:
        """Start block ``name``; with ``title``, a numbered section title on its own row.

        Parameters
        ----------
        name : str
            Name of the block (for the plan). [-]
        title : str, optional
            Section title. [-]
        """
        self.block = self.sheet.block(name)
        if not title:
            return
        self.section += 1
        self.row += 1
        self.put(self.layout.label, f"{self.section}. {title}", style="hl subtitle")
        if self.layout.title_merge:
            first = col_letter(self.layout.label)
            self.sheet.merges.append(f"{first}{self.row}:{self.layout.title_merge}{self.row}")
        self.row += 1

    def a1(self, col: int, row: int | None = None) -> str:
        """Cell address of column ``col`` in the current row (or ``row``). [-]

        Parameters
        ----------
        col : int
            Column number, 1 = A. [-]
        row : int, optional
            Row number; default the cursor's. [-]
        """
        return f"{col_letter(col)}{self.row if row is None else row}"

    def put(self, col: int, value=None, *, formula=None, style=None, fmt=None, role=None,
            row: int | None = None) -> str:
        """Put a value or formula in column ``col``; return its address.

        Parameters
        ----------
        col : int
            Column number, 1 = A. [-]
        value : object, optional
            Constant. [-]
        formula : str, optional
            Formula (starting with ``=``). [-]
        style, fmt, role : str, optional
            Named style, number format and role of the cell. [-]
        row : int, optional
            Row; default the cursor's. [-]
        """
        a1 = self.a1(col, row)
        self.block.put(a1, value, formula=formula, style=style, number_format=fmt, role=role)
        return a1

    def check(self, col: int, formula_ref: str, engine_ref: str, *, exact: bool = False,
              row: int | None = None) -> str:
        """Put a check cell comparing ``formula_ref`` with ``engine_ref``; count it.

        Parameters
        ----------
        col : int
            Column of the check cell. [-]
        formula_ref, engine_ref : str
            Cells compared. [-]
        exact : bool
            Compare for equality. [-]
        row : int, optional
            Row; default the cursor's. [-]
        """
        self.checks += 1
        return self.put(col, formula=check_formula(formula_ref, engine_ref, self.tol,
                                                   exact=exact), role="check", row=row)

    def value_row(self, label: str, *, formula=None, value=None, engine=None, fmt=None,
                  note: str = "", role=None, exact: bool = False) -> str:
        """A row: label, formula or input, the engine's value and a check (when the engine
        value is a finite number), note; return the formula's address.

        Parameters
        ----------
        label : str
            Text of the row. [-]
        formula : str, optional
            Live formula. [-]
        value : object, optional
            Input (or stated value) when there is no formula. [-]
        engine : float, optional
            The engine's value, checked against the formula. [unit of the row]
        fmt : str, optional
            Number format; default the layout's. [-]
        note : str
            Note at the end of the row. [-]
        role : str, optional
            Role of the value cell; default formula or input. [-]
        exact : bool
            Compare for equality. [-]
        """
        lay = self.layout
        fmt = fmt or lay.default_format
        self.put(lay.label, label)
        ref = self.put(lay.value, value, formula=formula, fmt=fmt,
                       role=role or ("formula" if formula else "input"))
        if engine is not None and math.isfinite(engine):
            eng = self.put(lay.engine, float(engine), role="engine", fmt=fmt)
            self.check(lay.check, ref, eng, exact=exact)
        if note:
            self.put(lay.note, note, role="note", style=lay.note_style)
        self.row += 1
        return ref

    def stated(self, label: str, value, fmt=None, note: str = "") -> str:
        """A row stating an engine value or text without a formula (nothing to check).

        Parameters
        ----------
        label : str
            Text of the row. [-]
        value : float or str or None
            The value stated. [unit of the row]
        fmt : str, optional
            Number format; default the layout's. [-]
        note : str
            Note at the end of the row. [-]
        """
        lay = self.layout
        self.put(lay.label, label)
        if isinstance(value, str) or value is None:
            ref = self.put(lay.value, "" if value is None else value, style="hl text")
        else:
            ref = self.put(lay.value, float(value) if math.isfinite(value) else str(value),
                           role="engine", fmt=fmt or lay.default_format)
        if note:
            self.put(lay.note, note, role="note", style=lay.note_style)
        self.row += 1
        return ref

    def headers(self, names, first_col: int = 1) -> None:
        """A header row of ``names`` from column ``first_col``.

        Parameters
        ----------
        names : sequence of str
            Header texts. [-]
        first_col : int
            Column of the first header. [-]
        """
        for i, name in enumerate(names):
            self.put(first_col + i, name, role="header")
        self.sheet.row_heights[self.row] = self.layout.header_height
        self.row += 1
