"""Sheet names and document properties that make valid workbooks, whatever the names typed.

Rules (Excel's and LibreOffice's, as documented by both programs): a sheet name has 1 to 31
characters, none of []:*?/\\, and does not start or end with an apostrophe; XML 1.0 (the
file format) cannot hold control characters other than tab, line feed and carriage return.
"""

from __future__ import annotations

import copy

import openpyxl
import pytest

from heatledger.demo import demo_project
from heatledger.errors import HeatLedgerError
from heatledger.project import project_from_dict
from heatledger.sheet.audit import audit_bytes
from heatledger.sheet.plan import WorkbookPlan, safe_sheet_name

HOSTILE = [
    "Roof over the old Gardeners' shed",  # as sheet "01 ...", the cut at 31 hits the '

    "'quoted wall'",                               # apostrophes at both ends
    "=HYPERLINK(\"x\")",                           # formula-like: stays text
    "wall\x00with\x07controls\x1b",                # control characters
    "a/b: [c]*?\\d",                               # forbidden characters only
    "x" * 40, "x" * 40,                            # same long name twice: unique
]


@pytest.mark.parametrize("name", HOSTILE)
def test_safe_sheet_name_follows_the_rules(name):
    out = safe_sheet_name(name, set())
    assert 1 <= len(out) <= 31
    assert not set(out) & set("[]:*?/\\")
    assert not any(ord(ch) < 32 for ch in out)
    assert not out.startswith("'") and not out.endswith("'")


def test_names_are_unique_without_case():
    used: set[str] = set()
    names = [safe_sheet_name(n, used, reserved=("Cover",)) for n in
             ["Wall", "WALL", "cover", "x" * 40, "x" * 40]]
    assert len({n.lower() for n in names}) == len(names)
    assert "cover" not in {n.lower() for n in names}
    assert all(len(n) <= 31 for n in names)


def test_a_plan_refuses_a_sheet_name_ending_in_an_apostrophe():
    with pytest.raises(HeatLedgerError, match="apostrophe"):
        WorkbookPlan(title="t").add_sheet("Gardeners'")


def _hostile_project():
    raw = copy.deepcopy(demo_project().raw)
    for con, name in zip(raw["constructions"], HOSTILE, strict=False):
        con["name"] = name
    raw["project"]["name"] = "Job\x07 12\x00 (invented)"
    raw.pop("rooms", None), raw.pop("building", None), raw.pop("fins", None)
    raw.pop("moisture", None), raw.pop("climates", None), raw.pop("junctions", None)
    for room_key in ("elements", "thermal_bridges"):
        raw.pop(room_key, None)
    return project_from_dict(raw, source_bytes=b"hostile", source_name="hostile.toml")


def test_audit_of_hostile_names_has_valid_sheet_names_and_properties(tmp_path):
    project = _hostile_project()
    path = tmp_path / "hostile.xlsx"
    path.write_bytes(audit_bytes(project))
    wb = openpyxl.load_workbook(path)
    assert "01 Roof over the old Gardeners" in wb.sheetnames
    for name in wb.sheetnames:
        assert not name.startswith("'") and not name.endswith("'"), name
        assert not any(ord(ch) < 32 for ch in name), name
    assert not any(ord(ch) < 32 and ch not in "\t\n\r" for ch in wb.properties.title or "")


@pytest.mark.calc
def test_audit_of_hostile_names_recalculates_in_libreoffice(tmp_path, recalc):
    path = tmp_path / "hostile.xlsx"
    path.write_bytes(audit_bytes(_hostile_project()))
    wb = openpyxl.load_workbook(recalc(path), data_only=True)
    cover = {r[0]: r[1] for r in wb["Cover"].iter_rows(min_col=2, max_col=3, values_only=True)}
    assert cover["State"] == "ALL CHECKS OK"


def test_excels_reserved_history_name_is_avoided():
    # Excel reserves the sheet name "History" (change tracking), from memory of its help
    assert safe_sheet_name("History", set()).lower() != "history"
