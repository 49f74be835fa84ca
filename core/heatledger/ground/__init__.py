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

Every formula and coefficient here is recalled (recalled) [source: iso13370-slab] and
[source: iso13370-floors]; the slab formulas are checked against the worked values 0.762
and 0.222 W/(m2 K). Check clause and equation numbers against the purchased standard before
release.

References
----------
EN ISO 13370:2017, *Thermal performance of buildings -- Heat transfer via the ground --
Calculation methods*: Table 7 (ground conductivity by category), clause 8.2 (slab on ground),
8.3 (suspended floor), 8.4 (heated basement), Annex B (edge insulation) (recalled).
"""

from __future__ import annotations

from .floors import (
    HeatedBasementResult,
    SuspendedFloorResult,
    heated_basement,
    suspended_floor,
)
from .slab import EdgeInsulation, SlabOnGroundResult, slab_on_ground
from .soil import (
    DEFAULT_SOIL_CONDUCTIVITY,
    EXPOSED_OUTLINES,
    RSE_GROUND,
    RSI_FLOOR,
    RSI_WALL,
    SOIL_TYPES,
    SUSPENDED_FLOOR_MAX_HEIGHT,
    WIND_SHIELDING_FACTORS,
    ground_conductivity,
    ground_heat_capacity,
)

__all__ = [
    "slab_on_ground",
    "SlabOnGroundResult",
    "EdgeInsulation",
    "suspended_floor",
    "SuspendedFloorResult",
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
