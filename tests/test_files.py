"""Files the user owns are never lost, and a file is read whole or refused.

Each test builds the hostile file it needs; none depends on timing. Work is measured by
counting what the reader reads.

source: ECMA-376 Part 1, 18.3.1 (SpreadsheetML worksheet: ``dimension`` is a hint,
``sheetData`` holds the rows in ascending ``row@r``, ``c/f`` a formula and ``c/v`` its saved
result); PKWARE APPNOTE.TXT 4.4.7 (a CRC-32 per zip member); TOML 1.0.0 (UTF-8 text);
POSIX open(2) with O_NONBLOCK on a FIFO; proc(5).
"""

from __future__ import annotations

import contextlib
import io
import os
import re
import signal
import subprocess
import sys
import threading
import zipfile
from pathlib import Path

import openpyxl
import pytest

from heatledger.cli import main, project_results
from heatledger.demo import demo_project
from heatledger.errors import HeatLedgerError, ProjectError
from heatledger.fileio import TEMP_MARK, read_bytes_limited, write_bytes_atomic
from heatledger.project import load_project
from heatledger.sheet import template as tpl
from heatledger.sheet.render_openpyxl import write_workbook

#: Size of the template of blank rows: the size at which the reader once took 27 s. [bytes]
BLANK_TEMPLATE_BYTES = 5_000_000


@pytest.fixture
def filled(tmp_path):
    return write_workbook(tpl.template_plan(demo_project().raw), tmp_path / "filled.xlsx")


@pytest.fixture
def counted_events(monkeypatch):
    """Count the XML events the template reader takes from its parser: its work."""
    from heatledger.sheet import xlsx_rows

    seen = [0]
    real = xlsx_rows.iterparse

    def counting(*args, **kwargs):
        for event in real(*args, **kwargs):
            seen[0] += 1
            yield event

    monkeypatch.setattr(xlsx_rows, "iterparse", counting)
    return seen


def _rewrite(path: Path, out: Path, edit, compression=zipfile.ZIP_DEFLATED) -> Path:
    """Copy an .xlsx archive, passing every member through ``edit(name, bytes)``."""
    with zipfile.ZipFile(path) as src, zipfile.ZipFile(out, "w", compression) as dst:
        for info in src.infolist():
            dst.writestr(info.filename, edit(info.filename, src.read(info.filename)))
    return out


def _one_line_error(capsys, argv) -> str:
    """Run the command line: it must fail as an input problem, with one line on stderr."""
    assert main(argv) == 1
    err = capsys.readouterr().err
    assert len(err.strip().splitlines()) == 1 and "Traceback" not in err, err
    return err


def _layers(project):
    return [[layer.name for layer in e.construction.layers] for e in project.constructions]


def _sheet_member(path: Path, sheet: str) -> str:
    wb = openpyxl.load_workbook(path, read_only=True)
    index = wb.sheetnames.index(sheet) + 1
    wb.close()
    return f"xl/worksheets/sheet{index}.xml"


# --------------------------------------------------------------------------- overwriting input
@pytest.mark.parametrize("how", ["same", "dot", "absolute", "symlink", "hardlink"])
def test_audit_never_writes_over_its_own_input(filled, how, capsys):
    before = filled.read_bytes()
    out = {"same": filled, "dot": filled.parent / "." / filled.name,
           "absolute": filled.resolve()}.get(how)
    if how == "symlink":
        out = filled.parent / "link.xlsx"
        out.symlink_to(filled)
    elif how == "hardlink":
        out = filled.parent / "hard.xlsx"
        os.link(filled, out)
    assert main(["audit", str(filled), "-o", str(out), "--force", "--quiet"]) == 1
    assert "is the input file" in capsys.readouterr().err
    assert filled.read_bytes() == before


# --------------------------------------------------------------------------- what is read
@contextlib.contextmanager
def _writer_standing_by(fifo: Path, data: bytes):
    """A writer waits on ``fifo``, so that a reader that blocks is served and the test fails
    rather than hangs; on exit the writer is released and joined."""
    def write():
        try:
            with open(fifo, "wb") as fh:
                fh.write(data)
        except OSError:
            pass  # the reader left first

    thread = threading.Thread(target=write, daemon=True)
    thread.start()
    try:
        yield
    finally:
        fd = os.open(fifo, os.O_RDONLY | os.O_NONBLOCK)  # pairs with a writer still waiting
        try:
            thread.join()
        finally:
            os.close(fd)


