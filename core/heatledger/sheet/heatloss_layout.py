"""Layout shared by the heat-loss sheets: formats, header rows, row columns, check counters.
"""

from __future__ import annotations

from .rows import CheckRows, RowLayout

__all__ = ["BUILDING_SHEET", "HEADER_ROWS", "FMT_T", "FMT_H", "FMT_U", "FMT_W", "FMT_SHARE",
           "FMT_SMALL", "TABLE_COLUMNS", "NOTE_STYLE", "HEATLOSS_ROWS"]


#: Name of the building sheet.
BUILDING_SHEET = "Heat loss building"


#: Rows 1 to HEADER_ROWS hold the title, the design data and the sheet's check count.
HEADER_ROWS = 11


FMT_T = "0.0"


FMT_H = "0.000"


FMT_U = "0.0000"


FMT_W = "0.0"


FMT_SHARE = "0.0%"


FMT_SMALL = "0.000E+00"


#: Columns of the element table.
TABLE_COLUMNS = [
    ("No.", 5), ("Element / line", 28), ("Kind", 11), ("Boundary", 26), ("Quantity", 10),
    ("Unit", 7), ("U, ψ, χ", 11), ("ΔU_TB [W/(m2 K)]", 10), ("θ other side [degC]", 10),
    ("Factor f [-]", 10), ("H [W/K]", 11), ("Engine H [W/K]", 11), ("Check H", 10),
    ("Φ [W]", 11), ("Share [-]", 9), ("Engine share [-]", 9), ("Check share", 10),
    ("Internal [1/0]", 8), ("Rule / source", 60),
]


#: Style of the notes in the last column: wrapped there, so a long provenance does not
#: run on past the table and shrink the printed page.
NOTE_STYLE = "hl note wrap"


#: Columns of a heat-loss sheet's rows: label B, value G, engine L, check M, note S.
HEATLOSS_ROWS = RowLayout(engine=12, check=13, note=19, default_format=FMT_H,
                          note_style=NOTE_STYLE, header_height=27.0)


def _counters(w: CheckRows, last_row: int, columns: str) -> tuple[str, str]:
    """Fill the check counters of the header (F4:J6); return (count, ok) refs.

    Only the check columns are counted, so a name that reads "OK" is not a check.
    """
    w.block = w.sheet.block("header")
    w.put(6, "Check cells on this sheet", row=4)
    count = w.put(10, w.checks, role="engine", fmt="0", row=4)
    w.put(6, "Check cells that say OK", row=5)
    terms = "+".join(f'COUNTIF({c}{HEADER_ROWS + 1}:{c}{last_row},"OK")' for c in columns)
    ok = w.put(10, formula=f"={terms}", fmt="0", row=5)
    w.put(6, "State of this sheet", row=6)
    w.put(10, formula=f'=IF({ok}={count},"ALL CHECKS OK","NOT ALL OK")',
          style="hl check", role="formula", row=6)
    return count, ok

#: Cells of the building sheet's header: theta_e, DD, DD base, tolerance, f_g1, G_w, theta_m,e.
_B_TE, _B_DD, _B_BASE, _B_TOL, _B_FG1, _B_GW, _B_TME = "C4", "C5", "C6", "C7", "C8", "C9", "C10"
