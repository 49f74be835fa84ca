"""Building, Rooms, Elements and Bridges sheets of the fill-in template.

The columns here are added to :data:`heatledger.sheet.template.COLUMNS`; this module turns
the project data's ``[building]`` and ``[[rooms]]`` into template rows (flattening the
ventilation and edge-insulation tables into columns) and the rows read back into the same
project data, noting the cell of every key so that a problem names its sheet and cell.
"""

from __future__ import annotations

from ..heatloss.schema import ELEMENT_TABLE, ROOM_TABLE, TABLES
from .template_tables import flatten_row, nest_row, note_cells

__all__ = ["ROOM_COLUMNS", "ROOM_NOTES", "ROOM_SHEETS", "template_rows", "read_rows"]

_VENT = ROOM_TABLE.subtables()
_EDGE = ELEMENT_TABLE.subtables()
ROOM_COLUMNS = {t.sheet: t.template_columns() for t in TABLES}
ROOM_SHEETS = tuple(ROOM_COLUMNS)
ROOM_NOTES = {t.sheet: t.note for t in TABLES}


def template_rows(data: dict) -> dict:
    """Template rows of the Building, Rooms, Elements and Bridges sheets.

    Parameters
    ----------
    data : dict
        Project data in the project-file schema. [-]

    Returns
    -------
    dict
        Sheet name -> list of row dictionaries keyed by column key. [-]
    """
    b = data.get("building")
    rooms = [r for r in data.get("rooms", []) if isinstance(r, dict)]
    out = {"Building": [dict(b)] if isinstance(b, dict) and b else [], "Rooms": [],
           "Elements": [], "Bridges": []}
    for r in rooms:
        out["Rooms"].append(flatten_row(r, _VENT, drop=("elements", "thermal_bridges")))
        for el in r.get("elements", []):
            erow = flatten_row(el, _EDGE)
            erow["room_name"] = r.get("name", "")
            out["Elements"].append(erow)
        for br in r.get("thermal_bridges", []):
            out["Bridges"].append(dict(br, room_name=r.get("name", "")))
    return out


def read_rows(tables: dict, data: dict, problems: list, cells: dict) -> None:
    """Add ``building`` and ``rooms`` read from the template's tables to ``data``.

    Parameters
    ----------
    tables : dict
        Sheet name -> list of (row, where) as read by the template reader. [-]
    data : dict
        Project data being assembled; gains ``building`` and ``rooms``. [-]
    problems : list
        Problems are appended as (cell, message). [-]
    cells : dict
        Key path -> cell, extended for every key read. [-]
    """
    building_rows = tables.get("Building", [])
    if len(building_rows) > 1:
        problems.append((building_rows[1][1]["_row"], "the Building sheet takes one row"))
    if building_rows:
        row, where = building_rows[0]
        data["building"] = dict(row)
        note_cells(cells, "building", where)
    rooms = []
    by_name: dict = {}
    for i, (row, where) in enumerate(tables.get("Rooms", []), 1):
        key = f"rooms[{i}]"
        room = nest_row(row, where, key, _VENT, cells)
        room["elements"] = []
        rooms.append(room)
        name = str(room.get("name", "")).strip()
        by_name.setdefault(name, (room, key))
    for sheet, child in (("Elements", "elements"), ("Bridges", "thermal_bridges")):
        for row, where in tables.get(sheet, []):
            row = dict(row)
            owner = str(row.pop("room_name", "") or "").strip()
            if owner not in by_name:
                choices = ", ".join(repr(r.get("name", "")) for r in rooms) or "none"
                problems.append((where.get("room_name", where["_row"]),
                                 f"room {owner!r} is not on the Rooms sheet; choose one of "
                                 f"{choices}"))
                continue
            room, key = by_name[owner]
            lst = room.setdefault(child, [])
            lst.append(nest_row(row, where, f"{key}.{child}[{len(lst) + 1}]",
                                _EDGE if child == "elements" else {}, cells))
    for room in rooms:
        if not room.get("thermal_bridges"):
            room.pop("thermal_bridges", None)
    if rooms:
        data["rooms"] = rooms
