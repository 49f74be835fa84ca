"""Spreadsheet functions (heatledger_xl.udfs): names, descriptions, layer-table conventions
and values checked against EN ISO 6946 equations and tables worked by hand in the test.

The demo layer tables are invented build-ups of our own.
"""

from __future__ import annotations

import math
import re

import numpy as np
import pytest

from heatledger_xl import udfs
from heatledger_xl.ranges import MAX_LAYERS
from heatledger_xl.registry import (
    MAX_DESCRIPTION,
    PREFIX,
    REGISTRY,
    looks_like_cell_reference,
)
from tests.tolerances import ATOL_TABLE_M2K_W, RTOL_ITERATION, RTOL_ROUND_OFF

# Invented demo wall: plasterboard, mineral wool, concrete, cavity, brick.
WALL = [
    ["material", "thickness [mm]", "conductivity [W/(m K)]"],
    ["gypsum plasterboard 900", 12.5, None],
    ["mineral wool 035", 100, None],
    ["block", 150, 1.35],
    ["air", 25, None],
    ["brick", 102, 0.77],
]
# source: EN ISO 6946:2017, Table 7 (Rsi horizontal 0.13, Rse 0.04 m2 K/W)
RSI_H, RSE = 0.13, 0.04
# source: ISO 10456:2007 Table 3 (gypsum plasterboard 900 kg/m3: 0.25 W/(m K)) [from memory]
LAMBDA_GYPSUM_900 = 0.25
LAMBDA_MW_035 = 0.035  # declared class "035" of the product family, W/(m K)
# source: EN ISO 6946:2017, Table 8, 25 mm unventilated, horizontal heat flow: 0.18 m2 K/W
# [from memory]; the Annex D formula gives 0.183.
R_AIR_25_H = 0.18
rtol_R = RTOL_ROUND_OFF  # tests/tolerances.py


def hand_resistance_wall(r_air: float) -> float:
    """R_T = Rsi + sum(d/lambda) + Rg + Rse (EN ISO 6946:2017, 6.7.1)."""
    return (RSI_H + 0.0125 / LAMBDA_GYPSUM_900 + 0.100 / LAMBDA_MW_035 + 0.150 / 1.35
            + r_air + 0.102 / 0.77 + RSE)


# --------------------------------------------------------------------------- registry
A1 = re.compile(r"^\$?[A-Z]{1,3}\$?[0-9]+$", re.IGNORECASE)
R1C1 = re.compile(r"^R\[?-?[0-9]*\]?C\[?-?[0-9]*\]?$|^[RC]\[?-?[0-9]*\]?$", re.IGNORECASE)


@pytest.mark.parametrize("ref", ["A1", "HL1", "XFD1048576", "R1C1", "R", "C", "RC", "R[1]C[-2]",
                                 "$B$7"])
def test_cell_reference_check_recognises_references(ref):
    assert looks_like_cell_reference(ref)
    assert A1.match(ref) or R1C1.match(ref)


def test_every_function_name_is_ours_in_capitals_and_not_a_cell_reference():
    assert len(REGISTRY) >= 15
    for name in REGISTRY:
        assert name.startswith(PREFIX)
        assert name == name.upper()
        assert re.fullmatch(r"[A-Z][A-Z0-9_]*", name)
        assert not A1.match(name) and not R1C1.match(name), name
        assert not A1.match(name.replace("_", "")), f"{name} without '_' is a cell reference"


def test_descriptions_fit_the_function_dialog_and_name_units():
    for name, spec in REGISTRY.items():
        assert 20 <= len(spec.description) <= MAX_DESCRIPTION, name
        assert "\n" not in spec.description
        assert spec.function.__doc__ == spec.description
        for a in spec.args:
            assert 10 <= len(a.doc) <= MAX_DESCRIPTION, (name, a.name)
            assert re.search(r"\[[^\]]+\]$", a.doc), f"{name}({a.name}) has no unit"


