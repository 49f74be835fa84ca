"""Closed-form fin blocks of the calculation sheet (uniform, profiled and annular fins).

Used by :mod:`heatledger.sheet.blocks_fins`; every result is a live formula with the
engine's value and a check cell beside it. See that module for the Bessel-function note.

References
----------
F. P. Incropera, D. P. DeWitt, *Fundamentals of Heat and Mass Transfer*, 6th ed., 2007,
section 3.6, Tables 3.4 and 3.5. D. Q. Kern, *Process Heat Transfer*, 1950, eq. 16.58.
M. Abramowitz, I. A. Stegun, *Handbook of Mathematical Functions*, 1964, eq. 9.6.24.

Sources: K_n by its integral form [source: abramowitz-stegun, 9.6.24].
"""

from __future__ import annotations

import math
from types import SimpleNamespace

from ..fins.annular import AnnularFin
from .plan import col_letter
from .rows import RowLayout

__all__ = ["k_formula", "K_STEP", "K_LIMIT", "K_NODE_COL", "HEADER_ROWS"]

#: Trapezoidal step of the K_n integral and its upper limit rule (x cosh t > K_LIMIT).
K_STEP = 0.05
K_LIMIT = 800.0
#: Column of the K_n quadrature nodes on annular-fin sheets.
K_NODE_COL = 27  # AA
#: Rows 1 to HEADER_ROWS hold the title, inputs of the header and the check count.
HEADER_ROWS = 10
F_G = "0.000000"
#: Columns of a fin sheet\'s rows: label B, value G, engine K, check L, note N.
FIN_ROWS = RowLayout(default_format=F_G, header_height=30.0, title_merge="N")
F_E = "0.000E+00"
F_T = "0.0000"

def k_formula(x: str, order: int, nodes: str) -> str:
    """Spreadsheet expression of ``K_order(x)`` by the trapezoidal rule on ``nodes``.

    Parameters
    ----------
    x : str
        Expression of the argument (a cell reference or a product). [-]
    order : int
        0 or 1. [-]
    nodes : str
        Absolute range of the quadrature nodes ``t_k = k * K_STEP`` from 0. [-]

    Returns
    -------
    str
        ``h (sum f(t_k) - f(0)/2)`` with ``f(t) = exp(-x cosh t) cosh(n t)``, without ``=``.
    """
    return (f"{K_STEP!r}*(SUMPRODUCT(EXP(-({x})*COSH({nodes}))*COSH({order}*{nodes}))"
            f"-0.5*EXP(-({x})))")


# --------------------------------------------------------------------------- closed forms
def _describe(fin) -> str:
    if isinstance(fin, AnnularFin):
        rim = "convective rim" if fin.tip == "convective" else "adiabatic rim"
        return f"annular fin of rectangular profile, {rim}" + (
            ", corrected radius" if fin.corrected_length else "")
    text = f"straight {fin.shape} fin, {fin.profile} profile, {fin.tip} tip"
    return text + (", corrected length" if fin.corrected_length else "")


def _mm_inputs(w, r, items):
    for key, label, value in items:
        mm = w.value_row(f"{label} [mm]", value=float(value) * 1000.0, fmt="0.000")
        r[key] = w.value_row(f"{label} [m]", formula=f"={mm}/1000", engine=float(value), fmt=F_G)


def _fin_size_inputs(w, r, fin, thickness: str, diameter: str) -> bool:
    """Length and section of a straight fin (mm inputs, m formulas); True for a plate."""
    plate = fin.shape == "plate"
    items = [("L", "L, fin length", fin.length)]
    items += [("t", f"t, {thickness}", fin.thickness), ("w", "w, plate width", fin.width)] \
        if plate else [("D", f"D, {diameter}", fin.diameter)]
    _mm_inputs(w, r, items)
    return plate


