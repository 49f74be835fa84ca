"""Surface humidity (EN ISO 13788 clause 5): f_Rsi,min by hand and f_Rsi of a plane
construction by hand."""

from __future__ import annotations

import math

import numpy as np
import pytest

from heatledger import (
    Construction,
    Layer,
    MonthlyClimate,
    saturation_pressure,
    surface_check,
    surface_factor_required,
)
from heatledger.errors import HeatLedgerError
from tests.tolerances import RTOL_ROUND_OFF

TE = [-2.0, -1.0, 3.0, 7.0, 11.0, 14.0, 16.0, 16.0, 13.0, 9.0, 4.0, 0.0]
RHE = [0.9, 0.88, 0.82, 0.78, 0.75, 0.75, 0.76, 0.78, 0.82, 0.86, 0.9, 0.91]


def _by_hand(te, ti, rhi, critical):
    # EN ISO 13788, 5.2 (recalled): p_sat,min = p_i / phi_cr; theta_si,min from Annex E
    # inverted (237.3 and 17.269 above 610.5 Pa); f = (theta_si,min - theta_e)/(theta_i - theta_e)
    p_min = rhi * 610.5 * math.exp(17.269 * ti / (237.3 + ti)) / critical
    x = math.log(p_min / 610.5)
    t_min = (237.3 * x / (17.269 - x)) if x >= 0 else (265.5 * x / (21.875 - x))
    return (t_min - te) / (ti - te)


@pytest.mark.parametrize("critical", [0.8, 1.0])
def test_required_factor_by_hand(critical):
    clim = MonthlyClimate(TE, RHE, 20.0, 0.6)
    got = surface_factor_required(clim, rh_critical=critical)
    for m in range(12):
        assert got[m] == pytest.approx(_by_hand(TE[m], 20.0, 0.6, critical),
                                       rel=RTOL_ROUND_OFF)
    # the critical month has the largest requirement
    check = surface_check(Construction([Layer(0.2, 1.0)]), clim, rh_critical=critical)
    assert check.critical_month == int(np.argmax(got))


def test_construction_factor_by_hand():
    # f_Rsi = (R_T - 0.25)/R_T with R_T = 0.25 + sum d/lambda + Rse (EN ISO 13788, 5.2, and
    # EN ISO 6946 Table 7 for Rse = 0.04)
    wall = Construction([Layer(0.2, 0.9), Layer(0.06, 0.04)])
    r_t = 0.25 + 0.2 / 0.9 + 0.06 / 0.04 + 0.04
    assert wall.surface_factor() == pytest.approx((r_t - 0.25) / r_t, rel=RTOL_ROUND_OFF)
    assert wall.surface_factor(0.13) == pytest.approx(1 - 0.13 / (r_t - 0.12),
                                                      rel=RTOL_ROUND_OFF)
    # not 1 - U Rsi with the U-value's own Rsi
    assert wall.surface_factor() != pytest.approx(1 - wall.u_value * 0.25)


def test_poor_wall_fails_and_good_wall_passes():
    clim = MonthlyClimate.from_humidity_class(TE, RHE, 4)
    solid = surface_check(Construction([Layer(0.1, 1.7, name="concrete")]), clim)
    insulated = surface_check(Construction([Layer(0.1, 1.7), Layer(0.15, 0.035)]), clim)
    assert not solid.ok and "FAILS" in solid.verdict
    assert insulated.ok and "passes" in insulated.verdict
    m = solid.critical_month
    # surface temperature from the factor: theta_si = theta_e + f (theta_i - theta_e)
    t = TE[m] + solid.surface_factor * (20.0 - TE[m])
    assert solid.temp_surface[m] == pytest.approx(t, rel=RTOL_ROUND_OFF)
    assert saturation_pressure(solid.temp_surface_min[m]) == pytest.approx(
        clim.vapour_pressure_inside[m] / 0.8, rel=1e-9)


def test_warm_months_do_not_apply():
    te = list(TE)
    te[6] = 22.0
    req = surface_factor_required(MonthlyClimate(te, RHE, 20.0, 0.5))
    assert math.isnan(req[6])
    assert not np.isnan(req[0])


def test_bad_critical_rh():
    clim = MonthlyClimate(TE, RHE, 20.0, 0.5)
    with pytest.raises(HeatLedgerError, match="looks like a percentage"):
        surface_factor_required(clim, rh_critical=80)
    with pytest.raises(HeatLedgerError, match="must be from 0.5 to 1"):
        surface_factor_required(clim, rh_critical=0.0)
