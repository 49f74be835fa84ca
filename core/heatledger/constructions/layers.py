"""Layers of a construction: homogeneous, air and bridged layers (EN ISO 6946:2017, 6.7,
6.9).

Sources: [source: iso6946-layers, 6.7, 6.7.2]; [source: iso6946-airlayers, 6.9.2];
[source: iso6946-ventilated, 6.9.3, 6.9.4].
"""

from __future__ import annotations

import math

from .._validate import (
    LIMITS,
    choice,
    finite,
    fraction,
    non_negative,
    positive,
    quote,
    within,
)
from ..airlayers import (
    MAX_AIR_LAYER_THICKNESS,
    VENT_AREA_UNVENTILATED_MM2,
    VENT_AREA_WELL_VENTILATED_MM2,
    VENTILATION_CLASSES,
    air_layer_resistance,
)
from ..errors import HeatLedgerError
from ..materials import Material, _load_default

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


_THICKNESS, _CONDUCTIVITY, _LAYER_R = (LIMITS["thickness"], LIMITS["conductivity"],
                                      LIMITS["layer_resistance"])
_SD = LIMITS["sd"]
_EMISSIVITY_DEFAULT = 0.9


def _label(who: tuple) -> str:
    """How messages name a layer: ``who`` is (kind of layer, name). Built only when a check
    fails or a message needs it (the checks of a sound layer do not format text)."""
    kind, name = who
    return f"{kind} {quote(name)}" if name else kind


def _thickness(who: tuple, thickness) -> float:
    """A layer thickness [m]: greater than zero and within the physical limit."""
    if type(thickness) is float and _THICKNESS.low <= thickness <= _THICKNESS.high:
        return thickness  # the common case, without building the message
    label = _label(who)
    return within(f"{label} thickness", positive(f"{label} thickness", thickness, "m"),
                  "thickness")


def _vapour(who: tuple, thickness: float, mu, sd, material=None) -> tuple:
    """``(mu, sd)`` of a layer: a stated mu [-] or sd [m] (not both), else the material's mu;
    ``sd = mu d``; ``(None, None)`` when nothing is known. ``inf`` marks a vapour-tight
    layer. [source: iso13788-glaser, 6.2 (s_d = mu d)]."""
    if mu is None and sd is None:  # the common case: the material's value, or none
        mu = None if material is None else material.vapour_resistance_factor
        if mu is None:
            return None, None
        # library and project materials are checked when they are read
        return mu, math.inf if mu == math.inf else mu * thickness
    label = _label(who)
    if mu is not None and sd is not None:
        raise HeatLedgerError(f"{label}: give either vapour_resistance_factor or sd, not both")
    if sd is not None:
        sd = _positive_or_tight(f"{label} sd", sd, "sd")
        return sd / thickness, sd
    if mu is None and material is not None:
        mu = material.vapour_resistance_factor
    if mu is None:
        return None, None
    mu = _positive_or_tight(f"{label} vapour_resistance_factor", mu,
                            "vapour_resistance_factor")
    if math.isinf(mu):
        return mu, math.inf
    return mu, within(f"{label} s_d = mu d", mu * thickness, "sd")


def _positive_or_tight(name: str, value, kind: str) -> float:
    """A positive number within :data:`LIMITS` ``[kind]``, or ``inf`` (vapour-tight)."""
    try:
        if float(value) == math.inf:
            return math.inf
    except (TypeError, ValueError):
        pass
    return within(name, positive(name, value), kind)


