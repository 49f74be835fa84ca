"""Tests of heatledger.heatloss (EN 12831-1 style design heat load, degree-day energy).

Rooms and buildings here are invented scenarios of our own.
"""

from __future__ import annotations

import math

import CoolProp.CoolProp as CP
import psychrolib
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from heatledger import heatloss
from heatledger.errors import HeatLedgerError
from heatledger.ground import slab_on_ground
from heatledger.heatloss import (
    AIR_DENSITY,
    AIR_REFERENCE_PRESSURE,
    AIR_REFERENCE_TEMPERATURE,
    AIR_SPECIFIC_HEAT,
    AdjacentRoom,
    Building,
    Element,
    Ground,
    LinearBridge,
    Outside,
    PointBridge,
    Room,
    Unheated,
    Ventilation,
    ventilation_heat_loss_coefficient,
)
from heatledger.windows import declared_window, window
from tests.tolerances import ATOL_ITERATION, ATOL_ROUND_OFF, RTOL_ITERATION, RTOL_ROUND_OFF

atol_same_equation = ATOL_ITERATION  # tests/tolerances.py

T_REF_K = AIR_REFERENCE_TEMPERATURE + 273.15


# ----------------------------------------------------------------------------- air properties


def test_air_reference_state_is_stated():
    assert AIR_REFERENCE_TEMPERATURE == 20.0
    assert AIR_REFERENCE_PRESSURE == 101325.0


def test_air_density_against_coolprop_and_psychrolib():
    # source: CoolProp (Lemmon et al. 2000 pseudo-pure air) at 293.15 K, 101325 Pa
    rho_coolprop = CP.PropsSI("D", "T", T_REF_K, "P", AIR_REFERENCE_PRESSURE, "Air")
    # ideal dry air omits the compressibility (Z = 0.9996 here) and uses the ASHRAE molar mass
    rtol_ideal_gas = 1e-3
    assert AIR_DENSITY == pytest.approx(rho_coolprop, rel=rtol_ideal_gas)
    # source: psychrolib GetDryAirDensity (ASHRAE Handbook Fundamentals 2017 ch. 1)
    psychrolib.SetUnitSystem(psychrolib.SI)
    rho_psychro = psychrolib.GetDryAirDensity(AIR_REFERENCE_TEMPERATURE, AIR_REFERENCE_PRESSURE)
    rtol_molar_mass = 1e-4  # psychrolib's R_da = 287.042 against R/M with M = 28.966 g/mol
    assert AIR_DENSITY == pytest.approx(rho_psychro, rel=rtol_molar_mass)


def test_air_specific_heat_against_coolprop_and_psychrolib():
    # source: CoolProp cp of air at 293.15 K, 101325 Pa (about 1006.1 J/(kg K))
    cp_coolprop = CP.PropsSI("C", "T", T_REF_K, "P", AIR_REFERENCE_PRESSURE, "Air")
    rtol_cp = 2e-3  # a rounded handbook constant against a real-gas equation of state
    assert AIR_SPECIFIC_HEAT == pytest.approx(cp_coolprop, rel=rtol_cp)
    # source: psychrolib dry-air enthalpy h = 1006 t (J/kg), slope = c_p
    psychrolib.SetUnitSystem(psychrolib.SI)
    slope = (psychrolib.GetDryAirEnthalpy(30.0) - psychrolib.GetDryAirEnthalpy(10.0)) / 20.0
    assert AIR_SPECIFIC_HEAT == pytest.approx(slope, rel=RTOL_ITERATION)


def test_ventilation_coefficient_against_reference_properties():
    # H_V = rho c_p V/3600 (1 - eta), rho and c_p from CoolProp at the stated state
    rho = CP.PropsSI("D", "T", T_REF_K, "P", 101325.0, "Air")
    cp = CP.PropsSI("C", "T", T_REF_K, "P", 101325.0, "Air")
    rtol_props = 3e-3  # sum of the density and c_p tolerances above
    for flow, eta in [(100.0, 0.0), (250.0, 0.75), (30.0, 0.9)]:
        expected = rho * cp * flow / 3600.0 * (1.0 - eta)
        got = ventilation_heat_loss_coefficient(flow, heat_recovery=eta)
        assert got == pytest.approx(expected, rel=rtol_props)


def test_ventilation_coefficient_near_en12831_conventional_034():
    # from memory: EN 12831-1 uses 0.34 W h/(m3 K) for rho c_p [source: en12831-1]
    rtol_two_figures = 0.015  # 0.34 is rounded to two figures (0.335 ... 0.345)
    assert ventilation_heat_loss_coefficient(1.0) == pytest.approx(0.34, rel=rtol_two_figures)