def _straight(w, r, fin, res):
    plate = _fin_size_inputs(w, r, fin, "plate thickness", "pin diameter")
    if fin.tip == "temperature":
        r["TL"] = w.value_row("T_L, prescribed tip temperature [degC]",
                              value=float(fin.temp_tip), fmt="0.00")
    w.start("geometry", "Fin parameter (Incropera & DeWitt, section 3.6.2, Table 3.4)")
    c = res.coefficients
    r["Ac"] = w.value_row("A_c, cross-section [m2]", formula=(f"={r['w']}*{r['t']}" if plate else
                          f"=PI()*{r['D']}^2/4"), engine=fin.cross_section_area, fmt=F_E,
                          note="w t (plate) or π D²/4 (pin)")
    r["P"] = w.value_row("P, perimeter [m]", formula=(f"=2*({r['w']}+{r['t']})" if plate else
                         f"=PI()*{r['D']}"), engine=fin.perimeter, fmt=F_G,
                         note="2(w + t), side edges included (plate), or π D (pin)")
    extra = (f"+{r['t']}/2" if plate else f"+{r['D']}/4") if fin.corrected_length else ""
    r["Le"] = w.value_row("L_e, length in the formulas [m]", formula=f"={r['L']}{extra}",
                          engine=fin.effective_length, fmt=F_G,
                          note="corrected length L_c = L + t/2 (plate) or L + D/4 (pin)"
                          if extra else "L")
    r["m"] = w.value_row("m = √(h P/(λ A_c)) [1/m]",
                         formula=f"=SQRT({r['h']}*{r['P']}/({r['k']}*{r['Ac']}))", engine=fin.m)
    r["mL"] = w.value_row("m L_e [-]", formula=f"={r['m']}*{r['Le']}", engine=c["mL"])
    r["M"] = w.value_row("M = √(h P λ A_c) [W/K]",
                         formula=f"=SQRT({r['h']}*{r['P']}*{r['k']}*{r['Ac']})",
                         engine=c["M_per_K"])
    beta_on = fin.tip == "convective" and not fin.corrected_length
    r["beta"] = w.value_row("h/(m λ) [-]", formula=f"={r['h']}/({r['m']}*{r['k']})",
                            engine=c["h_over_mk"], note="used by the convective tip")
    if fin.corrected_length:
        af = f"={r['P']}*{r['Le']}"
    elif fin.tip == "convective":
        af = f"={r['P']}*{r['L']}+{r['Ac']}"
    else:
        af = f"={r['P']}*{r['L']}"
    r["Af"] = w.value_row("A_f, fin surface in the efficiency [m2]", formula=af,
                          engine=fin.fin_area,
                          fmt=F_E, note="P L + A_c (convective tip), P L_c (corrected), P L")
    w.start("results", "Heat rate, efficiency, effectiveness, resistance")
    ml, big_m, beta, th = r["mL"], r["M"], r["beta"], r["theta"]
    if fin.tip == "temperature":
        r["thL"] = w.value_row("θ_L = T_L − T_inf [K]", formula=f"={r['TL']}-{r['tinf']}",
                               fmt="0.00")
        r["q"] = w.value_row("q_f = M (θ_b cosh mL − θ_L)/sinh mL [W]",
                             formula=f"={big_m}*({th}*COSH({ml})-{r['thL']})/SINH({ml})",
                             engine=res.heat_rate, note="Table 3.4 case C")
        r["eta"] = w.value_row("η_f = M (θ_b + θ_L) tanh(mL/2)/(h A_f θ_b) [-]",
                               formula=f"={big_m}*({th}+{r['thL']})*TANH({ml}/2)/({r['h']}*{r['Af']}"
                                       f"*{th})", engine=res.efficiency,
                               note="heat convected from the side over h A_f θ_b")
        r["eps"] = w.value_row("ε_f = q_f/(h A_c θ_b) [-]",
                               formula=f"={r['q']}/({r['h']}*{r['Ac']}*{th})",
                               engine=res.effectiveness)
        r["R"] = w.value_row("R_t,f = θ_b/q_f [K/W]", formula=f"={th}/{r['q']}",
                             engine=res.fin_resistance)
        tip = f"={r['tinf']}+{r['thL']}"
    else:
        g = {"convective": (f"={big_m}*(SINH({ml})+{beta}*COSH({ml}))/(COSH({ml})+{beta}"
                            f"*SINH({ml}))", "Table 3.4 case A"),
             "adiabatic": (f"={big_m}*TANH({ml})", "Table 3.4 case B"),
             "infinite": (f"={big_m}", "Table 3.4 case D")}
        key = "adiabatic" if fin.corrected_length else fin.tip
        note = g[key][1] + (" on L_c (approximates case A)" if fin.corrected_length else "")
        r["G"] = w.value_row("G_f = q_f/θ_b [W/K]", formula=g[key][0], engine=fin.conductance,
                             note=note)
        r["q"] = w.value_row("q_f = G_f θ_b [W]", formula=f"={r['G']}*{th}", engine=res.heat_rate)
        if fin.tip == "infinite":  # the loss on the stated length L only, at most 1
            r["eta"] = w.value_row("η_f = (1 − e^(−mL))/(m L) [-]", formula=f"=(1-EXP(-{ml}))/{ml}",
                                   engine=res.efficiency,
                                   note="case D: heat shed on 0..L, M θ_b (1 − e^(−mL)), over "
                                        "h A_f θ_b")
        else:
            r["eta"] = w.value_row("η_f = G_f/(h A_f) [-]",
                                   formula=f"={r['G']}/({r['h']}*{r['Af']})", engine=res.efficiency,
                                   note="eq. 3.86")
        r["eps"] = w.value_row("ε_f = G_f/(h A_c) [-]", formula=f"={r['G']}/({r['h']}*{r['Ac']})",
                               engine=res.effectiveness, note="eq. 3.81")
        r["R"] = w.value_row("R_t,f = 1/G_f [K/W]", formula=f"=1/{r['G']}",
                             engine=res.fin_resistance,
                             note="eq. 3.83")
        tip = f"={r['tinf']}+{th}*" + _theta_ratio(fin, r, r["L"], beta_on)
    r["tip"] = w.value_row("T at the tip [degC]", formula=tip, engine=res.temp_tip, fmt=F_T)