def test_optional_arguments_come_last_and_share_one_order():
    common = ["layers", "heat_flow", "rsi", "rse"]
    temps = ["layers", "temp_inside", "temp_outside", "heat_flow", "rsi", "rse"]
    for name, spec in REGISTRY.items():
        names = [a.name for a in spec.args]
        flags = [a.optional for a in spec.args]
        assert flags == sorted(flags), name  # all required before all optional
        if spec.family != "constructions":
            continue
        if "temp_inside" in names:
            assert names[:6] == temps, name
        elif "corrections" in names:
            assert names[:5] == ["layers", "corrections", "heat_flow", "rsi", "rse"], name
        elif names[:1] == ["layers"] and name != "HL_THICKNESS":
            assert names[:4] == common, name
        if "header" in names:
            assert names[-1] == "header"
    assert set(udfs.__all__) == set(REGISTRY)  # every family is a member of udfs
    assert all(getattr(udfs, name) is spec.function for name, spec in REGISTRY.items())


# --------------------------------------------------------------------------- values
def test_u_value_and_total_resistance_against_hand_calculation():
    r_air = udfs.HL_RAIR(25, "horizontal")
    assert r_air == pytest.approx(R_AIR_25_H, abs=ATOL_TABLE_M2K_W)  # Table 8 printed to 0.01
    r_t = hand_resistance_wall(r_air)
    assert udfs.HL_RTOTAL(WALL) == pytest.approx(r_t, rel=rtol_R)
    assert udfs.HL_UVALUE(WALL) == pytest.approx(1.0 / r_t, rel=rtol_R)
    assert udfs.HL_UVALUE_REPORTED(WALL) == round(1.0 / r_t, 2)  # 0.29: 2 sig. figures


@pytest.mark.parametrize(("heat_flow", "rsi"), [("up", 0.10), ("horizontal", 0.13),
                                                ("down", 0.17)])
def test_surface_resistances_are_iso_6946_table_7(heat_flow, rsi):
    # source: EN ISO 6946:2017, Table 7
    assert udfs.HL_RSURFACE("inside", heat_flow) == rsi
    assert udfs.HL_RSURFACE("outside", heat_flow) == RSE
    one_layer = [["slab", 200, 2.0]]
    assert udfs.HL_RTOTAL(one_layer, heat_flow) == pytest.approx(rsi + 0.1 + RSE, rel=rtol_R)


def test_surface_resistance_calc_reproduces_table_7():
    # source: EN ISO 6946:2017, Table 7 values are the Annex C result rounded to 0.01
    assert udfs.HL_RSURFACE_CALC("inside", "horizontal") == pytest.approx(0.13,
                                                                          abs=ATOL_TABLE_M2K_W)
    assert udfs.HL_RSURFACE_CALC("outside", "horizontal") == pytest.approx(0.04,
                                                                           abs=ATOL_TABLE_M2K_W)
    low_e = udfs.HL_RSURFACE_CALC("inside", "horizontal", 0.1)
    assert low_e > 0.25  # a low-emissivity surface has far less radiative exchange


@pytest.mark.parametrize(("d_mm", "heat_flow", "table"), [
    (5, "horizontal", 0.11), (10, "horizontal", 0.15), (25, "horizontal", 0.18),
    (100, "horizontal", 0.18), (25, "up", 0.16), (50, "up", 0.16), (25, "down", 0.19),
    (100, "down", 0.22), (300, "down", 0.23)])
def test_air_layer_matches_iso_6946_table_8(d_mm, heat_flow, table):
    # source: EN ISO 6946:2017, Table 8 (unventilated, emissivity 0.9) [from memory]
    atol = 0.006  # table printed to 0.01 m2 K/W
    assert udfs.HL_RAIR(d_mm, heat_flow) == pytest.approx(table, abs=atol)


