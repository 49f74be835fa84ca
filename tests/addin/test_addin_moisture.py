"""Spreadsheet functions of the moisture family: values against the engine and the
standard's equations written out here, and answers (never exceptions) for bad input."""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from heatledger import Construction, Layer, MonthlyClimate, interstitial_condensation
from heatledger_xl import udfs
from heatledger_xl.registry import REGISTRY
from tests.addin._addin_helpers import call_with_drawn, check_result
from tests.tolerances import RTOL_ROUND_OFF

MOISTURE = sorted(n for n, s in REGISTRY.items() if s.family == "moisture")
TE = [-2.0, -1.0, 3.0, 7.0, 11.0, 14.0, 16.0, 16.0, 13.0, 9.0, 4.0, 0.0]  # invented
CLIMATE = [[t, 0.85, 20.0, 0.5] for t in TE]
TABLE = [["gypsum plasterboard 900", 12.5], ["mineral wool 035", 140.0], ["plywood 700", 12.0]]


def test_functions_are_registered():
    assert MOISTURE == ["HL_CONDENSATION", "HL_DEWPOINT", "HL_FRSI", "HL_FRSI_MIN", "HL_PSAT"]


def test_psat_and_dewpoint_follow_annex_e():
    # EN ISO 13788 Annex E (recalled), written out here
    assert udfs.HL_PSAT(12.0) == pytest.approx(610.5 * math.exp(17.269 * 12 / 249.3),
                                               rel=RTOL_ROUND_OFF)
    assert udfs.HL_PSAT(-8.0) == pytest.approx(610.5 * math.exp(21.875 * -8 / 257.5),
                                               rel=RTOL_ROUND_OFF)
    assert udfs.HL_DEWPOINT(udfs.HL_PSAT(7.5)) == pytest.approx(7.5, rel=1e-12)


def test_frsi_by_hand():
    # f = (R_T - 0.25)/R_T, R_T = 0.25 + sum d/lambda + 0.04 (library lambdas)
    r_t = 0.25 + 0.0125 / 0.25 + 0.14 / 0.035 + 0.012 / 0.17 + 0.04
    assert udfs.HL_FRSI(TABLE) == pytest.approx((r_t - 0.25) / r_t, rel=RTOL_ROUND_OFF)


def test_frsi_min_by_hand():
    # EN ISO 13788, 5.2 (recalled): dew point of p_i/0.8, then the factor
    p = 0.5 * 610.5 * math.exp(17.269 * 20 / 257.3) / 0.8
    x = math.log(p / 610.5)
    t = 237.3 * x / (17.269 - x)
    assert udfs.HL_FRSI_MIN(20.0, -2.0, 0.5) == pytest.approx((t + 2.0) / 22.0,
                                                              rel=RTOL_ROUND_OFF)
    assert udfs.HL_FRSI_MIN(20.0, -2.0, 50).startswith("HL_FRSI_MIN: rh_inside = 50 looks")
    assert "at least 1 K above temp_outside" in udfs.HL_FRSI_MIN(20.0, 22.0, 0.5)


def test_condensation_spill_equals_the_engine():
    out = udfs.HL_CONDENSATION(TABLE, CLIMATE, header=True)
    con = Construction([Layer(0.0125, material="gypsum plasterboard 900"),
                        Layer(0.14, material="mineral wool 035"),
                        Layer(0.012, material="plywood 700")])
    res = interstitial_condensation(con, MonthlyClimate(TE, [0.85] * 12, 20.0, 0.5))
    assert out[0][0] == "month" and len(out) == 14
    for m in range(12):
        assert out[m + 1][2] == pytest.approx(res.condensation_rate[m], rel=RTOL_ROUND_OFF)
        assert out[m + 1][3] == pytest.approx(res.accumulation[m], rel=RTOL_ROUND_OFF)
    assert out[-1][1] == res.verdict


def test_vapour_range_overrides_and_fills():
    table = [["board", 12.5, 0.2], ["mineral wool 035", 140.0]]
    assert "has no vapour value" in udfs.HL_CONDENSATION(table, CLIMATE)
    # a vapour check of s_d 20 m on the inside board stops the condensation
    dry = udfs.HL_CONDENSATION(table + [["plywood 700", 12]], CLIMATE,
                               [[None, 20.0], [None, None], [None, None]])
    assert dry[-1][1].startswith("no interstitial condensation")
    assert "mu or s_d, not both" in udfs.HL_CONDENSATION(table, CLIMATE, [[10, 0.1]])


def test_climate_range_rules():
    assert "got 11 rows" in udfs.HL_CONDENSATION(TABLE, CLIMATE[:11])
    bad = [row[:] for row in CLIMATE]
    bad[3][1] = 85
    assert "climate row 4 (Apr) phi_e = 85 looks like a percentage" in udfs.HL_CONDENSATION(
        TABLE, bad)
    with_header = [["theta_e", "phi_e", "theta_i", "phi_i"]] + CLIMATE
    assert isinstance(udfs.HL_CONDENSATION(TABLE, with_header), list)


_CELLS = st.one_of(st.none(), st.floats(allow_nan=True, allow_infinity=True),
                   st.text(max_size=6), st.booleans(), st.integers(-10, 10))


@settings(max_examples=60, deadline=None)
@given(st.data())
def test_no_function_raises(data):
    name = data.draw(st.sampled_from(MOISTURE))
    ranges = st.lists(st.lists(_CELLS, min_size=1, max_size=5), min_size=0, max_size=13)
    check_result(name, call_with_drawn(name, data.draw, ranges, _CELLS))
