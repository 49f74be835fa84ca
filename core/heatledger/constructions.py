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

import functools
import math
from dataclasses import dataclass, field
from decimal import ROUND_HALF_UP, Decimal
from functools import cached_property
from itertools import product

import numpy as np

from . import fv1d
from ._validate import (
    MAX_CELLS,
    MAX_CELLS_PER_LAYER,
    choice,
    conductivity_warning,
    finite,
    fraction,
    non_negative,
    positive,
    quote,
    show,
    thin_layer_warning,
    within,
)
from .airlayers import (
    MAX_AIR_LAYER_THICKNESS,
    VENT_AREA_UNVENTILATED_MM2,
    VENT_AREA_WELL_VENTILATED_MM2,
    VENTILATION_CLASSES,
    air_layer_resistance,
)
from .errors import HeatLedgerError
from .materials import Material, _load_default
from .surfaces import HEAT_FLOWS, surface_resistance

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
]

#: Corrections totalling less than this fraction of U need not be applied.
#: source: EN ISO 6946:2017, Annex F.1 (recalled)
CORRECTION_THRESHOLD = 0.03
#: Largest ratio R'_T/R''_T for which the upper/lower-limit method is valid.
#: source: EN ISO 6946:2017, 6.7.2.1 (recalled)
BRIDGING_RATIO_LIMIT = 1.5
#: Cap on the resistance of layers outside a slightly ventilated air layer. [m2 K/W]
#: source: EN ISO 6946:2017, 6.9.3 (recalled)
SLIGHTLY_VENTILATED_OUTER_CAP = 0.15
#: Default number of finite-volume cells per layer.
DEFAULT_NODES_PER_LAYER = 4

# --------------------------------------------------------------------------------------
# Layers


def _thickness(label: str, thickness) -> float:
    """A layer thickness [m]: greater than zero and within the physical limit."""
    return within(f"{label} thickness", positive(f"{label} thickness", thickness, "m"),
                  "thickness")


def _conductivity(name: str, conductivity) -> float:
    """A conductivity [W/(m K)]: greater than zero and within the physical limits."""
    return within(name, positive(name, conductivity, "W/(m K)"), "conductivity")


class Layer:
    """A homogeneous layer: thickness and conductivity, or a declared thermal resistance.

    Parameters
    ----------
    thickness : float
        Layer thickness. [m]
    conductivity : float, optional
        Design thermal conductivity lambda. [W/(m K)]
    resistance : float, optional
        Declared thermal resistance, instead of ``conductivity``. [m2 K/W]
    name : str
        Label for tables and messages. [-]
    material : Material or str, optional
        A material (or its name in the generic library) giving the conductivity. [-]

    Raises
    ------
    HeatLedgerError
        If the thickness is not positive, if both or neither of ``conductivity`` and
        ``resistance`` are given, or if a value is not positive and finite.

    Notes
    -----
    ``R = d / lambda`` (EN ISO 6946:2017, 6.7.1, eq. (4), recalled numbering).
    """

    __slots__ = ("thickness", "conductivity", "declared_resistance", "name", "material",
                 "resistance_value", "kind")

    def __init__(self, thickness, conductivity=None, *, resistance=None, name: str = "",
                 material=None) -> None:
        label = f"layer {quote(name)}" if name else "layer"
        self.thickness = _thickness(label, thickness)
        if isinstance(material, str):
            material = _load_default().get(material)  # cached library, read only
        if material is not None and not isinstance(material, Material):
            raise HeatLedgerError(f"{label} material must be a Material or a material name")
        self.material = material
        if conductivity is None and material is not None and resistance is None:
            conductivity = material.conductivity
        if conductivity is not None and resistance is not None:
            raise HeatLedgerError(
                f"{label}: give either conductivity or a declared resistance, not both"
            )
        if conductivity is None and resistance is None:
            raise HeatLedgerError(f"{label}: give a conductivity, a material or a resistance")
        self.name = str(name) or (material.name if material is not None else "")
        if resistance is not None:
            self.conductivity = None
            self.declared_resistance = within(
                f"{label} resistance", positive(f"{label} resistance", resistance, "m2 K/W"),
                "layer_resistance")
            self.resistance_value = self.declared_resistance
            self.kind = "declared"
        else:
            self.conductivity = _conductivity(f"{label} conductivity", conductivity)
            self.declared_resistance = None
            self.resistance_value = within(
                f"{label} resistance thickness/conductivity",
                self.thickness / self.conductivity, "layer_resistance")
            self.kind = "material"

    def with_thickness(self, thickness) -> Layer:
        """The same layer with another thickness (a declared resistance scales with it)."""
        if self.declared_resistance is not None:
            r = self.declared_resistance * float(thickness) / self.thickness
            return Layer(thickness, resistance=r, name=self.name, material=self.material)
        return Layer(thickness, self.conductivity, name=self.name, material=self.material)

    def __repr__(self) -> str:
        return (f"Layer({self.thickness!r}, {self.conductivity!r}, "
                f"resistance={self.declared_resistance!r}, name={self.name!r})")


