"""Unventilated air layers against EN ISO 6946:2017 Table 8, and ventilation classes."""

import numpy as np
import pytest

from heatledger import HeatLedgerError, air_layer_resistance, ventilation_class
from tests._tables import read_table
from tests.tolerances import (
    ATOL_TABLE_INTERPOLATION,
    ATOL_TABLE_M2K_W,
    RTOL_APPROXIMATION,
    RTOL_ULP,
)

# source: EN ISO 6946:2017, Table 8, emissivities 0.9, mean temperature 10 degC
# [source: iso6946-airlayers, Table 8] (tests/data; from memory, reproduced by the Annex D
# formulas)
_TABLE8 = read_table("iso6946_2017_table8_unventilated_air_layers")
ISO6946_TABLE8_THICKNESS_MM = [float(row["thickness_mm"]) for row in _TABLE8]
ISO6946_TABLE8_UNVENTILATED_AIR_LAYERS = {
    flow: [float(row[flow]) for row in _TABLE8] for flow in ("up", "horizontal", "down")}


@pytest.mark.parametrize("heat_flow", list(ISO6946_TABLE8_UNVENTILATED_AIR_LAYERS))
def test_table8_reproduced(heat_flow):
    d = np.array(ISO6946_TABLE8_THICKNESS_MM) / 1000.0
    calc = air_layer_resistance(d, heat_flow)
    expected = ISO6946_TABLE8_UNVENTILATED_AIR_LAYERS[heat_flow]
    np.testing.assert_allclose(calc, expected, atol=ATOL_TABLE_M2K_W)


def test_scalar_matches_array():
    assert air_layer_resistance(0.025, "down") == air_layer_resistance([0.025], "down")[0]


RTOL_SCALAR_VS_ARRAY = RTOL_ULP  # tests/tolerances.py


@pytest.mark.parametrize("heat_flow", ["up", "horizontal", "down"])
@pytest.mark.parametrize("emissivities", [(0.9, 0.9), (0.05, 0.9), (1.0, 0.2)])
@pytest.mark.parametrize("width", [None, 0.01, 0.5])
def test_scalar_fast_path_matches_array_path(heat_flow, emissivities, width):
    # both paths evaluate EN ISO 6946:2017 Annex D, eqs (D.1)-(D.5); this checks the plain-float
    # fast path against the numpy path over the whole thickness range of the method
    d = np.concatenate([[0.0, 1e-6], np.linspace(0.0, 0.3, 301)[1:], np.geomspace(1e-5, 0.3, 50)])
    for temp_mean in (10.0, -5.0):
        arr = air_layer_resistance(d, heat_flow, *emissivities, temp_mean=temp_mean, width=width)
        scalar = [air_layer_resistance(float(x), heat_flow, *emissivities, temp_mean=temp_mean,
                                       width=width) for x in d]
        assert all(type(s) is float for s in scalar)
        np.testing.assert_allclose(scalar, arr, rtol=RTOL_SCALAR_VS_ARRAY, atol=0.0)


@pytest.mark.parametrize("bad", [float("nan"), float("inf"), -0.001, 0.31])
def test_scalar_and_array_paths_reject_alike(bad):
    with pytest.raises(HeatLedgerError) as scalar:
        air_layer_resistance(bad, "up")
    with pytest.raises(HeatLedgerError) as array:
        air_layer_resistance(np.array([bad]), "up")
    assert str(scalar.value).split("; got")[0] == str(array.value).split("; got")[0]


def test_intermediate_thickness_close_to_linear_interpolation():
    # source: EN ISO 6946:2017 6.9.2 (from memory): intermediate thicknesses by linear
    # interpolation in Table 8; the formula agrees within the table precision.
    calc = air_layer_resistance(0.0375, "down")
    interp = np.interp(37.5, ISO6946_TABLE8_THICKNESS_MM, ISO6946_TABLE8_UNVENTILATED_AIR_LAYERS[
        "down"])
    assert calc == pytest.approx(interp, abs=ATOL_TABLE_INTERPOLATION)


def test_low_emissivity_face_raises_resistance():
    # source: EN ISO 6946:2017 Annex D (from memory): E = 1/(1/e1 + 1/e2 - 1)
    normal = air_layer_resistance(0.025, "horizontal")
    foil = air_layer_resistance(0.025, "horizontal", emissivity_1=0.05)
    assert foil > 2.5 * normal


def test_small_void_form_tends_to_wide_layer():
    wide = air_layer_resistance(0.02, "horizontal")
    assert air_layer_resistance(0.02, "horizontal", width=100.0) == pytest.approx(wide,
                                                                                  rel=RTOL_APPROXIMATION)


# source: EN ISO 6946:2017 6.9.2-6.9.4: 500 and 1500 mm2 thresholds (confirmed in a
# secondary source)
@pytest.mark.parametrize(("area", "cls"), [(0, "unventilated"), (500, "unventilated"),
                                           (501, "slightly"), (1499, "slightly"),
                                           (1500, "well"), (8000, "well")])
def test_ventilation_class_thresholds(area, cls):
    assert ventilation_class(area) == cls


@pytest.mark.parametrize("bad", [-0.01, 0.31, float("nan")])
def test_bad_thickness(bad):
    with pytest.raises(HeatLedgerError, match="air layer thickness"):
        air_layer_resistance(bad, "up")


def test_bad_emissivity():
    with pytest.raises(HeatLedgerError, match="emissivity_1 must be between"):
        air_layer_resistance(0.02, "up", emissivity_1=0.0)
