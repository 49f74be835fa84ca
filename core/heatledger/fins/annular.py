"""Annular (circumferential) fins of rectangular profile: the Bessel-function solution.

Sources: [source: incropera-6, 3.6.3]; [source: kern-1950, eq. 16.58]; Bessel functions
[source: abramowitz-stegun, 9.6].
"""

from __future__ import annotations

import math
from dataclasses import KW_ONLY, dataclass

import numpy as np

from .. import _validate as v
from ..errors import HeatLedgerError
from ._base import FinBase
from ._bessel import ive, kve
from .straight import BIOT_1D_LIMIT

__all__ = ["AnnularFin", "ANNULAR_TIPS"]

ANNULAR_TIPS = ("adiabatic", "convective")


@dataclass(frozen=True)
class AnnularFin(FinBase):
    """An annular fin of uniform thickness on a tube (a disc between two radii).

    Parameters
    ----------
    inner_radius : float
        Radius of the fin root (tube outer radius) ``r_1``. [m]
    outer_radius : float
        Outer radius of the fin ``r_2``; must exceed ``inner_radius``. [m]
    thickness : float
        Fin thickness ``t``. [m]
    conductivity : float
        Thermal conductivity of the fin material. [W/(m K)]
    h : float
        Convection coefficient on both faces (and the rim for a convective tip). [W/(m2 K)]
    tip : str
        ``"adiabatic"`` (insulated rim) or ``"convective"`` (the rim ``2 pi r_2 t`` convects
        with ``h``). [-]
    corrected_length : bool
        For ``tip="convective"``: use the adiabatic solution on the corrected radius
        ``r_2c = r_2 + t/2`` instead of the exact convective-rim solution. [-]

    Raises
    ------
    HeatLedgerError
        For non-positive dimensions, ``inner_radius >= outer_radius``, an unknown tip, or
        ``corrected_length`` with an adiabatic tip.

    Notes
    -----
    ``d/dr (r d theta/dr) - m^2 r theta = 0`` with ``m = sqrt(2h/(k t))``, so
    ``theta = C_1 I0(m r) + C_2 K0(m r)``. Adiabatic rim (Incropera eq. 3.93 recalled,
    Kern eq. 16.58):

    ``eta_f = C_2 [K1(m r_1) I1(m r_2) - I1(m r_1) K1(m r_2)] /
    [I0(m r_1) K1(m r_2) + K0(m r_1) I1(m r_2)]``,  ``C_2 = (2 r_1/m)/(r_2^2 - r_1^2)``

    with ``A_f = 2 pi (r_2^2 - r_1^2)`` (``r_2c`` in place of ``r_2`` for the corrected
    length). The convective rim uses ``-k theta'(r_2) = h theta(r_2)`` and
    ``A_f = 2 pi (r_2^2 - r_1^2) + 2 pi r_2 t``. The constants are found with exponentially
    scaled Bessel functions so large ``m r`` does not overflow. Base heat rate
    ``q_f = -k 2 pi r_1 t theta'(r_1)``; effectiveness uses ``A_c,b = 2 pi r_1 t``.

    References
    ----------
    F. P. Incropera, D. P. DeWitt, *Fundamentals of Heat and Mass Transfer*, 6th ed., Wiley
    2007, section 3.6.3 and Table 3.5 (annular fin; equation numbers recalled).
    D. Q. Kern, *Process Heat Transfer*, McGraw-Hill 1950, eq. 16.58.
    [source: incropera-6, 3.6.3, Table 3.5]; [source: kern-1950, eq. 16.58].

    Examples
    --------
    A 0.38 mm fin of 57.15 mm diameter on a 25.4 mm tube (the inputs of the ``ht`` library's
    own example for its annular fin efficiency):

    >>> round(AnnularFin(0.0127, 0.028575, 0.00038, 200.0, 58.0).efficiency, 6)
    0.841259
    """

    inner_radius: float
    outer_radius: float
    thickness: float
    conductivity: float
    h: float
    _: KW_ONLY
    tip: str = "adiabatic"
    corrected_length: bool = False

    def __post_init__(self) -> None:
        _set = object.__setattr__
        _set(self, "inner_radius", v.positive("inner_radius", self.inner_radius, "m"))
        _set(self, "outer_radius", v.positive("outer_radius", self.outer_radius, "m"))
        if not self.inner_radius < self.outer_radius:
            raise HeatLedgerError(
                f"inner_radius must be below outer_radius; got inner_radius="
                f"{self.inner_radius:g} m, outer_radius={self.outer_radius:g} m"
            )
        _set(self, "thickness", v.positive_within("thickness", self.thickness, "thickness", "m"))
        _set(self, "conductivity", v.positive_within("conductivity", self.conductivity,
                                                     "conductivity", "W/(m K)"))
        _set(self, "h", v.positive_within("h", self.h, "h", "W/(m2 K)"))
        _set(self, "tip", v.choice("tip", self.tip, ANNULAR_TIPS))
        if not isinstance(self.corrected_length, (bool, np.bool_)):
            raise HeatLedgerError(
                f"corrected_length must be true or false; got {v.show(self.corrected_length)}"
            )
        if self.corrected_length and self.tip != "convective":
            raise HeatLedgerError(
                f'corrected_length applies to tip "convective"; got tip {v.show(self.tip)}'
            )

    temp_tip = None  # no prescribed-temperature rim for annular fins

    # ---------------------------------------------------------------- geometry
    @property
    def length(self) -> float:
        """Radial length ``r_2 - r_1``. [m]"""
        return self.outer_radius - self.inner_radius

    @property
    def effective_outer_radius(self) -> float:
        """``r_2c = r_2 + t/2`` with ``corrected_length``, else ``r_2``. [m]"""
        return self.outer_radius + (self.thickness / 2.0 if self.corrected_length else 0.0)

    @property
    def m(self) -> float:
        """Fin parameter ``m = sqrt(2h/(k t))``. [1/m]"""
        return math.sqrt(2.0 * self.h / (self.conductivity * self.thickness))

    @property
    def cross_section_area(self) -> float:
        """Conduction area at the root ``A_c,b = 2 pi r_1 t``. [m2]"""
        return 2.0 * math.pi * self.inner_radius * self.thickness

    @property
    def fin_area(self) -> float:
        """Heat-transfer area ``A_f`` used in the efficiency. [m2]"""
        r1, r2 = self.inner_radius, self.effective_outer_radius
        area = 2.0 * math.pi * (r2 * r2 - r1 * r1)
        if self.tip == "convective" and not self.corrected_length:
            area += 2.0 * math.pi * r2 * self.thickness
        return area

    @property
    def inputs(self) -> dict:
        """The fin's inputs (for the audit trail). [-]"""
        return {"kind": "annular fin", "inner_radius": self.inner_radius,
                "outer_radius": self.outer_radius, "thickness": self.thickness,
                "conductivity": self.conductivity, "h": self.h, "tip": self.tip,
                "corrected_length": bool(self.corrected_length)}

    def bessel_values(self) -> dict:
        """The modified Bessel functions of the solution at the root and the rim.

        Returns
        -------
        dict
            ``("I" or "K", order 0 or 1, "x_1" or "x_2")`` -> value, with ``x_1 = m r_1`` and
            ``x_2 = m r_2c``; the calculation sheet shows each beside its own formula. [-]

        Notes
        -----
        :math:`I_n(x) = \\mathrm{ive}(n, x)\\,e^{x}` and
        :math:`K_n(x) = \\mathrm{kve}(n, x)\\,e^{-x}` (scipy's scaled functions).

        References
        ----------
        Abramowitz & Stegun 1964, 9.6 (modified Bessel functions); Incropera & DeWitt 6th ed.,
        3.6.3 (the annular fin's solution).
        """
        out = {}
        for label, x in (("x_1", self.m * self.inner_radius),
                         ("x_2", self.m * self.effective_outer_radius)):
            for n in (0, 1):
                out[("I", n, label)] = float(ive(n, x) * math.exp(x))
                out[("K", n, label)] = float(kve(n, x) * math.exp(-x))
        return out

    def with_length(self, length: float) -> AnnularFin:
        """The same fin with radial length ``length`` [m] (outer radius moved).

        Parameters
        ----------
        length : float
            Radial length r_2 - r_1 of the new fin. [m]
        """
        from dataclasses import replace

        return replace(self, outer_radius=self.inner_radius + v.positive("length", length, "m"))

    # ---------------------------------------------------------------- internals
    @property
    def _method(self) -> str:
        if self.tip == "adiabatic":
            return "annular fin, Bessel solution, adiabatic rim (Kern eq. 16.58)"
        if self.corrected_length:
            return "annular fin, Bessel solution, adiabatic on corrected radius r2c = r2 + t/2"
        return "annular fin, Bessel solution, convective rim (exact)"

    @property
    def _references(self) -> tuple:
        return ("Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, 6th ed., "
                "section 3.6.3, Table 3.5",
                "Kern, Process Heat Transfer, 1950, eq. 16.58")

    def _length_axis(self) -> tuple[float, float]:
        return self.inner_radius, self.outer_radius

    def _constants(self):
        """Scaled constants (a, b) with
        ``theta/theta_b = a ive0(mr) e^{m(r-r2)} + b kve0(mr) e^{-m(r-r1)}``."""
        m, r1, r2 = self.m, self.inner_radius, self.effective_outer_radius
        e = math.exp(-m * (r2 - r1))
        x1, x2 = m * r1, m * r2
        # base row: theta(r1) = 1
        row1 = (ive(0, x1) * e, kve(0, x1))
        if self.tip == "adiabatic" or self.corrected_length:
            row2 = (ive(1, x2), -kve(1, x2) * e)  # theta'(r2) = 0
        else:  # k theta'(r2) + h theta(r2) = 0
            k, h = self.conductivity, self.h
            row2 = (k * m * ive(1, x2) + h * ive(0, x2), (-k * m * kve(1, x2)
                                                          + h * kve(0, x2)) * e)
        det = row1[0] * row2[1] - row1[1] * row2[0]
        return row2[1] / det, -row2[0] / det

    def _conductances(self) -> tuple[float, float]:
        m, r1, r2 = self.m, self.inner_radius, self.effective_outer_radius
        a, b = self._constants()
        e = math.exp(-m * (r2 - r1))
        dtheta = m * (a * ive(1, m * r1) * e - b * kve(1, m * r1))  # theta'(r1)/theta_b
        return float(-self.conductivity * self.cross_section_area * dtheta), 0.0

    def _theta(self, r: np.ndarray, theta_b: float, theta_l: float) -> np.ndarray:
        m, r1, r2 = self.m, self.inner_radius, self.effective_outer_radius
        r = np.asarray(r, dtype=float)
        a, b = self._constants()
        return theta_b * (a * ive(0, m * r) * np.exp(m * (r - r2))
                          + b * kve(0, m * r) * np.exp(-m * (r - r1)))

    def _coefficients(self) -> dict:
        m = self.m
        r1, r2 = self.inner_radius, self.effective_outer_radius
        return {"m": m, "m_r1": m * r1, "m_r2": m * r2, "effective_outer_radius": r2,
                "C2": (2.0 * r1 / m) / (r2 * r2 - r1 * r1), "fin_area": self.fin_area,
                "cross_section_area": self.cross_section_area,
                "mL": m * (r2 - r1)}

    def _fin_notes(self) -> tuple[tuple, tuple]:
        biot = self.h * self.thickness / 2.0 / self.conductivity
        if biot > BIOT_1D_LIMIT:
            return (f"Biot number h (t/2)/k = {biot:.3g} > {BIOT_1D_LIMIT}: the 1-D fin "
                    "model is doubtful",), ()
        return (), ()

    def _fv_setup(self) -> dict:
        r1, t = self.inner_radius, self.thickness
        setup = {"length": self.effective_outer_radius - r1,
                 "area": lambda x: 2.0 * math.pi * (r1 + np.asarray(x)) * t,
                 "perimeter": lambda x: 4.0 * math.pi * (r1 + np.asarray(x)),
                 "x_offset": r1, "base_cross_section": self.cross_section_area}
        if self.tip == "convective" and not self.corrected_length:
            setup.update(tip="convective", tip_area=2.0 * math.pi * self.outer_radius * t)
        else:
            setup["tip"] = "adiabatic"
        return setup
