"""The PDF record: the audit recalculated and printed by LibreOffice, with a bookmark per
sheet, and a clear message when no spreadsheet program is installed."""

from __future__ import annotations

import pypdf
import pytest

from heatledger.demo import demo_bytes, demo_project
from heatledger.errors import HeatLedgerError
from heatledger.sheet import commands, pdf
from heatledger.sheet.audit import audit_plan


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
    with pytest.raises(HeatLedgerError, match="exists"):
        commands.run_audit(project, out)


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
