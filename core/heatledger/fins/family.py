"""Registry hooks of the fins family (see :mod:`heatledger.families`)."""

from __future__ import annotations

from .project_io import fin_results, fins_from_dict

__all__ = ["parse", "results", "report"]


def parse(data, context, problems) -> list:
    """Fin entries of the project's ``[[fins]]`` tables.

    Parameters
    ----------
    data : dict
        The project data. [-]
    context : heatledger.families.ParseContext
        The material library. [-]
    problems : list
        Every problem is appended as ``(key path, message)``. [-]

    Returns
    -------
    list of FinEntry
    """
    return fins_from_dict(data.get("fins"), context.library, problems)


def results(project) -> dict:
    """The fins of ``project`` as plain data (``calc --json``: see :func:`fin_results`).

    Parameters
    ----------
    project : heatledger.project.Project
        A parsed project. [-]

    Returns
    -------
    dict
    """
    return {"fins": fin_results(project.fins)}


def report(results: dict, write, shown: set) -> None:
    """Print the fins of ``results`` (``calc`` text).

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
    fins = results["fins"]
    head = (f"{'fin (one fin of the entry)':<40} {'q W':>9} {'eta_f':>6} {'eps_f':>7} "
            f"{'T tip C':>8} {'array q W':>10} {'eta_o':>6}")
    write("\nFins (closed form; finite volumes as a check)\n" + head + "\n" + "-" * len(head)
          + "\n")
    for f in fins:
        arr = f["array"]
        aq, ae = ("", "") if arr is None else (f"{arr['heat_rate']:.2f}",
                                               f"{arr['overall_efficiency']:.3f}")
        write(f"{f['name'][:40]:<40} {f['heat_rate']:>9.3f} {f['efficiency']:>6.3f} "
          f"{f['effectiveness']:>7.2f} {f['temp_tip']:>8.2f} {aq:>10} {ae:>6}\n")
    for f in fins:
        fv = f["fv"]
        write(f"\n{f['name']}: {f['method']}; finite volumes {fv['heat_rate']:.4f} W "
          f"({fv['cells']} cells{', h(T)/radiation' if fv['nonlinear'] else ''}), energy "
          f"balance residual {fv['energy_residual']:.1e}, mesh estimate "
          f"{fv['mesh_estimate_heat_rate']:.1e} W\n")
        if f["array"] is not None:
            a = f["array"]
            write(f"  array of {a['count']} fins: {a['heat_rate']:.2f} W, resistance "
              f"{a['fin_resistance']:.4f} K/W\n")
        for key, sz in f["sizing"].items():
            what = "fin length" if key == "length" else "fin count"
            if sz["value"] is None:
                write(f"  {what} for {f['array']['target_heat_rate']:g} W: {sz['message']}\n")
            else:
                unit = " mm" if sz["unit"] == "mm" else ""
                write(f"  {what} for {f['array']['target_heat_rate']:g} W: "
                      f"{sz['value']:.4g}{unit}\n")
        for warning in f["warnings"]:
            write(f"  warning: {warning}\n")
