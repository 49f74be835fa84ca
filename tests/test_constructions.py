"""Constructions: series resistances, bridged layers, ventilated air layers, corrections,
required thickness and rounding, against EN ISO 6946:2017 equations and hand calculations."""

import math

import pytest

from heatledger import (
    AirGapCorrection,
    AirLayer,
    BridgedLayer,
    Construction,
    FastenerCorrection,
    HeatLedgerError,
    InvertedRoofCorrection,
    Layer,
    air_layer_resistance,
    required_thickness,
    round_significant,
)
from tests.tolerances import RTOL_APPROXIMATION, RTOL_HAND, RTOL_ITERATION, RTOL_ROUND_OFF


def test_series_sum_of_homogeneous_layers():
    # source: EN ISO 6946:2017 6.7.1: R_T = Rsi + sum(d/lambda) + Rse; Table 7 Rsi/Rse.
    # hand calculation: 0.13 + 0.148148 + 2.857143 + 0.04 = 3.17529
    wall = Construction([Layer(0.2, 1.35), Layer(0.1, 0.035)], "horizontal")
    assert wall.total_resistance == pytest.approx(3.17529, rel=RTOL_HAND)
    assert wall.u_value == pytest.approx(1 / 3.17529, rel=RTOL_HAND)


def test_declared_resistance_layer():
    con = Construction([Layer(0.01, resistance=0.5)], "up")
    # source: Table 7, upwards: 0.10 + 0.5 + 0.04
    assert con.total_resistance == pytest.approx(0.64)


def test_bridged_layer_worked_by_hand():
    # Worked by hand with EN ISO 6946:2017 6.7.2 (upper and lower limits):
    # plasterboard 12.5 mm (0.25), 140 mm studs 15 % softwood (0.13) / 85 % mineral wool
    # (0.035), horizontal heat flow.
    # section a (wool):   0.13 + 0.05 + 4.0000 + 0.04 = 4.2200
    # section b (timber): 0.13 + 0.05 + 1.07692 + 0.04 = 1.29692
    # upper R'_T = 1/(0.85/4.22 + 0.15/1.29692) = 3.15378
    # lower: lambda'' = 0.85*0.035 + 0.15*0.13 = 0.04925; R = 0.14/0.04925 = 2.84264
    #        R''_T = 0.13 + 0.05 + 2.84264 + 0.04 = 3.06264
    # R_T = 3.10821, e = (3.15378 - 3.06264)/(2*3.10821) = 0.014661
    wall = Construction([Layer(0.0125, 0.25),
                         BridgedLayer(0.14, [(0.035, 0.85), (0.13, 0.15)])], "horizontal")
    br = wall.bridging
    assert br.upper == pytest.approx(3.15378, rel=RTOL_HAND)
    assert br.lower == pytest.approx(3.06264, rel=RTOL_HAND)
    assert wall.total_resistance == pytest.approx(3.10821, rel=RTOL_HAND)
    assert br.relative_error == pytest.approx(0.014661, rel=RTOL_APPROXIMATION)
    assert wall.u_value == pytest.approx(1 / 3.10821, rel=RTOL_HAND)
    assert wall.u_value_reported == 0.32
    # the ladder used for temperatures sums to R_T
    used = wall.rsi + sum(r.resistance for r in wall.layer_table) + wall.rse_used
    assert used == pytest.approx(wall.total_resistance, rel=RTOL_ROUND_OFF)


def test_bridging_ratio_above_limit_warns():
    # source: EN ISO 6946:2017 6.7.2 (from memory): not valid when R'_T/R''_T > 1.5
    con = Construction([BridgedLayer(0.2, [(0.03, 0.9), (50.0, 0.1)])])
    assert con.bridging.ratio > 1.5
    assert any("exceeds 1.5" in w for w in con.warnings)


def test_well_ventilated_layer_and_outer_layers_ignored():
    # source: EN ISO 6946:2017 6.9.4 (from memory): disregard the air layer and all layers
    # outside it; external surface resistance = Rsi of the same direction (0.13 horizontal)
    con = Construction([Layer(0.1, 0.04), AirLayer(0.03, ventilation="well"),
                        Layer(0.1, 0.77)])
    assert con.total_resistance == pytest.approx(0.13 + 2.5 + 0.13)
    assert [r.counted for r in con.layer_table] == [True, False, False]


