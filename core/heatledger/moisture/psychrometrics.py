"""Water vapour in air for the moisture checks: saturation pressure, its inverse (the dew
point), vapour pressure, and the constants of EN ISO 13788.

Saturation pressure by the standard's Annex E equations (Magnus form, over water at and
above 0 degC, over ice below):

    p_sat = 610.5 exp(17.269 theta / (237.3 + theta))    theta >= 0 degC
    p_sat = 610.5 exp(21.875 theta / (265.5 + theta))    theta <  0 degC

Sources: [source: iso13788-saturation, Annex E]; [source: iso13788-glaser, 6.2 (delta_0)].
"""

from __future__ import annotations

import math

import numpy as np

from .._validate import finite
from ..errors import HeatLedgerError

__all__ = ["saturation_pressure", "dew_point", "vapour_pressure", "SATURATION_PRESSURE_0C",
           "WATER_VAPOUR_GAS_CONSTANT", "VAPOUR_PERMEABILITY_AIR", "MONTH_NAMES",
           "MONTH_DAYS", "SECONDS_PER_DAY"]

#: Saturation pressure at 0 degC in the standard's equations. [Pa]
SATURATION_PRESSURE_0C = 610.5
#: Magnus coefficients (a, b [degC]) over water (theta >= 0) and over ice (theta < 0).
_WATER = (17.269, 237.3)
_ICE = (21.875, 265.5)
#: Gas constant of water vapour R_v. [J/(kg K)]
WATER_VAPOUR_GAS_CONSTANT = 461.5
#: Water-vapour permeability of still air delta_0 as EN ISO 13788 takes it. [kg/(m s Pa)]
VAPOUR_PERMEABILITY_AIR = 2.0e-10
#: Months, January first, and their lengths in a year that is not a leap year. [-], [day]
MONTH_NAMES = ("Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov",
               "Dec")
MONTH_DAYS = (31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31)
SECONDS_PER_DAY = 86400.0
#: Temperatures the equations are used for: the standard's range of building climates
#: with a wide margin. [degC]
_TEMP_RANGE = (-100.0, 100.0)


def saturation_pressure(temp):
    """Saturation water-vapour pressure over water (temp >= 0) or ice (temp < 0).

    ``p_sat = 610.5 exp(a theta / (b + theta))`` with ``(a, b) = (17.269, 237.3 degC)`` over
    water and ``(21.875, 265.5 degC)`` over ice.

    Parameters
    ----------
    temp : float or array_like
        Temperature theta. [degC]

    Returns
    -------
    float or ndarray
        Saturation pressure, the shape of ``temp``. [Pa]

    Raises
    ------
    HeatLedgerError
        If a temperature is not a finite number between -100 and 100 degC.

    References
    ----------
    [source: iso13788-saturation, Annex E, eqs. (E.7) and (E.8)].
    """
    t = np.asarray(temp, dtype=float)
    lo, hi = _TEMP_RANGE
    if not np.all(np.isfinite(t)) or np.any((t < lo) | (t > hi)):
        bad = t[~np.isfinite(t) | (t < lo) | (t > hi)].ravel()[0]
        raise HeatLedgerError(f"temperature {bad:g} degC: the saturation pressure is computed "
                              f"for temperatures between {lo:g} and {hi:g} degC")
    water = t >= 0.0
    a = np.where(water, _WATER[0], _ICE[0])
    b = np.where(water, _WATER[1], _ICE[1])
    p = SATURATION_PRESSURE_0C * np.exp(a * t / (b + t))
    return float(p) if p.ndim == 0 else p


def dew_point(pressure):
    """Temperature at which ``pressure`` is the saturation pressure (the inverse of
    :func:`saturation_pressure`; over ice below 610.5 Pa).

    ``theta = b ln(p/610.5) / (a - ln(p/610.5))`` with the coefficients of the branch.

    Parameters
    ----------
    pressure : float or array_like
        Water-vapour pressure, greater than 0. [Pa]

    Returns
    -------
    float or ndarray
        Dew-point (or frost-point) temperature. [degC]

    References
    ----------
    [source: iso13788-saturation, Annex E (inverted)].
    """
    p = np.asarray(pressure, dtype=float)
    if not np.all(np.isfinite(p)) or np.any(p <= 0.0):
        raise HeatLedgerError("a vapour pressure must be a finite number above 0 Pa to have a "
                              "dew point")
    x = np.log(p / SATURATION_PRESSURE_0C)
    water = x >= 0.0
    a = np.where(water, _WATER[0], _ICE[0])
    b = np.where(water, _WATER[1], _ICE[1])
    t = b * x / (a - x)
    return float(t) if t.ndim == 0 else t


def vapour_pressure(temp, relative_humidity):
    """Water-vapour pressure ``p = phi p_sat(theta)``.

    Parameters
    ----------
    temp : float or array_like
        Air temperature. [degC]
    relative_humidity : float or array_like
        Relative humidity phi as a fraction. [-]

    Returns
    -------
    float or ndarray
        Vapour pressure. [Pa]

    References
    ----------
    [source: iso13788-saturation, Annex E].
    """
    rh = np.asarray(relative_humidity, dtype=float)
    p = rh * saturation_pressure(temp)
    return float(p) if np.ndim(p) == 0 else p


def month_seconds(month: int) -> float:
    """Length of ``month`` (0 = January) in seconds, in a year that is not a leap year.

    Parameters
    ----------
    month : int
        Month index 0..11. [-]

    References
    ----------
    [source: iso13788-glaser, 6.3 (monthly amounts)].
    """
    return MONTH_DAYS[int(month)] * SECONDS_PER_DAY


def check_month(name: str, month) -> int:
    """``month`` as a whole number 0..11 (January = 0), or an error naming ``name``.

    Parameters
    ----------
    name : str
        The input's name for the message. [-]
    month : object
        A month index. [-]
    """
    value = finite(name, month)
    if value != math.floor(value) or not 0 <= value <= 11:
        raise HeatLedgerError(f"{name} must be a month 0 (January) to 11 (December); "
                              f"got {month!r}")
    return int(value)
