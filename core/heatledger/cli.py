"""The ``heatledger`` command line.

    heatledger demo                 results of the (invented) demo project as a table
    heatledger calc FILE [--json]   results of a TOML project file
    heatledger materials [--json]   the material library

Exit codes: 0 success, 1 input problem (message on stderr), 2 usage error, 3 a defect of
heatledger (one line on stderr; HEATLEDGER_TRACEBACK=1 shows the traceback).
"""

from __future__ import annotations

import argparse
import json
import math
import os
import sys
from typing import TYPE_CHECKING

from .errors import HeatLedgerError

if TYPE_CHECKING:  # the engine is imported by the commands that use it, not by --help
    from .project import Project

__all__ = ["main", "demo_project", "project_results"]

DEMO_RESOURCE = "data/demo_project.toml"


def main(argv=None) -> int:
    """Run the command line; return the exit code."""
    parser = _parser()
    args = parser.parse_args(argv)
    if not getattr(args, "command", None):
        parser.print_help()
        return 2
    try:
        return int(args.handler(args) or 0)
    except BrokenPipeError:
        # the reader (e.g. `heatledger demo | head`) closed the pipe: stop quietly
        devnull = os.open(os.devnull, os.O_WRONLY)
        os.dup2(devnull, sys.stdout.fileno())
        return 0
    except HeatLedgerError as exc:
        print(f"heatledger: {exc}", file=sys.stderr)
        return 1
    except OSError as exc:
        print(f"heatledger: {exc.strerror or exc}: {exc.filename or ''}".rstrip(": "),
              file=sys.stderr)
        return 1
    except KeyboardInterrupt:
        print("heatledger: stopped", file=sys.stderr)
        return 130
    except Exception as exc:  # noqa: BLE001 - a user never sees a traceback
        if os.environ.get("HEATLEDGER_TRACEBACK"):
            raise
        reason = " ".join(str(exc).split())[:160]
        print(f"heatledger: unexpected problem ({type(exc).__name__}: {reason}); this is a "
              "defect of heatledger: please report it with the input file (set "
              "HEATLEDGER_TRACEBACK=1 to see the details)", file=sys.stderr)
        return 3


def demo_bytes() -> bytes:
    """The demo project file shipped with heatledger (an invented scenario), as bytes."""
    from importlib import resources

    return resources.files("heatledger").joinpath(DEMO_RESOURCE).read_bytes()


def demo_project() -> Project:
    """The demo project shipped with heatledger (an invented scenario)."""
    from .project import project_from_dict, tomllib

    data = demo_bytes()
    return project_from_dict(tomllib.loads(data.decode("utf-8")), source_bytes=data,
                             source_name="demo_project.toml")


def project_results(project: Project) -> dict:
    """Per-construction results of ``project`` as plain data (the ``--json`` schema).

    Parameters
    ----------
    project : Project
        A parsed project. [-]

    Returns
    -------
    dict
        ``{"project": ..., "design": ..., "constructions": [...]}`` with, per construction,
        ``total_resistance`` [m2 K/W], ``u_value`` and ``u_value_reported`` [W/(m2 K)],
        ``interface_temperatures`` [degC], ``heat_flux`` [W/m2] and ``energy_residual`` [-];
        ``input_warnings``: input that is probably a slip, each ``{"where", "message"}``.
    """
    from . import __version__
    from .cautions import caution_lines

    out = []
    for entry in project.constructions:
        con = entry.construction
        temps = con.temperatures(project.temp_inside, project.temp_outside,
                                 nodes_per_layer=entry.nodes_per_layer)
        counted = [row for row in con.layer_table if row.counted]
        labels = ["inside surface"] + [f"{a.name} | {b.name}" for a, b in
                                       zip(counted[:-1], counted[1:], strict=True)]
        labels.append("outside surface")
        target = entry.target_u
        sizing = None
        if entry.size_layer is not None:
            try:
                d_req = entry.required_thickness()
                sizing = {"layer": con.layers[entry.size_layer].name,
                          "required_thickness_mm": d_req * 1000.0, "message": ""}
            except HeatLedgerError as exc:
                sizing = {"layer": con.layers[entry.size_layer].name,
                          "required_thickness_mm": None, "message": str(exc)}
        out.append({
            "name": entry.name,
            "heat_flow": con.heat_flow,
            "area_m2": entry.area,
            "total_resistance": con.total_resistance,
            "u_value_uncorrected": con.u_value_uncorrected,
            "corrections_total": con.corrections.total,
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
            "sizing": sizing,
        })
    return {
        "project": project.info,
        "design": {"temp_inside": project.temp_inside, "temp_outside": project.temp_outside},
        "source_sha256": project.sha256,
        "tool_version": __version__,
        "input_warnings": [{"where": where, "message": text}
                           for where, text in getattr(project, "warnings", [])],
        "constructions": out,
        **_building_results(project),
        **_fin_results(project),
        "cautions": caution_lines() + (caution_lines("plant_sizing")
                                       if getattr(project, "building", None) else [])
        + (caution_lines("hot_surfaces") if getattr(project, "fins", None) else []),
    }


