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
    temp_outside_annual_mean = 9.0   # theta_m,e [degC], needed by ground elements
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
EN 12831-1:2017, clause 6 (recalled); EN ISO 10077-1:2017, clause 6 (recalled); EN ISO 13370:2017,
clauses 8.2 to 8.4 (recalled).
"""

from __future__ import annotations

from dataclasses import dataclass, field

from .._projectio import number, table, table_list, text, unknown
from .._validate import quote, show
from ..errors import HeatLedgerError
from .air import Ventilation
from .element_io import label_new, read_bridge, read_element, read_soil
from .elements import (
    GROUND_FACTOR_FG1,
    GROUNDWATER_FACTOR_DEEP,
    GROUNDWATER_FACTOR_SHALLOW,
)
from .rooms import Building, Room
from .schema import (
    BOUNDARIES,
    BUILDING_TABLE,
    ELEMENT_METHOD_NAMES,
    ELEMENT_TABLE,
    ROOM_TABLE,
)

__all__ = [
    "building_from_dict",
    "BuildingInput",
    "BUILDING_KEYS",
    "ROOM_KEYS",
    "ELEMENT_METHODS",
    "BOUNDARIES",
    "GROUNDWATER",
]

BUILDING_KEYS = BUILDING_TABLE.keys()
ROOM_KEYS = ROOM_TABLE.keys()
VENTILATION_KEYS = ROOM_TABLE.keys(sub="ventilation")
#: Groundwater depth and its factor G_w (EN 12831-1 (recalled)).
GROUNDWATER = {"deep": GROUNDWATER_FACTOR_DEEP, "shallow": GROUNDWATER_FACTOR_SHALLOW}
#: How an element's U-value is found, with the keys each method reads.
ELEMENT_METHODS = {method: ELEMENT_TABLE.keys(method) for method in ELEMENT_METHOD_NAMES}


@dataclass
class BuildingInput:
    """The building of a project and the settings that go with it.

    Parameters
    ----------
    building : Building
        Rooms, constructions and the design external temperature. [-]
    temp_outside : float
        Design external temperature ``theta_e``. [degC]
    degree_days : float or None
        Heating degree-days for the annual energy. [K day]
    degree_day_base : float or None
        Base temperature of the degree-days. [degC]
    temp_outside_annual_mean : float or None
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
    temp_outside: float
    degree_days: float | None = None
    degree_day_base: float | None = None
    temp_outside_annual_mean: float | None = None
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
        """Design heat load at :attr:`temp_outside`. [-]"""
        return self.building.heat_load(self.temp_outside)

    def annual_energy(self):
        """Building :class:`~heatledger.heatloss.AnnualEnergy`, or None without
        degree-days. [-]"""
        if self.degree_days is None:
            return None
        return self.building.annual_energy_result(self.degree_days,
                                                  degree_day_base=self.degree_day_base)

    def room_annual_energy(self) -> dict:
        """Per-room annual energy (empty without degree-days). [-]"""
        if self.degree_days is None:
            return {}
        return self.building.room_annual_energy(self.degree_days,
                                                degree_day_base=self.degree_day_base)


def building_from_dict(data, constructions, library, temp_inside, temp_outside, problems,
                       junctions=None):
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
    junctions : dict, optional
        Junction name -> its psi [W/(m K)] (None: known but broken), for thermal bridges
        that name a junction. [-]

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
    EN 12831-1:2017, clause 6 (recalled).
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
    ctx = _Context(constructions, settings, set(n for n in names if n), temp_outside,
                   dict(junctions or {}))
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
                            temp_outside=temp_outside)
        load = building.heat_load(temp_outside)
    except HeatLedgerError as exc:
        problems.append(("rooms", str(exc)))
        return None
    warnings = [(where.get((r.room, None), "rooms"), text) for r in load.rooms
                for text in r.warnings]
    return BuildingInput(building=building, temp_outside=float(temp_outside),
                         degree_days=settings["degree_days"],
                         degree_day_base=settings["degree_day_base"],
                         temp_outside_annual_mean=settings["theta_me"],
                         groundwater=settings["groundwater"], f_g1=settings["f_g1"],
                         groundwater_factor=settings["g_w"], where=where, warnings=warnings)


# ----------------------------------------------------------------------------- helpers


@dataclass
class _Context:
    constructions: dict
    settings: dict
    room_names: set
    temp_outside: float | None
    junctions: dict = field(default_factory=dict)


def _building_settings(raw, problems) -> dict:
    w = "building"
    dd = number(raw, "degree_days", w, problems, non_negative=True, limit="degree_days")
    base = number(raw, "degree_day_base", w, problems, limit="temperature")
    if dd is not None and base is None:
        problems.append(("building.degree_day_base", "state the base temperature of the "
                         "degree-days (degC) with degree_days; the energy depends on it"))
    if base is not None and dd is None:
        problems.append(("building.degree_days", "is required with degree_day_base"))
    theta_me = number(raw, "temp_outside_annual_mean", w, problems,
                      limit="temperature")
    gw = str(raw.get("groundwater", "deep")).strip().lower()
    if gw not in GROUNDWATER:
        problems.append(("building.groundwater", f'must be one of "deep" (water table more '
                         f'than 1 m below the floor, G_w 1.00) or "shallow" (1 m or less, G_w '
                         f'1.15); got {show(raw.get("groundwater"))}'))
        gw = "deep"
    fg1 = number(raw, "f_g1", w, problems, positive=True, default=GROUND_FACTOR_FG1)
    soil = read_soil(raw, w, problems, None)
    return {"degree_days": dd, "degree_day_base": base, "theta_me": theta_me,
            "groundwater": gw, "g_w": GROUNDWATER[gw],
            "f_g1": GROUND_FACTOR_FG1 if fg1 is None else fg1, "soil": soil}


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
        el = read_element(erow, ew, label, name, ctx, problems)
        if el is not None:
            elements.append(el)
            where_map[(name, el.name)] = ew
    bridges = []
    raw_br = table_list(row, "thermal_bridges", problems, where=where,
                        section="rooms.thermal_bridges")
    for j, brow in enumerate(raw_br, 1):
        bw = f"{where}.thermal_bridges[{j}]"
        br = read_bridge(brow, bw, label, name, ctx, problems)
        if br is not None:
            bridges.append(br)
            where_map[(name, br.name)] = bw
    where_map[(name, None)] = where
    label_new(problems, start, label)
    if len(problems) > start or ti is None:  # no ti: the design temperature's problem
        return None
    try:
        return Room(name, ti, volume, elements, vent, thermal_bridges=bridges,
                    floor_area=floor_area, reheat_factor=reheat,
                    temp_outside=ctx.temp_outside)
    except HeatLedgerError as exc:
        problems.append((where, str(exc)))
        return None


def _ventilation(raw, where, label, problems):
    if not isinstance(raw, dict):
        problems.append((where, f"{label}: give ventilation = {{ basis = \"air_change\" or "
                         "\"flow\", ventilation_rate = ..., infiltration = ..., heat_recovery = "
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
            for k in ("ventilation_rate", "infiltration", "minimum_air_change")}
    eta = number(raw, "heat_recovery", where, problems, non_negative=True, default=0.0)
    if eta is not None and eta > 1.0:
        problems.append((f"{where}.heat_recovery", f"{label}: the heat-recovery efficiency "
                         f"must be between 0 and 1; got {eta:g}"))
        return None
    if None in vals.values() or eta is None:
        return None
    return Ventilation(basis, vals["ventilation_rate"], vals["infiltration"], eta,
                       vals["minimum_air_change"])


