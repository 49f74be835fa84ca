"""Workbook files: deterministic zip members, and the safe writer of :mod:`heatledger.fileio`
(temporary file beside the target, moved into place; an existing file is never replaced
unless the caller asks).
"""

from __future__ import annotations

import io
import zipfile

from ..fileio import write_bytes_atomic

__all__ = ["write_bytes_atomic", "normalise_zip", "ZIP_EPOCH"]

#: Date of every zip member written by heatledger (the earliest date zip can store).
ZIP_EPOCH = (1980, 1, 1, 0, 0, 0)


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
