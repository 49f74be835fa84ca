"""The audit workbook, judged by LibreOffice Calc.

After LibreOffice has recalculated every formula (each with a planted stale cached value, see
conftest.py), every check cell must say OK, and the U-values, interface temperatures and nodal
temperatures the spreadsheet computed must equal the engine's to 1e-9 relative. Simple cases
are also checked against hand calculations and the analytical temperature profile.
"""

from __future__ import annotations

import copy
import re

import numpy as np
import openpyxl
import pytest

from heatledger.demo import demo_project
from heatledger.project import project_from_dict
from heatledger.sheet import audit
from heatledger.sheet.plan import split_ref
from heatledger.sheet.render_openpyxl import write_workbook
from tests.tolerances import (
    ATOL_ITERATION,
    ATOL_LINEAR_SOLVE,
    RTOL_ITERATION,
    RTOL_ROUND_OFF,
    RTOL_SHEET,
)

#: Functions both Excel (2007 file format, no _xlfn. prefix) and LibreOffice Calc know.
#: from memory: Excel's and LibreOffice's function lists; the _xlfn. functions (LET, LAMBDA,
#: XLOOKUP, FILTER, SEQUENCE, IFS, CONCAT, ...) came later and are excluded on purpose.
ALLOWED_FUNCTIONS = {"IF", "ABS", "MAX", "MIN", "SUM", "ROUND", "INT", "LOG10", "COUNTIF",
                     "ISNUMBER", "AND", "OR", "NOT", "SUMPRODUCT", "SUMIF", "COUNT", "COUNTA",
                     "AVERAGE", "LN", "LOG", "EXP", "SQRT", "POWER", "PI", "SINH", "COSH",
                     "TANH", "ISBLANK", "IFERROR", "INDEX", "MATCH", "BESSELI", "BESSELK",
                     "BESSELJ", "BESSELY", "HYPERLINK"}
FORBIDDEN = {"LET", "LAMBDA", "XLOOKUP", "FILTER", "SEQUENCE", "IFS", "CONCAT", "TEXTJOIN",
             "UNIQUE", "SORT", "XMATCH", "SWITCH", "MAXIFS", "MINIFS"}


def variety_data() -> dict:
    """An invented project touching every branch of the construction sheet."""
    return {
        "project": {"name": "Variety (invented test scenario)", "revision": "T"},
        "design": {"temp_inside": 21.0, "temp_outside": -10.0},
        "constructions": [
            {"name": "V1 slightly ventilated cavity wall", "heat_flow": "horizontal",
             "area": 10.0, "target_u": 0.3, "nodes_per_layer": 3,
             "layers": [
                 {"name": "plaster", "material": "gypsum plaster 1000", "thickness_mm": 15},
                 {"name": "wool", "material": "mineral wool 035", "thickness_mm": 90},
                 {"name": "cavity", "kind": "air", "ventilation": "slightly",
                  "vent_area_mm2": 1000, "thickness_mm": 40},
                 {"name": "brick", "material": "clay brick outer leaf", "thickness_mm": 102},
             ]},
            {"name": "R2 crossed battens next to unheated loft", "heat_flow": "up",
             "rsi": 0.10, "rse": 0.10, "nodes_per_layer": 2,
             "layers": [
                 {"name": "board", "material": "gypsum plasterboard 900", "thickness_mm": 12.5},
                 {"name": "battens 1", "kind": "bridged", "material": "mineral wool 035",
                  "bridging_material": "softwood 500", "bridging_fraction": 0.1,
                  "thickness_mm": 50},
                 {"name": "battens 2", "kind": "bridged", "material": "mineral wool 035",
                  "bridging_material": "softwood 500", "bridging_fraction": 0.12,
                  "thickness_mm": 100},
                 {"name": "declared panel", "kind": "declared", "resistance": 0.5,
                  "thickness_mm": 20},
             ],
             "corrections": [
                 {"kind": "fasteners", "layer": "battens 2", "conductivity": 50.0,
                  "cross_section_mm2": 10.0, "count_per_m2": 6, "edition": "2007",
                  "application": "roof"},
                 {"kind": "air_gaps", "layer": "battens 2", "level": 2}]},
            {"name": "F3 one-layer slab", "heat_flow": "down", "nodes_per_layer": 5,
             "layers": [{"name": "slab", "conductivity": 1.6, "thickness_mm": 200}]},
            {"name": "P4 declared panel, one cell", "heat_flow": "horizontal",
             "nodes_per_layer": 1,
             "layers": [{"name": "panel", "kind": "declared", "resistance": 2.0,
                         "thickness_mm": 50}]},
            {"name": "W5 rain screen, Rse given", "heat_flow": "horizontal", "rse": 0.13,
             "layers": [
                 {"name": "block", "material": "concrete medium density 1800",
                  "thickness_mm": 140},
                 {"name": "insulation", "material": "pir board 022", "thickness_mm": 80},
                 {"name": "vented cavity", "kind": "air", "ventilation": "well",
                  "thickness_mm": 30},
                 {"name": "cladding", "material": "softwood 500", "thickness_mm": 18}]},
        ],
    }


