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
from types import MappingProxyType

from ._validate import choices_text, quote
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


def all_sources():
    """Every source of the table, by key, in the order of the table.

    The table is read on the first call (``import heatledger`` does not read it).

    Returns
    -------
    Mapping
        Key -> :class:`Source`, read-only. [-]

    Examples
    --------
    >>> all_sources()["iso6946-surfaces"].edition
    '2017'
    """
    return _table()


@cache
def _table():
    text = resources.files("heatledger").joinpath("data/sources.csv").read_text("utf-8")
    body = "".join(line for line in text.splitlines(True) if not line.startswith("#"))
    rows = {row["key"]: Source(**row) for row in csv.DictReader(io.StringIO(body))}
    return MappingProxyType(rows)


def source(key: str) -> Source:
    """The source called ``key``.

    Parameters
    ----------
    key : str
        Key of a row of the sources table. [-]

    Returns
    -------
    Source
        Its citation, edition, clauses, confidence and note. [-]

    Raises
    ------
    HeatLedgerError
        When no row of the sources table has that key; the message lists the keys.
    """
    try:
        return all_sources()[key]
    except KeyError:
        raise HeatLedgerError(
            f"no source is called {quote(key)} in the sources table (data/sources.csv); "
            f"use one of {choices_text(sorted(all_sources()))}") from None
