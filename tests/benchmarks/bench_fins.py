"""Benchmark: the finite-volume fin with a temperature-dependent h at 100,000 cells.

Plain script (not a test): ``python tests/benchmarks/bench_fins.py``. Prints the median time
of the non-linear fin solve as a ratio to one linear solve of the same size, i.e. the cost
of the iteration. Each repeat times the reference solve right before the fin solve and the
median of those paired ratios is printed, so load from other users of a shared machine
affects both alike. Scenario (invented): an aluminium plate fin, 100 mm long, 2 mm thick,
100 mm wide, base at 80 degC in 20 degC air, natural convection h = 1.32 dT^0.25 W/(m2 K),
optionally with radiation (emissivity 0.85).
"""

from __future__ import annotations

import statistics
import time

import numpy as np

from heatledger.fins import PowerLawCoefficient, solve_fin_fv
from heatledger.fv1d import fixed_flux, fixed_temperature, solve_conduction, solve_tridiagonal

NODES = 100_000
REPEATS = 11
LENGTH, K, THICK, WIDTH = 0.1, 200.0, 0.002, 0.1
A_C, P = WIDTH * THICK, 2 * (WIDTH + THICK)
T_B, T_INF = 80.0, 20.0


def _once(func) -> float:
    start = time.perf_counter()
    func()
    return time.perf_counter() - start


def median_time(func, repeats=REPEATS):
    func()  # warm-up
    return statistics.median(_once(func) for _ in range(repeats))


def median_ratio(func, reference, repeats=REPEATS):
    """Median of per-repeat ratios, each timed right after its reference solve, so that
    load from other users of a shared machine affects both alike."""
    func()
    reference()
    ratios, times, refs = [], [], []
    for _ in range(repeats):
        t_ref = _once(reference)
        t = _once(func)
        ratios.append(t / t_ref)
        times.append(t)
        refs.append(t_ref)
    return statistics.median(ratios), statistics.median(times), statistics.median(refs)


def linear_solve():
    """One linear fin solve of the same size through solve_conduction (constant h)."""
    dx = LENGTH / NODES
    h = 5.0
    solve_conduction(np.full(NODES, dx), np.full(NODES, K), fixed_temperature(T_B),
                     fixed_flux(0.0), area=A_C, source=np.full(NODES, h * P * dx * T_INF),
                     source_slope=np.full(NODES, -h * P * dx))


def bare_tridiagonal():
    """The bare LAPACK tridiagonal solve of the same size."""
    diag = np.full(NODES, 2.1)
    off = np.full(NODES - 1, -1.0)
    solve_tridiagonal(off, diag, off, np.ones(NODES))


def fin(linearisation="newton", emissivity=0.0, mesh_estimate=False):
    return solve_fin_fv(LENGTH, K, PowerLawCoefficient(1.32, 0.25), area=A_C, perimeter=P,
                        base_temperature=T_B, ambient=T_INF, nodes=NODES, tip="convective",
                        emissivity=emissivity, linearisation=linearisation,
                        tolerance=1e-8, mesh_estimate=mesh_estimate)


def main() -> None:
    # one large run first: the allocator then keeps its heap, so neither the reference nor
    # the fin is timed with the page faults of fresh memory (timing them cold differs by ~2x)
    fin(mesh_estimate=True)
    t_lin = median_time(linear_solve)
    t_tri = median_time(bare_tridiagonal)
    print(f"cells: {NODES:,}; median of {REPEATS} repeats (time.perf_counter)")
    print(f"one linear solve_conduction (timed alone): {1e3 * t_lin:8.2f} ms")
    print(f"bare solve_tridiagonal:           {1e3 * t_tri:8.2f} ms")
    cases = [
        ("h(T) power law, Newton", dict(linearisation="newton")),
        ("h(T) power law, Picard", dict(linearisation="picard")),
        ("h(T) + radiation, Newton", dict(linearisation="newton", emissivity=0.85)),
        ("h(T), Newton, with mesh estimate (2x cells)", dict(linearisation="newton",
                                                            mesh_estimate=True)),
    ]
    for label, kw in cases:
        res = fin(**kw)
        ratio, t, t_ref = median_ratio(lambda kw=kw: fin(**kw), linear_solve)
        print(f"{label:45s} {1e3 * t:8.2f} ms = {ratio:5.1f} x one linear solve "
              f"(paired median, reference {1e3 * t_ref:.2f} ms; "
              f"{res.iterations} solves, last change {res.converged_change:.1e} K, "
              f"energy residual {res.energy_residual:.1e})")


if __name__ == "__main__":
    main()
