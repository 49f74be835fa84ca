"""Row groups of a room sheet: window, ground-floor and ventilation rows with their checks.
"""

from __future__ import annotations

from types import SimpleNamespace

from ..ground.soil import RSE_GROUND, RSI_FLOOR
from ..heatloss import AIR_DENSITY, AIR_SPECIFIC_HEAT
from .heatloss_layout import (
    FMT_H,
    FMT_U,
    NOTE_STYLE,
)

__all__ = []


def _window_rows(w, el):
    u = el.u
    w.put(2, f"window {el.name}", style="hl label")
    w.row += 1
    vals = {}
    for key, label, val, fmt in (
            ("ag", "A_g visible glazing area [m2]", u.glazing_area, "0.000"),
            ("af", "A_f projected frame area [m2]", u.frame_area, "0.000"),
            ("ap", "A_p opaque panel area [m2]", u.panel_area, "0.000"),
            ("ug", "U_g centre of glazing [W/(m2 K)]", u.glazing_u, FMT_U),
            ("uf", "U_f frame [W/(m2 K)]", u.frame_u, FMT_U),
            ("up", "U_p opaque panel [W/(m2 K)]", u.panel_u, FMT_U),
            ("lg", "l_g visible glazing perimeter [m]", u.glazing_perimeter, "0.000"),
            ("pg", "ψ_g glazing edge [W/(m K)]", u.psi_glazing, FMT_U),
            ("lp", "l_p panel perimeter [m]", u.panel_perimeter, "0.000"),
            ("pp", "ψ_p panel edge [W/(m K)]", u.psi_panel, FMT_U)):
        vals[key] = w.value_row(label, value=float(val), fmt=fmt)
    v = vals
    aw = w.value_row("A_w = A_g + A_f + A_p [m2]", formula=f"={v['ag']}+{v['af']}+{v['ap']}",
                     engine=u.area, fmt="0.000")
    uw = w.value_row("U_w = (A_g U_g + A_f U_f + l_g ψ_g + A_p U_p + l_p ψ_p)/A_w [W/(m2 K)]",
                     formula=(f"=({v['ag']}*{v['ug']}+{v['af']}*{v['uf']}+{v['lg']}*{v['pg']}"
                              f"+{v['ap']}*{v['up']}+{v['lp']}*{v['pp']})/{aw}"),
                     engine=u.u_value, fmt=FMT_U, note="EN ISO 10077-1:2017 clause 6 (recalled)")
    return uw, aw


def _ground_rows(w, el, crefs, constructions):
    """The rows of a ground element (EN ISO 13370): the inputs every method shares, then
    the method's own rows; returns the cells of U and of the area."""
    g = el.u
    res = g.result
    w.put(2, f"{g.method_key.replace('_', ' ')}: {el.name}", style="hl label")
    w.put(19, g.method, role="note", style=NOTE_STYLE)
    w.row += 1
    a = w.value_row("A floor area [m2]", value=float(res.area), fmt="0.00")
    p = w.value_row("P exposed perimeter [m]", value=float(res.exposed_perimeter), fmt="0.00")
    wt = w.value_row("w full wall thickness [m]", value=float(g.inputs["w"]), fmt="0.000")
    lam = w.value_row("λ ground conductivity [W/(m K)]", value=float(res.soil_conductivity),
                      fmt="0.00", note=g.soil)
    rsi = w.value_row("R_si floor, heat flow down [m2 K/W]", value=RSI_FLOOR, fmt="0.00")
    rse = w.value_row("R_se [m2 K/W]", value=RSE_GROUND, fmt="0.00")
    b = w.value_row("B' = A/(0.5 P) [m]", formula=f"={a}/(0.5*{p})",
                    engine=res.characteristic_dimension, fmt="0.0000")
    c = SimpleNamespace(w=w, g=g, res=res, a=a, p=p, wt=wt, lam=lam, rsi=rsi, rse=rse, b=b,
                        crefs=crefs, constructions=constructions)
    rows = {"slab_on_ground": _slab_rows, "suspended_floor": _suspended_rows,
            "heated_basement": _basement_rows}
    return rows[g.method_key](c)


