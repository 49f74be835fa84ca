"""One registry of the add-in's spreadsheet functions, shared by every engine family.

A function is declared once with :func:`udf`: its Excel name (the Python name, capitals,
prefix :data:`PREFIX`), its family (``"constructions"``, later ``"fins"``, ``"heat loss"``),
a short description and one description per argument. :func:`udf`

1. wraps the function so that it never raises into the spreadsheet: a
   :class:`~heatledger.errors.HeatLedgerError` becomes the one-line text
   ``"HL_UVALUE: layers row 3 thickness_mm must be greater than 0 mm; got -5"``, any other
   exception a one-line text that says it is unexpected; on the Office.js hosts
   (:data:`ERROR_VALUES`) the cell shows ``#VALUE!`` instead and :func:`message_of` (the
   function ``HL_MESSAGE``) gives the text;
2. applies xlwings' own ``func``, ``arg`` and ``ret`` decorators (imported from
   ``xlwings``, so the same module serves classic xlwings on Windows, xlwings Lite in the
   browser and xlwings Server), giving every argument its description and conversion
   options (``ndim=2`` for ranges, ``err_to_str=True`` so error cells arrive as text);
3. records a :class:`FunctionSpec` in :data:`REGISTRY` (tests check names, lengths of
   descriptions, argument order). Declaring a function again from the same module (the
   module was reloaded: classic xlwings reloads a function module whose file changed while
   Excel's Python runs) replaces its entry; the same name from another module is an error.

The wrapper also refuses to return a number that is not finite (NaN or an infinity), or a
spilled array holding one: the cell shows a one-line text instead.

A later family adds its functions by writing them in its own module with the same
decorator and importing that module from :mod:`heatledger_xl.udfs`.
"""

from __future__ import annotations

import functools
import inspect
import math
import re
from dataclasses import dataclass

import xlwings
from xlwings import arg as xl_arg
from xlwings import func as xl_func
from xlwings import ret as xl_ret

from heatledger._validate import show
from heatledger.errors import HeatLedgerError

__all__ = [
    "PREFIX",
    "MAX_DESCRIPTION",
    "ArgSpec",
    "FunctionSpec",
    "REGISTRY",
    "udf",
    "looks_like_cell_reference",
    "error_text",
    "message_of",
    "ERROR_VALUES",
    "ERROR_VALUE",
    "MESSAGE_FUNCTION",
]

#: Common prefix of every function name.
PREFIX = "HL_"
#: Longest description the spreadsheet's function dialog shows (function and argument).
MAX_DESCRIPTION = 255
#: Category of the functions in the classic Excel function dialog.
CATEGORY = "heatledger"
#: Whether a problem is returned as an Excel error value (``#VALUE!``, which ``IFERROR``
#: catches) instead of its one-line text: on the Office.js hosts (xlwings Server and xlwings
#: Lite: Excel on the web, macOS, Windows), where xlwings turns the text ``#VALUE!`` into a
#: real error. Classic xlwings (COM) and LibreOffice Calc show the text. The text is always
#: available from :func:`message_of` (the spreadsheet function ``HL_MESSAGE``).
ERROR_VALUES = bool(getattr(xlwings, "on_server", False))
#: The error value a problem shows on the hosts that have error values.
ERROR_VALUE = "#VALUE!"

_A1 = re.compile(r"^\$?[A-Z]{1,3}\$?[0-9]+$", re.IGNORECASE)
_R1C1 = re.compile(r"^R(\[?-?[0-9]*\]?)C(\[?-?[0-9]*\]?)$|^[RC]\[?-?[0-9]*\]?$",
                   re.IGNORECASE)
_NAME = re.compile(r"^[A-Z][A-Z0-9_]*$")


