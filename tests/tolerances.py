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
#: Half the last digit of a value printed to two decimals, in the value's own unit (0.34
#: W h/(m3 K), Rsi 0.13 m2 K/W...).
ATOL_PRINTED_2DP = 0.005
#: Half the last digit of a value printed to one decimal (a radiative coefficient 5.7
#: W/(m2 K)).
ATOL_PRINTED_1DP = 0.05
#: Half a unit of the third decimal of a printed value (tanh(2.65) = 0.99 in the textbook).
ATOL_PRINTED_3DP = 5e-4
#: Linear interpolation in a table against the formula it tabulates: one table step of
#: EN ISO 6946 Table 8 changes R by about 0.01 m2 K/W. [m2 K/W]
ATOL_TABLE_INTERPOLATION = 0.01
#: An approximation against the exact form it approximates (a corrected length, a small-void
#: limit, a hand value to four figures): 0.1 %. 0.1 % of a 10 W fin is 0.01 W.
RTOL_APPROXIMATION = 1e-3
#: Second-order finite volumes at a few hundred cells against the closed form: the error goes
#: as (dx/L)^2, about 1e-5 at 400 cells, and the coefficient of the tip adds a little. [-]
RTOL_MESH = 2e-4
#: A temperature on a few hundred cells against the exact profile (a node half a cell from
#: the point compared). [K]
ATOL_MESH_K = 2e-3
#: The order a mesh study observes against the scheme's formal order (second order: error
#: ratios of 4 within 5 %). [-]
RTOL_ORDER = 0.05
#: scipy.integrate.solve_bvp (tolerance 1e-8, a few hundred nodes) against the slender-fin
#: closed form. 2e-5 of a 10 W fin is 0.2 mW; temperatures to 0.1 mK. [-], [K]
RTOL_BVP = 2e-5
ATOL_BVP_K = 1e-4
#: Richardson extrapolation from three meshes against the exact value: the extrapolated value
#: removes the leading error, what is left is of higher order. [-]
RTOL_EXTRAPOLATED = 1e-6
#: The same on a linear problem, where the scheme's error is purely second order. [-]
RTOL_EXTRAPOLATED_LINEAR = 1e-8
#: The same with finer meshes. [-]
RTOL_EXTRAPOLATED_FINE = 1e-7
#: The extrapolated tip temperature against the boundary-value solution. [K]
ATOL_EXTRAPOLATED_K = 1e-5
#: A limit approached to within 1e-7 of its variable (a basement depth of 0.1 um against the
#: slab, a fin of 10 um against efficiency 1). [-]
RTOL_LIMIT = 1e-5
ATOL_LIMIT = 1e-6
#: Special functions (scipy's Bessel functions) in two algebraically equal forms. [-]
RTOL_SPECIAL_FUNCTIONS = 1e-11
#: Absolute round-off of a linear solve on temperatures of tens of degrees. [K]
ATOL_LINEAR_SOLVE = 1e-10
#: A scheme exact for the case (no source, or a uniform source in equal cells) against the
#: closed form at the nodes: only the linear solve's round-off. [-]
RTOL_EXACT_SCHEME = 1e-11
#: A closed form against the same equation re-typed in the test (another arrangement of the
#: same operations and special functions). [-]
RTOL_RETYPED = 1e-10
#: scipy.integrate.solve_bvp with tol=1e-9 on a fine mesh against the closed form (agreement to
#: about 1e-7 observed); its temperatures to 10 uK. [-], [K]
RTOL_BVP_FINE = 1e-6
ATOL_BVP_FINE_K = 1e-5
#: Finite volumes at 400 cells: second-order error (dx m)^2/12, about 1e-5 for mL ~ 0.6. [-]
RTOL_FV_FINE = 2e-5
#: A required thickness found by Brent's method (stops within 1e-9 m of the root), in mm. [mm]
ATOL_THICKNESS_MM = 1e-5
#: A committed workbook against a fresh generation: numbers to 1e-10 relative (the last bits
#: of another BLAS kernel or summation order), with a 1e-12 floor for round-off-sized values.
RTOL_WORKBOOK = 1e-10
ATOL_WORKBOOK = 1e-12
#: A constant computed from the SI defining constants against CODATA: four ulp. [-]
RTOL_CONSTANTS = 4 * 2.0**-52
#: EN ISO 13788's saturation-pressure equations against the Hyland-Wexler equations of the
#: ASHRAE Handbook (psychrolib): two correlations of the same measurements, which differ by
#: up to 0.2 % between -10 and 60 degC and 0.5 % at -20 degC (the Magnus form's fit range);
#: 0.3 % of 2337 Pa at 20 degC is 7 Pa, far below what a monthly climate carries.
RTOL_SATURATION_CORRELATIONS = {(-10.0, 60.0): 0.003, (-20.0, -10.0): 0.006}
#: Values the standard prints to 0.1 Pa (its Annex E check values, recalled): half the last
#: digit. [Pa]
ATOL_PRINTED_PA = 0.05
#: EN ISO 10211:2017 Annex A, the validation of a 2-D method: temperatures within 0.1 K of the
#: reference values and the heat flow within 0.1 W/m (the standard's own criteria, recalled).
ATOL_ISO10211_K = 0.1
ATOL_ISO10211_W_M = 0.1
#: A Fourier series summed to N and to 2N terms: the terms beyond N are below 1e-12 K at the
#: points compared (they decay as exp(-(2n+1) pi/8) at the point nearest the hot edge). [K]
ATOL_SERIES_K = 1e-12
#: A 2-D layered wall against 1/(Rsi + sum d/lambda + Rse): the scheme is exact for a field
#: linear in each layer, what is left is the sparse solve's round-off. [-]
RTOL_2D_EXACT = 1e-11
#: The observed order of a second-order scheme on a smooth 2-D case, three grids: within 0.2
#: of 2 (the next error terms still show at a few thousand cells). [-]
ATOL_ORDER_2D = 0.2
