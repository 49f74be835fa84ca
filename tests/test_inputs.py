"""Input that cannot be right is refused, input that is probably a slip is flagged, and
every message speaks the words of the project file (no Python reprs, no cascades).

The projects here are small invented build-ups of our own.
"""

from __future__ import annotations

import copy
import datetime as dt
import math
import re
import tracemalloc

import numpy as np
import pytest

from heatledger import HeatLedgerError, ProjectError, project_from_dict
from heatledger.cli import main, project_results
from heatledger.constructions import AirLayer, BridgedLayer, Construction, Layer
from heatledger.demo import demo_project
from heatledger.materials import default_library
from tests.tolerances import RTOL_ITERATION

# source: definition of the Celsius scale, 0 K = -273.15 degC
ABSOLUTE_ZERO_C = -273.15
# Relative agreement of the finite-volume heat flux with the exact series sum: the audit
# sheets check formula against engine to 1e-9 relative, so the solve must be at least as good.
RTOL_SOLVE = RTOL_ITERATION  # tests/tolerances.py


def wall(**layer) -> dict:
    """A two-layer invented wall; ``layer`` replaces keys of the second (insulation) layer."""
    second = {"name": "mineral wool 035", "material": "mineral wool 035", "thickness_mm": 100}
    second.update(layer)
    return {"design": {"temp_inside": 20.0, "temp_outside": -5.0},
            "constructions": [{"name": "W", "layers": [
                {"material": "concrete medium density 2000", "thickness_mm": 200}, second]}]}


def problems_of(data) -> list:
    with pytest.raises(ProjectError) as err:
        project_from_dict(data)
    return err.value.problems


def rooms_data() -> dict:
    return {
        "design": {"temp_inside": 20.0, "temp_outside": -10.0},
        "constructions": [{"name": "W", "layers": [{"conductivity": 0.04,
                                                    "thickness_mm": 200}]}],
        "rooms": [{"name": "A", "volume": 150.0, "floor_area": 50.0,
                   "ventilation": {"basis": "air_change", "ventilation_rate": 0.5},
                   "elements": [{"name": "wall", "method": "construction",
                                 "construction": "W", "area": 30.0}]}],
    }


# ----------------------------------------------------------------------------- refused
@pytest.mark.parametrize("value", [-300.0, ABSOLUTE_ZERO_C, -1e308])
def test_design_temperature_at_or_below_absolute_zero_is_refused(value):
    data = wall()
    data["design"]["temp_outside"] = value
    ((where, msg),) = problems_of(data)
    assert where == "design.temp_outside"
    assert "absolute zero" in msg and "-273.15 degC" in msg and f"{value:g}" in msg


def test_temperature_far_above_any_solid_is_refused():
    data = wall()
    data["design"]["temp_inside"] = 1e308
    ((where, msg),) = problems_of(data)
    assert where == "design.temp_inside" and "5000 degC" in msg


@pytest.mark.parametrize("key, value, fragment", [
    ("thickness_mm", 1e308, "at most 10000 mm"),
    ("thickness_mm", 20000.0, "at most 10000 mm"),
    ("conductivity", 1e-300, "at least 0.001 W/(m K)"),
    ("conductivity", 1e300, "at most 5000 W/(m K)"),
])
def test_layer_beyond_physical_sense_is_refused_at_its_key(key, value, fragment):
    ((where, msg),) = problems_of(wall(**{key: value}))
    assert where == f"constructions[1].layers[2].{key}"
    assert fragment in msg and f"{value:g}" in msg


@pytest.mark.parametrize("resistance", [1e-300, 5e-324, 1e-12, 1e300])
def test_declared_resistance_that_breaks_the_solve_is_refused(resistance):
    data = wall(kind="declared", resistance=resistance, thickness_mm=10)
    del data["constructions"][0]["layers"][1]["material"]
    ((where, msg),) = problems_of(data)
    assert where == "constructions[1].layers[2].resistance" and "m2 K/W" in msg


