"""Straight fins: plates and pins of rectangular (uniform), triangular and parabolic profile."""

from __future__ import annotations

import math
from dataclasses import KW_ONLY, dataclass

import numpy as np

from .. import _validate as v
from ..errors import HeatLedgerError
from ._base import FinBase
from ._bessel import ive

__all__ = ["StraightFin", "STRAIGHT_TIPS", "STRAIGHT_PROFILES"]

STRAIGHT_TIPS = ("convective", "adiabatic", "temperature", "infinite")
STRAIGHT_PROFILES = ("rectangular", "triangular", "parabolic")

#: mL above which the infinite-fin form is within 1 % of the adiabatic tip (tanh 2.65 = 0.99).
#: source: Incropera & DeWitt 6th ed., section 3.6.2, Example 3.9 (recalled); tanh checks it.
INFINITE_FIN_ML = 2.65
#: Validity of the corrected length: h t / k (plate) or h D / (2 k) (pin) below 0.0625.
#: from memory: Incropera & DeWitt 6th ed., section 3.6.2 (text after eq. 3.89).
CORRECTED_LENGTH_LIMIT = 0.0625
#: Biot number h (t/2)/k above which the 1-D fin assumption is doubtful.
#: common practice, no published source.
BIOT_1D_LIMIT = 0.1


