"""Calculation-sheet blocks of one construction, built from the engine's results.

Every step a reviewer follows is a live formula: ``R = d/lambda``, the lower-limit
conductivity of a bridged layer, the upper/lower limits and their error, the corrections,
``R_T``, ``U = 1/R_T`` and U to two significant figures, the interface temperatures from the
design temperatures, and the finite-volume nodal table with the coefficients ``a_W``,
``a_E``, ``a_P``, ``b`` and the tridiagonal forward sweep and back substitution (Thomas
algorithm), so the nodal temperatures recompute in any spreadsheet program. Beside each
formula result stands the engine's value as a constant and a check cell that says ``OK``
when both agree within the tolerance stated in the sheet header, and a text beginning with
``MISMATCH`` otherwise.

References
----------
EN ISO 6946:2017, 6.7 (total resistance, 6.7.2 upper and lower limits), 6.8 / Table 7
(surface resistances), 6.9 (air layers), Annex F (corrections), clause 8 (two significant
figures). S. V. Patankar, *Numerical Heat Transfer and Fluid Flow*, 1980, ch. 4 (discretisation
equations and the tridiagonal-matrix algorithm).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from types import SimpleNamespace

from ..constructions import (
    CORRECTION_THRESHOLD,
    SLIGHTLY_VENTILATED_OUTER_CAP,
    AirGapCorrection,
    Construction,
    ConstructionTemperatures,
    FastenerCorrection,
    InvertedRoofCorrection,
)
from ..surfaces import surface_resistance
from .plan import Chart, ChartSeries, PrintSetup, Sheet, WorkbookPlan, col_letter, sheet_ref
from .rows import CheckRows, RowLayout

__all__ = ["ConstructionRefs", "add_construction_sheet", "add_calculation_sheet",
           "put_warning", "DEFAULT_CHECK_TOLERANCE"]

#: Relative tolerance of the check cells: spreadsheet and engine both compute in IEEE
#: doubles, so they agree to ~1e-13; 1e-9 leaves room for a different summation order.
DEFAULT_CHECK_TOLERANCE = 1e-9

FMT_MM = "0.0"
FMT_LAMBDA = "0.0000"
FMT_R = "0.0000"
FMT_U = "0.0000"
FMT_T = "0.000"
FMT_COEF = "0.0000"
FMT_SMALL = "0.000E+00"
#: U to two significant figures shown with exactly two (0.20, 0.085, 1.4), not 0.200.
FMT_U_2SF = "[<0.1]0.000;[<1]0.00;0.0"

LAYER_COLUMNS = [
    ("No.", 5), ("Layer", 30), ("Kind", 11), ("Material", 24), ("d [mm]", 10),
    ("λ [W/(m K)]", 11), ("R own [m2 K/W]", 11), ("Counted [1/0]", 10), ("Factor [-]", 10),
    ("R used [m2 K/W]", 11), ("Engine R used [m2 K/W]", 12), ("Check", 10),
    ("FV cells [-]", 9), ("Rule / note", 10),
]
FV_COLUMNS = [
    "Node", "Layer", "w [m]", "k [W/(m K)]", "x [mm]", "G east [W/(m2 K)]", "a_W [W/(m2 K)]",
    "a_E [W/(m2 K)]", "a_P [W/(m2 K)]", "b [W/m2]", "P [-]", "Q [degC]", "T [degC]",
    "Engine a_W [W/(m2 K)]", "Engine a_E [W/(m2 K)]", "Engine a_P [W/(m2 K)]",
    "Engine b [W/m2]", "Engine T [degC]",
    "Engine x [mm]", "Check x and coefficients", "Check T",
]
#: Rows 1 to HEADER_ROWS hold the title, the design data and the sheet's check count.
HEADER_ROWS = 10
#: Width of every column of a construction sheet (A, B, ...), in characters.
COLUMN_WIDTHS = [5, 30, 11, 22, 10, 11, 11, 11, 11, 11, 12, 11, 11, 11, 11, 11, 11, 12, 11,
                 13, 10]


@dataclass
class ConstructionRefs:
    """Where a construction sheet keeps its key results (for the summary and cover).

    Attributes
    ----------
    sheet : str
        Sheet name.
    name : str
        Construction name.
    r_total, u_value, u_reported : str
        Absolute references (``'Sheet'!$G$30``) of R_T, U and U to two significant figures.
    checks_ok : str
        Reference of the cell counting the sheet's check cells that say OK.
    check_count : int
        Number of check cells on the sheet.
    heat_flux : str
        Reference of the heat flux cell. [-]
    extras : dict
        Further cell references by name. [-]
    """

    sheet: str
    name: str
    r_total: str
    u_value: str
    u_reported: str
    checks_ok: str
    check_count: int
    heat_flux: str = ""
    extras: dict = field(default_factory=dict)

#: Columns of a construction sheet's rows: label B, value G, engine K, check L, note N.
CONSTRUCTION_ROWS = RowLayout(default_format=FMT_R)


def _solution_record(w, temps) -> None:
    """The engine's energy balance and mesh estimate, stated with what each shows."""
    est = temps.mesh_estimate
    w.put(2, "Engine solution record (stated values)", style="hl label")
    w.row += 1
    rows = [("energy-balance residual, relative [-]", temps.energy_residual, FMT_SMALL,
             "shows conservation and solver rounding; it cannot reveal a wrong coefficient "
             "(the ladder check above can)")]
    if est.exact and not est.meshes:
        w.put(2, f"mesh: {est.basis}", role="note")
        w.row += 1
    else:
        rows += [(f"heat flux on {m} cells [W/m2]", v, "0.000000", "")
                 for m, v in zip(est.meshes, est.values, strict=True)]
        rows += [("observed order of convergence [-]", est.order, "0.00", est.basis),
                 ("extrapolated heat flux [W/m2]", est.extrapolated, "0.000000", ""),
                 ("mesh error bound of the heat flux [W/m2]", est.error_estimate, FMT_SMALL,
                  "1.25 × the Richardson error with the observed order"),
                 ("largest interface-temperature change to the next mesh [K]",
                  temps.mesh_temperature_change, FMT_SMALL, "")]
    for label, val, fmt, note in rows:
        w.put(2, label)
        if math.isfinite(val):
            w.put(7, float(val), role="engine", fmt=fmt)
        else:
            w.put(7, "none", role="engine")
        if note:
            w.put(14, note, role="note")
        w.row += 1


