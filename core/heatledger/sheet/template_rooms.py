"""Building, Rooms, Elements and Bridges sheets of the fill-in template.

The columns here are added to :data:`heatledger.sheet.template.COLUMNS`; this module turns
the project data's ``[building]`` and ``[[rooms]]`` into template rows (flattening the
ventilation and edge-insulation tables into columns) and the rows read back into the same
project data, noting the cell of every key so that a problem names its sheet and cell.
"""

from __future__ import annotations

from ..heatloss.schema import ELEMENT_TABLE, ROOM_TABLE, TABLES
from .template_tables import attach_children, flatten_row, note_cells, read_parents

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
    rooms, by_name = read_parents(tables.get("Rooms", []), "rooms", cells, _VENT)
    for room in rooms:
        room["elements"] = []
    for sheet, child in (("Elements", "elements"), ("Bridges", "thermal_bridges")):
        attach_children(tables.get(sheet, []), "room_name", child,
                        ("room", "Rooms", rooms, by_name), problems, cells,
                        _EDGE if child == "elements" else None)
    for room in rooms:
        if not room.get("thermal_bridges"):
            room.pop("thermal_bridges", None)
    if rooms:
        data["rooms"] = rooms
