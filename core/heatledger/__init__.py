"""heatledger: a tested heat-transfer engine for building constructions, rooms and fins.

SI units throughout (m, W/(m K), m2 K/W, W/(m2 K), degC, W); layers inside to outside; heat
flux positive from inside to outside. See the README for the project file and the CLI.

The public names below are loaded on first use (PEP 562), so ``import heatledger`` and the
``heatledger`` command's ``--help`` do not pay for numpy, scipy and the engine modules until a
name is used; ``from heatledger import Construction`` loads the constructions module and what
it needs, nothing more.
"""

from __future__ import annotations

import importlib

#: Where each public name lives: submodule -> names.
_EXPORTS = {
    "airlayers": (
        "air_layer_resistance",
        "ventilation_class",
    ),
    "bridges2d": (
        "external_corner",
        "general_junction",
        "Junction",
        "JunctionResult",
        "PsiResult",
        "Region",
        "Section2D",
        "Section2DResult",
        "Surface",
        "stud_wall",
        "SurfaceMinimum",
        "wall_floor",
    ),
    "constructions": (
        "AirGapCorrection",
        "AirLayer",
        "BridgedLayer",
        "Construction",
        "ConstructionTemperatures",
        "FastenerCorrection",
        "InvertedRoofCorrection",
        "Layer",
        "required_thickness",
        "round_significant",
    ),
    "errors": (
        "HeatLedgerError",
        "HeatLedgerWarning",
        "ProjectError",
    ),
    "fins": (
        "AnnularFin",
        "FinArray",
        "FinArrayResult",
        "FinFVResult",
        "FinResult",
        "FinSizing",
        "FinTemperatures",
        "PowerLawCoefficient",
        "solve_fin_fv",
        "StraightFin",
    ),
    "fv1d": (
        "fixed_flux",
        "fixed_temperature",
        "solve_conduction",
        "surface_to_ambient",
    ),
    "ground": (
        "EdgeInsulation",
        "ground_conductivity",
        "heated_basement",
        "slab_on_ground",
        "SlabOnGroundResult",
        "suspended_floor",
    ),
    "heatloss": (
        "AdjacentRoom",
        "AnnualEnergy",
        "Building",
        "BuildingHeatLoad",
        "Element",
        "Ground",
        "LinearBridge",
        "LossLine",
        "Outside",
        "PointBridge",
        "Room",
        "RoomHeatLoad",
        "Unheated",
        "Ventilation",
        "ventilation_heat_loss_coefficient",
    ),
    "materials": (
        "default_library",
        "Material",
        "MaterialLibrary",
    ),
    "moisture": (
        "CondensationResult",
        "dew_point",
        "interstitial_condensation",
        "MonthlyClimate",
        "saturation_pressure",
        "surface_check",
        "surface_factor_min",
        "surface_factor_required",
        "SurfaceCheck",
    ),
    "project": (
        "load_project",
        "Project",
        "project_from_dict",
    ),
    "surfaces": (
        "surface_resistance",
        "surface_resistance_calc",
    ),
    "windows": (
        "declared_window",
        "DeclaredWindow",
        "psi_glazing_default",
        "psi_glazing_table",
        "window",
        "window_with_shutter_u",
        "WindowResult",
    ),
}
_HOME = {name: module for module, names in _EXPORTS.items() for name in names}

__all__ = sorted([*_HOME, "__version__"], key=str.lower)


def __getattr__(name: str):
    """Load a public name from its submodule on first use (PEP 562)."""
    if name == "__version__":
        value = _version()
    elif name in _HOME:
        value = getattr(importlib.import_module(f".{_HOME[name]}", __name__), name)
    else:
        raise AttributeError(f"module 'heatledger' has no attribute {name!r}")
    globals()[name] = value
    return value


def __dir__() -> list[str]:
    return sorted({*globals(), *__all__})


def _version() -> str:
    from importlib.metadata import PackageNotFoundError, version

    try:
        return version("heatledger")
    except PackageNotFoundError:  # pragma: no cover - running from a source tree
        return "0.0.0+unknown"