def add_calculation_sheet(plan: WorkbookPlan, sheet_name: str, widths, header: str) -> Sheet:
    """Add a calculation sheet as every family lays it out: landscape A4 across one page
    width, rows 1 to 3 (title, note, caution) frozen and repeated on every printed page.

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook plan to extend. [-]
    sheet_name : str
        Name of the new sheet. [-]
    widths : sequence of float
        Column widths from column A on. [characters]
    header : str
        Page header (project and item). [-]

    Returns
    -------
    Sheet
    """
    return plan.add_sheet(
        sheet_name, column_widths={col_letter(i + 1): w for i, w in enumerate(widths)},
        freeze="A4",
        print_setup=PrintSetup(orientation="landscape", header=header,
                               footer_left="heatledger calculation sheet {sheet}",
                               footer_right="page {page} of {pages}", title_rows="1:3"))


def put_warning(w, text: str | None = None, *, formula: str | None = None,
                last_col: str = "N") -> str:
    """Write a warning on its own row from column B, merged to ``last_col`` so that it reads
    on one or two lines instead of wrapping in the narrow label column; move to the next row.

    Parameters
    ----------
    w : row writer
        A sheet's row writer (``put(col, ...)``, ``row``, ``sheet``). [-]
    text : str, optional
        The warning. [-]
    formula : str, optional
        A formula giving the warning text instead. [-]
    last_col : str
        Last column of the merged range. [-]

    Returns
    -------
    str
        The reference of the warning cell. [-]
    """
    a1 = w.put(2, text, formula=formula, style="hl warning")
    w.sheet.merges.append(f"B{w.row}:{last_col}{w.row}")
    w.row += 1
    return a1


def add_construction_sheet(plan: WorkbookPlan, sheet_name: str, construction: Construction,
                           *, temp_inside: float, temp_outside: float,
                           nodes_per_layer=None, area: float | None = None,
                           target_u: float | None = None, materials=None,
                           material_refs: dict | None = None,
                           bridging_materials=None,
                           project_name: str = "",
                           tolerance: float = DEFAULT_CHECK_TOLERANCE,
                           temperatures: ConstructionTemperatures | None = None
                           ) -> ConstructionRefs:
    """Add the calculation sheet of one construction to ``plan``.

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook plan to extend. [-]
    sheet_name : str
        Name of the new sheet (at most 31 characters). [-]
    construction : Construction
        The engine's construction, layers inside to outside. [-]
    temp_inside, temp_outside : float
        Design air temperatures inside and outside. [degC]
    nodes_per_layer : int, optional
        Finite-volume cells per counted layer (engine default when None). [-]
    area : float, optional
        Element area, for the summary. [m2]
    target_u : float, optional
        Target U-value. [W/(m2 K)]
    materials : sequence of str, optional
        Material name of each layer, for the table (blank where none). [-]
    material_refs : dict, optional
        Lower-case material name -> (reference of its λ cell on a materials sheet, λ
        [W/(m K)]); a layer whose λ equals it refers to that cell by formula. [-]
    bridging_materials : sequence of str, optional
        Bridging material name of each layer (bridged layers only). [-]
    project_name : str
        Project name for the page header. [-]
    tolerance : float
        Relative tolerance of the check cells, stated in the header. [-]
    temperatures : ConstructionTemperatures, optional
        Engine temperatures already computed with the same settings. [-]

    Returns
    -------
    ConstructionRefs
    """
    st = SimpleNamespace(
        plan=plan, sheet_name=sheet_name, construction=construction, temp_inside=temp_inside,
        temp_outside=temp_outside, nodes_per_layer=nodes_per_layer, area=area, target_u=target_u,
        materials=materials, material_refs=material_refs, bridging_materials=bridging_materials,
        project_name=project_name, tolerance=tolerance, temperatures=temperatures)
    _sheet_setup(st)
    _header(st)
    _layer_table(st)
    _layer_rows(st)
    _ventilation_setup(st)
    _surface_resistances(st)
    _bridging_limits(st)
    _layer_factors_and_total(st)
    _corrections(st)
    _ladder_temperatures(st)
    _chart_space(st)
    _nodal_table(st)
    _temperature_chart(st)
    return _check_count(st)


def _sheet_setup(st) -> None:
    """The sheet, the engine's temperatures and the row writer."""
    construction = st.construction
    nodes_per_layer = st.nodes_per_layer
    plan = st.plan
    project_name = st.project_name
    sheet_name = st.sheet_name
    temp_inside = st.temp_inside
    temp_outside = st.temp_outside
    temperatures = st.temperatures
    con = construction
    temps = temperatures or con.temperatures(temp_inside, temp_outside,
                                             nodes_per_layer=nodes_per_layer)
    name = con.name or sheet_name
    sheet = add_calculation_sheet(plan, sheet_name, COLUMN_WIDTHS, f"{project_name} | {name}")
    w = CheckRows(sheet, "$C$8", CONSTRUCTION_ROWS)
    st.con = con
    st.name = name
    st.sheet = sheet
    st.temps = temps
    st.w = w


