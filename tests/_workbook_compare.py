"""Compare two .xlsx workbooks by content, not by bytes.

A workbook generated on another machine may differ from the committed one in the last bits of
a computed constant (another numpy, scipy or BLAS kernel), so the committed demo workbooks are
compared with a fresh generation cell by cell: sheet order, formulas and text exactly, numbers
to :data:`RTOL_NUMBERS`, and number formats, styles and merged ranges exactly.
"""

from __future__ import annotations

import io
import math
from pathlib import Path

import openpyxl
from openpyxl.worksheet.formula import ArrayFormula

from tests.tolerances import ATOL_WORKBOOK, RTOL_WORKBOOK

RTOL_NUMBERS = RTOL_WORKBOOK  # tests/tolerances.py
ATOL_NUMBERS = ATOL_WORKBOOK  # tests/tolerances.py


def _load(source):
    data = Path(source).read_bytes() if not isinstance(source, bytes) else source
    return openpyxl.load_workbook(io.BytesIO(data))


def _plain(value):
    """An array formula as its range and text; anything else as it is."""
    if isinstance(value, ArrayFormula):
        return ("array formula", value.ref, value.text)
    return value


def _same_value(a, b) -> bool:
    a, b = _plain(a), _plain(b)
    numbers = (int, float)
    if isinstance(a, numbers) and isinstance(b, numbers) and not isinstance(a, bool) \
            and not isinstance(b, bool):
        return math.isclose(a, b, rel_tol=RTOL_NUMBERS, abs_tol=ATOL_NUMBERS)
    return a == b


def differences(expected, actual, *, most: int = 20) -> list[str]:
    """Where ``actual`` differs in content from ``expected`` (paths or bytes), at most
    ``most`` lines; an empty list when they agree."""
    wa, wb = _load(expected), _load(actual)
    out: list[str] = []
    if wa.sheetnames != wb.sheetnames:
        return [f"sheets differ: {wa.sheetnames} != {wb.sheetnames}"]
    for name in wa.sheetnames:
        sa, sb = wa[name], wb[name]
        if sorted(map(str, sa.merged_cells.ranges)) != sorted(map(str, sb.merged_cells.ranges)):
            out.append(f"{name}: merged ranges differ")
        cells_a = {c.coordinate: c for row in sa.iter_rows() for c in row}
        cells_b = {c.coordinate: c for row in sb.iter_rows() for c in row}
        for ref in sorted(set(cells_a) | set(cells_b)):
            ca, cb = cells_a.get(ref), cells_b.get(ref)
            va = None if ca is None else ca.value
            vb = None if cb is None else cb.value
            if not _same_value(va, vb):
                out.append(f"{name}!{ref}: {va!r} != {vb!r}")
            elif ca is not None and cb is not None and (
                    ca.number_format != cb.number_format or ca.style != cb.style):
                out.append(f"{name}!{ref}: format {ca.number_format!r}/{ca.style!r} != "
                           f"{cb.number_format!r}/{cb.style!r}")
            if len(out) >= most:
                return out
    return out
