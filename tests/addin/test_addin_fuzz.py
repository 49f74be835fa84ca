"""No spreadsheet function ever raises: arbitrary cell values give a result or a one-line
text naming the argument and the rule, fast (hypothesis deadline of one second per call,
the limit stated for bad input in the add-in's issue).

Cell values are what xlwings hands a function: numbers, text (including error values such
as ``#N/A`` as delivered with ``err_to_str``), blanks (None), booleans, NaN and infinities,
dates and times, and ranges as ragged or empty 2-D lists.
"""

from __future__ import annotations

import datetime as dt
import math

import numpy as np
import pytest
from hypothesis import HealthCheck, event, given, settings
from hypothesis import strategies as st

from heatledger.constructions import (
    AirLayer,
    BridgedLayer,
    Construction,
    Layer,
    required_thickness,
)
from heatledger_xl import udfs
from heatledger_xl.cells import ERROR_VALUES
from heatledger_xl.ranges import LIBRARY
from heatledger_xl.registry import REGISTRY
from tests.addin._addin_helpers import call_with_drawn
from tests.addin._addin_helpers import check_result as check_answer
from tests.tolerances import (
    ATOL_ITERATION,
    ATOL_ROUND_OFF,
    ATOL_THICKNESS_MM,
    RTOL_ITERATION,
    RTOL_ROUND_OFF,
)

DEADLINE_MS = 1000  # the add-in's issue: every bad input answers within a second
# The construction family; other families (fins) carry their own no-raise tests.
OURS = sorted(n for n, s in REGISTRY.items() if s.family == udfs.FAMILY)
MATERIALS = LIBRARY.names()

cells = st.one_of(
    st.none(),
    st.just(""),
    st.floats(allow_nan=True, allow_infinity=True),
    st.integers(min_value=-(10**400), max_value=10**400),
    st.booleans(),
    st.text(max_size=12),
    st.sampled_from(sorted(ERROR_VALUES)),
    st.sampled_from(["12.5", " 0 ", "-3", "1e999", "nan", "TRUE", "up", "down", "horizontal",
                     "inside", "outside", "air", "air:well", "air:slightly:800",
                     "thickness [mm]", "=1+1", "conductivity", "density"]),
    st.sampled_from(MATERIALS),
    st.datetimes(),
    st.dates(),
    st.times(),
)
# Plausible layer rows, so the search also reaches the engine, not only the parser.
plausible_rows = st.lists(
    st.tuples(
        st.one_of(st.sampled_from(MATERIALS), st.sampled_from(["air", "air:well",
                                                               "air:slightly:900", "x"]),
                  cells),
        st.one_of(st.floats(min_value=0.5, max_value=400), cells),
        st.one_of(st.none(), st.floats(min_value=0.01, max_value=60), cells),
        st.one_of(st.none(), st.none(), st.floats(min_value=0.01, max_value=8), cells),
        st.one_of(st.none(), st.none(), st.floats(min_value=0.01, max_value=0.5), cells),
        st.one_of(st.none(), st.floats(min_value=0.05, max_value=60),
                  st.sampled_from(MATERIALS), cells),
    ).map(list),
    min_size=1, max_size=8,
)
ragged = st.lists(st.lists(cells, max_size=8), max_size=10)
ranges_ = st.one_of(plausible_rows, ragged, st.lists(cells, max_size=7), cells)
scalars = st.one_of(cells, cells, st.lists(st.lists(cells, max_size=2), max_size=2))


@st.composite
def clean_row(draw):
    kind = draw(st.sampled_from(["library", "conductivity", "declared", "bridged", "air"]))
    d = draw(st.floats(min_value=0.5, max_value=300))
    lam = st.floats(min_value=0.02, max_value=60)
    if kind == "library":
        return [draw(st.sampled_from(MATERIALS)), d]
    if kind == "conductivity":
        return ["layer", d, draw(lam)]
    if kind == "declared":
        return ["panel", d, None, draw(st.floats(min_value=0.01, max_value=8))]
    if kind == "bridged":
        return ["frame", d, draw(lam), None, draw(st.floats(min_value=0.01, max_value=0.5)),
                draw(st.one_of(lam, st.sampled_from(MATERIALS)))]
    return [draw(st.sampled_from(["air", "air:well", "air:slightly:900"])), d]