def _header(st) -> None:
    """Title, design inputs, tolerance and the places of the check counters."""
    area = st.area
    con = st.con
    name = st.name
    sheet = st.sheet
    target_u = st.target_u
    temp_inside = st.temp_inside
    temp_outside = st.temp_outside
    tolerance = st.tolerance
    w = st.w
    # ---- header --------------------------------------------------------------------------
    w.put(1, f"{name}: thermal resistance, U-value and temperatures", style="hl title")
    sheet.merges.append("A1:N1")
    w.row = 2
    w.put(1, "Layers inside to outside; thickness in mm; EN ISO 6946:2017. Sand cells are "
             "inputs, teal cells are formulas, grey cells are the engine's values, green cells "
             "compare them.", role="note")
    w.row = 4
    w.put(2, "Heat-flow direction")
    w.put(3, con.heat_flow, role="input")
    w.row = 5
    w.put(2, "Inside design air temperature θi [degC]")
    ti = w.put(3, float(temp_inside), role="input", fmt="0.0")
    w.row = 6
    w.put(2, "Outside design air temperature θe [degC]")
    te = w.put(3, float(temp_outside), role="input", fmt="0.0")
    w.row = 7
    w.put(2, "Element area A [m2]")
    area_ref = w.put(3, None if area is None else float(area), role="input", fmt="0.00")
    w.row = 8
    w.put(2, "Check tolerance, relative [-]")
    w.put(3, float(tolerance), role="input", fmt=FMT_SMALL)
    w.put(4, "check: |formula − engine| ≤ tolerance × max(1, |engine|)", role="note")
    w.row = 9
    w.put(2, "Target U [W/(m2 K)]")
    target_ref = w.put(3, None if target_u is None else float(target_u), role="input",
                       fmt="0.000")
    w.row = 4
    w.put(6, "Check cells on this sheet")
    count_cell = w.a1(10)  # filled at the end, once the number is known
    w.row = 5
    w.put(6, "Check cells that say OK")
    ok_ref = w.a1(10)  # filled at the end
    w.row = 6
    w.put(6, "State of this sheet")
    state_cell = w.a1(10)
    w.row = HEADER_ROWS
    st.area_ref = area_ref
    st.count_cell = count_cell
    st.ok_ref = ok_ref
    st.state_cell = state_cell
    st.target_ref = target_ref
    st.te = te
    st.ti = ti


def _layer_table(st) -> None:
    """Rows of the layer table (filled later) and the bridged layers' parts (6.7.2)."""
    bridging_materials = st.bridging_materials
    con = st.con
    material_refs = st.material_refs
    materials = st.materials
    temps = st.temps
    w = st.w
    # ---- layer table ---------------------------------------------------------------------
    w.start("layers", "Layers, inside to outside (EN ISO 6946:2017, 6.7)")
    w.headers([c for c, _ in LAYER_COLUMNS])
    rows = con.layer_table
    counted_rows = [r for r in rows if r.counted]
    layer_row: dict[int, int] = {}
    first_layer_row = w.row
    bridged_idx = [r.index for r in rows if r.kind == "bridged" and r.counted]
    vent = con.ventilation
    slightly = vent is not None and vent.ventilation == "slightly"
    counts = dict(zip([r.index for r in counted_rows], temps.nodes_per_layer, strict=True))
    for r in rows:
        layer_row[r.index] = w.row
        w.row += 1
    last_layer_row = w.row - 1
    # bridging parts, sections and ventilation cells are laid out below and referenced here
    w.row += 1
    parts_at: dict[int, tuple[int, int]] = {}
    bridge = con.bridging
    if bridge is not None:
        w.start("bridged_parts", "Bridged layers: materials and area fractions (6.7.2)")
        w.headers(["", "Bridged layer / part", "", "", "d [mm]", "λ_q [W/(m K)]",
                   "f_q [-]", "λ_q·f_q [W/(m K)]"])
        for idx in bridged_idx:
            lay = con.layers[idx]
            first = w.row
            names = [_pick(materials, idx), _pick(bridging_materials, idx)]
            for k, (lam, frac) in enumerate(lay.parts, 1):
                w.put(1, idx + 1)
                w.put(2, f"{lay.name}: part {k}")
                w.put(5, formula=f"=E{layer_row[idx]}", fmt=FMT_MM)
                link = _material_link(material_refs, names[k - 1] if k <= 2 else "", lam)
                if link:
                    w.put(6, formula=f"={link}", fmt=FMT_LAMBDA)
                    w.put(4, names[k - 1])
                else:
                    w.put(6, float(lam), role="input", fmt=FMT_LAMBDA)
                w.put(7, float(frac), role="input", fmt="0.000")
                w.put(8, formula=f"=F{w.row}*G{w.row}", fmt=FMT_LAMBDA)
                w.row += 1
            parts_at[idx] = (first, w.row - 1)
    st.bridge = bridge
    st.bridged_idx = bridged_idx
    st.counted_rows = counted_rows
    st.counts = counts
    st.first_layer_row = first_layer_row
    st.last_layer_row = last_layer_row
    st.layer_row = layer_row
    st.parts_at = parts_at
    st.r = r
    st.rows = rows
    st.slightly = slightly
    st.vent = vent


def _layer_rows(st) -> None:
    """Fill the layer rows now that the bridged parts' rows are known."""
    con = st.con
    counts = st.counts
    layer_row = st.layer_row
    material_refs = st.material_refs
    materials = st.materials
    parts_at = st.parts_at
    rows = st.rows
    sheet = st.sheet
    w = st.w
    # fill the layer rows now that part ranges are known
    w.block = sheet.block("layers")
    rse_used_ref = "$G$0"  # placeholder, set below
    layer_cells: dict[int, dict[str, str]] = {}
    for r in rows:
        rr = layer_row[r.index]
        lay = con.layers[r.index]
        w.put(1, r.index + 1, row=rr)
        w.put(2, r.name or f"layer {r.index + 1}", role="input", row=rr)
        w.put(3, r.kind, row=rr)
        mat = ""
        if materials is not None and r.index < len(materials):
            mat = materials[r.index] or ""
        w.put(4, mat, row=rr)
        d_ref = w.put(5, r.thickness * 1000.0, role="input", fmt=FMT_MM, row=rr)
        note = ""
        if r.kind == "material":
            link = _material_link(material_refs, mat, r.conductivity)
            if link:
                w.put(6, formula=f"={link}", fmt=FMT_LAMBDA, row=rr)
            else:
                w.put(6, float(r.conductivity), role="input", fmt=FMT_LAMBDA, row=rr)
            own = w.put(7, formula=f"=E{rr}/1000/F{rr}", fmt=FMT_R, row=rr)
            note = "R = d/λ"
        elif r.kind == "declared":
            own = w.put(7, float(lay.declared_resistance), role="input", fmt=FMT_R, row=rr)
            note = "declared thermal resistance (input)"
        elif r.kind == "air":
            own = w.put(7, float(r.resistance_own), role="engine", fmt=FMT_R, row=rr)
            note = (f"{lay.ventilation}: R_g of ISO 6946 Annex D (stated), ε {lay.emissivity_1:g}"
                    f"/{lay.emissivity_2:g}")
        elif r.index not in parts_at:  # bridged but not counted: stated value only
            own = w.put(7, float(r.resistance_own), role="engine", fmt=FMT_R, row=rr)
        else:  # bridged
            p1, p2 = parts_at[r.index]
            w.put(6, formula=f"=SUM(H{p1}:H{p2})", fmt=FMT_LAMBDA, row=rr)
            own = w.put(7, formula=f"=E{rr}/1000/F{rr}", fmt=FMT_R, row=rr)
            note = "λ'' = Σ f_q λ_q; R_j = d/λ'' (lower limit, 6.7.2)"
        w.put(8, 1 if r.counted else 0, role="engine", fmt="0", row=rr)
        if not r.counted:
            note = "not counted: outside a well ventilated air layer (6.9.4)"
        layer_cells[r.index] = {"d": d_ref, "own": own}
        if r.counted:
            w.put(13, counts[r.index], role="input", fmt="0", row=rr)
        w.put(14, note, role="note", row=rr)
    st.layer_cells = layer_cells
    st.r = r
    st.rse_used_ref = rse_used_ref


