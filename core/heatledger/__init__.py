"""heatledger: a tested heat-transfer engine for building constructions, rooms and fins.

SI units throughout (m, W/(m K), m2 K/W, W/(m2 K), degC, W); layers inside to outside; heat
flux positive from inside to outside. See the README for the project file and the CLI.
"""

from importlib.metadata import PackageNotFoundError, version

from .airlayers import air_layer_resistance, ventilation_class
from .constructions import (
    AirGapCorrection,
    AirLayer,
    BridgedLayer,
    Construction,
    ConstructionTemperatures,
    FastenerCorrection,
    InvertedRoofCorrection,
    Layer,
    required_thickness,
    round_significant,
)
from .errors import HeatLedgerError, HeatLedgerWarning, ProjectError
from .fins import (
    AnnularFin,
    FinArray,
    FinArrayResult,
    FinFVResult,
    FinResult,
    FinSizing,
    FinTemperatures,
    PowerLawCoefficient,
    StraightFin,
    solve_fin_fv,
)
from .fv1d import fixed_flux, fixed_temperature, solve_conduction, surface_to_ambient
from .ground import (
    EdgeInsulation,
    SlabOnGroundResult,
    ground_conductivity,
    heated_basement,
    heated_basement_u,
    slab_on_ground,
    slab_on_ground_u,
    suspended_floor,
    suspended_floor_u,
)
from .heatloss import (
    AdjacentRoom,
    AnnualEnergy,
    Building,
    BuildingHeatLoad,
    Element,
    Ground,
    LinearBridge,
    LossLine,
    Outside,
    PointBridge,
    Room,
    RoomHeatLoad,
    Unheated,
    Ventilation,
    ventilation_heat_loss_coefficient,
)
from .materials import Material, MaterialLibrary, default_library
from .project import Project, load_project, project_from_dict
from .surfaces import surface_resistance, surface_resistance_calc
from .windows import (
    DeclaredWindow,
    WindowResult,
    declared_window,
    psi_glazing_default,
    psi_glazing_table,
    window,
    window_u,
    window_with_shutter_u,
)

try:
    __version__ = version("heatledger")
except PackageNotFoundError:  # pragma: no cover - running from a source tree
    __version__ = "0.0.0+unknown"

__all__ = [
    "AdjacentRoom",
    "air_layer_resistance",
    "AirGapCorrection",
    "AirLayer",
    "AnnualEnergy",
    "AnnularFin",
    "BridgedLayer",
    "Building",
    "BuildingHeatLoad",
    "Construction",
    "ConstructionTemperatures",
    "declared_window",
    "DeclaredWindow",
    "default_library",
    "EdgeInsulation",
    "Element",
    "FastenerCorrection",
    "FinArray",
    "FinArrayResult",
    "FinFVResult",
    "FinResult",
    "FinSizing",
    "FinTemperatures",
    "fixed_flux",
    "fixed_temperature",
    "Ground",
    "ground_conductivity",
    "heated_basement",
    "heated_basement_u",
    "HeatLedgerError",
    "HeatLedgerWarning",
    "InvertedRoofCorrection",
    "Layer",
    "LinearBridge",
    "load_project",
    "LossLine",
    "Material",
    "MaterialLibrary",
    "Outside",
    "PointBridge",
    "PowerLawCoefficient",
    "Project",
    "project_from_dict",
    "ProjectError",
    "psi_glazing_default",
    "psi_glazing_table",
    "required_thickness",
    "Room",
    "RoomHeatLoad",
    "round_significant",
    "slab_on_ground",
    "slab_on_ground_u",
    "SlabOnGroundResult",
    "solve_conduction",
    "solve_fin_fv",
    "StraightFin",
    "surface_resistance",
    "surface_resistance_calc",
    "surface_to_ambient",
    "suspended_floor",
    "suspended_floor_u",
    "Unheated",
    "Ventilation",
    "ventilation_class",
    "ventilation_heat_loss_coefficient",
    "window",
    "window_u",
    "window_with_shutter_u",
    "WindowResult",
    "__version__",
]
