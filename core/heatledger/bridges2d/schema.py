"""Input schema of the thermal-bridge family: ``[[junctions]]`` built from the project's
constructions, or drawn as ``[[junctions.regions]]`` and ``[[junctions.surfaces]]`` with
their ``[[junctions.flanking]]`` elements, declared once (see :mod:`heatledger.schema`).

Dimensions of a drawing and of layers in millimetres; flank lengths in metres.
"""

from __future__ import annotations

from ..schema import Column, Table
from .junctions import JUNCTION_KINDS
from .results import DIMENSIONS

__all__ = ["JUNCTION_TABLE", "REGION_TABLE", "SURFACE_TABLE", "FLANK_TABLE", "TABLES",
           "SIDES", "DEFAULT_MAX_CELL_MM"]

#: Largest cell edge of a junction's grid when none is given. [mm]
DEFAULT_MAX_CELL_MM = 5.0
#: Which side a drawn surface faces. [-]
SIDES = ("inside", "outside", "other")
_BUILT = ("corner", "floor", "balcony", "stud")
_FLOOR = ("floor", "balcony")
_MM = {"limit": "thickness", "scale": 1e-3, "sign": "positive"}
_COORD = {"limit": "length", "scale": 1e-3}

JUNCTION_TABLE = Table(
    key="junctions", title="a 2-D thermal bridge (EN ISO 10211)", sheet="Junctions",
    variant_key="kind", extra=("regions", "surfaces", "flanking"),
    note="Optional: one row per junction. corner, floor and balcony name the wall "
         "construction (and the floor); stud names the clear wall, the layer the studs "
         "replace, their width, spacing and material; rectangles are drawn on the Junction "
         "regions and Junction surfaces sheets with their flanking elements.",
    columns=(
        Column("name", "Junction name", "", "text", "name of the junction, unique",
               required=True),
        Column("kind", "Kind", "", "text", "which junction", choices=JUNCTION_KINDS,
               required=True),
        Column("construction", "Wall construction", "", "ref",
               "the wall (corner, floor, balcony) or the clear studded wall (stud)",
               variants=_BUILT),
        Column("floor", "Floor construction", "", "ref",
               "the floor build-up, its layers top to bottom", variants=_FLOOR),
        Column("bearing_mm", "Floor bearing", "mm", "number",
               "depth of the floor in the wall from the inside face; blank = up to the "
               "insulation", variants=("floor",), **_MM),
        Column("projection_mm", "Balcony projection", "mm", "number",
               "length of the slab outside the wall", variants=("balcony",), **_MM),
        Column("layer", "Layer with studs", "", "ref",
               "the layer the studs replace (name or number from inside)",
               variants=("stud",)),
        Column("stud_width_mm", "Stud width", "mm", "number", "width of one stud",
               variants=("stud",), **_MM),
        Column("spacing_mm", "Stud spacing", "mm", "number", "centre-to-centre spacing",
               variants=("stud",), **_MM),
        Column("stud_material", "Stud material", "", "material",
               "library or project material of the studs (or give λ)", variants=("stud",)),
        Column("stud_conductivity", "Stud λ", "W/(m K)", "number",
               "conductivity of the studs when no material is named", limit="conductivity",
               sign="positive", variants=("stud",)),
        Column("flank", "Flank length", "m", "number",
               "length of the flanking wall from the junction; blank = what EN ISO 10211 "
               "asks (at least 1 m or 3 thicknesses)", limit="length", sign="positive",
               variants=_BUILT),
        Column("floor_flank", "Floor flank", "m", "number",
               "length of the floor inside from the wall; blank = at least 1 m",
               limit="length", sign="positive", variants=_FLOOR),
        Column("dimensions", "Dimension system", "", "text",
               "dimension system of the flanking lengths (drawn junctions)",
               choices=DIMENSIONS, default="external", variants=("rectangles",)),
        Column("temp_inside", "θ_i", "degC", "number",
               "inside temperature; blank = [design] temp_inside", limit="temperature"),
        Column("temp_outside", "θ_e", "degC", "number",
               "outside temperature; blank = [design] temp_outside", limit="temperature"),
        Column("max_cell_mm", "Largest cell", "mm", "number",
               f"largest cell edge of the grid (default {DEFAULT_MAX_CELL_MM:g})",
               default=DEFAULT_MAX_CELL_MM, **_MM),
        Column("notes", "Notes", "", "text", "free text, printed on the junction's sheet"),
    ),
)

