"""Spreadsheet functions for room and building heat loss (windows, ground floors, ventilation,
design heat load, annual energy).

Declared like every heatledger function with :func:`heatledger_xl.registry.udf` (family
``"heat loss"``, prefix ``HL_``); imported by :mod:`heatledger_xl.udfs`, so pointing xlwings
at that module brings these in too. No function raises: a bad argument gives a one-line
text that starts with the function name and names the argument and the rule. Optional
arguments are read first, so a bad optional value is named even while required cells are
still blank.

- ``HL_WINDOW_UVALUE``: whole-window U-value, EN ISO 10077-1 (glazing, frame, glazing edge,
  optional opaque panel).
- ``HL_SLAB_UVALUE``, ``HL_SUSPENDED_FLOOR_UVALUE``, ``HL_BASEMENT_UVALUE``: ground-floor U-values,
  EN ISO 13370 (wall thickness in mm as on a drawing; everything else SI).
- ``HL_SOIL_CONDUCTIVITY``: EN ISO 13370 Table 7 by soil type.
- ``HL_VENTILATION_HV``: ventilation heat-loss coefficient from an air flow in m3/h.
- ``HL_ROOM_HT`` and ``HL_ROOM_LOAD``: transmission coefficient and design heat load of a
  room from an element range (conventions below); ``HL_ROOM_SHARES`` spills the breakdown.
- ``HL_ANNUAL_ENERGY``: degree-day annual heating energy (the base temperature is in the
  degree-days, so it is not an argument).

Element-range conventions (one row per element or thermal bridge; a blank row ends it, and
every row below a blank row must be blank too, as in a layer table):

==== ========================== =========================================================
col  heading (suggested)        rule
==== ========================== =========================================================
1    kind                       ``wall``, ``roof``, ``ceiling``, ``floor``, ``window``,
                                ``door``, ``other`` (an area times a U-value), ``linear``
                                (psi times length) or ``point`` (chi times count).
2    quantity                   Area [m2], length [m] or count [-].
3    transmittance              U [W/(m2 K)], psi [W/(m K)] or chi [W/K].
4    temperature other side     [degC]; blank = outside air at ``temp_outside``; the text
                                ``ground`` = the ground (EN 12831-1 factor f_g1 f_g2 G_w
                                from ``temp_outside_annual_mean`` and
                                ``groundwater``; U_equiv from ``HL_SLAB_UVALUE`` ...).
5    adjustment factor b        [-], 0 to 1, instead of column 4 (unheated space of unknown
                                temperature).
6    Delta U_TB                 [W/(m2 K)], blanket thermal-bridge allowance (areas only).
==== ========================== =========================================================

The first row is a header, and skipped, when every filled cell in it is text and its
quantity cell (column 2) is text too.

The design heat load supports, and does not replace, plant sizing by a competent person
under the local code.
"""

from __future__ import annotations

import math

from heatledger.construction_family.schema import DESIGN_TABLE
from heatledger.errors import HeatLedgerError
from heatledger.ground import (
    SOIL_TYPES,
    EdgeInsulation,
    ground_conductivity,
    heated_basement,
    slab_on_ground,
    suspended_floor,
)
from heatledger.heatloss import (
    AIR_DENSITY,
    AIR_SPECIFIC_HEAT,
    ELEMENT_KINDS,
    GROUNDWATER_FACTOR_DEEP,
    GROUNDWATER_FACTOR_SHALLOW,
    AdjacentRoom,
    Element,
    Ground,
    LinearBridge,
    Outside,
    PointBridge,
    Room,
    Unheated,
    Ventilation,
    ventilation_heat_loss_coefficient,
)
from heatledger.heatloss.schema import (
    BUILDING_TABLE,
    ELEMENT_TABLE,
    FUNCTION_ELEMENT_TABLE,
    ROOM_TABLE,
)
from heatledger.schema import check_value
from heatledger.windows import window