@dataclass(frozen=True)
class ArgSpec:
    """One argument of a spreadsheet function.

    Attributes
    ----------
    name : str
        Python and spreadsheet name of the argument.
    doc : str
        Description shown in the function dialog (unit in brackets at the end).
    optional : bool
        Whether the argument may be left out (optional arguments come last).
    is_range : bool
        Whether the argument takes a 2-D range.
    """

    name: str
    doc: str
    optional: bool
    is_range: bool


@dataclass(frozen=True)
class FunctionSpec:
    """One spreadsheet function of the registry.

    Attributes
    ----------
    name : str
        Spreadsheet name (``HL_UVALUE``).
    family : str
        Engine family (``"constructions"``).
    description : str
        Function description (the docstring) shown in the function dialog.
    args : tuple of ArgSpec
    returns : str
        What the function returns, with unit.
    spills : bool
        Whether the result is a 2-D array that spills.
    function : callable
        The decorated function.
    core : callable or None
        The function as written, before the guard (it may raise). [-]
    """

    name: str
    family: str
    description: str
    args: tuple
    returns: str
    spills: bool
    function: object
    core: object = None


#: Every registered function, by spreadsheet name, in declaration order.
REGISTRY: dict[str, FunctionSpec] = {}


def looks_like_cell_reference(name: str) -> bool:
    """True when ``name`` could be read as an A1 or R1C1 cell reference.

    Parameters
    ----------
    name : str
        A function name. [-]

    Examples
    --------
    >>> looks_like_cell_reference("HL1"), looks_like_cell_reference("R2C3")
    (True, True)
    >>> looks_like_cell_reference("HL_UVALUE")
    False
    """
    return bool(_A1.match(name) or _R1C1.match(name))


def error_text(function_name: str, exc: BaseException) -> str:
    """The one-line text a function returns instead of raising.

    Parameters
    ----------
    function_name : str
        Spreadsheet name of the function. [-]
    exc : BaseException
        The exception caught. [-]

    Examples
    --------
    >>> error_text("HL_X", HeatLedgerError("temp_inside is blank"))
    'HL_X: temp_inside is blank'
    """
    if isinstance(exc, HeatLedgerError):
        body = str(exc)
    else:
        body = (f"unexpected problem ({type(exc).__name__}: {exc}); please report it with "
                "the arguments used")
    line = " ".join(f"{function_name}: {body}".split())
    return line if len(line) <= 250 else line[:247] + "..."


def udf(family: str, *, returns: str, args: dict[str, str], ranges: tuple[str, ...] = (),
        spills: bool = False):
    """Declare a spreadsheet function (see the module docstring).

    Parameters
    ----------
    family : str
        Engine family the function belongs to. [-]
    returns : str
        What the function returns, with its unit. [-]
    args : dict
        Argument name -> description, for every argument, in signature order. [-]
    ranges : tuple of str
        Arguments that take a 2-D range. [-]
    spills : bool
        Whether the result is a 2-D array. [-]

    Returns
    -------
    callable
        A decorator.
    """

    def decorate(fn):
        name = fn.__name__
        _check_name(name)
        sig = inspect.signature(fn)
        params = list(sig.parameters.values())
        if [p.name for p in params] != list(args):
            raise HeatLedgerError(f"{name}: argument descriptions {list(args)} do not match "
                                  f"the signature {[p.name for p in params]}")
        specs = []
        seen_optional = False
        for p in params:
            optional = p.default is not inspect.Parameter.empty
            if seen_optional and not optional:
                raise HeatLedgerError(f"{name}: optional arguments must come last")
            seen_optional = seen_optional or optional
            specs.append(ArgSpec(p.name, args[p.name], optional, p.name in ranges))
        description = " ".join((fn.__doc__ or "").split())

        arg_names = ", ".join(spec.name for spec in specs)

        @functools.wraps(fn)
        def guarded(*a, **k):
            text = None
            try:
                out = fn(*a, **k)
            except Exception as exc:  # noqa: BLE001 - never raise into the spreadsheet
                text = error_text(name, exc)
            else:
                if isinstance(out, float) and not math.isfinite(out) or (
                        type(out) is list and not _all_finite(out)):
                    text = error_text(name, HeatLedgerError(
                        f"no finite result for these arguments ({arg_names}); please report "
                        "it with the arguments used"))
            if text is None:
                return out
            return ERROR_VALUE if ERROR_VALUES and name != MESSAGE_FUNCTION else text

        guarded.__doc__ = description
        decorated = guarded
        for spec in reversed(specs):
            options = {"ndim": 2} if spec.is_range else {}
            decorated = xl_arg(spec.name, doc=spec.doc, err_to_str=True, **options)(decorated)
        decorated = xl_ret()(decorated)
        decorated = xl_func(category=CATEGORY)(decorated)
        old = REGISTRY.get(name)
        if old is not None and _origin(old.function) != _origin(fn):
            raise HeatLedgerError(f"function {name} is declared in {old.function.__module__} "
                                  f"and again in {fn.__module__}")
        REGISTRY[name] = FunctionSpec(name, family, description, tuple(specs), returns,
                                      spills, decorated, fn)
        return decorated

    return decorate


