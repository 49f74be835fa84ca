"""Readers of a room's elements and thermal bridges in the ``[[rooms]]`` section: the
boundary each faces, the U-value method of each element (construction, declared, window,
ground floors of EN ISO 13370), edge insulation and soil. Every problem is appended as
``(key path, message)``; the keys and rules come from :mod:`heatledger.heatloss.schema`.
"""

from __future__ import annotations

import difflib

from .._projectio import number, text, unknown
from .._validate import choices_text, quote, show
from ..errors import HeatLedgerError
from ..ground import (
    DEFAULT_SOIL_CONDUCTIVITY,
    RSI_WALL,
    SOIL_TYPES,
    EdgeInsulation,
    ground_conductivity,
    heated_basement,
    slab_on_ground,
    suspended_floor,
)
from ..schema import read_value
from ..windows import PERIMETER_SHAPES, declared_window, window
from .elements import (
    ELEMENT_KINDS,
    AdjacentRoom,
    Element,
    Ground,
    LinearBridge,
    Outside,
    PointBridge,
    Unheated,
)
from .results import GroundFloorU
from .schema import (
    BOUNDARIES,
    BRIDGE_TABLE,
    ELEMENT_METHOD_NAMES,
    ELEMENT_TABLE,
    GROUND_METHODS,
)

__all__ = ["read_soil", "read_boundary", "read_element", "read_bridge", "closest", "label_new",
           "EDGE_KEYS", "BRIDGE_KEYS"]

#: The physical limit (heatledger._validate.LIMITS) of each window and floor input.
_WINDOW_LIMITS = {k: ELEMENT_TABLE.column(k).limit for k in (
    "glazing_area", "frame_area", "panel_area", "glazing_u", "frame_u", "panel_u",
    "glazing_perimeter", "panel_perimeter")}
_FLOOR_LIMITS = {k: ELEMENT_TABLE.column(k).limit for k in (
    "underfloor_height", "underfloor_wall_u", "vent_area_per_perimeter", "wind_speed")}
EDGE_KEYS = ELEMENT_TABLE.keys(sub="edge_insulation")
BRIDGE_KEYS = BRIDGE_TABLE.keys()
ELEMENT_METHODS = {method: ELEMENT_TABLE.keys(method) for method in ELEMENT_METHOD_NAMES}


def read_soil(raw, where, problems, default):
    """(conductivity, text) of the soil named in ``raw``, or ``default``.

    Parameters
    ----------
    raw : dict
        The table with soil or soil_conductivity. [-]
    where : str
        Key path of the table. [-]
    problems : list
        (key path, message) is appended for a problem. [-]
    default : tuple or None
        (conductivity, text) when the table names no soil. [-]
    """
    has_soil = raw.get("soil") not in (None, "")
    has_lam = raw.get("soil_conductivity") is not None
    if has_soil and has_lam:
        problems.append((f"{where}.soil_conductivity", "give soil (a type) or "
                         "soil_conductivity (W/(m K)), not both"))
        return default
    if has_soil:
        try:
            lam = ground_conductivity(str(raw["soil"]))
        except HeatLedgerError:
            problems.append((f"{where}.soil", f"must be one of "
                             f"{choices_text(SOIL_TYPES)} (EN ISO 13370 Table 7); got "
                             f"{show(raw['soil'])}"))
            return default
        return lam, f"soil {quote(str(raw['soil']).strip().lower())}: lambda {lam:g} W/(m K) " \
                    "(EN ISO 13370 Table 7)"
    if has_lam:
        lam = number(raw, "soil_conductivity", where, problems, positive=True,
                     limit="conductivity")
        return default if lam is None else (lam, f"soil conductivity {lam:g} W/(m K) (input)")
    return default


