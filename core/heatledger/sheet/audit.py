"""The audit workbook of a project: cover, materials, one sheet per construction, summary.

The workbook is self-checking: every step is a live formula, the engine's values stand
beside them as constants, and check cells compare the two. The cover counts the check cells
and how many say OK with formulas, so a reviewer sees at a glance whether the file is sound
after their own spreadsheet program has recalculated it.
"""

from __future__ import annotations

from collections.abc import Callable

from .. import cautions as _cautions
from .blocks_construction import (
    DEFAULT_CHECK_TOLERANCE,
    FMT_U_2SF,
    ConstructionRefs,
    add_construction_sheet,
)
from .plan import (
    Chart,
    ChartSeries,
    PrintSetup,
    WorkbookPlan,
    fit_text_columns,
    fit_wrapped_rows,
    safe_sheet_name,
    sheet_ref,
)
from .render_openpyxl import workbook_bytes, write_workbook

__all__ = ["audit_plan", "write_audit", "audit_bytes", "METHODS", "tool_version"]

#: Methods and standards the audit workbook applies, as stated on the cover.
METHODS = (
    "Thermal resistance and U-value: EN ISO 6946:2017, 6.7 (R = d/λ; R_T = Rsi + Σ R + Rse; "
    "U = 1/R_T)",
    "Surface resistances: EN ISO 6946:2017, 6.8 and Table 7 (by heat-flow direction)",
    "Air layers: EN ISO 6946:2017, 6.9 and Annex D (unventilated R_g); 6.9.3 slightly and "
    "6.9.4 well ventilated layers",
    "Inhomogeneous (bridged) layers: upper and lower limits, EN ISO 6946:2017, 6.7.2",
    "Corrections to U: EN ISO 6946:2017, Annex F (air gaps F.2, mechanical fasteners F.3, "
    "inverted roofs F.4); not applied below 3 % of U",
    "U-value reported to two significant figures: EN ISO 6946:2017, clause 8",
    "Temperatures: steady-state resistance ladder, and 1-D cell-centred finite volumes "
    "(S. V. Patankar, Numerical Heat Transfer and Fluid Flow, 1980, ch. 4): Thomas algorithm "
    "in the sheet, LAPACK gtsv in the engine; mesh check by Richardson extrapolation",
)

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
    title = info.get("name") or "heatledger project"
    plan = WorkbookPlan(title=f"heatledger audit: {title}")
    cover = plan.add_sheet("Cover", column_widths={"A": 3, "B": 34, "C": 70, "D": 14},
                           print_setup=_print(title, "portrait"), tab_color="2E5A6B")
    materials = plan.add_sheet("Materials", column_widths=_widths([5, 34, 12, 12, 14, 12, 12,
                                                                   60]),
                               freeze="A4", print_setup=_print(title, "landscape", "1:3"))
    summary = plan.add_sheet("Summary", column_widths=_widths([5, 36, 31, 12, 11, 12, 12, 12,
                                                               12, 12, 12, 10, 10, 16]),
                             freeze="A4", print_setup=_print(title, "landscape", "1:3"))
    material_refs = _materials(materials, project)
    refs: list[ConstructionRefs] = []
    names = _sheet_names([e.name for e in project.constructions])
    total = len(project.constructions)
    for i, (entry, sheet_name) in enumerate(zip(project.constructions, names, strict=True), 1):
        mats = [str(r.get("material", "") or "") if isinstance(r, dict) else ""
                for r in entry.layer_inputs]
        bmats = [str(r.get("bridging_material", "") or "") if isinstance(r, dict) else ""
                 for r in entry.layer_inputs]
        refs.append(add_construction_sheet(
            plan, sheet_name, entry.construction, temp_inside=project.temp_inside,
            temp_outside=project.temp_outside, nodes_per_layer=entry.nodes_per_layer,
            area=entry.area, target_u=entry.target_u, materials=mats,
            bridging_materials=bmats, material_refs=material_refs, project_name=title,
            tolerance=tolerance))
        plan.index[entry.name] = refs[-1]
        if progress is not None:
            progress(i, total, entry.name)
    summary_cells = _summary(summary, project, refs)
    if getattr(project, "fins", None):  # fins sheets only when the project has fins
        from .blocks_fins import add_fin_sheets

        summary_cells = add_fin_sheets(plan, project, summary_cells, tolerance=tolerance,
                                       project_name=title)
    building = getattr(project, "building", None)
    if building is not None and getattr(building, "rooms", None):  # rooms: heat-loss sheets
        from .blocks_heatloss import add_heatloss_sheets

        hl = add_heatloss_sheets(plan, building, project_name=title, tolerance=tolerance,
                                 construction_refs={r.name: r for r in refs})
        plan.index["heat loss"] = hl
        summary_cells = {"count": f"{summary_cells['count']}+{hl.check_count}",
                         "ok": f"{summary_cells['ok']}+{hl.checks_ok}"}
    _cover(cover, project, summary_cells, tolerance)
    for sheet in plan.sheets:
        fit_text_columns(sheet)
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