def _theta_ratio(fin, r, x: str, beta_on: bool) -> str:
    """θ/θ_b at distance ``x`` (an expression, m) of a uniform straight fin."""
    m, le, ml = r["m"], r["Le"], r["mL"]
    if fin.tip == "infinite":
        return f"EXP(-{m}*{x})"
    if fin.tip == "temperature":
        return (f"({r['thL']}*SINH({m}*{x})+{r['theta']}*SINH({m}*({r['L']}-{x})))/SINH({ml})"
                f"/{r['theta']}")
    b = r["beta"] if beta_on else "0"
    return (f"(COSH({m}*({le}-{x}))+{b}*SINH({m}*({le}-{x})))/(COSH({ml})+{b}*SINH({ml}))")


def _profiled(w, r, fin, res):
    plate = _fin_size_inputs(w, r, fin, "base thickness", "base diameter")
    w.start("geometry", f"{fin.profile.capitalize()} {fin.shape} fin (Incropera & DeWitt, "
                        "Table 3.5)")
    L = r["L"]  # noqa: N806 - the textbook's symbol
    r["Ac"] = w.value_row("A_c,b, cross-section at the base [m2]",
                          formula=f"={r['w']}*{r['t']}" if plate else f"=PI()*{r['D']}^2/4",
                          engine=fin.cross_section_area, fmt=F_E)
    r["m"] = w.value_row("m = √(2h/(λ t)) (plate) or √(4h/(λ D)) (pin) [1/m]",
                         formula=(f"=SQRT(2*{r['h']}/({r['k']}*{r['t']}))" if plate else
                                  f"=SQRT(4*{r['h']}/({r['k']}*{r['D']}))"), engine=fin.m)
    r["mL"] = w.value_row("m L [-]", formula=f"={r['m']}*{L}", engine=res.coefficients["mL"])
    ml = r["mL"]
    if plate and fin.profile == "triangular":
        af = f"=2*{r['w']}*SQRT({L}^2+({r['t']}/2)^2)"
        eta = f"=BESSELI(2*{ml},1)/({ml}*BESSELI(2*{ml},0))"
        note = "η = I1(2mL)/(mL I0(2mL))"
    elif plate:
        c1 = f"SQRT(1+({r['t']}/{L})^2)"
        af = f"={r['w']}*({c1}*{L}+{L}^2/{r['t']}*LN({r['t']}/{L}+{c1}))"
        eta = f"=2/(SQRT(4*{ml}^2+1)+1)"
        note = "η = 2/(√(4(mL)² + 1) + 1)"
    elif fin.profile == "triangular":
        af = f"=PI()*{r['D']}/2*SQRT({L}^2+({r['D']}/2)^2)"
        eta = f"=2/{ml}*BESSELI(2*{ml},2)/BESSELI(2*{ml},1)"
        note = "conical pin: η = (2/(mL)) I2(2mL)/I1(2mL)"
    else:
        a = f"({r['D']}/{L})"
        af = (f"=PI()*{L}^4/(8*{r['D']}^2)*({a}*(2*{a}^2+1)*SQRT(1+{a}^2)-ASINH({a}))")
        eta = f"=2/(SQRT(4/9*{ml}^2+1)+1)"
        note = "η = 2/(√((4/9)(mL)² + 1) + 1)"
    r["Af"] = w.value_row("A_f, fin surface [m2]", formula=af, engine=fin.fin_area, fmt=F_E,
                          note="true surface of the profile")
    w.start("results", "Heat rate, efficiency, effectiveness, resistance")
    r["eta"] = w.value_row("η_f, fin efficiency [-]", formula=eta, engine=res.efficiency, note=note)
    r["G"] = w.value_row("G_f = η_f h A_f [W/K]", formula=f"={r['eta']}*{r['h']}*{r['Af']}",
                         engine=fin.conductance)
    r["q"] = w.value_row("q_f = G_f θ_b [W]", formula=f"={r['G']}*{r['theta']}",
                         engine=res.heat_rate)
    r["eps"] = w.value_row("ε_f = G_f/(h A_c,b) [-]", formula=f"={r['G']}/({r['h']}*{r['Ac']})",
                           engine=res.effectiveness)
    r["R"] = w.value_row("R_t,f = 1/G_f [K/W]", formula=f"=1/{r['G']}", engine=res.fin_resistance)
    r["tip"] = w.value_row("T at the tip [degC]",
                           formula=f"={r['tinf']}+{r['theta']}*{_profile_ratio(fin, r, '0')}",
                           engine=res.temp_tip, fmt=F_T)


