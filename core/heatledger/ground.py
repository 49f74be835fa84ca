"""Heat transfer via the ground (EN ISO 13370): steady-state U-values of ground floors.

Covers slab-on-ground floors (both regimes of the standard, with horizontal or vertical edge
insulation), suspended floors over a ventilated underfloor space, and heated basements (floor,
walls and the combined U-value). Every function returns a result object holding every
intermediate value (characteristic dimension ``B'``, equivalent thicknesses, the regime that
applied) so that the audit workbook can show each step; the ``*_u`` functions return the
U-value alone.

The U-values here are the steady-state ``U`` of EN ISO 13370; for a design heat load to
EN 12831-1 they are used as ``U_equiv`` with the factors ``f_g1``, ``f_g2`` and ``G_w`` (see
:mod:`heatledger.heatloss`).

Every formula and coefficient here is recalled [M] (REFERENCES.md section 2); the slab
formulas are checked against the worked values 0.762 and 0.222 W/(m2 K). Check clause and
equation numbers against the purchased standard before release.

References
----------
EN ISO 13370:2017, *Thermal performance of buildings -- Heat transfer via the ground --
Calculation methods*: Table 7 (ground conductivity by category), clause 8.2 (slab on ground),
8.3 (suspended floor), 8.4 (heated basement), Annex B (edge insulation) [M].
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from . import _validate
from .errors import HeatLedgerError
from .windows import _check_perimeter, _non_negative_array, _out

__all__ = [
    "slab_on_ground_u",
    "slab_on_ground",
    "SlabOnGroundResult",
    "EdgeInsulation",
    "suspended_floor_u",
    "suspended_floor",
    "SuspendedFloorResult",
    "heated_basement_u",
    "heated_basement",
    "HeatedBasementResult",
    "ground_conductivity",
    "ground_heat_capacity",
    "SOIL_TYPES",
    "DEFAULT_SOIL_CONDUCTIVITY",
    "RSI_FLOOR",
    "RSI_WALL",
    "RSE_GROUND",
    "WIND_SHIELDING_FACTORS",
    "EXPOSED_OUTLINES",
    "SUSPENDED_FLOOR_MAX_HEIGHT",
]

#: Soil types and their EN ISO 13370:2017 Table 7 category: (category, conductivity
#: [W/(m K)], volumetric heat capacity [J/(m3 K)]). Conductivities [C]; heat capacities [M].
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
#: value used for basement walls in EN ISO 13370 [M]). [m2 K/W]
RSI_WALL = 0.13
#: External surface resistance used in the equivalent thickness (EN ISO 13370 [M]). [m2 K/W]
RSE_GROUND = 0.04

#: Wind shielding factor ``f_w`` of an underfloor space (EN ISO 13370:2017 8.3 [M]). [-]
WIND_SHIELDING_FACTORS = {"sheltered": 0.02, "average": 0.05, "exposed": 0.10}

#: How the exposed perimeter relates to the floor outline: ``"rectilinear"`` and ``"any"``
#: mean the whole outline is exposed (the perimeter is checked against the shortest outline
#: of that area); ``"partial"`` means party walls or unheated neighbours leave part of the
#: outline unexposed, and no bound is checked.
EXPOSED_OUTLINES = ("rectilinear", "any", "partial")

#: Largest floor height above outside ground covered by :func:`suspended_floor`. [m]
SUSPENDED_FLOOR_MAX_HEIGHT = 0.5

_SLAB_METHOD = "EN ISO 13370:2017 clause 8.2 slab on ground [M]"
_EDGE_METHOD = "EN ISO 13370:2017 Annex B edge insulation [M]"


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
    """
    key = _validate.choice("soil", soil, tuple(SOIL_TYPES))
    return SOIL_TYPES[key][2]


# ----------------------------------------------------------------------------- slab


