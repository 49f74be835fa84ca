"""Safe file input and output.

Output is written to a temporary file beside the target, then moved into place. An existing
file is replaced only when the caller asks (``force``); an error while writing leaves any
previous file exactly as it was. Input is read only when it is no larger than a stated limit.
"""

from __future__ import annotations

import os
import tempfile
from pathlib import Path

from .errors import HeatLedgerError

__all__ = ["read_bytes_limited", "write_bytes_atomic"]


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


def write_bytes_atomic(path: str | os.PathLike, data: bytes, *, force: bool = False) -> Path:
    """Write ``data`` to ``path`` through a temporary file in the same folder.

    Parameters
    ----------
    path : str or path-like
        Target file. [-]
    data : bytes
        File content. [-]
    force : bool
        Replace an existing file. Without it an existing file is an error. [-]

    Returns
    -------
    pathlib.Path
        The path written.

    Raises
    ------
    HeatLedgerError
        If the file exists and ``force`` is false, or the folder does not exist or cannot
        be written.

    Notes
    -----
    The data go to ``.<name>.<random>.tmp`` in the target folder, are flushed and synced,
    and the temporary file is then renamed over the target (``os.replace``, atomic on one
    file system). Without ``force`` the move is ``os.link`` + unlink, which fails if a file
    appeared at the target meanwhile, so nothing is ever overwritten by accident.
    """
    target = Path(path)
    folder = target.parent if str(target.parent) else Path(".")
    if not folder.is_dir():
        raise HeatLedgerError(f"output folder {str(folder)!r} does not exist; create it first")
    if target.exists() and not force:
        raise HeatLedgerError(
            f"output file {str(target)!r} exists; choose another name or use --force to "
            "replace it"
        )
    try:
        fd, tmp_name = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".tmp", dir=folder)
    except OSError as exc:
        raise HeatLedgerError(f"cannot write in folder {str(folder)!r}: {exc.strerror}") from None
    tmp = Path(tmp_name)
    try:
        with os.fdopen(fd, "wb") as fh:
            fh.write(data)
            fh.flush()
            os.fsync(fh.fileno())
        os.chmod(tmp, 0o644)
        if force:
            os.replace(tmp, target)
        else:
            try:
                os.link(tmp, target)
            except FileExistsError:
                raise HeatLedgerError(
                    f"output file {str(target)!r} exists; choose another name or use --force "
                    "to replace it"
                ) from None
            except OSError:  # file system without hard links
                if target.exists():
                    raise HeatLedgerError(
                        f"output file {str(target)!r} exists; use --force to replace it"
                    ) from None
                os.replace(tmp, target)
    except BaseException:
        tmp.unlink(missing_ok=True)
        raise
    tmp.unlink(missing_ok=True)
    return target
