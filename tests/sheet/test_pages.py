"""Printed pages: a print scale that keeps text readable, column breaks with the label
columns repeated, run-on texts wrapped, and the finite-volume appendix of a construction."""

from __future__ import annotations

from itertools import pairwise

import pytest

from heatledger.demo import demo_project
from heatledger.sheet.audit import audit_plan
from heatledger.sheet.pages import MIN_PRINT_SCALE, PAGE_WIDTH_CHARS, contain_overflow, paginate
from heatledger.sheet.plan import PrintSetup, WorkbookPlan, col_letter
from heatledger.sheet.styles import STYLES


def _sheet(widths, orientation="landscape"):
    plan = WorkbookPlan(title="t")
    sh = plan.add_sheet("S", column_widths={col_letter(i + 1): w for i, w in enumerate(widths)},
                        print_setup=PrintSetup(orientation=orientation))
    for i in range(len(widths)):
        sh.block("b").put(f"{col_letter(i + 1)}1", 1.0)
    return sh


def test_a_narrow_sheet_prints_at_full_size():
    sh = _sheet([10] * 5)
    paginate(sh, title_columns=2)
    assert sh.print_setup.scale == 100 and sh.col_breaks == []


def test_a_sheet_a_little_too_wide_is_scaled_not_split():
    width = PAGE_WIDTH_CHARS["landscape"] * 100 / (MIN_PRINT_SCALE + 5)
    sh = _sheet([width / 10] * 10)
    paginate(sh, title_columns=2)
    assert MIN_PRINT_SCALE <= sh.print_setup.scale < 100 and sh.col_breaks == []


def test_a_wide_sheet_splits_with_its_label_columns_on_every_page():
    sh = _sheet([5, 30] + [12] * 30)
    paginate(sh, title_columns=2)
    setup = sh.print_setup
    assert setup.scale == MIN_PRINT_SCALE and setup.title_columns == "A:B"
    capacity = PAGE_WIDTH_CHARS["landscape"] * 100 / MIN_PRINT_SCALE
    edges = [0, *sh.col_breaks, 32]
    widths = [5, 30] + [12] * 30
    for k, (a, b) in enumerate(pairwise(edges)):
        printed = sum(widths[a:b]) + (35 if k else 0)  # A:B repeat on later pages
        assert printed <= capacity, (k, printed)


def test_a_declared_break_is_kept():
    sh = _sheet([5, 20] + [10] * 8)
    sh.col_breaks.append(6)
    paginate(sh, title_columns=2)
    assert sh.col_breaks == [6]


def test_text_running_off_the_page_is_wrapped_across_the_free_columns():
    sh = _sheet([10, 10, 10])
    sh.block("n").put("A3", "x " * 60, style="hl note")
    sh.block("n").put("A4", "y " * 60, style="hl note")
    sh.block("n").put("B4", 2.0)
    assert contain_overflow(sh) == 2
    cells = sh.cell_map()
    assert STYLES[cells["A3"].style].wrap and "A3:C3" in sh.merges
    assert STYLES[cells["A4"].style].wrap and not any(m.startswith("A4") for m in sh.merges)


@pytest.fixture(scope="module")
def demo_plan():
    return audit_plan(demo_project())


def test_construction_sheets_print_one_page_across_and_the_appendix_at_the_back(demo_plan):
    names = [s.name for s in demo_plan.sheets]
    for entry in demo_project().constructions:
        refs = demo_plan.index[entry.name]
        sheet = demo_plan.sheet(refs.sheet)
        assert sheet.col_breaks == [] and sheet.print_setup.scale >= MIN_PRINT_SCALE
        fv = refs.extras["fv_sheet"]
        assert names.index(fv) > max(names.index(s.name) for s in demo_plan.sheets
                                     if s.name.startswith(("Moist ", "Room ")))
        cover = " ".join(str(c.formula or c.value) for c in demo_plan.sheet("Cover").cells())
        assert fv.replace("'", "''") in cover  # the cover lists the appendix


def test_every_sheet_prints_at_a_readable_scale(demo_plan):
    for sheet in demo_plan.sheets:
        assert sheet.print_setup.scale is not None, sheet.name
        assert sheet.print_setup.scale >= MIN_PRINT_SCALE, sheet.name


def test_a_merged_text_never_crosses_a_column_break():
    sh = _sheet([5, 30] + [12] * 30)
    sh.block("n").put("A3", "caution " * 40, style="hl warning")
    sh.merges.append("A3:AF3")
    paginate(sh, title_columns=2)
    contain_overflow(sh)
    first_break = sh.col_breaks[0]
    assert f"A3:{col_letter(first_break)}3" in sh.merges


def test_every_calculation_sheet_shows_its_check_counters_on_its_first_page(demo_plan):
    # the counters stand in column J (10) of every calculation sheet
    for sheet in demo_plan.sheets:
        if any(c.value == "State of this sheet" for c in sheet.cells()):
            assert not sheet.col_breaks or sheet.col_breaks[0] >= 10, sheet.name
