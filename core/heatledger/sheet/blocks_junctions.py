"""Audit sheets of the thermal-bridge family: an overview ``Junctions`` and one sheet per
junction with its geometry, surfaces, solver, results and the picture of its temperature
field.

The 2-D field is beyond live formulas; the sheet checks what a formula can: each region's
area, each surface's length, the energy balance over all surfaces, the thermal coupling
coefficient from the inside heat flows, psi from L_2D and the flanking U l, and f_Rsi from
the lowest inside surface temperature.

Sources: [source: iso10211-method, 10.2, 10.3 and 11]; [source: iso10211-validation,
Annex A].
"""

from __future__ import annotations

from types import SimpleNamespace

from .. import cautions as _cautions
from ..bridges2d.junctions import RESISTANCE_INSIDE_FRSI
from ..bridges2d.picture import temperature_picture
from .audit import Answer
from .blocks_construction import (
    add_calculation_sheet,
    put_check_counters,
    put_overview_state,
    put_overview_totals,
    put_sheet_state,
)
from .plan import Picture, PrintSetup, WorkbookPlan, col_letter, safe_sheet_name, sheet_ref
from .rows import CheckRows, RowLayout

__all__ = ["add_sheets", "topics", "add_junction_sheet", "JUNCTION_METHODS"]

#: Methods stated on the cover when the project has junctions.
JUNCTION_METHODS = (
    "2-D thermal bridges: heatledger's cell-centred finite volumes on a rectilinear grid "
    "through every region edge, harmonic-mean face conductances, sparse direct solve "
    "(SuperLU) with one refinement step; L_2D, psi = L_2D - sum U_j l_j and f_Rsi with "
    "R_si = 0.25 m2 K/W (EN ISO 10211:2017, clauses 10 and 11)",
    "The solver is validated as EN ISO 10211 Annex A asks: it reproduces test reference "
    "cases 1 (analytical) and 2 within 0.1 K and 0.1 W/m (tests/bridges2d/"
    "test_iso10211_annex_a.py)",
    "Flanking elements extend at least max(1 m, 3 thicknesses) beyond the junction "
    "(EN ISO 10211, 5.2); layers as bands of their EN ISO 6946 equivalent conductivity",
)
F = "0.0000"
#: Notes wrap in the wide last column, so a long note does not widen the printed page.
JUNCTION_ROWS = RowLayout(label=2, value=3, engine=4, check=5, note=14, default_format=F,
                          note_style="hl note wrap")
HEADER_ROWS = 9


def add_junction_sheet(plan: WorkbookPlan, sheet_name: str, entry, *, tolerance: float,
                       project_name: str = "") -> dict:
    """Add the sheet of one junction.

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook plan to extend. [-]
    sheet_name : str
        Name of the new sheet. [-]
    entry : heatledger.bridges2d.project_io.JunctionEntry
        The junction. [-]
    tolerance : float
        Relative tolerance of the check cells. [-]
    project_name : str
        Project name for the page header. [-]

    Returns
    -------
    dict
        Cells of psi, L_2D, f_Rsi, the checks that say OK, and the check count.
    """
    st = _setup(plan, sheet_name, entry, tolerance, project_name)
    _regions(st)
    _surfaces(st)
    _solver(st)
    _results(st)
    _picture(st)
    w = st.w
    ok = put_sheet_state(w, HEADER_ROWS, "N")
    s = sheet_name
    return {"psi": sheet_ref(s, st.psi), "l2d": sheet_ref(s, st.l2d),
            "f_rsi": sheet_ref(s, st.f_rsi), "ok": sheet_ref(s, ok), "count": w.checks}