def _conductivity(who: tuple, what: str, conductivity) -> float:
    """A conductivity [W/(m K)]: greater than zero and within the physical limits (``what``
    follows the layer's label in a message, as "conductivity")."""
    if type(conductivity) is float and _CONDUCTIVITY.low <= conductivity <= _CONDUCTIVITY.high:
        return conductivity
    name = f"{_label(who)} {what}"
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
        A material (or its name in the generic library) giving the conductivity and the
        vapour resistance factor. [-]
    vapour_resistance_factor : float, optional
        Water-vapour resistance factor mu (``inf`` = vapour-tight); default the material's.
        [-]
    sd : float, optional
        Declared equivalent air-layer thickness (membranes, foils) instead of mu. [m]

    Raises
    ------
    HeatLedgerError
        If the thickness is not positive, if both or neither of ``conductivity`` and
        ``resistance`` are given, or if a value is not positive and finite.

    Notes
    -----
    ``R = d / lambda`` (EN ISO 6946:2017, 6.7.1, eq. (4), recalled numbering);
    ``s_d = mu d`` (EN ISO 13788, 6.2). ``sd`` is None when no vapour value is known; a
    moisture check then names the layer.

    References
    ----------
    [source: iso6946-layers, 6.7 (R = d/lambda)]; [source: iso13788-glaser, 6.2 (s_d)].
    """

    __slots__ = ("thickness", "conductivity", "declared_resistance", "name", "material",
                 "resistance_value", "kind", "vapour_resistance_factor", "sd")

    def __init__(self, thickness, conductivity=None, *, resistance=None, name: str = "",
                 material=None, vapour_resistance_factor=None, sd=None) -> None:
        who = ("layer", name)
        self.thickness = _thickness(who, thickness)
        if isinstance(material, str):
            material = _load_default().get(material)  # cached library, read only
        if material is not None and not isinstance(material, Material):
            raise HeatLedgerError(f"{_label(who)} material must be a Material or a material "
                                  "name")
        self.material = material
        if conductivity is None and material is not None and resistance is None:
            conductivity = material.conductivity
        if conductivity is not None and resistance is not None:
            raise HeatLedgerError(
                f"{_label(who)}: give either conductivity or a declared resistance, not both"
            )
        if conductivity is None and resistance is None:
            raise HeatLedgerError(f"{_label(who)}: give a conductivity, a material or a "
                                  "resistance")
        self.name = str(name) or (material.name if material is not None else "")
        if resistance is not None:
            label = _label(who)
            self.conductivity = None
            self.declared_resistance = within(
                f"{label} resistance", positive(f"{label} resistance", resistance, "m2 K/W"),
                "layer_resistance")
            self.resistance_value = self.declared_resistance
            self.kind = "declared"
        else:
            self.conductivity = _conductivity(who, "conductivity", conductivity)
            self.declared_resistance = None
            r = self.thickness / self.conductivity
            self.resistance_value = r if _LAYER_R.low <= r <= _LAYER_R.high else within(
                f"{_label(who)} resistance thickness/conductivity", r, "layer_resistance")
            self.kind = "material"
        self.vapour_resistance_factor, self.sd = _vapour(
            who, self.thickness, vapour_resistance_factor, sd, material)

    def with_thickness(self, thickness) -> Layer:
        """The same layer with another thickness (a declared resistance scales with it, the
        vapour resistance factor stays).

        Parameters
        ----------
        thickness : float
            The new thickness. [m]
        """
        mu = self.vapour_resistance_factor
        if self.declared_resistance is not None:
            r = self.declared_resistance * float(thickness) / self.thickness
            return Layer(thickness, resistance=r, name=self.name, material=self.material,
                         vapour_resistance_factor=mu)
        return Layer(thickness, self.conductivity, name=self.name, material=self.material,
                     vapour_resistance_factor=mu)

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
        metre (horizontal layers); required for ``"slightly"``. [mm2 per m or m2]
    name : str
        Label. [-]
    sd : float, optional
        Equivalent air-layer thickness; default the thickness (mu = 1, still air). [m]

    Notes
    -----
    Unventilated: ``Rg`` of Annex D. Slightly ventilated:
    ``R_T = (1500 - Av)/1000 R_T,u + (Av - 500)/1000 R_T,v``. Well ventilated: the air layer
    and all layers outside it are disregarded and the external surface resistance becomes
    that of still air (the Rsi of the same heat-flow direction).

    References
    ----------
    [source: iso6946-airlayers, 6.9.2]; [source: iso6946-ventilated, 6.9.3, 6.9.4].
    """

    kind = "air"

    __slots__ = ("thickness", "ventilation", "emissivity_1", "emissivity_2", "vent_area", "name",
                 "vapour_resistance_factor", "sd")

    def __init__(self, thickness, *, ventilation: str = "unventilated", emissivity_1=0.9,
                 emissivity_2=0.9, vent_area=None, name: str = "", sd=None) -> None:
        who = ("air layer", name)
        d = thickness
        if not (type(d) is float and 0.0 < d <= MAX_AIR_LAYER_THICKNESS):
            d = positive(f"{_label(who)} thickness", d, "m")  # the common case skips this
        self.thickness = d
        if sd is None and type(d) is float and _SD.low <= d <= _SD.high:
            self.vapour_resistance_factor, self.sd = 1.0, d  # still air: mu = 1, s_d = d
        else:
            self.vapour_resistance_factor, self.sd = _vapour(
                who, d, 1.0 if sd is None else None, sd)
        if self.thickness > MAX_AIR_LAYER_THICKNESS + 1e-12:
            raise HeatLedgerError(
                f"{_label(who)} is {self.thickness * 1000.0:g} mm thick; the ISO 6946 Annex D "
                f"method covers air layers up to {MAX_AIR_LAYER_THICKNESS * 1000.0:g} mm: "
                "treat a larger space as an unheated space or a room (ISO 13789)")
        self.ventilation = (ventilation if ventilation == "unventilated" else
                            choice(f"{_label(who)} ventilation", ventilation,
                                   VENTILATION_CLASSES))
        self.emissivity_1, self.emissivity_2 = (
            (emissivity_1, emissivity_2) if emissivity_1 == emissivity_2 == _EMISSIVITY_DEFAULT
            and type(emissivity_1) is float and type(emissivity_2) is float else
            (fraction(f"{_label(who)} emissivity_1", emissivity_1, allow_zero=False),
             fraction(f"{_label(who)} emissivity_2", emissivity_2, allow_zero=False)))
        self.name = str(name) or "air layer"
        label = _label(who) if vent_area is not None or self.ventilation != "unventilated" \
            else ""  # messages below only where a vent area or a ventilation is given
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
        """Unventilated resistance ``Rg`` of this layer for ``heat_flow``. [m2 K/W]

        Parameters
        ----------
        heat_flow : str
            "up", "horizontal" or "down". [-]
        """
        return air_layer_resistance(self.thickness, heat_flow, self.emissivity_1,
                                    self.emissivity_2)

    def with_thickness(self, thickness) -> AirLayer:
        """The same air layer with another thickness.

        Parameters
        ----------
        thickness : float
            The new thickness. [m]
        """
        return AirLayer(thickness, ventilation=self.ventilation, emissivity_1=self.emissivity_1,
                        emissivity_2=self.emissivity_2, vent_area=self.vent_area, name=self.name,
                        sd=None if self.vapour_resistance_factor == 1.0 else
                        self.vapour_resistance_factor * float(thickness))


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
    vapour_resistance_factor : float, optional
        Water-vapour resistance factor mu of the layer as a whole. [-]
    sd : float, optional
        Equivalent air-layer thickness of the layer instead of mu. [m]

    Notes
    -----
    Each part defines a section of the element for the upper limit; the lower limit uses
    ``1/R_j = sum_q f_q / R_qj`` for this layer (EN ISO 6946:2017, 6.7.2). Where several
    layers are bridged, sections are all combinations of their parts with the product of
    the fractions (layouts assumed independent, such as crossed battens).

    References
    ----------
    [source: iso6946-layers, 6.7.2 (upper and lower limits)].
    """

    kind = "bridged"

    __slots__ = ("thickness", "parts", "name", "vapour_resistance_factor", "sd", "_lower")

    def __init__(self, thickness, parts, *, name: str = "", vapour_resistance_factor=None,
                 sd=None) -> None:
        who = ("bridged layer", name)
        self.thickness = _thickness(who, thickness)
        self.vapour_resistance_factor, self.sd = _vapour(who, self.thickness,
                                                         vapour_resistance_factor, sd)
        self.name = str(name) or "bridged layer"
        cleaned = []
        try:
            items = list(parts)
        except TypeError:
            raise HeatLedgerError(f"{_label(who)}: parts must be a list of (conductivity, "
                                  "area_fraction) pairs") from None
        if len(items) < 2:
            raise HeatLedgerError(f"{_label(who)}: parts must list at least two materials")
        for i, item in enumerate(items, 1):
            try:
                lam, frac = item
            except (TypeError, ValueError):
                raise HeatLedgerError(f"{_label(who)}: part {i} must be a (conductivity, "
                                      "area_fraction) pair") from None
            if isinstance(lam, Material):
                lam = lam.conductivity
            lam = _conductivity(who, f"part {i} conductivity", lam)
            if not (type(frac) is float and 0.0 < frac <= 1.0):  # the common case passes
                frac = finite(f"{_label(who)} part {i} area_fraction", frac)
                if not 0.0 < frac <= 1.0:
                    raise HeatLedgerError(f"{_label(who)} part {i} area_fraction must be above "
                                          f"0 and at most 1; got {frac:g}")
            cleaned.append((lam, frac))
        total = math.fsum([f for _, f in cleaned])
        if abs(total - 1.0) > 1e-6:
            raise HeatLedgerError(
                f"{_label(who)}: area fractions must sum to 1; they sum to {total:.6g}")
        self.parts = tuple(cleaned)
        r = self.thickness / math.fsum([lam * f for lam, f in cleaned])
        self._lower = r if _LAYER_R.low < r <= _LAYER_R.high else within(
            f"{_label(who)} lower-limit resistance thickness/(sum of fraction x conductivity)",
            r, "layer_resistance")

    @property
    def lower_limit_resistance(self) -> float:
        """Lower-limit resistance ``R_j = d / sum(f_q lambda_q)``. [m2 K/W]"""
        return self._lower

    def with_thickness(self, thickness) -> BridgedLayer:
        """The same bridged layer with another thickness.

        Parameters
        ----------
        thickness : float
            The new thickness. [m]
        """
        return BridgedLayer(thickness, self.parts, name=self.name,
                            vapour_resistance_factor=self.vapour_resistance_factor)
