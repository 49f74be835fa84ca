"""Rooms and buildings: coefficients, design heat load, breakdown, annual energy.

Caution: the design heat load supports, and does not replace, plant sizing by a competent
person under the local building regulations and codes.

Sources (recalled): [source: en12831-1, clause 6]; annual energy [source: degree-days].
"""

from __future__ import annotations

import math
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field, replace
from typing import Any

from .. import _validate
from .._validate import show as _show
from ..errors import HeatLedgerError
from ..windows import DeclaredWindow, WindowResult
from .air import (
    AIR_DENSITY,
    AIR_SPECIFIC_HEAT,
    Ventilation,
    VentilationFlows,
    _check_ventilation,
    _ventilation,
)
from .annual import _temp_text, annual_energy
from .elements import (
    Element,
    LinearBridge,
    PointBridge,
    _check_bridge,
    _check_element,
    _factor,
    _resolve_u,
)
from .results import AnnualEnergy, BuildingHeatLoad, LossLine, RoomHeatLoad

# ----------------------------------------------------------------------------- rooms


@dataclass(frozen=True)
class Room:
    """A heated room (or zone) and its heat losses, EN 12831-1 style.

    Parameters
    ----------
    name : str
        Room name, unique within a building. [-]
    temp_inside : float
        Design internal temperature ``theta_int``. [degC]
    volume : float
        Internal air volume ``V``. [m3]
    elements : sequence of Element
        The room's elements. [-]
    ventilation : Ventilation
        Ventilation and infiltration. [-]
    thermal_bridges : sequence of LinearBridge or PointBridge, optional
        Thermal bridges listed separately. [-]
    floor_area : float, optional
        Floor area for the heating-up allowance. [m2]
    reheat_factor : float, optional
        Heating-up (reheat) factor ``f_RH``, from a national table by reheat time and
        temperature drop; 0 for none. [W/m2]
    temp_outside : float, optional
        Design external temperature ``theta_e`` at which ``transmission_coefficient`` is
        stated; needed when a boundary is given by temperature or is the ground. [degC]
    constructions : mapping, optional
        Constructions by name, for elements whose ``u`` is a name. [-]

    References
    ----------
    [source: en12831-1, clause 6]; annual energy [source: degree-days].
    """

    name: str
    temp_inside: float
    volume: float
    elements: Sequence[Element]
    ventilation: Ventilation
    thermal_bridges: Sequence[LinearBridge | PointBridge] = ()
    floor_area: float = 0.0
    reheat_factor: float = 0.0
    temp_outside: float | None = None
    constructions: Mapping[str, Any] | None = field(default=None, compare=False)

    def __post_init__(self) -> None:
        if not isinstance(self.name, str) or not self.name.strip():
            raise HeatLedgerError(f"room name must be a non-empty text; got "
                                  f"{_show(self.name)}")
        ctx = f"room {_show(self.name)}"
        object.__setattr__(self, "temp_inside",
                           _validate.within(f"{ctx}: temp_inside",
                                            self.temp_inside, "temperature"))
        volume = _validate.positive(f"{ctx}: volume", self.volume, "m3")
        object.__setattr__(self, "volume", _validate.within(f"{ctx}: volume", volume, "volume"))
        floor = _validate.non_negative(f"{ctx}: floor_area", self.floor_area, "m2")
        object.__setattr__(self, "floor_area",
                           _validate.within(f"{ctx}: floor_area", floor, "area"))
        object.__setattr__(self, "reheat_factor", _validate.non_negative(
            f"{ctx}: reheat_factor", self.reheat_factor, "W/m2"))
        if self.reheat_factor > 0.0 and self.floor_area <= 0.0:
            raise HeatLedgerError(
                f"{ctx}: a reheat_factor of {self.reheat_factor:g} W/m2 needs the floor_area "
                "it applies to; got floor_area 0 m2"
            )
        if self.temp_outside is not None:
            te = _validate.within(f"{ctx}: temp_outside",
                                  self.temp_outside, "temperature")
            object.__setattr__(self, "temp_outside", te)
        if not isinstance(self.ventilation, Ventilation):
            raise HeatLedgerError(
                f"{ctx}: ventilation must be a Ventilation; got {_show(self.ventilation)}"
            )
        _check_ventilation(ctx, self.ventilation)
        elements = tuple(self.elements)
        bridges = tuple(self.thermal_bridges)
        seen: set[str] = set()
        for el in elements:
            _check_element(ctx, el, seen)
        for br in bridges:
            _check_bridge(ctx, br, seen)
        object.__setattr__(self, "elements", elements)
        object.__setattr__(self, "thermal_bridges", bridges)

    # -- coefficients at the design external temperature

    @property
    def transmission_coefficient(self) -> float:
        """``H_T`` at :attr:`temp_outside`. [W/K]"""
        return self._evaluate(self.temp_outside, None, None).transmission_coefficient

    @property
    def ventilation_coefficient(self) -> float:
        """``H_V``. [W/K]"""
        return self.ventilation_flows().coefficient

    @property
    def heat_loss_coefficient(self) -> float:
        """``H_T + H_V``. [W/K]"""
        return self.transmission_coefficient + self.ventilation_coefficient

    def ventilation_flows(self) -> VentilationFlows:
        """Air flows and ``H_V`` of this room.

        Returns
        -------
        VentilationFlows
            Flows and coefficient. [-]
        """
        return _ventilation(self.ventilation, self.volume)

    def heat_load(self, temp_outside) -> RoomHeatLoad:
        """Design heat load of this room alone, with every step.

        Parameters
        ----------
        temp_outside : float
            Design external temperature ``theta_e``. [degC]

        Returns
        -------
        RoomHeatLoad
            Coefficients, heat flows, breakdown and provenance. [-]

        Raises
        ------
        HeatLedgerError
            If ``theta_e`` is not below the internal temperature, an element faces a room by
            name (only a :class:`Building` can resolve it) or a construction name is unknown.

        Notes
        -----
        .. math::

            \\Phi_{HL} = (H_T + H_V)(\\theta_{int} - \\theta_e) + f_{RH} A_{floor}

            H_T = \\sum_k A_k (U_k + \\Delta U_{TB}) f_k + \\sum_l \\psi_l l_l f_l
                  + \\sum_j \\chi_j f_j

        with :math:`f = 1` outside, :math:`b_u` or
        :math:`(\\theta_{int} - \\theta_u)/(\\theta_{int} - \\theta_e)` to an unheated space,
        :math:`(\\theta_{int} - \\theta_{adj})/(\\theta_{int} - \\theta_e)` to another heated
        space, and :math:`f_{g1} f_{g2} G_w` with
        :math:`f_{g2} = (\\theta_{int} - \\theta_{m,e})/(\\theta_{int} - \\theta_e)` to the
        ground.

        References
        ----------
        EN 12831-1:2017, clause 6 [M: recalled].
        """
        te = _validate.finite("temp_outside", temp_outside)
        return self._evaluate(te, None, None)

    def design_heat_load(self, temp_outside) -> float:
        """Design heat load ``Phi_HL`` of this room.

        Parameters
        ----------
        temp_outside : float
            Design external temperature. [degC]

        Returns
        -------
        float
            Design heat load. [W]

        Raises
        ------
        HeatLedgerError
            As :meth:`heat_load`.
        """
        return self.heat_load(temp_outside).design_heat_load

    def annual_energy_result(self, degree_days, *, degree_day_base=None) -> AnnualEnergy:
        """Annual heating energy of this room from heating degree-days, with provenance.

        Parameters
        ----------
        degree_days : float
            Heating degree-days on the base appropriate to the room. [K day]
        degree_day_base : float, optional
            Base temperature of the degree-days, recorded in the result. [degC]

        Returns
        -------
        AnnualEnergy
            ``Q = 24 (H_T + H_V) DD / 1000``, with the coefficients used. [-]
        """
        h_t = self.transmission_coefficient
        return annual_energy(self.name, h_t, self.ventilation_coefficient, degree_days,
                       degree_day_base, self.temp_outside)

    def annual_energy(self, degree_days, *, degree_day_base=None) -> float:
        """Annual heating energy of this room from heating degree-days.

        Parameters
        ----------
        degree_days : float
            Heating degree-days. [K day]
        degree_day_base : float, optional
            Base temperature of the degree-days, recorded by
            :meth:`annual_energy_result`. [degC]

        Returns
        -------
        float
            ``Q = 24 H DD / 1000``. [kWh]
        """
        return self.annual_energy_result(degree_days, degree_day_base=degree_day_base).energy

    # -- the evaluation proper

    def _element_lines(self, ctx, te, room_temps, building_constructions, warnings) -> list:
        """One loss line per element (``A (U + dU_TB) f``); slips go to ``warnings``."""
        lines = []
        for el in self.elements:
            ectx = f"{ctx}, element {_show(el.name)}"
            u, source = _resolve_u(ectx, el, self.constructions, building_constructions)
            if isinstance(el.u, (WindowResult, DeclaredWindow)):  # they flag their own U
                warnings += [f"{ectx}: {w}" for w in el.u.warnings]
            elif el.kind in ("window", "door"):
                warnings.append(_validate.opening_u_warning(ectx, u))
            f, rule, internal, label = _factor(ectx, el.boundary, self.temp_inside, te,
                                               room_temps, self.name)
            ue = u + el.thermal_bridge_allowance
            lines.append(dict(name=el.name, category="transmission", kind=el.kind,
                              boundary=label, quantity=el.area, quantity_unit="m2",
                              transmittance=u, transmittance_unit="W/(m2 K)",
                              bridge_allowance=el.thermal_bridge_allowance, factor=f,
                              factor_rule=rule, coefficient=el.area * ue * f,
                              internal=internal, source=source))
        return lines

    def _bridge_lines(self, ctx, te, room_temps) -> list:
        """One loss line per linear (``psi l f``) or point (``chi n f``) thermal bridge."""
        lines = []
        for br in self.thermal_bridges:
            bctx = f"{ctx}, thermal bridge {_show(br.name)}"
            f, rule, internal, label = _factor(bctx, br.boundary, self.temp_inside, te,
                                               room_temps, self.name)
            if isinstance(br, LinearBridge):
                q, qu, t, tu, kind = br.length, "m", br.psi, "W/(m K)", "linear bridge"
            else:
                q, qu, t, tu, kind = float(br.count), "-", br.chi, "W/K", "point bridge"
            lines.append(dict(name=br.name, category="transmission", kind=kind, boundary=label,
                              quantity=q, quantity_unit=qu, transmittance=t,
                              transmittance_unit=tu, bridge_allowance=0.0, factor=f,
                              factor_rule=rule, coefficient=q * t * f, internal=internal,
                              source=(f"psi of junction {_show(br.junction)} (EN ISO 10211)"
                                      if getattr(br, "junction", "") else "given")))
        return lines

    def _evaluate(self, te, room_temps, building_constructions) -> RoomHeatLoad:
        ctx = f"room {_show(self.name)}"
        ti = self.temp_inside
        if te is not None and not te < ti:
            raise HeatLedgerError(
                f"{ctx}: temp_outside {te:g} degC must be below the internal "
                f"temperature {ti:g} degC for a design heat load"
            )
        warnings = [_validate.room_height_warning(ctx, self.volume, self.floor_area)]
        lines = self._element_lines(ctx, te, room_temps, building_constructions, warnings)
        lines += self._bridge_lines(ctx, te, room_temps)
        vent = self.ventilation_flows()
        reheat = self.reheat_factor * self.floor_area
        lines += _ventilation_and_reheat_lines(vent, self.reheat_factor, self.floor_area)
        dt = math.nan if te is None else ti - te
        for ln in lines:
            ln["heat_loss"] = reheat if ln["category"] == "reheat" else ln["coefficient"] * dt
        h_t = math.fsum(ln["coefficient"] for ln in lines if ln["category"] == "transmission")
        h_int = math.fsum(ln["coefficient"] for ln in lines if ln["internal"])
        phi_t = h_t * dt
        phi_v = vent.coefficient * dt
        total = phi_t + phi_v + reheat
        frozen = tuple(
            LossLine(room=self.name, share=_share(ln["heat_loss"], total), **ln) for ln in lines
        )
        prov = (
            f"design external temperature: {_temp_text(te)}; internal {ti:g} degC",
            "transmission: EN 12831-1:2017 clause 6, H_T = sum A (U + dU_TB) f + sum psi l f "
            "+ sum chi f (recalled)",
            f"ventilation: {vent.method}",
            f"air: rho {AIR_DENSITY:.4f} kg/m3 (ideal dry air, 20 degC, 101325 Pa), c_p "
            f"{AIR_SPECIFIC_HEAT:g} J/(kg K) (recalled)",
            "heating-up: Phi_hu = f_RH A_floor, f_RH input" if reheat > 0 else
            "heating-up: none (f_RH 0)",
        )
        return RoomHeatLoad(
            room=self.name, temp_inside=ti, temp_outside=te,
            temperature_difference=dt, transmission_coefficient=h_t,
            internal_exchange_coefficient=h_int, ventilation_coefficient=vent.coefficient,
            heat_loss_coefficient=h_t + vent.coefficient, transmission_heat_loss=phi_t,
            ventilation_heat_loss=phi_v, reheat_allowance=reheat, design_heat_load=total,
            ventilation=vent, lines=frozen, provenance=prov,
            warnings=tuple(dict.fromkeys(w for w in warnings if w)),
        )