def _profile_ratio(fin, r, xt: str) -> str:
    """θ/θ_b of a profiled fin at distance ``xt`` from the tip (expression, m)."""
    L, m, ml = r["L"], r["m"], r["mL"]  # noqa: N806
    if fin.profile == "parabolic":
        c = 1 if fin.shape == "plate" else 3
        p = f"((SQRT({c}^2+4*{ml}^2)-{c})/2)"
        return f"(({xt})/{L})^{p}"
    z = f"2*{m}*SQRT({L}*({xt}))"
    if fin.shape == "plate":
        return f"BESSELI({z},0)/BESSELI(2*{ml},0)"
    return (f"IF(({xt})>0,SQRT({L}/({xt}))*BESSELI({z},1),{ml})/BESSELI(2*{ml},1)")


def _annular(w, r, fin, res, entry):
    st = SimpleNamespace(w=w, r=r, fin=fin, res=res, entry=entry)
    _ann_setup(st)
    _ann_results(st)


def _ann_setup(st) -> None:
    """The inputs and first rows of this part of the sheet."""
    fin = st.fin
    r = st.r
    w = st.w
    d1 = w.value_row("D_1, tube outside diameter (fin root) [mm]",
                     value=fin.inner_radius * 2000.0, fmt="0.000")
    d2 = w.value_row("D_2, fin outside diameter [mm]", value=fin.outer_radius * 2000.0, fmt="0.000")
    t = w.value_row("t, fin thickness [mm]", value=fin.thickness * 1000.0, fmt="0.000")
    r["r1"] = w.value_row("r_1 = D_1/2 [m]", formula=f"={d1}/2000", engine=fin.inner_radius)
    r["r2"] = w.value_row("r_2 = D_2/2 [m]", formula=f"={d2}/2000", engine=fin.outer_radius)
    r["t"] = w.value_row("t [m]", formula=f"={t}/1000", engine=fin.thickness)
    nodes = _k_nodes(w, fin)
    w.start("bessel", "Bessel solution θ = A I0(m r) + B K0(m r) (Incropera & DeWitt 3.6.3)")
    corr = f"+{r['t']}/2" if fin.corrected_length else ""
    r["r2c"] = w.value_row("r_2c, outer radius in the formulas [m]", formula=f"={r['r2']}{corr}",
                           engine=fin.effective_outer_radius,
                           note="corrected r_2 + t/2" if corr else "r_2")
    r["m"] = w.value_row("m = √(2h/(λ t)) [1/m]", formula=f"=SQRT(2*{r['h']}/({r['k']}*{r['t']}))",
                         engine=fin.m)
    x1 = w.value_row("x_1 = m r_1 [-]", formula=f"={r['m']}*{r['r1']}",
                     engine=fin.m * fin.inner_radius)
    x2 = w.value_row("x_2 = m r_2c [-]", formula=f"={r['m']}*{r['r2c']}",
                     engine=fin.m * fin.effective_outer_radius)
    values = fin.bessel_values()
    b = {}
    for x, lab in ((x1, "x_1"), (x2, "x_2")):
        for n in (0, 1):
            b[("I", n, x)] = w.value_row(f"I{n}({lab}) = BESSELI [-]", formula=f"=BESSELI({x},{n})",
                                         engine=values[("I", n, lab)], fmt=F_E)
            b[("K", n, x)] = w.value_row(f"K{n}({lab}) by the integral (A&S 9.6.24) [-]",
                                         formula="=" + k_formula(x, n, nodes),
                                         engine=values[("K", n, lab)], fmt=F_E,
                                         note="trapezoidal rule on the nodes in column AA")
            w.put(2, f"K{n}({lab}) = BESSELK, for comparison only [-]")
            bk = w.put(7, formula=f"=BESSELK({x},{n})", fmt=F_E)
            # shown as 1.9E-9 (3 significant figures), not 15 digits of a fraction
            d = f'({bk}/{b[("K", n, x)]}-1)'
            e = f"ROUND(LN(ABS({d}))/LN(10)-0.5,0)"  # floor of log10 with the fin functions
            w.put(14, formula=f'="relative difference "&IF({d}=0,"0",'
                              f'ROUND({d}/10^{e},2)&"E"&{e})', role="note")
            w.row += 1
    exact_rim = fin.tip == "convective" and not fin.corrected_length
    hr = w.value_row("h at the rim [W/(m2 K)]", formula=f"={r['h']}" if exact_rim else None,
                     value=None if exact_rim else 0.0, role="formula" if exact_rim else "engine",
                     note="convective rim: h; adiabatic rim (or corrected radius): 0")
    k, m = r["k"], r["m"]
    a = w.value_row("a = λ m I1(x_2) + h_rim I0(x_2) [W/(m2 K)]",
                    formula=f"={k}*{m}*{b[('I', 1, x2)]}+{hr}*{b[('I', 0, x2)]}", fmt=F_E)
    bb = w.value_row("b = −λ m K1(x_2) + h_rim K0(x_2) [W/(m2 K)]",
                     formula=f"=-{k}*{m}*{b[('K', 1, x2)]}+{hr}*{b[('K', 0, x2)]}", fmt=F_E)
    den = f"({bb}*{b[('I', 0, x1)]}-{a}*{b[('K', 0, x1)]})"
    r["A"] = w.value_row("A = b/(b I0(x_1) − a K0(x_1)) [-]", formula=f"={bb}/{den}", fmt=F_E,
                         note="θ(r_1) = θ_b and λ θ'(r_2c) + h_rim θ(r_2c) = 0")
    r["B"] = w.value_row("B = −a/(b I0(x_1) − a K0(x_1)) [-]", formula=f"=-{a}/{den}", fmt=F_E)
    st.b = b
    st.exact_rim = exact_rim
    st.k = k
    st.m = m
    st.nodes = nodes
    st.x1 = x1
    st.x2 = x2


