"""Cell-centred finite volumes of a 2-D section: the grid, the sparse system and its solve.

Every block between grid lines is cut into an even number of equal cells per direction, no
wider than ``max_cell``. Each cell balances the heat through its four faces:

    sum_f G_f (T_nb - T_P) + sum_b G_b (T_amb,b - T_P) = 0
    G_f = l_f / (d_P / (2 k_P) + d_nb / (2 k_nb))          interior face [W/(m K)]
    G_b = l_b / (d_P / (2 k_P) + R_s)                      face on a surface [W/(m K)]

with ``l_f`` the face length, ``d`` the cell widths across the face and ``R_s`` the surface
resistance (0 for a fixed surface temperature); faces on the outline without a surface are
adiabatic. The matrix is symmetric positive definite; it is assembled at once from numpy
arrays (no loop over cells) as a ``scipy.sparse`` CSC matrix, factorised by SuperLU with a
minimum-degree ordering of ``A + A^T`` up to :data:`DIRECT_MAX_CELLS` cells and solved by
conjugate gradients above, preconditioned by the tridiagonal part along the grid rows.

Sources: [source: patankar-1980, ch. 4]; direct solve [source: superlu, 2005]; conjugate
gradients [source: saad-2003, 6.7, 9.2
and 10.2].
"""

from __future__ import annotations

import math

import numpy as np

from ..errors import HeatLedgerError
from ..mesh_estimates import REFINE_BELOW
from .geometry import Blocks

__all__ = ["Grid", "DIRECT_MAX_CELLS", "MAX_CELLS_2D", "CG_RTOL"]

#: Most cells solved directly (SuperLU). Measured with EN ISO 10211 case 2 on this
#: project's 2-core, 24 GiB build machine: 1.5 million cells in 13 s with 2.3 GB at peak,
#: 3.1 million in 49 s with 4.8 GB, 6.1 million in 124 s with 10.0 GB, 7.9 million in 168 s
#: with 13.2 GB; the factors grow a little faster than the cells, so 8 million keeps the
#: peak near 14 GB. common practice, no published source
DIRECT_MAX_CELLS = 8_000_000
#: Most cells of one grid. Above DIRECT_MAX_CELLS, conjugate gradients hold about 350 bytes
#: a cell (0.53 GB at peak for 1.5 million cells, so about 4 GB at 12 million) but are slow:
#: case 2 at 1.5 million cells took 8,021 iterations and 316 s on the same machine (its heat
#: flow within 4e-6 of the direct solve's), and both the iterations and their cost grow with
#: the cells, so 12 million would take about two hours. common practice, no published source
MAX_CELLS_2D = 12_000_000
#: Relative residual at which conjugate gradients stop; the energy balance of the result
#: shows what is left (about 1e-11 relative in the tests). [-]
CG_RTOL = 1e-12
#: Most conjugate-gradient iterations before the solve is given up. [-]
CG_MAX_ITERATIONS = 200_000
#: Most refinement steps of a direct solve (as in the 1-D engine).
MAX_REFINEMENTS = 2


def _edges(lines: np.ndarray, counts: np.ndarray) -> np.ndarray:
    """Cell edges: ``counts[i]`` equal cells between ``lines[i]`` and ``lines[i + 1]``. [m]"""
    parts = [np.linspace(lines[i], lines[i + 1], int(c) + 1)[:-1] for i, c in enumerate(counts)]
    return np.concatenate(parts + [lines[-1:]])