@st.composite
def clean_correction(draw):
    kind = draw(st.sampled_from(["air_gaps", "fasteners", "inverted_roof"]))
    layer = draw(st.integers(min_value=1, max_value=7))
    if kind == "air_gaps":
        return [kind, layer, draw(st.sampled_from([0, 1, 2]))]
    if kind == "fasteners":
        return [kind, layer, draw(st.one_of(st.floats(min_value=0.1, max_value=60),
                                            st.just("stainless steel"))),
                draw(st.floats(min_value=1, max_value=100)),
                draw(st.floats(min_value=0, max_value=20)),
                draw(st.one_of(st.none(), st.floats(min_value=1, max_value=400)))]
    return [kind, layer, draw(st.floats(min_value=0, max_value=10)),
            draw(st.floats(min_value=0, max_value=1)),
            draw(st.one_of(st.none(), st.floats(min_value=0, max_value=0.1)))]


opt = st.none
PLAUSIBLE = {
    "corrections": st.one_of(st.none(), st.lists(clean_correction(), max_size=3)),
    "layers": st.lists(clean_row(), min_size=1, max_size=7),
    "temp_inside": st.floats(min_value=-40, max_value=60),
    "temp_outside": st.floats(min_value=-40, max_value=60),
    "heat_flow": st.sampled_from([None, "up", "horizontal", "down"]),
    "rsi": st.one_of(opt(), st.floats(min_value=0, max_value=0.5)),
    "rse": st.one_of(opt(), st.floats(min_value=0, max_value=0.5)),
    "header": st.one_of(opt(), st.booleans()),
    "nodes_per_layer": st.one_of(opt(), st.integers(min_value=1, max_value=40)),
    "layer_number": st.integers(min_value=1, max_value=7),
    "target_u": st.floats(min_value=0.05, max_value=5),
    "side": st.sampled_from(["inside", "outside"]),
    "emissivity": st.one_of(opt(), st.floats(min_value=0, max_value=1)),
    "temp_mean": st.one_of(opt(), st.floats(min_value=-30, max_value=60)),
    "wind_speed": st.one_of(opt(), st.floats(min_value=0, max_value=30)),
    "thickness_mm": st.floats(min_value=0.1, max_value=300),
    "emissivity_1": st.one_of(opt(), st.floats(min_value=0.01, max_value=1)),
    "emissivity_2": st.one_of(opt(), st.floats(min_value=0.01, max_value=1)),
    "material": st.sampled_from(MATERIALS),
    "quantity": st.sampled_from([None, "conductivity", "density", "specific_heat",
                                 "vapour_resistance_factor", "source"]),
}
#: The functions whose answer may be a text that is not an error.
TEXT_RESULTS = ("HL_MATERIAL", "HL_VERSION", "HL_WARNINGS")


def check_result(name: str, out: object) -> None:
    check_answer(name, out, text_results=TEXT_RESULTS)


@pytest.mark.parametrize("name", OURS)
@settings(max_examples=120, deadline=DEADLINE_MS,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])
@given(data=st.data())
def test_any_cell_values_give_a_result_or_a_one_line_text(name, data):
    out = call_with_drawn(name, data.draw, ranges_, scalars)
    event("error text" if isinstance(out, str) and out.startswith(f"{name}: ") else "result")
    check_result(name, out)


@pytest.mark.parametrize("name", OURS)
@pytest.mark.parametrize("bad", ["#N/A", "#VALUE!", "nonsense", True, math.nan,
                                 dt.datetime(2026, 12, 2), [[1, 2], [3, 4]]])
def test_every_optional_argument_given_an_error_value_or_text(name, bad):
    spec = REGISTRY[name]
    wall = [["gypsum plasterboard 900", 12.5], ["mineral wool 035", 100],
            ["block", 150, 1.35]]
    good = {"layers": wall, "temp_inside": 20.0, "temp_outside": -5.0, "layer_number": 2,
            "target_u": 0.25, "side": "inside", "thickness_mm": 25.0, "material": "steel",
            "corrections": [["air_gaps", 2, 2]]}
    if name == "HL_RLIMITS":
        good["layers"] = wall + [["frame", 90, 0.035, None, 0.1, "softwood 500"]]
    base = [good.get(a.name) for a in spec.args]
    check_result(name, spec.function(*base))
    for i, a in enumerate(spec.args):
        if not a.optional:
            continue
        args = list(base)
        args[i] = bad
        out = spec.function(*args)
        check_result(name, out)
        if not (a.name == "header" and bad is True):  # TRUE is a valid header flag
            assert isinstance(out, str) and out.startswith(f"{name}: "), (a.name, bad, out)
            assert a.name in out


