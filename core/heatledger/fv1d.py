"""Steady 1-D heat conduction by the cell-centred finite-volume method.

The domain ``0 <= x <= L`` is cut into ``N`` control volumes (cells) of width ``w_i``, each
with its own conductivity ``k_i`` and conduction area ``A_i``. Heat flows between the
centres of neighbouring cells through the series resistance of the two half cells (the
harmonic mean of the conductivities), so a layer boundary that falls on a cell face is
represented exactly. Each cell balances conduction with a linearised source

    S_i = S_c,i + S_p,i * T_i          (W; S_p,i <= 0 keeps the system diagonally dominant)

which carries volumetric generation (a heating mat, a heated screed) and, for fins, the loss
to the surroundings. The discrete equations are

    a_P,i T_i = a_W,i T_(i-1) + a_E,i T_(i+1) + b_i
    a_W,i = G_(i-1/2),  a_E,i = G_(i+1/2),  a_P,i = a_W,i + a_E,i + G_b,i - S_p,i
    G_(i+1/2) = 1 / (w_i / (2 k_i A_i) + w_(i+1) / (2 k_(i+1) A_(i+1)))          [W/K]

with boundary conductances ``G_b`` and sources ``b`` set by the boundary conditions (fixed
temperature, surface resistance to an ambient, or fixed heat flux). The system is tridiagonal
and is solved in O(N) by LAPACK's tridiagonal solver (``?gtsv``); no dense matrix is formed.

References
----------
S. V. Patankar, *Numerical Heat Transfer and Fluid Flow*, Hemisphere 1980, ch. 4
(discretisation equations 4.9-4.12, harmonic-mean interface conductivity eq. 4.9).
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import cached_property

import numpy as np
from scipy.linalg import lapack

from .errors import HeatLedgerError

__all__ = [
    "Boundary",
    "FVSolution",
    "MeshEstimate",
    "fixed_temperature",
    "surface_to_ambient",
    "fixed_flux",
    "solve_conduction",
    "solve_tridiagonal",
    "richardson_estimate",
]

_GTSV = lapack.get_lapack_funcs("gtsv", dtype=np.float64)
#: Relative energy imbalance above which ``refine="auto"`` refines the solution (an order
#: below the 1e-9 the project promises for every result).
REFINE_BELOW = 1e-10
#: Most refinement steps taken.
MAX_REFINEMENTS = 2


@dataclass(frozen=True)
class Boundary:
    """A boundary condition at one end of the 1-D domain.

    Parameters
    ----------
    kind : str
        ``"temperature"`` (fixed surface temperature), ``"surface"`` (surface resistance to
        an ambient temperature) or ``"flux"`` (fixed heat flux into the domain). [-]
    temperature : float
        Surface temperature for ``"temperature"``, ambient temperature for ``"surface"``;
        unused for ``"flux"``. [degC]
    resistance : float
        Surface resistance between the face and the ambient, per unit area, for
        ``"surface"``; ``1/h`` for a convection coefficient ``h``. [m2 K/W]
    flux : float
        Heat flux into the domain through this face for ``"flux"``. [W/m2]
    """

    kind: str
    temperature: float = 0.0
    resistance: float = 0.0
    flux: float = 0.0


def fixed_temperature(temperature: float) -> Boundary:
    """Boundary held at ``temperature``. [degC]"""
    return Boundary("temperature", temperature=float(temperature))


def surface_to_ambient(temperature: float, resistance: float) -> Boundary:
    """Boundary exchanging heat with an ambient at ``temperature`` [degC] through a surface
    resistance ``resistance`` [m2 K/W] (``1/h``)."""
    if not resistance >= 0.0:
        raise HeatLedgerError(f"surface resistance must not be negative; got {resistance!r}")
    return Boundary("surface", temperature=float(temperature), resistance=float(resistance))


def fixed_flux(flux: float) -> Boundary:
    """Boundary through which ``flux`` [W/m2] enters the domain (0 is adiabatic)."""
    return Boundary("flux", flux=float(flux))


@dataclass(frozen=True)
class MeshEstimate:
    """Mesh-refinement estimate of a quantity.

    Attributes
    ----------
    quantity : str
        What was estimated (for example ``"heat_flux"``).
    coarse, fine : float
        The quantity on the mesh used and on a mesh refined by ``ratio``.
    ratio : float
        Refinement ratio (2 = every cell halved).
    order : float
        Assumed order of the method (2 for this cell-centred scheme).
    extrapolated : float
        Richardson extrapolation ``fine + (fine - coarse)/(ratio**order - 1)``.
    error_estimate : float
        Estimated error of the coarse value, ``|extrapolated - coarse|``, same unit as the
        quantity.
    """

    quantity: str
    coarse: float
    fine: float
    ratio: float
    order: float
    extrapolated: float
    error_estimate: float


class FVSolution:
    """Result of :func:`solve_conduction`.

    The solve itself computes the temperatures, the boundary heat rates and the energy
    balance; positions, face temperatures and interior face heat rates are derived from them
    on first access (so a million-node solve pays only for what it uses).

    Attributes
    ----------
    temperature : ndarray
        Cell-centre temperatures. [degC]
    widths : ndarray
        Cell widths. [m]
    x : ndarray
        Cell-centre positions from the left face. [m]
    faces : ndarray
        Face positions, ``N + 1`` values from 0 to L. [m]
    face_temperature : ndarray
        Temperatures at the faces (boundary faces included), from the half-cell
        resistances. [degC]
    face_heat_rate : ndarray
        Heat rate through each face in the +x direction. [W] (W/m2 where areas are 1)
    a_west, a_east, a_centre, b : ndarray
        The discretisation coefficients ``a_W``, ``a_E``, ``a_P`` [W/K] and ``b`` [W].
    heat_in, heat_out : float
        Heat rate entering through the left face and leaving through the right face. [W]
    source_total : float
        Net heat generated in the domain, ``sum(S_c + S_p T)``. [W]
    energy_residual : float
        ``(Q_in,left - Q_out,right + source_total)`` divided by the largest of those terms
        (at least the heat rate 1 K across the domain would drive): the relative
        energy-balance residual (0 for an exact balance).
    """

    def __init__(self, temperature, widths, half, g_int, a_centre, b, heat_in, heat_out,
                 source_total, energy_residual, settings) -> None:
        self.temperature = temperature
        self.widths = widths
        self._half = half
        self._g = g_int
        self.a_centre = a_centre
        self.b = b
        self.heat_in = float(heat_in)
        self.heat_out = float(heat_out)
        self.source_total = float(source_total)
        self.energy_residual = float(energy_residual)
        self.settings = settings

    @cached_property
    def faces(self) -> np.ndarray:
        out = np.empty(self.widths.size + 1)
        out[0] = 0.0
        np.cumsum(self.widths, out=out[1:])
        return out

    @cached_property
    def x(self) -> np.ndarray:
        return self.faces[:-1] + 0.5 * self.widths

    @cached_property
    def face_heat_rate(self) -> np.ndarray:
        t = self.temperature
        q = np.empty(t.size + 1)
        q[0] = self.heat_in
        q[-1] = self.heat_out
        np.multiply(self._g, t[:-1] - t[1:], out=q[1:-1])
        return q

    @cached_property
    def face_temperature(self) -> np.ndarray:
        q = self.face_heat_rate
        out = np.empty(q.size)
        # left face of cell i: T_i + Q_(i-1/2) * half_i (heat arrives from the left)
        out[:-1] = self.temperature + q[:-1] * self._half
        out[-1] = self.temperature[-1] - q[-1] * self._half[-1]
        return out

    @cached_property
    def a_west(self) -> np.ndarray:
        out = np.zeros(self.temperature.size)
        out[1:] = self._g
        return out

    @cached_property
    def a_east(self) -> np.ndarray:
        out = np.zeros(self.temperature.size)
        out[:-1] = self._g
        return out


def solve_conduction(
    widths,
    conductivity,
    left: Boundary,
    right: Boundary,
    *,
    area=None,
    source=None,
    source_slope=None,
    refine="auto",
) -> FVSolution:
    """Solve steady 1-D conduction on a cell-centred finite-volume mesh.

    Parameters
    ----------
    widths : array_like
        Cell widths ``w_i``, left to right. [m]
    conductivity : array_like
        Thermal conductivity of each cell ``k_i``. [W/(m K)]
    left, right : Boundary
        Boundary conditions at ``x = 0`` and ``x = L``. [-]
    area : array_like, optional
        Conduction area of each cell ``A_i``; default 1, so heat rates are fluxes. [m2]
    source : array_like, optional
        Constant part of the cell source ``S_c,i`` (heat generated in the cell). [W]
    source_slope : array_like, optional
        Linear part ``S_p,i`` of the cell source, must be <= 0. [W/K]
    refine : {"auto", True, False}
        Iterative refinement: ``"auto"`` refines (at most twice) when the relative energy
        imbalance of the first solve exceeds ``REFINE_BELOW``, as happens with very many
        cells or conductances that differ by orders of magnitude (thin metal sheets);
        ``False`` returns the plain tridiagonal solve. [-]

    Returns
    -------
    FVSolution

    Raises
    ------
    HeatLedgerError
        If a width, conductivity or area is not finite and positive, if ``source_slope`` is
        positive, or if no boundary fixes the temperature level.

    Notes
    -----
    Interior conductance ``G_(i+1/2) = 1/(w_i/(2 k_i A_i) + w_(i+1)/(2 k_(i+1) A_(i+1)))``.
    Boundary conductance ``G_b = 1/(w_0/(2 k_0 A_0) + R_s/A_0)`` for a surface resistance
    ``R_s`` (``R_s = 0`` for a fixed temperature). A fixed flux adds ``q A_0`` to ``b``.
    """
    w = np.asarray(widths, dtype=float)
    k = np.asarray(conductivity, dtype=float)
    n = w.size
    if n < 1 or w.ndim != 1 or k.shape != w.shape:
        raise HeatLedgerError(
            f"widths and conductivity must be 1-D arrays of the same length; got {w.shape} "
            f"and {k.shape}"
        )
    a = None if area is None else np.broadcast_to(np.asarray(area, dtype=float), (n,))
    for name, arr in (("cell width", w), ("conductivity", k), ("conduction area", a)):
        # min > 0 rejects zeros, negatives and NaN; a finite sum rejects infinities
        if arr is not None and not (arr.min() > 0.0 and np.isfinite(arr.sum())):
            raise HeatLedgerError(f"every {name} must be finite and greater than zero")
    if left.kind == "flux" and right.kind == "flux":
        raise HeatLedgerError(
            "at least one boundary must fix a temperature (temperature or surface); "
            "two flux boundaries leave the temperature level undefined"
        )
    area0 = 1.0 if a is None else float(a[0])
    area_n = 1.0 if a is None else float(a[-1])

    half = w / (2.0 * k) if a is None else w / (2.0 * k * a)  # half-cell resistances [K/W]
    g_int = half[:-1] + half[1:]
    np.reciprocal(g_int, out=g_int)  # interior face conductances [W/K]

    if source is None:
        b = np.zeros(n)
        src_const = 0.0
    else:
        b = np.array(np.broadcast_to(source, (n,)), dtype=float)
        src_const = float(b.sum())
    a_p = np.empty(n)
    a_p[0] = 0.0
    a_p[1:] = g_int
    a_p[:-1] += g_int
    sp = None
    if source_slope is not None:
        sp = np.broadcast_to(np.asarray(source_slope, dtype=float), (n,))
        if sp.max() > 0.0:
            raise HeatLedgerError("source_slope must be <= 0 for a stable, bounded solution")
        a_p -= sp
    gb_left = _boundary_conductance(left, half[0], area0)
    gb_right = _boundary_conductance(right, half[-1], area_n)
    if left.kind == "flux":
        b[0] += left.flux * area0
    else:
        a_p[0] += gb_left
        b[0] += gb_left * left.temperature
    if right.kind == "flux":
        b[-1] += right.flux * area_n
    else:
        a_p[-1] += gb_right
        b[-1] += gb_right * right.temperature

    sc = None if source is None else b - _boundary_rhs(left, right, gb_left, gb_right, area0,
                                                         area_n, n)
    temp = _solve(g_int, a_p, b)
    r_path = 2.0 * float(half.sum()) + left.resistance / area0 + right.resistance / area_n
    refinements = 0
    while True:
        q_in, q_out = _boundary_heat(left, right, gb_left, gb_right, area0, area_n, temp)
        src = src_const + (0.0 if sp is None else float(np.dot(sp, temp)))
        imbalance = q_in - q_out + src
        # scale: the largest heat term, but at least the heat rate that 1 K across the whole
        # domain would drive (so a near-isothermal case is not judged on rounding noise)
        scale = max(abs(q_in), abs(q_out), abs(src), 1.0 / r_path)
        if (refine is False or n == 1 or refinements == MAX_REFINEMENTS
                or (refine == "auto" and abs(imbalance) <= REFINE_BELOW * scale)):
            break
        # iterative refinement: the residual of every cell balance in flux form, where the
        # temperature differences are formed first (exact for close values), is far more
        # accurate than b - A T when conductances differ by orders of magnitude (thin metal)
        resid = np.zeros(n) if sc is None else sc.copy()
        if sp is not None:
            resid += sp * temp
        flux = g_int * (temp[:-1] - temp[1:])
        resid[:-1] -= flux
        resid[1:] += flux
        resid[0] += q_in
        resid[-1] -= q_out
        temp = temp + _solve(g_int, a_p, resid)
        refinements += 1
    return FVSolution(temp, w, half, g_int, a_p, b, q_in, q_out, src, imbalance / scale,
                      {"cells": n, "method": "cell-centred finite volume, harmonic-mean faces",
                       "refinements": refinements})


def solve_tridiagonal(lower, diag, upper, rhs) -> np.ndarray:
    """Solve a tridiagonal system in O(N) with LAPACK ``?gtsv``.

    Parameters
    ----------
    lower : array_like
        Sub-diagonal, ``N - 1`` values (row i+1, column i). [-]
    diag : array_like
        Main diagonal, ``N`` values. [-]
    upper : array_like
        Super-diagonal, ``N - 1`` values (row i, column i+1). [-]
    rhs : array_like
        Right-hand side, ``N`` values. [-]

    Returns
    -------
    ndarray
        The solution vector.

    Examples
    --------
    >>> solve_tridiagonal([-1.0], [2.0, 2.0], [-1.0], [1.0, 1.0])
    array([1., 1.])
    """
    d = np.array(diag, dtype=float)
    if d.size == 1:
        return np.asarray(rhs, dtype=float) / d
    return _gtsv(np.array(lower, dtype=float), d, np.array(upper, dtype=float),
                 np.array(rhs, dtype=float))


def richardson_estimate(quantity: str, coarse: float, fine: float, *, ratio: float = 2.0,
                        order: float = 2.0) -> MeshEstimate:
    """Richardson extrapolation from a coarse and a refined solution.

    Parameters
    ----------
    quantity : str
        Name of the quantity (for the record). [-]
    coarse, fine : float
        The quantity on the mesh used and on the refined mesh. [unit of the quantity]
    ratio : float
        Refinement ratio of cell size. [-]
    order : float
        Order of accuracy of the method. [-]

    Returns
    -------
    MeshEstimate

    Notes
    -----
    ``phi_exact ~ phi_fine + (phi_fine - phi_coarse) / (r**p - 1)``
    (L. F. Richardson, Phil. Trans. R. Soc. A 210 (1911); P. J. Roache, *Verification and
    Validation in Computational Science and Engineering*, 1998, eq. 5.4.1).

    Examples
    --------
    >>> richardson_estimate("q", 1.0, 1.0).error_estimate
    0.0
    """
    extrap = fine + (fine - coarse) / (ratio**order - 1.0)
    return MeshEstimate(quantity, float(coarse), float(fine), float(ratio), float(order),
                        float(extrap), float(abs(extrap - coarse)))


def _solve(g_int, a_p, rhs) -> np.ndarray:
    """Solve the assembled system; ``a_p`` and ``rhs`` are kept (copies go to LAPACK)."""
    if a_p.size == 1:
        return rhs / a_p
    dl = np.negative(g_int)
    return _gtsv(dl, a_p.copy(), dl.copy(), rhs.copy())


def _gtsv(dl, d, du, b) -> np.ndarray:
    """LAPACK ?gtsv on arrays it may overwrite."""
    _, _, _, x, info = _GTSV(dl, d, du, b, overwrite_dl=1, overwrite_d=1, overwrite_du=1,
                             overwrite_b=1)
    if info != 0:
        raise HeatLedgerError(f"the finite-volume system is singular (LAPACK gtsv info={info})")
    return x


def _boundary_rhs(left, right, gb_left, gb_right, area0, area_n, n) -> np.ndarray:
    out = np.zeros(n)
    out[0] += left.flux * area0 if left.kind == "flux" else gb_left * left.temperature
    out[-1] += right.flux * area_n if right.kind == "flux" else gb_right * right.temperature
    return out


def _boundary_heat(left, right, gb_left, gb_right, area0, area_n, temp):
    q_in = left.flux * area0 if left.kind == "flux" else gb_left * (left.temperature - temp[0])
    q_out = (-right.flux * area_n if right.kind == "flux"
             else gb_right * (temp[-1] - right.temperature))
    return q_in, q_out


def _boundary_conductance(bc: Boundary, half_resistance: float, area: float) -> float:
    if bc.kind == "temperature":
        return 1.0 / half_resistance
    if bc.kind == "surface":
        return 1.0 / (half_resistance + bc.resistance / area)
    if bc.kind == "flux":
        return 0.0
    raise HeatLedgerError(
        f"boundary kind must be one of 'temperature', 'surface', 'flux'; got {bc.kind!r}"
    )
