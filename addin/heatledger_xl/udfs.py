"""Spreadsheet functions for building constructions (EN ISO 6946 U-values, temperatures).

Every function is named ``HL_...`` and is declared with xlwings' ``func``/``arg``/``ret``
decorators through :func:`heatledger_xl.registry.udf`; the list, with every argument's
description, is :data:`heatledger_xl.registry.REGISTRY`. Point xlwings at this module
(``UDF Modules`` = ``heatledger_xl.udfs`` on Windows; ``from heatledger_xl.udfs import *``
in the ``main.py`` of the in-browser runtime).

Arguments come in a fixed order: the layer table first, then the temperatures or the value
the function needs, then the optional ones (``heat_flow``, ``rsi``, ``rse``, ``header``...),
which may be left out or blank. The layer-table conventions are those of
:mod:`heatledger_xl.ranges`. No function raises: a bad argument gives a one-line text that
starts with the function name and names the argument (and the row) and the rule.

Cost per call: the range is parsed once and the construction built once per distinct
input (a least-recently-used cache keyed on the hashable form of the range and bounded by
memory, :data:`CACHE_BYTES`, about 10,000 six-layer tables), without file or network
access; the material library is read when the module is imported.

No number that cannot be right: before a value leaves a function it is checked (R_T and U
finite and positive; temperatures finite, above absolute zero and, without heat sources,
between the two air temperatures; the finite-volume interface temperatures equal to the
resistance ladder's, which is exact for steady 1-D conduction without sources); a value
that fails becomes an error text naming the rows whose resistances caused it.

Results support, and do not replace, design by a competent person under the local codes;
check material values against the declared values of the products actually used.
"""

from __future__ import annotations

import importlib
import math
import sys

import heatledger
from heatledger.airlayers import air_layer_resistance
from heatledger.constructions import required_thickness
from heatledger.errors import HeatLedgerError
from heatledger.surfaces import surface_resistance, surface_resistance_calc

# Classic xlwings reloads this module (only this one) when its file changed while Excel's
# Python runs, as after an upgrade: the add-in modules it is built on are reloaded first, so
# that the functions and their helpers stay of one version (each function declared again
# replaces its registry entry).
if "HL_UVALUE" in globals():
    from heatledger.families import FAMILIES as _FAMILIES

    _family_modules = tuple(f.hooks["functions"].rpartition(".")[2] for f in _FAMILIES)
    for _module in ("cache", "cells", "ranges", "correction_ranges", "fin_cells") + _family_modules:
        if _module != __name__.rpartition(".")[2] and f"{__package__}.{_module}" in sys.modules:
            importlib.reload(sys.modules[f"{__package__}.{_module}"])

from .cache import MISSING, BoundedCache  # noqa: E402
from .cells import flag, heat_flow_value, integer, number, text  # noqa: E402
from .correction_ranges import build_corrections, correction_rows  # noqa: E402
from .ranges import LIBRARY, MIN_THICKNESS_MM, build_construction, layer_rows  # noqa: E402
from .registry import udf  # noqa: E402

__all__ = [
    "HL_UVALUE",
    "HL_UVALUE_REPORTED",
    "HL_RTOTAL",
    "HL_RLIMITS",
    "HL_LAYERS",
    "HL_WARNINGS",
    "HL_UVALUE_CORRECTED",
    "HL_CORRECTIONS",
    "HL_RSURFACE",
    "HL_RSURFACE_CALC",
    "HL_RAIR",
    "HL_INTERFACE_TEMPS",
    "HL_NODE_TEMPS",
    "HL_FVCHECK",
    "HL_HEATFLUX",
    "HL_THICKNESS",
    "HL_MATERIAL",
    "HL_MATERIALS",
    "HL_VERSION",
]

