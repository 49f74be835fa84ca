"""The Fins sheet of the fill-in template.

The columns here are added to :data:`heatledger.sheet.template.COLUMNS`; one row per
``[[fins]]`` table of the project data, with the ``[fins.array]`` and ``[fins.fv]``
sub-tables flattened into prefixed columns (``array_count``, ``fv_cells``, ...). Rows read
back become the same project data, and the cell of every key is noted so that a problem
names its sheet and cell.
"""

from __future__ import annotations

from ..fins.schema import FIN_TABLE
from .template_tables import flatten_row, nest_row

__all__ = ["FIN_COLUMNS", "FIN_NOTES", "FIN_SHEETS", "template_rows", "read_rows"]

_SUB = FIN_TABLE.subtables()
FIN_COLUMNS = {FIN_TABLE.sheet: FIN_TABLE.template_columns()}
FIN_SHEETS = tuple(FIN_COLUMNS)
FIN_NOTES = {FIN_TABLE.sheet: FIN_TABLE.note}


def template_rows(data: dict) -> dict:
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


def read_rows(tables: dict, data: dict, problems: list, cells: dict) -> None:
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
