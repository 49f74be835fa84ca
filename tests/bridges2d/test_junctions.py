"""Junction builders, the junctions family and its spreadsheet functions: geometry as
claimed, psi and f_Rsi as the standard defines them, bridged layers between the EN ISO 6946
limits, references from rooms and moisture checks, and the audit sheets recalculated."""

from __future__ import annotations

import copy
import math

import numpy as np
import openpyxl
import pytest

from heatledger import (
    BridgedLayer,
    Construction,
    Layer,
    external_corner,
    stud_wall,
    wall_floor,
)
from heatledger.bridges2d.junctions import layer_bands
from heatledger.demo import demo_project
from heatledger.errors import HeatLedgerError, ProjectError
from heatledger.project import project_from_dict
from heatledger.sheet import audit
from heatledger.sheet.render_openpyxl import write_workbook
from heatledger_xl import udfs
from tests.tolerances import RTOL_2D_EXACT, RTOL_ROUND_OFF

WALL = Construction([Layer(0.015, 0.5, name="plaster"), Layer(0.1, 0.5, name="block"),
                     Layer(0.1, 0.035, name="EPS"), Layer(0.01, 0.7, name="render")],
                    name="invented wall")
FLOOR = Construction([Layer(0.05, 1.3, name="screed"), Layer(0.2, 2.3, name="slab")],
                     heat_flow="down", name="invented floor")


def _union_area(result) -> float:
    g = result.grid
    return float((np.outer(g.dy, g.dx) * g.active).sum())


def test_corner_geometry_is_an_l_of_the_wall():
    j = external_corner(WALL)
    t = 0.225
    length = t + max(1.0, 3 * t)  # EN ISO 10211 5.2: the cut at least max(1 m, 3 d) away
    assert j.flanking == (("wall A", pytest.approx(layer_bands(WALL)[1]), length),
                          ("wall B", pytest.approx(layer_bands(WALL)[1]), length))
    res = j.section().solve(0.01)
    assert _union_area(res) == pytest.approx(2 * length * t - t * t, rel=1e-12)
    # far from the corner the layers are the wall's, outside to inside along y
    g = res.grid
    col = np.searchsorted(g.xe, length - 0.05) - 1
    ys = (g.ye[:-1] + g.ye[1:]) / 2
    lams = g.conductivity[:, col][(ys > 0) & (ys < t)]
    # cells of at most 10 mm, an even number (at least two) per layer
    expected = [0.7] * 2 + [0.035] * 10 + [0.5] * 10 + [0.5] * 2
    assert list(np.round(lams, 6)) == expected


def test_corner_psi_is_l2d_minus_flanks_and_external_corners_are_negative():
    r = external_corner(WALL).solve(0.01)
    u = layer_bands(WALL)[1]
    length = 0.225 + 1.0
    assert r.psi_result.psi == pytest.approx(r.psi_result.coupling_coefficient
                                             - 2 * u * length, rel=RTOL_ROUND_OFF)
    # with external dimensions an external corner of an insulated wall loses less than the
    # flanks count (psi_e < 0): a fact of the trade (EN ISO 14683 defaults, from memory)
    assert r.psi_result.psi < 0.0
    # f_Rsi from the lowest inside surface temperature, at R_si 0.25, found at the corner
    low = r.lowest
    assert (low.x, low.y) == pytest.approx((0.225, 0.225))
    assert r.surface_factor == pytest.approx((low.temperature - 0.0) / 20.0, rel=1e-12)


def test_layered_wall_far_field_carries_the_construction_u():
    # a stud junction with studs of the insulation's own conductivity is the plain wall:
    # L_2D / s = U = 1/R_T (EN ISO 6946 6.7, from memory; the scheme is exact for a field
    # linear in each layer)
    j = stud_wall(WALL, 2, stud_width=0.05, stud_conductivity=0.035, spacing=0.6)
    r = j.solve(0.01)
    assert r.psi_result.coupling_coefficient / 0.6 == pytest.approx(WALL.u_value,
                                                                   rel=RTOL_2D_EXACT)
    assert abs(r.psi_result.psi) < 1e-12


