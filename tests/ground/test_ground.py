"""Tests of heatledger.ground (EN ISO 13370 ground floors)."""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from heatledger.errors import HeatLedgerError
from heatledger.ground import (
    EdgeInsulation,
    ground_conductivity,
    ground_heat_capacity,
    heated_basement,
    slab_on_ground,
    suspended_floor,
)
from tests._tables import read_table
from tests.tolerances import ATOL_ROUND_OFF, RTOL_LIMIT, RTOL_ROUND_OFF

atol_same_equation = ATOL_ROUND_OFF  # tests/tolerances.py
#: The check values [source: iso13370-slab] are printed to three decimals. [W/(m2 K)]
atol_printed_3dp = 0.0005

RSI, RSE = 0.17, 0.04  # source: EN ISO 13370:2017 8.2 (floor Rsi, Rse), from memory


# ----------------------------------------------------------------------------- the equations


def iso13370_slab(area, perimeter, w, rf, lam):
    """Slab-on-ground U written out from the standard, independently of the module.

    from memory: EN ISO 13370:2017 clause 8.2 [source: iso13370-slab]:
    B' = A/(0.5 P); dt = w + lam (Rsi + Rf + Rse);
    dt < B': U = 2 lam/(pi B' + dt) ln(pi B'/dt + 1); dt >= B': U = lam/(0.457 B' + dt).
    """
    b = area / (0.5 * perimeter)
    dt = w + lam * (RSI + rf + RSE)
    if dt < b:
        return 2 * lam / (math.pi * b + dt) * math.log(math.pi * b / dt + 1)
    return lam / (0.457 * b + dt)


def test_worked_value_uninsulated_10x10():
    # source: check values [source: iso13370-slab, 8.2] (from memory):
    # 10 x 10 m, w = 0.3 m, lambda = 2.0, Rf = 0 -> B' = 5, dt = 0.72, U = 0.762
    r = slab_on_ground(100.0, 40.0, 0.3, 0.0, soil_conductivity=2.0)
    assert r.characteristic_dimension == pytest.approx(5.0)
    assert r.equivalent_thickness == pytest.approx(0.72)
    assert r.regime == "dt < B'"
    recomputed = 2 * 2.0 / (math.pi * 5.0 + 0.72) * math.log(math.pi * 5.0 / 0.72 + 1)
    assert r.u_value == pytest.approx(recomputed, abs=atol_same_equation)
    assert r.u_value == pytest.approx(0.762, abs=atol_printed_3dp)


def test_worked_value_insulated_10x10():
    # source: check values [source: iso13370-slab]: with Rf = 3.0, dt = 6.72 >= B', U = 0.222 [M+V]
    r = slab_on_ground(100.0, 40.0, 0.3, 3.0)
    assert r.equivalent_thickness == pytest.approx(6.72)
    assert r.regime == "dt >= B'"
    recomputed = 2.0 / (0.457 * 5.0 + 6.72)
    assert r.u_value == pytest.approx(recomputed, abs=atol_same_equation)
    assert r.u_value == pytest.approx(0.222, abs=atol_printed_3dp)
    assert slab_on_ground(100.0, 40.0, 0.3, 3.0).u_value == r.u_value


@settings(max_examples=80, deadline=None)
@given(
    side_a=st.floats(3.0, 60.0), side_b=st.floats(3.0, 60.0), w=st.floats(0.1, 0.6),
    rf=st.floats(0.0, 8.0), lam=st.sampled_from([1.5, 2.0, 3.5]),
)
def test_slab_against_independent_equation(side_a, side_b, w, rf, lam):
    area, per = side_a * side_b, 2 * (side_a + side_b)
    got = slab_on_ground(area, per, w, rf, soil_conductivity=lam).u_value
    assert got == pytest.approx(iso13370_slab(area, per, w, rf, lam), rel=RTOL_ROUND_OFF)


def test_the_two_regimes_meet_at_dt_equal_b():
    # At dt = B' the two equations give 2 ln(pi+1)/(pi+1) = 0.6863 and 1/1.457 = 0.6863
    # times lambda/B': the 0.457 of the standard makes U continuous (check by algebra).
    rtol_constant = 2e-4  # 0.457 is printed to three figures
    assert 2 * math.log(math.pi + 1) / (math.pi + 1) == pytest.approx(1 / 1.457,
                                                                     rel=rtol_constant)
    # a floor with dt just below and just above B' = 5 m
    rf_at = (5.0 - 0.3) / 2.0 - RSI - RSE
    below = slab_on_ground(100.0, 40.0, 0.3, rf_at - 1e-9)
    above = slab_on_ground(100.0, 40.0, 0.3, rf_at + 1e-9)
    assert below.regime != above.regime
    assert below.u_value == pytest.approx(above.u_value, rel=rtol_constant)


