"""Input schema of the moisture family: ``[[climates]]`` with their twelve
``[[climates.months]]``, and ``[[moisture]]`` checks naming a construction and a climate,
declared once (see :mod:`heatledger.schema`).
"""

from __future__ import annotations

from ..schema import Column, Table
from .climate import HUMIDITY_CLASSES
from .psychrometrics import MONTH_NAMES

__all__ = ["CLIMATE_TABLE", "MONTH_TABLE", "MOISTURE_TABLE", "TABLES", "MONTH_KEYS"]

#: Month names as the project file and the template write them (lower case). [-]
MONTH_KEYS = tuple(m.lower() for m in MONTH_NAMES)
_CLASSES = tuple(str(c) for c in HUMIDITY_CLASSES)

CLIMATE_TABLE = Table(
    key="climates", title="a year of monthly climate for the moisture checks",
    sheet="Climates", extra=("months",),
    note="Optional, for moisture checks: one row per climate. Give the inside humidity as a "
         "humidity class (1 to 5, EN ISO 13788 Annex A) or as a relative humidity (fraction "
         "0 to 1); the twelve months are on the Climate months sheet.",
    columns=(
        Column("name", "Climate name", "", "text", "name of the climate, unique in the project",
               required=True),
        Column("humidity_class", "Humidity class (1-5)", "-", "int",
               "internal humidity class of EN ISO 13788 Annex A (or give rh_inside)",
               choices=_CLASSES),
        Column("temp_inside", "θ_i", "degC", "number",
               "inside air temperature, every month (a month row may override it)",
               default=20.0, limit="temperature"),
        Column("rh_inside", "φ_i", "-", "number",
               "inside relative humidity as a fraction, every month (instead of a class)"),
        Column("notes", "Notes", "", "text", "free text, e.g. where the data come from"),
    ),
)

MONTH_TABLE = Table(
    key="climates.months", title="one month of a climate (twelve per climate)",
    sheet="Climate months",
    note="Twelve rows per climate, Jan to Dec, each naming its climate: monthly mean outside "
         "temperature and relative humidity (fraction 0 to 1). Inside values here override "
         "the climate's.",
    columns=(
        Column("climate", "Climate name", "", "text", "the climate the month belongs to",
               place="sheet"),
        Column("month", "Month", "", "text", "month name", choices=MONTH_KEYS, required=True),
        Column("temp_outside", "θ_e", "degC", "number", "monthly mean outside temperature",
               required=True, limit="temperature"),
        Column("rh_outside", "φ_e", "-", "number",
               "monthly mean outside relative humidity as a fraction", required=True),
        Column("temp_inside", "θ_i", "degC", "number",
               "inside temperature this month (blank = the climate's)", limit="temperature"),
        Column("rh_inside", "φ_i", "-", "number",
               "inside relative humidity this month (blank = the climate's or its class)"),
    ),
)

MOISTURE_TABLE = Table(
    key="moisture", title="a moisture check of a construction in a climate",
    sheet="Moisture checks",
    note="Optional: one row per check. Names a construction (Constructions sheet, every "
         "layer with a vapour value) and a climate; checks surface humidity (mould at 0.8, "
         "or surface condensation at 1.0) and interstitial condensation (Glaser method).",
    columns=(
        Column("name", "Check name", "", "text", "name of the check, unique in the project",
               required=True),
        Column("construction", "Construction", "", "ref", "the construction checked",
               required=True),
        Column("climate", "Climate", "", "ref", "the climate it is checked in",
               required=True),
        Column("junction", "Junction (surface check)", "", "ref",
               "a junction whose f_Rsi the surface check uses instead of the plane "
               "construction's (Junctions sheet)"),
        Column("rh_critical", "Critical φ_si", "-", "number",
               "critical surface relative humidity: 0.8 mould, 1.0 surface condensation",
               default=0.8),
        Column("resistance_inside", "R_si of the check", "m2 K/W", "number",
               "inside surface resistance of the surface check (0.25 opaque, 0.13 glazing)",
               default=0.25, limit="surface_resistance", sign="positive"),
        Column("notes", "Notes", "", "text", "free text, printed on the check's sheet"),
    ),
)

#: The family's tables, in template order.
TABLES = (CLIMATE_TABLE, MONTH_TABLE, MOISTURE_TABLE)
