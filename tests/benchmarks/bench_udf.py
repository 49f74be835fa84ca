"""Benchmark of the construction spreadsheet functions (prints figures; not a test).

    python tests/benchmarks/bench_udf.py

Every figure is a ratio of two kinds of work timed in alternating batches (so a change of
machine load affects both alike), reported as min and median over the batches, with the
verdict against the target. Absolute microseconds are printed beside them with the load
average of the machine, for the record only.

1. Recalculation: every table of a workbook computed once, then recalculated. Per-call
   time of a recalculation over 5,000 distinct tables against one over 256 distinct
   tables. Target: at most 2 (the cache holds both). The same with the cache cut to the
   memory of 256 tables (its former size) shows what the target guards against.
2. ``HL_UVALUE`` on a table never seen before (cache missed) against a plain-Python
   reference doing the same arithmetic on the same cells (library lookups, d/lambda,
   ISO 6946 Annex D air layer, bridging upper and lower limits, U = 1/R_T): the price of
   the checks, messages and result objects. Median Python time target: under 50 us for a
   6-layer table. Two kinds of new table: every row new, and one row changed (a designer
   trying insulation thicknesses: the other rows come from the row cache).
3. ``HL_NODE_TEMPS`` against the engine's ``Construction.temperatures`` on the same cached
   construction: the function pays for no mesh estimate it does not show (the engine
   computes it only when read); what remains is its ladder check and the spill.
4. ``HL_THICKNESS`` (closed form for a plain layer) against Brent's method on the same
   construction (a U-value evaluation per iteration, the former path).
5. Memory of the construction cache holding the 5,000 tables: measured against the
   estimate the cache budgets with.
"""

from __future__ import annotations

import gc
import math
import os
import statistics
import time
import tracemalloc

from scipy.optimize import brentq

from heatledger.airlayers import air_layer_resistance
from heatledger.constructions import required_thickness
from heatledger_xl import udfs
from heatledger_xl.ranges import LIBRARY, _cached_layer

RECALC_RATIO_TARGET = 2.0
NEW_TABLE_TARGET_US = 50.0
REPEATS = 15
SIGMA = 5.670374419e-8  # Stefan-Boltzmann constant [W/(m2 K4)] (CODATA 2018)


def wall(k: int, all_new: bool = True) -> list[list]:
    """An invented 6-layer timber-frame wall; table ``k`` differs from every other one in
    every row (``all_new``) or in the insulation thickness only."""
    e = k * 1e-4 if all_new else 0.0
    return [
        ["gypsum plasterboard 900", 12.5 + e, None, None, None, None],
        ["timber frame", 140.0 + k * 1e-3, 0.035, None, 0.15, "softwood 500"],
        ["osb", 12.0 + e, 0.13, None, None, None],
        ["air", 25.0 + e, None, None, None, None],
        ["brick", 102.0 + e, 0.77, None, None, None],
        ["render", 15.0 + e, 1.0, None, None, None],
    ]


def fresh(tables):
    """New list objects for every call, as xlwings hands a function its range."""
    return [[list(r) for r in t] for t in tables]


def reference_u(cells) -> float:
    """Plain-Python U-value of the bench wall from its cells: the same arithmetic as the
    engine (EN ISO 6946:2017 6.7.1, 6.7.2 and Annex D), no checks, no result objects."""
    rsi, rse = 0.13, 0.04
    r_plain, bridged = 0.0, []
    for name, d_mm, lam, _, frac, lam_b in cells:
        d = d_mm / 1000.0
        if name == "air":  # Annex D: 1/(ha + E hro), ha = max(1.25, 0.025/d), 10 degC mean
            e = 1.0 / (1.0 / 0.9 + 1.0 / 0.9 - 1.0)
            r_plain += 1.0 / (max(1.25, 0.025 / d) + e * 4.0 * SIGMA * 283.15 ** 3)
        elif frac is not None:
            lam_b = LIBRARY.get(lam_b).conductivity if isinstance(lam_b, str) else lam_b
            bridged.append((d, ((lam, 1.0 - frac), (lam_b, frac))))
        else:
            lam = lam if lam is not None else LIBRARY.get(name).conductivity
            r_plain += d / lam
    base = rsi + r_plain + rse
    (d, parts), = bridged
    upper = 1.0 / sum(f / (base + d / lam) for lam, f in parts)
    lower = base + d / sum(lam * f for lam, f in parts)
    return 1.0 / (0.5 * (upper + lower))


