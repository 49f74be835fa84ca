"""Benchmark of the audit workbook writer and of its recalculation (prints ratios; not a test).

    python tests/benchmarks/bench_audit.py [N] [--no-calc]

1. Writing: the audit workbook of a generated project of N constructions (default 200: the
   four constructions of the invented demo, repeated with varied thicknesses), everything
   included (the engine's temperatures per construction, the sheet plan, rendering and the
   deterministic zip), against openpyxl writing the same cells (the same values and formulas,
   no styles, charts or logic) to an in-memory file. Target: at most 1.5x.
2. Recalculating: LibreOffice Calc (headless, throw-away profile) loading, recalculating and
   saving the demo audit, against the same for a workbook of the same cells written by plain
   openpyxl: what our styles, charts and layout cost the spreadsheet program. Skipped without
   ``soffice``.
Both are timed in interleaved pairs (see ``_bench.py``).
"""

from __future__ import annotations

import copy
import io
import shutil
import subprocess
import sys
import tempfile
from pathlib import Path

from _bench import machine_line, paired
from openpyxl import Workbook

from heatledger.demo import demo_project
from heatledger.project import project_from_dict
from heatledger.sheet.audit import audit_bytes, audit_plan
from heatledger.sheet.plan import split_ref

WRITE_TARGET = 1.5


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


def same_cells(project):
    """The audit's cells per sheet: (sheet name, [(row, column, value or formula)])."""
    plan = audit_plan(project)
    return [(s.name, [(*split_ref(c.ref), c.formula if c.formula else c.value)
                      for c in s.cells()]) for s in plan.sheets]


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


def bench_write(n: int) -> None:
    project = generated_project(n)
    cells = same_cells(project)
    count = sum(len(c) for _n, c in cells)
    print(f"audit workbook: {n} constructions, {len(cells)} sheets, {count} cells")
    result = paired("  write: heatledger audit (A) / openpyxl same cells (B)",
                    lambda: audit_bytes(project), lambda: plain_openpyxl(cells), pairs=5)
    print(result.line(WRITE_TARGET))


def _recalculate(soffice: str, path: Path, work: Path) -> None:
    profile = work / "profile"
    out = work / "out"
    shutil.rmtree(out, ignore_errors=True)
    subprocess.run([soffice, f"-env:UserInstallation={profile.as_uri()}", "--headless",
                    "--norestore", "--nolockcheck", "--convert-to", "xlsx", "--outdir",
                    str(out), str(path)], check=True, capture_output=True, timeout=600)


def bench_recalculation() -> None:
    soffice = shutil.which("soffice") or shutil.which("libreoffice")
    if not soffice:
        print("  recalculation: skipped (LibreOffice's soffice is not on PATH)")
        return
    project = demo_project()
    with tempfile.TemporaryDirectory() as tmp:
        tmp = Path(tmp)
        ours, plain = tmp / "a" / "audit.xlsx", tmp / "b" / "audit.xlsx"
        ours.parent.mkdir(), plain.parent.mkdir()
        ours.write_bytes(audit_bytes(project))
        plain.write_bytes(plain_openpyxl(same_cells(project)))
        result = paired("  recalculate the demo audit in LibreOffice (A) / same cells, plain (B)",
                        lambda: _recalculate(soffice, ours, tmp / "wa"),
                        lambda: _recalculate(soffice, plain, tmp / "wb"), pairs=3)
        print(result.line())


def main(argv: list[str]) -> None:
    n = int(next((a for a in argv if a.isdigit()), 200))
    print(machine_line())
    bench_write(n)
    if "--no-calc" not in argv:
        bench_recalculation()


if __name__ == "__main__":
    main(sys.argv[1:])
