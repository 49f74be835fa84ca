"""Surface humidity: the temperature factor a construction must reach to avoid mould growth
(or surface condensation) month by month, EN ISO 13788 clause 5.

    p_sat,min = p_i / phi_si,cr          (phi_si,cr = 0.8 for mould, 1.0 for condensation)
    theta_si,min = dew point of p_sat,min
    f_Rsi,min = (theta_si,min - theta_e) / (theta_i - theta_e)

The critical month is the month with the largest f_Rsi,min; the construction passes in a
month when its f_Rsi (inside surface resistance 0.25 m2 K/W) exceeds f_Rsi,min.

Sources: [source: iso13788-surface, clause 5]; [source: iso13788-saturation, Annex E].
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from .._validate import finite
from ..errors import HeatLedgerError
from .psychrometrics import MONTH_NAMES, dew_point, vapour_pressure

__all__ = ["surface_factor_required", "surface_factor_min", "surface_check", "SurfaceCheck",
           "CRITICAL_RH_MOULD", "CRITICAL_RH_CONDENSATION", "RESISTANCE_INSIDE_CHECK"]

#: Critical surface relative humidity for mould growth, and for surface condensation. [-]
CRITICAL_RH_MOULD = 0.8
CRITICAL_RH_CONDENSATION = 1.0
#: Inside surface resistance of the surface check for opaque elements. [m2 K/W]
RESISTANCE_INSIDE_CHECK = 0.25
#: Smallest inside-outside temperature difference for which f_Rsi,min is given: below it
#: the factor is ill-conditioned (it divides by the difference) and the month is not a
#: heating month; common practice, no published source. [K]
MIN_TEMPERATURE_DIFFERENCE = 1.0
#: Lowest critical surface relative humidity accepted (the standard uses 0.8 and 1.0;
#: common practice, no published source). [-]
MIN_CRITICAL_RH = 0.5


def _critical_rh(value) -> float:
    v = finite("rh_critical", value)
    if 1.0 < v <= 100.0:
        raise HeatLedgerError(f"rh_critical = {v:g} looks like a percentage: give it as a "
                              f"fraction ({v / 100.0:g})")
    if not MIN_CRITICAL_RH <= v <= 1.0:
        raise HeatLedgerError(f"rh_critical = {v:g}: the critical surface relative humidity "
                              f"must be from {MIN_CRITICAL_RH:g} to 1 (0.8 mould, 1.0 "
                              "condensation)")
    return v


def surface_factor_required(climate, *, rh_critical=CRITICAL_RH_MOULD) -> np.ndarray:
    """The minimum temperature factor ``f_Rsi,min`` of each month.

    Parameters
    ----------
    climate : MonthlyClimate
        Twelve monthly means, January first. [-]
    rh_critical : float
        Critical relative humidity at the surface: 0.8 (mould) or 1.0 (condensation). [-]

    Returns
    -------
    ndarray (12,)
        f_Rsi,min [-]; NaN in a month whose outside is not at least 1 K colder than the
        inside (the check does not apply).

    References
    ----------
    [source: iso13788-surface, 5.2 and 5.3 (f_Rsi,min, critical month)].
    """
    return surface_factor_min(climate.temp_inside, climate.temp_outside, climate.rh_inside,
                              rh_critical=rh_critical)


def surface_factor_min(temp_inside, temp_outside, rh_inside, *,
                       rh_critical=CRITICAL_RH_MOULD):
    """``f_Rsi,min = (theta_si,min - theta_e)/(theta_i - theta_e)`` with ``theta_si,min`` the
    dew point of ``phi_i p_sat(theta_i) / phi_si,cr``, for one month or arrays of months.

    Parameters
    ----------
    temp_inside : float or array_like
        Inside temperature. [degC]
    temp_outside : float or array_like
        Monthly mean outside temperature. [degC]
    rh_inside : float or array_like
        Inside relative humidity as a fraction 0..1. [-]
    rh_critical : float
        0.8 (mould) or 1.0 (surface condensation). [-]

    Returns
    -------
    float or ndarray
        f_Rsi,min [-]; NaN where the outside is not at least
        :data:`MIN_TEMPERATURE_DIFFERENCE` colder than the inside (the check does not
        apply).

    References
    ----------
    [source: iso13788-surface, 5.2]; [source: iso13788-saturation, Annex E].
    """
    phi = _critical_rh(rh_critical)
    t_e = np.asarray(temp_outside, dtype=float)
    t_i = np.asarray(temp_inside, dtype=float)
    if np.any(np.asarray(rh_inside, dtype=float) <= 0.0):
        raise HeatLedgerError("rh_inside must be above 0 for the surface check: perfectly dry "
                              "air has no dew point")
    t_min = dew_point(vapour_pressure(t_i, rh_inside) / phi)
    diff = t_i - t_e
    applies = diff >= MIN_TEMPERATURE_DIFFERENCE
    f = np.where(applies, (t_min - t_e) / np.where(applies, diff, 1.0), np.nan)
    return float(f) if f.ndim == 0 else f


@dataclass(frozen=True, eq=False)
class SurfaceCheck:
    """The surface check of one construction (or junction) in one climate.

    Attributes
    ----------
    required : ndarray (12,)
        f_Rsi,min per month (NaN where the check does not apply). [-]
    surface_factor : float
        f_Rsi of the construction. [-]
    critical_month : int or None
        Month of the largest f_Rsi,min (0 = January). [-]
    passes : ndarray (12,) of bool
        f_Rsi > f_Rsi,min (True where the check does not apply). [-]
    temp_surface_min, temp_surface : ndarray (12,)
        Lowest acceptable inside surface temperature and the construction's. [degC]
    rh_critical, resistance_inside : float
        Settings of the check. [-], [m2 K/W]

    References
    ----------
    [source: iso13788-surface, 5.2 and 5.3].
    """

    required: np.ndarray
    surface_factor: float
    critical_month: int | None
    passes: np.ndarray
    temp_surface_min: np.ndarray
    temp_surface: np.ndarray
    rh_critical: float
    resistance_inside: float

    @property
    def ok(self) -> bool:
        """True when every month passes. [-]"""
        return bool(np.all(self.passes))

    @property
    def verdict(self) -> str:
        """One line for reports. [-]"""
        what = "mould" if self.rh_critical < 1.0 else "surface condensation"
        if self.critical_month is None:
            return "the outside is never colder than the inside: no surface check applies"
        f_max = self.required[self.critical_month]
        word = "passes" if self.ok else "FAILS"
        return (f"{what} check {word}: f_Rsi {self.surface_factor:.3f} against f_Rsi,min "
                f"{f_max:.3f} in {MONTH_NAMES[self.critical_month]} (critical month)")


def surface_check(construction, climate, *, rh_critical=CRITICAL_RH_MOULD,
                  resistance_inside=RESISTANCE_INSIDE_CHECK, surface_factor=None):
    """Month-by-month surface check of a construction (or of a junction's f_Rsi).

    Parameters
    ----------
    construction : heatledger.Construction or None
        The plane construction; its ``surface_factor(resistance_inside)`` is used unless
        ``surface_factor`` is given. [-]
    climate : MonthlyClimate
        Twelve monthly means, January first. [-]
    rh_critical : float
        0.8 (mould) or 1.0 (surface condensation). [-]
    resistance_inside : float
        Inside surface resistance of the check. [m2 K/W]
    surface_factor : float, optional
        f_Rsi of a junction (from a 2-D calculation) instead of the construction's. [-]

    Returns
    -------
    SurfaceCheck

    References
    ----------
    [source: iso13788-surface, 5.2 and 5.3].
    """
    required = surface_factor_required(climate, rh_critical=rh_critical)
    if surface_factor is None:
        f = construction.surface_factor(resistance_inside)
    else:
        f = finite("surface_factor", surface_factor)
    valid = ~np.isnan(required)
    critical = int(np.nanargmax(required)) if valid.any() else None
    t_i, t_e = climate.temp_inside, climate.temp_outside
    with np.errstate(invalid="ignore"):
        passes = np.where(valid, f > required, True)
    return SurfaceCheck(
        required=required, surface_factor=float(f), critical_month=critical,
        passes=passes, temp_surface_min=t_e + required * (t_i - t_e),
        temp_surface=t_e + f * (t_i - t_e), rh_critical=_critical_rh(rh_critical),
        resistance_inside=float(resistance_inside))