def test_bridged_layer_upper_and_lower_limits_by_hand():
    # Invented timber-frame wall: 140 mm studs (softwood, 0.13) at 15 % in 0.035 insulation.
    table = [["gypsum plasterboard 900", 12.5], ["frame", 140, 0.035, None, 0.15, 0.13],
             ["sheathing", 9, 0.13]]
    r_other = RSI_H + 0.0125 / LAMBDA_GYPSUM_900 + 0.009 / 0.13 + RSE
    r_ins = r_other + 0.14 / 0.035
    r_stud = r_other + 0.14 / 0.13
    upper = 1.0 / (0.85 / r_ins + 0.15 / r_stud)  # EN ISO 6946:2017, 6.7.2.2
    lower = r_other + 0.14 / (0.85 * 0.035 + 0.15 * 0.13)  # 6.7.2.3
    total = 0.5 * (upper + lower)  # 6.7.2.1
    got = dict((row[0], row[1]) for row in udfs.HL_RLIMITS(table))
    assert got["upper limit R'_T"] == pytest.approx(upper, rel=rtol_R)
    assert got["lower limit R''_T"] == pytest.approx(lower, rel=rtol_R)
    assert got["total R_T"] == pytest.approx(total, rel=rtol_R)
    assert got["relative error e"] == pytest.approx((upper - lower) / (2 * total),
                                                    rel=RTOL_ITERATION)
    assert udfs.HL_UVALUE(table) == pytest.approx(1.0 / total, rel=rtol_R)
    # the bridging material may be named from the library instead of a number
    named = [table[0], ["frame", 140, 0.035, None, 0.15, "softwood 500"], table[2]]
    assert udfs.HL_UVALUE(named) == pytest.approx(1.0 / total, rel=rtol_R)


def test_interface_temperatures_follow_the_resistance_ladder():
    t_in, t_out = 20.0, -5.0
    out = udfs.HL_INTERFACE_TEMPS(WALL, t_in, t_out, None, None, None, True)
    assert out[0] == ["interface", "x [mm]", "temperature [degC]"]
    rows = out[1:]
    r_air = udfs.HL_RAIR(25)
    resist = [0.0125 / LAMBDA_GYPSUM_900, 0.1 / LAMBDA_MW_035, 0.15 / 1.35, r_air, 0.102 / 0.77]
    q = (t_in - t_out) / hand_resistance_wall(r_air)
    expected = t_in - q * np.cumsum([RSI_H] + resist)  # theta = theta_i - q (Rsi + sum R)
    atol_K = 1e-9  # same ladder, independent arithmetic
    assert [r[2] for r in rows] == pytest.approx(list(expected), abs=atol_K)
    assert [r[1] for r in rows] == pytest.approx([0, 12.5, 112.5, 262.5, 287.5, 389.5])
    assert rows[0][0] == "inside surface" and rows[-1][0] == "outside surface"
    flux = udfs.HL_HEATFLUX(WALL, t_in, t_out)
    assert flux == pytest.approx(q, rel=rtol_R)


def test_nodal_temperatures_lie_on_the_exact_piecewise_linear_profile():
    # Steady 1-D conduction without sources: T is linear in each layer (Incropera & DeWitt,
    # eq. 3.3), so the finite-volume cell-centre values lie on the ladder's straight lines.
    t_in, t_out = 21.0, -8.0
    nodes = udfs.HL_NODE_TEMPS(WALL, t_in, t_out, None, None, None, 3)
    ladder = udfs.HL_INTERFACE_TEMPS(WALL, t_in, t_out)
    xs = [r[1] for r in ladder]
    ts = [r[2] for r in ladder]
    assert len(nodes) == 5 * 3
    assert [r[0] for r in nodes] == list(range(1, 16))
    assert [r[1] for r in nodes] == [1] * 3 + [2] * 3 + [3] * 3 + [4] * 3 + [5] * 3
    atol_K = 1e-8  # the scheme is exact for piecewise-linear profiles; round-off only
    for _, _, x, t in nodes:
        assert t == pytest.approx(float(np.interp(x, xs, ts)), abs=atol_K)
    with_header = udfs.HL_NODE_TEMPS(WALL, t_in, t_out, None, None, None, 3, True)
    assert with_header[0] == ["node", "layer", "x [mm]", "temperature [degC]"]
    assert with_header[1:] == nodes


def test_required_thickness_matches_the_closed_form():
    table = [["gypsum plasterboard 900", 12.5], ["mineral wool 035", 100],
             ["block", 150, 1.35]]
    target = 0.18
    r_rest = RSI_H + 0.0125 / LAMBDA_GYPSUM_900 + 0.15 / 1.35 + RSE
    d_mm = LAMBDA_MW_035 * (1.0 / target - r_rest) * 1000.0  # d = lambda (1/U_t - R_rest)
    atol_mm = 1e-5  # brentq tolerance 1e-9 m
    assert udfs.HL_THICKNESS(table, 2, target) == pytest.approx(d_mm, abs=atol_mm)
    assert udfs.HL_THICKNESS(table, 2.0, "0.18") == pytest.approx(d_mm, abs=atol_mm)


