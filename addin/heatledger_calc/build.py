"""Build the Calc extension (``.oxt``) from the function registry.

:func:`build_extension` writes the function table, the IDL interface compiled to a type
library by LibreOffice's own ``unoidl-write`` (SDK; Debian package ``libreoffice-dev``), the
function-wizard configuration, the component and the manifest into one zip file. The table
records the folders of the Python environment that builds the extension, so that the
component, running in LibreOffice's Python, imports heatledger, numpy and scipy from there:
build and install from the environment heatledger is installed in, with a Python of the same
minor version as LibreOffice's (both 3.11 on Debian 12).
"""

from __future__ import annotations

import io
import json
import os
import shutil
import site
import subprocess
import sys
import tempfile
import zipfile
from importlib import resources
from pathlib import Path

from heatledger.errors import HeatLedgerError

from . import extension as ext

__all__ = ["soffice_path", "program_dir", "unoidl_write_path", "site_dirs", "office_env",
           "extension_files", "extension_bytes", "build_extension"]

def office_env() -> dict[str, str]:
    """The environment for LibreOffice's programs: this one without an active virtual
    environment (``VIRTUAL_ENV``, its ``bin`` on ``PATH``) and without ``PYTHONHOME`` or
    ``PYTHONPATH``. LibreOffice's Python is the system's; started from an activated virtual
    environment of another Python build, its UNO bridge failed (``std::bad_alloc`` on the
    first call), seen on this machine. [-]"""
    env = dict(os.environ)
    venv = env.pop("VIRTUAL_ENV", None)
    for key in ("PYTHONHOME", "PYTHONPATH", "VIRTUAL_ENV_PROMPT"):
        env.pop(key, None)
    if venv:
        own = os.path.join(venv, "bin")
        env["PATH"] = os.pathsep.join(p for p in env.get("PATH", "").split(os.pathsep)
                                      if p and os.path.normpath(p) != os.path.normpath(own))
    return env


#: Where Debian/Ubuntu and the LibreOffice packages put their programs and SDK tools.
_PROGRAM_DIRS = ("/usr/lib/libreoffice/program", "/opt/libreoffice/program")
_SDK_DIRS = ("/usr/lib/libreoffice/sdk/bin", "/opt/libreoffice/sdk/bin")
NO_LIBREOFFICE = ("LibreOffice is not installed (no soffice on PATH); install it with "
                  "`sudo apt-get install libreoffice-calc-nogui python3-uno "
                  "libreoffice-script-provider-python` (Debian/Ubuntu) or from "
                  "https://www.libreoffice.org")
NO_SDK = ("LibreOffice's unoidl-write (SDK) is not installed, and it compiles the "
          "extension's interface; install it with `sudo apt-get install libreoffice-dev` "
          "(Debian/Ubuntu) or the LibreOffice SDK, or put unoidl-write on PATH")


def soffice_path() -> str | None:
    """Path of the LibreOffice executable, or None."""
    return shutil.which("soffice") or shutil.which("libreoffice")


def program_dir() -> Path:
    """LibreOffice's ``program`` folder (holds ``types.rdb`` and ``unopkg``)."""
    exe = soffice_path()
    candidates = [Path(os.path.realpath(exe)).parent] if exe else []
    candidates += [Path(p) for p in _PROGRAM_DIRS]
    for folder in candidates:
        if (folder / "types.rdb").is_file():
            return folder
    raise HeatLedgerError(NO_LIBREOFFICE)


def unoidl_write_path() -> str:
    """Path of ``unoidl-write``; a message saying how to install it when it is missing."""
    found = shutil.which("unoidl-write")
    if found:
        return found
    for folder in _SDK_DIRS:
        if os.access(Path(folder) / "unoidl-write", os.X_OK):
            return str(Path(folder) / "unoidl-write")
    raise HeatLedgerError(NO_SDK)


