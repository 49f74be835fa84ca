"""Calculation-sheet blocks of room and building heat losses, built from the engine's results.

One sheet per room and one building sheet. On a room sheet every step is a live formula:
whole-window U-values from glazing, frame and glazing edge (EN ISO 10077-1), ground-floor
U-values with ``B'``, ``d_t`` and both regimes (EN ISO 13370, with ``LN`` and ``PI``), the
ventilation coefficient ``H_V = rho c_p V_eff / 3600`` with the air properties stated, the
element table ``H = A (U + Delta U_TB) f``, the adjustment factors from the temperatures,
the design heat load ``Phi_HL = (H_T + H_V)(theta_int - theta_e) + Phi_hu`` and every share.
The building sheet sums the rooms less the exchange between them, breaks the loss down by
element type (with a bar chart) and gives the annual energy ``Q = 24 H DD / 1000`` with the
base temperature of the degree-days stated. Beside each formula result stands the engine's
value and a check cell (``OK`` or a text beginning with ``MISMATCH``), as on the construction
sheets.

References
----------
EN 12831-1:2017, clause 6 [M]; EN ISO 10077-1:2017, clause 6 [M]; EN ISO 13370:2017,
clauses 8.2 to 8.4 and Annex B [M].
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

from .. import cautions as _cautions
from ..ground.soil import RSE_GROUND, RSI_FLOOR
from ..heatloss import AIR_DENSITY, AIR_SPECIFIC_HEAT, AdjacentRoom, Ground, Outside, Unheated
from ..heatloss.results import GroundFloorU
from ..windows import DeclaredWindow, WindowResult
from .blocks_construction import DEFAULT_CHECK_TOLERANCE, add_calculation_sheet
from .plan import Chart, ChartSeries, WorkbookPlan, safe_sheet_name, sheet_ref
from .rows import CheckRows, RowLayout

__all__ = ["HeatLossRefs", "add_heatloss_sheets", "BUILDING_SHEET", "DEFAULT_CHECK_TOLERANCE",
           "HEATLOSS_METHODS"]

#: Methods the heat-loss sheets apply, as stated on the cover of the audit workbook.
HEATLOSS_METHODS = (
    "Room and building heat loss: EN 12831-1:2017 clause 6 style, H_T = Σ A (U + ΔU_TB) f + "
    "Σ ψ l f + Σ χ f; f = 1 outside, b_u or (θ_int − θ_u)/(θ_int − θ_e) to unheated and "
    "adjacent spaces, f_g1 f_g2 G_w to the ground; Φ_HL = (H_T + H_V)(θ_int − θ_e) + Φ_hu; "
    "building = Σ rooms less exchange between rooms [formulas recalled, M]",
    "Ventilation: H_V = ρ c_p V_eff / 3600 with V_eff = V_inf + V_vent (1 − η) + top-up to "
    "n_min V; dry air at 20 degC and 101325 Pa",
    "Windows and doors: EN ISO 10077-1:2017 clause 6, U_w from glazing, frame and glazing "
    "edge [M]",
    "Ground floors: EN ISO 13370:2017 clause 8.2 (slab on ground, both regimes; Annex B edge "
    "insulation), 8.3 (suspended floor), 8.4 (heated basement) [M]",
    "Annual heating energy: degree-day method Q = 24 H DD / 1000, base temperature stated",
)

#: Name of the building sheet.
BUILDING_SHEET = "Heat loss building"
#: Rows 1 to HEADER_ROWS hold the title, the design data and the sheet's check count.
HEADER_ROWS = 11

FMT_T = "0.0"
FMT_H = "0.000"
FMT_U = "0.0000"
FMT_W = "0.0"
FMT_SHARE = "0.0%"
FMT_SMALL = "0.000E+00"

#: Columns of the element table.
TABLE_COLUMNS = [
    ("No.", 5), ("Element / line", 28), ("Kind", 11), ("Boundary", 26), ("Quantity", 10),
    ("Unit", 7), ("U, ψ, χ", 11), ("ΔU_TB [W/(m2 K)]", 10), ("θ other side [degC]", 10),
    ("Factor f [-]", 10), ("H [W/K]", 11), ("Engine H [W/K]", 11), ("Check H", 10),
    ("Φ [W]", 11), ("Share [-]", 9), ("Engine share [-]", 9), ("Check share", 10),
    ("Internal [1/0]", 8), ("Rule / source", 60),
]
#: Style of the notes in the last column: wrapped there, so a long provenance does not
#: run on past the table and shrink the printed page.
NOTE_STYLE = "hl note wrap"
#: Header cells (column C) of a room sheet and of the building sheet.
_TI, _TE, _DT, _TOL = "C4", "C5", "C6", "C7"
# building sheet header cells
_B_TE, _B_DD, _B_BASE, _B_TOL, _B_FG1, _B_GW, _B_TME = "C4", "C5", "C6", "C7", "C8", "C9", "C10"


@dataclass
class HeatLossRefs:
    """Where the heat-loss sheets keep their key results (absolute references).

    Attributes
    ----------
    sheets : list of str
        Room sheets, then the building sheet.
    rooms : dict
        Room name -> dict of references (``transmission``, ``internal``, ``ventilation``,
        ``load``, ``energy``, ``sheet``).
    building : dict
        References of the building's ``transmission``, ``ventilation``, ``load``,
        ``energy``.
    check_count : str
        Reference of the cell counting every check cell of the heat-loss sheets.
    checks_ok : str
        Reference of the cell counting those that say OK.
    check_total : int
        Number of check cells.
    extras : dict
        Further cell references by name. [-]
    """

    sheets: list
    rooms: dict
    building: dict
    check_count: str
    checks_ok: str
    check_total: int
    extras: dict = field(default_factory=dict)

#: Columns of a heat-loss sheet's rows: label B, value G, engine L, check M, note S.
HEATLOSS_ROWS = RowLayout(engine=12, check=13, note=19, default_format=FMT_H,
                          note_style=NOTE_STYLE, header_height=27.0)


def _counters(w: CheckRows, last_row: int, columns: str) -> tuple[str, str]:
    """Fill the check counters of the header (F4:J6); return (count, ok) refs.

    Only the check columns are counted, so a name that reads "OK" is not a check.
    """
    w.block = w.sheet.block("header")
    w.put(6, "Check cells on this sheet", row=4)
    count = w.put(10, w.checks, role="engine", fmt="0", row=4)
    w.put(6, "Check cells that say OK", row=5)
    terms = "+".join(f'COUNTIF({c}{HEADER_ROWS + 1}:{c}{last_row},"OK")' for c in columns)
    ok = w.put(10, formula=f"={terms}", fmt="0", row=5)
    w.put(6, "State of this sheet", row=6)
    w.put(10, formula=f'=IF({ok}={count},"ALL CHECKS OK","NOT ALL OK")',
          style="hl check", role="formula", row=6)
    return count, ok


def add_heatloss_sheets(plan: WorkbookPlan, building_input, *, project_name: str = "",
                        tolerance: float = DEFAULT_CHECK_TOLERANCE,
                        construction_refs: dict | None = None,
                        reserved=()) -> HeatLossRefs:
    """Add one sheet per room and the building sheet to ``plan``.

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook plan to extend. [-]
    building_input : heatledger.heatloss.project_io.BuildingInput
        The parsed building with its design external temperature and degree-days. [-]
    project_name : str
        Project name for the page headers. [-]
    tolerance : float
        Relative tolerance of the check cells. [-]
    construction_refs : dict, optional
        Construction name -> :class:`~heatledger.sheet.blocks_construction.ConstructionRefs`
        of sheets already in ``plan``; element U-values then refer to those sheets by
        formula, otherwise they are stated as the engine's values. [-]
    reserved : iterable of str
        Sheet names already used (lower case compared). [-]

    Returns
    -------
    HeatLossRefs
    """
    bi = building_input
    building = bi.building
    result = bi.heat_load()
    crefs = construction_refs or {}
    used = {s.name.lower() for s in plan.sheets} | {str(r).lower() for r in reserved}
    names = _room_sheet_names([r.name for r in building.rooms], used)
    room_sheet = dict(zip([r.name for r in building.rooms], names, strict=True))
    bref = {k: sheet_ref(BUILDING_SHEET, v) for k, v in
            (("te", _B_TE), ("dd", _B_DD), ("base", _B_BASE), ("tol", _B_TOL),
             ("fg1", _B_FG1), ("gw", _B_GW), ("tme", _B_TME))}
    rooms_out: dict = {}
    counters = []
    for room, rres in zip(building.rooms, result.rooms, strict=True):
        refs = _room_sheet(plan, room_sheet[room.name], room, rres, building, bi, bref,
                           room_sheet, crefs, project_name)
        rooms_out[room.name] = refs
        counters.append((refs["count"], refs["ok"], refs["checks"]))
    b_refs = _building_sheet(plan, bi, result, rooms_out, room_sheet, counters, tolerance,
                             project_name)
    return HeatLossRefs(sheets=names + [BUILDING_SHEET], rooms=rooms_out, building=b_refs,
                        check_count=b_refs["all_count"], checks_ok=b_refs["all_ok"],
                        check_total=b_refs["check_total"])


# --------------------------------------------------------------------------- room sheet
def _room_sheet(plan, sname, room, rres, building, bi, bref, room_sheet, crefs, project_name):
    sheet = add_calculation_sheet(plan, sname, [w for _h, w in TABLE_COLUMNS],
                                  f"{project_name} | {room.name}")
    w = CheckRows(sheet, f"${_TOL[0]}${_TOL[1:]}", HEATLOSS_ROWS)
    w.put(1, f"Room {room.name}: heat loss and design heat load", style="hl title")
    sheet.merges.append("A1:S1")
    w.row = 2
    w.put(1, "EN 12831-1 style: H = A (U + ΔU_TB) f, Φ_HL = (H_T + H_V)(θ_int − θ_e) + Φ_hu. "
             "Sand cells are inputs, teal cells formulas, grey cells the engine's values, green "
             "cells compare them.", role="note")
    rows = (("Design internal temperature θ_int [degC]", float(room.temp_inside),
             None, FMT_T),
            ("Design external temperature θ_e [degC]", None, f"={bref['te']}", FMT_T),
            ("Temperature difference Δθ = θ_int − θ_e [K]", None, f"={_TI}-{_TE}", FMT_T),
            ("Check tolerance, relative [-]", None, f"={bref['tol']}", FMT_SMALL))
    for k, (label, value, formula, fmt) in enumerate(rows, 4):
        w.row = k
        w.put(2, label)
        w.put(3, value, formula=formula, fmt=fmt, role="input" if formula is None else None)
    w.row = 7
    w.put(4, "check: |formula − engine| ≤ tolerance × max(1, |engine|)", role="note")
    w.row = 9
    w.put(2, _cautions.CAUTIONS.get("plant_sizing", _cautions.CAUTIONS["general"]),
          style="hl warning")
    sheet.merges.append("B9:S9")
    sheet.row_heights[9] = 27.0
    w.row = HEADER_ROWS

    u_refs: dict = {}
    area_refs: dict = {}
    windows = [el for el in room.elements if isinstance(el.u, WindowResult)]
    if windows:
        w.start("windows", "Whole-window U-values (EN ISO 10077-1:2017, clause 6)")
        for el in windows:
            u_refs[el.name], area_refs[el.name] = _window_rows(w, el)
    grounds = [el for el in room.elements if isinstance(el.u, GroundFloorU)]
    if grounds:
        w.start("ground", "Ground floors (EN ISO 13370:2017, clause 8)")
        for el in grounds:
            u_refs[el.name], area_refs[el.name] = _ground_rows(w, el, crefs,
                                                                building.constructions or {})
    w.start("ventilation", "Ventilation heat-loss coefficient")
    vent = _ventilation_rows(w, room, rres)

    # ---- element table -------------------------------------------------------------------
    w.start("elements", "Elements, thermal bridges, ventilation and heating-up (EN 12831-1, "
                        "clause 6)")
    w.headers([h for h, _w in TABLE_COLUMNS])
    first = w.row
    n_trans = len(room.elements) + len(room.thermal_bridges)
    last_trans = first + n_trans - 1
    vent_row = last_trans + 1
    reheat_row = vent_row + 1
    total_ref = f"$G${reheat_row + 3 + 4}"  # Phi_HL in the totals block below (fixed layout)
    items = list(room.elements) + list(room.thermal_bridges)
    for k, (item, line) in enumerate(zip(items, rres.lines[:n_trans], strict=True)):
        r = first + k
        w.row = r
        w.put(1, k + 1)
        w.put(2, item.name, style="hl text")
        w.put(3, line.kind, style="hl text")
        w.put(4, line.boundary, style="hl text")
        if hasattr(item, "area"):
            if item.name in area_refs:
                w.put(5, formula=f"={area_refs[item.name]}", fmt="0.00")
            else:
                w.put(5, float(item.area), role="input", fmt="0.00")
            w.put(6, "m2")
            w.put(7, **_u_cell(item, u_refs, crefs, building.constructions or {}, line),
                  fmt=FMT_U)
            w.put(8, float(item.thermal_bridge_allowance), role="input", fmt="0.000")
            h_formula = f"=E{r}*(G{r}+H{r})*J{r}"
        else:
            linear = hasattr(item, "psi")
            w.put(5, float(item.length) if linear else int(item.count), role="input",
                  fmt="0.00" if linear else "0")
            w.put(6, "m" if linear else "-")
            w.put(7, float(item.psi if linear else item.chi), role="input", fmt=FMT_U)
            h_formula = f"=E{r}*G{r}*J{r}"
        _factor_cells(w, r, item.boundary, room_sheet, bref)
        h = w.put(11, formula=h_formula, fmt=FMT_H)
        w.check(13, h, w.put(12, float(line.coefficient), role="engine", fmt=FMT_H))
        w.put(14, formula=f"=K{r}*{_DT}", fmt=FMT_W)
        _share_cells(w, r, total_ref, line)
        w.put(18, 1 if line.internal else 0, role="engine", fmt="0")
        w.put(19, f"{line.factor_rule}; U from {line.source}", role="note", style=NOTE_STYLE)
    # ventilation row
    vline, rline = rres.lines[n_trans], rres.lines[n_trans + 1]
    r = w.row = vent_row
    w.put(1, n_trans + 1)
    w.put(2, "ventilation and infiltration", style="hl text")
    w.put(3, "ventilation", style="hl text")
    w.put(4, "outside air", style="hl text")
    w.put(5, formula=f"={vent['flow']}", fmt="0.00")
    w.put(6, "m3/h")
    w.put(7, formula=f"={vent['c']}", fmt=FMT_U)
    w.put(10, 1.0, role="input", fmt="0.000")
    h_v = w.put(11, formula=f"=E{r}*G{r}*J{r}", fmt=FMT_H)
    w.check(13, h_v, w.put(12, float(vline.coefficient), role="engine", fmt=FMT_H))
    w.put(14, formula=f"=K{r}*{_DT}", fmt=FMT_W)
    _share_cells(w, r, total_ref, vline)
    w.put(18, 0, role="engine", fmt="0")
    w.put(19, "H_V = V_eff ρ c_p / 3600 (quantity V_eff, transmittance ρ c_p/3600)", role="note",
          style=NOTE_STYLE)
    # reheat row
    r = w.row = reheat_row
    w.put(1, n_trans + 2)
    w.put(2, "heating-up allowance", style="hl text")
    w.put(3, "reheat", style="hl text")
    w.put(4, "-", style="hl text")
    w.put(5, float(room.floor_area), role="input", fmt="0.00")
    w.put(6, "m2")
    w.put(7, float(room.reheat_factor), role="input", fmt="0.00")
    w.put(11, 0.0, role="engine", fmt=FMT_H)
    phi_hu = w.put(14, formula=f"=E{r}*G{r}", fmt=FMT_W)
    w.check(13, phi_hu, w.put(12, float(rline.heat_loss), role="engine", fmt=FMT_W))
    _share_cells(w, r, total_ref, rline)
    w.put(18, 0, role="engine", fmt="0")
    w.put(19, "Φ_hu = f_RH A_floor (f_RH [W/m2] input; check compares Φ_hu)", role="note",
          style=NOTE_STYLE)
    w.row = reheat_row + 1

    # ---- totals (fixed layout: total_ref above points at Φ_HL) --------------------------
    w.start("totals", "Design heat load of the room")
    rng = f"K{first}:K{last_trans}"
    h_t = w.value_row("H_T = Σ H of elements and thermal bridges [W/K]",
                      formula=f"=SUM({rng})" if n_trans else "=0",
                      engine=rres.transmission_coefficient)
    h_int = w.value_row("of which towards rooms of this building H_int [W/K]",
                        formula=(f"=SUMPRODUCT({rng},R{first}:R{last_trans})" if n_trans
                                 else "=0"),
                        engine=rres.internal_exchange_coefficient)
    h_vr = w.value_row("H_V [W/K]", formula=f"=K{vent_row}", engine=rres.ventilation_coefficient)
    w.value_row("H = H_T + H_V [W/K]", formula=f"={h_t}+{h_vr}",
                engine=rres.heat_loss_coefficient)
    load = w.value_row("Φ_HL = (H_T + H_V) Δθ + Φ_hu [W]",
                       formula=f"=({h_t}+{h_vr})*{_DT}+N{reheat_row}",
                       engine=rres.design_heat_load, fmt=FMT_W,
                       note="design heat load of the room")
    assert f"${load[0]}${load[1:]}" == total_ref, (load, total_ref)
    w.value_row("Φ_T = H_T Δθ [W]", formula=f"={h_t}*{_DT}", engine=rres.transmission_heat_loss,
                fmt=FMT_W)
    w.value_row("Φ_V = H_V Δθ [W]", formula=f"={h_vr}*{_DT}", engine=rres.ventilation_heat_loss,
                fmt=FMT_W)
    w.value_row("Σ shares (must be 1) [-]", formula=f"=SUM(O{first}:O{reheat_row})",
                engine=1.0, fmt="0.000000")
    for text in rres.provenance:
        w.put(2, text, role="note")
        w.row += 1
    last = w.row
    count, ok = _counters(w, last, "MQ")
    s = sname
    return {"sheet": s, "transmission": sheet_ref(s, h_t), "internal": sheet_ref(s, h_int),
            "ventilation": sheet_ref(s, h_vr), "load": sheet_ref(s, load),
            "temp": sheet_ref(s, _TI), "count": sheet_ref(s, count), "ok": sheet_ref(s, ok),
            "checks": w.checks, "table": (first, reheat_row), "vent_row": vent_row}


def _u_cell(item, u_refs, crefs, constructions, line) -> dict:
    u = item.u
    if item.name in u_refs:
        return {"formula": f"={u_refs[item.name]}"}
    if isinstance(u, str) and u in crefs:
        return {"formula": f"={crefs[u].u_value}"}
    if isinstance(u, DeclaredWindow):
        return {"value": float(u.u_value), "role": "input"}
    return {"value": float(line.transmittance), "role": "input"}


def _factor_cells(w, r, b, room_sheet, bref) -> None:
    if isinstance(b, Outside):
        w.put(10, 1.0, role="input", fmt="0.000")
        return
    if isinstance(b, Unheated) and b.adjustment_factor is not None:
        w.put(10, float(b.adjustment_factor), role="input", fmt="0.000")
        return
    if isinstance(b, Ground):  # theta_m,e, f_g1 and G_w stand on the building sheet
        w.put(9, formula=f"={bref['tme']}", fmt=FMT_T)
        w.put(10, formula=f"={bref['fg1']}*{bref['gw']}*({_TI}-I{r})/{_DT}", fmt="0.0000")
        return
    if isinstance(b, AdjacentRoom) and b.room is not None:
        w.put(9, formula=f"={sheet_ref(room_sheet[b.room], _TI)}", fmt=FMT_T)
    else:  # unheated or adjacent space at a stated temperature
        w.put(9, float(b.temperature), role="input", fmt=FMT_T)
    w.put(10, formula=f"=({_TI}-I{r})/{_DT}", fmt="0.0000")


def _share_cells(w, r, total_ref, line) -> None:
    share = w.put(15, formula=f"=N{r}/{total_ref}", fmt=FMT_SHARE)
    w.check(17, share, w.put(16, float(line.share), role="engine", fmt=FMT_SHARE))


def _window_rows(w, el):
    u = el.u
    w.put(2, f"window {el.name}", style="hl label")
    w.row += 1
    vals = {}
    for key, label, val, fmt in (
            ("ag", "A_g visible glazing area [m2]", u.glazing_area, "0.000"),
            ("af", "A_f projected frame area [m2]", u.frame_area, "0.000"),
            ("ap", "A_p opaque panel area [m2]", u.panel_area, "0.000"),
            ("ug", "U_g centre of glazing [W/(m2 K)]", u.glazing_u, FMT_U),
            ("uf", "U_f frame [W/(m2 K)]", u.frame_u, FMT_U),
            ("up", "U_p opaque panel [W/(m2 K)]", u.panel_u, FMT_U),
            ("lg", "l_g visible glazing perimeter [m]", u.glazing_perimeter, "0.000"),
            ("pg", "ψ_g glazing edge [W/(m K)]", u.psi_glazing, FMT_U),
            ("lp", "l_p panel perimeter [m]", u.panel_perimeter, "0.000"),
            ("pp", "ψ_p panel edge [W/(m K)]", u.psi_panel, FMT_U)):
        vals[key] = w.value_row(label, value=float(val), fmt=fmt)
    v = vals
    aw = w.value_row("A_w = A_g + A_f + A_p [m2]", formula=f"={v['ag']}+{v['af']}+{v['ap']}",
                     engine=u.area, fmt="0.000")
    uw = w.value_row("U_w = (A_g U_g + A_f U_f + l_g ψ_g + A_p U_p + l_p ψ_p)/A_w [W/(m2 K)]",
                     formula=(f"=({v['ag']}*{v['ug']}+{v['af']}*{v['uf']}+{v['lg']}*{v['pg']}"
                              f"+{v['ap']}*{v['up']}+{v['lp']}*{v['pp']})/{aw}"),
                     engine=u.u_value, fmt=FMT_U, note="EN ISO 10077-1:2017 clause 6 [M]")
    return uw, aw


def _ground_rows(w, el, crefs, constructions):
    g = el.u
    res = g.result
    w.put(2, f"{g.method_key.replace('_', ' ')}: {el.name}", style="hl label")
    w.put(19, g.method, role="note", style=NOTE_STYLE)
    w.row += 1
    a = w.value_row("A floor area [m2]", value=float(res.area), fmt="0.00")
    p = w.value_row("P exposed perimeter [m]", value=float(res.exposed_perimeter), fmt="0.00")
    wt = w.value_row("w full wall thickness [m]", value=float(g.inputs["w"]), fmt="0.000")
    lam = w.value_row("λ ground conductivity [W/(m K)]", value=float(res.soil_conductivity),
                      fmt="0.00", note=g.soil)
    rsi = w.value_row("R_si floor, heat flow down [m2 K/W]", value=RSI_FLOOR, fmt="0.00")
    rse = w.value_row("R_se [m2 K/W]", value=RSE_GROUND, fmt="0.00")
    b = w.value_row("B' = A/(0.5 P) [m]", formula=f"={a}/(0.5*{p})",
                    engine=res.characteristic_dimension, fmt="0.0000")
    key = g.method_key
    if key in ("slab_on_ground", "heated_basement"):
        rf = _resistance_row(w, "R_f floor construction", g.inputs["rf"], g.construction,
                             crefs, constructions)
        dt_engine = res.equivalent_thickness if key == "slab_on_ground" else \
            res.floor_equivalent_thickness
        dt = w.value_row("d_t = w + λ (R_si + R_f + R_se) [m]",
                         formula=f"={wt}+{lam}*({rsi}+{rf}+{rse})", engine=dt_engine,
                         fmt="0.0000")
    if key == "slab_on_ground":
        u0 = w.value_row(
            "U_0: d_t < B' → 2λ/(πB' + d_t) ln(πB'/d_t + 1); else λ/(0.457 B' + d_t) "
            "[W/(m2 K)]",
            formula=_floor_u_formula(lam, b, dt),
            engine=res.u_without_edge, fmt=FMT_U, note=f"regime here: {res.regime}")
        edge = res.edge_insulation
        if edge is not None:
            dd = w.value_row("D edge insulation width (horizontal) or depth (vertical) [m]",
                             value=float(edge.extent), fmt="0.000")
            k = w.value_row("orientation factor: 1 horizontal, 2 vertical [-]",
                            value=1.0 if edge.orientation == "horizontal" else 2.0, fmt="0")
            rn = w.value_row("R_n edge insulation [m2 K/W]", value=float(edge.resistance),
                             fmt="0.000")
            dn = w.value_row("d_n edge insulation thickness [m]", value=float(edge.thickness),
                             fmt="0.000")
            rx = w.value_row("R' = R_n − d_n/λ [m2 K/W]", formula=f"={rn}-{dn}/{lam}",
                             engine=res.edge_extra_resistance, fmt="0.0000")
            dx = w.value_row("d' = R' λ [m]", formula=f"={rx}*{lam}",
                             engine=res.edge_extra_thickness, fmt="0.0000")
            psi = w.value_row(
                "ψ_ge = −(λ/π)[ln(kD/d_t + 1) − ln(kD/(d_t + d') + 1)] [W/(m K)]",
                formula=(f"=-({lam}/PI())*(LN({k}*{dd}/{dt}+1)-LN({k}*{dd}/({dt}+{dx})+1))"),
                engine=res.psi_edge, fmt="0.00000", note="EN ISO 13370 Annex B [M]")
            u = w.value_row("U = U_0 + 2 ψ_ge/B' [W/(m2 K)]", formula=f"={u0}+2*{psi}/{b}",
                            engine=res.u_value, fmt=FMT_U)
        else:
            u = w.value_row("U = U_0 (no edge insulation) [W/(m2 K)]", formula=f"={u0}",
                            engine=res.u_value, fmt=FMT_U)
        return u, a
    if key == "suspended_floor":
        rd = _resistance_row(w, "R_deck suspended deck", res.deck_resistance, g.construction,
                             crefs, constructions)
        h = w.value_row("h deck height above outside ground [m]",
                        value=g.inputs["h"], fmt="0.000")
        uw = w.value_row("U_w walls of the underfloor space [W/(m2 K)]",
                         value=g.inputs["uw"], fmt=FMT_U)
        eps = w.value_row("ε vent area per perimeter [m2/m]",
                          value=g.inputs["eps"], fmt="0.0000")
        v = w.value_row("v wind speed at 10 m [m/s]", value=g.inputs["v"],
                        fmt="0.00")
        fw = w.value_row("f_w wind shielding factor [-]", value=float(res.wind_shielding_factor),
                         fmt="0.00")
        rg = w.value_row("R_g insulation on the underfloor ground [m2 K/W]",
                         value=g.inputs["rg"], fmt="0.000")
        uf = w.value_row("U_f = 1/(R_si + R_deck + R_si) [W/(m2 K)]",
                         formula=f"=1/({rsi}+{rd}+{rsi})", engine=res.deck_u, fmt=FMT_U)
        dg = w.value_row("d_g = w + λ (R_si + R_g + R_se) [m]",
                         formula=f"={wt}+{lam}*({rsi}+{rg}+{rse})",
                         engine=res.ground_equivalent_thickness, fmt="0.0000")
        ug = w.value_row("U_g = 2λ/(πB' + d_g) ln(πB'/d_g + 1) [W/(m2 K)]",
                         formula=f"=2*{lam}/(PI()*{b}+{dg})*LN(PI()*{b}/{dg}+1)",
                         engine=res.ground_u, fmt=FMT_U)
        ux = w.value_row("U_x = 2 h U_w/B' + 1450 ε v f_w/B' [W/(m2 K)]",
                         formula=f"=2*{h}*{uw}/{b}+1450*{eps}*{v}*{fw}/{b}",
                         engine=res.exchange_u, fmt=FMT_U)
        u = w.value_row("U = 1/(1/U_f + 1/(U_g + U_x)) [W/(m2 K)]",
                        formula=f"=1/(1/{uf}+1/({ug}+{ux}))", engine=res.u_value, fmt=FMT_U)
        return u, a
    # heated basement
    z = w.value_row("z depth of the basement floor below ground [m]", value=float(res.depth),
                    fmt="0.000")
    rw = _resistance_row(w, "R_w basement wall", g.inputs["rw"], g.wall_construction,
                         crefs, constructions)
    rsiw = w.value_row("R_si wall, heat flow horizontal [m2 K/W]",
                       value=g.inputs["rsiw"], fmt="0.00")
    de = f"({dt}+{z}/2)"
    ubf = w.value_row(
        "U_bf: d_t + z/2 < B' → 2λ/(πB' + d_t + z/2) ln(πB'/(d_t + z/2) + 1); else "
        "λ/(0.457 B' + d_t + z/2) [W/(m2 K)]",
        formula=_floor_u_formula(lam, b, de),
        engine=res.floor_u, fmt=FMT_U, note=f"regime here: {res.floor_regime}")
    dw = w.value_row("d_w = λ (R_si + R_w + R_se) [m]", formula=f"={lam}*({rsiw}+{rw}+{rse})",
                     engine=res.wall_equivalent_thickness, fmt="0.0000")
    ds = w.value_row("d* = d_t if d_w ≥ d_t, else d_w [m]",
                     formula=f"=IF({dw}>={dt},{dt},{dw})", engine=res.wall_bracket_thickness,
                     fmt="0.0000")
    ubw = w.value_row("U_bw = 2λ/(πz)(1 + 0.5 d*/(d* + z)) ln(z/d_w + 1) [W/(m2 K)]",
                      formula=f"=2*{lam}/(PI()*{z})*(1+0.5*{ds}/({ds}+{z}))*LN({z}/{dw}+1)",
                      engine=res.wall_u, fmt=FMT_U)
    u = w.value_row("U' = (A U_bf + z P U_bw)/(A + z P) [W/(m2 K)]",
                    formula=f"=({a}*{ubf}+{z}*{p}*{ubw})/({a}+{z}*{p})", engine=res.u_value,
                    fmt=FMT_U)
    area = w.value_row("element area A + z P [m2]", formula=f"={a}+{z}*{p}", engine=g.area,
                       fmt="0.00")
    return u, area


def _floor_u_formula(lam, b, d) -> str:
    """U of a floor of characteristic dimension B' and equivalent thickness d (EN ISO 13370
    8.2 and 8.4): 2λ/(πB' + d) ln(πB'/d + 1) for d < B', else λ/(0.457 B' + d)."""
    return (f"=IF({d}<{b},2*{lam}/(PI()*{b}+{d})*LN(PI()*{b}/{d}+1),"
            f"{lam}/(0.457*{b}+{d}))")


def _resistance_row(w, label, value, cname, crefs, constructions):
    if cname and cname in crefs and cname in constructions:
        con = constructions[cname]
        return w.value_row(f"{label} = R_T − R_si − R_se of {cname!r} [m2 K/W]",
                           formula=f"={crefs[cname].r_total}-{con.rsi!r}-{con.rse_used!r}",
                           engine=value, fmt="0.0000")
    note = f"R_T − R_si − R_se of {cname!r}" if cname else "declared"
    return w.value_row(f"{label} [m2 K/W]", value=float(value), fmt="0.0000", note=note)


def _ventilation_rows(w, room, rres) -> dict:
    vf = rres.ventilation
    v = room.ventilation
    vol = w.value_row("V internal air volume [m3]", value=float(room.volume), fmt="0.00")
    if vf.basis == "air_change":
        nv = w.value_row("n_vent ventilation air change [1/h]", value=float(v.ventilation_rate),
                         fmt="0.000")
        ni = w.value_row("n_inf infiltration air change [1/h]", value=float(v.infiltration),
                         fmt="0.000")
        vv = w.value_row("V_vent = n_vent V [m3/h]", formula=f"={nv}*{vol}",
                         engine=vf.ventilation_flow, fmt="0.000")
        vi = w.value_row("V_inf = n_inf V [m3/h]", formula=f"={ni}*{vol}",
                         engine=vf.infiltration_flow, fmt="0.000")
    else:
        vv = w.value_row("V_vent design ventilation flow [m3/h]", value=float(v.ventilation_rate),
                         fmt="0.000")
        vi = w.value_row("V_inf infiltration flow [m3/h]", value=float(v.infiltration),
                         fmt="0.000")
    eta = w.value_row("η heat-recovery efficiency on V_vent [-]", value=float(v.heat_recovery),
                      fmt="0.000")
    nmin = w.value_row("n_min minimum air change [1/h]", value=float(v.minimum_air_change),
                       fmt="0.000")
    vmin = w.value_row("V_min = n_min V [m3/h]", formula=f"={nmin}*{vol}",
                       engine=vf.minimum_flow, fmt="0.000")
    top = w.value_row("top-up to the minimum, without recovery, MAX(0, V_min − V_vent − V_inf) "
                      "[m3/h]", formula=f"=MAX(0,{vmin}-{vv}-{vi})", engine=vf.top_up_flow,
                      fmt="0.000")
    eff = w.value_row("V_eff = V_inf + V_vent (1 − η) + top-up [m3/h]",
                      formula=f"={vi}+{vv}*(1-{eta})+{top}", engine=vf.effective_flow,
                      fmt="0.000")
    rho = w.value_row("ρ air density [kg/m3]", value=float(AIR_DENSITY), fmt="0.00000",
                      note="dry air as an ideal gas at 20 degC and 101325 Pa (M = 28.966 g/mol)")
    cp = w.value_row("c_p air specific heat [J/(kg K)]", value=float(AIR_SPECIFIC_HEAT),
                     fmt="0.0", note="dry air near 20 degC, 1.006 kJ/(kg K) [M]")
    c = w.value_row("ρ c_p / 3600 [W h/(m3 K)]", formula=f"={rho}*{cp}/3600",
                    engine=vf.volumetric_heat_capacity, fmt="0.000000")
    h = w.value_row("H_V = ρ c_p V_eff / 3600 [W/K]", formula=f"={rho}*{cp}*{eff}/3600",
                    engine=vf.coefficient, fmt=FMT_H,
                    note="equals ρ c_p V/3600 (1 − η) on the recovered flow")
    return {"flow": eff, "c": c, "h": h}


# --------------------------------------------------------------------------- building sheet
def _building_sheet(plan, bi, result, rooms_out, room_sheet, counters, tolerance,
                    project_name) -> dict:
    widths = [5, 40, 24, 10, 11, 11, 11, 11, 12, 12, 10, 10, 10, 10, 10, 10, 10, 10, 60]
    sheet = add_calculation_sheet(plan, BUILDING_SHEET, widths,
                                  f"{project_name} | building heat loss")
    w = CheckRows(sheet, f"${_B_TOL[0]}${_B_TOL[1:]}", HEATLOSS_ROWS)
    b = bi.building
    w.put(1, f"Building {b.name}: heat loss, design heat load and annual energy",
          style="hl title")
    sheet.merges.append("A1:S1")
    w.row = 2
    w.put(1, "The building loses the sum over its rooms less the heat its rooms exchange with "
             "each other. Sand cells are inputs; room values are live references.", role="note")
    header = (
        (_B_TE, "Design external temperature θ_e [degC]", float(bi.temp_outside),
         FMT_T),
        (_B_DD, "Heating degree-days DD [K day]",
         None if bi.degree_days is None else float(bi.degree_days), "0"),
        (_B_BASE, "Base temperature of the degree-days [degC]",
         None if bi.degree_day_base is None else float(bi.degree_day_base), FMT_T),
        (_B_TOL, "Check tolerance, relative [-]", float(tolerance), FMT_SMALL),
        (_B_FG1, "f_g1 ground factor [-]", float(bi.f_g1), "0.00"),
        (_B_GW, f"G_w groundwater factor ({bi.groundwater}) [-]", float(bi.groundwater_factor),
         "0.00"),
        (_B_TME, "θ_m,e annual mean external temperature [degC]",
         None if bi.annual_mean_external_temperature is None else
         float(bi.annual_mean_external_temperature), FMT_T),
    )
    for a1, label, value, fmt in header:
        row = int(a1[1:])
        w.put(2, label, row=row)
        w.put(3, value, role="input", fmt=fmt, row=row)
    w.row = HEADER_ROWS

    # ---- rooms ---------------------------------------------------------------------------
    w.start("rooms", "Rooms (live references to the room sheets)")
    heads = ["No.", "Room", "Sheet", "θ_int [degC]", "H_T [W/K]", "H_int [W/K]", "H_V [W/K]",
             "Φ_int = H_int (θ_int − θ_e) [W]", "Φ_HL [W]", "Engine Φ_int [W]", "Check Φ_int",
             "Check cells", "Checks OK"]
    for j, h in enumerate(heads, 1):
        w.put(j, h, role="header")
    sheet.row_heights[w.row] = 40.0
    w.row += 1
    first = w.row
    for i, (room, rres) in enumerate(zip(b.rooms, result.rooms, strict=True), 1):
        ref = rooms_out[room.name]
        r = w.row
        w.put(1, i)
        w.put(2, room.name, style="hl text")
        w.put(3, room_sheet[room.name], style="hl text")
        w.put(4, formula=f"={ref['temp']}", fmt=FMT_T)
        w.put(5, formula=f"={ref['transmission']}", fmt=FMT_H)
        w.put(6, formula=f"={ref['internal']}", fmt=FMT_H)
        w.put(7, formula=f"={ref['ventilation']}", fmt=FMT_H)
        q_int = w.put(8, formula=f"=F{r}*(D{r}-{_B_TE})", fmt=FMT_W)
        w.put(9, formula=f"={ref['load']}", fmt=FMT_W)
        engine_q = math.fsum(ln.heat_loss for ln in rres.lines if ln.internal)
        w.check(11, q_int, w.put(10, float(engine_q), role="engine", fmt=FMT_W))
        w.put(12, formula=f"={ref['count']}", fmt="0")
        w.put(13, formula=f"={ref['ok']}", fmt="0")
        w.row += 1
    last = w.row - 1
    w.start("building", "Building coefficients and design heat load")
    w.value_row("Σ H_T of the rooms [W/K]", formula=f"=SUM(E{first}:E{last})",
                engine=result.rooms_transmission_coefficient)
    w.value_row("Σ H_int, exchange between rooms of this building [W/K]",
                formula=f"=SUM(F{first}:F{last})", engine=result.internal_exchange_coefficient)
    h_t = w.value_row("H_T building = Σ H_T − Σ H_int [W/K]",
                      formula=f"=SUM(E{first}:E{last})-SUM(F{first}:F{last})",
                      engine=result.transmission_coefficient)
    h_v = w.value_row("H_V building = Σ H_V [W/K]", formula=f"=SUM(G{first}:G{last})",
                      engine=result.ventilation_coefficient,
                      note="no infiltration diversity applied")
    h = w.value_row("H = H_T + H_V [W/K]", formula=f"={h_t}+{h_v}",
                    engine=result.heat_loss_coefficient)
    w.value_row("Σ Φ_HL of the rooms [W]", formula=f"=SUM(I{first}:I{last})",
                engine=result.rooms_design_heat_load, fmt=FMT_W)
    w.value_row("Σ Φ_int, net exchange between rooms [W]", formula=f"=SUM(H{first}:H{last})",
                engine=result.internal_exchange_heat_loss, fmt=FMT_W)
    load = w.value_row("Φ_HL building = Σ Φ_HL − Σ Φ_int [W]",
                       formula=f"=SUM(I{first}:I{last})-SUM(H{first}:H{last})",
                       engine=result.design_heat_load, fmt=FMT_W,
                       note="design heat load of the building")
    w.put(2, _cautions.CAUTIONS.get("plant_sizing", _cautions.CAUTIONS["general"]),
          style="hl warning")
    sheet.merges.append(f"B{w.row}:S{w.row}")
    sheet.row_heights[w.row] = 27.0
    w.row += 1

    # ---- by element type -----------------------------------------------------------------
    w.start("by_kind", "Heat loss by element type (exchange between rooms left out)")
    for j, hname in ((2, "Element type"), (7, "Φ [W]"), (12, "Engine Φ [W]"), (13, "Check"),
                     (14, "Share [-]")):
        w.put(j, hname, role="header")
    w.row += 1
    k_first = w.row
    for kind, engine_q in result.by_kind.items():
        r = w.row
        w.put(2, kind, style="hl text")
        terms = []
        for room in b.rooms:
            ref = rooms_out[room.name]
            t0, t1 = ref["table"]
            s = ref["sheet"]
            c = sheet_ref(s, f"C{t0}:C{t1}")
            n = sheet_ref(s, f"N{t0}:N{t1}")
            internal = sheet_ref(s, f"R{t0}:R{t1}")
            terms.append(f'SUMPRODUCT(({c}="{kind}")*(1-{internal}),{n})')
        q = w.put(7, formula="=" + "+".join(terms), fmt=FMT_W)
        w.check(13, q, w.put(12, float(engine_q), role="engine", fmt=FMT_W))
        w.put(14, formula=f"={q}/{load}", fmt=FMT_SHARE)
        w.row += 1
    k_last = w.row - 1
    chart_row = w.row + 1
    w.row += 19

    # ---- annual energy -------------------------------------------------------------------
    w.start("energy", "Annual heating energy from degree-days")
    energy_ref = ""
    room_energy = {}
    ann = bi.annual_energy()
    if ann is None:
        w.put(2, "no degree-days given ([building] degree_days and degree_day_base): annual "
                 "energy not computed", role="note")
        w.row += 1
    else:
        w.value_row("base temperature of the degree-days, as stated [degC]",
                    formula=f"={_B_BASE}", fmt=FMT_T,
                    note="the degree-days must be on the base appropriate to the building")
        energy_ref = w.value_row("Q building = 24 H DD / 1000 [kWh]",
                                 formula=f"=24*{h}*{_B_DD}/1000", engine=ann.energy,
                                 fmt="0", note="heating-up allowance not included; gains not "
                                               "deducted (allow for them through the base)")
        per_room = bi.room_annual_energy()
        for room in b.rooms:
            ref = rooms_out[room.name]
            room_energy[room.name] = w.value_row(
                f"Q room {room.name} = 24 (H_T + H_V) DD / 1000 [kWh]",
                formula=f"=24*({ref['transmission']}+{ref['ventilation']})*{_B_DD}/1000",
                engine=per_room[room.name].energy, fmt="0",
                note="exchange with other rooms included, as the room sees it")
        for text in ann.provenance:
            w.put(2, text, role="note")
            w.row += 1
    for text in result.provenance:
        w.put(2, text, role="note")
        w.row += 1
    last_row = w.row

    # ---- totals of all heat-loss sheets -----------------------------------------------
    w.row += 1
    w.block = sheet.block("all_checks")
    w.put(2, "Check cells on all heat-loss sheets (rooms and building)")
    own_count, own_ok = "J4", "J5"
    all_count = w.put(7, formula="=" + "+".join([c for c, _o, _n in counters] + [own_count]),
                      fmt="0")
    w.row += 1
    w.put(2, "of which say OK")
    all_ok = w.put(7, formula="=" + "+".join([o for _c, o, _n in counters] + [own_ok]),
                   fmt="0")
    count, ok = _counters(w, last_row, "KM")
    assert (count, ok) == (own_count, own_ok)

    sheet.charts.append(Chart(
        "bar", "Design heat loss by element type", f"B{chart_row}",
        (ChartSeries("Φ [W]", sheet_ref(BUILDING_SHEET, f"G{k_first}:G{k_last}"),
                     sheet_ref(BUILDING_SHEET, f"B{k_first}:B{k_last}"), color="2E5A6B"),),
        x_title="element type", y_title="heat loss at θ_e [W]", width_cm=20.0, height_cm=8.0,
        y_format="0"))
    total = w.checks + sum(n for _c, _o, n in counters)
    s = BUILDING_SHEET
    for name, ref in room_energy.items():
        rooms_out[name]["energy"] = sheet_ref(s, ref)
    return {"transmission": sheet_ref(s, h_t), "ventilation": sheet_ref(s, h_v),
            "coefficient": sheet_ref(s, h), "load": sheet_ref(s, load),
            "energy": sheet_ref(s, energy_ref) if energy_ref else "",
            "all_count": sheet_ref(s, all_count), "all_ok": sheet_ref(s, all_ok),
            "check_total": total, "by_kind": (k_first, k_last)}


# --------------------------------------------------------------------------- helpers
def _room_sheet_names(names, used) -> list[str]:
    out = [safe_sheet_name(f"Room {i} {name}", used, reserved=(BUILDING_SHEET,))
           for i, name in enumerate(names, 1)]
    return out


def add_sheets(plan: WorkbookPlan, project, audit) -> None:
    """Add the heat-loss sheets to the audit (hook of :mod:`heatledger.families`).

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook plan to extend. [-]
    project : heatledger.project.Project
        A parsed project with rooms. [-]
    audit : heatledger.sheet.audit.AuditContext
        Shared state of the audit: the construction sheets' cells; gains the heat-loss
        check counts. [-]
    """
    hl = add_heatloss_sheets(plan, project.building, project_name=audit.title,
                             tolerance=audit.tolerance,
                             construction_refs=dict(audit.construction_refs))
    plan.index["heat loss"] = hl
    audit.counts.append({"count": hl.check_count, "ok": hl.checks_ok})
    audit.check_lists.append("Heat loss building (rooms)")


def topics(project) -> tuple:
    """Methods and cautions the cover lists when the project has rooms.

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

    return HEATLOSS_METHODS, cautions.caution_lines("plant_sizing")
