"""Audit sheets of the moisture family: an overview ``Moisture`` and one calculation sheet
per check (:mod:`heatledger.sheet.moisture_sheet`,
:mod:`heatledger.sheet.moisture_glaser_sheet`).

Sources: [source: iso13788-surface, clause 5]; [source: iso13788-glaser, clause 6].
"""

from __future__ import annotations

from .. import cautions as _cautions
from .audit import Answer
from .blocks_construction import put_overview_state, put_overview_totals, put_sheet_state
from .moisture_glaser_sheet import glaser_sections
from .moisture_sheet import (
    HEADER_ROWS,
    climate_section,
    layer_section,
    moisture_setup,
    surface_section,
)
from .plan import PrintSetup, WorkbookPlan, col_letter, safe_sheet_name, sheet_ref

__all__ = ["add_sheets", "topics", "add_moisture_sheet", "MOISTURE_METHODS"]

#: Methods stated on the cover when the project has moisture checks.
MOISTURE_METHODS = (
    "Surface humidity: f_Rsi,min per month for a critical surface relative humidity of 0.8 "
    "(mould) or 1.0 (condensation), f_Rsi of the plane construction with R_si = 0.25 m2 K/W "
    "(EN ISO 13788:2012, clause 5; saturation pressure Annex E)",
    "Interstitial condensation: the monthly Glaser method (EN ISO 13788:2012, clause 6) with "
    "EN ISO 6946 surface resistances; condensation planes at the layer interfaces; "
    "evaporation capped at what is held; start in the first month, from January, that "
    "condenses after one that does not",
    "Internal humidity classes of EN ISO 13788 Annex A with the 1.10 margin on the "
    "vapour-pressure excess, where a climate names a class",
)


def add_moisture_sheet(plan: WorkbookPlan, sheet_name: str, entry, *, tolerance: float,
                       project_name: str = "") -> dict:
    """Add the calculation sheet of one moisture check.

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook plan to extend. [-]
    sheet_name : str
        Name of the new sheet. [-]
    entry : heatledger.moisture.project_io.MoistureEntry
        The check. [-]
    tolerance : float
        Relative tolerance of the check cells. [-]
    project_name : str
        Project name for the page header. [-]

    Returns
    -------
    dict
        Cells of the sheet's results (``f_rsi``, ``surface``, ``verdict``, ``peak``,
        ``ok``) and its check count (``count``).
    """
    st = moisture_setup(plan, sheet_name, entry, tolerance, project_name)
    layer_section(st)
    climate_section(st)
    surface_section(st)
    glaser_sections(st)
    w = st.w
    ok = put_sheet_state(w, HEADER_ROWS, col_letter(40))
    s = sheet_name
    return {"f_rsi": sheet_ref(s, st.f_rsi), "surface": sheet_ref(s, st.surface_result),
            "verdict": sheet_ref(s, st.verdict_cell) if hasattr(st, "verdict_cell") else None,
            "peak": sheet_ref(s, st.peak_cell) if hasattr(st, "peak_cell") else None,
            "ok": sheet_ref(s, ok), "count": w.checks}


def add_sheets(plan: WorkbookPlan, project, audit) -> None:
    """Add the moisture overview and one sheet per check (hook of
    :mod:`heatledger.families`).

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook plan to extend. [-]
    project : heatledger.project.Project
        A parsed project with moisture checks. [-]
    audit : heatledger.sheet.audit.AuditContext
        Shared state of the audit; gains the checks' counts. [-]
    """
    overview = plan.add_sheet(
        "Moisture", column_widths={col_letter(i + 1): w for i, w in enumerate(
            [5, 40, 26, 12, 22, 26, 12, 12, 16])},
        freeze="A6", print_setup=PrintSetup(orientation="landscape",
                                            header=f"{audit.title} | {{sheet}}",
                                            footer_left="heatledger audit {sheet}",
                                            title_rows="1:5"))
    refs, used = [], set()
    for i, entry in enumerate(project.moisture, 1):
        name = safe_sheet_name(f"Moist {i} {entry.name}", used,
                               reserved=[s.name for s in plan.sheets])
        cells = add_moisture_sheet(plan, name, entry, tolerance=audit.tolerance,
                                   project_name=audit.title)
        refs.append((entry, name, cells))
        audit.answers.append(Answer(f"Moisture {entry.name}",
                                    f'="surface humidity (EN ISO 13788): "&{cells["surface"]}'))
        if cells["verdict"]:
            audit.answers.append(Answer(f"Moisture {entry.name}",
                                        f'="interstitial condensation: "&{cells["verdict"]}'))
    audit.counts.append(_overview(overview, refs))
    audit.check_lists.append("Moisture")


def _overview(sheet, refs) -> dict:
    b = sheet.block("overview")
    b.put("A1", "Moisture checks (EN ISO 13788)", style="hl title")
    sheet.merges.append("A1:I1")
    b.put("A2", _cautions.CAUTIONS["moisture"], style="hl warning")
    sheet.merges.append("A2:I2")
    sheet.row_heights[2] = 45.0
    b.put("A3", "Values are live references to the check sheets.", role="note")
    heads = ["No.", "Check", "Sheet", "f_Rsi [-]", "Surface humidity", "Interstitial "
             "condensation", "Check cells", "Checks OK", "State"]
    for j, head in enumerate(heads, 1):
        b.put(f"{col_letter(j)}5", head, role="header")
    first = 6
    for i, (entry, name, cells) in enumerate(refs):
        row = first + i
        b.put(f"A{row}", i + 1)
        b.put(f"B{row}", entry.name, style="hl text")
        b.put(f"C{row}", name, style="hl text")
        b.put(f"D{row}", formula=f"={cells['f_rsi']}", number_format="0.000")
        b.put(f"E{row}", formula=f"={cells['surface']}", style="hl text")
        if cells["verdict"]:
            b.put(f"F{row}", formula=f"={cells['verdict']}", style="hl text")
        put_overview_state(b, row, cells["count"], cells["ok"], "GHI")
    return put_overview_totals(sheet, b, first, len(refs), "Check cells on the moisture sheets",
                               "GH")


def topics(project) -> tuple:
    """Methods and cautions the cover lists when the project has moisture checks.

    Parameters
    ----------
    project : heatledger.project.Project
        A parsed project. [-]

    Returns
    -------
    tuple
        ``(methods, cautions)``. [-]
    """
    del project
    return MOISTURE_METHODS, _cautions.caution_lines("moisture")