def test_material_lookup():
    # source: ISO 10456:2007 Table 3 / EN ISO 10077-2 (steel 50 W/(m K), 7800 kg/m3)
    assert udfs.HL_MATERIAL("Steel") == 50.0
    assert udfs.HL_MATERIAL("steel", "density") == 7800.0
    assert udfs.HL_MATERIAL("steel", "vapour_resistance_factor") == "inf"
    assert "ISO 10456" in udfs.HL_MATERIAL("steel", "source")
    msg = udfs.HL_MATERIAL("stel")
    assert msg.startswith('HL_MATERIAL: unknown material "stel"') and '"steel"' in msg
    listing = udfs.HL_MATERIALS(True)
    assert listing[0][0] == "material" and len(listing) > 20
    assert all(len(r) == len(listing[0]) for r in listing)


def test_layers_table_sums_to_total_resistance():
    rows = udfs.HL_LAYERS(WALL)
    assert rows[0][1] == "inside surface" and rows[-1][1] == "outside surface"
    assert sum(r[5] for r in rows) == pytest.approx(udfs.HL_RTOTAL(WALL), rel=rtol_R)
    assert [r[2] for r in rows[1:-1]] == ["material", "material", "material", "air",
                                          "material"]


# --------------------------------------------------------------------------- conventions
def test_header_row_narrow_range_and_trailing_blank_rows_ending_the_table():
    body = [row[:2] for row in WALL[1:3]]
    u_two = udfs.HL_UVALUE(body)
    with_header = [["name", "thickness_mm"]] + body
    assert udfs.HL_UVALUE(with_header) == u_two
    with_tail = body + [[None, None]] * 20  # a range reaching into empty cells below
    assert udfs.HL_UVALUE(with_tail) == u_two
    spaces = body + [["  ", ""]]
    assert udfs.HL_UVALUE(spaces) == u_two


def test_a_blank_row_inside_the_table_is_an_error_naming_the_rows():
    # The layers below a gap used to vanish: U of the first layer alone (4.5 W/(m2 K))
    # instead of the whole wall's. Each function gives the same one-line error instead.
    gap = [WALL[1], [None, None, None], WALL[2], WALL[3]]
    want = "layers row 2 is blank but row 3 below it is filled"
    for out in (udfs.HL_UVALUE(gap), udfs.HL_NODE_TEMPS(gap, 20, -5), udfs.HL_THICKNESS(gap, 1, 1),
                udfs.HL_UVALUE_CORRECTED(gap, None)):
        assert isinstance(out, str) and want in out, out
    notes_below = WALL + [[None] * 3, ["notes", "text below the table"]]
    assert "layers row 7 is blank but row 8 below it is filled" in udfs.HL_UVALUE(notes_below)
    header_gap = [WALL[0], [None, None], WALL[1]]
    assert "layers row 2 is blank but row 3" in udfs.HL_UVALUE(header_gap)
    # the same rule for correction tables: a correction below a gap is not dropped
    corr_gap = [["air_gaps", 2, 1], [None, None, None], ["fasteners", 2, 17, 12, 4]]
    out = udfs.HL_UVALUE_CORRECTED(CORR_WALL, corr_gap)
    assert "corrections row 2 is blank but row 3 below it is filled" in out, out


def test_numbers_written_as_text_and_blank_optional_cells_take_defaults():
    a = udfs.HL_UVALUE([["block", 150, 1.35], ["render", 15, 1.0]])
    b = udfs.HL_UVALUE([["block", "150", " 1.35 ", None, "", None], ["render", 15.0, 1]])
    assert a == b
    assert udfs.HL_UVALUE([["block", 150, 1.35]], "", "", "") == udfs.HL_UVALUE(
        [["block", 150, 1.35]])