class AirLayer:
    """An air layer (cavity) of EN ISO 6946:2017, 6.9.

    Parameters
    ----------
    thickness : float
        Thickness of the air layer in the direction of heat flow (at most 0.3 m). [m]
    ventilation : str
        ``"unventilated"``, ``"slightly"`` (slightly ventilated) or ``"well"`` (well
        ventilated). [-]
    emissivity_1, emissivity_2 : float
        Emissivities of the two faces. [-]
    vent_area : float, optional
        Area of openings to the outside per metre of length (vertical layers) or per square
        metre (horizontal layers); required for ``"slightly"``. [mm2]
    name : str
        Label. [-]

    Notes
    -----
    Unventilated: ``Rg`` of Annex D. Slightly ventilated:
    ``R_T = (1500 - Av)/1000 R_T,u + (Av - 500)/1000 R_T,v``. Well ventilated: the air layer
    and all layers outside it are disregarded and the external surface resistance becomes
    that of still air (the Rsi of the same heat-flow direction).
    """

    kind = "air"

    __slots__ = ("thickness", "ventilation", "emissivity_1", "emissivity_2", "vent_area", "name")

    def __init__(self, thickness, *, ventilation: str = "unventilated", emissivity_1=0.9,
                 emissivity_2=0.9, vent_area=None, name: str = "") -> None:
        label = f"air layer {quote(name)}" if name else "air layer"
        self.thickness = positive(f"{label} thickness", thickness, "m")
        if self.thickness > MAX_AIR_LAYER_THICKNESS + 1e-12:
            raise HeatLedgerError(
                f"{label} is {self.thickness * 1000.0:g} mm thick; the ISO 6946 Annex D "
                f"method covers air layers up to {MAX_AIR_LAYER_THICKNESS * 1000.0:g} mm: "
                "treat a larger space as an unheated space or a room (ISO 13789)")
        self.ventilation = choice(f"{label} ventilation", ventilation, VENTILATION_CLASSES)
        self.emissivity_1 = fraction(f"{label} emissivity_1", emissivity_1, allow_zero=False)
        self.emissivity_2 = fraction(f"{label} emissivity_2", emissivity_2, allow_zero=False)
        self.name = str(name) or "air layer"
        self.vent_area = None if vent_area is None else non_negative(
            f"{label} vent_area", vent_area, "mm2")
        a = self.vent_area
        if self.ventilation == "slightly":
            if a is None or not (VENT_AREA_UNVENTILATED_MM2 < a < VENT_AREA_WELL_VENTILATED_MM2):
                got = "it is not given" if a is None else f"got {a:g} mm2"
                raise HeatLedgerError(
                    f"{label}: a slightly ventilated layer needs vent_area between 500 and "
                    f"1500 mm2 (per m or per m2); {got}"
                )
        elif self.ventilation == "unventilated" and a is not None and (
                a > VENT_AREA_UNVENTILATED_MM2):
            raise HeatLedgerError(
                f"{label}: vent_area {a:g} mm2 is above 500 mm2, so the layer is not "
                'unventilated (ISO 6946 6.9); choose "slightly" or "well"'
            )
        elif self.ventilation == "well" and a is not None and a < VENT_AREA_WELL_VENTILATED_MM2:
            raise HeatLedgerError(
                f"{label}: vent_area {a:g} mm2 is below 1500 mm2, so the layer is not well "
                'ventilated (ISO 6946 6.9); choose "slightly" or "unventilated"'
            )

    def resistance_for(self, heat_flow: str) -> float:
        """Unventilated resistance ``Rg`` of this layer for ``heat_flow``. [m2 K/W]"""
        return air_layer_resistance(self.thickness, heat_flow, self.emissivity_1,
                                    self.emissivity_2)

    def with_thickness(self, thickness) -> AirLayer:
        """The same air layer with another thickness."""
        return AirLayer(thickness, ventilation=self.ventilation, emissivity_1=self.emissivity_1,
                        emissivity_2=self.emissivity_2, vent_area=self.vent_area, name=self.name)


class BridgedLayer:
    """An inhomogeneous layer: insulation bridged by studs, joists or battens.

    Parameters
    ----------
    thickness : float
        Layer thickness. [m]
    parts : sequence of (conductivity, area_fraction)
        Each material of the layer with its conductivity [W/(m K)] (a number or a
        :class:`Material`) and the fraction of the element area it occupies [-]; fractions
        must sum to 1. [-]
    name : str
        Label. [-]

    Notes
    -----
    Each part defines a section of the element for the upper limit; the lower limit uses
    ``1/R_j = sum_q f_q / R_qj`` for this layer (EN ISO 6946:2017, 6.7.2). Where several
    layers are bridged, sections are all combinations of their parts with the product of
    the fractions (layouts assumed independent, such as crossed battens).
    """

    kind = "bridged"

    __slots__ = ("thickness", "parts", "name")

    def __init__(self, thickness, parts, *, name: str = "") -> None:
        label = f"bridged layer {quote(name)}" if name else "bridged layer"
        self.thickness = _thickness(label, thickness)
        self.name = str(name) or "bridged layer"
        cleaned = []
        try:
            items = list(parts)
        except TypeError:
            raise HeatLedgerError(f"{label}: parts must be a list of (conductivity, "
                                  "area_fraction) pairs") from None
        if len(items) < 2:
            raise HeatLedgerError(f"{label}: parts must list at least two materials")
        for i, item in enumerate(items, 1):
            try:
                lam, frac = item
            except (TypeError, ValueError):
                raise HeatLedgerError(f"{label}: part {i} must be a (conductivity, "
                                      "area_fraction) pair") from None
            if isinstance(lam, Material):
                lam = lam.conductivity
            lam = _conductivity(f"{label} part {i} conductivity", lam)
            frac = finite(f"{label} part {i} area_fraction", frac)
            if not 0.0 < frac <= 1.0:
                raise HeatLedgerError(
                    f"{label} part {i} area_fraction must be above 0 and at most 1; got {frac:g}")
            cleaned.append((lam, frac))
        total = math.fsum(f for _, f in cleaned)
        if abs(total - 1.0) > 1e-6:
            raise HeatLedgerError(
                f"{label}: area fractions must sum to 1; they sum to {total:.6g}")
        self.parts = tuple(cleaned)
        within(f"{label} lower-limit resistance thickness/(sum of fraction x conductivity)",
               self.lower_limit_resistance, "layer_resistance")

    @property
    def lower_limit_resistance(self) -> float:
        """Lower-limit resistance ``R_j = d / sum(f_q lambda_q)``. [m2 K/W]"""
        return self.thickness / math.fsum(lam * f for lam, f in self.parts)

    def with_thickness(self, thickness) -> BridgedLayer:
        """The same bridged layer with another thickness."""
        return BridgedLayer(thickness, self.parts, name=self.name)


# --------------------------------------------------------------------------------------
# Corrections (EN ISO 6946:2017 Annex F)


