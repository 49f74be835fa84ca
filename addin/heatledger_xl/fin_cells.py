"""Helpers of the fin spreadsheet functions: the limits of their arguments, fins built from
cell values, result rows, and fin sets read from a two-column range of project-file keys
and values.
"""

from __future__ import annotations

import datetime as _dt
import math
import warnings
from numbers import Real

import numpy as np

from heatledger.errors import HeatLedgerError
from heatledger.fins import AnnularFin, StraightFin
from heatledger.fins.project_io import ARRAY_KEYS, FV_KEYS, fins_from_dict

from .cells import ERROR_VALUES, flag, integer, number, text
from .ranges import LIBRARY

#: Bounds of the dimensions accepted. [mm]
MIN_MM, MAX_MM = 1e-3, 1e5
#: Bounds of conductivity [W/(m K)] and convection coefficient [W/(m2 K)].
MAX_CONDUCTIVITY, MAX_H = 1e4, 1e6
#: Most points of a temperature table and most finite-volume cells a cell may ask for.
MAX_POINTS, MAX_NODES = 1001, 2000

__all__ = ["MIN_PROFILE_RATIO", "MAX_SPEC_ROWS", "FINSET_QUANTITIES"]


_ABS_ZERO = -273.15


_MAX_TEMP = 2000.0


#: Smallest thickness-to-length ratio of a profiled fin (slender-fin formulas). [-]
MIN_PROFILE_RATIO = 1e-4


#: Most filled rows of a fin-set range.
MAX_SPEC_ROWS = 60


_STRAIGHT_TIPS = ("convective", "adiabatic", "temperature", "infinite", "corrected")


_ANNULAR_TIPS = ("adiabatic", "convective", "corrected")


# --------------------------------------------------------------------------- helpers
_TITLES = ["quantity", "value", "unit"]


_FV_NONLINEAR = ("fv_nonlinear_heat_rate", "fv_nonlinear_tip_temperature",
                 "fv_nonlinear_iterations")


#: Names of the numeric results of a fin set (HL_FINSET_VALUE's quantity).
FINSET_QUANTITIES = (
    "heat_rate", "efficiency", "effectiveness", "resistance", "temp_tip", "m",
    "fin_area", "cross_section_area", "fv_heat_rate", "fv_relative_difference",
    "fv_energy_residual", "fv_mesh_estimate", "fv_cells") + _FV_NONLINEAR + (
    "array_heat_rate", "overall_efficiency", "array_resistance", "total_area",
    "fin_heat_rate_in_array", "length_for_target_mm", "count_for_target")


def _straight_options(shape, tip, width_mm, temp_tip, profile) -> dict:
    """Optional arguments first, so a bad one is named even when required ones are blank."""
    kind = text("shape", shape, "plate").lower()
    if kind not in ("plate", "pin"):
        raise HeatLedgerError(f"shape must be one of 'plate', 'pin'; got {kind!r}")
    mode = text("tip", tip, "convective").lower()
    if mode not in _STRAIGHT_TIPS:
        raise HeatLedgerError(f"tip must be one of {', '.join(map(repr, _STRAIGHT_TIPS))}; "
                              f"got {mode!r}")
    width = number("width_mm", width_mm, None, low=MIN_MM, high=MAX_MM, low_inclusive=True,
                   unit="mm")
    t_l = number("temp_tip", temp_tip, None, low=_ABS_ZERO, high=_MAX_TEMP,
                 low_inclusive=True, unit="degC")
    prof = text("profile", profile, "rectangular").lower()
    if prof not in ("rectangular", "triangular", "parabolic"):
        raise HeatLedgerError(f"profile must be one of 'rectangular', 'triangular', "
                              f"'parabolic'; got {prof!r}")
    if width is not None and kind == "pin":
        raise HeatLedgerError("width_mm applies to plate fins only; leave it blank for a pin")
    if (mode == "temperature") != (t_l is not None):
        raise HeatLedgerError("temp_tip is needed with tip \"temperature\" and only "
                              f"then; got tip {mode!r} and temp_tip "
                              f"{'blank' if t_l is None else f'{t_l:g}'}")
    if prof != "rectangular" and mode not in ("convective", "adiabatic"):
        raise HeatLedgerError(f"a {prof} profile ends in an edge or point: tip must be "
                              f"\"convective\" or \"adiabatic\"; got {mode!r}")
    return {"shape": kind, "tip": mode, "width": width, "temp_tip": t_l,
            "profile": prof}


