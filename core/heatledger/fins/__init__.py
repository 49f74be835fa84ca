"""Fins and finned surfaces: closed forms, finite volumes and arrays.

Public names
------------
StraightFin, AnnularFin, FinArray
    Closed-form fins (Incropera & DeWitt Tables 3.4 and 3.5; Bessel solution for the
    annular fin, Kern eq. 16.58) and arrays on a base (section 3.6.5).
solve_fin_fv, PowerLawCoefficient
    A general fin by finite volumes with the engine's 1-D solver, with optional
    temperature-dependent h and radiation (iterated to a stated tolerance).
FinResult, FinTemperatures, FinFVResult, FinArrayResult, FinSizing
    Result records.

Warnings policy: every result carries a ``warnings`` tuple of text (for example a fin of
effectiveness below 1, which reduces the heat rate). Nothing is emitted as a Python warning
unless the caller asks with ``warn=True`` or ``result.emit_warnings()``, so spreadsheet
functions stay quiet and show the text instead. An effectiveness below 2 (common practice
threshold) is an advisory ``notes`` entry, never emitted.

Results support, and do not replace, design by a competent person; fins and finned surfaces
can be hot to the touch: check surface temperatures against the touch limits that apply.

Sources: [source: incropera-6, 3.6, Tables 3.4 and 3.5]; annular fins [source: kern-1950, eq.
16.58].
"""

from ._results import FinArrayResult, FinFVResult, FinResult, FinSizing, FinTemperatures
from .annular import ANNULAR_TIPS, AnnularFin
from .arrays import FinArray
from .fv import PowerLawCoefficient, solve_fin_fv
from .straight import STRAIGHT_PROFILES, STRAIGHT_TIPS, StraightFin

__all__ = [
    "StraightFin",
    "AnnularFin",
    "FinArray",
    "solve_fin_fv",
    "PowerLawCoefficient",
    "FinResult",
    "FinTemperatures",
    "FinFVResult",
    "FinArrayResult",
    "FinSizing",
    "STRAIGHT_TIPS",
    "STRAIGHT_PROFILES",
    "ANNULAR_TIPS",
]
