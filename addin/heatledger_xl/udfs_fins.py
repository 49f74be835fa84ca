"""Spreadsheet functions for fins and finned surfaces (heat sinks, finned tubes, pin fins).

Declared like every heatledger function with :func:`heatledger_xl.registry.udf` (family
``"fins"``, prefix ``HL_``); imported by :mod:`heatledger_xl.udfs`, so pointing xlwings at
that module brings these in too. No function raises: a bad argument gives a one-line text
that starts with the function name and names the argument and the rule.

Three groups, lengths in millimetres as on a data sheet, everything else SI:

- **Straight fins** (plates and pins of rectangular, triangular or parabolic profile):
  ``HL_FIN_HEATRATE``, ``HL_FIN_EFFICIENCY``, ``HL_FIN_EFFECTIVENESS``,
  ``HL_FIN_RESISTANCE``, ``HL_FIN_TIP_TEMP``, ``HL_FIN_TEMPS`` (spill), ``HL_FIN_RESULTS``
  (spill with warnings and the finite-volume cross-check). Arguments in one order:
  ``length_mm, size_mm, conductivity, h, temp_base, temp_fluid`` then the optional
  ``shape`` ("plate"/"pin"), ``tip`` ("convective", "adiabatic", "temperature",
  "infinite", or "corrected" = convective tip by the corrected length), ``width_mm``
  (plates; blank = 1000 mm, results per metre of base), ``temp_tip``, ``profile``.
- **Annular fins** on a tube: ``HL_ANNULAR_HEATRATE``, ``HL_ANNULAR_EFFICIENCY``,
  ``HL_ANNULAR_EFFECTIVENESS``, ``HL_ANNULAR_TIP_TEMP``, ``HL_ANNULAR_TEMPS`` (spill), with
  ``tube_diameter_mm, fin_diameter_mm, thickness_mm, conductivity, h, temp_base,
  temp_fluid`` and the optional ``tip`` ("adiabatic", "convective", "corrected").
- **Fin sets** described by a two-column range of keys and values, the keys of a
  ``[[fins]]`` table of the project file (``kind``, ``material`` or ``conductivity``,
  ``length_mm``, ``thickness_mm``, ... and, flat, the array keys ``count``, ``base_area``,
  ``contact_resistance``, ``target_heat_rate`` and the finite-volume keys ``cells``,
  ``emissivity``, ``temp_surroundings``, ``h_coefficient``, ``h_exponent``):
  ``HL_FINSET`` (spill of every result) and ``HL_FINSET_VALUE`` (one named quantity),
  including the array's overall efficiency and resistance and the inverse answers (fin
  length and fin count for a target heat rate).

Results support, and do not replace, design by a competent person; fins can be hot to the
touch: check surface temperatures against the touch limits that apply.
"""

from __future__ import annotations

from heatledger.errors import HeatLedgerError

from .cells import flag, text
from .fin_cells import (  # noqa: F401
    _ABS_ZERO,
    _ANNULAR_TIPS,
    _FV_NONLINEAR,
    _INT_KEYS,
    _MAX_TEMP,
    _STRAIGHT_TIPS,
    _TITLES,
    FINSET_QUANTITIES,
    MAX_CONDUCTIVITY,
    MAX_H,
    MAX_MM,
    MAX_NODES,
    MAX_POINTS,
    MAX_SPEC_ROWS,
    MIN_MM,
    MIN_PROFILE_RATIO,
    _annular_fin,
    _annular_result,
    _annular_tip,
    _blank,
    _clean,
    _common,
    _entry,
    _evaluate,
    _finset_rows,
    _finset_rows_of,
    _guard,
    _ratio,
    _result_rows,
    _spec_row,
    _spec_value,
    _straight_fin,
    _straight_options,
    _straight_result,
    _table_options,
    _with_header,
)
from .registry import udf

__all__ = [
    "HL_FIN_HEATRATE",
    "HL_FIN_EFFICIENCY",
    "HL_FIN_EFFECTIVENESS",
    "HL_FIN_RESISTANCE",
    "HL_FIN_TIP_TEMP",
    "HL_FIN_TEMPS",
    "HL_FIN_RESULTS",
    "HL_ANNULAR_HEATRATE",
    "HL_ANNULAR_EFFICIENCY",
    "HL_ANNULAR_EFFECTIVENESS",
    "HL_ANNULAR_TIP_TEMP",
    "HL_ANNULAR_TEMPS",
    "HL_FINSET",
    "HL_FINSET_VALUE",
]

