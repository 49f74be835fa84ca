"""Benchmark of the 1-D finite-volume solver (prints ratios; not a test).

    python tests/benchmarks/bench_fv1d.py

1. One million nodes: heatledger.solve_conduction (assembly, solve, face fluxes, energy
   balance) against a bare scipy.linalg.solve_banded of the same assembled system.
   Target: ratio at most 1.5.
2. 2,000 nodes: speed-up of solve_conduction over a dense numpy.linalg.solve of the same
   system. Target: at least 200.
"""

from __future__ import annotations

import statistics
import time

import numpy as np
from scipy.linalg import solve_banded

from heatledger import fv1d


def _median_time(fn, repeats: int) -> float:
    times = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


def _problem(n: int):
    rng = np.random.default_rng(1)
    widths = np.full(n, 0.3 / n)
    cond = rng.uniform(0.03, 2.0, n)
    left = fv1d.surface_to_ambient(20.0, 0.13)
    right = fv1d.surface_to_ambient(-5.0, 0.04)
    source = np.zeros(n)
    return widths, cond, left, right, source


def bench_million(repeats: int = 7) -> float:
    widths, cond, left, right, source = _problem(1_000_000)
    sol = fv1d.solve_conduction(widths, cond, left, right, source=source)
    ab = np.zeros((3, widths.size))
    ab[0, 1:] = -sol.a_east[:-1]
    ab[1] = sol.a_centre
    ab[2, :-1] = -sol.a_west[1:]
    b = sol.b.copy()
    t_bare = _median_time(lambda: solve_banded((1, 1), ab, b), repeats)
    t_plain = _median_time(
        lambda: fv1d.solve_conduction(widths, cond, left, right, source=source, refine=False),
        repeats)
    t_auto = _median_time(
        lambda: fv1d.solve_conduction(widths, cond, left, right, source=source), repeats)
    x_bare = solve_banded((1, 1), ab, b)
    plain = fv1d.solve_conduction(widths, cond, left, right, source=source, refine=False)
    assert np.allclose(x_bare, plain.temperature, rtol=1e-12, atol=1e-12)
    ratio = t_plain / t_bare
    print(f"1,000,000 nodes: heatledger single solve {t_plain * 1e3:.1f} ms, bare "
          f"solve_banded {t_bare * 1e3:.1f} ms, ratio {ratio:.2f} (target <= 1.5); "
          f"energy residual {plain.energy_residual:.1e}")
    print(f"  with default refinement ({sol.settings['refinements']} step): "
          f"{t_auto * 1e3:.1f} ms, ratio {t_auto / t_bare:.2f}; energy residual "
          f"{sol.energy_residual:.1e}")
    return ratio


def bench_dense(repeats: int = 5) -> float:
    widths, cond, left, right, source = _problem(2000)
    sol = fv1d.solve_conduction(widths, cond, left, right, source=source)
    dense = (np.diag(sol.a_centre) - np.diag(sol.a_east[:-1], 1) - np.diag(sol.a_west[1:], -1))
    b = sol.b.copy()
    t_dense = _median_time(lambda: np.linalg.solve(dense, b), repeats)
    t_ours = _median_time(
        lambda: fv1d.solve_conduction(widths, cond, left, right, source=source), 51)
    assert np.allclose(np.linalg.solve(dense, b), sol.temperature, rtol=1e-9)
    speedup = t_dense / t_ours
    print(f"2,000 nodes: heatledger {t_ours * 1e6:.0f} us, dense numpy.linalg.solve "
          f"{t_dense * 1e3:.2f} ms, speed-up {speedup:.0f}x (target >= 200)")
    return speedup


if __name__ == "__main__":
    bench_million()
    bench_dense()
