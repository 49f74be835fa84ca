"""Exponentially scaled modified Bessel functions, loaded from scipy.special on first use.

``scipy.special`` costs about 0.05-0.1 s to import; the fin modules call these thin wrappers so
that ``import heatledger`` does not pay for it until a fin with a Bessel solution is evaluated.
"""

from __future__ import annotations


def ive(order, x):
    """``I_v(x) exp(-|x|)``, :func:`scipy.special.ive`.

    Parameters
    ----------
    order : float
        Order v of the function. [-]
    x : float or array_like
        Argument. [-]
    """
    from scipy.special import ive as scaled_i

    return scaled_i(order, x)


def kve(order, x):
    """``K_v(x) exp(x)``, :func:`scipy.special.kve`.

    Parameters
    ----------
    order : float
        Order v of the function. [-]
    x : float or array_like
        Argument. [-]
    """
    from scipy.special import kve as scaled_k

    return scaled_k(order, x)
