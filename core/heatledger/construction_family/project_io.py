"""The ``[[constructions]]`` section of a project file: constructions with their layers and
corrections as project entries (EN ISO 6946).

Every problem is reported with its key path, for example
``constructions[2].layers[3].thickness_mm`` (numbering from 1, as a consultant counts rows);
the keys each table allows come from :mod:`heatledger.construction_family.schema`.
"""

from __future__ import annotations

from dataclasses import dataclass

from .._projectio import error_text, number, table_list, text, unknown
from .._validate import MAX_PROJECT_CELLS_PER_LAYER, choices_text, quote, show
from ..airlayers import MAX_AIR_LAYER_THICKNESS, VENTILATION_CLASSES
from ..constructions import (
    AirGapCorrection,
    AirLayer,
    BridgedLayer,
    Construction,
    FastenerCorrection,
    InvertedRoofCorrection,
    Layer,
)
from ..errors import HeatLedgerError, ProjectError
from ..materials import MaterialLibrary, MaterialWithheld, default_library
from ..surfaces import HEAT_FLOWS
from .schema import (
    CONSTRUCTION_TABLE,
    CORRECTION_KINDS,
    CORRECTION_TABLE,
    LAYER_KINDS,
    LAYER_TABLE,
)

__all__ = ["ConstructionEntry", "build_construction", "constructions_from_dict",
           "CONSTRUCTION_KEYS", "LAYER_KEYS", "CORRECTION_KEYS"]

CONSTRUCTION_KEYS = CONSTRUCTION_TABLE.keys()
LAYER_KEYS = {kind: LAYER_TABLE.keys(kind) for kind in LAYER_KINDS}
CORRECTION_KEYS = {kind: CORRECTION_TABLE.keys(kind) for kind in CORRECTION_KINDS}


@dataclass
class ConstructionEntry:
    """A construction of the project with its use: area and target.

    Attributes
    ----------
    name : str
        Name of the construction. [-]
    construction : Construction
        The engine's construction. [-]
    area : float or None
        Area, for the summary. [m2]
    target_u : float or None
        Target U-value. [W/(m2 K)]
    nodes_per_layer : int or None
        Finite-volume cells per layer. [-]
    layer_inputs : list of dict
        The layer tables as read. [-]
    where : str
        Key path of the table. [-]
    notes : str
        Free text. [-]
    size_layer : int or None
        Layer to size for the target, 0 = inside. [-]
    """

    name: str
    construction: Construction
    area: float | None
    target_u: float | None
    nodes_per_layer: int | None
    layer_inputs: list
    where: str
    notes: str = ""
    size_layer: int | None = None

    def required_thickness(self) -> float | None:
        """Thickness of ``size_layer`` that meets ``target_u``, or None if either is not
        given. [m]"""
        if self.size_layer is None or self.target_u is None:
            return None
        from ..constructions import required_thickness

        return required_thickness(self.construction, self.size_layer, self.target_u)


def constructions_from_dict(data, library, problems, broken) -> list:
    """Construction entries of the ``[[constructions]]`` tables of a project.

    Parameters
    ----------
    data : dict
        The project data. [-]
    library : MaterialLibrary
        Materials to resolve names against (with the project's own). [-]
    problems : list
        Every problem is appended as ``(key path, message)``. [-]
    broken : set of str
        Extended with the names of constructions that have a problem of their own. [-]

    Returns
    -------
    list of ConstructionEntry
        The entries without problems, in file order.
    """
    entries = []
    names_seen: set[str] = set()
    for i, row in enumerate(table_list(data, "constructions", problems), 1):
        where = f"constructions[{i}]"
        entry = _construction(row, where, library, problems)
        if entry is None:  # keep the name known: its references are not "unknown"
            broken.add(text(row, "name", where, []) or "")
            continue
        if entry.name.lower() in names_seen:
            problems.append((f"{where}.name", f"construction name {quote(entry.name)} is used "
                             "twice; names must be unique"))
        names_seen.add(entry.name.lower())
        entries.append(entry)
    return entries