def test_ventilation_coefficient_bad_input():
    with pytest.raises(HeatLedgerError, match="air_flow_m3_per_h must not be negative"):
        ventilation_heat_loss_coefficient(-5.0)
    with pytest.raises(HeatLedgerError, match="heat_recovery must be between 0 and 1"):
        ventilation_heat_loss_coefficient(5.0, heat_recovery=1.2)


# ----------------------------------------------------------------------------- a room


RHO_CP_WH = AIR_DENSITY * AIR_SPECIFIC_HEAT / 3600.0  # W h/(m3 K)


def simple_room(**over):
    kw = dict(
        name="Study",
        temp_inside=20.0,
        volume=40.0,
        elements=[
            Element("north wall", 12.0, 0.25),
            Element("window", 2.0, 1.4, kind="window"),
            Element("roof", 16.0, 0.15, kind="roof", thermal_bridge_allowance=0.05),
        ],
        ventilation=Ventilation("air_change", ventilation_rate=0.5, infiltration=0.1),
        thermal_bridges=[LinearBridge("window reveals", 0.05, 6.0),
                         PointBridge("balcony fixings", 0.2, count=3)],
        floor_area=16.0,
        reheat_factor=8.0,
    )
    kw.update(over)
    return Room(**kw)


def test_outside_room_against_en12831_sums():
    room = simple_room()
    te = -8.0
    # source: EN 12831-1:2017 clause 6, H_T = sum A U e + sum psi l + sum chi, from memory
    h_t = 12 * 0.25 + 2 * 1.4 + 16 * (0.15 + 0.05) + 0.05 * 6 + 0.2 * 3
    # ventilation: V = (0.5 + 0.1) x 40 m3/h, H_V = rho c_p V / 3600
    h_v = RHO_CP_WH * 0.6 * 40.0
    reheat = 8.0 * 16.0  # Phi_hu = f_RH A
    r = room.heat_load(te)
    assert r.transmission_coefficient == pytest.approx(h_t, abs=atol_same_equation)
    assert r.ventilation_coefficient == pytest.approx(h_v, abs=atol_same_equation)
    expected = (h_t + h_v) * (20.0 - te) + reheat
    assert r.design_heat_load == pytest.approx(expected, abs=atol_same_equation)
    assert room.design_heat_load(te) == r.design_heat_load
    assert room.transmission_coefficient == pytest.approx(h_t)
    assert room.ventilation_coefficient == pytest.approx(h_v)
    assert r.reheat_allowance == reheat


def test_shares_add_up_and_lines_are_complete():
    r = simple_room().heat_load(-5.0)
    assert sum(ln.share for ln in r.lines) == pytest.approx(1.0, abs=ATOL_ROUND_OFF)
    assert sum(ln.heat_loss for ln in r.lines) == pytest.approx(r.design_heat_load)
    names = [ln.name for ln in r.lines]
    assert names == ["north wall", "window", "roof", "window reveals", "balcony fixings",
                     "ventilation", "heating-up allowance"]
    roof = r.lines[2]
    assert roof.transmittance == 0.15 and roof.bridge_allowance == 0.05
    assert roof.coefficient == pytest.approx(16 * 0.2)
    assert any("EN 12831-1" in p for p in r.provenance)


@settings(max_examples=50, deadline=None)
@given(te1=st.floats(-30.0, 15.0), te2=st.floats(-30.0, 15.0))
def test_heat_load_linear_in_temperature_difference(te1, te2):
    # outside-only room without reheat: Phi = H (theta_int - theta_e), linear in delta T
    room = simple_room(reheat_factor=0.0)
    h = room.heat_loss_coefficient
    for te in (te1, te2):
        assert room.design_heat_load(te) == pytest.approx(h * (20.0 - te), rel=RTOL_ROUND_OFF)


@settings(max_examples=30, deadline=None)
@given(tu=st.floats(-5.0, 18.0), te=st.floats(-25.0, -6.0))
def test_unheated_by_temperature_equals_physical_flow(tu, te):
    # source: EN 12831-1, b_u = (theta_int - theta_u)/(theta_int - theta_e), from memory
    room = Room("Hall", 20.0, 30.0, [Element("to garage", 10.0, 0.5, Unheated(temperature=tu))],
                Ventilation("flow"))
    r = room.heat_load(te)
    line = r.lines[0]
    assert line.factor == pytest.approx((20.0 - tu) / (20.0 - te))
    assert line.heat_loss == pytest.approx(10.0 * 0.5 * (20.0 - tu), rel=RTOL_ROUND_OFF)