from .cells import ERROR_VALUES, flag, number, text
from .ranges import check_blank_below
from .registry import udf

__all__ = [
    "HL_WINDOW_UVALUE",
    "HL_SLAB_UVALUE",
    "HL_SUSPENDED_FLOOR_UVALUE",
    "HL_BASEMENT_UVALUE",
    "HL_SOIL_CONDUCTIVITY",
    "HL_VENTILATION_HV",
    "HL_ROOM_HT",
    "HL_ROOM_LOAD",
    "HL_ROOM_SHARES",
    "HL_ANNUAL_ENERGY",
]

FAMILY = "heat loss"
#: Most rows of an element range read (a room has well under 100 elements).
MAX_ELEMENT_ROWS = 500
#: Largest area [m2], length [m], count or flow [m3/h] accepted.
MAX_QUANTITY = 1.0e7
#: Smallest whole-window area (glazing + frame + panel) accepted: a square centimetre,
#: far below any window, far above areas whose division overflows. [m2]
MIN_WINDOW_AREA = 1.0e-4
_ABS_ZERO = -273.15
_MAX_TEMP = 2000.0
_MAX_U = 1.0e3
_ROW_KINDS = ELEMENT_KINDS + ("linear", "point")
_OUTLINES = ("rectilinear", "any", "partial")
_VOLUMETRIC = AIR_DENSITY * AIR_SPECIFIC_HEAT / 3600.0

# ---- argument descriptions (unit in brackets at the end) ---------------------------------
_D = {
    "glazing_area": "Visible glazing area A_g (all panes). [m2]",
    "frame_area": "Projected frame area A_f. [m2]",
    "glazing_u": "Centre-of-glazing U-value U_g. [W/(m2 K)]",
    "frame_u": "Frame U-value U_f. [W/(m2 K)]",
    "glazing_perimeter": "Visible glazing perimeter l_g (all panes). [m]",
    "psi_glazing": "Linear thermal transmittance of the glazing edge psi_g. [W/(m K)]",
    "panel_area": "Opaque panel area A_p; blank = 0. [m2]",
    "panel_u": "Opaque panel U-value U_p; blank = 0. [W/(m2 K)]",
    "panel_perimeter": "Visible panel perimeter l_p; blank = 0. [m]",
    "psi_panel": "Linear thermal transmittance of the panel edge psi_p; blank = 0. [W/(m K)]",
    "window_area": "Overall window area to check the parts against; blank = no check. [m2]",
    "area": "Floor area A (inside dimensions of the heated space). [m2]",
    "exposed_perimeter": "Exposed perimeter P (to outside or unheated space). [m]",
    "wall_thickness_mm": "Full thickness w of the walls at the perimeter. [mm]",
    "floor_resistance": "Thermal resistance R_f of the floor (insulation, coverings), "
                        "surfaces excluded. [m2 K/W]",
    "soil_conductivity": "Ground conductivity; blank = 2.0 (sand or gravel, EN ISO 13370 "
                         "Table 7). [W/(m K)]",
    "edge_orientation": "Edge insulation: \"horizontal\" or \"vertical\"; blank = none. [-]",
    "edge_extent": "Width (horizontal) or depth (vertical) D of the edge insulation. [m]",
    "edge_resistance": "Thermal resistance R_n of the edge insulation. [m2 K/W]",
    "edge_thickness_mm": "Thickness d_n of the edge insulation. [mm]",
    "exposed_outline": ("\"rectilinear\" (default), \"any\" or \"partial\" (party walls: "
                        "perimeter not checked against the area). [-]"),
    "deck_resistance": "Thermal resistance of the suspended deck, surfaces excluded. [m2 K/W]",
    "underfloor_height": "Height h of the deck above outside ground, at most 0.5. [m]",
    "underfloor_wall_u": "U-value of the underfloor walls above ground U_w. [W/(m2 K)]",
    "vent_area_per_perimeter": "Ventilation openings per length of perimeter epsilon. [m2/m]",
    "wind_speed": "Mean wind speed at 10 m height. [m/s]",
    "wind_shielding": "\"sheltered\" (0.02), \"average\" (0.05) or \"exposed\" (0.10). [-]",
    "ground_insulation_resistance": "Insulation on the underfloor ground R_g; blank = 0. "
                                    "[m2 K/W]",
    "wall_resistance": "Thermal resistance R_w of the basement walls, surfaces excluded. "
                       "[m2 K/W]",
    "depth": "Depth z of the basement floor below outside ground level. [m]",
    "soil": "\"clay\", \"silt\", \"sand\", \"gravel\" or \"rock\". [-]",
    "air_flow_m3_per_h": "Outdoor air volume flow entering the space. [m3/h]",
    "heat_recovery": "Heat-recovery temperature efficiency on this flow, 0 to 1; blank = 0. "
                     "[-]",
    "elements": ("Element range: kind (wall...door, linear, point), quantity, U/psi/chi, "
                 "temperature on the other side (blank = outside, \"ground\"), factor b, "
                 "Delta U_TB. [m2 or m, W/(m2 K), degC, -]"),
    "temp_outside_annual_mean": ("Annual mean external temperature theta_m,e for "
                                         "rows marked \"ground\". [degC]"),
    "groundwater": ("\"deep\" (water table more than 1 m below the floor, G_w 1.00, default) "
                    "or \"shallow\" (G_w 1.15). [-]"),
    "temp_inside": "Design internal temperature of the room. [degC]",
    "temp_outside": "Design external temperature, below temp_inside. [degC]",
    "ventilation_coefficient": "Ventilation heat-loss coefficient H_V (HL_VENTILATION_HV); "
                               "blank = 0. [W/K]",
    "reheat": "Heating-up allowance Phi_hu = f_RH A_floor; blank = 0. [W]",
    "heat_loss_coefficient": "Heat-loss coefficient H = H_T + H_V. [W/K]",
    "degree_days": "Heating degree-days on the base temperature appropriate to the "
                   "building. [K day]",
    "header": "TRUE adds a first row of column titles with units; default FALSE. [-]",
}


