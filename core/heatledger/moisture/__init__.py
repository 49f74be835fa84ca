"""Moisture checks of EN ISO 13788: surface humidity (mould and surface condensation,
clause 5) and interstitial condensation by the monthly Glaser method (clause 6).

Sources: [source: iso13788-surface, clause 5]; [source: iso13788-glaser, clause 6];
[source: iso13788-saturation, Annex E]; [source: iso13788-classes, Annex A].
"""

from .climate import (
    HUMIDITY_CLASS_MARGIN,
    HUMIDITY_CLASS_USES,
    HUMIDITY_CLASSES,
    MonthlyClimate,
    vapour_density_excess,
)
from .glaser import VAPOUR_TIGHT_SD, CondensationResult, interstitial_condensation
from .psychrometrics import (
    MONTH_NAMES,
    VAPOUR_PERMEABILITY_AIR,
    WATER_VAPOUR_GAS_CONSTANT,
    dew_point,
    saturation_pressure,
    vapour_pressure,
)
from .surface import (
    CRITICAL_RH_CONDENSATION,
    CRITICAL_RH_MOULD,
    RESISTANCE_INSIDE_CHECK,
    SurfaceCheck,
    surface_check,
    surface_factor_min,
    surface_factor_required,
)

__all__ = ["MonthlyClimate", "HUMIDITY_CLASSES", "HUMIDITY_CLASS_USES", "HUMIDITY_CLASS_MARGIN",
           "vapour_density_excess", "interstitial_condensation", "CondensationResult",
           "VAPOUR_TIGHT_SD", "saturation_pressure", "dew_point", "vapour_pressure",
           "MONTH_NAMES", "VAPOUR_PERMEABILITY_AIR", "WATER_VAPOUR_GAS_CONSTANT",
           "surface_factor_required", "surface_factor_min", "surface_check", "SurfaceCheck",
           "CRITICAL_RH_MOULD", "CRITICAL_RH_CONDENSATION", "RESISTANCE_INSIDE_CHECK"]
