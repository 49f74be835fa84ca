"""Heat-loss spreadsheet functions (heatledger_xl.udfs_heatloss): registry conventions, values
against the standards' equations written out here and published worked values, bad input
named, and a hypothesis proof that no function raises.

Rooms and element ranges are invented scenarios of our own.
"""

from __future__ import annotations

import datetime as dt
import math
import re

import CoolProp.CoolProp as CP
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from heatledger_xl import udfs
from heatledger_xl.cells import ERROR_VALUES
from heatledger_xl.registry import MAX_DESCRIPTION, PREFIX, REGISTRY
from tests.addin._addin_helpers import call_with_drawn, check_bad_optional_named, check_result
from tests.tolerances import ATOL_PRINTED_2DP, RTOL_ROUND_OFF

OURS = sorted(n for n, s in REGISTRY.items() if s.family == "heat loss")
DEADLINE_MS = 1000  # the add-in's rule: every bad input answers within a second
rtol_same = RTOL_ROUND_OFF  # tests/tolerances.py


def test_heat_loss_functions_are_registered_and_exported():
    assert set(OURS) == {"HL_WINDOW_UVALUE", "HL_SLAB_UVALUE", "HL_SUSPENDED_FLOOR_UVALUE",
                         "HL_BASEMENT_UVALUE",
                         "HL_SOIL_CONDUCTIVITY", "HL_VENTILATION_HV", "HL_ROOM_HT",
                         "HL_ROOM_LOAD", "HL_ROOM_SHARES", "HL_ANNUAL_ENERGY"}
    assert set(OURS) <= set(udfs.__all__)
    for name in OURS:
        spec = REGISTRY[name]
        assert name.startswith(PREFIX) and name == name.upper()
        assert 20 <= len(spec.description) <= MAX_DESCRIPTION
        assert re.search(r"\[[^\]]+\]$", spec.description), name
        flags = [a.optional for a in spec.args]
        assert flags == sorted(flags), name
        for a in spec.args:
            assert 10 <= len(a.doc) <= MAX_DESCRIPTION and re.search(r"\[[^\]]+\]$", a.doc)


# --------------------------------------------------------------------------- values
def test_window_u_is_the_iso_10077_1_equation():
    # source: EN ISO 10077-1:2017 clause 6, U_w = (A_g U_g + A_f U_f + l_g psi_g)/(A_g + A_f)
    # [from memory; source: iso10077-1], evaluated by hand
    assert udfs.HL_WINDOW_UVALUE(1.2, 0.4, 1.1, 1.4, 4.6, 0.08) == pytest.approx(
        (1.2 * 1.1 + 0.4 * 1.4 + 4.6 * 0.08) / 1.6, rel=rtol_same)
    with_panel = udfs.HL_WINDOW_UVALUE(0.5, 0.4, 1.2, 1.8, 3.0, 0.06, 1.1, 0.9, 4.4, 0.02, 2.0)
    assert with_panel == pytest.approx(
        (0.5 * 1.2 + 0.4 * 1.8 + 3.0 * 0.06 + 1.1 * 0.9 + 4.4 * 0.02) / 2.0, rel=rtol_same)


def test_slab_on_ground_worked_values():
    # source: EN ISO 13370:2017 8.2 check values 10 m x 10 m, w 0.3 m, lambda 2.0: R_f = 0
    # gives 0.762 and R_f = 3.0 gives 0.222 W/(m2 K) [from memory; source: iso13370-slab]
    atol_U = 5e-4  # values printed to three decimals
    assert udfs.HL_SLAB_UVALUE(100, 40, 300, 0.0) == pytest.approx(0.762, abs=atol_U)
    assert udfs.HL_SLAB_UVALUE(100, 40, 300, 3.0, 2.0) == pytest.approx(0.222, abs=atol_U)


