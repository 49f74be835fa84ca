"""The ``[[fins]]`` section of a project file: fins and finned surfaces as project entries.

Lengths are given in millimetres, as in a heat-sink or finned-tube data sheet (and as
thicknesses are in the construction tables); everything else is SI: conductivity in
W/(m K), convection coefficient in W/(m2 K), temperatures in degC, areas in m2, heat rates
in W. The method is always explicit: ``kind`` says whether the fin is straight or annular,
and a straight fin is a plate when ``thickness_mm`` is given and a pin when ``diameter_mm``
is given (the engine's front door). Every problem is reported with its key path, for
example ``fins[2].length_mm`` (numbering from 1); unknown keys are problems, so a typo never
passes silently.

Schema (one ``[[fins]]`` table per fin or finned surface)::

    [[fins]]
    name = "HS1 drive heat-sink fin"   # required, unique
    kind = "straight"                  # required: "straight" or "annular"
    material = "aluminium alloy"       # a library material name, or:
    # conductivity = 160.0             # W/(m K) (one of material / conductivity)
    h = 12.0                           # W/(m2 K), convection coefficient on the fin
    temp_base = 70.0            # degC, temperature of the fin base
    temp_fluid = 40.0                     # degC, fluid (air) temperature
    # straight fins:
    length_mm = 40.0                   # base to tip
    thickness_mm = 2.0                 # plate fin (or diameter_mm = 6.0 for a pin fin)
    width_mm = 120.0                   # plate width along the base (default 1000 = per m)
    profile = "rectangular"            # "rectangular" (default), "triangular", "parabolic"
    tip = "convective"                 # "convective" (default for straight fins),
                                       # "adiabatic", "temperature", "infinite"
    # temp_tip = 30.0           # degC, only with tip = "temperature"
    corrected_length = false           # L_c = L + t/2 (or D/4), convective tip only
    # annular fins (instead of length/thickness/width/profile):
    # tube_diameter_mm = 22.0          # outside diameter of the tube = fin root diameter
    # fin_diameter_mm = 50.0           # outside diameter of the fin
    # thickness_mm = 0.5
    # tip = "adiabatic"                # "adiabatic" (default for annular) or "convective"
    notes = ""

      [fins.array]                     # optional: N fins on a base
      count = 14                       # number of fins
      base_area = 0.0216               # m2, base area INCLUDING the fin roots
      contact_resistance = 0.0         # m2 K/W at each fin root (default 0)
      target_heat_rate = 150.0         # W, optional: size fin length and fin count

      [fins.fv]                        # optional finite-volume settings
      cells = 40                       # control volumes (default 40, at most 500)
      emissivity = 0.0                 # radiation to surroundings (default 0 = none)
      temp_surroundings = 40.0         # degC, radiating surroundings (default temp_fluid)
      h_coefficient = 3.0              # with h_exponent: h = C |T - T_inf|^n in the FV
      h_exponent = 0.25                # solution (natural convection), replacing h
"""

from __future__ import annotations

from dataclasses import dataclass

from .._projectio import number, unknown
from .._validate import choices_text, show
from ..errors import HeatLedgerError
from ..materials import MaterialWithheld
from .annular import ANNULAR_TIPS, AnnularFin
from .arrays import FinArray
from .fv import PowerLawCoefficient
from .schema import DEFAULT_FV_CELLS, FIN_KINDS, FIN_TABLE, MAX_FV_CELLS
from .straight import STRAIGHT_PROFILES, STRAIGHT_TIPS, StraightFin

__all__ = ["FinEntry", "FinFVSettings", "fins_from_dict", "fin_results", "FIN_KINDS", "FIN_KEYS",
           "ARRAY_KEYS", "FV_KEYS", "DEFAULT_FV_CELLS", "MAX_FV_CELLS"]

#: Keys of a ``[[fins]]`` table per kind, of ``[fins.array]`` and of ``[fins.fv]``
#: (derived from :data:`heatledger.fins.schema.FIN_TABLE`).
FIN_KEYS = {kind: FIN_TABLE.keys(kind) for kind in FIN_KINDS}
ARRAY_KEYS = FIN_TABLE.keys(sub="array")
FV_KEYS = FIN_TABLE.keys(sub="fv")

#: A fin dimension in mm, within the physical limit of a thickness (10 m).
_MM = {"limit": "thickness", "unit": "mm", "scale": 1e-3}


