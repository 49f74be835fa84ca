"""Calculation-sheet blocks of one construction, built from the engine's results.

Every step a reviewer follows is a live formula: ``R = d/lambda``, the lower-limit
conductivity of a bridged layer, the upper/lower limits and their error, the corrections,
``R_T``, ``U = 1/R_T`` and U to two significant figures, the interface temperatures from the
design temperatures, and the finite-volume nodal table with the coefficients ``a_W``,
``a_E``, ``a_P``, ``b`` and the tridiagonal forward sweep and back substitution (Thomas
algorithm), so the nodal temperatures recompute in any spreadsheet program. Beside each
formula result stands the engine's value as a constant and a check cell that says ``OK``
when both agree within the tolerance stated in the sheet header, and a text beginning with
``MISMATCH`` otherwise.

References
----------
EN ISO 6946:2017, 6.7 (total resistance, 6.7.2 upper and lower limits), 6.8 / Table 7
(surface resistances), 6.9 (air layers), Annex F (corrections), clause 8 (two significant
figures). S. V. Patankar, *Numerical Heat Transfer and Fluid Flow*, 1980, ch. 4 (discretisation
equations and the tridiagonal-matrix algorithm).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

from .plan import PrintSetup, Sheet, WorkbookPlan, col_letter, sheet_ref
from .rows import RowLayout

__all__ = ["ConstructionRefs", "add_calculation_sheet",
           "put_warning", "DEFAULT_CHECK_TOLERANCE"]

#: Relative tolerance of the check cells: spreadsheet and engine both compute in IEEE
#: doubles, so they agree to ~1e-13; 1e-9 leaves room for a different summation order.
DEFAULT_CHECK_TOLERANCE = 1e-9

FMT_MM = "0.0"
FMT_LAMBDA = "0.0000"
FMT_R = "0.0000"
FMT_U = "0.0000"
FMT_T = "0.000"
FMT_COEF = "0.0000"
FMT_SMALL = "0.000E+00"
#: U to two significant figures shown with exactly two (0.20, 0.085, 1.4), not 0.200.
FMT_U_2SF = "[<0.1]0.000;[<1]0.00;0.0"

LAYER_COLUMNS = [
    ("No.", 5), ("Layer", 30), ("Kind", 11), ("Material", 24), ("d [mm]", 10),
    ("λ [W/(m K)]", 11), ("R own [m2 K/W]", 11), ("Counted [1/0]", 10), ("Factor [-]", 10),
    ("R used [m2 K/W]", 11), ("Engine R used [m2 K/W]", 12), ("Check", 10),
    ("FV cells [-]", 9), ("Rule / note", 10),
]
FV_COLUMNS = [
    "Node", "Layer", "w [m]", "k [W/(m K)]", "x [mm]", "G east [W/(m2 K)]", "a_W [W/(m2 K)]",
    "a_E [W/(m2 K)]", "a_P [W/(m2 K)]", "b [W/m2]", "P [-]", "Q [degC]", "T [degC]",
    "Engine a_W [W/(m2 K)]", "Engine a_E [W/(m2 K)]", "Engine a_P [W/(m2 K)]",
    "Engine b [W/m2]", "Engine T [degC]",
    "Engine x [mm]", "Check x and coefficients", "Check T",
]
#: Rows 1 to HEADER_ROWS hold the title, the design data and the sheet's check count.
HEADER_ROWS = 10
#: Width of every column of a construction sheet (A, B, ...), in characters.
COLUMN_WIDTHS = [5, 30, 10, 24, 9, 9, 9, 9, 9, 9, 9, 9, 9, 24]
#: Width of every column of a construction's finite-volume appendix, in characters.
FV_WIDTHS = [5, 24, 10, 10, 9, 10, 10, 10, 10, 10, 10, 10, 10, 10, 10, 10, 10, 10, 10, 12, 10]
#: The appendix prints the sheet's own solve (node to T) on one page, the engine's values
#: and the checks on the next.
FV_PAGE_BREAK = 13


@dataclass
class ConstructionRefs:
    """Where a construction sheet keeps its key results (for the summary and cover).

    Attributes
    ----------
    sheet : str
        Sheet name.
    name : str
        Construction name.
    r_total, u_value, u_reported : str
        Absolute references (``'Sheet'!$G$30``) of R_T, U and U to two significant figures.
    checks_ok : str
        Reference of the cell counting the sheet's check cells that say OK.
    check_count : int
        Number of check cells on the sheet.
    heat_flux : str
        Reference of the heat flux cell. [-]
    extras : dict
        Further cell references by name. [-]
    """

    sheet: str
    name: str
    r_total: str
    u_value: str
    u_reported: str
    checks_ok: str
    check_count: int
    heat_flux: str = ""
    extras: dict = field(default_factory=dict)

#: Columns of a construction sheet's rows: label B, value G, engine K, check L, note N.
CONSTRUCTION_ROWS = RowLayout(default_format=FMT_R)


def _solution_record(w, temps) -> None:
    """The engine's energy balance and mesh estimate, stated with what each shows."""
    est = temps.mesh_estimate
    w.put(2, "Engine solution record (stated values)", style="hl label")
    w.row += 1
    rows = [("energy-balance residual, relative [-]", temps.energy_residual, FMT_SMALL,
             "shows conservation and solver rounding; it cannot reveal a wrong coefficient "
             "(the ladder check above can)")]
    if est.exact and not est.meshes:
        w.put(2, f"mesh: {est.basis}", role="note")
        w.row += 1
    else:
        rows += [(f"heat flux on {m} cells [W/m2]", v, "0.000000", "")
                 for m, v in zip(est.meshes, est.values, strict=True)]
        rows += [("observed order of convergence [-]", est.order, "0.00", est.basis),
                 ("extrapolated heat flux [W/m2]", est.extrapolated, "0.000000", ""),
                 ("mesh error bound of the heat flux [W/m2]", est.error_estimate, FMT_SMALL,
                  "1.25 × the Richardson error with the observed order"),
                 ("largest interface-temperature change to the next mesh [K]",
                  temps.mesh_temperature_change, FMT_SMALL, "")]
    for label, val, fmt, note in rows:
        w.put(2, label)
        if math.isfinite(val):
            w.put(7, float(val), role="engine", fmt=fmt)
        else:
            w.put(7, "none", role="engine")
        if note:
            w.put(14, note, role="note")
        w.row += 1


