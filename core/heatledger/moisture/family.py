"""Registry hooks of the moisture family (see :mod:`heatledger.families`)."""

from __future__ import annotations

from .project_io import checks_from_dict, climates_from_dict
from .psychrometrics import MONTH_NAMES

__all__ = ["parse", "warnings", "results", "report"]


def parse(data, context, problems) -> list:
    """Moisture checks of the project's ``[[climates]]`` and ``[[moisture]]`` tables.

    Parameters
    ----------
    data : dict
        The project data. [-]
    context : heatledger.families.ParseContext
        The constructions parsed before (a broken one stands as None). [-]
    problems : list
        Every problem is appended as ``(key path, message)``. [-]

    Returns
    -------
    list of MoistureEntry
    """
    constructions = {name: None for name in context.broken if name}
    constructions.update({e.name: e.construction
                          for e in context.entries.get("constructions", [])})
    climates = climates_from_dict(data, problems)
    junctions = {row.get("name"): None for row in data.get("junctions", []) or []
                 if isinstance(row, dict) and isinstance(row.get("name"), str)}
    junctions.update({e.name: e for e in context.entries.get("junctions", [])})
    return checks_from_dict(data, climates, constructions, problems, junctions)


def warnings(entries) -> list:
    """What was adjusted or looks doubtful, as ``(key path, message)``.

    Parameters
    ----------
    entries : list of MoistureEntry
        The parsed checks. [-]

    Returns
    -------
    list of tuple
    """
    out = []
    for e in entries:
        out += [(e.where, w) for w in e.climate.warnings]
        out += [(e.where, w) for w in e.interstitial.warnings]
    return out


def results(project) -> dict:
    """Moisture checks as plain data (``calc --json``): per month f_Rsi,min [-], pass,
    condensation rate and accumulation [kg/m2], planes; the verdicts.

    Parameters
    ----------
    project : heatledger.project.Project
        A parsed project. [-]

    Returns
    -------
    dict
    """
    out = []
    for e in project.moisture:
        s, g = e.surface, e.interstitial
        out.append({
            "name": e.name, "construction": e.construction.name, "climate": e.climate.name,
            "surface": {"surface_factor": s.surface_factor, "rh_critical": s.rh_critical,
                        "resistance_inside": s.resistance_inside,
                        "required": [None if v != v else float(v) for v in s.required],
                        "passes": [bool(p) for p in s.passes],
                        "critical_month": s.critical_month, "ok": s.ok,
                        "verdict": s.verdict},
            "interstitial": {"start_month": g.start_month,
                             "condensation_rate": [float(v) for v in g.condensation_rate],
                             "accumulation": [float(v) for v in g.accumulation],
                             "planes": [list(p) for p in g.planes],
                             "interfaces": list(g.interface_names),
                             "max_accumulation": g.max_accumulation,
                             "max_month": g.max_month, "dries_out": g.dries_out,
                             "mass_balance": g.mass_balance, "verdict": g.verdict,
                             "warnings": list(g.warnings)}})
    return {"moisture": out}


def report(results: dict, write, shown: set) -> None:
    """Print the moisture checks of ``results`` (``calc`` text).

    Parameters
    ----------
    results : dict
        The ``calc --json`` data. [-]
    write : callable
        Writes one string. [-]
    shown : set of str
        Messages already listed among the input warnings. [-]
    """
    for m in results["moisture"]:
        s, g = m["surface"], m["interstitial"]
        write(f"\nMoisture check {m['name']} ({m['construction']} in {m['climate']}; "
              "EN ISO 13788)\n")
        write(f"  surface: {s['verdict']}\n")
        write(f"  interstitial: {g['verdict']}\n")
        head = (f"  {'month':<6}{'f_Rsi,min':>10}{'surface':>9}{'rate g/m2':>11}"
                f"{'held g/m2':>11}  planes")
        write(head + "\n  " + "-" * (len(head) - 2) + "\n")
        for k, name in enumerate(MONTH_NAMES):
            req = s["required"][k]
            planes = ", ".join(g["interfaces"][i] for i in g["planes"][k]) or "-"
            write(f"  {name:<6}{'n/a' if req is None else f'{req:.3f}':>10}"
                  f"{'ok' if s['passes'][k] else 'FAIL':>9}"
                  f"{g['condensation_rate'][k] * 1000.0:>11.1f}"
                  f"{g['accumulation'][k] * 1000.0:>11.1f}  {planes}\n")
        for w in g["warnings"]:
            if w not in shown:
                write(f"  warning: {w}\n")
