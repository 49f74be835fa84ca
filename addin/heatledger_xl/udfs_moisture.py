"""Spreadsheet functions of the moisture family (EN ISO 13788).

Declared like every heatledger function with :func:`heatledger_xl.registry.udf` (family
``"moisture"``, prefix ``HL_``); made members of :mod:`heatledger_xl.udfs`. No function
raises: a bad argument gives a one-line text naming the argument and the rule.

- ``HL_PSAT(temp)``: saturation pressure [Pa] (Annex E, over water and ice);
  ``HL_DEWPOINT(pressure)``: its inverse [degC].
- ``HL_FRSI(layers, ...)``: f_Rsi of the plane construction with R_si = 0.25 (or given);
  ``HL_FRSI_MIN(temp_inside, temp_outside, rh_inside, rh_critical)``: f_Rsi,min of one month.
- ``HL_CONDENSATION(layers, climate, vapour, ...)``: the monthly Glaser calculation as a
  spill: month, planes, amount and water held [kg/m2], and the verdict. ``climate`` is a
  range of 12 rows (January first) and 4 columns: theta_e [degC], phi_e [-], theta_i
  [degC], phi_i [-]. ``vapour`` is an optional range beside the layer table, row for row:
  mu [-] in its first column or s_d [m] in its second; blank takes the library material's
  mu (air layers 1).

Moisture results are a steady monthly diffusion check: air leakage, rain, built-in moisture
and workmanship are outside it; defer to local codes and licensed practice.
"""

from __future__ import annotations

from heatledger.constructions import AirLayer, BridgedLayer, Layer
from heatledger.errors import HeatLedgerError
from heatledger.moisture import (
    MONTH_NAMES,
    MonthlyClimate,
    dew_point,
    interstitial_condensation,
    saturation_pressure,
    surface_factor_min,
)
from heatledger.moisture.surface import MIN_TEMPERATURE_DIFFERENCE

from .cache import MISSING, BoundedCache
from .cells import flag, is_blank, number, row_is_blank
from .ranges import build_construction
from .registry import udf
from .udfs import _construction, _inputs, _with_header

__all__ = ["HL_PSAT", "HL_DEWPOINT", "HL_FRSI", "HL_FRSI_MIN", "HL_CONDENSATION"]

FAMILY = "moisture"
#: Memory budget of the cache of Glaser results by input. [bytes]
RESULTS = BoundedCache(8 * 2**20)
_RESULT_BYTES = 6000
_TEMP = {"low": -100.0, "high": 100.0, "low_inclusive": True, "unit": "degC"}
_LAYERS = ("Layer table, inside to outside, as for HL_UVALUE (material, thickness_mm, "
           "conductivity, resistance, bridging_fraction, bridging_conductivity). [mm, W/(m K)]")
_CLIMATE = ("12 rows, January first, 4 columns: outside temperature [degC], outside relative "
            "humidity [-], inside temperature [degC], inside relative humidity [-]; fractions "
            "0 to 1. [degC, -]")
_VAPOUR = ("Optional range beside the layer table, row for row: mu in column 1 or s_d in "
           "column 2; blank = the library material's mu (air layers 1). [-, m]")
_HEAT_FLOW = "\"up\", \"horizontal\" (default) or \"down\". [-]"
_RSI = "Internal surface resistance; blank = ISO 6946 Table 7. [m2 K/W]"
_RSE = "External surface resistance; blank = ISO 6946 Table 7. [m2 K/W]"
_CRIT = "Critical surface relative humidity: 0.8 mould (default), 1.0 condensation. [-]"


@udf(FAMILY, returns="saturation pressure [Pa]",
     args={"temp": "Temperature, -100 to 100. [degC]"})
def HL_PSAT(temp):
    """Saturation water-vapour pressure over water (temp >= 0) or ice (EN ISO 13788
    Annex E). [Pa]"""
    return saturation_pressure(number("temp", temp, **_TEMP))


@udf(FAMILY, returns="dew point [degC]", args={"pressure": "Water-vapour pressure. [Pa]"})
def HL_DEWPOINT(pressure):
    """Dew point (frost point below 610.5 Pa) of a vapour pressure, the inverse of
    HL_PSAT. [degC]"""
    return dew_point(number("pressure", pressure, low=0.0, high=1e5, unit="Pa"))


@udf(FAMILY, returns="f_Rsi [-]",
     args={"layers": _LAYERS, "heat_flow": _HEAT_FLOW, "rse": _RSE,
           "resistance_inside": "R_si of the check; blank = 0.25 (0.13 glazing). [m2 K/W]"},
     ranges=("layers",))
def HL_FRSI(layers, heat_flow=None, rse=None, resistance_inside=None):
    """Temperature factor f_Rsi = (R_T - R_si)/R_T of a plane construction with R_si = 0.25
    m2 K/W (EN ISO 13788, 5). [-]"""
    r_si = number("resistance_inside", resistance_inside, 0.25, low=0.0, high=10.0,
                  unit="m2 K/W")
    return _construction(layers, heat_flow, None, rse).surface_factor(r_si)


@udf(FAMILY, returns="f_Rsi,min [-]",
     args={"temp_inside": "Inside temperature. [degC]",
           "temp_outside": "Monthly mean outside temperature. [degC]",
           "rh_inside": "Inside relative humidity, fraction 0 to 1. [-]",
           "rh_critical": _CRIT})
