"""The finite-volume block of a fin sheet: the nodal table with its coefficients, the Thomas
algorithm as live formulas and the engine check.
"""

from __future__ import annotations

import math
from types import SimpleNamespace

from .._constants import STEFAN_BOLTZMANN as Stefan_Boltzmann
from .._constants import ZERO_CELSIUS as zero_Celsius
from ..fins.annular import AnnularFin
from .blocks_construction import put_warning
from .blocks_fins_closed import (
    F_E,
    F_G,
    F_T,
)

__all__ = ["FV_COLUMNS"]


FV_COLUMNS = ["Cell", "x [mm]", "A [m2]", "P [m]", "G east [W/K]", "a_W [W/K]", "a_E [W/K]",
              "S_p [W/K]", "S_c [W]", "a_P [W/K]", "b [W]", "P [-]", "Q [degC]", "T [degC]",
              "Engine a_W", "Engine a_E", "Engine a_P", "Engine b", "Engine T [degC]",
              "Check coefficients", "Check T", "Loss [W]"]


# --------------------------------------------------------------------------- finite volumes
def _fv(w, r, fin, entry):
    state = SimpleNamespace(w=w, r=r, fin=fin, entry=entry)
    _fvs_setup(state)
    _fvs_tip_and_table_heading(state)
    _fvs_nodal_rows(state)
    return _fvs_results(state)


def _fvs_setup(state) -> None:
    """The settings and the mesh of the finite volumes."""
    entry = state.entry
    fin = state.fin
    r = state.r
    w = state.w
    fv = entry.finite_volume()
    sol = fv.solution
    st = fv.settings
    nonlinear = st["linearisation"] != "none (linear problem)"
    n = st["cells"]
    annular = isinstance(fin, AnnularFin)
    w.start("fv", "Finite volumes (cell-centred, Patankar 1980 ch. 4; heatledger.fv1d)")
    w.put(2, "a_P T_i = a_W T_(i−1) + a_E T_(i+1) + b with the loss to the fluid as the "
             "source S = S_c + S_p T; G = 1/(dx/(2λA_i) + dx/(2λA_(i+1))). Solved here by the "
             "Thomas algorithm (P_i = a_E/(a_P − a_W P_(i−1)), Q_i = (b + a_W Q_(i−1))/(a_P − "
             "a_W P_(i−1)), T_i = P_i T_(i+1) + Q_i); by the engine with LAPACK pttrf/pttrs.",
          role="note")
    w.row += 1
    cells = w.value_row("number of cells N [-]", value=float(n), fmt="0")
    length = f"({r['r2c']}-{r['r1']})" if annular else (
        r["Le"] if fin.profile == "rectangular" else r["L"])
    dx = w.value_row("dx = length/N [m]", formula=f"={length}/{cells}", engine=st["length"] / n,
                     fmt=F_E)
    law = st["h_law"]
    w.stated("convection law in the finite volumes", law if law == "constant" else
             f"{law}: C = {st['h_parameters']['h_coefficient']:g}, n = "
             f"{st['h_parameters']['h_exponent']:g}")
    w.stated("emissivity for radiation to the surroundings [-]", st["emissivity"], "0.000")
    w.stated("linearisation; iterations; tolerance [K]",
             f"{st['linearisation']}; {fv.iterations}; {st['tolerance_K']:g}")
    if nonlinear:
        w.put(2, "Non-linear loss (h(T) or radiation): a_P and b are the engine's last "
                 "linearisation (Patankar 1980, 7.2), stated as values; G, a_W, a_E, the "
                 "sweep and the loss at the final temperatures are formulas.", role="note")
        w.row += 1
    k, h, tinf = r["k"], r["h"], r["tinf"]
    sig = None
    if nonlinear:
        sig = w.value_row("σ, Stefan–Boltzmann constant [W/(m2 K4)]", value=float(Stefan_Boltzmann),
                          fmt=F_E, note="from the exact SI defining constants, 2 π⁵ k⁴/(15 h³ c²)")
    node0 = w.row + 3
    node_n = node0 + n - 1
    g0 = w.value_row("base conductance G_0 = 2 λ A_1/dx [W/K]", formula=f"=2*{k}*C{node0}/{dx}",
                     fmt=F_E, note="fixed base temperature, half a cell away")
    tip = st["tip"]
    half = f"{dx}/(2*{k}*C{node_n})"
    state.annular = annular
    state.dx = dx
    state.fv = fv
    state.g0 = g0
    state.h = h
    state.half = half
    state.k = k
    state.n = n
    state.node0 = node0
    state.node_n = node_n
    state.nonlinear = nonlinear
    state.sig = sig
    state.sol = sol
    state.st = st
    state.tinf = tinf
    state.tip = tip


