"""The [building] and [[rooms]] sections of a project file, the template's room sheets and the
CLI's heat-loss output.

Every project here is an invented scenario of our own.
"""

from __future__ import annotations

import copy
import json
import math

import openpyxl
import pytest

from heatledger.cautions import CAUTIONS
from heatledger.cli import main, project_results
from heatledger.demo import demo_bytes, demo_project
from heatledger.errors import ProjectError
from heatledger.project import project_from_dict, tomllib
from heatledger.sheet import template as tpl
from heatledger.sheet.render_openpyxl import write_workbook
from tests.tolerances import RTOL_ROUND_OFF

rtol_same = RTOL_ROUND_OFF  # tests/tolerances.py


def small_data() -> dict:
    return {
        "project": {"name": "small (invented)"},
        "design": {"temp_inside": 20.0, "temp_outside": -10.0},
        "building": {"temp_outside_annual_mean": 10.0, "groundwater": "shallow",
                     "soil": "sand", "degree_days": 2500.0, "degree_day_base": 15.0},
        "constructions": [
            {"name": "W", "heat_flow": "horizontal",
             "layers": [{"conductivity": 0.04, "thickness_mm": 200}]},
            {"name": "F", "heat_flow": "down",
             "layers": [{"conductivity": 0.025, "thickness_mm": 100}]},
        ],
        "rooms": [
            {"name": "A", "volume": 150.0,
             "ventilation": {"basis": "air_change", "ventilation_rate": 0.5},
             "elements": [
                 {"name": "wall", "method": "construction", "construction": "W", "area": 30.0},
                 {"name": "floor", "method": "slab_on_ground", "construction": "F",
                  "area": 50.0, "exposed_perimeter": 30.0, "wall_thickness_mm": 300},
                 {"name": "to B", "method": "declared", "u_value": 0.5, "u_source": "x",
                  "area": 10.0, "boundary": "room", "room": "B"},
             ]},
            {"name": "B", "temp_inside": 16.0, "volume": 40.0,
             "ventilation": {"basis": "flow", "ventilation_rate": 20.0},
             "elements": [
                 {"name": "to A", "method": "declared", "u_value": 0.5, "u_source": "x",
                  "area": 10.0, "boundary": "room", "room": "A"},
                 {"name": "to garage", "method": "declared", "u_value": 0.6, "u_source": "x",
                  "area": 8.0, "boundary": "unheated", "adjustment_factor": 0.4}],
             "thermal_bridges": [{"name": "sill", "psi": 0.1, "length": 5.0}]},
        ],
    }


def test_demo_has_rooms_marked_invented():
    text = demo_bytes().decode("utf-8")
    assert "INVENTED demo data" in text
    bi = demo_project().building
    assert [r.name for r in bi.rooms] == ["Workshop", "Office"]
    office = bi.building.rooms[1]
    assert office.ventilation.heat_recovery > 0
    kinds = {el.kind for r in bi.rooms for el in r.elements}
    assert {"wall", "window", "door", "roof", "floor"} <= kinds
    assert bi.degree_days and bi.degree_day_base is not None


