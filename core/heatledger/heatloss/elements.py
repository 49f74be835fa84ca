"""Boundaries, elements and thermal bridges of a room, and their adjustment factors.

References
----------
EN 12831-1:2017, clause 6 (transmission heat loss, temperature adjustment factors, ground
factors f_g1, f_g2, G_w) [M: recalled].
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

import numpy as np

from .. import _validate
from .._validate import show as _show
from ..errors import HeatLedgerError
from ..windows import WINDOW_AREA_RTOL

#: Correction factor for the annual variation of the external temperature, f_g1
#: (EN 12831-1:2017 (recalled)). [-]
GROUND_FACTOR_FG1 = 1.45
#: Groundwater factor G_w when the water table is more than 1 m below the floor (recalled). [-]
GROUNDWATER_FACTOR_DEEP = 1.0
#: Groundwater factor G_w when the water table is 1 m or less below the floor (recalled). [-]
GROUNDWATER_FACTOR_SHALLOW = 1.15

#: Kinds of element, for the breakdown by element type. [-]
ELEMENT_KINDS = ("wall", "roof", "ceiling", "floor", "window", "door", "other")


# ----------------------------------------------------------------------------- boundaries


@dataclass(frozen=True)
class Outside:
    """The element faces the external air (factor 1).

    References
    ----------
    [source: en12831-1, clause 6 (transmission to the external air)].
    """

    def describe(self) -> str:
        """Text for the breakdown. [-]"""
        return "outside"


@dataclass(frozen=True)
class Ground:
    """The element is in contact with the ground; its U-value is ``U_equiv`` (EN ISO 13370).

    Parameters
    ----------
    temp_outside_annual_mean : float
        Annual mean external temperature ``theta_m,e``. [degC]
    f_g1 : float, optional
        Correction for the annual variation of the external temperature; 1.45 (recalled). [-]
    groundwater_factor : float, optional
        ``G_w``: 1.00 when the water table is more than 1 m below the floor, 1.15 when it is
        1 m or less (recalled). [-]

    References
    ----------
    [source: en12831-1, clause 6 (ground factors f_g1, f_g2, G_w)]; [source: iso13370-slab, 8.2].
    """

    temp_outside_annual_mean: float
    f_g1: float = GROUND_FACTOR_FG1
    groundwater_factor: float = GROUNDWATER_FACTOR_DEEP

    def describe(self) -> str:
        """Text for the breakdown. [-]"""
        return f"ground (theta_m,e {self.temp_outside_annual_mean:g} degC)"


@dataclass(frozen=True)
class Unheated:
    """The element faces an unheated space: give its temperature OR its adjustment factor.

    Parameters
    ----------
    temperature : float, optional
        Temperature of the unheated space ``theta_u``. [degC]
    adjustment_factor : float, optional
        Temperature adjustment factor ``b_u`` (0..1) when the temperature is not known. [-]

    References
    ----------
    [source: en12831-1, clause 6 (temperature adjustment factor of an unheated space)].
    """

    temperature: float | None = None
    adjustment_factor: float | None = None

    def describe(self) -> str:
        """Text for the breakdown. [-]"""
        if self.temperature is not None:
            return f"unheated space at {self.temperature:g} degC"
        return f"unheated space, b_u {self.adjustment_factor:g}"


@dataclass(frozen=True)
class AdjacentRoom:
    """The element faces a neighbouring heated space: by room name OR by its temperature.

    Parameters
    ----------
    room : str, optional
        Name of a room of the same :class:`Building`; heat exchanged with it is internal to
        the building. [-]
    temperature : float, optional
        Temperature of a neighbouring space not modelled (another dwelling, another
        building). [degC]

    References
    ----------
    [source: en12831-1, clause 6 (adjustment factor to a neighbouring heated space)].
    """

    room: str | None = None
    temperature: float | None = None

    def describe(self) -> str:
        """Text for the breakdown. [-]"""
        if self.room is not None:
            return f"room {_show(self.room)}"
        return f"adjacent space at {self.temperature:g} degC"


_BOUNDARY_TYPES = (Outside, Ground, Unheated, AdjacentRoom)


# ----------------------------------------------------------------------------- elements


@dataclass(frozen=True)
class Element:
    """A plane element of a room: an area with a U-value and a boundary.

    Checked when the room is built, so that messages can name the room.

    Parameters
    ----------
    name : str
        Name of the element, unique within the room. [-]
    area : float
        Area of the element (for a window, its overall area). [m2]
    u : float, str or object
        The U-value: a number, the name of a construction (resolved through the room's or
        building's ``constructions`` mapping), or any object with a ``u_value`` attribute
        (a construction, :func:`heatledger.windows.window`, :func:`declared_window`,
        :func:`heatledger.ground.slab_on_ground` ...). For a ground element, ``U_equiv``.
        [W/(m2 K)]
    boundary : Outside, Ground, Unheated, AdjacentRoom or "outside"
        What lies on the other side. [-]
    kind : str, optional
        One of :data:`ELEMENT_KINDS`, for the breakdown by type. [-]
    thermal_bridge_allowance : float, optional
        Blanket allowance ``Delta U_TB`` added to U for thermal bridges not listed
        separately. [W/(m2 K)]
    """

    name: str
    area: float
    u: Any
    boundary: Any = "outside"
    kind: str = "wall"
    thermal_bridge_allowance: float = 0.0


@dataclass(frozen=True)
class LinearBridge:
    """A linear thermal bridge, ``psi * length``.

    Parameters
    ----------
    name : str
        Name of the junction. [-]
    psi : float
        Linear thermal transmittance. [W/(m K)]
    length : float
        Length of the junction. [m]
    boundary : Outside, Ground, Unheated, AdjacentRoom or "outside", optional
        Boundary whose temperature factor applies. [-]
    junction : str, optional
        The project junction whose computed psi this is (empty: psi declared). [-]
    """

    name: str
    psi: float
    length: float
    boundary: Any = "outside"
    junction: str = ""


@dataclass(frozen=True)
class PointBridge:
    """Point thermal bridges, ``chi * count``.

    Parameters
    ----------
    name : str
        Name of the point bridge. [-]
    chi : float
        Point thermal transmittance of one bridge. [W/K]
    count : int, optional
        Number of such bridges. [-]
    boundary : Outside, Ground, Unheated, AdjacentRoom or "outside", optional
        Boundary whose temperature factor applies. [-]
    """

    name: str
    chi: float
    count: int = 1
    boundary: Any = "outside"



def _check_name(ctx: str, what: str, name, seen: set[str]) -> str:
    if not isinstance(name, str) or not name.strip():
        raise HeatLedgerError(f"{ctx}: every {what} needs a non-empty name; got "
                              f"{_show(name)}")
    if name in seen:
        raise HeatLedgerError(f"{ctx}: the name {_show(name)} is used twice; names of "
                              "elements and thermal bridges must be unique within a room")
    seen.add(name)
    return f"{ctx}, {what} {_show(name)}"


def _check_element(ctx: str, el, seen: set[str]) -> None:
    if not isinstance(el, Element):
        raise HeatLedgerError(f"{ctx}: elements must be Element objects; got {_show(el)}")
    ectx = _check_name(ctx, "element", el.name, seen)
    area = _validate.within(f"{ectx}: area", _validate.positive(f"{ectx}: area", el.area, "m2"),
                            "area")
    _validate.choice(f"{ectx}: kind", el.kind, ELEMENT_KINDS)
    dutb = _validate.non_negative(f"{ectx}: thermal_bridge_allowance",
                                  el.thermal_bridge_allowance, "W/(m2 K)")
    object.__setattr__(el, "thermal_bridge_allowance", dutb)
    object.__setattr__(el, "area", area)
    object.__setattr__(el, "boundary", _check_boundary(ectx, el.boundary))
    u = el.u
    if isinstance(u, str):
        return
    if not isinstance(u, (int, float, np.floating, np.integer)) or isinstance(u, bool):
        if not hasattr(u, "u_value"):
            raise HeatLedgerError(
                f"{ectx}: u must be a number (W/(m2 K)), a construction name, or an object "
                f"with a u_value attribute; got {_show(u)}"
            )
        frame = getattr(u, "frame_area", None)
        if isinstance(frame, (int, float)) and frame > area:
            raise HeatLedgerError(
                f"{ectx}: frame area {frame:g} m2 is larger than the window area {area:g} m2"
            )
        own = getattr(u, "area", None)
        if isinstance(own, (int, float)) and abs(own - area) > WINDOW_AREA_RTOL * area:
            raise HeatLedgerError(
                f"{ectx}: element area {area:g} m2 differs from the area {own:g} m2 its "
                f"U-value object ({type(u).__name__}) was computed for"
            )


def _check_bridge(ctx: str, br, seen: set[str]) -> None:
    if isinstance(br, LinearBridge):
        bctx = _check_name(ctx, "thermal bridge", br.name, seen)
        object.__setattr__(br, "psi", _validate.finite(f"{bctx}: psi", br.psi))
        object.__setattr__(br, "length", _validate.positive(f"{bctx}: length", br.length, "m"))
    elif isinstance(br, PointBridge):
        bctx = _check_name(ctx, "thermal bridge", br.name, seen)
        object.__setattr__(br, "chi", _validate.finite(f"{bctx}: chi", br.chi))
        if isinstance(br.count, bool) or not isinstance(br.count, int) or br.count < 1:
            raise HeatLedgerError(f"{bctx}: count must be a whole number of at least 1; "
                                  f"got {_show(br.count)}")
    else:
        raise HeatLedgerError(
            f"{ctx}: thermal_bridges must be LinearBridge or PointBridge objects; got "
            f"{_show(br)}"
        )
    object.__setattr__(br, "boundary", _check_boundary(bctx, br.boundary))


def _check_boundary(ctx: str, b):
    if isinstance(b, str):
        if b.strip().lower() == "outside":
            return Outside()
        raise HeatLedgerError(
            f'{ctx}: boundary {_show(b)} needs its data; use "outside" or a boundary object: '
            "Outside, Ground (with temp_outside_annual_mean), Unheated (with "
            "temperature or adjustment_factor) or AdjacentRoom (with room or temperature)"
        )
    if not isinstance(b, _BOUNDARY_TYPES):
        raise HeatLedgerError(f'{ctx}: boundary must be "outside", Outside, Ground, Unheated '
                              f"or AdjacentRoom; got {_show(b)}")
    if isinstance(b, Ground):
        _validate.within(f"{ctx}: temp_outside_annual_mean",
                         b.temp_outside_annual_mean, "temperature")
        _validate.positive(f"{ctx}: f_g1", b.f_g1)
        _validate.positive(f"{ctx}: groundwater_factor", b.groundwater_factor)
    elif isinstance(b, Unheated):
        if (b.temperature is None) == (b.adjustment_factor is None):
            given = "both are given" if b.temperature is not None else "neither is given"
            raise HeatLedgerError(
                f"{ctx}: Unheated needs exactly one of temperature or adjustment_factor; "
                f"{given}")
        if b.temperature is not None:
            _validate.within(f"{ctx}: unheated temperature", b.temperature, "temperature")
        else:
            _validate.fraction(f"{ctx}: adjustment_factor b_u", b.adjustment_factor)
    elif isinstance(b, AdjacentRoom):
        if (b.room is None) == (b.temperature is None):
            given = "both are given" if b.room is not None else "neither is given"
            raise HeatLedgerError(
                f"{ctx}: AdjacentRoom needs exactly one of room (a name) or temperature; "
                f"{given}")
        if b.temperature is not None:
            _validate.within(f"{ctx}: adjacent temperature", b.temperature, "temperature")
    return b


def _resolve_u(ctx: str, el: Element, own, building) -> tuple[float, str]:
    u = el.u
    if isinstance(u, str):
        found = []
        for where, mapping in (("room", own), ("building", building)):
            if mapping is not None and u in mapping:
                found.append((where, mapping[u]))
        if not found:
            known = sorted({*(own or {}), *(building or {})})
            raise HeatLedgerError(
                f"{ctx}: construction {_show(u)} does not exist; known constructions: "
                f"{', '.join(map(_show, known)) or 'none (give a constructions mapping)'}"
            )
        if len(found) == 2 and found[0][1] is not found[1][1]:
            raise HeatLedgerError(f"{ctx}: construction {_show(u)} is defined differently by "
                                  "the room and the building; keep one definition")
        obj = found[0][1]
        value = obj if isinstance(obj, (int, float)) else getattr(obj, "u_value", None)
        source = (f"EN ISO 6946 U-value of construction {_show(u)} (defined for the "
                  f"{found[0][0]})")
    elif isinstance(u, (int, float, np.floating, np.integer)):
        value, source = u, "U-value given for the element"
    else:
        value = u.u_value
        source = str(getattr(u, "method", "") or "U-value of the element")
        if getattr(u, "source", ""):
            source += f" ({u.source})"
    if value is None:
        raise HeatLedgerError(f"{ctx}: construction {_show(u)} has no u_value")
    return _validate.non_negative(f"{ctx}: U-value", value, "W/(m2 K)"), source


def _factor(ctx, b, ti, te, room_temps, own_name):
    """Temperature adjustment factor, its rule text, whether internal, and a label."""

    def need_te(what: str) -> float:
        if te is None:
            raise HeatLedgerError(
                f"{ctx}: {what} is expressed as a coefficient only at a design external "
                "temperature; give the room's (or building's) temp_outside"
            )
        return te

    if isinstance(b, Outside):
        return 1.0, "outside: f = 1", False, b.describe()
    if isinstance(b, Unheated):
        if b.adjustment_factor is not None:
            return float(b.adjustment_factor), "b_u given", False, b.describe()
        t = need_te("a boundary at a stated temperature")
        f = (ti - b.temperature) / (ti - t)
        return f, "b_u = (theta_int - theta_u)/(theta_int - theta_e)", False, b.describe()
    if isinstance(b, Ground):
        t = need_te("a ground boundary (f_g2)")
        fg2 = (ti - b.temp_outside_annual_mean) / (ti - t)
        f = b.f_g1 * fg2 * b.groundwater_factor
        rule = (f"f_g1 f_g2 G_w = {b.f_g1:g} x {fg2:.6g} x {b.groundwater_factor:g}, "
                "f_g2 = (theta_int - theta_m,e)/(theta_int - theta_e)")
        return f, rule, False, b.describe()
    # AdjacentRoom
    if b.temperature is not None:
        t = need_te("a boundary at a stated temperature")
        f = (ti - b.temperature) / (ti - t)
        return f, "f_ij = (theta_int - theta_adj)/(theta_int - theta_e)", False, b.describe()
    if room_temps is None:
        raise HeatLedgerError(
            f"{ctx}: faces room {_show(b.room)} by name, which only a Building can resolve; "
            "put both rooms in a Building, or give the AdjacentRoom a temperature"
        )
    if b.room == own_name:
        raise HeatLedgerError(f"{ctx}: an element cannot face its own room "
                              f"{_show(own_name)}")
    if b.room not in room_temps:
        raise HeatLedgerError(
            f"{ctx}: faces room {_show(b.room)}, which does not exist in the building; rooms "
            "are "
            f"{', '.join(map(_show, room_temps))}"
        )
    tj = room_temps[b.room]
    t = need_te(f"exchange with room {_show(b.room)}")
    f = (ti - tj) / (ti - t)
    return (f, "f_ij = (theta_int,i - theta_int,j)/(theta_int,i - theta_e)", True,
            f"room {_show(b.room)} at {tj:g} degC")
