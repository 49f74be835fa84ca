"""Slab-on-ground floors, with edge insulation (EN ISO 13370 clause 8.2, Annex B).

References
----------
EN ISO 13370:2017, clause 8.2 and Annex B [M: recalled; worked values
0.762 and 0.222 W/(m2 K) reproduced].

Sources: [source: iso13370-slab, 8.2, Table 7]; [source: iso13370-edge, Annex B].
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from .. import _validate
from .._arrays import non_negative_array as _non_negative_array
from .._arrays import out as _out
from ..errors import HeatLedgerError
from .soil import (
    DEFAULT_SOIL_CONDUCTIVITY,
    EXPOSED_OUTLINES,
    RSE_GROUND,
    RSI_FLOOR,
    _area_perimeter,
)

_SLAB_METHOD = "EN ISO 13370:2017 clause 8.2 slab on ground (recalled)"
_EDGE_METHOD = "EN ISO 13370:2017 Annex B edge insulation (recalled)"


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
        object.__setattr__(self, "thickness", _validate.within(
            "edge insulation thickness", _validate.positive(
                "edge insulation thickness", self.thickness, "m"), "thickness"))


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
    SlabOnGroundResult
        ``B'``, ``d_t``, the regime, ``U_0``, ``psi_ge`` and ``u_value``. [-]

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
    EN ISO 13370:2017, clause 8.2 and Annex B [M: recalled; worked values 0.762 and 0.222
    W/(m2 K) reproduced].
    [source: iso13370-slab, 8.2]; edge insulation [source: iso13370-edge, Annex B].

    Examples
    --------
    >>> round(slab_on_ground(100.0, 40.0, 0.3, 0.0).u_value, 3)
    0.762
    """
    outline = _validate.choice("exposed_outline", exposed_outline, EXPOSED_OUTLINES)
    a, p = _area_perimeter(area, exposed_perimeter, outline)
    w = _non_negative_array("wall_thickness", wall_thickness, "m")
    if w.size:
        _validate.within("wall_thickness", float(w.max()), "wall_thickness")
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
                "edge_insulation must be an EdgeInsulation or left out; got "
                f"{_validate.show(edge_insulation)}"
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