@pytest.mark.skipif(not hasattr(os, "mkfifo"), reason="named pipes are POSIX")
@pytest.mark.parametrize("name", ["project.toml", "project.xlsx"])
def test_a_named_pipe_is_refused_without_waiting(tmp_path, capsys, name):
    fifo = tmp_path / name
    os.mkfifo(fifo)  # opening it for reading would block until a writer comes
    with _writer_standing_by(fifo, demo_project().source_bytes):
        with pytest.raises(HeatLedgerError, match="not a regular file"):
            read_bytes_limited(fifo, 1000, "project file")
        err = _one_line_error(capsys, ["audit", str(fifo), "-o", str(tmp_path / "a.xlsx")])
    assert "not a regular file" in err and name in err
    assert not (tmp_path / "a.xlsx").exists()


@pytest.mark.skipif(not Path("/dev/zero").exists(), reason="no /dev/zero")
def test_a_device_is_refused_before_reading(tmp_path):
    link = tmp_path / "zero.toml"
    link.symlink_to("/dev/zero")  # endless, and stat() says 0 bytes
    with pytest.raises(HeatLedgerError, match="not a regular file"):
        read_bytes_limited(link, 1000, "project file")
    with pytest.raises(HeatLedgerError, match="not a regular file"):
        read_bytes_limited(tmp_path, 1000, "project file")  # a folder


def test_reading_is_bounded_by_the_limit_itself(tmp_path):
    p = tmp_path / "p.toml"
    p.write_bytes(b"x" * 1001)
    with pytest.raises(HeatLedgerError, match="the limit is 1000 bytes"):
        read_bytes_limited(p, 1000, "project file")
    assert read_bytes_limited(p, 1001, "project file") == b"x" * 1001


@pytest.mark.skipif(not Path("/proc/self/maps").exists(), reason="no /proc")
def test_reading_is_bounded_by_the_limit_not_by_the_reported_size():
    maps = Path("/proc/self/maps")  # proc(5): reports 0 bytes and holds more
    assert maps.stat().st_size == 0
    with pytest.raises(HeatLedgerError, match="the limit is 100 bytes"):
        read_bytes_limited(maps, 100, "test file")


def test_a_template_whose_dimension_tag_ends_early_loses_no_rows(filled, tmp_path):
    member = _sheet_member(filled, "Layers")
    edited = _rewrite(filled, tmp_path / "short.xlsx", lambda n, b: re.sub(
        rb'<dimension ref="[^"]*"', b'<dimension ref="A1:N5"', b) if n == member else b)
    full, short = tpl.project_from_template(filled), tpl.project_from_template(edited)
    layers = [len(e.construction.layers) for e in full.constructions]
    assert [len(e.construction.layers) for e in short.constructions] == layers
    assert sum(layers) > 2  # the tag covered two data rows only


def test_formula_cells_without_calculated_values_are_named(filled, tmp_path):
    # a program that writes formulas but does not calculate leaves no cached value: the
    # row must not read as blank (the construction would silently lose a layer)
    wb = openpyxl.load_workbook(filled)
    ws = wb["Layers"]
    ws["B4"] = "=12.5*1"
    ws["C4"] = "=0+0.25"
    wb.save(filled)  # openpyxl writes formulas without cached values
    with pytest.raises(HeatLedgerError) as err:
        tpl.project_from_template(filled)
    text = str(err.value)
    assert "Layers!B4, Layers!C4" in text and "no calculated value" in text


def test_rows_absent_from_the_file_cost_nothing(filled, tmp_path, counted_events):
    # one row far below the table: reported as over the row limit, never silently dropped,
    # and the million rows the file does not store are not made up
    member = _sheet_member(filled, "Layers")
    far = b'<row r="900000"><c r="A900000" t="inlineStr"><is><t>x</t></is></c></row>'
    big = _rewrite(filled, tmp_path / "far.xlsx", lambda n, b: b.replace(
        b"</sheetData>", far + b"</sheetData>") if n == member else b)
    with pytest.raises(HeatLedgerError, match=r"Layers!A900000.*more than 5000 rows"):
        tpl.project_from_template(big)
    assert counted_events[0] < 2 * tpl.MAX_XML_ELEMENTS / 10


