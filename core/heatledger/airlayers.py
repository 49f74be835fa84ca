"""Thermal resistance of air layers in building elements (EN ISO 6946:2017, 6.9 and Annex D).

An air layer is *unventilated*, *slightly ventilated* or *well ventilated* according to the
area of openings to the outside. Unventilated layers have the resistance of Annex D (Table 8
lists it for emissivities 0.9); slightly and well ventilated layers are treated in
:mod:`heatledger.constructions`, which knows the layers on either side.

References
----------
EN ISO 6946:2017, 6.9 (air layers), Table 8 (unventilated air layers), Annex D (eqs D.1-D.5).

Sources: [source: iso6946-airlayers, 6.9, Table 8, Annex D].
"""

from __future__ import annotations

import math

import numpy as np

from ._validate import choice, finite, fraction, non_negative, positive, show
from .errors import HeatLedgerError
from .surfaces import HEAT_FLOWS, radiative_coefficient_black_body

__all__ = [
    "VENTILATION_CLASSES",
    "air_layer_resistance",
    "air_layer_convective_coefficient",
    "ventilation_class",
]

VENTILATION_CLASSES = ("unventilated", "slightly", "well")

#: Upper thickness limit of the Annex D method. [m]
MAX_AIR_LAYER_THICKNESS = 0.3
#: Opening area per m (vertical) or per m2 (horizontal) up to which a layer is unventilated,
#: and from which it is well ventilated. [mm2]  source: EN ISO 6946:2017, 6.9.2-6.9.4
VENT_AREA_UNVENTILATED_MM2 = 500.0
VENT_AREA_WELL_VENTILATED_MM2 = 1500.0
_HEAT_FLOW_SET = frozenset(HEAT_FLOWS)
#: hr0 at the default mean temperature of 10 degC, computed once. [W/(m2 K)]
_H_R0_10C = radiative_coefficient_black_body(10.0)


def air_layer_resistance(
    thickness,
    heat_flow: str,
    emissivity_1: float = 0.9,
    emissivity_2: float = 0.9,
    *,
    temp_mean: float = 10.0,
    width: float | None = None,
):
    """Thermal resistance of an unventilated air layer.

    Parameters
    ----------
    thickness : float or array_like
        Thickness of the air layer in the direction of heat flow, up to 0.3 m. [m]
    heat_flow : str
        ``"up"``, ``"horizontal"`` or ``"down"``. [-]
    emissivity_1, emissivity_2 : float
        Hemispherical emissivities of the two faces bounding the layer. [-]
    temp_mean : float
        Mean temperature of the layer, for the radiative coefficient. [degC]
    width : float, optional
        Width ``b`` of a small or divided void; when given and ``b < 10 d`` the radiative
        term uses the view-factor form for small voids. [m]

    Returns
    -------
    float or ndarray
        Thermal resistance ``Rg``. [m2 K/W]

    Raises
    ------
    HeatLedgerError
        If the thickness is negative or above 0.3 m, an emissivity is outside (0, 1] or the
        direction is unknown.

    Notes
    -----
    ``Rg = 1/(ha + E hr0)`` with ``E = 1/(1/e1 + 1/e2 - 1)``, ``hr0 = 4 sigma T_m^3`` and
    ``ha = max(1.25, 0.025/d)`` horizontal, ``max(1.95, 0.025/d)`` upwards,
    ``max(0.12 d^-0.44, 0.025/d)`` downwards (ha in W/(m2 K), d in m; the conduction limit
    0.025/d uses the conductivity of still air). For a small void the radiative term is
    ``hr0 / (1/e1 + 1/e2 - 2 + 2/(1 + sqrt(1 + d^2/b^2) - d/b))``. Valid for a temperature
    difference across the layer of at most 5 K.

    References
    ----------
    EN ISO 6946:2017, Annex D, eqs (D.1)-(D.5) and Table 8 (recalled; Table 8 is reproduced
    within 0.005 m2 K/W, see the tests).
    [source: iso6946-airlayers, Annex D, Table 8].

    Examples
    --------
    >>> round(air_layer_resistance(0.025, "horizontal"), 2)
    0.18
    """
    if not (type(heat_flow) is str and heat_flow in _HEAT_FLOW_SET):
        heat_flow = choice("heat_flow", heat_flow, HEAT_FLOWS)
    e1 = fraction("emissivity_1", emissivity_1, allow_zero=False)
    e2 = fraction("emissivity_2", emissivity_2, allow_zero=False)
    plain = isinstance(thickness, (int, float)) and not isinstance(thickness, bool)
    if plain:  # fast path: math on one number (numpy costs ~15 us on a scalar)
        d = float(thickness)
        _check_thickness(math.isfinite(d), d < 0.0, d > MAX_AIR_LAYER_THICKNESS + 1e-12, d)
    else:
        d = _thickness_array(thickness)
    h_r0 = (_H_R0_10C if temp_mean == 10.0 and type(temp_mean) is float else
            radiative_coefficient_black_body(finite("temp_mean", temp_mean)))
    radiative = _radiative_term(h_r0, e1, e2, d, width, math.sqrt if plain else np.sqrt)
    if plain:
        return _scalar_resistance(d, heat_flow, radiative)
    h_a = air_layer_convective_coefficient(d, heat_flow)
    out = 1.0 / (h_a + radiative)
    out = np.where(d == 0.0, 0.0, out)
    return float(out) if out.ndim == 0 else out


