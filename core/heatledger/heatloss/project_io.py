"""The ``[building]`` and ``[[rooms]]`` sections of a project file, turned into a
:class:`~heatledger.heatloss.Building`.

Every problem is appended to ``problems`` as ``(key path, message)``, key paths numbered from
1 (``rooms[2].elements[3].construction``), and every message about an element names its
room and element. Nothing is chosen silently from which keys are present: each element
states its ``method`` (how its U-value is found) and its ``boundary`` (what lies on the other
side), and unknown keys are problems.

Schema (SI; thickness in mm where a key says so)::

    [building]                       # optional
    name = "..."                     # default: the project name
    degree_days = 3100.0             # heating degree-days [K day], for the annual energy
    degree_day_base = 15.5           # base temperature of those degree-days [degC]
    annual_mean_external_temperature = 9.0   # theta_m,e [degC], needed by ground elements
    groundwater = "deep"             # "deep" (G_w 1.00, > 1 m below the floor) or "shallow"
    f_g1 = 1.45                      # optional override of f_g1 [-]
    soil = "clay"                    # or soil_conductivity = 1.5 [W/(m K)]; default 2.0

    [[rooms]]
    name = "Workshop"
    temp_inside = 18.0               # default: design.temp_inside [degC]
    volume = 160.0                   # [m3]
    floor_area = 64.0                # [m2], for the heating-up allowance
    reheat_factor = 0.0              # f_RH [W/m2]
    ventilation = { basis = "air_change", ventilation = 0.5, infiltration = 0.1,
                    heat_recovery = 0.0, minimum_air_change = 0.5 }
      [[rooms.elements]]
      name = "North wall"; kind = "wall"; method = "construction"
      construction = "EW1 timber-frame external wall"; area = 30.0
      boundary = "outside"           # outside | ground | unheated | room | adjacent
      thermal_bridge_allowance = 0.0 # Delta U_TB [W/(m2 K)]
      ...
      [[rooms.thermal_bridges]]
      name = "Window reveals"; psi = 0.05; length = 24.0     # or chi = 0.1; count = 4

References
----------
EN 12831-1:2017, clause 6 [M]; EN ISO 10077-1:2017, clause 6 [M]; EN ISO 13370:2017,
clauses 8.2 to 8.4 [M].
"""

from __future__ import annotations

import difflib
from dataclasses import dataclass, field

from .._projectio import number, table, table_list, text, unknown
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
from .air import Ventilation
from .elements import (
    ELEMENT_KINDS,
    GROUND_FACTOR_FG1,
    GROUNDWATER_FACTOR_DEEP,
    GROUNDWATER_FACTOR_SHALLOW,
    AdjacentRoom,
    Element,
    Ground,
    LinearBridge,
    Outside,
    PointBridge,
    Unheated,
)
from .rooms import Building, Room
from .schema import (
    BOUNDARIES,
    BRIDGE_TABLE,
    BUILDING_TABLE,
    ELEMENT_METHOD_NAMES,
    ELEMENT_TABLE,
    GROUND_METHODS,
    ROOM_TABLE,
)

__all__ = [
    "building_from_dict",
    "BuildingInput",
    "GroundFloorU",
    "BUILDING_KEYS",
    "ROOM_KEYS",
    "ELEMENT_METHODS",
    "BOUNDARIES",
    "GROUNDWATER",
]

BUILDING_KEYS = BUILDING_TABLE.keys()
ROOM_KEYS = ROOM_TABLE.keys()
VENTILATION_KEYS = ROOM_TABLE.keys(sub="ventilation")
#: Groundwater depth and its factor G_w (EN 12831-1 [M]).
GROUNDWATER = {"deep": GROUNDWATER_FACTOR_DEEP, "shallow": GROUNDWATER_FACTOR_SHALLOW}
#: How an element's U-value is found, with the keys each method reads.
ELEMENT_METHODS = {method: ELEMENT_TABLE.keys(method) for method in ELEMENT_METHOD_NAMES}
#: The physical limit (heatledger._validate.LIMITS) of each window and floor input.
_WINDOW_LIMITS = {k: ELEMENT_TABLE.column(k).limit for k in (
    "glazing_area", "frame_area", "panel_area", "glazing_u", "frame_u", "panel_u",
    "glazing_perimeter", "panel_perimeter")}
