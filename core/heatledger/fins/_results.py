"""Result records of the fins engine (plain dataclasses, no logic beyond small helpers).

Every result keeps its inputs, the method that ran (for the audit trail), the coefficients a
sheet needs to rebuild the numbers as live formulas, and a ``warnings`` tuple of plain text.
Warnings are *not* emitted as Python warnings unless the caller asks (``warn=True`` or
:meth:`FinResult.emit_warnings`), so spreadsheet functions stay quiet and can show the text in
a cell instead.
"""

from __future__ import annotations

import warnings as _warnings
from dataclasses import dataclass, field

import numpy as np

from ..errors import HeatLedgerWarning
from ..fv1d import FVSolution, MeshEstimate

__all__ = ["FinResult", "FinTemperatures", "FinFVResult", "FinArrayResult", "FinSizing"]

#: Effectiveness below which a fin reduces the heat rate (physics: the fin insulates the base).
EFFECTIVENESS_HARMFUL = 1.0
#: Effectiveness below which fins are rarely justified.
#: common practice, no published source beyond the textbook remark (Incropera & DeWitt 6th ed.,
#: section 3.6.4, "rarely justified unless effectiveness >= 2", recalled).
EFFECTIVENESS_WORTHWHILE = 2.0


def emit(messages) -> None:
    """Emit each message as a :class:`~heatledger.errors.HeatLedgerWarning`.

    Parameters
    ----------
    messages : iterable of str
        Warning texts, as kept in a result's ``warnings`` tuple. [-]
    """
    for text in messages:
        _warnings.warn(text, HeatLedgerWarning, stacklevel=3)


def effectiveness_messages(effectiveness: float) -> tuple[tuple[str, ...], tuple[str, ...]]:
    """Return (warnings, notes) for a fin effectiveness value."""
    if not np.isfinite(effectiveness):
        return (), ()
    if effectiveness < EFFECTIVENESS_HARMFUL:
        return (
            f"fin effectiveness is {effectiveness:.3g} (< 1): the fin reduces the heat rate "
            "of the base it covers; a fin does not help here",
        ), ()
    if effectiveness < EFFECTIVENESS_WORTHWHILE:
        return (), (
            f"fin effectiveness is {effectiveness:.3g} (< 2): fins are rarely worthwhile below "
            "an effectiveness of about 2 (common practice)",
        )
    return (), ()


@dataclass(frozen=True)
class FinResult:
    """Closed-form result for one fin at given base and ambient temperatures.

    Attributes
    ----------
    heat_rate : float
        Heat rate leaving the base into the fin, ``q_f``. [W]
    efficiency : float
        Fin efficiency ``eta_f``. [-]
    effectiveness : float
        Fin effectiveness ``epsilon_f = q_f / (h A_c,b theta_b)``. [-]
    fin_resistance : float
        Fin thermal resistance ``R_t,f = theta_b / q_f`` (``inf`` when ``theta_b = 0``). [K/W]
    temp_tip : float
        Temperature at the fin tip (outer radius for annular fins). [degC]
    temp_base, temp_fluid : float
        Inputs. [degC]
    m : float
        Fin parameter. [1/m]
    fin_area : float
        Heat-transfer area of the fin ``A_f`` used in the efficiency. [m2]
    cross_section_area : float
        Conduction area at the base ``A_c,b``. [m2]
    method : str
        What ran (equation and table), for the audit trail.
    coefficients : dict
        Intermediate quantities (``mL``, ``M``, ``h/(mk)``, corrected length...) for sheet
        formulas.
    inputs : dict
        The fin's inputs.
    warnings : tuple of str
        Reasons to doubt the result (for example effectiveness < 1).
    notes : tuple of str
        Advisory remarks (for example effectiveness < 2).
    references : tuple of str
        Textbook equations used.
    """

    heat_rate: float
    efficiency: float
    effectiveness: float
    fin_resistance: float
    temp_tip: float
    temp_base: float
    temp_fluid: float
    m: float
    fin_area: float
    cross_section_area: float
    method: str
    coefficients: dict = field(default_factory=dict)
    inputs: dict = field(default_factory=dict)
    warnings: tuple = ()
    notes: tuple = ()
    references: tuple = ()

    def emit_warnings(self) -> None:
        """Emit ``warnings`` as :class:`~heatledger.errors.HeatLedgerWarning` (quiet otherwise)."""
        emit(self.warnings)


@dataclass(frozen=True)
class FinTemperatures:
    """Temperature along a fin.

    Attributes
    ----------
    x : ndarray
        Distance from the base (straight fins) or radius (annular fins). [m]
    temperature : ndarray
        Temperature at ``x``. [degC]
    temp_tip : float
        Temperature at the tip / outer radius. [degC]
    heat_rate : float
        Heat rate into the fin at the base by the same method. [W]
    method : str
        ``"closed form: ..."`` or ``"finite volume: ..."``.
    fv : FinFVResult or None
        The finite-volume result when finite volumes ran (energy residual, mesh estimate,
        coefficients).
    warnings : tuple of str
        Warnings of the fin.
    """

    x: np.ndarray
    temperature: np.ndarray
    temp_tip: float
    heat_rate: float
    method: str
    fv: FinFVResult | None = None
    warnings: tuple = ()


