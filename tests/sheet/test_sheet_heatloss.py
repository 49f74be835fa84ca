"""Heat-loss calculation sheets, judged by LibreOffice Calc.

After LibreOffice has recalculated every formula (each with a planted stale cached value, see
conftest.py), every check cell of the room and building sheets must say OK, and the loads,
coefficients and energies the spreadsheet computed must equal the engine's to 1e-9 relative.
A small room is also checked against a hand calculation of EN ISO 10077-1, EN ISO 13370 and
EN 12831-1 equations written out here. All rooms are invented scenarios of our own.
"""

from __future__ import annotations

import copy
import math
import re
from pathlib import Path

import openpyxl
import pytest

from heatledger.demo import demo_bytes, demo_project
from heatledger.project import load_project, project_from_dict, tomllib
from heatledger.sheet import audit
from heatledger.sheet.blocks_heatloss import BUILDING_SHEET, add_heatloss_sheets
from heatledger.sheet.plan import WorkbookPlan
from heatledger.sheet.render_openpyxl import write_workbook
from tests.tolerances import RTOL_SHEET


def variety_data() -> dict:
    """Invented building touching every element method, boundary and bridge type."""
    data = tomllib.loads(demo_bytes().decode("utf-8"))
    data["project"]["name"] = "Heat-loss variety (invented test scenario)"
    data["building"].pop("degree_days")
    data["building"]["degree_days"] = 3300.0
    data["building"]["groundwater"] = "shallow"
    data["rooms"].append({
        "name": "Archive", "temp_inside": 12.0, "volume": 90.0, "floor_area": 30.0,
        "ventilation": {"basis": "air_change", "ventilation_rate": 0.0, "infiltration": 0.1,
                        "minimum_air_change": 0.3},
        "elements": [
            {"name": "Basement", "method": "heated_basement", "kind": "floor",
             "construction": "GF1 ground-bearing floor build-up",
             "wall_construction": "EW2 masonry cavity wall", "area": 30.0,
             "exposed_perimeter": 22.0, "wall_thickness_mm": 350, "depth": 1.5},
            {"name": "Suspended part", "method": "suspended_floor", "kind": "floor",
             "deck_resistance": 2.5, "area": 12.0, "exposed_perimeter": 14.0,
             "wall_thickness_mm": 300, "underfloor_height": 0.4, "underfloor_wall_u": 1.5,
             "vent_area_per_perimeter": 0.003, "wind_speed": 4.0, "wind_shielding": "average",
             "soil": "sand"},
            {"name": "Edge-insulated slab", "method": "slab_on_ground",
             "floor_resistance": 0.5, "area": 16.0, "exposed_perimeter": 16.0,
             "wall_thickness_mm": 250,
             "edge_insulation": {"orientation": "vertical", "extent": 0.6,
                                 "resistance": 2.0, "thickness_mm": 60}},
            {"name": "Horizontal edge slab", "method": "slab_on_ground",
             "floor_resistance": 0.1, "area": 9.0, "exposed_perimeter": 12.0,
             "wall_thickness_mm": 200, "soil_conductivity": 3.5,
             "edge_insulation": {"orientation": "horizontal", "extent": 1.0,
                                 "resistance": 1.5, "thickness_mm": 50}},
            {"name": "Panel door", "kind": "door", "method": "window", "glazing_area": 0.5,
             "frame_area": 0.4, "glazing_u": 1.2, "frame_u": 1.8, "glazing_perimeter": 3.0,
             "psi_glazing": 0.06, "panel_area": 1.1, "panel_u": 0.9, "panel_perimeter": 4.4,
             "psi_panel": 0.02},
            {"name": "Wall to garage", "method": "construction",
             "construction": "EW2 masonry cavity wall", "area": 10.0, "boundary": "unheated",
             "adjustment_factor": 0.5, "thermal_bridge_allowance": 0.05},
            {"name": "OK", "method": "declared", "u_value": 0.8,  # a name that reads OK
             "u_source": "invented", "area": 9.0, "boundary": "adjacent",
             "temp_adjacent": 15.0},
            {"name": "Wall to office", "method": "declared", "u_value": 0.6,
             "u_source": "invented", "area": 6.0, "boundary": "room", "room": "Office"},
        ],
        "thermal_bridges": [{"name": "lintel to garage", "psi": 0.3, "length": 2.0,
                             "boundary": "unheated", "adjustment_factor": 0.5}],
    })
    return data


@pytest.fixture(scope="module")
def demo():
    return demo_project()


@pytest.fixture(scope="module")
def variety():
    return project_from_dict(variety_data(), source_name="variety")


def _value(wb, reference):
    sheet, a1 = re.match(r"^'((?:[^']|'')+)'!(.+)$", reference).groups()
    return wb[sheet.replace("''", "'")][a1.replace("$", "")].value


