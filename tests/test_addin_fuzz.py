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

import pytest
from hypothesis import HealthCheck, event, given, settings
from hypothesis import strategies as st

from heatledger_xl import udfs
from heatledger_xl.ranges import ERROR_VALUES, LIBRARY
from heatledger_xl.registry import REGISTRY
from tests._addin_helpers import call_with_drawn
from tests._addin_helpers import check_result as check_answer

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
