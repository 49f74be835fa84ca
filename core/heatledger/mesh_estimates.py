"""Mesh estimates of finite-volume results: the observed order from three meshes with a
safety factor, Richardson extrapolation from two, and a proven exact case with its reason.

Sources: [source: roache-1998].
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

__all__ = ["MeshEstimate", "exact_estimate", "three_mesh_estimate", "richardson_estimate",
           "SAFETY_FACTOR", "ORDER_RANGE", "ROUNDING_ULPS", "REFINE_BELOW"]

#: Relative energy imbalance above which ``refine="auto"`` refines the solution (an order
#: below the 1e-9 the project promises for every result).
REFINE_BELOW = 1e-10


@dataclass(frozen=True)
class MeshEstimate:
    """Mesh estimate of a quantity: how far the reported value may be from the mesh-converged
    one, and on what evidence.

    Attributes
    ----------
    quantity : str
        What was estimated (for example ``"heat_flux"``).
    coarse, fine : float
        The reported value (on the mesh used) and the value on the finest mesh of the
        estimate (equal when the scheme is exact for the case).
    ratio : float
        Cell-size ratio between successive meshes (2 = every cell halved).
    order : float
        Order of convergence used: observed from three meshes, or NaN where none applies
        (exact case, or meshes outside the asymptotic range).
    extrapolated : float
        Richardson extrapolation to zero cell size with ``order`` (the reported value where
        the scheme is exact).
    error_estimate : float
        Bound on the error of the reported value, same unit as the quantity (see ``basis``).
    meshes : tuple of int
        Cells of each mesh solved, coarse to fine (empty where exactness is proven).
    values : tuple of float
        The quantity on each of ``meshes``.
    basis : str
        The evidence, in words: ``"observed order from three meshes"``, ``"exact for this
        case: ..."`` with the reason, ``"converged: ..."`` where the meshes agree to the
        solver's precision, or why a conservative bound was taken.

    References
    ----------
    [source: roache-1998].
    """

    quantity: str
    coarse: float
    fine: float
    ratio: float
    order: float
    extrapolated: float
    error_estimate: float
    meshes: tuple = ()
    values: tuple = ()
    basis: str = "assumed order"

    @property
    def exact(self) -> bool:
        """True where the scheme is exact for the case (proven), or the meshes agree to the
        solver's precision ("converged")."""
        return self.basis.startswith(("exact", "converged"))


#: Safety factor on a Richardson error estimate with an observed order (the grid convergence
#: index of P. J. Roache, 1998, section 5.9: 1.25 for three or more meshes).
SAFETY_FACTOR = 1.25


#: Observed orders outside this range mean the meshes are not in the asymptotic range. [-]
ORDER_RANGE = (0.5, 4.0)


#: Differences between meshes below this many units of the last place of the quantity (or 4
#: per cell of the finest mesh, if more, and at least REFINE_BELOW relative) are the
#: solver's rounding, not discretisation error.
ROUNDING_ULPS = 64.0


def exact_estimate(quantity: str, value: float, reason: str) -> MeshEstimate:
    """A mesh estimate for a case the scheme solves exactly, with the reason.

    Parameters
    ----------
    quantity : str
        Name of the quantity (for the record). [-]
    value : float
        The reported value. [unit of the quantity]
    reason : str
        Why the scheme is exact here (printed on the sheets). [-]

    Returns
    -------
    MeshEstimate

    References
    ----------
    [source: roache-1998].
    """
    v = float(value)
    return MeshEstimate(quantity, v, v, 2.0, math.nan, v, 0.0, (), (),
                        f"exact for this case: {reason}")


