"""Building constructions: thermal resistance and U-value (EN ISO 6946:2017), temperatures
through the layers (1-D finite volumes) and the insulation thickness for a target U-value.

Layers are listed inside to outside. A construction is a stack of homogeneous layers
(:class:`Layer`, thickness and conductivity or a declared resistance), air layers
(:class:`AirLayer`) and inhomogeneous layers bridged by studs, joists or battens
(:class:`BridgedLayer`), with optional U-value corrections (:class:`AirGapCorrection`,
:class:`FastenerCorrection`, :class:`InvertedRoofCorrection`).

References
----------
EN ISO 6946:2017, clauses 6.7 (total resistance; 6.7.2 upper and lower limits), 6.9 (air
layers), 6.8 / Table 7 (surface resistances), Annex F (corrections), 8 (rounding to two
significant figures). In the 2007 edition the corrections are Annex D.

Sources: [source: iso6946-layers, 6.7, 6.7.2, clause 8]; corrections [source:
iso6946-corrections, Annex F]; temperatures by finite volumes [source: patankar-1980, ch. 4].
"""

from __future__ import annotations

from .._rounding import round_significant
from .construction import Construction
from .corrections import AirGapCorrection, FastenerCorrection, InvertedRoofCorrection
from .layers import (
    BRIDGING_RATIO_LIMIT,
    CORRECTION_THRESHOLD,
    DEFAULT_NODES_PER_LAYER,
    SLIGHTLY_VENTILATED_OUTER_CAP,
    AirLayer,
    BridgedLayer,
    Layer,
)
from .results import (
    BridgingResult,
    ConstructionTemperatures,
    CorrectionResult,
    LayerRow,
    VentilationResult,
)
from .sizing import required_thickness

__all__ = [
    "Layer",
    "AirLayer",
    "BridgedLayer",
    "AirGapCorrection",
    "FastenerCorrection",
    "InvertedRoofCorrection",
    "Construction",
    "ConstructionTemperatures",
    "LayerRow",
    "BridgingResult",
    "CorrectionResult",
    "VentilationResult",
    "required_thickness",
    "round_significant",
    "CORRECTION_THRESHOLD",
    "BRIDGING_RATIO_LIMIT",
    "SLIGHTLY_VENTILATED_OUTER_CAP",
    "DEFAULT_NODES_PER_LAYER",
]
