"""The moisture family from a project file and the fill-in template: the same checks as the
engine's front door, and every problem named with its key path or cell."""

from __future__ import annotations

import copy

import numpy as np
import pytest

from heatledger import MonthlyClimate, interstitial_condensation, surface_check
from heatledger.demo import demo_project
from heatledger.errors import ProjectError
from heatledger.project import project_from_dict
from heatledger.sheet.render_openpyxl import write_workbook
from heatledger.sheet.template import project_from_template, template_plan
from tests.tolerances import RTOL_ROUND_OFF


def _raw():
    return copy.deepcopy(demo_project().raw)


def _problems(raw) -> str:
    with pytest.raises(ProjectError) as err:
        project_from_dict(raw, source_bytes=b"x", source_name="p.toml")
    return str(err.value)


def test_demo_checks_equal_the_front_door():
    project = demo_project()
    assert len(project.moisture) == 3
    raw = project.raw["climates"][0]
    te = [m["temp_outside"] for m in raw["months"]]
    rhe = [m["rh_outside"] for m in raw["months"]]
    clim = MonthlyClimate.from_humidity_class(te, rhe, raw["humidity_class"], 20.0)
    for entry in project.moisture:
        direct = interstitial_condensation(entry.construction, clim)
        np.testing.assert_allclose(entry.interstitial.accumulation, direct.accumulation,
                                   rtol=RTOL_ROUND_OFF, atol=0.0)
        assert entry.interstitial.planes == direct.planes
        if entry.junction is None:
            s = surface_check(entry.construction, clim)
        else:  # the junction's own f_Rsi from its 2-D solve
            s = surface_check(None, clim, surface_factor=entry.junction.result.surface_factor)
        assert entry.surface.surface_factor == pytest.approx(s.surface_factor)
        assert list(entry.surface.passes) == list(s.passes)


def test_bad_climate_inputs_are_named():
    raw = _raw()
    months = raw["climates"][0]["months"]
    months[2]["rh_outside"] = 80
    months[4]["month"] = "jan"
    del months[7]
    text = _problems(raw)
    assert "climates[1].months[3].rh_outside" in text and "looks like a percentage" in text
    assert "climates[1].months[5].month" in text and "given twice" in text


def test_missing_months_and_class_rules():
    raw = _raw()
    raw["climates"][0]["months"] = raw["climates"][0]["months"][:11]
    assert "needs twelve months" in _problems(raw) and "dec" in _problems(raw)
    raw = _raw()
    raw["climates"][0]["humidity_class"] = 6
    assert "climates[1].humidity_class" in _problems(raw)
    raw = _raw()
    raw["climates"][0]["rh_inside"] = 0.5
    assert "either humidity_class or rh_inside" in _problems(raw)
    raw = _raw()
    del raw["climates"][0]["humidity_class"]
    assert "give the inside humidity" in _problems(raw)


def test_check_references_and_vapour_values():
    raw = _raw()
    raw["moisture"][0]["climate"] = "nowhere"
    assert 'moisture[1].climate: no climate is called "nowhere"' in _problems(raw)
    raw = _raw()
    layers = raw["constructions"][1]["layers"]
    layers[0]["material"] = None
    del layers[0]["material"]
    layers[0]["conductivity"] = 0.4
    text = _problems(raw)
    assert "moisture[2].construction" in text and "has no vapour value" in text
    layers[0]["vapour_resistance_factor"] = 10.0
    project_from_dict(raw, source_bytes=b"x", source_name="p.toml")  # now it reads
    layers[0]["sd"] = 0.1
    assert "either vapour_resistance_factor or sd" in _problems(raw)


def test_template_round_trip(tmp_path):
    path = write_workbook(template_plan(demo_project().raw), tmp_path / "t.xlsx")
    project = project_from_template(path)
    demo = demo_project()
    assert [e.name for e in project.moisture] == [e.name for e in demo.moisture]
    for a, b in zip(project.moisture, demo.moisture, strict=True):
        np.testing.assert_allclose(a.interstitial.accumulation, b.interstitial.accumulation,
                                   rtol=RTOL_ROUND_OFF, atol=0.0)