def _ventilation_setup(st) -> None:
    """Still-air Rsi and the cells of a slightly ventilated layer (6.9.3)."""
    con = st.con
    # ---- ventilation (slightly) ----------------------------------------------------------
    rsi_still = surface_resistance("inside", con.heat_flow)
    vent_refs: dict[str, str] = {}
    st.rsi_still = rsi_still
    st.vent_refs = vent_refs


def _surface_resistances(st) -> None:
    """Rsi and Rse (Table 7) and, for a ventilated air layer, its treatment (6.9)."""
    bridged_idx = st.bridged_idx
    con = st.con
    counted_rows = st.counted_rows
    layer_cells = st.layer_cells
    rows = st.rows
    rsi_still = st.rsi_still
    slightly = st.slightly
    vent = st.vent
    vent_refs = st.vent_refs
    w = st.w
    # ---- surfaces and totals -------------------------------------------------------------
    w.row += 1
    w.start("totals", "Surface resistances (EN ISO 6946:2017, 6.8 and Table 7)")
    w.headers(["", "Quantity", "", "", "", "", "Value", "", "", "", "Engine", "Check", "",
               "Rule / note"])
    rsi = w.value_row("Rsi, internal surface resistance [m2 K/W]", value=float(con.rsi),
                      note=f"ISO 6946:2017 Table 7, heat flow {con.heat_flow}")
    rse = w.value_row("Rse, external surface resistance as given [m2 K/W]",
                      value=float(con.rse), note="ISO 6946:2017 Table 7 unless stated")
    base_cells = [layer_cells[r.index]["own"] for r in counted_rows
                  if r.index not in bridged_idx]

    if slightly:
        v = vent
        vi = v.layer
        w.put(2, "Slightly ventilated air layer: vent area Av [mm2 per m or m2]")
        av = w.put(7, float(v.vent_area), role="input", fmt="0")
        w.put(14, "ISO 6946:2017, 6.9.3", role="note")
        w.row += 1
        inner = [layer_cells[i]["own"] for i in range(vi)]
        outer = [layer_cells[i]["own"] for i in range(vi + 1, len(rows))]
        r_in = "(" + ("+".join(inner) if inner else "0") + ")"
        r_out = "(" + ("+".join(outer) if outer else "0") + ")"
        r_air = layer_cells[vi]["own"]
        w_u = w.value_row("weight of the unventilated case (1500 − Av)/1000 [-]",
                          formula=f"=(1500-{av})/1000", engine=v.weight_unventilated, fmt="0.0000")
        w_v = w.value_row("weight of the well ventilated case (Av − 500)/1000 [-]",
                          formula=f"=({av}-500)/1000", engine=v.weight_ventilated, fmt="0.0000")
        rse_v_formula = rse if con.rse_given else f"{rsi_still!r}"
        r_tu = w.value_row(
            "R_T,u: layer unventilated, outer layers capped at 0.15 [m2 K/W]",
            formula=f"={rsi}+{r_in}+{r_air}+MIN({r_out},{SLIGHTLY_VENTILATED_OUTER_CAP!r})"
                    f"+{rse}", engine=v.r_total_unventilated)
        r_tv = w.value_row(
            "R_T,v: layer well ventilated, still-air Rse [m2 K/W]",
            formula=f"={rsi}+{r_in}+{rse_v_formula}", engine=v.r_total_ventilated,
            note=f"still-air Rse = Rsi for heat flow {con.heat_flow} = {rsi_still:g}")
        r_t_vent = w.value_row("R_T = w_u R_T,u + w_v R_T,v [m2 K/W]",
                               formula=f"={w_u}*{r_tu}+{w_v}*{r_tv}", engine=con.total_resistance)
        scale = w.value_row(
            "factor on the air layer, the layers outside it and Rse [-]",
            formula=f"=({r_t_vent}-{rsi}-{r_in})/({r_air}+{r_out}+{rse})",
            engine=v.tail_scale, fmt="0.000000",
            note="so that Rsi + Σ R used + Rse used = R_T")
        vent_refs["scale"] = scale
        rse_used_ref = w.value_row("Rse used [m2 K/W]", formula=f"={rse}*{scale}",
                                   engine=con.rse_used)
    elif vent is not None and vent.ventilation == "well":
        rse_used_ref = w.value_row(
            "Rse used: still air behind a well ventilated layer [m2 K/W]",
            value=float(con.rse_used) if con.rse_given else rsi_still,
            engine=con.rse_used,
            note=f"6.9.4: Rse = Rsi of the same direction ({con.heat_flow})")
    else:
        rse_used_ref = w.value_row("Rse used [m2 K/W]", formula=f"={rse}", engine=con.rse_used)
    st.base_cells = base_cells
    st.rse_used_ref = rse_used_ref
    st.rsi = rsi


