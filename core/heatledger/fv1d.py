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
symmetric and positive definite, and is solved in O(N) by LAPACK's ``?pttrf``/``?pttrs`` (one
factorisation, reused for refinement); no dense matrix is formed.

References
----------
S. V. Patankar, *Numerical Heat Transfer and Fluid Flow*, Hemisphere 1980, ch. 4
(discretisation equations 4.9-4.12, harmonic-mean interface conductivity eq. 4.9).

Sources: [source: patankar-1980, ch. 4]; mesh estimates [source: roache-1998]; solvers [source:
lapack, ?gtsv, ?pttrf].
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from functools import cached_property

import numpy as np
from scipy.linalg import lapack

from .errors import HeatLedgerError
from .mesh_estimates import (  # noqa: F401
    ORDER_RANGE,
    REFINE_BELOW,
    ROUNDING_ULPS,
    SAFETY_FACTOR,
    MeshEstimate,
    exact_estimate,
    richardson_estimate,
    three_mesh_estimate,
)
from .tridiagonal import solve_tridiagonal  # noqa: E402  (re-exported)

__all__ = [
    "Boundary",
    "FVSolution",
    "MeshEstimate",
    "fixed_temperature",
    "surface_to_ambient",
    "fixed_flux",
    "solve_conduction",
    "conduction_mesh",
    "solve_on_mesh",
    "ConductionMesh",
    "solve_tridiagonal",
    "richardson_estimate",
    "three_mesh_estimate",
    "exact_estimate",
]

_PTTRF = lapack.get_lapack_funcs("pttrf", dtype=np.float64)
_PTTRS = lapack.get_lapack_funcs("pttrs", dtype=np.float64)
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
    """Boundary held at ``temperature``. [degC]

    Parameters
    ----------
    temperature : float
        Temperature of the face. [degC]

    References
    ----------
    [source: patankar-1980, ch. 4].
    """
    return Boundary("temperature", temperature=float(temperature))


def surface_to_ambient(temperature: float, resistance: float) -> Boundary:
    """Boundary exchanging heat with an ambient at ``temperature`` [degC] through a surface
    resistance ``resistance`` [m2 K/W] (``1/h``).

    Parameters
    ----------
    temperature : float
        Ambient temperature. [degC]
    resistance : float
        Surface resistance 1/h per unit area. [m2 K/W]

    References
    ----------
    [source: patankar-1980, ch. 4].
    """
    if not resistance >= 0.0:
        raise HeatLedgerError(f"surface resistance must not be negative; got {resistance!r}")
    return Boundary("surface", temperature=float(temperature), resistance=float(resistance))


def fixed_flux(flux: float) -> Boundary:
    """Boundary through which ``flux`` [W/m2] enters the domain (0 is adiabatic).

    Parameters
    ----------
    flux : float
        Heat flux entering the domain (0 = adiabatic). [W/m2]

    References
    ----------
    [source: patankar-1980, ch. 4].
    """
    return Boundary("flux", flux=float(flux))


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
        Heat rate through each face in the +x direction; at a face that releases heat, the
        heat rate leaving it on the +x side. [W] (W/m2 where areas are 1)
    face_sources : dict
        Heat released at interior faces, face index -> heat rate. [W]
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
    half : ndarray
        Half-cell resistances of the faces (internal, for face temperatures). [m2 K/W]
    g_int : ndarray
        Interface conductances (internal). [W/K]
    settings : dict
        The solver's settings, for the record. [-]
    """

    def __init__(self, temperature, widths, half, g_int, a_centre, b, heat_in, heat_out,
                 source_total, energy_residual, settings, face_sources=None) -> None:
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
        self.face_sources = dict(face_sources or {})

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
        half = self._half
        for f, heat in self.face_sources.items():
            # at a face that releases heat: the heat rate leaving it on the +x side
            q[f] += heat * half[f - 1] / (half[f - 1] + half[f])
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
    face_area=None,
    source=None,
    source_slope=None,
    face_source=None,
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
        Conduction area of each cell at its centre ``A_i``; default 1, so heat rates are
        fluxes. [m2]
    face_area : sequence of two floats, optional
        Areas of the two boundary faces ``(A_left, A_right)``, on which a flux or a surface
        resistance acts. Default: 1 without ``area``; with ``area``, the linear extrapolation
        of the two outermost cell areas (exact where the area varies linearly, as on a
        cylinder or a tapered fin). [m2]
    source : array_like, optional
        Constant part of the cell source ``S_c,i`` (heat generated in the cell). [W]
    source_slope : array_like, optional
        Linear part ``S_p,i`` of the cell source, must be <= 0. [W/K]
    face_source : dict, optional
        Interior face index ``f`` (1 to N-1, the face between cells ``f-1`` and ``f``) ->
        heat released at that face (a heating foil or cable mat). [W]
    refine : {"auto", True, False}
        Iterative refinement with the same factors: ``"auto"`` refines (at most twice) when
        the relative energy imbalance of the first solve exceeds ``REFINE_BELOW``, as happens
        with very many cells or conductances that differ by orders of magnitude (thin metal
        sheets); ``False`` returns the plain solve. [-]

    Returns
    -------
    FVSolution

    Raises
    ------
    HeatLedgerError
        If a width, conductivity or area is not finite and positive, if ``source_slope`` is
        positive, if a face source is not on an interior face, or if no boundary fixes the
        temperature level.

    Notes
    -----
    Interior conductance ``G_(i+1/2) = 1/(R_i + R_(i+1))`` with the half-cell resistances
    ``R_i = w_i/(2 k_i A_i)``. Boundary conductance ``G_b = 1/(R_0 + R_s/A_b)`` for a surface
    resistance ``R_s`` on the boundary face of area ``A_b`` (``R_s = 0`` for a fixed
    temperature); a fixed flux adds ``q A_b``. A heat ``Q`` released at the face between
    cells ``i`` and ``i+1`` goes to cell ``i`` as ``Q R_(i+1)/(R_i + R_(i+1))`` and to cell
    ``i+1`` as ``Q R_i/(R_i + R_(i+1))``, and the face temperature is
    ``(T_i/R_i + T_(i+1)/R_(i+1) + Q)/(1/R_i + 1/R_(i+1))``: the flux balance of the two
    half cells, exact for a piecewise-linear field. The matrix is symmetric positive
    definite and is factorised once by LAPACK ``?pttrf``; the solve and the refinement steps
    reuse the factors (``?pttrs``).

    References
    ----------
    [source: patankar-1980, ch. 4].
    """
    mesh = conduction_mesh(widths, conductivity, area=area, face_area=face_area)
    return _solve_on(mesh, left, right, source, source_slope, face_source, refine,
                     keep_mesh=False)  # a mesh of its own: its diagonal is used in place