@dataclass(frozen=True)
class StraightFin(FinBase):
    """A straight fin: a plate (``thickness`` given) or a pin (``diameter`` given).

    Parameters
    ----------
    length : float
        Fin length from the base to the tip. [m]
    conductivity : float
        Thermal conductivity of the fin material. [W/(m K)]
    h : float
        Convection coefficient on the fin surface (and tip). [W/(m2 K)]
    thickness : float, optional
        Plate thickness at the base (give this or ``diameter``). [m]
    diameter : float, optional
        Pin diameter at the base (give this or ``thickness``). [m]
    width : float
        Plate width along the base (plates only; 1 m gives results per metre). [m]
    tip : str
        ``"convective"`` (Table 3.4 case A), ``"adiabatic"`` (B), ``"temperature"`` (C,
        needs ``temp_tip``) or ``"infinite"`` (D). Profiled fins end in an edge or
        point and accept ``"convective"`` or ``"adiabatic"`` only (no tip area). [-]
    temp_tip : float, optional
        Prescribed tip temperature for ``tip="temperature"``. [degC]
    corrected_length : bool
        For ``tip="convective"`` on a rectangular profile: use the adiabatic form with
        ``L_c = L + t/2`` (plate) or ``L + D/4`` (pin). [-]
    profile : str
        ``"rectangular"`` (uniform cross-section), ``"triangular"`` (a wedge; for a pin, a
        cone) or ``"parabolic"`` (concave parabola ``y = (t/2)(1 - x/L)^2``). [-]

    Raises
    ------
    HeatLedgerError
        For a non-positive dimension, both or neither of ``thickness`` and ``diameter``, an
        unknown ``tip`` or ``profile``, ``tip="temperature"`` without ``temp_tip``,
        or an option that does not apply (``width`` on a pin, ``corrected_length`` with
        another tip or profile).

    Notes
    -----
    Uniform fin, ``theta = T - T_inf``, ``m^2 = h P / (k A_c)``, ``M = sqrt(h P k A_c)``
    with ``P = 2(w + t)``, ``A_c = w t`` (plate; the side edges are included in ``P``) or
    ``P = pi D``, ``A_c = pi D^2/4`` (pin). Heat rate (Table 3.4):

    - A, convective: ``q = M theta_b (sinh mL + (h/mk) cosh mL)/(cosh mL + (h/mk) sinh mL)``
    - B, adiabatic: ``q = M theta_b tanh mL``
    - C, prescribed ``theta_L``: ``q = M (theta_b cosh mL - theta_L)/sinh mL``
    - D, infinite: ``q = M theta_b``

    Efficiency ``eta_f = q/(h A_f theta_b)`` with ``A_f = P L + A_c`` (A), ``P L_c``
    (corrected length), ``P L`` (B, C, D). For C the efficiency counts only the heat convected
    from the side, ``M (theta_b + theta_L) tanh(mL/2)``, and for D it is ``1/(mL)`` on the
    given length. Effectiveness ``epsilon_f = q/(h A_c,b theta_b)``; resistance
    ``R_t,f = theta_b/q``.

    Profiled fins (Table 3.5, ``w >> t`` so ``m = sqrt(2h/(k t))`` for plates,
    ``m = sqrt(4h/(k D))`` for pins; ``q = eta_f h A_f theta_b``):

    - triangular plate ``eta = I1(2mL)/(mL I0(2mL))``, ``A_f = 2 w sqrt(L^2 + (t/2)^2)``;
    - parabolic plate ``eta = 2/(sqrt(4(mL)^2 + 1) + 1)``,
      ``A_f = w (C1 L + (L^2/t) ln(t/L + C1))``, ``C1 = sqrt(1 + (t/L)^2)``;
    - conical pin ``eta = (2/(mL)) I2(2mL)/I1(2mL)``, ``A_f = (pi D/2) sqrt(L^2 + (D/2)^2)``;
    - parabolic pin ``eta = 2/(sqrt((4/9)(mL)^2 + 1) + 1)``, ``A_f`` the exact surface of
      revolution of ``r = (D/2)(1 - x/L)^2``.

    The efficiencies and the temperature distributions of profiled fins solve the slender-fin
    equation (convection per unit projected length, ``P = 2w`` or ``2 pi r``); the textbook's
    heat rate multiplies that efficiency by the true surface ``A_f``, which is larger by a
    factor of order ``1 + (t/2L)^2/2``. Finite volumes (``nodes=``) use the true surface per
    unit length, so they agree with ``q`` to that order.

    References
    ----------
    F. P. Incropera, D. P. DeWitt, *Fundamentals of Heat and Mass Transfer*, 6th ed., Wiley
    2007: section 3.6, Table 3.4 (eqs. 3.70-3.81: distributions and heat rates, numbers
    recalled), eqs. 3.86-3.91 (efficiency, corrected length, recalled), Table 3.5.
    [source: incropera-6, 3.6, Tables 3.4 and 3.5].

    Examples
    --------
    An aluminium plate fin per metre of width (invented example):

    >>> fin = StraightFin(0.05, 200.0, 25.0, thickness=0.002, tip="adiabatic")
    >>> round(fin.efficiency, 4), round(fin.heat_rate(80.0, 20.0), 1)
    (0.9072, 136.4)
    """

    length: float
    conductivity: float
    h: float
    _: KW_ONLY
    thickness: float | None = None
    diameter: float | None = None
    width: float = 1.0
    tip: str = "convective"
    temp_tip: float | None = None
    corrected_length: bool = False
    profile: str = "rectangular"

    def __post_init__(self) -> None:
        _set = object.__setattr__
        _set(self, "length", v.positive("length", self.length, "m"))
        _set(self, "conductivity", v.positive_within("conductivity", self.conductivity,
                                                     "conductivity", "W/(m K)"))
        _set(self, "h", v.positive_within("h", self.h, "h", "W/(m2 K)"))
        if (self.thickness is None) == (self.diameter is None):
            got = "both" if self.thickness is not None else "neither"
            raise HeatLedgerError(
                "give exactly one of thickness (a plate fin) or diameter (a pin fin); "
                f"got {got}"
            )
        if self.thickness is not None:
            _set(self, "thickness", v.positive_within("thickness", self.thickness, "thickness",
                                                      "m"))
            _set(self, "width", v.positive_within("width", self.width, "thickness", "m"))
        else:
            _set(self, "diameter", v.positive_within("diameter", self.diameter, "thickness",
                                                     "m"))
            if float(self.width) != 1.0:
                raise HeatLedgerError(
                    f"width applies to plate fins only; got width {v.show(self.width)} with a "
                    "diameter (pin fin)"
                )
        _set(self, "tip", v.choice("tip", self.tip, STRAIGHT_TIPS))
        _set(self, "profile", v.choice("profile", self.profile, STRAIGHT_PROFILES))
        if self.tip == "temperature":
            if self.temp_tip is None:
                raise HeatLedgerError(
                    'tip "temperature" needs temp_tip (the tip temperature in degC); '
                    "it is not given"
                )
            _set(self, "temp_tip", v.within("temp_tip", self.temp_tip,
                                                   "temperature"))
        elif self.temp_tip is not None:
            raise HeatLedgerError(
                'temp_tip is used only with tip "temperature"; got tip '
                f"{v.show(self.tip)}"
            )
        if not isinstance(self.corrected_length, (bool, np.bool_)):
            raise HeatLedgerError(
                f"corrected_length must be true or false; got {v.show(self.corrected_length)}"
            )
        if self.corrected_length and (self.tip != "convective"
                                      or self.profile != "rectangular"):
            raise HeatLedgerError(
                'corrected_length applies to tip "convective" on a rectangular profile; got '
                f"tip {v.show(self.tip)}, profile {v.show(self.profile)}"
            )
        if self.profile != "rectangular" and self.tip not in ("convective", "adiabatic"):
            raise HeatLedgerError(
                f'a {self.profile} fin ends in an edge or point: tip must be "convective" or '
                f'"adiabatic" (no tip area); got {v.show(self.tip)}'
            )

    # ---------------------------------------------------------------- geometry
    @property
    def shape(self) -> str:
        """``"plate"`` or ``"pin"``. [-]"""
        return "plate" if self.thickness is not None else "pin"

    @property
    def cross_section_area(self) -> float:
        """Conduction area at the base ``A_c,b``. [m2]"""
        if self.shape == "plate":
            return self.width * self.thickness
        return math.pi * self.diameter**2 / 4.0

    @property
    def perimeter(self) -> float:
        """Perimeter of the base cross-section ``P``. [m]"""
        if self.shape == "plate":
            return 2.0 * (self.width + self.thickness)
        return math.pi * self.diameter

    @property
    def effective_length(self) -> float:
        """Length used in the formulas: ``L_c`` with ``corrected_length``, else ``L``. [m]"""
        if self.corrected_length:
            extra = self.thickness / 2.0 if self.shape == "plate" else self.diameter / 4.0
            return self.length + extra
        return self.length

    @property
    def m(self) -> float:
        """Fin parameter ``m``. [1/m]"""
        if self.profile == "rectangular":
            return math.sqrt(self.h * self.perimeter / (self.conductivity
                                                          * self.cross_section_area))
        if self.shape == "plate":
            return math.sqrt(2.0 * self.h / (self.conductivity * self.thickness))
        return math.sqrt(4.0 * self.h / (self.conductivity * self.diameter))

    @property
    def fin_area(self) -> float:
        """Heat-transfer area of the fin ``A_f`` used in the efficiency. [m2]"""
        big_l = self.length
        if self.profile == "rectangular":
            if self.corrected_length:
                return self.perimeter * self.effective_length
            if self.tip == "convective":
                return self.perimeter * big_l + self.cross_section_area
            return self.perimeter * big_l
        if self.shape == "plate":
            t, w = self.thickness, self.width
            if self.profile == "triangular":
                return 2.0 * w * math.hypot(big_l, t / 2.0)
            c1 = math.sqrt(1.0 + (t / big_l) ** 2)
            return w * (c1 * big_l + big_l**2 / t * math.log(t / big_l + c1))
        d = self.diameter
        if self.profile == "triangular":
            return math.pi * d / 2.0 * math.hypot(big_l, d / 2.0)
        a = d / big_l  # exact surface of revolution of r = (D/2)(1 - x/L)^2
        return (math.pi * big_l**4 / (8.0 * d * d)) * (
            a * (2.0 * a * a + 1.0) * math.sqrt(1.0 + a * a) - math.asinh(a))

    @property
    def inputs(self) -> dict:
        """The fin's inputs (for the audit trail). [-]"""
        return {"kind": "straight fin", "shape": self.shape, "profile": self.profile,
                "length": self.length, "conductivity": self.conductivity, "h": self.h,
                "thickness": self.thickness, "diameter": self.diameter,
                "width": self.width if self.shape == "plate" else None, "tip": self.tip,
                "temp_tip": self.temp_tip,
                "corrected_length": bool(self.corrected_length)}

    def with_length(self, length: float) -> StraightFin:
        """The same fin with another ``length`` [m].

        Parameters
        ----------
        length : float
            Length of the new fin, base to tip. [m]
        """
        from dataclasses import replace

        return replace(self, length=length)

    # ---------------------------------------------------------------- internals
    @property
    def _method(self) -> str:
        if self.profile != "rectangular":
            return (f"Incropera & DeWitt Table 3.5, {self.profile} {self.shape} fin "
                    "(slender-fin efficiency, q = eta_f h A_f theta_b)")
        case = {"convective": "A (convective tip)", "adiabatic": "B (adiabatic tip)",
                "temperature": "C (prescribed tip temperature)",
                "infinite": "D (infinitely long fin)"}[self.tip]
        if self.corrected_length:
            case = "B with corrected length L_c (approximates A)"
        return f"Incropera & DeWitt Table 3.4, case {case}, uniform {self.shape} fin"

    @property
    def _references(self) -> tuple:
        if self.profile != "rectangular":
            return ("Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, 6th ed., "
                    "Table 3.5",)
        return ("Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, 6th ed., "
                "Table 3.4, eqs. 3.70-3.81 (numbers recalled)",)

    def _length_axis(self) -> tuple[float, float]:
        return 0.0, self.length

    def _conductances(self) -> tuple[float, float]:
        """(G_b, G_L) with ``q = G_b theta_b - G_L theta_L``. [W/K]"""
        m = self.m
        if self.profile != "rectangular":
            return self._profile_efficiency() * self.h * self.fin_area, 0.0
        big_m = math.sqrt(self.h * self.perimeter * self.conductivity * self.cross_section_area)
        ml = m * self.effective_length
        e2 = math.exp(-2.0 * ml)
        if self.tip == "adiabatic" or self.corrected_length:
            return big_m * math.tanh(ml), 0.0
        if self.tip == "infinite":
            return big_m, 0.0
        if self.tip == "convective":
            beta = self.h / (m * self.conductivity)
            return big_m * ((1 + beta) - (1 - beta) * e2) / ((1 + beta) + (1 - beta) * e2), 0.0
        # prescribed tip: coth(mL) and 1/sinh(mL) in overflow-free form
        return big_m / math.tanh(ml), big_m * 2.0 * math.exp(-ml) / (1.0 - e2)

    def _side_loss(self, theta_b: float, theta_l: float) -> float:
        big_m = math.sqrt(self.h * self.perimeter * self.conductivity * self.cross_section_area)
        return big_m * (theta_b + theta_l) * math.tanh(self.m * self.length / 2.0)

    def _profile_efficiency(self) -> float:
        ml = self.m * self.length
        if self.profile == "parabolic":
            if self.shape == "plate":
                return 2.0 / (math.sqrt(4.0 * ml * ml + 1.0) + 1.0)
            return 2.0 / (math.sqrt(4.0 / 9.0 * ml * ml + 1.0) + 1.0)
        if self.shape == "plate":
            return float(ive(1, 2 * ml) / (ml * ive(0, 2 * ml)))
        return float(2.0 / ml * ive(2, 2 * ml) / ive(1, 2 * ml))

    def _theta(self, x: np.ndarray, theta_b: float, theta_l: float) -> np.ndarray:
        m = self.m
        x = np.asarray(x, dtype=float)
        if self.profile != "rectangular":
            return theta_b * self._profile_shape(np.clip(self.length - x, 0.0, None))
        big_l = self.effective_length
        if self.tip == "infinite":
            return theta_b * np.exp(-m * x)
        if self.tip == "temperature":
            def s(y):  # sinh(m y)/sinh(m L)
                return np.exp(m * (y - big_l)) * -np.expm1(-2 * m * y) / -math.expm1(
                    -2 * m * big_l)
            return theta_l * s(x) + theta_b * s(big_l - x)
        beta = 0.0 if (self.tip == "adiabatic" or self.corrected_length) else \
            self.h / (m * self.conductivity)
        num = (1 + beta) + (1 - beta) * np.exp(-2 * m * (big_l - x))
        den = (1 + beta) + (1 - beta) * math.exp(-2 * m * big_l)
        return theta_b * np.exp(-m * x) * num / den

    def _profile_shape(self, xt: np.ndarray) -> np.ndarray:
        """theta/theta_b at distance ``xt`` from the tip (slender-fin solutions)."""
        big_l, ml = self.length, self.m * self.length
        if self.profile == "parabolic":
            c = 1.0 if self.shape == "plate" else 3.0
            p = (math.sqrt(c * c + 4.0 * ml * ml) - c) / 2.0
            return (xt / big_l) ** p
        z = 2.0 * self.m * np.sqrt(big_l * xt)
        zb = 2.0 * ml
        if self.shape == "plate":  # I0(2 m sqrt(L x'))/I0(2 m L)
            return ive(0, z) / ive(0, zb) * np.exp(z - zb)
        # cone: sqrt(L/x') I1(2 m sqrt(L x'))/I1(2 m L); limit m L / I1(2mL) at the tip
        with np.errstate(divide="ignore", invalid="ignore"):
            ratio = np.where(xt > 0.0, np.sqrt(big_l / np.where(xt > 0, xt, 1.0))
                             * ive(1, z) * np.exp(z - zb), ml * np.exp(-zb))
        return ratio / ive(1, zb)

    def _coefficients(self) -> dict:
        out = {"m": self.m, "mL": self.m * self.effective_length,
               "effective_length": self.effective_length, "perimeter": self.perimeter,
               "fin_area": self.fin_area, "cross_section_area": self.cross_section_area}
        if self.profile == "rectangular":
            out["M_per_K"] = math.sqrt(self.h * self.perimeter * self.conductivity
                                       * self.cross_section_area)
            out["h_over_mk"] = self.h / (self.m * self.conductivity)
        else:
            out["profile_efficiency"] = self._profile_efficiency()
        return out

    def _fin_notes(self) -> tuple[tuple, tuple]:
        warns, notes = [], []
        ml = self.m * self.length
        if self.tip == "infinite" and ml < INFINITE_FIN_ML:
            warns.append(
                f"mL = {ml:.3g} < {INFINITE_FIN_ML}: the infinite-fin form overstates the heat "
                'rate of this finite fin by more than 1 %; use tip "adiabatic" or "convective"'
            )
        size = self.thickness if self.shape == "plate" else self.diameter / 2.0
        if self.corrected_length and self.h * size / self.conductivity > CORRECTED_LENGTH_LIMIT:
            notes.append(
                f"corrected length: h t/k = {self.h * size / self.conductivity:.3g} exceeds "
                f"{CORRECTED_LENGTH_LIMIT}; the approximation may be in error (recalled limit)"
            )
        biot = self.h * size / 2.0 / self.conductivity  # h (t/2)/k or h (D/4)/k (V/A)
        if biot > BIOT_1D_LIMIT:
            what = "h (t/2)/k" if self.shape == "plate" else "h (D/4)/k"
            warns.append(
                f"Biot number {what} = {biot:.3g} > {BIOT_1D_LIMIT}: temperature varies "
                "across the fin thickness and the 1-D fin model is doubtful"
            )
        return tuple(warns), tuple(notes)

    def _fv_setup(self) -> dict:
        big_l = self.effective_length
        setup = {"length": big_l, "base_cross_section": self.cross_section_area}
        if self.profile == "rectangular":
            setup.update(area=self.cross_section_area, perimeter=self.perimeter)
            if self.corrected_length or self.tip == "adiabatic":
                setup["tip"] = "adiabatic"
            elif self.tip == "convective":
                setup.update(tip="convective", tip_area=self.cross_section_area)
            elif self.tip == "temperature":
                setup.update(tip="temperature", temp_tip=self.temp_tip)
            else:
                setup["tip"] = "infinite"
            return setup
        setup["tip"] = "adiabatic"
        base = self.thickness if self.shape == "plate" else self.diameter
        power = 1.0 if self.profile == "triangular" else 2.0
        w = self.width

        def half(x):  # half-thickness or radius profile y(x), and |dy/dx|
            s = np.clip(1.0 - np.asarray(x) / big_l, 0.0, None)
            return base / 2.0 * s**power, base / 2.0 * power / big_l * s ** (power - 1.0)

        if self.shape == "plate":
            setup["area"] = lambda x: w * 2.0 * half(x)[0]
            setup["perimeter"] = lambda x: 2.0 * w * np.sqrt(1.0 + half(x)[1] ** 2)
        else:
            setup["area"] = lambda x: math.pi * half(x)[0] ** 2
            setup["perimeter"] = lambda x: 2.0 * math.pi * half(x)[0] * np.sqrt(
                1.0 + half(x)[1] ** 2)
        return setup