def _standalone(project, tmp_path, recalc):
    plan = WorkbookPlan(title="heat loss")
    refs = add_heatloss_sheets(plan, project.building, project_name="t")
    plan.validate()
    path = write_workbook(plan, tmp_path / "hl.xlsx")
    return plan, refs, openpyxl.load_workbook(recalc(path), data_only=True)


def _assert_checks_and_engine(project, plan, refs, wb):
    checks = [(s, c) for s, c in plan.cells_with_role("check") if s in refs.sheets]
    assert len(checks) == refs.check_total > 20
    bad = [(s, c.ref, wb[s][c.ref].value) for s, c in checks if wb[s][c.ref].value != "OK"]
    assert not bad, bad[:10]
    assert _value(wb, refs.check_count) == _value(wb, refs.checks_ok) == len(checks)
    bi = project.building
    res = bi.heat_load()
    for r in res.rooms:
        rr = refs.rooms[r.room]
        assert _value(wb, rr["load"]) == pytest.approx(r.design_heat_load, rel=RTOL_SHEET)
        assert _value(wb, rr["transmission"]) == pytest.approx(r.transmission_coefficient,
                                                               rel=RTOL_SHEET)
        assert _value(wb, rr["ventilation"]) == pytest.approx(r.ventilation_coefficient,
                                                              rel=RTOL_SHEET)
    b = refs.building
    assert _value(wb, b["load"]) == pytest.approx(res.design_heat_load, rel=RTOL_SHEET)
    assert _value(wb, b["transmission"]) == pytest.approx(res.transmission_coefficient,
                                                          rel=RTOL_SHEET)
    assert _value(wb, b["ventilation"]) == pytest.approx(res.ventilation_coefficient,
                                                         rel=RTOL_SHEET)
    assert _value(wb, b["energy"]) == pytest.approx(bi.annual_energy().energy, rel=RTOL_SHEET)


@pytest.mark.calc
def test_demo_heatloss_sheets_all_checks_ok_and_equal_engine(demo, tmp_path, recalc):
    plan, refs, wb = _standalone(demo, tmp_path, recalc)
    _assert_checks_and_engine(demo, plan, refs, wb)


@pytest.mark.calc
def test_variety_heatloss_sheets_all_checks_ok_and_equal_engine(variety, tmp_path, recalc):
    plan, refs, wb = _standalone(variety, tmp_path, recalc)
    _assert_checks_and_engine(variety, plan, refs, wb)


@pytest.mark.calc
def test_in_the_audit_workbook_u_values_link_to_the_construction_sheets(demo, tmp_path,
                                                                         recalc):
    plan = audit.audit_plan(demo)
    path = write_workbook(plan, tmp_path / "audit.xlsx")
    wb = openpyxl.load_workbook(recalc(path), data_only=True)
    refs = plan.index["heat loss"]
    _assert_checks_and_engine(demo, plan, refs, wb)
    formulas = [c.formula for c in plan.sheet(refs.sheets[0]).cells() if c.formula]
    ew1 = plan.index["EW1 timber-frame external wall"].u_value
    assert any(f == f"={ew1}" for f in formulas)
    cover = {r[0]: r[1] for r in wb["Cover"].iter_rows(min_col=2, max_col=3,
                                                      values_only=True)}
    all_checks = len(list(plan.cells_with_role("check")))
    assert cover["Check cells in the workbook"] == all_checks
    assert cover["State"] == "ALL CHECKS OK"
    texts = [v for row in wb["Cover"].iter_rows(values_only=True) for v in row if v]
    assert any("plant" in str(v).lower() for v in texts)