#: The companion function that gives the text of a problem.
MESSAGE_FUNCTION = "HL_MESSAGE"


def message_of(function_name: str, values: list) -> str:
    """The one-line text of the problem a function has with ``values``, or a line saying
    there is none (the spreadsheet function ``HL_MESSAGE``).

    Parameters
    ----------
    function_name : str
        Spreadsheet name of the function (``"HL_UVALUE"``). [-]
    values : list
        Its arguments in order, each as a 2-D list of cell values (a range or one cell);
        a trailing blank argument is left out. [-]

    Returns
    -------
    str
    """
    spec = REGISTRY.get(str(function_name or "").strip().upper())
    if spec is None or spec.name == MESSAGE_FUNCTION:
        return (f"{MESSAGE_FUNCTION}: no function {show(function_name)}; give the name of a "
                "heatledger function in quotes, such as \"HL_UVALUE\"")
    while values and _blank(values[-1]):
        values = values[:-1]
    if len(values) > len(spec.args):
        n = len(spec.args)
        return f"{spec.name}: takes {n} argument{'' if n == 1 else 's'}; got {len(values)}"
    args = [v if a.is_range else _single(v) for a, v in zip(spec.args, values, strict=False)]
    try:
        out = spec.core(*args)
    except Exception as exc:  # noqa: BLE001 - the message is the answer
        return error_text(spec.name, exc)
    if isinstance(out, float) and not math.isfinite(out) or (
            type(out) is list and not _all_finite(out)):
        return f"{spec.name}: no finite result for these arguments; please report it"
    return f"{spec.name}: no problem with these arguments"


def _blank(value) -> bool:
    """Whether an argument is empty (left out, or one blank cell)."""
    return value is None or value == [[None]] or value == [[""]]


def _single(value):
    """The value of a one-cell argument given as a 2-D list (a larger range is kept whole,
    so that the function itself names the problem)."""
    if type(value) is list and len(value) == 1 and type(value[0]) is list \
            and len(value[0]) == 1:
        return value[0][0]
    return value


def _origin(fn) -> tuple:
    """Module and qualified name of a (decorated) function: equal for the same function
    declared again by a reload of its module."""
    fn = inspect.unwrap(fn)
    return fn.__module__, fn.__qualname__


def _all_finite(rows: list) -> bool:
    """True when no cell of a spilled result is a non-finite float."""
    for row in rows:
        for cell in row if type(row) is list else (row,):
            if isinstance(cell, float) and not math.isfinite(cell):
                return False
    return True


def _check_name(name: str) -> None:
    if not (name.startswith(PREFIX) and _NAME.match(name)):
        raise HeatLedgerError(f"function name {name!r} must be capitals, digits and '_' "
                              f"and start with {PREFIX!r}")
    if looks_like_cell_reference(name):
        raise HeatLedgerError(f"function name {name!r} looks like a cell reference")
