"""Benchmark: the finite-volume fin with a temperature-dependent h at 100,000 cells.

    python tests/benchmarks/bench_fins.py

Plain script (not a test). Each figure is the fin solve as a ratio to one linear solve of the
same size (``solve_conduction`` with a constant h), timed in interleaved pairs
(``_bench.py``), min and median. The default path is what a user calls: Newton iterations
refined only near convergence, and the mesh estimate from three meshes (here 6,250, 25,000
and 100,000 cells) solved coarse to fine, each started from the converged solution of the
mesh before it. Target for that path: at most 5x one linear solve. Scenario
(invented): an aluminium plate fin, 100 mm long, 2 mm thick, 100 mm wide, base at 80 degC
in 20 degC air, natural convection h = 1.32 dT^0.25 W/(m2 K), optionally with radiation.
"""

from __future__ import annotations

import sys
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).parent))
from _bench import machine_line, paired  # noqa: E402

from heatledger.fins import PowerLawCoefficient, solve_fin_fv  # noqa: E402
from heatledger.fv1d import fixed_flux, fixed_temperature, solve_conduction  # noqa: E402

NODES = 100_000
TARGET = 5.0
LENGTH, K, THICK, WIDTH = 0.1, 200.0, 0.002, 0.1
A_C, P = WIDTH * THICK, 2 * (WIDTH + THICK)
T_B, T_INF = 80.0, 20.0


def linear_solve():
    """One linear fin solve of the same size through solve_conduction (constant h)."""
    dx = LENGTH / NODES
    h = 5.0
    return solve_conduction(np.full(NODES, dx), np.full(NODES, K), fixed_temperature(T_B),
                            fixed_flux(0.0), area=A_C,
                            source=np.full(NODES, h * P * dx * T_INF),
                            source_slope=np.full(NODES, -h * P * dx))


def fin(linearisation="newton", emissivity=0.0, mesh_estimate=True):
    return solve_fin_fv(LENGTH, K, PowerLawCoefficient(1.32, 0.25), area=A_C, perimeter=P,
                        temp_base=T_B, temp_fluid=T_INF, nodes=NODES, tip="convective",
                        emissivity=emissivity, linearisation=linearisation,
                        tolerance=1e-8, mesh_estimate=mesh_estimate)


def main() -> None:
    print(machine_line())
    print(f"cells: {NODES:,}")
    cases = [
        ("h(T), Newton, with the mesh estimate (default)", {}, TARGET),
        ("h(T), Newton, no mesh estimate", {"mesh_estimate": False}, None),
        ("h(T), Picard, no mesh estimate", {"linearisation": "picard", "mesh_estimate": False},
         None),
        ("h(T) + radiation, Newton, with the mesh estimate", {"emissivity": 0.85}, None),
    ]
    for label, kw, target in cases:
        res = fin(**kw)
        line = paired(f"{label} (A) / one linear solve (B)", lambda kw=kw: fin(**kw),
                      linear_solve, pairs=15, inner=3).line(target)
        est = res.mesh_estimate
        extra = (f"; estimate {est.error_estimate:.1e} W, {est.basis}" if est else "")
        print(f"{line}\n    {res.iterations} Newton/Picard solves, last change "
              f"{res.converged_change:.1e} K, energy residual {res.energy_residual:.1e}{extra}")


if __name__ == "__main__":
    main()
