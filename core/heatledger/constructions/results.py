"""Results of a construction: the layer table, bridging, corrections, ventilation and
temperatures through the layers.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from functools import cached_property

import numpy as np

from .. import fv1d

# --------------------------------------------------------------------------------------
# Results


@dataclass(frozen=True)
class LayerRow:
    """One row of a construction's layer table (resistance as used in the series sum).

    Attributes
    ----------
    index : int
        Position, 0 = inside. [-]
    name : str
        Layer name. [-]
    kind : str
        "material", "declared", "air" or "bridged". [-]
    thickness : float
        Layer thickness. [m]
    conductivity : float or None
        Conductivity where the layer has one. [W/(m K)]
    resistance_own : float
        Thermal resistance of the layer by itself. [m2 K/W]
    resistance : float
        Resistance as used in the series sum (after ventilation or bridging factors). [m2 K/W]
    counted : bool
        Whether the layer counts in R_T. [-]
    note : str
        How the resistance was found. [-]
    """

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
    whether they were applied (the 3 % rule).

    Attributes
    ----------
    items : tuple
        (label, layer index, delta_u) of each correction. [-]
    delta_u_total : float
        Sum of the corrections Delta U. [W/(m2 K)]
    applied : bool
        Whether the corrections are applied (3 % rule). [-]
    rule : str
        The rule applied, in words. [-]
    """

    items: tuple
    delta_u_total: float
    applied: bool
    rule: str


@dataclass(frozen=True)
class VentilationResult:
    """How a ventilated air layer was treated (EN ISO 6946:2017, 6.9.3/6.9.4).

    Attributes
    ----------
    layer : int
        Index of the ventilated air layer. [-]
    ventilation : str
        "slightly" or "well". [-]
    vent_area : float
        Vent area A_v. [mm2 per m or m2]
    r_total_unventilated : float or None
        R_T with the layer unventilated. [m2 K/W]
    r_total_ventilated : float or None
        R_T with the layer well ventilated. [m2 K/W]
    weight_unventilated : float
        Weight (1500 - A_v)/1000. [-]
    weight_ventilated : float
        Weight (A_v - 500)/1000. [-]
    tail_scale : float
        Factor on the air layer, the layers outside it and Rse. [-]
    note : str
        The rule applied, in words. [-]
    """

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
    estimator : callable
        Computes the mesh estimate on first access (internal). [-]

    References
    ----------
    [source: patankar-1980, ch. 4]; mesh estimate [source: roache-1998].
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