REGION_TABLE = Table(
    key="junctions.regions", title="a rectangle of material of a drawn junction",
    sheet="Junction regions",
    note="Rectangles of a drawn junction (kind rectangles), each naming its junction; "
         "coordinates in mm; later rows overlay earlier ones.",
    columns=(
        Column("junction", "Junction name", "", "text", "the junction drawn",
               place="sheet"),
        Column("name", "Region name", "", "text", "what the rectangle is"),
        Column("x0_mm", "x0", "mm", "number", "left edge", required=True, **_COORD),
        Column("y0_mm", "y0", "mm", "number", "bottom edge", required=True, **_COORD),
        Column("x1_mm", "x1", "mm", "number", "right edge", required=True, **_COORD),
        Column("y1_mm", "y1", "mm", "number", "top edge", required=True, **_COORD),
        Column("material", "Material", "", "material",
               "library or project material (or give λ)"),
        Column("conductivity", "λ", "W/(m K)", "number",
               "conductivity when no material is named", limit="conductivity",
               sign="positive"),
    ),
)

SURFACE_TABLE = Table(
    key="junctions.surfaces", title="a surface of a drawn junction",
    sheet="Junction surfaces",
    note="Straight pieces of the outline of a drawn junction with their ambient temperature "
         "and surface resistance (0 = fixed surface temperature); the rest of the outline "
         "is adiabatic. side says which are inside (f_Rsi) and outside.",
    columns=(
        Column("junction", "Junction name", "", "text", "the junction drawn",
               place="sheet"),
        Column("name", "Surface name", "", "text", "name of the surface", required=True),
        Column("x0_mm", "x0", "mm", "number", "start x", required=True, **_COORD),
        Column("y0_mm", "y0", "mm", "number", "start y", required=True, **_COORD),
        Column("x1_mm", "x1", "mm", "number", "end x", required=True, **_COORD),
        Column("y1_mm", "y1", "mm", "number", "end y", required=True, **_COORD),
        Column("temperature", "θ ambient", "degC", "number", "ambient temperature",
               required=True, limit="temperature"),
        Column("resistance", "R_s", "m2 K/W", "number",
               "surface resistance (0 = fixed surface temperature)", required=True,
               limit="surface_resistance", sign="non_negative"),
        Column("side", "Side", "", "text", "inside, outside or other", choices=SIDES,
               required=True),
    ),
)

FLANK_TABLE = Table(
    key="junctions.flanking", title="a flanking element of a drawn junction",
    sheet="Junction flanks",
    note="The flanking elements of a drawn junction: a construction of the project (its U) "
         "or a U-value, and the length it has in the section in the junction's dimension "
         "system.",
    columns=(
        Column("junction", "Junction name", "", "text", "the junction drawn",
               place="sheet"),
        Column("name", "Element", "", "text", "what the element is", required=True),
        Column("construction", "Construction", "", "ref", "a construction of the project"),
        Column("u_value", "U", "W/(m2 K)", "number", "U-value instead of a construction",
               limit="u_value", sign="non_negative"),
        Column("length", "Length", "m", "number", "length in the section", required=True,
               limit="length", sign="positive"),
    ),
)

#: The family's tables, in template order.
TABLES = (JUNCTION_TABLE, REGION_TABLE, SURFACE_TABLE, FLANK_TABLE)
