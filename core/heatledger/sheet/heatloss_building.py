"""The building sheet of the heat loss: the rooms summed, degree-day energy and the chart.
"""

from __future__ import annotations

import math
from types import SimpleNamespace

from .. import cautions as _cautions
from .blocks_construction import add_calculation_sheet
from .heatloss_layout import (
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
    FMT_W,
    HEADER_ROWS,
    HEATLOSS_ROWS,
    _counters,
)
from .plan import Chart, ChartSeries, sheet_ref
from .rows import CheckRows

__all__ = []



# --------------------------------------------------------------------------- building sheet
def _building_sheet(plan, bi, result, rooms_out, room_sheet, counters, tolerance,
                    project_name) -> dict:
    st = SimpleNamespace(
        plan=plan, bi=bi, result=result, rooms_out=rooms_out, room_sheet=room_sheet,
        counters=counters, tolerance=tolerance, project_name=project_name)
    _building_setup(st)
    _building_rooms(st)
    _building_by_kind(st)
    _building_energy(st)
    return _building_totals(st)


def _building_setup(st) -> None:
    """The sheet, its header and its inputs."""
    bi = st.bi
    plan = st.plan
    project_name = st.project_name
    tolerance = st.tolerance
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
         None if bi.temp_outside_annual_mean is None else
         float(bi.temp_outside_annual_mean), FMT_T),
    )
    for a1, label, value, fmt in header:
        row = int(a1[1:])
        w.put(2, label, row=row)
        w.put(3, value, role="input", fmt=fmt, row=row)
    w.row = HEADER_ROWS
    st.b = b
    st.sheet = sheet
    st.w = w


def _building_rooms(st) -> None:
    """One row per room: coefficients, loads and shares, linked to the room sheets."""
    b = st.b
    result = st.result
    room_sheet = st.room_sheet
    rooms_out = st.rooms_out
    sheet = st.sheet
    w = st.w
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
    st.h = h
    st.h_t = h_t
    st.h_v = h_v
    st.load = load


def _building_by_kind(st) -> None:
    """Heat loss by element kind, for the chart."""
    b = st.b
    load = st.load
    result = st.result
    rooms_out = st.rooms_out
    w = st.w
    # ---- by element type -----------------------------------------------------------------
    w.start("by_kind", "Heat loss by element type (exchange between rooms left out)")
    for j, hname in ((2, "Element type"), (7, "Φ [W]"), (12, "Engine Φ [W]"), (13, "Check"),
                     (14, "Share [-]")):
        w.put(j, hname, role="header")
    w.row += 1
    k_first = w.row
    for kind, engine_q in result.by_kind.items():
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
    st.c = c
    st.chart_row = chart_row
    st.k_first = k_first
    st.k_last = k_last
    st.n = n


def _building_energy(st) -> None:
    """Annual energy by the degree-day method."""
    b = st.b
    bi = st.bi
    h = st.h
    result = st.result
    rooms_out = st.rooms_out
    w = st.w
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
    st.energy_ref = energy_ref
    st.last_row = last_row
    st.room_energy = room_energy


def _building_totals(st) -> object:
    """Check counts of all heat-loss sheets; return the sheet's references."""
    chart_row = st.chart_row
    counters = st.counters
    energy_ref = st.energy_ref
    h = st.h
    h_t = st.h_t
    h_v = st.h_v
    k_first = st.k_first
    k_last = st.k_last
    last_row = st.last_row
    load = st.load
    room_energy = st.room_energy
    rooms_out = st.rooms_out
    sheet = st.sheet
    w = st.w
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
