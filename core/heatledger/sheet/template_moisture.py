"""Climates, Climate months and Moisture checks sheets of the fill-in template.

This module turns the project data's ``[[climates]]`` (with their twelve
``[[climates.months]]``) and ``[[moisture]]`` into template rows and the rows read back
into the same project data, noting the cell of every key so that a problem names its sheet
and cell.
"""

from __future__ import annotations

from ..moisture.schema import CLIMATE_TABLE, MOISTURE_TABLE, MONTH_TABLE
from .template_tables import attach_children, nest_row, read_parents

__all__ = ["template_rows", "read_rows", "REF_SHEETS"]

#: (sheet, column) -> the sheet whose first column lists the names it may take.
REF_SHEETS = {(MOISTURE_TABLE.sheet, "construction"): "Constructions",
              (MOISTURE_TABLE.sheet, "climate"): CLIMATE_TABLE.sheet,
              (MONTH_TABLE.sheet, "climate"): CLIMATE_TABLE.sheet}


def template_rows(data: dict) -> dict:
    """Template rows of the Climates, Climate months and Moisture checks sheets.

    Parameters
    ----------
    data : dict
        Project data in the project-file schema. [-]

    Returns
    -------
    dict
        Sheet name -> list of row dictionaries keyed by column key. [-]
    """
    climates = [c for c in data.get("climates", []) if isinstance(c, dict)]
    months = [dict(m, climate=c.get("name", "")) for c in climates
              for m in c.get("months", []) if isinstance(m, dict)]
    return {CLIMATE_TABLE.sheet: [{k: v for k, v in c.items() if k != "months"}
                                  for c in climates],
            MONTH_TABLE.sheet: months,
            MOISTURE_TABLE.sheet: [dict(m) for m in data.get("moisture", [])
                                   if isinstance(m, dict)]}


def read_rows(tables: dict, data: dict, problems: list, cells: dict) -> None:
    """Add ``climates`` and ``moisture`` read from the template's sheets to ``data``.

    Parameters
    ----------
    tables : dict
        Sheet name -> list of (row, where) as read by the template reader. [-]
    data : dict
        Project data being assembled. [-]
    problems : list
        Problems are appended as (cell, message). [-]
    cells : dict
        Key path -> cell, extended for every key read. [-]
    """
    climates, by_name = read_parents(tables.get(CLIMATE_TABLE.sheet, []), "climates", cells)
    for climate in climates:
        climate["months"] = []
    attach_children(tables.get(MONTH_TABLE.sheet, []), "climate", "months",
                    ("climate", CLIMATE_TABLE.sheet, climates, by_name), problems, cells)
    if climates:
        data["climates"] = climates
    checks = [nest_row(row, where, f"moisture[{i}]", {}, cells)
              for i, (row, where) in enumerate(tables.get(MOISTURE_TABLE.sheet, []), 1)]
    if checks:
        data["moisture"] = checks
