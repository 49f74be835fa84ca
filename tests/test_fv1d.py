"""The 1-D finite-volume solver against closed forms: the resistance ladder (exact without
sources) and the plane wall with uniform heat generation (Incropera & DeWitt, Fundamentals
of Heat and Mass Transfer, 6th ed., section 3.5, eqs 3.39-3.47)."""

import numpy as np
import pytest

from heatledger import Construction, HeatLedgerError, Layer, fv1d
from heatledger.fv1d import (
    fixed_flux,
    fixed_temperature,
    richardson_estimate,
    solve_conduction,
    solve_tridiagonal,
    surface_to_ambient,
)
from tests.tolerances import (
    ATOL_ITERATION,
    ATOL_LINEAR_SOLVE,
    ATOL_MESH_K,
    RTOL_ITERATION,
    RTOL_LINEAR_SOLVE,
    RTOL_ROUND_OFF,
)

ATOL_ROUNDING_K = ATOL_LINEAR_SOLVE  # tests/tolerances.py
ENERGY_RTOL = RTOL_ITERATION  # tests/tolerances.py


def _uniform(length, n):
    return np.full(n, length / n)


def test_multilayer_wall_equals_resistance_ladder():
    # source: series resistances (EN ISO 6946:2017 6.7.1); the interface temperature
    # theta = theta_i - q * sum(R upstream) (Incropera eq. 3.19, thermal circuit)
    wall = Construction([Layer(0.015, 0.57), Layer(0.1, 0.56), Layer(0.12, 0.035),
                         Layer(0.102, 0.77)])
    t = wall.temperatures(21.0, -8.0, nodes_per_layer=[3, 5, 7, 2])
    r = [0.13, 0.015 / 0.57, 0.1 / 0.56, 0.12 / 0.035, 0.102 / 0.77, 0.04]
    q = 29.0 / sum(r)
    ladder = 21.0 - q * np.cumsum(r)[:-1]
    np.testing.assert_allclose(t.interface_temperatures, ladder, atol=ATOL_ROUNDING_K)
    np.testing.assert_allclose(t.interface_temperatures, wall.ladder_temperatures(21, -8),
                               atol=ATOL_ROUNDING_K)
    assert t.heat_flux == pytest.approx(q, rel=RTOL_ROUND_OFF)
    assert abs(t.energy_residual) < ENERGY_RTOL
    # within a layer the exact profile is linear: nodes lie on it
    layer2 = t.layer_of_node == 2
    x2 = t.x[layer2]
    expected = ladder[2] + (ladder[3] - ladder[2]) * (x2 - 0.115) / 0.12
    np.testing.assert_allclose(t.temperature[layer2], expected, atol=ATOL_ROUNDING_K)


def _generation_profile(x, length, q_gen, k, t1, t2):
    # source: Incropera & DeWitt 6th ed. eq. 3.41 with the wall from -L to L (half-width L):
    # T = q L^2/(2k) (1 - x^2/L^2) + (T2 - T1)/2 * x/L + (T1 + T2)/2
    half = length / 2
    xi = x - half
    return (q_gen * half**2 / (2 * k) * (1 - xi**2 / half**2) + (t2 - t1) / 2 * xi / half
            + (t1 + t2) / 2)


def test_uniform_generation_second_order_convergence():
    length, k, q_gen, t1, t2 = 0.2, 1.4, 5.0e4, 30.0, 10.0
    errors = []
    for n in (10, 20, 40, 80):
        w = _uniform(length, n)
        sol = solve_conduction(w, np.full(n, k), fixed_temperature(t1), fixed_temperature(t2),
                               source=q_gen * w)
        exact = _generation_profile(sol.x, length, q_gen, k, t1, t2)
        errors.append(np.max(np.abs(sol.temperature - exact)))
        assert abs(sol.energy_residual) < ENERGY_RTOL
        # energy: heat generated leaves through both faces (Incropera eq. 3.47 check)
        assert sol.heat_out - sol.heat_in == pytest.approx(q_gen * length, rel=RTOL_ITERATION)
    ratios = [errors[i] / errors[i + 1] for i in range(3)]
    # second order: the error falls by 4 each time the cells are halved
    for r in ratios:
        assert 3.6 < r < 4.4, ratios
    assert errors[-1] < 0.05  # K, against a 179 K rise q L^2/(8k) at the centre


def test_maximum_temperature_symmetric_generation():
    # source: Incropera eq. 3.43: T_max = T_s + q L^2/(2k) for the symmetric wall
    length, k, q_gen, ts = 0.1, 0.8, 2.0e4, 15.0
    n = 400
    sol = solve_conduction(_uniform(length, n), np.full(n, k), fixed_temperature(ts),
                           fixed_temperature(ts), source=q_gen * length / n)
    t_max = ts + q_gen * (length / 2) ** 2 / (2 * k)
    assert sol.temperature.max() == pytest.approx(t_max, abs=ATOL_MESH_K)


def test_adiabatic_face_with_convection():
    # source: Incropera section 3.5 (from memory): symmetric wall, convection h, T_inf:
    # T_s = T_inf + q L/h, T(x) = T_s + q L^2/(2k) (1 - x^2/L^2) (here: adiabatic at x = 0)
    length, k, q_gen, h, t_inf = 0.05, 0.5, 1.0e4, 25.0, 20.0
    n = 200
    w = _uniform(length, n)
    sol = solve_conduction(w, np.full(n, k), fixed_flux(0.0), surface_to_ambient(t_inf, 1 / h),
                           source=q_gen * w)
    t_s = t_inf + q_gen * length / h
    assert sol.face_temperature[-1] == pytest.approx(t_s, abs=ATOL_ITERATION)
    exact = t_s + q_gen * length**2 / (2 * k) * (1 - (sol.x / length) ** 2)
    assert np.max(np.abs(sol.temperature - exact)) < 1e-3