def _floor_dt(c) -> tuple:
    """R_f of the floor and the equivalent thickness d_t (slab and basement floors)."""
    w, g, res, wt = c.w, c.g, c.res, c.wt
    lam, rsi, rse, crefs, constructions = c.lam, c.rsi, c.rse, c.crefs, c.constructions
    rf = _resistance_row(w, "R_f floor construction", g.inputs["rf"], g.construction,
                         crefs, constructions)
    dt_engine = res.equivalent_thickness if g.method_key == "slab_on_ground" else \
        res.floor_equivalent_thickness
    dt = w.value_row("d_t = w + λ (R_si + R_f + R_se) [m]",
                     formula=f"={wt}+{lam}*({rsi}+{rf}+{rse})", engine=dt_engine,
                     fmt="0.0000")
    return rf, dt


def _slab_rows(c) -> tuple:
    """Slab on ground (8.2) with edge insulation (Annex B); returns the U and area cells."""
    w, res, a, lam, b = c.w, c.res, c.a, c.lam, c.b
    rf, dt = _floor_dt(c)
    u0 = w.value_row(
        "U_0: d_t < B' → 2λ/(πB' + d_t) ln(πB'/d_t + 1); else λ/(0.457 B' + d_t) "
        "[W/(m2 K)]",
        formula=_floor_u_formula(lam, b, dt),
        engine=res.u_without_edge, fmt=FMT_U, note=f"regime here: {res.regime}")
    edge = res.edge_insulation
    if edge is not None:
        dd = w.value_row("D edge insulation width (horizontal) or depth (vertical) [m]",
                         value=float(edge.extent), fmt="0.000")
        k = w.value_row("orientation factor: 1 horizontal, 2 vertical [-]",
                        value=1.0 if edge.orientation == "horizontal" else 2.0, fmt="0")
        rn = w.value_row("R_n edge insulation [m2 K/W]", value=float(edge.resistance),
                         fmt="0.000")
        dn = w.value_row("d_n edge insulation thickness [m]", value=float(edge.thickness),
                         fmt="0.000")
        rx = w.value_row("R' = R_n − d_n/λ [m2 K/W]", formula=f"={rn}-{dn}/{lam}",
                         engine=res.edge_extra_resistance, fmt="0.0000")
        dx = w.value_row("d' = R' λ [m]", formula=f"={rx}*{lam}",
                         engine=res.edge_extra_thickness, fmt="0.0000")
        psi = w.value_row(
            "ψ_ge = −(λ/π)[ln(kD/d_t + 1) − ln(kD/(d_t + d') + 1)] [W/(m K)]",
            formula=(f"=-({lam}/PI())*(LN({k}*{dd}/{dt}+1)-LN({k}*{dd}/({dt}+{dx})+1))"),
            engine=res.psi_edge, fmt="0.00000", note="EN ISO 13370 Annex B (recalled)")
        u = w.value_row("U = U_0 + 2 ψ_ge/B' [W/(m2 K)]", formula=f"={u0}+2*{psi}/{b}",
                        engine=res.u_value, fmt=FMT_U)
    else:
        u = w.value_row("U = U_0 (no edge insulation) [W/(m2 K)]", formula=f"={u0}",
                        engine=res.u_value, fmt=FMT_U)
    return u, a


