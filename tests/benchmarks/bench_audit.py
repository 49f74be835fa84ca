"""Benchmark of the audit workbook writer (prints a ratio; not a test).

    python tests/benchmarks/bench_audit.py [N]

Writes the audit workbook of a generated project of N constructions (default 200: the four
constructions of the invented demo, repeated with varied thicknesses) and compares the time
with openpyxl writing the same cells (the same values and formulas, no styles, charts or
logic) to an in-memory file. The audit time includes everything: the engine's temperatures
per construction, the sheet plan, rendering and the deterministic zip.
Target (DESIGN.md section 10): ratio at most 2.
"""

from __future__ import annotations

import copy
import io
import statistics
import sys
import time

from openpyxl import Workbook

from heatledger.cli import demo_project
from heatledger.project import project_from_dict
from heatledger.sheet.audit import audit_bytes, audit_plan
from heatledger.sheet.plan import split_ref


def generated_project(n: int):
    """An invented project of ``n`` constructions derived from the demo's."""
    raw = demo_project().raw
    base = raw["constructions"]
    data = {k: copy.deepcopy(v) for k, v in raw.items()
            if k in ("project", "design", "materials")}  # constructions only, no rooms
    data["constructions"] = []
    for i in range(n):
        con = copy.deepcopy(base[i % len(base)])
        con["name"] = f"{con['name'][:24]} v{i + 1:03d}"
        for layer in con["layers"]:
            layer["thickness_mm"] = float(layer["thickness_mm"]) * (1.0 + 0.01 * (i % 7))
        data["constructions"].append(con)
    return project_from_dict(data, source_bytes=b"generated", source_name="generated.toml")


def plain_openpyxl(cells_by_sheet) -> bytes:
    """openpyxl writing the same cells, nothing else."""
    wb = Workbook()
    wb.remove(wb.active)
    for name, cells in cells_by_sheet:
        ws = wb.create_sheet(name)
        for row, col, value in cells:
            ws.cell(row=row, column=col, value=value)
    buf = io.BytesIO()
    wb.save(buf)
    return buf.getvalue()


def _median(fn, repeats):
    times = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


def main(n: int = 200, repeats: int = 3) -> float:
    project = generated_project(n)
    plan = audit_plan(project)
    cells = [(s.name, [(*split_ref(c.ref), c.formula if c.formula else c.value)
                       for c in s.cells()]) for s in plan.sheets]
    count = sum(len(c) for _n, c in cells)
    t_audit = _median(lambda: audit_bytes(project), repeats)
    t_plain = _median(lambda: plain_openpyxl(cells), repeats)
    ratio = t_audit / t_plain
    print(f"audit workbook: {n} constructions, {len(plan.sheets)} sheets, {count} cells")
    print(f"  heatledger audit (engine + plan + render + zip): {t_audit:.3f} s")
    print(f"  openpyxl, same cells, no logic:                  {t_plain:.3f} s")
    print(f"  ratio: {ratio:.2f} (target at most 2)")
    return ratio


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 200)
