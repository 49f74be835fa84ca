"""The published sources heatledger cites, from the table in the package
(``data/sources.csv``): citation, edition, the clauses used and how sure we are of each.

A pointer in the code, the sheets or the tests reads ``[source: key, clause]``; the key is a
row of the table (a test checks every pointer and every row).
"""

from __future__ import annotations

import csv
import io
from dataclasses import dataclass
from functools import cache
from importlib import resources

from .errors import HeatLedgerError

__all__ = ["Source", "source", "all_sources", "CONFIDENCES"]

#: How sure we are of a source's content, from the least to the most.
CONFIDENCES = ("recalled", "read", "verified numerically")


@dataclass(frozen=True)
class Source:
    """One published source.

    Parameters
    ----------
    key : str
        Short stable name used in pointers (``iso6946-airlayers``). [-]
    citation : str
        Authors or body, and title. [-]
    edition : str
        Edition or year. [-]
    clauses : str
        The clauses, tables and equations heatledger uses. [-]
    confidence : str
        One of :data:`CONFIDENCES`. [-]
    note : str
        What was checked, or a caveat. [-]
    """

    key: str
    citation: str
    edition: str
    clauses: str
    confidence: str
    note: str = ""


@cache
def all_sources() -> dict:
    """Every source of the table, by key.

    Returns
    -------
    dict
        Key -> :class:`Source`. [-]

    References
    ----------
    [source: bipm-si] and the other rows of ``data/sources.csv``.
    """
    text = resources.files("heatledger").joinpath("data/sources.csv").read_text("utf-8")
    body = "".join(line for line in text.splitlines(True) if not line.startswith("#"))
    return {row["key"]: Source(**row) for row in csv.DictReader(io.StringIO(body))}


def source(key: str) -> Source:
    """The source called ``key``.

    Parameters
    ----------
    key : str
        Key of a row of the sources table. [-]

    Returns
    -------
    Source
    """
    try:
        return all_sources()[key]
    except KeyError:
        raise HeatLedgerError(f"no source is called {key!r}; the sources are "
                              f"{', '.join(sorted(all_sources()))}") from None