def _args(*names):
    return {n: _D[n] for n in names}


# --------------------------------------------------------------------------- windows
@udf(FAMILY, returns="U_w [W/(m2 K)]",
     args=_args("glazing_area", "frame_area", "glazing_u", "frame_u", "glazing_perimeter",
                "psi_glazing", "panel_area", "panel_u", "panel_perimeter", "psi_panel",
                "window_area"))
def HL_WINDOW_UVALUE(glazing_area, frame_area, glazing_u, frame_u, glazing_perimeter, psi_glazing,
                panel_area=None, panel_u=None, panel_perimeter=None, psi_panel=None,
                window_area=None):
    """Whole-window U-value by EN ISO 10077-1: (A_g U_g + A_f U_f + l_g psi_g + A_p U_p +
    l_p psi_p)/(A_g + A_f + A_p), unrounded. [W/(m2 K)]"""
    ap = _q("panel_area", panel_area, 0.0)
    up = number("panel_u", panel_u, 0.0, low=0.0, high=_MAX_U, low_inclusive=True,
                unit="W/(m2 K)")
    lp = _q("panel_perimeter", panel_perimeter, 0.0)
    psip = number("psi_panel", psi_panel, 0.0, low=-10.0, high=10.0, unit="W/(m K)")
    aw = number("window_area", window_area, None, low=0.0, high=MAX_QUANTITY, unit="m2")
    ag = _q("glazing_area", glazing_area)
    af = _q("frame_area", frame_area)
    ug = number("glazing_u", glazing_u, low=0.0, high=_MAX_U, low_inclusive=True,
                unit="W/(m2 K)")
    uf = number("frame_u", frame_u, low=0.0, high=_MAX_U, low_inclusive=True, unit="W/(m2 K)")
    lg = _q("glazing_perimeter", glazing_perimeter)
    psig = number("psi_glazing", psi_glazing, low=-10.0, high=10.0, unit="W/(m K)")
    if ag + af + ap < MIN_WINDOW_AREA:
        raise HeatLedgerError(f"glazing_area + frame_area + panel_area must be at least "
                              f"{MIN_WINDOW_AREA:g} m2; got {ag + af + ap:g} m2")
    return float(window(ag, af, ug, uf, lg, psig, panel_area=ap, panel_u=up,
                          panel_perimeter=lp, psi_panel=psip, window_area=aw).u_value)