def build_construction(row: dict, library: MaterialLibrary | None = None, *,
                       where: str = "construction") -> ConstructionEntry:
    """Build one construction entry from a row dictionary; raise on the first problems.

    Parameters
    ----------
    row : dict
        A construction table in the project-file schema. [-]
    library : MaterialLibrary, optional
        Materials to resolve names against; default the generic library. [-]
    where : str
        Key path used in messages. [-]

    Returns
    -------
    ConstructionEntry
    """
    problems: list = []
    entry = _construction(row, where, library or default_library(), problems)
    if problems:
        raise ProjectError(problems)
    return entry


# ------------------------------------------------------------------------------------------


def _construction(row, where, library, problems) -> ConstructionEntry | None:
    if not isinstance(row, dict):
        problems.append((where, "must be a table with name, heat_flow and layers"))
        return None
    start = len(problems)
    unknown(row, CONSTRUCTION_KEYS, where, problems)
    name = text(row, "name", where, problems)
    if name == "":
        problems.append((f"{where}.name", "every construction needs a name"))
    heat_flow = row.get("heat_flow", "horizontal")
    if not isinstance(heat_flow, str) or heat_flow.strip().lower() not in HEAT_FLOWS:
        problems.append((f"{where}.heat_flow", f"must be one of {choices_text(HEAT_FLOWS)} "
                         f"(roofs up, walls horizontal, floors down); got {show(heat_flow)}"))
    area = number(row, "area", where, problems, positive=True, limit="area")
    target = number(row, "target_u", where, problems, positive=True, limit="u_value")
    rsi = number(row, "rsi", where, problems, non_negative=True, limit="surface_resistance")
    rse = number(row, "rse", where, problems, non_negative=True, limit="surface_resistance")
    nodes = row.get("nodes_per_layer")
    if nodes is not None and (isinstance(nodes, bool) or not isinstance(nodes, int)
                              or not 1 <= nodes <= MAX_PROJECT_CELLS_PER_LAYER):
        problems.append((f"{where}.nodes_per_layer", f"must be a whole number from 1 to "
                         f"{MAX_PROJECT_CELLS_PER_LAYER} (each cell is a row of the audit "
                         f"sheet); got {show(nodes)}"))
        nodes = None
    layers_in = row.get("layers")
    if not isinstance(layers_in, list) or not layers_in:
        problems.append((f"{where}.layers", "list at least one layer, inside to outside"))
        layers_in = []
    layers = []
    for j, lrow in enumerate(layers_in, 1):
        lw = f"{where}.layers[{j}]"
        try:
            layers.append(_layer(lrow, lw, library, problems))
        except HeatLedgerError as exc:
            problems.append((exc.where or lw, error_text(exc)))
    corrections = []
    for j, crow in enumerate(row.get("corrections") or [], 1):
        cw = f"{where}.corrections[{j}]"
        try:
            corrections.append(_correction(crow, cw, layers_in, library, problems))
        except HeatLedgerError as exc:
            problems.append((exc.where or cw, error_text(exc)))
    size_layer = None
    if row.get("size_layer") is not None:
        size_layer = _layer_index(row.get("size_layer"), layers_in, f"{where}.size_layer",
                                  problems)
        if target is None:
            problems.append((f"{where}.target_u", "size_layer needs a target_u to size for"))
    if len(problems) > start or any(lay is None for lay in layers) or \
            any(c is None for c in corrections):
        return None
    try:
        con = Construction(layers, heat_flow, rsi=rsi, rse=rse, name=name,
                           corrections=corrections,
                           apply_small_corrections=bool(row.get("apply_small_corrections",
                                                                False)))
    except HeatLedgerError as exc:
        problems.append((where, error_text(exc)))
        return None
    return ConstructionEntry(name, con, area, target, nodes, list(layers_in), where,
                             str(row.get("notes") or ""), size_layer)


