"""Standing checks of the tree: ruff lint, engine import with core dependencies only, and no
reference to where the method was first taught."""

import shutil
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]


def test_ruff_clean():
    ruff = shutil.which("ruff") or str(Path(sys.executable).with_name("ruff"))
    if not Path(ruff).exists():
        pytest.fail("ruff is not installed; it is part of the test extra")
    result = subprocess.run([ruff, "check", "--no-cache", str(ROOT)], capture_output=True,
                            text=True)
    assert result.returncode == 0, result.stdout + result.stderr


def test_engine_imports_without_sheet_or_addin_libraries():
    # DESIGN.md section 2: the engine never imports the sheet layer or xlwings
    code = ("import sys, heatledger; "
            "bad = [m for m in ('openpyxl', 'xlwings', 'heatledger.sheet') if m in sys.modules];"
            "print(','.join(bad))")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         check=True).stdout.strip()
    assert out == "", f"importing heatledger pulled in: {out}"
