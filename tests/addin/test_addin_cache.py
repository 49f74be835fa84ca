"""The memory-bounded least-recently-used cache behind the spreadsheet functions."""

from __future__ import annotations

from heatledger_xl.cache import MISSING, BoundedCache


def test_least_recently_used_entries_go_first_once_over_budget():
    cache = BoundedCache(300)
    for key in "abc":
        cache.put(key, key.upper(), 100)
    assert cache.get("a") == "A"  # a is now the most recently used
    cache.put("d", "D", 100)  # 400 > 300: the least recently used (b) goes
    assert cache.get("b") is MISSING
    assert [cache.get(k) for k in "acd"] == ["A", "C", "D"]
    assert cache.size_bytes == 300 and len(cache) == 3
    assert (cache.hits, cache.misses) == (4, 1)


def test_an_entry_larger_than_the_budget_is_kept_alone():
    cache = BoundedCache(100)
    cache.put("a", 1, 50)
    cache.put("big", 2, 500)
    assert cache.get("a") is MISSING and cache.get("big") == 2 and len(cache) == 1


def test_unhashable_keys_are_never_cached_and_a_key_is_held_once():
    cache = BoundedCache(1000)
    key = (1, [2])
    cache.put(key, "x", 10)
    assert cache.get(key) is MISSING and len(cache) == 0
    cache.put("k", "first", 10)
    cache.put("k", "second", 10)
    assert cache.get("k") == "first" and cache.size_bytes == 10
    cache.clear()
    assert len(cache) == 0 and cache.size_bytes == 0 and cache.hits == 0