FAMILY = "constructions"
#: Largest number of finite-volume cells per layer a cell may ask for.
MAX_NODES_PER_LAYER = 200
#: Memory budget of the cache of built constructions, estimated per entry from the table
#: size (:func:`_entry_bytes`; ``tests/benchmarks/bench_udf.py`` measures the estimate):
#: about 10,000 six-layer tables. [bytes]
CACHE_BYTES = 48 * 2**20
#: Memory budget of the cache of constructions with corrections. [bytes]
CORRECTED_CACHE_BYTES = 8 * 2**20
#: Estimated memory of one cache entry: fixed part, per layer row (construction, layer
#: row, the row's cells in the key) and per section of the bridging upper limit. [bytes]
ENTRY_BYTES, ROW_BYTES, SECTION_BYTES = 1200, 700, 150
#: Built constructions by parsed input; ``CORRECTED`` with their correction rows.
CONSTRUCTIONS = BoundedCache(CACHE_BYTES)
CORRECTED = BoundedCache(CORRECTED_CACHE_BYTES)
#: Largest disagreement allowed between a finite-volume temperature and the exact one of
#: the resistance ladder, and the largest excursion of a temperature beyond the two air
#: temperatures: a thousandth of a kelvin, ten times below the 0.01 K temperatures are
#: read to, and nine orders above the round-off of a sound solve. [K]
TEMP_TOL_K = 1e-3
#: Absolute zero. [degC]
_ABS_ZERO = -273.15
_MAX_TEMP = 2000.0

# ---- argument descriptions (shown in the function dialog; unit in brackets at the end) ---
_LAYERS = ("Layer table, inside to outside: material, thickness_mm, conductivity, resistance, "
           "bridging_fraction, bridging_conductivity (2 to 6 columns; a blank row ends it). "
           "[mm, W/(m K), m2 K/W, -]")
_HEAT_FLOW = ("Direction of heat flow: \"up\" (roofs), \"horizontal\" (walls, default) or "
              "\"down\" (floors). [-]")
_RSI = "Internal surface resistance; blank = ISO 6946 Table 7 value for heat_flow. [m2 K/W]"
_RSE = ("External surface resistance; blank = ISO 6946 Table 7 (0.04); give Rsi for an "
        "unheated space. [m2 K/W]")
_T_IN = "Inside air temperature. [degC]"
_T_OUT = "Outside air temperature. [degC]"
_HEADER = "TRUE adds a first row of column titles with units; default FALSE. [-]"

_CONSTRUCTION_ARGS = {"layers": _LAYERS, "heat_flow": _HEAT_FLOW, "rsi": _RSI, "rse": _RSE}


# --------------------------------------------------------------------------- U and R
@udf(FAMILY, returns="U-value [W/(m2 K)]", args=_CONSTRUCTION_ARGS, ranges=("layers",))
def HL_UVALUE(layers, heat_flow=None, rsi=None, rse=None):
    """U-value of a layer table by EN ISO 6946:2017 (U = 1/R_T, bridging by the upper and
    lower limits), unrounded. [W/(m2 K)]"""
    return _construction(layers, heat_flow, rsi, rse).u_value


@udf(FAMILY, returns="U-value, 2 significant figures [W/(m2 K)]", args=_CONSTRUCTION_ARGS,
     ranges=("layers",))
def HL_UVALUE_REPORTED(layers, heat_flow=None, rsi=None, rse=None):
    """U-value of a layer table rounded to two significant figures for reporting
    (EN ISO 6946:2017 clause 8). [W/(m2 K)]"""
    return _construction(layers, heat_flow, rsi, rse).u_value_reported


@udf(FAMILY, returns="total resistance R_T [m2 K/W]", args=_CONSTRUCTION_ARGS,
     ranges=("layers",))
def HL_RTOTAL(layers, heat_flow=None, rsi=None, rse=None):
    """Total thermal resistance R_T of a layer table, surface resistances included
    (EN ISO 6946:2017, 6.7). [m2 K/W]"""
    return _construction(layers, heat_flow, rsi, rse).total_resistance


@udf(FAMILY, returns="spill: quantity, value", args={**_CONSTRUCTION_ARGS, "header": _HEADER},
     ranges=("layers",), spills=True)