def test_fixed_surface_and_convection_derived_profile():
    # derived here [source: incropera-6, 3.5]: T = T_s + C1 x - q x^2/(2k),
    # C1 = [q L (1 + h L/(2k)) - h (T_s - T_inf)] / (k + h L)
    length, k, q_gen, h, ts, t_inf = 0.08, 1.1, 3.0e4, 12.0, 40.0, 5.0
    c1 = (q_gen * length * (1 + h * length / (2 * k)) - h * (ts - t_inf)) / (k + h * length)
    n = 320
    w = _uniform(length, n)
    sol = solve_conduction(w, np.full(n, k), fixed_temperature(ts),
                           surface_to_ambient(t_inf, 1 / h), source=q_gen * w)
    exact = ts + c1 * sol.x - q_gen * sol.x**2 / (2 * k)
    assert np.max(np.abs(sol.temperature - exact)) < 1e-3


def test_matches_dense_solve_of_same_system():
    rng = np.random.default_rng(7)
    n = 50
    w = rng.uniform(0.001, 0.02, n)
    k = rng.uniform(0.02, 3.0, n)
    sol = solve_conduction(w, k, surface_to_ambient(20, 0.13), surface_to_ambient(0, 0.04),
                           source=rng.uniform(0, 10, n), source_slope=-rng.uniform(0, 1, n))
    dense = np.diag(sol.a_centre) - np.diag(sol.a_east[:-1], 1) - np.diag(sol.a_west[1:], -1)
    np.testing.assert_allclose(np.linalg.solve(dense, sol.b), sol.temperature,
                               rtol=RTOL_LINEAR_SOLVE)
    assert abs(sol.energy_residual) < ENERGY_RTOL


def test_solve_tridiagonal_against_dense():
    rng = np.random.default_rng(3)
    n = 30
    lower, upper = rng.uniform(-1, 0, n - 1), rng.uniform(-1, 0, n - 1)
    diag = 2.5 + rng.uniform(0, 1, n)
    rhs = rng.normal(size=n)
    dense = np.diag(diag) + np.diag(lower, -1) + np.diag(upper, 1)
    np.testing.assert_allclose(solve_tridiagonal(lower, diag, upper, rhs),
                               np.linalg.solve(dense, rhs), rtol=RTOL_ROUND_OFF)


def test_heating_mat_in_screed_balances_energy():
    floor = Construction([Layer(0.065, 1.0, name="screed"), Layer(0.1, 0.022, name="PIR"),
                          Layer(0.15, 1.65, name="slab")], "down")
    q_vol = 100.0 / 0.065  # 100 W/m2 released in the screed
    t = floor.temperatures(20.0, 10.0, nodes_per_layer=10, layer_sources={0: q_vol})
    assert abs(t.energy_residual) < ENERGY_RTOL
    assert t.heat_flux_outside - t.heat_flux == pytest.approx(100.0, rel=RTOL_ITERATION)
    # the heated floor gives heat to the room: flux at the inside surface is negative
    assert t.heat_flux < 0
    assert t.mesh_estimate.error_estimate < 0.05  # W/m2


def test_interface_flux_source():
    wall = Construction([Layer(0.05, 1.0), Layer(0.05, 1.0)])
    t = wall.temperatures(20.0, 20.0, nodes_per_layer=20, interface_fluxes={1: 50.0})
    assert t.heat_flux_outside - t.heat_flux == pytest.approx(50.0, rel=RTOL_ITERATION)


def test_mesh_estimate_is_richardson():
    est = richardson_estimate("q", 10.0, 10.3)
    assert est.extrapolated == pytest.approx(10.4)
    assert est.error_estimate == pytest.approx(0.4)


def test_max_spacing_sets_cell_counts():
    wall = Construction([Layer(0.1, 1.0), Layer(0.025, 0.04)])
    t = wall.temperatures(20, 0, max_spacing=0.01)
    assert t.nodes_per_layer == (10, 3)


@pytest.mark.parametrize("bad", [[0.1, 0.0], [0.1, -0.1], [0.1, np.nan], [0.1, np.inf]])
def test_bad_widths(bad):
    with pytest.raises(HeatLedgerError, match="cell width must be finite and greater than zero"):
        solve_conduction(bad, [1.0, 1.0], fixed_temperature(0), fixed_temperature(1))


def test_two_flux_boundaries_rejected():
    with pytest.raises(HeatLedgerError, match="at least one boundary must fix a temperature"):
        solve_conduction([0.1], [1.0], fixed_flux(1.0), fixed_flux(0.0))


def test_positive_source_slope_rejected():
    with pytest.raises(HeatLedgerError, match="source_slope must be <= 0"):
        solve_conduction([0.1, 0.1], [1.0, 1.0], fixed_temperature(0), fixed_temperature(1),
                         source_slope=[0.0, 1.0])


def test_single_cell():
    sol = solve_conduction([0.1], [1.0], fixed_temperature(10.0), fixed_temperature(0.0))
    assert sol.temperature[0] == pytest.approx(5.0)
    assert sol.heat_in == pytest.approx(100.0)


def test_boundary_kind_checked():
    with pytest.raises(HeatLedgerError, match="boundary kind must be one of"):
        solve_conduction([0.1], [1.0], fv1d.Boundary("magic"), fixed_temperature(0.0))