def test_studs_lie_between_the_iso_6946_limits():
    # EN ISO 6946 6.7.2: R_T lies between the lower and upper limits of the bridged layer
    f = 0.05 / 0.6
    bridged = Construction([Layer(0.015, 0.5), Layer(0.1, 0.5),
                            BridgedLayer(0.1, [(0.035, 1 - f), (0.13, f)]), Layer(0.01, 0.7)])
    b = bridged.bridging
    r = stud_wall(WALL, 2, stud_width=0.05, stud_conductivity=0.13, spacing=0.6).solve(0.005)
    r_2d = 0.6 / r.psi_result.coupling_coefficient
    assert b.lower <= r_2d <= b.upper
    assert r.psi_result.psi > 0.0


def test_floor_and_balcony():
    floor = wall_floor(WALL, FLOOR).solve(0.01)
    balcony = wall_floor(WALL, FLOOR, projection=1.5).solve(0.01)
    # a slab carried through the insulation is a far larger bridge than one bearing on the
    # inner leaf, and an uninsulated balcony slab is above 0.5 W/(m K): common practice, no
    # published source; both conserve energy
    assert balcony.psi_result.psi > 0.5 > floor.psi_result.psi
    assert balcony.surface_factor < floor.surface_factor
    for r in (floor, balcony):
        assert abs(r.flow_solve.energy_balance) < 1e-9
    # the wall is 2 flanks + the floor high (external dimensions), each flank max(1 m, 3 d)
    # (EN ISO 10211, 5.2, from memory)
    h = 2 * max(1.0, 3 * 0.225) + 0.25
    assert wall_floor(WALL, FLOOR).flanking[0][2] == pytest.approx(h)


@pytest.mark.parametrize(("call", "message"), [
    (lambda: external_corner(WALL, flank=0.5), "shorter than EN ISO 10211 5.2 asks"),
    (lambda: stud_wall(WALL, 2, stud_width=0.6, stud_conductivity=0.1, spacing=0.6),
     "must be less than the spacing"),
    (lambda: stud_wall(WALL, 9, stud_width=0.05, stud_conductivity=0.1, spacing=0.6),
     "counted layers 0 to 3"),
    (lambda: wall_floor(WALL, FLOOR, bearing=0.5), "deeper than the wall"),
])
def test_bad_builder_input(call, message):
    with pytest.raises(HeatLedgerError, match=message):
        call()


def test_demo_rooms_take_the_junction_psi():
    project = demo_project()
    j1 = next(e for e in project.junctions if e.name.startswith("J1"))
    room = next(r for r in project.building.building.rooms if r.name == "Workshop")
    bridge = next(b for b in room.thermal_bridges if b.junction == j1.name)
    assert bridge.psi == j1.result.psi_result.psi


def test_project_problems_name_the_key():
    raw = copy.deepcopy(demo_project().raw)
    raw["junctions"][1]["floor"] = "no such floor"
    raw["rooms"][0]["thermal_bridges"][2]["psi"] = 0.1
    with pytest.raises(ProjectError) as err:
        project_from_dict(raw, source_bytes=b"x", source_name="p.toml")
    text = str(err.value)
    assert 'junctions[2].floor: no construction is called "no such floor"' in text
    assert "give psi or a junction, not both" in text


def test_a_drawn_junction_from_the_project_file():
    raw = copy.deepcopy(demo_project().raw)
    raw["junctions"].append({
        "name": "J9 drawn plain wall", "kind": "rectangles", "max_cell_mm": 10,
        "regions": [{"name": "block", "x0_mm": 0, "y0_mm": 0, "x1_mm": 1000, "y1_mm": 200,
                     "conductivity": 0.5}],
        "surfaces": [{"name": "out", "x0_mm": 0, "y0_mm": 0, "x1_mm": 1000, "y1_mm": 0,
                      "temperature": 0, "resistance": 0.04, "side": "outside"},
                     {"name": "in", "x0_mm": 0, "y0_mm": 200, "x1_mm": 1000, "y1_mm": 200,
                      "temperature": 20, "resistance": 0.13, "side": "inside"}],
        "flanking": [{"name": "wall", "u_value": 1 / (0.13 + 0.4 + 0.04), "length": 1.0}]})
    project = project_from_dict(raw, source_bytes=b"x", source_name="p.toml")
    j9 = project.junctions[-1]
    assert abs(j9.result.psi_result.psi) < 1e-12  # a plain wall has no bridge