def HL_RLIMITS(layers, heat_flow=None, rsi=None, rse=None, header=None):
    """Upper and lower limits R'_T, R''_T, R_T, relative error and ratio of a table with a
    bridged layer (EN ISO 6946:2017, 6.7.2), as a spilled list. [m2 K/W, -]"""
    show_header = flag("header", header, False)
    c = _construction(layers, heat_flow, rsi, rse)
    b = c.bridging
    if b is None:
        raise HeatLedgerError("layers has no bridged layer (give a bridging_fraction), so "
                              "R_T has no upper and lower limit")
    rows = [["upper limit R'_T", b.upper], ["lower limit R''_T", b.lower],
            ["total R_T", b.total], ["relative error e", b.relative_error],
            ["ratio R'_T/R''_T", b.ratio]]
    return _with_header(rows, ["quantity", "value [m2 K/W or -]"], show_header)


@udf(FAMILY, returns="spill: layer table as used", args={**_CONSTRUCTION_ARGS,
                                                         "header": _HEADER},
     ranges=("layers",), spills=True)
def HL_LAYERS(layers, heat_flow=None, rsi=None, rse=None, header=None):
    """Layer table as the engine used it: number, name, kind, thickness, conductivity,
    resistance in the series sum and counted flag, with Rsi and Rse rows. [mm, W/(m K),
    m2 K/W]"""
    show_header = flag("header", header, False)
    c = _construction(layers, heat_flow, rsi, rse)
    rows = [[0, "inside surface", "surface", None, None, c.rsi, True]]
    for r in c.layer_table:
        rows.append([r.index + 1, r.name, r.kind, r.thickness * 1000.0, r.conductivity,
                     r.resistance, r.counted])
    rows.append([len(c.layer_table) + 1, "outside surface", "surface", None, None,
                 c.rse_used, True])
    titles = ["layer", "name", "kind", "thickness [mm]", "conductivity [W/(m K)]",
              "resistance [m2 K/W]", "counted"]
    return _with_header(rows, titles, show_header)


@udf(FAMILY, returns="spill: warnings (text)", args=_CONSTRUCTION_ARGS, ranges=("layers",),
     spills=True)
def HL_WARNINGS(layers, heat_flow=None, rsi=None, rse=None):
    """Warnings the engine raised for a layer table (for example bridging limits ratio above
    1.5), one per row, or "none". [-]"""
    c = _construction(layers, heat_flow, rsi, rse)
    notes = list(c.warnings)
    if c.corrections.items:
        notes.append(c.corrections.rule)
    return [[n] for n in notes] or [["none"]]


# --------------------------------------------------------------------------- corrections
_CORRECTIONS = ("Correction table (ISO 6946 Annex F): kind (air_gaps, fasteners, inverted_roof), "
                "layer number, then the values of that kind; blank = none. [-, mm2, 1/m2, "
                "mm/day]")
_CORRECTED_ARGS = {"layers": _LAYERS, "corrections": _CORRECTIONS, "heat_flow": _HEAT_FLOW,
                   "rsi": _RSI, "rse": _RSE}


@udf(FAMILY, returns="corrected U-value [W/(m2 K)]", args=_CORRECTED_ARGS,
     ranges=("layers", "corrections"))
def HL_UVALUE_CORRECTED(layers, corrections, heat_flow=None, rsi=None, rse=None):
    """U-value with the corrections of EN ISO 6946:2017 Annex F (air gaps, fasteners,
    inverted roofs), applied when they total at least 3 % of U; unrounded. [W/(m2 K)]"""
    return _corrected(layers, corrections, heat_flow, rsi, rse).u_value


@udf(FAMILY, returns="spill: correction, layer, delta U [W/(m2 K)]",
     args={**_CORRECTED_ARGS, "header": _HEADER}, ranges=("layers", "corrections"),
     spills=True)
def HL_CORRECTIONS(layers, corrections, heat_flow=None, rsi=None, rse=None, header=None):
    """Each Annex F correction with its layer and Delta U, then the total, whether it was
    applied (3 % rule) and the corrected U-value. [W/(m2 K)]"""
    show_header = flag("header", header, False)
    c = _corrected(layers, corrections, heat_flow, rsi, rse)
    res = c.corrections
    rows = [[label, idx + 1, delta] for label, idx, delta in res.items]
    rows.append(["total Delta U", None, res.delta_u_total])
    rows.append([res.rule, None, res.delta_u_total if res.applied else 0.0])
    rows.append(["U corrected", None, c.u_value])
    return _with_header(rows, ["correction", "layer", "Delta U [W/(m2 K)]"], show_header)