@dataclass(frozen=True)
class AirGapCorrection:
    """Correction for air gaps in an insulation layer (EN ISO 6946:2017, F.2).

    Parameters
    ----------
    layer : int
        Index (0-based, inside to outside) of the layer containing the gaps. [-]
    level : int
        Correction level 0, 1 or 2 (``Delta U'' = 0, 0.01, 0.04`` W/(m2 K)). [-]

    Notes
    -----
    ``Delta U_g = Delta U'' (R_1 / R_T,h)^2`` (F.2, recalled).
    """

    layer: int
    level: int

    def delta_u(self, r_layer: float, r_total: float, layer_obj) -> float:
        levels = {0: 0.0, 1: 0.01, 2: 0.04}
        if self.level not in levels:
            raise HeatLedgerError(f"air-gap correction level must be 0, 1 or 2; got "
                                  f"{show(self.level)}")
        return levels[self.level] * (r_layer / r_total) ** 2

    @property
    def label(self) -> str:
        return f"air gaps, level {self.level} (ISO 6946 F.2)"


@dataclass(frozen=True)
class FastenerCorrection:
    """Correction for mechanical fasteners through an insulation layer (ISO 6946 F.3).

    Parameters
    ----------
    layer : int
        Index of the insulation layer the fasteners pass through. [-]
    conductivity : float
        Conductivity of the fastener. [W/(m K)]
    cross_section : float
        Cross-sectional area of one fastener. [m2]
    count_per_m2 : float
        Number of fasteners per square metre. [1/m2]
    penetration : float, optional
        Length of the fastener inside the insulation layer when recessed (2017 edition);
        default the full layer thickness. [m]
    edition : str
        ``"2017"`` (with the ``/d_0`` term) or ``"2007"`` (alpha = 6 1/m for wall ties or
        5 1/m for roof fixings). [-]
    application : str
        ``"wall"`` or ``"roof"``, for the 2007 alpha. [-]

    Notes
    -----
    2017: ``Delta U_f = alpha lambda_f A_f n_f / d_0 (R_1/R_T,h)^2`` with alpha = 0.8 (fully
    penetrating) or ``0.8 d_1/d_0`` (recessed). 2007: ``Delta U_f = alpha lambda_f n_f A_f
    (R_1/R_T,h)^2``. No correction when ``lambda_f < 1`` W/(m K). (Recalled.)
    """

    layer: int
    conductivity: float
    cross_section: float
    count_per_m2: float
    penetration: float | None = None
    edition: str = "2017"
    application: str = "wall"

    def delta_u(self, r_layer: float, r_total: float, layer_obj) -> float:
        lam = positive("fastener conductivity", self.conductivity, "W/(m K)")
        area = positive("fastener cross_section", self.cross_section, "m2")
        n = non_negative("fastener count_per_m2", self.count_per_m2, "1/m2")
        edition = choice("fastener edition", self.edition, ("2017", "2007"))
        if lam < 1.0:
            return 0.0
        ratio2 = (r_layer / r_total) ** 2
        if edition == "2007":
            app = choice("fastener application", self.application, ("wall", "roof"))
            alpha = 6.0 if app == "wall" else 5.0
            return alpha * lam * n * area * ratio2
        d0 = layer_obj.thickness
        d1 = d0 if self.penetration is None else positive("fastener penetration",
                                                          self.penetration, "m")
        if d1 > d0 * (1 + 1e-9):
            raise HeatLedgerError(f"fastener penetration {d1:g} m exceeds the insulation "
                                  f"thickness {d0:g} m")
        alpha = 0.8 * d1 / d0
        return alpha * lam * area * n / d0 * ratio2

    @property
    def label(self) -> str:
        return f"mechanical fasteners (ISO 6946 F.3, {self.edition} form)"


@dataclass(frozen=True)
class InvertedRoofCorrection:
    """Correction for rain water flowing below the insulation of an inverted roof (F.4).

    Parameters
    ----------
    layer : int
        Index of the insulation layer above the waterproofing membrane. [-]
    precipitation : float
        Mean precipitation during the heating season ``p``. [mm/day]
    drainage_factor : float
        Fraction ``f`` of ``p`` reaching the membrane. [-]
    factor_x : float
        Factor ``x`` for the increased heat loss. [W day/(m2 K mm)]

    Notes
    -----
    ``Delta U_r = p f x (R_1/R_T)^2`` (EN ISO 6946:2017 F.4, recalled; x = 0.04 recalled).
    """

    layer: int
    precipitation: float
    drainage_factor: float
    factor_x: float = 0.04

    def delta_u(self, r_layer: float, r_total: float, layer_obj) -> float:
        p = non_negative("inverted-roof precipitation", self.precipitation, "mm/day")
        f = non_negative("inverted-roof drainage_factor", self.drainage_factor)
        x = non_negative("inverted-roof factor_x", self.factor_x)
        return p * f * x * (r_layer / r_total) ** 2

    @property
    def label(self) -> str:
        return "inverted roof, rain water (ISO 6946 F.4)"


# --------------------------------------------------------------------------------------
# Results


@dataclass(frozen=True)
class LayerRow:
    """One row of a construction's layer table (resistance as used in the series sum)."""

    index: int
    name: str
    kind: str
    thickness: float
    conductivity: float | None
    resistance_own: float
    resistance: float
    counted: bool
    note: str = ""


@dataclass(frozen=True)
class BridgingResult:
    """Upper and lower limits of EN ISO 6946:2017, 6.7.2.

    Attributes
    ----------
    upper, lower, total : float
        ``R'_T``, ``R''_T`` and ``R_T = (R'_T + R''_T)/2``. [m2 K/W]
    relative_error : float
        ``e = (R'_T - R''_T)/(2 R_T)``. [-]
    ratio : float
        ``R'_T / R''_T`` (method valid up to 1.5). [-]
    sections : tuple of (fraction, R_T,q)
        Each section's area fraction [-] and total resistance [m2 K/W].
    layer_lower_resistances : dict
        Layer index -> lower-limit resistance ``R_j`` of each bridged layer. [m2 K/W]
    """

    upper: float
    lower: float
    total: float
    relative_error: float
    ratio: float
    sections: tuple
    layer_lower_resistances: dict