def test_declared_resistance_and_air_keywords():
    declared = udfs.HL_RTOTAL([["panel", 40, None, 1.5]])
    assert declared == pytest.approx(RSI_H + 1.5 + RSE, rel=rtol_R)
    well = udfs.HL_RTOTAL([["block", 100, 1.0], ["air:well", 50], ["cladding", 20, 0.2]])
    # source: EN ISO 6946:2017, 6.9.4: layers outside a well ventilated layer disregarded,
    # Rse = Rsi of the same direction
    assert well == pytest.approx(RSI_H + 0.1 + RSI_H, rel=rtol_R)
    slightly = udfs.HL_RTOTAL([["block", 100, 1.0], ["air:slightly:1000", 50],
                               ["cladding", 20, 0.2]])
    assert well < slightly < udfs.HL_RTOTAL([["block", 100, 1.0], ["air", 50],
                                             ["cladding", 20, 0.2]])


@pytest.mark.parametrize(("table", "fragment"), [
    ([["a", 10, 1], ["b", 20, 1], ["c", 0, 1]], "layers row 3 thickness_mm must be at least "
                                                "0.001 mm; got 0"),
    ([["a", 10, 1], ["b", -4, 1]], "layers row 2 thickness_mm must be at least 0.001 mm; "
                                   "got -4"),
    ([["a", "ten", 1]], "layers row 1 thickness_mm must be a number in mm; got 'ten'"),
    ([["a", 10, "#N/A"]], "layers row 1 conductivity holds the error #N/A"),
    ([["a", 10, True]], "layers row 1 conductivity must be a number or a text; got TRUE"),
    ([["a", 10, 1, 0.5]], "layers row 1: give conductivity or a declared resistance"),
    ([["a", 10, 1, None, 0.2]], "bridging_conductivity is blank"),
    ([["a", 10, 1, None, 1.2, 0.1]], "bridging_fraction must be at most 1"),
    ([["a", 10, 1, None, None, 0.1]], "bridging_fraction is blank"),
    ([["unobtainium", 10]], 'layers row 1 material: unknown material "unobtainium"'),
    ([[None, 10]], "give a material name, a conductivity or a declared resistance"),
    ([["air", 400]], "layers row 1: air layer thickness must be at most 300 mm"),
    ([["air:sideways", 40]], "write 'air', 'air:unventilated', 'air:well'"),
    ([["air", 40, 0.025]], "an air layer takes its resistance from ISO 6946 Annex D"),
    ([[10], [20]], "layers has 1 column"),
    ([["a", 1, 1, 1, 1, 1, "x"]], "layers has 7 columns"),
    ([[None, None], ["a", 10, 1]], "layers row 1 is blank but row 2 below it is filled"),
    ([[None, None]], "layers holds no layer"),
    ([], "layers holds no layer"),
    ([["frame", 50, 0.035, None, 0.1, 0.13]] * 9, "layers row 9: at most 8 bridged layers"),
    (12.5, "layers must be a range"),
])
def test_bad_layer_tables_return_one_line_naming_row_and_rule(table, fragment):
    out = udfs.HL_UVALUE(table)
    assert isinstance(out, str)
    assert out.startswith("HL_UVALUE: ")
    assert fragment in out
    assert "\n" not in out and len(out) <= 250


def test_bad_scalar_arguments_name_the_argument():
    assert "heat_flow must be one of 'up', 'horizontal', 'down'; got 'sideways'" in (
        udfs.HL_UVALUE(WALL, "sideways"))
    assert udfs.HL_UVALUE(WALL, None, -0.1).startswith("HL_UVALUE: rsi must be at least 0")
    assert "temp_inside is blank" in udfs.HL_INTERFACE_TEMPS(WALL, None, 0)
    assert "temp_outside must be greater than -273.15" in udfs.HL_HEATFLUX(WALL, 20, -300)
    assert "temp_inside must be a number" in udfs.HL_HEATFLUX(WALL, "warm", 0)
    assert "nodes_per_layer must be a whole number" in udfs.HL_NODE_TEMPS(WALL, 20, 0, None, None,
                                                                      None, 2.5)
    assert "header must be TRUE or FALSE" in udfs.HL_NODE_TEMPS(WALL, 20, 0, None, None, None, 2,
                                                            "yes")
    assert "layer_number must be 1 to 5" in udfs.HL_THICKNESS(WALL, 9, 0.2)
    assert "layer_number 4: layer_number points to an air layer" in udfs.HL_THICKNESS(
        WALL, 4, 0.2)
    assert "side must be one of 'inside', 'outside'" in udfs.HL_RSURFACE("left")
    assert "quantity must be one of" in udfs.HL_MATERIAL("steel", "colour")
    assert "temp_inside must be a single cell" in udfs.HL_HEATFLUX(WALL, [[1, 2]], 0)
    assert "has no bridged layer" in udfs.HL_RLIMITS(WALL)


