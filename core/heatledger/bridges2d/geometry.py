"""Geometry of a 2-D section: material rectangles, boundary surfaces and their checks.

A section is a set of axis-aligned rectangles of material (later ones overlay earlier ones)
and straight pieces of its outline that exchange heat with an ambient. The grid lines of
every rectangle edge and surface end cut the bounding box into *blocks*; every check here is
made on the blocks, so it is exact for the geometry and independent of the cell size.

Sources: [source: iso10211-method, 5.2 and 5.3].
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from .._validate import LIMITS, finite, non_negative, positive, quote, within
from ..errors import HeatLedgerError

__all__ = ["Region", "Surface", "Blocks", "SNAP"]

#: Coordinates closer than this are the same grid line (1 nm: far below any drawing's
#: precision, far above the rounding of a coordinate in metres). [m]
#: common practice, no published source
SNAP = 1e-9


def _coordinate(label: str, name: str, value) -> float:
    out = finite(f"{label} {name}", value)
    if abs(out) > LIMITS["length"].high:
        raise HeatLedgerError(f"{label} {name} must be within {LIMITS['length'].high:g} m of "
                              f"the origin (coordinates are in metres); got {out:g} m")
    return out


def _label(kind: str, name: str) -> str:
    return f"{kind} {quote(name)}" if name else kind


@dataclass(frozen=True)
class Region:
    """An axis-aligned rectangle of one material; a later region overlays earlier ones.

    Parameters
    ----------
    x0, y0, x1, y1 : float
        Opposite corners of the rectangle (either order). [m]
    conductivity : float
        Design thermal conductivity of the material. [W/(m K)]
    name : str
        Label for messages and tables. [-]

    Raises
    ------
    HeatLedgerError
        If a coordinate is not finite, the rectangle has zero width or height, or the
        conductivity is not positive or is beyond the physical limits.

    References
    ----------
    [source: iso10211-method, 5.2 (geometrical model)].
    """

    x0: float
    y0: float
    x1: float
    y1: float
    conductivity: float
    name: str = ""

    def __init__(self, x0, y0, x1, y1, conductivity, *, name: str = "") -> None:
        label = _label("region", str(name))
        xa, xb = sorted((_coordinate(label, "x0", x0), _coordinate(label, "x1", x1)))
        ya, yb = sorted((_coordinate(label, "y0", y0), _coordinate(label, "y1", y1)))
        for axis, low, high in (("width x1 - x0", xa, xb), ("height y1 - y0", ya, yb)):
            if high - low <= SNAP:
                raise HeatLedgerError(
                    f"{label} has zero {axis} ({low:g} m to {high:g} m); a region is a "
                    "rectangle of material with a width and a height")
        k = positive(f"{label} conductivity", conductivity, "W/(m K)")
        k = within(f"{label} conductivity", k, "conductivity")
        for attr, value in (("x0", xa), ("y0", ya), ("x1", xb), ("y1", yb),
                            ("conductivity", k), ("name", str(name))):
            object.__setattr__(self, attr, value)


@dataclass(frozen=True)
class Surface:
    """A straight piece of the outline that exchanges heat with an ambient.

    Parameters
    ----------
    x0, y0, x1, y1 : float
        End points; the piece is horizontal (``y0 == y1``) or vertical (``x0 == x1``). [m]
    temperature : float
        Ambient temperature (the surface temperature where ``resistance`` is 0). [degC]
    resistance : float
        Surface resistance between the outline and the ambient; 0 fixes the surface
        temperature. [m2 K/W]
    name : str
        Name of the surface, unique in a section (``heat_flow(name)``). [-]

    Raises
    ------
    HeatLedgerError
        If the name is empty, the piece is slanted or of zero length, or the temperature or
        resistance is beyond the physical limits.

    References
    ----------
    [source: iso10211-method, 6 (boundary conditions)].
    """

    x0: float
    y0: float
    x1: float
    y1: float
    temperature: float
    resistance: float
    name: str

    def __init__(self, x0, y0, x1, y1, *, temperature, resistance, name: str) -> None:
        if not str(name).strip():
            raise HeatLedgerError("every surface needs a name (heat flows are reported by "
                                  "surface name); got an empty name")
        label = _label("surface", str(name))
        xs = sorted((_coordinate(label, "x0", x0), _coordinate(label, "x1", x1)))
        ys = sorted((_coordinate(label, "y0", y0), _coordinate(label, "y1", y1)))
        dx, dy = xs[1] - xs[0], ys[1] - ys[0]
        if dx > SNAP and dy > SNAP:
            raise HeatLedgerError(
                f"{label} from ({x0:g}, {y0:g}) to ({x1:g}, {y1:g}) m is slanted; a surface "
                "is a horizontal (y0 = y1) or vertical (x0 = x1) piece of the outline")
        if dx <= SNAP and dy <= SNAP:
            raise HeatLedgerError(f"{label} has zero length (from ({x0:g}, {y0:g}) to "
                                  f"({x1:g}, {y1:g}) m); a surface needs two distinct ends")
        temp = within(f"{label} temperature", temperature, "temperature")
        res = within(f"{label} resistance",
                     non_negative(f"{label} resistance", resistance, "m2 K/W"),
                     "surface_resistance")
        for attr, value in (("x0", xs[0]), ("y0", ys[0]), ("x1", xs[1]), ("y1", ys[1]),
                            ("temperature", temp), ("resistance", res), ("name", str(name))):
            object.__setattr__(self, attr, value)

    @property
    def horizontal(self) -> bool:
        """True for a horizontal piece (constant y). [-]"""
        return self.y1 - self.y0 <= SNAP

    @property
    def length(self) -> float:
        """Length of the piece. [m]"""
        return max(self.x1 - self.x0, self.y1 - self.y0)


def _lines(values) -> np.ndarray:
    """Sorted grid-line coordinates, values closer than :data:`SNAP` merged. [m]"""
    v = np.unique(np.asarray(values, dtype=float))
    keep = np.ones(v.size, dtype=bool)
    keep[1:] = np.diff(v) > SNAP
    return v[keep]


def _index(lines: np.ndarray, value: float) -> int:
    """Index of the grid line at ``value`` (within :data:`SNAP`). [-]"""
    i = int(np.searchsorted(lines, value - SNAP))
    return min(i, lines.size - 1)


class Blocks:
    """The section cut into blocks by its grid lines, with the checks of a valid section.

    Parameters
    ----------
    regions : sequence of Region
        Material rectangles, later ones overlaying earlier ones. [-]
    surfaces : sequence of Surface
        Pieces of the outline with an ambient; the rest of the outline is adiabatic. [-]

    Attributes
    ----------
    xs, ys : ndarray
        Grid lines: every region edge and surface end. [m]
    owner : ndarray
        Region index of every block, ``(len(ys) - 1, len(xs) - 1)``; -1 where no material. [-]
    faces : list of tuple
        Per surface: ``(axis, line, first, last, side)``, the blocks ``first..last - 1``
        along grid line ``line`` (``axis`` 0 for a horizontal surface), ``side`` per block +1
        where the body lies on the side of increasing coordinate, else -1. [-]

    Raises
    ------
    HeatLedgerError
        If the regions do not form one connected body, a surface does not lie on the
        outline, two surfaces overlap or share a name, or fewer than two ambient
        temperatures drive a heat flow.

    References
    ----------
    [source: iso10211-method, 5.2 (geometrical model) and 6 (boundary conditions)].
    """

    def __init__(self, regions, surfaces) -> None:
        self.regions = tuple(regions)
        self.surfaces = tuple(surfaces)
        _check_kinds(self.regions, self.surfaces)
        coords_x = [c for r in self.regions for c in (r.x0, r.x1)]
        coords_y = [c for r in self.regions for c in (r.y0, r.y1)]
        coords_x += [c for s in self.surfaces for c in (s.x0, s.x1)]
        coords_y += [c for s in self.surfaces for c in (s.y0, s.y1)]
        self.xs, self.ys = _lines(coords_x), _lines(coords_y)
        owner = np.full((self.ys.size - 1, self.xs.size - 1), -1, dtype=np.int64)
        for i, r in enumerate(self.regions):  # one slice per region, not per cell
            owner[_index(self.ys, r.y0):_index(self.ys, r.y1),
                  _index(self.xs, r.x0):_index(self.xs, r.x1)] = i
        self.owner = owner
        self._check_connected()
        self.faces = self._surface_faces()

    def _check_connected(self) -> None:
        from scipy import ndimage

        labels, count = ndimage.label(self.owner >= 0)  # 4-connected: corners do not join
        if count <= 1:
            return
        groups = []
        for part in range(1, count + 1):
            idx = sorted(set(self.owner[labels == part].tolist()))
            groups.append(", ".join(_label("region", self.regions[i].name) + f" (number "
                                    f"{i + 1})" for i in idx))
        raise HeatLedgerError(
            f"the regions do not form one connected body: they fall into {count} separate "
            f"parts ({'; '.join(groups)}), split by a gap or touching only at a corner; a "
            "section is one body: close the gap with a region of the material between them "
            "(an air cavity as a region of its equivalent conductivity) or solve the parts "
            "as separate sections")

    def _surface_faces(self) -> list:
        taken: dict = {}
        out = []
        for s in self.surfaces:
            label = _label("surface", s.name)
            if s.horizontal:
                axis, line = 0, _index(self.ys, s.y0)
                first, last = _index(self.xs, s.x0), _index(self.xs, s.x1)
                ny = self.owner.shape[0]
                below = self.owner[line - 1, first:last] if line > 0 else None
                above = self.owner[line, first:last] if line < ny else None
            else:
                axis, line = 1, _index(self.xs, s.x0)
                first, last = _index(self.ys, s.y0), _index(self.ys, s.y1)
                nx = self.owner.shape[1]
                below = self.owner[first:last, line - 1] if line > 0 else None
                above = self.owner[first:last, line] if line < nx else None
            lo = below >= 0 if below is not None else np.zeros(last - first, dtype=bool)
            hi = above >= 0 if above is not None else np.zeros(last - first, dtype=bool)
            bad = np.flatnonzero(lo == hi)
            if bad.size:
                j = int(bad[0])
                where = self._point(axis, line, first + j)
                state = "material on both sides" if (lo[j] and hi[j]) else "no material"
                raise HeatLedgerError(
                    f"{label} does not lie on the outline of the body: near ({where[0]:g}, "
                    f"{where[1]:g}) m it has {state}; a surface must run along the edge of "
                    "the body, with material on one side and none on the other, over its "
                    "whole length")
            for b in range(first, last):
                other = taken.setdefault((axis, line, b), s.name)
                if other != s.name:
                    where = self._point(axis, line, b)
                    raise HeatLedgerError(
                        f"{label} overlaps {_label('surface', other)} near ({where[0]:g}, "
                        f"{where[1]:g}) m; each piece of the outline has at most one surface")
            out.append((axis, line, first, last, np.where(hi, 1, -1)))
        return out

    def _point(self, axis: int, line: int, block: int) -> tuple[float, float]:
        """Middle of block ``block`` along grid line ``line``. [m]"""
        if axis == 0:
            return 0.5 * (self.xs[block] + self.xs[block + 1]), float(self.ys[line])
        return float(self.xs[line]), 0.5 * (self.ys[block] + self.ys[block + 1])


def _check_kinds(regions, surfaces) -> None:
    """Types, names and the two ambient temperatures a heat flow needs."""
    if not regions:
        raise HeatLedgerError("a section needs at least one region of material; got none")
    for i, r in enumerate(regions):
        if not isinstance(r, Region):
            raise HeatLedgerError(f"regions[{i}] must be a Region; got a "
                                  f"{type(r).__name__} object")
    seen = set()
    for i, s in enumerate(surfaces):
        if not isinstance(s, Surface):
            raise HeatLedgerError(f"surfaces[{i}] must be a Surface; got a "
                                  f"{type(s).__name__} object")
        if s.name in seen:
            raise HeatLedgerError(f"two surfaces are named {quote(s.name)}; surface names "
                                  "must be unique (heat flows are reported by name)")
        seen.add(s.name)
    temps = sorted({s.temperature for s in surfaces})
    if len(temps) < 2:
        got = "no surfaces" if not temps else (
            f"every surface has the ambient temperature {temps[0]:g} degC")
        raise HeatLedgerError(
            f"a section needs at least two surfaces with different ambient temperatures to "
            f"drive a heat flow; got {got}")


def _spacing_counts(lines: np.ndarray, max_cell: float) -> np.ndarray:
    """Cells between successive grid lines: an even number, at least two, each cell at most
    ``max_cell`` wide, so that the mesh with every second line removed is exactly twice as
    coarse. [-]

    Parameters
    ----------
    lines : ndarray
        Grid-line coordinates. [m]
    max_cell : float
        Largest cell edge. [m]
    """
    gaps = np.diff(lines)
    return 2 * np.maximum(1, np.ceil(gaps / (2.0 * max_cell) - 1e-12).astype(np.int64))


def _check_max_cell(max_cell) -> float:
    """``max_cell`` as a positive finite float. [m]

    Parameters
    ----------
    max_cell : float
        Largest cell edge. [m]
    """
    out = positive("max_cell", max_cell, "m")
    if not math.isfinite(out):
        raise HeatLedgerError(f"max_cell must be finite; got {out:g} m")
    return out
