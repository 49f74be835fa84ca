"""Ground properties, surface resistances and shared input checks (EN ISO 13370).

References
----------
EN ISO 13370:2017, Table 7 (ground conductivity by category) [C];
clause 8 surface resistances (recalled).
"""

from __future__ import annotations

import numpy as np

from .. import _validate
from .._arrays import check_perimeter as _check_perimeter
from .._arrays import non_negative_array as _non_negative_array
from ..errors import HeatLedgerError

#: Soil types and their EN ISO 13370:2017 Table 7 category: (category, conductivity
#: [W/(m K)], volumetric heat capacity [J/(m3 K)]). Conductivities [C]; heat capacities (recalled).
SOIL_TYPES = {
    "clay": (1, 1.5, 3.0e6),
    "silt": (1, 1.5, 3.0e6),
    "sand": (2, 2.0, 2.0e6),
    "gravel": (2, 2.0, 2.0e6),
    "rock": (3, 3.5, 2.0e6),
}

#: Ground conductivity to use when the soil is unknown: category 2, sand or gravel
#: (EN ISO 13370:2017, 7.x, Table 7 [C]). Older UK guidance assumed clay (1.5) instead.
DEFAULT_SOIL_CONDUCTIVITY = 2.0

#: Internal surface resistance of a floor, heat flow downwards (EN ISO 13370, EN ISO 6946).
#: [m2 K/W]
RSI_FLOOR = 0.17
#: Internal surface resistance of a basement wall, heat flow horizontal (EN ISO 6946 Table 7
#: value used for basement walls in EN ISO 13370 (recalled)). [m2 K/W]
RSI_WALL = 0.13
#: External surface resistance used in the equivalent thickness (EN ISO 13370 (recalled)). [m2 K/W]
RSE_GROUND = 0.04

#: Wind shielding factor ``f_w`` of an underfloor space (EN ISO 13370:2017 8.3 (recalled)). [-]
WIND_SHIELDING_FACTORS = {"sheltered": 0.02, "average": 0.05, "exposed": 0.10}

#: How the exposed perimeter relates to the floor outline: ``"rectilinear"`` and ``"any"``
#: mean the whole outline is exposed (the perimeter is checked against the shortest outline
#: of that area); ``"partial"`` means party walls or unheated neighbours leave part of the
#: outline unexposed, and no bound is checked.
EXPOSED_OUTLINES = ("rectilinear", "any", "partial")

#: Largest floor height above outside ground covered by :func:`suspended_floor`. [m]
SUSPENDED_FLOOR_MAX_HEIGHT = 0.5


# ----------------------------------------------------------------------------- soil


def ground_conductivity(soil: str) -> float:
    """Thermal conductivity of the unfrozen ground by soil type, EN ISO 13370 Table 7.

    Parameters
    ----------
    soil : str
        ``"clay"`` or ``"silt"`` (category 1), ``"sand"`` or ``"gravel"`` (category 2),
        ``"rock"`` (category 3, homogeneous rock). [-]

    Returns
    -------
    float
        Conductivity ``lambda``: 1.5, 2.0 or 3.5. [W/(m K)]

    Raises
    ------
    HeatLedgerError
        For an unknown soil type; the message lists the known ones.

    Notes
    -----
    Use category 2 (:data:`DEFAULT_SOIL_CONDUCTIVITY`) when the soil is not known.

    References
    ----------
    EN ISO 13370:2017, Table 7 [C].
    [source: iso13370-slab, Table 7].

    Examples
    --------
    >>> ground_conductivity("clay")
    1.5
    """
    key = _validate.choice("soil", soil, tuple(SOIL_TYPES))
    return SOIL_TYPES[key][1]


def ground_heat_capacity(soil: str) -> float:
    """Volumetric heat capacity of the ground by soil type, EN ISO 13370 Table 7.

    Parameters
    ----------
    soil : str
        ``"clay"``, ``"silt"``, ``"sand"``, ``"gravel"`` or ``"rock"``. [-]

    Returns
    -------
    float
        ``rho c``: 3.0e6 (category 1) or 2.0e6 (categories 2 and 3). [J/(m3 K)]

    Raises
    ------
    HeatLedgerError
        For an unknown soil type.

    Notes
    -----
    Not used by the steady-state U-values; kept for the periodic method.

    References
    ----------
    EN ISO 13370:2017, Table 7 [M: recalled].
    [source: iso13370-slab, Table 7].
    """
    key = _validate.choice("soil", soil, tuple(SOIL_TYPES))
    return SOIL_TYPES[key][2]



def _area_perimeter(area, perimeter, outline: str):
    a = _non_negative_array("area", area, "m2")
    p = _non_negative_array("exposed_perimeter", perimeter, "m")
    if np.any(a <= 0.0):
        raise HeatLedgerError("area must be greater than zero; got 0 m2")
    if a.size:
        _validate.within("area", float(a.max()), "area")
    if np.any(p <= 0.0):
        raise HeatLedgerError(
            "exposed_perimeter must be greater than zero; got 0 m (a floor with no exposed "
            "edge is not a ground-floor heat loss of this method)"
        )
    if p.size:
        _validate.within("exposed_perimeter", float(p.min()), "perimeter")
        _validate.within("exposed_perimeter", float(p.max()), "perimeter")
    if outline != "partial":
        try:
            _check_perimeter("exposed_perimeter", p, "area", a, outline)
        except HeatLedgerError as exc:
            raise HeatLedgerError(
                f'{exc} (the whole outline was taken as exposed; give exposed_outline '
                '"partial" if party walls or unheated neighbours leave part of it unexposed)'
            ) from None
    return a, p



def _scalar_area_perimeter(area, perimeter, outline: str, method: str) -> tuple[float, float]:
    a, p = _area_perimeter(area, perimeter, outline)
    if a.ndim or p.ndim:
        raise HeatLedgerError(
            f"{method} takes one floor at a time: area and exposed_perimeter must be single "
            f"numbers; got arrays of shape {a.shape} and {p.shape}"
        )
    return float(a), float(p)
