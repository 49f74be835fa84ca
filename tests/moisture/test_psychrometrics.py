"""Saturation pressure, dew point and the humidity classes against EN ISO 13788 and an
independent psychrometric library."""

from __future__ import annotations

import math

import numpy as np
import psychrolib
import pytest

from heatledger import MonthlyClimate, dew_point, saturation_pressure
from heatledger.errors import HeatLedgerError
from heatledger.moisture import vapour_density_excess
from tests.tolerances import (
    ATOL_PRINTED_PA,
    RTOL_LAST_BITS,
    RTOL_ROUND_OFF,
    RTOL_SATURATION_CORRELATIONS,
)

psychrolib.SetUnitSystem(psychrolib.SI)


@pytest.mark.parametrize(("temp", "printed"), [(-10.0, 259.3), (0.0, 610.5), (10.0, 1227.3),
                                                (20.0, 2337.0)])
def test_saturation_pressure_check_values(temp, printed):
    # EN ISO 13788:2012 Annex E: check values of the two equations (recalled, from memory;
    # each agrees with the equation written out below to 0.05 Pa)
    assert saturation_pressure(temp) == pytest.approx(printed, abs=ATOL_PRINTED_PA)


@pytest.mark.parametrize("temp", [-25.0, -3.2, -0.001, 0.0, 0.001, 7.7, 23.0, 41.0])
def test_saturation_pressure_is_the_standards_equation(temp):
    # EN ISO 13788 Annex E, eqs. (E.7) over water and (E.8) over ice, written out here
    if temp >= 0.0:
        expected = 610.5 * math.exp(17.269 * temp / (237.3 + temp))
    else:
        expected = 610.5 * math.exp(21.875 * temp / (265.5 + temp))
    assert saturation_pressure(temp) == pytest.approx(expected, rel=RTOL_LAST_BITS)


def test_saturation_pressure_against_hyland_wexler():
    # ASHRAE Handbook Fundamentals (2017) ch. 1, eqs. 5 and 6 (Hyland and Wexler) as coded in
    # psychrolib: another correlation, so agreement within RTOL_SATURATION_CORRELATIONS only
    for (lo, hi), rtol in RTOL_SATURATION_CORRELATIONS.items():
        for t in np.linspace(lo, hi, 31):
            ref = psychrolib.GetSatVapPres(float(t))
            assert saturation_pressure(t) == pytest.approx(ref, rel=rtol), t


def test_saturation_pressure_arrays_and_scalars():
    temps = np.array([[-5.0, 0.0], [12.5, 30.0]])
    got = saturation_pressure(temps)
    assert got.shape == (2, 2)
    for t, p in zip(temps.ravel(), got.ravel(), strict=True):
        assert p == saturation_pressure(float(t))
    assert isinstance(saturation_pressure(3.0), float)


@pytest.mark.parametrize("temp", [-30.0, -12.0, -0.5, 0.0, 0.5, 9.0, 18.0, 35.0])
def test_dew_point_inverts_saturation_pressure(temp):
    # the inversion of EN ISO 13788 Annex E on both branches
    assert dew_point(saturation_pressure(temp)) == pytest.approx(temp, rel=RTOL_ROUND_OFF,
                                                                 abs=1e-12)


def test_saturation_pressure_bad_input():
    with pytest.raises(HeatLedgerError, match="between -100 and 100"):
        saturation_pressure(150.0)
    with pytest.raises(HeatLedgerError, match="above 0 Pa"):
        dew_point(0.0)


def test_humidity_class_excess_by_hand():
    # EN ISO 13788 Annex A (recalled, from memory): class 3 has Delta nu = 0.006 kg/m3 at
    # 0 degC and below, falling linearly to 0 at 20 degC; p_i = p_e + 1.10 Delta p with
    # Delta p = Delta nu R_v (T_i + T_e)/2
    te = [-5.0, 0.0, 5.0, 10.0, 15.0, 20.0, 25.0, 10.0, 5.0, 0.0, -5.0, -10.0]
    rhe = [0.85] * 12
    c = MonthlyClimate.from_humidity_class(te, rhe, 3, temp_inside=20.0)
    for m in (0, 3, 7, 11):
        dnu = 0.006 * min(max((20.0 - te[m]) / 20.0, 0.0), 1.0)
        dp = dnu * 461.5 * ((20.0 + 273.15) + (te[m] + 273.15)) / 2.0
        p_e = rhe[m] * saturation_pressure(te[m])
        expected_rh = (p_e + 1.10 * dp) / saturation_pressure(20.0)
        assert c.rh_inside[m] == pytest.approx(expected_rh, rel=RTOL_ROUND_OFF)
    assert c.humidity_class == 3
    assert vapour_density_excess(5, -20.0) == pytest.approx(0.010)
    assert vapour_density_excess(1, 30.0) == 0.0


def test_climate_bad_input():
    te, rh = [0.0] * 12, [0.8] * 12
    with pytest.raises(HeatLedgerError, match="looks like a percentage.*0.8 for 80"):
        MonthlyClimate(te, [80.0] * 12, 20.0, 0.5)
    with pytest.raises(HeatLedgerError, match="fraction from 0 to 1"):
        MonthlyClimate(te, rh, 20.0, -0.1)
    with pytest.raises(HeatLedgerError, match="12 monthly values.*got 11"):
        MonthlyClimate(te[:11], rh, 20.0, 0.5)
    with pytest.raises(HeatLedgerError, match="classes of EN ISO 13788 Annex A are 1, 2"):
        MonthlyClimate.from_humidity_class(te, rh, 6)
    with pytest.raises(HeatLedgerError, match="classes"):
        MonthlyClimate.from_humidity_class(te, rh, 2.5)


def test_class_five_in_a_humid_cold_climate_caps_inside_humidity():
    c = MonthlyClimate.from_humidity_class([-10.0] * 12, [1.0] * 12, 5, temp_inside=12.0)
    assert np.all(c.rh_inside <= 1.0)
    assert c.warnings and "capped" in c.warnings[0]