@dataclass(frozen=True)
class EdgeInsulation:
    """Edge insulation of a slab-on-ground floor (EN ISO 13370 Annex B).

    Parameters
    ----------
    orientation : str
        ``"horizontal"`` (a strip along the floor edge, inside or outside) or ``"vertical"``
        (down the foundation, or a low-density foundation wall). [-]
    extent : float
        Width ``D`` of horizontal insulation, or depth ``D`` below ground of vertical
        insulation. [m]
    resistance : float
        Thermal resistance of the edge insulation (or foundation) ``R_n``. [m2 K/W]
    thickness : float
        Thickness of the edge insulation ``d_n``. [m]
    """

    orientation: str
    extent: float
    resistance: float
    thickness: float

    def __post_init__(self) -> None:
        o = _validate.choice("edge insulation orientation", self.orientation,
                             ("horizontal", "vertical"))
        object.__setattr__(self, "orientation", o)
        object.__setattr__(self, "extent",
                           _validate.positive("edge insulation extent", self.extent, "m"))
        object.__setattr__(self, "resistance", _validate.non_negative(
            "edge insulation resistance", self.resistance, "m2 K/W"))
        object.__setattr__(self, "thickness", _validate.positive(
            "edge insulation thickness", self.thickness, "m"))


@dataclass(frozen=True)
class SlabOnGroundResult:
    """Every step of a slab-on-ground U-value (EN ISO 13370 8.2, Annex B).

    Parameters
    ----------
    area : float or ndarray
        Floor area ``A``. [m2]
    exposed_perimeter : float or ndarray
        Exposed perimeter ``P``. [m]
    wall_thickness : float or ndarray
        Full thickness of the surrounding walls ``w``. [m]
    floor_resistance : float or ndarray
        Thermal resistance of the floor construction ``R_f`` (all-over insulation, coverings).
        [m2 K/W]
    soil_conductivity : float
        Ground conductivity ``lambda``. [W/(m K)]
    rsi, rse : float
        Surface resistances used in ``d_t``. [m2 K/W]
    characteristic_dimension : float or ndarray
        ``B' = A / (0.5 P)``. [m]
    equivalent_thickness : float or ndarray
        ``d_t = w + lambda (R_si + R_f + R_se)``. [m]
    regime : str or ndarray
        ``"dt < B'"`` (uninsulated or moderately insulated) or ``"dt >= B'"`` (well
        insulated): which equation ran. [-]
    u_without_edge : float or ndarray
        ``U_0``, the floor without edge insulation. [W/(m2 K)]
    edge_insulation : EdgeInsulation or None
        The edge insulation, if any. [-]
    edge_extra_resistance : float or None
        ``R' = R_n - d_n / lambda``. [m2 K/W]
    edge_extra_thickness : float or None
        ``d' = R' lambda``. [m]
    psi_edge : float or ndarray
        Linear thermal transmittance of the edge insulation ``psi_ge`` (0 without). [W/(m K)]
    u_value : float or ndarray
        ``U = U_0 + 2 psi_ge / B'``, unrounded. [W/(m2 K)]
    exposed_outline : str
        How the exposed perimeter was checked (see :data:`EXPOSED_OUTLINES`). [-]
    method : str
        What ran, for the audit trail. [-]
    """

    area: float
    exposed_perimeter: float
    wall_thickness: float
    floor_resistance: float
    soil_conductivity: float
    rsi: float
    rse: float
    characteristic_dimension: float
    equivalent_thickness: float
    regime: str
    u_without_edge: float
    edge_insulation: EdgeInsulation | None
    edge_extra_resistance: float | None
    edge_extra_thickness: float | None
    psi_edge: float
    u_value: float
    exposed_outline: str
    method: str


