"""The ``[[fins]]`` project section, its problems by key path, the demo's fins and the CLI.

The example below is the one given for the README (invented data); its values are checked
against the textbook closed forms written out here.
"""

from __future__ import annotations

import json
import math

import pytest

from heatledger.cli import main, project_results
from heatledger.demo import demo_project
from heatledger.errors import ProjectError
from heatledger.fins import AnnularFin, FinArray, StraightFin
from heatledger.project import project_from_dict, tomllib
from tests.tolerances import RTOL_ITERATION, RTOL_ROUND_OFF

README_EXAMPLE = """
[project]
name = "Panel heat sink (invented example)"

[[fins]]
name = "HS1 drive heat sink"
kind = "straight"                 # "straight" or "annular"
material = "aluminium alloy"      # library name, or conductivity = 160.0 (W/(m K))
h = 8.0                           # W/(m2 K)
temp_base = 65.0           # degC
temp_fluid = 35.0                    # degC
length_mm = 40.0
thickness_mm = 2.0                # plate fin; diameter_mm = ... for a pin fin
width_mm = 150.0
tip = "convective"                # "convective", "adiabatic", "temperature", "infinite"
  [fins.array]
  count = 12
  base_area = 0.018               # m2, including the fin roots
  target_heat_rate = 45.0         # W: fin length and fin count that reach it
  [fins.fv]
  cells = 40
  emissivity = 0.85
  h_coefficient = 3.4             # h = C |T - T_inf|^n in the finite volumes
  h_exponent = 0.25

[[fins]]
name = "TH1 finned tube"
kind = "annular"
conductivity = 200.0
h = 6.0
temp_base = 55.0
temp_fluid = 20.0
tube_diameter_mm = 15.0
fin_diameter_mm = 45.0
thickness_mm = 0.4
tip = "adiabatic"                 # "adiabatic" or "convective"
"""


def _parse(text):
    return project_from_dict(tomllib.loads(text))


def _problems(data) -> dict:
    with pytest.raises(ProjectError) as info:
        project_from_dict(data)
    return dict(info.value.problems)


def test_readme_example_builds_the_engine_objects():
    p = _parse(README_EXAMPLE)
    hs, th = p.fins
    assert isinstance(hs.fin, StraightFin) and isinstance(hs.array, FinArray)
    assert isinstance(th.fin, AnnularFin) and th.array is None
    assert hs.fin.length == pytest.approx(0.040) and hs.fin.thickness == pytest.approx(0.002)
    assert hs.fin.width == pytest.approx(0.150)
    assert th.fin.inner_radius == pytest.approx(0.0075)
    assert th.fin.outer_radius == pytest.approx(0.0225)
    assert hs.fv.cells == 40 and hs.fv.nonlinear and not th.fv.nonlinear
    # source: ISO 10456:2007 Table 3 / EN ISO 10077-2 via the library: aluminium alloy 160
    assert hs.fin.conductivity == 160.0
    # source: Incropera & DeWitt 6th ed., Table 3.4 case A, written out here
    h, k, t, w, big_l, theta = 8.0, 160.0, 0.002, 0.150, 0.040, 30.0
    p_, a_c = 2 * (w + t), w * t
    m = math.sqrt(h * p_ / (k * a_c))
    r = h / (m * k)
    q = math.sqrt(h * p_ * k * a_c) * theta * (math.sinh(m * big_l) + r * math.cosh(m * big_l)) \
        / (math.cosh(m * big_l) + r * math.sinh(m * big_l))
    assert hs.evaluate().heat_rate == pytest.approx(q, rel=RTOL_ROUND_OFF)
    sizing = hs.sizing()
    assert sizing["length"].heat_rate == pytest.approx(45.0, rel=RTOL_ITERATION)
    assert sizing["count"].heat_rate >= 45.0


