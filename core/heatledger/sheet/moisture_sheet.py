"""The calculation sheet of one moisture check (EN ISO 13788): the layers with their vapour
values, the climate, the surface humidity check and the monthly Glaser calculation.

Every step a formula can carry is a live formula: the node positions in thermal resistance
and in ``s_d``, the vapour pressures of the climate (and the humidity class's excess), the
saturation pressure of Annex E, the dew point, f_Rsi,min and f_Rsi, the temperatures and
saturation pressures at every node, the vapour-pressure line, the monthly amounts and what
is held. Where the engine chose (the condensation planes of each month and the starting
month) the sheet states the choice and checks what follows from it: the line stays at or
below saturation everywhere and the year's mass balance closes. Beside each formula the
engine's value and a check cell stand, as on the other families' sheets.

Sources: [source: iso13788-saturation, Annex E]; [source: iso13788-surface, clause 5];
[source: iso13788-glaser, clause 6]; [source: iso13788-classes, Annex A].
"""

from __future__ import annotations

import math
from types import SimpleNamespace

from .. import cautions as _cautions
from ..moisture.climate import HUMIDITY_CLASS_MARGIN, HUMIDITY_CLASSES
from ..moisture.glaser import VAPOUR_TIGHT_SD, vapour_columns
from ..moisture.psychrometrics import (
    MONTH_DAYS,
    MONTH_NAMES,
    VAPOUR_PERMEABILITY_AIR,
    WATER_VAPOUR_GAS_CONSTANT,
)
from ..moisture.surface import MIN_TEMPERATURE_DIFFERENCE
from .blocks_construction import add_calculation_sheet, put_check_counters, put_warning
from .plan import col_letter
from .rows import CheckRows, RowLayout

__all__ = ["moisture_setup", "layer_section", "climate_section", "surface_section",
           "psat_formula", "dew_formula", "F_PA", "F_T", "F_KG", "HEADER_ROWS"]

F_PA = "0.00"
F_T = "0.000"
F_KG = "0.000000"
F_F = "0.0000"
HEADER_ROWS = 9
#: Value rows: label in B, formula in C, engine in D, check in E, note in F.
MOISTURE_ROWS = RowLayout(label=2, value=3, engine=4, check=5, note=6, default_format=F_F)


def psat_formula(t: str) -> str:
    """Saturation pressure of EN ISO 13788 Annex E as a spreadsheet expression, over water
    at and above 0 degC and over ice below. [Pa]

    Parameters
    ----------
    t : str
        Cell (or expression) holding the temperature. [degC]
    """
    return (f"IF({t}>=0,610.5*EXP(17.269*{t}/(237.3+{t})),"
            f"610.5*EXP(21.875*{t}/(265.5+{t})))")


def dew_formula(p: str) -> str:
    """Dew point (the inverse of :func:`psat_formula`) as a spreadsheet expression. [degC]

    Parameters
    ----------
    p : str
        Cell (or expression) holding the vapour pressure. [Pa]
    """
    x = f"LN({p}/610.5)"
    return f"IF({x}>=0,237.3*{x}/(17.269-{x}),265.5*{x}/(21.875-{x}))"