FAMILY = "fins"


# ---- argument descriptions (unit in brackets at the end) ---------------------------------
_D = {
    "length_mm": "Fin length from the base to the tip, above 0. [mm]",
    "size_mm": "Plate thickness, or pin diameter when shape is \"pin\" (at the base for "
               "profiled fins). [mm]",
    "conductivity": "Thermal conductivity of the fin material. [W/(m K)]",
    "h": "Convection coefficient on the fin surface. [W/(m2 K)]",
    "temp_base": "Temperature of the fin base. [degC]",
    "temp_fluid": "Temperature of the surrounding fluid (air). [degC]",
    "shape": "\"plate\" (default) or \"pin\". [-]",
    "tip": ("Tip condition: \"convective\" (default), \"adiabatic\", \"temperature\", "
            "\"infinite\" or \"corrected\" (convective tip by the corrected length). [-]"),
    "width_mm": "Plate width along the base; blank = 1000, results per metre (plates only). "
                "[mm]",
    "temp_tip": "Tip temperature, only with tip \"temperature\". [degC]",
    "profile": "\"rectangular\" (default), \"triangular\" or \"parabolic\". [-]",
    "points": "Number of evenly spaced points, base and tip included; default 11. [-]",
    "nodes": "Blank for the closed form; a number of finite-volume cells (2 to 2000) for "
             "the numerical solution. [-]",
    "header": "TRUE adds a first row of column titles with units; default FALSE. [-]",
    "tube_diameter_mm": "Outside diameter of the tube, the fin root. [mm]",
    "fin_diameter_mm": "Outside diameter of the fin, above the tube diameter. [mm]",
    "thickness_mm": "Fin thickness. [mm]",
    "annular_tip": ("Rim condition: \"adiabatic\" (default), \"convective\" or "
                    "\"corrected\" (adiabatic on r2 + t/2). [-]"),
    "spec": ("Two-column range of keys and values as in a [[fins]] project table: kind, "
             "material or conductivity, h, temp_base, temp_fluid, length_mm, "
             "thickness_mm, ...; array and FV keys flat. [mm, SI]"),
    "quantity": "Name of the result, as in the first column of HL_FINSET; default "
                "heat_rate. [-]",
}
_STRAIGHT = {k: _D[k] for k in ("length_mm", "size_mm", "conductivity", "h",
                                "temp_base", "temp_fluid", "shape", "tip", "width_mm",
                                "temp_tip", "profile")}
_ANNULAR = {k: _D[k] for k in ("tube_diameter_mm", "fin_diameter_mm", "thickness_mm",
                               "conductivity", "h", "temp_base", "temp_fluid")}
_ANNULAR["tip"] = _D["annular_tip"]


# --------------------------------------------------------------------------- straight fins
@udf(FAMILY, returns="heat rate [W]", args=_STRAIGHT)
def HL_FIN_HEATRATE(length_mm, size_mm, conductivity, h, temp_base, temp_fluid, shape=None,
                    tip=None, width_mm=None, temp_tip=None, profile=None):
    """Heat rate a straight fin sheds from its base (Incropera & DeWitt Table 3.4 for
    uniform fins, Table 3.5 for profiled fins); positive when the base is warmer. [W]"""
    return _straight_result(length_mm, size_mm, conductivity, h, temp_base, temp_fluid,
                            shape, tip, width_mm, temp_tip, profile).heat_rate


@udf(FAMILY, returns="fin efficiency [-]", args=_STRAIGHT)
def HL_FIN_EFFICIENCY(length_mm, size_mm, conductivity, h, temp_base, temp_fluid,
                      shape=None, tip=None, width_mm=None, temp_tip=None, profile=None):
    """Fin efficiency eta_f = q_f/(h A_f theta_b) of a straight fin (Incropera & DeWitt
    eq. 3.86, Tables 3.4 and 3.5). [-]"""
    return _straight_result(length_mm, size_mm, conductivity, h, temp_base, temp_fluid,
                            shape, tip, width_mm, temp_tip, profile).efficiency


@udf(FAMILY, returns="fin effectiveness [-]", args=_STRAIGHT)
def HL_FIN_EFFECTIVENESS(length_mm, size_mm, conductivity, h, temp_base, temp_fluid,
                         shape=None, tip=None, width_mm=None, temp_tip=None,
                         profile=None):
    """Fin effectiveness q_f/(h A_c theta_b); below 1 the fin reduces the heat rate of the
    base it covers (see HL_FIN_RESULTS for the warning). [-]"""
    return _straight_result(length_mm, size_mm, conductivity, h, temp_base, temp_fluid,
                            shape, tip, width_mm, temp_tip, profile).effectiveness


