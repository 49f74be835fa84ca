"""The 2-D engine against the validation cases of EN ISO 10211 Annex A.

Sources beside the checks:
- Case 1: the analytical solution of Laplace's equation in a rectangle by separation of
  variables (Fourier series; Incropera & DeWitt 6th ed., 4.2), computed here and checked for
  convergence; the standard compares at 28 points of an equidistant grid, within 0.1 K.
- Case 2: the reference temperatures and heat flow of EN ISO 10211 Annex A, written from
  memory (geometry, materials, boundary conditions, values and tolerances), within 0.1 K and
  0.1 W/m.
[source: iso10211-validation, Annex A]; [source: incropera-6, 4.2].
"""

from __future__ import annotations

import numpy as np
import pytest

from heatledger import Region, Section2D, Surface
from tests.tolerances import ATOL_ISO10211_K, ATOL_ISO10211_W_M, ATOL_SERIES_K

MM = 1e-3


# ------------------------------------------------------------------------------ case 1
def column_series(x, y, a, terms):
    """Half of a square column, 0 <= x <= a, 0 <= y <= 2a: T = 20 degC at y = 2a, 0 at x = 0
    and y = 0, dT/dx = 0 at x = a. Separation of variables (Incropera & DeWitt 6th ed., 4.2):
    T = sum_n 80/((2n+1) pi) sin(l_n x) sinh(l_n y)/sinh(2 a l_n), l_n = (2n+1) pi/(2a),
    from the sine series of the constant 20 on (0, a) with odd quarter waves. sinh ratios
    written with exponentials so no term overflows. [degC]"""
    n = np.arange(terms)[:, None]
    lam = (2 * n + 1) * np.pi / (2 * a)
    ratio = np.exp(lam * (y - 2 * a)) * -np.expm1(-2 * lam * y) / -np.expm1(-4 * lam * a)
    return (80.0 / ((2 * n + 1) * np.pi) * np.sin(lam * x) * ratio).sum(axis=0)


A_COLUMN = 0.4  # the width a [m]; the case is scale-free (Laplace's equation)
# from memory: the 28 points lie a/4 apart, x = a/4 .. a (the last on the symmetry line),
# y = a/4 .. 7a/4
POINTS_X, POINTS_Y = np.meshgrid(np.arange(1, 5) * A_COLUMN / 4, np.arange(1, 8) * A_COLUMN / 4)


def column_section() -> Section2D:
    a = A_COLUMN
    return Section2D(
        [Region(0, 0, a, 2 * a, 1.0, name="column")],
        [Surface(0, 2 * a, a, 2 * a, temperature=20.0, resistance=0.0, name="top"),
         Surface(0, 0, 0, 2 * a, temperature=0.0, resistance=0.0, name="left"),
         Surface(0, 0, a, 0, temperature=0.0, resistance=0.0, name="bottom")])


def test_case_1_series_converges():
    # the series at 200 and 400 terms agree to round-off at every point compared
    x, y = POINTS_X.ravel(), POINTS_Y.ravel()
    s200 = column_series(x, y, A_COLUMN, 200)
    s400 = column_series(x, y, A_COLUMN, 400)
    assert np.abs(s400 - s200).max() <= ATOL_SERIES_K
    assert x.size == 28
    # and it meets its boundary conditions: 0 on the cold edges, the mean 20 on the hot one
    # (a sine series converges to the value inside the edge, away from its ends)
    assert np.abs(column_series(np.zeros(5), np.linspace(0.1, 0.7, 5), A_COLUMN, 400)).max() \
        <= ATOL_SERIES_K
    edge = column_series(np.array([0.1, 0.2, 0.3]), np.full(3, 2 * A_COLUMN), A_COLUMN, 20000)
    assert np.allclose(edge, 20.0, atol=0.01)


@pytest.mark.parametrize("max_cell", [A_COLUMN / 20, A_COLUMN / 80])
def test_case_1_half_column_at_the_28_points(max_cell):
    # source: EN ISO 10211 Annex A, case 1: within 0.1 K of the analytical solution
    res = column_section().solve(max_cell)
    exact = column_series(POINTS_X.ravel(), POINTS_Y.ravel(), A_COLUMN, 400)
    got = res.temperature_at(POINTS_X.ravel(), POINTS_Y.ravel())
    assert np.abs(got - exact).max() <= ATOL_ISO10211_K
    assert abs(res.energy_residual) <= 1e-9


