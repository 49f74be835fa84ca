"""Benchmark of the 1-D finite-volume path (prints ratios; not a test).

    python tests/benchmarks/bench_fv1d.py

Every figure is a ratio of two pieces of work timed in interleaved pairs (``_bench.py``),
min and median, with the verdict against the target:

1. One million cells, plain solve: ``solve_conduction(..., refine=False)`` (assembly, the
   factorisation and solve, boundary heat, energy balance) against a bare
   ``scipy.linalg.solve_banded`` of the same system already assembled. Target 1.3.
2. The same with the default refinement (``refine="auto"``). Reported.
3. The public path a user calls: ``Construction.temperatures`` at one million cells, the
   mesh estimate read, against the same bare solve. (a) a layered wall (the estimate is the
   proof of exactness, no extra solve); (b) a heated screed (three meshes: 250,000, 500,000
   and 1,000,000 cells). Target 3.
4. Cost per cell from 1,000 to 1,000,000 cells: time per cell of the default solve at
   1e6 over that at 1e3 (1,000 calls per timing). Target: flat (at most 1.2).
5. 2,000 cells: speed-up over a dense ``numpy.linalg.solve`` of the same system. Target 200.
"""

from __future__ import annotations

import sys
from pathlib import Path

import numpy as np
from scipy.linalg import solve_banded

sys.path.insert(0, str(Path(__file__).parent))
from _bench import machine_line, paired  # noqa: E402

from heatledger import Construction, Layer, fv1d  # noqa: E402

PLAIN_TARGET, PUBLIC_TARGET, FLAT_TARGET, DENSE_TARGET = 1.3, 3.0, 1.2, 200.0
N = 1_000_000


def problem(n: int):
    """An invented wall of n cells with varying conductivity, air on both sides."""
    rng = np.random.default_rng(1)
    widths = np.full(n, 0.3 / n)
    cond = rng.uniform(0.03, 2.0, n)
    return widths, cond, fv1d.surface_to_ambient(20.0, 0.13), fv1d.surface_to_ambient(-5.0, 0.04)


def assembled(widths, cond, left, right):
    """The same tridiagonal system in banded storage, and its right-hand side."""
    half = widths / (2 * cond)
    g = 1 / (half[:-1] + half[1:])
    n = widths.size
    gl, gr = 1 / (half[0] + left.resistance), 1 / (half[-1] + right.resistance)
    ab = np.zeros((3, n))
    ab[0, 1:] = -g
    ab[2, :-1] = -g
    ab[1, :-1] += g
    ab[1, 1:] += g
    ab[1, 0] += gl
    ab[1, -1] += gr
    rhs = np.zeros(n)
    rhs[0], rhs[-1] = gl * left.temperature, gr * right.temperature
    return ab, rhs


def main() -> None:
    print(machine_line())
    w, k, left, right = problem(N)
    ab, rhs = assembled(w, k, left, right)

    def bare():
        return solve_banded((1, 1), ab, rhs)

    t_ref = bare()
    sol = fv1d.solve_conduction(w, k, left, right, refine=False)
    assert np.allclose(sol.temperature, t_ref, rtol=1e-6, atol=1e-6), "not the same system"
    print("1. " + paired("solve_conduction, refine=False (A) / bare solve_banded (B), 1e6",
                         lambda: fv1d.solve_conduction(w, k, left, right, refine=False),
                         bare).line(PLAIN_TARGET))
    print("2. " + paired("solve_conduction, default refinement (A) / bare (B), 1e6",
                         lambda: fv1d.solve_conduction(w, k, left, right), bare).line())
    wall = Construction([Layer(0.0125, 0.21), Layer(0.14, 0.035), Layer(0.1, 0.77)],
                        heat_flow="horizontal")
    screed = Construction([Layer(0.07, 1.4), Layer(0.08, 0.035)], heat_flow="up")

    def public(con, counts, **kw):
        def run():
            res = con.temperatures(20.0, -5.0, nodes_per_layer=counts, **kw)
            return res.mesh_estimate, res.interface_temperatures
        return run

    print("3a. " + paired("Construction.temperatures + mesh estimate, layered wall (A) / "
                          "bare (B), 1e6", public(wall, [333_332, 333_332, 333_336]),
                          bare, pairs=5).line(PUBLIC_TARGET))
    print("3b. " + paired("the same, heated screed, three meshes (A) / bare (B), 1e6",
                          public(screed, [500_000, 500_000], layer_sources={0: 800.0}),
                          bare, pairs=5).line(PUBLIC_TARGET))
    small = problem(1000)
    flat = paired("per cell: default solve at 1e6 (A) / at 1e3 (B)",
                  lambda: fv1d.solve_conduction(w, k, left, right),
                  lambda: [fv1d.solve_conduction(*small) for _ in range(1000)], pairs=5)
    print("4. " + flat.line(FLAT_TARGET))
    w2, k2, l2, r2 = problem(2000)
    ab2, rhs2 = assembled(w2, k2, l2, r2)
    dense = np.diag(ab2[1]) + np.diag(ab2[0, 1:], 1) + np.diag(ab2[2, :-1], -1)
    speed = paired("dense numpy.linalg.solve (A) / solve_conduction (B), 2,000 cells",
                   lambda: np.linalg.solve(dense, rhs2),
                   lambda: fv1d.solve_conduction(w2, k2, l2, r2), pairs=7, inner=5)
    print(f"5. {speed.line()}  (a speed-up; target at least {DENSE_TARGET:g})")


if __name__ == "__main__":
    main()