def test_every_problem_is_reported_with_its_key_path():
    data = tomllib.loads(README_EXAMPLE)
    hs, th = data["fins"]
    hs["lenght_mm"] = 3.0                    # typo
    hs["array"]["count"] = 2.5               # not whole
    hs["fv"]["emisivity"] = 0.9              # typo in a sub-table
    th["fin_diameter_mm"] = 10.0             # below the tube
    th["material"] = "unobtainium"           # both and unknown
    data["fins"].append({"name": "HS1 drive heat sink", "kind": "straight"})
    data["fins"].append({"name": "x", "kind": "wavy"})
    got = _problems(data)
    assert "unknown key" in got["fins[1].lenght_mm"]
    assert "whole number" in got["fins[1].array.count"]
    assert "unknown key" in got["fins[1].fv.emisivity"]
    assert "must exceed tube_diameter_mm" in got["fins[2].fin_diameter_mm"]
    assert "not both" in got["fins[2].conductivity"]
    assert got["fins[3].length_mm"] == "is required"
    assert 'one of "straight" or "annular"' in got["fins[4].kind"]


@pytest.mark.parametrize(("change", "key", "fragment"), [
    ({"thickness_mm": -2.0}, "fins[1].thickness_mm", "greater than zero"),
    ({"diameter_mm": 5.0}, "fins[1].thickness_mm", "exactly one of"),
    ({"tip": "pointy"}, "fins[1].tip", "must be one of"),
    ({"tip": "temperature"}, "fins[1].temp_tip", "needs temp_tip"),
    ({"temp_tip": 30.0}, "fins[1].temp_tip", "only with tip"),
    ({"corrected_length": "yes"}, "fins[1].corrected_length", "true or false"),
    ({"temp_base": -300.0}, "fins[1].temp_base", "absolute zero"),
    ({"h": "high"}, "fins[1].h", "must be a number"),
    ({"material": "aluminum"}, "fins[1].material", "aluminium alloy"),
    ({"profile": "triangular", "tip": "infinite"}, "fins[1].tip", "edge or point"),
])
def test_bad_fin_input_names_the_key(change, key, fragment):
    data = tomllib.loads(README_EXAMPLE)
    data["fins"][0].update(change)
    got = _problems(data)
    assert key in got, got
    assert fragment in got[key], got[key]


def test_array_and_fv_problems():
    data = tomllib.loads(README_EXAMPLE)
    data["fins"][0]["array"]["base_area"] = 1e-6
    assert "fin roots" in _problems(data)["fins[1].array.base_area"]
    data = tomllib.loads(README_EXAMPLE)
    data["fins"][0]["fv"]["cells"] = 1
    del data["fins"][0]["fv"]["h_exponent"]
    got = _problems(data)
    assert "2 to 500" in got["fins[1].fv.cells"]
    assert "together" in got["fins[1].fv.h_exponent"]


def test_demo_has_invented_fins_one_of_which_does_not_help():
    demo = demo_project()
    assert len(demo.fins) >= 3
    warned = [e.name for e in demo.fins if any("does not help" in w
                                               for w in e.evaluate().warnings)]
    assert warned == ["PB1 plastic pipe-bracket block"]
    assert any(e.array is not None and e.target_heat_rate for e in demo.fins)
    assert any(isinstance(e.fin, AnnularFin) for e in demo.fins)


def test_cli_json_lists_fins_and_the_hot_surface_caution(capsys):
    assert main(["demo", "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    names = [f["name"] for f in out["fins"]]
    assert names == [e.name for e in demo_project().fins]
    first = out["fins"][0]
    for key in ("heat_rate", "efficiency", "effectiveness", "temp_tip", "warnings"):
        assert key in first
    assert abs(first["fv"]["energy_residual"]) < 1e-9
    assert any("hot to the touch" in c for c in out["cautions"])
    assert main(["demo"]) == 0
    text = capsys.readouterr().out
    assert "Fins (closed form" in text and "does not help" in text


def test_no_fins_no_fin_output_and_no_hot_surface_caution():
    p = project_from_dict({"constructions": [
        {"name": "slab", "heat_flow": "down",
         "layers": [{"name": "slab", "conductivity": 1.6, "thickness_mm": 200}]}]})
    res = project_results(p)
    assert "fins" not in res
    assert not any("hot to the touch" in c for c in res["cautions"])