@pytest.mark.parametrize("name", [n for n in OURS
                                  if any(a.is_range for a in REGISTRY[n].args)])
@pytest.mark.parametrize("rows", [10_000])
def test_huge_ranges_and_text_in_number_columns(name, rows):
    spec = REGISTRY[name]
    filled = [["block", 10.0, 1.0, None, None, None]] * rows
    text_cols = [["block", "thick", "high", "x", "y", "z"]] + filled
    blanks = [[None] * 6] * rows
    merged = [["block", 100.0, 1.0]] + [[None, None, None]] * rows  # merged-looking blanks
    good = {"temp_inside": 20.0, "temp_outside": -5.0, "layer_number": 1, "target_u": 0.5}
    for table in (filled, text_cols, blanks, merged):
        args = [table if a.is_range else good.get(a.name) for a in spec.args]
        check_result(name, spec.function(*args))


@pytest.mark.parametrize("name", OURS)
@settings(max_examples=60, deadline=DEADLINE_MS,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])
@given(data=st.data())
def test_plausible_inputs_reach_the_engine_and_never_raise(name, data):
    spec = REGISTRY[name]
    args = [data.draw(PLAUSIBLE[a.name]) for a in spec.args]
    out = spec.function(*args)
    event("error text" if isinstance(out, str) and out.startswith(f"{name}: ") else "result")
    check_result(name, out)


def test_the_error_texts_are_not_taken_for_spreadsheet_errors_or_formulas():
    out = udfs.HL_UVALUE([["a", -1, 1]])
    assert not out.startswith(("#", "=", "+", "-", "@"))


# --------------------------------------------------------------------------- engine agreement
# Realistic tables drawn twice over: as the cells a consultant types and as the engine's own
# layer objects built directly from the same numbers. The function must answer with a number
# (never an error text) equal to the engine's result: the inputs reach the engine intact.
RTOL_SAME = RTOL_ROUND_OFF  # tests/tolerances.py
ATOL_FV_K = ATOL_ITERATION  # tests/tolerances.py
ATOL_D_MM = ATOL_THICKNESS_MM  # tests/tolerances.py


@st.composite
def realistic_layer(draw, first: bool):
    """(cells, engine layer) of one realistic layer; never an air layer first."""
    kinds = ["library", "conductivity", "declared", "bridged"] + ([] if first else ["air"] * 2)
    kind = draw(st.sampled_from(kinds))
    d_mm = draw(st.floats(min_value=5.0, max_value=300.0))
    d = d_mm / 1000.0
    if kind == "library":
        name = draw(st.sampled_from(MATERIALS))
        return [name, d_mm], Layer(d, material=LIBRARY.get(name))
    if kind == "conductivity":
        lam = draw(st.floats(min_value=0.02, max_value=2.5))
        return ["layer", d_mm, lam], Layer(d, lam)
    if kind == "declared":
        r = draw(st.floats(min_value=0.05, max_value=6.0))
        return ["product", d_mm, None, r], Layer(d, resistance=r)
    if kind == "bridged":
        lam = draw(st.floats(min_value=0.03, max_value=0.05))
        f = draw(st.floats(min_value=0.05, max_value=0.25))
        stud = draw(st.sampled_from(["softwood 500", "timber 450", 0.13, 0.18]))
        lam_b = LIBRARY.get(stud).conductivity if isinstance(stud, str) else stud
        return (["studs + wool", d_mm, lam, None, f, stud],
                BridgedLayer(d, [(lam, 1.0 - f), (lam_b, f)]))
    air = draw(st.sampled_from(["air", "air:slightly:900", "air:well"]))
    ventilation, area = {"air": ("unventilated", None), "air:slightly:900": ("slightly", 900.0),
                         "air:well": ("well", None)}[air]
    return [air, d_mm], AirLayer(d, ventilation=ventilation, vent_area=area)


