"""Input schema of the project-wide tables and of the constructions family, declared once
(see :mod:`heatledger.schema`): ``[project]``, ``[design]``, ``[[materials]]``,
``[[constructions]]`` with their ``layers`` and ``corrections``.

Thickness in millimetres, as build-ups are written in practice; everything else SI.
"""

from __future__ import annotations

from ..airlayers import VENTILATION_CLASSES
from ..schema import Column, Table
from ..surfaces import HEAT_FLOWS

__all__ = ["PROJECT_TABLE", "DESIGN_TABLE", "MATERIAL_TABLE", "CONSTRUCTION_TABLE",
           "LAYER_TABLE", "CORRECTION_TABLE", "FUNCTION_LAYER_TABLE", "LAYER_KINDS",
           "CORRECTION_KINDS", "TABLES"]

LAYER_KINDS = ("material", "declared", "air", "bridged")
CORRECTION_KINDS = ("air_gaps", "fasteners", "inverted_roof")
_MAT, _BR = ("material", "bridged"), ("bridged",)


def _info(key: str, label: str, description: str) -> Column:
    return Column(key, label, "", "text", description)


PROJECT_TABLE = Table(
    key="project", many=False, title="who, where and which revision (printed on every sheet)",
    columns=(
        _info("name", "Project name", "project name"),
        _info("client", "Client", "client"),
        _info("site", "Site", "site or address"),
        _info("author", "Author", "engineer who prepared the calculation"),
        _info("checker", "Checker", "engineer who checks it"),
        _info("revision", "Revision", "revision of the calculation"),
        _info("date", "Date (YYYY-MM-DD)", "date of the revision"),
        _info("notes", "Notes", "free text"),
    ),
)

DESIGN_TABLE = Table(
    key="design", many=False,
    title="design temperatures of the constructions' temperature profiles",
    columns=(
        Column("temp_inside", "Inside design air temperature", "degC", "number",
               "inside air temperature", default=20.0, limit="temperature"),
        Column("temp_outside", "Outside design air temperature", "degC", "number",
               "outside air temperature", default=-5.0, limit="temperature"),
    ),
)

MATERIAL_TABLE = Table(
    key="materials", title="a material of the project (adds to or overrides the library)",
    sheet="Materials",
    note="Your own materials (declared values of the products used) or overrides of the "
         "library; the library's names are on the Lists sheet.",
    columns=(
        Column("name", "Material name", "", "text", "name the layers use", required=True),
        Column("conductivity", "λ", "W/(m K)", "number", "design thermal conductivity",
               required=True, limit="conductivity", sign="positive"),
        Column("density", "ρ", "kg/m3", "number", "density", sign="positive"),
        Column("specific_heat", "c", "J/(kg K)", "number", "specific heat capacity",
               sign="positive"),
        Column("vapour_resistance_factor", "μ", "-", "number",
               "water-vapour resistance factor", sign="positive",
               limit="vapour_resistance_factor"),
        Column("source", "Source of the values", "", "text",
               "where the values come from (product declaration, standard table)"),
    ),
)

CONSTRUCTION_TABLE = Table(
    key="constructions", title="a wall, roof or floor build-up", sheet="Constructions",
    extra=("layers", "corrections"),
    note="One row per wall, roof or floor, with its heat-flow direction (up for roofs, "
         "horizontal for walls, down for floors), area and target U where you have one.",
    columns=(
        Column("name", "Construction name", "", "text", "name, unique in the project",
               required=True),
        Column("heat_flow", "Heat flow", "", "text",
               "direction of heat flow (EN ISO 6946 Table 7)", choices=HEAT_FLOWS,
               required=True),
        Column("area", "Area", "m2", "number", "area, for the heat loss shown on the sheet",
               limit="area", sign="positive"),
        Column("target_u", "Target U", "W/(m2 K)", "number",
               "U-value to size a layer for", limit="u_value", sign="positive"),
        Column("nodes_per_layer", "FV cells per layer", "-", "int",
               "finite-volume cells per layer of the temperature profile (1 to 500; blank = "
               "the engine's choice)"),
        Column("rsi", "Rsi if not Table 7", "m2 K/W", "number",
               "inside surface resistance instead of EN ISO 6946 Table 7",
               limit="surface_resistance", sign="non_negative"),
        Column("rse", "Rse if not Table 7", "m2 K/W", "number",
               "outside surface resistance instead of EN ISO 6946 Table 7",
               limit="surface_resistance", sign="non_negative"),
        Column("size_layer", "Layer to size for the target", "", "ref",
               "layer whose thickness meets target_u (name or number from inside)"),
        Column("apply_small_corrections", "Apply corrections under 3 %", "", "bool",
               "apply Annex F corrections even when their total is under 3 % of U",
               default=False, place="file"),
        Column("notes", "Notes", "", "text", "free text, printed on the construction's sheet"),
    ),
)