def test_a_template_of_blank_rows_is_refused_after_a_bounded_read(filled, tmp_path,
                                                                   counted_events):
    # a 5 MB template of blank rows once took 27 s: blank rows are counted as rows read
    tpl.project_from_template(filled)
    baseline = counted_events[0]  # the work of reading the template as written
    counted_events[0] = 0
    member = _sheet_member(filled, "Layers")
    row = b'<row r="%d"><c r="N%d" s="1"/></row>'
    n = BLANK_TEMPLATE_BYTES // len(row % (999_999, 999_999)) + 1
    blank = b"".join(row % (r, r) for r in range(1000, 1000 + n))
    big = _rewrite(filled, tmp_path / "blank.xlsx", lambda name, body: body.replace(
        b"</sheetData>", blank + b"</sheetData>") if name == member else body,
        zipfile.ZIP_STORED)
    assert big.stat().st_size >= BLANK_TEMPLATE_BYTES
    with pytest.raises(ProjectError) as info:
        tpl.project_from_template(big)
    (where, message), = info.value.problems
    assert where.startswith("Layers!A") and "blank rows" in message
    assert f"more than {tpl.MAX_SHEET_ROWS} rows" in message
    # read: the template as written and MAX_SHEET_ROWS rows of one cell (a start and an end
    # event for the row and for the cell), not the n blank rows
    assert counted_events[0] <= baseline + 4 * tpl.MAX_SHEET_ROWS < 4 * n


def test_rows_of_endless_blank_cells_are_refused_after_a_bounded_read(filled, tmp_path,
                                                                      monkeypatch,
                                                                      counted_events):
    budget = 60_000  # the template as written has about 33,000 elements
    monkeypatch.setattr(tpl, "MAX_XML_ELEMENTS", budget)
    member = _sheet_member(filled, "Corrections")
    letters = [openpyxl.utils.get_column_letter(c).encode() for c in range(1, 16_385)]
    wide = b"".join(b'<row r="%d">' % r + b"".join(b'<c r="%s%d" s="1"/>' % (c, r)
                                                    for c in letters) + b"</row>"
                    for r in range(300, 310))
    big = _rewrite(filled, tmp_path / "wide.xlsx", lambda n, b: b.replace(
        b"</sheetData>", wide + b"</sheetData>") if n == member else b)
    with pytest.raises(ProjectError, match=r"Corrections!A30\d: more than 60000 cells"):
        tpl.project_from_template(big)
    assert counted_events[0] <= 2 * budget + 2


def test_a_table_of_endless_empty_texts_is_refused_before_loading(filled, tmp_path,
                                                                   monkeypatch, counted_events):
    # shared texts are loaded whole before any sheet: 100,000 empty ones are 1.3 MB of XML
    # and 13 kB of file
    budget = 60_000
    monkeypatch.setattr(tpl, "MAX_XML_ELEMENTS", budget)
    ns = "http://schemas.openxmlformats.org/"
    texts = (f'<sst xmlns="{ns}spreadsheetml/2006/main">'.encode() + b"<si><t/></si>" * 100_000
             + b"</sst>")

    def edit(name, body):
        if name == "[Content_Types].xml":
            return body.replace(b"</Types>", b'<Override PartName="/xl/sharedStrings.xml" '
                                b'ContentType="application/vnd.openxmlformats-officedocument.'
                                b'spreadsheetml.sharedStrings+xml"/></Types>')
        if name == "xl/_rels/workbook.xml.rels":
            return body.replace(b"</Relationships>", f'<Relationship Id="rId99" Type="{ns}'
                                'officeDocument/2006/relationships/sharedStrings" '
                                'Target="/xl/sharedStrings.xml"/></Relationships>'.encode())
        return body

    path = _rewrite(filled, tmp_path / "texts.xlsx", edit)
    with zipfile.ZipFile(path, "a") as zf:
        zf.writestr("xl/sharedStrings.xml", texts, zipfile.ZIP_DEFLATED)
    with pytest.raises(HeatLedgerError, match=r"texts.xlsx.*sharedStrings.*more than 60000"):
        tpl.project_from_template(path)
    assert counted_events[0] <= 2 * budget + 2


