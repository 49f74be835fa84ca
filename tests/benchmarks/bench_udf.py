"""Benchmark of the U-value spreadsheet function (prints figures; not a test).

    python tests/benchmarks/bench_udf.py

Median Python time per call of ``HL_UVALUE`` for a 6-layer table (an invented wall given
as the 2-D list xlwings hands the function). Target: under 100 microseconds.

1. repeated identical calls (a workbook recalculating unchanged cells: the cache answers);
2. distinct tables every call (cache missed: parse, build the Construction, U-value);
3. where the time of a cache miss goes: parsing the range vs building the engine's
   Construction.
"""

from __future__ import annotations

import statistics
import time

from heatledger_xl import udfs
from heatledger_xl.ranges import build_construction, layer_rows

TARGET_US = 100.0
BATCH = 200
REPEATS = 60


def wall(extra_mm: float = 0.0) -> list[list]:
    return [
        ["gypsum plasterboard 900", 12.5, None, None, None, None],
        ["timber frame", 140.0 + extra_mm, 0.035, None, 0.15, "softwood 500"],
        ["osb", 12.0, 0.13, None, None, None],
        ["air", 25.0, None, None, None, None],
        ["brick", 102.0, 0.77, None, None, None],
        ["render", 15.0, 1.0, None, None, None],
    ]


def per_call_us(fn, make_args) -> float:
    """Median over REPEATS batches of the mean time per call in a batch. [us]"""
    samples = []
    for r in range(REPEATS):
        args = [make_args(r * BATCH + i) for i in range(BATCH)]
        t0 = time.perf_counter_ns()
        for a in args:
            fn(*a)
        samples.append((time.perf_counter_ns() - t0) / BATCH / 1000.0)
    return statistics.median(samples)


def main() -> None:
    table = wall()
    value = udfs.HL_UVALUE(table)
    assert isinstance(value, float), value
    hit = per_call_us(udfs.HL_UVALUE, lambda i: (table,))
    miss = per_call_us(udfs.HL_UVALUE, lambda i: (wall(i * 1e-3),))
    rows = layer_rows("layers", wall())
    parse = per_call_us(layer_rows, lambda i: ("layers", wall(i * 1e-3)))
    build = per_call_us(build_construction, lambda i: (rows, "horizontal", None, None))
    print(f"HL_UVALUE, 6-layer table (U = {value:.4f} W/(m2 K)), median Python time per call:")
    print(f"  identical calls (cache hit):   {hit:7.1f} us   target < {TARGET_US:.0f} us: "
          f"{'met' if hit < TARGET_US else 'NOT met'}")
    print(f"  distinct tables (cache miss):  {miss:7.1f} us   target < {TARGET_US:.0f} us: "
          f"{'met' if miss < TARGET_US else 'NOT met'}")
    print(f"    of which parsing the range:  {parse:7.1f} us")
    print(f"    of which engine Construction:{build:7.1f} us (layers, bridging limits, U)")


if __name__ == "__main__":
    main()