def _print(title: str, orientation: str, rows: str | None = None) -> PrintSetup:
    return PrintSetup(orientation=orientation, header=f"{title} | {{sheet}}",
                      footer_left="heatledger audit {sheet}", footer_right="page {page} of {pages}",
                      title_rows=rows)


def _sheet_names(names) -> list[str]:
    used: set[str] = set()
    width = max(2, len(str(len(names))))
    out = [safe_sheet_name(f"{i:0{width}d} {name}", used,
                           reserved=("Cover", "Materials", "Summary"))
           for i, name in enumerate(names, 1)]
    return out


def _summary(sheet, project, refs) -> dict[str, str]:
    b = sheet.block("summary")
    b.put("A1", "Summary of constructions", style="hl title")
    sheet.merges.append("A1:N1")
    b.put("A2", "Values are live references to the construction sheets; U·A only where an area "
                "is given. Area-weighted U is over the elements with an area.", role="note")
    heads = ["No.", "Construction", "Sheet", "Heat flow", "Area A [m2]", "R_T [m2 K/W]",
             "U [W/(m2 K)]", "U, 2 s.f. [W/(m2 K)]", "Target U [W/(m2 K)]",
             "Target met? (U ≤ target)",
             "U·A [W/K]", "Check cells", "Checks OK", "State"]
    for j, h in enumerate(heads, 1):
        b.put(f"{_col(j)}3", h, role="header")
    sheet.row_heights[3] = 30.0
    first = 4
    for i, (entry, ref) in enumerate(zip(project.constructions, refs, strict=True)):
        r = first + i
        b.put(f"A{r}", i + 1)
        b.put(f"B{r}", entry.name, style="hl text")
        b.put(f"C{r}", ref.sheet, style="hl text")
        b.put(f"D{r}", entry.construction.heat_flow, style="hl text")
        b.put(f"E{r}", formula=f'=IF(ISNUMBER({ref.extras["area"]}),{ref.extras["area"]},"")',
              number_format="0.00")
        b.put(f"F{r}", formula=f"={ref.r_total}", number_format="0.000")
        b.put(f"G{r}", formula=f"={ref.u_value}", number_format="0.0000")
        b.put(f"H{r}", formula=f"={ref.u_reported}", number_format=FMT_U_2SF)
        b.put(f"I{r}", formula=f'=IF(ISNUMBER({ref.extras["target"]}),{ref.extras["target"]},"")',
              number_format="0.000")
        b.put(f"J{r}", formula=f'=IF(ISNUMBER(I{r}),IF(G{r}<=I{r},"yes","NO"),"no target")')
        b.put(f"K{r}", formula=f'=IF(ISNUMBER(E{r}),G{r}*E{r},"")', number_format="0.00")
        b.put(f"L{r}", ref.check_count, role="engine", number_format="0")
        b.put(f"M{r}", formula=f"={ref.checks_ok}", number_format="0")
        b.put(f"N{r}", formula=f'=IF(M{r}=L{r},"ALL CHECKS OK","NOT ALL OK")', style="hl check")
    last = first + max(len(refs), 1) - 1
    t = last + 2
    b.put(f"B{t}", "Total area with U·A [m2]")
    b.put(f"E{t}", formula=f"=SUM(E{first}:E{last})", number_format="0.00")
    b.put(f"B{t + 1}", "Σ U·A [W/K]")
    b.put(f"K{t + 1}", formula=f"=SUM(K{first}:K{last})", number_format="0.00")
    b.put(f"B{t + 2}", "Area-weighted U = Σ U·A / Σ A [W/(m2 K)]")
    b.put(f"G{t + 2}", formula=f'=IF(E{t}>0,K{t + 1}/E{t},"")', number_format="0.0000")
    b.put(f"B{t + 3}", "Check cells in the workbook")
    b.put(f"L{t + 3}", formula=f"=SUM(L{first}:L{last})", number_format="0")
    b.put(f"M{t + 3}", formula=f"=SUM(M{first}:M{last})", number_format="0")
    if refs:
        sheet.charts.append(Chart(
            "bar", "U-value and target per construction", f"B{t + 6}",
            (ChartSeries("U [W/(m2 K)]", sheet_ref(sheet.name, f"G{first}:G{last}"),
                         sheet_ref(sheet.name, f"A{first}:A{last}"), color="2E5A6B"),
             ChartSeries("target U [W/(m2 K)]", sheet_ref(sheet.name, f"I{first}:I{last}"),
                         sheet_ref(sheet.name, f"A{first}:A{last}"), color="D9A441")),
            x_title="construction (No. in the table)", y_title="U [W/(m2 K)]",
            width_cm=20.0, height_cm=8.0, y_format="0.00"))
    return {"count": sheet_ref(sheet.name, f"L{t + 3}"),
            "ok": sheet_ref(sheet.name, f"M{t + 3}")}


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


