"""Junctions, Junction regions, Junction surfaces and Junction flanks sheets of the fill-in
template: the project data's ``[[junctions]]`` (with their drawn regions, surfaces and
flanking elements) as template rows, and the rows read back into the same project data,
noting the cell of every key so that a problem names its sheet and cell.
"""

from __future__ import annotations

from ..bridges2d.schema import FLANK_TABLE, JUNCTION_TABLE, REGION_TABLE, SURFACE_TABLE
from .template_tables import attach_children, read_parents

__all__ = ["template_rows", "read_rows", "REF_SHEETS"]

#: Child sheets: (table, key inside a junction).
_CHILDREN = ((REGION_TABLE, "regions"), (SURFACE_TABLE, "surfaces"), (FLANK_TABLE, "flanking"))
#: (sheet, column) -> the sheet whose first column lists the names it may take.
REF_SHEETS = {(JUNCTION_TABLE.sheet, "construction"): "Constructions",
              (JUNCTION_TABLE.sheet, "floor"): "Constructions",
              (FLANK_TABLE.sheet, "construction"): "Constructions",
              **{(t.sheet, "junction"): JUNCTION_TABLE.sheet for t, _c in _CHILDREN}}


def template_rows(data: dict) -> dict:
    """Template rows of the junction sheets.

    Parameters
    ----------
    data : dict
        Project data in the project-file schema. [-]

    Returns
    -------
    dict
        Sheet name -> list of row dictionaries keyed by column key. [-]
    """
    junctions = [j for j in data.get("junctions", []) if isinstance(j, dict)]
    out = {JUNCTION_TABLE.sheet: [{k: v for k, v in j.items()
                                   if k not in ("regions", "surfaces", "flanking")}
                                  for j in junctions]}
    for table, key in _CHILDREN:
        out[table.sheet] = [dict(r, junction=j.get("name", "")) for j in junctions
                            for r in j.get(key, []) if isinstance(r, dict)]
    return out


def read_rows(tables: dict, data: dict, problems: list, cells: dict) -> None:
    """Add ``junctions`` read from the template's sheets to ``data``.

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
    junctions, by_name = read_parents(tables.get(JUNCTION_TABLE.sheet, []), "junctions", cells)
    for table, child in _CHILDREN:
        attach_children(tables.get(table.sheet, []), "junction", child,
                        ("junction", JUNCTION_TABLE.sheet, junctions, by_name), problems, cells)
    if junctions:
        data["junctions"] = junctions