def _common(conductivity, h, temp_base, temp_fluid):
    k = number("conductivity", conductivity, low=0.0, high=MAX_CONDUCTIVITY, unit="W/(m K)")
    hh = number("h", h, low=0.0, high=MAX_H, unit="W/(m2 K)")
    t_b = number("temp_base", temp_base, low=_ABS_ZERO, high=_MAX_TEMP,
                 low_inclusive=True, unit="degC")
    t_inf = number("temp_fluid", temp_fluid, low=_ABS_ZERO, high=_MAX_TEMP, low_inclusive=True,
                   unit="degC")
    return k, hh, t_b, t_inf


def _straight_fin(length_mm, size_mm, conductivity, h, temp_base, temp_fluid, opts):
    length = number("length_mm", length_mm, low=MIN_MM, high=MAX_MM, low_inclusive=True,
                    unit="mm") / 1000.0
    size = number("size_mm", size_mm, low=MIN_MM, high=MAX_MM, low_inclusive=True,
                  unit="mm") / 1000.0
    k, hh, t_b, t_inf = _common(conductivity, h, temp_base, temp_fluid)
    if opts["profile"] != "rectangular" and size / length < MIN_PROFILE_RATIO:
        raise HeatLedgerError(f"size_mm/length_mm must be at least {MIN_PROFILE_RATIO:g} for "
                              "a profiled fin")
    tip = opts["tip"]
    kwargs = {"tip": "convective" if tip == "corrected" else tip,
              "corrected_length": tip == "corrected", "profile": opts["profile"],
              "temp_tip": opts["temp_tip"]}
    if opts["shape"] == "plate":
        w = 1.0 if opts["width"] is None else opts["width"] / 1000.0
        fin = _guard(lambda: StraightFin(length, k, hh, thickness=size, width=w, **kwargs))
    else:
        fin = _guard(lambda: StraightFin(length, k, hh, diameter=size, **kwargs))
    return fin, t_b, t_inf


def _straight_result(length_mm, size_mm, conductivity, h, temp_base, temp_fluid, shape,
                     tip, width_mm, temp_tip, profile):
    opts = _straight_options(shape, tip, width_mm, temp_tip, profile)
    fin, t_b, t_inf = _straight_fin(length_mm, size_mm, conductivity, h, temp_base,
                                    temp_fluid, opts)
    return _evaluate(fin, t_b, t_inf)


def _annular_tip(tip) -> str:
    mode = text("tip", tip, "adiabatic").lower()
    if mode not in _ANNULAR_TIPS:
        raise HeatLedgerError(f"tip must be one of {', '.join(map(repr, _ANNULAR_TIPS))}; "
                              f"got {mode!r}")
    return mode


def _annular_fin(d1_mm, d2_mm, t_mm, conductivity, h, temp_base, temp_fluid, mode):
    d1 = number("tube_diameter_mm", d1_mm, low=MIN_MM, high=MAX_MM, low_inclusive=True,
                unit="mm")
    d2 = number("fin_diameter_mm", d2_mm, low=MIN_MM, high=MAX_MM, low_inclusive=True,
                unit="mm")
    t = number("thickness_mm", t_mm, low=MIN_MM, high=MAX_MM, low_inclusive=True, unit="mm")
    if not d2 > d1 * (1.0 + 1e-9):
        raise HeatLedgerError(f"fin_diameter_mm must exceed tube_diameter_mm ({d1:g} mm); "
                              f"got {d2:g} mm")
    k, hh, t_b, t_inf = _common(conductivity, h, temp_base, temp_fluid)
    fin = _guard(lambda: AnnularFin(d1 / 2000.0, d2 / 2000.0, t / 1000.0, k, hh,
                                    tip="adiabatic" if mode == "adiabatic" else "convective",
                                    corrected_length=mode == "corrected"))
    return fin, t_b, t_inf


def _annular_result(d1_mm, d2_mm, t_mm, conductivity, h, temp_base, temp_fluid, tip):
    mode = _annular_tip(tip)
    fin, t_b, t_inf = _annular_fin(d1_mm, d2_mm, t_mm, conductivity, h, temp_base,
                                   temp_fluid, mode)
    return _evaluate(fin, t_b, t_inf)