@dataclass(frozen=True)
class FinFVSettings:
    """Finite-volume settings of a fin entry.

    Attributes
    ----------
    cells : int
        Number of control volumes. [-]
    emissivity : float
        Emissivity for radiation to the surroundings (0 = none). [-]
    temp_surroundings : float or None
        Radiating surroundings temperature; None = the ambient. [degC]
    h_law : PowerLawCoefficient or None
        ``h = C |T - T_inf|^n`` replacing the constant ``h`` in the finite volumes. [-]
    """

    cells: int = DEFAULT_FV_CELLS
    emissivity: float = 0.0
    temp_surroundings: float | None = None
    h_law: PowerLawCoefficient | None = None

    @property
    def nonlinear(self) -> bool:
        """True when the FV solution iterates (h(T) or radiation). [-]"""
        return self.h_law is not None or self.emissivity > 0.0


@dataclass
class FinEntry:
    """A fin or finned surface of the project.

    Attributes
    ----------
    name : str
        Name of the entry (unique in the project).
    fin : StraightFin or AnnularFin
        One fin, SI units.
    array : FinArray or None
        The fins on their base when ``[fins.array]`` is given.
    temp_base, temp_fluid : float
        Base and fluid temperatures. [degC]
    fv : FinFVSettings
        Finite-volume settings.
    target_heat_rate : float or None
        Target heat rate of the array for the inverse answers. [W]
    material : Material or None
        The library material named, if any.
    row : dict
        The raw ``[[fins]]`` table.
    where : str
        Key path of the table (``fins[2]``).
    notes : str
    """

    name: str
    fin: object
    array: FinArray | None
    temp_base: float
    temp_fluid: float
    fv: FinFVSettings
    target_heat_rate: float | None
    material: object
    row: dict
    where: str
    notes: str = ""

    @property
    def kind(self) -> str:
        """``"straight"`` or ``"annular"``. [-]"""
        return "annular" if isinstance(self.fin, AnnularFin) else "straight"

    def evaluate(self):
        """Closed-form result of one fin (:class:`~heatledger.fins.FinResult`)."""
        return self.fin.evaluate(self.temp_base, self.temp_fluid)

    def evaluate_array(self):
        """Array result (:class:`~heatledger.fins.FinArrayResult`) or None."""
        if self.array is None:
            return None
        return self.array.evaluate(self.temp_base, self.temp_fluid)

    def finite_volume(self):
        """Finite-volume result of one fin with this entry's settings
        (:class:`~heatledger.fins.FinFVResult`)."""
        s = self.fv
        return self.fin.finite_volume(self.temp_base, self.temp_fluid, nodes=s.cells,
                                      h=s.h_law, emissivity=s.emissivity,
                                      temp_surroundings=s.temp_surroundings)

    def sizing(self) -> dict:
        """Inverse answers for ``target_heat_rate``: ``{"length": FinSizing or message,
        "count": FinSizing or message}``; empty without a target or an array."""
        if self.array is None or self.target_heat_rate is None:
            return {}
        out = {}
        for key, method in (("length", self.array.length_for_heat_rate),
                            ("count", self.array.count_for_heat_rate)):
            try:
                out[key] = method(self.target_heat_rate, self.temp_base, self.temp_fluid)
            except HeatLedgerError as exc:
                out[key] = str(exc)
        return out


def fins_from_dict(rows, library, problems) -> list:
    """Fin entries from the ``[[fins]]`` tables of a project.

    Parameters
    ----------
    rows : list of dict
        The ``fins`` list of the project data. [-]
    library : MaterialLibrary
        Materials to resolve ``material`` names against. [-]
    problems : list
        Every problem is appended as ``(key path, message)``. [-]

    Returns
    -------
    list of FinEntry
        The entries that have no problem.
    """
    if not isinstance(rows, list):
        problems.append(("fins", "must be a list of tables ([[fins]])"))
        return []
    out = []
    seen: set[str] = set()
    for i, row in enumerate(rows, 1):
        where = f"fins[{i}]"
        entry = _entry(row, where, library, problems)
        if entry is None:
            continue
        if entry.name.lower() in seen:
            problems.append((f"{where}.name", f"fin name {show(entry.name)} is used twice; names "
                             "must be unique"))
            continue
        seen.add(entry.name.lower())
        out.append(entry)
    return out


