"""The finite-volume appendix of a construction: the nodal table (coefficients, the Thomas
algorithm, the engine's values and a check per cell) on a sheet of its own, and a one-line
summary (cells, mesh estimate, energy residual) on the construction sheet.

A building-services checker reads the construction sheet (layers, resistances, U, the
resistance ladder); the appendix is there for whoever checks the numerical method. Its check
cells count towards the construction sheet's, so the Summary and the cover see every one.
"""

from __future__ import annotations

import math

from .addresses import safe_sheet_name
from .blocks_construction import (
    CONSTRUCTION_ROWS,
    FMT_COEF,
    FMT_LAMBDA,
    FMT_SMALL,
    FMT_T,
    FV_COLUMNS,
    FV_PAGE_BREAK,
    FV_WIDTHS,
    HEADER_ROWS,
    _solution_record,
    add_calculation_sheet,
    put_check_counters,
    put_warning,
)
from .plan import sheet_ref
from .rows import CheckRows

__all__ = ["add_fv_appendix", "APPENDIX_PREFIX"]

#: Start of the name of every finite-volume appendix sheet.
APPENDIX_PREFIX = "FV "


def add_fv_appendix(st) -> None:
    """Write the appendix sheet of the construction in ``st`` and the summary row on the
    construction sheet.

    Parameters
    ----------
    st : types.SimpleNamespace
        The construction sheet's state (plan, sheet name, engine temperatures, the cells of
        the layer rows and of Rsi, Rse, θi, θe, R_T); gains ``fv_sheet``, ``fv_w``,
        ``fv_ok``, ``node0`` and ``nodeN``. [-]
    """
    used = {s.name for s in st.plan.sheets}
    st.fv_sheet = safe_sheet_name(APPENDIX_PREFIX + st.sheet_name, used)
    sheet = add_calculation_sheet(st.plan, st.fv_sheet, FV_WIDTHS,
                                  f"{st.project_name} | {st.name} | finite volumes")
    sheet.col_breaks.append(FV_PAGE_BREAK)
    st.fv_w = CheckRows(sheet, sheet_ref(st.sheet_name, st.w.tol), CONSTRUCTION_ROWS)
    _appendix_header(st)
    _nodal_heading(st)
    _nodal_rows(st)
    _nodal_checks(st)
    _appendix_counters(st)
    _summary_row(st)


def _on(st, a1: str) -> str:
    """A cell of the construction sheet, referred to from the appendix."""
    return sheet_ref(st.sheet_name, a1)


def _appendix_header(st) -> None:
    """Title, what the sheet is, the link back and the places of the check counters."""
    w = st.fv_w
    w.put(1, f"{st.name}: finite-volume temperatures (appendix to sheet {st.sheet_name})",
          style="hl title")
    w.sheet.merges.append("A1:N1")
    w.row = 2
    w.put(1, "The numerical method in full: every coefficient and every step of the solve "
             "is a live formula beside the engine's value. Layer data, temperatures and the "
             "tolerance are those of the construction sheet.", role="note")
    put_check_counters(w, 6)
    w.row = 4
    link = st.sheet_name.replace("'", "''")
    w.put(2, formula=f'=HYPERLINK("#\'{link}\'!A1","back to the construction sheet")',
          style="hl text")
    w.row = HEADER_ROWS