def _setup(plan, sheet_name, entry, tolerance, project_name):
    widths = [6, 40, 14, 14, 14, 14, 14, 14, 14, 14, 14, 14, 14, 60]
    sheet = add_calculation_sheet(plan, sheet_name, widths, f"{project_name} | {entry.name}")
    w = CheckRows(sheet, "$C$8", JUNCTION_ROWS)
    j = entry.junction
    w.put(1, f"{entry.name}: linear thermal transmittance and surface temperature "
             "(EN ISO 10211)", style="hl title")
    sheet.merges.append("A1:N1")
    w.row = 2
    w.put(1, f"{j.kind}: {j.description}. Coordinates in mm; heat flows per metre of "
             "junction, positive into the body.", role="note")
    w.row = 3
    w.put(1, _cautions.CAUTIONS["condensation"], style="hl warning")
    sheet.merges.append("A3:N3")
    w.row = 4
    w.put(2, "Inside temperature θ_i [degC]")
    t_in = w.put(3, _side_temperature(j, j.inside), role="input", fmt="0.0")
    w.row = 5
    w.put(2, "Outside temperature θ_e [degC]")
    t_out = w.put(3, _side_temperature(j, j.outside), role="input", fmt="0.0")
    w.row = 8
    w.put(2, "Check tolerance, relative [-]")
    w.put(3, float(tolerance), role="input", fmt="0.0E+00")
    put_check_counters(w, 8)
    if entry.notes:
        w.put(2, f"Notes: {entry.notes}", role="note", row=7)
    w.row = HEADER_ROWS
    return SimpleNamespace(w=w, sheet=sheet, sheet_name=sheet_name, entry=entry,
                           res=entry.result, t_in=t_in, t_out=t_out)


def _side_temperature(junction, names) -> float:
    return float(next(s.temperature for s in junction.surfaces if s.name in names))


def _regions(st) -> None:
    w, j = st.w, st.entry.junction
    w.start("regions", "Geometry: regions of material (later rows overlay earlier ones)")
    w.headers(["No.", "Region", "x0 [mm]", "y0 [mm]", "x1 [mm]", "y1 [mm]", "λ [W/(m K)]",
               "Area [m2]", "Engine area", "Check"])
    for i, r in enumerate(j.regions, 1):
        w.put(1, i)
        w.put(2, r.name, style="hl text")
        for k, v in enumerate((r.x0, r.y0, r.x1, r.y1)):
            w.put(3 + k, v * 1000.0, role="input", fmt="0.0")
        w.put(7, float(r.conductivity), role="input", fmt="0.0000")
        area = w.put(8, formula=f"=(E{w.row}-C{w.row})*(F{w.row}-D{w.row})/1E6", fmt="0.000000")
        w.check(10, area, w.put(9, (r.x1 - r.x0) * (r.y1 - r.y0), role="engine",
                                fmt="0.000000"))
        w.row += 1


def _surfaces(st) -> None:
    w, j, res = st.w, st.entry.junction, st.res
    w.start("surfaces", "Surfaces (the rest of the outline is adiabatic: cut or symmetry)")
    w.headers(["No.", "Surface", "Side", "x0 [mm]", "y0 [mm]", "x1 [mm]", "y1 [mm]",
               "Length [m]", "θ ambient [degC]", "R_s heat flow [m2 K/W]",
               "R_s surface temp. [m2 K/W]", "Heat flow [W/m] (engine)",
               "Heat flow, temp. solve [W/m]"])
    st.flow_rows, st.inside_rows = {}, []
    for i, s in enumerate(j.surfaces, 1):
        side = "inside" if s.name in j.inside else "outside" if s.name in j.outside else "other"
        w.put(1, i)
        w.put(2, s.name, style="hl text")
        w.put(3, side, style="hl text")
        for k, v in enumerate((s.x0, s.y0, s.x1, s.y1)):
            w.put(4 + k, v * 1000.0, role="input", fmt="0.0")
        w.put(8, formula=f"=SQRT((F{w.row}-D{w.row})^2+(G{w.row}-E{w.row})^2)/1000",
              fmt="0.000")
        w.put(9, float(s.temperature), role="input", fmt="0.0")
        w.put(10, float(s.resistance), role="input", fmt="0.00")
        w.put(11, RESISTANCE_INSIDE_FRSI if side == "inside" else float(s.resistance),
              role="input", fmt="0.00")
        w.put(12, res.flow_solve.heat_flows[s.name], role="engine", fmt="0.00000")
        w.put(13, res.temperature_solve.heat_flows[s.name], role="engine", fmt="0.00000")
        st.flow_rows[s.name] = w.row
        if side == "inside":
            st.inside_rows.append(w.row)
        w.row += 1
    st.surface_rows = (min(st.flow_rows.values()), max(st.flow_rows.values()))


