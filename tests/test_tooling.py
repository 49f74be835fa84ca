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


def _loaded_after(setup: str, names) -> list[str]:
    """Which of ``names`` a fresh interpreter has imported after running ``setup``."""
    code = (f"import sys\n{setup}\n"
            f"print(','.join(m for m in {tuple(names)!r} if m in sys.modules))")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         check=True).stdout.strip()
    return [m for m in out.split(",") if m]


def test_engine_imports_without_sheet_or_addin_libraries():
    # DEVELOPERS.md, "Architecture in a page": the engine never imports the sheet layer or
    # xlwings; every public name is loaded (the package loads them on first use)
    assert _loaded_after("from heatledger import *",
                         ("openpyxl", "xlwings", "heatledger.sheet")) == []


def test_engine_start_up_leaves_slow_scipy_parts_until_used():
    # start-up cost (README "Performance"): with every public name loaded, scipy.optimize,
    # scipy.special and scipy.constants are not imported until a root-finding, Bessel or
    # constant is needed; the constants are computed from the SI defining constants instead
    assert _loaded_after("from heatledger import *",
                         ("scipy.optimize", "scipy.special", "scipy.constants")) == []


def test_import_heatledger_alone_loads_no_numerical_library():
    assert _loaded_after("import heatledger", ("numpy", "scipy")) == []


def test_every_public_name_resolves_and_lists():
    import heatledger

    missing = [name for name in heatledger.__all__ if not hasattr(heatledger, name)]
    assert not missing
    assert set(heatledger.__all__) <= set(dir(heatledger))
    with pytest.raises(AttributeError, match="no attribute 'not_a_name'"):
        heatledger.not_a_name  # noqa: B018


def test_command_help_does_not_load_the_engine():
    # `heatledger --help` answers at once: argparse only, no numpy, scipy or engine module
    setup = ("import contextlib, io\nfrom heatledger.cli import main\n"
             "with contextlib.redirect_stdout(io.StringIO()), "
             "contextlib.suppress(SystemExit):\n    main(['--help'])")
    assert _loaded_after(setup, ("numpy", "scipy", "heatledger.constructions",
                                 "heatledger.project")) == []
