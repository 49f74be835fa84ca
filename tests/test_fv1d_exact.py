"""The finite-volume solver against exact solutions derived here, at several meshes.

- Heat released at a layer interface (a heating foil): the field is piecewise linear, so the
  scheme must be exact at every mesh (the heat splits by the flux balance of the two half
  cells). Exact solution: the resistance network with a source node, solved by hand below.
- Fixed flux and surface resistance on a cylinder: the boundary acts on the boundary face's
  area; the exact field is logarithmic (Incropera & DeWitt 6th ed., eq. 3.26 and 3.27).
- A layer with uniform heat generation: the exact field is quadratic in that layer (eq. 3.39
  integrated), the scheme second order; the mesh estimate's observed order and its error
  bound are checked against the true error.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from heatledger import Construction, Layer
from heatledger.fv1d import (
    fixed_flux,
    fixed_temperature,
    solve_conduction,
    surface_to_ambient,
    three_mesh_estimate,
)
from tests.tolerances import (
    ATOL_ROUND_OFF,
    RTOL_EXACT_SCHEME,
    RTOL_EXTRAPOLATED,
    RTOL_LINEAR_SOLVE,
    RTOL_ROUND_OFF,
    RTOL_ULP,
)

RTOL_EXACT = RTOL_EXACT_SCHEME  # tests/tolerances.py
RSI, RSE = 0.10, 0.04  # source: EN ISO 6946:2017, Table 7 (heat flow up)


def _network_with_foil(resistances, foil_at, heat, t_in, t_out):
    """Exact heat flux entering the inside face of a series of resistances [m2 K/W] (Rsi,
    layers..., Rse) with ``heat`` [W/m2] released at the node after resistance index
    ``foil_at``: one source node, two branches. T_f = (T_i/Ra + T_e/Rb + Q)/(1/Ra + 1/Rb)."""
    r_a = sum(resistances[: foil_at + 1])
    r_b = sum(resistances[foil_at + 1:])
    t_f = (t_in / r_a + t_out / r_b + heat) / (1 / r_a + 1 / r_b)
    return (t_in - t_f) / r_a, t_f


@pytest.mark.parametrize("cells", [1, 2, 3, 4, 8, 32])
def test_heating_foil_between_screed_and_insulation_is_exact_at_every_mesh(cells):
    # invented floor: 50 mm screed (1.3 W/(m K)) over 100 mm insulation (0.035 W/(m K)), a
    # 100 W/m2 heating foil between them, room 20 degC above, 10 degC below
    screed, ins = Layer(0.05, 1.3, name="screed"), Layer(0.10, 0.035, name="insulation")
    con = Construction([screed, ins], heat_flow="up", rsi=RSI, rse=RSE)
    res = con.temperatures(20.0, 10.0, nodes_per_layer=cells, interface_fluxes={1: 100.0})
    q_in, t_foil = _network_with_foil([RSI, 0.05 / 1.3, 0.10 / 0.035, RSE], 1, 100.0, 20.0,
                                      10.0)
    assert res.heat_flux == pytest.approx(q_in, rel=RTOL_EXACT)
    assert res.interface_temperatures[1] == pytest.approx(t_foil, rel=RTOL_EXACT)
    # conservation: what leaves both faces is what the foil and the room put in
    assert res.heat_flux_outside - res.heat_flux == pytest.approx(100.0, rel=RTOL_EXACT)
    assert res.mesh_estimate.exact


@pytest.mark.parametrize("cells", [1, 2, 5, 16])
def test_two_foils_in_three_layers_are_exact(cells):
    layers = [Layer(0.02, 0.2), Layer(0.06, 0.04), Layer(0.15, 1.0)]
    con = Construction(layers, heat_flow="horizontal", rsi=0.13, rse=0.04)
    res = con.temperatures(18.0, -3.0, nodes_per_layer=cells,
                           interface_fluxes={1: 40.0, 2: -15.0})
    # exact: nodal analysis of the series network (Rsi, R1, R2, R3, Rse) with sources at the
    # two interface nodes; unknowns T_1 (inside surface) ... T_4 (outside surface)
    r = [0.13, 0.02 / 0.2, 0.06 / 0.04, 0.15 / 1.0, 0.04]
    g = [1 / x for x in r]
    a = np.zeros((4, 4))
    rhs = np.array([g[0] * 18.0, 40.0, -15.0, g[4] * -3.0])
    for i in range(4):
        a[i, i] = g[i] + g[i + 1]
        if i > 0:
            a[i, i - 1] = -g[i]
        if i < 3:
            a[i, i + 1] = -g[i + 1]
    t_nodes = np.linalg.solve(a, rhs)
    assert res.heat_flux == pytest.approx(g[0] * (18.0 - t_nodes[0]), rel=RTOL_EXACT)
    np.testing.assert_allclose(res.interface_temperatures, t_nodes, rtol=RTOL_EXACT)


def _shell(n, r1=0.01, r2=0.05):
    edges = np.linspace(r1, r2, n + 1)
    centres = 0.5 * (edges[:-1] + edges[1:])
    return np.diff(edges), 2 * math.pi * centres  # widths [m], areas per metre [m2/m]


@pytest.mark.parametrize("n", [2, 5, 17, 64])
def test_fixed_flux_on_a_cylinder_enters_through_the_face_area(n):
    # an electric heater of 500 W/m2 on the inner face (r1 = 10 mm) of a 40 mm insulation
    # sleeve (k = 0.04), outside face held at 15 degC. The heat entering is q'' 2 pi r1 per
    # metre at every mesh (it used to be q'' times the first cell's centre area).
    widths, areas = _shell(n)
    sol = solve_conduction(widths, np.full(n, 0.04), fixed_flux(500.0), fixed_temperature(15.0),
                           area=areas)
    assert sol.heat_in == pytest.approx(500.0 * 2 * math.pi * 0.01, rel=RTOL_ROUND_OFF)
    assert sol.heat_out == pytest.approx(sol.heat_in, rel=RTOL_LINEAR_SOLVE)


def test_cylinder_temperatures_converge_at_second_order_to_the_log_profile():
    # exact: T(r) = T2 + Q/(2 pi k) ln(r2/r) with Q = q'' 2 pi r1 (eq. 3.26); the inner face
    # temperature converges as 1/n^2
    q_line = 500.0 * 2 * math.pi * 0.01
    exact = 15.0 + q_line / (2 * math.pi * 0.04) * math.log(0.05 / 0.01)
    errors = []
    for n in (8, 16, 32, 64):
        widths, areas = _shell(n)
        sol = solve_conduction(widths, np.full(n, 0.04), fixed_flux(500.0),
                               fixed_temperature(15.0), area=areas)
        errors.append(abs(sol.face_temperature[0] - exact))
    orders = [math.log2(a / b) for a, b in zip(errors[:-1], errors[1:], strict=True)]
    assert all(1.8 < p < 2.2 for p in orders), orders


def test_surface_resistance_on_a_cylinder_acts_on_the_outer_face():
    # pipe insulation: inner face 60 degC, k = 0.035, outside h = 10 W/(m2 K) to 20 degC.
    # exact heat per metre: (60 - 20)/(ln(r2/r1)/(2 pi k) + 1/(h 2 pi r2)) (eq. 3.27 + 3.9)
    exact = 40.0 / (math.log(5.0) / (2 * math.pi * 0.035) + 1 / (10.0 * 2 * math.pi * 0.05))
    errors = []
    for n in (8, 16, 32, 64):
        widths, areas = _shell(n)
        sol = solve_conduction(widths, np.full(n, 0.035), fixed_temperature(60.0),
                               surface_to_ambient(20.0, 0.1), area=areas)
        errors.append(abs(sol.heat_in - exact) / exact)
    orders = [math.log2(a / b) for a, b in zip(errors[:-1], errors[1:], strict=True)]
    assert all(1.8 < p < 2.2 for p in orders), orders
    assert errors[-1] < 1e-4


def _heated_screed_exact(g, k1, l1, k2, l2, t_in, t_out, rsi, rse):
    """Exact inside heat flux [W/m2] of a slab with uniform generation g [W/m3] (0..l1, k1)
    on a plain layer (l1..l1+l2, k2), surface resistances on both faces:
    T_A = -g x^2/(2 k1) + c1 x + c0, T_B = d1 x + d0, with continuity of T and of the flux
    at l1 (four linear conditions, solved here)."""
    big_l = l1 + l2
    a = np.array([
        [1.0, -k1 * rsi, 0.0, 0.0],         # T(0) - rsi (-k1 T'(0)) = t_in
        [0.0, 0.0, 1.0, big_l + k2 * rse],  # T(L) + rse (k2 T'(L))... = t_out
        [1.0, l1, -1.0, -l1],               # T_A(l1) = T_B(l1)
        [0.0, k1, 0.0, -k2],                # k1 T_A'(l1) = k2 T_B'(l1)
    ])
    rhs = np.array([t_in, t_out, g * l1**2 / (2 * k1), g * l1])
    _c0, c1, _d0, _d1 = np.linalg.solve(a, rhs)
    return -k1 * c1  # q(0) = -k1 T'(0), positive inside to outside


@pytest.mark.parametrize("cells", [1, 2, 4, 8])
def test_a_uniformly_heated_layer_is_exact_and_the_estimate_says_so(cells):
    # invented heated screed: 70 mm at 1.4 W/(m K) generating 800 W/m3 over 80 mm of
    # insulation at 0.035, room 20 degC (Rsi 0.10), ground side 10 degC (Rse 0.04). With a
    # constant source per layer the cell-centred scheme gives exact face values and fluxes
    # (the quadratic's difference quotients are exact); the three meshes show it.
    con = Construction([Layer(0.07, 1.4), Layer(0.08, 0.035)], heat_flow="up", rsi=RSI,
                       rse=RSE)
    exact = _heated_screed_exact(800.0, 1.4, 0.07, 0.035, 0.08, 20.0, 10.0, RSI, RSE)
    res = con.temperatures(20.0, 10.0, nodes_per_layer=cells, layer_sources={0: 800.0})
    assert res.heat_flux == pytest.approx(exact, rel=RTOL_EXACT)
    assert res.mesh_estimate.exact and "uniform heat source" in res.mesh_estimate.basis
    assert res.ladder_heat_flux is None  # no closed-form ladder with a source
    # the nodes of the heated layer lie g w^2/(8 lambda) above the exact parabola
    w = 0.07 / cells
    x0 = w / 2
    t_surface = 20.0 - RSI * exact  # inside surface, heat flux positive inside to outside
    t_exact_node = t_surface - exact / 1.4 * x0 - 800.0 * x0**2 / (2 * 1.4)
    assert res.temperature[0] - t_exact_node == pytest.approx(800.0 * w**2 / (8 * 1.4),
                                                              rel=RTOL_EXTRAPOLATED,
                                                                  abs=ATOL_ROUND_OFF)


def test_three_mesh_estimate_observes_the_order_and_bounds_the_true_error():
    # the cylinder with a surface resistance above: second order, exact answer known
    exact = 40.0 / (math.log(5.0) / (2 * math.pi * 0.035) + 1 / (10.0 * 2 * math.pi * 0.05))
    meshes = (8, 16, 32)
    values = []
    for n in meshes:
        widths, areas = _shell(n)
        values.append(solve_conduction(widths, np.full(n, 0.035), fixed_temperature(60.0),
                                       surface_to_ambient(20.0, 0.1), area=areas).heat_in)
    for reported in (0, 2):  # refining from the mesh used, or coarsening below it
        est = three_mesh_estimate("heat_rate", meshes, values, reported=reported)
        assert est.basis == "observed order from three meshes"
        assert 1.8 < est.order < 2.2
        true_error = abs(values[reported] - exact)
        assert true_error <= est.error_estimate <= 3.0 * true_error
        assert abs(est.extrapolated - exact) < 0.1 * abs(values[-1] - exact)


def test_three_mesh_estimate_is_conservative_outside_the_asymptotic_range():
    est = three_mesh_estimate("q", (2, 4, 8), (1.0, 1.1, 1.05))  # changes sign: no order
    assert math.isnan(est.order) and est.error_estimate == pytest.approx(0.3)
    assert "asymptotic" in est.basis


def test_layered_wall_without_sources_is_stated_exact_and_ladder_agrees():
    con = Construction([Layer(0.0125, 0.21), Layer(0.1, 0.035), Layer(0.1, 0.77)],
                       heat_flow="horizontal")
    res = con.temperatures(20.0, -5.0)
    assert res.mesh_estimate.exact and res.mesh_estimate.meshes == ()
    assert "linear within each layer" in res.mesh_estimate.basis
    assert res.ladder_heat_flux == pytest.approx(25.0 / con.total_resistance, rel=RTOL_ULP)
    assert res.ladder_difference < 1e-12