_FLOOR_LIMITS = {k: ELEMENT_TABLE.column(k).limit for k in (
    "underfloor_height", "underfloor_wall_u", "vent_area_per_perimeter", "wind_speed")}
EDGE_KEYS = ELEMENT_TABLE.keys(sub="edge_insulation")
BRIDGE_KEYS = BRIDGE_TABLE.keys()


@dataclass(frozen=True)
class GroundFloorU:
    """U-value of a ground element (EN ISO 13370) with the inputs behind it.

    Stands as an element's ``u``: it has ``u_value``, ``method`` and ``area``.

    Parameters
    ----------
    result : object
        :class:`~heatledger.ground.SlabOnGroundResult`, ``SuspendedFloorResult`` or
        ``HeatedBasementResult``. [-]
    method_key : str
        ``"slab_on_ground"``, ``"suspended_floor"`` or ``"heated_basement"``. [-]
    area : float
        Area of the element in the room: the floor area, plus ``z P`` of the walls below
        ground for a heated basement. [m2]
    construction : str
        Name of the project construction that gave ``R_f`` (or the deck), "" if declared. [-]
    wall_construction : str
        Name of the construction that gave ``R_w`` of a basement, "" if declared. [-]
    soil : str
        How the ground conductivity was found. [-]
    inputs : dict
        The inputs of the calculation by short name (``w`` [m], ``rf``, ``rw``, ``rg``
        [m2 K/W], ``h`` [m], ``uw`` [W/(m2 K)], ``eps`` [m2/m], ``v`` [m/s], ``rsiw``
        [m2 K/W]) for the calculation sheet. [-]
    """

    result: object
    method_key: str
    area: float
    construction: str = ""
    wall_construction: str = ""
    soil: str = ""
    inputs: dict = field(default_factory=dict, compare=False)

    @property
    def u_value(self) -> float:
        """``U`` (or ``U'`` of a basement) from EN ISO 13370. [W/(m2 K)]"""
        return float(self.result.u_value)

    @property
    def method(self) -> str:
        """What ran. [-]"""
        return f"{self.result.method}; {self.soil}"


@dataclass
class BuildingInput:
    """The building of a project and the settings that go with it.

    Parameters
    ----------
    building : Building
        Rooms, constructions and the design external temperature. [-]
    external_temperature : float
        Design external temperature ``theta_e``. [degC]
    degree_days : float or None
        Heating degree-days for the annual energy. [K day]
    base_temperature : float or None
        Base temperature of the degree-days. [degC]
    annual_mean_external_temperature : float or None
        ``theta_m,e`` for ground elements. [degC]
    groundwater : str
        ``"deep"`` or ``"shallow"``. [-]
    f_g1 : float
        Ground factor ``f_g1``. [-]
    groundwater_factor : float
        ``G_w``. [-]
    where : dict
        Key path of every room and element, by ``(room, element)`` name. [-]
    warnings : list of (str, str)
        Input that is probably a slip, as ``(key path, message)``. [-]
    """

    building: Building
    external_temperature: float
    degree_days: float | None = None
    base_temperature: float | None = None
    annual_mean_external_temperature: float | None = None
    groundwater: str = "deep"
    f_g1: float = GROUND_FACTOR_FG1
    groundwater_factor: float = GROUNDWATER_FACTOR_DEEP
    where: dict = field(default_factory=dict)
    warnings: list = field(default_factory=list)

    @property
    def rooms(self):
        """The building's rooms. [-]"""
        return self.building.rooms

    def heat_load(self):
        """Design heat load at :attr:`external_temperature`. [-]"""
        return self.building.heat_load(self.external_temperature)

    def annual_energy(self):
        """Building :class:`~heatledger.heatloss.AnnualEnergy`, or None without
        degree-days. [-]"""
        if self.degree_days is None:
            return None
        return self.building.annual_energy_result(self.degree_days,
                                                  base_temperature=self.base_temperature)

    def room_annual_energy(self) -> dict:
        """Per-room annual energy (empty without degree-days). [-]"""
        if self.degree_days is None:
            return {}
        return self.building.room_annual_energy(self.degree_days,
                                                base_temperature=self.base_temperature)