@dataclass(frozen=True)
class CorrectionResult:
    """U-value corrections: each item ``(label, layer index, delta_u)``, their total and
    whether they were applied (the 3 % rule)."""

    items: tuple
    total: float
    applied: bool
    rule: str


@dataclass(frozen=True)
class VentilationResult:
    """How a ventilated air layer was treated (EN ISO 6946:2017, 6.9.3/6.9.4)."""

    layer: int
    ventilation: str
    vent_area: float | None
    r_total_unventilated: float | None
    r_total_ventilated: float | None
    weight_unventilated: float
    weight_ventilated: float
    tail_scale: float
    note: str


@dataclass(frozen=True)
class ConstructionTemperatures:
    """Temperatures through a construction from the 1-D finite-volume solver.

    Attributes
    ----------
    x : ndarray
        Node (cell-centre) positions from the inside surface. [m]
    temperature : ndarray
        Node temperatures. [degC]
    heat_flux : float
        Heat flux through the inside surface, positive inside to outside. [W/m2]
    heat_flux_outside : float
        Heat flux through the outside surface. [W/m2]
    interface_x : ndarray
        Inside surface, every layer interface and the outside surface. [m]
    interface_temperatures : ndarray
        Temperatures at ``interface_x`` from the solution. [degC]
    energy_residual : float
        Relative energy-balance residual of the solve: conservation and solver rounding. It
        cannot reveal a wrong coefficient (a wrong conductivity balances as well as a right
        one); :attr:`ladder_heat_flux` can. [-]
    ladder_heat_flux : float or None
        The same heat flux from the closed-form series-resistance ladder,
        ``(T_i - T_e)/(R_si + sum R_j + R_se)``, where one exists (no heat sources, air or
        surface temperatures on both sides); an independent check of the solve. [W/m2]
    nodes_per_layer : tuple of int
    layer_of_node : ndarray
        Index of the layer each node lies in. [-]
    fv : FVSolution
        The full finite-volume solution, coefficients included.
    temp_inside, temp_outside : float
        Air (or surface) temperatures of the two boundaries; NaN for a flux boundary. [degC]
    mesh_estimate : MeshEstimate
        Mesh estimate of the heat flux, computed when first read: "exact for this case" with
        the reason for layers without volumetric sources, else the observed order from three
        meshes. [W/m2]
    mesh_temperature_change : float
        Largest change of an interface temperature between the mesh used and the next mesh
        of the estimate (0 where the scheme is exact). [K]
    """

    x: np.ndarray
    temperature: np.ndarray
    heat_flux: float
    heat_flux_outside: float
    interface_x: np.ndarray
    interface_temperatures: np.ndarray
    energy_residual: float
    ladder_heat_flux: float | None
    nodes_per_layer: tuple
    layer_of_node: np.ndarray
    fv: fv1d.FVSolution
    temp_inside: float
    temp_outside: float
    estimator: object = field(default=None, repr=False, compare=False)

    @property
    def ladder_difference(self) -> float | None:
        """Relative difference of the finite-volume heat flux from the ladder's. [-]"""
        if self.ladder_heat_flux is None:
            return None
        return abs(self.heat_flux - self.ladder_heat_flux) / max(abs(self.ladder_heat_flux),
                                                                 1e-300)

    @cached_property
    def _mesh(self) -> tuple:
        return self.estimator()

    @property
    def mesh_estimate(self) -> fv1d.MeshEstimate:
        """Mesh estimate of the heat flux (see the class notes). [W/m2]"""
        return self._mesh[0]

    @property
    def mesh_temperature_change(self) -> float:
        """Largest interface-temperature change between estimate meshes. [K]"""
        return self._mesh[1]


# --------------------------------------------------------------------------------------
# Construction