def timed(fn, calls) -> float:
    """Mean time per call over ``calls`` (each a tuple of arguments). [us]"""
    t0 = time.perf_counter_ns()
    for a in calls:
        fn(*a)
    return (time.perf_counter_ns() - t0) / len(calls) / 1000.0


def paired(make_a, fn_a, make_b, fn_b):
    """Alternating batches (a then b, b then a, ...): per-call times of a and b and their
    ratios a/b. ``make_x(r)`` prepares batch ``r`` of x (untimed) just before it runs.
    [us, us, -]"""
    ta, tb = [], []
    for r in range(REPEATS):
        for make, fn, out in ((make_a, fn_a, ta), (make_b, fn_b, tb))[::1 if r % 2 else -1]:
            calls = make(r)
            gc.collect()
            out.append(timed(fn, calls))
    return ta, tb, [a / b for a, b in zip(ta, tb, strict=True)]


def verdict(value: float, target: float) -> str:
    return "met" if value <= target else "NOT met"


def line(label: str, ratios, target: float | None = None) -> str:
    out = f"  {label:<58s} min {min(ratios):6.2f}  median {statistics.median(ratios):6.2f}"
    if target is not None:
        out += f"   target <= {target:g}: {verdict(statistics.median(ratios), target)}"
    return out


def recalculation(budget_bytes: int):
    """Ratio of per-call times: recalculating a workbook of 5,000 tables against one of 256,
    each workbook calculated once (untimed) just before, as when it is opened."""
    big = [wall(k) for k in range(5000)]
    small = [wall(k) for k in range(10_000, 10_256)]
    udfs.CONSTRUCTIONS.clear()
    udfs.CONSTRUCTIONS.budget_bytes = budget_bytes

    def workbook(tables):
        def make(r):
            for t in fresh(tables):  # the workbook calculated when opened
                udfs.HL_UVALUE(t)
            return [(t,) for t in fresh(tables)]
        return make

    try:
        return paired(workbook(big), udfs.HL_UVALUE, workbook(small), udfs.HL_UVALUE)
    finally:
        udfs.CONSTRUCTIONS.budget_bytes = udfs.CACHE_BYTES
        udfs.CONSTRUCTIONS.clear()


def new_tables(all_new: bool):
    """HL_UVALUE and the reference on tables never seen before, interleaved."""
    counter = iter(range(20_000, 10**9))
    if not all_new:  # the unchanged rows are known from earlier tables
        for t in fresh([wall(k, all_new=False) for k in range(3)]):
            udfs.HL_UVALUE(t)
    batch = 300

    def make(r):
        return [(t,) for t in fresh([wall(next(counter), all_new) for _ in range(batch)])]

    table = wall(12_345)
    assert math.isclose(udfs.HL_UVALUE(table), reference_u(table), rel_tol=1e-9)
    return paired(make, udfs.HL_UVALUE, make, reference_u)


def tnodes():
    table = wall(7)
    c = udfs._construction(table, None, None, None)
    calls = [(table, 20.0, -5.0, None, None, None, 4)] * 200
    engine_calls = [(20.0, -5.0)] * 200
    return paired(lambda r: calls, udfs.HL_NODE_TEMPS, lambda r: engine_calls,
                  lambda ti, te: c.temperatures(ti, te, nodes_per_layer=4))


def thickness():
    table = [["gypsum plasterboard 900", 12.5], ["mineral wool 035", 100], ["block", 150, 1.35],
             ["air", 25], ["brick", 102, 0.77], ["render", 15, 1.0]]
    c = udfs._construction(table, None, None, None)
    layer = c.layers[1]

    def iterative(target):  # the former path: Brent's method, a U-value per iteration
        return brentq(lambda d: c.with_layer(1, layer.with_thickness(d)).u_value - target,
                      1e-4, 2.0, xtol=1e-9, rtol=1e-12)

    assert math.isclose(iterative(0.18), required_thickness(c, 1, 0.18), abs_tol=1e-8)
    return paired(lambda r: [(table, 2, 0.18)] * 200, udfs.HL_THICKNESS,
                  lambda r: [(0.18,)] * 50, iterative)


