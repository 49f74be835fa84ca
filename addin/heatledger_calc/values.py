"""Calc's argument values to the functions' Python values, and the results back.

The component inside LibreOffice calls :func:`call` with the values Calc passes through UNO:

- a range or an inline array arrives as rows of cells (tuples); an empty cell of a range is
  ``None``, a number a float, a text a str (Calc has no separate TRUE/FALSE: they are 1 and
  0). A range argument keeps its rows; any other argument given a one-cell range gets the
  cell, as xlwings gives it in Excel;
- an optional argument left out is ``None`` (the function's default), as in Excel;
- a reference to one cell arrives as the cell's value. Calc hands every add-in the number 0
  for an empty single cell (it does not tell add-ins that the cell is empty), so there an
  empty cell counts as 0, unlike Excel; leave the argument out (``;;``) or give ``""`` to
  take its default. In a range, empty cells are blank as in Excel;
- an error value in an argument (``#DIV/0!``, ``#N/A``) never reaches the function: Calc
  gives the formula that error for a single cell and ``Err:504`` for a range holding one.

Results: a number stays a number, a text a text; a table (a function that spills in Excel)
becomes rows of cells. An empty cell of a table comes back as an empty text, so that it shows
blank: Calc would show an empty element of an array result as 0 (a thickness of 0 mm for a
surface row). TRUE/FALSE are booleans, which Calc shows as 1 and 0. A function never raises:
a problem is the one-line text that starts with the function's name, exactly as the Excel
functions return it (:func:`heatledger_xl.registry.error_text`); a table function returns
that text as a one-cell table.
"""

from __future__ import annotations

from numbers import Real

__all__ = ["to_python", "to_calc", "call"]


def to_python(value: object, is_range: bool) -> object:
    """One argument as Calc passes it, as the spreadsheet function takes it.

    Parameters
    ----------
    value : object
        The UNO value: ``None``, a float, a str or rows of cells (tuples). [-]
    is_range : bool
        Whether the argument takes a 2-D range. [-]

    Examples
    --------
    >>> to_python(((1.0, None), ("a", 2.0)), True)
    [[1.0, None], ['a', 2.0]]
    >>> to_python(((20.0,),), False), to_python(5.0, True), to_python(None, True)
    (20.0, [[5.0]], None)
    """
    if isinstance(value, (tuple, list)):
        rows = [list(row) if isinstance(row, (tuple, list)) else [row] for row in value]
        if not is_range and len(rows) == 1 and len(rows[0]) == 1:
            return rows[0][0]
        return rows
    if is_range and value is not None:
        return [[value]]
    return value


def _cell(value: object) -> object:
    if value is None or isinstance(value, (bool, str)):
        return value
    if isinstance(value, Real):
        return float(value)
    return str(value)


def to_calc(out: object, spills: bool) -> object:
    """A function's result as the component returns it to Calc.

    Parameters
    ----------
    out : object
        What the spreadsheet function returned (a number, a text, or rows of cells). [-]
    spills : bool
        Whether the function returns a table (UNO ``sequence< sequence< any > >``). [-]

    Examples
    --------
    >>> to_calc([[1, "a"], [True]], True)
    ((1.0, 'a'), (True, ''))
    >>> to_calc("HL_X: bad", True), to_calc(3, False)
    ((('HL_X: bad',),), 3.0)
    """
    if not spills:
        return _cell(out)
    if not isinstance(out, list):
        return ((_cell(out),),)
    rows = [row if isinstance(row, list) else [row] for row in out] or [[None]]
    width = max(len(row) for row in rows) or 1
    return tuple(tuple("" if c is None else _cell(c) for c in row) + ("",) * (width - len(row))
                 for row in rows)


def call(name: str, args: tuple, spills: bool, registry: dict | None = None) -> object:
    """Call the spreadsheet function ``name`` with the values Calc passed; never raises.

    Parameters
    ----------
    name : str
        Function name (``HL_UVALUE``). [-]
    args : tuple
        The UNO values, one per argument of the function. [-]
    spills : bool
        Whether the extension declares the function as returning a table (the shape of
        the answer, also when the function cannot be found). [-]
    registry : dict, optional
        Name -> FunctionSpec; default the full registry. [-]

    Returns
    -------
    object
        The result for Calc (:func:`to_calc`), or the one-line text of a problem.
    """
    from heatledger_xl.registry import error_text

    try:
        if registry is None:
            import heatledger_xl.udfs  # noqa: F401 - declares every family's functions
            from heatledger_xl.registry import REGISTRY as registry
        spec = registry[name]
        values = [to_python(v, a.is_range) for v, a in zip(args, spec.args, strict=True)]
        out = spec.function(*values)
    except Exception as exc:  # noqa: BLE001 - a function never raises into the sheet
        out = error_text(name, exc)
    return to_calc(out, spills)
