"""Layout of the generated workbooks as a reader sees them: text that a filled cell to its
right would cut is given a column wide enough, up to a cap."""

from __future__ import annotations

import pytest

from heatledger.demo import demo_project
from heatledger.sheet.audit import audit_plan
from heatledger.sheet.plan import (
    DEFAULT_COLUMN_WIDTH,
    MAX_FIT_WIDTH,
    STYLES,
    WorkbookPlan,
    col_letter,
    fit_text_columns,
    split_ref,
    wrapped_lines,
)
from heatledger.sheet.template import template_plan

# A column width is counted in characters of the default font; a 10 pt text of n characters
# needs about n of them (common practice, no published source), so the checks below ask for
# at least len(text), a little less than the helper gives (it adds room for cell padding).


@pytest.fixture(scope="module")
def demo():
    return demo_project()


@pytest.fixture(scope="module")
def plans(demo):
    return [audit_plan(demo), template_plan(demo.raw)]


def _cut_texts(sheet):
    """(column letters, text) of unwrapped, unmerged text cells with a filled right neighbour."""
    cells = sheet.cell_map()
    merged = set()
    for rng in sheet.merges:
        first, _, last = rng.partition(":")
        (r1, c1), (r2, c2) = split_ref(first), split_ref(last or first)
        merged |= {(r, c) for r in range(r1, r2 + 1) for c in range(c1, c2 + 1)}
    for c in cells.values():
        if c.formula is not None or not isinstance(c.value, str) or STYLES[c.style].wrap:
            continue
        row, col = split_ref(c.ref)
        right = cells.get(f"{col_letter(col + 1)}{row}")
        if (row, col) in merged or right is None:
            continue
        if right.formula is None and right.value in (None, ""):
            continue
        yield col_letter(col), c.value


def test_no_text_is_cut_by_its_neighbour(plans):
    short = []
    for plan in plans:
        for sheet in plan.sheets:
            for letters, text in _cut_texts(sheet):
                width = sheet.column_widths.get(letters, DEFAULT_COLUMN_WIDTH)
                if width < min(len(text), MAX_FIT_WIDTH):
                    short.append((sheet.name, letters, width, text))
    assert not short, short[:10]


def test_summary_sheet_column_fits_the_longest_sheet_name(demo, plans):
    audit = plans[0]
    summary = audit.sheet("Summary")
    longest = max(len(s.name) for s in audit.sheets)
    assert summary.column_widths["C"] >= longest
    names = [e.name for e in demo.constructions]
    assert summary.column_widths["B"] >= max(len(n) for n in names)
    fins = audit.sheet("Fins")
    cells = fins.cell_map()
    for i, fin in enumerate(demo.fins):  # whole: the column is wide enough or the name wraps
        cell = cells[f"B{6 + i}"]
        assert cell.value == fin.name
        assert fins.column_widths["B"] >= len(fin.name) or STYLES[cell.style].wrap
    assert fins.column_widths["C"] >= max(len(s.name) for s in audit.sheets
                                          if s.name.startswith("Fin "))


def test_fit_text_columns_widens_only_where_text_is_cut():
    plan = WorkbookPlan()
    sh = plan.add_sheet("T", column_widths={"A": 10, "C": 30})
    b = sh.block("b")
    b.put("A1", "a name much longer than ten characters")
    b.put("B1", 1.0)                                   # filled neighbour: A is widened
    b.put("C2", "runs on into empty cells to its right")  # no neighbour: C stays 30
    b.put("E1", "x" * 200)                             # capped
    b.put("F1", 2.0)
    b.put("G1", "merged title that is long enough to be cut")
    b.put("H1", 3.0)
    sh.merges.append("G1:G2")
    widened = fit_text_columns(sh)
    assert sh.column_widths["A"] >= len("a name much longer than ten characters")
    assert sh.column_widths["C"] == 30
    assert sh.column_widths["E"] == MAX_FIT_WIDTH
    assert "G" not in widened and "C" not in widened
    # never narrower than set
    sh.column_widths["A"] = 99.0
    fit_text_columns(sh)
    assert sh.column_widths["A"] == 99.0


def test_wrapped_lines_counts_words_and_long_words():
    # a header of two words that cannot share a 6-character line takes two lines
    assert wrapped_lines("Engine value", 7.0) == 2
    assert wrapped_lines("Engine value", 30.0) == 1
    assert wrapped_lines("x" * 40, 11.0) == 4   # 10 characters a line at 0.8 per character
    assert wrapped_lines("a\nb", 30.0) == 2


def test_wrapped_cells_have_rows_tall_enough(plans):
    short = []
    for plan in plans:
        for sheet in plan.sheets:
            widths = sheet.column_widths
            merged_tops = {m.partition(":")[0] for m in sheet.merges}
            for c in sheet.cells():
                style = STYLES[c.style]
                if not style.wrap or c.formula or not isinstance(c.value, str):
                    continue
                if c.ref in merged_tops:
                    continue
                row, col = split_ref(c.ref)
                width = widths.get(col_letter(col), DEFAULT_COLUMN_WIDTH)
                lines = wrapped_lines(c.value, width, style.size, bold=style.bold)
                # a line of a 10 pt font needs about 12.5 pt (common practice, no
                # published source); scaled for smaller notes
                if sheet.row_heights.get(row, 15.0) < 12.5 * style.size / 10.0 * lines:
                    short.append((sheet.name, c.ref, lines, c.value[:40]))
    assert not short, short[:10]


