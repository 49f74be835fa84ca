"""Command-line actions of the workbook layer (``template``, ``audit``, ``demo -o``).

:mod:`heatledger.cli` parses the arguments and calls these; each returns an exit code and
writes its one-line report to stdout, progress to stderr.
"""

from __future__ import annotations

import sys
from pathlib import Path

from .._validate import quote
from ..errors import HeatLedgerError
from ..fileio import same_file
from .audit import write_audit
from .render_openpyxl import write_workbook
from .template import project_from_template, template_plan

__all__ = ["run_template", "run_audit", "run_demo_audit", "load_any_project",
           "PROGRESS_THRESHOLD"]

#: Projects with at least this many constructions show a progress line on stderr.
PROGRESS_THRESHOLD = 10


def load_any_project(path):
    """A project from a TOML project file or a filled-in template (.xlsx).

    Parameters
    ----------
    path : str or path-like
        ``.toml`` or ``.xlsx`` file. [-]

    Returns
    -------
    heatledger.project.Project
    """
    from ..project import load_project

    p = Path(path)
    suffix = p.suffix.lower()
    if not p.exists():
        raise HeatLedgerError(f"input file {quote(p)} does not exist")
    if suffix == ".toml":
        return load_project(p)
    if suffix in (".xlsx", ".xlsm"):
        return project_from_template(p)
    raise HeatLedgerError(f"input file must be a project file (.toml) or a filled-in template "
                          f"(.xlsx); got {quote(p.name)}")


def run_template(output, *, force: bool = False, blank: bool = False) -> int:
    """Write the fill-in template (with the demo's rows as examples unless ``blank``).

    Parameters
    ----------
    output : str or path-like
        Output .xlsx file. [-]
    force : bool
        Replace an existing file. [-]
    blank : bool
        Leave out the example rows. [-]
    """
    data = None
    if not blank:
        from ..demo import demo_project

        data = demo_project().raw
    path = write_workbook(template_plan(data), output, force=force)
    print(f"heatledger: template written to {path}")
    return 0


def run_audit(source, output, *, force: bool = False, quiet: bool = False) -> int:
    """Write the audit workbook of a project file or filled-in template.

    Parameters
    ----------
    source : str or path-like
        ``.toml`` project file or ``.xlsx`` template. [-]
    output : str or path-like
        Output .xlsx workbook, or .pdf for the record printed by LibreOffice. [-]
    force : bool
        Replace an existing file. [-]
    quiet : bool
        No progress display. [-]
    """
    out = Path(output)
    if same_file(source, out):
        raise HeatLedgerError(
            f"the output {quote(out)} is the input file {quote(source)} itself (or a link to "
            "it); writing the audit there would destroy the project: choose another output "
            "name")
    if out.exists() and not force:
        raise HeatLedgerError(f"output file {quote(out)} exists; choose another name or use "
                              "--force to replace it")
    project = load_any_project(source)
    return _write(project, out, force=force, quiet=quiet)


def run_demo_audit(output, *, force: bool = False, quiet: bool = False) -> int:
    """Write the audit workbook of the invented demo project.

    Parameters
    ----------
    output : str or path-like
        Output .xlsx file. [-]
    force : bool
        Replace an existing file. [-]
    quiet : bool
        No progress display. [-]
    """
    from ..demo import demo_project

    return _write(demo_project(), Path(output), force=force, quiet=quiet)


def _write(project, out: Path, *, force: bool, quiet: bool) -> int:
    n = len(project.constructions)
    progress = None
    if not quiet and n >= PROGRESS_THRESHOLD:
        def progress(i, total, name):
            sys.stderr.write(f"\rheatledger: construction {i}/{total} {name[:40]:<40}")
            if i == total:
                sys.stderr.write("\n")
            sys.stderr.flush()
    suffix = out.suffix.lower()
    if suffix == ".pdf":
        from .audit import audit_plan
        from .pdf import spreadsheet_program, workbook_to_pdf
        from .render_openpyxl import workbook_bytes

        if spreadsheet_program() is None:  # say so before the work, not after
            from .pdf import INSTALL_HINT

            raise HeatLedgerError(INSTALL_HINT)
        path = workbook_to_pdf(workbook_bytes(audit_plan(project, progress=progress)), out,
                               force=force)
        from .pdf import FONT_HINT, layout_font_missing

        if layout_font_missing():
            print(f"heatledger: {FONT_HINT}", file=sys.stderr)
        what, hint = "record (PDF, recalculated and printed by LibreOffice)", (
            "the cover says whether all checks are OK")
    elif suffix in (".xlsx", ""):
        path = write_audit(project, out, force=force, progress=progress)
        what, hint = "audit", ("open it in a spreadsheet program and check that the cover "
                               "says ALL CHECKS OK")
    else:
        raise HeatLedgerError(f"the output must be a workbook (.xlsx) or the printed record "
                              f"(.pdf); got {quote(out.name)}")
    parts = [_count(n, "construction")]
    rooms = getattr(getattr(project, "building", None), "building", None)
    n_rooms = len(getattr(rooms, "rooms", ()) or ())
    if n_rooms:
        parts.append(_count(n_rooms, "room"))
    if project.fins:
        parts.append(_count(len(project.fins), "fin entry", "fin entries"))
    if project.junctions:
        parts.append(_count(len(project.junctions), "junction"))
    if project.moisture:
        parts.append(_count(len(project.moisture), "moisture check"))
    print(f"heatledger: {what} of {', '.join(parts)} written to {path}; {hint}")
    return 0


def _count(n: int, one: str, many: str | None = None) -> str:
    return f"{n} {one if n == 1 else (many or one + 's')}"