def test_slab_edge_insulation_is_annex_b():
    lam, b, w, rf = 2.0, 5.0, 0.3, 0.0
    dt_ = w + lam * (0.17 + rf + 0.04)
    u0 = 2 * lam / (math.pi * b + dt_) * math.log(math.pi * b / dt_ + 1)
    d_extra = (2.0 - 0.06 / lam) * lam
    # source: EN ISO 13370:2017 Annex B, psi_ge for vertical insulation of depth D [from memory]
    psi = -(lam / math.pi) * (math.log(2 * 0.6 / dt_ + 1) - math.log(2 * 0.6 / (dt_ + d_extra)
                                                                    + 1))
    got = udfs.HL_SLAB_UVALUE(100, 40, 300, 0.0, None, "vertical", 0.6, 2.0, 60)
    assert got == pytest.approx(u0 + 2 * psi / b, rel=rtol_same)
    assert got < u0


def test_suspended_floor_and_basement_are_the_clause_8_equations():
    lam, a, p, w = 2.0, 100.0, 40.0, 0.3
    b = a / (0.5 * p)
    # source: EN ISO 13370:2017 8.3 [from memory; source: iso13370-slab]
    uf = 1 / (0.17 + 2.5 + 0.17)
    dg = w + lam * (0.17 + 0.0 + 0.04)
    ug = 2 * lam / (math.pi * b + dg) * math.log(math.pi * b / dg + 1)
    ux = 2 * 0.3 * 1.5 / b + 1450 * 0.003 * 4.0 * 0.05 / b
    assert udfs.HL_SUSPENDED_FLOOR_UVALUE(a, p, 300, 2.5, 0.3, 1.5, 0.003, 4.0, "average") == \
        pytest.approx(1 / (1 / uf + 1 / (ug + ux)), rel=rtol_same)
    # source: EN ISO 13370:2017 8.4 [from memory; source: iso13370-slab]
    z, rfl, rw = 2.0, 0.5, 1.0
    dt_ = w + lam * (0.17 + rfl + 0.04)
    de = dt_ + z / 2
    ubf = (2 * lam / (math.pi * b + de) * math.log(math.pi * b / de + 1) if de < b
           else lam / (0.457 * b + de))
    dw = lam * (0.13 + rw + 0.04)
    ds = dt_ if dw >= dt_ else dw
    ubw = 2 * lam / (math.pi * z) * (1 + 0.5 * ds / (ds + z)) * math.log(z / dw + 1)
    assert udfs.HL_BASEMENT_UVALUE(a, p, 300, rfl, rw, z) == pytest.approx(
        (a * ubf + z * p * ubw) / (a + z * p), rel=rtol_same)


@pytest.mark.parametrize(("soil", "lam"), [("clay", 1.5), ("silt", 1.5), ("sand", 2.0),
                                           ("gravel", 2.0), ("rock", 3.5), ("CLAY", 1.5)])
def test_soil_conductivity_is_table_7(soil, lam):
    # source: EN ISO 13370:2017, Table 7 (categories 1, 2, 3) [source: iso13370-slab, Table 7]
    assert udfs.HL_SOIL_CONDUCTIVITY(soil) == lam


def test_ventilation_coefficient_against_coolprop_air():
    # source: CoolProp density and c_p of air at 293.15 K, 101325 Pa
    rho = CP.PropsSI("D", "T", 293.15, "P", 101325.0, "Air")
    cp = CP.PropsSI("C", "T", 293.15, "P", 101325.0, "Air")
    rtol_props = 3e-3  # ideal dry air and a handbook c_p against a real-gas equation of state
    assert udfs.HL_VENTILATION_HV(250.0, 0.6) == pytest.approx(
        rho * cp * 250.0 / 3600 * (1 - 0.6), rel=rtol_props)
    # source: EN 12831-1 conventional 0.34 W h/(m3 K) [from memory; source: en12831-1]
    assert udfs.HL_VENTILATION_HV(1.0) == pytest.approx(0.34, abs=ATOL_PRINTED_2DP)