@pytest.fixture(scope="module")
def demo():
    return demo_project()


@pytest.fixture(scope="module")
def variety():
    return project_from_dict(variety_data(), source_bytes=b"variety", source_name="variety")


def _recalculated(project, tmp_path, recalc):
    plan = audit.audit_plan(project)
    path = write_workbook(plan, tmp_path / "audit.xlsx")
    return plan, openpyxl.load_workbook(recalc(path), data_only=True)


def _value(wb, reference):
    sheet, a1 = re.match(r"^'((?:[^']|'')+)'!(.+)$", reference).groups()
    return wb[sheet.replace("''", "'")][a1.replace("$", "")].value


def _assert_all_checks_ok(plan, wb):
    checks = list(plan.cells_with_role("check"))
    assert checks
    bad = [(s, c.ref, wb[s][c.ref].value) for s, c in checks if wb[s][c.ref].value != "OK"]
    assert not bad, bad[:10]
    cover = {row[0]: row[1] for row in wb["Cover"].iter_rows(min_col=2, max_col=3,
                                                            values_only=True)}
    assert cover["Check cells in the workbook"] == len(checks)
    assert cover["Check cells that say OK"] == len(checks)
    assert cover["State"] == "ALL CHECKS OK"


def _assert_equals_engine(project, plan, wb):
    for entry in project.constructions:
        con = entry.construction
        refs = plan.index[entry.name]
        assert _value(wb, refs.u_value) == pytest.approx(con.u_value, rel=RTOL_SHEET)
        assert _value(wb, refs.u_reported) == pytest.approx(con.u_value_reported, rel=RTOL_SHEET)
        assert _value(wb, refs.r_total) == pytest.approx(con.total_resistance, rel=RTOL_SHEET)
        temps = con.temperatures(project.temp_inside, project.temp_outside,
                                 nodes_per_layer=entry.nodes_per_layer)
        ws = wb[refs.sheet]
        fv = wb[refs.extras["fv_sheet"]]  # the finite-volume appendix
        n0, n1 = refs.extras["nodes"]
        nodal = np.array([fv[f"M{r}"].value for r in range(n0, n1 + 1)], dtype=float)
        np.testing.assert_allclose(nodal, temps.temperature, rtol=RTOL_SHEET, atol=0)
        i0, i1 = refs.extras["interfaces"]
        ladder = np.array([ws[f"G{r}"].value for r in range(i0, i1 + 1)], dtype=float)
        np.testing.assert_allclose(
            ladder, con.ladder_temperatures(project.temp_inside, project.temp_outside),
            rtol=RTOL_SHEET, atol=0)
        # the finite-volume faces at the layer interfaces agree with the ladder too
        np.testing.assert_allclose(ladder, temps.interface_temperatures,
                                   rtol=RTOL_ITERATION, atol=ATOL_ITERATION)


