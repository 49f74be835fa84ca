"""Input schema of the heat-loss family: ``[building]``, ``[[rooms]]`` with their
``ventilation``, ``[[rooms.elements]]`` (with ``edge_insulation``) and
``[[rooms.thermal_bridges]]``, declared once (see :mod:`heatledger.schema`).
"""

from __future__ import annotations

from ..ground.soil import EXPOSED_OUTLINES, SOIL_TYPES, WIND_SHIELDING_FACTORS
from ..schema import Column, Table
from ..windows import PERIMETER_SHAPES
from .elements import ELEMENT_KINDS

__all__ = ["BUILDING_TABLE", "ROOM_TABLE", "ELEMENT_TABLE", "BRIDGE_TABLE", "TABLES",
           "FUNCTION_ELEMENT_TABLE",
           "ELEMENT_METHOD_NAMES", "BOUNDARIES", "GROUND_METHODS"]

#: How an element's U-value is found.
ELEMENT_METHOD_NAMES = ("construction", "declared", "window", "slab_on_ground",
                        "suspended_floor", "heated_basement")
GROUND_METHODS = ("slab_on_ground", "suspended_floor", "heated_basement")
#: Boundaries an element or thermal bridge may face.
BOUNDARIES = ("outside", "ground", "unheated", "room", "adjacent")
_SOILS = tuple(SOIL_TYPES)
_G = GROUND_METHODS
_CG = ("construction",) + GROUND_METHODS
_W, _SL, _SU, _HB = ("window",), ("slab_on_ground",), ("suspended_floor",), ("heated_basement",)


def _boundary_columns(what: str) -> tuple:
    return (
        Column("boundary", "Boundary", "", "text", "what is on the other side",
               choices=BOUNDARIES, default="outside"),
        Column("temp_adjacent", "θ other side", "degC", "number",
               f"temperature on the other side of the {what} (adjacent or unheated)",
               limit="temperature"),
        Column("adjustment_factor", "b_u", "-", "number",
               "temperature adjustment factor instead of a temperature (unheated)"),
        Column("room", "Neighbouring room", "", "text",
               "neighbouring room of the building (boundary room)"),
    )


BUILDING_TABLE = Table(
    key="building", many=False, title="building-wide data: degree-days and ground",
    sheet="Building",
    note="Optional, one row, for the heat loss: the degree-days with their base "
         "temperature, and the ground data (θ_m,e, groundwater, soil) of ground elements.",
    columns=(
        Column("name", "Building name", "", "text", "building name"),
        Column("degree_days", "Degree-days DD", "K day", "number",
               "heating degree-days for the annual energy", limit="degree_days"),
        Column("degree_day_base", "DD base temperature", "degC", "number",
               "base temperature of the degree-days", limit="temperature"),
        Column("temp_outside_annual_mean", "Annual mean θ_m,e", "degC", "number",
               "annual mean outside temperature (ground losses)", limit="temperature"),
        Column("groundwater", "Groundwater (deep/shallow)", "", "text",
               "groundwater depth (EN 12831-1 G_w)", choices=("deep", "shallow"),
               default="deep"),
        Column("f_g1", "f_g1", "-", "number",
               "correction for the annual swing of the outside temperature (EN 12831-1)"),
        Column("soil", "Soil type", "", "text", "soil type of ground elements (EN ISO 13370 "
               "Table 7)", choices=_SOILS),
        Column("soil_conductivity", "Soil λ", "W/(m K)", "number",
               "soil conductivity instead of the soil type", limit="conductivity",
               sign="positive"),
        Column("notes", "Notes", "", "text", "free text"),
    ),
)

ROOM_TABLE = Table(
    key="rooms", title="a heated room", sheet="Rooms", extra=("elements", "thermal_bridges"),
    note="One row per heated room with its volume and ventilation; a blank θ_int takes the "
         "design inside temperature from the Project sheet. Ventilation basis air_change "
         "(1/h) or flow (m3/h).",
    columns=(
        Column("name", "Room name", "", "text", "room name, unique in the building",
               required=True),
        Column("temp_inside", "θ_int", "degC", "number",
               "inside design temperature; blank = [design] temp_inside", limit="temperature"),
        Column("volume", "Volume", "m3", "number", "internal air volume", required=True,
               limit="volume", sign="positive"),
        Column("floor_area", "Floor area", "m2", "number",
               "floor area (reheat and room-height check)", default=0.0, limit="area",
               sign="non_negative"),
        Column("reheat_factor", "f_RH reheat", "W/m2", "number",
               "heating-up allowance per m2 of floor", default=0.0, limit="area_load",
               sign="non_negative"),
        Column("basis", "Ventilation basis (air_change/flow)", "", "text",
               "how ventilation is given: air changes (1/h) or a flow (m3/h)",
               choices=("air_change", "flow"), default="air_change", sub="ventilation",
               column="vent_basis"),
        Column("ventilation_rate", "Ventilation", "1/h or m3/h", "number",
               "design or mechanical ventilation", default=0.0, sub="ventilation",
               column="vent_rate", sign="non_negative"),
        Column("infiltration", "Infiltration", "1/h or m3/h", "number", "infiltration",
               default=0.0, sub="ventilation", column="vent_infiltration",
               sign="non_negative"),
        Column("heat_recovery", "Heat recovery η", "-", "number",
               "heat-recovery efficiency of the ventilation", default=0.0, sub="ventilation",
               column="vent_heat_recovery", sign="non_negative"),
        Column("minimum_air_change", "Minimum air change", "1/h", "number",
               "minimum air change of the room", default=0.0, sub="ventilation",
               column="vent_minimum_air_change", sign="non_negative"),
        Column("notes", "Notes", "", "text", "free text"),
    ),
)

