"""The Glaser part of a moisture check's sheet: temperatures, saturation pressures and the
vapour-pressure line at every node for each month, the monthly amounts at every interface,
what is held, the year's result and the two charts.

Sources: [source: iso13788-glaser, clause 6]; [source: iso13788-saturation, Annex E].
"""

from __future__ import annotations

import numpy as np

from ..moisture.psychrometrics import MONTH_NAMES, SECONDS_PER_DAY
from .blocks_construction import put_warning
from .moisture_sheet import F_KG, F_PA, F_T, psat_formula
from .plan import Chart, ChartSeries, col_letter, sheet_ref

__all__ = ["glaser_sections"]

#: Rows from the cursor to a matrix's first month row: a blank row, the title, the header.
_MATRIX_OFFSET = 3


def glaser_sections(st) -> None:
    """Sections 4 to 8 of the sheet: nodes by month, amounts, result, charts.

    Parameters
    ----------
    st : types.SimpleNamespace
        The sheet's shared state (:func:`heatledger.sheet.moisture_sheet.moisture_setup`
        and the sections before). [-]
    """
    res = st.res
    st.t_rows = _matrix(st, "Temperature at each node [degC]", st.node_col,
                        lambda m, k: _temperature(st, m, k), res.temperatures, F_T)
    st.p_rows = _matrix(st, "Saturation pressure at each node (Annex E) [Pa]", st.node_col,
                        lambda m, k: "=" + psat_formula(f"{st.node_col[k]}{st.t_rows[m]}"),
                        res.saturation, F_PA)
    _planes_note(st)
    st.v_rows = _matrix(st, "Vapour-pressure line at each node [Pa]", st.node_col,
                        lambda m, k: _line(st, m, k), res.vapour_pressure, F_PA,
                        extra=_below_saturation)
    _amounts(st)
    _year(st)
    _charts(st)


def _matrix(st, title, cols, formula, engine, fmt, extra=None) -> dict:
    """Month rows of formulas at ``cols``, the engine's values to their right and a check
    of each row (sum of absolute differences within the tolerance); returns month -> row."""
    w = st.w
    w.start(f"m{w.section + 1}", title)
    n = len(cols)
    eng0 = 3 + n + 1
    heads = ["Month", ""] + [f"node {c}" for c in _heads(st, n)] + [""] + [
        "engine" for _ in range(n)] + ["Check"]
    w.headers(heads)
    rows = {}
    for m, name in enumerate(MONTH_NAMES):
        r = w.row
        rows[m] = r
        w.put(1, name)
        for k in range(n):
            w.put(3 + k, formula=formula(m, k), fmt=fmt)
            w.put(eng0 + k, float(engine[m][k]), role="engine", fmt=fmt)
        got = f"{cols[0]}{r}:{cols[-1]}{r}"
        ref = f"{col_letter(eng0)}{r}:{col_letter(eng0 + n - 1)}{r}"
        w.checks += 1
        w.put(eng0 + n, formula=f'=IF(SUMPRODUCT(ABS({got}-{ref}))<={w.tol}*MAX(1,'
                                f'SUMPRODUCT(ABS({ref}))),"OK","MISMATCH: differs by "&'
                                f'SUMPRODUCT(ABS({got}-{ref})))', role="check")
        if extra:
            extra(st, m, r, eng0 + n + 1)
        w.row += 1
    return rows


def _heads(st, n) -> list:
    return ["inside" if k == 0 else "outside" if k == n - 1 else f"{k}|{k + 1}"
            for k in range(n)]


def _temperature(st, m, k) -> str:
    c = st.months[m]
    return f"=E{c}-(E{c}-C{c})*{st.node_col[k]}${st.r_row}/{st.r_total}"


def _planes_note(st) -> None:
    """The engine's planes of each month (its choice), stated for the line's formulas."""
    w, res = st.w, st.res
    w.start("planes", "Condensation planes of each month (the engine's choice)")
    start = ("none: nothing condenses in any month" if res.start_month is None
             else MONTH_NAMES[res.start_month])
    st.start_cell = w.stated("starting month (first month, from January, that condenses "
                             "after one that does not)", start)
    w.put(2, "Month", role="header")
    w.put(3, "Interfaces held at saturation (where the line bends)", role="header")
    w.row += 1
    for m, name in enumerate(MONTH_NAMES):
        w.put(2, name)
        planes = res.planes[m]
        w.put(3, ", ".join(res.interface_names[i] for i in planes) or "none",
              style="hl text")
        w.row += 1


