"""A 2-D section of a thermal bridge and its steady-state solve (EN ISO 10211).

Sources: [source: iso10211-method, 5 and 6]; discretisation [source: patankar-1980, ch. 4].
"""

from __future__ import annotations

import math

import numpy as np

from ..errors import HeatLedgerError
from .geometry import Blocks, _check_max_cell, _spacing_counts
from .mesh import MAX_CELLS_2D, Grid, solve_system
from .results import Section2DResult

__all__ = ["Section2D"]


class Section2D:
    """A 2-D section: regions of material and the surfaces of its outline.

    Parameters
    ----------
    regions : sequence of Region
        Material rectangles; later ones overlay earlier ones. They must form one connected
        body (touching along an edge, not only at a corner). [-]
    surfaces : sequence of Surface
        Pieces of the outline with an ambient temperature and a surface resistance; the
        rest of the outline is adiabatic (a cut or a symmetry line). At least two
        different ambient temperatures. [-]

    Raises
    ------
    HeatLedgerError
        If the regions are not one body, a surface is not on the outline, two surfaces
        overlap or share a name, or all ambient temperatures are equal.

    Notes
    -----
    Steady 2-D conduction ``div(lambda grad T) = 0`` with ``q = (T_amb - T_s)/R_s`` on each
    surface, solved by cell-centred finite volumes (see ``heatledger.bridges2d.mesh``).

    References
    ----------
    [source: iso10211-method, 5 (modelling) and 6 (boundary conditions)];
    [source: iso10211-validation, Annex A (test reference cases 1 and 2)].
    """

    def __init__(self, regions, surfaces) -> None:
        self.blocks = Blocks(regions, surfaces)

    @property
    def regions(self) -> tuple:
        """The regions, in overlay order. [-]"""
        return self.blocks.regions

    @property
    def surfaces(self) -> tuple:
        """The surfaces. [-]"""
        return self.blocks.surfaces

    def cells_for(self, max_cell=0.005) -> int:
        """Cells of material on the grid for ``max_cell``, without solving. [-]

        Parameters
        ----------
        max_cell : float
            Largest cell edge. [m]
        """
        m = _check_max_cell(max_cell)
        return _active_cells(self.blocks, _spacing_counts(self.blocks.xs, m),
                             _spacing_counts(self.blocks.ys, m))

    def solve(self, max_cell=0.005) -> Section2DResult:
        """Solve the section on a grid of cells no larger than ``max_cell``.

        Parameters
        ----------
        max_cell : float
            Largest cell edge; every block between grid lines gets an even number (at least
            two) of equal cells in each direction, so a grid may be finer. [m]

        Returns
        -------
        Section2DResult

        Raises
        ------
        HeatLedgerError
            If the grid would have more than ``MAX_CELLS_2D`` cells (the message gives a
            max_cell that fits).

        References
        ----------
        [source: iso10211-method, 5.3 (grid and convergence)].
        """
        m = _check_max_cell(max_cell)
        cx = _spacing_counts(self.blocks.xs, m)
        cy = _spacing_counts(self.blocks.ys, m)
        cells = _active_cells(self.blocks, cx, cy)
        if cells > MAX_CELLS_2D:
            hint = m * math.sqrt(cells / MAX_CELLS_2D) * 1.1
            raise HeatLedgerError(
                f"max_cell = {m:g} m gives {cells:,} cells, above the limit of "
                f"{MAX_CELLS_2D:,} cells (memory and time of the solve); use a larger "
                f"max_cell, about {hint:.2g} m or more")
        return Section2DResult(_solve(self.blocks, cx, cy, m))


def _active_cells(blocks: Blocks, cx, cy) -> int:
    per_block = np.outer(np.asarray(cy, dtype=np.int64), np.asarray(cx, dtype=np.int64))
    return int(per_block[blocks.owner >= 0].sum())


def _solve(blocks: Blocks, cx, cy, max_cell: float) -> dict:
    """Assemble and solve on the grid of ``cx`` by ``cy`` cells per block; the record keeps
    how to re-solve on the halved and doubled grids for the mesh estimate."""
    grid = Grid(blocks, cx, cy)
    matrix, rhs, faces, bnd, amb = grid.system()
    temp, solver, steps = solve_system(matrix, rhs, faces, bnd, amb)
    gain = bnd["conductance"] * (amb - temp[bnd["cell"]])
    flows = np.bincount(bnd["surface"], gain, len(blocks.surfaces))

    def remesh() -> dict:
        fine = _active_cells(blocks, 2 * cx, 2 * cy)
        if fine > MAX_CELLS_2D:
            return {"refused": f"the halved grid would have {fine:,} cells, above the limit "
                               f"of {MAX_CELLS_2D:,}; solve with a larger max_cell to have "
                               "the estimate"}
        names = [s.name for s in blocks.surfaces]
        out = {"cells": [], "flows": []}
        for which in ("coarse", "reported", "fine"):
            if which == "reported":
                cells, found = grid.cells, flows
            else:
                fx, fy = (cx // 2, cy // 2) if which == "coarse" else (2 * cx, 2 * cy)
                rec = _solve(blocks, fx, fy, max_cell)
                cells, found = rec["grid"].cells, rec["flows"]
            out["cells"].append(cells)
            out["flows"].append(dict(zip(names, found, strict=True)))
        return out

    return {"grid": grid, "temp": temp, "solver": solver, "steps": steps, "bnd": bnd,
            "amb": amb, "flows": flows, "max_cell": max_cell, "remesh": remesh}