# --------------------------------------------------------------------------- ground
@udf(FAMILY, returns="U [W/(m2 K)]",
     args=_args("area", "exposed_perimeter", "wall_thickness_mm", "floor_resistance",
                "soil_conductivity", "edge_orientation", "edge_extent", "edge_resistance",
                "edge_thickness_mm", "exposed_outline"))
def HL_SLAB_UVALUE(area, exposed_perimeter, wall_thickness_mm, floor_resistance,
              soil_conductivity=None, edge_orientation=None, edge_extent=None,
              edge_resistance=None, edge_thickness_mm=None, exposed_outline=None):
    """U-value of a slab-on-ground floor by EN ISO 13370 8.2 (both regimes by d_t against B'),
    with horizontal or vertical edge insulation (Annex B) when given. [W/(m2 K)]"""
    lam = _soil_lambda(soil_conductivity)
    outline = _outline(exposed_outline)
    edge = _edge(edge_orientation, edge_extent, edge_resistance, edge_thickness_mm)
    a, p, w = _floor(area, exposed_perimeter, wall_thickness_mm)
    rf = _resistance("floor_resistance", floor_resistance)
    try:
        return float(slab_on_ground(a, p, w, rf, soil_conductivity=lam,
                                      edge_insulation=edge, exposed_outline=outline).u_value)
    except HeatLedgerError as exc:
        if str(exc).startswith("edge insulation"):
            raise HeatLedgerError(f"edge_resistance and edge_thickness_mm: {exc}") from None
        raise


@udf(FAMILY, returns="U [W/(m2 K)]",
     args=_args("area", "exposed_perimeter", "wall_thickness_mm", "deck_resistance",
                "underfloor_height", "underfloor_wall_u", "vent_area_per_perimeter",
                "wind_speed", "wind_shielding", "ground_insulation_resistance",
                "soil_conductivity", "exposed_outline"))
def HL_SUSPENDED_FLOOR_UVALUE(area, exposed_perimeter, wall_thickness_mm, deck_resistance,
                         underfloor_height, underfloor_wall_u, vent_area_per_perimeter,
                         wind_speed, wind_shielding, ground_insulation_resistance=None,
                         soil_conductivity=None, exposed_outline=None):
    """U-value of a suspended floor over a ventilated underfloor space by EN ISO 13370 8.3:
    1/U = 1/U_f + 1/(U_g + U_x). [W/(m2 K)]"""
    rg = _resistance("ground_insulation_resistance", ground_insulation_resistance, 0.0)
    lam = _soil_lambda(soil_conductivity)
    outline = _outline(exposed_outline)
    a, p, w = _floor(area, exposed_perimeter, wall_thickness_mm)
    rd = _resistance("deck_resistance", deck_resistance)
    h = number("underfloor_height", underfloor_height, low=0.0, high=0.5, low_inclusive=True,
               unit="m")
    uw = number("underfloor_wall_u", underfloor_wall_u, low=0.0, high=_MAX_U,
                low_inclusive=True, unit="W/(m2 K)")
    eps = number("vent_area_per_perimeter", vent_area_per_perimeter, low=0.0, high=10.0,
                 low_inclusive=True, unit="m2/m")
    v = number("wind_speed", wind_speed, low=0.0, high=100.0, low_inclusive=True, unit="m/s")
    shield = _choice("wind_shielding", wind_shielding, ("sheltered", "average", "exposed"))
    return float(suspended_floor(a, p, w, rd, underfloor_height=h, underfloor_wall_u=uw,
                                   vent_area_per_perimeter=eps, wind_speed=v,
                                   wind_shielding=shield, ground_insulation_resistance=rg,
                                   soil_conductivity=lam, exposed_outline=outline).u_value)


