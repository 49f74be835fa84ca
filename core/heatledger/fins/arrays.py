"""Arrays of fins on a base: overall surface efficiency, resistance and inverse sizing."""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

import numpy as np

from .. import _validate as v
from ..errors import HeatLedgerError
from ._results import FinArrayResult, FinSizing, emit

__all__ = ["FinArray"]

#: fin parameter times length beyond which a fin behaves as infinitely long in the search
#: (tanh 40 = 1 to machine precision).
_ML_LONG = 40.0
_XTOL_LENGTH = 1e-12  # m, far below any manufacturing tolerance
_RTOL = 1e-12


@dataclass(frozen=True)
class FinArray:
    """``count`` identical fins on a base of area ``base_area``.

    Parameters
    ----------
    fin : StraightFin or AnnularFin
        One fin of the array (its ``h`` also applies to the exposed base; its tip must not
        be ``"temperature"``). [-]
    count : int
        Number of fins ``N``. [-]
    base_area : float
        Total base (prime) area *including* the fin roots, for example the plate area of a
        heat sink or the tube surface under the fins. The exposed base is
        ``A_b = base_area - N A_c,b``. [m2]
    contact_resistance : float
        Thermal contact resistance at each fin root ``R''_t,c`` (0 = bonded). [m2 K/W]

    Raises
    ------
    HeatLedgerError
        If ``count`` is not a whole number >= 0, ``base_area`` is not positive or is too
        small for the fin roots, ``contact_resistance`` is negative, or the fin has a
        prescribed tip temperature.

    Notes
    -----
    ``A_t = N A_f + A_b``, ``eta_o = 1 - (N A_f / A_t)(1 - eta_f)``,
    ``q_t = eta_o h A_t theta_b``, ``R_t,o = 1/(eta_o h A_t)``. With contact resistance
    ``eta_o(c) = 1 - (N A_f / A_t)(1 - eta_f / C_1)``,
    ``C_1 = 1 + eta_f h A_f (R''_t,c / A_c,b)``.

    References
    ----------
    Incropera & DeWitt, *Fundamentals of Heat and Mass Transfer*, 6th ed., section 3.6.5,
    eqs. 3.102-3.108 (numbers recalled).
    [source: incropera-6, 3.6.5].
    """

    fin: object
    count: int
    base_area: float
    contact_resistance: float = 0.0

    def __post_init__(self) -> None:
        _set = object.__setattr__
        if not hasattr(self.fin, "fin_area") or not hasattr(self.fin, "cross_section_area"):
            raise HeatLedgerError(
                f"fin must be a StraightFin or AnnularFin; got {type(self.fin).__name__}"
            )
        if getattr(self.fin, "tip", None) == "temperature":
            raise HeatLedgerError(
                'a fin array needs a fin with tip "convective", "adiabatic" or "infinite"; '
                'got tip "temperature"'
            )
        c = self.count
        if isinstance(c, bool) or not isinstance(c, (int, np.integer)) or c < 0:
            raise HeatLedgerError(f"count must be a whole number >= 0; got {v.show(c)}")
        _set(self, "count", int(c))
        _set(self, "base_area", v.positive("base_area", self.base_area, "m2"))
        _set(self, "contact_resistance",
             v.non_negative("contact_resistance", self.contact_resistance, "m2 K/W"))
        roots = self.count * self.fin.cross_section_area
        if roots >= self.base_area:
            raise HeatLedgerError(
                f"base_area must exceed the fin roots N A_c,b = {roots:.4g} m2 (count="
                f"{self.count}); got base_area={self.base_area:.4g} m2 — give the total base "
                "area including the roots"
            )

    # ---------------------------------------------------------------- properties
    @property
    def exposed_base_area(self) -> float:
        """Base area between the fins ``A_b``. [m2]"""
        return self.base_area - self.count * self.fin.cross_section_area

    @property
    def total_area(self) -> float:
        """``A_t = N A_f + A_b``. [m2]"""
        return self.count * self.fin.fin_area + self.exposed_base_area

    @property
    def contact_factor(self) -> float:
        """``C_1 = 1 + eta_f h A_f R''_t,c / A_c,b`` (1 without contact resistance). [-]

        ``eta_f h A_f`` is the fin's conductance ``q_f / theta_b`` (for an infinitely long fin
        the heat it sheds beyond its stated length is included)."""
        f = self.fin
        return 1.0 + f.conductance * self.contact_resistance / f.cross_section_area

    @property
    def overall_efficiency(self) -> float:
        """Overall surface efficiency ``eta_o`` (contact form when R''_t,c > 0). [-]"""
        f = self.fin
        share = self.count * f.fin_area / self.total_area
        return 1.0 - share * (1.0 - f.conductance / (f.h * f.fin_area) / self.contact_factor)

    @property
    def fin_resistance(self) -> float:
        """Overall thermal resistance ``R_t,o = 1/(eta_o h A_t)``. [K/W]"""
        return 1.0 / (self.overall_efficiency * self.fin.h * self.total_area)

    # ---------------------------------------------------------------- methods
    def heat_rate(self, temp_base, temp_fluid):
        """Total heat rate ``q_t = eta_o h A_t (T_b - T_inf)``.

        Parameters
        ----------
        temp_base : float or array_like
            Base temperature. [degC]
        temp_fluid : float or array_like
            Fluid temperature. [degC]

        Returns
        -------
        float or ndarray
            Heat rate. [W]
        """
        theta = np.asanyarray(temp_base, dtype=float) - np.asanyarray(temp_fluid,
                                                                              dtype=float)
        q = theta / self.fin_resistance
        return float(q) if np.ndim(q) == 0 else q

    def evaluate(self, temp_base: float, temp_fluid: float, *,
                 warn: bool = False) -> FinArrayResult:
        """All array results at one pair of temperatures.

        Parameters
        ----------
        temp_base : float
            Base temperature. [degC]
        temp_fluid : float
            Fluid temperature. [degC]
        warn : bool
            Also emit the warnings as ``HeatLedgerWarning``. [-]

        Returns
        -------
        FinArrayResult
        """
        t_b = v.within("temp_base", temp_base, "temperature")
        t_inf = v.within("temp_fluid", temp_fluid, "temperature")
        theta = t_b - t_inf
        f = self.fin
        c1 = self.contact_factor
        fin_q = f.conductance / c1 * theta
        warns = tuple(f.warnings)
        if self.count and f.conductance / (c1 * f.h) <= f.cross_section_area:
            warns += ("each fin (with its contact resistance) sheds no more than the base "
                      "area it covers: the array is no better than the bare base",)
        result = FinArrayResult(
            heat_rate=float(theta / self.fin_resistance),
            overall_efficiency=self.overall_efficiency,
            fin_resistance=self.fin_resistance, total_area=self.total_area,
            exposed_base_area=self.exposed_base_area, fin_efficiency=f.efficiency,
            fin_heat_rate=float(fin_q), count=self.count, contact_factor=c1,
            method="Incropera & DeWitt section 3.6.5, overall surface efficiency"
                   + (" with contact resistance" if self.contact_resistance else ""),
            coefficients={"fin_area": f.fin_area, "cross_section_area": f.cross_section_area,
                          "fin_share": self.count * f.fin_area / self.total_area,
                          "h": f.h},
            inputs={"fin": dict(f.inputs), "count": self.count, "base_area": self.base_area,
                    "contact_resistance": self.contact_resistance,
                    "temp_base": t_b, "temp_fluid": t_inf},
            warnings=warns, notes=tuple(f.notes),
        )
        if warn:
            emit(result.warnings)
        return result

    def length_for_heat_rate(self, target_heat_rate: float, temp_base: float,
                             temp_fluid: float) -> FinSizing:
        """Fin length that makes the array shed ``target_heat_rate``.

        Parameters
        ----------
        target_heat_rate : float
            Required total heat rate (same sign as ``T_b - T_inf``). [W]
        temp_base : float
            Base temperature. [degC]
        temp_fluid : float
            Fluid temperature. [degC]

        Returns
        -------
        FinSizing
            ``value`` is the straight-fin length or the annular radial length. [m]

        Raises
        ------
        HeatLedgerError
            If no length gives the target: above the infinitely-long-fin limit, at or below
            what the base gives with vanishing fins, or with fins that do not help.

        Notes
        -----
        ``q_t(L) - q_target = 0`` by :func:`scipy.optimize.brentq` on
        ``[1e-9 L_long, L_long]`` with ``m L_long = 40`` (tanh 40 = 1 in double precision).
        """
        q_goal, theta = self._target(target_heat_rate, temp_base, temp_fluid)
        if self.count == 0:
            raise HeatLedgerError("count is 0: fin length cannot change the heat rate")
        if getattr(self.fin, "tip", None) == "infinite":
            raise HeatLedgerError(
                'a fin with tip "infinite" has no length to size; use tip "adiabatic" or '
                '"convective"'
            )
        long = _ML_LONG / self.fin.m
        lo = 1e-9 * long

        def q_of(length: float) -> float:
            return replace(self, fin=self.fin.with_length(length)).heat_rate(theta, 0.0)

        q_lo, q_hi = q_of(lo), q_of(long)
        if not q_hi > q_lo:
            raise HeatLedgerError(
                "longer fins do not raise the heat rate (fin effectiveness <= 1): no fin "
                f"length reaches {target_heat_rate:g} W; use thinner or more conductive fins"
            )
        if not q_goal < q_hi:
            raise HeatLedgerError(
                f"target_heat_rate {target_heat_rate:g} W is at or above the limit of "
                f"infinitely long fins, {math.copysign(q_hi, theta):.6g} W: add fins, raise h "
                "or the temperature difference"
            )
        if not q_goal > q_lo:
            raise HeatLedgerError(
                f"target_heat_rate {target_heat_rate:g} W is met by the base with vanishing "
                f"fins ({math.copysign(q_lo, theta):.6g} W): no fin length is needed"
            )
        from scipy.optimize import brentq  # lazy: keeps scipy.optimize out of start-up

        root, info = brentq(lambda length: q_of(length) - q_goal, lo, long,
                            xtol=_XTOL_LENGTH, rtol=_RTOL, full_output=True)
        sized = replace(self, fin=self.fin.with_length(root))
        return FinSizing(
            quantity="length", value=float(root), target_heat_rate=float(target_heat_rate),
            heat_rate=sized.heat_rate(temp_base, temp_fluid), array=sized,
            continuous_value=float(root), bracket=(lo, long), iterations=info.iterations,
            tolerance=_XTOL_LENGTH,
            method="scipy.optimize.brentq on q_t(L) - q_target",
        )

    def count_for_heat_rate(self, target_heat_rate: float, temp_base: float,
                            temp_fluid: float, *, max_count: int | None = None) -> FinSizing:
        """Smallest whole number of fins that makes the array shed ``target_heat_rate``.

        Parameters
        ----------
        target_heat_rate : float
            Required total heat rate (same sign as ``T_b - T_inf``). [W]
        temp_base : float
            Base temperature. [degC]
        temp_fluid : float
            Fluid temperature. [degC]
        max_count : int, optional
            Largest count that fits; default the count whose roots fill the base area (a
            bound only: real fins need spacing). [-]

        Returns
        -------
        FinSizing

        Raises
        ------
        HeatLedgerError
            If fins do not raise the heat rate or the target needs more than ``max_count``.

        Notes
        -----
        ``q_t(N)`` is linear in ``N`` (each fin replaces ``A_c,b`` of bare base with
        ``eta_f A_f / C_1``); the continuous root is found by :func:`scipy.optimize.brentq`
        and rounded up.
        """
        q_goal, theta = self._target(target_heat_rate, temp_base, temp_fluid)
        f = self.fin
        limit = math.ceil(self.base_area / f.cross_section_area) - 1
        if max_count is not None:
            if isinstance(max_count, bool) or not isinstance(max_count, (int, np.integer)) \
                    or max_count < 0:
                raise HeatLedgerError(f"max_count must be a whole number >= 0; got "
                                      f"{v.show(max_count)}")
            limit = min(limit, int(max_count))
        per_fin = f.conductance / self.contact_factor - f.h * f.cross_section_area
        bare = f.h * self.base_area

        def q_of(n: float) -> float:  # per kelvin times |theta|
            return (bare + n * per_fin) * abs(theta)

        if q_goal <= q_of(0.0):
            return self._count_answer(0, 0.0, target_heat_rate, temp_base, temp_fluid,
                                      (0.0, float(limit)), 0,
                                      ("the bare base already meets the target",))
        if per_fin <= 0.0:
            raise HeatLedgerError(
                "each fin sheds no more than the base area it covers (effectiveness <= 1 "
                f"with contact resistance): no fin count reaches {target_heat_rate:g} W"
            )
        if q_goal > q_of(limit):
            raise HeatLedgerError(
                f"target_heat_rate {target_heat_rate:g} W needs more than {limit} fins (the "
                f"most that fit; {math.copysign(q_of(limit), theta):.6g} W): use longer fins "
                "or a larger base"
            )
        from scipy.optimize import brentq  # lazy: keeps scipy.optimize out of start-up

        root, info = brentq(lambda n: q_of(n) - q_goal, 0.0, float(limit), xtol=1e-9,
                            rtol=_RTOL, full_output=True)
        count = min(int(math.ceil(root)), limit)
        if count >= 1 and q_of(count - 1) >= q_goal:  # root landed just above a whole number
            count -= 1
        return self._count_answer(count, root, target_heat_rate, temp_base, temp_fluid,
                                  (0.0, float(limit)), info.iterations, ())

    # ---------------------------------------------------------------- internals
    def _target(self, target, t_b, t_inf):
        target = v.finite("target_heat_rate", target)
        theta = (v.within("temp_base", t_b, "temperature")
                 - v.within("temp_fluid", t_inf, "temperature"))
        if theta == 0.0 or target == 0.0 or math.copysign(1.0, target) != math.copysign(
                1.0, theta):
            raise HeatLedgerError(
                f"target_heat_rate must be non-zero with the sign of temp_base - "
                f"ambient ({theta:g} K); got {target:g} W"
            )
        return abs(target), abs(theta)

    def _count_answer(self, count, root, target, t_b, t_inf, bracket, iterations, notes):
        sized = replace(self, count=count)
        return FinSizing(
            quantity="count", value=float(count), target_heat_rate=float(target),
            heat_rate=sized.heat_rate(t_b, t_inf), array=sized, continuous_value=float(root),
            bracket=bracket, iterations=int(iterations), tolerance=1e-9,
            method="scipy.optimize.brentq on q_t(N) - q_target, rounded up", notes=notes,
        )
