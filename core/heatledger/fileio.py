"""Safe file input and output.

Output is written to a temporary file beside the target, then moved into place. An existing
file is replaced only when the caller asks (``force``); an error while writing leaves any
previous file exactly as it was. Input is read only when it is no larger than a stated limit.
"""

from __future__ import annotations

import os
import stat
import tempfile
import time
from pathlib import Path

from ._validate import quote as _quote
from .errors import HeatLedgerError

__all__ = ["read_bytes_limited", "same_file", "write_bytes_atomic", "TEMP_MARK"]

#: Part of the name of every temporary file the writer makes: ``.NAME.heatledger-tmp-*``.
TEMP_MARK = ".heatledger-tmp-"
#: On Windows, where a writer's process cannot be probed, a temporary this old is stale. [s]
STALE_AFTER_S = 3600.0


def read_bytes_limited(path, limit: int, what: str) -> bytes:
    """Read a whole regular file, refusing one larger than ``limit``.

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
        If the file cannot be read, is not a regular file (a folder, device, pipe or socket),
        or is larger than ``limit``.

    Notes
    -----
    The file is opened without blocking (a named pipe would otherwise wait for a writer),
    checked to be a regular file on the open descriptor (no race with a swapped path), and
    read at most ``limit + 1`` bytes: the limit bounds the reading itself, whatever the
    file system says of the size (``/dev/zero`` reports 0 bytes and never ends).
    """
    p = Path(path)
    flags = os.O_RDONLY | getattr(os, "O_NONBLOCK", 0) | getattr(os, "O_BINARY", 0)
    try:
        fd = os.open(p, flags)
    except OSError as exc:
        raise HeatLedgerError(f"cannot read {what} {_quote(p)}: {exc.strerror}") from None
    try:
        if not stat.S_ISREG(os.fstat(fd).st_mode):
            raise HeatLedgerError(
                f"{what} {_quote(p)} is not a regular file (a folder, device, pipe or socket); "
                "give the path of a saved file")
        with os.fdopen(fd, "rb") as fh:
            fd = None
            data = fh.read(limit + 1)
    finally:
        if fd is not None:
            os.close(fd)
    if len(data) > limit:
        raise HeatLedgerError(f"{what} {_quote(p.name)} is larger than allowed; the limit is "
                              f"{limit} bytes")
    return data


def same_file(a, b) -> bool:
    """Whether paths ``a`` and ``b`` name the same file (through links, relative paths and
    hard links); False when either does not exist.

    Parameters
    ----------
    a, b : str or path-like
        The two paths. [-]
    """
    try:
        return os.path.samefile(a, b)
    except OSError:
        return False


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
    The data go to ``.<name>.heatledger-tmp-<pid>-<random>`` in the target folder
    (temporaries of this target left by a writer process that no longer runs are removed
    first), are flushed and synced,
    and the temporary file is then renamed over the target (``os.replace``, atomic on one
    file system). Without ``force`` the move is ``os.link`` + unlink, which fails if a file
    appeared at the target meanwhile, so nothing is ever overwritten by accident.
    """
    target = Path(path)
    folder = target.parent if str(target.parent) else Path(".")
    if not folder.is_dir():
        raise HeatLedgerError(f"output folder {_quote(folder)} does not exist; create it first")
    if target.exists() and not force:
        raise HeatLedgerError(
            f"output file {_quote(target)} exists; choose another name or use --force to "
            "replace it"
        )
    _remove_stale_temporaries(folder, target.name)
    try:
        fd, tmp_name = tempfile.mkstemp(prefix=f".{target.name}{TEMP_MARK}{os.getpid()}-",
                                        dir=folder)
    except OSError as exc:
        raise HeatLedgerError(f"cannot write in folder {_quote(folder)}: {exc.strerror}") from None
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
                    f"output file {_quote(target)} exists; choose another name or use --force "
                    "to replace it"
                ) from None
            except OSError:  # file system without hard links
                if target.exists():
                    raise HeatLedgerError(
                        f"output file {_quote(target)} exists; use --force to replace it"
                    ) from None
                os.replace(tmp, target)
    except BaseException:
        tmp.unlink(missing_ok=True)
        raise
    tmp.unlink(missing_ok=True)
    return target


def _remove_stale_temporaries(folder: Path, name: str) -> None:
    """Remove temporaries of target ``name`` left by a killed writer (only those)."""
    prefix = f".{name}{TEMP_MARK}"
    try:
        entries = list(os.scandir(folder))
    except OSError:
        return
    for entry in entries:
        if not (entry.name.startswith(prefix) and entry.is_file(follow_symlinks=False)):
            continue
        if _writer_alive(entry.name[len(prefix):].split("-", 1)[0], entry):
            continue  # another heatledger process is writing this target right now
        try:
            os.unlink(entry.path)
        except OSError:
            pass  # not ours to remove (permissions): leave it


def _writer_alive(pid_text: str, entry: os.DirEntry) -> bool:
    """Whether the process that named a temporary file may still be writing it."""
    if os.name == "nt":  # no harmless liveness probe (os.kill would stop the process)
        try:
            return time.time() - entry.stat().st_mtime < STALE_AFTER_S
        except OSError:
            return True
    if not pid_text.isdigit() or int(pid_text) == os.getpid():
        return False
    try:
        os.kill(int(pid_text), 0)  # signal 0: only asks whether the process exists
    except ProcessLookupError:
        return False
    except (OSError, ValueError, OverflowError):
        return True  # exists but not ours to signal, or cannot tell: keep its file
    return True
