"""Behaviour shared by the closed-form fins (heat rate, evaluation, temperatures, FV)."""

from __future__ import annotations

import math

import numpy as np

from .. import _validate as v
from ..errors import HeatLedgerError
from ._results import FinResult, FinTemperatures, effectiveness_messages, emit
from .fv import solve_fin_fv


class FinBase:
    """Common front door of :class:`StraightFin` and :class:`AnnularFin` (not public)."""

    # subclasses provide: m, fin_area, cross_section_area, _conductances(), _theta(),
    # _fv_setup(), _method, _references, _fin_notes(), inputs, _length_axis()

    # ------------------------------------------------------------------ properties
    @property
    def efficiency(self) -> float:
        """Fin efficiency ``eta_f = q_f / (h A_f theta_b)``. [-]

        For an infinitely long fin (tip ``"infinite"``) ``A_f`` is the lateral area of the
        stated length ``L`` and ``q_f`` the heat shed on that length,
        ``M theta_b (1 - exp(-m L))``, so ``eta_f = (1 - exp(-m L))/(m L) <= 1``; the heat the
        fin sheds beyond ``L`` is in :attr:`conductance` and :attr:`effectiveness`.
        """
        self._need_linear_tip("efficiency")
        if getattr(self, "tip", None) == "infinite":
            ml = self.m * self.length
            return float(-math.expm1(-ml) / ml)
        g_b, _ = self._conductances()
        return float(g_b / (self.h * self.fin_area))

    @property
    def effectiveness(self) -> float:
        """Fin effectiveness ``epsilon_f = q_f / (h A_c,b theta_b)``. [-]"""
        self._need_linear_tip("effectiveness")
        g_b, _ = self._conductances()
        return float(g_b / (self.h * self.cross_section_area))

    @property
    def fin_resistance(self) -> float:
        """Fin thermal resistance ``R_t,f = theta_b / q_f``. [K/W]"""
        self._need_linear_tip("resistance")
        g_b, _ = self._conductances()
        return float(1.0 / g_b)

    @property
    def conductance(self) -> float:
        """Heat rate per kelvin of base excess temperature, ``q_f / theta_b``. [W/K]"""
        self._need_linear_tip("conductance")
        return float(self._conductances()[0])

    @property
    def warnings(self) -> tuple:
        """Warnings that do not depend on temperatures (effectiveness < 1, validity). [-]"""
        return self._warnings_notes(None)[0]

    @property
    def notes(self) -> tuple:
        """Advisory remarks (effectiveness < 2, approximation validity). [-]"""
        return self._warnings_notes(None)[1]

    # ------------------------------------------------------------------ methods
    def heat_rate(self, temp_base, temp_fluid):
        """Heat rate into the fin at its base.

        Parameters
        ----------
        temp_base : float or array_like
            Base temperature ``T_b``. [degC]
        temp_fluid : float or array_like
            Fluid temperature ``T_inf``. [degC]

        Returns
        -------
        float or ndarray
            ``q_f``; positive when the fin sheds heat. [W]
        """
        t_b = np.asanyarray(temp_base, dtype=float)
        t_inf = np.asanyarray(temp_fluid, dtype=float)
        g_b, g_l = self._conductances()
        q = g_b * (t_b - t_inf)
        if g_l:
            q = q - g_l * (self.temp_tip - t_inf)
        return float(q) if np.ndim(q) == 0 else q

    def evaluate(self, temp_base: float, temp_fluid: float, *,
                 warn: bool = False) -> FinResult:
        """All closed-form results at one pair of temperatures.

        Parameters
        ----------
        temp_base : float
            Base temperature ``T_b``. [degC]
        temp_fluid : float
            Fluid temperature ``T_inf``. [degC]
        warn : bool
            Also emit the result's warnings as ``HeatLedgerWarning`` (default quiet). [-]

        Returns
        -------
        FinResult
        """
        t_b = v.within("temp_base", temp_base, "temperature")
        t_inf = v.within("temp_fluid", temp_fluid, "temperature")
        theta_b = t_b - t_inf
        g_b, g_l = self._conductances()
        theta_l = (self.temp_tip - t_inf) if g_l else 0.0
        q = g_b * theta_b - g_l * theta_l
        eff, effect, res = self._ratios(q, theta_b, theta_l, g_b)
        tip_theta = float(self._theta(np.array([self._length_axis()[1]]), theta_b,
                                      theta_l)[0])
        warns, notes = self._warnings_notes(effect)
        result = FinResult(
            heat_rate=float(q), efficiency=eff, effectiveness=effect, fin_resistance=res,
            temp_tip=t_inf + tip_theta, temp_base=t_b, temp_fluid=t_inf,
            m=self.m, fin_area=self.fin_area, cross_section_area=self.cross_section_area,
            method=self._method, coefficients=self._coefficients(),
            inputs=dict(self.inputs), warnings=warns, notes=notes,
            references=self._references,
        )
        if warn:
            emit(result.warnings)
        return result

    def temperatures(self, temp_base: float, temp_fluid: float, *, nodes: int | None = None,
                     points: int = 51) -> FinTemperatures:
        """Temperature along the fin.

        Parameters
        ----------
        temp_base : float
            Base temperature ``T_b``. [degC]
        temp_fluid : float
            Fluid temperature ``T_inf``. [degC]
        nodes : int, optional
            ``None`` for the closed form; a number of control volumes for finite volumes
            (with energy residual and mesh estimate in ``.fv``). [-]
        points : int
            Number of evenly spaced closed-form points, base and tip included. [-]

        Returns
        -------
        FinTemperatures
        """
        t_b = v.within("temp_base", temp_base, "temperature")
        t_inf = v.within("temp_fluid", temp_fluid, "temperature")
        if nodes is not None:
            fv = self.finite_volume(t_b, t_inf, nodes=nodes)
            tip = self._length_axis()[1]
            tip_t = float(np.interp(tip, fv.x, fv.temperature))
            return FinTemperatures(x=fv.x, temperature=fv.temperature, temp_tip=tip_t,
                                   heat_rate=fv.heat_rate,
                                   method=f"finite volume: {fv.settings['cells']} cells",
                                   fv=fv, warnings=tuple(dict.fromkeys(
                                       self._warnings_notes(None)[0] + fv.warnings)))
        if isinstance(points, bool) or not isinstance(points, (int, np.integer)) or not (
                2 <= points <= v.MAX_CELLS):
            raise HeatLedgerError(f"points must be a whole number from 2 to {v.MAX_CELLS}; got "
                                  f"{v.show(points)}")
        start, tip = self._length_axis()
        x = np.linspace(start, tip, int(points))
        theta_b = t_b - t_inf
        g_b, g_l = self._conductances()
        theta_l = (self.temp_tip - t_inf) if g_l else 0.0
        theta = self._theta(x, theta_b, theta_l)
        return FinTemperatures(x=x, temperature=t_inf + theta,
                               temp_tip=float(t_inf + theta[-1]),
                               heat_rate=float(g_b * theta_b - g_l * theta_l),
                               method=f"closed form: {self._method}",
                               warnings=self._warnings_notes(None)[0])

    def finite_volume(self, temp_base: float, temp_fluid: float, *, nodes: int = 200,
                      h=None, emissivity: float = 0.0, temp_surroundings: float | None = None,
                      linearisation: str = "newton", tolerance: float = 1e-8,
                      max_iterations: int = 100, mesh_estimate: bool = True):
        """This fin's geometry solved by finite volumes, optionally with h(T) and radiation.

        Parameters
        ----------
        temp_base : float
            Base temperature. [degC]
        temp_fluid : float
            Fluid temperature. [degC]
        nodes : int
            Number of control volumes. [-]
        h : float, callable or PowerLawCoefficient, optional
            Replaces the fin's constant ``h`` (see :func:`solve_fin_fv`). [W/(m2 K)]
        emissivity : float
            Emissivity for radiation to surroundings. [-]
        temp_surroundings : float, optional
            Radiating surroundings temperature, default ``ambient``. [degC]
        linearisation : str
            ``"newton"`` or ``"picard"``. [-]
        tolerance : float
            Iteration stops when the largest change is below this. [K]
        max_iterations : int
            Iteration limit. [-]
        mesh_estimate : bool
            Solve again on twice the cells for a Richardson estimate. [-]

        Returns
        -------
        FinFVResult
        """
        if isinstance(nodes, (int, np.integer)) and nodes > v.MAX_CELLS:
            raise HeatLedgerError(f"nodes must be at most {v.MAX_CELLS} (the engine's memory "
                                  f"bound; a fin needs far fewer); got {nodes}")
        setup = self._fv_setup()
        if h is not None and setup["tip"] == "infinite":
            raise HeatLedgerError('tip "infinite" takes only the fin\'s constant h')
        return solve_fin_fv(
            setup.pop("length"), self.conductivity, self.h if h is None else h,
            temp_base=temp_base, temp_fluid=temp_fluid, nodes=nodes,
            emissivity=emissivity, temp_surroundings=temp_surroundings,
            linearisation=linearisation, tolerance=tolerance, max_iterations=max_iterations,
            mesh_estimate=mesh_estimate, **setup,
        )

    # ------------------------------------------------------------------ helpers
    def _need_linear_tip(self, what: str) -> None:
        if getattr(self, "tip", None) == "temperature":
            raise HeatLedgerError(
                f'{what} of a fin with tip "temperature" depends on the base and ambient '
                "temperatures; use evaluate(temp_base, temp_fluid)"
            )

    def _ratios(self, q, theta_b, theta_l, g_b):
        if getattr(self, "tip", None) != "temperature":
            return (self.efficiency, float(g_b / (self.h * self.cross_section_area)),
                    float(1.0 / g_b))
        if theta_b == 0.0:
            nan = float("nan")
            return nan, nan, nan
        side = self._side_loss(theta_b, theta_l)
        eff = side / (self.h * self.fin_area * theta_b)
        effect = q / (self.h * self.cross_section_area * theta_b)
        res = theta_b / q if q != 0.0 else float("inf")
        return float(eff), float(effect), float(res)

    def _warnings_notes(self, effectiveness):
        if effectiveness is None and getattr(self, "tip", None) != "temperature":
            effectiveness = self.effectiveness
        warns, notes = ((), ()) if effectiveness is None else \
            effectiveness_messages(effectiveness)
        w2, n2 = self._fin_notes()
        return warns + w2, notes + n2
