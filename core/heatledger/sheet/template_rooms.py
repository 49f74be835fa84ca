"""Building, Rooms, Elements and Bridges sheets of the fill-in template.

The columns here are added to :data:`heatledger.sheet.template.COLUMNS`; this module turns
the project data's ``[building]`` and ``[[rooms]]`` into template rows (flattening the
ventilation and edge-insulation tables into columns) and the rows read back into the same
project data, noting the cell of every key so that a problem names its sheet and cell.
"""

from __future__ import annotations

from .template_tables import flatten_row, nest_row, note_cells

__all__ = ["ROOM_COLUMNS", "ROOM_NOTES", "ROOM_SHEETS", "room_template_rows", "read_rooms"]

#: Nested tables written as prefixed columns: column key -> (table key, key inside it).
_VENT = {f"vent_{c}": ("ventilation", k) for c, k in (
    ("basis", "basis"), ("rate", "ventilation"), ("infiltration", "infiltration"),
    ("heat_recovery", "heat_recovery"), ("minimum_air_change", "minimum_air_change"))}
_EDGE = {f"edge_{k}": ("edge_insulation", k)
         for k in ("orientation", "extent", "resistance", "thickness_mm")}

ROOM_COLUMNS = {
    "Building": (
        ("name", "Building name", "text"), ("degree_days", "Degree-days DD [K day]", "number"),
        ("degree_day_base", "DD base temperature [degC]", "number"),
        ("annual_mean_external_temperature", "Annual mean θ_m,e [degC]", "number"),
        ("groundwater", "Groundwater (deep/shallow)", "text"), ("f_g1", "f_g1 [-]", "number"),
        ("soil", "Soil type", "text"), ("soil_conductivity", "Soil λ [W/(m K)]", "number"),
        ("notes", "Notes", "text"),
    ),
    "Rooms": (
        ("name", "Room name", "text"), ("temp_inside", "θ_int [degC]", "number"),
        ("volume", "Volume [m3]", "number"), ("floor_area", "Floor area [m2]", "number"),
        ("reheat_factor", "f_RH reheat [W/m2]", "number"),
        ("vent_basis", "Ventilation basis (air_change/flow)", "text"),
        ("vent_rate", "Ventilation [1/h or m3/h]", "number"),
        ("vent_infiltration", "Infiltration [1/h or m3/h]", "number"),
        ("vent_heat_recovery", "Heat recovery η [-]", "number"),
        ("vent_minimum_air_change", "Minimum air change [1/h]", "number"),
        ("notes", "Notes", "text"),
    ),
    "Elements": (
        ("room_name", "Room", "text"), ("name", "Element name", "text"),
        ("kind", "Kind", "text"), ("method", "Method", "text"),
        ("boundary", "Boundary", "text"), ("area", "Area [m2]", "number"),
        ("construction", "Construction", "text"),
        ("thermal_bridge_allowance", "ΔU_TB [W/(m2 K)]", "number"),
        ("temp_adjacent", "θ other side [degC]", "number"),
        ("adjustment_factor", "b_u [-]", "number"), ("room", "Neighbouring room", "text"),
        ("u_value", "Declared U [W/(m2 K)]", "number"), ("u_source", "U declared by", "text"),
        ("glazing_area", "A_g [m2]", "number"), ("frame_area", "A_f [m2]", "number"),
        ("glazing_u", "U_g [W/(m2 K)]", "number"), ("frame_u", "U_f [W/(m2 K)]", "number"),
        ("glazing_perimeter", "l_g [m]", "number"), ("psi_glazing", "ψ_g [W/(m K)]", "number"),
        ("panel_area", "A_p [m2]", "number"), ("panel_u", "U_p [W/(m2 K)]", "number"),
        ("panel_perimeter", "l_p [m]", "number"), ("psi_panel", "ψ_p [W/(m K)]", "number"),
        ("exposed_perimeter", "P exposed [m]", "number"),
        ("exposed_outline", "Outline (rectilinear/any/partial)", "text"),
        ("wall_thickness_mm", "w wall [mm]", "number"),
        ("floor_resistance", "R_f declared [m2 K/W]", "number"),
        ("soil", "Soil type", "text"), ("soil_conductivity", "Soil λ [W/(m K)]", "number"),
        ("edge_orientation", "Edge insulation (horizontal/vertical)", "text"),
        ("edge_extent", "Edge D [m]", "number"), ("edge_resistance", "Edge R_n [m2 K/W]",
                                                  "number"),
        ("edge_thickness_mm", "Edge d_n [mm]", "number"),
        ("deck_resistance", "R deck declared [m2 K/W]", "number"),
        ("underfloor_height", "h underfloor [m]", "number"),
        ("underfloor_wall_u", "U_w underfloor walls [W/(m2 K)]", "number"),
        ("vent_area_per_perimeter", "ε vents [m2/m]", "number"),
        ("wind_speed", "v wind [m/s]", "number"),
        ("wind_shielding", "Wind shielding", "text"),
        ("ground_insulation_resistance", "R_g [m2 K/W]", "number"),
        ("wall_construction", "Basement wall construction", "text"),
        ("wall_resistance", "R_w declared [m2 K/W]", "number"),
        ("depth", "z basement depth [m]", "number"), ("notes", "Notes", "text"),
    ),
    "Bridges": (
        ("room_name", "Room", "text"), ("name", "Thermal bridge", "text"),
        ("psi", "ψ [W/(m K)]", "number"), ("length", "Length [m]", "number"),
        ("chi", "χ [W/K]", "number"), ("count", "Count [-]", "int"),
        ("boundary", "Boundary", "text"), ("temp_adjacent", "θ other side [degC]", "number"),
        ("adjustment_factor", "b_u [-]", "number"), ("room", "Neighbouring room", "text"),
        ("notes", "Notes", "text"),
    ),
}
ROOM_SHEETS = tuple(ROOM_COLUMNS)
ROOM_NOTES = {
    "Building": "Optional, one row: degree-days with their base temperature, and the ground "
                "data (θ_m,e, groundwater, soil) of ground elements.",
    "Rooms": "One row per heated room; θ_int blank = the design inside temperature. "
             "Ventilation basis air_change (1/h) or flow (m3/h).",
    "Elements": "One row per element, naming its room. Method: construction, declared, "
                "window, slab_on_ground, suspended_floor, heated_basement. Boundary: outside, "
                "ground, unheated, room, adjacent.",
    "Bridges": "Thermal bridges: ψ and length (linear) or χ and count (point), naming the "
               "room.",
}


def room_template_rows(data: dict) -> dict:
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


def read_rooms(tables: dict, data: dict, problems: list, cells: dict) -> None:
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