def _layer(row, where, library, problems):
    if not isinstance(row, dict):
        problems.append((where, "must be a table with kind, thickness_mm and a material"))
        return None
    kind = row.get("kind", "material")
    kind = kind.strip().lower() if isinstance(kind, str) else kind
    if kind not in LAYER_KINDS:
        problems.append((f"{where}.kind", f"must be one of {choices_text(LAYER_KINDS)}; "
                         f"got {show(row.get('kind'))}"))
        return None
    start = len(problems)
    unknown(row, LAYER_KEYS[kind], where, problems)
    d_mm = number(row, "thickness_mm", where, problems, positive=True, required=True,
                  limit="thickness", unit="mm", scale=1e-3)
    name = text(row, "name", where, problems) or ""
    if kind == "air" and d_mm is not None and d_mm > MAX_AIR_LAYER_THICKNESS * 1000.0:
        label = f"air layer {quote(name)}" if name else "the air layer"
        problems.append((f"{where}.thickness_mm", f"{label} is {d_mm:g} mm thick; the ISO 6946 "
                         f"Annex D method covers air layers up to "
                         f"{MAX_AIR_LAYER_THICKNESS * 1000.0:g} mm: treat a larger space as an "
                         "unheated space or a room"))
    vapour = _vapour(row, where, problems)
    if len(problems) > start:
        return None
    d = d_mm / 1000.0
    if kind == "material":
        mat, lam = _material_or_conductivity(row, "material", "conductivity", where, library,
                                             problems)
        if lam is None:
            return None
        return Layer(d, lam, name=name or (mat.name if mat else ""), material=mat, **vapour)
    if kind == "declared":
        r = number(row, "resistance", where, problems, positive=True, required=True,
                   limit="layer_resistance")
        return None if r is None else Layer(d, resistance=r, name=name, **vapour)
    if kind == "air":
        mu = vapour.get("vapour_resistance_factor")
        return _air_layer(row, d, name, where, problems,
                          vapour.get("sd", None if mu is None else mu * d))
    mat, lam = _material_or_conductivity(row, "material", "conductivity", where, library,
                                         problems)
    bmat, blam = _material_or_conductivity(row, "bridging_material", "bridging_conductivity",
                                           where, library, problems)
    frac = number(row, "bridging_fraction", where, problems, required=True)
    if lam is None or blam is None or frac is None:
        return None
    if not 0.0 < frac < 1.0:
        problems.append((f"{where}.bridging_fraction", f"must be between 0 and 1 (the share of "
                         f"the area taken by studs, joists or battens); got {frac:g}"))
        return None
    label = name or f"{mat.name if mat else lam} bridged by {bmat.name if bmat else blam}"
    if not vapour and mat is not None and mat.vapour_resistance_factor is not None:
        vapour = {"vapour_resistance_factor": mat.vapour_resistance_factor}
    return BridgedLayer(d, [(lam, 1.0 - frac), (blam, frac)], name=label, **vapour)


def _vapour(row, where, problems) -> dict:
    """The layer's stated vapour value (mu or sd, not both) as keyword arguments."""
    mu = number(row, "vapour_resistance_factor", where, problems, positive=True,
                limit="vapour_resistance_factor")
    sd = number(row, "sd", where, problems, positive=True, limit="sd")
    if mu is not None and sd is not None:
        problems.append((f"{where}.sd", "give either vapour_resistance_factor or sd, not "
                         "both"))
        return {}
    return ({"vapour_resistance_factor": mu} if mu is not None else {}) | (
        {"sd": sd} if sd is not None else {})


def _air_layer(row, d, name, where, problems, sd=None):
    start = len(problems)
    eps = [number(row, key, where, problems, default=0.9) for key in ("emissivity_1",
                                                                       "emissivity_2")]
    for key, e in zip(("emissivity_1", "emissivity_2"), eps, strict=True):
        if e is not None and not 0.0 < e <= 1.0:
            problems.append((f"{where}.{key}", f"must be above 0 and at most 1; got {e:g}"))
    vent = number(row, "vent_area_mm2", where, problems, non_negative=True)
    ventilation = row.get("ventilation", "unventilated")
    if not isinstance(ventilation, str) or ventilation.strip().lower() not in \
            VENTILATION_CLASSES:
        problems.append((f"{where}.ventilation", f"must be one of "
                         f"{choices_text(VENTILATION_CLASSES)}; got {show(ventilation)}"))
    if len(problems) > start:
        return None
    return AirLayer(d, ventilation=ventilation, emissivity_1=eps[0], emissivity_2=eps[1],
                    vent_area=vent, name=name, sd=sd)