class Construction:
    """A wall, roof or floor as layers listed inside to outside.

    Parameters
    ----------
    layers : sequence of Layer, AirLayer or BridgedLayer
        The layers, inside to outside. [-]
    heat_flow : str
        ``"up"`` (roofs, ceilings), ``"horizontal"`` (walls) or ``"down"`` (floors). [-]
    rsi, rse : float, optional
        Internal and external surface resistances; default EN ISO 6946 Table 7 for the
        direction (use ``rse = rsi`` for an element next to an unheated space). [m2 K/W]
    name : str
        Label. [-]
    corrections : sequence, optional
        :class:`AirGapCorrection`, :class:`FastenerCorrection` or
        :class:`InvertedRoofCorrection` items. [-]
    apply_small_corrections : bool
        Apply corrections even when they total less than 3 % of U. [-]

    Raises
    ------
    HeatLedgerError
        For an empty layer list, an unknown direction, a negative surface resistance or a
        correction that names a layer that does not exist.

    Notes
    -----
    ``R_T = Rsi + sum R_j + Rse``, ``U = 1/R_T`` (EN ISO 6946:2017, 6.7.1). With bridged
    layers ``R_T = (R'_T + R''_T)/2`` (6.7.2). Corrected ``U_c = U + Delta U`` (Annex F).
    Temperatures through the layers exclude the corrections (they represent local 3-D
    effects).

    Examples
    --------
    >>> wall = Construction([Layer(0.1, 1.0), Layer(0.1, 0.04)])
    >>> round(wall.u_value, 4)
    0.361
    """

    def __init__(self, layers, heat_flow: str = "horizontal", *, rsi=None, rse=None,
                 name: str = "", corrections=(), apply_small_corrections: bool = False) -> None:
        self.name = str(name)
        self.heat_flow = choice("heat_flow", heat_flow, HEAT_FLOWS)
        self.layers = tuple(layers)
        label = f"construction {quote(self.name)}" if self.name else "construction"
        if not self.layers:
            raise HeatLedgerError(f"{label} has no layers; list at least one, inside to outside")
        for i, lay in enumerate(self.layers):
            if not isinstance(lay, (Layer, AirLayer, BridgedLayer)):
                raise HeatLedgerError(f"{label} layer {i + 1} must be a Layer, AirLayer or "
                                      f"BridgedLayer; got {type(lay).__name__}")
        self.rsi = (surface_resistance("inside", self.heat_flow) if rsi is None
                    else _surface_resistance(f"{label} rsi", rsi))
        rse_given = rse is not None
        self._rse_given = rse_given
        self.rse = (surface_resistance("outside", self.heat_flow) if rse is None
                    else _surface_resistance(f"{label} rse", rse))
        self.corrections_input = tuple(corrections)
        self.apply_small_corrections = bool(apply_small_corrections)
        self.warnings: list[str] = []
        self._compute(label, rse_given)
        #: Input that is probably a slip (a thickness in metres in a millimetre field, a
        #: conductivity far outside its material class); also at the head of ``warnings``.
        self.input_warnings: list[str] = _input_slips(self.layers)
        self.warnings[:0] = self.input_warnings

    # ---- results --------------------------------------------------------------------
    @property
    def total_resistance(self) -> float:
        """Total thermal resistance ``R_T`` surface to surface incl. Rsi and Rse. [m2 K/W]"""
        return self._r_total

    @property
    def u_value_uncorrected(self) -> float:
        """``U = 1/R_T`` before corrections. [W/(m2 K)]"""
        return 1.0 / self._r_total

    @property
    def u_value(self) -> float:
        """Thermal transmittance including applied corrections, unrounded. [W/(m2 K)]"""
        return self.u_value_uncorrected + (self.corrections.total if self.corrections.applied
                                           else 0.0)

    @property
    def u_value_reported(self) -> float:
        """U-value rounded to two significant figures (EN ISO 6946:2017, clause 8)."""
        return round_significant(self.u_value, 2)

    @property
    def layer_table(self) -> tuple:
        """Layer rows with the resistance each contributes to the series sum."""
        return self._rows

    @property
    def rse_used(self) -> float:
        """External surface resistance as used (still air behind a well ventilated layer,
        scaled for a slightly ventilated one). [m2 K/W]"""
        return self._rse_used

    @property
    def ventilation(self) -> VentilationResult | None:
        """Treatment of a ventilated air layer, or None."""
        return self._ventilation

    def ladder_temperatures(self, inside: float, outside: float) -> np.ndarray:
        """Temperatures at the inside surface, every counted layer interface and the outside
        surface from the resistance ladder, ``theta_k = theta_i - q (Rsi + sum R_j<k)``.

        Parameters
        ----------
        inside, outside : float
            Air temperatures on either side. [degC]

        Returns
        -------
        ndarray
            Temperatures. [degC]
        """
        t_i = within("inside", inside, "temperature")
        t_e = within("outside", outside, "temperature")
        q = (t_i - t_e) / self._r_total
        r = [self.rsi] + [row.resistance for row in self._rows if row.counted]
        return t_i - q * np.cumsum(r)

    def temperatures(self, inside, outside, *, nodes_per_layer=None, max_spacing=None,
                     layer_sources=None, interface_fluxes=None) -> ConstructionTemperatures:
        """Temperatures through the construction by 1-D finite volumes.

        Parameters
        ----------
        inside, outside : float or Boundary
            Air temperature on each side (exchanging through Rsi and Rse) [degC], or a
            :class:`heatledger.fv1d.Boundary` (fixed surface temperature or heat flux). [degC]
        nodes_per_layer : int or sequence of int, optional
            Control volumes in each counted layer (default 4). [-]
        max_spacing : float, optional
            Largest cell width instead of a count: each layer gets ``ceil(d/max_spacing)``
            cells. [m]
        layer_sources : dict, optional
            Layer index -> heat generated per unit volume in that layer (a heating mat, a
            heated screed). [W/m3]
        interface_fluxes : dict, optional
            Interface index k (between counted layers k-1 and k, 1-based from the inside) ->
            heat released per unit area at that interface, shared between the two adjacent
            cells. [W/m2]

        Returns
        -------
        ConstructionTemperatures
        """
        counted = [row for row in self._rows if row.counted]
        counts = _cell_counts(counted, nodes_per_layer, max_spacing)
        left = inside if isinstance(inside, fv1d.Boundary) else fv1d.surface_to_ambient(
            within("inside", inside, "temperature"), self.rsi)
        right = outside if isinstance(outside, fv1d.Boundary) else fv1d.surface_to_ambient(
            within("outside", outside, "temperature"), self._rse_used)
        sources = (layer_sources, interface_fluxes)
        sol, bounds, layer_of_node = self._solve_fv(counted, counts, left, right, *sources)
        t_if = sol.face_temperature[bounds]

        def estimate():
            return _mesh_estimate(sources, sol)

        return ConstructionTemperatures(
            x=sol.x, temperature=sol.temperature, heat_flux=sol.heat_in,
            heat_flux_outside=sol.heat_out, interface_x=sol.faces[bounds],
            interface_temperatures=t_if, energy_residual=sol.energy_residual,
            ladder_heat_flux=_ladder_flux(counted, left, right, sources),
            nodes_per_layer=tuple(counts), layer_of_node=layer_of_node, fv=sol,
            temp_inside=left.temperature if left.kind != "flux" else math.nan,
            temp_outside=right.temperature if right.kind != "flux" else math.nan,
            estimator=estimate,
        )

    # ---- internals ------------------------------------------------------------------
    def _solve_fv(self, counted, counts, left, right, layer_sources, interface_fluxes):
        sizes = [row.thickness / n for row, n in zip(counted, counts, strict=True)]
        widths = np.repeat(sizes, counts)
        cond = np.repeat([row.thickness / row.resistance for row in counted], counts)
        layer_of_node = np.repeat([row.index for row in counted], counts)
        bounds = np.concatenate(([0], np.cumsum(counts)))
        source = None
        face_source = {}
        if layer_sources:
            source = np.zeros(widths.size)
            for idx, q_vol in layer_sources.items():
                mask = layer_of_node == int(idx)
                if not mask.any():
                    raise HeatLedgerError(f"layer_sources names layer {show(idx)}, which is "
                                          "not a counted layer of this construction")
                source[mask] += finite(f"layer_sources[{idx}]", q_vol) * widths[mask]
        for k, q_s in (interface_fluxes or {}).items():
            k = int(k)
            if not 1 <= k < len(counted):
                raise HeatLedgerError(f"interface_fluxes names interface {k}; interfaces "
                                      f"run from 1 to {len(counted) - 1}")
            face = int(bounds[k])
            face_source[face] = face_source.get(face, 0.0) + finite(
                f"interface_fluxes[{k}]", q_s)
        sol = fv1d.solve_conduction(widths, cond, left, right, source=source,
                                    face_source=face_source)
        return sol, bounds, layer_of_node

    def _compute(self, label: str, rse_given: bool) -> None:
        hf = self.heat_flow
        own = []
        for lay in self.layers:
            if lay.kind == "air":
                own.append(lay.resistance_for(hf))
            elif lay.kind == "bridged":
                own.append(lay.lower_limit_resistance)
            else:
                own.append(lay.resistance_value)
        # ventilated air layers: the first ventilated layer from the inside governs
        vent_idx = next((i for i, lay in enumerate(self.layers)
                         if lay.kind == "air" and lay.ventilation != "unventilated"), None)
        counted = [True] * len(self.layers)
        scale = [1.0] * len(self.layers)
        rse_used = self.rse
        self._ventilation = None
        rsi_still = surface_resistance("inside", hf)
        if vent_idx is not None and self.layers[vent_idx].ventilation == "well":
            for i in range(vent_idx, len(self.layers)):
                counted[i] = False
            if not rse_given:
                rse_used = rsi_still
            self._ventilation = VentilationResult(
                vent_idx, "well", self.layers[vent_idx].vent_area, None, None, 0.0, 1.0, 1.0,
                "well ventilated: the air layer and all layers outside it are disregarded; "
                "external surface resistance = Rsi of the same direction (still air)")
        if vent_idx is not None and vent_idx == 0 and self.layers[0].ventilation == "well":
            raise HeatLedgerError(f"{label}: the first layer is a well ventilated air layer, so "
                                  "no layer is left to count")

        r_inner = math.fsum(r for r, c in zip(own, counted, strict=True) if c)
        bridging = self._bridging(own, counted, rse_used)
        r_total = bridging.total if bridging else self.rsi + r_inner + rse_used

        if vent_idx is not None and self.layers[vent_idx].ventilation == "slightly":
            lay = self.layers[vent_idx]
            av = lay.vent_area
            w_u = (VENT_AREA_WELL_VENTILATED_MM2 - av) / 1000.0
            w_v = (av - VENT_AREA_UNVENTILATED_MM2) / 1000.0
            r_in = math.fsum(own[:vent_idx])
            r_out = math.fsum(own[vent_idx + 1:])
            r_tu = self.rsi + r_in + own[vent_idx] + min(r_out, SLIGHTLY_VENTILATED_OUTER_CAP) \
                + self.rse
            r_tv = self.rsi + r_in + (self.rse if rse_given else rsi_still)
            r_total = w_u * r_tu + w_v * r_tv
            tail_actual = own[vent_idx] + r_out + self.rse
            s = (r_total - self.rsi - r_in) / tail_actual
            for i in range(vent_idx, len(self.layers)):
                scale[i] = s
            rse_used = self.rse * s
            if bridging is not None:
                self.warnings.append("bridged layers with a slightly ventilated air layer: the "
                                     "bridging limits are computed with the layer unventilated")
            self._ventilation = VentilationResult(
                vent_idx, "slightly", av, r_tu, r_tv, w_u, w_v, s,
                "slightly ventilated: R_T = (1500 - Av)/1000 R_T,u + (Av - 500)/1000 R_T,v; "
                f"air layer, outer layers and Rse scaled by {s:.6g} so the ladder sums to R_T")
        elif bridging is not None:
            # share the bridging adjustment (R_T - R''_T) among bridged layers, in proportion
            # to their lower-limit resistances, so that the ladder sums to R_T
            bridged = [i for i, lay in enumerate(self.layers) if lay.kind == "bridged"
                       and counted[i]]
            r_b = sum(own[i] for i in bridged)
            s = 1.0 + (bridging.total - bridging.lower) / r_b
            for i in bridged:
                scale[i] = s
        self._bridging_result = bridging
        self._r_total = r_total
        self._rse_used = rse_used
        self._row_data = (own, scale, counted)
        if bridging is not None and bridging.ratio > BRIDGING_RATIO_LIMIT:
            self.warnings.append(
                f"upper/lower limit ratio {bridging.ratio:.3f} exceeds 1.5: ISO 6946:2017 6.7.2 "
                "is not valid; use a numerical method (ISO 10211)")
        self._corrections = self._apply_corrections(label, own)

    @cached_property
    def _rows(self) -> tuple:
        """The layer table, built when first read (a U-value alone does not need it)."""
        own, scale, counted = self._row_data
        rows = []
        for i, lay in enumerate(self.layers):
            note = ""
            if lay.kind == "air":
                note = f"{lay.ventilation} air layer, ISO 6946 Annex D"
            elif lay.kind == "bridged":
                note = "bridged: lower-limit R_j, scaled so the ladder sums to R_T"
            elif lay.kind == "declared":
                note = "declared resistance"
            if not counted[i]:
                note = "not counted: outside a well ventilated air layer"
            elif scale[i] != 1.0 and lay.kind != "bridged":
                note += ("; " if note else "") + f"scaled by {scale[i]:.6g} (slightly ventilated)"
            rows.append(LayerRow(i, lay.name, lay.kind, lay.thickness,
                                 getattr(lay, "conductivity", None), own[i], own[i] * scale[i],
                                 counted[i], note))
        return tuple(rows)

    def _bridging(self, own, counted, rse_used) -> BridgingResult | None:
        bridged = [i for i, lay in enumerate(self.layers) if lay.kind == "bridged" and counted[i]]
        if not bridged:
            return None
        base = self.rsi + rse_used + math.fsum(own[i] for i in range(len(own))
                                         if counted[i] and i not in bridged)
        sections = []
        inv_upper = 0.0
        for combo in product(*(self.layers[i].parts for i in bridged)):
            frac = 1.0
            r_q = base
            for i, (lam, f) in zip(bridged, combo, strict=True):
                frac *= f
                r_q += self.layers[i].thickness / lam
            sections.append((frac, r_q))
            inv_upper += frac / r_q
        upper = 1.0 / inv_upper
        lower = base + math.fsum(own[i] for i in bridged)
        total = 0.5 * (upper + lower)
        return BridgingResult(upper, lower, total, (upper - lower) / (2.0 * total),
                              upper / lower, tuple(sections), {i: own[i] for i in bridged})

    def _apply_corrections(self, label, own) -> CorrectionResult:
        items = []
        for c in self.corrections_input:
            idx = getattr(c, "layer", None)
            if not isinstance(idx, (int, np.integer)) or not 0 <= idx < len(self.layers):
                raise HeatLedgerError(f"{label}: correction {type(c).__name__} names layer "
                                      f"{show(idx)}; layers are numbered 0 to "
                                      f"{len(self.layers) - 1}")
            items.append((c.label, int(idx), c.delta_u(own[idx], self._r_total,
                                                        self.layers[idx])))
        total = math.fsum(d for _, _, d in items)
        u = 1.0 / self._r_total
        if not items:
            return CorrectionResult((), 0.0, False, "no corrections")
        if total < CORRECTION_THRESHOLD * u and not self.apply_small_corrections:
            return CorrectionResult(tuple(items), total, False,
                                    "total below 3 % of U: not applied (ISO 6946 Annex F)")
        return CorrectionResult(tuple(items), total, True, "applied: U_c = U + sum(Delta U)")

    @property
    def rse_given(self) -> bool:
        """True where the external surface resistance was given by the user rather than
        taken from EN ISO 6946 Table 7."""
        return self._rse_given

    @property
    def corrections(self) -> CorrectionResult:
        """The U-value corrections and whether they were applied."""
        return self._corrections

    @property
    def bridging(self) -> BridgingResult | None:
        """Upper/lower-limit results where the construction has bridged layers."""
        return self._bridging_result

    def with_layer(self, index: int, layer) -> Construction:
        """A copy with layer ``index`` replaced by ``layer``."""
        layers = list(self.layers)
        layers[index] = layer
        return Construction(layers, self.heat_flow, rsi=self.rsi,
                            rse=self.rse if self._rse_given else None, name=self.name,
                            corrections=self.corrections_input,
                            apply_small_corrections=self.apply_small_corrections)

    def __repr__(self) -> str:
        return (f"Construction({len(self.layers)} layers, heat_flow={self.heat_flow!r}, "
                f"U={self.u_value:.4g} W/(m2 K))")