@st.composite
def realistic_wall(draw):
    """(cells, engine Construction, heat_flow, rsi, rse)."""
    n = draw(st.integers(min_value=1, max_value=7))
    pairs = [draw(realistic_layer(first=k == 0)) for k in range(n)]
    heat_flow = draw(st.sampled_from(["up", "horizontal", "down"]))
    rsi = draw(st.one_of(st.none(), st.floats(min_value=0.04, max_value=0.25)))
    rse = draw(st.one_of(st.none(), st.floats(min_value=0.0, max_value=0.13)))
    header = draw(st.booleans())
    cells = ([["material", "thickness [mm]"]] if header else []) + [p[0] for p in pairs]
    cells += [[None, None]] * draw(st.integers(min_value=0, max_value=3))  # range reaching below
    con = Construction([p[1] for p in pairs], heat_flow, rsi=rsi, rse=rse)
    return cells, con, heat_flow, rsi, rse


def _number(name, out):
    assert isinstance(out, float) and math.isfinite(out), f"{name} gave {out!r}"
    return out


@settings(max_examples=150, deadline=DEADLINE_MS,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])
@given(wall=realistic_wall(), t_in=st.floats(min_value=10, max_value=30),
       t_out=st.floats(min_value=-30, max_value=35))
def test_realistic_tables_give_the_engines_own_numbers(wall, t_in, t_out):
    cells, con, hf, rsi, rse = wall
    args = (hf, rsi, rse)
    u = _number("HL_UVALUE", udfs.HL_UVALUE(cells, *args))
    assert u == pytest.approx(con.u_value, rel=RTOL_SAME)
    assert udfs.HL_RTOTAL(cells, *args) == pytest.approx(con.total_resistance, rel=RTOL_SAME)
    assert udfs.HL_UVALUE_REPORTED(cells, *args) == con.u_value_reported
    flux = _number("HL_HEATFLUX", udfs.HL_HEATFLUX(cells, t_in, t_out, *args))
    assert flux == pytest.approx((t_in - t_out) / con.total_resistance, rel=RTOL_SAME)
    ladder = udfs.HL_INTERFACE_TEMPS(cells, t_in, t_out, *args)
    assert isinstance(ladder, list), ladder
    assert [r[2] for r in ladder] == pytest.approx(list(con.ladder_temperatures(t_in, t_out)),
                                                    abs=ATOL_FV_K)
    nodes = udfs.HL_NODE_TEMPS(cells, t_in, t_out, *args, 3)
    assert isinstance(nodes, list), nodes
    fv = con.temperatures(t_in, t_out, nodes_per_layer=3)
    assert [r[3] for r in nodes] == pytest.approx(list(fv.temperature), abs=ATOL_FV_K)
    assert [r[2] for r in nodes] == pytest.approx(list(fv.x * 1000.0), rel=RTOL_SAME)
    check = dict(udfs.HL_FVCHECK(cells, t_in, t_out, *args, 3))
    assert check["heat flux, finite volumes [W/m2]"] == pytest.approx(fv.heat_flux, rel=RTOL_SAME,
                                                                 abs=ATOL_ROUND_OFF)


@settings(max_examples=100, deadline=DEADLINE_MS,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])
@given(wall=realistic_wall(), data=st.data())
def test_required_thickness_recovers_the_drawn_thickness(wall, data):
    # Sizing a layer for the U-value the table already has must give back its thickness
    # where U is strictly monotonic in it: a counted layer, not outside a slightly
    # ventilated air layer (whose outer resistances count only up to a cap, ISO 6946 6.9.3,
    # so U stops changing beyond it and any larger thickness also meets the target).
    cells, con, hf, rsi, rse = wall
    k = data.draw(st.integers(min_value=1, max_value=len(con.layers)))
    row = con.layer_table[k - 1]
    out = udfs.HL_THICKNESS(cells, k, con.u_value, hf, rsi, rse)
    if row.kind == "air" or not row.counted:
        assert isinstance(out, str) and out.startswith("HL_THICKNESS: layer_number"), out
        return
    vent = con.ventilation
    if vent is not None and vent.ventilation == "slightly" and k - 1 > vent.layer:
        if isinstance(out, str):  # the cap is reached even at the thinnest layer
            assert "is met even without layer" in out, out
            return
        sized = con.with_layer(k - 1, con.layers[k - 1].with_thickness(out / 1000.0))
        assert sized.u_value == pytest.approx(con.u_value, rel=RTOL_ITERATION)
        return
    d_mm = _number("HL_THICKNESS", out)
    assert d_mm == pytest.approx(row.thickness * 1000.0, abs=ATOL_D_MM)
    assert out == pytest.approx(required_thickness(con, k - 1, con.u_value) * 1000.0,
                                abs=ATOL_D_MM)


