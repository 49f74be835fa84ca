"""Registry hooks of the heat-loss family (see :mod:`heatledger.families`)."""

from __future__ import annotations

from .project_io import building_from_dict

__all__ = ["parse", "warnings", "results", "report"]


def parse(data, context, problems):
    """The building of the project's ``[building]`` and ``[[rooms]]`` tables.

    Parameters
    ----------
    data : dict
        The project data. [-]
    context : heatledger.families.ParseContext
        The library, design temperatures and the constructions parsed before (a
        construction with a problem of its own stands as None: known, but not usable). [-]
    problems : list
        Every problem is appended as ``(key path, message)``. [-]

    Returns
    -------
    BuildingInput or None
    """
    constructions = {name: None for name in context.broken if name}
    constructions.update({e.name: e.construction
                          for e in context.entries.get("constructions", [])})
    junctions = {row.get("name"): None for row in data.get("junctions", []) or []
                 if isinstance(row, dict) and isinstance(row.get("name"), str)}
    junctions.update({e.name: e for e in context.entries.get("junctions", [])})
    return building_from_dict(data, constructions, context.library, context.temp_inside,
                              context.temp_outside, problems, junctions)


def warnings(building) -> list:
    """Input that is probably a slip, as ``(key path, message)``.

    Parameters
    ----------
    building : BuildingInput
        The parsed building. [-]

    Returns
    -------
    list of tuple
    """
    return list(getattr(building, "warnings", []) or [])


def results(project) -> dict:
    """Rooms and building heat loss as plain data (``calc --json``).

    Parameters
    ----------
    project : heatledger.project.Project
        A parsed project. [-]

    Returns
    -------
    dict
        ``{"rooms": [...], "building": {...}}``: coefficients [W/K], loads [W], annual
        energy [kWh].
    """
    bi = getattr(project, "building", None)
    if bi is None:
        return {}
    res = bi.heat_load()
    per_room = bi.room_annual_energy()
    rooms = [{"name": r.room, "temp_inside": r.temp_inside,
              "transmission_coefficient": r.transmission_coefficient,
              "internal_exchange_coefficient": r.internal_exchange_coefficient,
              "ventilation_coefficient": r.ventilation_coefficient,
              "heat_loss_coefficient": r.heat_loss_coefficient,
              "design_heat_load": r.design_heat_load, "reheat_allowance": r.reheat_allowance,
              "annual_energy_kwh": per_room[r.room].energy if per_room else None,
              "lines": [{"name": ln.name, "kind": ln.kind, "boundary": ln.boundary,
                         "coefficient": ln.coefficient, "heat_loss": ln.heat_loss,
                         "share": ln.share} for ln in r.lines]}
             for r in res.rooms]
    ann = bi.annual_energy()
    return {"rooms": rooms, "building": {
        "name": res.name, "temp_outside": res.temp_outside,
        "transmission_coefficient": res.transmission_coefficient,
        "ventilation_coefficient": res.ventilation_coefficient,
        "heat_loss_coefficient": res.heat_loss_coefficient,
        "design_heat_load": res.design_heat_load, "by_kind": dict(res.by_kind),
        "degree_days": bi.degree_days, "degree_day_base": bi.degree_day_base,
        "annual_energy_kwh": None if ann is None else ann.energy}}


def report(results: dict, write, shown: set) -> None:
    """Print the rooms and the building of ``results`` (``calc`` text).

    Parameters
    ----------
    results : dict
        The ``calc --json`` data. [-]
    write : callable
        Writes one string. [-]
    shown : set of str
        Messages already listed among the input warnings. [-]
    """
    del shown
    b = results["building"]
    rooms = results["rooms"]
    head = (f"{'room':<30} {'theta_i':>7} {'H_T W/K':>9} {'H_V W/K':>9} {'load W':>9} "
            f"{'energy kWh/a':>12}")
    write(f"\nHeat loss at theta_e {b['temp_outside']:g} degC (EN 12831-1 style)\n")
    write(head + "\n" + "-" * len(head) + "\n")
    for r in rooms:
        e = "" if r["annual_energy_kwh"] is None else f"{r['annual_energy_kwh']:.0f}"
        write(f"{r['name'][:30]:<30} {r['temp_inside']:>7.1f} "
              f"{r['transmission_coefficient']:>9.2f} "
              f"{r['ventilation_coefficient']:>9.2f} {r['design_heat_load']:>9.0f} {e:>12}\n")
    e = "" if b["annual_energy_kwh"] is None else f"{b['annual_energy_kwh']:.0f}"
    write(f"{('building ' + b['name'])[:30]:<30} {'':>7} "
          f"{b['transmission_coefficient']:>9.2f} "
      f"{b['ventilation_coefficient']:>9.2f} {b['design_heat_load']:>9.0f} {e:>12}\n")
    if b["annual_energy_kwh"] is not None:
        write(f"annual energy: Q = 24 H DD / 1000 with {b['degree_days']:g} K day on the base "
              f"{b['degree_day_base']:g} degC\n")