def test_spreadsheet_functions_against_the_engine():
    regions = [[0, 0, 1200, 100, 0.5], [0, 100, 1200, 200, "eps 032"]]
    surfaces = [["out", 0, 0, 1200, 0, 0, 0.04, "outside"],
                ["in", 0, 200, 1200, 200, 20, 0.13, "inside"]]
    # U = 1/(Rsi + sum d/lambda + Rse), EN ISO 6946 6.7 and Table 7 (from memory); eps 032
    # is the library's typical 0.032 W/(m K)
    u = 1 / (0.13 + 0.1 / 0.5 + 0.1 / 0.032 + 0.04)
    assert abs(udfs.HL_PSI(regions, surfaces, [[u, 1.2]])) < 1e-12
    surfaces[1][6] = 0.25  # R_si of the surface-temperature calculation
    r_t = 0.25 + 0.1 / 0.5 + 0.1 / 0.032 + 0.04
    assert udfs.HL_FRSI_2D(regions, surfaces) == pytest.approx(1 - 0.25 / r_t,
                                                               rel=RTOL_2D_EXACT)
    assert udfs.HL_PSI(regions, surfaces[:1], [[u, 1.2]]).startswith("HL_PSI: surfaces")
    assert "regions row 1 x1" in udfs.HL_PSI([[0, 0, "x", 1, 1]], surfaces, [[u, 1.2]])


@pytest.mark.calc
def test_junction_sheets_recalculate_ok_and_rooms_refer_to_them(tmp_path, recalc):
    project = demo_project()
    plan = audit.audit_plan(project)
    names = [s.name for s in plan.sheets if s.name.startswith("Junc ")]
    assert len(names) == len(project.junctions) == 2
    psi_cell = plan.index[("junction", project.junctions[0].name)]["psi"]
    formulas = [c.formula for s in plan.sheets for c in s.cells() if c.formula]
    assert f"={psi_cell}" in formulas  # the room sheet takes psi by reference
    wb = openpyxl.load_workbook(recalc(write_workbook(plan, tmp_path / "a.xlsx")),
                                data_only=True)
    for name in names + ["Junctions"]:
        bad = [c.value for row in wb[name].iter_rows() for c in row
               if isinstance(c.value, str) and c.value.startswith(("MISMATCH", "#"))]
        assert not bad, (name, bad[:5])
    for name in names:
        assert wb[name]["J6"].value == "ALL CHECKS OK"
        assert wb[name]["J4"].value == wb[name]["J5"].value
    assert math.isfinite(project.junctions[0].result.surface_factor)


def test_calc_saves_the_pictures(tmp_path, capsys):
    from heatledger.cli import main
    from heatledger.demo import demo_bytes

    project = tmp_path / "demo.toml"
    project.write_bytes(demo_bytes())
    assert main(["calc", str(project), "--pictures", str(tmp_path / "pics")]) == 0
    pngs = sorted((tmp_path / "pics").glob("*.png"))
    assert len(pngs) == len(demo_project().junctions)
    assert all(p.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n" for p in pngs)
    assert "Thermal bridges (2-D" in capsys.readouterr().out


def test_template_round_trip_of_junctions(tmp_path):
    from heatledger.sheet.template import project_from_template, template_plan

    raw = copy.deepcopy(demo_project().raw)
    raw["junctions"].append({
        "name": "J9 drawn", "kind": "rectangles", "max_cell_mm": 20,
        "regions": [{"name": "block", "x0_mm": 0, "y0_mm": 0, "x1_mm": 1000, "y1_mm": 200,
                     "material": "concrete medium density 1800"}],
        "surfaces": [{"name": "out", "x0_mm": 0, "y0_mm": 0, "x1_mm": 1000, "y1_mm": 0,
                      "temperature": 0, "resistance": 0.04, "side": "outside"},
                     {"name": "in", "x0_mm": 0, "y0_mm": 200, "x1_mm": 1000, "y1_mm": 200,
                      "temperature": 20, "resistance": 0.13, "side": "inside"}],
        "flanking": [{"name": "wall", "u_value": 2.0, "length": 1.0}]})
    path = write_workbook(template_plan(raw), tmp_path / "t.xlsx")
    project = project_from_template(path)
    direct = project_from_dict(raw, source_bytes=b"x", source_name="p.toml")
    assert [e.name for e in project.junctions] == [e.name for e in direct.junctions]
    for a, b in zip(project.junctions, direct.junctions, strict=True):
        assert a.result.psi_result.psi == pytest.approx(b.result.psi_result.psi,
                                                        rel=RTOL_ROUND_OFF, abs=1e-12)