def _vertices(st, m) -> list:
    return [0, *[i + 1 for i in st.res.planes[m]], st.n_nodes - 1]


def _line(st, m, k) -> str:
    """Node k of month m: a fixed point (inside, outside, a plane at saturation) or the
    straight line between the fixed points either side in s_d."""
    c, cols, s = st.months[m], st.node_col, st.s_row
    v = _vertices(st, m)
    if k == 0:
        return f"=J{c}"
    if k == st.n_nodes - 1:
        return f"=H{c}"
    if k in v:
        return f"={cols[k]}{st.p_rows[m]}"
    a = max(i for i in v if i < k)
    b = min(i for i in v if i > k)
    r = st.w.row
    pa, pb = f"{cols[a]}{r}", f"{cols[b]}{r}"
    return (f"={pa}+({pb}-{pa})*({cols[k]}${s}-{cols[a]}${s})/"
            f"({cols[b]}${s}-{cols[a]}${s})")


def _below_saturation(st, m, r, col) -> None:
    """Check that the line stays at or below saturation at every node of the row."""
    w = st.w
    line = f"{st.node_col[0]}{r}:{st.node_col[-1]}{r}"
    sat = f"{st.node_col[0]}{st.p_rows[m]}:{st.node_col[-1]}{st.p_rows[m]}"
    w.checks += 1
    w.put(col, formula=f'=IF(SUMPRODUCT(({line}>{sat}*(1+{w.tol}))*1)=0,"OK",'
                       f'"MISMATCH: above saturation")', role="check")
    if m == 0:
        w.put(col, "≤ saturation", role="header", row=r - 1)


def _amounts(st) -> None:
    """Monthly amount at each interface, what is held, and their totals."""
    n_if = st.n_nodes - 2
    if n_if < 1:
        return
    cols = [col_letter(3 + i) for i in range(n_if)]
    # a matrix's first month row is 3 below the cursor (title, header); the held matrix
    # follows the amounts, so both are known before either is written
    rate_first = st.w.row + _MATRIX_OFFSET
    st.held_first = rate_first + 12 + _MATRIX_OFFSET
    st.rate_rows = _matrix(st, "Amount condensed (+) or evaporated (−) at each interface "
                           "in the month [kg/m2]", cols, lambda m, i: _rate(st, m, i),
                           st.res.interface_rate, F_KG)
    st.held_rows = _matrix(st, "Water held at each interface at the end of the month "
                           "[kg/m2]", cols, lambda m, i: _held(st, m, i),
                           st.res.interface_accumulation, F_KG)
    if st.rate_rows[0] != rate_first or st.held_rows[0] != st.held_first:
        raise RuntimeError("moisture sheet: the amount matrices are not where planned")
    st.if_cols = cols


def _rate(st, m, i) -> str:
    """max(g t, −held before) with g = δ0 [(p_k-1 − p_k)/Δs − (p_k − p_k+1)/Δs']."""
    cols, s, v = st.node_col, st.s_row, st.v_rows[m]
    k = i + 1
    a, c, b = cols[k - 1], cols[k], cols[k + 1]
    g = (f"{st.delta0}*(({a}{v}-{c}{v})/({c}${s}-{a}${s})-({c}{v}-{b}{v})/"
         f"({b}${s}-{c}${s}))")
    seconds = f"B{st.months[m]}*{SECONDS_PER_DAY:g}"
    return f"=MAX({g}*{seconds},-{_before(st, m, i)})"


def _before(st, m, i) -> str:
    """What interface i held before month m: nothing in the starting month."""
    start = st.res.start_month if st.res.start_month is not None else 0
    if m == start:
        return "0"
    return f"{col_letter(3 + i)}{st.held_first + (m - 1) % 12}"


def _held(st, m, i) -> str:
    return f"={_before(st, m, i)}+{col_letter(3 + i)}{st.rate_rows[m]}"


