"""The committed demo workbooks are exactly what the CLI generates today (no drift)."""

from __future__ import annotations

from pathlib import Path

import pytest

from heatledger.sheet.workbooks import DEMO_FILES, regenerate

COMMITTED = Path(__file__).resolve().parents[1] / "workbooks"


def test_committed_demo_files_match_a_fresh_generation(tmp_path, capsys):
    fresh = regenerate(tmp_path)
    capsys.readouterr()
    stale = [p.name for p in fresh if not (COMMITTED / p.name).exists()
             or (COMMITTED / p.name).read_bytes() != p.read_bytes()]
    assert not stale, (f"{stale} differ from a fresh generation; regenerate with "
                       "`python -m heatledger.sheet.workbooks workbooks` and commit")


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
