"""Design heat load of rooms and buildings (EN 12831-1 style) and degree-day annual energy.

A :class:`Room` has a design internal temperature, a volume, elements (an area, a U-value and
what lies on the other side), thermal bridges, ventilation and an optional heating-up
(reheat) allowance. Its transmission and ventilation heat-loss coefficients (W/K), its design
heat load at a design external temperature (W), the share of every element and the annual
heating energy from heating degree-days (kWh) are computed here. A :class:`Building` sums its
rooms and removes the heat exchanged between its own rooms, which is not a loss of the
building.

Every method that runs is stated in the results' ``provenance``; nothing is chosen silently
from which inputs happen to be present.

Caution: the design heat load supports, and does not replace, plant sizing by a competent
person under the local building regulations and codes.

References
----------
EN 12831-1:2017, *Energy performance of buildings -- Method for calculation of the design
heat load -- Part 1: Space heating load*, clause 6 (transmission, ventilation and heating-up
terms) [M: every formula recalled; see REFERENCES.md section 5]. CEN/TR 12831-2:2017
(explanation and justification) [C: existence only].
"""

from __future__ import annotations

import math
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field
from typing import Any

import numpy as np
import scipy.constants as const

from . import _validate
from .errors import HeatLedgerError
from .windows import WINDOW_AREA_RTOL, _non_negative_array, _out

__all__ = [
    "ventilation_heat_loss_coefficient",
    "Outside",
    "Ground",
    "Unheated",
    "AdjacentRoom",
    "Element",
    "LinearBridge",
    "PointBridge",
    "Ventilation",
    "VentilationResult",
    "Room",
    "Building",
    "LossLine",
    "RoomHeatLoad",
    "BuildingHeatLoad",
    "AnnualEnergy",
    "ELEMENT_KINDS",
    "AIR_REFERENCE_TEMPERATURE",
    "AIR_REFERENCE_PRESSURE",
    "DRY_AIR_MOLAR_MASS",
    "AIR_DENSITY",
    "AIR_SPECIFIC_HEAT",
    "GROUND_FACTOR_FG1",
    "GROUNDWATER_FACTOR_DEEP",
    "GROUNDWATER_FACTOR_SHALLOW",
]

# ----------------------------------------------------------------------------- air properties

#: Temperature at which the air properties below are stated. [degC]
AIR_REFERENCE_TEMPERATURE = 20.0
#: Pressure at which the air properties below are stated: one standard atmosphere. [Pa]
AIR_REFERENCE_PRESSURE = const.atm
#: Molar mass of dry air, ASHRAE Handbook -- Fundamentals (2017), ch. 1 [M]. [kg/mol]
DRY_AIR_MOLAR_MASS = 28.966e-3
#: Density of dry air at the reference state as an ideal gas, p M / (R T). [kg/m3]
AIR_DENSITY = AIR_REFERENCE_PRESSURE * DRY_AIR_MOLAR_MASS / (
    const.R * (AIR_REFERENCE_TEMPERATURE + const.zero_Celsius)
)
#: Specific heat capacity of dry air at constant pressure near 20 degC: the 1.006 kJ/(kg K)
#: of the ASHRAE Handbook -- Fundamentals (2017) ch. 1 moist-air enthalpy [M]. [J/(kg K)]
AIR_SPECIFIC_HEAT = 1006.0

#: Correction factor for the annual variation of the external temperature, f_g1
#: (EN 12831-1:2017 [M]). [-]
GROUND_FACTOR_FG1 = 1.45
#: Groundwater factor G_w when the water table is more than 1 m below the floor [M]. [-]
GROUNDWATER_FACTOR_DEEP = 1.0
#: Groundwater factor G_w when the water table is 1 m or less below the floor [M]. [-]
GROUNDWATER_FACTOR_SHALLOW = 1.15

#: Kinds of element, for the breakdown by element type. [-]
ELEMENT_KINDS = ("wall", "roof", "ceiling", "floor", "window", "door", "other")

