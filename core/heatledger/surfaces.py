"""Surface resistances of building elements (EN ISO 6946:2017, 6.8 and Annex C).

Conventional values (Table 7) are used for plane surfaces with emissivity 0.9 and no special
exposure; the Annex C calculation covers low-emissivity surfaces, other mean temperatures and
other wind speeds.

References
----------
EN ISO 6946:2017, *Building components and building elements - Thermal resistance and thermal
transmittance - Calculation methods*, 6.8 and Table 7; Annex C, eqs (C.1)-(C.4).
(In the 2007 edition the same content is 5.2, Table 1 and Annex A.)

Sources: [source: iso6946-surfaces, 6.8, Table 7, Annex C].
"""

from __future__ import annotations

from ._constants import STEFAN_BOLTZMANN as Stefan_Boltzmann
from ._constants import ZERO_CELSIUS as zero_Celsius
from ._validate import choice, fraction, non_negative, within

__all__ = [
    "HEAT_FLOWS",
    "SIDES",
    "surface_resistance",
    "surface_resistance_calc",
    "radiative_coefficient_black_body",
]

HEAT_FLOWS = ("up", "horizontal", "down")
SIDES = ("inside", "outside")

# source: EN ISO 6946:2017, Table 7 (m2 K/W); 0.13/0.04 read, 0.10/0.17 recalled and
# reproduced by Annex C (see tests).
_RSI = {"up": 0.10, "horizontal": 0.13, "down": 0.17}
_RSE = 0.04
_SIDE_SET = frozenset(SIDES)
# source: EN ISO 6946:2017, Annex C: internal convective coefficients hci (W/(m2 K)) [recalled]
_HCI = {"up": 5.0, "horizontal": 2.5, "down": 0.7}


def surface_resistance(side: str, heat_flow: str) -> float:
    """Conventional surface resistance of a plane surface.

    Parameters
    ----------
    side : str
        ``"inside"`` (Rsi) or ``"outside"`` (Rse). [-]
    heat_flow : str
        Direction of heat flow: ``"up"``, ``"horizontal"`` (within +/-30 degrees of the
        horizontal plane) or ``"down"``. [-]

    Returns
    -------
    float
        Surface resistance. [m2 K/W]

    Raises
    ------
    HeatLedgerError
        If ``side`` or ``heat_flow`` is not one of the listed choices.

    Notes
    -----
    Rsi = 0.10 (up), 0.13 (horizontal), 0.17 (down); Rse = 0.04 in every direction.

    References
    ----------
    EN ISO 6946:2017, 6.8, Table 7.
    [source: iso6946-surfaces, 6.8, Table 7].

    Examples
    --------
    >>> surface_resistance("inside", "horizontal")
    0.13
    """
    if type(heat_flow) is str and heat_flow in _RSI and side in _SIDE_SET:
        return _RSI[heat_flow] if side == "inside" else _RSE  # written as the engine writes
    side = choice("side", side, SIDES)
    heat_flow = choice("heat_flow", heat_flow, HEAT_FLOWS)
    return _RSI[heat_flow] if side == "inside" else _RSE


def surface_resistance_calc(
    side: str,
    heat_flow: str,
    *,
    emissivity: float = 0.9,
    temp_mean: float | None = None,
    wind_speed: float = 4.0,
) -> float:
    """Surface resistance from convective and radiative coefficients.

    Parameters
    ----------
    side : str
        ``"inside"`` or ``"outside"``. [-]
    heat_flow : str
        ``"up"``, ``"horizontal"`` or ``"down"``. [-]
    emissivity : float
        Hemispherical emissivity of the surface. [-]
    temp_mean : float, optional
        Mean of the surface and its surroundings' temperature; default 20 degC inside and
        0 degC outside. [degC]
    wind_speed : float
        Wind speed adjacent to the surface (outside only). [m/s]

    Returns
    -------
    float
        Surface resistance ``Rs = 1/(hc + hr)``. [m2 K/W]

    Notes
    -----
    ``hr = emissivity * hr0`` with ``hr0 = 4 sigma T_m^3`` (T_m in K); inside
    ``hc = hci`` = 5.0 (up), 2.5 (horizontal), 0.7 (down) W/(m2 K); outside
    ``hc = 4 + 4 v``.

    References
    ----------
    EN ISO 6946:2017, Annex C, eqs (C.1)-(C.4) (recalled; the Table 7 values are reproduced,
    see the tests).
    [source: iso6946-surfaces, Annex C].

    Examples
    --------
    >>> round(surface_resistance_calc("outside", "horizontal"), 3)
    0.041
    """
    side = choice("side", side, SIDES)
    heat_flow = choice("heat_flow", heat_flow, HEAT_FLOWS)
    eps = fraction("emissivity", emissivity)
    default_t = 20.0 if side == "inside" else 0.0
    t_m = default_t if temp_mean is None else within("temp_mean", temp_mean, "temperature")
    h_r = eps * radiative_coefficient_black_body(t_m)
    if side == "inside":
        h_c = _HCI[heat_flow]
    else:
        h_c = 4.0 + 4.0 * non_negative("wind_speed", wind_speed, "m/s")
    return 1.0 / (h_c + h_r)


def radiative_coefficient_black_body(temp_mean: float) -> float:
    """Radiative coefficient of a black-body surface, ``hr0 = 4 sigma T_m^3``.

    Parameters
    ----------
    temp_mean : float
        Mean thermodynamic temperature of the surface and its surroundings. [degC]

    Returns
    -------
    float
        hr0. [W/(m2 K)]

    References
    ----------
    EN ISO 6946:2017, Annex C, eq. (C.3).
    [source: iso6946-surfaces, Annex C].

    Examples
    --------
    >>> round(radiative_coefficient_black_body(10.0), 2)
    5.15
    """
    t_k = within("temp_mean", temp_mean, "temperature") + zero_Celsius
    return 4.0 * Stefan_Boltzmann * t_k**3