@dataclass(frozen=True)
class ConductionMesh:
    """The checked geometry of a 1-D finite-volume mesh, ready for solves that differ only
    in their sources and boundaries (the iterations of a non-linear problem).

    Attributes
    ----------
    widths : ndarray
        Cell widths. [m]
    half_resistance : ndarray
        Half-cell resistances ``w_i / (2 k_i A_i)``. [K/W]
    g_int : ndarray
        Interior face conductances. [W/K]
    a_centre : ndarray
        Diagonal coefficient a_P from the interior faces alone. [W/K]
    face_areas : tuple of float
        Areas of the two boundary faces. [m2]

    References
    ----------
    [source: patankar-1980, ch. 4].
    """

    widths: np.ndarray
    half_resistance: np.ndarray
    g_int: np.ndarray
    a_centre: np.ndarray
    face_areas: tuple


def conduction_mesh(widths, conductivity, *, area=None, face_area=None) -> ConductionMesh:
    """Check the geometry of a mesh and compute its conductances once (see
    :func:`solve_conduction` for the arguments).

    Parameters
    ----------
    widths : array_like
        Cell widths. [m]
    conductivity : array_like
        Conductivity of each cell. [W/(m K)]
    area : array_like, optional
        Conduction area of each cell. [m2]
    face_area : sequence of two floats, optional
        Areas of the two boundary faces. [m2]

    Returns
    -------
    ConductionMesh

    References
    ----------
    [source: patankar-1980, ch. 4 (harmonic-mean face conductance)].
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
    areas = _boundary_areas(a, face_area, w)
    half = w / (2.0 * k) if a is None else w / (2.0 * k * a)  # half-cell resistances [K/W]
    g_int = np.add(half[:-1], half[1:])
    np.reciprocal(g_int, out=g_int)  # interior face conductances [W/K]
    a_p = np.empty(n)
    a_p[0] = 0.0
    a_p[1:] = g_int
    a_p[:-1] += g_int
    return ConductionMesh(w, half, g_int, a_p, areas)


def solve_on_mesh(mesh: ConductionMesh, left: Boundary, right: Boundary, *, source=None,
                  source_slope=None, face_source=None, refine="auto") -> FVSolution:
    """Solve on a checked mesh (see :func:`solve_conduction`, which is this after
    :func:`conduction_mesh`).

    Parameters
    ----------
    mesh : ConductionMesh
        The mesh. [-]
    left, right : Boundary
        Boundary conditions. [-]
    source : array_like, optional
        Constant part of the cell source. [W]
    source_slope : array_like, optional
        Linear part of the cell source, <= 0. [W/K]
    face_source : dict, optional
        Interior face index -> heat released there. [W]
    refine : {"auto", True, False}
        Iterative refinement with the same factors. [-]

    Returns
    -------
    FVSolution

    References
    ----------
    [source: patankar-1980, ch. 4]; [source: lapack, ?pttrf and ?pttrs].
    """
    return _solve_on(mesh, left, right, source, source_slope, face_source, refine,
                     keep_mesh=True)


def _solve_on(mesh, left, right, source, source_slope, face_source, refine, *,
              keep_mesh: bool) -> FVSolution:
    """The solve of :func:`solve_on_mesh`; ``keep_mesh`` False lets it build the diagonal
    in the mesh's own array (a mesh used once)."""
    w, half, g_int = mesh.widths, mesh.half_resistance, mesh.g_int
    n = w.size
    if left.kind == "flux" and right.kind == "flux":
        raise HeatLedgerError(
            "at least one boundary must fix a temperature (temperature or surface); "
            "two flux boundaries leave the temperature level undefined"
        )
    area0, area_n = mesh.face_areas
    b = np.zeros(n) if source is None else np.array(np.broadcast_to(source, (n,)), dtype=float)
    face_q = _face_sources(face_source, half, b)
    # numpy's pairwise sum (no BLAS): this total feeds only the energy-balance residual
    src_const = float(b.sum()) if (source is not None or face_q) else 0.0
    a_p = mesh.a_centre.copy() if keep_mesh else mesh.a_centre
    sp = None
    if source_slope is not None:
        sp = np.broadcast_to(np.asarray(source_slope, dtype=float), (n,))
        if sp.max() > 0.0:
            raise HeatLedgerError("source_slope must be <= 0 for a stable, bounded solution")
        a_p -= sp
    gb_left = _boundary_conductance(left, half[0], area0)
    gb_right = _boundary_conductance(right, half[-1], area_n)
    sc = b.copy() if (source is not None or face_q) else None  # cell sources only [W]
    b[0] += left.flux * area0 if left.kind == "flux" else gb_left * left.temperature
    b[-1] += right.flux * area_n if right.kind == "flux" else gb_right * right.temperature
    a_p[0] += gb_left
    a_p[-1] += gb_right

    factors = _factorise(a_p, g_int)
    temp = _solve_factored(factors, b.copy())
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
        temp += _solve_factored(factors, _residual(temp, g_int, sc, sp, q_in, q_out))
        refinements += 1
    return FVSolution(temp, w, half, g_int, a_p, b, q_in, q_out, src, imbalance / scale,
                      {"cells": n, "method": "cell-centred finite volume, harmonic-mean faces",
                       "refinements": refinements}, face_q)