def slab_on_ground_u(
    area,
    exposed_perimeter,
    wall_thickness,
    floor_resistance,
    *,
    soil_conductivity=DEFAULT_SOIL_CONDUCTIVITY,
    edge_insulation: EdgeInsulation | None = None,
    exposed_outline: str = "rectilinear",
):
    """U-value of a slab-on-ground floor, EN ISO 13370 clause 8.2.

    Parameters
    ----------
    area : float or array_like
        Floor area ``A`` (inside dimensions of the heated space). [m2]
    exposed_perimeter : float or array_like
        Exposed perimeter ``P``: the length of wall between the heated space and the outside
        or an unheated space. [m]
    wall_thickness : float or array_like
        Full thickness of the walls at the perimeter ``w``. [m]
    floor_resistance : float or array_like
        Thermal resistance of the floor ``R_f``: all-over insulation and coverings; dense
        concrete slabs may be neglected, hardcore counts as ground. [m2 K/W]
    soil_conductivity : float, optional
        Ground conductivity ``lambda``; 2.0 (sand or gravel, category 2) when the soil is
        unknown, or :func:`ground_conductivity` of a soil type. [W/(m K)]
    edge_insulation : EdgeInsulation, optional
        Horizontal or vertical edge insulation (Annex B). [-]
    exposed_outline : str, optional
        ``"rectilinear"`` (default: the whole outline is exposed and has right-angled corners,
        so ``P >= 4 sqrt(A)``), ``"any"`` (whole outline exposed, ``P >= 2 sqrt(pi A)``) or
        ``"partial"`` (party walls leave part of the outline unexposed; no bound). [-]

    Returns
    -------
    float or ndarray
        Thermal transmittance ``U`` of the floor, unrounded. [W/(m2 K)]

    Raises
    ------
    HeatLedgerError
        For non-positive area or perimeter, negative thickness or resistance, a perimeter
        that cannot bound the area, or edge insulation less resistive than the ground.

    Notes
    -----
    .. math::

        B' = \\frac{A}{0.5 P}, \\qquad d_t = w + \\lambda (R_{si} + R_f + R_{se})

        U = \\frac{2\\lambda}{\\pi B' + d_t} \\ln\\left(\\frac{\\pi B'}{d_t} + 1\\right)
        \\quad (d_t < B'), \\qquad
        U = \\frac{\\lambda}{0.457 B' + d_t} \\quad (d_t \\ge B')

    with :math:`R_{si} = 0.17` and :math:`R_{se} = 0.04` m2 K/W. Edge insulation adds
    :math:`2\\psi_{ge}/B'` (see :func:`slab_on_ground`). Use :func:`slab_on_ground` for every
    intermediate value.

    References
    ----------
    EN ISO 13370:2017, clause 8.2 and Annex B [M: recalled; worked values 0.762 and 0.222
    W/(m2 K) reproduced].

    Examples
    --------
    >>> round(slab_on_ground_u(100.0, 40.0, 0.3, 0.0), 3)
    0.762
    """
    return slab_on_ground(
        area,
        exposed_perimeter,
        wall_thickness,
        floor_resistance,
        soil_conductivity=soil_conductivity,
        edge_insulation=edge_insulation,
        exposed_outline=exposed_outline,
    ).u_value


