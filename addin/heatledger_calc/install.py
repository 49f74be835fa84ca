"""Install and remove the Calc extension with LibreOffice's ``unopkg``.

``unopkg add`` installs for the user running it (LibreOffice must be closed then). It
refuses to run as root without ``--shared`` (for every user of the machine), so as root
:func:`install_extension` asks for ``shared=True``. ``profile`` and ``shared_cache`` point
LibreOffice at a throw-away user profile and shared-extension folder (the tests install
there, so nothing outside their temporary folder changes).
"""

from __future__ import annotations

import os
import subprocess
from pathlib import Path

from heatledger.errors import HeatLedgerError

from .build import office_env, program_dir
from .extension import EXTENSION_ID

__all__ = ["unopkg_path", "location_args", "check_scope", "install_extension",
           "remove_extension"]

_ROOT = ("unopkg does not install an extension for the root user alone; run this command "
         "as the user who runs LibreOffice, or add --shared to install it for every user of "
         "this machine")


def unopkg_path() -> str:
    """Path of LibreOffice's ``unopkg``."""
    path = program_dir() / "unopkg"
    if not os.access(path, os.X_OK):
        raise HeatLedgerError(f"LibreOffice's unopkg is missing from {program_dir()}; "
                              "reinstall LibreOffice")
    return str(path)


def location_args(profile: Path | None = None, shared_cache: Path | None = None) -> list[str]:
    """``-env:`` arguments that point LibreOffice (soffice or unopkg) at another user
    profile and another folder of shared extensions.

    Parameters
    ----------
    profile : Path, optional
        Folder of the user profile. [-]
    shared_cache : Path, optional
        Folder of the shared extensions. [-]
    """
    args = []
    if profile is not None:
        args.append(f"-env:UserInstallation={Path(profile).resolve().as_uri()}")
    if shared_cache is not None:
        args.append(f"-env:UNO_SHARED_PACKAGES_CACHE={Path(shared_cache).resolve().as_uri()}")
    return args


def check_scope(shared: bool) -> None:
    """Refuse a per-user install or removal as root, which unopkg refuses too.

    Parameters
    ----------
    shared : bool
        Whether the extension is installed for every user (``--shared``). [-]
    """
    if not shared and hasattr(os, "geteuid") and os.geteuid() == 0:
        raise HeatLedgerError(_ROOT)


def _unopkg(args: list[str], what: str) -> str:
    proc = subprocess.run([unopkg_path(), *args], capture_output=True, text=True,
                          timeout=300, env=office_env(), check=False)
    out = " ".join((proc.stdout + " " + proc.stderr).split())
    if proc.returncode != 0:
        raise HeatLedgerError(f"unopkg could not {what} (exit {proc.returncode}): "
                              f"{out[:400] or 'no message'}; close every LibreOffice window "
                              "(and any soffice process of this user) and try again")
    return out


def install_extension(oxt: str | os.PathLike, *, shared: bool = False,
                      profile: Path | None = None, shared_cache: Path | None = None) -> str:
    """``unopkg add`` the extension (replacing an installed copy); returns unopkg's output.

    Parameters
    ----------
    oxt : path-like
        The extension file. [-]
    shared : bool
        Install for every user of the machine (``--shared``). [-]
    profile, shared_cache : Path, optional
        Another user profile and shared-extension folder (:func:`location_args`). [-]
    """
    path = Path(oxt)
    if not path.is_file():
        raise HeatLedgerError(f"extension file {path} not found; build it with "
                              "`heatledger calc-addin build -o heatledger.oxt`")
    check_scope(shared)
    args = ["add", "--force", "--suppress-license", *(["--shared"] if shared else []),
            *location_args(profile, shared_cache), str(path.resolve())]
    return _unopkg(args, f"install {path.name}")


def remove_extension(*, shared: bool = False, profile: Path | None = None,
                     shared_cache: Path | None = None) -> str:
    """``unopkg remove`` the extension; returns unopkg's output.

    Parameters
    ----------
    shared : bool
        Remove the copy installed for every user (``--shared``). [-]
    profile, shared_cache : Path, optional
        Another user profile and shared-extension folder (:func:`location_args`). [-]
    """
    check_scope(shared)
    args = ["remove", *(["--shared"] if shared else []),
            *location_args(profile, shared_cache), EXTENSION_ID]
    return _unopkg(args, f"remove {EXTENSION_ID}")