@settings(max_examples=60, deadline=None)
@given(rf=st.floats(0.0, 6.0), extra=st.floats(0.01, 3.0), side=st.floats(4.0, 40.0))
def test_more_insulation_gives_lower_u(rf, extra, side):
    # physical monotonicity (common practice, no published source needed)
    a, p = side * side, 4 * side
    assert slab_on_ground(a, p, 0.3, rf + extra).u_value < slab_on_ground(a, p, 0.3, rf).u_value


@settings(max_examples=40, deadline=None)
@given(p_frac=st.floats(0.2, 0.95))
def test_less_exposed_perimeter_gives_lower_u(p_frac):
    full = slab_on_ground(100.0, 40.0, 0.3, 1.0).u_value
    part = slab_on_ground(100.0, 40.0 * p_frac, 0.3, 1.0, exposed_outline="partial").u_value
    assert part < full


def test_arrays_with_both_regimes():
    got = slab_on_ground(np.array([100.0, 100.0]), 40.0, 0.3, np.array([0.0, 3.0]))
    assert list(got.regime) == ["dt < B'", "dt >= B'"]
    assert got.u_value == pytest.approx([iso13370_slab(100, 40, 0.3, 0, 2.0),
                                         iso13370_slab(100, 40, 0.3, 3, 2.0)], rel=RTOL_ROUND_OFF)


# ----------------------------------------------------------------------------- soil


def test_soil_conductivity_defaults():
    # source: EN ISO 13370:2017 Table 7 [source: iso13370-slab, Table 7] (tests/data): clay
    # and silt 1.5, sand and gravel 2.0, homogeneous rock 3.5 W/(m K); heat capacities from
    # memory
    for row in read_table("iso13370_2017_table7_ground_properties"):
        assert ground_conductivity(row["soil"]) == float(row["conductivity_w_mk"])
        assert ground_conductivity(row["soil"].title()) == float(row["conductivity_w_mk"])
        assert ground_heat_capacity(row["soil"]) == float(row["heat_capacity_j_m3k"])
    with pytest.raises(HeatLedgerError, match='"clay", "silt", "sand", "gravel" or "rock"'):
        ground_conductivity("peat")


def test_default_conductivity_is_category_2():
    # source: EN ISO 13370:2017 7.x, use category 2 when unknown [source: iso13370-slab, Table 7]
    assert slab_on_ground(100, 40, 0.3, 0.0).u_value == slab_on_ground(
        100, 40, 0.3, 0.0, soil_conductivity=ground_conductivity("sand")).u_value


# ----------------------------------------------------------------------------- edge insulation


def iso13370_psi_edge(orientation, d, dt, r_n, d_n, lam):
    """from memory: EN ISO 13370 Annex B [source: iso13370-edge]: R' = Rn - dn/lam, d' = R' lam,
    horizontal psi = -(lam/pi)[ln(D/dt + 1) - ln(D/(dt + d') + 1)], vertical with 2D."""
    dprime = (r_n - d_n / lam) * lam
    x = d if orientation == "horizontal" else 2 * d
    return -(lam / math.pi) * (math.log(x / dt + 1) - math.log(x / (dt + dprime) + 1))


@pytest.mark.parametrize("orientation", ["horizontal", "vertical"])
def test_edge_insulation_against_independent_equation(orientation):
    edge = EdgeInsulation(orientation, 1.0, 2.5, 0.08)
    r = slab_on_ground(100.0, 40.0, 0.3, 0.0, edge_insulation=edge)
    psi = iso13370_psi_edge(orientation, 1.0, 0.72, 2.5, 0.08, 2.0)
    assert r.psi_edge == pytest.approx(psi, rel=RTOL_ROUND_OFF)
    assert r.psi_edge < 0
    assert r.u_value == pytest.approx(r.u_without_edge + 2 * psi / 5.0, rel=RTOL_ROUND_OFF)
    assert r.edge_extra_resistance == pytest.approx(2.5 - 0.08 / 2.0)
    assert "Annex B" in r.method and orientation in r.method


def test_vertical_depth_d_equals_horizontal_width_2d():
    # identity of the two Annex B equations (2D in the vertical form)
    h = slab_on_ground(80.0, 36.0, 0.3, 0.5,
                       edge_insulation=EdgeInsulation("horizontal", 1.2, 1.5, 0.05))
    v = slab_on_ground(80.0, 36.0, 0.3, 0.5,
                       edge_insulation=EdgeInsulation("vertical", 0.6, 1.5, 0.05))
    assert h.psi_edge == pytest.approx(v.psi_edge, rel=RTOL_ROUND_OFF)