def building_from_dict(data, constructions, library, temp_inside, temp_outside, problems):
    """Parse ``[building]`` and ``[[rooms]]`` into a :class:`BuildingInput`.

    Parameters
    ----------
    data : dict
        The whole project data (TOML tables). [-]
    constructions : dict
        Construction name -> :class:`~heatledger.constructions.Construction` of the same
        project. [-]
    library : MaterialLibrary
        The project's materials (not needed by rooms; kept for the hook's signature). [-]
    temp_inside : float or None
        Design internal temperature of the project, the rooms' default. [degC]
    temp_outside : float or None
        Design external temperature ``theta_e``. [degC]
    problems : list
        Every problem is appended as ``(key path, message)``. [-]

    Returns
    -------
    BuildingInput or None
        None when there are problems or no rooms. [-]

    Notes
    -----
    Each element's U-value comes from the method it names: ``construction`` (U of a
    project construction, EN ISO 6946), ``declared``, ``window`` (EN ISO 10077-1),
    ``slab_on_ground``, ``suspended_floor`` or ``heated_basement`` (EN ISO 13370, with
    ``R_f = R_T - R_si - R_se`` of a named floor construction).

    References
    ----------
    EN 12831-1:2017, clause 6 [M].
    """
    del library
    start = len(problems)
    raw_b = table(data, "building", problems)
    unknown(raw_b, BUILDING_KEYS, "building", problems)
    raw_rooms = table_list(data, "rooms", problems)
    if not raw_rooms:
        problems.append(("rooms", "the [building] section needs at least one [[rooms]] table"))
        return None
    settings = _building_settings(raw_b, problems)
    names = []
    for row in raw_rooms:
        name = text(row, "name", "", []) or ""
        names.append(name)
    seen: set[str] = set()
    for i, name in enumerate(names, 1):
        if name and name in seen:
            problems.append((f"rooms[{i}].name", f"room name {quote(name)} is used twice; room "
                             "names must be unique"))
        seen.add(name)
    ctx = _Context(constructions, settings, set(n for n in names if n), temp_outside)
    rooms = []
    where: dict = {}
    for i, row in enumerate(raw_rooms, 1):
        room = _room(row, f"rooms[{i}]", ctx, temp_inside, problems, where)
        if room is not None:
            rooms.append(room)
    if len(problems) > start or temp_outside is None or len(rooms) < len(raw_rooms):
        return None  # a room left out without a problem of its own: see design.temp_inside
    bname = str(raw_b.get("name", "") or "").strip() or str(
        (data.get("project") or {}).get("name", "") or "building")
    try:
        building = Building(bname, rooms, constructions={k: v for k, v in constructions.items()
                                                         if v is not None},
                            design_external_temperature=temp_outside)
        load = building.heat_load(temp_outside)
    except HeatLedgerError as exc:
        problems.append(("rooms", str(exc)))
        return None
    warnings = [(where.get((r.room, None), "rooms"), text) for r in load.rooms
                for text in r.warnings]
    return BuildingInput(building=building, external_temperature=float(temp_outside),
                         degree_days=settings["degree_days"],
                         base_temperature=settings["degree_day_base"],
                         annual_mean_external_temperature=settings["theta_me"],
                         groundwater=settings["groundwater"], f_g1=settings["f_g1"],
                         groundwater_factor=settings["g_w"], where=where, warnings=warnings)


# ----------------------------------------------------------------------------- helpers


@dataclass
class _Context:
    constructions: dict
    settings: dict
    room_names: set
    temp_outside: float | None


