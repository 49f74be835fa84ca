"""What a newcomer runs on a fresh machine stays in step: the README's quick start, the
README's test command that CI (``.ci/run``) runs verbatim, and the Python floor that
pyproject.toml, ruff and the README state (3.11: xlwings 0.37.5 and later require it, per
their package metadata)."""

from __future__ import annotations

import re
import sys
import tomllib
from pathlib import Path

from packaging.specifiers import SpecifierSet

ROOT = Path(__file__).resolve().parents[1]
README = (ROOT / "README.md").read_text(encoding="utf-8")
PYPROJECT = tomllib.loads((ROOT / "pyproject.toml").read_text(encoding="utf-8"))


def _quick_start() -> str:
    return README.split("## Quick start", 1)[1].split("\n## ", 1)[0]


def _bash_blocks(text: str) -> list[list[str]]:
    return [[ln.strip() for ln in b.strip().splitlines()]
            for b in re.findall(r"```bash\n(.*?)```", text, flags=re.S)]


def test_ci_runs_the_readme_test_command_verbatim():
    blocks = _bash_blocks(_quick_start())
    test_command = blocks[-1]
    assert test_command == ["pip install -e '.[test]' && pytest"]
    ci = [ln.strip() for ln in (ROOT / ".ci" / "run").read_text().splitlines()
          if ln.strip() and not ln.lstrip().startswith("#")]
    assert ci[-1] == test_command[0]


def test_quick_start_makes_and_activates_a_virtual_environment_first():
    first = _bash_blocks(_quick_start())[0]
    assert first[0] == "python3 -m venv .venv && . .venv/bin/activate"
    assert any(ln.startswith("pip install .") for ln in first[1:])


def test_python_floor_agrees_everywhere():
    assert PYPROJECT["project"]["requires-python"] == ">=3.11"
    assert PYPROJECT["tool"]["ruff"]["target-version"] == "py311"
    assert "Python 3.11 or newer" in _quick_start()
    assert not any("tomli" in d for d in PYPROJECT["project"]["dependencies"])
    running = f"{sys.version_info.major}.{sys.version_info.minor}"
    assert running in SpecifierSet(PYPROJECT["project"]["requires-python"])