class Grid:
    """The rectilinear cell grid of a section and its finite-volume system.

    Parameters
    ----------
    blocks : Blocks
        The checked section cut at its grid lines. [-]
    counts_x, counts_y : ndarray
        Cells between successive grid lines in x and y. [-]

    Attributes
    ----------
    xe, ye : ndarray
        Cell edges. [m]
    conductivity : ndarray
        Conductivity of every cell, ``(ny, nx)``, 0 where there is no material. [W/(m K)]
    index : ndarray
        Unknown number of every cell, -1 where there is no material. [-]
    cells : int
        Cells with material (unknowns). [-]

    References
    ----------
    [source: patankar-1980, ch. 4 (harmonic face conductance)].
    """

    def __init__(self, blocks: Blocks, counts_x, counts_y) -> None:
        self.blocks = blocks
        self.counts_x = np.asarray(counts_x, dtype=np.int64)
        self.counts_y = np.asarray(counts_y, dtype=np.int64)
        self.xe = _edges(blocks.xs, self.counts_x)
        self.ye = _edges(blocks.ys, self.counts_y)
        self.dx, self.dy = np.diff(self.xe), np.diff(self.ye)
        self.line_x = np.concatenate(([0], np.cumsum(self.counts_x)))
        self.line_y = np.concatenate(([0], np.cumsum(self.counts_y)))
        k_region = np.array([r.conductivity for r in blocks.regions] + [0.0])
        k_block = k_region[blocks.owner]  # owner -1 picks the 0 at the end
        bx = np.repeat(np.arange(self.counts_x.size), self.counts_x)
        by = np.repeat(np.arange(self.counts_y.size), self.counts_y)
        self.conductivity = k_block[np.ix_(by, bx)]
        self.active = self.conductivity > 0.0
        self.cells = int(np.count_nonzero(self.active))
        self.index = np.full(self.active.shape, -1, dtype=np.int64)
        self.index[self.active] = np.arange(self.cells)

    # ------------------------------------------------------------------ assembly
    def interior_faces(self):
        """Pairs of neighbouring cells and their face conductances, x faces then y faces:
        ``(first, second, conductance)`` arrays. [-, -, W/(m K)]"""
        k, act, idx = self.conductivity, self.active, self.index
        with np.errstate(divide="ignore"):
            hx = self.dx[None, :] / (2.0 * k)  # half-cell resistances across x [m2 K/W]
            hy = self.dy[:, None] / (2.0 * k)
        both = act[:, :-1] & act[:, 1:]
        gx = (self.dy[:, None] / (hx[:, :-1] + hx[:, 1:]))[both]
        ax, bx = idx[:, :-1][both], idx[:, 1:][both]
        both = act[:-1, :] & act[1:, :]
        gy = (self.dx[None, :] / (hy[:-1, :] + hy[1:, :]))[both]
        ay, by = idx[:-1, :][both], idx[1:, :][both]
        return np.concatenate((ax, ay)), np.concatenate((bx, by)), np.concatenate((gx, gy))

    def boundary_faces(self):
        """Every cell face on a surface, as a dict of arrays: ``cell`` (unknown number),
        ``row``, ``col``, ``surface`` (index), ``conductance`` G_b [W/(m K)], ``half``
        (half-cell resistance [m2 K/W]), ``axis`` (0: face normal along y), ``side`` (+1: the
        body on the side of increasing coordinate), ``x``, ``y`` (face middle [m])."""
        parts = []
        for s_i, (surf, (axis, line, first, last, side)) in enumerate(
                zip(self.blocks.surfaces, self.blocks.faces, strict=True)):
            if axis == 0:
                along, cross, counts = self.line_x, self.line_y, self.counts_x
            else:
                along, cross, counts = self.line_y, self.line_x, self.counts_y
            pos = np.arange(along[first], along[last])
            fside = np.repeat(side, counts[first:last])
            across = np.where(fside > 0, cross[line], cross[line] - 1)
            row, col = (across, pos) if axis == 0 else (pos, across)
            length = self.dx[col] if axis == 0 else self.dy[row]
            width = self.dy[row] if axis == 0 else self.dx[col]
            half = width / (2.0 * self.conductivity[row, col])
            line_at = self.ye[cross[line]] if axis == 0 else self.xe[cross[line]]
            mid = 0.5 * ((self.xe[col] + self.xe[col + 1]) if axis == 0
                         else (self.ye[row] + self.ye[row + 1]))
            parts.append(dict(
                cell=self.index[row, col], row=row, col=col,
                surface=np.full(pos.size, s_i), conductance=length / (half + surf.resistance),
                half=half, axis=np.full(pos.size, axis), side=fside,
                x=mid if axis == 0 else np.full(pos.size, line_at),
                y=np.full(pos.size, line_at) if axis == 0 else mid))
        return {key: np.concatenate([p[key] for p in parts]) for key in parts[0]}

    def system(self):
        """The sparse matrix (CSC), the right-hand side, the interior faces and the boundary
        faces of the finite-volume equations. [W/(m K)], [W/m]"""
        from scipy import sparse

        first, second, g = self.interior_faces()
        bnd = self.boundary_faces()
        amb = np.array([s.temperature for s in self.blocks.surfaces])[bnd["surface"]]
        n = self.cells
        diag = (np.bincount(first, g, n) + np.bincount(second, g, n)
                + np.bincount(bnd["cell"], bnd["conductance"], n))
        rhs = np.bincount(bnd["cell"], bnd["conductance"] * amb, n)
        rows = np.concatenate((first, second, np.arange(n)))
        cols = np.concatenate((second, first, np.arange(n)))
        data = np.concatenate((-g, -g, diag))
        matrix = sparse.csc_matrix((data, (rows, cols)), shape=(n, n))
        return matrix, rhs, (first, second, g), bnd, amb