def test_huge_ranges_stop_at_the_layer_limit():
    # 10,000 filled rows: rejected once the table passes MAX_LAYERS, without building it
    huge = [["block", 10, 1.0]] * 10_000
    out = udfs.HL_UVALUE(huge)
    assert out.startswith("HL_UVALUE: layers holds more than") and str(MAX_LAYERS) in out
    # 10,000 blank rows below the table end it; text below a blank row is an error
    tall = WALL + [[None] * 3] * 10_000
    assert udfs.HL_UVALUE(tall) == udfs.HL_UVALUE(WALL)
    tall_text = WALL + [[None] * 3] + [["x", "y", "z"]] * 10_000
    assert "layers row 7 is blank but row 8" in udfs.HL_UVALUE(tall_text)


def test_identical_calls_reuse_the_cached_construction():
    udfs.CONSTRUCTIONS.clear()
    first = udfs.HL_UVALUE(WALL)
    hits = udfs.CONSTRUCTIONS.hits
    for _ in range(5):
        assert udfs.HL_UVALUE([list(r) for r in WALL]) == first
    assert udfs.CONSTRUCTIONS.hits == hits + 5
    assert udfs.HL_RTOTAL(WALL, "up") != udfs.HL_RTOTAL(WALL, "horizontal")


def test_a_recalculation_of_5000_distinct_tables_is_answered_from_the_cache():
    # A workbook of 5,000 distinct tables recalculated twice: the second pass finds every
    # table in the cache (a cache of 256 entries answered none of them: least recently used
    # is always the next one needed), within the memory budget.
    tables = [[["gypsum plasterboard 900", 12.5], ["mineral wool 035", 100 + k * 0.01],
               ["block", 150, 1.35], ["air", 25], ["brick", 102, 0.77], ["render", 15, 1.0]]
              for k in range(5000)]
    udfs.CONSTRUCTIONS.clear()
    first = [udfs.HL_UVALUE(t) for t in tables]
    assert udfs.CONSTRUCTIONS.misses == 5000
    assert [udfs.HL_UVALUE(t) for t in tables] == first
    assert udfs.CONSTRUCTIONS.hits == 5000
    assert udfs.CONSTRUCTIONS.size_bytes <= udfs.CACHE_BYTES
    udfs.CONSTRUCTIONS.clear()


def test_true_and_one_do_not_share_a_cache_entry():
    # TRUE == 1 in Python: a cached valid table must not answer for one holding TRUE
    assert isinstance(udfs.HL_UVALUE([["a", 100, 1]]), float)
    assert udfs.HL_UVALUE([["a", 100, True]]).startswith("HL_UVALUE: layers row 1 "
                                                         "conductivity")
    assert isinstance(udfs.HL_UVALUE_CORRECTED(CORR_WALL, [["air_gaps", 2, 1]]), float)
    out = udfs.HL_UVALUE_CORRECTED(CORR_WALL, [["air_gaps", 2, True]])
    assert out.startswith("HL_UVALUE_CORRECTED: corrections row 1 column 3")


def test_heat_flow_direction_changes_air_layer_and_surfaces():
    up = udfs.HL_RTOTAL(WALL, "UP ")
    assert math.isfinite(up) and up != udfs.HL_RTOTAL(WALL)


# --------------------------------------------------------------------------- corrections
CORR_WALL = [["gypsum plasterboard 900", 12.5], ["mineral wool 035", 100],
             ["block", 150, 1.35], ["brick", 102, 0.77]]  # invented


