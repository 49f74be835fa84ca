"""The Fins sheet of the fill-in template.

The columns here are added to :data:`heatledger.sheet.template.COLUMNS`; one row per
``[[fins]]`` table of the project data, with the ``[fins.array]`` and ``[fins.fv]``
sub-tables flattened into prefixed columns (``array_count``, ``fv_cells``, ...). Rows read
back become the same project data, and the cell of every key is noted so that a problem
names its sheet and cell.
"""

from __future__ import annotations

from .template_tables import flatten_row, nest_row

__all__ = ["FIN_COLUMNS", "FIN_NOTES", "FIN_SHEETS", "fin_template_rows", "read_fins"]

#: Sub-tables written as prefixed columns: column key -> (sub-table, key inside it).
_SUB = {"array_count": ("array", "count"), "array_base_area": ("array", "base_area"),
        "array_contact_resistance": ("array", "contact_resistance"),
        "array_target_heat_rate": ("array", "target_heat_rate"),
        "fv_cells": ("fv", "cells"), "fv_emissivity": ("fv", "emissivity"),
        "fv_temp_surroundings": ("fv", "temp_surroundings"),
        "fv_h_coefficient": ("fv", "h_coefficient"), "fv_h_exponent": ("fv", "h_exponent")}

FIN_COLUMNS = {
    "Fins": (
        ("name", "Fin name", "text"), ("kind", "Kind (straight/annular)", "text"),
        ("material", "Material", "text"), ("conductivity", "λ if no material [W/(m K)]",
                                           "number"),
        ("h", "h [W/(m2 K)]", "number"), ("base_temperature", "Base T_b [degC]", "number"),
        ("ambient", "Fluid T_inf [degC]", "number"), ("length_mm", "Length L [mm]", "number"),
        ("thickness_mm", "Thickness t [mm]", "number"),
        ("diameter_mm", "Pin diameter D [mm]", "number"),
        ("width_mm", "Plate width w [mm]", "number"),
        ("profile", "Profile (rectangular/triangular/parabolic)", "text"),
        ("tip", "Tip (convective/adiabatic/temperature/infinite)", "text"),
        ("tip_temperature", "Tip T_L [degC]", "number"),
        ("corrected_length", "Corrected length (TRUE/FALSE)", "text"),
        ("tube_diameter_mm", "Annular: tube D_1 [mm]", "number"),
        ("fin_diameter_mm", "Annular: fin D_2 [mm]", "number"),
        ("array_count", "Array: fins N [-]", "int"),
        ("array_base_area", "Array: base area incl. roots [m2]", "number"),
        ("array_contact_resistance", "Array: contact R''_t,c [m2 K/W]", "number"),
        ("array_target_heat_rate", "Array: target q [W]", "number"),
        ("fv_cells", "FV cells [-]", "int"), ("fv_emissivity", "FV emissivity [-]", "number"),
        ("fv_temp_surroundings", "FV T_sur [degC]", "number"),
        ("fv_h_coefficient", "FV h = C|ΔT|^n: C [W/(m2 K^(1+n))]", "number"),
        ("fv_h_exponent", "FV h = C|ΔT|^n: n [-]", "number"), ("notes", "Notes", "text"),
    ),
}
FIN_SHEETS = tuple(FIN_COLUMNS)
FIN_NOTES = {
    "Fins": "Optional: one row per fin or finned surface. Lengths in mm. Straight fins: "
            "length with thickness (plate) or diameter (pin); annular fins: tube and fin "
            "diameters and thickness. Array and FV columns are optional.",
}


def fin_template_rows(data: dict) -> dict:
    """Template rows of the Fins sheet.

    Parameters
    ----------
    data : dict
        Project data in the project-file schema. [-]

    Returns
    -------
    dict
        ``{"Fins": [row, ...]}`` with rows keyed by column key. [-]
    """
    rows = []
    for fin in data.get("fins", []):
        if not isinstance(fin, dict):
            continue
        row = flatten_row(fin, _SUB)
        if isinstance(row.get("corrected_length"), bool):
            row["corrected_length"] = "TRUE" if row["corrected_length"] else "FALSE"
        rows.append(row)
    return {"Fins": rows}


def read_fins(tables: dict, data: dict, problems: list, cells: dict) -> None:
    """Add ``fins`` read from the template's Fins sheet to ``data``.

    Parameters
    ----------
    tables : dict
        Sheet name -> list of (row, where) as read by the template reader. [-]
    data : dict
        Project data being assembled; gains ``fins`` when the sheet has rows. [-]
    problems : list
        Problems would be appended as (cell, message); the project parser checks the
        values, so that every problem of the sheet is reported at once. [-]
    cells : dict
        Key path -> cell, extended for every key read. [-]
    """
    fins = []
    for i, (row, where) in enumerate(tables.get("Fins", []), 1):
        fin = nest_row(row, where, f"fins[{i}]", _SUB, cells)
        flag = fin.get("corrected_length")
        if isinstance(flag, str) and flag.strip().lower() in ("true", "false"):
            fin["corrected_length"] = flag.strip().lower() == "true"
        # any other text is reported by the project parser, with every other problem
        fins.append(fin)
    if fins:
        data["fins"] = fins