def moisture_setup(plan, sheet_name: str, entry, tolerance: float, project_name: str):
    """The sheet, its title rows and the tolerance cell; returns the shared state.

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook plan to extend. [-]
    sheet_name : str
        Name of the new sheet. [-]
    entry : heatledger.moisture.project_io.MoistureEntry
        The check. [-]
    tolerance : float
        Relative tolerance of the check cells. [-]
    project_name : str
        Project name for the page header. [-]
    """
    widths = [8, 38] + [13] * 26
    sheet = add_calculation_sheet(plan, sheet_name, widths, f"{project_name} | {entry.name}")
    w = CheckRows(sheet, "$C$8", MOISTURE_ROWS)
    w.put(1, f"{entry.name}: surface humidity and interstitial condensation (EN ISO 13788)",
          style="hl title")
    sheet.merges.append("A1:N1")
    w.row = 2
    w.put(1, "Sand cells are inputs, teal cells formulas, grey cells the engine's values, "
             "green cells compare them. Months January first; pressures in Pa, amounts in "
             "kg/m2.", role="note")
    w.row = 3
    w.put(1, _cautions.CAUTIONS["moisture"], style="hl warning")
    sheet.merges.append("A3:N3")
    sheet.row_heights[3] = 45.0
    w.row = 4
    w.put(2, "Construction")
    w.put(3, entry.construction.name, style="hl text")
    w.row = 5
    w.put(2, "Climate")
    w.put(3, entry.climate.name, style="hl text")
    w.row = 6
    w.put(2, "δ0, vapour permeability of still air [kg/(m s Pa)]")
    delta0 = w.put(3, VAPOUR_PERMEABILITY_AIR, role="input", fmt="0.00E+00")
    w.row = 8
    w.put(2, "Check tolerance, relative [-]")
    w.put(3, float(tolerance), role="input", fmt="0.0E+00")
    put_check_counters(w, 8)
    if entry.notes:
        w.put(4, f"Notes: {entry.notes}", role="note", row=5)
    w.row = HEADER_ROWS
    return SimpleNamespace(w=w, sheet=sheet, sheet_name=sheet_name, entry=entry, plan=plan,
                           delta0=f"$C${delta0[1:]}", res=entry.interstitial,
                           surf=entry.surface, months={})


def layer_section(st) -> None:
    """Layers with R and s_d, and the node positions in R and s_d as rows.

    Parameters
    ----------
    st : types.SimpleNamespace
        The sheet's shared state from :func:`moisture_setup`. [-]
    """
    w, con, res = st.w, st.entry.construction, st.res
    names, resistances, sds = vapour_columns(con)
    counted = [(row, lay) for row, lay in zip(con.layer_table, con.layers, strict=True)
               if row.counted]
    w.start("layers", "Layers, inside to outside, with their vapour values")
    w.headers(["No.", "Layer", "d [m]", "R [m2 K/W]", "μ [-]", "s_d = μ d [m]",
               "Engine s_d [m]", "Check", "Note"])
    layer_rows = []
    for i, ((_row, lay), r_used, sd) in enumerate(zip(counted, resistances, sds,
                                                      strict=True)):
        w.put(1, i + 1)
        w.put(2, lay.name, style="hl text")
        d = w.put(3, float(lay.thickness), role="input", fmt="0.0000")
        w.put(4, float(r_used), role="input", fmt=F_F)
        mu = lay.vapour_resistance_factor
        tight = math.isinf(lay.sd)
        if tight:
            w.put(5, "vapour-tight", style="hl text")
            s = w.put(6, VAPOUR_TIGHT_SD, role="input", fmt="0.000")
            note = f"vapour-tight: s_d taken as {VAPOUR_TIGHT_SD:g} m"
        else:
            w.put(5, float(mu), role="input", fmt="0.00")
            s = w.put(6, formula=f"=E{w.row}*{d}", fmt="0.0000")
            note = "R as the construction's ladder uses it"
        w.check(8, s, w.put(7, float(sd), role="engine", fmt="0.0000"))
        w.put(9, note, role="note")
        layer_rows.append(w.row)
        w.row += 1
    st.layer_rows = layer_rows
    _node_rows(st, names, res)


def _node_rows(st, names, res) -> None:
    """Rows of node positions: R from the inside air, s_d from the inside surface."""
    w, con = st.w, st.entry.construction
    n = len(names)
    st.n_nodes = n + 1
    st.node_col = [col_letter(3 + k) for k in range(n + 1)]
    w.row += 1
    w.put(2, "Node (surfaces and interfaces)", role="header")
    for k in range(n + 1):
        head = ("inside surface" if k == 0 else "outside surface" if k == n
                else f"{k}|{k + 1}")
        w.put(3 + k, head, role="header")
    w.row += 1
    w.put(2, "Rsi of the construction [m2 K/W]")
    rsi = w.put(3, float(con.rsi), role="input", fmt=F_F)
    w.row += 1
    st.r_row = _position_row(st, "R from the inside air to the node [m2 K/W]", rsi, "D",
                             res.resistance_position)
    st.s_row = _position_row(st, "s_d from the inside surface to the node [m]", "0", "F",
                             res.sd_position)
    w.put(2, "Rse as used [m2 K/W]")
    rse = w.put(3, float(con.rse_used), role="input", fmt=F_F)
    w.row += 1
    last = f"{st.node_col[-1]}{st.r_row}"
    st.r_total = w.value_row("R_T = R to the outside surface + Rse [m2 K/W]",
                             formula=f"={last}+{rse}", engine=con.total_resistance)
    st.rsi = rsi