def test_corrections_against_the_annex_f_equations():
    r_ins = 0.1 / LAMBDA_MW_035
    r_t = RSI_H + 0.0125 / LAMBDA_GYPSUM_900 + r_ins + 0.15 / 1.35 + 0.102 / 0.77 + RSE
    # source: EN ISO 6946:2017, F.2: Delta U_g = Delta U'' (R_1/R_T)^2, Delta U'' = 0.01 at
    # level 1 [from memory]
    du_gaps = 0.01 * (r_ins / r_t) ** 2
    # source: EN ISO 6946:2017, F.3 (2017 form): Delta U_f = 0.8 lambda_f A_f n_f / d_0
    # (R_1/R_T)^2 for fasteners through the layer [from memory]; stainless steel 17 W/(m K)
    du_fix = 0.8 * 17.0 * 12.6e-6 * 4 / 0.1 * (r_ins / r_t) ** 2
    table = [["kind", "layer", "level / conductivity", "cross section [mm2]", "count"],
             ["air_gaps", 2, 1], ["fasteners", "mineral wool 035", "stainless steel", 12.6, 4]]
    rows = udfs.HL_CORRECTIONS(CORR_WALL, table)
    rtol = 1e-12  # same equations, independent arithmetic
    assert rows[0][1:] == [2, pytest.approx(du_gaps, rel=rtol)]
    assert rows[1][1:] == [2, pytest.approx(du_fix, rel=rtol)]
    total = du_gaps + du_fix
    assert total >= 0.03 / r_t  # above the 3 % rule, so applied
    assert udfs.HL_UVALUE_CORRECTED(CORR_WALL, table) == pytest.approx(1 / r_t + total, rel=rtol)
    # source: EN ISO 6946:2017, F.4: Delta U_r = p f x (R_1/R_T)^2, x = 0.04 [from memory]
    roof = [["inverted_roof", 2, 2.0, 0.5]]
    got = udfs.HL_CORRECTIONS(CORR_WALL, roof)[0][2]
    assert got == pytest.approx(2.0 * 0.5 * 0.04 * (r_ins / r_t) ** 2, rel=rtol)


def test_small_corrections_are_not_applied_and_blank_means_none():
    only_gaps = [["air_gaps", 2, 1]]
    u = udfs.HL_UVALUE(CORR_WALL)
    assert udfs.HL_UVALUE_CORRECTED(CORR_WALL, only_gaps) == u  # below 3 % of U
    assert "not applied" in udfs.HL_CORRECTIONS(CORR_WALL, only_gaps)[-2][0]
    assert udfs.HL_UVALUE_CORRECTED(CORR_WALL, None) == u
    assert udfs.HL_UVALUE_CORRECTED(CORR_WALL, [[None, None]]) == u


@pytest.mark.parametrize(("table", "fragment"), [
    ([["air_gaps", 2, 3]], 'corrections row 1 level must be one of "0", "1" or "2"; got 3'),
    ([["air_gaps", 9, 1]], "corrections row 1 layer must be at most 4"),
    ([["air_gaps", "roof", 1]], "corrections row 1 layer must be a layer number 1 to 4"),
    ([["air_gaps", 2, 1, 5]], "corrections row 1: column 4 must be blank for air_gaps"),
    ([["glue", 2, 1]], "corrections row 1 kind must be one of 'air_gaps'"),
    ([["fasteners", 2, "unobtainium", 12, 4]], 'unknown material "unobtainium"'),
    ([["fasteners", 2, 17, 12, 4, 200]], "corrections: fastener penetration 0.2 m exceeds"),
    ([["inverted_roof", 2, 2.0]], "corrections row 1 drainage_factor is blank"),
])
def test_bad_correction_tables_name_row_and_rule(table, fragment):
    out = udfs.HL_UVALUE_CORRECTED(CORR_WALL, table)
    assert isinstance(out, str) and out.startswith("HL_UVALUE_CORRECTED: ")
    assert fragment in out, out


