"""Benchmark of the moisture family (prints figures; not a test).

    python tests/benchmarks/bench_moisture.py

1. A 12-month Glaser check (``interstitial_condensation``) of a 10-layer construction
   against one U-value evaluation of the same construction (building it and reading
   ``u_value``): the ratio says what a year of monthly vapour diffusion costs in U-values.
   No target; reported.
2. ``HL_CONDENSATION`` on a table never seen before (cache missed: parsing, the build, the
   Glaser year and the spill) against ``HL_UVALUE`` on a new table: the function must stay
   under 1 ms a call; the absolute median is printed beside the ratio.
"""

from __future__ import annotations

import statistics
import sys
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))

from _bench import paired  # noqa: E402

from heatledger import Construction, Layer, MonthlyClimate, interstitial_condensation  # noqa: E402
from heatledger_xl import udfs  # noqa: E402

TE = [-1.0, 0.5, 4.0, 8.5, 13.0, 16.5, 18.5, 18.0, 14.5, 9.5, 4.5, 1.0]  # invented
RHE = [0.88, 0.85, 0.8, 0.74, 0.72, 0.72, 0.73, 0.76, 0.8, 0.85, 0.88, 0.89]
UDF_TARGET_MS = 1.0


def _layers():
    # ten invented layers, vapour-open inside to tighter outside
    return [Layer(0.02 + 0.005 * i, 0.04 + 0.1 * i, name=f"layer {i + 1}",
                  vapour_resistance_factor=1.0 + 20.0 * i) for i in range(10)]


def main() -> None:
    layers = _layers()
    climate = MonthlyClimate(TE, RHE, 20.0, 0.55)
    con = Construction(layers)
    glaser = paired("1. Glaser year of a 10-layer construction vs one U-value",
                    lambda: interstitial_condensation(con, climate),
                    lambda: Construction(layers).u_value, pairs=9, inner=200)
    print(glaser.line())
    clim_rows = [[t, r, 20.0, 0.55] for t, r in zip(TE, RHE, strict=True)]
    counter = iter(range(10**9))

    def table():
        k = next(counter)
        return [["gypsum plasterboard 900", 12.5], ["mineral wool 035", 100 + k % 100000 * 1e-4],
                ["plywood 700", 12.0]]

    udf = paired("2. HL_CONDENSATION (new table) vs HL_UVALUE (new table)",
                 lambda: udfs.HL_CONDENSATION(table(), clim_rows),
                 lambda: udfs.HL_UVALUE(table()), pairs=9, inner=100)
    print(udf.line())
    med = statistics.median(udf.a) * 1e3
    print(f"   HL_CONDENSATION median {med:.3f} ms a call: target < {UDF_TARGET_MS:g} ms "
          f"{'met' if med < UDF_TARGET_MS else 'NOT met'}")


if __name__ == "__main__":
    main()