def _bridging_limits(st) -> None:
    """Upper and lower limits of a bridged construction (6.7.2)."""
    base_cells = st.base_cells
    bridge = st.bridge
    bridged_idx = st.bridged_idx
    con = st.con
    layer_cells = st.layer_cells
    layer_row = st.layer_row
    parts_at = st.parts_at
    rse_used_ref = st.rse_used_ref
    rsi = st.rsi
    sheet = st.sheet
    w = st.w
    # bridging limits (upper/lower) need Rsi, Rse used and the own resistances
    bridge_refs: dict[str, str] = {}
    if bridge is not None:
        w.row += 1
        w.start("bridging", "Upper and lower limits of the bridged construction (6.7.2)")
        # section 1 combines the first part of every bridged layer, so the engine's base
        # resistance is its R_T,q less those parts' d/lambda
        base_engine = bridge.sections[0][1] - math.fsum(
            con.layers[i].thickness / con.layers[i].parts[0][0] for i in bridged_idx)
        base = w.value_row(
            "Rsi + Rse used + Σ R of the homogeneous counted layers [m2 K/W]",
            formula=f"={rsi}+{rse_used_ref}" + "".join(f"+{c}" for c in base_cells),
            engine=base_engine)
        w.headers(["No.", "Section: parts (one per bridged layer)", "", "", "", "", "f [-]",
                   "R_T,q [m2 K/W]", "f/R_T,q [W/(m2 K)]", "", "Engine R_T,q [m2 K/W]",
                   "Check"])
        first_sec = w.row
        part_lists = [list(range(parts_at[i][0], parts_at[i][1] + 1)) for i in bridged_idx]
        combos = _product(part_lists)
        for q, (combo, (_frac, r_q)) in enumerate(zip(combos, bridge.sections, strict=True), 1):
            w.put(1, q)
            w.put(2, " + ".join(f"part {pr - parts_at[i][0] + 1} of layer {i + 1}"
                                for i, pr in zip(bridged_idx, combo, strict=True)))
            w.put(7, formula="=" + "*".join(f"G{pr}" for pr in combo), fmt="0.0000")
            rq = w.put(8, formula=f"={base}" + "".join(
                f"+E{layer_row[i]}/1000/F{pr}" for i, pr in zip(bridged_idx, combo,
                                                                 strict=True)), fmt=FMT_R)
            w.put(9, formula=f"=G{w.row}/H{w.row}", fmt=FMT_COEF)
            eng = w.put(11, float(r_q), role="engine", fmt=FMT_R)
            w.check(12, rq, eng)
            w.row += 1
        last_sec = w.row - 1
        upper = w.value_row("R'_T upper limit = 1/Σ(f_q/R_T,q) [m2 K/W]",
                            formula=f"=1/SUM(I{first_sec}:I{last_sec})", engine=bridge.upper)
        lower = w.value_row(
            "R''_T lower limit = base + Σ R_j (lower-limit layers) [m2 K/W]",
            formula=f"={base}" + "".join(f"+{layer_cells[i]['own']}" for i in bridged_idx),
            engine=bridge.lower)
        r_t_b = w.value_row("R_T = (R'_T + R''_T)/2 [m2 K/W]", formula=f"=({upper}+{lower})/2",
                            engine=bridge.total)
        w.value_row("maximum relative error e = (R'_T − R''_T)/(2 R_T) [-]",
                    formula=f"=({upper}-{lower})/(2*{r_t_b})", engine=bridge.relative_error,
                    fmt="0.0000")
        ratio = w.value_row("ratio R'_T/R''_T [-]", formula=f"={upper}/{lower}",
                            engine=bridge.ratio, fmt="0.0000")
        w.put(2, "Validity of the method")
        w.put(7, formula=f'=IF({ratio}<=1.5,"valid: ratio ≤ 1.5","NOT VALID: ratio > 1.5, '
                         f'use a numerical method (EN ISO 10211)")')
        sheet.merges.append(f"G{w.row}:J{w.row}")
        w.put(14, "ISO 6946:2017, 6.7.2.1", role="note")
        w.row += 1
        bridge_refs = {"total": r_t_b, "lower": lower}
    st.bridge_refs = bridge_refs


def _layer_factors_and_total(st) -> None:
    """Factors of the layer rows, R_T and U before corrections (6.7.1)."""
    bridge = st.bridge
    bridge_refs = st.bridge_refs
    bridged_idx = st.bridged_idx
    con = st.con
    counted_rows = st.counted_rows
    first_layer_row = st.first_layer_row
    last_layer_row = st.last_layer_row
    layer_cells = st.layer_cells
    layer_row = st.layer_row
    rows = st.rows
    rse_used_ref = st.rse_used_ref
    rsi = st.rsi
    sheet = st.sheet
    slightly = st.slightly
    vent = st.vent
    vent_refs = st.vent_refs
    w = st.w
    # factors of the layer table (need the bridging/ventilation cells)
    w.block = sheet.block("layers")
    r_b_sum = "+".join(layer_cells[i]["own"] for i in bridged_idx) if bridged_idx else ""
    for r in rows:
        rr = layer_row[r.index]
        if slightly and r.index >= vent.layer:
            w.put(9, formula=f"={vent_refs['scale']}", fmt="0.000000", row=rr)
        elif bridge_refs and r.index in bridged_idx and not slightly:
            w.put(9, formula=f"=1+({bridge_refs['total']}-{bridge_refs['lower']})/({r_b_sum})",
                  fmt="0.000000", row=rr)
        else:
            w.put(9, 1, role="engine", fmt="0.000000", row=rr)
        used = w.put(10, formula=f"=G{rr}*H{rr}*I{rr}", fmt=FMT_R, row=rr)
        eng = w.put(11, float(r.resistance if r.counted else 0.0), role="engine", fmt=FMT_R,
                    row=rr)
        w.check(12, used, eng, row=rr)
    w.row += 1
    w.start("total", "Total resistance and U-value")
    w.headers(["", "Quantity", "", "", "", "", "Value", "", "", "", "Engine", "Check", "",
               "Rule / note"])
    sum_used = w.value_row("Σ R used of the layers [m2 K/W]",
                           formula=f"=SUM(J{first_layer_row}:J{last_layer_row})",
                           engine=math.fsum(r.resistance for r in counted_rows))
    r_total = w.value_row("R_T = Rsi + Σ R used + Rse used [m2 K/W]",
                          formula=f"={rsi}+{sum_used}+{rse_used_ref}",
                          engine=con.total_resistance,
                          note="6.7.1; with bridged layers R_T = (R'_T + R''_T)/2, carried by "
                               "the factors" if bridge is not None else "6.7.1")
    u0 = w.value_row("U = 1/R_T, before corrections [W/(m2 K)]", formula=f"=1/{r_total}",
                     engine=con.u_value_uncorrected, fmt=FMT_U)
    st.r_total = r_total
    st.u0 = u0