def _print_table(results: dict, stream=None) -> None:
    stream = stream or sys.stdout
    w = stream.write
    info = results["project"]
    des = results["design"]
    w(f"{info.get('name') or 'heatledger project'}\n")
    w(f"design temperatures: inside {des['temp_inside']:g} degC, outside "
      f"{des['temp_outside']:g} degC\n\n")
    slips = results.get("input_warnings") or []
    if slips:
        w("Input warnings (probably slips: check these inputs before using the results):\n")
        for item in slips:
            w(f"  - {item['where']}: {item['message']}\n")
        w("\n")
    shown = {item["message"] for item in slips}
    head = (f"{'construction':<36} {'flow':<10} {'R_T m2K/W':>10} {'U W/m2K':>9} "
            f"{'U (2 s.f.)':>10} {'target':>7} {'met':>4}")
    w(head + "\n" + "-" * len(head) + "\n")
    for c in results["constructions"]:
        target = "" if c["target_u"] is None else f"{c['target_u']:.2f}"
        met = "" if c["target_met"] is None else ("yes" if c["target_met"] else "NO")
        w(f"{c['name'][:36]:<36} {c['heat_flow']:<10} {c['total_resistance']:>10.3f} "
          f"{c['u_value']:>9.4f} {c['u_value_reported']:>#10.2g} {target:>7} {met:>4}\n")
    for c in results["constructions"]:
        exact = c["mesh_estimate_basis"].startswith("exact")
        mesh = ("mesh: exact for this case" if exact else
                f"mesh error bound {c['mesh_estimate_heat_flux']:.1e} W/m2")
        ladder = ("" if c["ladder_heat_flux"] is None else
                  f", ladder check {c['ladder_heat_flux']:.3f} W/m2")
        w(f"\n{c['name']}: heat flux {c['heat_flux']:.3f} W/m2{ladder}, energy balance "
          f"residual {c['energy_residual']:.1e}, {mesh} ({c['nodes']} nodes)\n")
        for t in c["interface_temperatures"]:
            w(f"  {t['x_m'] * 1000:8.1f} mm  {t['temperature_C']:8.2f} degC  {t['at']}\n")
        if c["sizing"]:
            sz = c["sizing"]
            if sz["required_thickness_mm"] is not None:
                w(f"  to reach U = {c['target_u']:g} W/(m2 K): {sz['layer']} "
                  f"{sz['required_thickness_mm']:.1f} mm\n")
            else:
                w(f"  sizing {sz['layer']}: {sz['message']}\n")
        for warning in c["warnings"]:
            if warning not in shown:  # input warnings are listed once, at the top
                w(f"  warning: {warning}\n")
    if results.get("building"):
        _print_building(dict(results["building"], rooms_table=results["rooms"]), w)
    if results.get("fins"):
        _print_fins(results["fins"], w)
    w("\nCautions:\n")
    for line in results["cautions"]:
        w(f"  - {line}\n")


def _building_results(project: Project) -> dict:
    """Rooms and building heat loss as plain data (empty when the project has no rooms)."""
    bi = getattr(project, "building", None)
    if bi is None:
        return {}
    res = bi.heat_load()
    per_room = bi.room_annual_energy()
    rooms = [{"name": r.room, "temp_inside": r.internal_temperature,
              "transmission_coefficient": r.transmission_coefficient,
              "internal_exchange_coefficient": r.internal_exchange_coefficient,
              "ventilation_coefficient": r.ventilation_coefficient,
              "heat_loss_coefficient": r.heat_loss_coefficient,
              "design_heat_load": r.design_heat_load, "reheat_allowance": r.reheat_allowance,
              "annual_energy_kwh": per_room[r.room].energy if per_room else None,
              "lines": [{"name": ln.name, "kind": ln.kind, "boundary": ln.boundary,
                         "coefficient": ln.coefficient, "heat_flow": ln.heat_flow,
                         "share": ln.share} for ln in r.lines]}
             for r in res.rooms]
    ann = bi.annual_energy()
    return {"rooms": rooms, "building": {
        "name": res.name, "temp_outside": res.external_temperature,
        "transmission_coefficient": res.transmission_coefficient,
        "ventilation_coefficient": res.ventilation_coefficient,
        "heat_loss_coefficient": res.heat_loss_coefficient,
        "design_heat_load": res.design_heat_load, "by_kind": dict(res.by_kind),
        "degree_days": bi.degree_days, "degree_day_base": bi.base_temperature,
        "annual_energy_kwh": None if ann is None else ann.energy}}