def test_an_archive_of_endless_empty_parts_is_refused(filled, tmp_path):
    path = _rewrite(filled, tmp_path / "parts.xlsx", lambda n, b: b)
    with zipfile.ZipFile(path, "a") as zf:
        for i in range(tpl.MAX_PARTS):
            zf.writestr(f"customXml/item{i}.xml", b"<a/>")
    with pytest.raises(HeatLedgerError, match=f"parts.xlsx.*the limit is {tpl.MAX_PARTS}"):
        tpl.project_from_template(path)


@pytest.mark.parametrize("rows", [
    b'<row r="250"><c r="A250" t="inlineStr"><is><t>late</t></is></c></row>'
    b'<row r="240"><c r="A240" t="inlineStr"><is><t>early</t></is></c></row>',
    b'<row r="250"><c r="A250" t="inlineStr"><is><t>one</t></is></c></row>'
    b'<row r="250"><c r="A250" t="inlineStr"><is><t>two</t></is></c></row>',
], ids=["descending", "twice"])
def test_rows_stored_out_of_order_are_refused(filled, tmp_path, rows):
    # ECMA-376 Part 1, 18.3.1.73: rows ascend; a program shows one of two rows stored twice
    member = _sheet_member(filled, "Materials")
    path = _rewrite(filled, tmp_path / "order.xlsx", lambda n, b: b.replace(
        b"</sheetData>", rows + b"</sheetData>") if n == member else b)
    with pytest.raises(HeatLedgerError, match="order.xlsx.*damaged.*out of order"):
        tpl.project_from_template(path)


def test_formula_results_saved_in_the_file_are_read(filled, tmp_path):
    # a spreadsheet program saves each formula's result beside it (<v>); a text result may
    # be empty (t="str" with an empty <v>), which is a blank cell, not a missing result
    member = _sheet_member(filled, "Layers")

    def edit(name, body):
        if name != member:
            return body
        body, n = re.subn(rb'(<c r="E4"[^>]*?)(?: t="n")?>\s*<v>([^<]*)</v>',
                          rb"\1><f>1*\2</f><v>\2</v>", body, count=1)
        assert n == 1
        return body.replace(b"</sheetData>", b'<row r="290"><c r="A290" t="str"><f>""</f>'
                                             b"<v></v></c></row></sheetData>")

    edited = _rewrite(filled, tmp_path / "saved.xlsx", edit)
    assert _layers(tpl.project_from_template(edited)) == _layers(tpl.project_from_template(
        filled))


def test_project_sheet_is_read_whole(filled):
    wb = openpyxl.load_workbook(filled)
    ws = wb["Project"]
    ws["A250"] = "colour"  # far below the fields: still read, and refused as unknown
    ws["A251"], ws["C251"] = "name", '="Invented office"'  # no saved result
    wb.save(filled)
    with pytest.raises(ProjectError) as info:
        tpl.project_from_template(filled)
    problems = dict(info.value.problems)
    assert "unknown key" in problems["Project!A250"]
    assert "no calculated value" in problems["Project!C251"]


# --------------------------------------------------------------------------- parse errors
@pytest.mark.parametrize("nest", [("[", "]", ""), ("{a = ", "}", "1")],
                         ids=["arrays", "inline tables"])
def test_deeply_nested_toml_is_one_line(tmp_path, capsys, nest):
    opening, closing, core = nest
    p = tmp_path / "deep.toml"
    p.write_text(f"x = {opening * 50_000}{core}{closing * 50_000}\n")
    err = _one_line_error(capsys, ["calc", str(p)])
    assert "nested too deeply" in err and "deep.toml" in err
    _one_line_error(capsys, ["audit", str(p), "-o", str(tmp_path / "a.xlsx")])


def test_a_project_file_with_a_byte_order_mark_is_read(tmp_path):
    demo = demo_project()
    p = tmp_path / "bom.toml"
    p.write_bytes(b"\xef\xbb\xbf" + demo.source_bytes)  # as some Windows editors save
    assert project_results(load_project(p))["constructions"] == \
        project_results(demo)["constructions"]