def test_layer_resistance_at_the_bound_keeps_the_solve_exact():
    from heatledger._validate import LIMITS

    r_min = LIMITS["layer_resistance"].low
    con = Construction([Layer(0.2, 1.35), Layer(1e-6, resistance=r_min), Layer(0.1, 0.035)])
    temps = con.temperatures(20.0, -5.0)
    # source: exact 1-D steady conduction through resistances in series,
    # q = (t_i - t_e) / R_T with R_T = Rsi + sum R + Rse (EN ISO 6946:2017, 6.7.1)
    assert temps.heat_flux == pytest.approx(25.0 / con.total_resistance, rel=RTOL_SOLVE)
    with pytest.raises(HeatLedgerError, match="resistance must be at least 1e-09 m2 K/W"):
        Layer(1e-6, resistance=r_min / 10)


@pytest.mark.parametrize("make, fragment", [
    (lambda: Layer(1e305, 1.0), "thickness must be at most 10 m"),
    (lambda: Layer(0.1, 1e-300), "conductivity must be at least 0.001"),
    (lambda: Layer(0.1, resistance=1e-300), "resistance must be at least 1e-09"),
    (lambda: Layer(1e-6, 5000.0), "resistance thickness/conductivity must be at least"),
    (lambda: Layer(1e-12, 1.0), "thickness must be at least 1e-06 m"),
    (lambda: BridgedLayer(1e308, [(0.04, 0.9), (0.13, 0.1)]), "at most 10 m"),
    (lambda: Construction([Layer(0.1, 1.0)], rsi=1e300), "rsi must be at most 10 m2 K/W"),
    (lambda: Construction([Layer(0.1, 1.0)]).temperatures(-300, -5), "inside must be above"),
    (lambda: Construction([Layer(0.1, 1.0)]).ladder_temperatures(20, ABSOLUTE_ZERO_C),
     "outside must be above -273.15 degC (absolute zero"),
])
def test_engine_refuses_the_same_inputs(make, fragment):
    with pytest.raises(HeatLedgerError, match=re.escape(fragment)):
        make()


def test_air_layer_too_thick_names_the_layer_and_its_millimetres():
    data = wall(kind="air", name="cavity", thickness_mm=400)
    del data["constructions"][0]["layers"][1]["material"]
    ((where, msg),) = problems_of(data)
    assert where == "constructions[1].layers[2].thickness_mm"
    assert '"cavity"' in msg and "400 mm" in msg and "300 mm" in msg
    with pytest.raises(HeatLedgerError, match='air layer "cavity" is 400 mm thick'):
        AirLayer(0.4, name="cavity")


@pytest.mark.parametrize("nodes", [10**9, 501, 0, 2.5, "many"])
def test_nodes_per_layer_beyond_the_bound_is_refused_in_a_project(nodes):
    data = wall()
    data["constructions"][0]["nodes_per_layer"] = nodes
    ((where, msg),) = problems_of(data)
    assert where == "constructions[1].nodes_per_layer" and "from 1 to 500" in msg


@pytest.mark.parametrize("kwargs", [{"nodes_per_layer": 10**9}, {"nodes_per_layer": 10**7},
                                    {"nodes_per_layer": [600_000, 600_000]},
                                    {"max_spacing": 1e-300}, {"max_spacing": 5e-324}])
def test_huge_meshes_are_refused_by_the_engine_before_any_memory_is_taken(kwargs):
    con = Construction([Layer(0.2, 1.35), Layer(0.1, 0.035)])
    with pytest.raises(HeatLedgerError, match="at most 1000000 per layer and 1000000"):
        con.temperatures(20.0, -5.0, **kwargs)


