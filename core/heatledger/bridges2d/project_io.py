"""The ``[[junctions]]`` section of a project file: 2-D thermal bridges as project entries.

Schema (see :mod:`heatledger.bridges2d.schema` for every key)::

    [[junctions]]
    name = "J1 balcony at EW2"
    kind = "balcony"               # corner | floor | balcony | stud | rectangles
    construction = "EW2 masonry cavity wall"
    floor = "IF1 intermediate floor"
    projection_mm = 1500
    max_cell_mm = 5

    [[junctions]]                  # drawn as rectangles
    name = "J9 window reveal"
    kind = "rectangles"
    dimensions = "external"
      [[junctions.regions]]
      name = "blockwork"; x0_mm = 0; y0_mm = 0; x1_mm = 100; y1_mm = 1200; conductivity = 0.5
      [[junctions.surfaces]]
      name = "room"; x0_mm = 100; y0_mm = 0; x1_mm = 100; y1_mm = 1200
      temperature = 20; resistance = 0.13; side = "inside"
      [[junctions.flanking]]
      name = "wall"; construction = "EW2 masonry cavity wall"; length = 1.2

Every problem is reported with its key path (``junctions[2].surfaces[1].side``).
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import cached_property

from .._projectio import error_text, table_list, unknown
from .._validate import quote, show
from ..errors import HeatLedgerError
from ..materials import MaterialWithheld
from ..schema import read_value
from .geometry import Region, Surface
from .junctions import external_corner, general_junction, stud_wall, wall_floor
from .schema import FLANK_TABLE, JUNCTION_TABLE, REGION_TABLE, SURFACE_TABLE

__all__ = ["JunctionEntry", "junctions_from_dict"]


@dataclass
class JunctionEntry:
    """A junction of the project.

    Attributes
    ----------
    name : str
    junction : heatledger.bridges2d.Junction
        The built or drawn section with its flanking elements.
    max_cell : float
        Largest cell edge of the grid. [m]
    where : str
        Key path (``junctions[1]``).
    notes : str
    """

    name: str
    junction: object
    max_cell: float
    where: str
    notes: str = ""

    @cached_property
    def result(self):
        """The solved junction (:class:`~heatledger.bridges2d.JunctionResult`)."""
        return self.junction.solve(self.max_cell)


def junctions_from_dict(data, context, problems) -> list:
    """Junctions of the project's ``[[junctions]]`` tables.

    Parameters
    ----------
    data : dict
        The project data. [-]
    context : heatledger.families.ParseContext
        The library, design temperatures and the constructions parsed before. [-]
    problems : list
        Every problem is appended as ``(key path, message)``. [-]

    Returns
    -------
    list of JunctionEntry
    """
    constructions = {name: None for name in context.broken if name}
    constructions.update({e.name: e.construction
                          for e in context.entries.get("constructions", [])})
    out, seen = [], set()
    for i, row in enumerate(table_list(data, "junctions", problems), 1):
        where = f"junctions[{i}]"
        start = len(problems)
        kind = str(row.get("kind", "")).strip().lower() if isinstance(row, dict) else ""
        variant = kind if kind in JUNCTION_TABLE.variants else None
        unknown(row, JUNCTION_TABLE.keys(variant), where, problems)
        v = {c.key: read_value(c, row, where, problems) for c in JUNCTION_TABLE.columns}
        for key, default in (("temp_inside", context.temp_inside),
                             ("temp_outside", context.temp_outside)):
            if v[key] is None:
                v[key] = default
        if v["name"] and v["name"].lower() in seen:
            problems.append((f"{where}.name", f"junction name {show(v['name'])} is used twice"))
        if len(problems) > start or v["temp_inside"] is None or v["temp_outside"] is None:
            if v["temp_inside"] is None or v["temp_outside"] is None:
                problems.append((where, "give temp_inside and temp_outside, or the [design] "
                                 "temperatures"))
            continue
        junction = _build(v, row, where, constructions, context.library, problems)
        if junction is None or len(problems) > start:
            continue
        seen.add(v["name"].lower())
        out.append(JunctionEntry(v["name"], junction, v["max_cell_mm"] / 1000.0, where,
                                 v["notes"] or ""))
    return out


def _build(v, row, where, constructions, library, problems):
    temps = {"temp_inside": v["temp_inside"], "temp_outside": v["temp_outside"],
             "name": v["name"]}
    try:
        if v["kind"] == "rectangles":
            return _drawn(v, row, where, constructions, library, problems)
        wall = _construction(v, "construction", where, constructions, problems)
        if wall is None:
            return None
        if v["kind"] == "corner":
            return external_corner(wall, flank=v["flank"], **temps)
        if v["kind"] == "stud":
            return _stud(v, row, wall, where, library, problems, temps)
        floor = _construction(v, "floor", where, constructions, problems)
        if floor is None:
            return None
        projection = (v["projection_mm"] or 0.0) / 1000.0
        if v["kind"] == "balcony" and projection <= 0.0:
            problems.append((f"{where}.projection_mm", "a balcony needs projection_mm"))
            return None
        bearing = None if v["bearing_mm"] is None else v["bearing_mm"] / 1000.0
        return wall_floor(wall, floor, bearing=bearing, projection=projection,
                          flank=v["flank"], floor_flank=v["floor_flank"], **temps)
    except HeatLedgerError as exc:
        problems.append((where, error_text(exc)))
        return None


def _construction(v, key, where, constructions, problems):
    name = v[key]
    if name is None:
        problems.append((f"{where}.{key}", f"a {v['kind']} junction names its {key}"))
        return None
    if name not in constructions:
        known = ", ".join(quote(k) for k in constructions) or "none"
        problems.append((f"{where}.{key}", f"no construction is called {quote(name)}; the "
                         f"project has {known}"))
        return None
    return constructions[name]


def _conductivity(row, v_mat, v_lam, where, library, problems, key_mat, key_lam):
    if v_mat is not None and v_lam is not None:
        problems.append((f"{where}.{key_lam}", f"give {key_mat} or {key_lam}, not both"))
        return None
    if v_mat is not None:
        try:
            return library.get(v_mat).conductivity
        except (KeyError, MaterialWithheld, HeatLedgerError) as exc:
            problems.append((f"{where}.{key_mat}", error_text(exc)))
            return None
    if v_lam is None:
        problems.append((f"{where}.{key_lam}", f"give {key_mat} or {key_lam}"))
    return v_lam


def _stud(v, row, wall, where, library, problems, temps):
    lam = _conductivity(row, v["stud_material"], v["stud_conductivity"], where, library,
                        problems, "stud_material", "stud_conductivity")
    layer = _layer_index(v["layer"], wall, f"{where}.layer", problems)
    for key in ("stud_width_mm", "spacing_mm"):
        if v[key] is None:
            problems.append((f"{where}.{key}", "is required for a stud junction"))
    if lam is None or layer is None or v["stud_width_mm"] is None or v["spacing_mm"] is None:
        return None
    return stud_wall(wall, layer, stud_width=v["stud_width_mm"] / 1000.0,
                     stud_conductivity=lam, spacing=v["spacing_mm"] / 1000.0, **temps)


def _layer_index(ref, wall, where, problems):
    names = [lay.name for lay in wall.layers]
    if ref is None:
        problems.append((where, "name the layer the studs replace (name or number from "
                         "inside)"))
        return None
    text = str(ref).strip()
    if text.isdigit() and 1 <= int(text) <= len(names):
        return int(text) - 1
    matches = [i for i, n in enumerate(names) if n.lower() == text.lower()]
    if len(matches) != 1:
        problems.append((where, f"no single layer is called {quote(text)}; the layers are "
                         f"{', '.join(quote(n) for n in names)} (or give a number from 1)"))
        return None
    return matches[0]


def _drawn(v, row, where, constructions, library, problems):
    start = len(problems)
    regions, surfaces, flanking, sides = [], [], [], {}
    for j, r in enumerate(table_list(row, "regions", problems, where=where,
                                     section="junctions.regions"), 1):
        at = f"{where}.regions[{j}]"
        unknown(r, REGION_TABLE.keys(), at, problems)
        g = {c.key: read_value(c, r, at, problems) for c in REGION_TABLE.columns
             if c.place != "sheet"}
        lam = _conductivity(r, g["material"], g["conductivity"], at, library, problems,
                            "material", "conductivity")
        if len(problems) == start:
            regions.append(Region(g["x0_mm"] / 1e3, g["y0_mm"] / 1e3, g["x1_mm"] / 1e3,
                                  g["y1_mm"] / 1e3, lam, name=g["name"] or f"region {j}"))
    for j, r in enumerate(table_list(row, "surfaces", problems, where=where,
                                     section="junctions.surfaces"), 1):
        at = f"{where}.surfaces[{j}]"
        unknown(r, SURFACE_TABLE.keys(), at, problems)
        g = {c.key: read_value(c, r, at, problems) for c in SURFACE_TABLE.columns
             if c.place != "sheet"}
        if len(problems) == start:
            surfaces.append(Surface(g["x0_mm"] / 1e3, g["y0_mm"] / 1e3, g["x1_mm"] / 1e3,
                                    g["y1_mm"] / 1e3, temperature=g["temperature"],
                                    resistance=g["resistance"], name=g["name"]))
            sides.setdefault(g["side"], []).append(g["name"])
    for j, r in enumerate(table_list(row, "flanking", problems, where=where,
                                     section="junctions.flanking"), 1):
        at = f"{where}.flanking[{j}]"
        unknown(r, FLANK_TABLE.keys(), at, problems)
        g = {c.key: read_value(c, r, at, problems) for c in FLANK_TABLE.columns
             if c.place != "sheet"}
        u = _flank_u(g, at, constructions, problems)
        if u is not None and len(problems) == start:
            flanking.append((g["name"], u, g["length"]))
    if len(problems) > start:
        return None
    if not sides.get("inside") or not sides.get("outside"):
        problems.append((f"{where}.surfaces", "mark at least one surface side = \"inside\" and "
                         "one side = \"outside\""))
        return None
    return general_junction(regions, surfaces, flanking, dimensions=v["dimensions"],
                            inside=sides["inside"], outside=sides["outside"], name=v["name"])


def _flank_u(g, at, constructions, problems):
    if (g["construction"] is None) == (g["u_value"] is None):
        problems.append((at, "give a construction or a u_value (one of them)"))
        return None
    if g["u_value"] is not None:
        return g["u_value"]
    if g["construction"] not in constructions:
        problems.append((f"{at}.construction", f"no construction is called "
                         f"{quote(g['construction'])}"))
        return None
    con = constructions[g["construction"]]
    return None if con is None else con.u_value_uncorrected
