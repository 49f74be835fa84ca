"""Shared readers for project-file tables: numbers, sub-tables, lists of tables, unknown keys.

Used by :mod:`heatledger.project` and the family sections (``fins/project_io.py``,
``heatloss/project_io.py``). Every reader appends ``(key path, message)`` to ``problems``
instead of raising, so a project reports all its problems at once.
"""

from __future__ import annotations

from ._validate import ABSOLUTE_ZERO, show
from .errors import HeatLedgerError
from .schema import Column, value_problem

__all__ = ["number", "text", "table", "table_list", "unknown", "required_number", "error_text",
           "ABSOLUTE_ZERO"]


def number(row, key, where, problems, *, default=None, required=False, positive=False,
           non_negative=False, above_absolute_zero=False, limit=None, unit=None, scale=1.0):
    """Read one optional or required number from a table.

    Parameters
    ----------
    row : dict
        The table; anything else reads as if the key were missing. [-]
    key : str
        The key to read. [-]
    where : str
        Key path of the table (``constructions[2]``); empty for the top level. [-]
    problems : list
        A problem is appended as ``(key path, message)``. [-]
    default : float or None
        Returned when the key is missing or empty. [-]
    required : bool
        Report a missing key as a problem. [-]
    positive : bool
        The value must be greater than zero. [-]
    non_negative : bool
        The value must not be negative. [-]
    above_absolute_zero : bool
        The value is a temperature: the same as ``limit="temperature"``. [-]
    limit : str, optional
        Key of :data:`heatledger._validate.LIMITS` the value must lie within. [-]
    unit : str, optional
        The key's unit, for the message (``"mm"``); default the limit's SI unit. [-]
    scale : float
        SI units per unit of the key (0.001 for a ``_mm`` key). [-]

    Returns
    -------
    float or None
        The value as a float, ``default`` when missing, None when it has a problem.
    """
    if above_absolute_zero:
        limit = "temperature"
    col = Column(key, key, unit or "", "number", "", required=required, limit=limit,
                 scale=scale, sign="positive" if positive else
                 "non_negative" if non_negative else "")
    value = row.get(key) if isinstance(row, dict) else None
    problem = value_problem(col, value)
    if problem is not None:
        problems.append((f"{where}.{key}" if where else key, problem))
        return None
    return default if value is None or value == "" else float(value)


def text(row, key, where, problems, *, default=""):
    """Read one optional text (a name, or a reference to a name) from a table.

    Parameters
    ----------
    row : dict
        The table; anything else reads as if the key were missing. [-]
    key : str
        The key to read. [-]
    where : str
        Key path of the table; empty for the top level. [-]
    problems : list
        A problem is appended as ``(key path, message)``. [-]
    default : str
        Returned when the key is missing. [-]

    Returns
    -------
    str or None
        The text, stripped (a whole number reads as its digits), ``default`` when missing,
        None when it is not text.
    """
    value = row.get(key) if isinstance(row, dict) else None
    if value is None:
        return default
    if isinstance(value, str):
        return value.strip()
    if isinstance(value, int) and not isinstance(value, bool):
        return str(value)
    path = f"{where}.{key}" if where else key
    problems.append((path, f"must be text (a name); got {show(value)}"))
    return None


def table(data, key, problems) -> dict:
    """Read a top-level ``[key]`` table; a missing one is empty.

    Parameters
    ----------
    data : dict
        The project data. [-]
    key : str
        The section name. [-]
    problems : list
        A problem is appended as ``(key, message)``. [-]

    Returns
    -------
    dict
        The table, or ``{}`` when missing or not a table.
    """
    value = data.get(key, {})
    if not isinstance(value, dict):
        problems.append((key, "must be a table ([" + key + "])"))
        return {}
    return value


def table_list(data, key, problems, *, where="", section=None) -> list:
    """Read a ``[[key]]`` list of tables; a missing one is empty.

    Parameters
    ----------
    data : dict
        The project data, or the table holding the list. [-]
    key : str
        The key of the list. [-]
    problems : list
        A problem is appended as ``(key path, message)``. [-]
    where : str
        Key path of ``data`` (``rooms[2]``); empty for the top level. [-]
    section : str, optional
        The list's name in TOML, for the message (``rooms.elements``); default ``key``. [-]

    Returns
    -------
    list
        The list, or ``[]`` when missing or not a list.
    """
    value = data.get(key, [])
    if not isinstance(value, list):
        path = f"{where}.{key}" if where else key
        problems.append((path, f"must be a list of tables ([[{section or key}]])"))
        return []
    return value


def unknown(row, allowed, where, problems) -> None:
    """Report every key of a table that is not allowed there.

    Parameters
    ----------
    row : dict
        The table; anything else is passed over. [-]
    allowed : sequence of str
        The keys allowed in this table, listed in the message. [-]
    where : str
        Key path of the table; empty for the top level. [-]
    problems : list
        A problem per unknown key is appended as ``(key path, message)``. [-]
    """
    if not isinstance(row, dict):
        return
    for key in row:
        if key not in allowed:
            path = f"{where}.{key}" if where else key
            problems.append((path, f"unknown key; allowed here: {', '.join(allowed)}"))


def required_number(row, key, where):
    """A required number of a table, raised as an error naming its key path when missing or
    not a number (for readers that build an engine object in one go).

    Parameters
    ----------
    row : dict
        The table. [-]
    key : str
        The key to read. [-]
    where : str
        Key path of the table. [-]

    Returns
    -------
    int or float
        The value as given.
    """
    value = row.get(key)
    if value is None:
        raise HeatLedgerError("is required", where=f"{where}.{key}")
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        kind = " (text)" if isinstance(value, str) else ""
        raise HeatLedgerError(f"must be a number; got {show(value)}{kind}",
                              where=f"{where}.{key}")
    return value


def error_text(exc: HeatLedgerError) -> str:
    """The message of ``exc`` without its key path prefix (the problem list shows the path).

    Parameters
    ----------
    exc : HeatLedgerError
        The error. [-]

    Returns
    -------
    str
    """
    text = str(exc)
    if exc.where and text.startswith(f"{exc.where}: "):
        return text[len(exc.where) + 2:]
    return text