def _nodal_heading(st) -> None:
    """Section title, the method, the boundary conductances and the table header."""
    w, temps = st.fv_w, st.temps
    w.start("fv", "Finite-volume nodal temperatures (cell-centred, Patankar 1980 ch. 4)")
    fv = temps.fv
    w.put(2, "Cell-centred finite volumes; face conductance G = 1/(w_i/(2k_i) + w_(i+1)/(2k_("
             "i+1))); a_P T_i = a_W T_(i−1) + a_E T_(i+1) + b. Solved here by the Thomas "
             "algorithm (P_i = a_E/(a_P − a_W P_(i−1)), Q_i = (b + a_W Q_(i−1))/(a_P − a_W "
             "P_(i−1)), T_i = P_i T_(i+1) + Q_i); by the engine with LAPACK pttrf/pttrs.",
          role="note")
    w.row += 1
    n = fv.temperature.size
    node0 = w.row + 3  # two boundary rows and the header row come first
    nodeN = node0 + n - 1
    st.g_left = w.value_row(
        "boundary conductance inside G_i = 1/(w_1/(2k_1) + Rsi) [W/(m2 K)]",
        formula=f"=1/(C{node0}/(2*D{node0})+{_on(st, st.rsi)})",
        engine=fv.a_centre[0] - fv.a_east[0] - fv.a_west[0] if n > 1 else None,
        fmt=FMT_COEF)
    st.g_right = w.value_row(
        "boundary conductance outside G_e = 1/(w_N/(2k_N) + Rse used) [W/(m2 K)]",
        formula=f"=1/(C{nodeN}/(2*D{nodeN})+{_on(st, st.rse_used_ref)})",
        engine=fv.a_centre[-1] - fv.a_west[-1] - fv.a_east[-1] if n > 1 else None,
        fmt=FMT_COEF)
    w.headers(FV_COLUMNS)
    assert w.row == node0, (w.row, node0)
    st.fv, st.n, st.node0, st.nodeN = fv, n, node0, nodeN


def _nodal_rows(st) -> None:
    """One row per cell: coefficients, the Thomas algorithm and the checks."""
    w, fv, n = st.fv_w, st.fv, st.n
    g_left, g_right = st.g_left, st.g_right
    ti, te = _on(st, st.ti), _on(st, st.te)
    for i in range(n):
        rr = w.row
        lr = st.layer_row[int(st.temps.layer_of_node[i])]
        first, last = i == 0, i == n - 1
        w.put(1, i + 1)
        w.put(2, formula=f"={_on(st, f'B{lr}')}", style="hl label")
        w.put(3, formula=f"={_on(st, f'E{lr}')}/1000/{_on(st, f'M{lr}')}", fmt="0.000000")
        w.put(4, formula=f"={_on(st, f'E{lr}')}/1000/{_on(st, f'J{lr}')}", fmt=FMT_LAMBDA)
        w.put(5, formula=f"=C{rr}*1000/2" if first else f"=E{rr - 1}+(C{rr - 1}+C{rr})*1000/2",
              fmt="0.00")
        if not last:
            w.put(6, formula=f"=1/(C{rr}/(2*D{rr})+C{rr + 1}/(2*D{rr + 1}))", fmt=FMT_COEF)
        w.put(7, 0.0 if first else None, formula=None if first else f"=F{rr - 1}",
              role="engine" if first else "formula", fmt=FMT_COEF)
        w.put(8, 0.0 if last else None, formula=None if last else f"=F{rr}",
              role="engine" if last else "formula", fmt=FMT_COEF)
        ap = f"=G{rr}+H{rr}" + (f"+{g_left}" if first else "") + (f"+{g_right}" if last else "")
        w.put(9, formula=ap, fmt=FMT_COEF)
        b_terms = ([f"{g_left}*{ti}"] if first else []) + ([f"{g_right}*{te}"] if last else [])
        w.put(10, formula="=" + "+".join(b_terms) if b_terms else None,
              value=None if b_terms else 0.0, role="formula" if b_terms else "engine",
              fmt=FMT_COEF)
        _thomas_cells(w, rr, first, last)
        _engine_cells(w, fv, i, rr)
        w.row += 1
    w.row += 1
    w.value_row("heat flux through the inside surface q = G_i (θi − T_1) [W/m2]",
                formula=f"={g_left}*({ti}-M{st.node0})", engine=st.temps.heat_flux,
                fmt="0.0000")
    w.value_row("heat flux through the outside surface q = G_e (T_N − θe) [W/m2]",
                formula=f"={g_right}*(M{st.nodeN}-{te})", engine=st.temps.heat_flux_outside,
                fmt="0.0000")


