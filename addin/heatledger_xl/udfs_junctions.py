"""Spreadsheet functions of the thermal-bridge family (EN ISO 10211).

- ``HL_PSI(regions, surfaces, flanking, max_cell_mm, dimensions)``: psi of a 2-D section
  drawn as ranges [W/(m K)].
- ``HL_FRSI_2D(regions, surfaces, max_cell_mm)``: f_Rsi from the lowest inside surface
  temperature [-] (give R_si = 0.25 on the inside surfaces, as EN ISO 13788 asks).

Ranges, coordinates in mm:

- ``regions``: one row per rectangle, x0, y0, x1, y1 [mm], conductivity [W/(m K)] or a
  library material name; later rows overlay earlier ones.
- ``surfaces``: one row per surface, name, x0, y0, x1, y1 [mm], ambient temperature
  [degC], surface resistance [m2 K/W], side ("inside", "outside" or "other").
- ``flanking``: one row per flanking element, U [W/(m2 K)], length [m].

Results are cached by their inputs: a sheet recalculating does not solve again. No
function raises: a bad argument gives a one-line text naming it and the rule.
"""

from __future__ import annotations

from heatledger.bridges2d import Region, Surface, general_junction
from heatledger.errors import HeatLedgerError

from .cache import MISSING, BoundedCache
from .cells import is_blank, number, row_is_blank, text
from .ranges import LIBRARY
from .registry import udf

__all__ = ["HL_PSI", "HL_FRSI_2D"]

FAMILY = "junctions"
#: Solved junctions by input (a solve is 10 ms to a few seconds). [bytes]
SOLVED = BoundedCache(16 * 2**20)
_ENTRY_BYTES = 200_000
_MAX_ROWS = 500
_COORD = {"low": -1e5, "high": 1e5, "low_inclusive": True, "unit": "mm"}
_REGIONS = ("Rectangles: x0, y0, x1, y1 [mm], conductivity [W/(m K)] or a material name; "
            "later rows overlay earlier ones. [mm, W/(m K)]")
_SURFACES = ("Surfaces: name, x0, y0, x1, y1 [mm], ambient temperature [degC], surface "
             "resistance [m2 K/W], side (inside/outside/other). [mm, degC, m2 K/W]")
_MAX_CELL = "Largest cell edge; blank = 5. [mm]"


def _rows(name: str, cells) -> list:
    rows = [r if isinstance(r, (list, tuple)) else [r] for r in (cells or [])]
    rows = [list(r) for r in rows if not row_is_blank(r)]
    if rows and all(isinstance(c, str) for c in rows[0] if not is_blank(c)) and len(rows) > 1:
        rows = rows[1:]  # a header row
    if not rows or len(rows) > _MAX_ROWS:
        raise HeatLedgerError(f"{name} must hold 1 to {_MAX_ROWS} rows; got {len(rows)}")
    return rows


def _regions(cells) -> tuple:
    out = []
    for i, r in enumerate(_rows("regions", cells), 1):
        r = (r + [None] * 5)[:5]
        where = f"regions row {i}"
        xy = [number(f"{where} {k}", v, **_COORD) / 1000.0
              for k, v in zip(("x0", "y0", "x1", "y1"), r[:4], strict=True)]
        lam = r[4]
        if isinstance(lam, str) and lam.strip() and not _is_number(lam):
            lam = LIBRARY.get(lam.strip()).conductivity
        lam = number(f"{where} conductivity", lam, low=1e-3, high=5000.0, unit="W/(m K)")
        out.append((*xy, lam))
    return tuple(out)


def _is_number(value: str) -> bool:
    try:
        float(value)
    except ValueError:
        return False
    return True