# --------------------------------------------------------------------------- surfaces, air
@udf(FAMILY, returns="surface resistance [m2 K/W]",
     args={"side": "\"inside\" (Rsi) or \"outside\" (Rse). [-]", "heat_flow": _HEAT_FLOW})
def HL_RSURFACE(side, heat_flow=None):
    """Conventional surface resistance Rsi or Rse of EN ISO 6946:2017 Table 7 (plane
    surface, emissivity 0.9). [m2 K/W]"""
    return surface_resistance(_side(side), heat_flow_value(heat_flow))


@udf(FAMILY, returns="surface resistance [m2 K/W]",
     args={"side": "\"inside\" (Rsi) or \"outside\" (Rse). [-]", "heat_flow": _HEAT_FLOW,
           "emissivity": "Hemispherical emissivity of the surface, 0 to 1; default 0.9. [-]",
           "temp_mean": ("Mean temperature of surface and surroundings; default 20 inside, "
                         "0 outside. [degC]"),
           "wind_speed": "Wind speed at the surface (outside only); default 4. [m/s]"})
def HL_RSURFACE_CALC(side, heat_flow=None, emissivity=None, temp_mean=None, wind_speed=None):
    """Surface resistance Rs = 1/(hc + hr) from emissivity, mean temperature and wind speed
    (EN ISO 6946:2017 Annex C). [m2 K/W]"""
    eps = number("emissivity", emissivity, 0.9, low=0.0, high=1.0, low_inclusive=True)
    t_m = number("temp_mean", temp_mean, None, low=_ABS_ZERO, high=_MAX_TEMP, unit="degC")
    wind = number("wind_speed", wind_speed, 4.0, low=0.0, high=100.0, low_inclusive=True,
                  unit="m/s")
    return surface_resistance_calc(_side(side), heat_flow_value(heat_flow), emissivity=eps,
                                   temp_mean=t_m, wind_speed=wind)


@udf(FAMILY, returns="air-layer resistance [m2 K/W]",
     args={"thickness_mm": "Thickness of the air layer in the heat-flow direction, up to "
                           "300. [mm]",
           "heat_flow": _HEAT_FLOW,
           "emissivity_1": "Emissivity of one face, above 0 to 1; default 0.9. [-]",
           "emissivity_2": "Emissivity of the other face, above 0 to 1; default 0.9. [-]",
           "temp_mean": "Mean temperature of the air layer; default 10. [degC]"})
def HL_RAIR(thickness_mm, heat_flow=None, emissivity_1=None, emissivity_2=None,
            temp_mean=None):
    """Thermal resistance Rg of an unventilated air layer (EN ISO 6946:2017 Annex D, Table 8
    for emissivity 0.9). [m2 K/W]"""
    d = number("thickness_mm", thickness_mm, low=MIN_THICKNESS_MM, low_inclusive=True,
               high=300.0, unit="mm")
    e1 = number("emissivity_1", emissivity_1, 0.9, low=0.0, high=1.0)
    e2 = number("emissivity_2", emissivity_2, 0.9, low=0.0, high=1.0)
    t_m = number("temp_mean", temp_mean, 10.0, low=_ABS_ZERO, high=_MAX_TEMP, unit="degC")
    return air_layer_resistance(d / 1000.0, heat_flow_value(heat_flow), e1, e2,
                                temp_mean=t_m)


# --------------------------------------------------------------------------- temperatures
_TEMP_ARGS = {"layers": _LAYERS, "temp_inside": _T_IN, "temp_outside": _T_OUT,
              "heat_flow": _HEAT_FLOW, "rsi": _RSI, "rse": _RSE}