def _building_settings(raw, problems) -> dict:
    w = "building"
    dd = number(raw, "degree_days", w, problems, non_negative=True, limit="degree_days")
    base = number(raw, "degree_day_base", w, problems, limit="temperature")
    if dd is not None and base is None:
        problems.append(("building.degree_day_base", "state the base temperature of the "
                         "degree-days (degC) with degree_days; the energy depends on it"))
    if base is not None and dd is None:
        problems.append(("building.degree_days", "is required with degree_day_base"))
    theta_me = number(raw, "annual_mean_external_temperature", w, problems,
                      limit="temperature")
    gw = str(raw.get("groundwater", "deep")).strip().lower()
    if gw not in GROUNDWATER:
        problems.append(("building.groundwater", f'must be one of "deep" (water table more '
                         f'than 1 m below the floor, G_w 1.00) or "shallow" (1 m or less, G_w '
                         f'1.15); got {show(raw.get("groundwater"))}'))
        gw = "deep"
    fg1 = number(raw, "f_g1", w, problems, positive=True, default=GROUND_FACTOR_FG1)
    soil = _soil(raw, w, problems, None)
    return {"degree_days": dd, "degree_day_base": base, "theta_me": theta_me,
            "groundwater": gw, "g_w": GROUNDWATER[gw],
            "f_g1": GROUND_FACTOR_FG1 if fg1 is None else fg1, "soil": soil}


def _soil(raw, where, problems, default):
    """(conductivity, text) of the soil named in ``raw``, or ``default``."""
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


def _room(row, where, ctx, temp_inside, problems, where_map):
    if not isinstance(row, dict):
        problems.append((where, "must be a table with name, volume, ventilation and elements"))
        return None
    start = len(problems)
    unknown(row, ROOM_KEYS, where, problems)
    name = text(row, "name", where, problems)
    if name == "":
        problems.append((f"{where}.name", "every room needs a name"))
    if not name:
        name = where
    label = f"room {quote(name)}"
    ti = number(row, "temp_inside", where, problems, default=temp_inside, limit="temperature")
    if ti is not None and ctx.temp_outside is not None and not ti > ctx.temp_outside:
        problems.append((f"{where}.temp_inside", f"{label}: must be above the design external "
                         f"temperature {ctx.temp_outside:g} degC; got {ti:g} degC"))
    volume = number(row, "volume", where, problems, positive=True, required=True,
                    limit="volume")
    floor_area = number(row, "floor_area", where, problems, non_negative=True, default=0.0,
                        limit="area")
    reheat = number(row, "reheat_factor", where, problems, non_negative=True, default=0.0,
                    limit="area_load")
    vent = _ventilation(row.get("ventilation"), f"{where}.ventilation", label, problems)
    elements = []
    raw_el = table_list(row, "elements", problems, where=where, section="rooms.elements")
    for j, erow in enumerate(raw_el, 1):
        ew = f"{where}.elements[{j}]"
        el = _element(erow, ew, label, name, ctx, problems)
        if el is not None:
            elements.append(el)
            where_map[(name, el.name)] = ew
    bridges = []
    raw_br = table_list(row, "thermal_bridges", problems, where=where,
                        section="rooms.thermal_bridges")
    for j, brow in enumerate(raw_br, 1):
        bw = f"{where}.thermal_bridges[{j}]"
        br = _bridge(brow, bw, label, name, ctx, problems)
        if br is not None:
            bridges.append(br)
            where_map[(name, br.name)] = bw
    where_map[(name, None)] = where
    _label_new(problems, start, label)
    if len(problems) > start or ti is None:  # no ti: the design temperature's problem
        return None
    try:
        return Room(name, ti, volume, elements, vent, thermal_bridges=bridges,
                    floor_area=floor_area, reheat_factor=reheat,
                    design_external_temperature=ctx.temp_outside)
    except HeatLedgerError as exc:
        problems.append((where, str(exc)))
        return None