def read_boundary(row, where, label, own_room, ctx, problems, default="outside"):
    """The boundary an element or bridge faces (Outside, Ground, Unheated, AdjacentRoom), or
    None with a problem.

    Parameters
    ----------
    row : dict
        The element or bridge table. [-]
    where : str
        Key path of the table. [-]
    label : str
        Name of the element for messages. [-]
    own_room : str
        Name of the element's room. [-]
    ctx : object
        The building's settings, known rooms and constructions. [-]
    problems : list
        (key path, message) is appended for every problem. [-]
    default : str
        Boundary when the table names none. [-]
    """
    b = str(row.get("boundary", default) or default).strip().lower()
    if b not in BOUNDARIES:
        problems.append((f"{where}.boundary", f"{label}: must be one of "
                         f"{choices_text(BOUNDARIES)}; got {show(row.get('boundary'))}"))
        return None
    extra = {"outside": (), "ground": (), "unheated": ("temp_adjacent", "adjustment_factor"),
             "room": ("room",), "adjacent": ("temp_adjacent",)}[b]
    for key in ("temp_adjacent", "adjustment_factor", "room"):
        if key in row and key not in extra:
            problems.append((f"{where}.{key}", f"{label}: not used with boundary {quote(b)}"))
            return None
    if b == "outside":
        return Outside()
    if b == "ground":
        s = ctx.settings
        if s["theta_me"] is None:
            problems.append(("building.temp_outside_annual_mean",
                             f"{label} faces the ground: give the annual mean external "
                             "temperature theta_m,e (degC) in [building]"))
            return None
        return Ground(s["theta_me"], f_g1=s["f_g1"], groundwater_factor=s["g_w"])
    if b == "unheated":
        t = number(row, "temp_adjacent", where, problems, limit="temperature")
        f = number(row, "adjustment_factor", where, problems)
        if (t is None) == (f is None):
            problems.append((f"{where}.boundary", f"{label}: an unheated space needs exactly "
                             "one of temp_adjacent (degC) or adjustment_factor (b_u, 0..1)"))
            return None
        if f is not None and not 0.0 <= f <= 1.0:
            problems.append((f"{where}.adjustment_factor", f"{label}: b_u must be between 0 "
                             f"and 1; got {f:g}"))
            return None
        return Unheated(temperature=t) if t is not None else Unheated(adjustment_factor=f)
    if b == "adjacent":
        t = number(row, "temp_adjacent", where, problems, required=True, limit="temperature")
        return None if t is None else AdjacentRoom(temperature=t)
    other = text(row, "room", where, problems)
    if other is None:
        return None
    if not other:
        problems.append((f"{where}.room", f'{label}: boundary "room" needs the name of the '
                         "neighbouring room"))
        return None
    if other == own_room:
        problems.append((f"{where}.room", f"{label}: an element cannot face its own room"))
        return None
    if other not in ctx.room_names:
        problems.append((f"{where}.room", f"{label}: room {quote(other)} does not exist"
                         f"{closest(other, ctx.room_names)}"))
        return None
    return AdjacentRoom(room=other)


def read_element(row, where, room_label, room_name, ctx, problems):
    """One element of a room from its table, with its U-value method, or None with problems.

    Parameters
    ----------
    row : dict
        The table. [-]
    where : str
        Key path of the table. [-]
    room_label : str
        The room, for messages. [-]
    room_name : str
        Name of the room. [-]
    ctx : object
        The building's settings, known rooms and constructions. [-]
    problems : list
        (key path, message) is appended for every problem. [-]
    """
    if not isinstance(row, dict):
        problems.append((where, f"{room_label}: an element must be a table with name, kind, "
                         "method, area and boundary"))
        return None
    start = len(problems)
    name = text(row, "name", where, problems)
    if name == "":
        problems.append((f"{where}.name", f"{room_label}: every element needs a name"))
    name = name or where
    label = f"{room_label}, element {quote(name)}"
    method = str(row.get("method", "")).strip().lower()
    if method not in ELEMENT_METHODS:
        problems.append((f"{where}.method", f"{label}: must be one of "
                         f"{choices_text(ELEMENT_METHODS)} (how the U-value is found); "
                         f"got {show(row.get('method'))}"))
        return None
    unknown(row, ELEMENT_METHODS[method], where, problems)
    kind = str(row.get("kind", "floor" if method in GROUND_METHODS else "wall")).strip().lower()
    if kind not in ELEMENT_KINDS:
        problems.append((f"{where}.kind", f"{label}: must be one of "
                         f"{choices_text(ELEMENT_KINDS)}; got {show(row.get('kind'))}"))
    default_b = "ground" if method in GROUND_METHODS else "outside"
    boundary = read_boundary(row, where, label, room_name, ctx, problems, default=default_b)
    if isinstance(boundary, Ground) and method not in GROUND_METHODS:
        problems.append((f"{where}.boundary", f"{label}: a ground boundary needs an EN ISO "
                         f"13370 U-value; use method {choices_text(GROUND_METHODS)}"))
    if method in GROUND_METHODS and boundary is not None and not isinstance(
            boundary, (Ground, Outside)):
        problems.append((f"{where}.boundary", f"{label}: an EN ISO 13370 ground element faces "
                         '"ground" (or "outside"); got ' + show(row.get("boundary"))))
    dutb = number(row, "thermal_bridge_allowance", where, problems, non_negative=True,
                  limit="u_value",
                   default=0.0)
    area = number(row, "area", where, problems, positive=True,
                  required=method != "window", limit="area")
    u = None
    try:
        if method == "construction":
            u = _construction_name(row, "construction", where, label, ctx, problems,
                                   required=True)
        elif method == "declared":
            uv = number(row, "u_value", where, problems, positive=True, required=True,
                        limit="u_value")
            src = str(row.get("u_source", "") or "").strip()
            if not src:
                problems.append((f"{where}.u_source", f"{label}: a declared U-value needs "
                                 "u_source naming the declaration (product, test report)"))
            elif uv is not None:
                u = declared_window(uv, source=src, area=area)
        elif method == "window":
            u = _window(row, where, label, area, problems)
            if u is not None and area is None:
                area = float(u.area)
        else:
            u = _ground(method, row, where, label, area, ctx, problems)
            if u is not None:
                area = u.area
    except HeatLedgerError as exc:
        problems.append((where, f"{label}: {exc}"))
        return None
    label_new(problems, start, label)
    if len(problems) > start or u is None or area is None:
        return None
    return Element(name, area, u, boundary, kind=kind, thermal_bridge_allowance=dutb)


