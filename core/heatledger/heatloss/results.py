"""Result objects of the heat-loss calculation (plain dataclasses)."""

from __future__ import annotations

from dataclasses import dataclass, field

from .air import VentilationFlows


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
    heat_loss : float
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
    heat_loss: float
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
    temp_inside, temp_outside : float
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
    ventilation : VentilationFlows
        Air flows. [-]
    lines : tuple of LossLine
        Breakdown; shares add up to 1. [-]
    provenance : tuple of str
        Methods that ran. [-]
    warnings : tuple of str
        Input that is probably a slip (a window U above 7, a volume that does not fit the
        floor area), each naming its room and element. [-]
    """

    room: str
    temp_inside: float
    temp_outside: float
    temperature_difference: float
    transmission_coefficient: float
    internal_exchange_coefficient: float
    ventilation_coefficient: float
    heat_loss_coefficient: float
    transmission_heat_loss: float
    ventilation_heat_loss: float
    reheat_allowance: float
    design_heat_load: float
    ventilation: VentilationFlows
    lines: tuple[LossLine, ...]
    provenance: tuple[str, ...]
    warnings: tuple[str, ...] = ()


@dataclass(frozen=True)
class BuildingHeatLoad:
    """Design heat load of a building: its rooms, less exchange between them.

    Parameters
    ----------
    name : str
        Building name. [-]
    temp_outside : float
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
    internal_exchange_heat_loss : float
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
    warnings : tuple of str
        The rooms' warnings. [-]
    """

    name: str
    temp_outside: float
    rooms: tuple[RoomHeatLoad, ...]
    rooms_transmission_coefficient: float
    internal_exchange_coefficient: float
    transmission_coefficient: float
    ventilation_coefficient: float
    heat_loss_coefficient: float
    rooms_design_heat_load: float
    internal_exchange_heat_loss: float
    transmission_heat_loss: float
    ventilation_heat_loss: float
    reheat_allowance: float
    design_heat_load: float
    lines: tuple[LossLine, ...]
    by_kind: dict[str, float]
    provenance: tuple[str, ...]
    warnings: tuple[str, ...] = ()


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
    degree_day_base : float or None
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
    degree_day_base: float | None
    energy: float
    provenance: tuple[str, ...]


@dataclass(frozen=True)
class GroundFloorU:
    """U-value of a ground element (EN ISO 13370) with the inputs behind it.

    Stands as an element's ``u``: it has ``u_value``, ``method`` and ``area``.

    Parameters
    ----------
    result : object
        :class:`~heatledger.ground.SlabOnGroundResult`, ``SuspendedFloorResult`` or
        ``HeatedBasementResult``. [-]
    method_key : str
        ``"slab_on_ground"``, ``"suspended_floor"`` or ``"heated_basement"``. [-]
    area : float
        Area of the element in the room: the floor area, plus ``z P`` of the walls below
        ground for a heated basement. [m2]
    construction : str
        Name of the project construction that gave ``R_f`` (or the deck), "" if declared. [-]
    wall_construction : str
        Name of the construction that gave ``R_w`` of a basement, "" if declared. [-]
    soil : str
        How the ground conductivity was found. [-]
    inputs : dict
        The inputs of the calculation by short name (``w`` [m], ``rf``, ``rw``, ``rg``
        [m2 K/W], ``h`` [m], ``uw`` [W/(m2 K)], ``eps`` [m2/m], ``v`` [m/s], ``rsiw``
        [m2 K/W]) for the calculation sheet. [-]

    References
    ----------
    [source: iso13370-slab, 8.2]; [source: iso13370-floors, 8.3, 8.4].
    """

    result: object
    method_key: str
    area: float
    construction: str = ""
    wall_construction: str = ""
    soil: str = ""
    inputs: dict = field(default_factory=dict, compare=False)

    @property
    def u_value(self) -> float:
        """``U`` (or ``U'`` of a basement) from EN ISO 13370. [W/(m2 K)]"""
        return float(self.result.u_value)

    @property
    def method(self) -> str:
        """What ran. [-]"""
        return f"{self.result.method}; {self.soil}"