def _ventilation(raw, where, label, problems):
    if not isinstance(raw, dict):
        problems.append((where, f"{label}: give ventilation = {{ basis = \"air_change\" or "
                         "\"flow\", ventilation = ..., infiltration = ..., heat_recovery = "
                         "..., minimum_air_change = ... }"))
        return None
    unknown(raw, VENTILATION_KEYS, where, problems)
    basis = str(raw.get("basis", "")).strip().lower()
    if basis not in ("air_change", "flow"):
        problems.append((f"{where}.basis", f'{label}: must be "air_change" (1/h) or "flow" '
                         f'(m3/h); got {show(raw.get("basis"))}'))
        return None
    rate = "air_change" if basis == "air_change" else "air_flow"
    vals = {k: number(raw, k, where, problems, non_negative=True, default=0.0,
                      limit="air_change" if k == "minimum_air_change" else rate)
            for k in ("ventilation", "infiltration", "minimum_air_change")}
    eta = number(raw, "heat_recovery", where, problems, non_negative=True, default=0.0)
    if eta is not None and eta > 1.0:
        problems.append((f"{where}.heat_recovery", f"{label}: the heat-recovery efficiency "
                         f"must be between 0 and 1; got {eta:g}"))
        return None
    if None in vals.values() or eta is None:
        return None
    return Ventilation(basis, vals["ventilation"], vals["infiltration"], eta,
                       vals["minimum_air_change"])


def _boundary(row, where, label, own_room, ctx, problems, default="outside"):
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
            problems.append(("building.annual_mean_external_temperature",
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
                         f"{_closest(other, ctx.room_names)}"))
        return None
    return AdjacentRoom(room=other)


def _element(row, where, room_label, room_name, ctx, problems):
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
    boundary = _boundary(row, where, label, room_name, ctx, problems, default=default_b)
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
    _label_new(problems, start, label)
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
                         f"{_closest(ref, ctx.constructions)}"))
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
    soil = _soil(row, where, problems, ctx.settings["soil"])
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


def _bridge(row, where, room_label, room_name, ctx, problems):
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
    boundary = _boundary(row, where, label, room_name, ctx, problems)
    linear = "psi" in row or "length" in row
    try:
        return _bridge_object(row, where, label, name, boundary, linear, start, problems)
    finally:
        _label_new(problems, start, label)


def _bridge_object(row, where, label, name, boundary, linear, start, problems):
    point = "chi" in row or "count" in row
    if linear == point:
        problems.append((where, f"{label}: give psi (W/(m K)) and length (m) for a linear "
                         "bridge, or chi (W/K) and count for point bridges"))
        return None
    if linear:
        psi = number(row, "psi", where, problems, required=True, limit="psi")
        length = number(row, "length", where, problems, positive=True, required=True,
                        limit="length")
        if len(problems) > start:
            return None
        return LinearBridge(name, psi, length, boundary)
    chi = number(row, "chi", where, problems, required=True, limit="chi")
    count = row.get("count", 1)
    if isinstance(count, bool) or not isinstance(count, int) or count < 1:
        problems.append((f"{where}.count", f"{label}: must be a whole number of at least 1; "
                         f"got {show(count)}"))
    if len(problems) > start:
        return None
    return PointBridge(name, chi, count, boundary)


def _label_new(problems, start, label) -> None:
    """Prefix the problems added since ``start`` with ``label`` (room and element names)."""
    for k in range(start, len(problems)):
        path, msg = problems[k]
        if not msg.startswith("room "):
            problems[k] = (path, f"{label}: {msg}")


def _closest(name, choices) -> str:
    choices = sorted(choices)
    if not choices:
        return "; the project has none"
    near = difflib.get_close_matches(name, choices, n=3, cutoff=0.3)
    if not near:
        low = name.lower()
        near = [c for c in choices if low[:3] and c.lower().startswith(low[:3])][:3]
    listed = ", ".join(map(quote, near or choices[:5]))
    return f"; closest names: {listed}" if near else f"; names are: {listed}"
