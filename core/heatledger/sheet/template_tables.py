"""Rows of the fill-in template's tables, shared by the template's sheet modules.

A template table is flat: a nested table of the project data (a fin's ``[fins.array]``, a
room's ``ventilation``, an element's ``edge_insulation``) is written as prefixed columns
(``array_count``, ``vent_basis``, ``edge_extent``). ``subtables`` maps such a column key to
``(table key, key inside the table)``. Reading a row back nests the columns again and notes
the cell of every key, so that a problem found later names its sheet and cell.
"""

from __future__ import annotations

__all__ = ["flatten_row", "nest_row", "note_cells"]


def flatten_row(source: dict, subtables: dict, drop: tuple = ()) -> dict:
    """Template row of one project-data table: its keys, and its sub-tables as columns.

    Parameters
    ----------
    source : dict
        One table of the project data (a fin, a room, an element). [-]
    subtables : dict
        Column key -> (table key, key inside the table). [-]
    drop : tuple of str
        Further keys that are not columns of this row (child lists written elsewhere). [-]

    Returns
    -------
    dict
        Column key -> value. [-]

    Examples
    --------
    >>> flatten_row({"name": "F1", "array": {"count": 3}}, {"array_count": ("array", "count")})
    {'name': 'F1', 'array_count': 3}
    """
    tables = {sub for sub, _key in subtables.values()}
    row = {k: v for k, v in source.items() if k not in tables and k not in drop}
    for col, (sub, key) in subtables.items():
        table = source.get(sub)
        if isinstance(table, dict) and key in table:
            row[col] = table[key]
    return row


def nest_row(row: dict, where: dict, key: str, subtables: dict, cells: dict) -> dict:
    """Project data of one template row read back, with the cell of every key noted.

    Parameters
    ----------
    row : dict
        Column key -> value of the non-blank cells. [-]
    where : dict
        Column key -> cell (``"Fins!C7"``) for every column, and ``"_row"`` -> the row's
        first cell. [-]
    key : str
        Key path of the row in the project data (``"fins[2]"``). [-]
    subtables : dict
        Column key -> (table key, key inside the table). [-]
    cells : dict
        Key path -> cell, extended in place; a whole sub-table is located at its first
        column. [-]

    Returns
    -------
    dict
        The row with its prefixed columns nested into their sub-tables. [-]
    """
    out = {k: v for k, v in row.items() if k not in subtables}
    note_cells(cells, key, where, skip=subtables)
    for col, (sub, sub_key) in subtables.items():
        if col in row:
            out.setdefault(sub, {})[sub_key] = row[col]
        if col in where:
            cells[f"{key}.{sub}.{sub_key}"] = where[col]
            cells.setdefault(f"{key}.{sub}", where[col])
    return out


def note_cells(cells: dict, key: str, where: dict, skip=()) -> None:
    """Note the cell of a row (``key``) and of each of its columns (``key.column``).

    Parameters
    ----------
    cells : dict
        Key path -> cell, extended in place. [-]
    key : str
        Key path of the row in the project data. [-]
    where : dict
        Column key -> cell, and ``"_row"`` -> the row's first cell. [-]
    skip : collection of str
        Column keys not noted under their own name (sub-table columns). [-]
    """
    cells[key] = where["_row"]
    for k, ref in where.items():
        if k != "_row" and k not in skip:
            cells[f"{key}.{k}"] = ref


def read_parents(rows, key: str, cells: dict, subtables=None) -> tuple:
    """The rows of a parent sheet (Rooms, Climates, Junctions) as project tables, and the
    tables by name for :func:`attach_children`.

    Parameters
    ----------
    rows : list
        ``(row, where)`` pairs of the sheet. [-]
    key : str
        Key of the list in the project data (``"rooms"``). [-]
    cells : dict
        Key path -> cell, extended in place. [-]
    subtables : dict, optional
        Column key -> (table key, key inside the table). [-]

    Returns
    -------
    tuple
        ``(tables, {name: (table, key path)})``.
    """
    parents, by_name = [], {}
    for i, (row, where) in enumerate(rows, 1):
        path = f"{key}[{i}]"
        parent = nest_row(row, where, path, subtables or {}, cells)
        parents.append(parent)
        by_name.setdefault(str(parent.get("name", "")).strip(), (parent, path))
    return parents, by_name


def attach_children(rows, link: str, child: str, parents: tuple, problems: list,
                    cells: dict, subtables=None) -> None:
    """Put each row of a child sheet (Elements, Climate months...) into the parent its
    ``link`` column names; a row naming no parent is a problem at that cell.

    Parameters
    ----------
    rows : list
        ``(row, where)`` pairs of the child sheet. [-]
    link : str
        Column naming the parent (``"room_name"``). [-]
    child : str
        Key of the children's list in the parent (``"elements"``). [-]
    parents : tuple
        ``(what, sheet, tables, by_name)``: the parent's kind and sheet for the message and
        the output of :func:`read_parents`. [-]
    problems : list
        ``(cell, message)`` is appended for a row naming no parent. [-]
    cells : dict
        Key path -> cell, extended in place. [-]
    subtables : dict, optional
        Column key -> (table key, key inside the table) of the child rows. [-]
    """
    what, sheet, tables, by_name = parents
    for row, where in rows:
        row = dict(row)
        owner = str(row.pop(link, "") or "").strip()
        if owner not in by_name:
            names = ", ".join(repr(t.get("name", "")) for t in tables) or "none"
            problems.append((where.get(link, where["_row"]),
                             f"{what} {owner!r} is not on the {sheet} sheet; choose one of "
                             f"{names}"))
            continue
        parent, path = by_name[owner]
        lst = parent.setdefault(child, [])
        lst.append(nest_row(row, where, f"{path}.{child}[{len(lst) + 1}]", subtables or {},
                            cells))
