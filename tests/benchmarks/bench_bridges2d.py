"""Benchmark of the 2-D section solver (prints ratios; not a test).

    python tests/benchmarks/bench_bridges2d.py            # the ratios
    python tests/benchmarks/bench_bridges2d.py --largest  # the largest section that solves

Every figure is a ratio of two pieces of work timed in interleaved pairs (``_bench.py``),
min and median, with the verdict against the target:

1. EN ISO 10211 Annex A case 2 at 0.25 mm cells (380,000 cells) end to end: the section built
   and checked, the grid, the assembly, the solve with its refinement, the heat flows, the
   energy balance and the nine temperatures of the standard read, against a bare
   ``scipy.sparse.linalg.spsolve`` of a 5-point Laplacian of the same size (2,000 x 190,
   assembled beforehand, default ordering). Target 1.5.
2. The same bare solve with the ordering the engine uses (minimum degree on A + A^T):
   what the engine adds to its own factorisation. Reported.
3. The mesh estimate (two more solves, on the grids with every cell halved and with every
   second line removed) read after the solve, against the bare solve. Reported.

``--largest`` solves case 2 on finer and finer grids (cells halved in each direction per
step, up to the engine's cell limit) and prints the cells, the solver, the time and the
peak memory of each, so the largest section that solves on the machine can be read off.
"""

from __future__ import annotations

import resource
import sys
import time
from pathlib import Path

import numpy as np
import scipy.sparse as sp
from scipy.sparse.linalg import spsolve

sys.path.insert(0, str(Path(__file__).parent))
sys.path.insert(0, str(Path(__file__).parents[2]))
from _bench import machine_line, paired  # noqa: E402

from heatledger import HeatLedgerError  # noqa: E402
from tests.bridges2d.test_iso10211_annex_a import CASE_2_POINTS, MM, case_2  # noqa: E402

END_TO_END_TARGET = 1.5
MAX_CELL = 0.25 * MM


def laplacian(nx: int, ny: int):
    """A 5-point Laplacian on nx by ny cells, fixed values around it (CSC), and a
    right-hand side."""
    tx = sp.diags([-np.ones(nx - 1), 2 * np.ones(nx), -np.ones(nx - 1)], [-1, 0, 1])
    ty = sp.diags([-np.ones(ny - 1), 2 * np.ones(ny), -np.ones(ny - 1)], [-1, 0, 1])
    matrix = sp.kronsum(tx, ty, format="csc")
    return matrix, np.random.default_rng(1).uniform(0.0, 20.0, nx * ny)


def end_to_end():
    res = case_2().solve(MAX_CELL)
    temps = [res.temperature_at(x * MM, y * MM) for x, y, _ in CASE_2_POINTS.values()]
    return res.heat_flow("inside"), res.energy_residual, temps


def main() -> None:
    print(machine_line())
    res = case_2().solve(MAX_CELL)
    nx, ny = res.settings["grid"]
    print(f"case 2 at {MAX_CELL * 1e3:g} mm: {res.cells:,} cells ({nx} x {ny}), "
          f"{res.solver}, {res.settings['steps']} refinement step(s); heat flow "
          f"{res.heat_flow('inside'):.4f} W/m, energy residual {res.energy_residual:.1e}")
    matrix, rhs = laplacian(nx, ny)
    assert matrix.shape[0] == res.cells, "not the same size"

    def bare():
        return spsolve(matrix, rhs)

    def bare_same_ordering():
        return spsolve(matrix, rhs, permc_spec="MMD_AT_PLUS_A")

    print("1. " + paired("case 2 end to end (A) / bare spsolve, 5-point Laplacian (B)",
                         end_to_end, bare, pairs=5).line(END_TO_END_TARGET))
    print("2. " + paired("case 2 end to end (A) / bare spsolve, the engine's ordering (B)",
                         end_to_end, bare_same_ordering, pairs=5).line())

    def with_estimate():
        return case_2().solve(MAX_CELL).mesh_estimate

    est = with_estimate()
    print(f"   mesh estimate: meshes {est.meshes}, order {est.order:.2f}, "
          f"extrapolated {est.extrapolated:.4f} W/m, bound {est.error_estimate:.1e} W/m")
    print("3. " + paired("case 2 with its mesh estimate read (A) / bare spsolve (B)",
                         with_estimate, bare, pairs=3).line())


def largest() -> None:
    print(machine_line())
    sec = case_2()
    max_cell = 0.5 * MM
    while True:
        cells = sec.cells_for(max_cell)
        t0 = time.perf_counter()
        try:
            res = sec.solve(max_cell)
        except (HeatLedgerError, MemoryError) as exc:
            print(f"max_cell {max_cell * 1e3:.4g} mm, {cells:,} cells: not solved ({exc})")
            break
        took = time.perf_counter() - t0
        peak = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1e6
        print(f"max_cell {max_cell * 1e3:.4g} mm: {res.cells:,} cells, {res.solver}, "
              f"{res.settings['steps']} steps, {took:.1f} s, peak memory {peak:.1f} GB, "
              f"heat flow {res.heat_flow('inside'):.4f} W/m, residual "
              f"{res.energy_residual:.1e}", flush=True)
        del res
        max_cell /= 2 ** 0.5


if __name__ == "__main__":
    largest() if "--largest" in sys.argv else main()