def _surfaces(cells) -> tuple:
    out = []
    for i, r in enumerate(_rows("surfaces", cells), 1):
        r = (r + [None] * 8)[:8]
        where = f"surfaces row {i}"
        name = text(f"{where} name", r[0])
        xy = [number(f"{where} {k}", v, **_COORD) / 1000.0
              for k, v in zip(("x0", "y0", "x1", "y1"), r[1:5], strict=True)]
        temp = number(f"{where} temperature", r[5], low=-273.15, high=5000.0, unit="degC")
        res = number(f"{where} resistance", r[6], low=0.0, high=10.0, low_inclusive=True,
                     unit="m2 K/W")
        side = text(f"{where} side", r[7], "other").strip().lower()
        if side not in ("inside", "outside", "other"):
            raise HeatLedgerError(f"{where} side must be inside, outside or other; got {side!r}")
        out.append((name, *xy, temp, res, side))
    return tuple(out)


def _flanking(cells) -> tuple:
    out = []
    for i, r in enumerate(_rows("flanking", cells), 1):
        r = (r + [None, None])[:2]
        out.append((f"flank {i}",
                    number(f"flanking row {i} U", r[0], low=0.0, high=100.0,
                           low_inclusive=True, unit="W/(m2 K)"),
                    number(f"flanking row {i} length", r[1], low=0.0, high=1e5,
                           unit="m")))
    return tuple(out)


def _solved(regions, surfaces, flanking, max_cell_mm, dimensions):
    key = (_regions(regions), _surfaces(surfaces), flanking,
           number("max_cell_mm", max_cell_mm, 5.0, low=0.01, high=1000.0, unit="mm"),
           text("dimensions", dimensions, "external").strip().lower())
    res = SOLVED.get(key)
    if res is MISSING:
        regs = [Region(*r[:4], r[4], name=f"region {i + 1}") for i, r in enumerate(key[0])]
        surfs = [Surface(*s[1:5], temperature=s[5], resistance=s[6], name=s[0])
                 for s in key[1]]
        inside = [s[0] for s in key[1] if s[7] == "inside"]
        outside = [s[0] for s in key[1] if s[7] == "outside"]
        if not inside or not outside:
            raise HeatLedgerError("surfaces must mark at least one side inside and one "
                                  "outside")
        junction = general_junction(regs, surfs, key[2], dimensions=key[4], inside=inside,
                                    outside=outside)
        flow = junction.section().solve(key[3] / 1000.0)
        res = (junction, flow)
        SOLVED.put(key, res, _ENTRY_BYTES)
    return res


@udf(FAMILY, returns="psi [W/(m K)]",
     args={"regions": _REGIONS, "surfaces": _SURFACES,
           "flanking": "Flanking elements: U [W/(m2 K)], length [m] per row. [W/(m2 K), m]",
           "max_cell_mm": _MAX_CELL,
           "dimensions": "Dimension system of the lengths: external (default), internal or "
                         "overall internal. [-]"},
     ranges=("regions", "surfaces", "flanking"))
def HL_PSI(regions, surfaces, flanking, max_cell_mm=None, dimensions=None):
    """Linear thermal transmittance psi = L_2D - sum U_j l_j of a 2-D section drawn as
    rectangles and surfaces (EN ISO 10211, 10.3). [W/(m K)]"""
    junction, flow = _solved(regions, surfaces, _flanking(flanking), max_cell_mm, dimensions)
    return flow.psi([(u, length) for _, u, length in junction.flanking],
                    dimensions=junction.dimensions, inside=junction.inside,
                    outside=junction.outside).psi


@udf(FAMILY, returns="f_Rsi [-]",
     args={"regions": _REGIONS, "surfaces": _SURFACES, "max_cell_mm": _MAX_CELL},
     ranges=("regions", "surfaces"))
def HL_FRSI_2D(regions, surfaces, max_cell_mm=None):
    """Temperature factor f_Rsi from the lowest inside surface temperature of a 2-D section
    (EN ISO 10211, 11); give R_si = 0.25 on the inside surfaces. [-]"""
    junction, flow = _solved(regions, surfaces, (), max_cell_mm, None)
    return flow.surface_factor(junction.inside, junction.outside)