def fin_results(entries) -> list:
    """Results of fin entries as plain data (the CLI's ``--json`` schema for fins).

    Parameters
    ----------
    entries : list of FinEntry
        The project's fins. [-]

    Returns
    -------
    list of dict
        Per entry: ``heat_rate`` [W], ``efficiency`` and ``effectiveness`` [-],
        ``resistance`` [K/W], ``temp_tip`` [degC] of one fin; ``fv`` (finite-volume
        heat rate [W], energy residual [-], mesh estimate [W], cells); ``array`` (count, heat
        rate [W], overall efficiency [-], resistance [K/W]) or None; ``sizing`` (fin length
        [mm] and count for the target, or the reason there is none); ``warnings``.
    """
    out = []
    for e in entries:
        res = e.evaluate()
        fv = e.finite_volume()
        arr = e.evaluate_array()
        warns = list(dict.fromkeys(res.warnings + (arr.warnings if arr is not None else ())
                                   + tuple(f"finite volumes: {t}" for t in fv.warnings)))
        sizing = {}
        for key, answer in e.sizing().items():
            if isinstance(answer, str):
                sizing[key] = {"value": None, "message": answer}
            else:
                value = answer.value * 1000.0 if key == "length" else answer.value
                sizing[key] = {"value": value, "message": "",
                               "unit": "mm" if key == "length" else "-"}
        out.append({
            "name": e.name, "kind": e.kind, "method": res.method,
            "temp_base": e.temp_base, "temp_fluid": e.temp_fluid,
            "heat_rate": res.heat_rate, "efficiency": res.efficiency,
            "effectiveness": res.effectiveness, "fin_resistance": res.fin_resistance,
            "temp_tip": res.temp_tip,
            "fv": {"heat_rate": fv.heat_rate, "temp_tip": fv.temp_tip,
                   "energy_residual": fv.energy_residual,
                   "mesh_estimate_heat_rate": fv.mesh_estimate.error_estimate,
                   "cells": fv.settings["cells"], "iterations": fv.iterations,
                   "nonlinear": e.fv.nonlinear},
            "array": None if arr is None else {
                "count": arr.count, "heat_rate": arr.heat_rate,
                "overall_efficiency": arr.overall_efficiency, "fin_resistance": arr.fin_resistance,
                "target_heat_rate": e.target_heat_rate},
            "sizing": sizing, "warnings": warns, "notes": list(res.notes),
        })
    return out


# ----------------------------------------------------------------------------- internals
def _entry(row, where, library, problems):
    if not isinstance(row, dict):
        problems.append((where, "must be a table with name, kind, material or conductivity, "
                         "h, temp_base, temp_fluid and the dimensions"))
        return None
    start = len(problems)
    name = row.get("name")
    if not isinstance(name, str) or not name.strip():
        problems.append((f"{where}.name", "every fin needs a name (text)"))
        name = ""
    kind = row.get("kind")
    if kind not in FIN_KINDS:
        problems.append((f"{where}.kind", f"must be one of {choices_text(FIN_KINDS)}; "
                         f"got {show(kind)}"))
        unknown(row, sorted(set(FIN_KEYS["straight"]) | set(FIN_KEYS["annular"])), where,
                 problems)
        return None
    unknown(row, FIN_KEYS[kind], where, problems)
    material, k = _conductivity(row, where, library, problems)
    h = number(row, "h", where, problems, required=True, positive=True, limit="h")
    t_b = number(row, "temp_base", where, problems, required=True, above_absolute_zero=True)
    t_inf = number(row, "temp_fluid", where, problems, required=True, above_absolute_zero=True)
    corrected = row.get("corrected_length", False)
    if not isinstance(corrected, bool):
        problems.append((f"{where}.corrected_length", f"must be true or false; got "
                         f"{show(corrected)}"))
    notes = row.get("notes", "")
    if not isinstance(notes, str):
        problems.append((f"{where}.notes", f"must be text; got {show(notes)}"))
    if kind == "straight":
        dims = _straight_inputs(row, where, problems)
    else:
        dims = _annular_inputs(row, where, problems)
    array_in = _sub(row, "array", ARRAY_KEYS, where, problems)
    array_values = None if array_in is None else _array_inputs(array_in, f"{where}.array",
                                                                  problems)
    fv = _fv(row, where, problems)
    if len(problems) > start or k is None:  # no k: its material's problem is reported
        return None
    try:
        if kind == "straight":
            length = dims.pop("length")
            fin = StraightFin(length, k, h, corrected_length=corrected, **dims)
        else:
            fin = AnnularFin(dims["inner_radius"], dims["outer_radius"], dims["thickness"], k,
                             h, tip=dims["tip"], corrected_length=corrected)
    except HeatLedgerError as exc:
        problems.append((_key_of(str(exc), where), str(exc)))
        return None
    array, target = None, None
    if array_values is not None:
        array, target = _array(array_values, fin, f"{where}.array", problems)
        if array is None:
            return None
    if fv.h_law is not None and getattr(fin, "tip", None) == "infinite":
        problems.append((f"{where}.fv.h_coefficient", 'tip = "infinite" takes only the fin\'s '
                         "constant h; use a finite tip with h_coefficient"))
        return None
    return FinEntry(name=name.strip(), fin=fin, array=array, temp_base=t_b,
                    temp_fluid=t_inf, fv=fv, target_heat_rate=target, material=material,
                    row=row, where=where, notes=notes if isinstance(notes, str) else "")