def _fvs_tip_and_table_heading(state) -> None:
    """The tip condition and the heading of the nodal table."""
    annular = state.annular
    dx = state.dx
    h = state.h
    half = state.half
    k = state.k
    node0 = state.node0
    node_n = state.node_n
    nonlinear = state.nonlinear
    r = state.r
    st = state.st
    tinf = state.tinf
    tip = state.tip
    w = state.w
    # ---- tip and table heading -----------------------------------------------------------
    if tip == "adiabatic":
        gl, t_r = "0", tinf
        w.stated("tip: adiabatic, no conductance", "0")
    elif tip == "convective":
        a_tip = (f"(2*PI()*{r['r2']}*{r['t']})" if annular else r["Ac"])
        gl = w.value_row("tip conductance G_N = 1/(dx/(2λA_N) + 1/(h A_tip)) [W/K]",
                         formula=f"=1/({half}+1/({h}*{a_tip}))", fmt=F_E,
                         note="with the constant h; the last iteration's tip coefficient "
                              "(h(T), radiation) is inside the engine's a_P and b" if nonlinear
                         else "")
        t_r = tinf
    elif tip == "temperature":
        gl = w.value_row("tip conductance G_N = 2 λ A_N/dx [W/K]", formula=f"=2*{k}*C{node_n}/{dx}",
                         fmt=F_E)
        t_r = r["TL"]
    else:
        gl = w.value_row("tip conductance G_N = 1/(dx/(2λA_N) + 1/(λ m A_N)) [W/K]",
                         formula=f"=1/({half}+1/({k}*SQRT({h}*D{node_n}/({k}*C{node_n}))"
                                 f"*C{node_n}))", fmt=F_E,
                         note="continuation of an infinitely long fin: −λ dT/dx = λ m θ")
        t_r = tinf
    w.headers(FV_COLUMNS)
    assert w.row == node0, (w.row, node0)
    t_sur = st["temp_surroundings"]
    state.gl = gl
    state.t_r = t_r
    state.t_sur = t_sur


def _fvs_nodal_rows(state) -> None:
    """One row per cell: coefficients, the Thomas algorithm and the checks."""
    annular = state.annular
    dx = state.dx
    entry = state.entry
    fin = state.fin
    fv = state.fv
    g0 = state.g0
    gl = state.gl
    h = state.h
    k = state.k
    n = state.n
    node0 = state.node0
    node_n = state.node_n
    nonlinear = state.nonlinear
    r = state.r
    sig = state.sig
    sol = state.sol
    t_r = state.t_r
    t_sur = state.t_sur
    tinf = state.tinf
    w = state.w
    # ---- nodal rows ----------------------------------------------------------------------
    for i in range(n):
        rr = w.row
        first, last = i == 0, i == n - 1
        w.put(1, i + 1)
        xc = f"({i}+0.5)*{dx}"
        w.put(2, formula=f"=({r['r1']}+{xc})*1000" if annular else f"={xc}*1000", fmt="0.000")
        area, perim = _fv_geometry(fin, r, xc)
        w.put(3, formula=f"={area}", fmt=F_E)
        w.put(4, formula=f"={perim}", fmt=F_G)
        if not last:
            w.put(5, formula=f"=1/({dx}/(2*{k}*C{rr})+{dx}/(2*{k}*C{rr + 1}))", fmt=F_E)
        w.put(6, 0.0 if first else None, formula=None if first else f"=E{rr - 1}",
              role="engine" if first else "formula", fmt=F_E)
        w.put(7, 0.0 if last else None, formula=None if last else f"=E{rr}",
              role="engine" if last else "formula", fmt=F_E)
        if nonlinear:
            w.put(10, float(sol.a_centre[i]), role="engine", fmt=F_E)
            w.put(11, float(sol.b[i]), role="engine", fmt=F_E)
        else:
            w.put(8, formula=f"=-{h}*D{rr}*{dx}", fmt=F_E)
            w.put(9, formula=f"={h}*D{rr}*{dx}*{tinf}", fmt=F_E)
            w.put(10, formula=f"=F{rr}+G{rr}-H{rr}" + (f"+{g0}" if first else "")
                  + (f"+{gl}" if last else ""), fmt=F_E)
            w.put(11, formula=f"=I{rr}" + (f"+{g0}*{r['tb']}" if first else "")
                  + (f"+{gl}*{t_r}" if last else ""), fmt=F_E)
        if first:
            w.put(12, formula=f"=G{rr}/J{rr}", fmt=F_G)
            w.put(13, formula=f"=K{rr}/J{rr}", fmt=F_T)
        else:
            den = f"(J{rr}-F{rr}*L{rr - 1})"
            w.put(12, formula=f"=G{rr}/{den}", fmt=F_G)
            w.put(13, formula=f"=(K{rr}+F{rr}*M{rr - 1})/{den}", fmt=F_T)
        w.put(14, formula=f"=M{rr}" if last else f"=L{rr}*N{rr + 1}+M{rr}", fmt=F_T)
        for col, arr in zip((15, 16, 17, 18, 19), (sol.a_west, sol.a_east, sol.a_centre, sol.b,
                                                   sol.temperature), strict=True):
            w.put(col, float(arr[i]), role="engine", fmt=F_T if col == 19 else F_E)
        pairs = (("F", "O"), ("G", "P")) if nonlinear else (("F", "O"), ("G", "P"), ("J", "Q"),
                                                            ("K", "R"))
        conds = ",".join(f"ABS({a}{rr}-{e}{rr})<={w.tol}*MAX(1,ABS({e}{rr}))" for a, e in pairs)
        w.checks += 1
        w.put(20, formula=f'=IF(AND({conds}),"OK","MISMATCH: a coefficient differs")',
              role="check")
        w.check(21, f"N{rr}", f"S{rr}")
        w.put(22, formula="=" + _loss(fin, r, entry, f"N{rr}", f"D{rr}*{dx}", sig, t_sur),
              fmt=F_E)
        w.row += 1
    w.row += 1
    q_fv = w.value_row("heat rate at the base q = G_0 (T_b − T_1) [W]",
                formula=f"={g0}*({r['tb']}-N{node0})", engine=fv.heat_rate)
    w.value_row("loss from the fin's side Σ loss [W]", formula=f"=SUM(V{node0}:V{node_n})",
                engine=fv.heat_loss_surface, note="non-linear laws at the final temperatures"
                if nonlinear else "Σ h P dx (T_i − T_inf)")
    state.q_fv = q_fv