def three_mesh_estimate(quantity: str, meshes, values, *, reported: int = 0,
                        ratio: float = 2.0) -> MeshEstimate:
    """Mesh estimate from three meshes refined by ``ratio``, with the observed order.

    Parameters
    ----------
    quantity : str
        Name of the quantity (for the record). [-]
    meshes : sequence of int
        Cells of the three meshes, coarse to fine. [-]
    values : sequence of float
        The quantity on each mesh. [unit of the quantity]
    reported : int
        Index in ``meshes`` of the mesh whose value is reported. [-]
    ratio : float
        Cell-size ratio between successive meshes. [-]

    Returns
    -------
    MeshEstimate

    Notes
    -----
    With ``phi_1, phi_2, phi_3`` coarse to fine, the observed order is
    ``p = ln((phi_1 - phi_2)/(phi_2 - phi_3)) / ln r``; the extrapolated value
    ``phi_3 + (phi_3 - phi_2)/(r**p - 1)`` and the error bound of the reported value
    ``F_s |extrapolated - phi_reported|`` with ``F_s = 1.25`` (Roache 1998, eqs. 5.4.1 and
    5.10.6.1). Where both differences are at rounding level the scheme is exact for the case;
    where ``p`` is outside 0.5..4 or the differences change sign, the meshes are not in the
    asymptotic range and the bound is three times the largest difference.

    Examples
    --------
    >>> est = three_mesh_estimate("q", (4, 8, 16), (1.16, 1.04, 1.01))
    >>> round(est.order, 6), round(est.extrapolated, 6)
    (2.0, 1.0)

    References
    ----------
    [source: roache-1998].
    """
    f1, f2, f3 = (float(v) for v in values)
    d12, d23 = f1 - f2, f2 - f3
    rep = (f1, f2, f3)[reported]
    # the solver's own precision: rounding, grown with the number of cells, up to the
    # relative imbalance at which refinement stops (REFINE_BELOW)
    ulps = max(ROUNDING_ULPS, 4.0 * max((int(m) for m in meshes), default=0))
    rel = max(ulps * np.finfo(float).eps, REFINE_BELOW)
    tiny = rel * max(abs(f1), abs(f2), abs(f3), 1e-300)
    mesh = tuple(int(m) for m in meshes)
    if abs(d12) <= tiny and abs(d23) <= tiny:
        return MeshEstimate(quantity, rep, f3, ratio, math.nan, rep, max(abs(d12), abs(d23),
                                                                       tiny / ulps),
                            mesh, (f1, f2, f3),
                            f"converged: the three meshes agree to the solver's precision "
                            f"({rel:.0e} relative)")
    if d12 * d23 > 0.0:
        order = math.log(d12 / d23) / math.log(ratio)
        if ORDER_RANGE[0] <= order <= ORDER_RANGE[1]:
            extrap = f3 + (f3 - f2) / (ratio**order - 1.0)
            return MeshEstimate(quantity, rep, f3, ratio, order, extrap,
                                SAFETY_FACTOR * abs(extrap - rep), mesh, (f1, f2, f3),
                                "observed order from three meshes")
    bound = 3.0 * max(abs(d12), abs(d23))
    return MeshEstimate(quantity, rep, f3, ratio, math.nan, f3, bound, mesh, (f1, f2, f3),
                        "meshes outside the asymptotic range (no steady order): three times "
                        "the largest change between meshes")


def richardson_estimate(quantity: str, coarse: float, fine: float, *, ratio: float = 2.0,
                        order: float = 2.0) -> MeshEstimate:
    """Richardson extrapolation from a coarse and a refined solution.

    Parameters
    ----------
    quantity : str
        Name of the quantity (for the record). [-]
    coarse, fine : float
        The quantity on the mesh used and on the refined mesh. [unit of the quantity]
    ratio : float
        Refinement ratio of cell size. [-]
    order : float
        Order of accuracy of the method. [-]

    Returns
    -------
    MeshEstimate

    Notes
    -----
    ``phi_exact ~ phi_fine + (phi_fine - phi_coarse) / (r**p - 1)``
    (L. F. Richardson, Phil. Trans. R. Soc. A 210 (1911); P. J. Roache, *Verification and
    Validation in Computational Science and Engineering*, 1998, eq. 5.4.1).

    Examples
    --------
    >>> richardson_estimate("q", 1.0, 1.0).error_estimate
    0.0

    References
    ----------
    [source: roache-1998].
    """
    extrap = fine + (fine - coarse) / (ratio**order - 1.0)
    return MeshEstimate(quantity, float(coarse), float(fine), float(ratio), float(order),
                        float(extrap), float(abs(extrap - coarse)))
