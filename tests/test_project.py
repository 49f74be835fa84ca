"""Project files: parsing, every problem reported at once with its key path."""

import textwrap

import pytest

from heatledger import HeatLedgerError, ProjectError, load_project, project_from_dict
from heatledger.demo import demo_project
from tests.tolerances import RTOL_ITERATION


def _write(tmp_path, text):
    p = tmp_path / "p.toml"
    p.write_text(textwrap.dedent(text), encoding="utf-8")
    return p


def test_demo_project_parses_and_is_marked_invented():
    proj = demo_project()
    assert "invented" in proj.info["name"].lower()
    assert len(proj.constructions) >= 4
    assert len(proj.sha256) == 64


def test_minimal_project(tmp_path):
    p = _write(tmp_path, """
        [design]
        temp_inside = 21
        temp_outside = -3
        [[constructions]]
        name = "W"
        [[constructions.layers]]
        material = "concrete medium density 2000"
        thickness_mm = 200
        [[constructions.layers]]
        conductivity = 0.035
        thickness_mm = 100
    """)
    proj = load_project(p)
    con = proj.constructions[0].construction
    # source: ISO 6946 6.7.1 and Table 7: 0.13 + 0.2/1.35 + 0.1/0.035 + 0.04
    assert con.total_resistance == pytest.approx(0.13 + 0.2 / 1.35 + 0.1 / 0.035 + 0.04)
    assert proj.temp_inside == 21


def test_all_problems_reported_with_key_paths(tmp_path):
    p = _write(tmp_path, """
        [design]
        temp_inside = "warm"
        [[constructions]]
        name = "W"
        heat_flow = "sideways"
        [[constructions.layers]]
        material = "mineral wol 035"
        thickness_mm = 100
        [[constructions.layers]]
        conductivity = 1.0
        thickness_mm = -5
        [[constructions.layers]]
        conductivity = 1.0
        resistance = 0.2
        thickness_mm = 10
        [[constructions]]
        name = "R"
        colour = "red"
    """)
    with pytest.raises(ProjectError) as err:
        load_project(p)
    where = [w for w, _ in err.value.problems]
    assert "design.temp_inside" in where
    assert "constructions[1].layers[1].material" in where
    assert "constructions[1].layers[2].thickness_mm" in where
    assert "constructions[1].layers[3].resistance" in where
    assert "constructions[2].colour" in where
    assert "constructions[2].layers" in where
    text = str(err.value)
    assert 'closest known: "mineral wool 035"' in text
    assert "must be greater than zero; got -5" in text


def test_unknown_direction_reported(tmp_path):
    p = _write(tmp_path, """
        [[constructions]]
        name = "W"
        heat_flow = "sideways"
        [[constructions.layers]]
        conductivity = 1.0
        thickness_mm = 100
    """)
    with pytest.raises(ProjectError, match=r'constructions\[1\].heat_flow: must be '
                                           'one of "up", "horizontal" or "down"'):
        load_project(p)


def test_malformed_toml(tmp_path):
    p = _write(tmp_path, "[[constructions]\nname = ")
    with pytest.raises(ProjectError, match="not valid TOML"):
        load_project(p)


def test_corrections_and_sizing_by_layer_name():
    data = {"constructions": [{
        "name": "W", "target_u": 0.2, "size_layer": "Ins",
        "layers": [{"name": "Block", "conductivity": 0.5, "thickness_mm": 100},
                   {"name": "Ins", "material": "mineral wool 035", "thickness_mm": 50}],
        "corrections": [{"kind": "air_gaps", "layer": "ins", "level": 2}]}]}
    entry = project_from_dict(data).constructions[0]
    assert entry.construction.corrections.applied
    d = entry.required_thickness()
    sized = entry.construction.with_layer(1, entry.construction.layers[1].with_thickness(d))
    assert sized.u_value == pytest.approx(0.2, rel=RTOL_ITERATION)


def test_duplicate_construction_names():
    layer = [{"conductivity": 1.0, "thickness_mm": 10}]
    data = {"constructions": [{"name": "A", "layers": layer}, {"name": "a", "layers": layer}]}
    with pytest.raises(ProjectError, match="used twice"):
        project_from_dict(data)


def test_material_row_problems_name_the_key_without_repeating_it():
    data = {"materials": [{"name": "m1"}, {"name": "m2", "conductivity": "high"},
                          {"name": "m3", "conductivity": -1.0}]}
    with pytest.raises(ProjectError) as err:
        project_from_dict(data)
    problems = err.value.problems
    assert ("materials[1].conductivity", "is required") in problems
    assert ("materials[2].conductivity", 'must be a number; got "high" (text)') in problems
    ((where, msg),) = [(w, m) for w, m in problems if w.startswith("materials[3]")]
    assert where == "materials[3].conductivity" and msg == "must be greater than zero; got -1"


def test_project_file_over_the_size_limit(tmp_path, monkeypatch):
    import heatledger.project as project_module

    p = _write(tmp_path, "[design]\ntemp_inside = 20\n")
    size = p.stat().st_size
    monkeypatch.setattr(project_module, "MAX_INPUT_BYTES", size - 1)
    with pytest.raises(HeatLedgerError) as err:
        load_project(p)
    assert str(err.value) == ('project file "p.toml" is larger than allowed; the limit is '
                              f"{size - 1} bytes")
    monkeypatch.setattr(project_module, "MAX_INPUT_BYTES", size)
    assert load_project(p).constructions == []
