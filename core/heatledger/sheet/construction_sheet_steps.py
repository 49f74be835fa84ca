"""Later steps of a construction's calculation sheet: corrections to U, the resistance ladder,
the finite-volume nodal table, the chart and the check counters.
"""

from __future__ import annotations

from ..constructions import (
    CORRECTION_THRESHOLD,
    AirGapCorrection,
    FastenerCorrection,
    InvertedRoofCorrection,
)
from .blocks_construction import (
    FMT_MM,
    FMT_T,
    FMT_U,
    FMT_U_2SF,
    HEADER_ROWS,
    ConstructionRefs,
)
from .plan import Chart, ChartSeries, sheet_ref

__all__ = []


def _corrections(st) -> None:
    """Corrections to U (Annex F) and the U-value reported."""
    _corrections_setup(st)
    _correction_rows(st)
    _u_value_rows(st)


def _corrections_setup(st) -> None:
    """The inputs and first rows of this part of the sheet."""
    con = st.con
    layer_cells = st.layer_cells
    r_total = st.r_total
    target_ref = st.target_ref
    u0 = st.u0
    w = st.w
    st.con = con
    st.layer_cells = layer_cells
    st.r_total = r_total
    st.target_ref = target_ref
    st.u0 = u0
    st.w = w


def _correction_rows(st) -> None:
    """Corrections."""
    con = st.con
    layer_cells = st.layer_cells
    r_total = st.r_total
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
    st.applied = applied
    st.du_sum = du_sum


def _u_value_rows(st) -> None:
    """The U-value with its corrections and the U reported."""
    applied = st.applied
    con = st.con
    du_sum = st.du_sum
    target_ref = st.target_ref
    u0 = st.u0
    w = st.w
    # ---- u value -------------------------------------------------------------------------
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
    del sheet
    st.chart_row = chart_row


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
        (ChartSeries("nodal temperature (finite volumes)", sheet_ref(st.fv_sheet,
                     f"M{node0}:M{nodeN}"), sheet_ref(st.fv_sheet, f"E{node0}:E{nodeN}"),
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
    checks = w.checks + st.fv_w.checks  # this sheet's and its appendix's
    w.put(10, checks, role="engine", fmt="0", row=int(count_cell[1:]))
    # the count starts below the header so that it never includes itself
    w.put(10, formula=f'=COUNTIF(A{HEADER_ROWS + 1}:U{last_row},"OK")+{st.fv_ok}', fmt="0",
          row=int(ok_ref[1:]))
    w.put(10, formula=f'=IF({ok_ref}={count_cell},"ALL CHECKS OK","NOT ALL OK")',
          style="hl check", role="formula", row=int(state_cell[1:]))
    return ConstructionRefs(
        sheet=sheet_name, name=name, r_total=sheet_ref(sheet_name, r_total),
        u_value=sheet_ref(sheet_name, u_val), u_reported=sheet_ref(sheet_name, u_rep),
        checks_ok=sheet_ref(sheet_name, ok_ref), check_count=checks,
        heat_flux=sheet_ref(sheet_name, q_ref),
        extras={"area": sheet_ref(sheet_name, area_ref),
                "target": sheet_ref(sheet_name, target_ref),
                "nodes": (node0, nodeN), "fv_sheet": st.fv_sheet,
                "interfaces": (first_if, last_if)},
    )
