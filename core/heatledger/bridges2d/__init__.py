"""Two-dimensional steady heat conduction through thermal bridges (EN ISO 10211).

A section is drawn as axis-aligned rectangles of material (later ones overlay earlier ones)
and straight pieces of its outline with an ambient temperature and a surface resistance; the
rest of the outline is adiabatic. It is solved by cell-centred finite volumes on a
rectilinear grid through every region edge and surface end.

Public names
------------
Region, Surface, Section2D
    The geometry, the boundary conditions and the section (``Section2D.solve``).
external_corner, wall_floor, stud_wall, general_junction, Junction, JunctionResult
    Junctions built from constructions (or drawn) with their flanking elements: psi,
    f_Rsi at R_si = 0.25 and the lowest inside surface temperature.
Section2DResult, PsiResult, SurfaceMinimum
    Heat flows per surface, energy balance, temperatures anywhere in the body, the thermal
    coupling coefficient L_2D, the linear thermal transmittance psi with its dimension system,
    the minimum surface temperature with its place, the temperature factor f_Rsi and a mesh
    estimate from three grids with the observed order.

Results support, and do not replace, design by a competent person; the minimum surface
temperature informs a condensation or mould-risk check, it is not one (EN ISO 13788).

Sources: [source: iso10211-method, 5, 6, 10 and 11]; validation [source: iso10211-validation,
Annex A]; discretisation [source: patankar-1980, ch. 4].
"""

from .geometry import Region, Surface
from .junctions import (
    JUNCTION_KINDS,
    Junction,
    JunctionResult,
    external_corner,
    general_junction,
    stud_wall,
    wall_floor,
)
from .mesh import DIRECT_MAX_CELLS, MAX_CELLS_2D
from .results import DIMENSIONS, PsiResult, Section2DResult, SurfaceMinimum
from .section import Section2D

__all__ = [
    "Junction",
    "JunctionResult",
    "JUNCTION_KINDS",
    "external_corner",
    "wall_floor",
    "stud_wall",
    "general_junction",
    "Region",
    "Surface",
    "Section2D",
    "Section2DResult",
    "PsiResult",
    "SurfaceMinimum",
    "DIMENSIONS",
    "DIRECT_MAX_CELLS",
    "MAX_CELLS_2D",
]