def _corrections(st) -> None:
    """Corrections to U (Annex F) and the U-value reported."""
    con = st.con
    layer_cells = st.layer_cells
    r_total = st.r_total
    target_ref = st.target_ref
    u0 = st.u0
    w = st.w
    # ---- corrections ---------------------------------------------------------------------
    corr = con.corrections
    items = []
    if con.corrections_input:
        w.row += 1
        w.start("corrections", "Corrections to U (EN ISO 6946:2017, Annex F)")
        for c, (label, idx, du) in zip(con.corrections_input, corr.items, strict=True):
            w.put(2, f"{label}, layer {idx + 1} ({con.layers[idx].name})", style="hl label")
            w.row += 1
            r1 = layer_cells[idx]["own"]
            ratio = f"({r1}/{r_total})^2"
            if isinstance(c, AirGapCorrection):
                dupp = w.value_row("ΔU'' for the level [W/(m2 K)]",
                                   value={0: 0.0, 1: 0.01, 2: 0.04}[c.level], fmt="0.000",
                                   note=f"level {c.level}: 0 / 0.01 / 0.04 (F.2)")
                ref_du = w.value_row("ΔU_g = ΔU'' (R_1/R_T)² [W/(m2 K)]",
                                     formula=f"={dupp}*{ratio}", engine=du, fmt=FMT_U)
            elif isinstance(c, FastenerCorrection):
                lam = w.value_row("λ_f fastener [W/(m K)]", value=float(c.conductivity),
                                  fmt="0.0")
                af = w.value_row("A_f cross-section of one fastener [mm2]",
                                 value=float(c.cross_section) * 1e6, fmt="0.00")
                nf = w.value_row("n_f fasteners per m2 [1/m2]", value=float(c.count_per_m2),
                                 fmt="0.00")
                if c.edition == "2007":
                    alpha = w.value_row("α (2007: 6 for walls, 5 for roofs) [1/m]",
                                        value=6.0 if c.application == "wall" else 5.0,
                                        fmt="0.0")
                    f = f"=IF({lam}<1,0,{alpha}*{lam}*{af}/1000000*{nf}*{ratio})"
                    rule = "2007 form: ΔU_f = α λ_f A_f n_f (R_1/R_T)²; 0 when λ_f < 1"
                else:
                    d0 = f"{layer_cells[idx]['d']}/1000"
                    pen = c.penetration if c.penetration is not None else None
                    d1 = w.value_row("d_1 fastener length in the layer [mm]",
                                     value=(pen if pen is not None else
                                            con.layers[idx].thickness) * 1000.0, fmt=FMT_MM)
                    f = (f"=IF({lam}<1,0,0.8*({d1}/1000)/({d0})*{lam}*{af}/1000000*{nf}/({d0})"
                         f"*{ratio})")
                    rule = "2017 form: ΔU_f = 0.8 (d_1/d_0) λ_f A_f n_f / d_0 (R_1/R_T)²"
                ref_du = w.value_row("ΔU_f [W/(m2 K)]", formula=f, engine=du, fmt=FMT_U,
                                     note=rule)
            elif isinstance(c, InvertedRoofCorrection):
                p = w.value_row("p precipitation in the heating season [mm/day]",
                                value=float(c.precipitation), fmt="0.00")
                fr = w.value_row("f drainage factor [-]", value=float(c.drainage_factor),
                                 fmt="0.000")
                x = w.value_row("x factor [W day/(m2 K mm)]", value=float(c.factor_x),
                                fmt="0.000")
                ref_du = w.value_row("ΔU_r = p f x (R_1/R_T)² [W/(m2 K)]",
                                     formula=f"={p}*{fr}*{x}*{ratio}", engine=du, fmt=FMT_U)
            else:  # pragma: no cover - a new correction type must be added here
                ref_du = w.value_row("ΔU (engine value) [W/(m2 K)]", value=float(du),
                                     fmt=FMT_U)
            items.append(ref_du)
    if not items:
        w.row += 1
        w.start("corrections", "Corrections to U (EN ISO 6946:2017, Annex F)")
        w.put(2, "no corrections given for this construction", role="note")
        w.row += 1
    du_sum = w.value_row("Σ ΔU [W/(m2 K)]", formula="=" + ("+".join(items) if items else "0"),
                         engine=corr.delta_u_total, fmt=FMT_U)
    force = 1 if con.apply_small_corrections else 0
    applied = w.value_row(
        "corrections applied? (1 = yes) [-]",
        formula=f"=IF(OR({force}=1,AND({len(items)}>0,{du_sum}>={CORRECTION_THRESHOLD!r}*{u0})"
                "),1,0)",
        engine=1.0 if corr.applied else 0.0, fmt="0",
        note="Annex F: not applied when Σ ΔU < 3 % of U")
    w.row += 1
    w.start("u_value", "U-value")
    u_val = w.value_row("U = U + ΔU (when applied) [W/(m2 K)]",
                        formula=f"={u0}+{applied}*{du_sum}", engine=con.u_value, fmt=FMT_U)
    u_rep = w.value_row("U to two significant figures [W/(m2 K)]",
                        formula=f"=ROUND({u_val},1-INT(LOG10(ABS({u_val}))))",
                        engine=con.u_value_reported, fmt=FMT_U_2SF,
                        note="ISO 6946:2017 clause 8")
    w.put(2, "Target met?")
    w.put(7, formula=f'=IF(ISNUMBER({target_ref}),IF({u_val}<={target_ref},"yes","NO"),'
                     '"no target")')
    w.row += 1
    st.u_rep = u_rep
    st.u_val = u_val