def test_unheated_by_adjustment_factor():
    room = Room("Hall", 20.0, 30.0,
                [Element("to loft", 10.0, 0.2, Unheated(adjustment_factor=0.9), kind="ceiling")],
                Ventilation("flow"))
    assert room.transmission_coefficient == pytest.approx(10 * 0.2 * 0.9)
    assert room.heat_load(-10.0).lines[0].factor_rule == "b_u given"


def test_ground_element_flow_uses_annual_mean_temperature():
    # from memory: EN 12831-1 H_T,ig = f_g1 f_g2 A U_equiv G_w, f_g2 = (ti - tme)/(ti - te),
    # f_g1 = 1.45, G_w = 1.15 with a water table 1 m or less below the floor
    slab = slab_on_ground(20.0, 9.0, 0.3, 2.5, exposed_outline="partial")
    room = Room("Kitchen", 20.0, 50.0,
                [Element("floor", 20.0, slab, Ground(9.0, groundwater_factor=1.15),
                         kind="floor")],
                Ventilation("flow"), temp_outside=-10.0)
    for te in (-10.0, -3.0):
        r = room.heat_load(te)
        assert r.lines[0].heat_loss == pytest.approx(1.45 * 1.15 * 20 * slab.u_value * (20 - 9))
        fg2 = (20 - 9) / (20 - te)
        assert r.lines[0].factor == pytest.approx(1.45 * fg2 * 1.15)
    assert room.transmission_coefficient == pytest.approx(
        1.45 * (11 / 30) * 1.15 * 20 * slab.u_value)
    assert "13370" in r.lines[0].source


def test_window_and_construction_objects_are_duck_typed():
    class StandIn:  # any object with .u_value, as heatledger's Construction has
        u_value = 0.3
        method = "stand-in construction"

    w = window(1.2, 0.4, 1.1, 1.4, 4.6, 0.08)
    d = declared_window(1.3, source="invented declaration (test)")
    room = Room("Bed", 18.0, 30.0,
                [Element("wall", 10.0, StandIn()), Element("w1", 1.6, w, kind="window"),
                 Element("w2", 1.0, d, kind="window"), Element("wall 2", 5.0, "cavity")],
                Ventilation("flow", ventilation_rate=20.0), constructions={"cavity": 0.4})
    assert room.transmission_coefficient == pytest.approx(3.0 + 1.6 * w.u_value + 1.3 + 2.0)
    srcs = [ln.source for ln in room.heat_load(-3).lines[:4]]
    assert "stand-in construction" in srcs[0] and "10077-1" in srcs[1]
    assert "declared" in srcs[2] and '"cavity"' in srcs[3]


def test_real_construction_object_works_as_u():
    from heatledger.constructions import Construction, Layer

    c = Construction([Layer(0.1, 1.0), Layer(0.1, 0.04)])
    room = Room("Store", 15.0, 20.0, [Element("wall", 8.0, c)], Ventilation("flow"))
    assert room.transmission_coefficient == pytest.approx(8.0 * c.u_value)


# ----------------------------------------------------------------------------- ventilation


def test_minimum_air_change_tops_up_without_recovery():
    v = Ventilation("flow", ventilation_rate=10.0, infiltration=2.0, heat_recovery=0.8,
                    minimum_air_change=0.5)
    room = Room("Office", 21.0, 60.0, [Element("wall", 5.0, 0.3)], v)
    r = room.ventilation_flows()
    # from memory: EN 12831 natural case V = max(V_inf, V_min); here the shortfall of
    # 0.5 x 60 - (10 + 2) = 18 m3/h is added as outdoor air without recovery
    assert r.top_up_flow == pytest.approx(18.0)
    assert r.minimum_governs
    assert r.effective_flow == pytest.approx(2.0 + 10.0 * 0.2 + 18.0)
    assert r.coefficient == pytest.approx(RHO_CP_WH * r.effective_flow)
    assert "governs" in r.method


