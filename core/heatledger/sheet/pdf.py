"""The signable record: the audit workbook recalculated and printed to PDF by the
spreadsheet program itself (LibreOffice, headless, with a throw-away profile of its own), so
that every number on paper is one the spreadsheet computed, not a value heatledger cached.

LibreOffice's PDF export writes one bookmark per sheet. The PDF is written atomically: the
output file is replaced only when the whole conversion succeeded.
"""

from __future__ import annotations

import shutil
import subprocess
import tempfile
from pathlib import Path

from ..errors import HeatLedgerError
from ..fileio import write_bytes_atomic

__all__ = ["spreadsheet_program", "workbook_to_pdf", "INSTALL_HINT", "CONVERT_TIMEOUT",
           "layout_font_missing", "FONT_HINT"]

#: How long a conversion may take. [s]
CONVERT_TIMEOUT = 600.0
INSTALL_HINT = ("the PDF record is printed by LibreOffice, which is not installed: install "
                "it (Debian/Ubuntu: apt-get install libreoffice-calc-nogui; Windows and macOS: "
                "libreoffice.org), or write the workbook (-o record.xlsx) and print it from "
                "your spreadsheet program")
#: Recalculate every formula on load (never trust the cached values in a file).
_PROFILE = """<?xml version="1.0" encoding="UTF-8"?>
<oor:items xmlns:oor="http://openoffice.org/2001/registry"
 xmlns:xs="http://www.w3.org/2001/XMLSchema"
 xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">
<item oor:path="/org.openoffice.Office.Calc/Formula/Load">
<prop oor:name="OOXMLRecalcMode" oor:op="fuse"><value>0</value></prop></item>
<item oor:path="/org.openoffice.Office.Calc/Formula/Load">
<prop oor:name="ODFRecalcMode" oor:op="fuse"><value>0</value></prop></item>
</oor:items>
"""


FONT_HINT = ("note: neither Calibri nor Carlito (its metric-compatible stand-in) is installed, "
             "so LibreOffice printed with a wider font and some sheets take more pages "
             "across (the text size is unchanged); for the pages as designed install Carlito "
             "(Debian/Ubuntu: apt-get install fonts-crosextra-carlito)")


def layout_font_missing() -> bool:
    """True when the font system answers Calibri with neither Calibri nor Carlito (the
    workbook's font and its metric-compatible stand-in); False when it cannot tell. [-]"""
    exe = shutil.which("fc-match")
    if exe is None:
        return False
    try:
        found = subprocess.run([exe, "Calibri"], capture_output=True, text=True, timeout=30,
                               check=False).stdout
    except (OSError, subprocess.TimeoutExpired):
        return False
    return not any(name in found for name in ("Calibri", "Carlito"))


def spreadsheet_program() -> str | None:
    """Path of LibreOffice's command (``soffice``), or None when it is not installed. [-]"""
    return shutil.which("soffice") or shutil.which("libreoffice")


def workbook_to_pdf(xlsx: bytes, output, *, force: bool = False) -> Path:
    """Recalculate a workbook in LibreOffice and write its printout as a PDF.

    Parameters
    ----------
    xlsx : bytes
        The workbook. [-]
    output : str or path-like
        The PDF to write (atomic; an existing file only with ``force``). [-]
    force : bool
        Replace an existing file. [-]

    Returns
    -------
    pathlib.Path
        The PDF written.

    Raises
    ------
    HeatLedgerError
        When LibreOffice is not installed or the conversion fails.
    """
    exe = spreadsheet_program()
    if exe is None:
        raise HeatLedgerError(INSTALL_HINT)
    out = Path(output)
    if out.exists() and not force:
        raise HeatLedgerError(f"output file {str(out)!r} exists; choose another name or use "
                              "--force to replace it")
    with tempfile.TemporaryDirectory(prefix="heatledger-pdf-") as tmp:
        work = Path(tmp)
        profile = work / "profile"
        (profile / "user").mkdir(parents=True)
        (profile / "user" / "registrymodifications.xcu").write_text(_PROFILE,
                                                                     encoding="utf-8")
        src = work / "record.xlsx"
        src.write_bytes(xlsx)
        cmd = [exe, f"-env:UserInstallation={profile.as_uri()}", "--headless", "--invisible",
               "--norestore", "--nologo", "--nodefault", "--nolockcheck", "--convert-to",
               "pdf:calc_pdf_Export", "--outdir", str(work), str(src)]
        try:
            proc = subprocess.run(cmd, capture_output=True, text=True,
                                  timeout=CONVERT_TIMEOUT, check=False)
        except (OSError, subprocess.TimeoutExpired) as exc:
            raise HeatLedgerError(f"LibreOffice could not print the record: {exc}") from None
        pdf = work / "record.pdf"
        if proc.returncode != 0 or not pdf.exists():
            raise HeatLedgerError("LibreOffice could not print the record (exit "
                                  f"{proc.returncode}): {proc.stderr.strip()[:300]}")
        return write_bytes_atomic(out, pdf.read_bytes(), force=force)