def _surface_resistance(name: str, value) -> float:
    """A given surface resistance [m2 K/W]: not negative, within the physical limit."""
    return within(name, non_negative(name, value, "m2 K/W"), "surface_resistance")


#: Why the finite-volume solution of a layered construction is exact at the faces (printed
#: with its mesh estimate). Without a volumetric source the temperature is linear in each
#: layer and harmonic-mean faces reproduce it at any mesh.
EXACT_REASON = ("no volumetric heat source, so the temperature is linear within each layer, "
                "which cells with harmonic-mean face conductances reproduce exactly at any "
                "mesh (heat released at interfaces included); the ladder check compares with "
                "the closed form")
#: With a uniform source g in a layer of equal cells w the exact temperature is quadratic;
#: the discrete solution is the exact one with every node raised by g w^2/(8 lambda), so the
#: half-cell relations give the face temperatures and heat fluxes exactly (derivation in
#: tests/test_fv1d_exact.py, checked there against the closed form at 1 to 8 cells).
EXACT_REASON_SOURCES = ("uniform heat source in equal cells: the face temperatures and heat "
                        "fluxes are exact at any mesh (the node temperatures of a heated "
                        "layer lie g w²/(8 λ) above the exact curve)")


def _mesh_estimate(sources, sol) -> tuple:
    """(MeshEstimate of the heat flux, largest interface-temperature change) [W/m2, K]:
    exact for every construction the solver takes (equal cells per layer, sources uniform
    per layer or at interfaces); the reason is stated."""
    reason = EXACT_REASON_SOURCES if sources[0] else EXACT_REASON
    return fv1d.exact_estimate("heat_flux", sol.heat_in, reason), 0.0