def _fvs_results(state) -> object:
    """The heat rate, tip temperature and the solution record with their checks."""
    fv = state.fv
    gl = state.gl
    half = state.half
    node0 = state.node0
    node_n = state.node_n
    nonlinear = state.nonlinear
    q_fv = state.q_fv
    r = state.r
    t_r = state.t_r
    tip = state.tip
    w = state.w
    # ---- results -------------------------------------------------------------------------
    if not nonlinear or tip == "adiabatic":
        face = (f"=N{node_n}" if tip == "adiabatic" else
                f"=N{node_n}-{gl}*(N{node_n}-{t_r})*{half}")
        w.value_row("tip face temperature [degC]", formula=face, engine=fv.temp_tip, fmt=F_T)
    else:
        w.stated("tip face temperature [degC] (engine)", fv.temp_tip, F_T)
    w.stated("heat leaving through the tip face [W] (engine)", fv.heat_loss_tip, F_G)
    w.value_row("relative difference to the closed form (q_FV − q_f)/q_f [-]",
                formula=f"=({q_fv}-{r['q']})/{r['q']}", fmt=F_E,
                note="the closed form uses the constant h" if nonlinear else
                "second-order in dx (see the mesh estimate)")
    est = fv.mesh_estimate
    rows = [("energy-balance residual, relative [-]", fv.energy_residual, F_E,
             "conservation and solver rounding; the closed form above checks the coefficients")]
    rows += [(f"heat rate on {m} cells [W]", val, F_G, "") for m, val in
             zip(est.meshes, est.values, strict=True)]
    if not est.exact:
        rows += [("observed order of convergence [-]", est.order, F_G, est.basis),
                 ("extrapolated heat rate [W]", est.extrapolated, F_G, "")]
    rows += [("mesh error bound of the heat rate [W]", est.error_estimate, F_E,
              est.basis if est.exact else "1.25 × the Richardson error, observed order"),
             ("fin efficiency by finite volumes [-]", fv.efficiency, F_G, ""),
             ("fin effectiveness by finite volumes [-]", fv.effectiveness, F_G, "")]
    for label, val, fmt, note in rows:
        w.stated(label, val if math.isfinite(val) else "none", fmt, note=note)
    for text in fv.warnings:
        put_warning(w, f"Warning (finite volumes): {text}")
    return node0, node_n


def _fv_geometry(fin, r, xc: str) -> tuple[str, str]:
    if isinstance(fin, AnnularFin):
        rad = f"({r['r1']}+{xc})"
        return f"2*PI()*{rad}*{r['t']}", f"4*PI()*{rad}"
    if fin.profile == "rectangular":
        return r["Ac"], r["P"]
    pw = 1 if fin.profile == "triangular" else 2
    base = r["t"] if fin.shape == "plate" else r["D"]
    s = f"MAX(0,1-{xc}/{r['L']})"
    y = f"({base}/2*{s}^{pw})"
    dy = f"({base}/2*{pw}/{r['L']}*{s}^{pw - 1})"
    if fin.shape == "plate":
        return f"{r['w']}*2*{y}", f"2*{r['w']}*SQRT(1+{dy}^2)"
    return f"PI()*{y}^2", f"2*PI()*{y}*SQRT(1+{dy}^2)"


def _loss(fin, r, entry, temp: str, p_dx: str, sig, t_sur) -> str:
    theta = f"({temp}-{r['tinf']})"
    law = entry.fv.h_law
    conv = (f"{law.h_coefficient!r}*ABS({theta})^{law.h_exponent!r}*{theta}" if law is not None
            else f"{r['h']}*{theta}")
    if entry.fv.emissivity > 0.0:
        tk = f"({temp}+{zero_Celsius!r})"
        conv += (f"+{entry.fv.emissivity!r}*{sig}*({tk}^4-({float(t_sur)!r}+{zero_Celsius!r})"
                 "^4)")
    return f"{p_dx}*({conv})"