# ---- hostile tables: a realistic table with one cell made impossible, or a gap ----------
HOSTILE_THICKNESS = [0, -5.0, math.nan, math.inf, -math.inf, 1e300, "ten", True, "#N/A",
                     dt.datetime(2026, 1, 1), 10**400]
HOSTILE_CONDUCTIVITY = [0, -1.0, math.nan, math.inf, 1e300, "#DIV/0!", False, "warm",
                        dt.date(2026, 1, 1)]
LAYER_FUNCTIONS = [n for n in OURS if REGISTRY[n].args[:1] and REGISTRY[n].args[0].name == "layers"]


@st.composite
def hostile_wall(draw):
    cells, *_ = draw(realistic_wall())
    body = [list(r) for r in cells if r[0] is not None and r[0] != "material"]
    k = draw(st.integers(min_value=0, max_value=len(body) - 1))
    how = draw(st.sampled_from(["thickness", "conductivity", "gap"]))
    if how == "gap":
        body.insert(k, [None, None])
        body.append(["brick", 102, 0.77])  # at least one filled row below the gap
    elif how == "thickness":
        body[k][1] = draw(st.sampled_from(HOSTILE_THICKNESS))
    else:
        body[k] = ["layer", body[k][1], draw(st.sampled_from(HOSTILE_CONDUCTIVITY))]
    return body


@pytest.mark.parametrize("name", LAYER_FUNCTIONS)
@settings(max_examples=40, deadline=DEADLINE_MS,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])
@given(table=hostile_wall())
def test_hostile_tables_give_a_one_line_text_naming_the_layers(name, table):
    spec = REGISTRY[name]
    good = {"temp_inside": 20.0, "temp_outside": -5.0, "layer_number": 1, "target_u": 0.3,
            "corrections": None}
    out = spec.function(*[table if a.name == "layers" else good.get(a.name)
                          for a in spec.args])
    assert isinstance(out, str) and out.startswith(f"{name}: layers"), out
    assert "\n" not in out and len(out) <= 250 and "unexpected" not in out


# ---- extreme but accepted values: a number that cannot be right never comes out --------
@st.composite
def extreme_wall(draw):
    cells, *_ = draw(realistic_wall())
    body = [list(r) for r in cells if r[0] is not None and r[0] != "material"]
    k = draw(st.integers(min_value=0, max_value=len(body) - 1))
    body[k] = draw(st.sampled_from([
        ["panel", 100.0, None, 1e-20], ["panel", 0.001, None, 1e-16], ["film", 0.001, 1e4],
        ["foil", 0.001, None, 1e-300], ["void", 10000.0, 1e-300], ["void", 10000.0, 5e-324],
        ["slab", 10000.0, 1e4], ["panel", 100.0, None, 1000.0]]))
    return body


@settings(max_examples=80, deadline=DEADLINE_MS,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])
@given(table=extreme_wall(), t_in=st.floats(min_value=10, max_value=30),
       t_out=st.floats(min_value=-30, max_value=35))
def test_extreme_tables_give_a_sound_number_or_a_text(table, t_in, t_out):
    # Steady 1-D conduction without sources: every temperature lies between the two air
    # temperatures and, in each layer, on the straight line between its interfaces
    # (Incropera & DeWitt eq. 3.3), which is what the resistance ladder gives.
    tol_k = udfs.TEMP_TOL_K
    low, high = min(t_in, t_out) - tol_k, max(t_in, t_out) + tol_k
    u = udfs.HL_UVALUE(table)
    if isinstance(u, str):
        assert u.startswith("HL_UVALUE: layers"), u
    else:
        assert math.isfinite(u) and u > 0.0
    ladder = udfs.HL_INTERFACE_TEMPS(table, t_in, t_out)
    nodes = udfs.HL_NODE_TEMPS(table, t_in, t_out, None, None, None, 2)
    for name, out in (("HL_INTERFACE_TEMPS", ladder), ("HL_NODE_TEMPS", nodes)):
        if isinstance(out, str):
            assert out.startswith(f"{name}: layers") and len(out) <= 250, out
            continue
        temps = [r[-1] for r in out]
        assert all(low <= t <= high for t in temps), (name, temps)
    if isinstance(ladder, list) and isinstance(nodes, list):
        xs, ts = [r[1] for r in ladder], [r[2] for r in ladder]
        for _, _, x, t in nodes:
            assert t == pytest.approx(float(np.interp(x, xs, ts)), abs=tol_k)