def test_room_load_and_transmission_by_hand():
    table = [["kind", "quantity", "U, psi, chi", "temperature", "b", "dU_TB"],
             ["wall", 20.0, 0.2, None, None, 0.05],
             ["window", 4.0, 1.3],
             ["wall", 10.0, 0.5, 16.0],          # neighbour at 16 degC
             ["floor", 40.0, 0.15, None, 0.45],  # ground factor given as b
             ["linear", 18.0, 0.1],
             ["point", 4, 0.25],
             [None, None, None]]                 # blank rows below end the range
    ti, te = 21.0, -8.0
    # source: EN 12831-1:2017 clause 6, H_T = sum A (U + dU) f + sum psi l f + sum chi f,
    # f_ij = (theta_int - theta_adj)/(theta_int - theta_e) [from memory; source: en12831-1]
    h_t = (20 * 0.25 + 4 * 1.3 + 10 * 0.5 * (ti - 16.0) / (ti - te) + 40 * 0.15 * 0.45
           + 18 * 0.1 + 4 * 0.25)
    assert udfs.HL_ROOM_HT(table, ti, te) == pytest.approx(h_t, rel=rtol_same)
    h_v = udfs.HL_VENTILATION_HV(90.0)
    load = udfs.HL_ROOM_LOAD(table, ti, te, None, None, h_v, 150.0)
    assert load == pytest.approx((h_t + h_v) * (ti - te) + 150.0, rel=rtol_same)
    # an element below a blank row is not dropped from the load (it would undersize the
    # heating): the range is rejected, naming the rows
    out = udfs.HL_ROOM_LOAD(table + [["wall", 9.0, 0.3]], ti, te)
    assert "elements row 7 is blank but row 8 below it is filled" in out, out


def test_shares_spill_adds_up_to_the_load():
    table = [["wall", 20.0, 0.2], ["window", 4.0, 1.3], ["linear", 10.0, 0.05]]
    out = udfs.HL_ROOM_SHARES(table, 20.0, -5.0, None, None, 30.0, 200.0, True)
    assert out[0][0] == "line" and [r[1] for r in out[1:]] == [
        "wall", "window", "linear bridge", "ventilation", "reheat"]
    load = udfs.HL_ROOM_LOAD(table, 20.0, -5.0, None, None, 30.0, 200.0)
    assert sum(r[3] for r in out[1:]) == pytest.approx(load, rel=rtol_same)
    assert sum(r[4] for r in out[1:]) == pytest.approx(1.0, rel=rtol_same)
    # source: EN 12831-1 clause 6 [from memory]: the wall's share is A U dT / Phi_HL
    assert out[1][4] == pytest.approx(20 * 0.2 * 25 / load, rel=rtol_same)


def test_ground_rows_use_the_ground_factors():
    u_floor = udfs.HL_SLAB_UVALUE(100, 40, 300, 2.0, 1.5)
    table = [["floor", 100.0, u_floor, "ground"]]
    # source: EN 12831-1:2017 clause 6, H_T,ig = f_g1 f_g2 A U_equiv G_w with f_g1 = 1.45,
    # f_g2 = (theta_int - theta_m,e)/(theta_int - theta_e), G_w 1.15 shallow [from memory;
    # source: en12831-1]
    f = 1.45 * (20.0 - 9.0) / (20.0 - (-12.0)) * 1.15
    assert udfs.HL_ROOM_HT(table, 20.0, -12.0, 9.0, "shallow") == pytest.approx(
        100 * u_floor * f, rel=rtol_same)
    out = udfs.HL_ROOM_HT(table, 20.0, -12.0)
    assert isinstance(out, str) and "temp_outside_annual_mean" in out


def test_a_room_facing_only_its_own_temperature_loses_nothing():
    # common practice, no published source: no temperature difference, no heat flow
    assert udfs.HL_ROOM_LOAD([["wall", 30.0, 0.5, 20.0]], 20.0, -5.0) == 0.0


def test_annual_energy_is_the_degree_day_equation():
    # source: degree-day method Q = 24 H DD / 1000 [from memory; source: en12831-1]
    assert udfs.HL_ANNUAL_ENERGY(120.0, 2900.0) == pytest.approx(
        24 * 120.0 * 2900.0 / 1000, rel=rtol_same)
    # the base temperature lies in the degree-days; no argument that changes nothing
    assert "degree_day_base" not in [a.name for a in REGISTRY["HL_ANNUAL_ENERGY"].args]