def test_edge_insulation_no_better_than_ground_has_no_effect_or_is_rejected():
    lam = 2.0
    same = EdgeInsulation("horizontal", 1.0, 0.05 / lam, 0.05)  # R' = 0
    assert slab_on_ground(100, 40, 0.3, 0, edge_insulation=same).psi_edge == pytest.approx(0)
    worse = EdgeInsulation("horizontal", 1.0, 0.01, 0.05)
    with pytest.raises(HeatLedgerError, match="R' = R_n - d_n/lambda must not be negative"):
        slab_on_ground(100, 40, 0.3, 0, edge_insulation=worse)
    with pytest.raises(HeatLedgerError, match='"horizontal" or "vertical"'):
        EdgeInsulation("diagonal", 1.0, 1.0, 0.05)


# ----------------------------------------------------------------------------- suspended floor


def iso13370_suspended(a, p, w, r_deck, h, uw, eps, v, fw, rg, lam):
    """from memory: EN ISO 13370:2017 8.3 [source: iso13370-floors]."""
    b = a / (0.5 * p)
    uf = 1 / (0.17 + r_deck + 0.17)
    dg = w + lam * (0.17 + rg + 0.04)
    ug = 2 * lam / (math.pi * b + dg) * math.log(math.pi * b / dg + 1)
    ux = 2 * h * uw / b + 1450 * eps * v * fw / b
    return 1 / (1 / uf + 1 / (ug + ux))


def test_suspended_floor_against_independent_equation():
    kw = dict(underfloor_height=0.4, underfloor_wall_u=1.7, vent_area_per_perimeter=0.0015,
              wind_speed=4.0, wind_shielding="average", ground_insulation_resistance=0.0)
    r = suspended_floor(90.0, 38.0, 0.3, 2.5, **kw)
    # f_w average = 0.05, from memory (EN ISO 13370 8.3)
    expected = iso13370_suspended(90.0, 38.0, 0.3, 2.5, 0.4, 1.7, 0.0015, 4.0, 0.05, 0.0, 2.0)
    assert r.u_value == pytest.approx(expected, rel=RTOL_ROUND_OFF)
    assert r.wind_shielding_factor == 0.05
    assert r.exchange_u == pytest.approx(r.underfloor_wall_term + r.ventilation_term)
    assert suspended_floor(90.0, 38.0, 0.3, 2.5, **kw).u_value == r.u_value


def test_suspended_floor_limits():
    kw = dict(underfloor_height=0.0, underfloor_wall_u=1.0, vent_area_per_perimeter=0.0,
              wind_speed=0.0, wind_shielding="sheltered")
    r = suspended_floor(100.0, 40.0, 0.3, 0.0, **kw)
    # no exchange with outside air: deck and ground in series
    assert r.exchange_u == 0.0
    assert r.u_value == pytest.approx(1 / (1 / r.deck_u + 1 / r.ground_u))
    # the ground under an unventilated, sealed void is the uninsulated slab equation
    assert r.ground_u == pytest.approx(iso13370_slab(100, 40, 0.3, 0.0, 2.0), rel=RTOL_ROUND_OFF)
    # a much better deck lowers U towards zero
    assert suspended_floor(100, 40, 0.3, 50.0, **kw).u_value < 0.02


def test_suspended_floor_out_of_scope_height_rejected():
    with pytest.raises(HeatLedgerError, match="underfloor_height must not exceed 0.5 m"):
        suspended_floor(100, 40, 0.3, 1.0, underfloor_height=0.8, underfloor_wall_u=1.0,
                        vent_area_per_perimeter=0.001, wind_speed=3, wind_shielding="average")
    with pytest.raises(HeatLedgerError, match='"sheltered", "average" or "exposed"'):
        suspended_floor(100, 40, 0.3, 1.0, underfloor_height=0.3, underfloor_wall_u=1.0,
                        vent_area_per_perimeter=0.001, wind_speed=3, wind_shielding="windy")


# ----------------------------------------------------------------------------- heated basement


def iso13370_basement(a, p, w, rf, rw, z, lam, rsi_wall=0.13):
    """from memory: EN ISO 13370:2017 8.4 [source: iso13370-floors]; wall Rsi 0.13 [M]."""
    b = a / (0.5 * p)
    dt = w + lam * (0.17 + rf + 0.04)
    if dt + z / 2 < b:
        ubf = 2 * lam / (math.pi * b + dt + z / 2) * math.log(math.pi * b / (dt + z / 2) + 1)
    else:
        ubf = lam / (0.457 * b + dt + z / 2)
    dw = lam * (rsi_wall + rw + 0.04)
    ds = dt if dw >= dt else dw
    ubw = 2 * lam / (math.pi * z) * (1 + 0.5 * ds / (ds + z)) * math.log(z / dw + 1)
    return ubf, ubw, (a * ubf + z * p * ubw) / (a + z * p)