def _cover(sheet, project, summary_cells, tolerance) -> None:
    info = project.info
    b = sheet.block("cover")
    b.put("B1", "heatledger calculation record", style="hl title")
    b.put("B2", "Thermal resistance, U-values and temperatures through constructions; heat "
                "loss and fins where the project has them",
          role="note")
    r = 4
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
    b.put(f"C{r}", formula=f'=IF(AND({count}>0,{ok}={count}),"ALL CHECKS OK",'
                           f'"NOT ALL OK: "&({count}-{ok})&" check(s) fail; do not rely on this '
                           'file")', style="hl check")
    r += 1
    lists = ["the Summary (constructions)"]
    if getattr(project, "fins", None):
        lists.append("Fins")
    if _heatloss_topics(project)[0]:
        lists.append("Heat loss building (rooms)")
    text = ("Every calculation sheet counts its own check cells at its top right; "
            + ", ".join(lists[:-1]) + (" and " if len(lists) > 1 else "") + lists[-1]
            + (" list" if len(lists) > 1 else " lists")
            + " them sheet by sheet, so a failing check can be found.")
    b.put(f"B{r}", "Where the checks are")
    b.put(f"C{r}", text, style="hl paragraph")
    sheet.merges.append(f"C{r}:D{r}")
    r = _input_warnings(b, sheet, project, r + 2)
    b.put(f"B{r}", "Methods and standards applied", style="hl subtitle")
    sheet.merges.append(f"B{r}:D{r}")
    r += 1
    for text in METHODS + _fin_topics(project)[0] + _heatloss_topics(project)[0]:
        b.put(f"B{r}", "•")
        b.put(f"C{r}", text, style="hl paragraph")
        sheet.row_heights[r] = _height(text)
        r += 1
    r += 1
    b.put(f"B{r}", "Cautions", style="hl subtitle")
    sheet.merges.append(f"B{r}:D{r}")
    r += 1
    for text in (_cautions.caution_lines() + _fin_topics(project)[1]
                 + _heatloss_topics(project)[1]):
        b.put(f"B{r}", "!")
        b.put(f"C{r}", text, style="hl warning")
        sheet.row_heights[r] = _height(text, 78)
        r += 1
    r += 1
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


def _fin_topics(project) -> tuple[tuple, list]:
    """Methods and cautions the cover adds when the project has fins."""
    if not getattr(project, "fins", None):
        return (), []
    from .blocks_fins import FIN_METHODS

    return FIN_METHODS, _cautions.caution_lines("hot_surfaces")


def _heatloss_topics(project) -> tuple[tuple, list]:
    """Methods and cautions the cover adds when the project has rooms."""
    building = getattr(project, "building", None)
    if building is None or not getattr(building, "rooms", None):
        return (), []
    from .blocks_heatloss import HEATLOSS_METHODS

    return HEATLOSS_METHODS, _cautions.caution_lines("plant_sizing")
