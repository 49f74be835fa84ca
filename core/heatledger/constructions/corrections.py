"""Corrections to U (EN ISO 6946:2017, Annex F): air gaps, mechanical fasteners, inverted
roofs.

Sources: [source: iso6946-corrections, Annex F].
"""

from __future__ import annotations

from dataclasses import dataclass

from .._validate import (
    choice,
    non_negative,
    positive,
    show,
)
from ..errors import HeatLedgerError

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

    References
    ----------
    [source: iso6946-corrections, F.2].
    """

    layer: int
    level: int

    def delta_u(self, r_layer: float, r_total: float, layer_obj) -> float:
        """The correction Delta U of this item for the construction. [W/(m2 K)]

        Parameters
        ----------
        r_layer : float
            Thermal resistance R of the corrected layer. [m2 K/W]
        r_total : float
            Total thermal resistance R_T of the construction. [m2 K/W]
        layer_obj : Layer
            The corrected layer (its thickness for fasteners). [-]
        """
        levels = {0: 0.0, 1: 0.01, 2: 0.04}
        if self.level not in levels:
            raise HeatLedgerError(f"air-gap correction level must be 0, 1 or 2; got "
                                  f"{show(self.level)}")
        return levels[self.level] * (r_layer / r_total) ** 2

    @property
    def label(self) -> str:
        """The correction as the sheets and reports name it. [-]"""
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

    References
    ----------
    [source: iso6946-corrections, F.3].
    """

    layer: int
    conductivity: float
    cross_section: float
    count_per_m2: float
    penetration: float | None = None
    edition: str = "2017"
    application: str = "wall"

    def delta_u(self, r_layer: float, r_total: float, layer_obj) -> float:
        """The correction Delta U of this item for the construction. [W/(m2 K)]

        Parameters
        ----------
        r_layer : float
            Thermal resistance R of the corrected layer. [m2 K/W]
        r_total : float
            Total thermal resistance R_T of the construction. [m2 K/W]
        layer_obj : Layer
            The corrected layer (its thickness for fasteners). [-]
        """
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
        """The correction as the sheets and reports name it. [-]"""
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

    References
    ----------
    [source: iso6946-corrections, F.4].
    """

    layer: int
    precipitation: float
    drainage_factor: float
    factor_x: float = 0.04

    def delta_u(self, r_layer: float, r_total: float, layer_obj) -> float:
        """The correction Delta U of this item for the construction. [W/(m2 K)]

        Parameters
        ----------
        r_layer : float
            Thermal resistance R of the corrected layer. [m2 K/W]
        r_total : float
            Total thermal resistance R_T of the construction. [m2 K/W]
        layer_obj : Layer
            The corrected layer (its thickness for fasteners). [-]
        """
        p = non_negative("inverted-roof precipitation", self.precipitation, "mm/day")
        f = non_negative("inverted-roof drainage_factor", self.drainage_factor)
        x = non_negative("inverted-roof factor_x", self.factor_x)
        return p * f * x * (r_layer / r_total) ** 2

    @property
    def label(self) -> str:
        """The correction as the sheets and reports name it. [-]"""
        return "inverted roof, rain water (ISO 6946 F.4)"