def _evaluate(fin, t_b, t_inf):
    res = _guard(lambda: fin.evaluate(t_b, t_inf))
    for name in ("heat_rate", "efficiency", "effectiveness", "fin_resistance", "temp_tip"):
        if not math.isfinite(getattr(res, name)):
            raise HeatLedgerError(f"{name} is undefined when temp_base equals temp_fluid "
                                  f"({t_b:g} degC) for this tip condition")
    return res


def _table_options(points, nodes, header):
    n_pts = integer("points", points, 11, low=2, high=MAX_POINTS)
    n_fv = integer("nodes", nodes, None, low=2, high=MAX_NODES)
    return n_pts, n_fv, flag("header", header, False)


def _guard(call):
    """Run an engine call; numerical trouble becomes a HeatLedgerError naming the inputs."""
    try:
        with warnings.catch_warnings(), np.errstate(over="raise", divide="raise",
                                                    invalid="raise", under="ignore"):
            warnings.simplefilter("error")
            return call()
    except HeatLedgerError:
        raise
    except (ArithmeticError, ValueError, Warning) as exc:
        raise HeatLedgerError(
            "the dimensions, conductivity and h lie outside the range the formulas handle "
            f"({type(exc).__name__}); check the inputs") from None


def _result_rows(fin, t_b, t_inf, cells):
    res = _evaluate(fin, t_b, t_inf)
    fv = _guard(lambda: fin.finite_volume(t_b, t_inf, nodes=cells))
    rows = [["heat_rate", res.heat_rate, "W"], ["efficiency", res.efficiency, "-"],
            ["effectiveness", res.effectiveness, "-"], ["resistance", res.fin_resistance, "K/W"],
            ["temp_tip", res.temp_tip, "degC"], ["m", res.m, "1/m"],
            ["fin_area", res.fin_area, "m2"],
            ["cross_section_area", res.cross_section_area, "m2"],
            ["fv_heat_rate", fv.heat_rate, "W"],
            ["fv_relative_difference", _ratio(fv.heat_rate, res.heat_rate), "-"],
            ["fv_energy_residual", fv.energy_residual, "-"],
            ["fv_mesh_estimate", fv.mesh_estimate.error_estimate, "W"],
            ["fv_cells", float(fv.settings["cells"]), "-"], ["method", res.method, ""]]
    rows += [["warning", t, ""] for t in dict.fromkeys(res.warnings + fv.warnings)]
    return [_clean(r) for r in rows]


def _ratio(a, b):
    return (a - b) / b if b else 0.0


def _clean(row):
    out = []
    for v in row:
        if isinstance(v, float) and not math.isfinite(v):
            v = "undefined"
        out.append(v)
    return out


def _with_header(rows, titles, header):
    return [list(titles)] + rows if header else rows


# ---- fin sets ------------------------------------------------------------------------------
_INT_KEYS = ("count", "cells")


def _entry(spec):
    row, where = _spec_row(spec)
    problems: list = []
    try:
        entries = _guard(lambda: fins_from_dict([row], LIBRARY, problems))
    except HeatLedgerError as exc:  # name the argument the values came from
        raise HeatLedgerError(f"spec: {exc}") from None
    if problems:
        # a problem with a key the user typed first (a missing key second)
        problems.sort(key=lambda p: p[0].split(".")[-1] not in where)
        path, msg = problems[0]
        key = path.split(".")[-1] if "." in path else ""
        at = f" (row {where[key]})" if key in where else ""
        more = f"; {len(problems) - 1} more problem(s)" if len(problems) > 1 else ""
        raise HeatLedgerError(f"spec {key or 'table'}{at}: {msg}{more}")
    return entries[0]