def test_small_project_by_hand():
    bi = project_from_dict(small_data()).building
    res = bi.heat_load()
    a = res.rooms[0]
    # source: EN ISO 6946:2017, Table 7 and 6.7 (R_T = Rsi + d/lambda + Rse)
    u_wall = 1 / (0.13 + 0.2 / 0.04 + 0.04)
    # R_f of the floor construction: R_T - Rsi - Rse = d/lambda
    r_f = 0.1 / 0.025
    # source: EN ISO 13370:2017 8.2 [from memory; source: iso13370-slab], lambda 2.0 sand
    # (Table 7 [C])
    b_dash, d_t = 50.0 / 15.0, 0.3 + 2.0 * (0.17 + r_f + 0.04)
    u_floor = (2 * 2.0 / (math.pi * b_dash + d_t) * math.log(math.pi * b_dash / d_t + 1)
               if d_t < b_dash else 2.0 / (0.457 * b_dash + d_t))
    # source: EN 12831-1:2017 clause 6 [from memory]: f_g1 1.45, G_w 1.15 (shallow),
    # f_g2 = (theta_int - theta_m,e)/(theta_int - theta_e); f_ij for the room at 16 degC
    f_ground = 1.45 * (20 - 10) / 30 * 1.15
    h_t = 30 * u_wall + 50 * u_floor * f_ground + 10 * 0.5 * (20 - 16) / 30
    assert a.transmission_coefficient == pytest.approx(h_t, rel=rtol_same)
    # the building: sum over rooms less the exchange between them
    bt = res.rooms[1].transmission_coefficient
    internal = 10 * 0.5 * (20 - 16) / 30 + 10 * 0.5 * (16 - 20) / 26
    assert res.transmission_coefficient == pytest.approx(h_t + bt - internal, rel=rtol_same)
    assert bi.annual_energy().energy == pytest.approx(
        24 * res.heat_loss_coefficient * 2500 / 1000, rel=rtol_same)


def test_room_facing_only_rooms_at_its_own_temperature_loses_nothing():
    data = small_data()
    data["rooms"][1]["temp_inside"] = 20.0
    data["rooms"][1]["elements"] = data["rooms"][1]["elements"][:1]
    data["rooms"][1].pop("thermal_bridges")
    data["rooms"][1]["ventilation"] = {"basis": "flow"}
    res = project_from_dict(data).building.heat_load()
    assert res.rooms[1].design_heat_load == 0.0


def _problems(data) -> list:
    with pytest.raises(ProjectError) as exc:
        project_from_dict(data)
    return exc.value.problems


def test_unknown_construction_names_room_element_rule_and_closest_names():
    data = small_data()
    data["rooms"][0]["elements"][0]["construction"] = "WW"
    ((where, msg),) = _problems(data)
    assert where == "rooms[1].elements[1].construction"
    assert 'room "A"' in msg and 'element "wall"' in msg and "does not exist" in msg
    assert '"W"' in msg


@pytest.mark.parametrize(("change", "path", "fragment"), [
    (lambda d: d["rooms"][0]["elements"][0].update(colour="red"),
     "rooms[1].elements[1].colour", "unknown key"),
    (lambda d: d["rooms"][0]["elements"][0].pop("method"), "rooms[1].elements[1].method",
     "how the U-value is found"),
    (lambda d: d["rooms"][0]["elements"][0].update(boundary="sky"),
     "rooms[1].elements[1].boundary", '"outside"'),
    (lambda d: d["rooms"][0]["elements"][0].update(area=-3.0), "rooms[1].elements[1].area",
     'element "wall"'),
    (lambda d: d["rooms"][0]["elements"][2].update(room="C"), "rooms[1].elements[3].room",
     "does not exist"),
    (lambda d: d["building"].pop("temp_outside_annual_mean"),
     "building.temp_outside_annual_mean", "faces the ground"),
    (lambda d: d["building"].pop("degree_day_base"), "building.degree_day_base",
     "base temperature"),
    (lambda d: d["rooms"][1].update(name="A"), "rooms[2].name", "used twice"),
    (lambda d: d["rooms"][1]["ventilation"].update(heat_recovery=1.2),
     "rooms[2].ventilation.heat_recovery", "between 0 and 1"),
    (lambda d: d["rooms"][1]["thermal_bridges"][0].update(chi=0.1),
     "rooms[2].thermal_bridges[1]", "linear bridge"),
    (lambda d: d["rooms"][0]["elements"][0].update(boundary="ground"),
     "rooms[1].elements[1].boundary", "EN ISO 13370"),
    (lambda d: d["rooms"][0].update(temp_inside=-20.0), "rooms[1].temp_inside",
     "above the design external"),
    (lambda d: d["rooms"][1]["elements"][1].update(adjustment_factor=1.5),
     "rooms[2].elements[2].adjustment_factor", "between 0"),
    (lambda d: d["rooms"][0]["elements"][1].update(exposed_perimeter=10.0),
     "rooms[1].elements[2]", "exposed_perimeter"),
    (lambda d: d["rooms"][0].update(elements={}), "rooms[1].elements",
     'room "A": must be a list of tables ([[rooms.elements]])'),
    (lambda d: d["rooms"][1].update(thermal_bridges=3), "rooms[2].thermal_bridges",
     "must be a list of tables ([[rooms.thermal_bridges]])"),
    (lambda d: d.update(building=[1]), "building", "must be a table ([building])"),
    (lambda d: d.update(rooms={}), "rooms", "must be a list of tables ([[rooms]])"),
])
def test_bad_input_is_named_by_key_path(change, path, fragment):
    data = small_data()
    change(data)
    problems = _problems(data)
    assert any(w == path and fragment in m for w, m in problems), problems


