"""Calculation-sheet blocks of fins and finned surfaces, built from the engine's results.

One sheet per fin entry of the project and an overview sheet ``Fins``. Every closed form is
a live formula: the fin parameter ``m``, ``M``, ``mL``, the heat rate for the tip condition
(COSH, SINH, TANH, EXP, SQRT), the profiled fins' efficiencies (BESSELI, SQRT, LN, ASINH),
the annular fin's Bessel solution, efficiency, effectiveness, resistance, the tip
temperature and the temperature along the fin; the array's overall surface efficiency and
resistance; and the finite-volume nodal table with the coefficients ``a_W``, ``a_E``,
``a_P``, ``b`` and the Thomas sweep. Beside each formula result the engine's value stands as
a constant with a check cell (``OK`` or a text beginning ``MISMATCH``), as on the
construction sheets.

Modified Bessel functions: spreadsheets' ``BESSELI`` agrees with scipy to about 1e-15, but
``BESSELK`` is a polynomial approximation (relative error up to about 1e-7 in LibreOffice
Calc), too coarse for checks at 1e-9. The sheet therefore computes ``K_n(x)`` from its
integral representation ``K_n(x) = int_0^inf exp(-x cosh t) cosh(n t) dt`` (Abramowitz &
Stegun 1964, eq. 9.6.24) by the trapezoidal rule on a column of nodes (step 0.05 up to
``x cosh t > 800``; the rule converges exponentially for this analytic, fast-decaying
integrand, Trefethen & Weideman, SIAM Review 56 (2014)), and shows ``BESSELK`` beside it
for comparison only.

References
----------
F. P. Incropera, D. P. DeWitt, *Fundamentals of Heat and Mass Transfer*, 6th ed., 2007,
section 3.6, Tables 3.4 and 3.5, section 3.6.5 (arrays). D. Q. Kern, *Process Heat
Transfer*, 1950, eq. 16.58. S. V. Patankar, *Numerical Heat Transfer and Fluid Flow*, 1980,
ch. 4 (discretisation and the tridiagonal-matrix algorithm) and 7.2 (source linearisation).
M. Abramowitz, I. A. Stegun, *Handbook of Mathematical Functions*, 1964, eq. 9.6.24.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

from .. import cautions as _cautions
from .._constants import STEFAN_BOLTZMANN as Stefan_Boltzmann
from .._constants import ZERO_CELSIUS as zero_Celsius
from ..fins.annular import AnnularFin
from .blocks_construction import DEFAULT_CHECK_TOLERANCE, add_calculation_sheet, put_warning
from .blocks_fins_closed import (
    F_E,
    F_G,
    F_T,
    FIN_ROWS,
    HEADER_ROWS,
    _annular,
    _annular_ratio,
    _describe,
    _profile_ratio,
    _profiled,
    _straight,
    _theta_ratio,
)
from .plan import (
    Chart,
    ChartSeries,
    PrintSetup,
    WorkbookPlan,
    col_letter,
    safe_sheet_name,
    sheet_ref,
)
from .rows import CheckRows

__all__ = ["FinRefs", "add_fin_sheet", "add_fin_sheets", "FIN_METHODS", "PROFILE_POINTS"]

#: Methods stated for fins (cover sheet and overview).
FIN_METHODS = (
    "Fins: Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, 6th ed., section 3.6, "
    "Table 3.4 (uniform fins, four tip conditions, corrected length) and Table 3.5 "
    "(profiled and annular fins); annular fin Bessel solution (Kern 1950, eq. 16.58)",
    "Fin arrays: overall surface efficiency and resistance, with contact resistance "
    "(Incropera & DeWitt, section 3.6.5)",
    "Fins by finite volumes: heatledger's 1-D cell-centred solver with the loss to the "
    "surroundings as a linearised source (Patankar 1980, ch. 4 and 7); Thomas algorithm in "
    "the sheet; mesh check from three meshes with the observed order",
)
#: Evenly spaced points of the closed-form temperature table (base and tip included).
PROFILE_POINTS = 11
COLUMN_WIDTHS = [6, 44, 11, 11, 11, 11, 14, 11, 11, 11, 14, 11, 11, 40, 11, 11, 11, 11, 12,
                 12, 11, 12]
FV_COLUMNS = ["Cell", "x [mm]", "A [m2]", "P [m]", "G east [W/K]", "a_W [W/K]", "a_E [W/K]",
              "S_p [W/K]", "S_c [W]", "a_P [W/K]", "b [W]", "P [-]", "Q [degC]", "T [degC]",
              "Engine a_W", "Engine a_E", "Engine a_P", "Engine b", "Engine T [degC]",
              "Check coefficients", "Check T", "Loss [W]"]


@dataclass
class FinRefs:
    """Where a fin sheet keeps its key results (absolute references).

    Attributes
    ----------
    sheet, name : str
    heat_rate, efficiency, effectiveness, fin_resistance, tip_temperature : str
        Closed-form results of one fin.
    array : dict
        ``heat_rate``, ``overall_efficiency``, ``fin_resistance`` of the array (empty without).
    checks_ok : str
    check_count : int
    extras : dict
        Row ranges of the profile table (``profile``) and FV table (``fv``).
    """

    sheet: str
    name: str
    heat_rate: str
    efficiency: str
    effectiveness: str
    fin_resistance: str
    tip_temperature: str
    checks_ok: str
    check_count: int
    array: dict = field(default_factory=dict)
    extras: dict = field(default_factory=dict)


def add_fin_sheets(plan: WorkbookPlan, project, summary_cells: dict | None = None, *,
                   tolerance: float = DEFAULT_CHECK_TOLERANCE, project_name: str = "") -> dict:
    """Add the ``Fins`` overview and one sheet per fin entry; return the check-count cells.

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook plan to extend. [-]
    project : heatledger.project.Project
        A parsed project with ``fins``. [-]
    summary_cells : dict, optional
        ``{"count": ref, "ok": ref}`` of the construction checks; the returned cells add the
        fin checks to them. [-]
    tolerance : float
        Relative tolerance of the check cells. [-]
    project_name : str
        Project name for the page headers. [-]

    Returns
    -------
    dict
        ``{"count": expression, "ok": expression}`` counting every check of the workbook.
    """
    overview = plan.add_sheet(
        "Fins", column_widths={col_letter(i + 1): w for i, w in enumerate(
            [5, 34, 24, 12, 12, 12, 12, 12, 12, 12, 12, 11, 11, 16, 60])},
        freeze="A6", print_setup=PrintSetup(orientation="landscape",
                                            header=f"{project_name} | {{sheet}}",
                                            footer_left="heatledger audit {sheet}",
                                            title_rows="1:5"))
    refs = []
    used: set[str] = set()
    for i, entry in enumerate(project.fins, 1):
        name = safe_sheet_name(f"Fin {i} {entry.name}", used, reserved=[s.name for s in
                                                                         plan.sheets])
        refs.append(add_fin_sheet(plan, name, entry, tolerance=tolerance,
                                  project_name=project_name))
        plan.index[("fins", entry.name)] = refs[-1]
    cells = _overview(overview, project.fins, refs)
    if summary_cells:
        return {k: f"{summary_cells[k]}+{cells[k]}" for k in ("count", "ok")}
    return cells


def add_fin_sheet(plan: WorkbookPlan, sheet_name: str, entry, *,
                  tolerance: float = DEFAULT_CHECK_TOLERANCE, project_name: str = "") -> FinRefs:
    """Add the calculation sheet of one fin entry.

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook plan to extend. [-]
    sheet_name : str
        Name of the new sheet. [-]
    entry : heatledger.fins.project_io.FinEntry
        The fin entry (fin, optional array, temperatures, FV settings). [-]
    tolerance : float
        Relative tolerance of the check cells. [-]
    project_name : str
        Project name for the page header. [-]

    Returns
    -------
    FinRefs
    """
    fin = entry.fin
    res = entry.evaluate()
    sheet = add_calculation_sheet(plan, sheet_name, COLUMN_WIDTHS,
                                  f"{project_name} | {entry.name}")
    w = CheckRows(sheet, "$C$8", FIN_ROWS)
    w.put(1, f"{entry.name}: fin heat rate, efficiency and temperatures", style="hl title")
    sheet.merges.append("A1:N1")
    w.row = 2
    w.put(1, "Lengths are entered in mm and converted to m; SI otherwise. Sand cells are "
             "inputs, teal cells formulas, grey cells the engine's values, green cells compare "
             "them.", role="note")
    w.row = 3
    w.put(1, _cautions.CAUTIONS["hot_surfaces"], style="hl warning")
    sheet.merges.append("A3:N3")
    sheet.row_heights[3] = 30.0
    w.row = 4
    w.put(2, "Fin")
    w.put(3, _describe(fin), style="hl text wrap")
    sheet.merges.append("C4:E4")  # wraps in the room left of the check counts
    w.row = 5
    w.put(2, "Base temperature T_b [degC]")
    r = {"tb": w.put(3, float(entry.temp_base), role="input", fmt="0.00")}
    w.row = 6
    w.put(2, "Fluid temperature T_inf [degC]")
    r["tinf"] = w.put(3, float(entry.temp_fluid), role="input", fmt="0.00")
    w.row = 7
    w.put(2, "Base excess temperature θ_b = T_b − T_inf [K]")
    r["theta"] = w.put(3, formula=f"={r['tb']}-{r['tinf']}", fmt="0.00")
    w.row = 8
    w.put(2, "Check tolerance, relative [-]")
    w.put(3, float(tolerance), role="input", fmt=F_E)
    w.put(4, "check: |formula − engine| ≤ tolerance × max(1, |engine|)", role="note")
    for row, label in ((4, "Check cells on this sheet"), (5, "Check cells that say OK"),
                       (6, "State of this sheet")):
        w.put(6, label, row=row)
    if entry.notes:
        w.row = 9
        w.put(2, "Notes")
        w.put(3, entry.notes, style="hl text")
    w.row = HEADER_ROWS

    w.start("inputs", "Inputs")
    mat = entry.material
    r["k"] = w.value_row("λ, thermal conductivity of the fin [W/(m K)]",
                         value=float(fin.conductivity),
                         fmt="0.00", note=(f"library material {mat.name!r}: {mat.source}" if mat
                                           else "given in the project"))
    r["h"] = w.value_row("h, convection coefficient [W/(m2 K)]", value=float(fin.h), fmt="0.00")
    if isinstance(fin, AnnularFin):
        _annular(w, r, fin, res, entry)
    elif fin.profile == "rectangular":
        _straight(w, r, fin, res)
    else:
        _profiled(w, r, fin, res)
    w.value_row("highest surface temperature of the fin [degC]",
                formula=f"=MAX({r['tb']},{r['tip']})", fmt="0.00",
                note="compare with the touch limits that apply (see the caution above)")
    put_warning(w, formula=f'=IF({r["eps"]}<1,"WARNING: fin effectiveness "&ROUND({r["eps"]},3)'
                           f'&" is below 1: the fin reduces the heat rate of the base it covers",'
                           f'"fin effectiveness "&ROUND({r["eps"]},3)&" is at least 1")')
    for text in res.warnings:
        put_warning(w, f"Warning (engine): {text}")
    for text in res.notes:
        w.put(2, f"Note (engine): {text}", role="note")
        w.row += 1
    profile = _profile_table(w, r, fin, entry)
    array_refs = _array(w, r, entry) if entry.array is not None else {}
    fv_rows = _fv(w, r, fin, entry)
    last_row = w.row
    sheet.charts.append(Chart(
        "scatter", f"Temperature along {entry.name}", f"P{HEADER_ROWS + 2}",
        (ChartSeries("closed form", sheet_ref(sheet_name, f"E{profile[0]}:E{profile[1]}"),
                     sheet_ref(sheet_name, f"C{profile[0]}:C{profile[1]}"), line=True,
                     marker="diamond", color="C0504D"),
         ChartSeries("finite volumes (cell centres)" + (", h(T) and radiation"
                                                         if entry.fv.nonlinear else ""),
                     sheet_ref(sheet_name, f"N{fv_rows[0]}:N{fv_rows[1]}"),
                     sheet_ref(sheet_name, f"B{fv_rows[0]}:B{fv_rows[1]}"), line=False,
                     marker="circle", color="2E5A6B")),
        x_title=("radius [mm]" if isinstance(fin, AnnularFin) else
                 "distance from the base [mm]"),
        y_title="temperature [degC]", width_cm=18.0, height_cm=9.0))
    w.block = sheet.block("header")
    count = w.put(10, w.checks, role="engine", fmt="0", row=4)
    ok = w.put(10, formula=f'=COUNTIF(A{HEADER_ROWS + 1}:V{last_row},"OK")', fmt="0", row=5)
    w.put(10, formula=f'=IF({ok}={count},"ALL CHECKS OK","NOT ALL OK")', style="hl check",
          row=6)
    s = sheet_name
    return FinRefs(sheet=s, name=entry.name, heat_rate=sheet_ref(s, r["q"]),
                   efficiency=sheet_ref(s, r["eta"]), effectiveness=sheet_ref(s, r["eps"]),
                   fin_resistance=sheet_ref(s, r["R"]), tip_temperature=sheet_ref(s, r["tip"]),
                   checks_ok=sheet_ref(s, ok), check_count=w.checks,
                   array={k: sheet_ref(s, v) for k, v in array_refs.items()},
                   extras={"profile": profile, "fv": fv_rows})


def _profile_table(w, r, fin, entry):
    temps = fin.temperatures(entry.temp_base, entry.temp_fluid, points=PROFILE_POINTS)
    annular = isinstance(fin, AnnularFin)
    w.start("profile", "Temperature along the fin (closed form)")
    w.headers(["Point", "s [-]", "r [mm]" if annular else "x [mm]", "θ/θ_b [-]", "T [degC]",
               "Engine T [degC]", "Check"])
    first = w.row
    for i in range(PROFILE_POINTS):
        s = w.put(2, i / (PROFILE_POINTS - 1), role="input", fmt="0.00")
        w.put(1, i + 1)
        if annular:
            x = f"({r['r1']}+{s}*({r['r2']}-{r['r1']}))"
            ratio = _annular_ratio(r, x, r["nodes"])
        elif fin.profile == "rectangular":
            x = f"({s}*{r['L']})"
            ratio = _theta_ratio(fin, r, x, fin.tip == "convective" and not fin.corrected_length)
        else:
            x = f"({s}*{r['L']})"
            ratio = _profile_ratio(fin, r, f"{r['L']}*(1-{s})")
        w.put(3, formula=f"={x}*1000", fmt="0.000")
        th = w.put(4, formula=f"={ratio}", fmt=F_G)
        t = w.put(5, formula=f"={r['tinf']}+{r['theta']}*{th}", fmt=F_T)
        w.check(7, t, w.put(6, float(temps.temperature[i]), role="engine", fmt=F_T))
        w.row += 1
    return first, w.row - 1


def _array(w, r, entry):
    arr = entry.array
    res = entry.evaluate_array()
    w.start("array", f"Array of fins on a base ({res.method})")
    n = w.value_row("N, number of fins [-]", value=float(arr.count), fmt="0")
    base = w.value_row("base area including the fin roots [m2]", value=float(arr.base_area),
                       fmt=F_E)
    rc = w.value_row("R''_t,c, contact resistance at each root [m2 K/W]",
                     value=float(arr.contact_resistance), fmt=F_E)
    ab = w.value_row("A_b = base area − N A_c,b [m2]", formula=f"={base}-{n}*{r['Ac']}",
                     engine=res.exposed_base_area, fmt=F_E)
    at = w.value_row("A_t = N A_f + A_b [m2]", formula=f"={n}*{r['Af']}+{ab}",
                     engine=res.total_area,
                     fmt=F_E)
    # G_f = eta_f h A_f, the fin's own conductance where the sheet has it (it keeps the heat an
    # infinitely long fin sheds beyond its stated length)
    g_f = r["G"] if "G" in r else f"{r['eta']}*{r['h']}*{r['Af']}"
    c1 = w.value_row("C_1 = 1 + η_f h A_f R''_t,c/A_c,b [-]",
                     formula=f"=1+{g_f}*{rc}/{r['Ac']}", engine=res.contact_factor)
    eta_o = w.value_row("η_o = 1 − (N A_f/A_t)(1 − η_f/C_1) [-]",
                        formula=f"=1-{n}*{r['Af']}/{at}*(1-{g_f}/({r['h']}*{r['Af']})/{c1})",
                        engine=res.overall_efficiency, note="eqs. 3.107 and 3.110")
    res_o = w.value_row("R_t,o = 1/(η_o h A_t) [K/W]", formula=f"=1/({eta_o}*{r['h']}*{at})",
                        engine=res.fin_resistance, note="eq. 3.108")
    q_t = w.value_row("q_t = θ_b/R_t,o [W]", formula=f"={r['theta']}/{res_o}", engine=res.heat_rate)
    w.value_row("q per fin = (η_f/C_1) h A_f θ_b [W]",
                formula=f"={g_f}/{c1}*{r['theta']}", engine=res.fin_heat_rate)
    w.value_row("bare base alone h A_base θ_b [W]", formula=f"={r['h']}*{base}*{r['theta']}",
                fmt=F_G,
                note="for comparison: the base without fins")
    for text in res.warnings[len(entry.fin.warnings):]:
        put_warning(w, f"Warning (engine): {text}")
    for key, answer in entry.sizing().items():
        label = "fin length" if key == "length" else "fin count"
        if isinstance(answer, str):
            w.stated(f"{label} for the target {entry.target_heat_rate:g} W", answer)
            continue
        if key == "length":
            w.stated(f"{label} for the target {entry.target_heat_rate:g} W [mm]",
                     answer.value * 1000.0, "0.000",
                     note=f"engine: {answer.method} (root found by the engine, not "
                          "recomputed here)")
        else:
            cnt = w.stated(f"{label} for the target {entry.target_heat_rate:g} W [-]",
                           answer.value, "0", note=f"engine: {answer.method}")
            target = w.value_row("target heat rate [W]", value=float(entry.target_heat_rate))
            per = (f"({r['h']}*({r['eta']}/{c1}*{r['Af']}-{r['Ac']})*{r['theta']})")
            bare = f"({r['h']}*{base}*{r['theta']})"
            w.put(2, "the count meets the target and one fin fewer does not")
            chk = (f'=IF(AND({bare}+{cnt}*{per}>={target}*(1-{w.tol}),OR({cnt}=0,'
                   f'{bare}+({cnt}-1)*{per}<{target})),"OK","MISMATCH: count does not fit")')
            w.checks += 1
            w.put(12, formula=chk, role="check")
            w.row += 1
    return {"heat_rate": q_t, "overall_efficiency": eta_o, "fin_resistance": res_o}


# --------------------------------------------------------------------------- finite volumes
def _fv(w, r, fin, entry):
    fv = entry.finite_volume()
    sol = fv.solution
    st = fv.settings
    nonlinear = st["linearisation"] != "none (linear problem)"
    n = st["cells"]
    annular = isinstance(fin, AnnularFin)
    w.start("fv", "Finite volumes (cell-centred, Patankar 1980 ch. 4; heatledger.fv1d)")
    w.put(2, "a_P T_i = a_W T_(i−1) + a_E T_(i+1) + b with the loss to the fluid as the "
             "source S = S_c + S_p T; G = 1/(dx/(2λA_i) + dx/(2λA_(i+1))). Solved here by the "
             "Thomas algorithm (P_i = a_E/(a_P − a_W P_(i−1)), Q_i = (b + a_W Q_(i−1))/(a_P − "
             "a_W P_(i−1)), T_i = P_i T_(i+1) + Q_i); by the engine with LAPACK gtsv.",
          role="note")
    w.row += 1
    cells = w.value_row("number of cells N [-]", value=float(n), fmt="0")
    length = f"({r['r2c']}-{r['r1']})" if annular else (
        r["Le"] if fin.profile == "rectangular" else r["L"])
    dx = w.value_row("dx = length/N [m]", formula=f"={length}/{cells}", engine=st["length"] / n,
                     fmt=F_E)
    law = st["h_law"]
    w.stated("convection law in the finite volumes", law if law == "constant" else
             f"{law}: C = {st['h_parameters']['h_coefficient']:g}, n = "
             f"{st['h_parameters']['h_exponent']:g}")
    w.stated("emissivity for radiation to the surroundings [-]", st["emissivity"], "0.000")
    w.stated("linearisation; iterations; tolerance [K]",
             f"{st['linearisation']}; {fv.iterations}; {st['tolerance_K']:g}")
    if nonlinear:
        w.put(2, "Non-linear loss (h(T) or radiation): a_P and b are the engine's last "
                 "linearisation (Patankar 1980, 7.2), stated as values; G, a_W, a_E, the "
                 "sweep and the loss at the final temperatures are formulas.", role="note")
        w.row += 1
    k, h, tinf = r["k"], r["h"], r["tinf"]
    sig = None
    if nonlinear:
        sig = w.value_row("σ, Stefan–Boltzmann constant [W/(m2 K4)]", value=float(Stefan_Boltzmann),
                          fmt=F_E, note="from the exact SI defining constants, 2 π⁵ k⁴/(15 h³ c²)")
    node0 = w.row + 3
    node_n = node0 + n - 1
    g0 = w.value_row("base conductance G_0 = 2 λ A_1/dx [W/K]", formula=f"=2*{k}*C{node0}/{dx}",
                     fmt=F_E, note="fixed base temperature, half a cell away")
    tip = st["tip"]
    half = f"{dx}/(2*{k}*C{node_n})"
    if tip == "adiabatic":
        gl, t_r = "0", tinf
        w.stated("tip: adiabatic, no conductance", "0")
    elif tip == "convective":
        a_tip = (f"(2*PI()*{r['r2']}*{r['t']})" if annular else r["Ac"])
        gl = w.value_row("tip conductance G_N = 1/(dx/(2λA_N) + 1/(h A_tip)) [W/K]",
                         formula=f"=1/({half}+1/({h}*{a_tip}))", fmt=F_E,
                         note="with the constant h; the last iteration's tip coefficient "
                              "(h(T), radiation) is inside the engine's a_P and b" if nonlinear
                         else "")
        t_r = tinf
    elif tip == "temperature":
        gl = w.value_row("tip conductance G_N = 2 λ A_N/dx [W/K]", formula=f"=2*{k}*C{node_n}/{dx}",
                         fmt=F_E)
        t_r = r["TL"]
    else:
        gl = w.value_row("tip conductance G_N = 1/(dx/(2λA_N) + 1/(λ m A_N)) [W/K]",
                         formula=f"=1/({half}+1/({k}*SQRT({h}*D{node_n}/({k}*C{node_n}))"
                                 f"*C{node_n}))", fmt=F_E,
                         note="continuation of an infinitely long fin: −λ dT/dx = λ m θ")
        t_r = tinf
    w.headers(FV_COLUMNS)
    assert w.row == node0, (w.row, node0)
    t_sur = st["temp_surroundings"]
    for i in range(n):
        rr = w.row
        first, last = i == 0, i == n - 1
        w.put(1, i + 1)
        xc = f"({i}+0.5)*{dx}"
        w.put(2, formula=f"=({r['r1']}+{xc})*1000" if annular else f"={xc}*1000", fmt="0.000")
        area, perim = _fv_geometry(fin, r, xc)
        w.put(3, formula=f"={area}", fmt=F_E)
        w.put(4, formula=f"={perim}", fmt=F_G)
        if not last:
            w.put(5, formula=f"=1/({dx}/(2*{k}*C{rr})+{dx}/(2*{k}*C{rr + 1}))", fmt=F_E)
        w.put(6, 0.0 if first else None, formula=None if first else f"=E{rr - 1}",
              role="engine" if first else "formula", fmt=F_E)
        w.put(7, 0.0 if last else None, formula=None if last else f"=E{rr}",
              role="engine" if last else "formula", fmt=F_E)
        if nonlinear:
            w.put(10, float(sol.a_centre[i]), role="engine", fmt=F_E)
            w.put(11, float(sol.b[i]), role="engine", fmt=F_E)
        else:
            w.put(8, formula=f"=-{h}*D{rr}*{dx}", fmt=F_E)
            w.put(9, formula=f"={h}*D{rr}*{dx}*{tinf}", fmt=F_E)
            w.put(10, formula=f"=F{rr}+G{rr}-H{rr}" + (f"+{g0}" if first else "")
                  + (f"+{gl}" if last else ""), fmt=F_E)
            w.put(11, formula=f"=I{rr}" + (f"+{g0}*{r['tb']}" if first else "")
                  + (f"+{gl}*{t_r}" if last else ""), fmt=F_E)
        if first:
            w.put(12, formula=f"=G{rr}/J{rr}", fmt=F_G)
            w.put(13, formula=f"=K{rr}/J{rr}", fmt=F_T)
        else:
            den = f"(J{rr}-F{rr}*L{rr - 1})"
            w.put(12, formula=f"=G{rr}/{den}", fmt=F_G)
            w.put(13, formula=f"=(K{rr}+F{rr}*M{rr - 1})/{den}", fmt=F_T)
        w.put(14, formula=f"=M{rr}" if last else f"=L{rr}*N{rr + 1}+M{rr}", fmt=F_T)
        for col, arr in zip((15, 16, 17, 18, 19), (sol.a_west, sol.a_east, sol.a_centre, sol.b,
                                                   sol.temperature), strict=True):
            w.put(col, float(arr[i]), role="engine", fmt=F_T if col == 19 else F_E)
        pairs = (("F", "O"), ("G", "P")) if nonlinear else (("F", "O"), ("G", "P"), ("J", "Q"),
                                                            ("K", "R"))
        conds = ",".join(f"ABS({a}{rr}-{e}{rr})<={w.tol}*MAX(1,ABS({e}{rr}))" for a, e in pairs)
        w.checks += 1
        w.put(20, formula=f'=IF(AND({conds}),"OK","MISMATCH: a coefficient differs")',
              role="check")
        w.check(21, f"N{rr}", f"S{rr}")
        w.put(22, formula="=" + _loss(fin, r, entry, f"N{rr}", f"D{rr}*{dx}", sig, t_sur),
              fmt=F_E)
        w.row += 1
    w.row += 1
    q_fv = w.value_row("heat rate at the base q = G_0 (T_b − T_1) [W]",
                formula=f"={g0}*({r['tb']}-N{node0})", engine=fv.heat_rate)
    w.value_row("loss from the fin's side Σ loss [W]", formula=f"=SUM(V{node0}:V{node_n})",
                engine=fv.heat_loss_surface, note="non-linear laws at the final temperatures"
                if nonlinear else "Σ h P dx (T_i − T_inf)")
    if not nonlinear or tip == "adiabatic":
        face = (f"=N{node_n}" if tip == "adiabatic" else
                f"=N{node_n}-{gl}*(N{node_n}-{t_r})*{half}")
        w.value_row("tip face temperature [degC]", formula=face, engine=fv.tip_temperature, fmt=F_T)
    else:
        w.stated("tip face temperature [degC] (engine)", fv.tip_temperature, F_T)
    w.stated("heat leaving through the tip face [W] (engine)", fv.heat_loss_tip, F_G)
    w.value_row("relative difference to the closed form (q_FV − q_f)/q_f [-]",
                formula=f"=({q_fv}-{r['q']})/{r['q']}", fmt=F_E,
                note="the closed form uses the constant h" if nonlinear else
                "second-order in dx (see the mesh estimate)")
    est = fv.mesh_estimate
    rows = [("energy-balance residual, relative [-]", fv.energy_residual, F_E,
             "conservation and solver rounding; the closed form above checks the coefficients")]
    rows += [(f"heat rate on {m} cells [W]", val, F_G, "") for m, val in
             zip(est.meshes, est.values, strict=True)]
    if not est.exact:
        rows += [("observed order of convergence [-]", est.order, F_G, est.basis),
                 ("extrapolated heat rate [W]", est.extrapolated, F_G, "")]
    rows += [("mesh error bound of the heat rate [W]", est.error_estimate, F_E,
              est.basis if est.exact else "1.25 × the Richardson error, observed order"),
             ("fin efficiency by finite volumes [-]", fv.efficiency, F_G, ""),
             ("fin effectiveness by finite volumes [-]", fv.effectiveness, F_G, "")]
    for label, val, fmt, note in rows:
        w.stated(label, val if math.isfinite(val) else "none", fmt, note=note)
    for text in fv.warnings:
        put_warning(w, f"Warning (finite volumes): {text}")
    return node0, node_n


def _fv_geometry(fin, r, xc: str) -> tuple[str, str]:
    if isinstance(fin, AnnularFin):
        rad = f"({r['r1']}+{xc})"
        return f"2*PI()*{rad}*{r['t']}", f"4*PI()*{rad}"
    if fin.profile == "rectangular":
        return r["Ac"], r["P"]
    pw = 1 if fin.profile == "triangular" else 2
    base = r["t"] if fin.shape == "plate" else r["D"]
    s = f"MAX(0,1-{xc}/{r['L']})"
    y = f"({base}/2*{s}^{pw})"
    dy = f"({base}/2*{pw}/{r['L']}*{s}^{pw - 1})"
    if fin.shape == "plate":
        return f"{r['w']}*2*{y}", f"2*{r['w']}*SQRT(1+{dy}^2)"
    return f"PI()*{y}^2", f"2*PI()*{y}*SQRT(1+{dy}^2)"


def _loss(fin, r, entry, temp: str, p_dx: str, sig, t_sur) -> str:
    theta = f"({temp}-{r['tinf']})"
    law = entry.fv.h_law
    conv = (f"{law.h_coefficient!r}*ABS({theta})^{law.h_exponent!r}*{theta}" if law is not None
            else f"{r['h']}*{theta}")
    if entry.fv.emissivity > 0.0:
        tk = f"({temp}+{zero_Celsius!r})"
        conv += (f"+{entry.fv.emissivity!r}*{sig}*({tk}^4-({float(t_sur)!r}+{zero_Celsius!r})"
                 "^4)")
    return f"{p_dx}*({conv})"


# --------------------------------------------------------------------------- overview
def _overview(sheet, entries, refs) -> dict:
    b = sheet.block("overview")
    b.put("A1", "Fins and finned surfaces", style="hl title")
    sheet.merges.append("A1:O1")
    b.put("A2", _cautions.CAUTIONS["hot_surfaces"], style="hl warning")
    sheet.merges.append("A2:O2")
    sheet.row_heights[2] = 30.0
    b.put("A3", "Values are live references to the fin sheets; the methods are listed on the "
                "cover and on each fin sheet.", role="note")
    heads = ["No.", "Fin", "Sheet", "q_f one fin [W]", "η_f [-]", "ε_f [-]", "R_t,f [K/W]",
             "T tip [degC]", "q_t array [W]", "η_o [-]", "R_t,o [K/W]", "Check cells",
             "Checks OK", "State", "Warnings (engine)"]
    for j, head in enumerate(heads, 1):
        b.put(f"{col_letter(j)}5", head, role="header")
    sheet.row_heights[5] = 30.0
    first = 6
    for i, (entry, ref) in enumerate(zip(entries, refs, strict=True)):
        row = first + i
        b.put(f"A{row}", i + 1)
        b.put(f"B{row}", entry.name, style="hl text")
        b.put(f"C{row}", ref.sheet, style="hl text")
        for col, target, fmt in (("D", ref.heat_rate, F_T), ("E", ref.efficiency, F_T),
                                 ("F", ref.effectiveness, "0.00"), ("G", ref.fin_resistance, F_T),
                                 ("H", ref.tip_temperature, "0.00"),
                                 ("I", ref.array.get("heat_rate"), "0.00"),
                                 ("J", ref.array.get("overall_efficiency"), F_T),
                                 ("K", ref.array.get("fin_resistance"), F_T)):
            if target:
                b.put(f"{col}{row}", formula=f"={target}", number_format=fmt)
        b.put(f"L{row}", ref.check_count, role="engine", number_format="0")
        b.put(f"M{row}", formula=f"={ref.checks_ok}", number_format="0")
        b.put(f"N{row}", formula=f'=IF(M{row}=L{row},"ALL CHECKS OK","NOT ALL OK")',
              style="hl check")
        warns = list(entry.evaluate().warnings)
        arr = entry.evaluate_array()
        if arr is not None:
            warns += [t for t in arr.warnings if t not in warns]
        b.put(f"O{row}", "; ".join(warns) or "none", style="hl text wrap")
    last = first + max(len(refs), 1) - 1
    t = last + 2
    b.put(f"B{t}", "Check cells on the fin sheets")
    count = b.put(f"L{t}", formula=f"=SUM(L{first}:L{last})", number_format="0").ref
    ok = b.put(f"M{t}", formula=f"=SUM(M{first}:M{last})", number_format="0").ref
    return {"count": sheet_ref(sheet.name, count), "ok": sheet_ref(sheet.name, ok)}


def add_sheets(plan: WorkbookPlan, project, audit) -> None:
    """Add the fins' sheets to the audit (hook of :mod:`heatledger.families`).

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook plan to extend. [-]
    project : heatledger.project.Project
        A parsed project with fins. [-]
    audit : heatledger.sheet.audit.AuditContext
        Shared state of the audit; gains the fins' check counts. [-]
    """
    audit.counts.append(add_fin_sheets(plan, project, tolerance=audit.tolerance,
                                       project_name=audit.title))
    audit.check_lists.append("Fins")


def topics(project) -> tuple:
    """Methods and cautions the cover lists when the project has fins.

    Parameters
    ----------
    project : heatledger.project.Project
        A parsed project. [-]

    Returns
    -------
    tuple
        ``(methods, cautions)``. [-]
    """
    del project
    from .. import cautions

    return FIN_METHODS, cautions.caution_lines("hot_surfaces")