def _ladder_flux(counted, left, right, sources) -> float | None:
    """Heat flux from the series-resistance ladder, or None where no closed form applies.
    [W/m2]"""
    if sources[0] or sources[1] or "flux" in (left.kind, right.kind):
        return None
    r_total = left.resistance + math.fsum(row.resistance for row in counted) + right.resistance
    return (left.temperature - right.temperature) / r_total


def _cell_counts(counted, nodes_per_layer, max_spacing) -> list:
    """Finite-volume cells of each counted layer, within the engine's memory bound."""
    if nodes_per_layer is not None and max_spacing is not None:
        raise HeatLedgerError("give nodes_per_layer or max_spacing, not both")
    if max_spacing is not None:
        h = positive("max_spacing", max_spacing, "m")
        ratios = [row.thickness / h for row in counted]
        counts = [max(1, math.ceil(r - 1e-9)) if r <= MAX_CELLS else MAX_CELLS + 1
                  for r in ratios]
        what = f"max_spacing {h:g} m"
    elif nodes_per_layer is None:
        return [DEFAULT_NODES_PER_LAYER] * len(counted)
    else:
        items = ([nodes_per_layer] * len(counted)
                 if isinstance(nodes_per_layer, (int, np.integer, float, str, bool))
                 else list(nodes_per_layer))
        if len(items) != len(counted):
            raise HeatLedgerError(
                f"nodes_per_layer lists {len(items)} counts for {len(counted)} layers")
        for n in items:
            if isinstance(n, bool) or not isinstance(n, (int, np.integer)) or n < 1:
                raise HeatLedgerError(f"nodes_per_layer must be a whole number of at least 1 "
                                      f"in every layer; got {show(n)}")
        counts = [int(n) for n in items]
        what = "nodes_per_layer"
    if max(counts) > MAX_CELLS_PER_LAYER or sum(counts) > MAX_CELLS:
        raise HeatLedgerError(
            f"{what} asks for more cells than the engine takes: at most "
            f"{MAX_CELLS_PER_LAYER} per layer and {MAX_CELLS} in a construction (about 250 MB "
            "of memory; the solve converges as 1/n^2, so far fewer are enough)")
    return counts


