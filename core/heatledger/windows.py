"""Thermal transmittance of windows and doors (EN ISO 10077-1).

The whole-window U-value is the area-weighted mean of the glazing and frame U-values plus the
extra heat flow through the glazing edge (spacer), expressed as a linear thermal transmittance
``psi_g`` times the visible glazing perimeter; opaque infill panels add their own area and edge
terms. A declared whole-window U-value (for example from a product declaration) is the
alternative, and is recorded as such.

Results keep full precision. Rounding to two significant figures for a report is a separate
step (:func:`heatledger.constructions.round_significant`).

References
----------
EN ISO 10077-1:2017, *Thermal performance of windows, doors and shutters -- Calculation of
thermal transmittance -- Part 1: General*, clause 6 (whole-window U-value) [M: clause and
equation numbers recalled, check against the purchased text]; Annex G (default psi_g; Tables
E.1 and E.2 of the 2006 edition) (recalled).

Sources: [source: iso10077-1, clause 6, Annex G].
"""

from __future__ import annotations

import csv
import io
from dataclasses import dataclass, field
from importlib import resources

import numpy as np

from . import _validate
from ._arrays import check_perimeter as _check_perimeter
from ._arrays import finite_array as _finite_array
from ._arrays import non_negative_array as _non_negative_array
from ._arrays import out as _out
from ._arrays import perimeter_bound as _perimeter_bound
from ._arrays import pick as _pick
from .errors import HeatLedgerError

__all__ = [
    "window",
    "WindowResult",
    "DeclaredWindow",
    "declared_window",
    "window_with_shutter_u",
    "psi_glazing_default",
    "psi_glazing_table",
    "PsiGlazingRow",
    "perimeter_lower_bound",
    "PERIMETER_SHAPES",
    "WINDOW_AREA_RTOL",
]

#: Shapes accepted by :func:`perimeter_lower_bound`: ``"rectilinear"`` (every corner a right
#: angle; the square is the shortest such outline, P >= 4 sqrt(A)) and ``"any"`` (isoperimetric
#: inequality, the circle, P >= 2 sqrt(pi A)).
PERIMETER_SHAPES = ("rectilinear", "any")

#: Relative tolerance between the sum of glazing, frame and panel areas and a stated overall
#: window area. Drawing areas are usually given to three significant figures, so 0.5 % allows
#: for their rounding and no more.
WINDOW_AREA_RTOL = 0.005

_PSI_TABLE_FILE = "psi_glazing_defaults.csv"


# ----------------------------------------------------------------------------- public API


@dataclass(frozen=True)
class WindowResult:
    """Every step of a whole-window U-value (EN ISO 10077-1), as returned by :func:`window`.

    The object can stand as the U-value of a room element: it has ``u_value`` and ``area``.

    Parameters
    ----------
    glazing_area, frame_area, panel_area : float or ndarray
        Visible glazing, projected frame and opaque panel areas. [m2]
    glazing_u, frame_u, panel_u : float or ndarray
        U-values of glazing, frame and panels. [W/(m2 K)]
    glazing_perimeter, panel_perimeter : float or ndarray
        Visible perimeters of glazing and panels. [m]
    psi_glazing, psi_panel : float or ndarray
        Linear thermal transmittances of the glazing and panel edges. [W/(m K)]
    area : float or ndarray
        Total window area ``A_w = A_g + A_f + A_p``. [m2]
    glazing_term, frame_term, glazing_edge_term, panel_term, panel_edge_term : float or ndarray
        The terms of the numerator ``A_g U_g``, ``A_f U_f``, ``l_g psi_g``, ``A_p U_p``,
        ``l_p psi_p``. [W/K]
    heat_loss_coefficient : float or ndarray
        Their sum, ``U_w A_w``. [W/K]
    frame_fraction : float or ndarray
        ``A_f / A_w``. [-]
    u_value : float or ndarray
        Whole-window thermal transmittance ``U_w``, unrounded. [W/(m2 K)]
    method : str
        What ran, for the audit trail. [-]
    warnings : tuple of str
        Input that is probably a slip: a frame area larger than the glazing area, or a
        U-value above 7 W/(m2 K). [-]
    """

    glazing_area: float
    frame_area: float
    panel_area: float
    glazing_u: float
    frame_u: float
    panel_u: float
    glazing_perimeter: float
    panel_perimeter: float
    psi_glazing: float
    psi_panel: float
    area: float
    glazing_term: float
    frame_term: float
    glazing_edge_term: float
    panel_term: float
    panel_edge_term: float
    heat_loss_coefficient: float
    frame_fraction: float
    u_value: float
    method: str = ("EN ISO 10077-1:2017 clause 6, whole window from glazing, frame and edge "
                   "(recalled)")
    warnings: tuple = ()


