"""One glossary: one name per quantity across the engine, the project file and the
spreadsheet functions (core/heatledger/data/glossary.csv).

Every parameter of a public engine function, method or class, every field of a result, every
spreadsheet-function argument and every project-file key must be a glossary name; none may
be a name the glossary lists as "instead of" another; a unit a docstring or the schema states
for a name must be the glossary's unit.
"""

from __future__ import annotations

import csv
import io
from importlib import resources

import pytest

from heatledger.construction_family.schema import (
    DESIGN_TABLE,
    FUNCTION_LAYER_TABLE,
    MATERIAL_TABLE,
    PROJECT_TABLE,
)
from heatledger.families import FAMILIES
from heatledger.heatloss.schema import FUNCTION_ELEMENT_TABLE
from tests._names import engine_names, function_arguments

#: Units that hold for any quantity a name may carry.
VARIES = "varies"


def _glossary() -> dict:
    text = resources.files("heatledger").joinpath("data/glossary.csv").read_text("utf-8")
    lines = "".join(line for line in text.splitlines(True) if not line.startswith("#"))
    return {row["name"]: row for row in csv.DictReader(io.StringIO(lines))}


GLOSSARY = _glossary()
INSTEAD = {bad.strip(): row["name"] for row in GLOSSARY.values()
           for bad in row["instead_of"].split(";") if bad.strip()}
ENGINE = engine_names()
FUNCTIONS = function_arguments()
TABLES = (PROJECT_TABLE, DESIGN_TABLE, MATERIAL_TABLE, FUNCTION_LAYER_TABLE,
          FUNCTION_ELEMENT_TABLE) + tuple(
    t for fam in FAMILIES for t in fam.tables)
SCHEMA = {c.key: c.unit for t in TABLES for c in t.columns if c.place != "sheet"}


def _unit(text: str | None) -> str | None:
    return None if text is None else " ".join(text.split())


def test_every_glossary_row_is_complete():
    for name, row in GLOSSARY.items():
        assert row["unit"].strip(), name
        assert row["meaning"].strip(), name


@pytest.mark.parametrize("name", sorted(set(ENGINE) | set(FUNCTIONS) | set(SCHEMA)))
def test_every_public_name_is_in_the_glossary(name):
    assert name in GLOSSARY, (
        f"{name!r} ({sorted(ENGINE.get(name, ()))[:3] or FUNCTIONS.get(name)}) is not in "
        "core/heatledger/data/glossary.csv: use the glossary's name for the quantity or add it")


def test_no_name_is_one_the_glossary_replaces():
    used = set(ENGINE) | set(FUNCTIONS) | set(SCHEMA)
    clashes = {name: INSTEAD[name] for name in used if name in INSTEAD}
    assert not clashes, f"use the glossary's names: {clashes}"


def test_a_name_keeps_its_unit_everywhere():
    wrong = []
    for name, seen in ENGINE.items():
        row = GLOSSARY.get(name)
        if row is None or row["unit"] == VARIES:
            continue
        for where, unit in seen:
            if unit is not None and _unit(unit) != _unit(row["unit"]):
                wrong.append(f"{where}({name}) [{unit}] but the glossary says [{row['unit']}]")
    for name, unit in SCHEMA.items():
        row = GLOSSARY.get(name)
        if row and row["unit"] != VARIES and unit and _unit(unit) != _unit(row["unit"]):
            wrong.append(f"project key {name} [{unit}] but the glossary says [{row['unit']}]")
    assert not wrong, "\n".join(wrong)


def test_the_glossary_has_no_dead_rows():
    used = set(ENGINE) | set(FUNCTIONS) | set(SCHEMA)
    assert not set(GLOSSARY) - used, sorted(set(GLOSSARY) - used)


def test_the_check_catches_a_synonym():
    # the rule itself: a name the glossary replaces is refused (planted, not in the code)
    assert INSTEAD["internal_temperature"] == "temp_inside"
    assert INSTEAD["ambient"] == "temp_fluid"