def _correction(row, where, layers_in, library, problems):
    if not isinstance(row, dict):
        problems.append((where, "must be a table with kind and layer"))
        return None
    kind = row.get("kind", "")
    kind = kind.strip().lower() if isinstance(kind, str) else kind
    if kind not in CORRECTION_KINDS:
        problems.append((f"{where}.kind", f"must be one of "
                         f"{choices_text(CORRECTION_KINDS)}; got {show(row.get('kind'))}"))
        return None
    unknown(row, CORRECTION_KEYS[kind], where, problems)
    idx = _layer_index(row.get("layer"), layers_in, f"{where}.layer", problems)
    if idx is None:
        return None
    if kind == "air_gaps":
        level = row.get("level")
        if level not in (0, 1, 2) or isinstance(level, bool):
            problems.append((f"{where}.level", f"must be 0, 1 or 2; got {show(level)}"))
            return None
        return AirGapCorrection(idx, int(level))
    if kind == "fasteners":
        _, lam = _material_or_conductivity(row, "material", "conductivity", where, library,
                                           problems)
        area = number(row, "cross_section_mm2", where, problems, positive=True, required=True,
                      limit="area", unit="mm2", scale=1e-6)
        n = number(row, "count_per_m2", where, problems, non_negative=True, required=True,
                   limit="count_per_m2")
        pen = number(row, "penetration_mm", where, problems, positive=True,
                     limit="thickness", unit="mm", scale=1e-3)
        if lam is None or area is None or n is None:
            return None
        return FastenerCorrection(idx, lam, area * 1e-6, n,
                                  penetration=None if pen is None else pen / 1000.0,
                                  edition=str(row.get("edition", "2017")),
                                  application=str(row.get("application", "wall")))
    p = number(row, "precipitation_mm_per_day", where, problems, non_negative=True,
               required=True, limit="precipitation")
    f = number(row, "drainage_factor", where, problems, non_negative=True, required=True)
    x = number(row, "factor_x", where, problems, non_negative=True, default=0.04,
               limit="factor_x")
    if f is not None and f > 1.0:
        problems.append((f"{where}.drainage_factor", f"must be between 0 and 1 (the share of "
                         f"the rain that reaches the membrane); got {f:g}"))
        return None
    if p is None or f is None or x is None:
        return None
    return InvertedRoofCorrection(idx, p, f, x)


def _layer_index(ref, layers_in, where, problems):
    names = [str(r.get("name", "") or r.get("material", "")).strip().lower()
             if isinstance(r, dict) else "" for r in layers_in]
    if isinstance(ref, int) and not isinstance(ref, bool):
        if 1 <= ref <= len(layers_in):
            return ref - 1
        problems.append((where, f"layer number must be 1 to {len(layers_in)}; got {ref}"))
        return None
    if isinstance(ref, str) and ref.strip().lower() in names:
        return names.index(ref.strip().lower())
    problems.append((where, f"must name a layer of this construction (its name or number 1 to "
                     f"{len(layers_in)}); got {show(ref)}"))
    return None


def _material_or_conductivity(row, mat_key, lam_key, where, library, problems):
    name = text(row, mat_key, where, problems)
    lam = row.get(lam_key)
    mat = None
    if name is None:
        return None, None
    if name:
        try:
            mat = library.get(str(name))
        except MaterialWithheld:  # its own entry's problem is reported there
            return None, None
        except HeatLedgerError as exc:
            problems.append((f"{where}.{mat_key}", str(exc)))
            return None, None
    if lam is not None:
        value = number(row, lam_key, where, problems, positive=True, limit="conductivity")
        return mat, value
    if mat is None:
        problems.append((f"{where}.{mat_key}", f"give {mat_key} (a library name) or {lam_key} "
                         "(W/(m K))"))
        return None, None
    return mat, mat.conductivity
