"""Tolerances of the tests, named in one place, each justified in physical units.

A test compares a result with something outside the project (a table, a worked example, a
closed form, a reference library) or with the same quantity computed another way. The
tolerance says how far apart the two may be and why; in physical units, for the typical
magnitudes of the project (heat rates of 1 to 1000 W, fluxes of 1 to 100 W/m2, resistances
of 0.1 to 10 m2 K/W, temperatures of -20 to 100 degC).
"""

from __future__ import annotations

#: The same operations, perhaps in another order: a few units in the last place of a double
#: (2.2e-16 each). 1e-15 of a 100 W heat rate is 1e-13 W.
RTOL_ULP = 1e-15
#: The same equations by another route (a vectorised and a scalar path, a sum in another
#: order, a closed form rearranged): a few hundred ulp. 1e-13 of 10 m2 K/W is 1e-12 m2 K/W.
RTOL_LAST_BITS = 1e-13
#: A closed form against an independent evaluation of the same mathematics (special
#: functions, a hand-derived solution): double precision keeps about 16 digits, the special
#: functions and cancellations cost up to four. 1e-12 of a 100 W heat rate is 1e-10 W.
RTOL_ROUND_OFF = 1e-12
#: Absolute round-off of quantities that should be zero or are near it (temperatures,
#: fluxes). [K or W/m2]
ATOL_ROUND_OFF = 1e-12
#: A direct linear solve against another solver of the same system: round-off grows with
#: the condition number (a million cells, resistance ratios of 1e4). 1e-10 of 20 K is 2 nK.
RTOL_LINEAR_SOLVE = 1e-10
#: An iteration stopped at its own tolerance (Brent's method for a thickness, Newton for
#: h(T) fins) or a balance summed over a million cells. 1e-9 of a 100 W heat rate is 0.1 uW,
#: of a 200 mm insulation thickness 0.2 nm.
RTOL_ITERATION = 1e-9
#: Absolute tolerance of the same kind for temperatures and heat flows near zero. [K, W]
ATOL_ITERATION = 1e-9
#: A spreadsheet's recalculation against the engine (the sheets' own check tolerance):
#: LibreOffice's functions agree with the engine to 1e-10 or better, except BESSELK (about
#: 1e-7, which the sheets replace by an integral). 1e-9 of 0.2 W/(m2 K) is 2e-10 W/(m2 K).
RTOL_SHEET = 1e-9
#: A published table printed to two decimals (EN ISO 6946 Tables 7 and 8: 0.01 m2 K/W):
#: half its last digit. [m2 K/W]
ATOL_TABLE_M2K_W = 0.005
#: A hand calculation carried to four or five significant figures. [-]
RTOL_HAND = 1e-4