def window(
    glazing_area,
    frame_area,
    glazing_u,
    frame_u,
    glazing_perimeter,
    psi_glazing,
    *,
    panel_area=0.0,
    panel_u=0.0,
    panel_perimeter=0.0,
    psi_panel=0.0,
    window_area=None,
    glazing_shape: str = "rectilinear",
) -> WindowResult:
    """Whole-window U-value with every intermediate value, EN ISO 10077-1.

    Parameters
    ----------
    glazing_area : float or array_like
        Visible glazing area ``A_g`` (sum over all panes). [m2]
    frame_area : float or array_like
        Projected frame area ``A_f`` (the larger of the inside and outside projections). [m2]
    glazing_u : float or array_like
        Centre-of-glazing thermal transmittance ``U_g``. [W/(m2 K)]
    frame_u : float or array_like
        Frame thermal transmittance ``U_f``. [W/(m2 K)]
    glazing_perimeter : float or array_like
        Visible perimeter of the glazing ``l_g`` (sum over all panes). [m]
    psi_glazing : float or array_like
        Linear thermal transmittance of the glazing edge (spacer and frame junction) ``psi_g``;
        see :func:`psi_glazing_default`. [W/(m K)]
    panel_area : float or array_like, optional
        Visible area of opaque infill panels ``A_p``. [m2]
    panel_u : float or array_like, optional
        Thermal transmittance of the opaque panels ``U_p``. [W/(m2 K)]
    panel_perimeter : float or array_like, optional
        Visible perimeter of the opaque panels ``l_p``. [m]
    psi_panel : float or array_like, optional
        Linear thermal transmittance of the panel edge ``psi_p``. [W/(m K)]
    window_area : float or array_like, optional
        Overall window area, if known, to check the parts against: the frame area must not
        exceed it and ``A_g + A_f + A_p`` must equal it within :data:`WINDOW_AREA_RTOL`. [m2]
    glazing_shape : str, optional
        ``"rectilinear"`` (default; panes with right-angled corners need
        ``l_g >= 4 sqrt(A_g)``) or ``"any"`` (any outline, ``l_g >= 2 sqrt(pi A_g)``). [-]

    Returns
    -------
    WindowResult
        Areas, terms, frame fraction and ``u_value``. [-]

    Raises
    ------
    HeatLedgerError
        For negative or non-finite inputs, a zero total area, a frame area larger than the
        stated window area, parts that do not add up to it, or a glazing perimeter too short
        to bound the glazing area.

    Notes
    -----
    .. math::

        U_w = \\frac{\\sum A_g U_g + \\sum A_f U_f + \\sum l_g \\psi_g
                     + \\sum A_p U_p + \\sum l_p \\psi_p}{\\sum A_g + \\sum A_f + \\sum A_p}

    to two significant figures (:func:`heatledger.constructions.round_significant`).

    References
    ----------
    EN ISO 10077-1:2017, clause 6, whole-window equation with opaque panels [M: recalled].
    [source: iso10077-1, clause 6].

    Examples
    --------
    >>> round(window(1.2, 0.4, 1.1, 1.4, 4.6, 0.08).u_value, 3)
    1.405
    """
    shape = _validate.choice("glazing_shape", glazing_shape, PERIMETER_SHAPES)
    ag = _area_array("glazing_area", glazing_area)
    af = _area_array("frame_area", frame_area)
    ap = _area_array("panel_area", panel_area)
    ug = _non_negative_array("glazing_u", glazing_u, "W/(m2 K)")
    uf = _non_negative_array("frame_u", frame_u, "W/(m2 K)")
    up = _non_negative_array("panel_u", panel_u, "W/(m2 K)")
    lg = _non_negative_array("glazing_perimeter", glazing_perimeter, "m")
    lp = _non_negative_array("panel_perimeter", panel_perimeter, "m")
    psig = _finite_array("psi_glazing", psi_glazing)
    psip = _finite_array("psi_panel", psi_panel)

    total = ag + af + ap
    if np.any(total <= 0.0):
        raise HeatLedgerError(
            "glazing_area + frame_area + panel_area must be greater than zero; got 0 m2"
        )
    _check_perimeter("glazing_perimeter", lg, "glazing_area", ag, shape)
    _check_perimeter("panel_perimeter", lp, "panel_area", ap, shape)
    if window_area is not None:
        _check_window_area(window_area, af, total)

    t_g = ag * ug
    t_f = af * uf
    t_lg = lg * psig
    t_p = ap * up
    t_lp = lp * psip
    h = t_g + t_f + t_lg + t_p + t_lp
    uw = h / total
    return WindowResult(
        glazing_area=_out(ag),
        frame_area=_out(af),
        panel_area=_out(ap),
        glazing_u=_out(ug),
        frame_u=_out(uf),
        panel_u=_out(up),
        glazing_perimeter=_out(lg),
        panel_perimeter=_out(lp),
        psi_glazing=_out(psig),
        psi_panel=_out(psip),
        area=_out(total),
        glazing_term=_out(t_g),
        frame_term=_out(t_f),
        glazing_edge_term=_out(t_lg),
        panel_term=_out(t_p),
        panel_edge_term=_out(t_lp),
        heat_loss_coefficient=_out(h),
        frame_fraction=_out(af / total),
        u_value=_out(uw),
        warnings=_window_warnings(ag, af, uw),
    )