def _year(st) -> None:
    """Totals by month, the year's result and its checks."""
    w, res = st.w, st.res
    if not hasattr(st, "rate_rows"):
        return
    w.start("year", "The year: totals, largest amount, drying and mass balance")
    w.headers(["Month", "", "Total amount [kg/m2]", "Engine", "Check", "Total held [kg/m2]",
               "Engine", "Check"])
    first = w.row
    last_if = st.if_cols[-1]
    for m, name in enumerate(MONTH_NAMES):
        w.put(1, name)
        rate = w.put(3, formula=f"=SUM(C{st.rate_rows[m]}:{last_if}{st.rate_rows[m]})",
                     fmt=F_KG)
        w.check(5, rate, w.put(4, float(res.condensation_rate[m]), role="engine", fmt=F_KG))
        held = w.put(6, formula=f"=SUM(C{st.held_rows[m]}:{last_if}{st.held_rows[m]})",
                     fmt=F_KG)
        w.check(8, held, w.put(7, float(res.accumulation[m]), role="engine", fmt=F_KG))
        w.row += 1
    last = w.row - 1
    st.total_rows = (first, last)
    _verdict(st, first, last)


def _verdict(st, first, last) -> None:
    w, res = st.w, st.res
    w.row += 1
    peak = w.value_row("largest amount held [kg/m2]", formula=f"=MAX(F{first}:F{last})",
                       engine=res.max_accumulation, fmt=F_KG)
    end = ((res.start_month or 0) - 1) % 12
    left = w.value_row(f"held at the end of the 12-month cycle (end of {MONTH_NAMES[end]}) "
                       "[kg/m2]", formula=f"=F{first + end}", engine=res.residual, fmt=F_KG)
    w.value_row("mass balance: sum of the monthly amounts − held at the end [kg/m2]",
                formula=f"=SUM(C{first}:C{last})-{left}", engine=0.0, fmt=F_KG,
                note="zero when no water is created or lost")
    kind = ("none" if res.start_month is None else "dries out" if res.dries_out
            else "does not dry out")
    verdict = w.value_row(
        "interstitial condensation over the year",
        formula=f'=IF({peak}<=0,"none",IF({left}<=1E-12,"dries out","does not dry out"))',
        role="formula")
    w.check(5, verdict, w.put(4, kind, role="engine", row=w.row - 1), exact=True,
            row=w.row - 1)
    st.verdict_cell, st.peak_cell = verdict, peak
    w.stated("engine's verdict", res.verdict)
    for text in res.warnings:
        put_warning(w, f"Warning (engine): {text}")


def _charts(st) -> None:
    res, name = st.res, st.sheet_name
    worst = (res.max_month if res.max_month is not None
             else int(np.argmin(st.entry.climate.temp_outside)))
    cols = st.node_col
    s_range = sheet_ref(name, f"{cols[0]}{st.s_row}:{cols[-1]}{st.s_row}")
    p_row, v_row = st.p_rows[worst], st.v_rows[worst]
    st.sheet.charts.append(Chart(
        "scatter", f"Vapour pressure and saturation through the construction, "
        f"{MONTH_NAMES[worst]}", f"{col_letter(2 * st.n_nodes + 7)}{st.t_rows[0]}",
        (ChartSeries("saturation pressure", sheet_ref(name, f"{cols[0]}{p_row}:"
                                                            f"{cols[-1]}{p_row}"),
                     s_range, line=True, marker="circle", color="C0504D"),
         ChartSeries("vapour pressure", sheet_ref(name, f"{cols[0]}{v_row}:{cols[-1]}{v_row}"),
                     s_range, line=True, marker="diamond", color="2E5A6B")),
        x_title="s_d from the inside surface [m]", y_title="pressure [Pa]",
        width_cm=18.0, height_cm=9.0, y_format="0"))
    if hasattr(st, "total_rows"):
        first, last = st.total_rows
        st.sheet.charts.append(Chart(
            "bar", "Water held at the end of each month [kg/m2]",
            f"{col_letter(2 * st.n_nodes + 7)}{st.rate_rows[0]}",
            (ChartSeries("held", sheet_ref(name, f"F{first}:F{last}"),
                         sheet_ref(name, f"A{first}:A{last}"), color="2E5A6B"),),
            x_title="month", y_title="kg/m2", width_cm=18.0, height_cm=8.0,
            y_format="0.000"))