@udf(FAMILY, returns="spill: interface, x [mm], temperature [degC]",
     args={**_TEMP_ARGS, "header": _HEADER}, ranges=("layers",), spills=True)
def HL_INTERFACE_TEMPS(layers, temp_inside, temp_outside, heat_flow=None, rsi=None, rse=None,
                   header=None):
    """Temperatures at the inside surface, every layer interface and the outside surface
    from the resistance ladder, as rows of interface, x from the inside, temperature.
    [mm, degC]"""
    show_header = flag("header", header, False)
    c = _construction(layers, heat_flow, rsi, rse)
    t_i, t_e = _temperatures(temp_inside, temp_outside)
    temps = c.ladder_temperatures(t_i, t_e)
    _check_temperatures(c, layers, temps.tolist(), t_i, t_e)
    counted = [r for r in c.layer_table if r.counted]
    x = 0.0
    rows = [["inside surface", 0.0, float(temps[0])]]
    for k, r in enumerate(counted):
        x += r.thickness * 1000.0
        label = ("outside surface" if k == len(counted) - 1
                 else f"{r.name} | {counted[k + 1].name}")
        rows.append([label, x, float(temps[k + 1])])
    return _with_header(rows, ["interface", "x [mm]", "temperature [degC]"], show_header)


@udf(FAMILY, returns="spill: node, layer, x [mm], temperature [degC]",
     args={**_TEMP_ARGS,
           "nodes_per_layer": "Finite-volume cells in each layer, 1 to 200; default 4. [-]",
           "header": _HEADER},
     ranges=("layers",), spills=True)
def HL_NODE_TEMPS(layers, temp_inside, temp_outside, heat_flow=None, rsi=None, rse=None,
              nodes_per_layer=None, header=None):
    """Nodal temperatures through a layer table by the 1-D finite-volume solver, as rows of
    node, layer number, x of the cell centre from the inside, temperature. [mm, degC]"""
    show_header = flag("header", header, False)
    c = _construction(layers, heat_flow, rsi, rse)
    t_i, t_e = _temperatures(temp_inside, temp_outside)
    n = integer("nodes_per_layer", nodes_per_layer, 4, low=1, high=MAX_NODES_PER_LAYER)
    owner, xs, temps = _nodal_solution(c, layers, t_i, t_e, n)
    rows = [[i + 1, layer + 1, x * 1000.0, t]
            for i, (layer, x, t) in enumerate(zip(owner, xs, temps, strict=True))]
    return _with_header(rows, ["node", "layer", "x [mm]", "temperature [degC]"], show_header)


@udf(FAMILY, returns="spill: quantity, value",
     args={**_TEMP_ARGS,
           "nodes_per_layer": "Finite-volume cells in each layer, 1 to 200; default 4. [-]",
           "header": _HEADER},
     ranges=("layers",), spills=True)
def HL_FVCHECK(layers, temp_inside, temp_outside, heat_flow=None, rsi=None, rse=None,
               nodes_per_layer=None, header=None):
    """Checks of the finite-volume solution behind HL_NODE_TEMPS: energy-balance residual, the
    heat flux against the closed-form resistance ladder, and the mesh estimate (exact for
    layers without heat sources). [-, W/m2, K]"""
    show_header = flag("header", header, False)
    c = _construction(layers, heat_flow, rsi, rse)
    t_i, t_e = _temperatures(temp_inside, temp_outside)
    n = integer("nodes_per_layer", nodes_per_layer, 4, low=1, high=MAX_NODES_PER_LAYER)
    res = _solving(c, layers, lambda: c.temperatures(t_i, t_e, nodes_per_layer=n))
    est = res.mesh_estimate
    _check_fv(c, layers, t_i, t_e, res.interface_temperatures.tolist(),
              res.temperature.tolist(), (est.coarse, est.fine))
    rows = [["energy-balance residual (conservation, rounding) [-]",
             float(res.energy_residual)],
            ["heat flux, finite volumes [W/m2]", float(res.heat_flux)],
            ["heat flux, resistance ladder (independent) [W/m2]",
             float(res.ladder_heat_flux)],
            ["relative difference from the ladder [-]", float(res.ladder_difference)],
            ["estimated error of the heat flux [W/m2]", float(est.error_estimate)],
            [f"mesh: {est.basis}"[:250], float(res.mesh_temperature_change)]]
    return _with_header(rows, ["quantity", "value"], show_header)