def test_a_zip_with_a_bad_checksum_is_one_line(filled, tmp_path, capsys):
    stored = tmp_path / "stored.xlsx"
    with zipfile.ZipFile(filled) as src, zipfile.ZipFile(stored, "w") as dst:
        for info in src.infolist():
            dst.writestr(info.filename, src.read(info.filename))  # stored, not compressed
    data = bytearray(stored.read_bytes())
    data[data.find(b"<sheetData>") + 3] ^= 1  # one bit flipped: the CRC no longer matches
    stored.write_bytes(bytes(data))
    assert main(["audit", str(stored), "-o", str(tmp_path / "a.xlsx"), "--quiet"]) == 1
    err = capsys.readouterr().err.strip()
    assert "stored.xlsx" in err and "corrupt" in err and "\n" not in err


def test_broken_sheet_xml_is_one_line(filled, tmp_path, capsys):
    member = _sheet_member(filled, "Layers")
    broken = _rewrite(filled, tmp_path / "broken.xlsx",
                      lambda n, b: b[: len(b) // 2] if n == member else b)
    assert main(["audit", str(broken), "-o", str(tmp_path / "a.xlsx"), "--quiet"]) == 1
    err = capsys.readouterr().err.strip()
    assert "broken.xlsx" in err and "\n" not in err and "Traceback" not in err


def _member_start(path: Path, member: str):
    with zipfile.ZipFile(path) as zf:
        info = zf.getinfo(member)
    return info.header_offset + 30 + len(info.filename) + len(info.extra), info.compress_size


def _flip_text_byte(filled, out, member):
    """Store every member and change one letter of text in ``member``: the XML stays well
    formed, only the member's CRC-32 tells."""
    path = _rewrite(filled, out, lambda n, b: b, zipfile.ZIP_STORED)
    raw = bytearray(path.read_bytes())
    start, _size = _member_start(path, member)
    raw[raw.index(b"<t>", start) + 4] ^= 1
    path.write_bytes(bytes(raw))
    return path


def _damage_deflate(filled, out, member):
    path = _rewrite(filled, out, lambda n, b: b)
    raw = bytearray(path.read_bytes())
    start, size = _member_start(path, member)
    for i in range(start + 20, start + size - 20, 97):
        raw[i] ^= 0xFF
    path.write_bytes(bytes(raw))
    return path


def _in_member(member_edit):
    return lambda f, out, m: _rewrite(f, out, lambda n, b: member_edit(b) if n == m else b)


_ENTITIES = (b'<?xml version="1.0"?><!DOCTYPE w [<!ENTITY a "aaaaaaaaaa">'
             b'<!ENTITY b "&a;&a;&a;&a;&a;&a;&a;&a;&a;&a;">]>')
DAMAGE = {
    "bad checksum in a sheet": _flip_text_byte,
    "damaged deflate data": _damage_deflate,
    "entity declarations in a sheet": _in_member(
        lambda b: _ENTITIES + b.replace(b"<t>", b"<t>&b;", 1)),
    "text index with no shared text": _in_member(lambda b: re.sub(
        rb'<c r="A4"[^>]*>.*?</c>', b'<c r="A4" t="s"><v>7</v></c>', b, count=1)),
    "text stored as a number": _in_member(lambda b: re.sub(
        rb'<c r="E4"([^>]*)>\s*<v>[^<]*</v>', rb'<c r="E4"\1><v>twelve</v>', b, count=1)),
    "row number that is not a number": _in_member(
        lambda b: b.replace(b'<row r="4"', b'<row r="four"', 1)),
    "broken styles": lambda f, out, m: _rewrite(
        f, out, lambda n, b: b[: len(b) // 2] if n == "xl/styles.xml" else b),
}


@pytest.mark.parametrize("damage", sorted(DAMAGE))
def test_a_damaged_template_is_one_line_naming_the_file(filled, tmp_path, capsys, damage):
    path = DAMAGE[damage](filled, tmp_path / "damaged.xlsx", _sheet_member(filled, "Layers"))
    with pytest.raises(HeatLedgerError) as info:
        tpl.project_from_template(path)
    assert "damaged.xlsx" in str(info.value) and "\n" not in str(info.value)
    err = _one_line_error(capsys, ["audit", str(path), "-o", str(tmp_path / "a.xlsx")])
    assert "damaged.xlsx" in err
    assert sorted(p.name for p in tmp_path.iterdir()) == ["damaged.xlsx", "filled.xlsx"]


def test_the_command_never_shows_a_traceback(tmp_path):
    # an unexpected failure is one line and exit code 3 (here: a project path the operating
    # system refuses in a way no reader expects is not easy to make, so call with a broken
    # handler through the module's own entry point)
    code = ("import heatledger.cli as c\n"
            "c._cmd_materials = lambda args: 1 / 0\n"
            "raise SystemExit(c.main(['materials']))")
    proc = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True)
    assert proc.returncode == 3
    assert "Traceback" not in proc.stderr and proc.stderr.count("\n") == 1
    assert "ZeroDivisionError" in proc.stderr


# --------------------------------------------------------------------------- temporaries
def test_a_temporary_left_by_a_killed_writer_is_cleaned_up(tmp_path):
    target = tmp_path / "audit.xlsx"
    dead = subprocess.run([sys.executable, "-c", "import os; print(os.getpid())"],
                          capture_output=True, text=True, check=True).stdout.strip()
    stale = tmp_path / f".audit.xlsx{TEMP_MARK}{dead}-abc123"
    stale.write_bytes(b"half a workbook")
    alive = tmp_path / f".audit.xlsx{TEMP_MARK}{os.getppid()}-def456"  # a running process
    alive.write_bytes(b"being written")
    other = tmp_path / f".other.xlsx{TEMP_MARK}{dead}-zzz"  # another target's: not ours
    other.write_bytes(b"x")
    write_bytes_atomic(target, b"new", force=True)
    assert target.read_bytes() == b"new"
    assert not stale.exists() and alive.exists() and other.exists()
    assert sorted(p.name for p in tmp_path.iterdir()) == sorted(
        [target.name, alive.name, other.name])


_KILLED_WRITER = """
import sys, time
from heatledger import fileio

def stall(fd):
    print("writing", flush=True)
    time.sleep(3600)

fileio.os.fsync = stall
fileio.write_bytes_atomic(sys.argv[1], b"new content", force=True)
"""


@pytest.mark.skipif(os.name != "posix", reason="SIGKILL is POSIX")
def test_the_temporary_of_a_writer_killed_while_writing_goes_with_the_next_write(tmp_path):
    target = tmp_path / "out.xlsx"
    target.write_bytes(b"previous content")
    proc = subprocess.Popen([sys.executable, "-c", _KILLED_WRITER, str(target)],
                            stdout=subprocess.PIPE, text=True)
    try:
        assert proc.stdout.readline().strip() == "writing"  # its data are in the temporary
    finally:
        proc.send_signal(signal.SIGKILL)
        proc.wait()
        proc.stdout.close()
    left = [p.name for p in tmp_path.iterdir() if p.name != target.name]
    assert len(left) == 1 and left[0].startswith(f".out.xlsx{TEMP_MARK}")
    assert target.read_bytes() == b"previous content"
    keep = [f".out.xlsx{TEMP_MARK}folder", f".other.xlsx{TEMP_MARK}1", f"out.xlsx{TEMP_MARK}1",
            ".out.xlsx.1234.tmp", "out.xlsx.bak", f".out.xlsx{TEMP_MARK}link"]
    (tmp_path / keep[0]).mkdir()
    for name in keep[1:5]:
        (tmp_path / name).write_bytes(b"not heatledger's to remove")
    os.symlink(tmp_path / keep[1], tmp_path / keep[5])
    write_bytes_atomic(target, b"next content", force=True)
    assert sorted(p.name for p in tmp_path.iterdir()) == sorted(keep + [target.name])
    assert target.read_bytes() == b"next content"


def test_template_round_trip_still_reads_every_row(filled):
    # the reader that no longer trusts <dimension> gives the same project as before
    from heatledger.sheet.xlsx_rows import SheetReader

    wb = openpyxl.load_workbook(io.BytesIO(filled.read_bytes()), read_only=True,
                                data_only=True)
    reader = SheetReader(filled.name, tpl.MAX_SHEET_ROWS, tpl.MAX_XML_ELEMENTS)
    rows = [r for r, values, _ in reader.rows(wb["Layers"], 4, 14) if any(values)]
    assert rows == sorted(rows) and len(rows) >= 5