def slab_on_ground(
    area,
    exposed_perimeter,
    wall_thickness,
    floor_resistance,
    *,
    soil_conductivity=DEFAULT_SOIL_CONDUCTIVITY,
    edge_insulation: EdgeInsulation | None = None,
    exposed_outline: str = "rectilinear",
) -> SlabOnGroundResult:
    """Slab-on-ground U-value with every intermediate value, EN ISO 13370 8.2 and Annex B.

    Parameters
    ----------
    area : float or array_like
        Floor area ``A``. [m2]
    exposed_perimeter : float or array_like
        Exposed perimeter ``P``. [m]
    wall_thickness : float or array_like
        Full wall thickness ``w``. [m]
    floor_resistance : float or array_like
        Floor thermal resistance ``R_f``. [m2 K/W]
    soil_conductivity : float, optional
        Ground conductivity ``lambda``. [W/(m K)]
    edge_insulation : EdgeInsulation, optional
        Edge insulation (Annex B). [-]
    exposed_outline : str, optional
        Perimeter check, see :func:`slab_on_ground_u`. [-]

    Returns
    -------
    SlabOnGroundResult
        ``B'``, ``d_t``, the regime, ``U_0``, ``psi_ge`` and ``u_value``. [-]

    Raises
    ------
    HeatLedgerError
        As :func:`slab_on_ground_u`.

    Notes
    -----
    Edge insulation (Annex B), with :math:`R' = R_n - d_n/\\lambda` and
    :math:`d' = R'\\lambda`:

    .. math::

        \\psi_{ge} = -\\frac{\\lambda}{\\pi}\\left[\\ln\\left(\\frac{D}{d_t} + 1\\right)
                      - \\ln\\left(\\frac{D}{d_t + d'} + 1\\right)\\right]
        \\quad \\text{(horizontal, width D)}

        \\psi_{ge} = -\\frac{\\lambda}{\\pi}\\left[\\ln\\left(\\frac{2D}{d_t} + 1\\right)
                      - \\ln\\left(\\frac{2D}{d_t + d'} + 1\\right)\\right]
        \\quad \\text{(vertical, depth D)}

        U = U_0 + 2\\psi_{ge}/B'

    References
    ----------
    EN ISO 13370:2017, clause 8.2 and Annex B [M: recalled].
    """
    outline = _validate.choice("exposed_outline", exposed_outline, EXPOSED_OUTLINES)
    a, p = _area_perimeter(area, exposed_perimeter, outline)
    w = _non_negative_array("wall_thickness", wall_thickness, "m")
    rf = _non_negative_array("floor_resistance", floor_resistance, "m2 K/W")
    lam = _validate.positive("soil_conductivity", soil_conductivity, "W/(m K)")

    b = a / (0.5 * p)
    dt = w + lam * (RSI_FLOOR + rf + RSE_GROUND)
    u0 = _slab_u(b, dt, lam)
    regime = _regime(dt < b, "dt < B'", "dt >= B'")

    r_extra = d_extra = None
    psi = np.zeros_like(u0)
    method = f"{_SLAB_METHOD}; regime chosen by comparing d_t with B'"
    if edge_insulation is not None:
        if not isinstance(edge_insulation, EdgeInsulation):
            raise HeatLedgerError(
                f"edge_insulation must be an EdgeInsulation(...) or None; got {edge_insulation!r}"
            )
        r_extra = edge_insulation.resistance - edge_insulation.thickness / lam
        if r_extra < 0.0:
            raise HeatLedgerError(
                f"edge insulation resistance {edge_insulation.resistance:g} m2 K/W is less than "
                f"that of the ground it replaces (d_n/lambda = "
                f"{edge_insulation.thickness / lam:.4g} m2 K/W); R' = R_n - d_n/lambda must not "
                "be negative"
            )
        d_extra = r_extra * lam
        factor = 1.0 if edge_insulation.orientation == "horizontal" else 2.0
        dd = factor * edge_insulation.extent
        psi = -(lam / math.pi) * (np.log(dd / dt + 1.0) - np.log(dd / (dt + d_extra) + 1.0))
        method += f"; {_EDGE_METHOD}, {edge_insulation.orientation}"
    u = u0 + 2.0 * psi / b
    return SlabOnGroundResult(
        area=_out(a),
        exposed_perimeter=_out(p),
        wall_thickness=_out(w),
        floor_resistance=_out(rf),
        soil_conductivity=lam,
        rsi=RSI_FLOOR,
        rse=RSE_GROUND,
        characteristic_dimension=_out(b),
        equivalent_thickness=_out(dt),
        regime=regime,
        u_without_edge=_out(u0),
        edge_insulation=edge_insulation,
        edge_extra_resistance=r_extra,
        edge_extra_thickness=d_extra,
        psi_edge=_out(psi),
        u_value=_out(u),
        exposed_outline=outline,
        method=method,
    )


# ----------------------------------------------------------------------------- suspended


@dataclass(frozen=True)
class SuspendedFloorResult:
    """Every step of a suspended-floor U-value (EN ISO 13370 8.3).

    Parameters
    ----------
    area : float
        Floor area ``A``. [m2]
    exposed_perimeter : float
        Exposed perimeter ``P``. [m]
    characteristic_dimension : float
        ``B' = A / (0.5 P)``. [m]
    deck_resistance : float
        Thermal resistance of the suspended deck, surfaces excluded. [m2 K/W]
    deck_u : float
        ``U_f = 1/(R_si + R_deck + R_si)`` with ``R_si`` = 0.17 on both faces. [W/(m2 K)]
    ground_equivalent_thickness : float
        ``d_g = w + lambda (R_si + R_g + R_se)``. [m]
    ground_u : float
        ``U_g``, the ground under the underfloor space. [W/(m2 K)]
    underfloor_wall_term : float
        ``2 h U_w / B'``. [W/(m2 K)]
    ventilation_term : float
        ``1450 epsilon v f_w / B'``. [W/(m2 K)]
    exchange_u : float
        ``U_x``, their sum. [W/(m2 K)]
    wind_shielding_factor : float
        ``f_w``. [-]
    soil_conductivity : float
        Ground conductivity ``lambda``. [W/(m K)]
    u_value : float
        ``U = 1/(1/U_f + 1/(U_g + U_x))``, unrounded. [W/(m2 K)]
    method : str
        What ran. [-]
    """

    area: float
    exposed_perimeter: float
    characteristic_dimension: float
    deck_resistance: float
    deck_u: float
    ground_equivalent_thickness: float
    ground_u: float
    underfloor_wall_term: float
    ventilation_term: float
    exchange_u: float
    wind_shielding_factor: float
    soil_conductivity: float
    u_value: float
    method: str