def _check_window_area(window_area, af, total) -> None:
    """Refuse a frame larger than the stated window area, or parts that do not add up to it
    within :data:`WINDOW_AREA_RTOL`."""
    aw = _area_array("window_area", window_area)
    too_big = af > aw
    if np.any(too_big):
        i = int(np.argmax(np.broadcast_to(too_big, np.broadcast(af, aw).shape).ravel()))
        af, aw = np.broadcast_arrays(af, aw)
        raise HeatLedgerError(
            f"frame_area must not be larger than the window area; got frame_area "
            f"{_pick(af, i):g} m2 > window_area {_pick(aw, i):g} m2"
        )
    mismatch = np.abs(total - aw) > WINDOW_AREA_RTOL * aw
    if np.any(mismatch):
        i = int(np.argmax(np.broadcast_to(mismatch, np.broadcast(total, aw).shape).ravel()))
        total, aw = np.broadcast_arrays(total, aw)
        raise HeatLedgerError(
            "glazing_area + frame_area + panel_area must equal window_area within "
            f"{WINDOW_AREA_RTOL:.1%}; got {_pick(total, i):g} m2 against {_pick(aw, i):g} m2"
        )


@dataclass(frozen=True)
class DeclaredWindow:
    """A whole-window (or door) U-value taken as declared, not calculated.

    Parameters
    ----------
    u_value : float
        Declared whole-window thermal transmittance ``U_w``. [W/(m2 K)]
    source : str
        Where the value comes from (product declaration, test report). [-]
    area : float or None
        Overall window area the declaration refers to, if stated. [m2]
    method : str
        Recorded method text. [-]
    warnings : tuple of str
        Input that is probably a slip (a U-value above 7 W/(m2 K)). [-]
    """

    u_value: float
    source: str
    area: float | None = None
    method: str = field(default="declared whole-window U-value (not calculated here)")
    warnings: tuple = ()


def declared_window(u_value, *, source: str, area=None) -> DeclaredWindow:
    """A declared whole-window U-value, the alternative to :func:`window`.

    Parameters
    ----------
    u_value : float
        Declared whole-window thermal transmittance. [W/(m2 K)]
    source : str
        Where the declared value comes from; must not be empty. [-]
    area : float, optional
        Overall window area the declaration refers to. [m2]

    Returns
    -------
    DeclaredWindow
        Object with ``u_value`` for use as a room element's U-value. [-]

    Raises
    ------
    HeatLedgerError
        For a non-positive U-value, a negative area or an empty source.

    Notes
    -----
    No equation: the value is used as given, and the audit trail says so.

    References
    ----------
    EN ISO 10077-1:2017, scope (declared values of products may replace the calculation) (recalled).
    [source: iso10077-1, scope].
    """
    u = _validate.positive("u_value", u_value, "W/(m2 K)")
    if not isinstance(source, str) or not source.strip():
        raise HeatLedgerError(
            "source of a declared window U-value must be a non-empty text naming the "
            f"declaration; got {_validate.show(source)}"
        )
    a = None if area is None else _validate.within(
        "area", _validate.positive("area", area, "m2"), "area")
    warn = _validate.opening_u_warning("declared", u)
    return DeclaredWindow(u_value=u, source=source.strip(), area=a,
                          warnings=(warn,) if warn else ())