@udf(FAMILY, returns="U' [W/(m2 K)]",
     args=_args("area", "exposed_perimeter", "wall_thickness_mm", "floor_resistance",
                "wall_resistance", "depth", "soil_conductivity", "exposed_outline"))
def HL_BASEMENT_UVALUE(area, exposed_perimeter, wall_thickness_mm, floor_resistance,
                  wall_resistance, depth, soil_conductivity=None, exposed_outline=None):
    """Combined U-value U' = (A U_bf + z P U_bw)/(A + z P) of the floor and below-ground walls
    of a heated basement by EN ISO 13370 8.4; apply it to the area A + z P. [W/(m2 K)]"""
    lam = _soil_lambda(soil_conductivity)
    outline = _outline(exposed_outline)
    a, p, w = _floor(area, exposed_perimeter, wall_thickness_mm)
    rf = _resistance("floor_resistance", floor_resistance)
    rw = _resistance("wall_resistance", wall_resistance)
    z = number("depth", depth, low=0.0, high=100.0, unit="m")
    return float(heated_basement(a, p, w, rf, rw, z, soil_conductivity=lam,
                                   exposed_outline=outline).u_value)


@udf(FAMILY, returns="ground conductivity [W/(m K)]", args=_args("soil"))
def HL_SOIL_CONDUCTIVITY(soil):
    """Thermal conductivity of unfrozen ground by soil type, EN ISO 13370 Table 7: clay or
    silt 1.5, sand or gravel 2.0, rock 3.5. [W/(m K)]"""
    return ground_conductivity(_choice("soil", soil, tuple(SOIL_TYPES)))


# --------------------------------------------------------------------------- ventilation
@udf(FAMILY, returns="H_V [W/K]", args=_args("air_flow_m3_per_h", "heat_recovery"))
def HL_VENTILATION_HV(air_flow_m3_per_h, heat_recovery=None):
    """Ventilation heat-loss coefficient H_V = rho c_p V/3600 (1 - eta), dry air at 20 degC
    and 101325 Pa (rho c_p/3600 = 0.336 W h/(m3 K)). [W/K]"""
    eta = number("heat_recovery", heat_recovery, 0.0, low=0.0, high=1.0, low_inclusive=True)
    flow = _q("air_flow_m3_per_h", air_flow_m3_per_h, unit="m3/h")
    return float(ventilation_heat_loss_coefficient(flow, heat_recovery=eta))


# --------------------------------------------------------------------------- rooms
_ROOM_ARGS = _args("elements", "temp_inside", "temp_outside",
                   "temp_outside_annual_mean", "groundwater")


@udf(FAMILY, returns="H_T [W/K]", args=_ROOM_ARGS, ranges=("elements",))
def HL_ROOM_HT(elements, temp_inside, temp_outside, temp_outside_annual_mean=None,
               groundwater=None):
    """Transmission heat-loss coefficient H_T = sum A (U + dU_TB) f + sum psi l f + sum chi f
    of a room's element range (EN 12831-1 style). [W/K]"""
    ground = _ground(temp_outside_annual_mean, groundwater)
    room = _room(elements, temp_inside, temp_outside, 0.0, 0.0, ground)
    return room.heat_load(room.temp_outside).transmission_coefficient


@udf(FAMILY, returns="design heat load [W]",
     args={**_ROOM_ARGS, **_args("ventilation_coefficient", "reheat")},
     ranges=("elements",))