def _solver(st) -> None:
    w, res = st.w, st.res
    flow = res.flow_solve
    w.start("solver", "Solver and grid")
    w.stated("largest cell edge asked [mm]", st.entry.max_cell * 1000.0, "0.00")
    w.stated("cells with material (unknowns)", float(flow.cells), "#,##0")
    nx, ny = flow.settings["grid"]
    w.stated("grid columns x rows", f"{nx} x {ny}")
    w.stated("method", flow.settings["method"])
    w.stated("solver", f"{flow.solver}; {flow.settings['steps']} refinement step(s)")
    a, b = st.surface_rows
    w.value_row("energy balance: sum of all surface heat flows [W/m]",
                formula=f"=SUM(L{a}:L{b})", engine=flow.energy_balance, fmt="0.0E+00",
                note="zero when the solve conserves energy (rounding only)")
    w.value_row("energy balance of the surface-temperature solve [W/m]",
                formula=f"=SUM(M{a}:M{b})", engine=res.temperature_solve.energy_balance,
                fmt="0.0E+00")
    est = flow.mesh_estimate
    w.stated("mesh estimate of the inside heat flow [W/m]", est.error_estimate, "0.0E+00",
             note=f"{est.basis}; meshes {', '.join(f'{c:,}' for c in est.meshes)} cells")


def _results(st) -> None:
    w, res, j = st.w, st.res, st.entry.junction
    w.start("results", "Results: L_2D, psi and the temperature factor")
    inside = "+".join(f"L{r}" for r in st.inside_rows)
    st.l2d = w.value_row("L_2D = Φ_inside / (θ_i − θ_e) [W/(m K)]",
                         formula=f"=({inside})/({st.t_in}-{st.t_out})",
                         engine=res.psi_result.coupling_coefficient, fmt="0.00000")
    w.headers(["", "Flanking element", "U [W/(m2 K)]", "l [m]", "U l [W/(m K)]"])
    first = w.row
    for name, u, length in j.flanking:
        w.put(2, name, style="hl text")
        w.put(3, float(u), role="input", fmt="0.00000")
        w.put(4, float(length), role="input", fmt="0.000")
        w.put(5, formula=f"=C{w.row}*D{w.row}", fmt="0.00000")
        w.row += 1
    last = w.row - 1
    total = w.value_row("Σ U_j l_j [W/(m K)]", formula=f"=SUM(E{first}:E{last})",
                        engine=res.psi_result.flanking_total, fmt="0.00000")
    st.psi = w.value_row(f"ψ = L_2D − Σ U_j l_j [W/(m K)], {res.psi_result.dimensions} dimensions",
                         formula=f"={st.l2d}-{total}", engine=res.psi_result.psi, fmt="0.00000",
                         note="lengths in the dimension system stated; psi depends on it")
    low = res.lowest
    t = w.value_row(f"lowest inside surface temperature at R_si {RESISTANCE_INSIDE_FRSI:g} "
                    "[degC] (engine)", value=low.temperature, fmt="0.000", role="engine",
                    note=f"on {low.surface} at x = {low.x * 1000:.1f} mm, y = "
                         f"{low.y * 1000:.1f} mm")
    st.f_rsi = w.value_row("f_Rsi = (θ_si,min − θ_e)/(θ_i − θ_e) [-]",
                           formula=f"=({t}-{st.t_out})/({st.t_in}-{st.t_out})",
                           engine=res.surface_factor, fmt="0.0000",
                           note="compare with f_Rsi,min of the moisture check (EN ISO 13788)")
    st.picture_row = first