def _boundary_areas(a, face_area, w) -> tuple[float, float]:
    """Areas of the two boundary faces [m2] (see ``face_area`` in solve_conduction)."""
    if face_area is not None:
        a0, an = (float(x) for x in face_area)
        if not (a0 > 0.0 and an > 0.0 and math.isfinite(a0 + an)):
            raise HeatLedgerError("face_area must be two finite areas greater than zero")
        return a0, an
    if a is None:
        return 1.0, 1.0
    if a.size == 1:
        return float(a[0]), float(a[0])
    # linear through the two outermost cell centres, evaluated at the boundary face
    a0 = a[0] - (a[1] - a[0]) * w[0] / (w[0] + w[1])
    an = a[-1] + (a[-1] - a[-2]) * w[-1] / (w[-1] + w[-2])
    return float(a0) if a0 > 0.0 else float(a[0]), float(an) if an > 0.0 else float(a[-1])


def _face_sources(face_source, half, b) -> dict:
    """Add heat released at interior faces to the two cells beside each face, split by the
    flux balance of the half cells; return ``{face: heat}``. [W]"""
    if not face_source:
        return {}
    n = half.size
    out = {}
    for face, heat in face_source.items():
        f = int(face)
        if not 1 <= f <= n - 1 or f != face:
            raise HeatLedgerError(f"a face source must be on an interior face, 1 to {n - 1}; "
                                  f"got face {face}")
        q = float(heat)
        if not math.isfinite(q):
            raise HeatLedgerError(f"the heat released at face {f} must be finite")
        r_left, r_right = half[f - 1], half[f]
        b[f - 1] += q * r_right / (r_left + r_right)
        b[f] += q * r_left / (r_left + r_right)
        out[f] = out.get(f, 0.0) + q
    return out


def _residual(temp, g_int, sc, sp, q_in, q_out) -> np.ndarray:
    """Residual of every cell balance in flux form, where the temperature differences are
    formed first (exact for close values): far more accurate than ``b - A T`` when
    conductances differ by orders of magnitude (thin metal). [W]"""
    resid = np.zeros(temp.size) if sc is None else sc.copy()
    if sp is not None:
        resid += sp * temp
    flux = np.subtract(temp[:-1], temp[1:])
    flux *= g_int
    resid[:-1] -= flux
    resid[1:] += flux
    resid[0] += q_in
    resid[-1] -= q_out
    return resid


def _factorise(a_p, g_int):
    """L D L^T factors of the symmetric positive definite tridiagonal matrix (``?pttrf``)."""
    if a_p.size == 1:
        return (a_p, None)
    d, e, info = _PTTRF(a_p, np.negative(g_int), overwrite_e=1)
    if info != 0:
        raise HeatLedgerError(f"the finite-volume system is singular (LAPACK pttrf info={info})")
    return (d, e)


def _solve_factored(factors, rhs) -> np.ndarray:
    """Solve with the factors of :func:`_factorise`; ``rhs`` may be overwritten."""
    d, e = factors
    if e is None:
        return rhs / d
    x, info = _PTTRS(d, e, rhs, overwrite_b=1)
    if info != 0:
        raise HeatLedgerError(f"the finite-volume solve failed (LAPACK pttrs info={info})")
    return x


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
