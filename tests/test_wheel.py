"""The project builds a wheel (``python -m build``) that carries its packages, their data
and the command, and every install instruction names a route that exists (the package is not
on the package index yet)."""

from __future__ import annotations

import re
import shutil
import subprocess
import sys
import zipfile
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]


@pytest.fixture(scope="module")
def wheel(tmp_path_factory) -> Path:
    """A wheel built from a copy of the source (the checkout stays clean); the build runs
    without an isolated environment, with the setuptools and wheel of the test extra."""
    src = tmp_path_factory.mktemp("src")
    for name in ("pyproject.toml", "README.md"):
        shutil.copy2(ROOT / name, src / name)
    skip = shutil.ignore_patterns("__pycache__", "*.egg-info", "*.pyc")
    for folder in ("core", "addin"):
        shutil.copytree(ROOT / folder, src / folder, ignore=skip)
    out = tmp_path_factory.mktemp("dist")
    proc = subprocess.run([sys.executable, "-m", "build", "--wheel", "--no-isolation",
                           "--outdir", str(out), str(src)],
                          capture_output=True, text=True, timeout=600, check=False)
    assert proc.returncode == 0, proc.stdout[-2000:] + proc.stderr[-2000:]
    (found,) = out.glob("heatledger-*.whl")
    return found


def test_the_wheel_carries_the_packages_their_data_and_the_command(wheel):
    with zipfile.ZipFile(wheel) as z:
        names = set(z.namelist())
        meta = next(n for n in names if n.endswith(".dist-info/METADATA"))
        metadata = z.read(meta).decode("utf-8")
        entry = z.read(next(n for n in names if n.endswith("entry_points.txt"))).decode()
    for module in ("heatledger/__init__.py", "heatledger/cli.py", "heatledger/fv1d.py",
                   "heatledger_xl/udfs.py", "heatledger_xl/registry.py",
                   "heatledger_calc/build.py", "heatledger_calc/uno/component.py"):
        assert module in names, module
    data = {n for n in names if n.startswith("heatledger/data/")}
    shipped = {f"heatledger/data/{p.name}" for p in (ROOT / "core/heatledger/data").iterdir()
               if p.suffix in (".csv", ".toml")}
    assert shipped and shipped <= data
    assert not any("tests/" in n or n.startswith("workbooks/") for n in names)
    assert "heatledger = heatledger.cli:main" in entry
    for dep in ("numpy", "scipy", "openpyxl", "xlwings"):
        assert re.search(rf"^Requires-Dist: {dep}\b", metadata, re.M), dep


def test_install_instructions_name_routes_that_exist():
    from heatledger_xl.workbook import _STEPS

    readme = (ROOT / "README.md").read_text(encoding="utf-8")
    steps = "\n".join(_STEPS)
    for text in (readme, steps):
        # no bare "pip install heatledger": the package is not on the package index yet
        assert not re.search(r"pip install heatledger(?![\w./-])", text)
    assert "not on the package index" in readme and "not on the package index" in steps
    assert "python -m build" in readme