def _spec_row(spec):
    if not isinstance(spec, (list, tuple)):
        raise HeatLedgerError("spec must be a range of two columns: key and value")
    rows = [r if isinstance(r, (list, tuple)) else [r] for r in spec]
    row: dict = {"name": "fin"}
    where: dict = {}
    filled = 0
    for i, cells in enumerate(rows, 1):
        cells = list(cells) + [None, None]
        key, value = cells[0], cells[1]
        if _blank(key) and _blank(value):
            continue
        if i == 1 and isinstance(key, str) and key.strip().lower() == "key":
            continue  # header row
        filled += 1
        if filled > MAX_SPEC_ROWS:
            raise HeatLedgerError(f"spec has more than {MAX_SPEC_ROWS} filled rows")
        if not isinstance(key, str) or _blank(key) or key.strip().upper() in ERROR_VALUES:
            raise HeatLedgerError(f"spec row {i}: the first column must be a key (text)")
        name = key.strip().lower()
        target = row
        if name in ARRAY_KEYS:
            target = row.setdefault("array", {})
        elif name in FV_KEYS:
            target = row.setdefault("fv", {})
        if name in target or (name == "name" and "name" in where):
            raise HeatLedgerError(f"spec row {i}: key {name!r} is given twice")
        target[name] = _spec_value(name, value, i)
        where[name] = i
    if filled == 0:
        raise HeatLedgerError("spec is empty: give key/value rows (kind, conductivity, h, "
                              "temp_base, temp_fluid and the dimensions)")
    return row, where


def _spec_value(name, value, i):
    if isinstance(value, (list, tuple)):
        raise HeatLedgerError(f"spec row {i}: the value of {name} must be one cell")
    if _blank(value):
        return None
    if isinstance(value, bool):
        return value
    if isinstance(value, (_dt.date, _dt.datetime, _dt.time)):
        raise HeatLedgerError(f"spec row {i}: the value of {name} must be a number or text; "
                              "got a date")
    if isinstance(value, str):
        stripped = value.strip()
        if stripped.upper() in ERROR_VALUES:
            raise HeatLedgerError(f"spec row {i}: the value of {name} holds the error "
                                  f"{stripped.upper()}")
        if stripped.upper() in ("TRUE", "FALSE"):
            return stripped.upper() == "TRUE"
        try:
            value = float(stripped)
        except ValueError:
            return stripped
    if not isinstance(value, Real):
        raise HeatLedgerError(f"spec row {i}: the value of {name} must be a number or text")
    try:
        out = float(value)
    except (OverflowError, ValueError):
        raise HeatLedgerError(f"spec row {i}: the value of {name} must be a finite "
                              "number") from None
    if not math.isfinite(out):
        raise HeatLedgerError(f"spec row {i}: the value of {name} must be a finite number")
    if name in _INT_KEYS and out.is_integer() and abs(out) < 1e12:
        return int(out)
    return out


def _blank(value) -> bool:
    return value is None or (isinstance(value, str) and not value.strip())


def _finset_rows(entry):
    try:
        return _finset_rows_of(entry)
    except HeatLedgerError as exc:  # name the argument the values came from
        text_ = str(exc)
        raise HeatLedgerError(text_ if text_.startswith("spec") else f"spec: {text_}") from None


def _finset_rows_of(entry):
    rows = _result_rows(entry.fin, entry.temp_base, entry.temp_fluid, entry.fv.cells)
    warns = [r for r in rows if r[0] == "warning"]
    rows = [r for r in rows if r[0] != "warning"]
    if entry.fv.nonlinear:
        fv = _guard(entry.finite_volume)
        rows += [["fv_nonlinear_heat_rate", fv.heat_rate, "W"],
                 ["fv_nonlinear_tip_temperature", fv.temp_tip, "degC"],
                 ["fv_nonlinear_iterations", float(fv.iterations), "-"]]
        warns += [["warning", t, ""] for t in fv.warnings]
    if entry.array is not None:
        arr = _guard(entry.evaluate_array)
        rows += [["array_heat_rate", arr.heat_rate, "W"],
                 ["overall_efficiency", arr.overall_efficiency, "-"],
                 ["array_resistance", arr.fin_resistance, "K/W"],
                 ["total_area", arr.total_area, "m2"],
                 ["fin_heat_rate_in_array", arr.fin_heat_rate, "W"]]
        warns += [["warning", t, ""] for t in arr.warnings]
        sizing = _guard(entry.sizing)
        for key, unit, scale in (("length", "mm", 1000.0), ("count", "-", 1.0)):
            if key not in sizing:
                continue
            answer = sizing[key]
            label = "length_for_target_mm" if key == "length" else "count_for_target"
            rows.append([label, answer if isinstance(answer, str) else answer.value * scale,
                         unit])
    seen = set()
    for w in warns:
        if w[1] not in seen:
            seen.add(w[1])
            rows.append(w)
    return [_clean(r) for r in rows]