def HL_ROOM_LOAD(elements, temp_inside, temp_outside, temp_outside_annual_mean=None,
                 groundwater=None, ventilation_coefficient=None, reheat=None):
    """Design heat load of a room Phi_HL = (H_T + H_V)(temp_inside - temp_outside) + Phi_hu
    from its element range (EN 12831-1 style). [W]"""
    h_v, phi_hu = _ventilation_and_reheat(ventilation_coefficient, reheat)
    ground = _ground(temp_outside_annual_mean, groundwater)
    room = _room(elements, temp_inside, temp_outside, h_v, phi_hu, ground)
    return room.design_heat_load(room.temp_outside)


@udf(FAMILY, returns="spill: line, kind, H [W/K], heat flow [W], share [-]",
     args={**_ROOM_ARGS, **_args("ventilation_coefficient", "reheat", "header")},
     ranges=("elements",), spills=True)
def HL_ROOM_SHARES(elements, temp_inside, temp_outside, temp_outside_annual_mean=None,
                   groundwater=None, ventilation_coefficient=None, reheat=None, header=None):
    """Breakdown of a room's design heat load: one row per element row, then ventilation and
    heating-up, with H, heat flow and share of Phi_HL (EN 12831-1 style). [W/K, W, -]"""
    show_header = flag("header", header, False)
    h_v, phi_hu = _ventilation_and_reheat(ventilation_coefficient, reheat)
    ground = _ground(temp_outside_annual_mean, groundwater)
    room = _room(elements, temp_inside, temp_outside, h_v, phi_hu, ground)
    res = room.heat_load(room.temp_outside)
    rows = [[ln.name, ln.kind, ln.coefficient, ln.heat_loss,
             ln.share if math.isfinite(ln.share) else None] for ln in res.lines]
    titles = ["line", "kind", "H [W/K]", "heat flow [W]", "share [-]"]
    return [titles] + rows if show_header else rows


@udf(FAMILY, returns="annual heating energy [kWh]",
     args=_args("heat_loss_coefficient", "degree_days"))
def HL_ANNUAL_ENERGY(heat_loss_coefficient, degree_days):
    """Annual heating energy by the degree-day method Q = 24 H DD / 1000; the degree-days
    must be on the base temperature appropriate to the building (gains are allowed for
    through that base). [kWh]"""
    h = number("heat_loss_coefficient", heat_loss_coefficient, low=0.0, high=MAX_QUANTITY,
               low_inclusive=True, unit="W/K")
    dd = number("degree_days", degree_days, low=0.0, high=20000.0, low_inclusive=True,
                unit="K day")
    room = Room("cell", 20.0, 1.0, (), Ventilation("flow", ventilation_rate=h / _VOLUMETRIC))
    return room.annual_energy(dd)


# --------------------------------------------------------------------------- helpers
def _q(name, value, default=None, unit="m2"):
    if default is None:
        return number(name, value, low=0.0, high=MAX_QUANTITY, low_inclusive=True, unit=unit)
    return number(name, value, default, low=0.0, high=MAX_QUANTITY, low_inclusive=True,
                  unit=unit)


def _resistance(name, value, default=None):
    if default is None:
        return number(name, value, low=0.0, high=100.0, low_inclusive=True, unit="m2 K/W")
    return number(name, value, default, low=0.0, high=100.0, low_inclusive=True,
                  unit="m2 K/W")


def _floor(area, perimeter, wall_thickness_mm):
    a = number("area", area, low=0.0, high=MAX_QUANTITY, unit="m2")
    p = number("exposed_perimeter", perimeter, low=0.0, high=MAX_QUANTITY, unit="m")
    w = number("wall_thickness_mm", wall_thickness_mm, low=0.0, high=10000.0,
               low_inclusive=True, unit="mm")
    return a, p, w / 1000.0


def _soil_lambda(value):
    return number("soil_conductivity", value, 2.0, low=0.0, high=100.0, unit="W/(m K)")