def test_air_change_and_flow_bases_agree():
    a = Room("A", 20.0, 50.0, [Element("w", 1.0, 1.0)],
             Ventilation("air_change", ventilation_rate=0.6, infiltration=0.2, heat_recovery=0.5))
    b = Room("A", 20.0, 50.0, [Element("w", 1.0, 1.0)],
             Ventilation("flow", ventilation_rate=30.0, infiltration=10.0, heat_recovery=0.5))
    assert a.ventilation_coefficient == pytest.approx(b.ventilation_coefficient)
    assert a.ventilation_coefficient == pytest.approx(RHO_CP_WH * (10.0 + 30.0 * 0.5))


# ----------------------------------------------------------------------------- buildings


def two_room_house():
    living = Room(
        "Living", 21.0, 60.0,
        [Element("front wall", 15.0, 0.3), Element("window", 4.0, 1.2, kind="window"),
         Element("to hall", 12.0, 1.8, AdjacentRoom(room="Hall"))],
        Ventilation("air_change", ventilation_rate=0.5, infiltration=0.2),
        floor_area=24.0, reheat_factor=4.0,
    )
    hall = Room(
        "Hall", 16.0, 25.0,
        [Element("front wall", 6.0, 0.3), Element("door", 2.0, 1.8, kind="door"),
         Element("to living", 12.0, 1.8, AdjacentRoom(room="Living")),
         Element("to neighbour", 8.0, 0.9, AdjacentRoom(temperature=12.0))],
        Ventilation("air_change", ventilation_rate=0.5),
    )
    return Building("House", [living, hall], temp_outside=-4.0)


def test_building_is_sum_of_rooms_less_internal_exchange():
    b = two_room_house()
    r = b.heat_load(-4.0)
    rooms_h = sum(x.transmission_coefficient for x in r.rooms)
    internal = sum(ln.coefficient for x in r.rooms for ln in x.lines if ln.internal)
    assert r.rooms_transmission_coefficient == pytest.approx(rooms_h)
    assert r.internal_exchange_coefficient == pytest.approx(internal)
    assert r.transmission_coefficient == pytest.approx(rooms_h - internal)
    assert b.transmission_coefficient == pytest.approx(rooms_h - internal)
    assert r.ventilation_coefficient == pytest.approx(sum(x.ventilation_coefficient
                                                          for x in r.rooms))
    # both sides of the party wall are modelled: the exchange cancels in heat-flow terms
    assert r.internal_exchange_heat_loss == pytest.approx(0.0, abs=ATOL_ITERATION)
    # building load = sum over rooms of everything except the room-to-room lines
    external = sum(ln.heat_loss for x in r.rooms for ln in x.lines if not ln.internal)
    assert r.design_heat_load == pytest.approx(external)
    assert sum(ln.share for ln in r.lines) == pytest.approx(1.0)
    assert sum(r.by_kind.values()) == pytest.approx(r.design_heat_load)
    # the neighbouring dwelling at 12 degC is a loss of this building, not internal
    neighbour = [ln for ln in r.lines if ln.name == "to neighbour"][0]
    assert not neighbour.internal
    assert neighbour.heat_loss == pytest.approx(8 * 0.9 * (16 - 12))


def test_room_facing_only_rooms_at_its_own_temperature_loses_nothing():
    inner = Room("Core", 20.0, 30.0,
                 [Element("east", 10.0, 1.5, AdjacentRoom(room="East")),
                  Element("west", 10.0, 1.5, AdjacentRoom(room="West"))],
                 Ventilation("flow"))
    east = Room("East", 20.0, 30.0, [Element("outer", 10.0, 0.3),
                                     Element("core", 10.0, 1.5, AdjacentRoom(room="Core"))],
                Ventilation("flow"))
    west = Room("West", 20.0, 30.0, [Element("outer", 10.0, 0.3),
                                     Element("core", 10.0, 1.5, AdjacentRoom(room="Core"))],
                Ventilation("flow"))
    r = Building("Block", [inner, east, west]).heat_load(-10.0)
    core = r.rooms[0]
    assert core.transmission_coefficient == 0.0
    assert core.design_heat_load == 0.0
    assert r.design_heat_load == pytest.approx(2 * 10 * 0.3 * 30)


