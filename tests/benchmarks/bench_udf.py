"""Benchmark of the U-value spreadsheet function (prints figures; not a test).

    python tests/benchmarks/bench_udf.py

Median Python time per call of ``HL_UVALUE`` for a 6-layer table (an invented wall given
as the 2-D list xlwings hands the function). Target: under 100 microseconds.

1. repeated identical calls (a workbook recalculating unchanged cells: the cache answers);
2. distinct tables every call (cache missed: parse, build the Construction, U-value);
3. where the time of a cache miss goes: reading the range into layer objects (the
   add-in), building the engine's Construction from them, and within that the ISO 6946
   Annex D air-layer resistance for one plain-float thickness (its math fast path).
"""

from __future__ import annotations

import statistics
import time

from heatledger.airlayers import air_layer_resistance
from heatledger.constructions import Construction
from heatledger_xl import udfs
from heatledger_xl.ranges import _layer, layer_rows

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
    layers = [_layer("layers", i, cells) for i, cells in rows]
    parse = per_call_us(lambda t: [_layer("layers", i, c) for i, c in layer_rows("layers", t)],
                        lambda i: (wall(i * 1e-3),))
    build = per_call_us(Construction, lambda i: (layers, "horizontal"))
    air = per_call_us(air_layer_resistance, lambda i: (0.025, "horizontal"))
    print(f"HL_UVALUE, 6-layer table (U = {value:.4f} W/(m2 K)), median Python time per call:")
    print(f"  identical calls (cache hit):   {hit:7.1f} us   target < {TARGET_US:.0f} us: "
          f"{'met' if hit < TARGET_US else 'NOT met'}")
    print(f"  distinct tables (cache miss):  {miss:7.1f} us   target < {TARGET_US:.0f} us: "
          f"{'met' if miss < TARGET_US else 'NOT met'}")
    print(f"    range -> layer objects (add-in):      {parse:7.1f} us")
    print(f"    engine Construction from the layers:  {build:7.1f} us")
    print(f"      of which one air_layer_resistance:  {air:7.1f} us (plain float: math path)")


if __name__ == "__main__":
    main()