@udf(FAMILY, returns="heat flux [W/m2]", args=_TEMP_ARGS, ranges=("layers",))
def HL_HEATFLUX(layers, temp_inside, temp_outside, heat_flow=None, rsi=None, rse=None):
    """Heat flux through the plane construction, q = (temp_inside - temp_outside)/R_T,
    positive from inside to outside; U-value corrections excluded. [W/m2]"""
    c = _construction(layers, heat_flow, rsi, rse)
    t_i, t_e = _temperatures(temp_inside, temp_outside)
    return (t_i - t_e) / c.total_resistance


@udf(FAMILY, returns="thickness [mm]",
     args={"layers": _LAYERS,
           "layer_number": "Row of the layer to size, 1 = first layer of the table. [-]",
           "target_u": "Target U-value to reach. [W/(m2 K)]",
           "heat_flow": _HEAT_FLOW, "rsi": _RSI, "rse": _RSE},
     ranges=("layers",))
def HL_THICKNESS(layers, layer_number, target_u, heat_flow=None, rsi=None, rse=None):
    """Thickness of one layer (for example the insulation) that makes the table reach a
    target U-value; the layer's own thickness in the table is ignored. [mm]"""
    c = _construction(layers, heat_flow, rsi, rse)
    k = integer("layer_number", layer_number, low=1, high=len(c.layers))
    u_t = number("target_u", target_u, low=0.0, high=1.0e3, unit="W/(m2 K)")
    try:
        d_mm = required_thickness(c, k - 1, u_t) * 1000.0
    except HeatLedgerError as exc:
        msg = str(exc).replace(f"layer {k - 1} ", f"layer {k} ").replace("layer_index",
                                                                       "layer_number")
        raise HeatLedgerError(f"layer_number {k}: {msg}") from None
    if not (math.isfinite(d_mm) and d_mm > 0.0):
        raise HeatLedgerError(f"layer_number {k}: no finite positive thickness reaches "
                              f"target_u {u_t:g} W/(m2 K) with this table; got {d_mm:g} mm")
    return d_mm


# --------------------------------------------------------------------------- materials
_QUANTITIES = ("conductivity", "density", "specific_heat", "vapour_resistance_factor",
               "vapour_resistance_factor_wet", "source", "confidence")


@udf(FAMILY, returns="material value (unit of the quantity)",
     args={"material": "Material name in the heatledger library (case-insensitive). [-]",
           "quantity": ("conductivity [W/(m K)] (default), density [kg/m3], specific_heat "
                        "[J/(kg K)], vapour_resistance_factor, vapour_resistance_factor_wet, "
                        "source or confidence. [-]")})
def HL_MATERIAL(material, quantity=None):
    """A value of a material in the generic library (design values, each row with its
    source); check it against the declared value of the product used. [unit of quantity]"""
    name = text("material", material)
    what = text("quantity", quantity, "conductivity").lower()
    if what not in _QUANTITIES:
        raise HeatLedgerError("quantity must be one of " + ", ".join(map(repr, _QUANTITIES))
                              + f"; got {what!r}")
    mat = LIBRARY.get(name)  # unknown name: the message lists the closest names
    value = getattr(mat, what)
    if value is None:
        raise HeatLedgerError(f"material {mat.name!r} has no {what} in the library")
    if isinstance(value, float) and value == float("inf"):
        return "inf"
    return value


@udf(FAMILY, returns="spill: the material library", args={"header": _HEADER}, spills=True)
def HL_MATERIALS(header=None):
    """The generic material library as rows of name, conductivity, density, specific heat,
    vapour resistance factors (dry, wet), source and confidence. [W/(m K), kg/m3, J/(kg K)]"""
    show_header = flag("header", header, False)
    rows = [[m.name, m.conductivity, m.density, m.specific_heat,
             _finite_or_text(m.vapour_resistance_factor),
             _finite_or_text(m.vapour_resistance_factor_wet), m.source, m.confidence]
            for m in LIBRARY]
    titles = ["material", "conductivity [W/(m K)]", "density [kg/m3]",
              "specific heat [J/(kg K)]", "mu dry [-]", "mu wet [-]", "source", "confidence"]
    return _with_header(rows, titles, show_header)