@pytest.mark.parametrize(("call", "fragment"), [
    (lambda: udfs.HL_WINDOW_UVALUE(1.0, 2.5, 1.1, 1.4, 4.0, 0.08, None, None, None, None, 3.0),
     "frame_area"),
    (lambda: udfs.HL_WINDOW_UVALUE(1.0, 0.4, 1.1, 1.4, 1.0, 0.08), "glazing_perimeter"),
    (lambda: udfs.HL_WINDOW_UVALUE(-1.0, 0.4, 1.1, 1.4, 4.0, 0.08), "glazing_area"),
    (lambda: udfs.HL_SLAB_UVALUE(100, 10, 300, 0.0), "exposed_perimeter"),
    (lambda: udfs.HL_SLAB_UVALUE(100, 40, 300, 0.0, None, None, 0.6), "edge_orientation"),
    (lambda: udfs.HL_SUSPENDED_FLOOR_UVALUE(100, 40, 300, 2.5, 0.8, 1.5, 0.003, 4, "average"),
     "underfloor_height"),
    (lambda: udfs.HL_SUSPENDED_FLOOR_UVALUE(100, 40, 300, 2.5, 0.3, 1.5, 0.003, 4, "windy"),
     "wind_shielding"),
    (lambda: udfs.HL_SOIL_CONDUCTIVITY("peat"), "soil"),
    (lambda: udfs.HL_VENTILATION_HV(100, 1.5), "heat_recovery"),
    (lambda: udfs.HL_ROOM_LOAD([["wal", 1, 1]], 20, -5), "elements row 1 kind"),
    (lambda: udfs.HL_ROOM_LOAD([["wall", -1, 1]], 20, -5), "elements row 1 quantity"),
    (lambda: udfs.HL_ROOM_LOAD([["wall", 1, 1, 5, 0.5]], 20, -5), "elements row 1"),
    (lambda: udfs.HL_ROOM_LOAD([["point", 2.5, 1]], 20, -5), "whole count"),
    (lambda: udfs.HL_ROOM_LOAD([["wall", 1, 1]], 20, 25), "temp_outside"),
    (lambda: udfs.HL_ANNUAL_ENERGY(100, None), "degree_days"),
])
def test_bad_input_gives_one_line_naming_the_argument(call, fragment):
    out = call()
    assert isinstance(out, str) and out.startswith("HL_") and "\n" not in out
    assert fragment in out, out


# --------------------------------------------------------------------------- never raises
cells = st.one_of(
    st.none(), st.just(""), st.floats(allow_nan=True, allow_infinity=True),
    st.integers(min_value=-(10**400), max_value=10**400), st.booleans(), st.text(max_size=12),
    st.sampled_from(sorted(ERROR_VALUES)),
    st.sampled_from(["12.5", " 0 ", "-3", "1e999", "nan", "wall", "window", "linear", "point",
                     "clay", "average", "vertical", "horizontal", "partial", "=1+1"]),
    st.datetimes(), st.dates(),
)
element_rows = st.lists(st.lists(st.one_of(
    st.sampled_from(["wall", "roof", "floor", "window", "door", "linear", "point"]),
    st.floats(min_value=-5, max_value=200), cells), max_size=7), max_size=8)