def test_slightly_ventilated_layer_weights_the_two_totals():
    # source: EN ISO 6946:2017 6.9.3 (from memory):
    # R_T = (1500 - Av)/1000 * R_T,u + (Av - 500)/1000 * R_T,v, outer layers capped at 0.15
    av = 1000.0
    rg = air_layer_resistance(0.05, "horizontal")
    r_tu = 0.13 + 2.5 + rg + min(0.102 / 0.77, 0.15) + 0.04
    r_tv = 0.13 + 2.5 + 0.13
    expected = (1500 - av) / 1000 * r_tu + (av - 500) / 1000 * r_tv
    con = Construction([Layer(0.1, 0.04), AirLayer(0.05, ventilation="slightly", vent_area=av),
                        Layer(0.102, 0.77)])
    assert con.total_resistance == pytest.approx(expected, rel=RTOL_ROUND_OFF)
    used = con.rsi + sum(r.resistance for r in con.layer_table) + con.rse_used
    assert used == pytest.approx(expected, rel=RTOL_ROUND_OFF)


def test_air_gap_correction():
    # source: EN ISO 6946:2017 F.2 (from memory): Delta U_g = Delta U'' (R_1/R_T,h)^2,
    # level 2 Delta U'' = 0.04 W/(m2 K)
    layers = [Layer(0.1, 1.0), Layer(0.1, 0.035)]
    plain = Construction(layers)
    con = Construction(layers, corrections=[AirGapCorrection(1, 2)])
    r1 = 0.1 / 0.035
    expected = 0.04 * (r1 / plain.total_resistance) ** 2
    assert con.corrections.applied
    assert con.u_value - plain.u_value == pytest.approx(expected, rel=RTOL_ROUND_OFF)


def test_fastener_correction_2017_and_2007_forms():
    # source: EN ISO 6946:2017 F.3 (from memory): alpha lambda_f A_f n_f / d_0 (R_1/R_T,h)^2
    # with alpha = 0.8; 2007 Annex D: alpha lambda_f n_f A_f (R_1/R_T,h)^2 with alpha = 6 1/m
    layers = [Layer(0.1, 0.56), Layer(0.1, 0.035), Layer(0.1, 0.77)]
    plain = Construction(layers)
    ratio2 = ((0.1 / 0.035) / plain.total_resistance) ** 2
    c17 = FastenerCorrection(1, 17.0, 12.6e-6, 4.4)
    c07 = FastenerCorrection(1, 17.0, 12.6e-6, 4.4, edition="2007")
    d17 = Construction(layers, corrections=[c17], apply_small_corrections=True)
    d07 = Construction(layers, corrections=[c07], apply_small_corrections=True)
    assert d17.corrections.delta_u_total == pytest.approx(0.8 * 17 * 12.6e-6 * 4.4 / 0.1 * ratio2)
    assert d07.corrections.delta_u_total == pytest.approx(6 * 17 * 12.6e-6 * 4.4 * ratio2)


def test_fastener_of_low_conductivity_needs_no_correction():
    # source: EN ISO 6946:2017 F.3 (from memory): no correction when lambda_f < 1 W/(m K)
    con = Construction([Layer(0.1, 0.035)], corrections=[FastenerCorrection(0, 0.5, 1e-4, 4)])
    assert con.corrections.delta_u_total == 0.0


def test_small_corrections_not_applied():
    # source: EN ISO 6946:2017 Annex F (from memory): corrections below 3 % of U need not be
    # applied
    layers = [Layer(0.2, 1.0), Layer(0.2, 0.035)]
    con = Construction(layers, corrections=[AirGapCorrection(0, 1)])
    assert con.corrections.delta_u_total < 0.03 * con.u_value_uncorrected
    assert not con.corrections.applied
    assert con.u_value == con.u_value_uncorrected


def test_inverted_roof_correction_sets_a_floor_on_u():
    # source: EN ISO 6946 F.4 (from memory): Delta U_r = p f x (R_1/R_T)^2 -> p f x as the
    # insulation dominates; p = 3 mm/day, f x = 0.04 gives 0.12 W/(m2 K) that no insulation
    # thickness can beat.
    corr = [InvertedRoofCorrection(1, 3.0, 1.0, 0.04)]
    base = [Layer(0.2, 2.3)]
    u_thick = Construction(base + [Layer(2.0, 0.034)], "up", corrections=corr).u_value
    assert u_thick > 0.12
    roof = Construction(base + [Layer(0.1, 0.034)], "up", corrections=corr)
    with pytest.raises(HeatLedgerError, match="cannot be reached"):
        required_thickness(roof, 1, 0.11)


