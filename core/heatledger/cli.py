"""The ``heatledger`` command line.

    heatledger demo                 results of the (invented) demo project as a table
    heatledger calc FILE [--json]   results of a TOML project file
    heatledger materials [--json]   the material library
    heatledger calc-addin build|install|remove   the functions as a LibreOffice Calc extension

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

__all__ = ["main", "project_results"]



def main(argv=None) -> int:
    """Run the command line; return the exit code.

    Parameters
    ----------
    argv : list of str, optional
        Command-line arguments; default sys.argv. [-]
    """
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


def project_results(project: Project) -> dict:
    """Results of ``project`` as plain data (the ``--json`` schema).

    Parameters
    ----------
    project : Project
        A parsed project. [-]

    Returns
    -------
    dict
        ``{"project": ..., "design": ..., "input_warnings": ..., "cautions": ...}`` and one
        key per method family the project uses (``constructions``, ``rooms`` and
        ``building``, ``fins``): see each family's ``results`` hook.
    """
    from . import __version__
    from .cautions import caution_lines
    from .families import FAMILIES

    out = {
        "project": project.info,
        "design": {"temp_inside": project.temp_inside, "temp_outside": project.temp_outside},
        "source_sha256": project.sha256,
        "tool_version": __version__,
        "input_warnings": [{"where": where, "message": text}
                           for where, text in getattr(project, "warnings", [])],
        "constructions": [],
    }
    cautions = caution_lines()
    for fam in FAMILIES:
        if fam.present(project):
            out.update(fam.load("results")(project))
            cautions += [line for key in fam.cautions for line in caution_lines(key)]
    out["cautions"] = cautions
    return out


def _print_table(results: dict, stream=None) -> None:
    from .families import FAMILIES

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
    for fam in FAMILIES:
        if results.get(fam.result_key):
            fam.load("report")(results, w, shown)
    w("\nCautions:\n")
    for line in results["cautions"]:
        w(f"  - {line}\n")


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
    from .demo import demo_bytes, demo_project

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

    project = load_project(args.file)
    _emit(project_results(project), args.json)
    if args.pictures:
        _write_pictures(project, args.pictures, args.force)
    return 0


def _write_pictures(project, folder: str, force: bool) -> None:
    """One PNG of the temperature field per junction, written atomically into ``folder``."""
    import re
    from pathlib import Path

    from .bridges2d.picture import temperature_picture
    from .fileio import write_bytes_atomic

    out = Path(folder)
    out.mkdir(parents=True, exist_ok=True)
    for entry in project.junctions:
        r = entry.result
        png = temperature_picture(r.temperature_solve, title=f"{entry.name}: temperature at "
                                  "R_si 0.25", inside=entry.junction.inside, lowest=r.lowest)
        stem = re.sub(r"[^A-Za-z0-9._-]+", "_", entry.name).strip("_") or "junction"
        path = write_bytes_atomic(out / f"{stem}.png", png, force=force)
        sys.stderr.write(f"heatledger: temperature field of {entry.name} written to {path}\n")


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
        description="Heat-transfer calculations for buildings: U-values (EN ISO 6946) and "
                    "temperatures through the layers (1-D finite volumes), fins, 2-D thermal "
                    "bridges (EN ISO 10211), room and building heat loss (EN 12831-1) and "
                    "moisture (EN ISO 13788), with a self-checking audit workbook and its "
                    "printed record.",
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
    a.add_argument("-o", "--output", metavar="XLSX|PDF", required=True,
                   help="output workbook (.xlsx), or the record printed to PDF by LibreOffice "
                        "(.pdf)")
    a.add_argument("--force", action="store_true", help="replace an existing output file")
    a.add_argument("--quiet", action="store_true", help="no progress display")
    a.set_defaults(handler=_cmd_audit)

    c = sub.add_parser("calc", help="results of a TOML project file")
    c.add_argument("file", help="project file (.toml)")
    c.add_argument("--json", action="store_true", help="machine-readable output")
    c.add_argument("--pictures", metavar="FOLDER",
                   help="also save each junction's temperature field as a PNG in FOLDER")
    c.add_argument("--force", action="store_true", help="replace existing pictures")
    c.set_defaults(handler=_cmd_calc)

    m = sub.add_parser("materials", help="list the material library")
    m.add_argument("--json", action="store_true", help="machine-readable output")
    m.set_defaults(handler=_cmd_materials)
    _calc_addin_parser(sub)
    return p


def _calc_addin_parser(sub) -> None:
    x = sub.add_parser("calc-addin", help="the spreadsheet functions as a LibreOffice Calc "
                       "extension: build, install, remove")
    xs = x.add_subparsers(dest="action", metavar="ACTION", required=True)
    b = xs.add_parser("build", help="write the extension (.oxt) built from this environment")
    b.add_argument("-o", "--output", metavar="OXT", required=True, help="output file (.oxt)")
    b.add_argument("--force", action="store_true", help="replace an existing output file")
    i = xs.add_parser("install", help="build the extension and install it with unopkg add "
                      "(close LibreOffice first)")
    i.add_argument("--oxt", metavar="OXT", help="install this extension file instead of "
                   "building one")
    i.add_argument("--shared", action="store_true",
                   help="install for every user of this machine (unopkg --shared)")
    r = xs.add_parser("remove", help="uninstall the extension (unopkg remove)")
    r.add_argument("--shared", action="store_true", help="remove the copy for every user")
    x.set_defaults(handler=_cmd_calc_addin)


def _cmd_calc_addin(args) -> int:
    try:
        from heatledger_calc import build, install
    except ImportError:
        raise HeatLedgerError("heatledger_calc is not installed in this environment; "
                              "reinstall heatledger (pip install heatledger)") from None
    if args.action == "build":
        path = build.build_extension(args.output, force=args.force)
        sys.stderr.write(f"heatledger: Calc extension written to {path}; install it with "
                         f"`unopkg add {path}` or `heatledger calc-addin install --oxt "
                         f"{path}`\n")
        return 0
    if args.action == "remove":
        install.remove_extension(shared=args.shared)
        sys.stderr.write("heatledger: Calc extension removed\n")
        return 0
    return _install_calc_addin(args, build, install)


def _install_calc_addin(args, build, install) -> int:
    import tempfile
    from pathlib import Path

    install.check_scope(args.shared)
    with tempfile.TemporaryDirectory(prefix="heatledger-oxt-") as tmp:
        oxt = Path(args.oxt) if args.oxt else build.build_extension(Path(tmp) / "heatledger.oxt")
        install.install_extension(oxt, shared=args.shared)
    where = "every user of this machine" if args.shared else "you"
    sys.stderr.write(f"heatledger: Calc extension installed for {where}; start LibreOffice "
                     "Calc and type =HL_VERSION() in a cell (the functions are in the "
                     "Add-In category of the function wizard)\n")
    return 0
