"""Sources inside the project: every reference a reader meets resolves in the repository.

The published sources live in core/heatledger/data/sources.csv (heatledger.sources). A
pointer reads ``[source: key, clause]``. These tests check that no file points outside the
repository (to design notes or reference packs it does not contain), that every pointer names
a row of the table, that every row is complete and cited.
"""

from __future__ import annotations

import re
import subprocess
import sys
from pathlib import Path

import pytest

from heatledger import HeatLedgerError
from heatledger.sources import CONFIDENCES, all_sources, source

ROOT = Path(__file__).resolve().parents[1]
#: A pointer: whatever follows "[source:" up to a comma, a space or "]" must be a key of the
#: table, so a pointer written as "[source: ISO 6946]" fails instead of being skipped.
POINTER = re.compile(r"\[source:\s*([^\s,\]]*)")
#: The placeholders the contributor guide and the tests use to describe a pointer.
PLACEHOLDERS = {"key", "...", "<key>"}
#: Names of documents that are not in the repository (split so this file does not match).
OUTSIDE = ("REFERENCES" + ".md", "DESIGN" + ".md", "fact " + "pack")


def _files():
    for folder in ("core", "addin", "tests"):
        for path in (ROOT / folder).rglob("*"):
            if path.suffix in (".py", ".csv", ".toml", ".md") and "egg-info" not in str(path):
                yield path
    yield ROOT / "README.md"
    yield ROOT / "DEVELOPERS.md"


TEXTS = {p: p.read_text(encoding="utf-8") for p in _files() if p.name != "test_sources.py"}


def test_nothing_points_outside_the_repository():
    found = [f"{p.relative_to(ROOT)}: {name}" for p, text in TEXTS.items()
             for name in OUTSIDE if name in text]
    assert not found, found


def test_every_pointer_names_a_source():
    keys = set(all_sources())
    bad = [f"{p.relative_to(ROOT)}: {k or 'no key'}" for p, text in TEXTS.items()
           for k in POINTER.findall(text) if k not in keys | PLACEHOLDERS]
    assert not bad, bad


def test_every_source_is_complete_and_cited():
    cited = {k for text in TEXTS.values() for k in POINTER.findall(text)}
    for key, src in all_sources().items():
        assert src.citation and src.edition and src.clauses, key
        assert src.confidence in CONFIDENCES, (key, src.confidence)
        assert key in cited, f"source {key} is cited nowhere"


def test_every_key_is_a_short_stable_name():
    keys = list(all_sources())
    assert len(keys) == len(set(keys))
    assert all(re.fullmatch(r"[a-z0-9]+(-[a-z0-9]+)*", k) for k in keys), keys


def test_an_unknown_key_is_refused_naming_the_choices():
    assert source("iso6946-airlayers").edition == "2017"
    with pytest.raises(HeatLedgerError, match='no source is called "iso9999".*"iso6946'):
        source("iso9999")


def test_the_table_is_read_only():
    with pytest.raises(TypeError):
        all_sources()["iso9999"] = source("iso6946-airlayers")


def test_the_pointer_pattern_finds_planted_pointers():
    text = "see [source: iso13370-slab, 8.2], [source: x-1] and [source: ISO 6946]"
    assert POINTER.findall(text) == ["iso13370-slab", "x-1", "ISO"]


def test_import_heatledger_does_not_read_the_table():
    code = "import sys, heatledger; print('heatledger.sources' in sys.modules)"
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         check=True).stdout.strip()
    assert out == "False"