@udf(FAMILY, returns="fin thermal resistance [K/W]", args=_STRAIGHT)
def HL_FIN_RESISTANCE(length_mm, size_mm, conductivity, h, temp_base, temp_fluid,
                      shape=None, tip=None, width_mm=None, temp_tip=None, profile=None):
    """Fin thermal resistance R_t,f = theta_b/q_f of a straight fin (Incropera & DeWitt
    eq. 3.83). [K/W]"""
    return _straight_result(length_mm, size_mm, conductivity, h, temp_base, temp_fluid,
                            shape, tip, width_mm, temp_tip, profile).fin_resistance


@udf(FAMILY, returns="tip temperature [degC]", args=_STRAIGHT)
def HL_FIN_TIP_TEMP(length_mm, size_mm, conductivity, h, temp_base, temp_fluid, shape=None,
                   tip=None, width_mm=None, temp_tip=None, profile=None):
    """Temperature at the tip of a straight fin from the closed-form temperature
    distribution (Incropera & DeWitt Table 3.4). [degC]"""
    return _straight_result(length_mm, size_mm, conductivity, h, temp_base, temp_fluid,
                            shape, tip, width_mm, temp_tip, profile).temp_tip


@udf(FAMILY, returns="spill: x [mm], temperature [degC]",
     args={**_STRAIGHT, "points": _D["points"], "nodes": _D["nodes"], "header": _D["header"]},
     spills=True)
def HL_FIN_TEMPS(length_mm, size_mm, conductivity, h, temp_base, temp_fluid, shape=None,
                 tip=None, width_mm=None, temp_tip=None, profile=None, points=None,
                 nodes=None, header=None):
    """Temperature along a straight fin as rows of distance from the base and temperature:
    the closed form, or finite volumes (cell centres and both faces) when nodes is given.
    [mm, degC]"""
    opts = _straight_options(shape, tip, width_mm, temp_tip, profile)
    n_pts, n_fv, head = _table_options(points, nodes, header)
    fin, t_b, t_inf = _straight_fin(length_mm, size_mm, conductivity, h, temp_base,
                                    temp_fluid, opts)
    temps = _guard(lambda: fin.temperatures(t_b, t_inf, nodes=n_fv, points=n_pts))
    rows = [[float(x) * 1000.0, float(t)] for x, t in zip(temps.x, temps.temperature,
                                                            strict=True)]
    return _with_header(rows, ["x [mm]", "temperature [degC]"], head)


@udf(FAMILY, returns="spill: quantity, value, unit",
     args={**_STRAIGHT, "nodes": _D["nodes"], "header": _D["header"]}, spills=True)
def HL_FIN_RESULTS(length_mm, size_mm, conductivity, h, temp_base, temp_fluid, shape=None,
                   tip=None, width_mm=None, temp_tip=None, profile=None, nodes=None,
                   header=None):
    """Every result of a straight fin: heat rate, efficiency, effectiveness, resistance,
    tip temperature, m, areas, the finite-volume heat rate with energy residual and mesh
    estimate, and the warnings. [W, -, K/W, degC]"""
    opts = _straight_options(shape, tip, width_mm, temp_tip, profile)
    _, n_fv, head = _table_options(None, nodes, header)
    fin, t_b, t_inf = _straight_fin(length_mm, size_mm, conductivity, h, temp_base,
                                    temp_fluid, opts)
    return _with_header(_result_rows(fin, t_b, t_inf, n_fv or 200), _TITLES, head)


# --------------------------------------------------------------------------- annular fins
@udf(FAMILY, returns="heat rate [W]", args=_ANNULAR)
def HL_ANNULAR_HEATRATE(tube_diameter_mm, fin_diameter_mm, thickness_mm, conductivity, h,
                        temp_base, temp_fluid, tip=None):
    """Heat rate of one annular fin of rectangular profile on a tube (Bessel-function
    solution, Incropera & DeWitt section 3.6.3). [W]"""
    return _annular_result(tube_diameter_mm, fin_diameter_mm, thickness_mm, conductivity, h,
                           temp_base, temp_fluid, tip).heat_rate