def site_dirs() -> list[str]:
    """Folders the component adds to LibreOffice's Python path: where heatledger,
    heatledger_xl and heatledger_calc are imported from, then this environment's
    site-packages (numpy, scipy, openpyxl, xlwings)."""
    import heatledger
    import heatledger_calc
    import heatledger_xl

    dirs = [str(Path(m.__file__).resolve().parents[1])
            for m in (heatledger, heatledger_xl, heatledger_calc)]
    dirs += site.getsitepackages()
    if site.ENABLE_USER_SITE and os.path.isdir(site.getusersitepackages()):
        dirs.append(site.getusersitepackages())
    return list(dict.fromkeys(dirs))


def _type_library(idl: str) -> bytes:
    """The IDL compiled to a UNO type library by ``unoidl-write``."""
    tool = unoidl_write_path()
    types = program_dir() / "types.rdb"
    with tempfile.TemporaryDirectory(prefix="heatledger-idl-") as tmp:
        src = Path(tmp) / "heatledger.idl"
        out = Path(tmp) / ext.TYPES_FILE
        src.write_text(idl, encoding="utf-8")
        proc = subprocess.run([tool, str(types), str(src), str(out)], env=office_env(),
                              capture_output=True, text=True, timeout=120, check=False)
        if proc.returncode != 0 or not out.is_file():
            detail = " ".join((proc.stderr or proc.stdout).split())[:300]
            raise HeatLedgerError(f"unoidl-write could not compile the extension's interface "
                                  f"(exit {proc.returncode}): {detail}")
        return out.read_bytes()


def extension_files(table: dict | None = None, *, version: str | None = None,
                    dirs: list[str] | None = None) -> dict[str, bytes]:
    """Every file of the extension, by path inside it.

    Parameters
    ----------
    table : dict, optional
        The function table; default the full registry's. [-]
    version : str, optional
        Version recorded in description.xml; default heatledger's. [-]
    dirs : list of str, optional
        Folders recorded for the component's imports; default :func:`site_dirs`. [-]
    """
    if table is None:
        table = ext.function_table()
    if version is None:
        from heatledger import __version__ as version
    stored = dict(table, site_dirs=site_dirs() if dirs is None else list(dirs),
                  python=list(sys.version_info[:2]))
    component = resources.files("heatledger_calc").joinpath("uno/component.py").read_bytes()
    return {
        "META-INF/manifest.xml": ext.manifest_text().encode("utf-8"),
        "description.xml": ext.description_text(version).encode("utf-8"),
        ext.COMPONENTS_FILE: ext.components_text().encode("utf-8"),
        ext.COMPONENT_FILE: component,
        ext.TABLE_FILE: json.dumps(stored, indent=1, ensure_ascii=False).encode("utf-8"),
        ext.XCU_FILE: ext.xcu_text(table).encode("utf-8"),
        ext.TYPES_FILE: _type_library(ext.idl_text(table)),
        "heatledger.idl": ext.idl_text(table).encode("utf-8"),
    }


def extension_bytes(files: dict[str, bytes]) -> bytes:
    """The ``.oxt`` (a zip file) holding ``files``, in a fixed order with fixed dates.

    Parameters
    ----------
    files : dict
        Path inside the extension -> content. [-]
    """
    out = io.BytesIO()
    with zipfile.ZipFile(out, "w", zipfile.ZIP_DEFLATED) as zf:
        for path in sorted(files):
            info = zipfile.ZipInfo(path, date_time=(2026, 1, 1, 0, 0, 0))
            info.compress_type = zipfile.ZIP_DEFLATED
            info.external_attr = 0o644 << 16
            zf.writestr(info, files[path])
    return out.getvalue()


def build_extension(output: str | os.PathLike, *, force: bool = False) -> Path:
    """Write the Calc extension of every registered function to ``output``.

    Parameters
    ----------
    output : path-like
        The ``.oxt`` file to write (atomically; an existing file only with ``force``). [-]
    force : bool
        Replace an existing file. [-]

    Returns
    -------
    Path
        The file written.
    """
    from heatledger.fileio import write_bytes_atomic

    if Path(output).suffix.lower() != ".oxt":
        raise HeatLedgerError(f"the extension file must end in .oxt (unopkg needs it); got "
                              f"{Path(output).name}")
    return write_bytes_atomic(output, extension_bytes(extension_files()), force=force)