def _suspended_rows(c) -> tuple:
    """Suspended floor (8.3); returns the U and area cells."""
    w, g, res, a, wt = c.w, c.g, c.res, c.a, c.wt
    lam, rsi, rse, b, crefs, constructions = c.lam, c.rsi, c.rse, c.b, c.crefs, c.constructions
    rd = _resistance_row(w, "R_deck suspended deck", res.deck_resistance, g.construction,
                         crefs, constructions)
    h = w.value_row("h deck height above outside ground [m]",
                    value=g.inputs["h"], fmt="0.000")
    uw = w.value_row("U_w walls of the underfloor space [W/(m2 K)]",
                     value=g.inputs["uw"], fmt=FMT_U)
    eps = w.value_row("ε vent area per perimeter [m2/m]",
                      value=g.inputs["eps"], fmt="0.0000")
    v = w.value_row("v wind speed at 10 m [m/s]", value=g.inputs["v"],
                    fmt="0.00")
    fw = w.value_row("f_w wind shielding factor [-]", value=float(res.wind_shielding_factor),
                     fmt="0.00")
    rg = w.value_row("R_g insulation on the underfloor ground [m2 K/W]",
                     value=g.inputs["rg"], fmt="0.000")
    uf = w.value_row("U_f = 1/(R_si + R_deck + R_si) [W/(m2 K)]",
                     formula=f"=1/({rsi}+{rd}+{rsi})", engine=res.deck_u, fmt=FMT_U)
    dg = w.value_row("d_g = w + λ (R_si + R_g + R_se) [m]",
                     formula=f"={wt}+{lam}*({rsi}+{rg}+{rse})",
                     engine=res.ground_equivalent_thickness, fmt="0.0000")
    ug = w.value_row("U_g = 2λ/(πB' + d_g) ln(πB'/d_g + 1) [W/(m2 K)]",
                     formula=f"=2*{lam}/(PI()*{b}+{dg})*LN(PI()*{b}/{dg}+1)",
                     engine=res.ground_u, fmt=FMT_U)
    ux = w.value_row("U_x = 2 h U_w/B' + 1450 ε v f_w/B' [W/(m2 K)]",
                     formula=f"=2*{h}*{uw}/{b}+1450*{eps}*{v}*{fw}/{b}",
                     engine=res.exchange_u, fmt=FMT_U)
    u = w.value_row("U = 1/(1/U_f + 1/(U_g + U_x)) [W/(m2 K)]",
                    formula=f"=1/(1/{uf}+1/({ug}+{ux}))", engine=res.u_value, fmt=FMT_U)
    return u, a


def _basement_rows(c) -> tuple:
    """Heated basement (8.4); returns the U and area cells."""
    w, g, res, a, p = c.w, c.g, c.res, c.a, c.p
    lam, rse, b, crefs, constructions = c.lam, c.rse, c.b, c.crefs, c.constructions
    rf, dt = _floor_dt(c)
    z = w.value_row("z depth of the basement floor below ground [m]", value=float(res.depth),
                    fmt="0.000")
    rw = _resistance_row(w, "R_w basement wall", g.inputs["rw"], g.wall_construction,
                         crefs, constructions)
    rsiw = w.value_row("R_si wall, heat flow horizontal [m2 K/W]",
                       value=g.inputs["rsiw"], fmt="0.00")
    de = f"({dt}+{z}/2)"
    ubf = w.value_row(
        "U_bf: d_t + z/2 < B' → 2λ/(πB' + d_t + z/2) ln(πB'/(d_t + z/2) + 1); else "
        "λ/(0.457 B' + d_t + z/2) [W/(m2 K)]",
        formula=_floor_u_formula(lam, b, de),
        engine=res.floor_u, fmt=FMT_U, note=f"regime here: {res.floor_regime}")
    dw = w.value_row("d_w = λ (R_si + R_w + R_se) [m]", formula=f"={lam}*({rsiw}+{rw}+{rse})",
                     engine=res.wall_equivalent_thickness, fmt="0.0000")
    ds = w.value_row("d* = d_t if d_w ≥ d_t, else d_w [m]",
                     formula=f"=IF({dw}>={dt},{dt},{dw})", engine=res.wall_bracket_thickness,
                     fmt="0.0000")
    ubw = w.value_row("U_bw = 2λ/(πz)(1 + 0.5 d*/(d* + z)) ln(z/d_w + 1) [W/(m2 K)]",
                      formula=f"=2*{lam}/(PI()*{z})*(1+0.5*{ds}/({ds}+{z}))*LN({z}/{dw}+1)",
                      engine=res.wall_u, fmt=FMT_U)
    u = w.value_row("U' = (A U_bf + z P U_bw)/(A + z P) [W/(m2 K)]",
                    formula=f"=({a}*{ubf}+{z}*{p}*{ubw})/({a}+{z}*{p})", engine=res.u_value,
                    fmt=FMT_U)
    area = w.value_row("element area A + z P [m2]", formula=f"={a}+{z}*{p}", engine=g.area,
                       fmt="0.00")
    return u, area