def test_annual_energy_from_degree_days():
    b = two_room_house()
    h = b.heat_loss_coefficient
    # from memory: Q (kWh) = 24 H DD / 1000 [source: degree-days]
    assert b.annual_energy(2200.0) == pytest.approx(24 * h * 2200 / 1000)
    res = b.annual_energy_result(2200.0, degree_day_base=15.5)
    assert res.degree_day_base == 15.5
    assert any("15.5 degC" in p for p in res.provenance)
    assert any("NOT STATED" in p for p in b.annual_energy_result(2200.0).provenance)
    living = b.heat_load(-4.0).rooms[0]
    per_room = b.room_annual_energy(1000.0, degree_day_base=15.5)
    assert per_room["Living"].energy == pytest.approx(
        24 * (living.transmission_coefficient + living.ventilation_coefficient) * 1000 / 1000)
    # a room of the building cannot resolve its neighbour by name on its own
    with pytest.raises(HeatLedgerError, match="only a Building can resolve"):
        b.rooms[0].annual_energy(1000.0)
    alone = simple_room()
    assert alone.annual_energy(1000.0) == pytest.approx(24 * alone.heat_loss_coefficient)


# ----------------------------------------------------------------------------- bad input


def test_negative_area_names_room_element_and_rule():
    with pytest.raises(HeatLedgerError,
                       match=r'room "Study", element "north wall": area must be greater than '
                             r"zero; got -12"):
        simple_room(elements=[Element("north wall", -12.0, 0.25)])


def test_frame_area_larger_than_window_element():
    w = window(0.3, 2.0, 1.1, 1.4, 2.4, 0.08)
    with pytest.raises(HeatLedgerError,
                       match=r'room "Study", element "w": frame area 2 m2 is larger than the '
                             r"window area 1.5 m2"):
        simple_room(elements=[Element("w", 1.5, w, kind="window")])
    with pytest.raises(HeatLedgerError, match="differs from the area"):
        simple_room(elements=[Element("w", 2.5, w, kind="window")])


def test_unknown_construction_names_room_element_and_choices():
    with pytest.raises(HeatLedgerError,
                       match=r'room "Study", element "wall": construction "brick" does not '
                             r'exist; known constructions: "block"'):
        simple_room(elements=[Element("wall", 5.0, "brick")],
                    constructions={"block": 0.3}).heat_load(-3)


def test_unknown_room_name_in_building():
    a = Room("A", 20.0, 30.0, [Element("to B", 5.0, 1.0, AdjacentRoom(room="Bee"))],
             Ventilation("flow"))
    with pytest.raises(HeatLedgerError,
                       match=r'room "A", element "to B": faces room "Bee", which does not '
                             r'exist in the building; rooms are "A"'):
        Building("X", [a]).heat_load(-3)
    with pytest.raises(HeatLedgerError, match="only a Building can resolve"):
        a.heat_load(-3)


def test_temperature_boundary_needs_design_external_temperature():
    room = Room("Hall", 20.0, 30.0, [Element("garage", 10.0, 0.5, Unheated(temperature=5.0))],
                Ventilation("flow"))
    with pytest.raises(HeatLedgerError, match="temp_outside"):
        _ = room.transmission_coefficient
    assert room.heat_load(-10.0).transmission_coefficient == pytest.approx(10 * 0.5 * 15 / 30)


@pytest.mark.parametrize(
    "element,match",
    [
        (Element("x", 5.0, 0.3, "ground"), 'boundary "ground" needs its data'),
        (Element("x", 5.0, 0.3, Unheated()), "exactly one of temperature or adjustment"),
        (Element("x", 5.0, 0.3, Unheated(temperature=5, adjustment_factor=0.5)), "exactly one"),
        (Element("x", 5.0, 0.3, AdjacentRoom(room="B", temperature=18)), "exactly one of room"),
        (Element("x", 5.0, 0.3, Unheated(adjustment_factor=1.5)), "between 0 and 1"),
        (Element("x", 5.0, 0.3, kind="facade"), "kind must be one of"),
        (Element("x", 5.0, object()), "u must be a number"),
        (Element("x", 5.0, -0.3), "U-value must not be negative"),
    ],
)
def test_bad_elements(element, match):
    with pytest.raises(HeatLedgerError, match=match):
        simple_room(elements=[element]).heat_load(-5.0)


def test_other_room_level_errors():
    with pytest.raises(HeatLedgerError, match="used twice"):
        simple_room(elements=[Element("a", 1.0, 0.3), Element("a", 2.0, 0.3)])
    with pytest.raises(HeatLedgerError, match="needs the floor_area"):
        simple_room(floor_area=0.0, reheat_factor=5.0)
    with pytest.raises(HeatLedgerError, match="must be below the internal temperature"):
        simple_room().heat_load(25.0)
    with pytest.raises(HeatLedgerError, match="ventilation basis must be one of"):
        simple_room(ventilation=Ventilation("ach", 0.5))
    with pytest.raises(HeatLedgerError, match="appears twice"):
        Building("B", [simple_room(), simple_room()])
    with pytest.raises(HeatLedgerError, match="different design external temperatures"):
        Building("B", [simple_room(temp_outside=-3.0)],
                 temp_outside=-5.0)