def _picture(st) -> None:
    res, j = st.res, st.entry.junction
    png = temperature_picture(res.temperature_solve, title=f"{st.entry.name}: temperature at "
                              f"R_si {RESISTANCE_INSIDE_FRSI:g}", inside=j.inside,
                              lowest=res.lowest)
    st.w.row += 1
    st.sheet.pictures.append(Picture(png, f"B{st.w.row}", 17.0, 11.7,
                                     f"temperature field of {st.entry.name}"))
    st.w.row += 30  # the picture's height in rows, so the print area covers it


def add_sheets(plan: WorkbookPlan, project, audit) -> None:
    """Add the junctions' overview and one sheet per junction (hook of
    :mod:`heatledger.families`); the psi cells are indexed for the heat-loss sheets.

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook plan to extend. [-]
    project : heatledger.project.Project
        A parsed project with junctions. [-]
    audit : heatledger.sheet.audit.AuditContext
        Shared state of the audit; gains the checks' counts. [-]
    """
    overview = plan.add_sheet(
        "Junctions", column_widths={col_letter(i + 1): w for i, w in enumerate(
            [5, 34, 26, 12, 12, 12, 12, 12, 12, 16, 50])},
        freeze="A6", print_setup=PrintSetup(orientation="landscape",
                                            header=f"{audit.title} | {{sheet}}",
                                            footer_left="heatledger audit {sheet}",
                                            title_rows="1:5"))
    refs, used = [], set()
    for i, entry in enumerate(project.junctions, 1):
        name = safe_sheet_name(f"Junc {i} {entry.name}", used,
                               reserved=[s.name for s in plan.sheets])
        cells = add_junction_sheet(plan, name, entry, tolerance=audit.tolerance,
                                   project_name=audit.title)
        plan.index[("junction", entry.name)] = cells
        refs.append((entry, name, cells))
        audit.answers += [
            Answer(f"Junction {entry.name}", f"psi [W/(m K)] (EN ISO 10211, "
                   f"{entry.junction.dimensions} dimensions)", f"={cells['psi']}", "0.000"),
            Answer(f"Junction {entry.name}", "f_Rsi [-] (R_si 0.25)", f"={cells['f_rsi']}",
                   "0.000")]
    audit.counts.append(_overview(overview, refs))
    audit.check_lists.append("Junctions")


def _overview(sheet, refs) -> dict:
    b = sheet.block("overview")
    b.put("A1", "Thermal bridges (2-D, EN ISO 10211)", style="hl title")
    sheet.merges.append("A1:K1")
    b.put("A2", _cautions.CAUTIONS["condensation"], style="hl warning")
    sheet.merges.append("A2:K2")
    b.put("A3", "Values are live references to the junction sheets.", role="note")
    heads = ["No.", "Junction", "Sheet", "ψ [W/(m K)]", "L_2D [W/(m K)]", "f_Rsi [-]",
             "Check cells", "Checks OK", "State", "Dimensions", "What was built"]
    for j, head in enumerate(heads, 1):
        b.put(f"{col_letter(j)}5", head, role="header")
    first = 6
    for i, (entry, name, cells) in enumerate(refs):
        row = first + i
        b.put(f"A{row}", i + 1)
        b.put(f"B{row}", entry.name, style="hl text")
        b.put(f"C{row}", name, style="hl text")
        for col, key in (("D", "psi"), ("E", "l2d"), ("F", "f_rsi")):
            b.put(f"{col}{row}", formula=f"={cells[key]}", number_format="0.0000")
        put_overview_state(b, row, cells["count"], cells["ok"], "GHI")
        b.put(f"J{row}", entry.junction.dimensions, style="hl text")
        b.put(f"K{row}", entry.junction.description, style="hl text wrap")
    return put_overview_totals(sheet, b, first, len(refs), "Check cells on the junction sheets",
                               "GH")


def topics(project) -> tuple:
    """Methods and cautions the cover lists when the project has junctions.

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
    return JUNCTION_METHODS, _cautions.caution_lines("condensation")
