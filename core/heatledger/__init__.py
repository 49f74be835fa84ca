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
from .fv1d import fixed_flux, fixed_temperature, solve_conduction, surface_to_ambient
from .materials import Material, MaterialLibrary, default_library
from .project import Project, load_project, project_from_dict
from .surfaces import surface_resistance, surface_resistance_calc

try:
    __version__ = version("heatledger")
except PackageNotFoundError:  # pragma: no cover - running from a source tree
    __version__ = "0.0.0+unknown"

__all__ = [
    "AirGapCorrection",
    "AirLayer",
    "BridgedLayer",
    "Construction",
    "ConstructionTemperatures",
    "FastenerCorrection",
    "HeatLedgerError",
    "HeatLedgerWarning",
    "InvertedRoofCorrection",
    "Layer",
    "Material",
    "MaterialLibrary",
    "Project",
    "ProjectError",
    "__version__",
    "air_layer_resistance",
    "default_library",
    "fixed_flux",
    "fixed_temperature",
    "load_project",
    "project_from_dict",
    "required_thickness",
    "round_significant",
    "solve_conduction",
    "surface_resistance",
    "surface_resistance_calc",
    "surface_to_ambient",
    "ventilation_class",
]
