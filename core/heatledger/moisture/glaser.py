"""Interstitial condensation by the monthly Glaser method of EN ISO 13788, clause 6.

For each month the temperatures at the layer interfaces follow the resistance ladder of the
construction (EN ISO 6946 surface resistances), the saturation pressures follow from them,
and the vapour-pressure line is drawn through the construction against the equivalent
air-layer thickness ``s_d``: the tightest line from the inside vapour pressure to the
outside one that stays at or below saturation at every interface (the lower convex hull of
the saturation points), held at saturation where water lies from earlier months. Where the
line bends, vapour condenses (or evaporates) at the rate

    g_c = delta_0 [(p_a - p_c)/(s_c - s_a) - (p_c - p_b)/(s_b - s_c)]    kg/(m2 s)

with ``a`` and ``b`` the neighbouring points of the line. Amounts are carried month to month
from the starting month; evaporation is capped at what lies at the interface.

Decisions where the standard leaves room (README, "Moisture"): the monthly amount is the
actual change (evaporation capped); the calculation starts in the first month, scanning
from January, in which condensation occurs after a month without any (January when every
month condenses); planes are the layer interfaces, and a vapour-pressure line that rises
above saturation inside a layer is reported as a warning naming the layer, to be split.
Surface vapour resistances are neglected (the standard's practice); vapour-tight layers
(mu = inf) enter with ``s_d`` = :data:`VAPOUR_TIGHT_SD`.

Sources: [source: iso13788-glaser, clause 6]; [source: iso13788-saturation, Annex E].
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from .._validate import quote
from ..errors import HeatLedgerError
from .psychrometrics import (
    MONTH_NAMES,
    VAPOUR_PERMEABILITY_AIR,
    month_seconds,
    saturation_pressure,
)

__all__ = ["interstitial_condensation", "CondensationResult", "VAPOUR_TIGHT_SD",
           "vapour_columns"]

#: Equivalent air-layer thickness standing for a vapour-tight layer (mu = inf): far above
#: the 1500 m commonly taken as vapour-tight (common practice, no source). [m]
VAPOUR_TIGHT_SD = 1.0e4
#: Amounts below this are taken as dry (rounding of the running sum). [kg/m2]
DRY = 1e-12
#: Sample points inside each layer for the above-saturation warning. [-]
_INSIDE_SAMPLES = 9


@dataclass(frozen=True, eq=False)
class CondensationResult:
    """The monthly Glaser calculation of one construction in one climate.

    Attributes
    ----------
    start_month : int or None
        Month the calculation starts in (0 = January); None when nothing condenses. [-]
    condensation_rate : ndarray (12,)
        Change of the water held in the construction in each month, + condensing,
        - evaporating (January first). [kg/m2]
    accumulation : ndarray (12,)
        Water held at the end of each month. [kg/m2]
    planes : tuple of 12 tuples of int
        Interfaces held at saturation in each month (0 = between layer 0 and layer 1). [-]
    max_accumulation : float
        Largest amount held at a month end. [kg/m2]
    max_month : int or None
        Month of ``max_accumulation`` (None when nothing condenses). [-]
    dries_out : bool
        True when nothing is left at the end of the year's cycle (also with no
        condensation). [-]
    interface_rate, interface_accumulation : ndarray (12, interfaces)
        The same per interface. [kg/m2]
    temperatures, saturation, vapour_pressure : ndarray (12, nodes)
        At the inside surface, every interface and the outside surface. [degC], [Pa], [Pa]
    sd_position : ndarray (nodes,)
        Equivalent air-layer thickness from the inside surface to each node. [m]
    resistance_position : ndarray (nodes,)
        Thermal resistance from the inside air to each node (Rsi included). [m2 K/W]
    flux_inside, flux_outside : ndarray (12,)
        Vapour flux entering at the inside surface and leaving at the outside. [kg/(m2 s)]
    layer_names, interface_names : tuple of str
        The layers counted and the interfaces between them. [-]
    mass_balance : float
        ``sum(condensation_rate)`` minus the water left at the end of the cycle. [kg/m2]
    warnings : tuple of str

    References
    ----------
    [source: iso13788-glaser, 6.4 and 6.5 (monthly amounts, report)].
    """

    start_month: int | None
    condensation_rate: np.ndarray
    accumulation: np.ndarray
    planes: tuple
    max_accumulation: float
    max_month: int | None
    dries_out: bool
    interface_rate: np.ndarray
    interface_accumulation: np.ndarray
    temperatures: np.ndarray
    saturation: np.ndarray
    vapour_pressure: np.ndarray
    sd_position: np.ndarray
    resistance_position: np.ndarray
    flux_inside: np.ndarray
    flux_outside: np.ndarray
    layer_names: tuple
    interface_names: tuple
    mass_balance: float
    warnings: tuple = ()

    @property
    def verdict(self) -> str:
        """One line: no condensation, condensation that dries out, or that does not. [-]"""
        if self.start_month is None:
            return "no interstitial condensation in any month"
        peak = (f"at most {self.max_accumulation * 1000.0:.4g} g/m2, end of "
                f"{MONTH_NAMES[self.max_month]}")
        if self.dries_out:
            return f"condensation that dries out within the year ({peak})"
        return (f"condensation that does NOT dry out within the year ({peak}; "
                f"{self.residual * 1000.0:.4g} g/m2 left after 12 months)")

    @property
    def residual(self) -> float:
        """Water left at the end of the 12-month cycle. [kg/m2]"""
        if self.start_month is None:
            return 0.0
        return float(self.accumulation[(self.start_month - 1) % 12])

    @property
    def condensing_months(self) -> tuple:
        """Months (0 = January) in which water condenses at some interface. [-]"""
        return tuple(int(m) for m in np.flatnonzero(np.any(self.interface_rate > 0.0, axis=1)))


def vapour_columns(construction) -> tuple:
    """Names, thermal resistances [m2 K/W] and ``s_d`` [m] of the counted layers.

    Layers outside a well ventilated air layer are not counted (their outside face is at
    the outside vapour pressure); a layer without a vapour value is an error naming it.

    Parameters
    ----------
    construction : heatledger.Construction
        The build-up, inside to outside. [-]

    Returns
    -------
    tuple
        ``(names, resistances, sds)``. [-]

    References
    ----------
    [source: iso13788-glaser, 6.2 (s_d = mu d)]; [source: iso6946-ventilated, 6.9.4].
    """
    names, res, sds, missing = [], [], [], []
    for row, lay in zip(construction.layer_table, construction.layers, strict=True):
        if not row.counted:
            continue
        sd = getattr(lay, "sd", None)
        if sd is None:
            missing.append(f"layer {row.index + 1} {quote(lay.name)}")
            continue
        names.append(lay.name)
        res.append(row.resistance)
        sds.append(VAPOUR_TIGHT_SD if math.isinf(sd) else sd)
    if missing:
        raise HeatLedgerError(
            f"construction {quote(construction.name)}: {', '.join(missing)} has no vapour value; "
            "give vapour_resistance_factor (mu) or sd, or use a material that has one "
            "(EN ISO 13788 needs s_d = mu d of every layer)")
    return tuple(names), np.array(res), np.array(sds)


def interstitial_condensation(construction, climate) -> CondensationResult:
    """Monthly interstitial condensation and drying by the Glaser method.

    Parameters
    ----------
    construction : heatledger.Construction
        The build-up, inside to outside, with a vapour value for every layer. [-]
    climate : MonthlyClimate
        Twelve monthly means, January first. [-]

    Returns
    -------
    CondensationResult

    Raises
    ------
    HeatLedgerError
        If a layer has no vapour value.

    References
    ----------
    [source: iso13788-glaser, 6.3 to 6.5 (interfaces, vapour-pressure line, monthly
    amounts, starting month)].
    """
    names, res, sds = vapour_columns(construction)
    r_pos = np.concatenate(([construction.rsi], construction.rsi + np.cumsum(res)))
    r_total = construction.rsi + res.sum() + construction.rse_used
    s_pos = np.concatenate(([0.0], np.cumsum(sds)))
    t_i, t_e = climate.temp_inside[:, None], climate.temp_outside[:, None]
    temps = t_i - (t_i - t_e) * r_pos[None, :] / r_total
    p_sat = saturation_pressure(temps)
    p_in, p_out = climate.vapour_pressure_inside, climate.vapour_pressure_outside
    n_if = len(names) - 1
    # plain lists: the month loop reads them element by element
    s_list, sat_list = s_pos.tolist(), p_sat.tolist()
    p_in, p_out = p_in.tolist(), p_out.tolist()
    dry = [_contacts(s_list, sat_list[m], p_in[m], p_out[m], ()) for m in range(12)]
    start = _start_month([bool(c) for c in dry])
    run = _Run(s_list, sat_list, p_in, p_out, n_if)
    if start is not None:
        for k in range(12):
            run.month((start + k) % 12)
    else:
        for m in range(12):
            run.line[m] = _line(s_pos, p_in[m], p_out[m], ())
            run.flux[m] = _end_fluxes(s_pos, run.line[m])
    return _result(run, start, temps, p_sat, s_pos, r_pos, names, construction)


def _start_month(condenses: list) -> int | None:
    """First month, scanning from January, that condenses after one that does not."""
    if not any(condenses):
        return None
    if all(condenses):
        return 0
    return next(m for m in range(12) if condenses[m] and not condenses[m - 1])


class _Run:
    """Running state of the monthly calculation: water per interface, per-month records."""

    def __init__(self, s_pos, p_sat, p_in, p_out, n_if) -> None:
        self.s, self.p_sat, self.p_in, self.p_out = s_pos, p_sat, p_in, p_out
        self.held = np.zeros(n_if)
        self.rate = np.zeros((12, n_if))
        self.acc = np.zeros((12, n_if))
        self.line = np.zeros((12, len(s_pos)))
        self.flux = np.zeros((12, 2))
        self.planes = [()] * 12

    def month(self, m: int) -> None:
        """One month: the line with wet interfaces held at saturation, then the amounts."""
        wet = tuple(int(i) + 1 for i in np.flatnonzero(self.held > DRY))
        nodes = _contacts(self.s, self.p_sat[m], self.p_in[m], self.p_out[m], wet)
        vertices = tuple(sorted(set(nodes) | set(wet)))
        line = _line(self.s, self.p_in[m], self.p_out[m],
                     {v: self.p_sat[m][v] for v in vertices})
        seconds = month_seconds(m)
        values = line.tolist()
        for v in vertices:
            g = _plane_flux(self.s, values, v, vertices)
            i = v - 1
            before = float(self.held[i])
            change = max(g * seconds, -before)
            self.held[i] = 0.0 if before + change <= DRY else before + change
            self.rate[m, i] = change
        self.acc[m] = self.held
        self.line[m] = line
        self.flux[m] = _end_fluxes(self.s, line)
        self.planes[m] = tuple(v - 1 for v in vertices)


def _contacts(s, p_sat, p_in, p_out, wet) -> tuple:
    """Interior nodes where the tightest line under saturation touches it, between the
    fixed points (both surfaces and the ``wet`` nodes held at saturation)."""
    n = len(s) - 1
    fixed = [0, *sorted(wet), n]
    value = {0: p_in, n: p_out, **{w: p_sat[w] for w in wet}}
    found = []
    for a, b in zip(fixed[:-1], fixed[1:], strict=True):
        hull = [a]
        for k in range(a + 1, b + 1):
            pk = value[k] if k == b else p_sat[k]
            while len(hull) >= 2 and _below_or_on(s, hull[-2], hull[-1], k, p_sat, value, pk):
                hull.pop()
            hull.append(k)
        found += hull[1:-1]
    return tuple(found)


def _below_or_on(s, i, j, k, p_sat, value, pk) -> bool:
    """True when point j lies on or above the chord from i to k (so j is not a vertex)."""
    pi, pj = value.get(i, p_sat[i]), value.get(j, p_sat[j])
    cross = (s[j] - s[i]) * (pk - pi) - (pj - pi) * (s[k] - s[i])
    scale = max(abs(pk), abs(pi), 1.0) * max(s[k] - s[i], 1e-300)
    return cross <= 1e-12 * scale


def _line(s, p_in, p_out, held) -> np.ndarray:
    """Vapour pressure at every node: straight between the held points. [Pa]"""
    n = len(s) - 1
    pts = {0: p_in, n: p_out, **dict(held)}
    xs = sorted(pts)
    return np.interp(s, [s[i] for i in xs], [pts[i] for i in xs])


def _plane_flux(s, line, v, vertices) -> float:
    """Net flux into node v from its neighbouring vertices of the line. [kg/(m2 s)]"""
    pts = [0, *vertices, len(s) - 1]
    k = pts.index(v)
    a, b = pts[k - 1], pts[k + 1]
    g_in = (line[a] - line[v]) / (s[v] - s[a])
    g_out = (line[v] - line[b]) / (s[b] - s[v])
    return VAPOUR_PERMEABILITY_AIR * (g_in - g_out)


def _end_fluxes(s, line) -> np.ndarray:
    """Vapour flux in at the inside surface and out at the outside surface. [kg/(m2 s)]"""
    return VAPOUR_PERMEABILITY_AIR * np.array([(line[0] - line[1]) / (s[1] - s[0]),
                                               (line[-2] - line[-1]) / (s[-1] - s[-2])])


def _inside_warnings(run, temps, s_pos, names) -> list:
    """Months and layers where the line rises above saturation between interfaces."""
    frac = np.linspace(0.0, 1.0, _INSIDE_SAMPLES)[1:-1]
    t = temps[:, :-1, None] + frac * (temps[:, 1:, None] - temps[:, :-1, None])
    p = run.line[:, :-1, None] + frac * (run.line[:, 1:, None] - run.line[:, :-1, None])
    excess = (p - saturation_pressure(t)).max(axis=2)  # (month, layer)
    out = []
    for j in np.flatnonzero(excess.max(axis=0) > 1e-9):
        month = int(np.argmax(excess[:, j]))
        out.append(f"layer {j + 1} {quote(names[j])}: in {MONTH_NAMES[month]} the vapour-"
                   f"pressure line rises up to {excess[month, j]:.3g} Pa above saturation "
                   "inside the layer, so water may condense within it; split the layer into "
                   "thinner layers to locate the plane (EN ISO 13788, 6)")
    return out


def _result(run, start, temps, p_sat, s_pos, r_pos, names, construction):
    total_rate = run.rate.sum(axis=1)
    total_acc = run.acc.sum(axis=1)
    residual = 0.0 if start is None else float(total_acc[(start - 1) % 12])
    peak = float(total_acc.max()) if start is not None else 0.0
    warnings = _inside_warnings(run, temps, s_pos, names)
    if np.any(run.line[:, 0] > p_sat[:, 0] + 1e-9):
        warnings.append("the inside vapour pressure exceeds saturation at the inside surface "
                        "in some month (surface condensation): see the surface check")
    return CondensationResult(
        start_month=start, condensation_rate=total_rate, accumulation=total_acc,
        planes=tuple(run.planes), max_accumulation=peak,
        max_month=int(np.argmax(total_acc)) if start is not None else None,
        dries_out=residual <= DRY, interface_rate=run.rate,
        interface_accumulation=run.acc, temperatures=temps, saturation=p_sat,
        vapour_pressure=run.line, sd_position=s_pos, resistance_position=r_pos,
        flux_inside=run.flux[:, 0], flux_outside=run.flux[:, 1], layer_names=names,
        interface_names=tuple(f"{a} | {b}" for a, b in zip(names[:-1], names[1:],
                                                            strict=True)),
        mass_balance=float(total_rate.sum()) - residual, warnings=tuple(warnings))
