"""Air properties, the ventilation heat-loss coefficient and room ventilation.

References
----------
EN 12831-1:2017, clause 6 (ventilation heat loss) [M: recalled].
ASHRAE Handbook -- Fundamentals (2017), ch. 1 (dry-air properties) (recalled).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from .. import _validate
from .._arrays import non_negative_array, out
from .._constants import GAS_CONSTANT, SECONDS_PER_HOUR, STANDARD_ATMOSPHERE, ZERO_CELSIUS
from .._validate import show as _show
from ..errors import HeatLedgerError

# ----------------------------------------------------------------------------- air properties

#: Temperature at which the air properties below are stated. [degC]
AIR_REFERENCE_TEMPERATURE = 20.0
#: Pressure at which the air properties below are stated: one standard atmosphere. [Pa]
AIR_REFERENCE_PRESSURE = STANDARD_ATMOSPHERE
#: Molar mass of dry air, ASHRAE Handbook -- Fundamentals (2017), ch. 1 (recalled). [kg/mol]
DRY_AIR_MOLAR_MASS = 28.966e-3
#: Density of dry air at the reference state as an ideal gas, p M / (R T). [kg/m3]
AIR_DENSITY = AIR_REFERENCE_PRESSURE * DRY_AIR_MOLAR_MASS / (
    GAS_CONSTANT * (AIR_REFERENCE_TEMPERATURE + ZERO_CELSIUS)
)
#: Specific heat capacity of dry air at constant pressure near 20 degC: the 1.006 kJ/(kg K)
#: of the ASHRAE Handbook -- Fundamentals (2017) ch. 1 moist-air enthalpy (recalled). [J/(kg K)]
AIR_SPECIFIC_HEAT = 1006.0

_SECONDS_PER_HOUR = SECONDS_PER_HOUR


def ventilation_heat_loss_coefficient(
    air_flow_m3_per_h,
    *,
    heat_recovery=0.0,
    density=AIR_DENSITY,
    specific_heat=AIR_SPECIFIC_HEAT,
):
    """Ventilation heat-loss coefficient of an outdoor air flow.

    Parameters
    ----------
    air_flow_m3_per_h : float or array_like
        Outdoor air volume flow entering the space. [m3/h]
    heat_recovery : float or array_like, optional
        Temperature efficiency of heat recovery on this flow, 0 without recovery. [-]
    density : float, optional
        Air density; default :data:`AIR_DENSITY` (dry air, 20 degC, 101325 Pa). [kg/m3]
    specific_heat : float, optional
        Specific heat capacity of air; default :data:`AIR_SPECIFIC_HEAT`. [J/(kg K)]

    Returns
    -------
    float or ndarray
        ``H_V``. [W/K]

    Raises
    ------
    HeatLedgerError
        For a negative flow, an efficiency outside 0..1 or non-positive air properties.

    Notes
    -----
    .. math:: H_V = \\rho c_p \\frac{\\dot V}{3600} (1 - \\eta)

    With the defaults :math:`\\rho c_p / 3600 \\approx 0.336` W h/(m3 K), the conventional
    0.34 of EN 12831-1 to its two figures.

    References
    ----------
    EN 12831-1:2017, clause 6 (ventilation heat-loss coefficient) (recalled).
    [source: en12831-1, clause 6].

    Examples
    --------
    >>> round(ventilation_heat_loss_coefficient(100.0), 2)
    33.65
    """
    flow = non_negative_array("air_flow_m3_per_h", air_flow_m3_per_h, "m3/h")
    eta = non_negative_array("heat_recovery", heat_recovery, "")
    if np.any(eta > 1.0):
        raise HeatLedgerError(
            f"heat_recovery must be between 0 and 1; got {float(np.max(eta)):g}"
        )
    rho = _validate.positive("density", density, "kg/m3")
    cp = _validate.positive("specific_heat", specific_heat, "J/(kg K)")
    return out(rho * cp * flow / _SECONDS_PER_HOUR * (1.0 - eta))


# ----------------------------------------------------------------------------- ventilation


@dataclass(frozen=True)
class Ventilation:
    """Ventilation and infiltration of a room, on an explicit basis.

    Parameters
    ----------
    basis : str
        ``"air_change"`` (``ventilation_rate`` and ``infiltration`` in air changes per hour) or
        ``"flow"`` (in m3/h). [-]
    ventilation_rate : float, optional
        Design outdoor air for ventilation (natural or mechanical supply). [1/h or m3/h]
    infiltration : float, optional
        Infiltration through the envelope, entering at the external temperature. [1/h or m3/h]
    heat_recovery : float, optional
        Temperature efficiency of heat recovery on the ventilation air (0..1). [-]
    minimum_air_change : float, optional
        Minimum outdoor air change ``n_min``; any shortfall of ventilation plus infiltration
        below ``n_min V`` is added as outdoor air without heat recovery. [1/h]
    """

    basis: str
    ventilation_rate: float = 0.0
    infiltration: float = 0.0
    heat_recovery: float = 0.0
    minimum_air_change: float = 0.0


@dataclass(frozen=True)
class VentilationFlows:
    """Air flows and the ventilation heat-loss coefficient of one room.

    Parameters
    ----------
    basis : str
        Basis of the inputs. [-]
    ventilation_flow : float
        Design ventilation flow. [m3/h]
    infiltration_flow : float
        Infiltration flow. [m3/h]
    minimum_flow : float
        ``n_min V``. [m3/h]
    top_up_flow : float
        Outdoor air added to reach the minimum, without heat recovery. [m3/h]
    heat_recovery : float
        Heat recovery efficiency on the ventilation flow. [-]
    effective_flow : float
        ``V_inf + V_vent (1 - eta) + V_top-up``. [m3/h]
    volumetric_heat_capacity : float
        ``rho c_p / 3600``. [W h/(m3 K)]
    coefficient : float
        ``H_V``. [W/K]
    minimum_governs : bool
        Whether the minimum air change added air. [-]
    method : str
        What ran. [-]
    """

    basis: str
    ventilation_flow: float
    infiltration_flow: float
    minimum_flow: float
    top_up_flow: float
    heat_recovery: float
    effective_flow: float
    volumetric_heat_capacity: float
    coefficient: float
    minimum_governs: bool
    method: str



def _ventilation(v: Ventilation, volume: float) -> VentilationFlows:
    scale = volume if v.basis == "air_change" else 1.0
    vent = v.ventilation_rate * scale
    inf = v.infiltration * scale
    vmin = v.minimum_air_change * volume
    top_up = max(0.0, vmin - (vent + inf))
    eff = inf + vent * (1.0 - v.heat_recovery) + top_up
    c = AIR_DENSITY * AIR_SPECIFIC_HEAT / _SECONDS_PER_HOUR
    method = (
        f"basis {_show(v.basis)}; V_eff = V_inf + V_vent (1 - eta) + max(0, n_min V - V_inf - "
        f"V_vent); eta {v.heat_recovery:g}; minimum air change "
        + ("governs" if top_up > 0.0 else "met")
        + "; EN 12831-1 style (recalled)"
    )
    return VentilationFlows(
        basis=v.basis, ventilation_flow=vent, infiltration_flow=inf, minimum_flow=vmin,
        top_up_flow=top_up, heat_recovery=v.heat_recovery, effective_flow=eff,
        volumetric_heat_capacity=c,
        coefficient=float(ventilation_heat_loss_coefficient(eff)),
        minimum_governs=top_up > 0.0, method=method,
    )


def _check_ventilation(ctx: str, v: Ventilation) -> None:
    _validate.choice(f"{ctx}: ventilation basis", v.basis, ("air_change", "flow"))
    object.__setattr__(v, "basis", v.basis.strip().lower())
    unit = "1/h" if v.basis == "air_change" else "m3/h"
    for name in ("ventilation_rate", "infiltration"):
        _validate.non_negative(f"{ctx}: ventilation.{name}", getattr(v, name), unit)
    _validate.fraction(f"{ctx}: ventilation.heat_recovery", v.heat_recovery)
    _validate.non_negative(f"{ctx}: ventilation.minimum_air_change", v.minimum_air_change, "1/h")


