"""Safe file output: write to a temporary file beside the target, then move it into place.

An existing file is never replaced unless the caller asks (``force=True``), and a failure
while writing leaves any previous file exactly as it was.
"""

from __future__ import annotations

import io
import os
import tempfile
import zipfile
from pathlib import Path

from ..errors import HeatLedgerError

__all__ = ["write_bytes_atomic", "normalise_zip", "ZIP_EPOCH"]

#: Date of every zip member written by heatledger (the earliest date zip can store).
ZIP_EPOCH = (1980, 1, 1, 0, 0, 0)


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


def normalise_zip(data: bytes) -> bytes:
    """Rewrite a zip archive with fixed member timestamps so equal content gives equal bytes.

    Parameters
    ----------
    data : bytes
        A zip archive (an .xlsx file). [-]

    Returns
    -------
    bytes
        The same members, in the same order, dated 1980-01-01, deflate-compressed.
    """
    out = io.BytesIO()
    with zipfile.ZipFile(io.BytesIO(data)) as src, zipfile.ZipFile(
        out, "w", zipfile.ZIP_DEFLATED
    ) as dst:
        for info in src.infolist():
            member = zipfile.ZipInfo(info.filename, date_time=ZIP_EPOCH)
            member.compress_type = zipfile.ZIP_DEFLATED
            member.external_attr = 0o644 << 16
            dst.writestr(member, src.read(info.filename), compresslevel=6)
    return out.getvalue()