@pytest.mark.calc
def test_demo_audit_every_check_ok_and_values_equal_engine(demo, tmp_path, recalc):
    plan, wb = _recalculated(demo, tmp_path, recalc)
    _assert_all_checks_ok(plan, wb)
    _assert_equals_engine(demo, plan, wb)


@pytest.mark.calc
def test_variety_audit_every_check_ok_and_values_equal_engine(variety, tmp_path, recalc):
    plan, wb = _recalculated(variety, tmp_path, recalc)
    _assert_all_checks_ok(plan, wb)
    _assert_equals_engine(variety, plan, wb)


@pytest.mark.calc
def test_one_layer_slab_against_hand_calculation(variety, tmp_path, recalc):
    plan, wb = _recalculated(variety, tmp_path, recalc)
    refs = plan.index["F3 one-layer slab"]
    # source: EN ISO 6946:2017, Table 7: Rsi = 0.17 (heat flow down), Rse = 0.04 m2 K/W
    r_total = 0.17 + 0.200 / 1.6 + 0.04
    assert _value(wb, refs.r_total) == pytest.approx(r_total, rel=RTOL_ROUND_OFF)
    q = (21.0 - (-10.0)) / r_total
    # analytical steady profile in a homogeneous slab: linear, theta(x) = theta_si - q x / k
    ws = wb[refs.extras["fv_sheet"]]
    n0, n1 = refs.extras["nodes"]
    x_m = np.array([ws[f"E{r}"].value for r in range(n0, n1 + 1)]) / 1000.0
    exact = 21.0 - q * 0.17 - q * x_m / 1.6
    nodal = np.array([ws[f"M{r}"].value for r in range(n0, n1 + 1)])
    np.testing.assert_allclose(nodal, exact, rtol=RTOL_ROUND_OFF, atol=ATOL_LINEAR_SOLVE)
    np.testing.assert_allclose(x_m, (np.arange(5) + 0.5) * 0.04, rtol=RTOL_ROUND_OFF)


@pytest.mark.calc
def test_a_wrong_engine_value_is_reported_as_mismatch(demo, tmp_path, recalc):
    plan = audit.audit_plan(demo)
    refs = plan.index[demo.constructions[0].name]
    sheet = plan.sheet(refs.sheet)
    u_ref = refs.u_value.split("!")[1].replace("$", "")
    row, _ = split_ref(u_ref)
    engine_cell = next(c for c in sheet.cells() if c.ref == f"K{row}")
    engine_cell.value *= 1.0 + 1e-6  # a corrupted engine constant
    path = write_workbook(plan, tmp_path / "tampered.xlsx")
    wb = openpyxl.load_workbook(recalc(path), data_only=True)
    assert str(wb[refs.sheet][f"L{row}"].value).startswith("MISMATCH")
    cover = {r[0]: r[1] for r in wb["Cover"].iter_rows(min_col=2, max_col=3, values_only=True)}
    assert str(cover["State"]).startswith("NOT ALL OK")


HOSTILE = {"name": "=HYPERLINK(\"http://example.invalid\",\"x\")", "client": "+44 20 0000",
           "site": "-5 m below datum", "author": "@handle", "notes": "=1+1"}


