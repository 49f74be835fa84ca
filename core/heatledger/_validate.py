"""Small input checks shared by every engine module.

Each check returns the cleaned value or raises :class:`~heatledger.errors.HeatLedgerError`
whose message names the input (``name``), the value received and the rule.
"""

from __future__ import annotations

import math
from collections.abc import Iterable

import numpy as np

from .errors import HeatLedgerError

__all__ = ["finite", "positive", "non_negative", "fraction", "choice", "array_positive"]


def _as_float(name: str, value: object) -> float:
    if isinstance(value, bool):
        raise HeatLedgerError(f"{name} must be a number; got {value!r}")
    try:
        out = float(value)  # type: ignore[arg-type]
    except (TypeError, ValueError):
        raise HeatLedgerError(f"{name} must be a number; got {value!r}") from None
    if math.isnan(out) or math.isinf(out):
        raise HeatLedgerError(f"{name} must be a finite number; got {value!r}")
    return out


def finite(name: str, value: object) -> float:
    """Return ``value`` as a finite float."""
    return _as_float(name, value)


def positive(name: str, value: object, unit: str = "") -> float:
    """Return ``value`` as a float that is finite and > 0."""
    out = _as_float(name, value)
    if out <= 0.0:
        raise HeatLedgerError(f"{name} must be greater than zero; got {out:g}{_u(unit)}")
    return out


def non_negative(name: str, value: object, unit: str = "") -> float:
    """Return ``value`` as a float that is finite and >= 0."""
    out = _as_float(name, value)
    if out < 0.0:
        raise HeatLedgerError(f"{name} must not be negative; got {out:g}{_u(unit)}")
    return out


def fraction(name: str, value: object, *, allow_zero: bool = True) -> float:
    """Return ``value`` as a float in [0, 1] (or (0, 1] when ``allow_zero`` is false)."""
    out = _as_float(name, value)
    low_ok = out >= 0.0 if allow_zero else out > 0.0
    if not (low_ok and out <= 1.0):
        bound = "0" if allow_zero else "above 0"
        raise HeatLedgerError(f"{name} must be between {bound} and 1; got {out:g}")
    return out


def choice(name: str, value: object, choices: Iterable[str]) -> str:
    """Return ``value`` if it is one of ``choices`` (case-insensitive, spaces trimmed)."""
    options = tuple(choices)
    text = str(value).strip().lower() if isinstance(value, str) else value
    if text not in options:
        listed = ", ".join(repr(c) for c in options)
        raise HeatLedgerError(f"{name} must be one of {listed}; got {value!r}")
    return text  # type: ignore[return-value]


def array_positive(name: str, value: object) -> np.ndarray:
    """Return ``value`` as a float array whose every element is finite and > 0."""
    arr = np.asarray(value, dtype=float)
    bad = ~np.isfinite(arr) | (arr <= 0.0)
    if bad.any():
        first = arr.ravel()[np.argmax(bad.ravel())]
        raise HeatLedgerError(f"{name} must be finite and greater than zero; got {first!r}")
    return arr


def _u(unit: str) -> str:
    return f" {unit}" if unit else ""
