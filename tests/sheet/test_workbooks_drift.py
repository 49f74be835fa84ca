"""The committed demo files are what the CLI generates today (no drift).

The workbooks are compared by content (tests/_workbook_compare.py: formulas, text, formats
exactly, numbers to a stated relative tolerance), because another numpy, scipy or BLAS
kernel may change the last bits of a computed constant; byte-for-byte equality is checked
only between two generations in the same environment.
"""

from __future__ import annotations

import io
from pathlib import Path

import openpyxl
import pytest

from heatledger.sheet.workbooks import DEMO_FILES, regenerate
from tests._workbook_compare import RTOL_NUMBERS, differences

COMMITTED = Path(__file__).resolve().parents[2] / "workbooks"


def test_committed_demo_files_match_a_fresh_generation(tmp_path, capsys):
    fresh = regenerate(tmp_path)
    capsys.readouterr()
    for path in fresh:
        committed = COMMITTED / path.name
        assert committed.exists(), f"{path.name} is not committed"
        if path.suffix == ".xlsx":
            found = differences(committed, path)
        else:
            same = committed.read_text(encoding="utf-8") == path.read_text(encoding="utf-8")
            found = [] if same else [f"{path.name} differs"]
        assert not found, (f"{path.name} differs from a fresh generation: {found}; "
                           "regenerate with `python -m heatledger.sheet.workbooks workbooks` "
                           "and commit")


def _edited(path: Path, sheet: str, ref: str, value) -> bytes:
    wb = openpyxl.load_workbook(path)
    wb[sheet][ref] = value
    buf = io.BytesIO()
    wb.save(buf)
    return buf.getvalue()


def test_content_comparison_passes_last_bit_noise_and_catches_changes(tmp_path, capsys):
    audit = regenerate(tmp_path)[2]
    capsys.readouterr()
    wb = openpyxl.load_workbook(audit)
    sheet = next(ws for ws in wb.worksheets if ws.title.startswith("01 "))
    num = next(c for row in sheet.iter_rows() for c in row
               if isinstance(c.value, float) and abs(c.value) > 1e-3)
    form = next(c for row in sheet.iter_rows() for c in row
                if isinstance(c.value, str) and c.value.startswith("="))
    noise = num.value * (1 + 4e-16)  # last-bit noise of another BLAS kernel: passes
    assert differences(audit, _edited(audit, sheet.title, num.coordinate, noise)) == []
    changed = num.value * (1 + 100 * RTOL_NUMBERS)  # a real change: fails
    assert differences(audit, _edited(audit, sheet.title, num.coordinate, changed))
    edited = form.value.replace("=", "=1+", 1)  # another formula: fails
    assert differences(audit, _edited(audit, sheet.title, form.coordinate, edited))


def test_generation_is_repeatable(tmp_path, capsys):
    first = [p.read_bytes() for p in regenerate(tmp_path / "a")]
    second = [p.read_bytes() for p in regenerate(tmp_path / "b")]
    capsys.readouterr()
    assert first == second
    assert len(first) == len(DEMO_FILES)


@pytest.mark.calc
def test_committed_audit_checks_all_ok(recalc):
    import openpyxl

    wb = openpyxl.load_workbook(recalc(COMMITTED / "demo_audit.xlsx"), data_only=True)
    cover = {r[0]: r[1] for r in wb["Cover"].iter_rows(min_col=2, max_col=3, values_only=True)}
    assert cover["State"] == "ALL CHECKS OK"
    assert cover["Check cells in the workbook"] == cover["Check cells that say OK"] > 100