def _position_row(st, label, first, col, engine) -> int:
    """One row of cumulative positions (formulas) with the engine's row below and checks."""
    w = st.w
    row = w.row
    w.put(2, label)
    w.put(3, formula=f"={first}", fmt=F_F)
    for k in range(1, st.n_nodes):
        prev = f"{st.node_col[k - 1]}{row}"
        w.put(3 + k, formula=f"={prev}+{col}{st.layer_rows[k - 1]}", fmt=F_F)
    w.row += 1
    w.put(2, "engine's values", role="note")
    for k in range(st.n_nodes):
        cell = w.put(3 + k, float(engine[k]), role="engine", fmt=F_F)
        w.check(3 + k, f"{st.node_col[k]}{row}", cell, row=w.row + 1)
    w.row += 2
    return row


def climate_section(st) -> None:
    """The twelve months: temperatures, humidities and vapour pressures.

    Parameters
    ----------
    st : types.SimpleNamespace
        The sheet's shared state from :func:`moisture_setup`. [-]
    """
    w, clim = st.w, st.entry.climate
    cls = clim.humidity_class
    w.start("climate", "Climate, monthly means" + (
        f" (inside humidity from humidity class {cls}, EN ISO 13788 Annex A)" if cls else ""))
    if cls:
        st.dnu = w.value_row(f"Δν of class {cls} at θe ≤ 0 degC [kg/m3]",
                             value=HUMIDITY_CLASSES[cls], fmt="0.000")
        st.rv = w.value_row("R_v, gas constant of water vapour [J/(kg K)]",
                            value=WATER_VAPOUR_GAS_CONSTANT, fmt="0.0")
        st.margin = w.value_row("safety margin on Δp [-]", value=HUMIDITY_CLASS_MARGIN,
                                fmt="0.00")
    w.headers(["Month", "Days", "θe [degC]", "φe [-]", "θi [degC]", "φi [-]",
               "p_sat(θe) [Pa]", "p_e [Pa]", "p_sat(θi) [Pa]", "p_i [Pa]", "Engine p_e",
               "Engine p_i", "Check p_e", "Check p_i", "Δν [kg/m3]", "Δp [Pa]"])
    p_e_eng, p_i_eng = clim.vapour_pressure_outside, clim.vapour_pressure_inside
    for m, name in enumerate(MONTH_NAMES):
        r = w.row
        st.months[m] = r
        w.put(1, name)
        w.put(2, MONTH_DAYS[m], role="input", fmt="0")
        w.put(3, float(clim.temp_outside[m]), role="input", fmt="0.0")
        w.put(4, float(clim.rh_outside[m]), role="input", fmt="0.000")
        w.put(5, float(clim.temp_inside[m]), role="input", fmt="0.0")
        if cls:
            w.put(15, formula=f"={st.dnu}*MIN(1,MAX(0,(20-C{r})/20))", fmt="0.00000")
            w.put(16, formula=f"=O{r}*{st.rv}*((E{r}+273.15)+(C{r}+273.15))/2", fmt=F_PA)
            w.put(6, formula=f"=MIN(1,(H{r}+{st.margin}*P{r})/I{r})", fmt="0.000")
        else:
            w.put(6, float(clim.rh_inside[m]), role="input", fmt="0.000")
        w.put(7, formula=f"={psat_formula(f'C{r}')}", fmt=F_PA)
        w.put(8, formula=f"=D{r}*G{r}", fmt=F_PA)
        w.put(9, formula=f"={psat_formula(f'E{r}')}", fmt=F_PA)
        w.put(10, formula=f"=F{r}*I{r}", fmt=F_PA)
        w.check(13, f"H{r}", w.put(11, float(p_e_eng[m]), role="engine", fmt=F_PA))
        w.check(14, f"J{r}", w.put(12, float(p_i_eng[m]), role="engine", fmt=F_PA))
        w.row += 1
    for text in clim.warnings:
        put_warning(w, f"Warning (engine): {text}")


