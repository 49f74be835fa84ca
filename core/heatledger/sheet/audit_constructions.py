"""The constructions family's audit sheets: one calculation sheet per construction and the
Summary of constructions (hooks of :mod:`heatledger.families`)."""

from __future__ import annotations

from openpyxl.cell.cell import ILLEGAL_CHARACTERS_RE

from .blocks_construction import FMT_U_2SF, ConstructionRefs
from .construction_sheet import add_construction_sheet
from .plan import Chart, ChartSeries, col_letter, safe_sheet_name, sheet_ref

__all__ = ["add_sheets", "topics", "METHODS"]

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
    "in the sheet, LAPACK pttrf/pttrs in the engine; mesh estimate from three meshes with "
    "the observed order (Roache 1998), or exact where the scheme is proven exact for the case",
)



def topics(project) -> tuple:
    """Methods and cautions the cover lists for the constructions (no extra cautions).

    Parameters
    ----------
    project : heatledger.project.Project
        A parsed project. [-]

    Returns
    -------
    tuple
        ``(methods, cautions)``. [-]
    """
    del project
    return METHODS, []


def add_sheets(plan, project, audit) -> None:
    """Add one calculation sheet per construction and fill the Summary.

    Parameters
    ----------
    plan : WorkbookPlan
        The workbook plan to extend. [-]
    project : heatledger.project.Project
        A parsed project. [-]
    audit : heatledger.sheet.audit.AuditContext
        Shared state of the audit; gains the construction sheets' cells and check counts. [-]
    """
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
            bridging_materials=bmats, material_refs=audit.material_refs,
            project_name=audit.title, tolerance=audit.tolerance))
        plan.index[entry.name] = refs[-1]
        audit.construction_refs[entry.name] = refs[-1]
        audit.answers.append(_answer(entry, refs[-1]))
        audit.appendices.append((refs[-1].extras["fv_sheet"],
                                 f"finite-volume temperatures of {entry.name}"))
        if audit.progress is not None:
            audit.progress(i, total, entry.name)
    audit.counts.append(_summary(audit.summary, project, refs))
    audit.check_lists.append("the Summary (constructions)")


def _answer(entry, ref):
    """The construction's U on the cover, with its target when it has one."""
    from .audit import Answer

    if entry.target_u is None:
        return Answer(entry.name, "U-value [W/(m2 K)] (EN ISO 6946)", f"={ref.u_value}",
                      "0.000")
    t = f"{entry.target_u:g}"
    return Answer(entry.name, f'=IF({ref.u_value}<={t},"U-value [W/(m2 K)]: meets the target '
                              f'{t}","U-value [W/(m2 K)]: ABOVE the target {t}")',
                  f"={ref.u_value}", "0.000")


def _ground_build_ups(project) -> set:
    """Constructions the project uses as the build-up of a ground floor (their own U is not
    the floor's U)."""
    from ..heatloss.schema import GROUND_METHODS

    out = set()
    for room in project.raw.get("rooms", []) or []:
        for el in (room.get("elements", []) if isinstance(room, dict) else []) or []:
            if isinstance(el, dict) and el.get("method") in GROUND_METHODS:
                out.add(el.get("construction"))
    return out


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
    b.put("A2", "Values are live references to the construction sheets (click a name to open "
                "its sheet); U·A only where an area is given, and not for the build-up of a "
                "ground floor, whose EN ISO 13370 U-value is on its room's sheet. Area-weighted "
                "U is over the elements counted in U·A.", role="note")
    ground = _ground_build_ups(project)
    heads = ["No.", "Construction", "Sheet", "Heat flow", "Area A [m2]", "R_T [m2 K/W]",
             "U [W/(m2 K)]", "U, 2 s.f. [W/(m2 K)]", "Target U [W/(m2 K)]",
             "Target met? (U ≤ target)",
             "U·A [W/K]", "Check cells", "Checks OK", "State"]
    for j, h in enumerate(heads, 1):
        b.put(f"{col_letter(j)}3", h, role="header")
    sheet.row_heights[3] = 30.0
    first = 4
    for i, (entry, ref) in enumerate(zip(project.constructions, refs, strict=True)):
        r = first + i
        b.put(f"A{r}", i + 1)
        link = ref.sheet.replace("'", "''")
        text = ILLEGAL_CHARACTERS_RE.sub("", entry.name).replace('"', '""')[:255]
        b.put(f"B{r}", formula=f'=HYPERLINK("#\'{link}\'!A1","{text}")', style="hl text")
        b.put(f"C{r}", ref.sheet, style="hl text")
        b.put(f"D{r}", entry.construction.heat_flow, style="hl text")
        if entry.name not in ground:
            b.put(f"E{r}", formula=f'=IF(ISNUMBER({ref.extras["area"]}),'
                                   f'{ref.extras["area"]},"")', number_format="0.00")
        b.put(f"F{r}", formula=f"={ref.r_total}", number_format="0.000")
        b.put(f"G{r}", formula=f"={ref.u_value}", number_format="0.0000")
        b.put(f"H{r}", formula=f"={ref.u_reported}", number_format=FMT_U_2SF)
        b.put(f"I{r}", formula=f'=IF(ISNUMBER({ref.extras["target"]}),{ref.extras["target"]},"")',
              number_format="0.000")
        b.put(f"J{r}", formula=f'=IF(ISNUMBER(I{r}),IF(G{r}<=I{r},"yes","NO"),"no target")')
        if entry.name in ground:  # the floor's own U is EN ISO 13370's, on the room sheet
            b.put(f"E{r}", "ground floor", style="hl text")
            b.put(f"K{r}", "build-up U only", style="hl text")
        else:
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
    b.put(f"B{t + 3}", "Check cells of the construction sheets (the cover counts the "
                       "whole workbook)")
    b.put(f"L{t + 3}", formula=f"=SUM(L{first}:L{last})", number_format="0")
    b.put(f"M{t + 3}", formula=f"=SUM(M{first}:M{last})", number_format="0")
    if refs:
        sheet.charts.append(Chart(
            "bar", "U-value and target per construction", f"B{t + 6}",
            (ChartSeries("U [W/(m2 K)]", sheet_ref(sheet.name, f"G{first}:G{last}"),
                         sheet_ref(sheet.name, f"B{first}:B{last}"), color="2E5A6B"),
             ChartSeries("target U [W/(m2 K)]", sheet_ref(sheet.name, f"I{first}:I{last}"),
                         sheet_ref(sheet.name, f"B{first}:B{last}"), color="D9A441")),
            x_title="construction", y_title="U [W/(m2 K)]",
            width_cm=20.0, height_cm=8.0, y_format="0.00"))
    return {"count": sheet_ref(sheet.name, f"L{t + 3}"),
            "ok": sheet_ref(sheet.name, f"M{t + 3}")}


