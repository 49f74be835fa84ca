"""Rounding for reports: U-values to two significant figures (EN ISO 6946:2017, clause 8).

Sources: [source: iso6946-layers, clause 8].
"""

from __future__ import annotations

import math
from decimal import ROUND_HALF_UP, Decimal

__all__ = ["round_significant"]


def round_significant(value: float, digits: int = 2) -> float:
    """Round to ``digits`` significant figures, halves away from zero (as spreadsheets do).

    Parameters
    ----------
    value : float
        Value to round. [any unit]
    digits : int
        Significant figures. [-]

    Returns
    -------
    float

    Examples
    --------
    >>> round_significant(0.2449), round_significant(0.245), round_significant(1.25)
    (0.24, 0.25, 1.3)
    """
    if value == 0.0 or not math.isfinite(value):
        return value
    exponent = math.floor(math.log10(abs(value)))
    places = digits - 1 - exponent
    quantum = Decimal(1).scaleb(-places)
    return float(Decimal(repr(value)).quantize(quantum, rounding=ROUND_HALF_UP))
