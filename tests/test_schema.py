"""The input schema: one declaration per table, and everything derived from it agrees.

The schema (heatledger.schema, each family's ``schema.py``) is the one place a key, its unit,
type, choices, default and rule are declared. These tests hold the parts derived from it to
it: the project-file parser refuses what a column's rule refuses, at that column's key path;
the template's columns and drop-down lists are the schema's; the README's key tables are the
generated ones; the two faces of the validation core say the same thing.
"""

from __future__ import annotations

import copy
import math
import subprocess
import sys
from importlib import resources
from pathlib import Path

import pytest
from hypothesis import given
from hypothesis import strategies as st

from heatledger import HeatLedgerError, ProjectError
from heatledger._validate import LIMITS
from heatledger.construction_family.schema import DESIGN_TABLE, MATERIAL_TABLE, PROJECT_TABLE
from heatledger.families import FAMILIES, project_file_reference
from heatledger.project import project_from_dict, tomllib
from heatledger.schema import TYPES, Column, check_value, read_value
from heatledger.sheet import template as tpl

ROOT = Path(__file__).resolve().parents[1]
ALL_TABLES = (PROJECT_TABLE, DESIGN_TABLE, MATERIAL_TABLE) + tuple(
    t for fam in FAMILIES for t in fam.tables)


def _demo() -> dict:
    raw = resources.files("heatledger").joinpath("data/demo_project.toml").read_bytes()
    return tomllib.loads(raw.decode("utf-8"))


def _instances(data: dict, table) -> list:
    """(key path, row) of every row of ``table`` in the project data."""
    parts = table.key.split(".")
    found = [("", data)]
    for depth, part in enumerate(parts):
        nxt = []
        for path, holder in found:
            value = holder.get(part) if isinstance(holder, dict) else None
            base = f"{path}.{part}" if path else part
            if isinstance(value, list):
                nxt += [(f"{base}[{i}]", row) for i, row in enumerate(value, 1)]
            elif isinstance(value, dict) and depth == len(parts) - 1:
                nxt.append((base, value))
        found = nxt
    return found


def _breaking_values(col: Column) -> list:
    """Values the column's declared rule refuses (in the unit entered)."""
    out = []
    if col.sign == "positive":
        out.append(0.0 if col.type == "number" else 0)
    if col.sign == "non_negative":
        out.append(-1.0 if col.type == "number" else -1)
    if col.limit is not None and LIMITS[col.limit].high is not None:
        high = LIMITS[col.limit].high / col.scale
        out.append(float(math.ceil(high * 10)) if col.type == "number" else int(high * 10))
    if col.choices:
        out.append("no such choice")
    if col.type in ("number", "int"):
        out.append("text where a number belongs")
    return out


def _cases():
    data = _demo()
    for table in ALL_TABLES:
        for path, row in _instances(data, table):
            variant = row.get(table.variant_key) if table.variant_key else None
            for col in table.columns:
                if col.place == "sheet" or (variant and col.variants and
                                            variant not in col.variants):
                    continue
                holder = row.get(col.sub) if col.sub else row
                if not isinstance(holder, dict) or col.key not in holder:
                    continue  # only keys the demo fills: adding one may clash with another
                for bad in _breaking_values(col):
                    where = f"{path}.{col.sub}" if col.sub else path
                    yield pytest.param(table.key, where, col.key, bad,
                                       id=f"{where}.{col.key}={bad!r}")


def _set(data: dict, where: str, key: str, value) -> None:
    node = data
    for part in where.split("."):
        name, _, index = part.partition("[")
        node = node[name]
        if index:
            node = node[int(index[:-1]) - 1]
    node[key] = value


@pytest.mark.parametrize(("table", "where", "key", "bad"), list(_cases()))
def test_the_project_parser_refuses_what_the_schema_refuses_at_its_key(table, where, key, bad):
    # source: the schema's own rule for the column (sign, physical limit, choices, type);
    # the parser must report it at the column's key path (cells for a template)
    data = copy.deepcopy(_demo())
    _set(data, where, key, bad)
    with pytest.raises(ProjectError) as err:
        project_from_dict(data)
    paths = [p for p, _m in err.value.problems]
    assert f"{where}.{key}" in paths, (table, paths)