@dataclass(frozen=True)
class FinFVResult:
    """Finite-volume solution of a general fin (:func:`heatledger.fins.solve_fin_fv`).

    Attributes
    ----------
    x : ndarray
        Base face, cell centres and tip face, measured from the base plus ``x_offset`` (the
        radius for annular fins). [m]
    temperature : ndarray
        Temperatures at ``x`` (face temperatures at both ends). [degC]
    heat_rate : float
        Heat rate entering the fin at the base. [W]
    heat_loss_surface : float
        Heat lost from the lateral surface, evaluated with the non-linear laws at the final
        temperatures. [W]
    heat_loss_tip : float
        Heat leaving through the tip face (convection and radiation from a convective tip,
        conduction for a prescribed or infinite tip, 0 for an adiabatic tip). [W]
    temp_tip : float
        Tip face temperature. [degC]
    efficiency : float
        Heat lost / heat that the same surface would lose at the base temperature
        everywhere (lateral surface only for tip ``"temperature"``/``"infinite"``). [-]
    effectiveness : float
        ``q_f / (q''_base-surface A_c,b)``: heat rate over what the bare base area would lose
        at the base temperature. [-]
    energy_residual : float
        ``(heat_rate - heat_loss_surface - heat_loss_tip) / heat_rate``. [-]
    linear_residual : float
        Energy residual of the last linear solve as reported by the 1-D solver. [-]
    mesh_estimate : MeshEstimate or None
        Heat rate on this mesh and on two more (see ``mesh_estimate`` of
        :func:`solve_fin_fv`), with the observed order.
    mesh_estimate_tip : MeshEstimate or None
        The same for the tip temperature.
    iterations : int
        Linear solves used by the non-linear iteration on this mesh (1 for a linear problem;
        from 4096 cells with a mesh estimate the iteration starts from the solution on the
        coarser mesh, so it may need only one or two).
    converged_change : float
        Largest temperature change in the last iteration. [K]
    solution : FVSolution
        The last linear solve (coefficients ``a_W``, ``a_E``, ``a_P``, ``b`` for the sheet).
    settings : dict
        Provenance: cells, tip condition, laws for h and radiation, linearisation,
        tolerance, iteration limit.
    warnings : tuple of str
    notes : tuple of str
    """

    x: np.ndarray
    temperature: np.ndarray
    heat_rate: float
    heat_loss_surface: float
    heat_loss_tip: float
    temp_tip: float
    efficiency: float
    effectiveness: float
    energy_residual: float
    linear_residual: float
    mesh_estimate: MeshEstimate | None
    mesh_estimate_tip: MeshEstimate | None
    iterations: int
    converged_change: float
    solution: FVSolution
    settings: dict = field(default_factory=dict)
    warnings: tuple = ()
    notes: tuple = ()

    def emit_warnings(self) -> None:
        """Emit ``warnings`` as :class:`~heatledger.errors.HeatLedgerWarning` (quiet otherwise)."""
        emit(self.warnings)


@dataclass(frozen=True)
class FinArrayResult:
    """Result for an array of fins on a base (Incropera & DeWitt section 3.6.5).

    Attributes
    ----------
    heat_rate : float
        Total heat rate from fins and exposed base ``q_t``. [W]
    overall_efficiency : float
        Overall surface efficiency ``eta_o`` (with the contact correction if any). [-]
    fin_resistance : float
        Overall thermal resistance ``R_t,o = 1/(eta_o h A_t)``. [K/W]
    total_area : float
        ``A_t = N A_f + A_b``. [m2]
    exposed_base_area : float
        ``A_b`` = base area minus the fin roots. [m2]
    fin_efficiency : float
        Efficiency of one fin. [-]
    fin_heat_rate : float
        Heat rate of one fin (with the contact correction if any). [W]
    count : int
    contact_factor : float
        ``C_1 = 1 + eta_f h A_f R''_t,c / A_c,b`` (1 without contact resistance). [-]
    method : str
    coefficients : dict
    inputs : dict
    warnings : tuple of str
    notes : tuple of str
    """

    heat_rate: float
    overall_efficiency: float
    fin_resistance: float
    total_area: float
    exposed_base_area: float
    fin_efficiency: float
    fin_heat_rate: float
    count: int
    contact_factor: float
    method: str
    coefficients: dict = field(default_factory=dict)
    inputs: dict = field(default_factory=dict)
    warnings: tuple = ()
    notes: tuple = ()

    def emit_warnings(self) -> None:
        """Emit ``warnings`` as :class:`~heatledger.errors.HeatLedgerWarning` (quiet otherwise)."""
        emit(self.warnings)


@dataclass(frozen=True)
class FinSizing:
    """Answer of an inverse solve (fin length or fin count for a target heat rate).

    Attributes
    ----------
    quantity : str
        ``"length"`` (straight fin length; annular: ``outer_radius - inner_radius``) or
        ``"count"``.
    value : float
        The length [m] or the count (an integer stored as float) that meets the target.
    target_heat_rate : float
        Requested heat rate. [W]
    heat_rate : float
        Heat rate of the sized array (>= target for a count, = target for a length). [W]
    array : FinArray
        The sized array.
    continuous_value : float
        The root before rounding up to a whole number of fins (equals ``value`` for a
        length).
    bracket : tuple of float
        Interval searched by the root finder.
    iterations : int
        Iterations used by :func:`scipy.optimize.brentq`.
    tolerance : float
        Absolute tolerance on the root (``xtol``). [m or -]
    method : str
    notes : tuple of str
    """

    quantity: str
    value: float
    target_heat_rate: float
    heat_rate: float
    array: object
    continuous_value: float
    bracket: tuple
    iterations: int
    tolerance: float
    method: str
    notes: tuple = ()