def test_the_largest_mesh_accepted_stays_under_three_hundred_megabytes():
    from heatledger._validate import MAX_CELLS, MAX_CELLS_PER_LAYER

    layers = [Layer(0.1, 1.0)] * max(1, MAX_CELLS // MAX_CELLS_PER_LAYER)
    con = Construction(layers)
    tracemalloc.start()
    try:
        res = con.temperatures(20.0, -5.0, nodes_per_layer=MAX_CELLS_PER_LAYER)
        _ = (res.mesh_estimate, res.fv.face_temperature)  # all a caller may read
        peak = tracemalloc.get_traced_memory()[1]
    finally:
        tracemalloc.stop()
    # common practice, no published source: "a few hundred MB at most" on a laptop
    assert peak < 300e6


@pytest.mark.parametrize("value", [float("nan"), float("inf"), "100", True, [100],
                                   {"mm": 100}, dt.date(2024, 1, 1)])
def test_not_a_finite_number_is_refused_in_words_of_the_file(value):
    ((where, msg),) = problems_of(wall(thickness_mm=value))
    assert where == "constructions[1].layers[2].thickness_mm"
    assert "must be a" in msg
    assert not re.search(r"None|'|datetime|\{", msg), msg


@pytest.mark.parametrize("change, path, fragment", [
    (lambda d: d["rooms"][0].update(volume=1e308), "rooms[1].volume", "at most 1e+08 m3"),
    (lambda d: d["rooms"][0].update(temp_inside=-300.0), "rooms[1].temp_inside",
     "absolute zero"),
    (lambda d: d["rooms"][0]["elements"][0].update(area=1e308), "rooms[1].elements[1].area",
     "at most 1e+07 m2"),
    (lambda d: d["rooms"][0]["elements"][0].update(boundary="adjacent", temp_adjacent=-280.0),
     "rooms[1].elements[1].temp_adjacent", "absolute zero"),
])
def test_rooms_refuse_values_beyond_physical_sense(change, path, fragment):
    data = rooms_data()
    change(data)
    problems = problems_of(data)
    assert any(w == path and fragment in m for w, m in problems), problems


def test_fin_temperature_at_absolute_zero_is_refused_in_file_and_engine():
    from heatledger.fins import StraightFin

    fin = {"name": "F", "kind": "straight", "conductivity": 200.0, "h": 10.0,
           "temp_base": ABSOLUTE_ZERO_C, "temp_fluid": 20.0, "length_mm": 40.0,
           "thickness_mm": 2.0}
    problems = problems_of({"fins": [fin]})
    assert ("fins[1].temp_base" in [w for w, _ in problems])
    with pytest.raises(HeatLedgerError, match="absolute zero"):
        StraightFin(0.04, 200.0, 10.0, thickness=0.002).evaluate(ABSOLUTE_ZERO_C, 20.0)
    with pytest.raises(HeatLedgerError, match="nodes must be at most"):
        StraightFin(0.04, 200.0, 10.0, thickness=0.002).finite_volume(80.0, 20.0,
                                                                      nodes=10**9)


def test_template_cells_get_the_same_limits(tmp_path):
    from heatledger.sheet import template as tpl
    from heatledger.sheet.render_openpyxl import write_workbook

    data = copy.deepcopy(demo_project().raw)
    data["constructions"][0]["layers"][2]["thickness_mm"] = 1e308
    path = write_workbook(tpl.template_plan(data), tmp_path / "filled.xlsx")
    with pytest.raises(ProjectError) as err:
        tpl.project_from_template(path)
    ((where, msg),) = err.value.problems
    assert where.startswith("Layers!") and "at most 10000 mm" in msg
    data["constructions"][0]["layers"][2]["thickness_mm"] = 0.06  # metres in a mm cell
    path = write_workbook(tpl.template_plan(data), tmp_path / "thin.xlsx", force=True)
    ((where, text),) = tpl.project_from_template(path).warnings
    assert where.startswith("Constructions!") and "0.06 mm is below 1 mm" in text


# ----------------------------------------------------------------------------- flagged
def test_a_thin_insulation_layer_is_flagged_everywhere_results_are_shown(tmp_path, capsys):
    data = wall(thickness_mm=0.1)
    project = project_from_dict(data)
    ((where, text),) = project.warnings
    assert where == "constructions[1]"
    assert '"mineral wool 035"' in text and "0.1 mm" in text and "100 mm" in text
    assert text in project.constructions[0].construction.warnings
    assert project_results(project)["input_warnings"] == [{"where": where, "message": text}]
    # the command line lists it once, at the top
    toml = tmp_path / "thin.toml"
    toml.write_text('[design]\ntemp_inside = 20\ntemp_outside = -5\n[[constructions]]\n'
                    'name = "W"\n[[constructions.layers]]\nmaterial = "mineral wool 035"\n'
                    "thickness_mm = 0.1\n", encoding="utf-8")
    assert main(["calc", str(toml)]) == 0
    out = capsys.readouterr().out
    assert "Input warnings" in out and out.count("0.1 mm is below 1 mm") == 1
    # the audit cover lists it
    from heatledger.sheet.audit import audit_plan

    cover = audit_plan(project).sheets[0]
    texts = [c.value for c in cover.cells() if isinstance(c.value, str)]
    assert "Input warnings" in texts and any("0.1 mm is below 1 mm" in t for t in texts)


def test_the_spreadsheet_warning_function_shows_a_thin_layer():
    from heatledger_xl.udfs import HL_WARNINGS

    rows = HL_WARNINGS([["concrete medium density 2000", 200], ["mineral wool 035", 0.12]])
    assert any("0.12 mm is below 1 mm" in r[0] for r in rows), rows


@pytest.mark.parametrize("name, d_mm", [("vapour control membrane", 0.2),
                                        ("polyethylene film", 0.15), ("steel", 0.7)])
def test_membranes_foils_and_metal_sheets_may_be_thin(name, d_mm):
    data = wall(name=name, material=name, thickness_mm=d_mm)
    if name not in default_library():
        del data["constructions"][0]["layers"][1]["material"]
        data["constructions"][0]["layers"][1]["conductivity"] = 0.2
    assert project_from_dict(data).warnings == []


def test_a_conductivity_far_outside_its_class_is_flagged():
    con = Construction([Layer(0.1, 35.0, name="PIR board")])
    (text,) = con.input_warnings
    assert "insulation" in text and "35 W/(m K)" in text and "mW/(m K)" in text


def test_every_library_material_lies_within_its_own_class():
    from heatledger._validate import conductivity_class

    for mat in default_library():
        found = conductivity_class(mat.name)
        if found is not None:
            _, low, high = found
            # source: EN ISO 10456:2007 Table 3 values of the shipped library
            assert low <= mat.conductivity <= high, (mat.name, found)


def test_window_slips_are_flagged_on_the_result_and_in_the_project():
    from heatledger.windows import declared_window, window

    swapped = window(0.4, 1.2, 1.1, 1.4, 2.6, 0.08)
    assert any("frame_area 1.2 m2 is larger than glazing_area 0.4 m2" in t
               for t in swapped.warnings)
    # source: EN ISO 6946:2017 Table 7, 1/(Rsi + Rse) = 1/(0.10 + 0.04) W/(m2 K) upwards
    assert declared_window(8.0, source="x").warnings
    assert not declared_window(1.0 / (0.10 + 0.04) - 0.2, source="x").warnings
    data = rooms_data()
    data["rooms"][0]["elements"].append(
        {"name": "door", "kind": "door", "method": "declared", "u_value": 8.5,
         "u_source": "test report", "area": 2.0})
    warnings = project_from_dict(data).warnings
    assert any(w == "rooms[1]" and '"door"' in t and "8.5" in t for w, t in warnings)


def test_a_room_volume_that_does_not_fit_its_floor_area_is_flagged():
    data = rooms_data()
    data["rooms"][0]["volume"] = 50.0  # the floor area written as the volume
    ((where, text),) = project_from_dict(data).warnings
    assert where == "rooms[1]" and "1 m" in text and "volume" in text


def test_the_invented_demo_raises_no_input_warning():
    assert demo_project().warnings == []


# ----------------------------------------------------------------------------- cascades
def test_a_bad_material_is_reported_once_not_at_every_reference():
    data = wall(material="my board", name="board")
    data["materials"] = [{"name": "my board", "conductivity": -0.03}]
    data["fins"] = [{"name": "F", "kind": "straight", "material": "my board", "h": 10.0,
                     "temp_base": 60.0, "temp_fluid": 20.0, "length_mm": 40.0,
                     "thickness_mm": 2.0}]
    problems = problems_of(data)
    assert [w for w, _ in problems] == ["materials[1].conductivity"]


def test_a_bad_construction_does_not_cascade_into_does_not_exist():
    data = rooms_data()
    data["constructions"][0]["layers"][0]["thickness_mm"] = -5
    data["rooms"][0]["elements"].append(
        {"name": "floor", "method": "slab_on_ground", "construction": "W", "area": 50.0,
         "exposed_perimeter": 30.0, "wall_thickness_mm": 300})
    data["building"] = {"temp_outside_annual_mean": 10.0}
    problems = problems_of(data)
    assert problems == [("constructions[1].layers[1].thickness_mm",
                         "must be greater than zero; got -5")]


def test_a_bad_design_temperature_does_not_cascade_into_the_rooms():
    data = rooms_data()
    data["design"]["temp_inside"] = "warm"
    problems = problems_of(data)
    assert [w for w, _ in problems] == ["design.temp_inside"]


# ----------------------------------------------------------------------------- wording
PYTHON_SYNTAX = [
    re.compile(r"\bNone\b"), re.compile(r"\bTrue\b|\bFalse\b"), re.compile(r"\w='|\w=\""),
    re.compile(r"\[\s*'|\(\s*'|\{\s*'"), re.compile(r"(?<![A-Za-z])'[^'\s][^']*'(?![A-Za-z])"),
    re.compile(r"datetime\.|object at 0x|array\(|np\.|<class"),
]


def _bad_projects():
    yield wall(thickness_mm=None)
    yield wall(thickness_mm=[1, "a"])
    yield wall(thickness_mm={"a": 1})
    yield wall(thickness_mm=dt.date(2024, 1, 1))
    yield wall(kind=None)
    yield wall(kind=["air"])
    yield wall(kind="air", ventilation=None, emissivity_1="high", vent_area_mm2=True)
    yield wall(kind="air", ventilation="slightly")
    yield wall(kind="bridged", bridging_material="softwood 500", bridging_fraction=1.5)
    yield wall(material="mineral wol 035")
    yield wall(material=None, name=None)
    for key, value in (("heat_flow", None), ("heat_flow", 3), ("rsi", "low"),
                       ("nodes_per_layer", None), ("nodes_per_layer", True),
                       ("size_layer", "foam"), ("area", False), ("layers", None),
                       ("corrections", [{"kind": None}, {"kind": "air_gaps", "layer": 9,
                                                         "level": None}])):
        data = wall()
        data["constructions"][0][key] = value
        yield data
    data = wall()
    data["design"] = {"temp_inside": None, "temp_outside": [1]}
    yield data
    data = wall()
    data["materials"] = [{"name": "m", "conductivity": None}, None,
                         {"name": None, "conductivity": 1e9}]
    yield data
    for change in (
        lambda d: d["rooms"][0].update(name=None, volume=None, ventilation=None),
        lambda d: d["rooms"][0]["elements"][0].update(method=None, kind=3, boundary=None),
        lambda d: d["rooms"][0]["elements"][0].update(construction=None),
        lambda d: d["rooms"][0]["elements"][0].update(construction="V"),
        lambda d: d["rooms"][0]["elements"][0].update(boundary="unheated"),
        lambda d: d["rooms"][0]["elements"][0].update(boundary="room", room="Z"),
        lambda d: d["rooms"][0]["elements"].append(
            {"name": "win", "method": "window", "glazing_area": 0.5, "frame_area": 0.3,
             "glazing_u": 1.1, "frame_u": 1.4, "glazing_perimeter": 2.6, "psi_glazing": 0.08,
             "glazing_shape": "oval"}),
        lambda d: d["rooms"][0]["elements"].append(
            {"name": "win", "method": "window", "glazing_area": 0.5, "frame_area": 0.3,
             "glazing_u": 1.1, "frame_u": 1.4, "glazing_perimeter": 2.0, "psi_glazing": 0.08}),
        lambda d: d["rooms"][0]["elements"].append(
            {"name": "g", "method": "slab_on_ground", "floor_resistance": 1.0, "area": 50.0,
             "exposed_perimeter": 10.0, "wall_thickness_mm": 300, "soil": None,
             "edge_insulation": {"orientation": None, "extent": 1, "resistance": 1,
                                 "thickness_mm": 10}}),
        lambda d: d["rooms"][0].update(thermal_bridges=[{"name": "b", "chi": 0.1,
                                                         "count": None}]),
        lambda d: d.update(building={"groundwater": None, "soil": 4}),
        lambda d: d["rooms"][0]["ventilation"].update(basis=None),
    ):
        data = rooms_data()
        change(data)
        yield data
    fin = {"name": "F", "kind": "straight", "conductivity": 200.0, "h": 10.0,
           "temp_base": 60.0, "temp_fluid": 20.0, "length_mm": 40.0, "thickness_mm": 2.0}
    for key, value in (("kind", None), ("tip", None), ("profile", 3), ("corrected_length", 1),
                       ("notes", [1]), ("fv", {"cells": None}), ("array", {"count": None}),
                       ("tip", "temperature")):
        f = dict(fin)
        f[key] = value
        yield {"fins": [f]}


def _engine_calls():
    from heatledger import fins, windows
    from heatledger.ground import slab_on_ground
    from heatledger.heatloss import Element, Room, Unheated, Ventilation

    yield lambda: Layer(None, 1.0)
    yield lambda: Layer(0.1, None, resistance=None)
    yield lambda: Layer("thick", 1.0)
    yield lambda: AirLayer(0.05, ventilation="slightly")
    yield lambda: AirLayer(0.05, ventilation=None)
    yield lambda: Construction([Layer(0.1, 1.0)], None)
    yield lambda: Construction([None])
    yield lambda: Construction([Layer(0.1, 1.0)]).temperatures(20, 0, nodes_per_layer=[None])
    yield lambda: windows.window(1, 0.2, 1.1, 1.4, 3, 0.08, glazing_shape=None)
    yield lambda: windows.window(1, 0.2, 1.1, 1.4, 3, 0.08)
    yield lambda: windows.window([1, np.nan], 0.2, 1.1, 1.4, 3, 0.08)
    yield lambda: windows.declared_window(1.0, source=None)
    yield lambda: windows.psi_glazing_default("wood", None)
    yield lambda: slab_on_ground(50.0, 10.0, 0.3, 1.0, edge_insulation="yes")
    yield lambda: fins.StraightFin(0.04, 200.0, 10.0, thickness=0.002, tip="temperature")
    yield lambda: fins.StraightFin(0.04, 200.0, 10.0, thickness=0.002, corrected_length=None)
    yield lambda: Room("A", 20.0, 50.0, [Element("x", 5.0, 0.3, Unheated())],
                       Ventilation("flow"))
    yield lambda: Room(None, 20.0, 50.0, [], Ventilation("flow"))
    yield lambda: Room("A", 20.0, 50.0, [Element("x", 5.0, None)], Ventilation("flow"))


def _messages() -> list:
    out = []
    for data in _bad_projects():
        try:
            project_from_dict(data)
        except ProjectError as exc:
            out += [f"{w}: {m}" for w, m in exc.problems]
    for call in _engine_calls():
        try:
            call()
        except HeatLedgerError as exc:
            out.append(str(exc))
    return out


def test_no_message_shows_python_syntax():
    messages = _messages()
    assert len(messages) > 60  # the scan reaches far
    bad = [(m, p.pattern) for m in messages for p in PYTHON_SYNTAX if p.search(m)]
    assert not bad, "\n".join(f"{p}: {m}" for m, p in bad[:20])


def test_names_and_choices_are_quoted_as_in_the_project_file():
    ((_, msg),) = problems_of(wall(kind="foam"))
    assert msg == ('must be one of "material", "declared", "air" or "bridged"; got "foam"')


# ----------------------------------------------------------------------------- every key
def _leaves(obj, path=()):
    if isinstance(obj, dict):
        for k, v in obj.items():
            yield from _leaves(v, path + (k,))
    elif isinstance(obj, list):
        for i, v in enumerate(obj):
            yield from _leaves(v, path + (i,))
    else:
        yield path, obj


def _with(data, path, value):
    out = copy.deepcopy(data)
    node = out
    for k in path[:-1]:
        node = node[k]
    node[path[-1]] = value
    return out


def _finite(obj) -> bool:
    if isinstance(obj, float):
        return math.isfinite(obj)
    if isinstance(obj, dict):
        return all(_finite(v) for v in obj.values())
    if isinstance(obj, list):
        return all(_finite(v) for v in obj)
    return True


@pytest.mark.parametrize("value", [1e308, -1e308, 1e-308])
def test_every_number_of_the_demo_at_an_extreme_is_refused_or_gives_finite_results(value):
    base = demo_project().raw
    for path, old in _leaves(base):
        if isinstance(old, bool) or not isinstance(old, (int, float)):
            continue
        try:
            results = project_results(project_from_dict(_with(base, path, value)))
        except ProjectError:
            continue
        assert _finite(results), path


@pytest.mark.parametrize("value", [None, "x", True, [1, "a"], {"a": 1}, dt.date(2024, 1, 1)])
def test_every_key_of_the_demo_with_a_wrong_type_gives_plain_messages(value):
    base = demo_project().raw
    for path, _ in _leaves(base):
        try:
            project_from_dict(_with(base, path, value))
        except ProjectError as exc:
            for where, msg in exc.problems:
                bad = [p.pattern for p in PYTHON_SYNTAX if p.search(msg)]
                assert not bad, (path, where, msg)