LAYER_TABLE = Table(
    key="constructions.layers", title="a layer, inside to outside", sheet="Layers",
    variant_key="kind",
    note="One row per layer, inside to outside, each naming its construction. Thickness in "
         "mm. Kind material needs a material or λ; declared a resistance; air a "
         "ventilation class (and the vent area when slightly ventilated); bridged a "
         "material, a bridging material or λ and the bridging fraction.",
    columns=(
        Column("construction", "Construction name", "", "text",
               "the construction the layer belongs to", place="sheet"),
        Column("name", "Layer name", "", "text", "name shown on the sheets"),
        Column("kind", "Kind", "", "text", "what the layer is", choices=LAYER_KINDS,
               default="material"),
        Column("material", "Material", "", "material",
               "library or project material (or give conductivity)", variants=_MAT),
        Column("thickness_mm", "d", "mm", "number", "layer thickness", required=True,
               limit="thickness", scale=1e-3, sign="positive"),
        Column("conductivity", "λ if no material", "W/(m K)", "number",
               "conductivity when no material is named", limit="conductivity",
               sign="positive", variants=_MAT),
        Column("resistance", "Declared R", "m2 K/W", "number",
               "declared thermal resistance of the layer", limit="layer_resistance",
               sign="positive", variants=("declared",)),
        Column("ventilation", "Air layer ventilation", "", "text",
               "EN ISO 6946 6.9 class", choices=VENTILATION_CLASSES,
               default="unventilated", variants=("air",)),
        Column("vent_area_mm2", "Vent area", "mm2 per m or m2", "number",
               "openings per m of length (vertical) or m2 of area (horizontal)",
               sign="non_negative", variants=("air",)),
        Column("emissivity_1", "ε1", "-", "number", "emissivity of one face of the air layer",
               default=0.9, variants=("air",)),
        Column("emissivity_2", "ε2", "-", "number",
               "emissivity of the other face of the air layer", default=0.9,
               variants=("air",)),
        Column("bridging_material", "Bridging material", "", "material",
               "material of the studs, joists or webs", variants=_BR),
        Column("bridging_conductivity", "Bridging λ", "W/(m K)", "number",
               "conductivity of the bridging when no material is named",
               limit="conductivity", sign="positive", variants=_BR),
        Column("bridging_fraction", "Bridging fraction", "-", "number",
               "fraction of the area taken by the bridging", variants=_BR),
        Column("vapour_resistance_factor", "μ (moisture)", "-", "number",
               "water-vapour resistance factor for the moisture check; blank = the "
               "material's (air layers 1)", sign="positive", limit="vapour_resistance_factor"),
        Column("sd", "s_d (moisture)", "m", "number",
               "declared equivalent air-layer thickness (membranes, foils) instead of μ",
               sign="positive", limit="sd"),
    ),
)

_G, _F, _I = ("air_gaps",), ("fasteners",), ("inverted_roof",)
CORRECTION_TABLE = Table(
    key="constructions.corrections", title="a correction to U (EN ISO 6946 Annex F)",
    sheet="Corrections", variant_key="kind",
    note="Optional corrections to U (EN ISO 6946 Annex F): air_gaps (level), fasteners (λ "
         "or material, section, count), inverted_roof (p, f, x). Name the layer as on the "
         "Layers sheet.",
    columns=(
        Column("construction", "Construction name", "", "text",
               "the construction corrected", place="sheet"),
        Column("kind", "Kind", "", "text", "which correction", choices=CORRECTION_KINDS,
               required=True),
        Column("layer", "Layer name", "", "ref",
               "the insulation layer corrected (name or number from inside)"),
        Column("level", "Air-gap level (0/1/2)", "-", "int", "Annex F.2 level of air gaps",
               choices=("0", "1", "2"), variants=_G),
        Column("material", "Fastener material", "", "material", "fastener material",
               variants=_F),
        Column("conductivity", "Fastener λ", "W/(m K)", "number",
               "fastener conductivity when no material is named", limit="conductivity",
               sign="positive", variants=_F),
        Column("cross_section_mm2", "Fastener section", "mm2", "number",
               "cross-section of one fastener", sign="positive", variants=_F),
        Column("count_per_m2", "Fasteners per m2", "1/m2", "number", "fasteners per m2",
               sign="non_negative", variants=_F),
        Column("penetration_mm", "Fastener length in layer", "mm", "number",
               "length of the fastener inside the layer", sign="positive", variants=_F),
        Column("edition", "ISO 6946 edition (2017/2007)", "", "text",
               "edition of the fastener formula", choices=("2017", "2007"), default="2017",
               variants=_F),
        Column("application", "wall / roof (2007)", "", "text",
               "wall or roof, for the 2007 coefficient", choices=("wall", "roof"),
               variants=_F),
        Column("precipitation_mm_per_day", "p", "mm/day", "number",
               "mean rainfall in the heating season", limit="precipitation",
               sign="non_negative", variants=_I),
        Column("drainage_factor", "f", "-", "number", "drainage factor (0 to 1)",
               sign="non_negative", variants=_I),
        Column("factor_x", "x", "W day/(m2 K mm)", "number", "factor for the heat loss",
               limit="factor_x", variants=_I),
    ),
)

#: The layer table of the spreadsheet functions (``HL_UVALUE`` and its kin): one row per
#: layer, inside to outside, six columns; a material named ``air`` (or ``air: ...``) is an
#: unventilated air layer by EN ISO 6946 Annex D.
FUNCTION_LAYER_TABLE = Table(
    key="layers", title="a layer of a spreadsheet function's layer range",
    columns=(
        Column("material", "Material or name", "", "material",
               "library material, `air` for an air layer, or a name with λ or R"),
        Column("thickness_mm", "d", "mm", "number", "layer thickness", required=True,
               limit="thickness", scale=1e-3, sign="positive"),
        Column("conductivity", "λ", "W/(m K)", "number",
               "conductivity instead of the material's", limit="conductivity",
               sign="positive"),
        Column("resistance", "R", "m2 K/W", "number", "declared thermal resistance",
               limit="layer_resistance", sign="positive"),
        Column("bridging_fraction", "Bridging fraction", "-", "number",
               "fraction of the area taken by studs or battens (below 1)", sign="positive"),
        Column("bridging_conductivity", "Bridging λ", "W/(m K)", "number",
               "conductivity (or material) of the bridging", limit="conductivity"),
    ),
)

#: The tables of project information and the constructions family, in template order.
TABLES = (CONSTRUCTION_TABLE, LAYER_TABLE, CORRECTION_TABLE)
