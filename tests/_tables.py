"""Published tables the tests check against, read from tests/data (one file per table,
named after it; the first lines say where each comes from)."""

from __future__ import annotations

import csv
from pathlib import Path

DATA = Path(__file__).resolve().parent / "data"


def read_table(name: str) -> list[dict]:
    """The rows of ``tests/data/<name>.csv`` (comment lines starting with # skipped).

    Parameters
    ----------
    name : str
        File name without ``.csv``. [-]

    Returns
    -------
    list of dict
        One dict per row, values as text. [-]
    """
    with open(DATA / f"{name}.csv", encoding="utf-8", newline="") as fh:
        return list(csv.DictReader(line for line in fh if not line.startswith("#")))