def _print_building(b: dict, w) -> None:
    rooms = b.get("rooms_table", [])
    head = (f"{'room':<30} {'theta_i':>7} {'H_T W/K':>9} {'H_V W/K':>9} {'load W':>9} "
            f"{'energy kWh/a':>12}")
    w(f"\nHeat loss at theta_e {b['temp_outside']:g} degC (EN 12831-1 style)\n")
    w(head + "\n" + "-" * len(head) + "\n")
    for r in rooms:
        e = "" if r["annual_energy_kwh"] is None else f"{r['annual_energy_kwh']:.0f}"
        w(f"{r['name'][:30]:<30} {r['temp_inside']:>7.1f} {r['transmission_coefficient']:>9.2f} "
          f"{r['ventilation_coefficient']:>9.2f} {r['design_heat_load']:>9.0f} {e:>12}\n")
    e = "" if b["annual_energy_kwh"] is None else f"{b['annual_energy_kwh']:.0f}"
    w(f"{('building ' + b['name'])[:30]:<30} {'':>7} {b['transmission_coefficient']:>9.2f} "
      f"{b['ventilation_coefficient']:>9.2f} {b['design_heat_load']:>9.0f} {e:>12}\n")
    if b["annual_energy_kwh"] is not None:
        w(f"annual energy: Q = 24 H DD / 1000 with {b['degree_days']:g} K day on the base "
          f"{b['degree_day_base']:g} degC\n")


def _fin_results(project: Project) -> dict:
    """Fins as plain data (empty when the project has no fins)."""
    if not getattr(project, "fins", None):
        return {}
    from .fins.project_io import fin_results

    return {"fins": fin_results(project.fins)}


def _print_fins(fins: list, w) -> None:
    head = (f"{'fin (one fin of the entry)':<40} {'q W':>9} {'eta_f':>6} {'eps_f':>7} "
            f"{'T tip C':>8} {'array q W':>10} {'eta_o':>6}")
    w("\nFins (closed form; finite volumes as a check)\n" + head + "\n" + "-" * len(head)
      + "\n")
    for f in fins:
        arr = f["array"]
        aq, ae = ("", "") if arr is None else (f"{arr['heat_rate']:.2f}",
                                               f"{arr['overall_efficiency']:.3f}")
        w(f"{f['name'][:40]:<40} {f['heat_rate']:>9.3f} {f['efficiency']:>6.3f} "
          f"{f['effectiveness']:>7.2f} {f['tip_temperature']:>8.2f} {aq:>10} {ae:>6}\n")
    for f in fins:
        fv = f["fv"]
        w(f"\n{f['name']}: {f['method']}; finite volumes {fv['heat_rate']:.4f} W "
          f"({fv['cells']} cells{', h(T)/radiation' if fv['nonlinear'] else ''}), energy "
          f"balance residual {fv['energy_residual']:.1e}, mesh estimate "
          f"{fv['mesh_estimate_heat_rate']:.1e} W\n")
        if f["array"] is not None:
            a = f["array"]
            w(f"  array of {a['count']} fins: {a['heat_rate']:.2f} W, resistance "
              f"{a['resistance']:.4f} K/W\n")
        for key, sz in f["sizing"].items():
            what = "fin length" if key == "length" else "fin count"
            if sz["value"] is None:
                w(f"  {what} for {f['array']['target_heat_rate']:g} W: {sz['message']}\n")
            else:
                unit = " mm" if sz["unit"] == "mm" else ""
                w(f"  {what} for {f['array']['target_heat_rate']:g} W: {sz['value']:.4g}{unit}\n")
        for warning in f["warnings"]:
            w(f"  warning: {warning}\n")


def _emit(results: dict, as_json: bool) -> None:
    if as_json:
        json.dump(_clean(results), sys.stdout, indent=2)
        sys.stdout.write("\n")
    else:
        _print_table(results)


def _clean(obj):
    if isinstance(obj, float) and not math.isfinite(obj):
        return None
    if isinstance(obj, dict):
        return {k: _clean(v) for k, v in obj.items()}
    if isinstance(obj, list):
        return [_clean(v) for v in obj]
    return obj


