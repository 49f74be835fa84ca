"""Suspended floors and heated basements (EN ISO 13370 clauses 8.3 and 8.4).

References
----------
EN ISO 13370:2017, clauses 8.3 and 8.4 [M: recalled].

Sources: [source: iso13370-floors, 8.3, 8.4].
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from .. import _validate
from ..errors import HeatLedgerError
from .soil import (
    DEFAULT_SOIL_CONDUCTIVITY,
    EXPOSED_OUTLINES,
    RSE_GROUND,
    RSI_FLOOR,
    RSI_WALL,
    SUSPENDED_FLOOR_MAX_HEIGHT,
    WIND_SHIELDING_FACTORS,
    _scalar_area_perimeter,
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
    **kwargs : dict
        Keyword arguments of :func:`suspended_floor` (``underfloor_height``,
        ``underfloor_wall_u``, ``vent_area_per_perimeter``, ``wind_speed``,
        ``wind_shielding`` ...). [-]
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
        Perimeter check, see :func:`heatledger.ground.slab_on_ground`. [-]

    Returns
    -------
    SuspendedFloorResult
        ``U_f``, ``U_g``, ``U_x`` and ``u_value``. [-]

    Raises
    ------
    HeatLedgerError
        As :func:`suspended_floor`.

    Notes
    -----
    See :func:`suspended_floor`.


    .. math::

        \\frac{1}{U} = \\frac{1}{U_f} + \\frac{1}{U_g + U_x}, \\qquad
        U_g = \\frac{2\\lambda}{\\pi B' + d_g}\\ln\\left(\\frac{\\pi B'}{d_g} + 1\\right)

        d_g = w + \\lambda (R_{si} + R_g + R_{se}), \\qquad
        U_x = \\frac{2 h U_w}{B'} + \\frac{1450\\,\\varepsilon\\, v\\, f_w}{B'}

    Not covered: an underfloor space whose floor is below outside ground level.

    References
    ----------
    EN ISO 13370:2017, clause 8.3 [M: recalled].
    [source: iso13370-floors, 8.3].
    """
    outline = _validate.choice("exposed_outline", exposed_outline, EXPOSED_OUTLINES)
    a, p = _scalar_area_perimeter(area, exposed_perimeter, outline, "suspended_floor")
    w = _validate.within("wall_thickness", _validate.non_negative(
        "wall_thickness", wall_thickness, "m"), "wall_thickness")
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
        method=f"EN ISO 13370:2017 clause 8.3 suspended floor, h <= 0.5 m, f_w {shield} (recalled)",
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
    **kwargs : dict
        Keyword arguments of :func:`heated_basement`. [-]
    soil_conductivity : float, optional
        Ground conductivity ``lambda``. [W/(m K)]
    rsi_wall : float, optional
        Internal surface resistance of the walls (horizontal heat flow). [m2 K/W]
    exposed_outline : str, optional
        Perimeter check, see :func:`heatledger.ground.slab_on_ground`. [-]

    Returns
    -------
    HeatedBasementResult
        Floor and wall U-values, thicknesses, regime and combined ``u_value``. [-]

    Raises
    ------
    HeatLedgerError
        As :func:`heated_basement`.

    Notes
    -----
    See :func:`heated_basement`.


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
    [source: iso13370-floors, 8.4].
    """
    outline = _validate.choice("exposed_outline", exposed_outline, EXPOSED_OUTLINES)
    a, p = _scalar_area_perimeter(area, exposed_perimeter, outline, "heated_basement")
    w = _validate.within("wall_thickness", _validate.non_negative(
        "wall_thickness", wall_thickness, "m"), "wall_thickness")
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
            + " (recalled)"
        ),
    )