def cache_memory() -> tuple[float, float]:
    """Measured and estimated bytes per entry of the cache holding 5,000 tables."""
    udfs.CONSTRUCTIONS.clear()
    _cached_layer.cache_clear()
    tables = fresh([wall(k) for k in range(30_000, 35_000)])
    gc.collect()
    tracemalloc.start()
    before = tracemalloc.get_traced_memory()[0]
    for t in tables:
        udfs.HL_UVALUE(t)
    del tables
    _cached_layer.cache_clear()  # count what the table cache alone keeps alive
    gc.collect()
    after = tracemalloc.get_traced_memory()[0]
    tracemalloc.stop()
    n = len(udfs.CONSTRUCTIONS)
    measured, estimated = (after - before) / n, udfs.CONSTRUCTIONS.size_bytes / n
    udfs.CONSTRUCTIONS.clear()
    return measured, estimated


def main() -> None:
    load = os.getloadavg()
    print(f"machine: {os.cpu_count()} cores, load average {load[0]:.2f} {load[1]:.2f} "
          f"{load[2]:.2f} (1, 5, 15 min)")
    value = udfs.HL_UVALUE(wall(0))
    print(f"HL_UVALUE of the bench wall: {value:.4f} W/(m2 K); air layer "
          f"{air_layer_resistance(0.025, 'horizontal'):.3f} m2 K/W")
    measured, estimated = cache_memory()
    entries = udfs.CACHE_BYTES / estimated

    print("\n1. recalculation, per call: 5,000 distinct tables / 256 distinct tables")
    t_big, t_small, ratio = recalculation(udfs.CACHE_BYTES)
    print(line(f"cache {udfs.CACHE_BYTES / 2**20:.0f} MiB (~{entries:,.0f} such tables)", ratio,
               RECALC_RATIO_TARGET))
    print(f"  {'':<58s} {statistics.median(t_big):.1f} us / {statistics.median(t_small):.1f} us")
    _, _, ratio_old = recalculation(int(256 * estimated))
    print(line("cache cut to 256 tables (the former size)", ratio_old))

    print("\n2. HL_UVALUE on a new 6-layer table / plain-Python reference, same cells")
    for all_new, label in ((True, "every row new"), (False, "one row changed")):
        t_fn, t_ref, ratio = new_tables(all_new)
        med = statistics.median(t_fn)
        print(line(label, ratio))
        print(f"  {'':<58s} median {med:.1f} us (reference {statistics.median(t_ref):.1f} us)"
              f"   target < {NEW_TABLE_TARGET_US:g} us: {verdict(med, NEW_TABLE_TARGET_US)}")

    print("\n3. HL_NODE_TEMPS (one solve, ladder check) / Construction.temperatures (one solve; "
          "its mesh estimate is computed only when read)")
    t_fn, t_eng, ratio = tnodes()
    print(line("6 layers x 4 cells, construction cached", ratio))
    print(f"  {'':<58s} {statistics.median(t_fn):.1f} us / {statistics.median(t_eng):.1f} us")

    print("\n4. HL_THICKNESS (closed form) / Brent's method on the same construction")
    t_fn, t_it, ratio = thickness()
    print(line("plain insulation layer of a 6-layer wall", ratio))
    print(f"  {'':<58s} {statistics.median(t_fn):.1f} us / {statistics.median(t_it):.1f} us")

    print("\n5. construction cache memory per 6-layer table (tracemalloc)")
    print(f"  measured {measured:,.0f} B, estimated {estimated:,.0f} B; budget "
          f"{udfs.CACHE_BYTES / 2**20:.0f} MiB holds ~{entries:,.0f} such tables "
          f"(~{udfs.CACHE_BYTES / measured:,.0f} by the measured size)")


if __name__ == "__main__":
    main()
