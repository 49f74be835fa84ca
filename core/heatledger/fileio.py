"""Safe file input and output.

Output is written to a temporary file beside the target, then moved into place. An existing
file is replaced only when the caller asks (``force``); an error while writing leaves any
previous file exactly as it was. Input is read only when it is no larger than a stated limit.
"""

from __future__ import annotations

import os
import tempfile
from collections.abc import Callable
from pathlib import Path

from .errors import HeatLedgerError

__all__ = ["read_bytes_limited", "write_atomic", "write_bytes_atomic"]


def read_bytes_limited(path, limit: int, what: str) -> bytes:
    """Read a whole file, refusing one larger than ``limit``.

    Parameters
    ----------
    path : str or Path
        The file to read. [-]
    limit : int
        Largest size accepted. [bytes]
    what : str
        What the file is, for messages (``"project file"``, ``"template"``). [-]

    Returns
    -------
    bytes
        The file content.

    Raises
    ------
    HeatLedgerError
        If the file cannot be read or is larger than ``limit``.
    """
    p = Path(path)
    try:
        size = p.stat().st_size
    except OSError as exc:
        raise HeatLedgerError(f"cannot read {what} {str(p)!r}: {exc.strerror}") from None
    if size > limit:
        raise HeatLedgerError(f"{what} {p.name!r} is {size} bytes; the limit is {limit} bytes")
    return p.read_bytes()


def write_atomic(path, writer: Callable[[Path], None], *, force: bool = False) -> Path:
    """Create ``path`` by calling ``writer(temporary_path)`` and moving the result into place.

    Parameters
    ----------
    path : str or Path
        Destination file. [-]
    writer : callable
        Called with a temporary path in the same folder; must write the complete file. [-]
    force : bool
        Replace an existing file. [-]

    Returns
    -------
    Path
        The destination.

    Raises
    ------
    HeatLedgerError
        If the file exists and ``force`` is false, or the folder does not exist.
    """
    dest = Path(path)
    if dest.exists() and not force:
        raise HeatLedgerError(f"{str(dest)!r} exists; choose another name or add --force to "
                              "replace it")
    folder = dest.parent if str(dest.parent) else Path(".")
    if not folder.is_dir():
        raise HeatLedgerError(f"folder {str(folder)!r} does not exist; create it first")
    fd, tmp_name = tempfile.mkstemp(prefix=f".{dest.name}.", suffix=".part", dir=folder)
    os.close(fd)
    tmp = Path(tmp_name)
    try:
        writer(tmp)
        os.replace(tmp, dest)
    finally:
        if tmp.exists():
            tmp.unlink()
    return dest


def write_bytes_atomic(path, data: bytes, *, force: bool = False) -> Path:
    """Write ``data`` to ``path`` atomically (see :func:`write_atomic`).

    Parameters
    ----------
    path : str or Path
        Destination file. [-]
    data : bytes
        Complete file content. [-]
    force : bool
        Replace an existing file. [-]

    Returns
    -------
    Path
    """
    return write_atomic(path, lambda tmp: tmp.write_bytes(data), force=force)