def air_layer_convective_coefficient(thickness, heat_flow: str):
    """Convective/conductive coefficient ``ha`` of an unventilated air layer.

    Parameters
    ----------
    thickness : float or array_like
        Thickness of the layer in the direction of heat flow. [m]
    heat_flow : str
        ``"up"``, ``"horizontal"`` or ``"down"``. [-]

    Returns
    -------
    float or ndarray
        ``ha``. [W/(m2 K)]

    References
    ----------
    EN ISO 6946:2017, Annex D, eqs (D.2)-(D.4) for a temperature difference <= 5 K
    (recalled).
    [source: iso6946-airlayers, Annex D].
    """
    heat_flow = choice("heat_flow", heat_flow, HEAT_FLOWS)
    d = _thickness_array(thickness)
    with np.errstate(divide="ignore"):
        conduction = np.where(d > 0.0, 0.025 / np.where(d > 0.0, d, 1.0), np.inf)
        if heat_flow == "horizontal":
            conv = np.full_like(d, 1.25)
        elif heat_flow == "up":
            conv = np.full_like(d, 1.95)
        else:
            conv = 0.12 * np.where(d > 0.0, d, 1.0) ** -0.44
    out = np.maximum(conv, conduction)
    return float(out) if out.ndim == 0 else out


def ventilation_class(vent_area_mm2: float) -> str:
    """Ventilation class of an air layer from the area of its openings to the outside.

    Parameters
    ----------
    vent_area_mm2 : float
        Opening area per metre of length (vertical layers) or per square metre of surface
        (horizontal layers). [mm2 per m or m2]

    Returns
    -------
    str
        ``"unventilated"`` (<= 500 mm2), ``"slightly"`` (500 to 1500 mm2) or ``"well"``
        (>= 1500 mm2).

    References
    ----------
    EN ISO 6946:2017, 6.9.2-6.9.4 (thresholds confirmed in a secondary source).
    [source: iso6946-ventilated, opening-area classes].

    Examples
    --------
    >>> ventilation_class(800)
    'slightly'
    """
    area = non_negative("vent_area_mm2", vent_area_mm2, "mm2")
    if area <= VENT_AREA_UNVENTILATED_MM2:
        return "unventilated"
    if area < VENT_AREA_WELL_VENTILATED_MM2:
        return "slightly"
    return "well"


def _radiative_term(h_r0, e1, e2, d, width, sqrt):
    """``E hr0`` of Annex D, or its small-void form when ``width`` is given.

    ``sqrt`` is ``math.sqrt`` for one number or ``np.sqrt`` for arrays (the same operations
    either way, so both paths agree to the last bit or within 1e-15 relative, tested).
    """
    if width is None:
        return h_r0 / (1.0 / e1 + 1.0 / e2 - 1.0)
    b = positive("width", width, "m")
    ratio = d / b
    return h_r0 / (1.0 / e1 + 1.0 / e2 - 2.0 + 2.0 / (1.0 + sqrt(1.0 + ratio * ratio) - ratio))


def _scalar_resistance(d: float, heat_flow: str, radiative: float) -> float:
    """``Rg = 1/(ha + E hr0)`` for one thickness, in math (see the array path)."""
    if d == 0.0:
        return 0.0
    if heat_flow == "horizontal":
        conv = 1.25
    elif heat_flow == "up":
        conv = 1.95
    else:
        conv = 0.12 * d**-0.44
    return 1.0 / (max(conv, 0.025 / d) + radiative)


def _check_thickness(finite_, negative, too_thick, thickness) -> None:
    """Raise for a bad air-layer thickness; ``thickness`` is the first offending value. [m]"""
    if not finite_:
        raise HeatLedgerError(f"air layer thickness must be a finite number; got "
                              f"{show(thickness)}")
    if negative:
        raise HeatLedgerError(f"air layer thickness must not be negative; got "
                              f"{thickness:g} m")
    if too_thick:
        raise HeatLedgerError(
            f"air layer thickness must be at most {MAX_AIR_LAYER_THICKNESS * 1000:g} mm for "
            f"the ISO 6946 Annex D method; got {thickness * 1000:g} mm (treat a larger space "
            "as a room or use ISO 13789)"
        )


def _thickness_array(thickness):
    try:
        d = np.asarray(thickness, dtype=float)
    except (TypeError, ValueError):
        raise HeatLedgerError(f"air layer thickness must be a number; got "
                              f"{show(thickness)}") from None
    bad = ~np.isfinite(d) | (d < 0.0) | (d > MAX_AIR_LAYER_THICKNESS + 1e-12)
    first = float(d.ravel()[np.argmax(bad.ravel())]) if bad.any() else 0.0
    _check_thickness(np.isfinite(d).all(), (d < 0.0).any(),
                     (d > MAX_AIR_LAYER_THICKNESS + 1e-12).any(), first)
    if math.isnan(float(d.max(initial=0.0))):
        raise HeatLedgerError("air layer thickness must not be NaN")
    return d