@pytest.mark.parametrize("rf,rw", [(0.0, 0.5), (0.5, 2.0), (3.0, 0.2), (6.0, 4.0)])
def test_heated_basement_against_independent_equation(rf, rw):
    r = heated_basement(120.0, 44.0, 0.35, rf, rw, 2.4)
    ubf, ubw, u = iso13370_basement(120.0, 44.0, 0.35, rf, rw, 2.4, 2.0)
    assert r.floor_u == pytest.approx(ubf, rel=RTOL_ROUND_OFF)
    assert r.wall_u == pytest.approx(ubw, rel=RTOL_ROUND_OFF)
    assert r.u_value == pytest.approx(u, rel=RTOL_ROUND_OFF)
    assert heated_basement(120.0, 44.0, 0.35, rf, rw, 2.4).u_value == r.u_value
    branch = "d_w (d_w < d_t)" if r.wall_equivalent_thickness < r.floor_equivalent_thickness \
        else "d_t"
    assert branch in r.method


def test_shallow_basement_floor_tends_to_slab():
    # z -> 0: the basement floor equation becomes the slab equation (same dt, z/2 -> 0)
    r = heated_basement(100.0, 40.0, 0.3, 0.0, 1.0, 1e-7)
    assert r.floor_u == pytest.approx(iso13370_slab(100, 40, 0.3, 0.0, 2.0), rel=RTOL_LIMIT)
    assert r.u_value == pytest.approx(r.floor_u, rel=RTOL_LIMIT)


def test_deeper_basement_floor_loses_less():
    assert heated_basement(100, 40, 0.3, 0.0, 1.0, 3.0).floor_u < heated_basement(
        100, 40, 0.3, 0.0, 1.0, 1.0).floor_u


# ----------------------------------------------------------------------------- bad input


def test_perimeter_that_cannot_bound_the_area():
    # a rectilinear 100 m2 outline needs P >= 4 sqrt(100) = 40 m
    with pytest.raises(HeatLedgerError, match=r'4 sqrt\(A\) = 40 m.*exposed_outline "partial"'):
        slab_on_ground(100.0, 30.0, 0.3, 0.0)
    # with party walls the exposed perimeter may be shorter: allowed when said so
    assert slab_on_ground(100.0, 20.0, 0.3, 0.0, exposed_outline="partial").u_value > 0
    with pytest.raises(HeatLedgerError, match="exposed_perimeter"):
        heated_basement(100.0, 30.0, 0.3, 0.0, 1.0, 2.0)


@pytest.mark.parametrize(
    "args,match",
    [
        ((-100.0, 40.0, 0.3, 0.0), "area must not be negative"),
        ((0.0, 40.0, 0.3, 0.0), "area must be greater than zero"),
        ((100.0, 0.0, 0.3, 0.0), "exposed_perimeter must be greater than zero"),
        ((100.0, 40.0, -0.3, 0.0), "wall_thickness must not be negative"),
        ((100.0, 40.0, 0.3, -1.0), "floor_resistance must not be negative"),
    ],
)
def test_bad_slab_inputs(args, match):
    with pytest.raises(HeatLedgerError, match=match):
        slab_on_ground(*args)


def test_bad_conductivity_and_depth():
    with pytest.raises(HeatLedgerError, match="soil_conductivity must be greater than zero"):
        slab_on_ground(100, 40, 0.3, 0, soil_conductivity=0.0)
    with pytest.raises(HeatLedgerError, match="depth must be greater than zero"):
        heated_basement(100, 40, 0.3, 0, 1.0, 0.0)


def test_result_objects_carry_u_value_for_room_elements():
    for r in (slab_on_ground(100, 40, 0.3, 1.0), heated_basement(100, 40, 0.3, 1.0, 1.0, 2.0),
              suspended_floor(100, 40, 0.3, 1.0, underfloor_height=0.3, underfloor_wall_u=1.0,
                              vent_area_per_perimeter=0.001, wind_speed=3,
                              wind_shielding="exposed")):
        assert r.u_value > 0 and "13370" in r.method


def test_scalar_only_methods_reject_arrays_clearly():
    with pytest.raises(HeatLedgerError, match="one floor at a time"):
        heated_basement([100.0, 120.0], [40.0, 44.0], 0.3, 0.0, 1.0, 2.0)