@udf(FAMILY, returns="fin efficiency [-]", args=_ANNULAR)
def HL_ANNULAR_EFFICIENCY(tube_diameter_mm, fin_diameter_mm, thickness_mm, conductivity, h,
                          temp_base, temp_fluid, tip=None):
    """Efficiency of an annular fin of rectangular profile (adiabatic rim: Kern eq. 16.58;
    convective rim: exact Bessel solution). [-]"""
    return _annular_result(tube_diameter_mm, fin_diameter_mm, thickness_mm, conductivity, h,
                           temp_base, temp_fluid, tip).efficiency


@udf(FAMILY, returns="fin effectiveness [-]", args=_ANNULAR)
def HL_ANNULAR_EFFECTIVENESS(tube_diameter_mm, fin_diameter_mm, thickness_mm, conductivity, h,
                             temp_base, temp_fluid, tip=None):
    """Effectiveness of an annular fin, q_f/(h 2 pi r1 t theta_b); below 1 the fin does not
    help. [-]"""
    return _annular_result(tube_diameter_mm, fin_diameter_mm, thickness_mm, conductivity, h,
                           temp_base, temp_fluid, tip).effectiveness


@udf(FAMILY, returns="rim temperature [degC]", args=_ANNULAR)
def HL_ANNULAR_TIP_TEMP(tube_diameter_mm, fin_diameter_mm, thickness_mm, conductivity, h,
                       temp_base, temp_fluid, tip=None):
    """Temperature at the outer radius (rim) of an annular fin from the Bessel-function
    temperature distribution. [degC]"""
    return _annular_result(tube_diameter_mm, fin_diameter_mm, thickness_mm, conductivity, h,
                           temp_base, temp_fluid, tip).temp_tip


@udf(FAMILY, returns="spill: radius [mm], temperature [degC]",
     args={**_ANNULAR, "points": _D["points"], "nodes": _D["nodes"], "header": _D["header"]},
     spills=True)
def HL_ANNULAR_TEMPS(tube_diameter_mm, fin_diameter_mm, thickness_mm, conductivity, h,
                     temp_base, temp_fluid, tip=None, points=None, nodes=None, header=None):
    """Temperature across an annular fin as rows of radius and temperature: the Bessel
    solution, or finite volumes when nodes is given. [mm, degC]"""
    mode = _annular_tip(tip)
    n_pts, n_fv, head = _table_options(points, nodes, header)
    fin, t_b, t_inf = _annular_fin(tube_diameter_mm, fin_diameter_mm, thickness_mm,
                                   conductivity, h, temp_base, temp_fluid, mode)
    temps = _guard(lambda: fin.temperatures(t_b, t_inf, nodes=n_fv, points=n_pts))
    rows = [[float(x) * 1000.0, float(t)] for x, t in zip(temps.x, temps.temperature,
                                                            strict=True)]
    return _with_header(rows, ["radius [mm]", "temperature [degC]"], head)


# --------------------------------------------------------------------------- fin sets
@udf(FAMILY, returns="spill: quantity, value, unit",
     args={"spec": _D["spec"], "header": _D["header"]}, ranges=("spec",), spills=True)
def HL_FINSET(spec, header=None):
    """Every result of a fin set given as key/value rows: the fin, its finite-volume check,
    the array (overall efficiency, resistance, heat rate) and the fin length and count for
    a target heat rate, with warnings. [W, -, K/W, degC, mm]"""
    head = flag("header", header, False)
    return _with_header(_finset_rows(_entry(spec)), _TITLES, head)


@udf(FAMILY, returns="the named result (unit of the quantity)",
     args={"spec": _D["spec"], "quantity": _D["quantity"]}, ranges=("spec",))
def HL_FINSET_VALUE(spec, quantity=None):
    """One result of a fin set given as key/value rows, named as in HL_FINSET's first column
    (heat_rate, efficiency, array_heat_rate, overall_efficiency, length_for_target_mm,
    count_for_target, ...). [unit of quantity]"""
    what = text("quantity", quantity, "heat_rate").lower()
    if what not in FINSET_QUANTITIES:
        raise HeatLedgerError(f"quantity must be one of {', '.join(FINSET_QUANTITIES)}; got "
                              f"{what!r}")
    rows = _finset_rows(_entry(spec))
    values = {r[0]: r[1] for r in rows if r[0] not in ("warning", "method")}
    if what not in values:
        need = ("an array (count and base_area)" if what not in _FV_NONLINEAR else
                "emissivity or h_coefficient/h_exponent")
        raise HeatLedgerError(f"quantity {what} needs {need} in spec")
    value = values[what]
    if isinstance(value, str):
        raise HeatLedgerError(f"quantity {what}: {value}")
    return value