def window_with_shutter_u(window_u_value, shutter_resistance):
    """U-value of a window with a closed shutter, EN ISO 10077-1.

    Parameters
    ----------
    window_u_value : float or array_like
        Whole-window U-value without the shutter ``U_w``. [W/(m2 K)]
    shutter_resistance : float or array_like
        Additional thermal resistance of the shutter and the air space it encloses
        ``Delta R``. [m2 K/W]

    Returns
    -------
    float or ndarray
        ``U_ws``. [W/(m2 K)]

    Raises
    ------
    HeatLedgerError
        For a non-positive U-value or a negative resistance.

    Notes
    -----
    .. math:: U_{ws} = \\frac{1}{1/U_w + \\Delta R}

    References
    ----------
    EN ISO 10077-1:2017, clause 6, window with closed shutter [M: recalled].
    [source: iso10077-1, clause 6].
    """
    uw = _non_negative_array("window_u_value", window_u_value, "W/(m2 K)")
    if np.any(uw <= 0.0):
        raise HeatLedgerError("window_u_value must be greater than zero; got 0 W/(m2 K)")
    dr = _non_negative_array("shutter_resistance", shutter_resistance, "m2 K/W")
    return _out(1.0 / (1.0 / uw + dr))


@dataclass(frozen=True)
class PsiGlazingRow:
    """One row of the default psi_g table.

    Parameters
    ----------
    frame : str
        Frame type key. [-]
    glazing : str
        Glazing type key (``uncoated`` or ``low_e``). [-]
    spacer : str
        Spacer type key (``conventional`` or ``warm_edge``). [-]
    psi_glazing : float
        Linear thermal transmittance of the glazing edge. [W/(m K)]
    source : str
        Source of the value. [-]
    """

    frame: str
    glazing: str
    spacer: str
    psi_glazing: float
    source: str


def psi_glazing_table(path=None) -> tuple[PsiGlazingRow, ...]:
    """Read the editable table of default psi_g values.

    Parameters
    ----------
    path : str or os.PathLike, optional
        A CSV file of the same layout to read instead of the shipped table
        ``heatledger/data/psi_glazing_defaults.csv``. [-]

    Returns
    -------
    tuple of PsiGlazingRow
        The rows, in file order. [-]

    Raises
    ------
    HeatLedgerError
        If a row is incomplete, has a non-numeric psi_g or no source, or repeats a key.

    Notes
    -----
    Lines starting with ``#`` are the table's header (source, edition, units).

    References
    ----------
    EN ISO 10077-1:2006 Tables E.1 and E.2; EN ISO 10077-1:2017 Annex G [M: recalled].
    [source: iso10077-1, Annex G].
    """
    if path is None:
        text = resources.files("heatledger").joinpath("data", _PSI_TABLE_FILE).read_text(
            encoding="utf-8"
        )
        where = _PSI_TABLE_FILE
    else:
        with open(path, encoding="utf-8") as fh:
            text = fh.read()
        where = str(path)
    lines = [ln for ln in text.splitlines() if ln.strip() and not ln.lstrip().startswith("#")]
    reader = csv.DictReader(io.StringIO("\n".join(lines)))
    needed = {"frame", "glazing", "spacer", "psi_glazing", "source"}
    if reader.fieldnames is None or not needed <= set(reader.fieldnames):
        raise HeatLedgerError(
            f"{where}: the psi_g table needs the columns {', '.join(sorted(needed))}; "
            f"got {', '.join(reader.fieldnames or []) or 'none'}"
        )
    rows: list[PsiGlazingRow] = []
    seen: set[tuple[str, str, str]] = set()
    for n, rec in enumerate(reader, start=2):
        key = tuple((rec.get(k) or "").strip().lower() for k in ("frame", "glazing", "spacer"))
        source = (rec.get("source") or "").strip()
        if not all(key) or not source:
            raise HeatLedgerError(
                f"{where}, data row {n - 1}: frame, glazing, spacer and source must all be "
                "filled in; got " + ", ".join(f"{k} {_validate.show(v or '')}"
                                             for k, v in rec.items() if k is not None)
            )
        psi = _validate.finite(f"{where}, data row {n - 1}: psi_glazing", rec["psi_glazing"])
        if key in seen:
            raise HeatLedgerError(f"{where}, data row {n - 1}: the combination of frame, "
                                  f"glazing, spacer {', '.join(key)} appears twice")
        seen.add(key)  # type: ignore[arg-type]
        rows.append(PsiGlazingRow(*key, psi_glazing=psi, source=source))
    return tuple(rows)