def surface_section(st) -> None:
    """f_Rsi of the construction and f_Rsi,min of each month, pass or fail.

    Parameters
    ----------
    st : types.SimpleNamespace
        The sheet's shared state from :func:`moisture_setup`. [-]
    """
    w, s = st.w, st.surf
    what = "mould growth" if s.rh_critical < 1.0 else "surface condensation"
    w.start("surface", f"Surface humidity: {what} (EN ISO 13788, 5)")
    phi = w.value_row("φ_si,cr, critical surface relative humidity [-]",
                      value=s.rh_critical, fmt="0.00")
    rsi = w.value_row("R_si of the check [m2 K/W]", value=s.resistance_inside, fmt="0.00",
                      note="0.25 opaque elements, 0.13 glazing and frames")
    junction = st.entry.junction
    cells = st.plan.index.get(("junction", junction.name)) if junction else None
    if junction is not None:
        f = w.value_row(f"f_Rsi of junction {junction.name} (2-D, R_si 0.25) [-]",
                        formula=f"={cells['f_rsi']}" if cells else None,
                        value=None if cells else s.surface_factor,
                        engine=s.surface_factor, note="the junction's own sheet")
    else:
        rt = w.value_row("R_T with this R_si = R_T − Rsi + R_si [m2 K/W]",
                         formula=f"={st.r_total}-{st.rsi}+{rsi}")
        f = w.value_row("f_Rsi = (R_T − R_si)/R_T [-]", formula=f"=({rt}-{rsi})/{rt}",
                        engine=s.surface_factor)
    w.headers(["Month", "p_i [Pa]", "p_sat,min = p_i/φ [Pa]", "θ_si,min [degC]",
               "f_Rsi,min [-]", "Engine f_Rsi,min", "Check", "f_Rsi [-]", "Result",
               "Engine result", "Check"])
    first = w.row
    for m, name in enumerate(MONTH_NAMES):
        r, c = w.row, st.months[m]
        w.put(1, name)
        w.put(2, formula=f"=J{c}", fmt=F_PA)
        w.put(3, formula=f"=B{r}/{phi}", fmt=F_PA)
        w.put(4, formula=f"={dew_formula(f'C{r}')}", fmt=F_T)
        w.put(5, formula=f'=IF(E{c}-C{c}>={MIN_TEMPERATURE_DIFFERENCE:g},(D{r}-C{c})/'
                         f'(E{c}-C{c}),"n/a")', fmt=F_F)
        req = s.required[m]
        if math.isnan(req):
            w.check(7, f"E{r}", w.put(6, "n/a", role="engine"), exact=True)
        else:
            w.check(7, f"E{r}", w.put(6, float(req), role="engine", fmt=F_F))
        w.put(8, formula=f"={f}", fmt=F_F)
        w.put(9, formula=f'=IF(E{r}="n/a","n/a",IF(H{r}>E{r},"pass","FAIL"))')
        eng = "n/a" if math.isnan(req) else ("pass" if s.passes[m] else "FAIL")
        w.check(11, f"I{r}", w.put(10, eng, role="engine"), exact=True)
        w.row += 1
    last = w.row - 1
    crit = ("n/a" if s.critical_month is None else MONTH_NAMES[s.critical_month])
    w.value_row("critical month (largest f_Rsi,min)",
                formula=f"=INDEX(A{first}:A{last},MATCH(MAX(E{first}:E{last}),"
                        f"E{first}:E{last},0))", role="formula")
    w.put(4, crit, role="engine", row=w.row - 1)
    w.check(5, f"C{w.row - 1}", f"D{w.row - 1}", exact=True, row=w.row - 1)
    st.surface_result = w.value_row(
        "surface check over the year", formula=f'=IF(COUNTIF(I{first}:I{last},"FAIL")=0,'
        f'"pass in every month","FAILS in "&COUNTIF(I{first}:I{last},"FAIL")&" month(s)")',
        role="formula")
    st.f_rsi = f
