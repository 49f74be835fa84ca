"""Shared test fixtures.

The ``recalc`` fixture is the independent judge of generated workbooks: LibreOffice Calc,
run headless with its own throw-away profile, opens a workbook, recalculates every formula
and saves the computed values, which the tests then read back with openpyxl
(``data_only=True``). Before the conversion every formula cell gets a stale cached value
(:data:`STALE_VALUE`), so a program that kept cached values instead of recalculating would
hand that number back and fail the test.

Without ``soffice`` the tests marked ``calc`` skip with a message saying how to install
LibreOffice; with ``CI=true`` in the environment they fail instead.
"""

from __future__ import annotations

import io
import os
import re
import shutil
import subprocess
import uuid
import zipfile
from pathlib import Path

import pytest

#: Value planted as the cached result of every formula before recalculation.
#: The benchmark scripts print ratios; they are run by hand, never collected as tests.
collect_ignore = ["benchmarks"]

STALE_VALUE = -987654321.0

_INSTALL_HINT = (
    "LibreOffice Calc (soffice) is not installed, so workbook recalculation tests are "
    "skipped; install it with `sudo apt-get install libreoffice-calc-nogui` (Debian/Ubuntu) "
    "or from https://www.libreoffice.org and make sure `soffice` is on PATH"
)

# Always recalculate on load, for OOXML and ODF files (0 = always, 1 = never, 2 = ask).
_REGISTRY = """<?xml version="1.0" encoding="UTF-8"?>
<oor:items xmlns:oor="http://openoffice.org/2001/registry"
 xmlns:xs="http://www.w3.org/2001/XMLSchema"
 xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">
<item oor:path="/org.openoffice.Office.Calc/Formula/Load">
<prop oor:name="OOXMLRecalcMode" oor:op="fuse"><value>0</value></prop></item>
<item oor:path="/org.openoffice.Office.Calc/Formula/Load">
<prop oor:name="ODFRecalcMode" oor:op="fuse"><value>0</value></prop></item>
</oor:items>
"""

_FILTERS = {"xlsx": "xlsx:Calc MS Excel 2007 XML", "ods": "ods"}


def soffice_path() -> str | None:
    """Path of the LibreOffice executable, or None."""
    return shutil.which("soffice") or shutil.which("libreoffice")


def _require_soffice() -> str:
    exe = soffice_path()
    if exe is None:
        if os.environ.get("CI", "").strip().lower() == "true":
            pytest.fail(_INSTALL_HINT.replace("are skipped", "cannot run in CI"))
        pytest.skip(_INSTALL_HINT)
    return exe


def poison_cached_values(path: Path, value: float = STALE_VALUE) -> int:
    """Give every formula cell of an .xlsx file the cached value ``value``; return how many."""
    data = path.read_bytes()
    out = io.BytesIO()
    count = 0
    with zipfile.ZipFile(io.BytesIO(data)) as src, zipfile.ZipFile(
        out, "w", zipfile.ZIP_DEFLATED
    ) as dst:
        for info in src.infolist():
            body = src.read(info.filename)
            if info.filename.startswith("xl/worksheets/sheet") and info.filename.endswith(".xml"):
                text = body.decode("utf-8")
                text, n = re.subn(r"(</f>)<v\s*/>", rf"\1<v>{value!r}</v>", text)
                count += n
                body = text.encode("utf-8")
            dst.writestr(info, body)
    path.write_bytes(out.getvalue())
    return count


def run_calc(src: Path, workdir: Path, fmt: str = "xlsx", *, poison: bool = True,
             timeout: float = 240.0) -> Path:
    """Recalculate ``src`` in LibreOffice Calc and return the converted file."""
    exe = _require_soffice()
    run_id = uuid.uuid4().hex[:10]
    work = workdir / f"calc-{run_id}"
    profile = work / "profile"
    (profile / "user").mkdir(parents=True)
    (profile / "user" / "registrymodifications.xcu").write_text(_REGISTRY, encoding="utf-8")
    indir = work / "in"
    outdir = work / "out"
    indir.mkdir()
    outdir.mkdir()
    staged = indir / src.name
    shutil.copyfile(src, staged)
    if poison:
        poison_cached_values(staged)
    cmd = [
        exe, f"-env:UserInstallation={profile.as_uri()}", "--headless", "--invisible",
        "--norestore", "--nologo", "--nodefault", "--nolockcheck",
        "--convert-to", _FILTERS[fmt], "--outdir", str(outdir), str(staged),
    ]
    proc = subprocess.run(cmd, capture_output=True, text=True, timeout=timeout, check=False)
    result = outdir / f"{src.stem}.{fmt}"
    if proc.returncode != 0 or not result.exists():
        pytest.fail(f"LibreOffice conversion failed (exit {proc.returncode}): "
                    f"{proc.stdout.strip()} {proc.stderr.strip()}")
    return result


def convert_to_pdf(src: Path, workdir: Path) -> Path:
    """Print ``src`` to PDF with LibreOffice (for looking at the page layout)."""
    exe = _require_soffice()
    run_id = uuid.uuid4().hex[:10]
    profile = workdir / f"pdf-{run_id}" / "profile"
    (profile / "user").mkdir(parents=True)
    (profile / "user" / "registrymodifications.xcu").write_text(_REGISTRY, encoding="utf-8")
    outdir = workdir / f"pdf-{run_id}" / "out"
    outdir.mkdir()
    subprocess.run([exe, f"-env:UserInstallation={profile.as_uri()}", "--headless",
                    "--norestore", "--nolockcheck", "--convert-to", "pdf", "--outdir",
                    str(outdir), str(src)], capture_output=True, timeout=240, check=False)
    return outdir / f"{src.stem}.pdf"


@pytest.fixture
def recalc(tmp_path):
    """``recalc(path, fmt="xlsx", poison=True) -> Path`` of the recalculated copy."""
    _require_soffice()

    def _run(src, fmt: str = "xlsx", *, poison: bool = True) -> Path:
        return run_calc(Path(src), tmp_path, fmt, poison=poison)

    return _run


@pytest.fixture
def stale_value() -> float:
    """The number planted as every formula's cached value before recalculation."""
    return STALE_VALUE


@pytest.fixture
def poison():
    """``poison(path) -> count``: plant :data:`STALE_VALUE` as every formula's cached value."""
    return poison_cached_values


@pytest.fixture
def require_soffice():
    """The check the ``calc`` tests run first: skip (or fail in CI) without LibreOffice."""
    return _require_soffice
