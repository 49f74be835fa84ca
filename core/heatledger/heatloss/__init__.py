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
terms) [M: every formula recalled; [source: en12831-1]]. CEN/TR 12831-2:2017
(explanation and justification) [C: existence only].
"""

from __future__ import annotations

from .air import (
    AIR_DENSITY,
    AIR_REFERENCE_PRESSURE,
    AIR_REFERENCE_TEMPERATURE,
    AIR_SPECIFIC_HEAT,
    DRY_AIR_MOLAR_MASS,
    Ventilation,
    VentilationFlows,
    ventilation_heat_loss_coefficient,
)
from .elements import (
    ELEMENT_KINDS,
    GROUND_FACTOR_FG1,
    GROUNDWATER_FACTOR_DEEP,
    GROUNDWATER_FACTOR_SHALLOW,
    AdjacentRoom,
    Element,
    Ground,
    LinearBridge,
    Outside,
    PointBridge,
    Unheated,
)
from .results import AnnualEnergy, BuildingHeatLoad, GroundFloorU, LossLine, RoomHeatLoad
from .rooms import Building, Room

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
    "VentilationFlows",
    "Room",
    "Building",
    "LossLine",
    "RoomHeatLoad",
    "BuildingHeatLoad",
    "AnnualEnergy",
    "GroundFloorU",
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