def _cmd_demo(args) -> int:
    if getattr(args, "output", None):
        from .sheet.commands import run_demo_audit

        return run_demo_audit(args.output, force=args.force, quiet=args.quiet)
    if args.write_toml:
        from .fileio import write_bytes_atomic

        write_bytes_atomic(args.write_toml, demo_bytes(), force=args.force)
        return 0
    _emit(project_results(demo_project()), args.json)
    return 0


def _cmd_template(args) -> int:
    from .sheet.commands import run_template

    return run_template(args.output, force=args.force, blank=args.blank)


def _cmd_audit(args) -> int:
    from .sheet.commands import run_audit

    return run_audit(args.file, args.output, force=args.force, quiet=args.quiet)


def _cmd_calc(args) -> int:
    from .project import load_project

    _emit(project_results(load_project(args.file)), args.json)
    return 0


def _cmd_materials(args) -> int:
    from .materials import default_library

    lib = default_library()
    if args.json:
        rows = [{"name": m.name, "conductivity": m.conductivity, "density": m.density,
                 "specific_heat": m.specific_heat,
                 "vapour_resistance_factor": m.vapour_resistance_factor,
                 "source": m.source, "confidence": m.confidence} for m in lib]
        json.dump(_clean(rows), sys.stdout, indent=2)
        sys.stdout.write("\n")
        return 0
    head = f"{'material':<32} {'lambda W/mK':>11} {'rho kg/m3':>9} {'c J/kgK':>8} {'mu':>7}  source"
    print(head)
    print("-" * len(head))
    for m in lib:
        mu = "" if m.vapour_resistance_factor is None else f"{m.vapour_resistance_factor:g}"
        rho = "" if m.density is None else f"{m.density:g}"
        cp = "" if m.specific_heat is None else f"{m.specific_heat:g}"
        print(f"{m.name:<32} {m.conductivity:>11g} {rho:>9} {cp:>8} {mu:>7}  {m.source} "
              f"[{m.confidence}]")
    return 0


class _VersionAction(argparse.Action):
    """``--version``: print the installed version and exit (looked up only when asked)."""

    def __init__(self, option_strings, dest=argparse.SUPPRESS, **kwargs):
        super().__init__(option_strings, dest, nargs=0, help="print the version and exit",
                         **kwargs)

    def __call__(self, parser, namespace, values, option_string=None):
        from . import __version__

        parser.exit(message=f"heatledger {__version__}\n")


def _parser() -> argparse.ArgumentParser:
    p = argparse.ArgumentParser(
        prog="heatledger",
        description="Heat-transfer calculations for building constructions: U-values "
                    "(EN ISO 6946), temperatures through the layers (1-D finite volumes).",
    )
    p.add_argument("--version", action=_VersionAction)
    sub = p.add_subparsers(dest="command", metavar="COMMAND")

    d = sub.add_parser("demo", help="results of the invented demo project")
    d.add_argument("--json", action="store_true", help="machine-readable output")
    d.add_argument("--write-toml", metavar="PATH",
                   help="write the demo project file (TOML) to PATH instead")
    d.add_argument("-o", "--output", metavar="XLSX",
                   help="write the audit workbook of the demo project to XLSX")
    d.add_argument("--force", action="store_true", help="replace an existing output file")
    d.add_argument("--quiet", action="store_true", help="no progress display")
    d.set_defaults(handler=_cmd_demo)

    t = sub.add_parser("template", help="write the fill-in project template (.xlsx)")
    t.add_argument("-o", "--output", metavar="XLSX", required=True, help="output file")
    t.add_argument("--force", action="store_true", help="replace an existing output file")
    t.add_argument("--blank", action="store_true", help="leave out the demo example rows")
    t.set_defaults(handler=_cmd_template)

    a = sub.add_parser("audit", help="write the self-checking audit workbook of a project")
    a.add_argument("file", help="project file (.toml) or filled-in template (.xlsx)")
    a.add_argument("-o", "--output", metavar="XLSX", required=True, help="output file")
    a.add_argument("--force", action="store_true", help="replace an existing output file")
    a.add_argument("--quiet", action="store_true", help="no progress display")
    a.set_defaults(handler=_cmd_audit)

    c = sub.add_parser("calc", help="results of a TOML project file")
    c.add_argument("file", help="project file (.toml)")
    c.add_argument("--json", action="store_true", help="machine-readable output")
    c.set_defaults(handler=_cmd_calc)

    m = sub.add_parser("materials", help="list the material library")
    m.add_argument("--json", action="store_true", help="machine-readable output")
    m.set_defaults(handler=_cmd_materials)
    return p