@udf(FAMILY, returns="version text", args={})
def HL_VERSION():
    """Version of heatledger computing these cells, for the audit trail. [-]"""
    return f"heatledger {heatledger.__version__}"


# --------------------------------------------------------------------------- helpers
def _inputs(layers, heat_flow, rsi, rse):
    rows = layer_rows("layers", layers)
    hf = heat_flow_value(heat_flow)
    r_i = number("rsi", rsi, None, low=0.0, high=10.0, low_inclusive=True, unit="m2 K/W")
    r_e = number("rse", rse, None, low=0.0, high=10.0, low_inclusive=True, unit="m2 K/W")
    return rows, hf, r_i, r_e


def _construction(layers, heat_flow, rsi, rse):
    key = _inputs(layers, heat_flow, rsi, rse)
    c = CONSTRUCTIONS.get(key)
    if c is MISSING:
        c = _checked(build_construction(*key), key[0])
        CONSTRUCTIONS.put(key, c, _entry_bytes(c))
    return c


def _corrected(layers, corrections, heat_flow, rsi, rse):
    key = _inputs(layers, heat_flow, rsi, rse) + (correction_rows("corrections", corrections),)
    c = CORRECTED.get(key)
    if c is MISSING:
        c = _checked(_build_corrected(*key), key[0])
        CORRECTED.put(key, c, _entry_bytes(c) + ROW_BYTES * len(key[-1]))
    return c


def _build_corrected(rows, heat_flow, rsi, rse, crows):
    base = build_construction(rows, heat_flow, rsi, rse)
    items = build_corrections(crows, [lay.name for lay in base.layers])
    return build_construction(rows, heat_flow, rsi, rse, corrections=items, name="corrections")


def _entry_bytes(c) -> int:
    sections = len(c.bridging.sections) if c.bridging is not None else 0
    return ENTRY_BYTES + ROW_BYTES * len(c.layers) + SECTION_BYTES * sections


def _checked(c, rows):
    """``c`` when its R_T and U are finite and positive; otherwise an error naming the rows
    whose resistances are out of scale."""
    r_t, u = c.total_resistance, c.u_value
    if math.isfinite(r_t) and r_t > 0.0 and math.isfinite(u) and u > 0.0:
        return c
    raise HeatLedgerError(f"layers: R_T = {r_t:.3g} m2 K/W and U = {u:.3g} W/(m2 K) are not "
                          f"finite and positive; {_resistance_span(c, rows)}")


def _resistance_span(c, rows) -> str:
    """The smallest and largest counted layer resistances with their rows in the range."""
    counted = [r for r in c.layer_table if r.counted]
    low = min(counted, key=lambda r: r.resistance)
    high = max(counted, key=lambda r: r.resistance)
    if low is high:
        return (f"row {rows[low.index][0]} has R = {low.resistance:.3g} m2 K/W: check its "
                "conductivity or resistance")
    return (f"layer R runs from {low.resistance:.3g} (row {rows[low.index][0]}) to "
            f"{high.resistance:.3g} m2 K/W (row {rows[high.index][0]}): check the "
            "conductivity or resistance of those rows")


def _table_rows(layers):
    """The parsed rows of a layer table already accepted by :func:`_construction`."""
    return layer_rows("layers", layers)