_SECONDS_PER_HOUR = 3600.0


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
    EN 12831-1:2017, clause 6 (ventilation heat-loss coefficient) [M].

    Examples
    --------
    >>> round(ventilation_heat_loss_coefficient(100.0), 2)
    33.65
    """
    flow = _non_negative_array("air_flow_m3_per_h", air_flow_m3_per_h, "m3/h")
    eta = _non_negative_array("heat_recovery", heat_recovery, "")
    if np.any(eta > 1.0):
        raise HeatLedgerError(
            f"heat_recovery must be between 0 and 1; got {float(np.max(eta)):g}"
        )
    rho = _validate.positive("density", density, "kg/m3")
    cp = _validate.positive("specific_heat", specific_heat, "J/(kg K)")
    return _out(rho * cp * flow / _SECONDS_PER_HOUR * (1.0 - eta))


# ----------------------------------------------------------------------------- boundaries


@dataclass(frozen=True)
class Outside:
    """The element faces the external air (factor 1)."""

    def describe(self) -> str:
        """Text for the breakdown. [-]"""
        return "outside"


@dataclass(frozen=True)
class Ground:
    """The element is in contact with the ground; its U-value is ``U_equiv`` (EN ISO 13370).

    Parameters
    ----------
    annual_mean_external_temperature : float
        Annual mean external temperature ``theta_m,e``. [degC]
    f_g1 : float, optional
        Correction for the annual variation of the external temperature; 1.45 [M]. [-]
    groundwater_factor : float, optional
        ``G_w``: 1.00 when the water table is more than 1 m below the floor, 1.15 when it is
        1 m or less [M]. [-]
    """

    annual_mean_external_temperature: float
    f_g1: float = GROUND_FACTOR_FG1
    groundwater_factor: float = GROUNDWATER_FACTOR_DEEP

    def describe(self) -> str:
        """Text for the breakdown. [-]"""
        return f"ground (theta_m,e {self.annual_mean_external_temperature:g} degC)"


@dataclass(frozen=True)
class Unheated:
    """The element faces an unheated space: give its temperature OR its adjustment factor.

    Parameters
    ----------
    temperature : float, optional
        Temperature of the unheated space ``theta_u``. [degC]
    adjustment_factor : float, optional
        Temperature adjustment factor ``b_u`` (0..1) when the temperature is not known. [-]
    """

    temperature: float | None = None
    adjustment_factor: float | None = None

    def describe(self) -> str:
        """Text for the breakdown. [-]"""
        if self.temperature is not None:
            return f"unheated space at {self.temperature:g} degC"
        return f"unheated space, b_u {self.adjustment_factor:g}"


@dataclass(frozen=True)
class AdjacentRoom:
    """The element faces a neighbouring heated space: by room name OR by its temperature.

    Parameters
    ----------
    room : str, optional
        Name of a room of the same :class:`Building`; heat exchanged with it is internal to
        the building. [-]
    temperature : float, optional
        Temperature of a neighbouring space not modelled (another dwelling, another
        building). [degC]
    """

    room: str | None = None
    temperature: float | None = None

    def describe(self) -> str:
        """Text for the breakdown. [-]"""
        if self.room is not None:
            return f"room {self.room!r}"
        return f"adjacent space at {self.temperature:g} degC"


_BOUNDARY_TYPES = (Outside, Ground, Unheated, AdjacentRoom)


# ----------------------------------------------------------------------------- elements


@dataclass(frozen=True)
class Element:
    """A plane element of a room: an area with a U-value and a boundary.

    Checked when the room is built, so that messages can name the room.

    Parameters
    ----------
    name : str
        Name of the element, unique within the room. [-]
    area : float
        Area of the element (for a window, its overall area). [m2]
    u : float, str or object
        The U-value: a number, the name of a construction (resolved through the room's or
        building's ``constructions`` mapping), or any object with a ``u_value`` attribute
        (a construction, :func:`heatledger.windows.window`, :func:`declared_window`,
        :func:`heatledger.ground.slab_on_ground` ...). For a ground element, ``U_equiv``.
        [W/(m2 K)]
    boundary : Outside, Ground, Unheated, AdjacentRoom or "outside"
        What lies on the other side. [-]
    kind : str, optional
        One of :data:`ELEMENT_KINDS`, for the breakdown by type. [-]
    thermal_bridge_allowance : float, optional
        Blanket allowance ``Delta U_TB`` added to U for thermal bridges not listed
        separately. [W/(m2 K)]
    """

    name: str
    area: float
    u: Any
    boundary: Any = "outside"
    kind: str = "wall"
    thermal_bridge_allowance: float = 0.0


@dataclass(frozen=True)
class LinearBridge:
    """A linear thermal bridge, ``psi * length``.

    Parameters
    ----------
    name : str
        Name of the junction. [-]
    psi : float
        Linear thermal transmittance. [W/(m K)]
    length : float
        Length of the junction. [m]
    boundary : Outside, Ground, Unheated, AdjacentRoom or "outside", optional
        Boundary whose temperature factor applies. [-]
    """

    name: str
    psi: float
    length: float
    boundary: Any = "outside"


@dataclass(frozen=True)
class PointBridge:
    """Point thermal bridges, ``chi * count``.

    Parameters
    ----------
    name : str
        Name of the point bridge. [-]
    chi : float
        Point thermal transmittance of one bridge. [W/K]
    count : int, optional
        Number of such bridges. [-]
    boundary : Outside, Ground, Unheated, AdjacentRoom or "outside", optional
        Boundary whose temperature factor applies. [-]
    """

    name: str
    chi: float
    count: int = 1
    boundary: Any = "outside"


# ----------------------------------------------------------------------------- ventilation


@dataclass(frozen=True)
class Ventilation:
    """Ventilation and infiltration of a room, on an explicit basis.

    Parameters
    ----------
    basis : str
        ``"air_change"`` (``ventilation`` and ``infiltration`` in air changes per hour) or
        ``"flow"`` (in m3/h). [-]
    ventilation : float, optional
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
    ventilation: float = 0.0
    infiltration: float = 0.0
    heat_recovery: float = 0.0
    minimum_air_change: float = 0.0


@dataclass(frozen=True)
class VentilationResult:
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


# ----------------------------------------------------------------------------- results


@dataclass(frozen=True)
class LossLine:
    """One line of a heat-loss breakdown: an element, a bridge, ventilation or reheat.

    Parameters
    ----------
    room : str
        Room name. [-]
    name : str
        Element, bridge or line name. [-]
    category : str
        ``"transmission"``, ``"ventilation"`` or ``"reheat"``. [-]
    kind : str
        Element kind, ``"linear bridge"``, ``"point bridge"``, ``"ventilation"`` or
        ``"reheat"``. [-]
    boundary : str
        What lies on the other side. [-]
    quantity : float
        Area, length, count, effective air flow or floor area. [see quantity_unit]
    quantity_unit : str
        Unit of ``quantity``. [-]
    transmittance : float
        U-value, psi, chi, ``rho c_p/3600`` or ``f_RH``. [see transmittance_unit]
    transmittance_unit : str
        Unit of ``transmittance``. [-]
    bridge_allowance : float
        ``Delta U_TB`` added to the U-value (elements only). [W/(m2 K)]
    factor : float
        Temperature adjustment factor applied. [-]
    factor_rule : str
        How the factor was found. [-]
    coefficient : float
        Heat-loss coefficient of the line (0 for reheat). [W/K]
    heat_flow : float
        Heat flow at the external temperature of the result. [W]
    share : float
        Share of the design heat load of the room (or building). [-]
    internal : bool
        True for exchange with a room of the same building. [-]
    source : str
        Where the U-value (or transmittance) came from. [-]
    """

    room: str
    name: str
    category: str
    kind: str
    boundary: str
    quantity: float
    quantity_unit: str
    transmittance: float
    transmittance_unit: str
    bridge_allowance: float
    factor: float
    factor_rule: str
    coefficient: float
    heat_flow: float
    share: float
    internal: bool
    source: str


@dataclass(frozen=True)
class RoomHeatLoad:
    """Design heat load of one room with every step.

    Parameters
    ----------
    room : str
        Room name. [-]
    internal_temperature, external_temperature : float
        Design temperatures. [degC]
    temperature_difference : float
        ``theta_int - theta_e``. [K]
    transmission_coefficient, ventilation_coefficient, heat_loss_coefficient : float
        ``H_T``, ``H_V`` and their sum. [W/K]
    internal_exchange_coefficient : float
        Part of ``H_T`` towards rooms of the same building. [W/K]
    transmission_heat_loss, ventilation_heat_loss, reheat_allowance : float
        ``Phi_T``, ``Phi_V``, ``Phi_hu``. [W]
    design_heat_load : float
        ``Phi_HL = Phi_T + Phi_V + Phi_hu``. [W]
    ventilation : VentilationResult
        Air flows. [-]
    lines : tuple of LossLine
        Breakdown; shares add up to 1. [-]
    provenance : tuple of str
        Methods that ran. [-]
    """

    room: str
    internal_temperature: float
    external_temperature: float
    temperature_difference: float
    transmission_coefficient: float
    internal_exchange_coefficient: float
    ventilation_coefficient: float
    heat_loss_coefficient: float
    transmission_heat_loss: float
    ventilation_heat_loss: float
    reheat_allowance: float
    design_heat_load: float
    ventilation: VentilationResult
    lines: tuple[LossLine, ...]
    provenance: tuple[str, ...]


@dataclass(frozen=True)
class BuildingHeatLoad:
    """Design heat load of a building: its rooms, less exchange between them.

    Parameters
    ----------
    name : str
        Building name. [-]
    external_temperature : float
        Design external temperature. [degC]
    rooms : tuple of RoomHeatLoad
        Per-room results (internal exchange included, as a room sees it). [-]
    rooms_transmission_coefficient : float
        Sum of the rooms' ``H_T``. [W/K]
    internal_exchange_coefficient : float
        Sum of the rooms' coefficients towards rooms of this building. [W/K]
    transmission_coefficient : float
        Building ``H_T`` = rooms' sum less internal exchange. [W/K]
    ventilation_coefficient : float
        Sum of the rooms' ``H_V``. [W/K]
    heat_loss_coefficient : float
        ``H_T + H_V``. [W/K]
    rooms_design_heat_load : float
        Sum of the rooms' design heat loads. [W]
    internal_exchange_heat_flow : float
        Net heat flow between rooms of this building, as summed over rooms. [W]
    transmission_heat_loss, ventilation_heat_loss, reheat_allowance : float
        Building totals. [W]
    design_heat_load : float
        Building design heat load. [W]
    lines : tuple of LossLine
        Building breakdown (internal exchange left out); shares of the building load. [-]
    by_kind : dict
        Heat flow by element kind (and ventilation, reheat), for a chart. [W]
    provenance : tuple of str
        Methods that ran. [-]
    """

    name: str
    external_temperature: float
    rooms: tuple[RoomHeatLoad, ...]
    rooms_transmission_coefficient: float
    internal_exchange_coefficient: float
    transmission_coefficient: float
    ventilation_coefficient: float
    heat_loss_coefficient: float
    rooms_design_heat_load: float
    internal_exchange_heat_flow: float
    transmission_heat_loss: float
    ventilation_heat_loss: float
    reheat_allowance: float
    design_heat_load: float
    lines: tuple[LossLine, ...]
    by_kind: dict[str, float]
    provenance: tuple[str, ...]


@dataclass(frozen=True)
class AnnualEnergy:
    """Annual heating energy from heating degree-days.

    Parameters
    ----------
    subject : str
        Room or building name. [-]
    heat_loss_coefficient : float
        ``H = H_T + H_V`` used. [W/K]
    transmission_coefficient, ventilation_coefficient : float
        Its parts. [W/K]
    degree_days : float
        Heating degree-days. [K day]
    base_temperature : float or None
        Base temperature of the degree-days, as stated by the user (None: not stated). [degC]
    energy : float
        ``Q = 24 H DD / 1000``. [kWh]
    provenance : tuple of str
        Methods that ran. [-]
    """

    subject: str
    heat_loss_coefficient: float
    transmission_coefficient: float
    ventilation_coefficient: float
    degree_days: float
    base_temperature: float | None
    energy: float
    provenance: tuple[str, ...]


# ----------------------------------------------------------------------------- rooms


@dataclass(frozen=True)
class Room:
    """A heated room (or zone) and its heat losses, EN 12831-1 style.

    Parameters
    ----------
    name : str
        Room name, unique within a building. [-]
    internal_temperature : float
        Design internal temperature ``theta_int``. [degC]
    volume : float
        Internal air volume ``V``. [m3]
    elements : sequence of Element
        The room's elements. [-]
    ventilation : Ventilation
        Ventilation and infiltration. [-]
    thermal_bridges : sequence of LinearBridge or PointBridge, optional
        Thermal bridges listed separately. [-]
    floor_area : float, optional
        Floor area for the heating-up allowance. [m2]
    reheat_factor : float, optional
        Heating-up (reheat) factor ``f_RH``, from a national table by reheat time and
        temperature drop; 0 for none. [W/m2]
    design_external_temperature : float, optional
        Design external temperature ``theta_e`` at which ``transmission_coefficient`` is
        stated; needed when a boundary is given by temperature or is the ground. [degC]
    constructions : mapping, optional
        Constructions by name, for elements whose ``u`` is a name. [-]
    """

    name: str
    internal_temperature: float
    volume: float
    elements: Sequence[Element]
    ventilation: Ventilation
    thermal_bridges: Sequence[LinearBridge | PointBridge] = ()
    floor_area: float = 0.0
    reheat_factor: float = 0.0
    design_external_temperature: float | None = None
    constructions: Mapping[str, Any] | None = field(default=None, compare=False)

    def __post_init__(self) -> None:
        if not isinstance(self.name, str) or not self.name.strip():
            raise HeatLedgerError(f"room name must be a non-empty text; got {self.name!r}")
        ctx = f"room {self.name!r}"
        object.__setattr__(self, "internal_temperature",
                           _validate.finite(f"{ctx}: internal_temperature",
                                            self.internal_temperature))
        object.__setattr__(self, "volume",
                           _validate.positive(f"{ctx}: volume", self.volume, "m3"))
        object.__setattr__(self, "floor_area", _validate.non_negative(
            f"{ctx}: floor_area", self.floor_area, "m2"))
        object.__setattr__(self, "reheat_factor", _validate.non_negative(
            f"{ctx}: reheat_factor", self.reheat_factor, "W/m2"))
        if self.reheat_factor > 0.0 and self.floor_area <= 0.0:
            raise HeatLedgerError(
                f"{ctx}: a reheat_factor of {self.reheat_factor:g} W/m2 needs the floor_area "
                "it applies to; got floor_area 0 m2"
            )
        if self.design_external_temperature is not None:
            te = _validate.finite(f"{ctx}: design_external_temperature",
                                  self.design_external_temperature)
            object.__setattr__(self, "design_external_temperature", te)
        if not isinstance(self.ventilation, Ventilation):
            raise HeatLedgerError(
                f"{ctx}: ventilation must be a Ventilation(...); got {self.ventilation!r}"
            )
        _check_ventilation(ctx, self.ventilation)
        elements = tuple(self.elements)
        bridges = tuple(self.thermal_bridges)
        seen: set[str] = set()
        for el in elements:
            _check_element(ctx, el, seen)
        for br in bridges:
            _check_bridge(ctx, br, seen)
        object.__setattr__(self, "elements", elements)
        object.__setattr__(self, "thermal_bridges", bridges)

    # -- coefficients at the design external temperature

    @property
    def transmission_coefficient(self) -> float:
        """``H_T`` at :attr:`design_external_temperature`. [W/K]"""
        return self._evaluate(self.design_external_temperature, None, None).transmission_coefficient

    @property
    def ventilation_coefficient(self) -> float:
        """``H_V``. [W/K]"""
        return self.ventilation_result().coefficient

    @property
    def heat_loss_coefficient(self) -> float:
        """``H_T + H_V``. [W/K]"""
        return self.transmission_coefficient + self.ventilation_coefficient

    def ventilation_result(self) -> VentilationResult:
        """Air flows and ``H_V`` of this room.

        Returns
        -------
        VentilationResult
            Flows and coefficient. [-]
        """
        return _ventilation(self.ventilation, self.volume)

    def heat_load(self, external_temperature) -> RoomHeatLoad:
        """Design heat load of this room alone, with every step.

        Parameters
        ----------
        external_temperature : float
            Design external temperature ``theta_e``. [degC]

        Returns
        -------
        RoomHeatLoad
            Coefficients, heat flows, breakdown and provenance. [-]

        Raises
        ------
        HeatLedgerError
            If ``theta_e`` is not below the internal temperature, or an element faces a room
            by name (only a :class:`Building` can resolve it), or a construction name is
            unknown.

        Notes
        -----
        .. math::

            \\Phi_{HL} = (H_T + H_V)(\\theta_{int} - \\theta_e) + f_{RH} A_{floor}

            H_T = \\sum_k A_k (U_k + \\Delta U_{TB}) f_k + \\sum_l \\psi_l l_l f_l
                  + \\sum_j \\chi_j f_j

        with :math:`f = 1` outside, :math:`b_u` or
        :math:`(\\theta_{int} - \\theta_u)/(\\theta_{int} - \\theta_e)` to an unheated space,
        :math:`(\\theta_{int} - \\theta_{adj})/(\\theta_{int} - \\theta_e)` to another heated
        space, and :math:`f_{g1} f_{g2} G_w` with
        :math:`f_{g2} = (\\theta_{int} - \\theta_{m,e})/(\\theta_{int} - \\theta_e)` to the
        ground.

        References
        ----------
        EN 12831-1:2017, clause 6 [M: recalled].
        """
        te = _validate.finite("external_temperature", external_temperature)
        return self._evaluate(te, None, None)

    def design_heat_load(self, external_temperature) -> float:
        """Design heat load ``Phi_HL`` of this room.

        Parameters
        ----------
        external_temperature : float
            Design external temperature. [degC]

        Returns
        -------
        float
            Design heat load. [W]

        Raises
        ------
        HeatLedgerError
            As :meth:`heat_load`.
        """
        return self.heat_load(external_temperature).design_heat_load

    def annual_energy_result(self, degree_days, *, base_temperature=None) -> AnnualEnergy:
        """Annual heating energy of this room from heating degree-days, with provenance.

        Parameters
        ----------
        degree_days : float
            Heating degree-days on the base appropriate to the room. [K day]
        base_temperature : float, optional
            Base temperature of the degree-days, recorded in the result. [degC]

        Returns
        -------
        AnnualEnergy
            ``Q = 24 (H_T + H_V) DD / 1000``, with the coefficients used. [-]
        """
        h_t = self.transmission_coefficient
        return _annual(self.name, h_t, self.ventilation_coefficient, degree_days,
                       base_temperature, self.design_external_temperature)

    def annual_energy(self, degree_days, *, base_temperature=None) -> float:
        """Annual heating energy of this room from heating degree-days.

        Parameters
        ----------
        degree_days : float
            Heating degree-days. [K day]
        base_temperature : float, optional
            Base temperature of the degree-days, recorded by
            :meth:`annual_energy_result`. [degC]

        Returns
        -------
        float
            ``Q = 24 H DD / 1000``. [kWh]
        """
        return self.annual_energy_result(degree_days, base_temperature=base_temperature).energy

    # -- the evaluation proper

    def _evaluate(self, te, room_temps, building_constructions) -> RoomHeatLoad:
        ctx = f"room {self.name!r}"
        ti = self.internal_temperature
        if te is not None and not te < ti:
            raise HeatLedgerError(
                f"{ctx}: external_temperature {te:g} degC must be below the internal "
                f"temperature {ti:g} degC for a design heat load"
            )
        lines: list[dict] = []
        for el in self.elements:
            ectx = f"{ctx}, element {el.name!r}"
            u, source = _resolve_u(ectx, el, self.constructions, building_constructions)
            f, rule, internal, label = _factor(ectx, el.boundary, ti, te, room_temps, self.name)
            ue = u + el.thermal_bridge_allowance
            lines.append(dict(name=el.name, category="transmission", kind=el.kind,
                              boundary=label, quantity=el.area, quantity_unit="m2",
                              transmittance=u, transmittance_unit="W/(m2 K)",
                              bridge_allowance=el.thermal_bridge_allowance, factor=f,
                              factor_rule=rule, coefficient=el.area * ue * f,
                              internal=internal, source=source))
        for br in self.thermal_bridges:
            bctx = f"{ctx}, thermal bridge {br.name!r}"
            f, rule, internal, label = _factor(bctx, br.boundary, ti, te, room_temps, self.name)
            if isinstance(br, LinearBridge):
                q, qu, t, tu, kind = br.length, "m", br.psi, "W/(m K)", "linear bridge"
            else:
                q, qu, t, tu, kind = float(br.count), "-", br.chi, "W/K", "point bridge"
            lines.append(dict(name=br.name, category="transmission", kind=kind, boundary=label,
                              quantity=q, quantity_unit=qu, transmittance=t,
                              transmittance_unit=tu, bridge_allowance=0.0, factor=f,
                              factor_rule=rule, coefficient=q * t * f, internal=internal,
                              source="given"))
        vent = self.ventilation_result()
        lines.append(dict(name="ventilation", category="ventilation", kind="ventilation",
                          boundary="outside air", quantity=vent.effective_flow,
                          quantity_unit="m3/h", transmittance=vent.volumetric_heat_capacity,
                          transmittance_unit="W h/(m3 K)", bridge_allowance=0.0, factor=1.0,
                          factor_rule=vent.method, coefficient=vent.coefficient,
                          internal=False, source="air properties at 20 degC, 101325 Pa"))
        reheat = self.reheat_factor * self.floor_area
        lines.append(dict(name="heating-up allowance", category="reheat", kind="reheat",
                          boundary="-", quantity=self.floor_area, quantity_unit="m2",
                          transmittance=self.reheat_factor, transmittance_unit="W/m2",
                          bridge_allowance=0.0, factor=1.0,
                          factor_rule="Phi_hu = f_RH A_floor (input)", coefficient=0.0,
                          internal=False, source="input f_RH"))
        dt = math.nan if te is None else ti - te
        for ln in lines:
            ln["heat_flow"] = reheat if ln["category"] == "reheat" else ln["coefficient"] * dt
        h_t = sum(ln["coefficient"] for ln in lines if ln["category"] == "transmission")
        h_int = sum(ln["coefficient"] for ln in lines if ln["internal"])
        phi_t = h_t * dt
        phi_v = vent.coefficient * dt
        total = phi_t + phi_v + reheat
        frozen = tuple(
            LossLine(room=self.name, share=_share(ln["heat_flow"], total), **ln) for ln in lines
        )
        prov = (
            f"design external temperature: {te!r} degC; internal {ti:g} degC",
            "transmission: EN 12831-1:2017 clause 6, H_T = sum A (U + dU_TB) f + sum psi l f "
            "+ sum chi f [M]",
            f"ventilation: {vent.method}",
            f"air: rho {AIR_DENSITY:.4f} kg/m3 (ideal dry air, 20 degC, 101325 Pa), c_p "
            f"{AIR_SPECIFIC_HEAT:g} J/(kg K) [M]",
            "heating-up: Phi_hu = f_RH A_floor, f_RH input" if reheat > 0 else
            "heating-up: none (f_RH 0)",
        )
        return RoomHeatLoad(
            room=self.name, internal_temperature=ti, external_temperature=te,
            temperature_difference=dt, transmission_coefficient=h_t,
            internal_exchange_coefficient=h_int, ventilation_coefficient=vent.coefficient,
            heat_loss_coefficient=h_t + vent.coefficient, transmission_heat_loss=phi_t,
            ventilation_heat_loss=phi_v, reheat_allowance=reheat, design_heat_load=total,
            ventilation=vent, lines=frozen, provenance=prov,
        )


# ----------------------------------------------------------------------------- building


@dataclass(frozen=True)
class Building:
    """A building: its rooms, less the heat they exchange with each other.

    Parameters
    ----------
    name : str
        Building name. [-]
    rooms : sequence of Room
        Rooms with unique names. [-]
    constructions : mapping, optional
        Constructions by name for elements whose ``u`` is a name (looked up after the room's
        own mapping; a name in both must be the same object). [-]
    design_external_temperature : float, optional
        Design external temperature at which the coefficients are stated; rooms that state
        their own must agree with it. [degC]
    """

    name: str
    rooms: Sequence[Room]
    constructions: Mapping[str, Any] | None = field(default=None, compare=False)
    design_external_temperature: float | None = None

    def __post_init__(self) -> None:
        rooms = tuple(self.rooms)
        if not rooms:
            raise HeatLedgerError(f"building {self.name!r} must have at least one room")
        names: set[str] = set()
        for r in rooms:
            if not isinstance(r, Room):
                raise HeatLedgerError(f"building {self.name!r}: rooms must be Room objects; "
                                      f"got {r!r}")
            if r.name in names:
                raise HeatLedgerError(f"building {self.name!r}: room name {r.name!r} "
                                      "appears twice; room names must be unique")
            names.add(r.name)
        object.__setattr__(self, "rooms", rooms)
        temps = {r.design_external_temperature for r in rooms} - {None}
        te = self.design_external_temperature
        if te is not None:
            te = _validate.finite(f"building {self.name!r}: design_external_temperature", te)
            object.__setattr__(self, "design_external_temperature", te)
            temps.add(te)
        if len(temps) > 1:
            raise HeatLedgerError(
                f"building {self.name!r}: the rooms and building state different design "
                f"external temperatures {sorted(temps)}; one building has one design value"
            )
        object.__setattr__(self, "_te", temps.pop() if temps else None)
        temps_by_room = {r.name: r.internal_temperature for r in rooms}
        object.__setattr__(self, "_room_temps", temps_by_room)

    @property
    def transmission_coefficient(self) -> float:
        """Building ``H_T``: rooms' sum less internal exchange. [W/K]"""
        return self._evaluate(self._te).transmission_coefficient  # type: ignore[attr-defined]

    @property
    def ventilation_coefficient(self) -> float:
        """Building ``H_V``: sum over rooms. [W/K]"""
        return sum(r.ventilation_coefficient for r in self.rooms)

    @property
    def heat_loss_coefficient(self) -> float:
        """``H_T + H_V``. [W/K]"""
        return self.transmission_coefficient + self.ventilation_coefficient

    def heat_load(self, external_temperature) -> BuildingHeatLoad:
        """Design heat load of the building and of every room, with every step.

        Parameters
        ----------
        external_temperature : float
            Design external temperature. [degC]

        Returns
        -------
        BuildingHeatLoad
            Room results, building totals, breakdown and provenance. [-]

        Raises
        ------
        HeatLedgerError
            As :meth:`Room.heat_load`, and for an element naming a room not in the
            building.

        Notes
        -----
        .. math::

            \\Phi_{HL,bldg} = \\sum_i (\\Phi_{HL,i} - \\Phi_{int,i}), \\qquad
            H_{T,bldg} = \\sum_i (H_{T,i} - H_{int,i})

        where the internal parts are the elements and bridges facing rooms of the same
        building.

        References
        ----------
        EN 12831-1:2017, clause 6 (building heat load) [M].
        """
        te = _validate.finite("external_temperature", external_temperature)
        return self._evaluate(te)

    def design_heat_load(self, external_temperature) -> float:
        """Building design heat load.

        Parameters
        ----------
        external_temperature : float
            Design external temperature. [degC]

        Returns
        -------
        float
            Design heat load of the building. [W]
        """
        return self.heat_load(external_temperature).design_heat_load

    def annual_energy_result(self, degree_days, *, base_temperature=None) -> AnnualEnergy:
        """Annual heating energy of the building from heating degree-days, with provenance.

        Parameters
        ----------
        degree_days : float
            Heating degree-days. [K day]
        base_temperature : float, optional
            Base temperature of the degree-days, recorded in the result. [degC]

        Returns
        -------
        AnnualEnergy
            ``Q = 24 H DD / 1000`` with the building's coefficients. [-]
        """
        return _annual(self.name, self.transmission_coefficient, self.ventilation_coefficient,
                       degree_days, base_temperature, self._te)  # type: ignore[attr-defined]

    def annual_energy(self, degree_days, *, base_temperature=None) -> float:
        """Annual heating energy of the building from heating degree-days.

        Parameters
        ----------
        degree_days : float
            Heating degree-days. [K day]
        base_temperature : float, optional
            Base temperature of the degree-days. [degC]

        Returns
        -------
        float
            ``Q = 24 H DD / 1000``. [kWh]
        """
        return self.annual_energy_result(degree_days, base_temperature=base_temperature).energy

    def room_annual_energy(self, degree_days, *, base_temperature=None) -> dict:
        """Annual heating energy of every room, with the room-to-room exchange resolved.

        Parameters
        ----------
        degree_days : float
            Heating degree-days. [K day]
        base_temperature : float, optional
            Base temperature of the degree-days. [degC]

        Returns
        -------
        dict of str to AnnualEnergy
            Per room, ``Q = 24 (H_T + H_V) DD / 1000`` with the room's own coefficients
            (exchange with other rooms included, as the room sees it). [-]
        """
        result = self._evaluate(self._te)  # type: ignore[attr-defined]
        return {
            r.room: _annual(r.room, r.transmission_coefficient, r.ventilation_coefficient,
                            degree_days, base_temperature, self._te)  # type: ignore[attr-defined]
            for r in result.rooms
        }

    def _evaluate(self, te) -> BuildingHeatLoad:
        results = tuple(
            r._evaluate(te, self._room_temps, self.constructions)  # type: ignore[attr-defined]
            for r in self.rooms
        )
        h_sum = sum(r.transmission_coefficient for r in results)
        h_int = sum(r.internal_exchange_coefficient for r in results)
        h_v = sum(r.ventilation_coefficient for r in results)
        q_int = sum(ln.heat_flow for r in results for ln in r.lines if ln.internal)
        phi_t = sum(r.transmission_heat_loss for r in results) - q_int
        phi_v = sum(r.ventilation_heat_loss for r in results)
        reheat = sum(r.reheat_allowance for r in results)
        total = phi_t + phi_v + reheat
        lines = tuple(
            _replace_share(ln, total) for r in results for ln in r.lines if not ln.internal
        )
        by_kind: dict[str, float] = {}
        for ln in lines:
            by_kind[ln.kind] = by_kind.get(ln.kind, 0.0) + ln.heat_flow
        prov = (
            f"building {self.name!r}: {len(results)} rooms, design external temperature "
            f"{te!r} degC",
            "building H_T = sum of room H_T less exchange with rooms of this building; "
            "H_V = sum of room H_V (no infiltration diversity applied)",
            *results[0].provenance[1:4],
        )
        return BuildingHeatLoad(
            name=self.name, external_temperature=te, rooms=results,
            rooms_transmission_coefficient=h_sum, internal_exchange_coefficient=h_int,
            transmission_coefficient=h_sum - h_int, ventilation_coefficient=h_v,
            heat_loss_coefficient=h_sum - h_int + h_v,
            rooms_design_heat_load=sum(r.design_heat_load for r in results),
            internal_exchange_heat_flow=q_int, transmission_heat_loss=phi_t,
            ventilation_heat_loss=phi_v, reheat_allowance=reheat, design_heat_load=total,
            lines=lines, by_kind=by_kind, provenance=prov,
        )


# ----------------------------------------------------------------------------- helpers


def _share(value: float, total: float) -> float:
    return value / total if total != 0.0 and math.isfinite(total) else math.nan


def _replace_share(line: LossLine, total: float) -> LossLine:
    from dataclasses import replace

    return replace(line, share=_share(line.heat_flow, total))


def _annual(subject, h_t, h_v, degree_days, base_temperature, te) -> AnnualEnergy:
    dd = _validate.non_negative("degree_days", degree_days, "K day")
    base = None if base_temperature is None else _validate.finite("base_temperature",
                                                                  base_temperature)
    h = h_t + h_v
    energy = 24.0 * h * dd / 1000.0
    base_text = (f"base temperature {base:g} degC (as stated)" if base is not None else
                 "base temperature NOT STATED: the degree-days must be on the base "
                 "appropriate to the building")
    prov = (
        "annual energy: Q = 24 H DD / 1000 (degree-day method) [M]",
        f"degree-days {dd:g} K day, {base_text}",
        f"H = H_T + H_V = {h_t:.6g} + {h_v:.6g} W/K, adjustment factors at the design "
        f"external temperature {te!r} degC; heating-up allowance not included; gains not "
        "deducted (allow for them through the base temperature)",
    )
    return AnnualEnergy(subject=subject, heat_loss_coefficient=h, transmission_coefficient=h_t,
                        ventilation_coefficient=h_v, degree_days=dd, base_temperature=base,
                        energy=energy, provenance=prov)


def _ventilation(v: Ventilation, volume: float) -> VentilationResult:
    scale = volume if v.basis == "air_change" else 1.0
    vent = v.ventilation * scale
    inf = v.infiltration * scale
    vmin = v.minimum_air_change * volume
    top_up = max(0.0, vmin - (vent + inf))
    eff = inf + vent * (1.0 - v.heat_recovery) + top_up
    c = AIR_DENSITY * AIR_SPECIFIC_HEAT / _SECONDS_PER_HOUR
    method = (
        f"basis {v.basis!r}; V_eff = V_inf + V_vent (1 - eta) + max(0, n_min V - V_inf - "
        f"V_vent); eta {v.heat_recovery:g}; minimum air change "
        + ("governs" if top_up > 0.0 else "met")
        + "; EN 12831-1 style [M]"
    )
    return VentilationResult(
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
    for name in ("ventilation", "infiltration"):
        _validate.non_negative(f"{ctx}: ventilation.{name}", getattr(v, name), unit)
    _validate.fraction(f"{ctx}: ventilation.heat_recovery", v.heat_recovery)
    _validate.non_negative(f"{ctx}: ventilation.minimum_air_change", v.minimum_air_change, "1/h")


def _check_name(ctx: str, what: str, name, seen: set[str]) -> str:
    if not isinstance(name, str) or not name.strip():
        raise HeatLedgerError(f"{ctx}: every {what} needs a non-empty name; got {name!r}")
    if name in seen:
        raise HeatLedgerError(f"{ctx}: the name {name!r} is used twice; names of elements "
                              "and thermal bridges must be unique within a room")
    seen.add(name)
    return f"{ctx}, {what} {name!r}"


def _check_element(ctx: str, el, seen: set[str]) -> None:
    if not isinstance(el, Element):
        raise HeatLedgerError(f"{ctx}: elements must be Element objects; got {el!r}")
    ectx = _check_name(ctx, "element", el.name, seen)
    area = _validate.positive(f"{ectx}: area", el.area, "m2")
    _validate.choice(f"{ectx}: kind", el.kind, ELEMENT_KINDS)
    dutb = _validate.non_negative(f"{ectx}: thermal_bridge_allowance",
                                  el.thermal_bridge_allowance, "W/(m2 K)")
    object.__setattr__(el, "thermal_bridge_allowance", dutb)
    object.__setattr__(el, "area", area)
    object.__setattr__(el, "boundary", _check_boundary(ectx, el.boundary))
    u = el.u
    if isinstance(u, str):
        return
    if not isinstance(u, (int, float, np.floating, np.integer)) or isinstance(u, bool):
        if not hasattr(u, "u_value"):
            raise HeatLedgerError(
                f"{ectx}: u must be a number (W/(m2 K)), a construction name, or an object "
                f"with a u_value attribute; got {u!r}"
            )
        frame = getattr(u, "frame_area", None)
        if isinstance(frame, (int, float)) and frame > area:
            raise HeatLedgerError(
                f"{ectx}: frame area {frame:g} m2 is larger than the window area {area:g} m2"
            )
        own = getattr(u, "area", None)
        if isinstance(own, (int, float)) and abs(own - area) > WINDOW_AREA_RTOL * area:
            raise HeatLedgerError(
                f"{ectx}: element area {area:g} m2 differs from the area {own:g} m2 its "
                f"U-value object ({type(u).__name__}) was computed for"
            )


def _check_bridge(ctx: str, br, seen: set[str]) -> None:
    if isinstance(br, LinearBridge):
        bctx = _check_name(ctx, "thermal bridge", br.name, seen)
        object.__setattr__(br, "psi", _validate.finite(f"{bctx}: psi", br.psi))
        object.__setattr__(br, "length", _validate.positive(f"{bctx}: length", br.length, "m"))
    elif isinstance(br, PointBridge):
        bctx = _check_name(ctx, "thermal bridge", br.name, seen)
        object.__setattr__(br, "chi", _validate.finite(f"{bctx}: chi", br.chi))
        if isinstance(br.count, bool) or not isinstance(br.count, int) or br.count < 1:
            raise HeatLedgerError(f"{bctx}: count must be a whole number of at least 1; "
                                  f"got {br.count!r}")
    else:
        raise HeatLedgerError(
            f"{ctx}: thermal_bridges must be LinearBridge or PointBridge objects; got {br!r}"
        )
    object.__setattr__(br, "boundary", _check_boundary(bctx, br.boundary))


def _check_boundary(ctx: str, b):
    if isinstance(b, str):
        if b.strip().lower() == "outside":
            return Outside()
        raise HeatLedgerError(
            f"{ctx}: boundary {b!r} needs its data; use 'outside', Outside(), "
            "Ground(annual_mean_external_temperature=...), Unheated(temperature=... or "
            "adjustment_factor=...) or AdjacentRoom(room=... or temperature=...)"
        )
    if not isinstance(b, _BOUNDARY_TYPES):
        raise HeatLedgerError(f"{ctx}: boundary must be 'outside', Outside, Ground, Unheated "
                              f"or AdjacentRoom; got {b!r}")
    if isinstance(b, Ground):
        _validate.finite(f"{ctx}: annual_mean_external_temperature",
                         b.annual_mean_external_temperature)
        _validate.positive(f"{ctx}: f_g1", b.f_g1)
        _validate.positive(f"{ctx}: groundwater_factor", b.groundwater_factor)
    elif isinstance(b, Unheated):
        if (b.temperature is None) == (b.adjustment_factor is None):
            raise HeatLedgerError(
                f"{ctx}: Unheated needs exactly one of temperature or adjustment_factor; got "
                f"temperature={b.temperature!r}, adjustment_factor={b.adjustment_factor!r}"
            )
        if b.temperature is not None:
            _validate.finite(f"{ctx}: unheated temperature", b.temperature)
        else:
            _validate.fraction(f"{ctx}: adjustment_factor b_u", b.adjustment_factor)
    elif isinstance(b, AdjacentRoom):
        if (b.room is None) == (b.temperature is None):
            raise HeatLedgerError(
                f"{ctx}: AdjacentRoom needs exactly one of room (a name) or temperature; got "
                f"room={b.room!r}, temperature={b.temperature!r}"
            )
        if b.temperature is not None:
            _validate.finite(f"{ctx}: adjacent temperature", b.temperature)
    return b


def _resolve_u(ctx: str, el: Element, own, building) -> tuple[float, str]:
    u = el.u
    if isinstance(u, str):
        found = []
        for where, mapping in (("room", own), ("building", building)):
            if mapping is not None and u in mapping:
                found.append((where, mapping[u]))
        if not found:
            known = sorted({*(own or {}), *(building or {})})
            raise HeatLedgerError(
                f"{ctx}: construction {u!r} does not exist; known constructions: "
                f"{', '.join(map(repr, known)) or 'none (give a constructions mapping)'}"
            )
        if len(found) == 2 and found[0][1] is not found[1][1]:
            raise HeatLedgerError(f"{ctx}: construction {u!r} is defined differently by the "
                                  "room and the building; keep one definition")
        obj = found[0][1]
        value = obj if isinstance(obj, (int, float)) else getattr(obj, "u_value", None)
        source = f"construction {u!r} ({found[0][0]} mapping)"
    elif isinstance(u, (int, float, np.floating, np.integer)):
        value, source = u, "given U-value"
    else:
        value = u.u_value
        source = f"{type(u).__name__}.u_value"
        if getattr(u, "method", None):
            source += f" ({u.method})"
    if value is None:
        raise HeatLedgerError(f"{ctx}: construction {u!r} has no u_value")
    return _validate.non_negative(f"{ctx}: U-value", value, "W/(m2 K)"), source


def _factor(ctx, b, ti, te, room_temps, own_name):
    """Temperature adjustment factor, its rule text, whether internal, and a label."""

    def need_te(what: str) -> float:
        if te is None:
            raise HeatLedgerError(
                f"{ctx}: {what} is expressed as a coefficient only at a design external "
                "temperature; give the room's (or building's) design_external_temperature"
            )
        return te

    if isinstance(b, Outside):
        return 1.0, "outside: f = 1", False, b.describe()
    if isinstance(b, Unheated):
        if b.adjustment_factor is not None:
            return float(b.adjustment_factor), "b_u given", False, b.describe()
        t = need_te("a boundary at a stated temperature")
        f = (ti - b.temperature) / (ti - t)
        return f, "b_u = (theta_int - theta_u)/(theta_int - theta_e)", False, b.describe()
    if isinstance(b, Ground):
        t = need_te("a ground boundary (f_g2)")
        fg2 = (ti - b.annual_mean_external_temperature) / (ti - t)
        f = b.f_g1 * fg2 * b.groundwater_factor
        rule = (f"f_g1 f_g2 G_w = {b.f_g1:g} x {fg2:.6g} x {b.groundwater_factor:g}, "
                "f_g2 = (theta_int - theta_m,e)/(theta_int - theta_e)")
        return f, rule, False, b.describe()
    # AdjacentRoom
    if b.temperature is not None:
        t = need_te("a boundary at a stated temperature")
        f = (ti - b.temperature) / (ti - t)
        return f, "f_ij = (theta_int - theta_adj)/(theta_int - theta_e)", False, b.describe()
    if room_temps is None:
        raise HeatLedgerError(
            f"{ctx}: faces room {b.room!r} by name, which only a Building can resolve; put "
            "both rooms in a Building, or give AdjacentRoom(temperature=...)"
        )
    if b.room == own_name:
        raise HeatLedgerError(f"{ctx}: an element cannot face its own room {own_name!r}")
    if b.room not in room_temps:
        raise HeatLedgerError(
            f"{ctx}: faces room {b.room!r}, which does not exist in the building; rooms are "
            f"{', '.join(map(repr, room_temps))}"
        )
    tj = room_temps[b.room]
    t = need_te(f"exchange with room {b.room!r}")
    f = (ti - tj) / (ti - t)
    return (f, "f_ij = (theta_int,i - theta_int,j)/(theta_int,i - theta_e)", True,
            f"room {b.room!r} at {tj:g} degC")