def _construction_name(row, key, where, label, ctx, problems, *, required):
    ref = row.get(key)
    if ref in (None, ""):
        if required:
            problems.append((f"{where}.{key}", f"{label}: name a construction of this "
                             "project"))
        return None
    if not isinstance(ref, str):
        problems.append((f"{where}.{key}", f"{label}: must be text (the name of a "
                         f"construction); got {show(ref)}"))
        return None
    ref = ref.strip()
    if ref in ctx.constructions and ctx.constructions[ref] is None:
        return None  # the construction's own problem is reported at its entry
    if ref not in ctx.constructions:
        problems.append((f"{where}.{key}", f"{label}: construction {quote(ref)} does not exist "
                         f"among the project's [[constructions]]"
                         f"{closest(ref, ctx.constructions)}"))
        return None
    return ref


def _window(row, where, label, area, problems):
    req = ("glazing_area", "frame_area", "glazing_u", "frame_u", "glazing_perimeter")
    vals = {k: number(row, k, where, problems, non_negative=True, required=True,
                      limit=_WINDOW_LIMITS[k]) for k in req}
    vals["psi_glazing"] = number(row, "psi_glazing", where, problems, required=True,
                                 limit="psi")
    for k in ("panel_area", "panel_u", "panel_perimeter"):
        vals[k] = number(row, k, where, problems, non_negative=True, default=0.0,
                         limit=_WINDOW_LIMITS[k])
    vals["psi_panel"] = number(row, "psi_panel", where, problems, default=0.0, limit="psi")
    if None in vals.values():
        return None
    shape = row.get("glazing_shape", "rectilinear")
    if shape not in PERIMETER_SHAPES:
        problems.append((f"{where}.glazing_shape", f"{label}: must be one of "
                         f"{choices_text(PERIMETER_SHAPES)}; got {show(shape)}"))
        return None
    return window(vals["glazing_area"], vals["frame_area"], vals["glazing_u"], vals["frame_u"],
                  vals["glazing_perimeter"], vals["psi_glazing"], panel_area=vals["panel_area"],
                  panel_u=vals["panel_u"], panel_perimeter=vals["panel_perimeter"],
                  psi_panel=vals["psi_panel"], window_area=area, glazing_shape=shape)


def _resistance(row, con_key, r_key, where, label, ctx, problems):
    """(R [m2 K/W], construction name) from a named construction or a declared value."""
    has_c = row.get(con_key) not in (None, "")
    has_r = row.get(r_key) is not None
    if has_c == has_r:
        problems.append((f"{where}.{con_key}", f"{label}: give {con_key} (a project "
                         f"construction, R = R_T - R_si - R_se) or {r_key} (m2 K/W), one of "
                         "them"))
        return None, ""
    if has_r:
        return number(row, r_key, where, problems, non_negative=True, limit="resistance"), ""
    name = _construction_name(row, con_key, where, label, ctx, problems, required=True)
    if name is None:
        return None, ""
    con = ctx.constructions[name]
    return float(con.total_resistance - con.rsi - con.rse_used), name