def add_calculation_sheet(plan: WorkbookPlan, sheet_name: str, widths, header: str) -> Sheet:
    """Add a calculation sheet as every family lays it out: landscape A4 across one page
    width, rows 1 to 3 (title, note, caution) frozen and repeated on every printed page.

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook plan to extend. [-]
    sheet_name : str
        Name of the new sheet. [-]
    widths : sequence of float
        Column widths from column A on. [characters]
    header : str
        Page header (project and item). [-]

    Returns
    -------
    Sheet
    """
    return plan.add_sheet(
        sheet_name, column_widths={col_letter(i + 1): w for i, w in enumerate(widths)},
        freeze="A4",
        print_setup=PrintSetup(orientation="landscape", header=header,
                               footer_left="heatledger calculation sheet {sheet}",
                               footer_right="page {page} of {pages}", title_rows="1:3"))


def put_check_counters(w, label_col: int) -> None:
    """The labels of a calculation sheet's check counters, rows 4 to 6 of ``label_col``.

    Parameters
    ----------
    w : CheckRows
        The sheet's row writer. [-]
    label_col : int
        Column of the labels (the counts stand in column J). [-]
    """
    for row, label in ((4, "Check cells on this sheet"), (5, "Check cells that say OK"),
                       (6, "State of this sheet")):
        w.put(label_col, label, row=row)