@pytest.mark.calc
def test_hand_calculation_of_a_small_room(tmp_path, recalc):
    data = {
        "project": {"name": "hand check (invented)"},
        "design": {"temp_inside": 20.0, "temp_outside": -10.0},
        "building": {"temp_outside_annual_mean": 10.0, "degree_days": 2000.0,
                     "degree_day_base": 15.5},
        "constructions": [],
        "rooms": [{
            "name": "Box", "volume": 100.0,
            "ventilation": {"basis": "flow", "ventilation_rate": 100.0, "heat_recovery": 0.5},
            "elements": [
                {"name": "glazing", "kind": "window", "method": "window",
                 "glazing_area": 1.2, "frame_area": 0.4, "glazing_u": 1.1, "frame_u": 1.4,
                 "glazing_perimeter": 4.6, "psi_glazing": 0.08},
                {"name": "floor", "method": "slab_on_ground", "floor_resistance": 0.0,
                 "area": 100.0, "exposed_perimeter": 40.0, "wall_thickness_mm": 300,
                 "soil_conductivity": 2.0},
            ]}],
    }
    project = project_from_dict(data)
    plan, refs, wb = _standalone(project, tmp_path, recalc)
    # source: EN ISO 10077-1:2017 clause 6 equation [from memory], evaluated by hand
    uw = (1.2 * 1.1 + 0.4 * 1.4 + 4.6 * 0.08) / 1.6
    # source: EN ISO 13370:2017 8.2, worked value 0.762 for 10 m x 10 m, w 0.3, lambda 2
    # [from memory; source: iso13370-slab]
    b_dash, d_t = 100.0 / 20.0, 0.3 + 2.0 * (0.17 + 0.0 + 0.04)
    u_floor = 2 * 2.0 / (math.pi * b_dash + d_t) * math.log(math.pi * b_dash / d_t + 1)
    assert round(u_floor, 3) == 0.762
    # source: EN 12831-1:2017 clause 6, f_g1 f_g2 G_w [from memory]
    f_ground = 1.45 * (20.0 - 10.0) / (20.0 - (-10.0)) * 1.0
    # H_V = rho c_p V (1 - eta)/3600 with dry air at 20 degC, 101325 Pa (ideal gas)
    rho = 101325.0 * 28.966e-3 / (8.314462618 * 293.15)
    h_v = rho * 1006.0 * 100.0 * 0.5 / 3600.0
    h_t = 1.6 * uw + 100.0 * u_floor * f_ground
    load = (h_t + h_v) * 30.0
    rr = refs.rooms["Box"]
    rtol_hand = 1e-9  # same equations, other order of operations
    assert _value(wb, rr["transmission"]) == pytest.approx(h_t, rel=rtol_hand)
    assert _value(wb, rr["ventilation"]) == pytest.approx(h_v, rel=rtol_hand)
    assert _value(wb, rr["load"]) == pytest.approx(load, rel=rtol_hand)
    # source: degree-day method Q = 24 H DD / 1000 [from memory; source: degree-days]
    q = 24.0 * (h_t + h_v) * 2000.0 / 1000.0
    assert _value(wb, refs.building["energy"]) == pytest.approx(q, rel=rtol_hand)


@pytest.mark.calc
def test_a_wrong_engine_value_is_reported_as_mismatch(demo, tmp_path, recalc):
    plan = WorkbookPlan(title="tampered")
    refs = add_heatloss_sheets(plan, demo.building)
    sheet = plan.sheet(refs.sheets[0])
    first, _last = refs.rooms["Workshop"]["table"]
    engine = next(c for c in sheet.cells() if c.ref == f"L{first}")
    engine.value *= 1.0 + 1e-6
    path = write_workbook(plan, tmp_path / "tampered.xlsx")
    wb = openpyxl.load_workbook(recalc(path), data_only=True)
    assert str(wb[refs.sheets[0]][f"M{first}"].value).startswith("MISMATCH")
    assert _value(wb, refs.checks_ok) == _value(wb, refs.check_count) - 1


def test_heatloss_formulas_use_portable_functions(variety):
    allowed = {"IF", "ABS", "MAX", "MIN", "SUM", "COUNTIF", "AND", "OR", "SUMPRODUCT", "LN",
               "PI"}
    plan = WorkbookPlan(title="x")
    refs = add_heatloss_sheets(plan, variety.building)
    used = set()
    for name in refs.sheets:
        for cell in plan.sheet(name).cells():
            if cell.formula:
                text = re.sub(r'"[^"]*"', "", cell.formula)
                used |= set(re.findall(r"([A-Z][A-Z0-9.]*)\(", text))
    assert used <= allowed, used - allowed
    assert {"LN", "PI"} <= used


def test_sheets_are_deterministic_and_room_names_stay_text(demo):
    data = copy.deepcopy(demo.raw)
    data["rooms"][0]["name"] = "=1+1 workshop"
    data["rooms"][1]["elements"][4]["room"] = "=1+1 workshop"
    project = project_from_dict(data)
    plan = WorkbookPlan(title="x")
    refs = add_heatloss_sheets(plan, project.building)
    texts = [c.value for c in plan.sheet(BUILDING_SHEET).cells() if c.value == "=1+1 workshop"]
    assert texts and all(c.formula is None for c in plan.sheet(BUILDING_SHEET).cells()
                         if c.value == "=1+1 workshop")
    assert refs.sheets[0].startswith("Room 1")


README_EXAMPLE = Path(__file__).resolve().parents[1] / "data" / "heatloss_readme_example.toml"


@pytest.mark.calc
def test_readme_example_audit_all_checks_ok(tmp_path, recalc):
    """The README's complete [[rooms]] example (every method and boundary) through the audit,
    where basement-wall and floor resistances refer to the construction sheets."""
    project = load_project(README_EXAMPLE)
    plan = audit.audit_plan(project)
    path = write_workbook(plan, tmp_path / "readme.xlsx")
    wb = openpyxl.load_workbook(recalc(path), data_only=True)
    refs = plan.index["heat loss"]
    _assert_checks_and_engine(project, plan, refs, wb)
    methods = {type(el.u).__name__ for r in project.building.rooms for el in r.elements}
    assert {"str", "WindowResult", "DeclaredWindow", "GroundFloorU"} <= methods
    formulas = [c.formula for s in refs.sheets for c in plan.sheet(s).cells() if c.formula]
    assert any("-0.13-0.04" in f for f in formulas)  # R_w = R_T - Rsi - Rse of W1, live
