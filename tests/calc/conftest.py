"""The headless Calc the ``calc_functions`` tests evaluate documents in.

One session per test run: the extension is built from this checkout's registry, installed
with ``unopkg`` into a throw-away profile and shared-extension folder under pytest's
temporary directory, and LibreOffice is started once, headless, listening on a pipe. Without
LibreOffice, its Python bridge, its Python component loader or ``unoidl-write`` the tests
skip with a message saying what to install; with ``CI=true`` they fail instead.
"""

from __future__ import annotations

import os

import pytest

from heatledger.errors import HeatLedgerError


def missing_parts() -> list[str]:
    """What the Calc extension tests need and this machine lacks, as install hints."""
    from heatledger_calc.build import NO_LIBREOFFICE, program_dir, soffice_path, unoidl_write_path
    from heatledger_calc.session import uno_python

    if soffice_path() is None:
        return [NO_LIBREOFFICE]
    problems = []
    for check in (unoidl_write_path, uno_python):
        try:
            check()
        except HeatLedgerError as exc:
            problems.append(str(exc))
    if not (program_dir() / "pythonloader.py").is_file():
        problems.append("LibreOffice's Python component loader is missing; install it with "
                        "`sudo apt-get install libreoffice-script-provider-python`")
    return problems


def require_calc_extension_tools() -> None:
    """Skip (locally) or fail (``CI=true``) when something the tests need is missing."""
    problems = missing_parts()
    if problems:
        text = "Calc extension tests cannot run: " + "; ".join(problems)
        if os.environ.get("CI", "").strip().lower() == "true":
            pytest.fail(text)
        pytest.skip(text)


@pytest.fixture(scope="session")
def calc_oxt(tmp_path_factory):
    """The extension built from this checkout (path of the .oxt)."""
    require_calc_extension_tools()
    from heatledger_calc.build import build_extension

    return build_extension(tmp_path_factory.mktemp("oxt") / "heatledger.oxt")


@pytest.fixture(scope="session")
def calc(tmp_path_factory, calc_oxt):
    """A started :class:`heatledger_calc.session.CalcSession` with the extension installed."""
    from heatledger_calc.session import CalcSession

    session = CalcSession(tmp_path_factory.mktemp("calc-session"), calc_oxt).start()
    try:
        yield session
    finally:
        session.close()
