"""The thickness of one layer that meets a target U-value (closed form).
"""

from __future__ import annotations

import numpy as np

from .._validate import (
    positive,
    quote,
    show,
)
from ..errors import HeatLedgerError
from .construction import Construction


def required_thickness(construction: Construction, layer_index: int, target_u: float, *,
                       max_thickness: float = 2.0) -> float:
    """Thickness of one layer that makes the construction reach a target U-value.

    Parameters
    ----------
    construction : Construction
        The construction as designed (the chosen layer's current thickness is ignored). [-]
    layer_index : int
        Index of the layer to size (0-based, inside to outside). [-]
    target_u : float
        Target U-value, corrections included. [W/(m2 K)]
    max_thickness : float
        Largest thickness searched. [m]

    Returns
    -------
    float
        The thickness at which ``U = target_u``. [m]

    Raises
    ------
    HeatLedgerError
        If the target cannot be reached with any thickness up to ``max_thickness`` (for
        example an inverted roof whose rain-water correction alone exceeds it), or if the
        layer is an air layer.

    Notes
    -----
    Where ``U = 1/R_T`` is linear in the layer's resistance (a plain or declared layer, no
    bridged layer, no ventilated air layer, no corrections) the closed form
    ``d = (1/U_t - R_rest) d_0/R_0`` is used, with ``R_rest = R_T - R_0`` and ``d_0/R_0`` the
    layer's thickness per unit resistance (``lambda``; a declared resistance scales with
    the thickness). Otherwise Brent's method solves ``U(d) - U_target = 0``, monotonic in
    ``d``.

    References
    ----------
    [source: iso6946-layers, 6.7].
    """
    target = positive("target_u", target_u, "W/(m2 K)")
    n = len(construction.layers)
    if not isinstance(layer_index, (int, np.integer)) or not 0 <= layer_index < n:
        raise HeatLedgerError(f"layer_index must be 0 to {n - 1}; got {show(layer_index)}")
    layer = construction.layers[layer_index]
    if layer.kind == "air":
        raise HeatLedgerError("layer_index points to an air layer; choose an insulation layer")

    d_min = 1e-4
    d_max = positive("max_thickness", max_thickness, "m")
    linear = (layer.kind in ("material", "declared") and construction.bridging is None
              and construction.ventilation is None and not construction.corrections_input)
    m_per_r = layer.thickness / layer.resistance_value if linear else 0.0  # [m/(m2 K/W)]
    r_rest = construction.total_resistance - layer.resistance_value if linear else 0.0

    def u_at(d: float) -> float:
        if linear:  # U = 1/R_T with R_T = R_rest + d/m_per_r
            return 1.0 / (r_rest + d / m_per_r) - target
        return construction.with_layer(layer_index, layer.with_thickness(d)).u_value - target

    if u_at(d_min) <= 0.0:
        raise HeatLedgerError(
            f"target_u {target:g} W/(m2 K) is met even without layer "
            f"{layer_index} ({quote(layer.name)}); no thickness is needed")
    if u_at(d_max) > 0.0:
        best = u_at(d_max) + target
        raise HeatLedgerError(
            f"target_u {target:g} W/(m2 K) cannot be reached: with {d_max:g} m of layer "
            f"{layer_index} ({quote(layer.name)}) U is still {best:.4g} W/(m2 K); improve another "
            "layer or relax the target")
    if linear:
        return float((1.0 / target - r_rest) * m_per_r)
    from scipy.optimize import brentq  # imported here: scipy.optimize costs 0.1 s at start-up

    return float(brentq(u_at, d_min, d_max, xtol=1e-9, rtol=1e-12))
