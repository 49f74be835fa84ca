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

from dataclasses import dataclass, field
from types import SimpleNamespace

from .. import cautions as _cautions
from ..fins.annular import AnnularFin
from .blocks_construction import (
    DEFAULT_CHECK_TOLERANCE,
    add_calculation_sheet,
    put_check_counters,
    put_overview_state,
    put_overview_totals,
    put_sheet_state,
    put_warning,
)
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
from .fins_fv_sheet import (  # noqa: F401
    FV_COLUMNS,
    _fv,
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


@dataclass
class FinRefs:
    """Where a fin sheet keeps its key results (absolute references).

    Attributes
    ----------
    sheet, name : str
    heat_rate, efficiency, effectiveness, fin_resistance, temp_tip : str
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
    temp_tip: str
    checks_ok: str
    check_count: int
    array: dict = field(default_factory=dict)
    extras: dict = field(default_factory=dict)


def add_fin_sheets(plan: WorkbookPlan, project, summary_cells: dict | None = None, *,
                   tolerance: float = DEFAULT_CHECK_TOLERANCE, project_name: str = "",
                   answers: list | None = None) -> dict:
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
    answers : list, optional
        Gains ``(fin name, FinRefs)`` for the cover. [-]

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
        if answers is not None:
            answers.append((entry.name, refs[-1]))
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
    st = SimpleNamespace(
        plan=plan, sheet_name=sheet_name, entry=entry, tolerance=tolerance,
        project_name=project_name)
    _fin_setup(st)
    return _fin_inputs(st)


def _fin_setup(st) -> None:
    """The inputs and first rows of this part of the sheet."""
    entry = st.entry
    plan = st.plan
    project_name = st.project_name
    sheet_name = st.sheet_name
    tolerance = st.tolerance
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
    put_check_counters(w, 6)
    if entry.notes:
        w.row = 9
        w.put(2, "Notes")
        w.put(3, entry.notes, style="hl text")
    w.row = HEADER_ROWS
    st.fin = fin
    st.r = r
    st.res = res
    st.sheet = sheet
    st.w = w


def _fin_inputs(st) -> object:
    """The inputs of the fin and the sections that follow them."""
    entry = st.entry
    fin = st.fin
    r = st.r
    res = st.res
    sheet = st.sheet
    sheet_name = st.sheet_name
    w = st.w
    # ---- inputs --------------------------------------------------------------------------
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
    ok = put_sheet_state(w, HEADER_ROWS + 1, "V")
    s = sheet_name
    return FinRefs(sheet=s, name=entry.name, heat_rate=sheet_ref(s, r["q"]),
                   efficiency=sheet_ref(s, r["eta"]), effectiveness=sheet_ref(s, r["eps"]),
                   fin_resistance=sheet_ref(s, r["R"]), temp_tip=sheet_ref(s, r["tip"]),
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
                                 ("H", ref.temp_tip, "0.00"),
                                 ("I", ref.array.get("heat_rate"), "0.00"),
                                 ("J", ref.array.get("overall_efficiency"), F_T),
                                 ("K", ref.array.get("fin_resistance"), F_T)):
            if target:
                b.put(f"{col}{row}", formula=f"={target}", number_format=fmt)
        put_overview_state(b, row, ref.check_count, ref.checks_ok, "LMN")
        warns = list(entry.evaluate().warnings)
        arr = entry.evaluate_array()
        if arr is not None:
            warns += [t for t in arr.warnings if t not in warns]
        b.put(f"O{row}", "; ".join(warns) or "none", style="hl text wrap")
    return put_overview_totals(sheet, b, first, len(refs), "Check cells on the fin sheets", "LM")


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
    from .audit import Answer

    found: list = []
    audit.counts.append(add_fin_sheets(plan, project, tolerance=audit.tolerance,
                                       project_name=audit.title, answers=found))
    for name, ref in found:
        audit.answers.append(Answer(f"Fin {name}", "heat rate of one fin [W]",
                                    f"={ref.heat_rate}", "0.000"))
        if ref.array:
            audit.answers.append(Answer(f"Fin {name}", "heat rate of the array [W]",
                                        f"={ref.array['heat_rate']}", "0.00"))
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
