"""Results of a 2-D section: heat flows, coupling coefficient, psi, surface temperatures,
temperature factor, energy balance and the mesh estimate.

Sources: [source: iso10211-method, 10 and 11]; mesh estimate [source: roache-1998].
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass
from functools import cached_property

import numpy as np

from .._validate import choice, choices_text, non_negative, quote, show
from ..errors import HeatLedgerError
from ..mesh_estimates import MeshEstimate, three_mesh_estimate
from .fields import FaceTemperatures

__all__ = ["Section2DResult", "PsiResult", "SurfaceMinimum", "DIMENSIONS"]

#: Dimension systems of the flanking lengths (EN ISO 13789 / EN ISO 10211). [-]
DIMENSIONS = ("internal", "external", "overall internal")
#: Observed orders within this distance of 2 are reported as the scheme's formal order. [-]
ORDER_SLACK = 0.25


@dataclass(frozen=True)
class PsiResult:
    """Linear thermal transmittance of a junction from a 2-D section.

    Attributes
    ----------
    psi : float
        Linear thermal transmittance ``L_2D - sum U_j l_j``. [W/(m K)]
    coupling_coefficient : float
        Thermal coupling coefficient of the section ``L_2D``. [W/(m K)]
    flanking : tuple
        The flanking elements ``(U_j, l_j)`` as given: U-value [W/(m2 K)] and length [m]. [-]
    flanking_total : float
        ``sum U_j l_j``. [W/(m K)]
    dimensions : str
        Dimension system of the lengths, as stated by the caller. [-]
    inside, outside : tuple of str
        The surfaces taken as inside and outside. [-]

    References
    ----------
    [source: iso10211-method, 10.3 (psi from L_2D)].
    """

    psi: float
    coupling_coefficient: float
    flanking: tuple
    flanking_total: float
    dimensions: str
    inside: tuple
    outside: tuple


@dataclass(frozen=True)
class SurfaceMinimum:
    """The lowest surface temperature found on a set of surfaces.

    Attributes
    ----------
    temperature : float
        Lowest surface temperature. [degC]
    x, y : float
        Where it is. [m]
    surface : str
        The surface it is on. [-]
    """

    temperature: float
    x: float
    y: float
    surface: str


def _names(arg, known, what: str) -> tuple:
    names = (arg,) if isinstance(arg, str) else tuple(arg)
    if not names:
        raise HeatLedgerError(f"{what} needs at least one surface name; got none")
    for n in names:
        if n not in known:
            raise HeatLedgerError(f"{what}: there is no surface {quote(n)}; the surfaces are "
                                  f"{choices_text(known)}")
    return names


class Section2DResult:
    """The solved section: temperatures, heat flows and what follows from them.

    Built by :meth:`Section2D.solve`. Heat flows are per metre of the section's length
    (W/m), positive into the body.

    Parameters
    ----------
    solution : dict
        The solve's arrays and record (internal). [-]

    Attributes
    ----------
    heat_flows : dict
        Surface name -> heat flow into the body through it. [W/m]
    energy_balance : float
        Sum of the heat flows through all surfaces (0 for an exact balance). [W/m]
    energy_residual : float
        ``energy_balance`` over half the sum of the magnitudes of the heat flows (the heat
        flow through the section); the project asks at most 1e-9. [-]
    cells : int
        Cells of material solved. [-]
    solver : str
        The linear solver that ran (direct or iterative, with its preconditioner). [-]
    max_cell : float
        Largest cell edge asked for. [m]
    cell_temperatures : ndarray
        Temperatures at the cell centres, in the order of the grid's ``index``. [degC]
    grid : Grid
        The cell grid (edges, conductivities, numbering). [-]
    settings : dict
        Cells, grid size, solver, refinement steps or iterations, method. [-]

    References
    ----------
    [source: iso10211-method, 10 and 11]; [source: iso10211-validation, Annex A].
    """

    def __init__(self, solution: dict) -> None:
        self._s = solution
        self.grid = solution["grid"]
        self.max_cell = solution["max_cell"]
        self.solver = solution["solver"]
        self.cells = self.grid.cells
        self.cell_temperatures = solution["temp"]
        surfaces = self.grid.blocks.surfaces
        flows = solution["flows"]
        self.heat_flows = {s.name: float(q) for s, q in zip(surfaces, flows, strict=True)}
        self.energy_balance = float(math.fsum(flows))
        scale = 0.5 * math.fsum(abs(q) for q in flows)
        self.energy_residual = self.energy_balance / scale if scale > 0.0 else 0.0
        self.settings = {"cells": self.cells, "max_cell": self.max_cell,
                         "grid": (int(self.grid.dx.size), int(self.grid.dy.size)),
                         "solver": self.solver, "steps": solution["steps"],
                         "method": "cell-centred finite volumes, harmonic-mean faces"}

    # ------------------------------------------------------------------ heat flows
    def heat_flow(self, name: str) -> float:
        """Heat flow through one surface into the body. [W/m]

        Parameters
        ----------
        name : str
            Surface name. [-]
        """
        (key,) = _names(name, self.heat_flows, "heat_flow")
        return self.heat_flows[key]

    def _sides(self, inside, outside):
        surfaces = {s.name: s for s in self.grid.blocks.surfaces}
        if inside is None or outside is None:
            temps = sorted({s.temperature for s in surfaces.values()})
            if len(temps) != 2:
                raise HeatLedgerError(
                    f"the section has {len(temps)} ambient temperatures; name the inside and "
                    "outside surfaces (inside=..., outside=...)")
            hot = tuple(n for n, s in surfaces.items() if s.temperature == temps[1])
            cold = tuple(n for n, s in surfaces.items() if s.temperature == temps[0])
            inside = hot if inside is None else inside
            outside = cold if outside is None else outside
        ins = _names(inside, surfaces, "inside")
        out = _names(outside, surfaces, "outside")
        for label, group in (("inside", ins), ("outside", out)):
            temps = {surfaces[n].temperature for n in group}
            if len(temps) != 1:
                raise HeatLedgerError(
                    f"the {label} surfaces {choices_text(group)} have different ambient "
                    "temperatures; one side of a coupling coefficient has one temperature")
        t_in, t_out = surfaces[ins[0]].temperature, surfaces[out[0]].temperature
        if t_in == t_out or set(ins) & set(out):
            raise HeatLedgerError("inside and outside must be different surfaces at different "
                                  f"ambient temperatures; got {t_in:g} and {t_out:g} degC")
        return ins, out, t_in, t_out

    def coupling_coefficient(self, inside=None, outside=None) -> float:
        """Thermal coupling coefficient ``L_2D = Phi / (theta_i - theta_e)``. [W/(m K)]

        Parameters
        ----------
        inside, outside : str or sequence of str, optional
            Names of the inside and outside surfaces; by default the surfaces at the higher
            and the lower of exactly two ambient temperatures. [-]

        Notes
        -----
        ``Phi`` is the heat flow entering through the inside surfaces. With more than two
        ambient temperatures, other surfaces take part and this is one coupling of several.

        References
        ----------
        [source: iso10211-method, 10.2 (thermal coupling coefficient)].
        """
        ins, _, t_in, t_out = self._sides(inside, outside)
        return math.fsum(self.heat_flows[n] for n in ins) / (t_in - t_out)

    def psi(self, flanking, *, dimensions: str, inside=None, outside=None) -> PsiResult:
        """Linear thermal transmittance ``psi = L_2D - sum U_j l_j``.

        Parameters
        ----------
        flanking : sequence of (float, float)
            Flanking elements as ``(U_j, l_j)``: U-value [W/(m2 K)] and the length of the
            element in the section in the stated dimension system [m]. [-]
        dimensions : str
            Dimension system of the lengths: "internal", "external" or "overall
            internal"; carried in the result (psi depends on it). [-]
        inside, outside : str or sequence of str, optional
            Inside and outside surfaces (see :meth:`coupling_coefficient`). [-]

        Returns
        -------
        PsiResult

        References
        ----------
        [source: iso10211-method, 10.3 (psi = L_2D - sum U_j l_j)].
        """
        dims = choice("dimensions", dimensions, DIMENSIONS)
        ins, out, _, _ = self._sides(inside, outside)
        pairs = []
        for j, item in enumerate(flanking):
            try:
                u, length = item
            except (TypeError, ValueError):
                raise HeatLedgerError(f"flanking[{j}] must be a pair (U-value, length); got "
                                      f"{show(item)}") from None
            pairs.append((non_negative(f"flanking[{j}] U-value", u, "W/(m2 K)"),
                          non_negative(f"flanking[{j}] length", length, "m")))
        l2d = self.coupling_coefficient(ins, out)
        total = math.fsum(u * length for u, length in pairs)
        return PsiResult(l2d - total, l2d, tuple(pairs), total, dims, ins, out)

    # ------------------------------------------------------------------ temperatures
    @cached_property
    def _faces(self) -> FaceTemperatures:
        return FaceTemperatures(self.grid, self._s["temp"], self._s["bnd"], self._s["amb"])

    def temperature_at(self, x, y):
        """Temperature at a point of the body (interior, junction or outline). [degC]

        Parameters
        ----------
        x, y : float or array_like
            Coordinates. [m]

        Notes
        -----
        Linear from each cell centre to its face middles; face temperatures from the face
        fluxes; on a surface, extrapolated through the boundary face; on an edge or corner
        shared by several cells, the mean over the cells of material that touch it,
        weighted by their conductivities (see ``heatledger.bridges2d.fields``).

        References
        ----------
        [source: patankar-1980, ch. 4].
        """
        out = self._faces.at(x, y)
        return float(out[0]) if np.ndim(x) == 0 and np.ndim(y) == 0 else out

    def min_surface_temperature(self, surfaces) -> SurfaceMinimum:
        """Lowest temperature on the given surfaces, at face middles and cell corners.

        Parameters
        ----------
        surfaces : str or sequence of str
            Surface names. [-]

        Returns
        -------
        SurfaceMinimum

        References
        ----------
        [source: iso10211-method, 11 (minimum internal surface temperature)].
        """
        names = _names(surfaces, self.heat_flows, "min_surface_temperature")
        all_names = [s.name for s in self.grid.blocks.surfaces]
        bnd = self._s["bnd"]
        best = None
        for n in names:
            sel = bnd["surface"] == all_names.index(n)
            xs, ys = bnd["x"][sel], bnd["y"][sel]
            # face middles and the face ends (cell corners along the surface)
            horizontal = bnd["axis"][sel][0] == 0
            ends = self._face_ends(bnd, sel, horizontal)
            px = np.concatenate((xs, ends[0]))
            py = np.concatenate((ys, ends[1]))
            temps = self._faces.at(px, py)
            i = int(np.argmin(temps))
            if best is None or temps[i] < best.temperature:
                best = SurfaceMinimum(float(temps[i]), float(px[i]), float(py[i]), n)
        return best

    def _face_ends(self, bnd, sel, horizontal):
        g = self.grid
        if horizontal:
            cols = bnd["col"][sel]
            ex = np.union1d(g.xe[cols], g.xe[cols + 1])
            return ex, np.full(ex.size, bnd["y"][sel][0])
        rows = bnd["row"][sel]
        ey = np.union1d(g.ye[rows], g.ye[rows + 1])
        return np.full(ey.size, bnd["x"][sel][0]), ey

    def surface_factor(self, inside=None, outside=None) -> float:
        """Temperature factor at the internal surface
        ``f_Rsi = (theta_si,min - theta_e) / (theta_i - theta_e)``. [-]

        Parameters
        ----------
        inside, outside : str or sequence of str, optional
            Inside and outside surfaces (see :meth:`coupling_coefficient`); the lowest
            temperature is sought on the inside surfaces. [-]

        References
        ----------
        [source: iso10211-method, 11 (temperature factor f_Rsi)].
        """
        ins, _, t_in, t_out = self._sides(inside, outside)
        low = self.min_surface_temperature(ins).temperature
        return (low - t_out) / (t_in - t_out)

    # ------------------------------------------------------------------ mesh estimate
    @cached_property
    def _meshes(self) -> dict:
        return self._s["remesh"]()

    @cached_property
    def mesh_estimate(self) -> MeshEstimate:
        """Mesh estimate of the heat flow entering through the surfaces at the highest
        ambient temperature, from this grid, the grid with every cell halved and the grid
        with every second line removed (three solves, made when first read). [W/m]"""
        hot = max(s.temperature for s in self.grid.blocks.surfaces)
        names = [s.name for s in self.grid.blocks.surfaces if s.temperature == hot]
        return self.surface_mesh_estimate(names)

    def surface_mesh_estimate(self, surfaces) -> MeshEstimate:
        """Mesh estimate of the heat flow through the given surfaces (see
        :attr:`mesh_estimate`).

        Parameters
        ----------
        surfaces : str or sequence of str
            Surface names. [-]

        Returns
        -------
        MeshEstimate
            With the observed order; where it is not near the scheme's order 2 the basis
            says so and why (singular corners), and the error bound uses the observed
            order.

        References
        ----------
        [source: roache-1998].
        """
        names = _names(surfaces, self.heat_flows, "surface_mesh_estimate")
        meshes = self._meshes
        quantity = "heat flow through " + ", ".join(quote(n) for n in names) + " [W/m]"
        if meshes.get("refused"):
            q = math.fsum(self.heat_flows[n] for n in names)
            return MeshEstimate(quantity, q, q, 2.0, math.nan, q, math.nan, (), (),
                                f"not estimated: {meshes['refused']}")
        values = [math.fsum(f[n] for n in names) for f in meshes["flows"]]
        est = three_mesh_estimate(quantity, meshes["cells"], values, reported=1)
        return dataclasses.replace(est, basis=est.basis + _order_note(est.order))


def _order_note(order: float) -> str:
    if math.isnan(order):
        return ""
    if abs(order - 2.0) <= ORDER_SLACK:
        return f" (observed order {order:.2f}, near the scheme's formal 2)"
    return (f" (observed order {order:.2f}, not the scheme's formal 2: singular points such "
            "as material corners, re-entrant corners or a jump of surface temperature slow "
            "the convergence; the error bound uses the observed order)")

