"""What-if edits of an audit workbook: the inputs as the engine ran on them are recorded on
a ``Record`` sheet, each beside a live reference to its cell; when a number on a sheet no
longer equals its recorded value, that sheet and the cover say that the inputs changed since
the record was made (the checks then compare against the recorded run) instead of reporting
failed checks. An untouched record still says ALL CHECKS OK.
"""

from __future__ import annotations

import numbers

from .plan import PrintSetup, WorkbookPlan, sheet_ref

__all__ = ["add_record_sheet", "RECORD_SHEET", "CHANGED_TEXT"]

RECORD_SHEET = "Record"
#: What a sheet says when its inputs changed.
CHANGED_TEXT = ("WHAT-IF: inputs changed since the record (see the Record sheet); checks "
                "compare against the recorded run")
_STATE = '"ALL CHECKS OK","NOT ALL OK")'


def _recordable(cell) -> bool:
    return (cell.role == "input" and cell.formula is None and not isinstance(cell.value, bool)
            and isinstance(cell.value, numbers.Real))


def add_record_sheet(plan: WorkbookPlan, title: str) -> str | None:
    """Record every numeric input of the calculation sheets and let each sheet's state say
    when one was changed; return the cell counting the changed inputs (None: no inputs).

    Parameters
    ----------
    plan : WorkbookPlan
        The audit plan, its sheets complete. [-]
    title : str
        Page header. [-]

    Returns
    -------
    str or None
        Absolute reference of the count of changed inputs.
    """
    sources = [(s, [c for c in s.cells() if _recordable(c)]) for s in plan.sheets]
    sources = [(s, cells) for s, cells in sources if cells]
    if not sources:
        return None
    rec = plan.add_sheet(RECORD_SHEET, column_widths={"A": 34, "B": 10, "C": 18, "D": 18,
                                                      "E": 10},
                         freeze="A4", print_setup=PrintSetup(
                             orientation="portrait", header=f"{title} | {{sheet}}",
                             footer_left="heatledger audit {sheet}",
                             footer_right="page {page} of {pages}", title_rows="1:3"))
    b = rec.block("record")
    b.put("A1", "Inputs as the engine ran on them", style="hl title")
    b.put("A2", "Each numeric input of the calculation sheets, recorded when the workbook was "
                "made, beside its current value; changed = 1 where they differ (a what-if).",
          role="note")
    for j, head in enumerate(("Sheet", "Cell", "Recorded", "Now", "Changed"), 1):
        b.put(f"{'ABCDE'[j - 1]}3", head, role="header")
    r = 4
    first = r
    for sheet, cells in sources:
        for c in cells:
            b.put(f"A{r}", sheet.name, style="hl text")
            b.put(f"B{r}", c.ref, style="hl text")
            b.put(f"C{r}", float(c.value), role="engine", number_format="General")
            b.put(f"D{r}", formula=f"={sheet_ref(sheet.name, c.ref)}", number_format="General")
            b.put(f"E{r}", formula=f"=IF(D{r}=C{r},0,1)", number_format="0")
            r += 1
    total = b.put(f"D{r + 1}", formula=f"=SUM(E{first}:E{r - 1})", number_format="0")
    b.put(f"A{r + 1}", "Inputs changed since the record was made")
    total_ref = sheet_ref(RECORD_SHEET, total.ref)
    for sheet in plan.sheets:  # a changed material changes the sheets that use it too
        _mark_state(sheet, total_ref)
    return total_ref


def _mark_state(sheet, changed: str) -> None:
    """Wrap the sheet's state cells: a what-if says so before the check result.

    Parameters
    ----------
    sheet : Sheet
        A sheet of the plan. [-]
    changed : str
        Reference of the count of changed inputs. [-]
    """
    for c in sheet.cells():
        if c.formula and c.formula.endswith(_STATE) and c.formula.startswith("=IF("):
            c.formula = f'=IF({changed}>0,"{CHANGED_TEXT}",{c.formula[1:]})'
