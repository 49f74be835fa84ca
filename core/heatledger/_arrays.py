"""Array-aware input checks and small helpers shared by the heat-loss family modules.

Each check accepts a scalar or an array and raises :class:`~heatledger.errors.HeatLedgerError`
naming the input, the first offending value and the rule.
"""

from __future__ import annotations

import math

import numpy as np

from ._validate import show
from .errors import HeatLedgerError

__all__ = ["check_perimeter", "finite_array", "non_negative_array", "out", "perimeter_bound",
           "pick"]


def perimeter_bound(area, shape: str) -> np.ndarray:
    """Shortest outline of ``area`` [m2]: 4 sqrt(A) for ``"rectilinear"``, 2 sqrt(pi A)
    for ``"any"`` (isoperimetric inequality). [m]"""
    factor = 4.0 if shape == "rectilinear" else 2.0 * math.sqrt(math.pi)
    return factor * np.sqrt(np.asarray(area, dtype=float))


def check_perimeter(pname, perimeter, aname, area, shape, *, context: str = "") -> None:
    perimeter, area = np.broadcast_arrays(np.asarray(perimeter), np.asarray(area))
    bound = perimeter_bound(area, shape)
    # a relative slack of 1e-9 lets an exact square pass despite rounding
    short = (area > 0.0) & (perimeter < bound * (1.0 - 1e-9))
    if np.any(short):
        i = int(np.argmax(short.ravel()))
        rule = (
            "a rectilinear outline of area A needs a perimeter of at least 4 sqrt(A)"
            if shape == "rectilinear"
            else "any outline of area A needs a perimeter of at least 2 sqrt(pi A)"
        )
        hint = ' (give glazing_shape "any" for a round or curved outline)' if (
            shape == "rectilinear" and pname == "glazing_perimeter"
        ) else ""
        raise HeatLedgerError(
            f"{context}{pname} {pick(perimeter, i):g} m cannot bound {aname} "
            f"{pick(area, i):g} m2: {rule} = {pick(bound, i):.4g} m{hint}"
        )


def non_negative_array(name: str, value, unit: str) -> np.ndarray:
    arr = finite_array(name, value)
    if np.any(arr < 0.0):
        bad = arr.ravel()[np.argmax((arr < 0.0).ravel())]
        raise HeatLedgerError(f"{name} must not be negative; got {bad:g} {unit}")
    return arr


def finite_array(name: str, value) -> np.ndarray:
    if isinstance(value, bool):
        raise HeatLedgerError(f"{name} must be a number; got {show(value)}")
    try:
        arr = np.asarray(value, dtype=float)
    except (TypeError, ValueError):
        raise HeatLedgerError(f"{name} must be a number or an array of numbers; "
                              f"got {show(value)}") from None
    if not np.all(np.isfinite(arr)):
        bad = arr.ravel()[np.argmax(~np.isfinite(arr.ravel()))]
        raise HeatLedgerError(f"{name} must be finite; got {show(bad)}")
    return arr


def pick(arr, i: int) -> float:
    a = np.asarray(arr)
    return float(a) if a.ndim == 0 else float(a.ravel()[min(i, a.size - 1)])


def out(arr):
    a = np.asarray(arr, dtype=float)
    return float(a) if a.ndim == 0 else a