def test_the_cases_above_cover_every_family():
    tables = {case.values[0] for case in _cases()}
    assert {"constructions", "constructions.layers", "fins", "rooms", "rooms.elements",
            "materials"} <= tables


def test_every_column_is_declared_completely():
    for table in ALL_TABLES:
        keys = [(c.sub, c.key) for c in table.columns]
        assert len(keys) == len(set(keys)), table.key
        for c in table.columns:
            assert c.type in TYPES, (table.key, c.key)
            assert c.description.strip(), (table.key, c.key)
            assert c.limit is None or c.limit in LIMITS, (table.key, c.key)
            if c.type in ("number", "int"):
                assert c.unit, f"{table.key}.{c.key}: a number needs its unit"
            assert all(ch == ch.lower() for ch in c.choices), (table.key, c.key)
            if c.default is not None:  # a default obeys its own rule
                check_value(c, c.default)
            if table.variant_key and c.variants:
                assert set(c.variants) <= set(table.variants), (table.key, c.key)


def test_the_template_has_the_schema_columns_and_a_list_for_every_choice():
    plan = tpl.template_plan()
    for table in (MATERIAL_TABLE,) + tuple(t for f in FAMILIES for t in f.tables):
        sheet = plan.sheet(table.sheet)
        heads = [c.value for c in sheet.cells() if c.ref.endswith(f"{tpl.HEADER_ROW}")
                 and c.role == "header"]
        assert heads == [h for _k, h, _t in table.template_columns()]
        listed = {v.cells.split(":")[0].rstrip("0123456789") for v in sheet.validations
                  if v.kind == "list"}
        prompted = {v.cells.rstrip("0123456789") for v in sheet.validations
                    if v.kind == "any" and v.cells.endswith(str(tpl.HEADER_ROW))}
        shown = [c for c in table.columns if c.place != "file"]
        for j, col in enumerate(shown, 1):
            letter = tpl.col_letter(j)
            assert letter in prompted, (table.sheet, col.key)  # the header explains it
            refers = (table.sheet, col.key) in tpl._REF_SHEETS  # names a row of another sheet
            assert (letter in listed) == bool(col.choices or col.type == "material"
                                              or refers), (table.sheet, col.key)


def test_the_readme_key_tables_are_the_generated_ones():
    readme = (ROOT / "README.md").read_text(encoding="utf-8")
    section = readme.split("<!-- keys:begin -->\n")[1].split("<!-- keys:end -->")[0]
    assert section == project_file_reference(), (
        "regenerate the README section with `python -m heatledger.families`")


def test_the_reference_command_prints_the_tables():
    out = subprocess.run([sys.executable, "-m", "heatledger.families"], capture_output=True,
                         text=True, check=True).stdout
    assert out == project_file_reference()


_COLUMN = Column("thickness_mm", "d", "mm", "number", "layer thickness", limit="thickness",
                 scale=1e-3, sign="positive")


@given(st.one_of(st.floats(allow_nan=True, allow_infinity=True), st.integers(),
                 st.text(max_size=5), st.booleans(), st.none()))
def test_both_faces_of_the_validation_core_say_the_same(value):
    # the raising face (engine, spreadsheet functions) and the collecting face (files,
    # templates) must refuse the same values with the same rule
    problems: list = []
    got = read_value(_COLUMN, {"thickness_mm": value}, "constructions[1].layers[2]", problems)
    try:
        raised = check_value(_COLUMN, value, "constructions[1].layers[2].thickness_mm")
    except HeatLedgerError as exc:
        assert problems and str(exc) == f"{problems[0][0]} {problems[0][1]}"
        assert got is None
    else:
        assert not problems and got == raised


def test_the_limit_in_millimetres_names_both_units():
    # source: heatledger._validate.LIMITS["thickness"] (10 m, common practice) read in mm
    with pytest.raises(HeatLedgerError, match=r"at most 10000 mm \(10 m"):
        check_value(_COLUMN, 20000.0, "d")
