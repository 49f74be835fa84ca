"""Registry hooks of the thermal-bridge family (see :mod:`heatledger.families`)."""

from __future__ import annotations

from .project_io import junctions_from_dict

__all__ = ["parse", "warnings", "results", "report"]


def parse(data, context, problems) -> list:
    """Junctions of the project's ``[[junctions]]`` tables.

    Parameters
    ----------
    data : dict
        The project data. [-]
    context : heatledger.families.ParseContext
        The library, design temperatures and the constructions parsed before. [-]
    problems : list
        Every problem is appended as ``(key path, message)``. [-]

    Returns
    -------
    list of JunctionEntry
    """
    return junctions_from_dict(data, context, problems)


def warnings(entries) -> list:
    """What looks doubtful, as ``(key path, message)``.

    Parameters
    ----------
    entries : list of JunctionEntry
        The parsed junctions. [-]

    Returns
    -------
    list of tuple
    """
    return [(e.where, w) for e in entries for w in e.junction.warnings]


def results(project) -> dict:
    """Junctions as plain data (``calc --json``): psi and L_2D [W/(m K)], f_Rsi [-], the
    lowest inside surface temperature [degC] and where it is [m], the energy balance [W/m],
    the grid and the mesh estimate.

    Parameters
    ----------
    project : heatledger.project.Project
        A parsed project. [-]

    Returns
    -------
    dict
    """
    out = []
    for e in project.junctions:
        r = e.result
        est = r.flow_solve.mesh_estimate
        out.append({
            "name": e.name, "kind": e.junction.kind, "description": e.junction.description,
            "psi": r.psi_result.psi, "coupling_coefficient": r.psi_result.coupling_coefficient,
            "flanking": [{"name": n, "u_value": u, "length": length}
                         for n, u, length in e.junction.flanking],
            "dimensions": r.psi_result.dimensions, "surface_factor": r.surface_factor,
            "lowest_temperature": r.lowest.temperature,
            "lowest_at": [r.lowest.x, r.lowest.y], "lowest_surface": r.lowest.surface,
            "energy_balance": r.flow_solve.energy_balance, "cells": r.flow_solve.cells,
            "solver": r.flow_solve.solver, "mesh_estimate": est.error_estimate,
            "mesh_basis": est.basis})
    return {"junctions": out}


def report(results: dict, write, shown: set) -> None:
    """Print the junctions of ``results`` (``calc`` text).

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
    head = (f"{'junction':<34} {'psi W/(m K)':>12} {'L2D':>8} {'f_Rsi':>6} "
            f"{'lowest degC':>11}  dimensions")
    write("\nThermal bridges (2-D, EN ISO 10211)\n" + head + "\n" + "-" * len(head) + "\n")
    for j in results["junctions"]:
        write(f"{j['name'][:34]:<34} {j['psi']:>12.4f} {j['coupling_coefficient']:>8.4f} "
              f"{j['surface_factor']:>6.3f} {j['lowest_temperature']:>11.2f}  "
              f"{j['dimensions']}\n")
    for j in results["junctions"]:
        write(f"\n{j['name']}: {j['description']}; {j['cells']:,} cells ({j['solver']}), "
              f"energy balance {j['energy_balance']:.1e} W/m, mesh estimate of the heat "
              f"flow {j['mesh_estimate']:.1e} W/m ({j['mesh_basis']})\n")