def put_sheet_state(w, first_row: int, last_col: str) -> str:
    """The check counters of a finished calculation sheet (J4 to J6): the checks written, the
    ones that say OK in ``A{first_row}`` to the last row written, and the state; return the
    OK count's cell.

    Parameters
    ----------
    w : CheckRows
        The sheet's row writer, after its last row. [-]
    first_row : int
        First row searched for "OK". [-]
    last_col : str
        Last column searched. [-]
    """
    last = w.row
    w.block = w.sheet.block("header")
    count = w.put(10, w.checks, role="engine", fmt="0", row=4)
    ok = w.put(10, formula=f'=COUNTIF(A{first_row}:{last_col}{last},"OK")', fmt="0", row=5)
    w.put(10, formula=f'=IF({ok}={count},"ALL CHECKS OK","NOT ALL OK")', style="hl check",
          row=6)
    return ok


def put_overview_state(b, row: int, count: int, ok_ref: str, cols: str) -> None:
    """One row of an overview sheet's checks: the sheet's check count, the OK count (a
    reference to the sheet) and the state, in the three columns ``cols`` (``"GHI"``).

    Parameters
    ----------
    b : Block
        The overview's block. [-]
    row : int
        Row. [-]
    count : int
        Check cells on the sheet. [-]
    ok_ref : str
        The sheet's cell counting the checks that say OK. [-]
    cols : str
        Three column letters. [-]
    """
    c_count, c_ok, c_state = cols
    b.put(f"{c_count}{row}", count, role="engine", number_format="0")
    b.put(f"{c_ok}{row}", formula=f"={ok_ref}", number_format="0")
    b.put(f"{c_state}{row}",
          formula=f'=IF({c_ok}{row}={c_count}{row},"ALL CHECKS OK","NOT ALL OK")',
          style="hl check")


def put_overview_totals(sheet, b, first: int, n_rows: int, label: str, cols: str) -> dict:
    """The total check counts under an overview table; return ``{"count", "ok"}`` refs.

    Parameters
    ----------
    sheet : Sheet
        The overview sheet. [-]
    b : Block
        Its block. [-]
    first : int
        First row of the table. [-]
    n_rows : int
        Rows of the table. [-]
    label : str
        Text of the totals row. [-]
    cols : str
        The count and OK columns (``"GH"``). [-]
    """
    last = first + max(n_rows, 1) - 1
    t = last + 2
    c_count, c_ok = cols[0], cols[1]
    b.put(f"B{t}", label)
    count = b.put(f"{c_count}{t}", formula=f"=SUM({c_count}{first}:{c_count}{last})",
                  number_format="0").ref
    ok = b.put(f"{c_ok}{t}", formula=f"=SUM({c_ok}{first}:{c_ok}{last})",
               number_format="0").ref
    return {"count": sheet_ref(sheet.name, count), "ok": sheet_ref(sheet.name, ok)}


def put_warning(w, text: str | None = None, *, formula: str | None = None,
                last_col: str = "N") -> str:
    """Write a warning on its own row from column B, merged to ``last_col`` so that it reads
    on one or two lines instead of wrapping in the narrow label column; move to the next row.

    Parameters
    ----------
    w : row writer
        A sheet's row writer (``put(col, ...)``, ``row``, ``sheet``). [-]
    text : str, optional
        The warning. [-]
    formula : str, optional
        A formula giving the warning text instead. [-]
    last_col : str
        Last column of the merged range. [-]

    Returns
    -------
    str
        The reference of the warning cell. [-]
    """
    a1 = w.put(2, text, formula=formula, style="hl warning")
    w.sheet.merges.append(f"B{w.row}:{last_col}{w.row}")
    w.row += 1
    return a1


def _pick(names, idx: int) -> str:
    if names is None or idx >= len(names):
        return ""
    return str(names[idx] or "")


def _material_link(refs, name: str, conductivity) -> str:
    """Reference of the material's λ cell when the layer uses exactly that value."""
    if not refs or not name or conductivity is None:
        return ""
    hit = refs.get(name.strip().lower())
    if hit is None:
        return ""
    ref, lam = hit
    return ref if float(lam) == float(conductivity) else ""


def _product(lists):
    """All combinations, the first list varying slowest (as :func:`itertools.product`)."""
    out = [[]]
    for options in lists:
        out = [prev + [o] for prev in out for o in options]
    return out
