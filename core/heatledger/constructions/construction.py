"""The construction: layers inside to outside, surface resistances, R_T, U and the
temperatures through the layers by 1-D finite volumes.

Sources: [source: iso6946-layers, 6.7, clause 8]; [source: patankar-1980, ch. 4].
"""

from __future__ import annotations

import math
from functools import cached_property
from itertools import product

import numpy as np

from .. import fv1d
from .._rounding import round_significant
from .._validate import (
    MAX_CELLS,
    MAX_CELLS_PER_LAYER,
    choice,
    finite,
    non_negative,
    positive,
    quote,
    show,
    within,
)
from ..airlayers import (
    VENT_AREA_UNVENTILATED_MM2,
    VENT_AREA_WELL_VENTILATED_MM2,
)
from ..errors import HeatLedgerError
from ..surfaces import HEAT_FLOWS, surface_resistance
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
from .slips import _input_slips

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

    References
    ----------
    [source: iso6946-layers, 6.7]; [source: iso6946-surfaces, 6.8];
    [source: iso6946-corrections, Annex F]; temperatures [source: patankar-1980, ch. 4].

    Examples
    --------
    >>> wall = Construction([Layer(0.1, 1.0), Layer(0.1, 0.04)])
    >>> round(wall.u_value, 4)
    0.361
    """

    def __init__(self, layers, heat_flow: str = "horizontal", *, rsi=None, rse=None,
                 name: str = "", corrections=(), apply_small_corrections: bool = False) -> None:
        self.name = str(name)
        self.heat_flow = (heat_flow if type(heat_flow) is str and heat_flow in _HEAT_FLOW_SET
                          else choice("heat_flow", heat_flow, HEAT_FLOWS))
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
        # tuples, not lists: a cached construction then holds fewer objects the cyclic
        # garbage collector walks (a workbook may keep thousands)
        self._method_warnings: tuple = ()
        self._compute(label, rse_given)

    # ---- results --------------------------------------------------------------------
    @cached_property
    def input_warnings(self) -> list:
        """Input that is probably a slip (a thickness in metres in a millimetre field, a
        conductivity far outside its material class); also at the head of ``warnings``.
        Found when first read (a U-value alone does not need them). [-]"""
        return _input_slips(self.layers)

    @cached_property
    def warnings(self) -> list:
        """The input slips, then the method's warnings (bridging limits beyond their range,
        bridged layers with a slightly ventilated air layer). [-]"""
        return self.input_warnings + list(self._method_warnings)

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
        corr = self.corrections
        return self.u_value_uncorrected + (corr.delta_u_total if corr.applied
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

    def surface_factor(self, resistance_inside=0.25) -> float:
        """Temperature factor at the inside surface of the plane construction,
        ``f_Rsi = (R_T - R_si) / R_T`` with ``R_T = R_si + sum R_j + R_se`` taken with this
        ``R_si`` (not ``1 - U R_si`` with the U-value's own Rsi).

        Parameters
        ----------
        resistance_inside : float
            Inside surface resistance of the check; EN ISO 13788 takes 0.25 for opaque
            elements (0.13 for glazing and frames). [m2 K/W]

        Returns
        -------
        float
            f_Rsi. [-]

        References
        ----------
        [source: iso13788-surface, 5.2 (f_Rsi, R_si = 0.25)]; R_T [source: iso6946-layers, 6.7].
        """
        r_si = _surface_resistance("resistance_inside", resistance_inside)
        r_t = self._r_total - self.rsi + r_si
        return (r_t - r_si) / r_t

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
        vent_idx = None  # ventilated air layers: the first one from the inside governs
        for i, lay in enumerate(self.layers):
            kind = lay.kind
            if kind == "air":
                own.append(lay.resistance_for(hf))
                if vent_idx is None and lay.ventilation != "unventilated":
                    vent_idx = i
            elif kind == "bridged":
                own.append(lay.lower_limit_resistance)
            else:
                own.append(lay.resistance_value)
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

        bridging = self._bridging(own, counted, rse_used)
        r_total = (bridging.total if bridging else
                   self.rsi + math.fsum([r for r, c in zip(own, counted, strict=True) if c])
                   + rse_used)

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
                self._method_warnings += ("bridged layers with a slightly ventilated air "
                                          "layer: the bridging limits are computed with the "
                                          "layer unventilated",)
            self._ventilation = VentilationResult(
                vent_idx, "slightly", av, r_tu, r_tv, w_u, w_v, s,
                "slightly ventilated: R_T = (1500 - Av)/1000 R_T,u + (Av - 500)/1000 R_T,v; "
                f"air layer, outer layers and Rse scaled by {s:.6g} so the ladder sums to R_T")
        elif bridging is not None:
            # share the bridging adjustment (R_T - R''_T) among bridged layers, in proportion
            # to their lower-limit resistances, so that the ladder sums to R_T
            lower_r = bridging.layer_lower_resistances  # the counted bridged layers, in order
            s = 1.0 + (bridging.total - bridging.lower) / sum(lower_r.values())
            for i in lower_r:
                scale[i] = s
        self._bridging_result = bridging
        self._r_total = r_total
        self._rse_used = rse_used
        self._row_data = (tuple(own), tuple(scale), tuple(counted))
        if bridging is not None and bridging.ratio > BRIDGING_RATIO_LIMIT:
            self._method_warnings += (
                f"upper/lower limit ratio {bridging.ratio:.3f} exceeds 1.5: ISO 6946:2017 6.7.2 "
                "is not valid; use a numerical method (ISO 10211)",)
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
        base = self.rsi + rse_used + math.fsum([own[i] for i in range(len(own))
                                                if counted[i] and i not in bridged])
        sections = _sections(base, [self.layers[i] for i in bridged])
        inv_upper = 0.0
        for frac, r_q in sections:
            inv_upper += frac / r_q
        upper = 1.0 / inv_upper
        lower = base + math.fsum([own[i] for i in bridged])
        total = 0.5 * (upper + lower)
        return BridgingResult(upper, lower, total, (upper - lower) / (2.0 * total),
                              upper / lower, tuple(sections), {i: own[i] for i in bridged})

    def _apply_corrections(self, label, own) -> CorrectionResult:
        if not self.corrections_input:
            return _NO_CORRECTIONS
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
        """A copy with layer ``index`` replaced by ``layer``.

        Parameters
        ----------
        index : int
            Position of the layer, 0 = inside. [-]
        layer : Layer or AirLayer or BridgedLayer
            The new layer. [-]
        """
        layers = list(self.layers)
        layers[index] = layer
        return Construction(layers, self.heat_flow, rsi=self.rsi,
                            rse=self.rse if self._rse_given else None, name=self.name,
                            corrections=self.corrections_input,
                            apply_small_corrections=self.apply_small_corrections)

    def __repr__(self) -> str:
        return (f"Construction({len(self.layers)} layers, heat_flow={self.heat_flow!r}, "
                f"U={self.u_value:.4g} W/(m2 K))")


#: The heat-flow directions, for a quick test of a direction written as the engine writes it.
_HEAT_FLOW_SET = frozenset(HEAT_FLOWS)
#: The correction result of a construction without corrections (immutable, shared).
_NO_CORRECTIONS = CorrectionResult((), 0.0, False, "no corrections")


def _sections(base: float, bridged: list) -> list:
    """Area fraction [-] and total resistance [m2 K/W] of every section of the upper limit:
    every combination of the parts of the bridged layers, each adding its d/lambda to the
    ``base`` resistance of the other layers and the surfaces."""
    if len(bridged) == 1:  # the common case: the sections are the parts of the one layer
        d = bridged[0].thickness
        return [(f, base + d / lam) for lam, f in bridged[0].parts]
    out = []
    for combo in product(*(lay.parts for lay in bridged)):
        frac = 1.0
        r_q = base
        for lay, (lam, f) in zip(bridged, combo, strict=True):
            frac *= f
            r_q += lay.thickness / lam
        out.append((frac, r_q))
    return out


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
