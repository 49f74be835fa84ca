"""Constructions, Layers and Corrections sheets of the fill-in template.

One row per ``[[constructions]]`` table; its layers and corrections on their own sheets,
each naming its construction. Rows read back become the same project data, and the cell of
every key is noted so that a problem names its sheet and cell.
"""

from __future__ import annotations

from .template_tables import note_cells

__all__ = ["template_rows", "read_rows"]

#: Child sheets: sheet name -> key of the list in a construction table.
_CHILDREN = (("Layers", "layers"), ("Corrections", "corrections"))


def template_rows(data: dict) -> dict:
    """Template rows of the Constructions, Layers and Corrections sheets.

    Parameters
    ----------
    data : dict
        Project data in the project-file schema. [-]

    Returns
    -------
    dict
        Sheet name -> list of rows keyed by column key. [-]
    """
    cons = data.get("constructions", [])
    rows = {"Constructions": [{k: v for k, v in c.items() if k not in ("layers", "corrections")}
                              for c in cons]}
    for sheet, child in _CHILDREN:
        rows[sheet] = [dict(row, construction=c.get("name", ""))
                       for c in cons for row in c.get(child, [])]
    return rows


def read_rows(tables: dict, data: dict, problems: list, cells: dict) -> None:
    """Add ``constructions`` read from the template's sheets to ``data``.

    Parameters
    ----------
    tables : dict
        Sheet name -> list of (row, where) as read by the template reader. [-]
    data : dict
        Project data being assembled; gains ``constructions``. [-]
    problems : list
        A layer or correction naming no construction of the sheet is appended as
        ``(cell, message)``. [-]
    cells : dict
        Key path -> cell, extended for every key read. [-]
    """
    constructions = []
    by_name: dict[str, dict] = {}
    for i, (row, where) in enumerate(tables.get("Constructions", []), 1):
        row = dict(row, layers=[])
        constructions.append(row)
        key = f"constructions[{i}]"
        note_cells(cells, key, where)
        name = str(row.get("name", "")).strip().lower()
        if name not in by_name:  # a duplicate is reported by the project parser
            by_name[name] = {"row": row, "key": key}
    for sheet, child in _CHILDREN:
        for row, where in tables.get(sheet, []):
            _attach(dict(row), where, child, by_name, constructions, problems, cells)
    for c in constructions:
        if not c.get("corrections"):
            c.pop("corrections", None)
    data["constructions"] = constructions


def _attach(row, where, child, by_name, constructions, problems, cells) -> None:
    owner = str(row.pop("construction", "") or "").strip()
    target = by_name.get(owner.lower())
    if target is None:
        choices = ", ".join(repr(c.get("name", "")) for c in constructions) or "none"
        problems.append((where["construction"], f"construction {owner!r} is not on the "
                         f"Constructions sheet; choose one of {choices}"))
        return
    lst = target["row"].setdefault(child, [])
    lst.append(row)
    note_cells(cells, f"{target['key']}.{child}[{len(lst)}]", where)