def _thomas_cells(w, rr: int, first: bool, last: bool) -> None:
    """P, Q and T of one row of the Thomas algorithm (columns K, L, M)."""
    if first:
        w.put(11, formula=f"=H{rr}/I{rr}", fmt="0.000000")
        w.put(12, formula=f"=J{rr}/I{rr}", fmt="0.000000")
    else:
        den = f"(I{rr}-G{rr}*K{rr - 1})"
        w.put(11, formula=f"=H{rr}/{den}", fmt="0.000000")
        w.put(12, formula=f"=(J{rr}+G{rr}*L{rr - 1})/{den}", fmt="0.000000")
    w.put(13, formula=f"=L{rr}" if last else f"=K{rr}*M{rr + 1}+L{rr}", fmt=FMT_T)


def _engine_cells(w, fv, i: int, rr: int) -> None:
    """The engine's coefficients, temperature and position of cell ``i``, and two checks."""
    for col, arr in zip((14, 15, 16, 17, 18, 19),
                        (fv.a_west, fv.a_east, fv.a_centre, fv.b, fv.temperature,
                         fv.x * 1000.0),
                        strict=True):
        w.put(col, float(arr[i]), role="engine",
              fmt={18: FMT_T, 19: "0.00"}.get(col, FMT_COEF))
    t = w.tol
    conds = ",".join(f"ABS({a}{rr}-{e}{rr})<={t}*MAX(1,ABS({e}{rr}))"
                     for a, e in (("G", "N"), ("H", "O"), ("I", "P"), ("J", "Q"), ("E", "S")))
    w.checks += 1
    w.put(20, formula=f'=IF(AND({conds}),"OK","MISMATCH: x or a coefficient differs")',
          role="check")
    w.check(21, f"M{rr}", f"R{rr}")


def _nodal_checks(st) -> None:
    """The closed-form flux against the finite-volume flux, the solution record, warnings."""
    w, temps = st.fv_w, st.temps
    if temps.ladder_heat_flux is not None:
        w.value_row("independent check: ladder heat flux q = (θi − θe)/R_T [W/m2]",
                    formula=f"=({_on(st, st.ti)}-{_on(st, st.te)})/{_on(st, st.r_total)}",
                    engine=temps.heat_flux, fmt="0.0000",
                    note="the closed form (6.7.1) against the finite-volume flux: they agree "
                         "only if every coefficient of the solve is right")
    _solution_record(w, temps)
    st.fv_last_row = w.row


def _appendix_counters(st) -> None:
    """The appendix's own check counters (J4:J6)."""
    w = st.fv_w
    w.block = w.sheet.block("header")
    w.put(10, w.checks, role="engine", fmt="0", row=4)
    w.put(10, formula=f'=COUNTIF(A7:U{st.fv_last_row},"OK")', fmt="0", row=5)
    w.put(10, formula='=IF(J5=J4,"ALL CHECKS OK","NOT ALL OK")', style="hl check",
          role="formula", row=6)
    st.fv_ok = sheet_ref(st.fv_sheet, "J5")


def _summary_row(st) -> None:
    """One line on the construction sheet: cells, mesh estimate, residual, checks, link."""
    w, temps = st.w, st.temps
    est = temps.mesh_estimate
    w.start("fv", "Finite-volume temperatures (details in the appendix)")
    w.headers(["", "Solution", "", "", "Cells", "", "Mesh error bound of q [W/m2]", "", "",
               "", "Energy residual, relative [-]", "Appendix checks OK", "", "Appendix"])
    w.put(2, "1-D cell-centred finite volumes (engine: LAPACK pttrf/pttrs)")
    w.put(5, int(st.n), role="engine", fmt="0")
    bound = est.error_estimate
    if est.exact and not est.meshes:
        w.put(7, "exact", role="engine")
    else:
        w.put(7, float(bound) if math.isfinite(bound) else "none", role="engine",
              fmt=FMT_SMALL)
    w.put(11, float(temps.energy_residual), role="engine", fmt=FMT_SMALL)
    w.put(12, formula=f'={st.fv_ok}&" of "&{sheet_ref(st.fv_sheet, "J4")}', style="hl text")
    link = st.fv_sheet.replace("'", "''")
    w.put(14, formula=f'=HYPERLINK("#\'{link}\'!A1","open the appendix")', style="hl text")
    w.row += 1
    for text in st.con.warnings:
        put_warning(w, f"Warning: {text}")
