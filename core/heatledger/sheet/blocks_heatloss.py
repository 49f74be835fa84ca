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
EN 12831-1:2017, clause 6 (recalled); EN ISO 10077-1:2017, clause 6 (recalled); EN ISO 13370:2017,
clauses 8.2 to 8.4 and Annex B (recalled).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from types import SimpleNamespace

from .. import cautions as _cautions
from ..heatloss import AdjacentRoom, Ground, Outside, Unheated
from ..heatloss.results import GroundFloorU
from ..windows import DeclaredWindow, WindowResult
from .blocks_construction import DEFAULT_CHECK_TOLERANCE, add_calculation_sheet
from .heatloss_building import (  # noqa: F401
    _building_sheet,
)
from .heatloss_layout import (  # noqa: F401
    _B_BASE,
    _B_DD,
    _B_FG1,
    _B_GW,
    _B_TE,
    _B_TME,
    _B_TOL,
    BUILDING_SHEET,
    FMT_H,
    FMT_SHARE,
    FMT_SMALL,
    FMT_T,
    FMT_U,
    FMT_W,
    HEADER_ROWS,
    HEATLOSS_ROWS,
    NOTE_STYLE,
    TABLE_COLUMNS,
    _counters,
)
from .heatloss_rows import (  # noqa: F401
    _floor_u_formula,
    _ground_rows,
    _resistance_row,
    _ventilation_rows,
    _window_rows,
)
from .plan import WorkbookPlan, safe_sheet_name, sheet_ref
from .rows import CheckRows

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
    "edge (recalled)",
    "Ground floors: EN ISO 13370:2017 clause 8.2 (slab on ground, both regimes; Annex B edge "
    "insulation), 8.3 (suspended floor), 8.4 (heated basement) (recalled)",
    "Annual heating energy: degree-day method Q = 24 H DD / 1000, base temperature stated",
)


#: Header cells (column C) of a room sheet and of the building sheet.
_TI, _TE, _DT, _TOL = "C4", "C5", "C6", "C7"
# building sheet header cells


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
    st = SimpleNamespace(
        plan=plan, sname=sname, room=room, rres=rres, building=building, bi=bi, bref=bref,
        room_sheet=room_sheet, crefs=crefs, project_name=project_name)
    _room_setup(st)
    _room_elements(st)
    return _room_totals(st)


def _psi_cell(plan, item, linear) -> dict:
    """The transmittance cell of a bridge: a live reference to the junction sheet's psi
    when the bridge names a junction, else the declared value as an input."""
    cells = plan.index.get(("junction", getattr(item, "junction", ""))) if linear else None
    if cells:
        return {"formula": f"={cells['psi']}"}
    return {"value": float(item.psi if linear else item.chi), "role": "input"}


def _room_setup(st) -> None:
    """The sheet, its header and its inputs."""
    bref = st.bref
    building = st.building
    crefs = st.crefs
    plan = st.plan
    project_name = st.project_name
    room = st.room
    rres = st.rres
    sname = st.sname
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
    st.area_refs = area_refs
    st.u_refs = u_refs
    st.vent = vent
    st.w = w


def _room_elements(st) -> None:
    """One row per element and thermal bridge: U, factor, H and share with their checks."""
    _elem_setup(st)
    _elem_element_table(st)
    _elem_ventilation_row(st)
    _elem_reheat_row(st)


def _elem_setup(st) -> None:
    """The inputs and first rows of this part of the sheet."""
    area_refs = st.area_refs
    bref = st.bref
    building = st.building
    crefs = st.crefs
    room = st.room
    room_sheet = st.room_sheet
    rres = st.rres
    u_refs = st.u_refs
    vent = st.vent
    w = st.w
    st.area_refs = area_refs
    st.bref = bref
    st.building = building
    st.crefs = crefs
    st.room = room
    st.room_sheet = room_sheet
    st.rres = rres
    st.u_refs = u_refs
    st.vent = vent
    st.w = w


def _elem_element_table(st) -> None:
    """One row per element and thermal bridge with U, factor, H and share."""
    area_refs = st.area_refs
    bref = st.bref
    building = st.building
    crefs = st.crefs
    room = st.room
    room_sheet = st.room_sheet
    rres = st.rres
    u_refs = st.u_refs
    w = st.w
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
            w.put(7, **_psi_cell(st.plan, item, linear), fmt=FMT_U)
            h_formula = f"=E{r}*G{r}*J{r}"
        _factor_cells(w, r, item.boundary, room_sheet, bref)
        h = w.put(11, formula=h_formula, fmt=FMT_H)
        w.check(13, h, w.put(12, float(line.coefficient), role="engine", fmt=FMT_H))
        w.put(14, formula=f"=K{r}*{_DT}", fmt=FMT_W)
        _share_cells(w, r, total_ref, line)
        w.put(18, 1 if line.internal else 0, role="engine", fmt="0")
        w.put(19, f"{line.factor_rule}; U from {line.source}", role="note", style=NOTE_STYLE)
    st.first = first
    st.last_trans = last_trans
    st.n_trans = n_trans
    st.reheat_row = reheat_row
    st.total_ref = total_ref
    st.vent_row = vent_row


def _elem_ventilation_row(st) -> None:
    """The ventilation row of the room."""
    n_trans = st.n_trans
    rres = st.rres
    total_ref = st.total_ref
    vent = st.vent
    vent_row = st.vent_row
    w = st.w
    # ---- ventilation row -----------------------------------------------------------------
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
    st.rline = rline


def _elem_reheat_row(st) -> None:
    """The heating-up row of the room."""
    first = st.first
    last_trans = st.last_trans
    n_trans = st.n_trans
    reheat_row = st.reheat_row
    rline = st.rline
    room = st.room
    total_ref = st.total_ref
    vent_row = st.vent_row
    w = st.w
    # ---- reheat row ----------------------------------------------------------------------
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
    st.first = first
    st.last_trans = last_trans
    st.n_trans = n_trans
    st.reheat_row = reheat_row
    st.total_ref = total_ref
    st.vent_row = vent_row


def _room_totals(st) -> object:
    """Totals of the room: H_T, ventilation, reheat and the design heat load."""
    first = st.first
    last_trans = st.last_trans
    n_trans = st.n_trans
    reheat_row = st.reheat_row
    rres = st.rres
    sname = st.sname
    total_ref = st.total_ref
    vent_row = st.vent_row
    w = st.w
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
    from .audit import Answer

    for name, cells in hl.rooms.items():
        audit.answers.append(Answer(f"Room {name}", "design heat load [W] (EN 12831-1)",
                                    f"={cells['load']}", "#,##0"))
    audit.answers.append(Answer("Building", "design heat load [W] (EN 12831-1)",
                                f"={hl.building['load']}", "#,##0"))
    if hl.building.get("energy"):
        audit.answers.append(Answer("Building", "annual heating energy [kWh]",
                                    f"={hl.building['energy']}", "#,##0"))
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