def test_boundary_string_outside_and_object_agree():
    a = simple_room(elements=[Element("w", 5.0, 0.3, "outside")])
    b = simple_room(elements=[Element("w", 5.0, 0.3, Outside())])
    assert a.transmission_coefficient == b.transmission_coefficient


def test_module_states_caution_and_sources():
    assert "competent person" in " ".join(heatloss.__doc__.split())
    assert "EN 12831-1:2017" in heatloss.__doc__
    assert math.isclose(heatloss.GROUND_FACTOR_FG1, 1.45)  # from memory: EN 12831-1 f_g1


@settings(max_examples=30, deadline=None)
@given(t_a=st.floats(12.0, 24.0), t_b=st.floats(12.0, 24.0), te=st.floats(-20.0, 5.0),
       u_party=st.floats(0.3, 3.0))
def test_internal_exchange_cancels_for_any_temperatures(t_a, t_b, te, u_party):
    # heat leaving A through the party wall enters B: the building loses neither
    a = Room("A", t_a, 40.0, [Element("out", 10.0, 0.3),
                              Element("party", 9.0, u_party, AdjacentRoom(room="B"))],
             Ventilation("air_change", ventilation_rate=0.5))
    b = Room("B", t_b, 40.0, [Element("out", 12.0, 0.3),
                              Element("party", 9.0, u_party, AdjacentRoom(room="A"))],
             Ventilation("air_change", ventilation_rate=0.5))
    r = Building("Pair", [a, b]).heat_load(te)
    assert r.internal_exchange_heat_loss == pytest.approx(0.0, abs=ATOL_ITERATION)
    # the building load equals that of the same rooms with the party wall left out
    a0 = Room("A", t_a, 40.0, [Element("out", 10.0, 0.3)], Ventilation("air_change",
                                                                        ventilation_rate=0.5))
    b0 = Room("B", t_b, 40.0, [Element("out", 12.0, 0.3)], Ventilation("air_change",
                                                                        ventilation_rate=0.5))
    r0 = Building("Pair", [a0, b0]).heat_load(te)
    assert r.design_heat_load == pytest.approx(r0.design_heat_load, rel=RTOL_ROUND_OFF)
    assert r.transmission_coefficient == pytest.approx(r0.transmission_coefficient,
                                                       rel=RTOL_ROUND_OFF)


def test_room_alone_next_to_spaces_at_its_own_temperature_loses_nothing():
    room = Room("Flat core", 20.0, 30.0,
                [Element("to flat above", 30.0, 0.8, AdjacentRoom(temperature=20.0),
                         kind="ceiling"),
                 Element("to flat below", 30.0, 0.8, AdjacentRoom(temperature=20.0),
                         kind="floor")],
                Ventilation("flow"), temp_outside=-5.0)
    assert room.transmission_coefficient == 0.0
    assert room.design_heat_load(-5.0) == 0.0
    # shares are undefined for a zero load and say so (nan), rather than dividing by zero
    assert all(math.isnan(ln.share) for ln in room.heat_load(-5.0).lines)


def test_constructions_resolved_through_the_building():
    class StandIn:
        def __init__(self, u):
            self.u_value = u

    shared = StandIn(0.35)
    a = Room("A", 20.0, 30.0, [Element("wall", 10.0, "block")], Ventilation("flow"))
    b = Building("B", [a], constructions={"block": shared})
    assert b.transmission_coefficient == pytest.approx(3.5)
    line = b.heat_load(-5.0).lines[0]
    assert '"block" (defined for the building)' in line.source
    # the same name defined differently by the room and the building is ambiguous
    a2 = Room("A", 20.0, 30.0, [Element("wall", 10.0, "block")], Ventilation("flow"),
              constructions={"block": StandIn(0.5)})
    with pytest.raises(HeatLedgerError, match="defined differently by the room and the building"):
        Building("B", [a2], constructions={"block": shared}).heat_load(-5.0)


def test_ground_result_area_must_match_element_area():
    slab = slab_on_ground(20.0, 18.0, 0.3, 2.0)
    with pytest.raises(HeatLedgerError, match=r'element "floor": element area 25 m2 differs'):
        simple_room(elements=[Element("floor", 25.0, slab, Ground(9.0), kind="floor")])
