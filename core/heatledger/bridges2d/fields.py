"""Temperatures between cell centres: face temperatures and the reconstruction used for
``temperature_at``.

Face temperatures follow from the flux through each face (Patankar 1980, ch. 4):

- interior face between cells P and N: ``T_f = (T_P/R_P + T_N/R_N) / (1/R_P + 1/R_N)`` with
  the half-cell resistances ``R = d/(2 k)`` (the flux balance of the two half cells, so the
  temperature is continuous and the flux too);
- face on a surface: ``T_f = T_P + (T_amb - T_P) R_P / (R_P + R_s)`` (the surface temperature
  extrapolated through the boundary face from the face flux);
- adiabatic face: ``T_f = T_P`` (no normal gradient).

Inside a cell the temperature is linear from the centre to each face middle, separately in x
and y: ``T = T_P + (x - x_P)/(d_x/2) (T_e - T_P) + (y - y_P)/(d_y/2) (T_n - T_P)`` with
``T_e`` the east face for a point east of the centre (the west face otherwise), ``T_n`` the
same in y. This is exact for a field linear in each cell. A point on a cell edge or corner
(a material junction, the outline) takes the mean of the values of every cell of material
that touches it, weighted by the cells' conductivities: the weighting of the face temperature
above for cells of equal size, so at a junction of aluminium and insulation the metal, whose
temperature is nearly uniform, sets the value.

Sources: [source: patankar-1980, ch. 4].
"""

from __future__ import annotations

import numpy as np

from ..errors import HeatLedgerError
from .geometry import SNAP

__all__ = ["FaceTemperatures"]


class FaceTemperatures:
    """Temperatures at the middle of the four faces of every cell, and the reconstruction
    of the temperature at any point of the body.

    Parameters
    ----------
    grid : Grid
        The cell grid. [-]
    temp : ndarray
        Cell temperatures, one per cell of material. [degC]
    bnd : dict
        Boundary faces on surfaces (see ``Grid.boundary_faces``). [-]
    amb : ndarray
        Ambient temperature of every boundary face. [degC]

    References
    ----------
    [source: patankar-1980, ch. 4 (face temperatures from the half-cell resistances)].
    """

    def __init__(self, grid, temp, bnd, amb) -> None:
        self.grid = grid
        t = np.full(grid.active.shape, np.nan)
        t[grid.active] = temp
        self.cell = t
        k = grid.conductivity
        with np.errstate(divide="ignore", invalid="ignore"):
            cx = 2.0 * k / grid.dx[None, :]  # half-cell conductances [W/(m2 K)]
            cy = 2.0 * k / grid.dy[:, None]
            # adiabatic by default; interior faces from the flux balance of the half cells
            west, east, south, north = t.copy(), t.copy(), t.copy(), t.copy()
            both = grid.active[:, :-1] & grid.active[:, 1:]
            tf = (t[:, :-1] * cx[:, :-1] + t[:, 1:] * cx[:, 1:]) / (cx[:, :-1] + cx[:, 1:])
            east[:, :-1][both] = tf[both]
            west[:, 1:][both] = tf[both]
            both = grid.active[:-1, :] & grid.active[1:, :]
            tf = (t[:-1, :] * cy[:-1, :] + t[1:, :] * cy[1:, :]) / (cy[:-1, :] + cy[1:, :])
            north[:-1, :][both] = tf[both]
            south[1:, :][both] = tf[both]
        resist = np.array([s.resistance for s in grid.blocks.surfaces])[bnd["surface"]]
        tc = temp[bnd["cell"]]
        surf = tc + (amb - tc) * bnd["half"] / (bnd["half"] + resist)
        self.surface = surf
        r, c = bnd["row"], bnd["col"]
        for axis, side, target in ((0, 1, south), (0, -1, north), (1, 1, west), (1, -1, east)):
            sel = (bnd["axis"] == axis) & (bnd["side"] == side)
            target[r[sel], c[sel]] = surf[sel]
        self.west, self.east, self.south, self.north = west, east, south, north

    def at(self, x, y) -> np.ndarray:
        """Temperature at points of the body (interior, material junctions, outline).

        Parameters
        ----------
        x, y : array_like
            Coordinates of the points. [m]

        Returns
        -------
        ndarray
            Temperatures. [degC]
        """
        g = self.grid
        px = np.atleast_1d(np.asarray(x, dtype=float))
        py = np.atleast_1d(np.asarray(y, dtype=float))
        total = np.zeros(px.shape)
        count = np.zeros(px.shape)
        nx, ny = g.dx.size, g.dy.size
        # the cells whose closed rectangle holds the point: up to two columns and two rows
        cols = (np.searchsorted(g.xe, px - SNAP, "left") - 1,
                np.searchsorted(g.xe, px + SNAP, "right") - 1)
        rows = (np.searchsorted(g.ye, py - SNAP, "left") - 1,
                np.searchsorted(g.ye, py + SNAP, "right") - 1)
        for ci in {0, 1}:
            for ri in {0, 1}:
                c, r = cols[ci], rows[ri]
                ok = (c >= 0) & (c < nx) & (r >= 0) & (r < ny)
                if ci == 1:
                    ok &= cols[1] != cols[0]
                if ri == 1:
                    ok &= rows[1] != rows[0]
                c, r = np.clip(c, 0, nx - 1), np.clip(r, 0, ny - 1)
                ok &= g.active[r, c]
                value = self._inside(r, c, px, py)
                weight = np.where(ok, g.conductivity[r, c], 0.0)
                total += np.where(ok, value, 0.0) * weight
                count += weight
        if not count.all():
            i = int(np.flatnonzero(count == 0)[0])
            raise HeatLedgerError(
                f"the point ({px[i]:g}, {py[i]:g}) m is not in the body of the section (no "
                "material there or on its edge); ask for temperatures inside the regions or "
                "on their outline")
        return total / count

    def _inside(self, r, c, px, py) -> np.ndarray:
        """Linear-per-half reconstruction in cell ``(r, c)`` at ``(px, py)``. [degC]"""
        g = self.grid
        xc = 0.5 * (g.xe[c] + g.xe[c + 1])
        yc = 0.5 * (g.ye[r] + g.ye[r + 1])
        t = self.cell[r, c]
        sx = np.clip((px - xc) / (0.5 * g.dx[c]), -1.0, 1.0)
        sy = np.clip((py - yc) / (0.5 * g.dy[r]), -1.0, 1.0)
        tx = np.where(sx >= 0.0, self.east[r, c] - t, t - self.west[r, c])
        ty = np.where(sy >= 0.0, self.north[r, c] - t, t - self.south[r, c])
        return t + sx * tx + sy * ty