def _floor_u_formula(lam, b, d) -> str:
    """U of a floor of characteristic dimension B' and equivalent thickness d (EN ISO 13370
    8.2 and 8.4): 2λ/(πB' + d) ln(πB'/d + 1) for d < B', else λ/(0.457 B' + d)."""
    return (f"=IF({d}<{b},2*{lam}/(PI()*{b}+{d})*LN(PI()*{b}/{d}+1),"
            f"{lam}/(0.457*{b}+{d}))")


def _resistance_row(w, label, value, cname, crefs, constructions):
    if cname and cname in crefs and cname in constructions:
        con = constructions[cname]
        return w.value_row(f"{label} = R_T − R_si − R_se of {cname!r} [m2 K/W]",
                           formula=f"={crefs[cname].r_total}-{con.rsi!r}-{con.rse_used!r}",
                           engine=value, fmt="0.0000")
    note = f"R_T − R_si − R_se of {cname!r}" if cname else "declared"
    return w.value_row(f"{label} [m2 K/W]", value=float(value), fmt="0.0000", note=note)


def _ventilation_rows(w, room, rres) -> dict:
    vf = rres.ventilation
    v = room.ventilation
    vol = w.value_row("V internal air volume [m3]", value=float(room.volume), fmt="0.00")
    if vf.basis == "air_change":
        nv = w.value_row("n_vent ventilation air change [1/h]", value=float(v.ventilation_rate),
                         fmt="0.000")
        ni = w.value_row("n_inf infiltration air change [1/h]", value=float(v.infiltration),
                         fmt="0.000")
        vv = w.value_row("V_vent = n_vent V [m3/h]", formula=f"={nv}*{vol}",
                         engine=vf.ventilation_flow, fmt="0.000")
        vi = w.value_row("V_inf = n_inf V [m3/h]", formula=f"={ni}*{vol}",
                         engine=vf.infiltration_flow, fmt="0.000")
    else:
        vv = w.value_row("V_vent design ventilation flow [m3/h]", value=float(v.ventilation_rate),
                         fmt="0.000")
        vi = w.value_row("V_inf infiltration flow [m3/h]", value=float(v.infiltration),
                         fmt="0.000")
    eta = w.value_row("η heat-recovery efficiency on V_vent [-]", value=float(v.heat_recovery),
                      fmt="0.000")
    nmin = w.value_row("n_min minimum air change [1/h]", value=float(v.minimum_air_change),
                       fmt="0.000")
    vmin = w.value_row("V_min = n_min V [m3/h]", formula=f"={nmin}*{vol}",
                       engine=vf.minimum_flow, fmt="0.000")
    top = w.value_row("top-up to the minimum, without recovery, MAX(0, V_min − V_vent − V_inf) "
                      "[m3/h]", formula=f"=MAX(0,{vmin}-{vv}-{vi})", engine=vf.top_up_flow,
                      fmt="0.000")
    eff = w.value_row("V_eff = V_inf + V_vent (1 − η) + top-up [m3/h]",
                      formula=f"={vi}+{vv}*(1-{eta})+{top}", engine=vf.effective_flow,
                      fmt="0.000")
    rho = w.value_row("ρ air density [kg/m3]", value=float(AIR_DENSITY), fmt="0.00000",
                      note="dry air as an ideal gas at 20 degC and 101325 Pa (M = 28.966 g/mol)")
    cp = w.value_row("c_p air specific heat [J/(kg K)]", value=float(AIR_SPECIFIC_HEAT),
                     fmt="0.0", note="dry air near 20 degC, 1.006 kJ/(kg K) (recalled)")
    c = w.value_row("ρ c_p / 3600 [W h/(m3 K)]", formula=f"={rho}*{cp}/3600",
                    engine=vf.volumetric_heat_capacity, fmt="0.000000")
    h = w.value_row("H_V = ρ c_p V_eff / 3600 [W/K]", formula=f"={rho}*{cp}*{eff}/3600",
                    engine=vf.coefficient, fmt=FMT_H,
                    note="equals ρ c_p V/3600 (1 − η) on the recovered flow")
    return {"flow": eff, "c": c, "h": h}