ELEMENT_TABLE = Table(
    key="rooms.elements", title="a wall, window, roof or floor of a room", sheet="Elements",
    variant_key="method",
    note="One row per wall, window, roof or floor, naming its room. The method says how "
         "its U is found (construction, declared, window, slab_on_ground, suspended_floor, "
         "heated_basement) and the boundary what lies beyond it (outside, ground, "
         "unheated, room, adjacent); fill in the columns that method and boundary name.",
    columns=(
        Column("room_name", "Room", "", "text", "the room the element belongs to",
               place="sheet"),
        Column("name", "Element name", "", "text", "element name"),
        Column("kind", "Kind", "", "text", "what the element is", choices=ELEMENT_KINDS),
        Column("method", "Method", "", "text", "how its U-value is found",
               choices=ELEMENT_METHOD_NAMES, required=True),
        *_boundary_columns("element")[:1],
        Column("area", "Area", "m2", "number", "area of the element", limit="area",
               sign="positive"),
        Column("construction", "Construction", "", "text",
               "project construction giving U (the floor build-up for ground methods)",
               variants=_CG),
        Column("thermal_bridge_allowance", "ΔU_TB", "W/(m2 K)", "number",
               "allowance for thermal bridges added to U", default=0.0,
               sign="non_negative"),
        *_boundary_columns("element")[1:],
        Column("u_value", "Declared U", "W/(m2 K)", "number", "declared U-value",
               limit="u_value", sign="positive", variants=("declared",)),
        Column("u_source", "U declared by", "", "text",
               "who declares the U-value (manufacturer, certificate)", variants=("declared",)),
        Column("glazing_area", "A_g", "m2", "number", "glazed area", limit="area",
               sign="non_negative", variants=_W),
        Column("frame_area", "A_f", "m2", "number", "frame area", limit="area",
               sign="non_negative", variants=_W),
        Column("glazing_u", "U_g", "W/(m2 K)", "number", "U of the glazing", limit="u_value",
               variants=_W),
        Column("frame_u", "U_f", "W/(m2 K)", "number", "U of the frame", limit="u_value",
               variants=_W),
        Column("glazing_perimeter", "l_g", "m", "number", "visible perimeter of the glazing",
               limit="length", variants=_W),
        Column("psi_glazing", "ψ_g", "W/(m K)", "number",
               "linear transmittance of the glazing edge", limit="psi", variants=_W),
        Column("panel_area", "A_p", "m2", "number", "opaque panel area", default=0.0,
               limit="area", sign="non_negative", variants=_W),
        Column("panel_u", "U_p", "W/(m2 K)", "number", "U of the panel", default=0.0,
               limit="u_value", sign="non_negative", variants=_W),
        Column("panel_perimeter", "l_p", "m", "number", "visible perimeter of the panel",
               default=0.0, limit="length", sign="non_negative", variants=_W),
        Column("psi_panel", "ψ_p", "W/(m K)", "number",
               "linear transmittance of the panel edge", default=0.0, limit="psi",
               variants=_W),
        Column("glazing_shape", "Glazing shape", "", "text",
               "shape check of the glazing perimeter", choices=PERIMETER_SHAPES,
               default="rectilinear", variants=_W, place="file"),
        Column("exposed_perimeter", "P exposed", "m", "number",
               "exposed perimeter of the floor", required=True, limit="perimeter",
               sign="positive", variants=_G),
        Column("exposed_outline", "Outline (rectilinear/any/partial)", "", "text",
               "how the exposed perimeter was checked", choices=EXPOSED_OUTLINES,
               default="rectilinear", variants=_G),
        Column("wall_thickness_mm", "w wall", "mm", "number",
               "thickness of the surrounding walls", required=True, limit="wall_thickness",
               scale=1e-3, sign="non_negative", variants=_G),
        Column("floor_resistance", "R_f declared", "m2 K/W", "number",
               "declared floor resistance instead of a construction", limit="resistance",
               variants=_SL + _HB),
        Column("soil", "Soil type", "", "text", "soil type; blank = the building's",
               choices=_SOILS, variants=_G),
        Column("soil_conductivity", "Soil λ", "W/(m K)", "number",
               "soil conductivity instead of the soil type", limit="conductivity",
               sign="positive", variants=_G),
        Column("orientation", "Edge insulation (horizontal/vertical)", "", "text",
               "edge insulation horizontal or vertical", choices=("horizontal", "vertical"),
               sub="edge_insulation", column="edge_orientation", variants=_SL),
        Column("extent", "Edge D", "m", "number", "width or depth of the edge insulation",
               limit="length", sign="positive", sub="edge_insulation", column="edge_extent",
               variants=_SL),
        Column("resistance", "Edge R_n", "m2 K/W", "number",
               "resistance of the edge insulation", limit="resistance", sign="non_negative",
               sub="edge_insulation", column="edge_resistance", variants=_SL),
        Column("thickness_mm", "Edge d_n", "mm", "number",
               "thickness of the edge insulation", limit="thickness", scale=1e-3,
               sign="positive", sub="edge_insulation", column="edge_thickness_mm",
               variants=_SL),
        Column("deck_resistance", "R deck declared", "m2 K/W", "number",
               "declared deck resistance instead of a construction", limit="resistance",
               variants=_SU),
        Column("underfloor_height", "h underfloor", "m", "number",
               "height of the underfloor space above ground", limit="length", variants=_SU),
        Column("underfloor_wall_u", "U_w underfloor walls", "W/(m2 K)", "number",
               "U of the underfloor space walls", limit="u_value", variants=_SU),
        Column("vent_area_per_perimeter", "ε vents", "m2/m", "number",
               "ventilation openings per m of perimeter", limit="length", variants=_SU),
        Column("wind_speed", "v wind", "m/s", "number", "mean wind speed at 10 m height",
               limit="wind_speed", variants=_SU),
        Column("wind_shielding", "Wind shielding", "", "text", "wind shielding of the site",
               choices=tuple(WIND_SHIELDING_FACTORS), variants=_SU),
        Column("ground_insulation_resistance", "R_g", "m2 K/W", "number",
               "insulation on the ground of the underfloor space", limit="resistance",
               variants=_SU),
        Column("wall_construction", "Basement wall construction", "", "text",
               "project construction of the basement walls", variants=_HB),
        Column("wall_resistance", "R_w declared", "m2 K/W", "number",
               "declared basement wall resistance instead of a construction",
               limit="resistance", variants=_HB),
        Column("depth", "z basement depth", "m", "number",
               "depth of the basement floor below ground", limit="length", sign="positive",
               variants=_HB),
        Column("notes", "Notes", "", "text", "free text"),
    ),
)

