"""The ``[[climates]]`` and ``[[moisture]]`` sections of a project file.

Schema (see :mod:`heatledger.moisture.schema` for every key)::

    [[climates]]
    name = "Demo lowland site (invented)"
    humidity_class = 3             # EN ISO 13788 Annex A, or rh_inside = 0.5
    temp_inside = 20.0             # degC, every month
      [[climates.months]]          # twelve, "jan" to "dec"
      month = "jan"
      temp_outside = 1.5           # degC, monthly mean
      rh_outside = 0.87            # fraction 0..1

    [[moisture]]
    name = "External wall W1"
    construction = "W1 external wall"
    climate = "Demo lowland site (invented)"
    rh_critical = 0.8              # 0.8 mould (default), 1.0 surface condensation
    resistance_inside = 0.25       # m2 K/W, inside surface resistance of the surface check

Every problem is reported with its key path (``climates[1].months[3].rh_outside``).
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import cached_property

from .._projectio import error_text, table_list, unknown
from .._validate import quote, show
from ..errors import HeatLedgerError
from ..schema import read_value
from .climate import MonthlyClimate, _rh
from .glaser import interstitial_condensation, vapour_columns
from .schema import CLIMATE_TABLE, MOISTURE_TABLE, MONTH_KEYS, MONTH_TABLE
from .surface import _critical_rh, surface_check

__all__ = ["MoistureEntry", "climates_from_dict", "checks_from_dict"]


@dataclass
class MoistureEntry:
    """A moisture check of the project: a construction in a climate.

    Attributes
    ----------
    name : str
    construction : heatledger.Construction
    climate : MonthlyClimate
    rh_critical : float
        Critical surface relative humidity. [-]
    resistance_inside : float
        Inside surface resistance of the surface check. [m2 K/W]
    where : str
        Key path (``moisture[1]``).
    notes : str
    junction : object, optional
        A junction entry whose f_Rsi the surface check uses (None: the plane
        construction's). [-]
    """

    name: str
    construction: object
    climate: MonthlyClimate
    rh_critical: float
    resistance_inside: float
    where: str
    notes: str = ""
    junction: object = None

    @cached_property
    def surface(self):
        """The surface humidity check (:class:`~heatledger.moisture.SurfaceCheck`)."""
        f = None if self.junction is None else self.junction.result.surface_factor
        return surface_check(self.construction, self.climate, rh_critical=self.rh_critical,
                             resistance_inside=self.resistance_inside, surface_factor=f)

    @cached_property
    def interstitial(self):
        """The Glaser calculation (:class:`~heatledger.moisture.CondensationResult`)."""
        return interstitial_condensation(self.construction, self.climate)


def climates_from_dict(data, problems) -> dict:
    """Climates of the project's ``[[climates]]`` tables, by name (None for a climate with
    a problem of its own, so that a check naming it is not reported again).

    Parameters
    ----------
    data : dict
        The project data. [-]
    problems : list
        Every problem is appended as ``(key path, message)``. [-]

    Returns
    -------
    dict
        Name -> MonthlyClimate or None.
    """
    out = {}
    for i, row in enumerate(table_list(data, "climates", problems), 1):
        where = f"climates[{i}]"
        start = len(problems)
        unknown(row, CLIMATE_TABLE.keys(), where, problems)
        vals = {c.key: read_value(c, row, where, problems) for c in CLIMATE_TABLE.columns
                if c.place != "sheet"}
        name = vals.get("name")
        if name and name.lower() in {k.lower() for k in out}:
            problems.append((f"{where}.name", f"climate name {show(name)} is used twice"))
            continue
        months = _months(row, vals, where, problems)
        if name is None:
            continue
        out[name] = None if len(problems) > start or months is None else _climate(
            vals, months, where, problems)
    return out


def _months(row, vals, where, problems):
    """The twelve month rows, in calendar order, or None after a problem."""
    rows = table_list(row if isinstance(row, dict) else {}, "months", problems, where=where,
                      section="climates.months")
    start = len(problems)
    by_month = {}
    for j, month in enumerate(rows, 1):
        at = f"{where}.months[{j}]"
        unknown(month, MONTH_TABLE.keys(), at, problems)
        got = {c.key: read_value(c, month, at, problems) for c in MONTH_TABLE.columns
               if c.place != "sheet"}
        for key in ("rh_outside", "rh_inside"):
            if got.get(key) is not None:
                _fraction(got, key, at, problems)
        if got["month"] in by_month:
            problems.append((f"{at}.month", f"{show(got['month'])} is given twice"))
        elif got["month"] is not None:
            by_month[got["month"]] = got
    missing = [m for m in MONTH_KEYS if m not in by_month]
    if missing and len(problems) == start:
        problems.append((f"{where}.months", f"needs twelve months, jan to dec; missing "
                         f"{', '.join(missing)}"))
    if vals.get("rh_inside") is not None:
        _fraction(vals, "rh_inside", where, problems)
    if len(problems) > start:
        return None
    return [by_month[m] for m in MONTH_KEYS]


def _fraction(values, key, where, problems) -> None:
    try:
        _rh(key, values[key])
    except HeatLedgerError as exc:
        problems.append((f"{where}.{key}", error_text(exc).removeprefix(f"{key} = ")))
        values[key] = None


def _climate(vals, months, where, problems):
    """The MonthlyClimate of one ``[[climates]]`` table."""
    t_i = [m["temp_inside"] if m["temp_inside"] is not None else vals["temp_inside"]
           for m in months]
    t_e = [m["temp_outside"] for m in months]
    rh_e = [m["rh_outside"] for m in months]
    rh_i = [m["rh_inside"] if m["rh_inside"] is not None else vals["rh_inside"]
            for m in months]
    cls = vals.get("humidity_class")
    try:
        if cls is not None:
            if any(m["rh_inside"] is not None for m in months) or vals["rh_inside"] is not None:
                problems.append((f"{where}.humidity_class", "give either humidity_class or "
                                 "rh_inside, not both"))
                return None
            return MonthlyClimate.from_humidity_class(t_e, rh_e, cls, t_i, name=vals["name"])
        if any(v is None for v in rh_i):
            problems.append((f"{where}.rh_inside", "give the inside humidity: humidity_class "
                             "(1 to 5) or rh_inside (for the climate or every month)"))
            return None
        return MonthlyClimate(t_e, rh_e, t_i, rh_i, name=vals["name"])
    except HeatLedgerError as exc:
        problems.append((where, error_text(exc)))
        return None


def checks_from_dict(data, climates, constructions, problems, junctions=None) -> list:
    """Moisture checks of the project's ``[[moisture]]`` tables.

    Parameters
    ----------
    data : dict
        The project data. [-]
    climates : dict
        Climate name -> MonthlyClimate (None: known but broken). [-]
    constructions : dict
        Construction name -> Construction (None: known but broken). [-]
    problems : list
        Every problem is appended as ``(key path, message)``. [-]
    junctions : dict, optional
        Junction name -> junction entry, for checks that name one. [-]

    Returns
    -------
    list of MoistureEntry
    """
    out, seen = [], set()
    junctions = junctions or {}
    for i, row in enumerate(table_list(data, "moisture", problems), 1):
        where = f"moisture[{i}]"
        start = len(problems)
        unknown(row, MOISTURE_TABLE.keys(), where, problems)
        v = {c.key: read_value(c, row, where, problems) for c in MOISTURE_TABLE.columns}
        con = _named(v["construction"], constructions, "construction", where, problems)
        clim = _named(v["climate"], climates, "climate", where, problems)
        junction = _named(v["junction"], junctions, "junction", where, problems)
        if v["rh_critical"] is not None:
            try:
                _critical_rh(v["rh_critical"])
            except HeatLedgerError as exc:
                problems.append((f"{where}.rh_critical", error_text(exc)))
        if con is not None:
            try:
                vapour_columns(con)
            except HeatLedgerError as exc:
                problems.append((f"{where}.construction", error_text(exc)))
        if v["name"] and v["name"].lower() in seen:
            problems.append((f"{where}.name", f"check name {show(v['name'])} is used twice"))
        if len(problems) > start or con is None or clim is None or (
                v["junction"] is not None and junction is None):
            continue
        seen.add(v["name"].lower())
        out.append(MoistureEntry(v["name"], con, clim, v["rh_critical"],
                                 v["resistance_inside"], where, v["notes"] or "", junction))
    return out


def _named(name, known, what, where, problems):
    if name is None:
        return None
    if name not in known:
        listed = ", ".join(quote(k) for k in known) or f"none: add a [[{what}s]] table"
        problems.append((f"{where}.{what}", f"no {what} is called {quote(name)}; the project "
                         f"has {listed}"))
        return None
    return known[name]