def test_window_parts_must_fit_the_window():
    data = small_data()
    data["rooms"][0]["elements"].append({
        "name": "win", "kind": "window", "method": "window", "area": 1.5,
        "glazing_area": 1.2, "frame_area": 1.6, "glazing_u": 1.1, "frame_u": 1.4,
        "glazing_perimeter": 4.6, "psi_glazing": 0.08})
    ((where, msg),) = _problems(data)
    assert where == "rooms[1].elements[4]" and 'element "win"' in msg and "frame_area" in msg


# --------------------------------------------------------------------------- template
def test_template_round_trip_keeps_rooms(tmp_path):
    demo = demo_project()
    path = write_workbook(tpl.template_plan(demo.raw), tmp_path / "filled.xlsx")
    again = tpl.project_from_template(path)
    a, b = project_results(again), project_results(demo)
    for d in (a, b):
        d.pop("source_sha256")
    assert a["rooms"] == b["rooms"] and a["building"] == b["building"]


def test_template_problem_in_elements_names_the_cell(tmp_path):
    demo = demo_project()
    path = write_workbook(tpl.template_plan(demo.raw), tmp_path / "filled.xlsx")
    wb = openpyxl.load_workbook(path)
    ws = wb["Elements"]
    col = next(c.column_letter for c in ws[tpl.HEADER_ROW] if c.value == "Construction")
    ws[f"{col}{tpl.HEADER_ROW + 1}"] = "EW9 unknown"
    wb.save(path)
    with pytest.raises(ProjectError) as exc:
        tpl.project_from_template(path)
    ((where, msg),) = exc.value.problems
    assert where == f"Elements!{col}{tpl.HEADER_ROW + 1}" and "does not exist" in msg


# --------------------------------------------------------------------------- CLI
def test_cli_json_has_rooms_building_and_the_plant_caution(capsys):
    assert main(["demo", "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    bi = demo_project().building
    res = bi.heat_load()
    assert out["building"]["design_heat_load"] == pytest.approx(res.design_heat_load,
                                                                rel=rtol_same)
    assert [r["name"] for r in out["rooms"]] == ["Workshop", "Office"]
    assert out["building"]["annual_energy_kwh"] == pytest.approx(bi.annual_energy().energy)
    assert CAUTIONS["plant_sizing"] in out["cautions"]


def test_cli_table_shows_rooms(capsys):
    assert main(["demo"]) == 0
    text = capsys.readouterr().out
    assert "Workshop" in text and "Office" in text and "24 H DD / 1000" in text


def test_project_without_rooms_has_no_plant_caution():
    data = copy.deepcopy(small_data())
    for key in ("rooms", "building"):
        data.pop(key)
    results = project_results(project_from_dict(data))
    assert "rooms" not in results and CAUTIONS["plant_sizing"] not in results["cautions"]


def test_demo_toml_round_trips_through_tomllib():
    assert tomllib.loads(demo_bytes().decode("utf-8"))["rooms"][0]["name"] == "Workshop"
