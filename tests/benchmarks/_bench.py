"""Shared timing for the benchmark scripts (not tests, never run by pytest).

Every benchmark compares two pieces of the same work in one run: A and B are timed in turn,
A B A B ..., after a warm-up of each, and the ratio A/B is taken pair by pair, so a machine
that speeds up or slows down during the run moves both sides of a pair together. The minimum
and the median of the pair ratios are printed with a verdict against the target.
"""

from __future__ import annotations

import os
import statistics
import time
from collections.abc import Callable
from dataclasses import dataclass


@dataclass(frozen=True)
class Paired:
    """Pair-by-pair timings of A against B. [s]"""

    label: str
    a: list[float]
    b: list[float]

    @property
    def ratios(self) -> list[float]:
        return [x / y for x, y in zip(self.a, self.b, strict=True)]

    def line(self, target: float | None = None, *, unit: str = "x") -> str:
        r = self.ratios
        verdict = ""
        if target is not None:
            verdict = (f"  target <= {target:g}{unit}: "
                       f"{'met' if statistics.median(r) <= target else 'NOT met'} (median)")
        return (f"{self.label}: ratio min {min(r):.2f}{unit}, median {statistics.median(r):.2f}"
                f"{unit} over {len(r)} pairs (A median {statistics.median(self.a) * 1e3:.1f} ms, "
                f"B median {statistics.median(self.b) * 1e3:.1f} ms){verdict}")


def _once(fn: Callable[[], object], inner: int) -> float:
    t0 = time.perf_counter()
    for _ in range(inner):
        fn()
    return (time.perf_counter() - t0) / inner


def paired(label: str, fn_a: Callable[[], object], fn_b: Callable[[], object], *,
           pairs: int = 7, inner: int = 1) -> Paired:
    """Time ``fn_a`` against ``fn_b`` interleaved; ``inner`` calls per timing. [s]"""
    fn_a(), fn_b()  # warm-up: caches, imports, first-touch of memory
    a, b = [], []
    for i in range(pairs):
        order = (fn_a, fn_b) if i % 2 == 0 else (fn_b, fn_a)  # alternate who goes first
        t = {fn: _once(fn, inner) for fn in order}
        a.append(t[fn_a])
        b.append(t[fn_b])
    return Paired(label, a, b)


def machine_line() -> str:
    """One line on the machine and its load, to print above the figures."""
    load = os.getloadavg() if hasattr(os, "getloadavg") else (float("nan"),) * 3
    return (f"machine: {os.cpu_count()} logical cores, load average {load[0]:.2f} "
            f"(1 min); {time.strftime('%Y-%m-%d')}")