def test_finite_volume_checks_agree_with_the_exact_heat_flux():
    # Without sources the 1-D steady profile is piecewise linear and q = (ti - te)/R_T
    # (Incropera & DeWitt, eq. 3.12 with the resistance network of section 3.1.2).
    rows = dict(udfs.HL_FVCHECK(WALL, 20.0, -5.0, None, None, None, 3))
    q = (20.0 - -5.0) / hand_resistance_wall(udfs.HL_RAIR(25))
    rtol_q = 1e-9  # exact scheme for this case: round-off only
    assert rows["heat flux, finite volumes [W/m2]"] == pytest.approx(q, rel=rtol_q)
    assert rows["heat flux, resistance ladder (independent) [W/m2]"] == pytest.approx(
        q, rel=rtol_q)
    assert rows["relative difference from the ladder [-]"] < rtol_q
    assert abs(rows["energy-balance residual (conservation, rounding) [-]"]) < 1e-10
    assert rows["estimated error of the heat flux [W/m2]"] == 0.0  # proven exact, stated so
    assert any(k.startswith("mesh: exact for this case") for k in rows)
    assert udfs.HL_FVCHECK(WALL, 20, -5, None, None, None, 3, True)[0] == ["quantity", "value"]


# --------------------------------------------------------------------------- sound numbers
def test_a_near_zero_declared_resistance_gives_a_text_not_impossible_temperatures():
    # A declared R of 1e-20 m2 K/W beside ordinary layers made the finite-volume solve
    # meaningless (nodal temperatures down to -1459 degC, outside the two air temperatures,
    # which steady conduction without sources cannot leave: the maximum principle). The
    # engine now refuses a layer resistance below its stated precision bound, and every
    # function that reads the table answers with a text naming the row and the rule.
    table = [["gypsum plasterboard 900", 12.5], ["panel", 100, None, 1e-20],
             ["brick", 102, 0.77]]
    calls = {"HL_NODE_TEMPS": (table, 20.0, -5.0), "HL_FVCHECK": (table, 20.0, -5.0),
             "HL_INTERFACE_TEMPS": (table, 20.0, -5.0), "HL_RTOTAL": (table,),
             "HL_UVALUE": (table,)}
    for name, args in calls.items():
        out = REGISTRY[name].function(*args)
        assert isinstance(out, str) and out.startswith(f"{name}: layers row 2"), out
        assert "panel" in out and "at least 1e-09 m2 K/W" in out, out


@pytest.mark.parametrize("row", [["void", 10000, 5e-324], ["void", 10000, 1e-300],
                                 ["frame", 100, 0.04, None, 0.1, 1e-300]])
def test_a_layer_resistance_out_of_scale_is_refused_naming_the_row(row):
    # 10 m at 5e-324 W/(m K) gave R_T = inf and a U-value of 0 (and NaN temperatures); the
    # bound is the physical limit of a conductivity (heatledger._validate.LIMITS, common
    # practice), the same as in a project file
    table = [["gypsum plasterboard 900", 12.5], row]
    for out in (udfs.HL_UVALUE(table), udfs.HL_INTERFACE_TEMPS(table, 20, -5)):
        assert isinstance(out, str) and "layers row 2" in out and "conductivity" in out, out
        assert "must be at least 0.001 W/(m K)" in out


def test_required_thickness_of_plain_and_declared_layers_is_the_closed_form():
    # d = lambda (1/U_t - R_rest) for a plain layer, from R_T = Rsi + sum R + Rse (ISO 6946
    # 6.7.1); a declared layer scales its R with d. Exact to round-off (rel 1e-12, far
    # inside the 1e-9 m an iterative root finder stops at).
    table = [["gypsum plasterboard 900", 12.5], ["board", 60, None, 1.5], ["block", 150, 1.35]]
    r_rest = RSI_H + 0.0125 / LAMBDA_GYPSUM_900 + 0.15 / 1.35 + RSE
    d_mm = 60.0 / 1.5 * (1.0 / 0.2 - r_rest)  # thickness per unit R of the declared board
    assert udfs.HL_THICKNESS(table, 2, 0.2) == pytest.approx(d_mm, rel=RTOL_ROUND_OFF)
    d_block = 1.35 * (1.0 / 0.4 - (RSI_H + 0.0125 / LAMBDA_GYPSUM_900 + 1.5 + RSE)) * 1000
    assert udfs.HL_THICKNESS(table, 3, 0.4) == pytest.approx(d_block, rel=RTOL_ROUND_OFF)