def psi_glazing_default(frame: str, glazing: str, *, spacer: str = "conventional", path=None):
    """Default linear thermal transmittance of the glazing edge, from the editable table.

    Parameters
    ----------
    frame : str
        ``"wood_or_pvc"``, ``"metal_thermal_break"`` or ``"metal_no_thermal_break"``. [-]
    glazing : str
        ``"uncoated"`` (double or triple, uncoated) or ``"low_e"`` (double with one low-e
        coating, triple with two). [-]
    spacer : str, optional
        ``"conventional"`` (aluminium or steel) or ``"warm_edge"``. [-]
    path : str or os.PathLike, optional
        Alternative table file (see :func:`psi_glazing_table`). [-]

    Returns
    -------
    float
        ``psi_g``. [W/(m K)]

    Raises
    ------
    HeatLedgerError
        If the combination is not in the table; the message lists those that are.

    Notes
    -----
    Table look-up; no equation. The shipped values are recalled (recalled): prefer a value declared
    for the actual spacer.

    References
    ----------
    EN ISO 10077-1:2006 Tables E.1 and E.2; EN ISO 10077-1:2017 Annex G [M: recalled].
    [source: iso10077-1, Annex G].

    Examples
    --------
    >>> psi_glazing_default("wood_or_pvc", "low_e")
    0.08
    """
    rows = psi_glazing_table(path)
    key = tuple(str(v).strip().lower() for v in (frame, glazing, spacer))
    for row in rows:
        if (row.frame, row.glazing, row.spacer) == key:
            return row.psi_glazing
    listed = "; ".join(f"{r.frame}, {r.glazing}, {r.spacer}" for r in rows)
    raise HeatLedgerError(
        f"no default psi_g for frame {_validate.show(frame)}, glazing "
        f"{_validate.show(glazing)}, spacer {_validate.show(spacer)}; the table has: {listed} "
        "(frame, glazing, spacer)"
    )


def _area_array(name: str, value) -> np.ndarray:
    """An area input [m2]: finite, not negative, within the physical limit."""
    arr = _non_negative_array(name, value, "m2")
    if arr.size and float(arr.max()) > _validate.LIMITS["area"].high:
        _validate.within(name, float(arr.max()), "area")
    return arr


def _window_warnings(ag, af, uw) -> tuple:
    """Slips in a window's input: frame larger than glazing, U above 7 W/(m2 K)."""
    ag, af, uw = np.broadcast_arrays(ag, af, uw)
    out = []
    many = ag.size > 1
    for bad, text in ((af > ag, lambda i: _validate.frame_glazing_warning(
            "", float(af.flat[i]), float(ag.flat[i]))),
                      (uw > _validate.OPENING_U_HIGH, lambda i: _validate.opening_u_warning(
                          "", float(uw.flat[i])))):
        if np.any(bad):
            i = int(np.argmax(bad.ravel()))
            where = f" (first at item {i + 1} of {ag.size})" if many else ""
            out.append(text(i) + where)
    return tuple(out)


def perimeter_lower_bound(area, shape: str = "rectilinear"):
    """Shortest perimeter that can enclose ``area``.

    Parameters
    ----------
    area : float or array_like
        Enclosed area. [m2]
    shape : str, optional
        ``"rectilinear"`` (right-angled corners: the square, ``4 sqrt(A)``) or ``"any"``
        (the circle, ``2 sqrt(pi A)``). [-]

    Returns
    -------
    float or ndarray
        Lower bound of the perimeter. [m]

    Raises
    ------
    HeatLedgerError
        For a negative area or an unknown shape.

    Notes
    -----
    Isoperimetric inequality :math:`P \\ge 2\\sqrt{\\pi A}`; among outlines with right-angled
    corners the square is the shortest, :math:`P \\ge 4\\sqrt{A}`.

    References
    ----------
    G. Polya, *Mathematics and Plausible Reasoning*, vol. 1, ch. VIII (isoperimetric
    problem), Princeton 1954.
    [source: polya-1954, ch. VIII].
    """
    shape = _validate.choice("shape", shape, PERIMETER_SHAPES)
    return _out(_perimeter_bound(_non_negative_array("area", area, "m2"), shape))
