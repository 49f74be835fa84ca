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
    # every public name is loaded (the package loads them on first use)
    code = ("import sys; from heatledger import *; "
            "bad = [m for m in ('openpyxl', 'xlwings', 'heatledger.sheet') if m in sys.modules];"
            "print(','.join(bad))")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         check=True).stdout.strip()
    assert out == "", f"importing heatledger pulled in: {out}"


def test_engine_start_up_leaves_slow_scipy_parts_until_used():
    # start-up cost (README "Performance"): with every public name loaded, scipy.optimize,
    # scipy.special and scipy.constants are not imported until a root-finding, Bessel or
    # constant is needed; the constants are computed from the SI defining constants instead
    code = ("import sys; from heatledger import *; "
            "slow = ('scipy.optimize', 'scipy.special', 'scipy.constants');"
            "print(','.join(m for m in slow if m in sys.modules))")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         check=True).stdout.strip()
    assert out == "", f"loading heatledger's public names imported: {out}"


def test_import_heatledger_alone_loads_no_numerical_library():
    code = "import sys, heatledger; print('numpy' in sys.modules, 'scipy' in sys.modules)"
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         check=True).stdout.split()
    assert out == ["False", "False"]


def test_every_public_name_resolves_and_lists():
    import heatledger

    missing = [name for name in heatledger.__all__ if not hasattr(heatledger, name)]
    assert not missing
    assert set(heatledger.__all__) <= set(dir(heatledger))
    with pytest.raises(AttributeError, match="no attribute 'not_a_name'"):
        heatledger.not_a_name  # noqa: B018


def test_command_help_does_not_load_the_engine():
    # `heatledger --help` answers at once: argparse only, no numpy, scipy or engine module
    code = ("import sys; from heatledger.cli import main\n"
            "try:\n    main(['--help'])\nexcept SystemExit:\n    pass\n"
            "heavy = ('numpy', 'scipy', 'heatledger.constructions', 'heatledger.project');"
            "print(','.join(m for m in heavy if m in sys.modules), file=sys.stderr)")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         check=True).stderr.strip()
    assert out == "", f"heatledger --help imported: {out}"