def _straight_inputs(row, where, problems) -> dict:
    length = number(row, "length_mm", where, problems, required=True, positive=True, **_MM)
    t = number(row, "thickness_mm", where, problems, positive=True, **_MM)
    d = number(row, "diameter_mm", where, problems, positive=True, **_MM)
    w = number(row, "width_mm", where, problems, positive=True, **_MM)
    if (row.get("thickness_mm") is None) == (row.get("diameter_mm") is None):
        got = "both" if row.get("thickness_mm") is not None else "neither"
        problems.append((f"{where}.thickness_mm", "give exactly one of thickness_mm (a plate "
                         f"fin) or diameter_mm (a pin fin); got {got}"))
    if w is not None and row.get("diameter_mm") is not None:
        problems.append((f"{where}.width_mm", "width_mm applies to plate fins only (not with "
                         "diameter_mm)"))
    tip = _choice(row, "tip", STRAIGHT_TIPS, "convective", where, problems)
    profile = _choice(row, "profile", STRAIGHT_PROFILES, "rectangular", where, problems)
    t_l = number(row, "temp_tip", where, problems, above_absolute_zero=True)
    if tip == "temperature" and row.get("temp_tip") is None:
        problems.append((f"{where}.temp_tip", 'tip = "temperature" needs '
                         "temp_tip (degC)"))
    if tip != "temperature" and row.get("temp_tip") is not None:
        problems.append((f"{where}.temp_tip", f'is used only with tip = "temperature"; '
                         f"got tip = {show(tip)}"))
    out = {"length": None if length is None else length / 1000.0, "tip": tip,
           "profile": profile, "temp_tip": t_l}
    if t is not None:
        out["thickness"] = t / 1000.0
        out["width"] = 1.0 if w is None else w / 1000.0
    if d is not None:
        out["diameter"] = d / 1000.0
    return out


def _annular_inputs(row, where, problems) -> dict:
    d1 = number(row, "tube_diameter_mm", where, problems, required=True, positive=True, **_MM)
    d2 = number(row, "fin_diameter_mm", where, problems, required=True, positive=True, **_MM)
    t = number(row, "thickness_mm", where, problems, required=True, positive=True, **_MM)
    if d1 is not None and d2 is not None and not d1 < d2:
        problems.append((f"{where}.fin_diameter_mm", f"must exceed tube_diameter_mm "
                         f"({d1:g} mm); got {d2:g} mm"))
    tip = _choice(row, "tip", ANNULAR_TIPS, "adiabatic", where, problems)
    return {"inner_radius": None if d1 is None else d1 / 2000.0,
            "outer_radius": None if d2 is None else d2 / 2000.0,
            "thickness": None if t is None else t / 1000.0, "tip": tip}


def _array_inputs(data, where, problems):
    """The array's own values, checked before the fin is built (so every problem shows)."""
    start = len(problems)
    count = data.get("count")
    if isinstance(count, bool) or not isinstance(count, int) or count < 0:
        problems.append((f"{where}.count", f"must be a whole number >= 0; got {show(count)}"))
    area = number(data, "base_area", where, problems, required=True, positive=True,
                  limit="area")
    rc = number(data, "contact_resistance", where, problems, non_negative=True, default=0.0,
                limit="resistance")
    target = number(data, "target_heat_rate", where, problems)
    if target is not None and target == 0.0:
        problems.append((f"{where}.target_heat_rate", "must not be zero (leave it out for no "
                         "sizing)"))
    return None if len(problems) > start else (count, area, rc, target)