def _outline(value):
    return _choice("exposed_outline", value, _OUTLINES, "rectilinear")


def _choice(name, value, choices, default=None):
    if default is None:
        raw = text(name, value)
    else:
        raw = text(name, value, default)
    out = raw.lower()
    if out not in choices:
        raise HeatLedgerError(f"{name} must be one of {', '.join(map(repr, choices))}; "
                              f"got {raw[:40]!r}")
    return out


def _edge(orientation, extent, resistance, thickness_mm):
    o = text("edge_orientation", orientation, "")
    if not o:
        for name, value in (("edge_extent", extent), ("edge_resistance", resistance),
                            ("edge_thickness_mm", thickness_mm)):
            if number(name, value, None, low=0.0, high=1e6, low_inclusive=True) is not None:
                raise HeatLedgerError(f"{name} is given but edge_orientation is blank; give "
                                      "\"horizontal\" or \"vertical\", or leave all edge "
                                      "cells blank")
        return None
    edge = {c.key: c for c in ELEMENT_TABLE.columns if c.sub == "edge_insulation"}
    o = _choice("edge_orientation", o, edge["orientation"].choices)
    d, rn, dn = (check_value(edge[key], number(f"edge_{key}", value), f"edge_{key}")
                 for key, value in (("extent", extent), ("resistance", resistance),
                                    ("thickness_mm", thickness_mm)))
    return EdgeInsulation(o, d, rn, dn / 1000.0)


def _ground(temp_outside_annual_mean, groundwater):
    """(theta_m,e or None, G_w) for rows marked "ground"."""
    gw = _choice("groundwater", groundwater, BUILDING_TABLE.column("groundwater").choices,
                 BUILDING_TABLE.column("groundwater").default)
    key = "temp_outside_annual_mean"
    tme = number(key, temp_outside_annual_mean, None)
    tme = None if tme is None else check_value(BUILDING_TABLE.column(key), tme, key)
    return tme, GROUNDWATER_FACTOR_SHALLOW if gw == "shallow" else GROUNDWATER_FACTOR_DEEP


def _ventilation_and_reheat(ventilation_coefficient, reheat):
    """H_V [W/K] and the heating-up allowance Phi_hu [W] from their cells (blank = 0)."""
    h_v = number("ventilation_coefficient", ventilation_coefficient, 0.0, low=0.0,
                 high=MAX_QUANTITY, low_inclusive=True, unit="W/K")
    phi_hu = number("reheat", reheat, 0.0, low=0.0, high=MAX_QUANTITY, low_inclusive=True,
                    unit="W")
    return h_v, phi_hu


def _room(cells, temp_inside, temp_outside, h_v, phi_hu, ground):
    ti = check_value(ROOM_TABLE.column("temp_inside"), number("temp_inside", temp_inside),
                     "temp_inside")
    te = check_value(DESIGN_TABLE.column("temp_outside"), number("temp_outside", temp_outside),
                     "temp_outside")
    if not te < ti:
        raise HeatLedgerError(f"temp_outside {te:g} degC must be below temp_inside {ti:g} degC "
                              "for a design heat load")
    elements, bridges = _element_rows(cells, ground)
    vent = Ventilation("flow", ventilation_rate=h_v / _VOLUMETRIC)
    try:
        return Room("room", ti, 1.0, elements, vent, thermal_bridges=bridges,
                    floor_area=1.0 if phi_hu > 0.0 else 0.0, reheat_factor=phi_hu,
                    temp_outside=te)
    except HeatLedgerError as exc:
        raise HeatLedgerError(f"elements: {str(exc).replace(chr(39) + 'room' + chr(39), '')}"
                              ) from None