BRIDGE_TABLE = Table(
    key="rooms.thermal_bridges", title="a linear or point thermal bridge of a room",
    sheet="Bridges",
    note="Thermal bridges of a room: ψ and length (linear) or χ and count (point), naming "
         "the room.",
    columns=(
        Column("room_name", "Room", "", "text", "the room the bridge belongs to",
               place="sheet"),
        Column("name", "Thermal bridge", "", "text", "name of the junction"),
        Column("psi", "ψ", "W/(m K)", "number", "linear thermal transmittance", limit="psi"),
        Column("junction", "Junction (instead of ψ)", "", "ref",
               "a junction of the project whose computed psi is used"),
        Column("length", "Length", "m", "number", "length of the junction", limit="length",
               sign="positive"),
        Column("chi", "χ", "W/K", "number", "point thermal transmittance", limit="chi"),
        Column("count", "Count", "-", "int", "number of point bridges", sign="positive"),
        *_boundary_columns("bridge"),
        Column("notes", "Notes", "", "text", "free text"),
    ),
)

#: The element range of the spreadsheet functions (``HL_ROOM_HT`` and its kin): one row per
#: element or thermal bridge, six columns by position.
FUNCTION_ELEMENT_TABLE = Table(
    key="elements", title="an element or thermal bridge of a room's element range",
    columns=(
        Column("kind", "kind", "", "text",
               "element kind, or linear / point for a thermal bridge",
               choices=ELEMENT_KINDS + ("linear", "point"), required=True),
        Column("quantity", "quantity", "m2, m or count", "number",
               "area, length or count", required=True, sign="non_negative"),
        Column("transmittance", "transmittance", "W/(m2 K), W/(m K) or W/K", "number",
               "U, psi or chi", required=True),
        Column("temperature", "temperature", "degC", "number",
               "temperature on the other side; blank = outside; the text ground = the ground",
               limit="temperature"),
        Column("adjustment_factor", "factor", "-", "number",
               "temperature adjustment factor b_u instead of a temperature",
               sign="non_negative"),
        Column("thermal_bridge_allowance", "Delta U_TB", "W/(m2 K)", "number",
               "allowance for thermal bridges added to U (areas only)", default=0.0,
               sign="non_negative"),
    ),
)

#: The family's tables, in template order.
TABLES = (BUILDING_TABLE, ROOM_TABLE, ELEMENT_TABLE, BRIDGE_TABLE)