def suspended_floor_u(area, exposed_perimeter, wall_thickness, deck_resistance, **kwargs):
    """U-value of a suspended floor over a ventilated underfloor space, EN ISO 13370 8.3.

    Parameters
    ----------
    area : float
        Floor area ``A``. [m2]
    exposed_perimeter : float
        Exposed perimeter ``P``. [m]
    wall_thickness : float
        Full thickness of the perimeter walls ``w``. [m]
    deck_resistance : float
        Thermal resistance of the suspended deck, surface resistances excluded. [m2 K/W]
    **kwargs : dict
        Keyword arguments of :func:`suspended_floor` (``underfloor_height``,
        ``underfloor_wall_u``, ``vent_area_per_perimeter``, ``wind_speed``,
        ``wind_shielding`` ...). [-]

    Returns
    -------
    float
        Thermal transmittance ``U``, unrounded. [W/(m2 K)]

    Raises
    ------
    HeatLedgerError
        As :func:`suspended_floor`.

    Notes
    -----
    See :func:`suspended_floor`.

    References
    ----------
    EN ISO 13370:2017, clause 8.3 [M: recalled].
    """
    return suspended_floor(area, exposed_perimeter, wall_thickness, deck_resistance,
                           **kwargs).u_value


def suspended_floor(
    area,
    exposed_perimeter,
    wall_thickness,
    deck_resistance,
    *,
    underfloor_height,
    underfloor_wall_u,
    vent_area_per_perimeter,
    wind_speed,
    wind_shielding: str,
    ground_insulation_resistance=0.0,
    soil_conductivity=DEFAULT_SOIL_CONDUCTIVITY,
    exposed_outline: str = "rectilinear",
) -> SuspendedFloorResult:
    """Suspended-floor U-value with every intermediate value, EN ISO 13370 8.3.

    Parameters
    ----------
    area : float
        Floor area ``A``. [m2]
    exposed_perimeter : float
        Exposed perimeter ``P``. [m]
    wall_thickness : float
        Full thickness of the perimeter walls ``w``. [m]
    deck_resistance : float
        Thermal resistance of the suspended deck, surface resistances excluded. [m2 K/W]
    underfloor_height : float
        Height ``h`` of the top of the deck above outside ground level; at most
        :data:`SUSPENDED_FLOOR_MAX_HEIGHT`. [m]
    underfloor_wall_u : float
        U-value ``U_w`` of the walls of the underfloor space above ground. [W/(m2 K)]
    vent_area_per_perimeter : float
        Area of ventilation openings per length of perimeter ``epsilon``. [m2/m]
    wind_speed : float
        Mean wind speed at 10 m height ``v``. [m/s]
    wind_shielding : str
        ``"sheltered"`` (f_w 0.02), ``"average"`` (0.05) or ``"exposed"`` (0.10). [-]
    ground_insulation_resistance : float, optional
        Thermal resistance of insulation on the ground of the underfloor space ``R_g``.
        [m2 K/W]
    soil_conductivity : float, optional
        Ground conductivity ``lambda``. [W/(m K)]
    exposed_outline : str, optional
        Perimeter check, see :func:`slab_on_ground_u`. [-]

    Returns
    -------
    SuspendedFloorResult
        ``U_f``, ``U_g``, ``U_x`` and ``u_value``. [-]

    Raises
    ------
    HeatLedgerError
        For bad inputs, or ``h`` above 0.5 m (the standard then uses other formulas, not
        implemented here).

    Notes
    -----
    .. math::

        \\frac{1}{U} = \\frac{1}{U_f} + \\frac{1}{U_g + U_x}, \\qquad
        U_g = \\frac{2\\lambda}{\\pi B' + d_g}\\ln\\left(\\frac{\\pi B'}{d_g} + 1\\right)

        d_g = w + \\lambda (R_{si} + R_g + R_{se}), \\qquad
        U_x = \\frac{2 h U_w}{B'} + \\frac{1450\\,\\varepsilon\\, v\\, f_w}{B'}

    Not covered: an underfloor space whose floor is below outside ground level.

    References
    ----------
    EN ISO 13370:2017, clause 8.3 [M: recalled].
    """
    outline = _validate.choice("exposed_outline", exposed_outline, EXPOSED_OUTLINES)
    a, p = _area_perimeter(area, exposed_perimeter, outline)
    a, p = float(a), float(p)
    w = _validate.non_negative("wall_thickness", wall_thickness, "m")
    r_deck = _validate.non_negative("deck_resistance", deck_resistance, "m2 K/W")
    h = _validate.non_negative("underfloor_height", underfloor_height, "m")
    if h > SUSPENDED_FLOOR_MAX_HEIGHT:
        raise HeatLedgerError(
            f"underfloor_height must not exceed {SUSPENDED_FLOOR_MAX_HEIGHT} m for the "
            f"EN ISO 13370 8.3 formulas implemented here; got {h:g} m"
        )
    uw = _validate.non_negative("underfloor_wall_u", underfloor_wall_u, "W/(m2 K)")
    eps = _validate.non_negative("vent_area_per_perimeter", vent_area_per_perimeter, "m2/m")
    v = _validate.non_negative("wind_speed", wind_speed, "m/s")
    shield = _validate.choice("wind_shielding", wind_shielding, tuple(WIND_SHIELDING_FACTORS))
    fw = WIND_SHIELDING_FACTORS[shield]
    rg = _validate.non_negative("ground_insulation_resistance", ground_insulation_resistance,
                                "m2 K/W")
    lam = _validate.positive("soil_conductivity", soil_conductivity, "W/(m K)")

    b = a / (0.5 * p)
    uf = 1.0 / (RSI_FLOOR + r_deck + RSI_FLOOR)
    dg = w + lam * (RSI_FLOOR + rg + RSE_GROUND)
    ug = 2.0 * lam / (math.pi * b + dg) * math.log(math.pi * b / dg + 1.0)
    wall_term = 2.0 * h * uw / b
    vent_term = 1450.0 * eps * v * fw / b
    ux = wall_term + vent_term
    u = 1.0 / (1.0 / uf + 1.0 / (ug + ux))
    return SuspendedFloorResult(
        area=a,
        exposed_perimeter=p,
        characteristic_dimension=b,
        deck_resistance=r_deck,
        deck_u=uf,
        ground_equivalent_thickness=dg,
        ground_u=ug,
        underfloor_wall_term=wall_term,
        ventilation_term=vent_term,
        exchange_u=ux,
        wind_shielding_factor=fw,
        soil_conductivity=lam,
        u_value=u,
        method=f"EN ISO 13370:2017 clause 8.3 suspended floor, h <= 0.5 m, f_w {shield} [M]",
    )