def test_required_thickness_closed_form():
    # d = lambda (1/U_target - (R_T - R_layer)), from R_T = Rsi + sum R + Rse (ISO 6946 6.7.1)
    con = Construction([Layer(0.2, 1.35), Layer(0.05, 0.035)])
    d = required_thickness(con, 1, 0.18)
    expected = 0.035 * (1 / 0.18 - (0.13 + 0.2 / 1.35 + 0.04))
    assert d == pytest.approx(expected, rel=RTOL_ITERATION)
    sized = con.with_layer(1, con.layers[1].with_thickness(d))
    assert sized.u_value == pytest.approx(0.18, rel=RTOL_ITERATION)


def test_required_thickness_with_bridging_meets_target():
    con = Construction([Layer(0.0125, 0.25), BridgedLayer(0.1, [(0.035, 0.85), (0.13, 0.15)])])
    d = required_thickness(con, 1, 0.2)
    assert con.with_layer(1, con.layers[1].with_thickness(d)).u_value == pytest.approx(0.2)


@pytest.mark.parametrize(("value", "expected"), [(0.2449, 0.24), (0.245, 0.25), (1.25, 1.3),
                                                 (0.0996, 0.1), (12.34, 12.0), (0.3, 0.3)])
def test_round_significant(value, expected):
    # source: EN ISO 6946:2017 clause 8 (from memory): U to two significant figures;
    # halves away from zero as spreadsheet ROUND does
    assert round_significant(value, 2) == expected


# ---- bad input: each a HeatLedgerError naming the input and the rule ---------------------

@pytest.mark.parametrize(("kwargs", "pattern"), [
    ({"thickness": 0.0, "conductivity": 1.0}, "thickness must be greater than zero"),
    ({"thickness": -0.1, "conductivity": 1.0}, "thickness must be greater than zero"),
    ({"thickness": 0.1, "conductivity": 0.0}, "conductivity must be greater than zero"),
    ({"thickness": 0.1, "conductivity": -2.0}, "conductivity must be greater than zero"),
    ({"thickness": 0.1, "conductivity": 1.0, "resistance": 0.2}, "not both"),
    ({"thickness": math.nan, "conductivity": 1.0}, "thickness must be a finite number"),
    ({"thickness": 0.1, "conductivity": math.nan}, "conductivity must be a finite number"),
    ({"thickness": 0.1}, "give a conductivity"),
    ({"thickness": "ten", "conductivity": 1.0}, "thickness must be a number"),
])
def test_layer_bad_input(kwargs, pattern):
    with pytest.raises(HeatLedgerError, match=pattern):
        Layer(**kwargs, name="brick")


def test_layer_error_names_the_layer():
    with pytest.raises(HeatLedgerError, match='layer "brick" thickness'):
        Layer(-1, 1.0, name="brick")


def test_area_fractions_must_sum_to_one():
    with pytest.raises(HeatLedgerError, match="area fractions must sum to 1; they sum to 0.9"):
        BridgedLayer(0.1, [(0.035, 0.8), (0.13, 0.1)])


def test_unknown_material_suggests_names():
    with pytest.raises(HeatLedgerError, match='unknown material "mineral wol 035"; closest '
                                              'known: "mineral wool 035"'):
        Layer(0.1, material="mineral wol 035")


def test_unknown_direction():
    with pytest.raises(HeatLedgerError, match='heat_flow must be one of "up", "horizontal" '
                                              'or "down"; got "sideways"'):
        Construction([Layer(0.1, 1.0)], "sideways")


def test_heatledger_error_is_value_error():
    assert issubclass(HeatLedgerError, ValueError)


def test_correction_naming_missing_layer():
    with pytest.raises(HeatLedgerError, match="names layer 5"):
        Construction([Layer(0.1, 1.0)], corrections=[AirGapCorrection(5, 1)])


def test_slightly_ventilated_needs_vent_area():
    with pytest.raises(HeatLedgerError, match="needs vent_area between 500 and 1500"):
        AirLayer(0.05, ventilation="slightly")
