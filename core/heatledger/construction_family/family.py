"""Registry hooks of the constructions family (see :mod:`heatledger.families`)."""

from __future__ import annotations

from ..errors import HeatLedgerError
from .project_io import constructions_from_dict

__all__ = ["parse", "warnings", "results", "report"]


def parse(data, context, problems) -> list:
    """Construction entries of the project's ``[[constructions]]`` tables.

    Parameters
    ----------
    data : dict
        The project data. [-]
    context : heatledger.families.ParseContext
        The material library; names of constructions with problems are added to
        ``context.broken``. [-]
    problems : list
        Every problem is appended as ``(key path, message)``. [-]

    Returns
    -------
    list of ConstructionEntry
    """
    return constructions_from_dict(data, context.library, problems, context.broken)


def warnings(entries) -> list:
    """Input that is probably a slip, as ``(key path, message)``.

    Parameters
    ----------
    entries : list of ConstructionEntry
        The project's constructions. [-]

    Returns
    -------
    list of tuple
    """
    return [(e.where, text) for e in entries for text in e.construction.input_warnings]


def results(project) -> dict:
    """Per-construction results of ``project`` as plain data (``calc --json``).

    Parameters
    ----------
    project : heatledger.project.Project
        A parsed project. [-]

    Returns
    -------
    dict
        ``{"constructions": [...]}`` with, per construction, ``total_resistance``
        [m2 K/W], ``u_value`` and ``u_value_reported`` [W/(m2 K)], ``interface_temperatures``
        [degC], ``heat_flux`` [W/m2], ``energy_residual`` [-] and the mesh estimate.
    """
    return {"constructions": [_result(project, entry) for entry in project.constructions]}


def _result(project, entry) -> dict:
    con = entry.construction
    temps = con.temperatures(project.temp_inside, project.temp_outside,
                             nodes_per_layer=entry.nodes_per_layer)
    counted = [row for row in con.layer_table if row.counted]
    labels = ["inside surface"] + [f"{a.name} | {b.name}" for a, b in
                                   zip(counted[:-1], counted[1:], strict=True)]
    labels.append("outside surface")
    target = entry.target_u
    return {
        "name": entry.name,
        "heat_flow": con.heat_flow,
        "area_m2": entry.area,
        "total_resistance": con.total_resistance,
        "u_value_uncorrected": con.u_value_uncorrected,
        "corrections_total": con.corrections.delta_u_total,
        "corrections_applied": con.corrections.applied,
        "u_value": con.u_value,
        "u_value_reported": con.u_value_reported,
        "target_u": target,
        "target_met": None if target is None else con.u_value <= target,
        "heat_flux": temps.heat_flux,
        "interface_temperatures": [
            {"at": label, "x_m": float(x), "temperature_C": float(t)}
            for label, x, t in zip(labels, temps.interface_x, temps.interface_temperatures,
                                   strict=True)
        ],
        "energy_residual": temps.energy_residual,
        "mesh_estimate_heat_flux": temps.mesh_estimate.error_estimate,
        "mesh_estimate_basis": temps.mesh_estimate.basis,
        "ladder_heat_flux": temps.ladder_heat_flux,
        "nodes": int(temps.x.size),
        "warnings": list(con.warnings),
        "sizing": _sizing(entry),
    }


def _sizing(entry) -> dict | None:
    if entry.size_layer is None:
        return None
    layer = entry.construction.layers[entry.size_layer].name
    try:
        d_req = entry.required_thickness()
    except HeatLedgerError as exc:
        return {"layer": layer, "required_thickness_mm": None, "message": str(exc)}
    return {"layer": layer, "required_thickness_mm": d_req * 1000.0, "message": ""}


def report(results: dict, write, shown: set) -> None:
    """Print the constructions of ``results`` (``calc`` text).

    Parameters
    ----------
    results : dict
        The ``calc --json`` data. [-]
    write : callable
        Writes one string. [-]
    shown : set of str
        Messages already listed among the input warnings (not repeated). [-]
    """
    head = (f"{'construction':<36} {'flow':<10} {'R_T m2K/W':>10} {'U W/m2K':>9} "
            f"{'U (2 s.f.)':>10} {'target':>7} {'met':>4}")
    write(head + "\n" + "-" * len(head) + "\n")
    for c in results["constructions"]:
        target = "" if c["target_u"] is None else f"{c['target_u']:.2f}"
        met = "" if c["target_met"] is None else ("yes" if c["target_met"] else "NO")
        write(f"{c['name'][:36]:<36} {c['heat_flow']:<10} {c['total_resistance']:>10.3f} "
              f"{c['u_value']:>9.4f} {c['u_value_reported']:>#10.2g} {target:>7} {met:>4}\n")
    for c in results["constructions"]:
        _report_one(c, write, shown)


def _report_one(c: dict, write, shown: set) -> None:
    exact = c["mesh_estimate_basis"].startswith("exact")
    mesh = ("mesh: exact for this case" if exact else
            f"mesh error bound {c['mesh_estimate_heat_flux']:.1e} W/m2")
    ladder = ("" if c["ladder_heat_flux"] is None else
              f", ladder check {c['ladder_heat_flux']:.3f} W/m2")
    write(f"\n{c['name']}: heat flux {c['heat_flux']:.3f} W/m2{ladder}, energy balance "
          f"residual {c['energy_residual']:.1e}, {mesh} ({c['nodes']} nodes)\n")
    for t in c["interface_temperatures"]:
        write(f"  {t['x_m'] * 1000:8.1f} mm  {t['temperature_C']:8.2f} degC  {t['at']}\n")
    sz = c["sizing"]
    if sz and sz["required_thickness_mm"] is not None:
        write(f"  to reach U = {c['target_u']:g} W/(m2 K): {sz['layer']} "
              f"{sz['required_thickness_mm']:.1f} mm\n")
    elif sz:
        write(f"  sizing {sz['layer']}: {sz['message']}\n")
    for warning in c["warnings"]:
        if warning not in shown:  # input warnings are listed once, at the top
            write(f"  warning: {warning}\n")