def _ventilation_and_reheat_lines(vent, reheat_factor, floor_area) -> list:
    """The ventilation line (``H_V``) and the heating-up allowance line (``f_RH A``)."""
    return [dict(name="ventilation", category="ventilation", kind="ventilation",
                 boundary="outside air", quantity=vent.effective_flow, quantity_unit="m3/h",
                 transmittance=vent.volumetric_heat_capacity,
                 transmittance_unit="W h/(m3 K)", bridge_allowance=0.0, factor=1.0,
                 factor_rule=vent.method, coefficient=vent.coefficient, internal=False,
                 source="air properties at 20 degC, 101325 Pa"),
            dict(name="heating-up allowance", category="reheat", kind="reheat",
                 boundary="-", quantity=floor_area, quantity_unit="m2",
                 transmittance=reheat_factor, transmittance_unit="W/m2",
                 bridge_allowance=0.0, factor=1.0,
                 factor_rule="Phi_hu = f_RH A_floor (input)", coefficient=0.0,
                 internal=False, source="input f_RH")]


# ----------------------------------------------------------------------------- building


@dataclass(frozen=True)
class Building:
    """A building: its rooms, less the heat they exchange with each other.

    Parameters
    ----------
    name : str
        Building name. [-]
    rooms : sequence of Room
        Rooms with unique names. [-]
    constructions : mapping, optional
        Constructions by name for elements whose ``u`` is a name (looked up after the room's
        own mapping; a name in both must be the same object). [-]
    temp_outside : float, optional
        Design external temperature of the coefficients; a room's own must agree. [degC]

    References
    ----------
    [source: en12831-1, clause 6]; annual energy [source: degree-days].
    """

    name: str
    rooms: Sequence[Room]
    constructions: Mapping[str, Any] | None = field(default=None, compare=False)
    temp_outside: float | None = None

    def __post_init__(self) -> None:
        rooms = tuple(self.rooms)
        if not rooms:
            raise HeatLedgerError(f"building {_show(self.name)} must have at least one "
                                  "room")
        names: set[str] = set()
        for r in rooms:
            if not isinstance(r, Room):
                raise HeatLedgerError(f"building {_show(self.name)}: rooms must be Room "
                                      f"objects; got {_show(r)}")
            if r.name in names:
                raise HeatLedgerError(f"building {_show(self.name)}: room name "
                                      f"{_show(r.name)} appears twice; room names must be "
                                      "unique")
            names.add(r.name)
        object.__setattr__(self, "rooms", rooms)
        temps = {r.temp_outside for r in rooms} - {None}
        te = self.temp_outside
        if te is not None:
            te = _validate.within(f"building {_show(self.name)}: temp_outside",
                                  te, "temperature")
            object.__setattr__(self, "temp_outside", te)
            temps.add(te)
        if len(temps) > 1:
            raise HeatLedgerError(
                f"building {_show(self.name)}: the rooms and building state different design "
                f"external temperatures, {', '.join(f'{t:g}' for t in sorted(temps))} degC; one "
                "building has one design value"
            )
        object.__setattr__(self, "_te", temps.pop() if temps else None)
        temps_by_room = {r.name: r.temp_inside for r in rooms}
        object.__setattr__(self, "_room_temps", temps_by_room)

    @property
    def transmission_coefficient(self) -> float:
        """Building ``H_T``: rooms' sum less internal exchange. [W/K]"""
        return self._evaluate(self._te).transmission_coefficient  # type: ignore[attr-defined]

    @property
    def ventilation_coefficient(self) -> float:
        """Building ``H_V``: sum over rooms. [W/K]"""
        return math.fsum(r.ventilation_coefficient for r in self.rooms)

    @property
    def heat_loss_coefficient(self) -> float:
        """``H_T + H_V``. [W/K]"""
        return self.transmission_coefficient + self.ventilation_coefficient

    def heat_load(self, temp_outside) -> BuildingHeatLoad:
        """Design heat load of the building and of every room, with every step.

        Parameters
        ----------
        temp_outside : float
            Design external temperature. [degC]

        Returns
        -------
        BuildingHeatLoad
            Room results, building totals, breakdown and provenance. [-]

        Raises
        ------
        HeatLedgerError
            As :meth:`Room.heat_load`, and for an element naming a room not in the building.

        Notes
        -----
        .. math::

            \\Phi_{HL,bldg} = \\sum_i (\\Phi_{HL,i} - \\Phi_{int,i}), \\qquad
            H_{T,bldg} = \\sum_i (H_{T,i} - H_{int,i})

        where the internal parts are the elements and bridges facing rooms of the same
        building.

        References
        ----------
        EN 12831-1:2017, clause 6 (building heat load) (recalled).
        """
        te = _validate.finite("temp_outside", temp_outside)
        return self._evaluate(te)

    def design_heat_load(self, temp_outside) -> float:
        """Building design heat load.

        Parameters
        ----------
        temp_outside : float
            Design external temperature. [degC]

        Returns
        -------
        float
            Design heat load of the building. [W]
        """
        return self.heat_load(temp_outside).design_heat_load

    def annual_energy_result(self, degree_days, *, degree_day_base=None) -> AnnualEnergy:
        """Annual heating energy of the building from heating degree-days, with provenance.

        Parameters
        ----------
        degree_days : float
            Heating degree-days. [K day]
        degree_day_base : float, optional
            Base temperature of the degree-days, recorded in the result. [degC]

        Returns
        -------
        AnnualEnergy
            ``Q = 24 H DD / 1000`` with the building's coefficients. [-]
        """
        return annual_energy(self.name, self.transmission_coefficient, self.ventilation_coefficient,
                       degree_days, degree_day_base, self._te)  # type: ignore[attr-defined]

    def annual_energy(self, degree_days, *, degree_day_base=None) -> float:
        """Annual heating energy of the building from heating degree-days.

        Parameters
        ----------
        degree_days : float
            Heating degree-days. [K day]
        degree_day_base : float, optional
            Base temperature of the degree-days. [degC]

        Returns
        -------
        float
            ``Q = 24 H DD / 1000``. [kWh]
        """
        return self.annual_energy_result(degree_days, degree_day_base=degree_day_base).energy

    def room_annual_energy(self, degree_days, *, degree_day_base=None) -> dict:
        """Annual heating energy of every room, with the room-to-room exchange resolved.

        Parameters
        ----------
        degree_days : float
            Heating degree-days. [K day]
        degree_day_base : float, optional
            Base temperature of the degree-days. [degC]

        Returns
        -------
        dict of str to AnnualEnergy
            Per room, ``Q = 24 (H_T + H_V) DD / 1000`` with the room's own coefficients
            (exchange with other rooms included, as the room sees it). [-]
        """
        result = self._evaluate(self._te)  # type: ignore[attr-defined]
        return {
            r.room: annual_energy(r.room, r.transmission_coefficient, r.ventilation_coefficient,
                            degree_days, degree_day_base, self._te)  # type: ignore[attr-defined]
            for r in result.rooms
        }

    def _evaluate(self, te) -> BuildingHeatLoad:
        results = tuple(
            r._evaluate(te, self._room_temps, self.constructions)  # type: ignore[attr-defined]
            for r in self.rooms
        )
        h_sum = math.fsum(r.transmission_coefficient for r in results)
        h_int = math.fsum(r.internal_exchange_coefficient for r in results)
        h_v = math.fsum(r.ventilation_coefficient for r in results)
        q_int = math.fsum(ln.heat_loss for r in results for ln in r.lines if ln.internal)
        phi_t = math.fsum(r.transmission_heat_loss for r in results) - q_int
        phi_v = math.fsum(r.ventilation_heat_loss for r in results)
        reheat = math.fsum(r.reheat_allowance for r in results)
        total = phi_t + phi_v + reheat
        lines = tuple(
            _replace_share(ln, total) for r in results for ln in r.lines if not ln.internal
        )
        by_kind: dict[str, float] = {}
        for ln in lines:
            by_kind[ln.kind] = by_kind.get(ln.kind, 0.0) + ln.heat_loss
        prov = (
            f"building {_show(self.name)}: {len(results)} rooms, design external temperature "
            f"{_temp_text(te)}",
            "building H_T = sum of room H_T less exchange with rooms of this building; "
            "H_V = sum of room H_V (no infiltration diversity applied)",
            results[0].provenance[1],
            "ventilation: per room (see each room's provenance)",
            results[0].provenance[3],
        )
        return BuildingHeatLoad(
            name=self.name, temp_outside=te, rooms=results,
            rooms_transmission_coefficient=h_sum, internal_exchange_coefficient=h_int,
            transmission_coefficient=h_sum - h_int, ventilation_coefficient=h_v,
            heat_loss_coefficient=h_sum - h_int + h_v,
            rooms_design_heat_load=math.fsum(r.design_heat_load for r in results),
            internal_exchange_heat_loss=q_int, transmission_heat_loss=phi_t,
            ventilation_heat_loss=phi_v, reheat_allowance=reheat, design_heat_load=total,
            lines=lines, by_kind=by_kind, provenance=prov,
            warnings=tuple(dict.fromkeys(w for r in results for w in r.warnings)),
        )


# ----------------------------------------------------------------------------- helpers


def _share(value: float, total: float) -> float:
    return value / total if total != 0.0 and math.isfinite(total) else math.nan


def _replace_share(line: LossLine, total: float) -> LossLine:
    return replace(line, share=_share(line.heat_loss, total))
