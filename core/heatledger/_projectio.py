"""Shared readers for project-file tables: numbers, sub-tables, lists of tables, unknown keys.

Used by :mod:`heatledger.project` and the family sections (``fins/project_io.py``,
``heatloss/project_io.py``). Every reader appends ``(key path, message)`` to ``problems``
instead of raising, so a project reports all its problems at once.
"""

from __future__ import annotations

import math

__all__ = ["number", "table", "table_list", "unknown"]

#: Lowest temperature a temperature key may hold. [degC]
ABSOLUTE_ZERO = -273.15


def number(row, key, where, problems, *, default=None, required=False, positive=False,
           non_negative=False, above_absolute_zero=False):
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
        The value is a temperature and must be at least -273.15. [-]

    Returns
    -------
    float or None
        The value as a float, ``default`` when missing, None when it has a problem.
    """
    value = row.get(key) if isinstance(row, dict) else None
    path = f"{where}.{key}" if where else key
    if value is None or value == "":
        if required:
            problems.append((path, "is required"))
        return default
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        problems.append((path, f"must be a number; got {value!r}"))
        return None
    value = float(value)
    if not math.isfinite(value):
        problems.append((path, f"must be a finite number; got {value!r}"))
        return None
    if positive and value <= 0.0:
        problems.append((path, f"must be greater than zero; got {value:g}"))
        return None
    if non_negative and value < 0.0:
        problems.append((path, f"must not be negative; got {value:g}"))
        return None
    if above_absolute_zero and value < ABSOLUTE_ZERO:
        problems.append((path, f"must be at least {ABSOLUTE_ZERO:g} (absolute zero); "
                         f"got {value:g}"))
        return None
    return value


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