def _ground(method, row, where, label, area, ctx, problems):
    soil = read_soil(row, where, problems, ctx.settings["soil"])
    if soil is None:
        soil = (DEFAULT_SOIL_CONDUCTIVITY, f"soil unknown: lambda {DEFAULT_SOIL_CONDUCTIVITY:g} "
                "W/(m K), category 2 (EN ISO 13370 Table 7)")
    lam, soil_text = soil
    p = number(row, "exposed_perimeter", where, problems, positive=True, required=True,
               limit="perimeter")
    w_mm = number(row, "wall_thickness_mm", where, problems, non_negative=True, required=True,
                  limit="wall_thickness", unit="mm", scale=1e-3)
    outline = read_value(ELEMENT_TABLE.column("exposed_outline"), row, where, problems)
    if area is None or p is None or w_mm is None or outline is None:
        return None
    w = w_mm / 1000.0
    if method == "slab_on_ground":
        rf, cname = _resistance(row, "construction", "floor_resistance", where, label, ctx,
                                problems)
        edge = None
        if row.get("edge_insulation") is not None:
            edge = _edge(row["edge_insulation"], f"{where}.edge_insulation", label, problems)
            if edge is None:
                return None
        if rf is None:
            return None
        res = slab_on_ground(area, p, w, rf, soil_conductivity=lam, edge_insulation=edge,
                             exposed_outline=outline)
        return GroundFloorU(res, method, float(area), cname, "", soil_text,
                            {"w": w, "rf": rf})
    if method == "suspended_floor":
        rd, cname = _resistance(row, "construction", "deck_resistance", where, label, ctx,
                                problems)
        kw = {k: number(row, k, where, problems, non_negative=True, required=True,
                        limit=_FLOOR_LIMITS[k])
              for k in ("underfloor_height", "underfloor_wall_u", "vent_area_per_perimeter",
                        "wind_speed")}
        kw["ground_insulation_resistance"] = number(
            row, "ground_insulation_resistance", where, problems, non_negative=True,
            default=0.0, limit="resistance")
        shield = row.get("wind_shielding")
        if shield in (None, ""):
            problems.append((f"{where}.wind_shielding", f'{label}: is required: "sheltered", '
                             '"average" or "exposed"'))
            return None
        if rd is None or None in kw.values():
            return None
        res = suspended_floor(area, p, w, rd, wind_shielding=str(shield),
                              soil_conductivity=lam, exposed_outline=outline, **kw)
        return GroundFloorU(res, method, float(area), cname, "", soil_text,
                            {"w": w, "rd": rd, "h": kw["underfloor_height"],
                             "uw": kw["underfloor_wall_u"], "eps": kw["vent_area_per_perimeter"],
                             "v": kw["wind_speed"], "rg": kw["ground_insulation_resistance"]})
    rf, cname = _resistance(row, "construction", "floor_resistance", where, label, ctx, problems)
    rw, wname = _resistance(row, "wall_construction", "wall_resistance", where, label, ctx,
                            problems)
    z = number(row, "depth", where, problems, positive=True, required=True, limit="length")
    if rf is None or rw is None or z is None:
        return None
    res = heated_basement(area, p, w, rf, rw, z, soil_conductivity=lam,
                          exposed_outline=outline)
    return GroundFloorU(res, method, float(area + z * p), cname, wname, soil_text,
                        {"w": w, "rf": rf, "rw": rw, "rsiw": RSI_WALL})


def _edge(raw, where, label, problems):
    if not isinstance(raw, dict):
        problems.append((where, f"{label}: must be a table {{ orientation, extent, resistance, "
                         "thickness_mm }"))
        return None
    unknown(raw, EDGE_KEYS, where, problems)
    ext = number(raw, "extent", where, problems, positive=True, required=True, limit="length")
    rn = number(raw, "resistance", where, problems, non_negative=True, required=True,
                limit="resistance")
    dn = number(raw, "thickness_mm", where, problems, positive=True, required=True,
                limit="thickness", unit="mm", scale=1e-3)
    if None in (ext, rn, dn):
        return None
    try:
        return EdgeInsulation(raw.get("orientation", ""), ext, rn, dn / 1000.0)
    except HeatLedgerError as exc:
        problems.append((f"{where}.orientation", f"{label}: {exc}"))
        return None


