"""Finite-volume solution of a general fin with the engine's 1-D solver.

The fin is a 1-D conductor along ``x`` (from the base) with conduction area ``A(x)``,
heated perimeter ``P(x)`` and a surface loss per unit area

    q''(x, T) = h(x, T) (T - T_inf) + eps sigma (T_K^4 - T_sur,K^4)

entered into :func:`heatledger.fv1d.solve_conduction` as a linearised cell source
``S = S_c + S_p T``. With constant ``h`` and no radiation the problem is linear
(``S_c = h P dx T_inf``, ``S_p = -h P dx``) and one solve is exact; otherwise the source is
re-linearised about the last temperatures (Newton or Picard) until the largest temperature
change is below ``tolerance``.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from .. import _validate as v
from .._constants import STEFAN_BOLTZMANN as Stefan_Boltzmann
from .._constants import ZERO_CELSIUS as zero_Celsius
from ..errors import HeatLedgerError
from ..fv1d import (
    REFINE_BELOW,
    conduction_mesh,
    fixed_flux,
    fixed_temperature,
    solve_on_mesh,
    surface_to_ambient,
    three_mesh_estimate,
)
from ._results import FinFVResult, effectiveness_messages

__all__ = ["PowerLawCoefficient", "solve_fin_fv"]

FV_TIPS = ("adiabatic", "convective", "temperature", "infinite")
LINEARISATIONS = ("newton", "picard")


@dataclass(frozen=True)
class PowerLawCoefficient:
    """Convection coefficient of the power-law form ``h = C |T - T_inf|**n``.

    Typical of natural convection (``n = 1/4`` laminar, ``n = 1/3`` turbulent).

    Parameters
    ----------
    h_coefficient : float
        ``C``, the coefficient at a 1 K difference. [W/(m2 K^(1+n))]
    h_exponent : float
        ``n``, between 0 and 1. [-]

    References
    ----------
    Incropera & DeWitt, *Fundamentals of Heat and Mass Transfer*, 6th ed., ch. 9
    (simplified natural-convection correlations of the form h = C dT^n, recalled).
    """

    h_coefficient: float
    h_exponent: float

    def __post_init__(self) -> None:
        v.positive("h_coefficient", self.h_coefficient, "W/(m2 K^(1+n))")
        n = v.finite("h_exponent", self.h_exponent)
        if not 0.0 <= n <= 1.0:
            raise HeatLedgerError(f"h_exponent must be between 0 and 1; got {n:g}")

    def __call__(self, delta_temp):
        """Return ``h`` for a temperature difference ``delta_temp`` [K]. [W/(m2 K)]"""
        theta = np.abs(np.asanyarray(delta_temp, dtype=float))
        return self.h_coefficient * theta ** self.h_exponent


def solve_fin_fv(
    length: float,
    conductivity: float,
    h,
    *,
    area,
    perimeter,
    temp_base: float,
    temp_fluid: float,
    nodes: int = 200,
    tip: str = "adiabatic",
    temp_tip: float | None = None,
    tip_area: float | None = None,
    emissivity: float = 0.0,
    temp_surroundings: float | None = None,
    linearisation: str = "newton",
    tolerance: float = 1e-8,
    max_iterations: int = 100,
    mesh_estimate: bool = True,
    x_offset: float = 0.0,
    base_cross_section: float | None = None,
) -> FinFVResult:
    """Temperature and heat rate of a general fin by cell-centred finite volumes.

    Parameters
    ----------
    length : float
        Fin length from base to tip (``r_2 - r_1`` for an annular fin). [m]
    conductivity : float
        Thermal conductivity of the fin material. [W/(m K)]
    h : float, callable or PowerLawCoefficient
        Convection coefficient: a constant; a callable ``h(x, temperature)`` of distance
        from the base [m] and local temperature [degC] returning arrays; or a
        :class:`PowerLawCoefficient` ``C |T - T_inf|**n``. [W/(m2 K)]
    area : float or callable
        Conduction area ``A(x)``, constant or a callable of distance from the base. [m2]
    perimeter : float or callable
        Heated perimeter ``P(x)`` (surface area per unit length), constant or callable. [m]
    temp_base : float
        Temperature of the base. [degC]
    temp_fluid : float
        Temperature of the surrounding fluid ``T_inf``. [degC]
    nodes : int
        Number of control volumes (uniform). [-]
    tip : str
        ``"adiabatic"``, ``"convective"`` (same ``h`` and radiation on ``tip_area``),
        ``"temperature"`` (``temp_tip`` fixed) or ``"infinite"`` (the fin continues
        uniformly: ``-k dT/dx = k m (T - T_inf)``, constant ``h`` only). [-]
    temp_tip : float, optional
        Tip temperature for ``tip="temperature"``. [degC]
    tip_area : float, optional
        Area of the convective tip face; default ``A(length)``. [m2]
    emissivity : float
        Surface emissivity for radiation to surroundings (0 = none). [-]
    temp_surroundings : float, optional
        Temperature of the radiating surroundings; default ``ambient``. [degC]
    linearisation : str
        ``"newton"`` (source tangent; derivative of a callable ``h`` by central difference
        and clipped at zero) or ``"picard"`` (coefficients at the last temperatures). [-]
    tolerance : float
        Stop when the largest cell temperature change of an iteration is below this. [K]
    max_iterations : int
        Largest number of linear solves before :class:`HeatLedgerError`. [-]
    mesh_estimate : bool
        Also solve on two more meshes and give the three-mesh estimate with the observed
        order: on 2 and 4 times the cells, or from 4096 cells on coarser meshes (n/16 and
        n/4 of them, or n/4 and n/2), solved coarse to fine, each started from the solution
        of the mesh before it. [-]
    x_offset : float
        Added to the reported positions and passed to nothing else (annular fins report
        radius). [m]
    base_cross_section : float, optional
        Base area the fin replaces, for the effectiveness; default ``A(0)``. [m2]

    Returns
    -------
    FinFVResult

    Raises
    ------
    HeatLedgerError
        For invalid inputs or when the iteration does not converge.

    Notes
    -----
    Cell ``i`` of width ``dx`` has ``A_i = A(x_i)``, ``P_i = P(x_i)`` at its centre and the
    source (Patankar 1980, section 4.2-7 and 7.2-1, source linearisation)

    - linear: ``S_c = h P dx T_inf``, ``S_p = -h P dx``;
    - Picard: ``h`` at ``T*`` and radiation as ``h_r = eps sigma (T*^2 + T_sur^2)(T* + T_sur)``
      (kelvin): ``S_c = P dx (h T_inf + h_r T_sur)``, ``S_p = -P dx (h + h_r)``;
    - Newton: with ``g(T) = q''(T)``, ``S_c = -P dx (g* - g'* T*)``, ``S_p = -P dx g'*``.

    A convective tip is a surface resistance ``1/(h + h_r)`` to the weighted ambient
    ``(h T_inf + h_r T_sur)/(h + h_r)``, updated each iteration. The energy residual uses
    the non-linear laws at the final temperatures, so it also measures the iteration error.

    References
    ----------
    S. V. Patankar, *Numerical Heat Transfer and Fluid Flow*, Hemisphere 1980, ch. 4 and 7.
    Incropera & DeWitt, *Fundamentals of Heat and Mass Transfer*, 6th ed., eq. 3.61 (general
    fin equation, number recalled).
    [source: patankar-1980, ch. 4, 7.2]; [source: incropera-6, 3.6].
    """
    length = v.positive("length", length, "m")
    k = v.positive("conductivity", conductivity, "W/(m K)")
    t_b = v.finite("temp_base", temp_base)
    t_inf = v.finite("temp_fluid", temp_fluid)
    nodes = _count("nodes", nodes, 1)
    max_iterations = _count("max_iterations", max_iterations, 1)
    tip = v.choice("tip", tip, FV_TIPS)
    linearisation = v.choice("linearisation", linearisation, LINEARISATIONS)
    tolerance = v.positive("tolerance", tolerance, "K")
    eps = v.fraction("emissivity", emissivity)
    x_offset = v.finite("x_offset", x_offset)
    t_sur = t_inf if temp_surroundings is None else v.finite("temp_surroundings",
                                                              temp_surroundings)
    if tip == "temperature":
        if temp_tip is None:
            raise HeatLedgerError("tip='temperature' needs temp_tip (degC); got None")
        t_tip_fixed = v.finite("temp_tip", temp_tip)
    law = _h_law(h)
    if tip == "infinite" and (law[0] != "constant" or eps > 0.0):
        raise HeatLedgerError(
            "tip='infinite' needs a constant h and no radiation (the continuation is the "
            "uniform-fin exponential); use a longer fin with tip='adiabatic' instead"
        )

    def run(n: int, initial=None):
        return _solve(length, k, law, area, perimeter, t_b, t_inf, n, tip,
                      t_tip_fixed if tip == "temperature" else None, tip_area, eps, t_sur,
                      linearisation, tolerance, max_iterations, initial)

    if mesh_estimate:
        out, mesh_q, mesh_tip = _fin_mesh_estimates(run, nodes, length)
    else:
        out, mesh_q, mesh_tip = run(nodes), None, None
    sol = out["sol"]
    x = np.concatenate(([0.0], sol.x, [length])) + float(x_offset)
    temp = np.concatenate(([sol.face_temperature[0]], sol.temperature,
                           [sol.face_temperature[-1]]))
    theta_b = t_b - t_inf
    a0 = _eval(area, np.array([0.0]), "area")[0] if base_cross_section is None else \
        v.positive("base_cross_section", base_cross_section, "m2")
    g_base = float(_flux(law, eps, np.array([0.0]), np.array([t_b]), t_inf, t_sur)[0])
    bare = g_base * a0
    effectiveness = out["q"] / bare if bare != 0.0 else float("nan")
    warn, notes = effectiveness_messages(effectiveness) if theta_b != 0.0 else ((), ())
    if mesh_q is not None and out["q"] != 0.0 and mesh_q.error_estimate > 0.01 * abs(out["q"]):
        warn = warn + (f"mesh estimate of the heat rate differs by "
                       f"{100 * mesh_q.error_estimate / abs(out['q']):.2g} %: use more nodes",)
    settings = _settings(nodes, tip, law, eps, t_sur, linearisation if out["nonlinear"] else
                         "none (linear problem)", tolerance, max_iterations, mesh_q, t_b,
                         t_inf, t_tip_fixed if tip == "temperature" else None, length, k,
                         x_offset)
    return FinFVResult(
        x=x, temperature=temp, heat_rate=out["q"], heat_loss_surface=out["loss_side"],
        heat_loss_tip=out["loss_tip"], temp_tip=out["t_tip"],
        efficiency=out["efficiency"], effectiveness=float(effectiveness),
        energy_residual=out["residual"], linear_residual=float(sol.energy_residual),
        mesh_estimate=mesh_q, mesh_estimate_tip=mesh_tip, iterations=out["iterations"],
        converged_change=out["change"], solution=sol, settings=settings,
        warnings=warn, notes=notes,
    )


def _settings(nodes, tip, law, eps, t_sur, linearisation, tolerance, max_iterations, mesh_q,
              t_b, t_inf, t_tip, length, k, x_offset) -> dict:
    """The finite-volume settings of a fin result, for the record (the sheet states them)."""
    return {
        "method": "cell-centred finite volume (heatledger.fv1d.solve_conduction), uniform cells",
        "cells": nodes,
        "tip": tip,
        "h_law": law[0],
        "h_parameters": law[2],
        "emissivity": eps,
        "temp_surroundings": t_sur,
        "linearisation": linearisation,
        "tolerance_K": tolerance,
        "max_iterations": max_iterations,
        "mesh_refinement": (f"three meshes {mesh_q.meshes}{_order_note(mesh_q, nodes)}, "
                            f"{mesh_q.basis}" if mesh_q else "none"),
        "temp_base": t_b,
        "temp_fluid": t_inf,
        "temp_tip": t_tip,
        "length": length,
        "conductivity": k,
        "x_offset": float(x_offset),
    }


# ----------------------------------------------------------------------------- internals


def _order_note(mesh_q, nodes: int) -> str:
    """How the meshes of an estimate were solved, when the reported mesh is the finest."""
    if mesh_q.meshes and mesh_q.meshes[-1] == nodes:
        return " solved coarse to fine, each iteration started from the coarser solution"
    return ""


def _count(name: str, value, low: int) -> int:
    if isinstance(value, bool) or not isinstance(value, (int, np.integer)) or value < low:
        raise HeatLedgerError(f"{name} must be a whole number >= {low}; got {value!r}")
    return int(value)


def _h_law(h):
    """Return (kind, object, parameters) for a convection-coefficient input."""
    if isinstance(h, PowerLawCoefficient):
        return ("power law C|T - T_inf|^n", h,
                {"h_coefficient": h.h_coefficient, "h_exponent": h.h_exponent})
    if callable(h):
        return ("callable h(x, temperature)", h, {"callable": getattr(h, "__name__", repr(h))})
    return ("constant", v.positive("h", h, "W/(m2 K)"), {"h": float(h)})


def _eval(func, x: np.ndarray, name: str) -> np.ndarray:
    if callable(func):
        out = np.broadcast_to(np.asarray(func(x), dtype=float), x.shape)
    else:
        out = np.full(x.shape, v.finite(name, func))
    if not (np.isfinite(out).all() and (out >= 0.0).all()):
        raise HeatLedgerError(f"{name} must be finite and not negative along the fin")
    return out


def _h_of(law, x: np.ndarray, temp: np.ndarray, t_inf: float) -> np.ndarray:
    kind, obj, _ = law
    if kind == "constant":
        return np.full(temp.shape, obj)
    if isinstance(obj, PowerLawCoefficient):
        return obj(temp - t_inf)
    out = np.broadcast_to(np.asarray(obj(x, temp), dtype=float), temp.shape)
    if not (np.isfinite(out).all() and (out >= 0.0).all()):
        raise HeatLedgerError("h(x, temperature) must return finite values >= 0 W/(m2 K)")
    return out


def _flux(law, eps, x, temp, t_inf, t_sur) -> np.ndarray:
    """Surface heat flux lost at temperature ``temp``. [W/m2]"""
    q = _h_of(law, x, temp, t_inf) * (temp - t_inf)
    if eps > 0.0:
        q = q + eps * Stefan_Boltzmann * ((temp + zero_Celsius) ** 4
                                          - (t_sur + zero_Celsius) ** 4)
    return q


def _flux_slope(law, eps, x, temp, t_inf, t_sur) -> np.ndarray:
    """d q''/dT, clipped at zero. [W/(m2 K)]"""
    kind, obj, _ = law
    if kind == "constant":
        g1 = np.full(temp.shape, obj)
    elif isinstance(obj, PowerLawCoefficient):
        g1 = obj.h_coefficient * (obj.h_exponent + 1.0) * np.abs(temp - t_inf) ** obj.h_exponent
    else:
        step = 1e-4 * np.maximum(1.0, np.abs(temp - t_inf))
        up = _h_of(law, x, temp + step, t_inf) * (temp + step - t_inf)
        dn = _h_of(law, x, temp - step, t_inf) * (temp - step - t_inf)
        g1 = np.maximum((up - dn) / (2.0 * step), 0.0)
    if eps > 0.0:
        g1 = g1 + 4.0 * eps * Stefan_Boltzmann * (temp + zero_Celsius) ** 3
    return g1


def _flux_and_slope(law, eps, x, temp, t_inf, t_sur):
    """``q''(T)`` and ``dq''/dT`` together (one power evaluation for the power law)."""
    obj = law[1]
    if isinstance(obj, PowerLawCoefficient):
        theta = temp - t_inf
        h_c = np.abs(theta)
        np.power(h_c, obj.h_exponent, out=h_c)
        h_c *= obj.h_coefficient
        g0 = np.multiply(h_c, theta, out=theta)
        g1 = np.multiply(h_c, obj.h_exponent + 1.0, out=h_c)
        if eps > 0.0:
            tk = temp + zero_Celsius
            tk3 = tk * tk * tk
            sk = t_sur + zero_Celsius
            es = eps * Stefan_Boltzmann
            g0 = g0 + es * (tk3 * tk - sk**4)
            g1 = g1 + 4.0 * es * tk3
        return g0, g1
    return (_flux(law, eps, x, temp, t_inf, t_sur),
            _flux_slope(law, eps, x, temp, t_inf, t_sur))


def _tip_coefficient(law, eps, x_tip, t_tip, t_inf, t_sur):
    """Combined coefficient and weighted ambient for the tip face (secant linearisation)."""
    hc = float(_h_of(law, np.array([x_tip]), np.array([t_tip]), t_inf)[0])
    hr = 0.0
    if eps > 0.0:
        tk, sk = t_tip + zero_Celsius, t_sur + zero_Celsius
        hr = eps * Stefan_Boltzmann * (tk * tk + sk * sk) * (tk + sk)
    total = hc + hr
    if total <= 0.0:
        return 0.0, t_inf
    return total, (hc * t_inf + hr * t_sur) / total


#: Change of the iterate below which the fin's linear solves are refined: from the second
#: Newton step on, since an unrefined solve of 1e5 cells carries about 1e-6 K of rounding,
#: which would stall the iteration short of its 1e-8 K tolerance; the first step, from a flat
#: guess, is replaced anyway. [K]
REFINE_NEAR_K = 0.1
#: An iteration whose change stops decreasing within this factor of the tolerance has
#: reached the rounding of the linear solves (a tolerance near 1e-8 K on 1e5 cells). [-]
STALL_FACTOR = 10.0
#: Cells from which the fin's mesh estimate coarsens (n/16, n/4, n, or n/4, n/2, n) instead
#: of refining (n, 2n, 4n). [-]
COARSEN_FROM = 4096


def _fin_mesh_estimates(run, nodes: int, length: float):
    """The solution on ``nodes`` cells with three-mesh estimates of its heat rate [W] and tip
    temperature [degC].

    From ``COARSEN_FROM`` cells the meshes are coarser (n/16, n/4, n or n/4, n/2, n) and are
    solved coarse to fine, each iteration started from the solution of the mesh before it
    (interpolated, boundary faces included); below, the finer meshes (2n, 4n) start from the
    solution on ``nodes`` cells. Every mesh iterates to the same tolerance."""
    if nodes >= COARSEN_FROM and nodes % 16 == 0:  # cells cut by 4: 0.31 of a solve
        meshes, used, ratio = (nodes // 16, nodes // 4, nodes), 2, 4.0
    elif nodes >= COARSEN_FROM and nodes % 4 == 0:
        meshes, used, ratio = (nodes // 4, nodes // 2, nodes), 2, 2.0
    else:
        meshes, used, ratio = (nodes, 2 * nodes, 4 * nodes), 0, 2.0
    if used == 0:
        out = run(nodes)
        sol = out["sol"]
        start = (sol.x, sol.temperature, out["t_tip"])
        runs = [out] + [run(m, start) for m in meshes[1:]]
    else:  # coarse to fine: the converged coarser solution is the finer mesh's start
        runs = []
        for m in meshes:
            runs.append(run(m, _start_from(runs[-1], length) if runs else None))
        out = runs[used]
    mesh_q = three_mesh_estimate("heat_rate", meshes, [r["q"] for r in runs], reported=used,
                                 ratio=ratio)
    mesh_tip = three_mesh_estimate("temp_tip", meshes, [r["t_tip"] for r in runs],
                                   reported=used, ratio=ratio)
    return out, mesh_q, mesh_tip


def _start_from(out: dict, length: float):
    """A converged solution as the start of a finer mesh: positions [m] and temperatures
    [degC] of the cell centres with both boundary faces (so the ends are interpolated, not
    held), the tip-face temperature [degC], and a flag that the start is close."""
    sol = out["sol"]
    faces = sol.face_temperature
    x = np.concatenate(([0.0], sol.x, [length]))
    temp = np.concatenate(([faces[0]], sol.temperature, [faces[-1]]))
    return (x, temp, out["t_tip"], True)


def _solve(length, k, law, area, perimeter, t_b, t_inf, n, tip, t_tip_fixed, tip_area, eps,
           t_sur, linearisation, tolerance, max_iterations, initial=None):
    dx = length / n
    widths = np.full(n, dx)
    x = (np.arange(n) + 0.5) * dx
    a_c = _eval(area, x, "area")
    if (a_c <= 0.0).any():
        raise HeatLedgerError("area must be greater than zero at every cell centre")
    p_dx = _eval(perimeter, x, "perimeter") * dx
    kk = np.full(n, k)
    a_tip = None
    if tip == "convective":
        a_tip = (_eval(area, np.array([length]), "area")[0] if tip_area is None
                 else v.non_negative("tip_area", tip_area, "m2"))
    left = fixed_temperature(t_b)
    nonlinear = law[0] != "constant" or eps > 0.0
    # the base and tip faces: conduction area at x = 0 and the tip's exchange area at x = L
    a_end = _eval(area, np.array([0.0, length]), "area")
    faces = (float(a_end[0]) if a_end[0] > 0.0 else float(a_c[0]),
             a_tip if a_tip else (float(a_end[1]) if a_end[1] > 0.0 else float(a_c[-1])))

    def right_bc(t_tip_face):
        if tip == "adiabatic":
            return fixed_flux(0.0)
        if tip == "temperature":
            return fixed_temperature(t_tip_fixed)
        if tip == "infinite":
            m_tip = np.sqrt(law[1] * p_dx[-1] / dx / (k * a_c[-1]))
            return surface_to_ambient(t_inf, 1.0 / (k * m_tip))
        coeff, t_eq = _tip_coefficient(law, eps, length, t_tip_face, t_inf, t_sur)
        if coeff <= 0.0 or a_tip == 0.0:
            return fixed_flux(0.0)
        # a resistance per unit area of the tip face (face_area below)
        return surface_to_ambient(t_eq, 1.0 / coeff)

    mesh = conduction_mesh(widths, kk, area=a_c, face_area=faces)  # checked once
    if initial is None:
        temp, t_tip = np.full(n, t_b), t_b
    else:  # start from a solution on another mesh
        temp, t_tip = np.interp(x, initial[0], initial[1]), initial[2]
    iterations = 0
    change = math.inf
    # a start interpolated from a converged coarser mesh is close: refine from the first solve
    close = initial is not None and len(initial) > 3 and initial[3]
    while True:
        sc, sp = _cell_sources(law, eps, x, temp, t_inf, t_sur, p_dx,
                               "linear" if not nonlinear else linearisation)
        system = (right_bc(t_tip), sc, sp)
        # refinement only near convergence: the iterates before are replaced anyway
        near = not nonlinear or change < REFINE_NEAR_K or close
        sol = solve_on_mesh(mesh, left, system[0], source=sc, source_slope=sp,
                            refine="auto" if near else False)
        iterations += 1
        previous = change
        step = np.subtract(sol.temperature, temp)
        change = float(np.abs(step, out=step).max())
        # the tip face: T_N - Q_out R_N (FVSolution.face_temperature[-1], without the arrays)
        tip_face = float(sol.temperature[-1] - sol.heat_out * mesh.half_resistance[-1])
        change = max(change, abs(tip_face - t_tip))
        temp = sol.temperature
        t_tip = tip_face
        if not nonlinear or change < tolerance:
            break
        if change < STALL_FACTOR * tolerance and change >= previous:
            break  # no longer decreasing near the tolerance: the solver's rounding is reached
        if iterations >= max_iterations:
            raise HeatLedgerError(
                f"fin iteration did not converge in max_iterations={max_iterations} "
                f"(last change {change:.3g} K, tolerance {tolerance:g} K); raise "
                "max_iterations, try linearisation='picard' or check h and emissivity"
            )
    if not nonlinear:
        change = 0.0
    if abs(sol.energy_residual) > REFINE_BELOW:  # refine the last iterate only
        sol = solve_on_mesh(mesh, left, system[0], source=system[1], source_slope=system[2],
                            refine="auto")
        temp, t_tip = sol.temperature, float(sol.face_temperature[-1])

    out = _fin_balance(sol, law, eps, x, temp, t_b, t_inf, t_sur, t_tip, p_dx, tip, a_tip,
                       length, n)
    out.update({"iterations": iterations, "change": change, "nonlinear": nonlinear})
    return out


def _cell_sources(law, eps, x, temp, t_inf, t_sur, p_dx, linearisation) -> tuple:
    """The linearised loss of each cell to the fluid (and surroundings), ``S = S_c + S_p T``
    (Patankar 1980, 7.2): constant h; Picard (h and h_r at the last iterate); or Newton (the
    tangent of the loss at the last iterate)."""
    if linearisation == "linear":
        h_c = law[1]
        return h_c * p_dx * t_inf, -h_c * p_dx
    if linearisation == "picard":
        h_c = _h_of(law, x, temp, t_inf)
        sc, sp = h_c * p_dx * t_inf, -h_c * p_dx
        if eps > 0.0:
            tk, sk = temp + zero_Celsius, t_sur + zero_Celsius
            h_r = eps * Stefan_Boltzmann * (tk * tk + sk * sk) * (tk + sk)
            sc, sp = sc + h_r * p_dx * t_sur, sp - h_r * p_dx
        return sc, sp
    g0, g1 = _flux_and_slope(law, eps, x, temp, t_inf, t_sur)
    sc = np.multiply(g1, temp)  # S_c = -P dx (g* - g'* T*), in one array
    np.subtract(g0, sc, out=sc)
    sc *= p_dx
    np.negative(sc, out=sc)
    g1 *= p_dx  # S_p = -P dx g'*, in g'*'s own array
    return sc, np.negative(g1, out=g1)


def _fin_balance(sol, law, eps, x, temp, t_b, t_inf, t_sur, t_tip, p_dx, tip, a_tip, length,
                 n) -> dict:
    """The base heat rate, the losses of side and tip, the efficiency and the energy balance
    of a converged fin solution."""
    q_base = float(sol.face_heat_rate[0])
    # numpy's pairwise sum, not np.dot: the reported heat rates must not depend on the BLAS
    # kernel's summation order (math.fsum would cost a linear solve at 100,000 cells)
    loss_side = float(np.sum(_flux(law, eps, x, temp, t_inf, t_sur) * p_dx))
    if law[0] == "constant" or isinstance(law[1], PowerLawCoefficient):  # one flux for all
        ideal = _flux(law, eps, x[:1], np.array([t_b]), t_inf, t_sur)[0]
    else:
        ideal = _flux(law, eps, x, np.full(n, t_b), t_inf, t_sur)
    ideal_side = float(np.sum(ideal * p_dx))
    if tip == "convective":
        loss_tip = float(_flux(law, eps, np.array([length]), np.array([t_tip]), t_inf,
                               t_sur)[0]) * a_tip
        ideal_tip = float(_flux(law, eps, np.array([length]), np.array([t_b]), t_inf,
                                t_sur)[0]) * a_tip
    elif tip == "adiabatic":
        loss_tip = ideal_tip = 0.0
    else:
        loss_tip, ideal_tip = float(sol.face_heat_rate[-1]), 0.0
    if tip in ("convective", "adiabatic"):
        num, den = loss_side + loss_tip, ideal_side + ideal_tip
    else:  # prescribed or infinite tip: the lateral loss on the stated length (at most 1)
        num, den = loss_side, ideal_side
    efficiency = num / den if den != 0.0 else float("nan")  # base at temp_fluid: undefined
    scale = max(abs(q_base), abs(loss_side), abs(loss_tip), np.finfo(float).tiny)
    residual = (q_base - loss_side - loss_tip) / scale
    return {"sol": sol, "q": q_base, "loss_side": loss_side, "loss_tip": loss_tip,
            "t_tip": t_tip, "efficiency": float(efficiency), "residual": float(residual)}
