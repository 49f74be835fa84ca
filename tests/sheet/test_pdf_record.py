"""The PDF record: the audit recalculated and printed by LibreOffice, with a bookmark per
sheet, and a clear message when no spreadsheet program is installed."""

from __future__ import annotations

import math
import statistics

import pypdf
import pytest

from heatledger.demo import demo_bytes, demo_project
from heatledger.errors import HeatLedgerError
from heatledger.sheet import commands, pdf
from heatledger.sheet.audit import audit_plan
from heatledger.sheet.styles import STYLES


@pytest.mark.calc
def test_the_record_is_printed_with_bookmarks_and_recalculated_values(tmp_path, capsys,
                                                                       require_soffice):
    require_soffice()
    project = tmp_path / "demo.toml"
    project.write_bytes(demo_bytes())
    out = tmp_path / "record.pdf"
    assert commands.run_audit(project, out) == 0
    assert "record (PDF" in capsys.readouterr().out
    reader = pypdf.PdfReader(out)
    sheets = [s.name for s in audit_plan(demo_project()).sheets]
    titles = [item["/Title"] for item in reader.outline if isinstance(item, dict)]
    assert titles == sheets  # one bookmark per sheet, in order
    cover = reader.pages[0].extract_text()
    # the state is a formula: the printed text is what LibreOffice computed
    assert "ALL CHECKS OK" in cover
    # readable on A4: on every page the median printed word is at least 65 % of the body font
    body = STYLES["hl label"].size
    medians = [(i + 1, _median_word_height(page)) for i, page in enumerate(reader.pages)]
    smallest = min(medians, key=lambda m: m[1])
    assert smallest[1] >= 0.65 * body, smallest
    with pytest.raises(HeatLedgerError, match="exists"):
        commands.run_audit(project, out)


def _median_word_height(page) -> float:
    """Median printed height of the words on a PDF page: font size times the vertical scale
    of the text and current transformation matrices (PDF 32000-1:2008, 9.4.2). [pt]"""
    heights = []

    def visit(text, cm, tm, _font, size):
        if text.strip():
            c, d = tm[2], tm[3]
            heights.append(size * math.hypot(c * cm[0] + d * cm[2], c * cm[1] + d * cm[3]))

    page.extract_text(visitor_text=visit)
    return statistics.median(heights) if heights else math.inf


def test_without_a_spreadsheet_program_the_message_says_how_to_get_one(tmp_path,
                                                                       monkeypatch):
    monkeypatch.setattr(pdf, "spreadsheet_program", lambda: None)
    project = tmp_path / "demo.toml"
    project.write_bytes(demo_bytes())
    with pytest.raises(HeatLedgerError, match="LibreOffice, which is not installed"):
        commands.run_audit(project, tmp_path / "record.pdf")
    assert not (tmp_path / "record.pdf").exists()
    with pytest.raises(HeatLedgerError, match=r"\(.xlsx\) or the printed record \(.pdf\)"):
        commands.run_audit(project, tmp_path / "record.docx")


@pytest.mark.calc
def test_the_cover_answers_first_and_equals_the_engine(tmp_path, recalc):
    import openpyxl

    from heatledger.sheet.render_openpyxl import write_workbook
    from tests.tolerances import RTOL_SHEET

    project = demo_project()
    wb = openpyxl.load_workbook(recalc(write_workbook(audit_plan(project),
                                                      tmp_path / "a.xlsx")), data_only=True)
    rows = list(wb["Cover"].iter_rows(min_col=2, max_col=4, values_only=True))
    assert rows[3][0].startswith("Results")
    found = {(b, c.split(":")[0] if isinstance(c, str) else c): d for b, c, d in rows[4:40]
             if b}
    for entry in project.constructions:
        value = next(v for (item, q), v in found.items() if item == entry.name)
        assert value == pytest.approx(entry.construction.u_value, rel=RTOL_SHEET)
    for j in project.junctions:
        value = next(v for (item, q), v in found.items()
                     if item == f"Junction {j.name}" and q.startswith("psi"))
        assert value == pytest.approx(j.result.psi_result.psi, rel=RTOL_SHEET, abs=1e-12)
    load = next(v for (item, q), v in found.items()
                if item == "Building" and q.startswith("design heat load"))
    assert load == pytest.approx(project.building.heat_load().design_heat_load, rel=RTOL_SHEET)
    verdicts = [c for b, c, _ in rows[4:40] if b and b.startswith("Moisture")]
    assert any("FAILS" in v for v in verdicts)  # the demo's canopy junction fails (invented)