def HL_FRSI_MIN(temp_inside, temp_outside, rh_inside, rh_critical=None):
    """Minimum temperature factor of one month, f_Rsi,min, for mould (0.8) or surface
    condensation (1.0) (EN ISO 13788, 5.2). [-]"""
    t_e = number("temp_outside", temp_outside, **_TEMP)
    t_i = number("temp_inside", temp_inside, **_TEMP)
    if t_i - t_e < MIN_TEMPERATURE_DIFFERENCE:
        raise HeatLedgerError(f"temp_inside must be at least {MIN_TEMPERATURE_DIFFERENCE:g} K "
                              "above temp_outside: f_Rsi,min applies only to months when the "
                              "outside is colder")
    rh = _fraction("rh_inside", rh_inside)
    crit = number("rh_critical", rh_critical, 0.8, low=0.0, high=100.0, unit="")
    return surface_factor_min(t_i, t_e, rh, rh_critical=crit)


@udf(FAMILY, returns="spill: month, planes, amount [kg/m2], held [kg/m2]; verdict",
     args={"layers": _LAYERS, "climate": _CLIMATE, "vapour": _VAPOUR,
           "heat_flow": _HEAT_FLOW, "rsi": _RSI, "rse": _RSE,
           "header": "TRUE adds a first row of column titles. [-]"},
     ranges=("layers", "climate", "vapour"), spills=True)
def HL_CONDENSATION(layers, climate, vapour=None, heat_flow=None, rsi=None, rse=None,
                    header=None):
    """Interstitial condensation month by month by the Glaser method (EN ISO 13788, 6):
    the interfaces where water condenses, the amount and the water held at the end of each
    month, and the verdict for the year. [kg/m2]"""
    show = flag("header", header, False)
    key = (_inputs(layers, heat_flow, rsi, rse), _vapour_rows(vapour), _climate(climate))
    res = RESULTS.get(key)
    if res is MISSING:
        con = _with_vapour(build_construction(*key[0]), key[1])
        res = interstitial_condensation(con, MonthlyClimate(*zip(*key[2], strict=True)))
        RESULTS.put(key, res, _RESULT_BYTES)
    rows = [[MONTH_NAMES[m], ", ".join(res.interface_names[i] for i in res.planes[m]) or "-",
             float(res.condensation_rate[m]), float(res.accumulation[m])] for m in range(12)]
    rows.append(["year", res.verdict, float(sum(res.condensation_rate)),
                 float(res.max_accumulation)])
    return _with_header(rows, ["month", "planes", "amount [kg/m2]", "held [kg/m2]"], show)


def _fraction(name, value) -> float:
    v = number(name, value, low=0.0, high=100.0, low_inclusive=True, unit="")
    if v > 1.0:
        raise HeatLedgerError(f"{name} = {v:g} looks like a percentage: give relative "
                              f"humidity as a fraction 0 to 1 ({v / 100.0:g} for {v:g} %)")
    return v


def _climate(cells) -> tuple:
    """Twelve (theta_e, phi_e, theta_i, phi_i) rows of a climate range."""
    rows = [r if isinstance(r, (list, tuple)) else [r] for r in (cells or [])]
    rows = [r for r in rows if not row_is_blank(r)]
    if rows and all(isinstance(c, str) for c in rows[0] if not is_blank(c)):
        rows = rows[1:]  # a header row
    if len(rows) != 12 or any(len(r) < 4 for r in rows):
        raise HeatLedgerError(f"climate must be 12 rows (January first) of 4 columns: "
                              f"theta_e, phi_e, theta_i, phi_i; got {len(rows)} rows")
    out = []
    for i, r in enumerate(rows, 1):
        where = f"climate row {i} ({MONTH_NAMES[i - 1]})"
        out.append((number(f"{where} theta_e", r[0], **_TEMP),
                    _fraction(f"{where} phi_e", r[1]),
                    number(f"{where} theta_i", r[2], **_TEMP),
                    _fraction(f"{where} phi_i", r[3])))
    return tuple(out)


def _vapour_rows(cells) -> tuple:
    """(mu or None, sd or None) per row of the vapour range (empty when not given)."""
    if cells is None:
        return ()
    out = []
    for i, r in enumerate(cells if isinstance(cells, (list, tuple)) else [[cells]], 1):
        r = list(r) if isinstance(r, (list, tuple)) else [r]
        r = (r + [None, None])[:2]
        if isinstance(r[0], str) and not r[0].strip().replace(".", "", 1).isdigit():
            out.append((None, None))  # a header or a note
            continue
        mu = number(f"vapour row {i} mu", r[0], None, low=0.0, high=1e9, unit="-")
        sd = number(f"vapour row {i} s_d", r[1], None, low=0.0, high=1e6, unit="m")
        if mu is not None and sd is not None:
            raise HeatLedgerError(f"vapour row {i}: give mu or s_d, not both")
        out.append((mu, sd))
    return tuple(out)


def _with_vapour(con, rows):
    """The construction with the vapour range's values applied, row for row."""
    if not rows:
        return con
    layers = []
    for i, lay in enumerate(con.layers):
        mu, sd = rows[i] if i < len(rows) else (None, None)
        if mu is None and sd is None:
            layers.append(lay)
        elif isinstance(lay, AirLayer):
            layers.append(AirLayer(lay.thickness, ventilation=lay.ventilation,
                                   emissivity_1=lay.emissivity_1, emissivity_2=lay.emissivity_2,
                                   vent_area=lay.vent_area, name=lay.name,
                                   sd=sd if sd is not None else mu * lay.thickness))
        elif isinstance(lay, BridgedLayer):
            layers.append(BridgedLayer(lay.thickness, lay.parts, name=lay.name,
                                       vapour_resistance_factor=mu, sd=sd))
        else:
            layers.append(Layer(lay.thickness, lay.conductivity,
                                resistance=lay.declared_resistance, name=lay.name,
                                material=lay.material, vapour_resistance_factor=mu, sd=sd))
    return type(con)(layers, con.heat_flow, rsi=con.rsi,
                     rse=con.rse if con.rse_given else None, name=con.name)