def _check_temperatures(c, layers, temps: list, t_i: float, t_e: float) -> None:
    """Every temperature finite, above absolute zero and, as steady conduction without heat
    sources requires, between the two air temperatures (within :data:`TEMP_TOL_K`)."""
    low = max(min(t_i, t_e) - TEMP_TOL_K, math.nextafter(_ABS_ZERO, 0.0))
    high = max(t_i, t_e) + TEMP_TOL_K
    if math.isfinite(sum(temps)) and low <= min(temps) and max(temps) <= high:
        return
    bad = next(t for t in temps if not low <= t <= high)  # NaN fails both comparisons
    raise HeatLedgerError(
        f"layers: a temperature of {bad:.4g} degC lies outside temp_inside and "
        f"temp_outside (impossible without heat sources); "
        f"{_resistance_span(c, _table_rows(layers))}")


def _check_fv(c, layers, t_i, t_e, interface_temps: list, temps: list, fluxes) -> None:
    """The finite-volume solution equals the exact resistance ladder (the scheme is exact
    for piecewise-linear profiles) within :data:`TEMP_TOL_K`, and its heat fluxes equal
    ``(t_i - t_e)/R_T`` within the flux that :data:`TEMP_TOL_K` across R_T drives."""
    _check_temperatures(c, layers, temps, t_i, t_e)
    exact = c.ladder_temperatures(t_i, t_e).tolist()
    r_t = c.total_resistance
    q = (t_i - t_e) / r_t
    off = max([abs(a - b) for a, b in zip(interface_temps, exact, strict=True)]
              + [abs(f - q) * r_t for f in fluxes])
    if off <= TEMP_TOL_K:  # NaN fails
        return
    raise HeatLedgerError(
        f"layers: the finite-volume solution is {off:.3g} K off the exact resistance ladder "
        f"(more than {TEMP_TOL_K:g} K); {_resistance_span(c, _table_rows(layers))}")


def _solving(c, layers, solve):
    """Run a finite-volume solve; a solver failure names the rows that caused it."""
    try:
        return solve()
    except HeatLedgerError as exc:
        raise HeatLedgerError(f"layers: the finite-volume solver failed ({exc}); "
                              f"{_resistance_span(c, _table_rows(layers))}") from None


def _nodal_solution(c, layers, t_i, t_e, n):
    """Layer numbers, cell centres [m] and temperatures [degC] of the 1-D finite-volume
    solution with ``n`` cells in each counted layer, checked against the ladder (one solve;
    the engine computes a mesh estimate only when it is read, and HL_NODE_TEMPS reads none)."""
    res = _solving(c, layers, lambda: c.temperatures(t_i, t_e, nodes_per_layer=n))
    temps = res.temperature.tolist()
    _check_fv(c, layers, t_i, t_e, res.interface_temperatures.tolist(), temps,
              (res.heat_flux, res.heat_flux_outside))
    return res.layer_of_node.tolist(), res.x.tolist(), temps


def _temperatures(temp_inside, temp_outside):
    t_i = number("temp_inside", temp_inside, low=_ABS_ZERO, high=_MAX_TEMP, unit="degC")
    t_e = number("temp_outside", temp_outside, low=_ABS_ZERO, high=_MAX_TEMP, unit="degC")
    return t_i, t_e


def _side(value):
    out = text("side", value).lower()
    if out not in ("inside", "outside"):
        raise HeatLedgerError(f"side must be one of 'inside', 'outside'; got {out!r}")
    return out


def _with_header(rows, titles, show_header):
    return [list(titles)] + rows if show_header else rows


def _finite_or_text(value):
    if isinstance(value, float) and value == float("inf"):
        return "inf"
    return value


# --------------------------------------------------------------------------- other families
# Every family's functions must be members of this module: classic xlwings imports the
# functions it finds in the module named under "UDF Modules", xlwings Lite/Server those of
# the module passed to them.
from heatledger.families import FAMILIES  # noqa: E402


def _add_family_functions() -> list:
    """Make every registered family's functions members of this module (in registry order);
    returns their names."""
    names = []
    for fam in FAMILIES:
        module = fam.load("functions")
        if module is None or module.__name__ == __name__:
            continue
        for name in module.__all__:
            globals()[name] = getattr(module, name)
            names.append(name)
    return names


from .udfs_message import HL_MESSAGE  # noqa: E402  (the companion of every function)

__all__ = __all__ + _add_family_functions() + ["HL_MESSAGE"]
