"""A general tridiagonal solve by LAPACK ``?gtsv`` (the finite-volume sheets' Thomas
algorithm is checked against it).

Sources: [source: lapack, ?gtsv].
"""

from __future__ import annotations

import numpy as np
from scipy.linalg import lapack

from .errors import HeatLedgerError

__all__ = ["solve_tridiagonal"]

_GTSV = lapack.get_lapack_funcs("gtsv", dtype=np.float64)


def solve_tridiagonal(sub_diagonal, main_diagonal, super_diagonal, rhs) -> np.ndarray:
    """Solve a tridiagonal system in O(N) with LAPACK ``?gtsv``.

    Parameters
    ----------
    sub_diagonal : array_like
        Sub-diagonal, ``N - 1`` values (row i+1, column i). [-]
    main_diagonal : array_like
        Main diagonal, ``N`` values. [-]
    super_diagonal : array_like
        Super-diagonal, ``N - 1`` values (row i, column i+1). [-]
    rhs : array_like
        Right-hand side, ``N`` values. [-]

    Returns
    -------
    ndarray
        The solution vector.

    Examples
    --------
    >>> solve_tridiagonal([-1.0], [2.0, 2.0], [-1.0], [1.0, 1.0])
    array([1., 1.])

    References
    ----------
    [source: lapack, ?gtsv].
    """
    d = np.array(main_diagonal, dtype=float)
    if d.size == 1:
        return np.asarray(rhs, dtype=float) / d
    return _gtsv(np.array(sub_diagonal, dtype=float), d, np.array(super_diagonal, dtype=float),
                 np.array(rhs, dtype=float))


def _gtsv(dl, d, du, b) -> np.ndarray:
    """LAPACK ?gtsv on arrays it may overwrite."""
    _, _, _, x, info = _GTSV(dl, d, du, b, overwrite_dl=1, overwrite_d=1, overwrite_du=1,
                             overwrite_b=1)
    if info != 0:
        raise HeatLedgerError(f"the finite-volume system is singular (LAPACK gtsv info={info})")
    return x