@pytest.mark.calc
def test_user_text_stays_text(tmp_path, recalc):
    data = variety_data()
    data["project"].update(HOSTILE)
    data["constructions"][2]["name"] = "=2+3 slab"
    data["constructions"][2]["layers"][0]["name"] = "-slab @ level 0"
    data["constructions"][0]["name"] = "O'Neill's [north] wall: a/b? *draft*"
    project = project_from_dict(data)
    plan, wb = _recalculated(project, tmp_path, recalc)
    cover = {r[0]: r[1] for r in wb["Cover"].iter_rows(min_col=2, max_col=3, values_only=True)}
    assert cover["Project"] == HOSTILE["name"]
    assert cover["Client"] == HOSTILE["client"]
    assert cover["Site"] == HOSTILE["site"]
    assert cover["Author"] == HOSTILE["author"]
    assert cover["Notes"] == HOSTILE["notes"]
    refs = plan.index["=2+3 slab"]
    summary_names = [r[0] for r in wb["Summary"].iter_rows(min_col=2, max_col=2,
                                                          values_only=True)]
    assert "=2+3 slab" in summary_names
    layer_names = [r[0] for r in wb[refs.sheet].iter_rows(min_col=2, max_col=2,
                                                          values_only=True)]
    assert "-slab @ level 0" in layer_names
    odd = plan.index["O'Neill's [north] wall: a/b? *draft*"]
    assert odd.sheet.startswith("01 O'Neill's north wall a b")
    assert len(odd.sheet) <= 31 and not set(odd.sheet) & set("[]:*?/\\")
    _assert_all_checks_ok(plan, wb)
    _assert_equals_engine(project, plan, wb)


def test_audit_bytes_are_deterministic(demo):
    assert audit.audit_bytes(demo) == audit.audit_bytes(copy.deepcopy(demo))


def test_formulas_use_only_portable_functions(demo, variety):
    for project in (demo, variety):
        plan = audit.audit_plan(project)
        used = set()
        for sheet in plan.sheets:
            for cell in sheet.cells():
                if cell.formula:
                    text = re.sub(r'"[^"]*"', "", cell.formula)  # drop string literals
                    used |= set(re.findall(r"([A-Z][A-Z0-9.]*)\(", text))
        assert not used & FORBIDDEN, used & FORBIDDEN
        assert used <= ALLOWED_FUNCTIONS, used - ALLOWED_FUNCTIONS
        assert not any("_xlfn" in (c.formula or "") for s in plan.sheets for c in s.cells())


def test_cover_states_method_version_hash_and_cautions(demo):
    plan = audit.audit_plan(demo)
    texts = [c.value for c in plan.sheet("Cover").cells() if isinstance(c.value, str)]
    assert demo.sha256 in texts
    assert any(t.startswith("heatledger ") for t in texts)
    assert any("do not replace" in t for t in texts)
    assert any("declared values" in t for t in texts)
    assert any("ISO 6946" in t for t in texts)


def test_progress_is_reported_per_construction(demo):
    seen = []
    audit.audit_plan(demo, progress=lambda i, n, name: seen.append((i, n, name)))
    assert [s[0] for s in seen] == list(range(1, len(demo.constructions) + 1))


@pytest.mark.calc
def test_changing_a_material_recomputes_the_sheet(demo, tmp_path, recalc):
    """The layer table refers to the Materials sheet: a new λ flows through to U."""
    plan = audit.audit_plan(demo)
    path = write_workbook(plan, tmp_path / "live.xlsx")
    wb = openpyxl.load_workbook(path)
    ws = wb["Materials"]
    row = next(r for r in range(4, ws.max_row + 1) if ws[f"B{r}"].value == "mineral wool 035")
    ws[f"C{row}"] = 0.070  # twice the conductivity
    wb.save(path)
    out = openpyxl.load_workbook(recalc(path), data_only=True)
    entry = next(e for e in demo.constructions if e.name.startswith("EW2"))
    refs = plan.index[entry.name]
    # the engine's answer for the changed input, computed independently of the sheet
    layers = list(entry.construction.layers)
    idx = next(i for i, lay in enumerate(layers) if lay.name == "Cavity insulation")
    from heatledger.constructions import Layer

    layers[idx] = Layer(layers[idx].thickness, 0.070, name=layers[idx].name)
    changed = entry.construction.with_layer(idx, layers[idx])
    assert _value(out, refs.u_value) == pytest.approx(changed.u_value, rel=RTOL_SHEET)
    cover = {r[0]: r[1] for r in out["Cover"].iter_rows(min_col=2, max_col=3, values_only=True)}
    # the engine constants are for 0.035: a what-if, said as such rather than as failed checks
    assert str(cover["State"]).startswith("WHAT-IF: 1 input(s) changed")