# ----------------------------------------------------------------------------- basement


@dataclass(frozen=True)
class HeatedBasementResult:
    """Every step of a heated-basement U-value (EN ISO 13370 8.4).

    Parameters
    ----------
    area : float
        Basement floor area ``A``. [m2]
    exposed_perimeter : float
        Exposed perimeter ``P``. [m]
    depth : float
        Depth ``z`` of the basement floor below outside ground level. [m]
    characteristic_dimension : float
        ``B' = A / (0.5 P)``. [m]
    floor_equivalent_thickness : float
        ``d_t = w + lambda (R_si + R_f + R_se)``. [m]
    floor_regime : str
        ``"dt + z/2 < B'"`` or ``"dt + z/2 >= B'"``: which floor equation ran. [-]
    floor_u : float
        ``U_bf``. [W/(m2 K)]
    wall_equivalent_thickness : float
        ``d_w = lambda (R_si + R_w + R_se)``. [m]
    wall_bracket_thickness : float
        Thickness used in the bracket of the wall equation: ``d_t`` when ``d_w >= d_t``,
        else ``d_w``. [m]
    wall_u : float
        ``U_bw``. [W/(m2 K)]
    soil_conductivity : float
        Ground conductivity ``lambda``. [W/(m K)]
    u_value : float
        Combined ``U' = (A U_bf + z P U_bw) / (A + z P)``, unrounded. [W/(m2 K)]
    method : str
        What ran. [-]
    """

    area: float
    exposed_perimeter: float
    depth: float
    characteristic_dimension: float
    floor_equivalent_thickness: float
    floor_regime: str
    floor_u: float
    wall_equivalent_thickness: float
    wall_bracket_thickness: float
    wall_u: float
    soil_conductivity: float
    u_value: float
    method: str


