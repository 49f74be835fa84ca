"""The calculation sheet of one construction: layers, surface resistances, bridging,
ventilation, corrections, the resistance ladder and the finite-volume nodal table, step by
step, every result a live formula beside the engine's value and a check cell.
"""

from __future__ import annotations

import math
from types import SimpleNamespace

from ..constructions import (
    SLIGHTLY_VENTILATED_OUTER_CAP,
    Construction,
    ConstructionTemperatures,
)
from ..surfaces import surface_resistance
from .blocks_construction import (
    COLUMN_WIDTHS,
    CONSTRUCTION_ROWS,
    DEFAULT_CHECK_TOLERANCE,
    FMT_COEF,
    FMT_LAMBDA,
    FMT_MM,
    FMT_R,
    FMT_SMALL,
    FMT_U,
    HEADER_ROWS,
    LAYER_COLUMNS,
    ConstructionRefs,
    _material_link,
    _pick,
    _product,
    add_calculation_sheet,
)
from .construction_fv_sheet import add_fv_appendix
from .construction_sheet_steps import (  # noqa: F401
    _chart_space,
    _check_count,
    _corrections,
    _ladder_temperatures,
    _temperature_chart,
)
from .plan import WorkbookPlan
from .rows import CheckRows

__all__ = ["add_construction_sheet"]


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
    add_fv_appendix(st)
    st.last_row = st.w.row
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
    w.put(2, "Design θi, inside air [degC]")
    ti = w.put(3, float(temp_inside), role="input", fmt="0.0")
    w.row = 6
    w.put(2, "Design θe, outside air [degC]")
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
    w.put(6, "Check cells here and in the appendix")
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


