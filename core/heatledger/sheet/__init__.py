"""The calculation workbook: a backend-neutral sheet plan, its openpyxl renderer, the audit
workbook of a project and the fill-in template.

Flow: project -> engine results -> :class:`~heatledger.sheet.plan.WorkbookPlan` (blocks of
cells, formulas, styles, charts) -> renderer (:mod:`heatledger.sheet.render_openpyxl` here;
the add-in renders the same plan through xlwings). This package never imports xlwings.
"""

from .audit import audit_bytes, audit_plan, write_audit
from .blocks_construction import ConstructionRefs
from .construction_sheet import add_construction_sheet
from .plan import STYLES, Block, Cell, Chart, ChartSeries, PrintSetup, Sheet, WorkbookPlan
from .render_openpyxl import render_workbook, workbook_bytes, write_workbook
from .template import project_from_template, read_template, template_plan

__all__ = [
    "STYLES",
    "Block",
    "Cell",
    "Chart",
    "ChartSeries",
    "ConstructionRefs",
    "PrintSetup",
    "Sheet",
    "WorkbookPlan",
    "add_construction_sheet",
    "audit_bytes",
    "audit_plan",
    "project_from_template",
    "read_template",
    "render_workbook",
    "template_plan",
    "workbook_bytes",
    "write_audit",
    "write_workbook",
]