def _ladder_temperatures(st) -> None:
    """Temperatures at the interfaces by the resistance ladder."""
    con = st.con
    counted_rows = st.counted_rows
    layer_row = st.layer_row
    r_total = st.r_total
    rse_used_ref = st.rse_used_ref
    rsi = st.rsi
    sheet = st.sheet
    te = st.te
    temp_inside = st.temp_inside
    temp_outside = st.temp_outside
    ti = st.ti
    w = st.w
    # ---- ladder temperatures -------------------------------------------------------------
    w.row += 1
    sheet.row_breaks.append(w.row)  # temperatures and their chart start a printed page
    w.start("interfaces", "Temperatures at the surfaces and layer interfaces (resistance "
                          "ladder, no corrections)")
    w.headers(["", "Position", "", "", "x [mm]", "", "θ [degC]", "", "", "", "Engine θ [degC]",
               "Check", "", "Rule / note"])
    q_ref = w.value_row("heat flux q = (θi − θe)/R_T [W/m2]",
                        formula=f"=({ti}-{te})/{r_total}",
                        engine=(temp_inside - temp_outside) / con.total_resistance,
                        fmt="0.0000", note="positive from inside to outside")
    ladder = con.ladder_temperatures(temp_inside, temp_outside)
    first_if = w.row
    w.put(2, "inside surface")
    w.put(5, 0.0, role="engine", fmt=FMT_MM)
    t_prev = w.put(7, formula=f"={ti}-{q_ref}*{rsi}", fmt=FMT_T)
    w.check(12, t_prev, w.put(11, float(ladder[0]), role="engine", fmt=FMT_T))
    w.put(14, "θsi = θi − q Rsi", role="note")
    w.row += 1
    for k, r in enumerate(counted_rows, 1):
        rr = layer_row[r.index]
        is_last = k == len(counted_rows)
        w.put(2, "outside surface" if is_last else
              f"between {r.name} and {counted_rows[k].name}")
        w.put(5, formula=f"=E{w.row - 1}+E{rr}", fmt=FMT_MM)
        t_k = w.put(7, formula=f"=G{w.row - 1}-{q_ref}*J{rr}", fmt=FMT_T)
        w.check(12, t_k, w.put(11, float(ladder[k]), role="engine", fmt=FMT_T))
        w.put(14, f"minus q × R used of layer {r.index + 1}", role="note")
        w.row += 1
    last_if = w.row - 1
    w.value_row("outside air, back from the outside surface: θse − q Rse used [degC]",
                formula=f"=G{last_if}-{q_ref}*{rse_used_ref}", engine=float(temp_outside),
                fmt=FMT_T, note="closes the ladder: equals θe")
    w.value_row("temperature factor fRsi = (θsi − θe)/(θi − θe) [-]",
                formula=f"=(G{first_if}-{te})/({ti}-{te})",
                engine=(float(ladder[0]) - temp_outside) / (temp_inside - temp_outside),
                fmt="0.0000", note="plane element; a mould check uses Rsi = 0.25 (ISO 13788)")
    st.first_if = first_if
    st.last_if = last_if
    st.q_ref = q_ref


def _chart_space(st) -> None:
    """Rows kept free for the temperature chart."""
    sheet = st.sheet
    w = st.w
    # ---- chart placeholder rows ----------------------------------------------------------
    chart_row = w.row + 1
    w.row += 21
    sheet.row_breaks.append(w.row)  # the nodal table starts a printed page
    st.chart_row = chart_row


def _nodal_table(st) -> None:
    """The finite-volume nodal table: coefficients, Thomas algorithm, engine check."""
    con = st.con
    layer_row = st.layer_row
    r_total = st.r_total
    rse_used_ref = st.rse_used_ref
    rsi = st.rsi
    te = st.te
    temps = st.temps
    ti = st.ti
    w = st.w
    # ---- finite-volume nodal table -------------------------------------------------------
    w.start("fv", "Finite-volume nodal temperatures (cell-centred, Patankar 1980 ch. 4)")
    fv = temps.fv
    w.put(2, "Cell-centred finite volumes; face conductance G = 1/(w_i/(2k_i) + w_(i+1)/(2k_("
             "i+1))); a_P T_i = a_W T_(i−1) + a_E T_(i+1) + b. Solved here by the Thomas "
             "algorithm (P_i = a_E/(a_P − a_W P_(i−1)), Q_i = (b + a_W Q_(i−1))/(a_P − a_W "
             "P_(i−1)), T_i = P_i T_(i+1) + Q_i); by the engine with LAPACK gtsv.",
          role="note")
    w.row += 1
    n = fv.temperature.size
    node0 = w.row + 3  # two boundary rows and the header row come first
    nodeN = node0 + n - 1
    g_left = w.value_row(
        "boundary conductance inside G_i = 1/(w_1/(2k_1) + Rsi) [W/(m2 K)]",
        formula=f"=1/(C{node0}/(2*D{node0})+{rsi})",
        engine=fv.a_centre[0] - fv.a_east[0] - fv.a_west[0] if n > 1 else None,
        fmt=FMT_COEF)
    g_right = w.value_row(
        "boundary conductance outside G_e = 1/(w_N/(2k_N) + Rse used) [W/(m2 K)]",
        formula=f"=1/(C{nodeN}/(2*D{nodeN})+{rse_used_ref})",
        engine=fv.a_centre[-1] - fv.a_west[-1] - fv.a_east[-1] if n > 1 else None,
        fmt=FMT_COEF)
    w.headers(FV_COLUMNS)
    assert w.row == node0, (w.row, node0)
    layer_rows_of_nodes = [layer_row[int(i)] for i in temps.layer_of_node]
    for i in range(n):
        rr = w.row
        lr = layer_rows_of_nodes[i]
        first, last = i == 0, i == n - 1
        w.put(1, i + 1)
        w.put(2, formula=f"=B{lr}", style="hl label")
        w.put(3, formula=f"=E{lr}/1000/M{lr}", fmt="0.000000")
        w.put(4, formula=f"=E{lr}/1000/J{lr}", fmt=FMT_LAMBDA)
        w.put(5, formula=f"=C{rr}*1000/2" if first else f"=E{rr - 1}+(C{rr - 1}+C{rr})*1000/2",
              fmt="0.00")
        if not last:
            w.put(6, formula=f"=1/(C{rr}/(2*D{rr})+C{rr + 1}/(2*D{rr + 1}))", fmt=FMT_COEF)
        w.put(7, 0.0 if first else None, formula=None if first else f"=F{rr - 1}",
              role="engine" if first else "formula", fmt=FMT_COEF)
        w.put(8, 0.0 if last else None, formula=None if last else f"=F{rr}",
              role="engine" if last else "formula", fmt=FMT_COEF)
        ap = f"=G{rr}+H{rr}" + (f"+{g_left}" if first else "") + (f"+{g_right}" if last else "")
        w.put(9, formula=ap, fmt=FMT_COEF)
        b_terms = ([f"{g_left}*{ti}"] if first else []) + ([f"{g_right}*{te}"] if last else [])
        w.put(10, formula="=" + "+".join(b_terms) if b_terms else None,
              value=None if b_terms else 0.0, role="formula" if b_terms else "engine",
              fmt=FMT_COEF)
        if first:
            w.put(11, formula=f"=H{rr}/I{rr}", fmt="0.000000")
            w.put(12, formula=f"=J{rr}/I{rr}", fmt="0.000000")
        else:
            den = f"(I{rr}-G{rr}*K{rr - 1})"
            w.put(11, formula=f"=H{rr}/{den}", fmt="0.000000")
            w.put(12, formula=f"=(J{rr}+G{rr}*L{rr - 1})/{den}", fmt="0.000000")
        w.put(13, formula=f"=L{rr}" if last else f"=K{rr}*M{rr + 1}+L{rr}", fmt=FMT_T)
        for col, arr in zip((14, 15, 16, 17, 18, 19),
                            (fv.a_west, fv.a_east, fv.a_centre, fv.b, fv.temperature,
                             fv.x * 1000.0),
                            strict=True):
            w.put(col, float(arr[i]), role="engine",
                  fmt={18: FMT_T, 19: "0.00"}.get(col, FMT_COEF))
        t = w.tol
        conds = ",".join(f"ABS({a}{rr}-{e}{rr})<={t}*MAX(1,ABS({e}{rr}))"
                         for a, e in (("G", "N"), ("H", "O"), ("I", "P"), ("J", "Q"),
                                      ("E", "S")))
        w.checks += 1
        w.put(20, formula=f'=IF(AND({conds}),"OK","MISMATCH: x or a coefficient differs")',
              role="check")
        w.check(21, f"M{rr}", f"R{rr}")
        w.row += 1
    w.row += 1
    w.value_row("heat flux through the inside surface q = G_i (θi − T_1) [W/m2]",
                formula=f"={g_left}*({ti}-M{node0})", engine=temps.heat_flux, fmt="0.0000")
    w.value_row("heat flux through the outside surface q = G_e (T_N − θe) [W/m2]",
                formula=f"={g_right}*(M{nodeN}-{te})", engine=temps.heat_flux_outside,
                fmt="0.0000")
    if temps.ladder_heat_flux is not None:
        w.value_row("independent check: ladder heat flux q = (θi − θe)/R_T [W/m2]",
                    formula=f"=({ti}-{te})/{r_total}", engine=temps.heat_flux, fmt="0.0000",
                    note="the closed form (6.7.1) against the finite-volume flux: they agree "
                         "only if every coefficient of the solve is right")
    _solution_record(w, temps)
    for text in con.warnings:
        put_warning(w, f"Warning: {text}")
    last_row = w.row
    st.last_row = last_row
    st.node0 = node0
    st.nodeN = nodeN