def test_case_1_error_falls_with_the_cell_size():
    # the same comparison on three grids: the largest error at the 28 points falls at least
    # threefold per halving (second order away from the singular corners)
    exact = column_series(POINTS_X.ravel(), POINTS_Y.ravel(), A_COLUMN, 400)
    errors = [np.abs(column_section().solve(A_COLUMN / n).temperature_at(
        POINTS_X.ravel(), POINTS_Y.ravel()) - exact).max() for n in (10, 20, 40)]
    assert errors[0] > 3 * errors[1] > 9 * errors[2]


# ------------------------------------------------------------------------------ case 2
def case_2() -> Section2D:
    # from memory: EN ISO 10211 Annex A, case 2 (mm): concrete 1.15, wood 0.12,
    # insulation 0.029, aluminium 230 W/(m K)
    return Section2D(
        [Region(0, 1.5 * MM, 500 * MM, 41.5 * MM, 0.029, name="insulation"),
         Region(0, 41.5 * MM, 500 * MM, 47.5 * MM, 1.15, name="concrete"),
         Region(0, 36.5 * MM, 15 * MM, 41.5 * MM, 0.12, name="wood"),
         Region(0, 0, 500 * MM, 1.5 * MM, 230.0, name="aluminium plate"),
         Region(0, 0, 1.5 * MM, 36.5 * MM, 230.0, name="aluminium leg"),
         Region(0, 35 * MM, 15 * MM, 36.5 * MM, 230.0, name="aluminium flange")],
        [Surface(0, 47.5 * MM, 500 * MM, 47.5 * MM, temperature=0.0, resistance=0.06,
                 name="outside"),
         Surface(0, 0, 500 * MM, 0, temperature=20.0, resistance=0.11, name="inside")])


# from memory: EN ISO 10211 Annex A, case 2, the nine reference temperatures [degC]
CASE_2_POINTS = {"A": (0, 47.5, 7.1), "B": (500, 47.5, 0.8), "C": (0, 41.5, 7.9),
                 "D": (15, 41.5, 6.3), "E": (500, 41.5, 0.8), "F": (0, 36.5, 16.4),
                 "G": (15, 36.5, 16.3), "H": (0, 0, 16.8), "I": (500, 0, 18.3)}
CASE_2_HEAT_FLOW = 9.5  # W/m, from memory


@pytest.fixture(scope="module")
def case_2_result():
    return case_2().solve(0.5 * MM)


@pytest.mark.parametrize("point", sorted(CASE_2_POINTS))
def test_case_2_temperatures(case_2_result, point):
    # source: EN ISO 10211 Annex A, case 2 (from memory), within 0.1 K. Points on material
    # corners (C, D, F, G) and on the outline take the conductivity-weighted mean of the
    # cells that touch them, each extrapolated linearly from its centre to the point
    x, y, ref = CASE_2_POINTS[point]
    assert case_2_result.temperature_at(x * MM, y * MM) == pytest.approx(
        ref, abs=ATOL_ISO10211_K)


def test_case_2_heat_flow(case_2_result):
    # source: EN ISO 10211 Annex A, case 2 (from memory): 9.5 W/m within 0.1 W/m, through
    # either surface (the balance closes)
    res = case_2_result
    assert res.heat_flow("inside") == pytest.approx(CASE_2_HEAT_FLOW, abs=ATOL_ISO10211_W_M)
    assert -res.heat_flow("outside") == pytest.approx(CASE_2_HEAT_FLOW, abs=ATOL_ISO10211_W_M)
    assert abs(res.energy_residual) <= 1e-9
    # the grid is fine enough to judge: its own error bound is far inside the tolerance
    est = res.mesh_estimate
    assert est.error_estimate < ATOL_ISO10211_W_M / 10
    assert est.meshes[1] == res.cells
    assert est.extrapolated == pytest.approx(CASE_2_HEAT_FLOW, abs=ATOL_ISO10211_W_M)