def _element_rows(cells, ground):
    if cells is None or not isinstance(cells, (list, tuple)):
        raise HeatLedgerError("elements must be a range of 2 to 6 columns: kind, quantity, "
                              "transmittance, temperature, factor, Delta U_TB")
    rows = [list(r) if isinstance(r, (list, tuple)) else [r] for r in cells]
    if rows and _is_header(rows[0]):
        rows = rows[1:]
    elements, bridges = [], []
    for n, row in enumerate(rows, 1):
        if n > MAX_ELEMENT_ROWS:
            raise HeatLedgerError(f"elements has more than {MAX_ELEMENT_ROWS} rows; a blank "
                                  "row ends the table")
        if all(_blank(c) for c in row):
            check_blank_below("elements", rows, n)
            break
        if len(row) > 6:
            raise HeatLedgerError(f"elements has {len(row)} columns; give 2 to 6 (kind, "
                                  "quantity, transmittance, temperature, factor, Delta U_TB)")
        row = row + [None] * (6 - len(row))
        where = f"elements row {n}"
        kind = _row_value(where, "kind", text(f"{where} kind", row[0]).lower())
        q = _row_value(where, "quantity", number(f"{where} quantity", row[1]))
        t = _row_value(where, "transmittance", number(f"{where} transmittance", row[2]))
        on_ground = isinstance(row[3], str) and row[3].strip().lower() == "ground"
        temp = None if on_ground else _row_value(
            where, "temperature", number(f"{where} temperature", row[3], None))
        b = _row_value(where, "adjustment_factor", number(f"{where} factor", row[4], None))
        if b is not None and b > 1.0:
            raise HeatLedgerError(f"{where} factor must be between 0 and 1; got {b:g}")
        dutb = _row_value(where, "thermal_bridge_allowance",
                          number(f"{where} Delta U_TB", row[5], 0.0))
        if (temp is not None or on_ground) and b is not None:
            raise HeatLedgerError(f"{where}: give a temperature or \"ground\" (column 4) or "
                                  "a factor (column 5), not both")
        if on_ground and ground[0] is None:
            raise HeatLedgerError(f"{where} is marked ground: give "
                                  "temp_outside_annual_mean (theta_m,e)")
        boundary = (Ground(ground[0], groundwater_factor=ground[1]) if on_ground else
                    Outside() if temp is None and b is None else
                    Unheated(adjustment_factor=b) if b is not None else
                    AdjacentRoom(temperature=temp))
        label = f"row {n}"
        if kind in ELEMENT_KINDS:
            if t < 0.0:
                raise HeatLedgerError(f"{where} transmittance (a U-value) must not be "
                                      f"negative; got {t:g}")
            elements.append(Element(label, q, t, boundary, kind=kind,
                                    thermal_bridge_allowance=dutb))
        elif dutb:
            raise HeatLedgerError(f"{where} Delta U_TB applies to areas only, not to a "
                                  f"{kind} bridge")
        elif kind == "linear":
            bridges.append(LinearBridge(label, t, q, boundary))
        else:
            if q != int(q) or q < 1:
                raise HeatLedgerError(f"{where} quantity of point bridges must be a whole "
                                      f"count of at least 1; got {q:g}")
            bridges.append(PointBridge(label, t, int(q), boundary))
    return elements, bridges


def _row_value(where: str, key: str, value):
    """A cell of an element row checked by the rule of its column in the schema
    (:data:`~heatledger.heatloss.schema.FUNCTION_ELEMENT_TABLE`); None stays None."""
    col = FUNCTION_ELEMENT_TABLE.column(key)
    if value is None:
        return None
    return check_value(col, value, f"{where} {col.label}")


def _blank(value) -> bool:
    return value is None or (isinstance(value, str) and not value.strip())


def _is_header(row) -> bool:
    filled = [c for c in row if not _blank(c)]
    return (len(row) > 1 and bool(filled) and all(isinstance(c, str) for c in filled)
            and isinstance(row[1], str) and row[1].strip().upper() not in ERROR_VALUES
            and not _numeric_text(row[1]))


def _numeric_text(value: str) -> bool:
    try:
        float(value)
    except ValueError:
        return False
    return True
