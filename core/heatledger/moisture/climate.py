"""A year of monthly climate for the moisture checks, given directly or from the internal
humidity classes of EN ISO 13788 Annex A.

Sources: [source: iso13788-classes, Annex A]; [source: iso13788-saturation, Annex E].
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from .._validate import finite, within
from ..errors import HeatLedgerError
from .psychrometrics import WATER_VAPOUR_GAS_CONSTANT, saturation_pressure

__all__ = ["MonthlyClimate", "HUMIDITY_CLASSES", "HUMIDITY_CLASS_USES",
           "HUMIDITY_CLASS_MARGIN", "vapour_density_excess"]

#: Internal vapour-density excess Delta nu at outside temperatures of 0 degC and below,
#: by internal humidity class 1..5; it falls linearly to 0 at 20 degC. [kg/m3]
HUMIDITY_CLASSES = {1: 0.002, 2: 0.004, 3: 0.006, 4: 0.008, 5: 0.010}
#: What each class stands for (short, for drop-downs and the cover). [-]
HUMIDITY_CLASS_USES = {
    1: "storage areas",
    2: "offices, shops",
    3: "dwellings with low occupancy",
    4: "dwellings with high occupancy, sports halls, kitchens, canteens",
    5: "special buildings: laundries, breweries, swimming pools",
}
#: Safety margin on the vapour-pressure excess of a humidity class. [-]
HUMIDITY_CLASS_MARGIN = 1.10
#: Outside temperatures where the class excess is full and where it has fallen to 0. [degC]
_FULL_EXCESS_BELOW, _NO_EXCESS_ABOVE = 0.0, 20.0
_KELVIN = 273.15


def _twelve(name: str, values, kind: str) -> np.ndarray:
    """12 monthly values (one number stands for every month)."""
    if np.ndim(values) == 0:
        values = [values] * 12
    try:
        items = list(values)
    except TypeError:
        raise HeatLedgerError(f"{name} must be 12 monthly values, January first") from None
    if len(items) != 12:
        raise HeatLedgerError(f"{name} must be 12 monthly values, January first; got "
                              f"{len(items)}")
    out = np.empty(12)
    for i, v in enumerate(items):
        label = f"{name}[{i + 1}]"
        out[i] = within(label, v, "temperature") if kind == "temperature" else _rh(label, v)
    return out


def _rh(name: str, value) -> float:
    """A relative humidity as a fraction 0..1, naming a likely percentage as such."""
    v = finite(name, value)
    if 1.0 < v <= 100.0:
        raise HeatLedgerError(f"{name} = {v:g} looks like a percentage: give relative humidity "
                              f"as a fraction 0 to 1 ({v / 100.0:g} for {v:g} %)")
    if not 0.0 <= v <= 1.0:
        raise HeatLedgerError(f"{name} = {v:g}: relative humidity must be a fraction from 0 "
                              "to 1")
    return v


def vapour_density_excess(humidity_class, temp_outside):
    """Internal vapour-density excess ``Delta nu`` of a humidity class at the outside
    temperatures: the class value at 0 degC and below, falling linearly to 0 at 20 degC.

    Parameters
    ----------
    humidity_class : int
        Internal humidity class 1 to 5. [-]
    temp_outside : float or array_like
        Monthly mean outside temperature. [degC]

    Returns
    -------
    ndarray
        ``Delta nu = nu_i - nu_e``. [kg/m3]

    References
    ----------
    [source: iso13788-classes, Annex A, Table A.1 and Figure A.1].
    """
    full = HUMIDITY_CLASSES[_humidity_class(humidity_class)]
    t = np.asarray(temp_outside, dtype=float)
    share = np.clip((_NO_EXCESS_ABOVE - t) / (_NO_EXCESS_ABOVE - _FULL_EXCESS_BELOW), 0.0, 1.0)
    return full * share


def _humidity_class(value) -> int:
    v = finite("humidity_class", value)
    if v != int(v) or int(v) not in HUMIDITY_CLASSES:
        raise HeatLedgerError(f"humidity_class = {value!r}: the internal humidity classes of "
                              "EN ISO 13788 Annex A are 1, 2, 3, 4 and 5")
    return int(v)


@dataclass(frozen=True, eq=False)
class MonthlyClimate:
    """Twelve monthly means of the outside and inside air, January first.

    Parameters
    ----------
    temp_outside : sequence of 12 float
        Outside air temperature, January first. [degC]
    rh_outside : sequence of 12 float
        Outside relative humidity as a fraction 0..1. [-]
    temp_inside : sequence of 12 float, or one float for every month
        Inside air temperature. [degC]
    rh_inside : sequence of 12 float, or one float for every month
        Inside relative humidity as a fraction 0..1. [-]
    name : str
        Label. [-]
    humidity_class : int, optional
        The internal humidity class the inside humidity came from (set by
        :meth:`from_humidity_class`). [-]
    vapour_pressure_excess : ndarray, optional
        The class's vapour-pressure excess ``Delta p`` per month, before the 1.10 margin. [Pa]
    warnings : tuple of str
        What was adjusted (an inside humidity capped at saturation). [-]

    Raises
    ------
    HeatLedgerError
        If a series does not have 12 values, a temperature is outside the physical limits or
        a relative humidity lies outside 0..1 (a value such as 80 is named as a percentage).

    Notes
    -----
    Vapour pressures ``p = phi p_sat(theta)`` (EN ISO 13788 Annex E). A climate from
    :meth:`from_humidity_class` also carries the class and the vapour-pressure excess.

    References
    ----------
    [source: iso13788-saturation, Annex E]; [source: iso13788-classes, Annex A].
    """

    temp_outside: np.ndarray
    rh_outside: np.ndarray
    temp_inside: np.ndarray
    rh_inside: np.ndarray
    name: str = ""
    humidity_class: int | None = None
    vapour_pressure_excess: np.ndarray | None = None
    warnings: tuple = field(default=(), compare=False)

    def __post_init__(self) -> None:
        for key, kind in (("temp_outside", "temperature"), ("rh_outside", "rh"),
                          ("temp_inside", "temperature"), ("rh_inside", "rh")):
            arr = _twelve(key, getattr(self, key), kind)
            arr.flags.writeable = False
            object.__setattr__(self, key, arr)

    @classmethod
    def from_humidity_class(cls, temp_outside, rh_outside, humidity_class,
                            temp_inside=20.0, *, name: str = "") -> MonthlyClimate:
        """Inside humidity from an internal humidity class of EN ISO 13788 Annex A.

        ``p_i = p_e + 1.10 Delta p`` with ``Delta p = Delta nu R_v (T_i + T_e)/2`` (T in
        kelvin); the inside relative humidity is ``p_i / p_sat(theta_i)``, capped at 1 with a
        warning.

        Parameters
        ----------
        temp_outside : sequence of 12 float
            Outside air temperature, January first. [degC]
        rh_outside : sequence of 12 float
            Outside relative humidity as a fraction 0..1. [-]
        humidity_class : int
            Internal humidity class 1 (storage) to 5 (special buildings). [-]
        temp_inside : float or sequence of 12 float
            Inside air temperature. [degC]
        name : str
            Label. [-]

        Returns
        -------
        MonthlyClimate

        References
        ----------
        [source: iso13788-classes, Annex A (classes, the 1.10 margin)].
        """
        t_e = _twelve("temp_outside", temp_outside, "temperature")
        rh_e = _twelve("rh_outside", rh_outside, "rh")
        t_i = _twelve("temp_inside", temp_inside, "temperature")
        cls_no = _humidity_class(humidity_class)
        excess = (vapour_density_excess(cls_no, t_e) * WATER_VAPOUR_GAS_CONSTANT
                  * ((t_i + _KELVIN) + (t_e + _KELVIN)) / 2.0)
        p_i = rh_e * saturation_pressure(t_e) + HUMIDITY_CLASS_MARGIN * excess
        rh_i = p_i / saturation_pressure(t_i)
        warnings = ()
        if np.any(rh_i > 1.0):
            months = ", ".join(str(i + 1) for i in np.flatnonzero(rh_i > 1.0))
            warnings = (f"humidity class {cls_no}: the inside vapour pressure would exceed "
                        f"saturation in month(s) {months}; inside relative humidity capped "
                        "at 1.0",)
            rh_i = np.minimum(rh_i, 1.0)
        return cls(t_e, rh_e, t_i, rh_i, name=name, humidity_class=cls_no,
                   vapour_pressure_excess=excess, warnings=warnings)

    @property
    def vapour_pressure_outside(self) -> np.ndarray:
        """``p_e = phi_e p_sat(theta_e)`` for each month. [Pa]"""
        return self.rh_outside * saturation_pressure(self.temp_outside)

    @property
    def vapour_pressure_inside(self) -> np.ndarray:
        """``p_i = phi_i p_sat(theta_i)`` for each month. [Pa]"""
        return self.rh_inside * saturation_pressure(self.temp_inside)