def test_fin_overview_fits_its_page(plans):
    fins = plans[0].sheet("Fins")
    cells = fins.cell_map()
    # the notes under the title stay short; the warnings wrap inside their column
    assert len(cells["A3"].value) < 120
    assert all(STYLES[c.style].wrap for ref, c in cells.items()
               if ref.startswith("O") and ref[1:].isdigit() and int(ref[1:]) > 5)


def test_template_tables_print_at_a_readable_scale(plans):
    # about 147 characters of column width fit across A4 landscape at 100 % with 0.5 inch
    # margins (common practice, no published source); ask for 60 % or more on every page
    template = plans[1]
    for sheet in template.sheets:
        total = sum(sheet.column_widths.values())
        scale = 147.0 * sheet.print_setup.fit_width / total
        assert scale >= 0.6, (sheet.name, total, sheet.print_setup.fit_width)


def test_template_instructions_name_every_input_sheet(plans):
    template = plans[1]
    text = " ".join(str(c.value) for c in template.sheet("Instructions").cells())
    for sheet in template.sheets:
        if sheet.name not in ("Instructions", "Lists"):
            assert f"{sheet.name}" in text, sheet.name
    assert "ALL CHECKS OK" in text


def test_bar_chart_axes_have_sensible_number_formats(plans):
    # U-values to two decimals (0.20, not 0.2), heat losses in whole watts (not 1000.0)
    audit = plans[0]
    assert audit.sheet("Summary").charts[0].y_format == "0.00"
    assert audit.sheet("Heat loss building").charts[0].y_format == "0"
    import io
    import zipfile

    from heatledger.sheet.render_openpyxl import workbook_bytes

    with zipfile.ZipFile(io.BytesIO(workbook_bytes(audit))) as zf:
        charts = [zf.read(n).decode() for n in zf.namelist() if n.startswith("xl/charts/")]
    assert any('formatCode="0.00"' in c for c in charts)


def test_u_to_two_significant_figures_is_shown_with_two(plans):
    # ISO 6946:2017 clause 8: U reported to two significant figures; 0.20 shows as 0.20,
    # not 0.200 (three figures) nor 0.2 (one)
    audit = plans[0]
    summary = audit.sheet("Summary").cell_map()
    fmt = summary["H4"].number_format
    assert fmt == "[<0.1]0.000;[<1]0.00;0.0"
    for ref in audit.index.values():
        if hasattr(ref, "u_reported"):
            sheet, a1 = ref.u_reported.split("!")
            cell = audit.sheet(sheet.strip("'")).cell_map()[a1.replace("$", "")]
            assert cell.number_format == fmt


def test_warnings_have_room_to_be_read(plans):
    # a caution wrapped into a narrow label column spills over the rows around it
    narrow = []
    for sheet in plans[0].sheets:
        tops = {}
        for rng in sheet.merges:
            first, _, last = rng.partition(":")
            (_r1, c1), (_r2, c2) = split_ref(first), split_ref(last or first)
            tops[first] = sum(sheet.column_widths.get(col_letter(c), DEFAULT_COLUMN_WIDTH)
                              for c in range(c1, c2 + 1))
        for c in sheet.cells():
            if c.style != "hl warning":
                continue
            _row, col = split_ref(c.ref)
            width = tops.get(c.ref, sheet.column_widths.get(col_letter(col),
                                                            DEFAULT_COLUMN_WIDTH))
            if width < 60:
                narrow.append((sheet.name, c.ref, width))
    assert not narrow, narrow[:10]


def test_heat_loss_notes_wrap_in_their_column(plans):
    # a provenance note running on past the table makes the page print at half size
    for sheet in plans[0].sheets:
        if not (sheet.name.startswith("Room ") or sheet.name == "Heat loss building"):
            continue
        notes = [c for c in sheet.cells() if c.ref.startswith("S") and c.role == "note"]
        assert notes, sheet.name
        long = [c.ref for c in notes if len(str(c.value)) > sheet.column_widths["S"]
                and not STYLES[c.style].wrap]
        assert not long, (sheet.name, long)


def test_template_thermal_inputs_show_their_decimals(plans):
    # a target U of 0.20 must read 0.20 (not 0.2); λ 0.040 reads 0.040
    template = plans[1]
    cons = template.sheet("Constructions").cell_map()
    heads = {c.value: c.ref[0] for c in cons.values() if c.role == "header"}
    target = cons[f"{heads['Target U [W/(m2 K)]']}5"]
    assert target.number_format == "0.00###"
    mats = template.sheet("Materials").cell_map()
    heads = {c.value: c.ref[0] for c in mats.values() if c.role == "header"}
    assert mats[f"{heads['λ [W/(m K)]']}5"].number_format == "0.000##"
    fins = template.sheet("Fins").cell_map()
    heads = {c.value: "".join(ch for ch in c.ref if ch.isalpha())
             for c in fins.values() if c.role == "header"}
    contact = [h for h in heads if "contact" in h]
    assert contact and fins[f"{heads[contact[0]]}5"].number_format is None  # 1e-5 as typed


def test_cover_says_where_the_checks_are(plans):
    cover = {c.ref: c.value for c in plans[0].sheet("Cover").cells()}
    row = next(k[1:] for k, v in cover.items() if v == "Where the checks are")
    text = cover[f"C{row}"]
    for sheet in ("Summary", "Fins", "Heat loss building"):
        assert sheet in text
        assert any(s.name == sheet for s in plans[0].sheets)