def read_bridge(row, where, room_label, room_name, ctx, problems):
    """One linear or point thermal bridge of a room from its table, or None with problems.

    Parameters
    ----------
    row : dict
        The table. [-]
    where : str
        Key path of the table. [-]
    room_label : str
        The room, for messages. [-]
    room_name : str
        Name of the room. [-]
    ctx : object
        The building's settings, known rooms and constructions. [-]
    problems : list
        (key path, message) is appended for every problem. [-]
    """
    if not isinstance(row, dict):
        problems.append((where, f"{room_label}: a thermal bridge must be a table with name and "
                         "psi and length, or chi and count"))
        return None
    start = len(problems)
    unknown(row, BRIDGE_KEYS, where, problems)
    name = text(row, "name", where, problems)
    if name == "":
        problems.append((f"{where}.name", f"{room_label}: every thermal bridge needs a name"))
    name = name or where
    label = f"{room_label}, thermal bridge {quote(name)}"
    boundary = read_boundary(row, where, label, room_name, ctx, problems)
    linear = "psi" in row or "length" in row or "junction" in row
    try:
        return _bridge_object(row, where, label, name, boundary, linear, start, problems,
                              ctx.junctions)
    finally:
        label_new(problems, start, label)


def _junction(row, where, label, junctions, problems):
    """The junction a bridge names (its psi is computed), or None."""
    if row.get("junction") is None:
        return None
    ref = read_value(BRIDGE_TABLE.column("junction"), row, where, problems)
    if ref is None:
        return None
    if "psi" in row:
        problems.append((f"{where}.junction", f"{label}: give psi or a junction, not both"))
        return None
    if ref not in junctions:
        known = ", ".join(quote(k) for k in junctions) or "none: add a [[junctions]] table"
        problems.append((f"{where}.junction", f"{label}: no junction is called {quote(ref)}; "
                         f"the project has {known}"))
        return None
    return _BROKEN if junctions[ref] is None else junctions[ref]


#: A junction that is known but has a problem of its own.
_BROKEN = object()


def _bridge_object(row, where, label, name, boundary, linear, start, problems, junctions):
    point = "chi" in row or "count" in row
    if linear == point:
        problems.append((where, f"{label}: give psi (W/(m K)) and length (m) for a linear "
                         "bridge, or chi (W/K) and count for point bridges"))
        return None
    if linear:
        junction = _junction(row, where, label, junctions, problems)
        if junction is _BROKEN:  # its own problem is reported where it is defined
            return None
        psi = junction.result.psi_result.psi if junction is not None else number(
            row, "psi", where, problems, required="junction" not in row, limit="psi")
        length = number(row, "length", where, problems, positive=True, required=True,
                        limit="length")
        if len(problems) > start:
            return None
        return LinearBridge(name, psi, length, boundary,
                            junction.name if junction is not None else "")
    chi = number(row, "chi", where, problems, required=True, limit="chi")
    count = row.get("count", 1)
    if isinstance(count, bool) or not isinstance(count, int) or count < 1:
        problems.append((f"{where}.count", f"{label}: must be a whole number of at least 1; "
                         f"got {show(count)}"))
    if len(problems) > start:
        return None
    return PointBridge(name, chi, count, boundary)


def label_new(problems, start, label) -> None:
    """Prefix the problems added since ``start`` with ``label`` (room and element names).

    Parameters
    ----------
    problems : list
        (key path, message) is appended for every problem. [-]
    start : int
        Length of problems before the table was read. [-]
    label : str
        Prefix for the new problems. [-]
    """
    for k in range(start, len(problems)):
        path, msg = problems[k]
        if not msg.startswith("room "):
            problems[k] = (path, f"{label}: {msg}")


def closest(name, choices) -> str:
    """The known names closest to ``name``, for a message (empty when none is close).

    Parameters
    ----------
    name : str
        The name given. [-]
    choices : iterable of str
        The names known. [-]
    """
    choices = sorted(choices)
    if not choices:
        return "; the project has none"
    near = difflib.get_close_matches(name, choices, n=3, cutoff=0.3)
    if not near:
        low = name.lower()
        near = [c for c in choices if low[:3] and c.lower().startswith(low[:3])][:3]
    listed = ", ".join(map(quote, near or choices[:5]))
    return f"; closest names: {listed}" if near else f"; names are: {listed}"