def _temperature_chart(st) -> None:
    """The temperature chart through the construction."""
    chart_row = st.chart_row
    first_if = st.first_if
    last_if = st.last_if
    name = st.name
    node0 = st.node0
    nodeN = st.nodeN
    sheet = st.sheet
    sheet_name = st.sheet_name
    # ---- chart ---------------------------------------------------------------------------
    sheet.charts.append(Chart(
        "scatter", f"Temperature through {name}", f"B{chart_row}",
        (ChartSeries("nodal temperature (finite volumes)", sheet_ref(sheet_name,
                     f"M{node0}:M{nodeN}"), sheet_ref(sheet_name, f"E{node0}:E{nodeN}"),
                     line=True, marker="circle", color="2E5A6B"),
         ChartSeries("surfaces and layer interfaces", sheet_ref(sheet_name,
                     f"G{first_if}:G{last_if}"), sheet_ref(sheet_name, f"E{first_if}:E{last_if}"),
                     line=False, marker="diamond", color="C0504D")),
        x_title="position from the inside surface [mm]", y_title="temperature [degC]",
        width_cm=30.0, height_cm=10.5))


def _check_count(st) -> object:
    """Fill the sheet's check counters; return the sheet's references."""
    area_ref = st.area_ref
    count_cell = st.count_cell
    first_if = st.first_if
    last_if = st.last_if
    last_row = st.last_row
    name = st.name
    node0 = st.node0
    nodeN = st.nodeN
    ok_ref = st.ok_ref
    q_ref = st.q_ref
    r_total = st.r_total
    sheet = st.sheet
    sheet_name = st.sheet_name
    state_cell = st.state_cell
    target_ref = st.target_ref
    u_rep = st.u_rep
    u_val = st.u_val
    w = st.w
    # ---- sheet check count ---------------------------------------------------------------
    w.block = sheet.block("header")
    w.put(10, w.checks, role="engine", fmt="0", row=int(count_cell[1:]))
    # the count starts below the header so that it never includes itself
    w.put(10, formula=f'=COUNTIF(A{HEADER_ROWS + 1}:U{last_row},"OK")', fmt="0",
          row=int(ok_ref[1:]))
    w.put(10, formula=f'=IF({ok_ref}={count_cell},"ALL CHECKS OK","NOT ALL OK")',
          style="hl check", role="formula", row=int(state_cell[1:]))
    return ConstructionRefs(
        sheet=sheet_name, name=name, r_total=sheet_ref(sheet_name, r_total),
        u_value=sheet_ref(sheet_name, u_val), u_reported=sheet_ref(sheet_name, u_rep),
        checks_ok=sheet_ref(sheet_name, ok_ref), check_count=w.checks,
        heat_flux=sheet_ref(sheet_name, q_ref),
        extras={"area": sheet_ref(sheet_name, area_ref),
                "target": sheet_ref(sheet_name, target_ref),
                "nodes": (node0, nodeN), "interfaces": (first_if, last_if)},
    )


def _pick(names, idx: int) -> str:
    if names is None or idx >= len(names):
        return ""
    return str(names[idx] or "")


def _material_link(refs, name: str, conductivity) -> str:
    """Reference of the material's λ cell when the layer uses exactly that value."""
    if not refs or not name or conductivity is None:
        return ""
    hit = refs.get(name.strip().lower())
    if hit is None:
        return ""
    ref, lam = hit
    return ref if float(lam) == float(conductivity) else ""


def _product(lists):
    """All combinations, the first list varying slowest (as :func:`itertools.product`)."""
    out = [[]]
    for options in lists:
        out = [prev + [o] for prev in out for o in options]
    return out
