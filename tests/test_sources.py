"""Sources inside the project: every reference a reader meets resolves in the repository.

The published sources live in core/heatledger/data/sources.csv (heatledger.sources). A
pointer reads ``[source: key, clause]``. These tests check that no file points outside the
repository (to design notes or reference packs it does not contain), that every pointer names
a row of the table, that every row is complete and cited.
"""

from __future__ import annotations

import re
from pathlib import Path

import pytest

from heatledger import HeatLedgerError
from heatledger.sources import CONFIDENCES, all_sources, source

ROOT = Path(__file__).resolve().parents[1]
POINTER = re.compile(r"\[source:\s+(?!key\b)([a-z0-9][a-z0-9-]*)")
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
    bad = [f"{p.relative_to(ROOT)}: {k}" for p, text in TEXTS.items()
           for k in POINTER.findall(text) if k not in keys]
    assert not bad, bad


def test_every_source_is_complete_and_cited():
    cited = {k for text in TEXTS.values() for k in POINTER.findall(text)}
    for key, src in all_sources().items():
        assert src.citation and src.edition and src.clauses, key
        assert src.confidence in CONFIDENCES, (key, src.confidence)
        assert key in cited, f"source {key} is cited nowhere"


def test_an_unknown_key_is_refused_naming_the_choices():
    assert source("iso6946-airlayers").edition == "2017"
    with pytest.raises(HeatLedgerError, match="no source is called 'iso9999'.*iso6946"):
        source("iso9999")


def test_the_pointer_pattern_finds_a_planted_pointer():
    assert POINTER.findall("see [source: iso13370-slab, 8.2] and [source: x-1]") == [
        "iso13370-slab", "x-1"]