def flux_residual(temp, faces, bnd, amb) -> np.ndarray:
    """Heat balance of every cell in flux form (temperature differences first, so close
    values keep their digits). [W/m]

    Parameters
    ----------
    temp : ndarray
        Cell temperatures. [degC]
    faces : tuple of ndarray
        Interior faces ``(first, second, conductance)`` as from :meth:`Grid.interior_faces`.
        [-]
    bnd : dict
        Boundary faces as from :meth:`Grid.boundary_faces`. [-]
    amb : ndarray
        Ambient temperature of every boundary face. [degC]
    """
    first, second, g = faces
    n = temp.size
    flow = g * (temp[first] - temp[second])
    gain = bnd["conductance"] * (amb - temp[bnd["cell"]])
    return np.bincount(second, flow, n) - np.bincount(first, flow, n) + \
        np.bincount(bnd["cell"], gain, n)


def balanced(temp, bnd, amb) -> bool:
    """True when the heat flows through the surfaces balance to ``REFINE_BELOW`` of the heat
    flow through the section (half the sum of their magnitudes). [-]

    Parameters
    ----------
    temp : ndarray
        Cell temperatures. [degC]
    bnd : dict
        Boundary faces (see :meth:`Grid.boundary_faces`). [-]
    amb : ndarray
        Ambient temperature of every boundary face. [degC]
    """
    gain = bnd["conductance"] * (amb - temp[bnd["cell"]])
    return abs(math.fsum(gain)) <= REFINE_BELOW * 0.5 * float(np.abs(gain).sum())


def solve_system(matrix, rhs, faces, bnd, amb) -> tuple[np.ndarray, str, int]:
    """Solve the finite-volume system: SuperLU up to :data:`DIRECT_MAX_CELLS` cells, with up
    to two refinement steps from the flux-form residual; conjugate gradients preconditioned by
    the tridiagonal part along the grid rows above. Returns ``(temperatures, solver,
    steps)``. [degC, -, -]

    Parameters
    ----------
    matrix : scipy.sparse.csc_matrix
        The symmetric positive definite matrix. [W/(m K)]
    rhs : ndarray
        Right-hand side. [W/m]
    faces, bnd, amb : tuple, dict, ndarray
        Interior faces, boundary faces and ambient temperatures (for the residual). [-]
    """
    from scipy.sparse import linalg

    n = rhs.size
    if n <= DIRECT_MAX_CELLS:
        lu = linalg.splu(matrix, permc_spec="MMD_AT_PLUS_A")
        temp = lu.solve(rhs)
        steps = 0
        while steps < MAX_REFINEMENTS and not balanced(temp, bnd, amb):
            temp += lu.solve(flux_residual(temp, faces, bnd, amb))
            steps += 1
        return temp, "direct (SuperLU, minimum-degree ordering of A + A^T)", steps
    precond = _row_preconditioner(matrix.diagonal(), faces, linalg)
    counter = {"iterations": 0}

    def count(_):
        counter["iterations"] += 1

    temp, info = linalg.cg(matrix, rhs, rtol=CG_RTOL, maxiter=CG_MAX_ITERATIONS, M=precond,
                           callback=count)
    if info != 0:
        raise HeatLedgerError(
            f"the iterative solver did not converge on {n:,} cells in {counter['iterations']:,} "
            f"iterations; use a larger max_cell (up to {DIRECT_MAX_CELLS:,} cells are solved "
            "directly)")
    return temp, "iterative (conjugate gradients, line preconditioner along grid rows)", \
        counter["iterations"]


def _row_preconditioner(diag, faces, linalg):
    """Line-Jacobi preconditioner: the matrix with only its couplings along grid rows (x
    faces), a symmetric positive definite tridiagonal matrix factorised once by LAPACK
    ``?pttrf`` and applied by ``?pttrs`` (one O(n) sweep per iteration). [-]"""
    from scipy.linalg import lapack

    first, second, g = faces
    n = diag.size
    off = np.zeros(max(n - 1, 0))
    along = second - first == 1  # neighbours along a row have consecutive numbers
    off[first[along]] = -g[along]
    d, e, info = lapack.dpttrf(diag.copy(), off)
    if info != 0:
        raise HeatLedgerError(f"the finite-volume system is singular (LAPACK pttrf "
                              f"info={info})")

    def apply(v):
        x, _ = lapack.dpttrs(d, e, v)
        return x

    return linalg.LinearOperator((n, n), matvec=apply, dtype=float)