scalars = st.one_of(cells, cells, st.lists(st.lists(cells, max_size=2), max_size=2))
PLAUSIBLE = {
    "glazing_area": st.floats(0.0, 5.0), "frame_area": st.floats(0.0, 2.0),
    "glazing_u": st.floats(0.4, 6.0), "frame_u": st.floats(0.5, 7.0),
    "glazing_perimeter": st.floats(0.0, 30.0), "psi_glazing": st.floats(-0.1, 0.2),
    "panel_area": st.one_of(st.none(), st.floats(0, 3)),
    "panel_u": st.one_of(st.none(), st.floats(0, 3)),
    "panel_perimeter": st.one_of(st.none(), st.floats(0, 10)),
    "psi_panel": st.one_of(st.none(), st.floats(-0.1, 0.2)),
    "window_area": st.one_of(st.none(), st.floats(0.1, 8)),
    "area": st.floats(0.5, 2000), "exposed_perimeter": st.floats(0.5, 400),
    "wall_thickness_mm": st.floats(0, 800), "floor_resistance": st.floats(0, 8),
    "soil_conductivity": st.one_of(st.none(), st.floats(0.5, 4)),
    "edge_orientation": st.sampled_from([None, "horizontal", "vertical"]),
    "edge_extent": st.one_of(st.none(), st.floats(0.1, 2)),
    "edge_resistance": st.one_of(st.none(), st.floats(0, 5)),
    "edge_thickness_mm": st.one_of(st.none(), st.floats(10, 200)),
    "exposed_outline": st.sampled_from([None, "rectilinear", "any", "partial"]),
    "deck_resistance": st.floats(0, 6), "underfloor_height": st.floats(0, 0.6),
    "underfloor_wall_u": st.floats(0, 3), "vent_area_per_perimeter": st.floats(0, 0.01),
    "wind_speed": st.floats(0, 10), "wind_shielding": st.sampled_from(
        ["sheltered", "average", "exposed"]),
    "ground_insulation_resistance": st.one_of(st.none(), st.floats(0, 3)),
    "wall_resistance": st.floats(0, 6), "depth": st.floats(0.1, 4),
    "soil": st.sampled_from(["clay", "silt", "sand", "gravel", "rock", "peat"]),
    "air_flow_m3_per_h": st.floats(0, 5000),
    "heat_recovery": st.one_of(st.none(), st.floats(0, 1)),
    "elements": st.lists(st.tuples(
        st.sampled_from(["wall", "roof", "floor", "window", "door", "linear", "point"]),
        st.floats(0.01, 100), st.floats(0, 5),
        st.one_of(st.none(), st.floats(-10, 30), st.just("ground")),
        st.none(), st.one_of(st.none(), st.floats(0, 0.2))).map(list), max_size=8),
    "temp_inside": st.floats(5, 30), "temp_outside": st.floats(-30, 4),
    "ventilation_coefficient": st.one_of(st.none(), st.floats(0, 500)),
    "reheat": st.one_of(st.none(), st.floats(0, 2000)),
    "heat_loss_coefficient": st.floats(0, 5000), "degree_days": st.floats(0, 6000),
    "degree_day_base": st.floats(8, 20),
    "temp_outside_annual_mean": st.one_of(st.none(), st.floats(-5, 20)),
    "groundwater": st.sampled_from([None, "deep", "shallow"]),
    "header": st.one_of(st.none(), st.booleans()),
}


@pytest.mark.parametrize("name", OURS)
@settings(max_examples=100, deadline=DEADLINE_MS,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])
@given(data=st.data())
def test_any_cell_values_give_a_result_or_a_one_line_text(name, data):
    check_result(name, call_with_drawn(name, data.draw, element_rows, scalars))


@pytest.mark.parametrize("name", OURS)
@settings(max_examples=60, deadline=DEADLINE_MS,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])
@given(data=st.data())
def test_plausible_inputs_reach_the_engine_and_never_raise(name, data):
    spec = REGISTRY[name]
    check_result(name, spec.function(*[data.draw(PLAUSIBLE[a.name]) for a in spec.args]))


@pytest.mark.parametrize("name", OURS)
@pytest.mark.parametrize("bad", ["#N/A", "nonsense", True, math.nan, dt.datetime(2026, 12, 2),
                                 [[1, 2], [3, 4]]])
def test_a_bad_optional_argument_is_named_even_with_blank_required_ones(name, bad):
    check_bad_optional_named(name, bad)


def test_huge_element_ranges_stop_at_the_row_limit():
    rows = [["wall", 1.0, 0.2]] * 10_000
    out = udfs.HL_ROOM_HT(rows, 20, -5)
    assert isinstance(out, str) and "elements" in out
    assert udfs.HL_ROOM_HT(rows[:400] + [[None] * 3] * 10_000, 20, -5) == pytest.approx(
        400 * 0.2, rel=rtol_same)


def test_a_window_of_vanishing_area_is_refused_naming_the_areas():
    # 2.2e-309 m2 of frame and no glazing: psi l / A overflowed into an unexpected problem
    out = udfs.HL_WINDOW_UVALUE(0.0, 2.225073858507203e-309, 1.0, 1.0, 4.0, 0.125)
    assert out.startswith("HL_WINDOW_UVALUE: glazing_area + frame_area + panel_area must be at "
                          "least 0.0001 m2"), out