def heated_basement_u(area, exposed_perimeter, wall_thickness, floor_resistance,
                      wall_resistance, depth, **kwargs):
    """Combined U-value of the floor and walls of a heated basement, EN ISO 13370 8.4.

    Parameters
    ----------
    area : float
        Basement floor area ``A``. [m2]
    exposed_perimeter : float
        Exposed perimeter ``P``. [m]
    wall_thickness : float
        Full thickness of the basement walls ``w``. [m]
    floor_resistance : float
        Thermal resistance of the basement floor ``R_f``. [m2 K/W]
    wall_resistance : float
        Thermal resistance of the basement walls ``R_w``. [m2 K/W]
    depth : float
        Depth ``z`` of the basement floor below outside ground level. [m]
    **kwargs : dict
        Keyword arguments of :func:`heated_basement`. [-]

    Returns
    -------
    float
        Combined ``U'`` over floor and below-ground walls, unrounded. [W/(m2 K)]

    Raises
    ------
    HeatLedgerError
        As :func:`heated_basement`.

    Notes
    -----
    See :func:`heated_basement`.

    References
    ----------
    EN ISO 13370:2017, clause 8.4 [M: recalled].
    """
    return heated_basement(area, exposed_perimeter, wall_thickness, floor_resistance,
                           wall_resistance, depth, **kwargs).u_value


