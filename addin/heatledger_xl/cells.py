"""Spreadsheet cell values turned into engine inputs: numbers, whole numbers, text and
true/false, each checked with a message naming the argument and the rule.

Everything here is plain Python: no spreadsheet library is imported, so the readers serve
desktop Excel (classic xlwings), Excel on the web and macOS (the in-browser runtime) and
plain tests alike. Every rejected value raises :class:`heatledger.errors.HeatLedgerError`
with a one-line message; the function layer (:mod:`heatledger_xl.udfs`) turns it into the
text shown in the cell. Numbers written as text (``"12.5"``) are read as numbers; other
text, TRUE/FALSE, dates and spreadsheet errors (``#N/A``) in a number argument are refused.
"""

from __future__ import annotations

import datetime as _dt
import math
from numbers import Real

from heatledger.errors import HeatLedgerError

__all__ = ["ERROR_VALUES", "Required", "REQUIRED", "number", "integer", "text", "flag",
           "heat_flow_value", "describe", "is_blank", "row_is_blank", "unwrap_single"]

#: Spreadsheet error values as they arrive as text (xlwings ``err_to_str``).
ERROR_VALUES = frozenset({"#N/A", "#VALUE!", "#REF!", "#DIV/0!", "#NUM!", "#NAME?",
                          "#NULL!", "#SPILL!", "#CALC!", "#GETTING_DATA", "#FIELD!",
                          "#BLOCKED!", "#CONNECT!", "#BUSY!", "#UNKNOWN!", "#PYTHON!"})
_HEAT_FLOWS = ("up", "horizontal", "down")
_BLANK_TEXT = ""


class Required:
    """Marker for an argument that has no default."""

    __slots__ = ()

    def __repr__(self) -> str:
        return "REQUIRED"


#: The marker; kept when the module is reloaded, so functions defined before and after a
#: reload (classic xlwings reloads the function module after an upgrade) agree on it.
REQUIRED = globals().get("REQUIRED") or Required()


# --------------------------------------------------------------------------- cell values
def describe(value: object) -> str:
    """A cell value in words for a message (a number, a text, a date, an error, a range).

    Parameters
    ----------
    value : object
        A cell value. [-]
    """
    if isinstance(value, bool):
        return "TRUE" if value else "FALSE"
    if isinstance(value, (_dt.date, _dt.datetime, _dt.time)):
        return f"a date ({value.isoformat()})"
    if isinstance(value, str):
        short = value if len(value) <= 40 else value[:37] + "..."
        return repr(short)
    if isinstance(value, Real):
        try:
            return f"{float(value):g}"
        except OverflowError:
            return "a number too large for a spreadsheet"
    if isinstance(value, (list, tuple)):
        return "a range"
    return f"a {type(value).__name__}"


def is_blank(value: object) -> bool:
    """True for an empty cell or a text of spaces only.

    Parameters
    ----------
    value : object
        A cell value. [-]
    """
    if value is None:
        return True
    if isinstance(value, str):
        return value.strip() == _BLANK_TEXT
    return False


def row_is_blank(row) -> bool:
    """True when every cell of the row is blank.

    Parameters
    ----------
    row : sequence
        The cells of one row. [-]
    """
    for c in row:
        if c is not None and (type(c) is not str or c.strip()):
            return False
    return True


def unwrap_single(name: str, value: object) -> object:
    """A 1x1 range (``[[x]]`` or ``[x]``) is its cell; a larger range is rejected.

    Parameters
    ----------
    name : str
        The argument, for the message. [-]
    value : object
        A value or a one-cell range. [-]
    """
    while isinstance(value, (list, tuple)):
        if len(value) == 0:
            return None
        if len(value) != 1:
            raise HeatLedgerError(f"{name} must be a single cell; got a range of "
                                  f"{len(value)} cells")
        value = value[0]
    return value


def number(name: str, value: object, default: object = REQUIRED, *, low: float | None = None,
           high: float | None = None, low_inclusive: bool = False,
           unit: str = "") -> float:
    """A finite number from a cell, with optional bounds.

    Parameters
    ----------
    name : str
        Argument name used in messages. [-]
    value : object
        The cell value (number, numeric text, blank). [-]
    default : object
        Returned for a blank cell; :data:`REQUIRED` makes a blank an error. [-]
    low, high : float, optional
        Bounds; ``low`` is exclusive unless ``low_inclusive``; ``high`` is inclusive. [-]
    low_inclusive : bool
        Accept ``value == low``. [-]
    unit : str
        Unit shown in messages. [-]

    Returns
    -------
    float
    """
    kind = type(value)
    if kind is float or kind is int:  # the common case: a number cell (fast path)
        out = float(value) if kind is float or -2**53 < value < 2**53 else _number_slow(
            name, value, unit)
        return _bounded(name, value, out, low, high, low_inclusive, unit)
    if value is None:
        if default is REQUIRED:
            raise HeatLedgerError(f"{name} is blank; give a number{_in(unit)}")
        return default  # type: ignore[return-value]
    value = unwrap_single(name, value)
    if is_blank(value):
        if default is REQUIRED:
            raise HeatLedgerError(f"{name} is blank; give a number{_in(unit)}")
        return default  # type: ignore[return-value]
    return _bounded(name, value, _number_slow(name, value, unit), low, high, low_inclusive,
                    unit)