def _array(values, fin, where, problems):
    count, area, rc, target = values
    try:
        return FinArray(fin, count, area, rc), target
    except HeatLedgerError as exc:
        key = ("base_area" if "base_area" in str(exc) else
               "count" if "count" in str(exc) else "")
        problems.append((f"{where}.{key}" if key else where, str(exc)))
        return None, None


def _fv(row, where, problems) -> FinFVSettings:
    data = _sub(row, "fv", FV_KEYS, where, problems) or {}
    sub = f"{where}.fv"
    cells = data.get("cells", DEFAULT_FV_CELLS)
    if isinstance(cells, bool) or not isinstance(cells, int) or not 2 <= cells <= MAX_FV_CELLS:
        problems.append((f"{sub}.cells", f"must be a whole number from 2 to {MAX_FV_CELLS}; "
                         f"got {show(cells)}"))
        cells = DEFAULT_FV_CELLS
    eps = number(data, "emissivity", sub, problems, non_negative=True, default=0.0)
    if eps is not None and eps > 1.0:
        problems.append((f"{sub}.emissivity", f"must be between 0 and 1; got {eps:g}"))
        eps = 0.0
    t_sur = number(data, "temp_surroundings", sub, problems, above_absolute_zero=True)
    c = number(data, "h_coefficient", sub, problems, positive=True, limit="h")
    n = number(data, "h_exponent", sub, problems, non_negative=True)
    law = None
    if (data.get("h_coefficient") is None) != (data.get("h_exponent") is None):
        problems.append((f"{sub}.h_exponent", "give h_coefficient and h_exponent together "
                         "(h = C |T - T_inf|^n) or neither"))
    elif c is not None and n is not None:
        try:
            law = PowerLawCoefficient(c, n)
        except HeatLedgerError as exc:
            problems.append((f"{sub}.h_exponent", str(exc)))
    return FinFVSettings(cells=cells, emissivity=eps or 0.0, temp_surroundings=t_sur,
                         h_law=law)


def _conductivity(row, where, library, problems):
    name = row.get("material")
    lam = row.get("conductivity")
    if name not in (None, "") and not isinstance(name, str):
        problems.append((f"{where}.material", f"must be text (a library name); got "
                         f"{show(name)}"))
        return None, None
    if name not in (None, "") and lam is not None:
        problems.append((f"{where}.conductivity", "give material (a library name) or "
                         "conductivity (W/(m K)), not both"))
        return None, None
    if name not in (None, ""):
        try:
            mat = library.get(str(name))
        except MaterialWithheld:  # its own entry's problem is reported there
            return None, None
        except HeatLedgerError as exc:
            problems.append((f"{where}.material", str(exc)))
            return None, None
        return mat, mat.conductivity
    if lam is None:
        problems.append((f"{where}.material", "give material (a library name) or "
                         "conductivity (W/(m K))"))
        return None, None
    return None, number(row, "conductivity", where, problems, positive=True,
                        limit="conductivity")


def _sub(row, key, allowed, where, problems):
    if key not in row:
        return None
    data = row[key]
    if not isinstance(data, dict):
        problems.append((f"{where}.{key}", f"must be a table ([fins.{key}])"))
        return None
    unknown(data, allowed, f"{where}.{key}", problems)
    return data


def _choice(row, key, choices, default, where, problems):
    value = row.get(key, default)
    if value not in choices:
        problems.append((f"{where}.{key}", f"must be one of {choices_text(choices)}; "
                         f"got {show(value)}"))
        return default
    return value


_ENGINE_KEYS = (("temp_tip", "temp_tip"), ("corrected_length", "corrected_length"),
                ("inner_radius", "tube_diameter_mm"), ("outer_radius", "fin_diameter_mm"),
                ("thickness", "thickness_mm"), ("diameter", "diameter_mm"),
                ("width", "width_mm"), ("length", "length_mm"), ("profile", "profile"),
                ("tip", "tip"), ("conductivity", "conductivity"), ("h", "h"))


def _key_of(message: str, where: str) -> str:
    """The project key an engine message is about (the first engine name it mentions)."""
    for engine_name, key in _ENGINE_KEYS:
        if message.startswith(engine_name) or f" {engine_name}" in message:
            return f"{where}.{key}"
    return where