def heated_basement(
    area,
    exposed_perimeter,
    wall_thickness,
    floor_resistance,
    wall_resistance,
    depth,
    *,
    soil_conductivity=DEFAULT_SOIL_CONDUCTIVITY,
    rsi_wall=RSI_WALL,
    exposed_outline: str = "rectilinear",
) -> HeatedBasementResult:
    """Heated-basement U-values with every intermediate value, EN ISO 13370 8.4.

    Parameters
    ----------
    area : float
        Basement floor area ``A``. [m2]
    exposed_perimeter : float
        Exposed perimeter ``P``. [m]
    wall_thickness : float
        Full thickness of the basement walls ``w``. [m]
    floor_resistance : float
        Thermal resistance of the basement floor ``R_f``. [m2 K/W]
    wall_resistance : float
        Thermal resistance of the basement walls ``R_w``. [m2 K/W]
    depth : float
        Depth ``z`` of the basement floor below outside ground level. [m]
    soil_conductivity : float, optional
        Ground conductivity ``lambda``. [W/(m K)]
    rsi_wall : float, optional
        Internal surface resistance of the walls (horizontal heat flow). [m2 K/W]
    exposed_outline : str, optional
        Perimeter check, see :func:`slab_on_ground_u`. [-]

    Returns
    -------
    HeatedBasementResult
        Floor and wall U-values, thicknesses, regime and combined ``u_value``. [-]

    Raises
    ------
    HeatLedgerError
        For bad inputs (non-positive depth, area or perimeter; negative resistances).

    Notes
    -----
    .. math::

        d_t = w + \\lambda (R_{si} + R_f + R_{se}), \\qquad
        U_{bf} = \\frac{2\\lambda}{\\pi B' + d_t + z/2}
                 \\ln\\left(\\frac{\\pi B'}{d_t + z/2} + 1\\right) \\quad (d_t + z/2 < B')

        U_{bf} = \\frac{\\lambda}{0.457 B' + d_t + z/2} \\quad (d_t + z/2 \\ge B')

        d_w = \\lambda (R_{si} + R_w + R_{se}), \\qquad
        U_{bw} = \\frac{2\\lambda}{\\pi z}\\left(1 + \\frac{0.5 d^*}{d^* + z}\\right)
                 \\ln\\left(\\frac{z}{d_w} + 1\\right)

        U' = \\frac{A U_{bf} + z P U_{bw}}{A + z P}

    with :math:`d^* = d_t` if :math:`d_w \\ge d_t`, else :math:`d_w`.

    References
    ----------
    EN ISO 13370:2017, clause 8.4 [M: recalled].
    """
    outline = _validate.choice("exposed_outline", exposed_outline, EXPOSED_OUTLINES)
    a, p = _area_perimeter(area, exposed_perimeter, outline)
    a, p = float(a), float(p)
    w = _validate.non_negative("wall_thickness", wall_thickness, "m")
    rf = _validate.non_negative("floor_resistance", floor_resistance, "m2 K/W")
    rw = _validate.non_negative("wall_resistance", wall_resistance, "m2 K/W")
    z = _validate.positive("depth", depth, "m")
    lam = _validate.positive("soil_conductivity", soil_conductivity, "W/(m K)")
    rsiw = _validate.non_negative("rsi_wall", rsi_wall, "m2 K/W")

    b = a / (0.5 * p)
    dt = w + lam * (RSI_FLOOR + rf + RSE_GROUND)
    de = dt + 0.5 * z
    if de < b:
        ubf = 2.0 * lam / (math.pi * b + de) * math.log(math.pi * b / de + 1.0)
        regime = "dt + z/2 < B'"
    else:
        ubf = lam / (0.457 * b + de)
        regime = "dt + z/2 >= B'"
    dw = lam * (rsiw + rw + RSE_GROUND)
    dstar = dt if dw >= dt else dw
    ubw = 2.0 * lam / (math.pi * z) * (1.0 + 0.5 * dstar / (dstar + z)) * math.log(z / dw + 1.0)
    u = (a * ubf + z * p * ubw) / (a + z * p)
    return HeatedBasementResult(
        area=a,
        exposed_perimeter=p,
        depth=z,
        characteristic_dimension=b,
        floor_equivalent_thickness=dt,
        floor_regime=regime,
        floor_u=ubf,
        wall_equivalent_thickness=dw,
        wall_bracket_thickness=dstar,
        wall_u=ubw,
        soil_conductivity=lam,
        u_value=u,
        method=(
            "EN ISO 13370:2017 clause 8.4 heated basement, floor regime by comparing "
            "d_t + z/2 with B', wall bracket uses " + ("d_t" if dw >= dt else "d_w (d_w < d_t)")
            + " [M]"
        ),
    )


# ----------------------------------------------------------------------------- helpers


def _slab_u(b, dt, lam):
    """Both regimes of the slab equation, evaluated where each applies."""
    b, dt = np.broadcast_arrays(np.asarray(b, dtype=float), np.asarray(dt, dtype=float))
    thin = dt < b
    u = np.empty_like(b)
    u[thin] = 2.0 * lam / (np.pi * b[thin] + dt[thin]) * np.log(np.pi * b[thin] / dt[thin] + 1.0)
    u[~thin] = lam / (0.457 * b[~thin] + dt[~thin])
    return u


def _regime(mask, yes: str, no: str):
    m = np.asarray(mask)
    if m.ndim == 0:
        return yes if bool(m) else no
    return np.where(m, yes, no)


def _area_perimeter(area, perimeter, outline: str):
    a = _non_negative_array("area", area, "m2")
    p = _non_negative_array("exposed_perimeter", perimeter, "m")
    if np.any(a <= 0.0):
        raise HeatLedgerError("area must be greater than zero; got 0 m2")
    if np.any(p <= 0.0):
        raise HeatLedgerError(
            "exposed_perimeter must be greater than zero; got 0 m (a floor with no exposed "
            "edge is not a ground-floor heat loss of this method)"
        )
    if outline != "partial":
        try:
            _check_perimeter("exposed_perimeter", p, "area", a, outline)
        except HeatLedgerError as exc:
            raise HeatLedgerError(
                f"{exc} (the whole outline was taken as exposed; pass "
                "exposed_outline='partial' if party walls or unheated neighbours leave part "
                "of it unexposed)"
            ) from None
    return a, p

