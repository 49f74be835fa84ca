"""The annual heating energy of a room or building by the degree-day method.

Sources (recalled): [source: degree-days].
"""

from __future__ import annotations

from .. import _validate
from .results import AnnualEnergy

__all__ = ["annual_energy"]


def _temp_text(te) -> str:
    """A design temperature for a provenance line: ``-10 degC`` or ``not stated``."""
    return "not stated" if te is None else f"{te:g} degC"


def annual_energy(subject, h_t, h_v, degree_days, degree_day_base, te) -> AnnualEnergy:
    """Annual heating energy ``Q = 24 H DD / 1000`` [kWh] with its provenance.

    Parameters
    ----------
    subject : str
        The room or building. [-]
    h_t, h_v : float
        Transmission and ventilation heat-loss coefficients. [W/K]
    degree_days : float
        Heating degree-days. [K day]
    degree_day_base : float or None
        Base temperature of the degree-days. [degC]
    te : float or None
        Design external temperature (for the provenance). [degC]

    Returns
    -------
    AnnualEnergy

    References
    ----------
    [source: degree-days].
    """
    dd = _validate.non_negative("degree_days", degree_days, "K day")
    base = None if degree_day_base is None else _validate.finite("degree_day_base",
                                                                  degree_day_base)
    h = h_t + h_v
    energy = 24.0 * h * dd / 1000.0
    base_text = (f"base temperature {base:g} degC (as stated)" if base is not None else
                 "base temperature NOT STATED: the degree-days must be on the base "
                 "appropriate to the building")
    prov = (
        "annual energy: Q = 24 H DD / 1000 (degree-day method) (recalled)",
        f"degree-days {dd:g} K day, {base_text}",
        f"H = H_T + H_V = {h_t:.6g} + {h_v:.6g} W/K, adjustment factors at the design "
        f"external temperature {_temp_text(te)}; heating-up allowance not included; gains not "
        "deducted (allow for them through the base temperature)",
    )
    return AnnualEnergy(subject=subject, heat_loss_coefficient=h, transmission_coefficient=h_t,
                        ventilation_coefficient=h_v, degree_days=dd, degree_day_base=base,
                        energy=energy, provenance=prov)