def _input_slips(layers) -> list:
    """Warnings for layer input that is probably a slip (see heatledger._validate)."""
    out = []
    for i, lay in enumerate(layers, 1):
        mat = getattr(lay, "material", None)
        found = _layer_slips(lay.name, mat.name if mat is not None else "", lay.thickness,
                             getattr(lay, "conductivity", None))
        if found:
            label = f"layer {i} {quote(lay.name)}" if lay.name else f"layer {i}"
            out += [f"{label}: {text}" for text in found]
    return out


@functools.lru_cache(maxsize=4096)
def _layer_slips(name: str, material: str, thickness: float, conductivity) -> tuple:
    """The slip warnings of one layer, without its position (cached: a spreadsheet's tables
    repeat their layers). [-]"""
    found = [thin_layer_warning("", thickness, name, material,
                                metal=conductivity is not None and conductivity >= 10.0)]
    if conductivity is not None:
        found.append(conductivity_warning("", conductivity, name, material))
    return tuple(w for w in found if w)


def required_thickness(construction: Construction, layer_index: int, target_u: float, *,
                       max_thickness: float = 2.0) -> float:
    """Thickness of one layer that makes the construction reach a target U-value.

    Parameters
    ----------
    construction : Construction
        The construction as designed (the chosen layer's current thickness is ignored). [-]
    layer_index : int
        Index of the layer to size (0-based, inside to outside). [-]
    target_u : float
        Target U-value, corrections included. [W/(m2 K)]
    max_thickness : float
        Largest thickness searched. [m]

    Returns
    -------
    float
        The thickness at which ``U = target_u``. [m]

    Raises
    ------
    HeatLedgerError
        If the target cannot be reached with any thickness up to ``max_thickness`` (for
        example an inverted roof whose rain-water correction alone exceeds it), or if the
        layer is an air layer.

    Notes
    -----
    Where ``U = 1/R_T`` is linear in the layer's resistance (a plain or declared layer, no
    bridged layer, no ventilated air layer, no corrections) the closed form
    ``d = (1/U_t - R_rest) d_0/R_0`` is used, with ``R_rest = R_T - R_0`` and ``d_0/R_0`` the
    layer's thickness per unit resistance (``lambda``; a declared resistance scales with
    the thickness). Otherwise Brent's method solves ``U(d) - U_target = 0``, monotonic in
    ``d``.
    """
    target = positive("target_u", target_u, "W/(m2 K)")
    n = len(construction.layers)
    if not isinstance(layer_index, (int, np.integer)) or not 0 <= layer_index < n:
        raise HeatLedgerError(f"layer_index must be 0 to {n - 1}; got {show(layer_index)}")
    layer = construction.layers[layer_index]
    if layer.kind == "air":
        raise HeatLedgerError("layer_index points to an air layer; choose an insulation layer")

    d_min = 1e-4
    d_max = positive("max_thickness", max_thickness, "m")
    linear = (layer.kind in ("material", "declared") and construction.bridging is None
              and construction.ventilation is None and not construction.corrections_input)
    m_per_r = layer.thickness / layer.resistance_value if linear else 0.0  # [m/(m2 K/W)]
    r_rest = construction.total_resistance - layer.resistance_value if linear else 0.0

    def u_at(d: float) -> float:
        if linear:  # U = 1/R_T with R_T = R_rest + d/m_per_r
            return 1.0 / (r_rest + d / m_per_r) - target
        return construction.with_layer(layer_index, layer.with_thickness(d)).u_value - target

    if u_at(d_min) <= 0.0:
        raise HeatLedgerError(
            f"target_u {target:g} W/(m2 K) is met even without layer "
            f"{layer_index} ({quote(layer.name)}); no thickness is needed")
    if u_at(d_max) > 0.0:
        best = u_at(d_max) + target
        raise HeatLedgerError(
            f"target_u {target:g} W/(m2 K) cannot be reached: with {d_max:g} m of layer "
            f"{layer_index} ({quote(layer.name)}) U is still {best:.4g} W/(m2 K); improve another "
            "layer or relax the target")
    if linear:
        return float((1.0 / target - r_rest) * m_per_r)
    from scipy.optimize import brentq  # imported here: scipy.optimize costs 0.1 s at start-up

    return float(brentq(u_at, d_min, d_max, xtol=1e-9, rtol=1e-12))


def round_significant(value: float, digits: int = 2) -> float:
    """Round to ``digits`` significant figures, halves away from zero (as spreadsheets do).

    Parameters
    ----------
    value : float
        Value to round. [any unit]
    digits : int
        Significant figures. [-]

    Returns
    -------
    float

    Examples
    --------
    >>> round_significant(0.2449), round_significant(0.245), round_significant(1.25)
    (0.24, 0.25, 1.3)
    """
    if value == 0.0 or not math.isfinite(value):
        return value
    exponent = math.floor(math.log10(abs(value)))
    places = digits - 1 - exponent
    quantum = Decimal(1).scaleb(-places)
    return float(Decimal(repr(value)).quantize(quantum, rounding=ROUND_HALF_UP))
