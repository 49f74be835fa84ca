"""A least-recently-used cache bounded by the memory its entries hold (an estimate).

The spreadsheet functions keep what they built from a range (a construction, a layer) so
that a recalculation of unchanged cells does not build it again. A workbook may hold
thousands of distinct tables; a cache bounded by a count of entries either holds too few
of them (a recalculation then misses every time, since the least recently used entry is
always the next one needed) or, with large tables, too much memory. This one is bounded by
the estimated bytes of its entries instead, which the caller states per entry.
"""

from __future__ import annotations

import threading
from collections import OrderedDict

__all__ = ["MISSING", "BoundedCache"]

#: Returned by :meth:`BoundedCache.get` when the key is not cached (kept when the module is
#: reloaded).
MISSING = globals().get("MISSING") or object()


class BoundedCache:
    """Least-recently-used cache whose entries together stay under a memory budget.

    Parameters
    ----------
    budget_bytes : int
        Largest estimated memory of all entries together; the least recently used entries
        are dropped beyond it (the newest entry is always kept). [bytes]

    Attributes
    ----------
    hits, misses : int
        Lookups answered from the cache, and lookups of keys not held. [-]

    Notes
    -----
    Keys must be hashable; a key that is not (a cell holding a list) is simply not cached.
    Lookups and insertions hold a lock, so calls from several threads are safe.

    Examples
    --------
    >>> cache = BoundedCache(100)
    >>> cache.put("a", 1.0, 60); cache.put("b", 2.0, 60)
    >>> len(cache), cache.get("b"), cache.size_bytes
    (1, 2.0, 60)
    """

    def __init__(self, budget_bytes: int) -> None:
        self.budget_bytes = int(budget_bytes)
        self._data: OrderedDict = OrderedDict()
        self._bytes = 0
        self._lock = threading.Lock()
        self.hits = 0
        self.misses = 0

    def get(self, key):
        """The value held for ``key``, or :data:`MISSING`.

        Parameters
        ----------
        key : hashable
            The key. [-]
        """
        with self._lock:
            try:
                entry = self._data[key]
            except (KeyError, TypeError):  # TypeError: an unhashable key is never held
                self.misses += 1
                return MISSING
            self._data.move_to_end(key)
            self.hits += 1
            return entry[0]

    def put(self, key, value, size_bytes: int) -> None:
        """Hold ``value`` for ``key`` (unless a value is held for it already), dropping the
        least recently used entries beyond the budget.

        Parameters
        ----------
        key : hashable
            The key; an unhashable key is not cached. [-]
        value : object
            The value. [-]
        size_bytes : int
            Estimated memory the entry holds, key included. [bytes]
        """
        with self._lock:
            try:
                if key in self._data:  # put meanwhile by another thread: keep that one
                    return
            except TypeError:
                return
            self._data[key] = (value, size_bytes)
            self._bytes += size_bytes
            while self._bytes > self.budget_bytes and len(self._data) > 1:
                _, (_, size) = self._data.popitem(last=False)
                self._bytes -= size

    def clear(self) -> None:
        """Drop every entry and reset the counts."""
        with self._lock:
            self._data.clear()
            self._bytes = 0
            self.hits = self.misses = 0

    def __len__(self) -> int:
        return len(self._data)

    @property
    def size_bytes(self) -> int:
        """Estimated memory of the entries held. [bytes]"""
        return self._bytes
