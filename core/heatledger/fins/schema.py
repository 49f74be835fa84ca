"""Input schema of the fins family: the ``[[fins]]`` table with ``[fins.array]`` and
``[fins.fv]``, declared once (see :mod:`heatledger.schema`).

Lengths in millimetres, as in a heat-sink or finned-tube data sheet; everything else SI.
"""

from __future__ import annotations

from ..schema import Column, Table
from .annular import ANNULAR_TIPS
from .straight import STRAIGHT_PROFILES, STRAIGHT_TIPS

__all__ = ["FIN_TABLE", "FIN_KINDS", "DEFAULT_FV_CELLS", "MAX_FV_CELLS", "TABLES"]

FIN_KINDS = ("straight", "annular")
#: Control volumes of the finite-volume check when ``[fins.fv] cells`` is not given. [-]
DEFAULT_FV_CELLS = 40
#: Most control volumes a project may ask for (each is a row of the calculation sheet). [-]
MAX_FV_CELLS = 500

_S, _A = ("straight",), ("annular",)
_MM = {"limit": "thickness", "scale": 1e-3, "sign": "positive"}
_TIPS = tuple(dict.fromkeys(STRAIGHT_TIPS + ANNULAR_TIPS))

FIN_TABLE = Table(
    key="fins", title="one fin, or one fin type of a finned surface", sheet="Fins",
    variant_key="kind",
    note="Optional: one row per fin or finned surface. Lengths in mm. Straight fins: "
         "length with thickness (plate) or diameter (pin); annular fins: tube and fin "
         "diameters and thickness. The array and FV columns are optional.",
    columns=(
        Column("name", "Fin name", "", "text", "name of the fin, unique in the project",
               required=True),
        Column("kind", "Kind (straight/annular)", "", "text", "fin geometry",
               choices=FIN_KINDS, required=True),
        Column("material", "Material", "", "material",
               "library or project material (or give conductivity)"),
        Column("conductivity", "λ if no material", "W/(m K)", "number",
               "fin conductivity when no material is named", limit="conductivity",
               sign="positive"),
        Column("h", "h", "W/(m2 K)", "number", "convection coefficient on the fin surface",
               required=True, limit="h", sign="positive"),
        Column("temp_base", "Base T_b", "degC", "number",
               "temperature of the fin base", required=True, limit="temperature"),
        Column("temp_fluid", "Fluid T_inf", "degC", "number", "temperature of the fluid (air)",
               required=True, limit="temperature"),
        Column("length_mm", "Length L", "mm", "number", "base to tip", variants=_S, **_MM),
        Column("thickness_mm", "Thickness t", "mm", "number",
               "plate or disc thickness (straight: give thickness or diameter)", **_MM),
        Column("diameter_mm", "Pin diameter D", "mm", "number", "pin fin diameter",
               variants=_S, **_MM),
        Column("width_mm", "Plate width w", "mm", "number",
               "plate width along the base; blank = 1000 (per metre)", variants=_S, **_MM),
        Column("profile", "Profile (rectangular/triangular/parabolic)", "", "text",
               "longitudinal profile of a plate fin", choices=STRAIGHT_PROFILES,
               default="rectangular", variants=_S),
        Column("tip", "Tip (convective/adiabatic/temperature/infinite)", "", "text",
               "tip condition; blank = convective (straight), adiabatic (annular)",
               choices=_TIPS),
        Column("temp_tip", "Tip T_L", "degC", "number",
               'tip temperature, only with tip = "temperature"', limit="temperature",
               variants=_S),
        Column("corrected_length", "Corrected length (TRUE/FALSE)", "", "bool",
               "L_c = L + t/2 (or D/4) for a convective tip", default=False),
        Column("tube_diameter_mm", "Annular: tube D_1", "mm", "number",
               "outside diameter of the tube (fin root)", variants=_A, **_MM),
        Column("fin_diameter_mm", "Annular: fin D_2", "mm", "number",
               "outside diameter of the fin", variants=_A, **_MM),
        Column("count", "Array: fins N", "-", "int", "number of fins on the base",
               sub="array", sign="non_negative"),
        Column("base_area", "Array: base area incl. roots", "m2", "number",
               "base area including the fin roots", sub="array", limit="area",
               sign="positive"),
        Column("contact_resistance", "Array: contact R''_t,c", "m2 K/W", "number",
               "contact resistance at each fin root", sub="array", default=0.0,
               limit="resistance", sign="non_negative"),
        Column("target_heat_rate", "Array: target q", "W", "number",
               "heat rate to size fin length and count for", sub="array"),
        Column("cells", "FV cells", "-", "int",
               f"control volumes of the finite-volume check (2 to {MAX_FV_CELLS})", sub="fv",
               default=DEFAULT_FV_CELLS),
        Column("emissivity", "FV emissivity", "-", "number",
               "emissivity for radiation to the surroundings (0 = none)", sub="fv",
               default=0.0),
        Column("temp_surroundings", "FV T_sur", "degC", "number",
               "radiating surroundings; blank = the fluid temperature", sub="fv",
               limit="temperature"),
        Column("h_coefficient", "FV h = C|ΔT|^n: C", "W/(m2 K^(1+n))", "number",
               "coefficient C of h = C |T - T_inf|^n in the finite volumes", sub="fv"),
        Column("h_exponent", "FV h = C|ΔT|^n: n", "-", "number",
               "exponent n of h = C |T - T_inf|^n", sub="fv"),
        Column("notes", "Notes", "", "text", "free text, printed on the fin's sheet"),
    ),
)

#: The family's tables, in template order.
TABLES = (FIN_TABLE,)