def _ann_results(st) -> None:
    """The results of the part with their checks."""
    b = st.b
    exact_rim = st.exact_rim
    fin = st.fin
    k = st.k
    m = st.m
    nodes = st.nodes
    r = st.r
    res = st.res
    w = st.w
    x1 = st.x1
    x2 = st.x2
    # ---- results -------------------------------------------------------------------------
    w.start("results", "Heat rate, efficiency, effectiveness, resistance")
    pi2 = "2*PI()"
    r["Ac"] = w.value_row("A_c,b = 2π r_1 t [m2]", formula=f"={pi2}*{r['r1']}*{r['t']}",
                          engine=fin.cross_section_area, fmt=F_E)
    rim = f"+{pi2}*{r['r2']}*{r['t']}" if exact_rim else ""
    r["Af"] = w.value_row("A_f = 2π (r_2c² − r_1²) (+ 2π r_2 t, convective rim) [m2]",
                          formula=f"={pi2}*({r['r2c']}^2-{r['r1']}^2){rim}", engine=fin.fin_area,
                          fmt=F_E)
    r["G"] = w.value_row("G_f = −λ A_c,b m (A I1(x_1) − B K1(x_1)) [W/K]",
                         formula=f"=-{k}*{r['Ac']}*{m}*({r['A']}*{b[('I', 1, x1)]}-{r['B']}*"
                                 f"{b[('K', 1, x1)]})", engine=fin.conductance,
                         note="q_f = −λ A_c,b dθ/dr at r_1, per kelvin of θ_b")
    r["q"] = w.value_row("q_f = G_f θ_b [W]", formula=f"={r['G']}*{r['theta']}",
                         engine=res.heat_rate)
    r["eta"] = w.value_row("η_f = G_f/(h A_f) [-]", formula=f"={r['G']}/({r['h']}*{r['Af']})",
                           engine=res.efficiency)
    if not exact_rim:
        c2 = w.value_row("C_2 = (2 r_1/m)/(r_2c² − r_1²) [m]",
                         formula=f"=(2*{r['r1']}/{m})/({r['r2c']}^2-{r['r1']}^2)",
                         engine=res.coefficients["C2"], fmt=F_E)
        i0a, i1a, k0a, k1a = (b[("I", 0, x1)], b[("I", 1, x1)], b[("K", 0, x1)], b[("K", 1, x1)])
        i1b, k1b = b[("I", 1, x2)], b[("K", 1, x2)]
        w.value_row("η_f by the closed form of Kern eq. 16.58 [-]",
                    formula=f"={c2}*({k1a}*{i1b}-{i1a}*{k1b})/({i0a}*{k1b}+{k0a}*{i1b})",
                    engine=res.efficiency, note="adiabatic rim (Incropera & DeWitt eq. 3.96)")
    r["eps"] = w.value_row("ε_f = G_f/(h A_c,b) [-]", formula=f"={r['G']}/({r['h']}*{r['Ac']})",
                           engine=res.effectiveness)
    r["R"] = w.value_row("R_t,f = 1/G_f [K/W]", formula=f"=1/{r['G']}", engine=res.fin_resistance)
    r["tip"] = w.value_row("T at the fin's outer radius r_2 [degC]",
                           formula=f"={r['tinf']}+{r['theta']}*{_annular_ratio(r, r['r2'], nodes)}",
                           engine=res.temp_tip, fmt=F_T)
    r["nodes"] = nodes


def _annular_ratio(r, radius: str, nodes: str) -> str:
    x = f"{r['m']}*{radius}"
    return f"({r['A']}*BESSELI({x},0)+{r['B']}*{k_formula(x, 0, nodes)})"


def _k_nodes(w, fin) -> str:
    """Write the quadrature nodes t_k = k K_STEP in column Z; return their range."""
    x_min = fin.m * fin.inner_radius
    count = int(math.ceil(math.acosh(max(1.0, K_LIMIT / x_min)) / K_STEP)) + 1
    col = col_letter(K_NODE_COL)
    first = HEADER_ROWS + 1
    w.put(K_NODE_COL, "t_k nodes of K_n", role="header", row=first)
    for i in range(count):
        w.put(K_NODE_COL, i * K_STEP, role="input", fmt="0.00", row=first + 1 + i)
    return f"${col}${first + 1}:${col}${first + count}"