def _number_slow(name: str, value: object, unit: str) -> float:
    if isinstance(value, bool) or not isinstance(value, (Real, str)):
        raise HeatLedgerError(f"{name} must be a number{_in(unit)}; got {describe(value)}")
    if isinstance(value, str):
        stripped = value.strip()
        if stripped.upper() in ERROR_VALUES:
            raise HeatLedgerError(f"{name} holds the error {stripped.upper()}; "
                                  f"give a number{_in(unit)}")
        try:
            out = float(stripped)
        except ValueError:
            raise HeatLedgerError(f"{name} must be a number{_in(unit)}; got "
                                  f"{describe(value)}") from None
    else:
        try:
            out = float(value)
        except (OverflowError, ValueError):
            raise HeatLedgerError(f"{name} must be a finite number; got "
                                  f"{describe(value)}") from None
    return out


def _bounded(name: str, value: object, out: float, low, high, low_inclusive: bool,
             unit: str) -> float:
    if not math.isfinite(out):
        raise HeatLedgerError(f"{name} must be a finite number; got {describe(value)}")
    if low is not None:
        if out < low or (out == low and not low_inclusive):
            rule = "at least" if low_inclusive else "greater than"
            raise HeatLedgerError(f"{name} must be {rule} {low:g}{_u(unit)}; got {out:g}")
    if high is not None and out > high:
        raise HeatLedgerError(f"{name} must be at most {high:g}{_u(unit)}; got {out:g}")
    return out


def integer(name: str, value: object, default: object = REQUIRED, *, low: int = 1,
            high: int | None = None) -> int:
    """A whole number from a cell (``3`` or ``3.0``), with bounds ``low <= n <= high``.

    Parameters
    ----------
    name : str
        Argument name used in messages. [-]
    value : object
        The cell value. [-]
    default : object
        Returned for a blank cell; :data:`REQUIRED` makes a blank an error. [-]
    low, high : int
        Inclusive bounds. [-]
    """
    out = number(name, value, default)
    if out is default and default is not REQUIRED:
        return default  # type: ignore[return-value]
    if out != math.floor(out):
        raise HeatLedgerError(f"{name} must be a whole number; got {out:g}")
    n = int(out)
    if n < low or (high is not None and n > high):
        span = f"{low} to {high}" if high is not None else f"{low} or more"
        raise HeatLedgerError(f"{name} must be {span}; got {n}")
    return n


def text(name: str, value: object, default: object = REQUIRED) -> str:
    """Text from a cell (numbers are written as text, ``12`` -> ``"12"``).

    Parameters
    ----------
    name : str
        Argument name used in messages. [-]
    value : object
        The cell value. [-]
    default : object
        Returned for a blank cell; :data:`REQUIRED` makes a blank an error. [-]
    """
    if type(value) is str:  # the common case (fast path)
        stripped = value.strip()
        if stripped and stripped[0] != "#":
            return stripped
    value = unwrap_single(name, value)
    if is_blank(value):
        if default is REQUIRED:
            raise HeatLedgerError(f"{name} is blank; give a text")
        return default  # type: ignore[return-value]
    if isinstance(value, str):
        stripped = value.strip()
        if stripped.upper() in ERROR_VALUES:
            raise HeatLedgerError(f"{name} holds the error {stripped.upper()}; give a text")
        return stripped
    if isinstance(value, bool) or not isinstance(value, Real):
        raise HeatLedgerError(f"{name} must be a text; got {describe(value)}")
    out = _float_or_nan(value)
    if not math.isfinite(out):
        raise HeatLedgerError(f"{name} must be a text; got {describe(value)}")
    return f"{out:g}"


def flag(name: str, value: object, default: bool = False) -> bool:
    """TRUE/FALSE from a cell (also 1/0 and the texts TRUE/FALSE); blank -> ``default``.

    Parameters
    ----------
    name : str
        Argument name used in messages. [-]
    value : object
        The cell value. [-]
    default : bool
        Value of a blank cell. [-]
    """
    value = unwrap_single(name, value)
    if is_blank(value):
        return default
    if isinstance(value, bool):
        return value
    if isinstance(value, Real) and not isinstance(value, bool):
        if _float_or_nan(value) in (0.0, 1.0):
            return bool(_float_or_nan(value))
    if isinstance(value, str) and value.strip().upper() in ("TRUE", "FALSE"):
        return value.strip().upper() == "TRUE"
    raise HeatLedgerError(f"{name} must be TRUE or FALSE; got {describe(value)}")


def heat_flow_value(value: object) -> str:
    """The heat-flow direction from a cell; blank -> ``"horizontal"``.

    Parameters
    ----------
    value : object
        The cell value. [-]
    """
    if value is None:  # a blank cell, the common case
        return "horizontal"
    raw = text("heat_flow", value, "horizontal")
    out = raw.lower()
    if out not in _HEAT_FLOWS:
        raise HeatLedgerError(f"heat_flow must be one of 'up', 'horizontal', 'down'; "
                              f"got {describe(raw)}")
    return out


def _float_or_nan(value: Real) -> float:
    try:
        return float(value)
    except (OverflowError, ValueError):
        return math.nan


def _u(unit: str) -> str:
    return f" {unit}" if unit else ""


def _in(unit: str) -> str:
    return f" in {unit}" if unit else ""
