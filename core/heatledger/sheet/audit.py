"""The audit workbook of a project: cover, materials, one sheet per construction, summary.

The workbook is self-checking: every step is a live formula, the engine's values stand
beside them as constants, and check cells compare the two. The cover counts the check cells
and how many say OK with formulas, so a reviewer sees at a glance whether the file is sound
after their own spreadsheet program has recalculated it.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, field
from types import SimpleNamespace

from .. import cautions as _cautions
from ..families import FAMILIES
from .blocks_construction import DEFAULT_CHECK_TOLERANCE
from .pages import LABEL_COLUMN_CAP, contain_overflow, paginate
from .plan import (
    PrintSetup,
    WorkbookPlan,
    fit_text_columns,
    fit_wrapped_rows,
    sheet_ref,
)
from .render_openpyxl import workbook_bytes, write_workbook
from .whatif import add_record_sheet

__all__ = ["audit_plan", "write_audit", "audit_bytes", "tool_version", "AuditContext",
           "Answer"]


@dataclass
class AuditContext:
    """What the families' sheet writers share while the audit workbook is laid out.

    Attributes
    ----------
    title : str
        Project name for the page headers. [-]
    tolerance : float
        Relative tolerance of the check cells. [-]
    progress : callable or None
        Called as ``progress(done, total, name)`` after each construction. [-]
    material_refs : dict
        Material name -> its cells on the Materials sheet. [-]
    summary : SheetPlan
        The Summary sheet (filled by the constructions family). [-]
    construction_refs : dict
        Construction name -> its sheet's cells, for the families that use constructions. [-]
    counts : list of dict
        ``{"count": expression, "ok": expression}`` per family: its check cells. [-]
    check_lists : list of str
        Sheets that list check cells sheet by sheet, for the cover. [-]
    answers : list of Answer
        The results the cover shows first, each a live reference to its sheet. [-]
    appendices : list of tuple
        ``(sheet name, what it holds)`` of every appendix sheet; they print at the back
        and the cover lists them. [-]
    """

    title: str
    tolerance: float
    progress: Callable | None
    material_refs: dict
    summary: object
    construction_refs: dict = field(default_factory=dict)
    counts: list = field(default_factory=list)
    check_lists: list = field(default_factory=list)
    answers: list = field(default_factory=list)
    appendices: list = field(default_factory=list)


@dataclass(frozen=True)
class Answer:
    """One result the cover shows first.

    Attributes
    ----------
    item : str
        What it is about (a construction, a room, a junction...). [-]
    quantity : str
        The quantity with its unit, or a formula giving that text with a verdict. [-]
    value : str or None
        Formula of the value (a reference to its sheet), or None for a text result. [-]
    number_format : str
        Format of the value. [-]
    """

    item: str
    quantity: str
    value: str | None = None
    number_format: str = "0.000"

#: What the confidence words of the methods and the materials mean, in plain words.
CONFIDENCE_LEGEND = (
    "\"recalled\": a formula, coefficient or clause number written from memory of the "
    "standard's text, to be checked against the purchased standard before the result is "
    "relied on; \"read\": read in the published text or a secondary published source; "
    "\"verified numerically\": a recalled formula that reproduces the standard's printed "
    "values (a test checks it); \"typical\": a typical value of a product family, to be "
    "replaced by the declared value of the product used.")

_PROJECT_FIELDS = (("name", "Project"), ("client", "Client"), ("site", "Site"),
                   ("author", "Author"), ("checker", "Checker"), ("revision", "Revision"),
                   ("date", "Date"), ("notes", "Notes"))


def tool_version() -> str:
    """heatledger's version: ``heatledger.__version__`` or the installed distribution's."""
    import heatledger

    version = getattr(heatledger, "__version__", None)
    if version:
        return str(version)
    try:
        from importlib.metadata import version as _dist_version

        return _dist_version("heatledger")
    except Exception:  # noqa: BLE001 - any failure means "unknown"
        return "unknown"


def audit_plan(project, *, progress: Callable[[int, int, str], None] | None = None,
               tolerance: float = DEFAULT_CHECK_TOLERANCE) -> WorkbookPlan:
    """The workbook plan of the audit of ``project``.

    Parameters
    ----------
    project : heatledger.project.Project
        A parsed project. [-]
    progress : callable, optional
        Called as ``progress(done, total, name)`` after each construction. [-]
    tolerance : float
        Relative tolerance of the check cells. [-]

    Returns
    -------
    WorkbookPlan
    """
    info = project.info
    name = info.get("name") or "heatledger project"
    plan = WorkbookPlan(title=f"heatledger audit: {name}")
    title = page_header(info)
    cover = plan.add_sheet("Cover", column_widths={"A": 3, "B": 34, "C": 70, "D": 14},
                           print_setup=_print(title, "portrait"), tab_color="2E5A6B")
    materials = plan.add_sheet("Materials", column_widths=_widths([5, 34, 12, 12, 14, 12, 12,
                                                                   60]),
                               freeze="A4", print_setup=_print(title, "landscape", "1:3"))
    summary = plan.add_sheet("Summary", column_widths=_widths([5, 36, 31, 12, 11, 12, 12, 12,
                                                               12, 12, 12, 10, 10, 16]),
                             freeze="A4", print_setup=_print(title, "landscape", "1:3"))
    audit = AuditContext(title=title, tolerance=tolerance, progress=progress,
                         material_refs=_materials(materials, project), summary=summary)
    for fam in FAMILIES:
        if fam.present(project) or fam is FAMILIES[0]:  # the Summary is always filled
            fam.load("sheets")(plan, project, audit)
    appendix = {name for name, _ in audit.appendices}  # the appendices print at the back
    plan.sheets.sort(key=lambda sheet: sheet.name in appendix)
    summary_cells = {k: "+".join(c[k] for c in audit.counts) for k in ("count", "ok")}
    summary_cells["changed"] = add_record_sheet(plan, title)
    _cover(cover, project, summary_cells, audit)
    for sheet in plan.sheets:
        fit_text_columns(sheet, cap=LABEL_COLUMN_CAP)
        paginate(sheet, title_columns=2)
        contain_overflow(sheet)
        fit_wrapped_rows(sheet)
    return plan


def audit_bytes(project, **kwargs) -> bytes:
    """The audit workbook of ``project`` as .xlsx bytes (deterministic).

    Parameters
    ----------
    project : heatledger.project.Project
        A parsed project. [-]
    **kwargs
        Passed to :func:`audit_plan`. [-]
    """
    return workbook_bytes(audit_plan(project, **kwargs))


def write_audit(project, path, *, force: bool = False, **kwargs):
    """Write the audit workbook of ``project`` to ``path`` (atomic; no overwrite unless
    ``force``).

    Parameters
    ----------
    project : heatledger.project.Project
        A parsed project. [-]
    path : str or path-like
        Output .xlsx file. [-]
    force : bool
        Replace an existing file. [-]
    **kwargs
        Passed to :func:`audit_plan`. [-]

    Returns
    -------
    pathlib.Path
    """
    return write_workbook(audit_plan(project, **kwargs), path, force=force)


# --------------------------------------------------------------------------- sheets
def _widths(widths):
    from .plan import col_letter

    return {col_letter(i + 1): w for i, w in enumerate(widths)}


def page_header(info: dict) -> str:
    """The page header of every sheet: project, revision, date and checker. [-]

    Parameters
    ----------
    info : dict
        The project's ``[project]`` table. [-]
    """
    parts = [str(info.get("name") or "heatledger project")]
    for key, label in (("revision", "rev."), ("date", ""), ("checker", "checked:")):
        value = str(info.get(key) or "").strip()
        if value:
            parts.append(f"{label} {value}".strip())
    return " | ".join(parts)


def _print(title: str, orientation: str, rows: str | None = None) -> PrintSetup:
    return PrintSetup(orientation=orientation, header=f"{title} | {{sheet}}",
                      footer_left="heatledger audit {sheet}", footer_right="page {page} of {pages}",
                      title_rows=rows)


def _materials(sheet, project) -> dict:
    b = sheet.block("materials")
    b.put("A1", "Materials used, with their design values and sources", style="hl title")
    sheet.merges.append("A1:H1")
    b.put("A2", _cautions.CAUTIONS.get("materials", ""), role="note")
    heads = ["No.", "Material", "λ [W/(m K)]", "ρ [kg/m3]", "c [J/(kg K)]", "μ [-]",
             "Confidence", "Source"]
    for j, h in enumerate(heads, 1):
        b.put(f"{_col(j)}3", h, role="header")
    used = list(project.materials_used())
    extra = list(getattr(project, "user_materials", []))
    for entry in project.constructions:  # fastener materials named in corrections
        for row in (_entry_raw(project, entry).get("corrections") or []):
            name = row.get("material") if isinstance(row, dict) else None
            if isinstance(name, str) and name in project.materials:
                extra.append(project.materials.get(name))
    for mat in extra:
        if all(m.name != mat.name for m in used):
            used.append(mat)
    refs = {}
    for i, mat in enumerate(used, 1):
        r = 3 + i
        b.put(f"A{r}", i)
        b.put(f"B{r}", mat.name, style="hl text")
        lam = b.put(f"C{r}", float(mat.conductivity), role="input", number_format="0.000")
        refs[mat.name.strip().lower()] = (sheet_ref(sheet.name, lam.ref), float(mat.conductivity))
        for col, val, fmt in (("D", mat.density, "0"), ("E", mat.specific_heat, "0"),
                              ("F", mat.vapour_resistance_factor, "0")):
            if val is not None:
                v = float(val)
                b.put(f"{col}{r}", v if v != float("inf") else "vapour-tight", role="input",
                      number_format=fmt)
        b.put(f"G{r}", str(getattr(mat, "confidence", "") or ""), style="hl text")
        b.put(f"H{r}", str(mat.source or ""), style="hl text")
    if not used:
        b.put("B4", "no library materials are referred to by name", role="note")
    return refs


def _entry_raw(project, entry) -> dict:
    """The raw construction table of ``entry`` from the project data (empty if unknown)."""
    raw = getattr(project, "raw", None) or {}
    for row in raw.get("constructions", []) or []:
        if isinstance(row, dict) and str(row.get("name", "")).strip() == entry.name:
            return row
    return {}


def _cover(sheet, project, summary_cells, audit) -> None:
    st = SimpleNamespace(sheet=sheet, project=project, summary_cells=summary_cells, audit=audit)
    _cover_setup(st)
    _cover_record(st)
    _cover_checks(st)
    _cover_methods(st)
    _cover_how_to_read(st)
    _cover_appendices(st)


def _cover_setup(st) -> None:
    """The inputs and first rows of this part of the sheet."""
    audit = st.audit
    project = st.project
    sheet = st.sheet
    tolerance = audit.tolerance
    info = project.info
    b = sheet.block("cover")
    b.put("B1", "heatledger calculation record", style="hl title")
    subtitle = "; ".join(fam.title for fam in FAMILIES
                         if fam.present(project) or fam is FAMILIES[0])
    b.put("B2", subtitle, style="hl paragraph")
    sheet.merges.append("B2:D2")
    sheet.row_heights[2] = _height(subtitle)
    r = _cover_answers(b, sheet, audit.answers, 4)
    b.put(f"B{r}", "Project information", style="hl subtitle")
    sheet.merges.append(f"B{r}:D{r}")
    r += 1
    for key, label in _PROJECT_FIELDS:
        b.put(f"B{r}", label)
        b.put(f"C{r}", str(info.get(key, "") or ""), style="hl text")
        r += 1
    b.put(f"B{r}", "Design temperature inside [degC]")
    b.put(f"C{r}", float(project.temp_inside), role="input", number_format="0.0")
    r += 1
    b.put(f"B{r}", "Design temperature outside [degC]")
    b.put(f"C{r}", float(project.temp_outside), role="input", number_format="0.0")
    r += 2
    st.b = b
    st.r = r
    st.tolerance = tolerance


def _cover_answers(b, sheet, answers, r: int) -> int:
    """The results first: one row per answer, live references to the sheets."""
    b.put(f"B{r}", "Results (live references to the calculation sheets)", style="hl subtitle")
    sheet.merges.append(f"B{r}:D{r}")
    r += 1
    for a in answers:
        b.put(f"B{r}", a.item, style="hl text wrap")
        if a.quantity.startswith("="):
            b.put(f"C{r}", formula=a.quantity, style="hl text wrap")
        else:
            b.put(f"C{r}", a.quantity, style="hl text wrap")
        if a.value is not None:
            b.put(f"D{r}", formula=a.value, number_format=a.number_format)
        r += 1
    return r + 1


def _cover_record(st) -> None:
    """The record: tool, input file, its hash, the tolerance."""
    b = st.b
    project = st.project
    r = st.r
    sheet = st.sheet
    tolerance = st.tolerance
    # ---- record --------------------------------------------------------------------------
    b.put(f"B{r}", "Record", style="hl subtitle")
    sheet.merges.append(f"B{r}:D{r}")
    r += 1
    for label, value in (("Tool", f"heatledger {tool_version()}"),
                         ("Input file", project.source_name or "(not from a file)"),
                         ("SHA-256 of the input file", project.sha256),
                         ("Check tolerance, relative [-]", float(tolerance))):
        b.put(f"B{r}", label)
        if isinstance(value, float):
            b.put(f"C{r}", value, role="input", number_format="0.0E+00")
        else:
            b.put(f"C{r}", value, style="hl text")
        r += 1
    r += 1
    st.r = r


def _cover_checks(st) -> None:
    """The check counts and where the checks are."""
    audit = st.audit
    b = st.b
    project = st.project
    r = st.r
    sheet = st.sheet
    summary_cells = st.summary_cells
    # ---- checks --------------------------------------------------------------------------
    b.put(f"B{r}", "Checks (formula against engine, after recalculation)", style="hl subtitle")
    sheet.merges.append(f"B{r}:D{r}")
    r += 1
    b.put(f"B{r}", "Check cells in the workbook")
    count = b.put(f"C{r}", formula=f"={summary_cells['count']}", number_format="0").ref
    r += 1
    b.put(f"B{r}", "Check cells that say OK")
    ok = b.put(f"C{r}", formula=f"={summary_cells['ok']}", number_format="0").ref
    r += 1
    b.put(f"B{r}", "State")
    state = (f'IF(AND({count}>0,{ok}={count}),"ALL CHECKS OK","NOT ALL OK: "&({count}-{ok})'
             '&" check(s) fail; do not rely on this file")')
    changed = summary_cells.get("changed")
    if changed:  # a what-if is a what-if, not a failure
        state = (f'IF({changed}>0,"WHAT-IF: "&{changed}&" input(s) changed since the record '
                 'was made (see the Record sheet); the checks compare against the recorded '
                 f'run",{state})')
    b.put(f"C{r}", formula=f"={state}", style="hl check")
    r += 1
    lists = audit.check_lists
    text = ("Every calculation sheet counts its own check cells at its top right; "
            + ", ".join(lists[:-1]) + (" and " if len(lists) > 1 else "") + lists[-1]
            + (" list" if len(lists) > 1 else " lists")
            + " them sheet by sheet, so a failing check can be found.")
    b.put(f"B{r}", "Where the checks are")
    b.put(f"C{r}", text, style="hl paragraph")
    sheet.merges.append(f"C{r}:D{r}")
    r = _input_warnings(b, sheet, project, r + 2)
    st.r = r


def _cover_methods(st) -> None:
    """The methods, standards and cautions applied."""
    b = st.b
    project = st.project
    r = st.r
    sheet = st.sheet
    # ---- methods -------------------------------------------------------------------------
    b.put(f"B{r}", "Methods and standards applied", style="hl subtitle")
    sheet.merges.append(f"B{r}:D{r}")
    r += 1
    topics = [fam.load("topics")(project) for fam in FAMILIES
              if fam.present(project) or fam is FAMILIES[0]]
    for text in [line for methods, _c in topics for line in methods]:
        b.put(f"B{r}", "•")
        b.put(f"C{r}", text, style="hl paragraph")
        sheet.row_heights[r] = _height(text)
        r += 1
    b.put(f"B{r}", "How sure the sources are")
    b.put(f"C{r}", CONFIDENCE_LEGEND, style="hl paragraph")
    sheet.row_heights[r] = _height(CONFIDENCE_LEGEND)
    r += 2
    b.put(f"B{r}", "Cautions", style="hl subtitle")
    sheet.merges.append(f"B{r}:D{r}")
    r += 1
    for text in _cautions.caution_lines() + [line for _m, c in topics for line in c]:
        b.put(f"B{r}", "!")
        b.put(f"C{r}", text, style="hl warning")
        sheet.row_heights[r] = _height(text, 78)
        r += 1
    r += 1
    st.r = r


def _cover_how_to_read(st) -> None:
    """How to read the workbook."""
    b = st.b
    r = st.r
    sheet = st.sheet
    # ---- how to read ---------------------------------------------------------------------
    b.put(f"B{r}", "How to read this workbook", style="hl subtitle")
    sheet.merges.append(f"B{r}:D{r}")
    r += 1
    for text in ("Sand cells are inputs, teal cells are formulas, grey cells are the engine's "
                 "values as constants, green cells compare formula and engine.",
                 "Every step is a live formula: change an input and the sheet recomputes; the "
                 "checks then compare with the engine's values for the original input.",
                 "Layers are listed inside to outside; thickness in mm; heat flux is positive "
                 "from inside to outside."):
        b.put(f"C{r}", text, style="hl paragraph")
        sheet.row_heights[r] = _height(text)
        r += 1
    st.r = r


def _cover_appendices(st) -> None:
    """The appendix sheets, each a link, with what it holds."""
    b, sheet, r = st.b, st.sheet, st.r + 1
    if not st.audit.appendices:
        return
    b.put(f"B{r}", "Appendices (at the back of the workbook)", style="hl subtitle")
    sheet.merges.append(f"B{r}:D{r}")
    r += 1
    for name, what in st.audit.appendices:
        link = name.replace("'", "''").replace('"', '""')
        b.put(f"B{r}", formula=f'=HYPERLINK("#\'{link}\'!A1","{link}")', style="hl text")
        b.put(f"C{r}", what, style="hl text wrap")
        r += 1
    st.r = r


def _input_warnings(b, sheet, project, r: int) -> int:
    """The cover's list of input that is probably a slip; returns the next free row."""
    b.put(f"B{r}", "Input warnings", style="hl subtitle")
    sheet.merges.append(f"B{r}:D{r}")
    r += 1
    items = list(getattr(project, "warnings", []) or [])
    if not items:
        text = ("No input looks like a slip (looked for: layers thinner than 1 mm, "
                "conductivities far outside their material class, window and door U-values "
                "above 7, frames larger than their glazing, room volumes that do not fit the "
                "floor area).")
        b.put(f"C{r}", text, style="hl paragraph")
        sheet.merges.append(f"C{r}:D{r}")
        sheet.row_heights[r] = _height(text)
        return r + 2
    for where, text in items:
        line = f"{where}: {text}"
        b.put(f"B{r}", "!")
        b.put(f"C{r}", line, style="hl warning")
        sheet.merges.append(f"C{r}:D{r}")
        sheet.row_heights[r] = _height(line, 78)
        r += 1
    return r + 1


def _height(text: str, per_line: int = 88) -> float:
    """Row height in points for ``text`` wrapped in the cover's wide column."""
    lines = max(1, -(-len(text) // per_line))
    return 13.5 * lines + 2.0


def _col(j: int) -> str:
    from .plan import col_letter

    return col_letter(j)
