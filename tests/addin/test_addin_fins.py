"""Spreadsheet functions for fins (heatledger_xl.udfs_fins): values against the textbook
closed forms written out here and the ``ht`` library, fin sets against the array
equations, and a hypothesis proof that no function raises.

All fins are invented examples of our own.
"""

from __future__ import annotations

import datetime as dt
import math
import re

import ht
import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from heatledger_xl import udfs_fins as uf
from heatledger_xl.cells import ERROR_VALUES
from heatledger_xl.registry import MAX_DESCRIPTION, PREFIX, REGISTRY
from tests.addin._addin_helpers import call_with_drawn, check_bad_optional_named, check_result
from tests.tolerances import ATOL_ROUND_OFF, RTOL_ITERATION, RTOL_ROUND_OFF

FINS = sorted(n for n, s in REGISTRY.items() if s.family == "fins")
rtol_closed = RTOL_ROUND_OFF  # tests/tolerances.py
DEADLINE_MS = 1000  # every bad input answers within a second (the add-in's rule)

# Invented aluminium plate fin, per metre of base: L 50 mm, t 2 mm, k 200, h 25, 80/20 degC.
PLATE = (50.0, 2.0, 200.0, 25.0, 80.0, 20.0)


def uniform_plate(tip: str):
    """q [W] of the plate fin by Incropera & DeWitt 6th ed., Table 3.4, written out here."""
    big_l, t, w, k, h, theta = 0.050, 0.002, 1.0, 200.0, 25.0, 60.0
    p, a_c = 2 * (w + t), w * t
    m = math.sqrt(h * p / (k * a_c))
    big_m = math.sqrt(h * p * k * a_c) * theta
    ml = m * big_l
    if tip == "adiabatic":  # case B
        return big_m * math.tanh(ml)
    if tip == "infinite":  # case D
        return big_m
    if tip == "corrected":  # case B on L_c = L + t/2 (eq. 3.89)
        return big_m * math.tanh(m * (big_l + t / 2))
    r = h / (m * k)  # case A
    return big_m * (math.sinh(ml) + r * math.cosh(ml)) / (math.cosh(ml) + r * math.sinh(ml))


def test_fin_functions_are_registered_with_units_and_our_prefix():
    assert len(FINS) == len(uf.__all__) == 14
    assert set(FINS) == set(uf.__all__)
    for name in FINS:
        spec = REGISTRY[name]
        assert name.startswith(PREFIX) and re.fullmatch(r"[A-Z][A-Z0-9_]*", name)
        assert 20 <= len(spec.description) <= MAX_DESCRIPTION, name
        for a in spec.args:
            assert 10 <= len(a.doc) <= MAX_DESCRIPTION, (name, a.name)
            assert re.search(r"\[[^\]]+\]$", a.doc), f"{name}({a.name}) has no unit"
        flags = [a.optional for a in spec.args]
        assert flags == sorted(flags), name
        if any(a.name == "header" for a in spec.args):
            assert spec.args[-1].name == "header"


@pytest.mark.parametrize("tip", ["convective", "adiabatic", "infinite", "corrected"])
def test_plate_heat_rate_is_table_3_4(tip):
    # source: Incropera & DeWitt 6th ed., Table 3.4 cases A, B, D and eq. 3.89 (recalled)
    assert uf.HL_FIN_HEATRATE(*PLATE, None, tip) == pytest.approx(uniform_plate(tip),
                                                                  rel=rtol_closed)


def test_efficiency_effectiveness_resistance_and_tip_temperature():
    q = uniform_plate("adiabatic")
    theta, h = 60.0, 25.0
    # source: Incropera & DeWitt 6th ed., eqs. 3.86 (A_f = 2 w L + 2 t L), 3.81 and 3.83
    a_f, a_c = 2 * (1.0 + 0.002) * 0.050, 0.002
    assert uf.HL_FIN_EFFICIENCY(*PLATE, "plate", "adiabatic") == pytest.approx(
        q / (h * a_f * theta), rel=rtol_closed)
    assert uf.HL_FIN_EFFECTIVENESS(*PLATE, "plate", "adiabatic") == pytest.approx(
        q / (h * a_c * theta), rel=rtol_closed)
    assert uf.HL_FIN_RESISTANCE(*PLATE, "plate", "adiabatic") == pytest.approx(theta / q,
                                                                               rel=rtol_closed)
    # source: Incropera & DeWitt 6th ed., eq. 3.75: theta(L)/theta_b = 1/cosh(mL)
    m = math.sqrt(25.0 * 2 * 1.002 / (200.0 * 0.002))
    assert uf.HL_FIN_TIP_TEMP(*PLATE, "plate", "adiabatic") == pytest.approx(
        20.0 + 60.0 / math.cosh(m * 0.050), rel=rtol_closed)


def test_pin_with_prescribed_tip_temperature():
    # source: Incropera & DeWitt 6th ed., Table 3.4 case C: q = M (theta_b cosh mL - theta_L)
    # / sinh mL; invented steel pin D 10 mm, L 100 mm, k 50, h 25, T_L 30 degC
    d, big_l, k, h = 0.010, 0.100, 50.0, 25.0
    m = math.sqrt(4 * h / (k * d))
    big_m = math.sqrt(h * math.pi * d * k * math.pi * d * d / 4)
    q = big_m * (60.0 * math.cosh(m * big_l) - 10.0) / math.sinh(m * big_l)
    assert uf.HL_FIN_HEATRATE(100, 10, 50, 25, 80, 20, "pin", "temperature", None, 30) == \
        pytest.approx(q, rel=rtol_closed)
    assert uf.HL_FIN_TIP_TEMP(100, 10, 50, 25, 80, 20, "pin", "temperature", None, 30) == \
        pytest.approx(30.0, abs=ATOL_ROUND_OFF)


def test_profiled_plate_efficiencies_are_table_3_5():
    # source: Incropera & DeWitt 6th ed., Table 3.5: parabolic plate eta = 2/(sqrt(4(mL)^2+1)+1)
    m = math.sqrt(2 * 25.0 / (180.0 * 0.003))
    ml = m * 0.030
    assert uf.HL_FIN_EFFICIENCY(30, 3, 180, 25, 80, 20, None, "adiabatic", None, None,
                                "parabolic") == pytest.approx(
        2 / (math.sqrt(4 * ml * ml + 1) + 1), rel=rtol_closed)
    # source: Table 3.5, triangular plate eta = I1(2mL)/(mL I0(2mL)) (scipy.special.iv)
    from scipy.special import iv
    assert uf.HL_FIN_EFFICIENCY(30, 3, 180, 25, 80, 20, None, None, None, None,
                                "triangular") == pytest.approx(
        iv(1, 2 * ml) / (ml * iv(0, 2 * ml)), rel=RTOL_ROUND_OFF)


@pytest.mark.parametrize(("d_fin", "t", "h"), [(57.15, 0.38, 58.0), (50.0, 1.0, 10.0),
                                               (80.0, 0.5, 120.0)])
def test_annular_efficiency_against_ht(d_fin, t, h):
    # source: ht.fin_efficiency_Kern_Kraus (Kern & Kraus 1972), adiabatic rim, as in ht 1.x
    ref = ht.fin_efficiency_Kern_Kraus(0.0254, d_fin / 1000.0, t / 1000.0, 200.0, h)
    assert uf.HL_ANNULAR_EFFICIENCY(25.4, d_fin, t, 200.0, h, 80, 20) == pytest.approx(
        ref, rel=RTOL_ITERATION)


def test_annular_temperatures_and_rim():
    rows = uf.HL_ANNULAR_TEMPS(25.4, 57.15, 0.38, 200, 58, 80, 20, None, 5, None, True)
    assert rows[0] == ["radius [mm]", "temperature [degC]"]
    radii = [r[0] for r in rows[1:]]
    assert radii == pytest.approx(np.linspace(12.7, 28.575, 5), rel=RTOL_ROUND_OFF)
    assert rows[1][1] == pytest.approx(80.0, abs=ATOL_ROUND_OFF)
    assert rows[-1][1] == pytest.approx(uf.HL_ANNULAR_TIP_TEMP(25.4, 57.15, 0.38, 200, 58, 80,
                                                              20), rel=RTOL_ROUND_OFF)
    temps = [r[1] for r in rows[1:]]
    assert all(a > b for a, b in zip(temps, temps[1:], strict=False))


def test_temperature_table_closed_form_and_finite_volumes_converge():
    # source: Incropera & DeWitt 6th ed., eq. 3.75: theta/theta_b = cosh m(L - x)/cosh mL
    m = math.sqrt(25.0 * 2 * 1.002 / (200.0 * 0.002))
    rows = uf.HL_FIN_TEMPS(*PLATE, None, "adiabatic", None, None, None, 6)
    for x_mm, temp in rows:
        x = x_mm / 1000.0
        assert temp == pytest.approx(20 + 60 * math.cosh(m * (0.05 - x)) / math.cosh(m * 0.05),
                                     rel=rtol_closed)
    # finite volumes: error in the tip temperature falls about fourfold per halving
    exact = rows[-1][1]
    errors = [abs(uf.HL_FIN_TEMPS(*PLATE, None, "adiabatic", None, None, None, None, n)[-1][1]
                  - exact) for n in (10, 20, 40)]
    ratios = [errors[0] / errors[1], errors[1] / errors[2]]
    assert all(3.5 < r < 4.5 for r in ratios), ratios  # second order: 4 per halving


def test_results_spill_carries_the_fv_check_and_the_warning():
    rows = uf.HL_FIN_RESULTS(20, 10, 0.2, 200, 80, 20, None, None, None, None, None, 100,
                             True)
    assert rows[0] == ["quantity", "value", "unit"]
    values = {r[0]: r[1] for r in rows[1:] if r[0] != "warning"}
    assert values["effectiveness"] < 1
    # the mesh estimate bounds the finite-volume error against the closed form: Richardson
    # with the observed order times the safety factor 1.25 (Roache 1998, eq. 5.4.1 and
    # section 5.9), so at least the error and at most 1.25 x it plus the asymptotic slack
    error = abs(values["fv_heat_rate"] - values["heat_rate"])
    assert error <= values["fv_mesh_estimate"] <= 1.35 * error
    assert abs(values["fv_energy_residual"]) < 1e-9
    assert any(r[0] == "warning" and "does not help" in r[1] for r in rows)
    assert len({len(r) for r in rows}) == 1


# Invented aluminium heat sink on a drive: 14 plate fins 40 x 2 x 120 mm on a 0.0216 m2 base.
SINK = [["key", "value"], ["kind", "straight"], ["material", "aluminium alloy"], ["h", 12],
        ["temp_base", 70], ["temp_fluid", 40], ["length_mm", 40], ["thickness_mm", 2],
        ["width_mm", 120], ["count", 14], ["base_area", 0.0216], ["target_heat_rate", 60]]


def test_finset_array_against_overall_surface_efficiency():
    values = {r[0]: r[1] for r in uf.HL_FINSET(SINK) if r[0] != "warning"}
    # source: Incropera & DeWitt 6th ed., eqs. 3.102-3.108: A_t = N A_f + A_b,
    # eta_o = 1 - N A_f (1 - eta_f)/A_t, q_t = eta_o h A_t theta_b
    a_f, a_c, n, h, theta = values["fin_area"], values["cross_section_area"], 14, 12.0, 30.0
    a_t = n * a_f + (0.0216 - n * a_c)
    eta_o = 1 - n * a_f * (1 - values["efficiency"]) / a_t
    assert values["total_area"] == pytest.approx(a_t, rel=RTOL_ROUND_OFF)
    assert values["overall_efficiency"] == pytest.approx(eta_o, rel=RTOL_ROUND_OFF)
    assert values["array_heat_rate"] == pytest.approx(eta_o * h * a_t * theta, rel=RTOL_ROUND_OFF)
    assert values["array_resistance"] == pytest.approx(1 / (eta_o * h * a_t), rel=RTOL_ROUND_OFF)
    assert uf.HL_FINSET_VALUE(SINK, "overall_efficiency") == values["overall_efficiency"]


def test_finset_inverse_answers_round_trip():
    length = uf.HL_FINSET_VALUE(SINK, "length_for_target_mm")
    resized = [r if r[0] != "length_mm" else ["length_mm", length] for r in SINK]
    assert uf.HL_FINSET_VALUE(resized, "array_heat_rate") == pytest.approx(60.0, rel=RTOL_ITERATION)
    count = uf.HL_FINSET_VALUE(SINK, "count_for_target")
    more = [r if r[0] != "count" else ["count", count] for r in SINK]
    fewer = [r if r[0] != "count" else ["count", count - 1] for r in SINK]
    assert uf.HL_FINSET_VALUE(more, "array_heat_rate") >= 60.0
    assert uf.HL_FINSET_VALUE(fewer, "array_heat_rate") < 60.0


def test_finset_problems_name_the_key_and_row():
    out = uf.HL_FINSET(SINK + [["lenght_mm", 3]])
    assert out.startswith("HL_FINSET: spec lenght_mm (row 13): unknown key")
    out = uf.HL_FINSET([r if r[0] != "length_mm" else ["length_mm", -3] for r in SINK])
    assert "spec length_mm" in out and "greater than zero" in out
    out = uf.HL_FINSET_VALUE(SINK, "nonsense")
    assert out.startswith("HL_FINSET_VALUE: quantity must be one of")


@pytest.mark.parametrize(("call", "fragment"), [
    (lambda: uf.HL_FIN_HEATRATE(-5, 2, 200, 25, 80, 20), "length_mm must be at least"),
    (lambda: uf.HL_FIN_HEATRATE(50, 2, 200, 25, 80, 20, "pin", None, 100), "width_mm"),
    (lambda: uf.HL_FIN_HEATRATE(50, 2, 200, 25, 80, 20, None, "temperature"),
     "temp_tip"),
    (lambda: uf.HL_FIN_HEATRATE(50, 2, 200, 25, 80, 20, None, "infinite", None, None,
                                "parabolic"), "tip must be"),
    (lambda: uf.HL_ANNULAR_HEATRATE(50, 40, 1, 200, 25, 80, 20), "fin_diameter_mm must exceed"),
    (lambda: uf.HL_FIN_EFFICIENCY(50, 2, 200, 25, 20, 20, None, "temperature", None, 30),
     "temp_base equals temp_fluid"),
])
def test_bad_input_gives_one_line_naming_the_argument(call, fragment):
    out = call()
    assert isinstance(out, str) and "\n" not in out and fragment in out, out


# --------------------------------------------------------------------------- never raises
cells = st.one_of(
    st.none(), st.just(""), st.floats(allow_nan=True, allow_infinity=True),
    st.integers(min_value=-(10**400), max_value=10**400), st.booleans(), st.text(max_size=12),
    st.sampled_from(sorted(ERROR_VALUES)),
    st.sampled_from(["12.5", "-3", "1e999", "nan", "TRUE", "pin", "plate", "adiabatic",
                     "temperature", "infinite", "corrected", "convective", "triangular",
                     "parabolic", "kind", "straight", "annular", "=1+1"]),
    st.datetimes(), st.dates(),
)
spec_rows = st.lists(st.lists(cells, max_size=3), max_size=12)
scalars = st.one_of(cells, cells, st.lists(st.lists(cells, max_size=2), max_size=2))
positive = st.floats(min_value=1e-3, max_value=1e5)
PLAUSIBLE = {
    "length_mm": positive, "size_mm": positive, "tube_diameter_mm": positive,
    "fin_diameter_mm": positive, "thickness_mm": positive, "width_mm": st.one_of(st.none(),
                                                                                positive),
    "conductivity": st.floats(min_value=1e-3, max_value=1e4),
    "h": st.floats(min_value=1e-3, max_value=1e6),
    "temp_base": st.floats(min_value=-273.15, max_value=2000),
    "temp_fluid": st.floats(min_value=-273.15, max_value=2000),
    "temp_tip": st.one_of(st.none(), st.floats(min_value=-273.15, max_value=2000)),
    "shape": st.sampled_from([None, "plate", "pin"]),
    "tip": st.sampled_from([None, "convective", "adiabatic", "temperature", "infinite",
                            "corrected"]),
    "profile": st.sampled_from([None, "rectangular", "triangular", "parabolic"]),
    "points": st.one_of(st.none(), st.integers(min_value=2, max_value=60)),
    "nodes": st.one_of(st.none(), st.integers(min_value=2, max_value=300)),
    "header": st.one_of(st.none(), st.booleans()),
    "quantity": st.sampled_from([None, "heat_rate", "array_heat_rate", "count_for_target"]),
    "spec": st.lists(st.tuples(st.sampled_from(["kind", "material", "conductivity", "h",
                                                "length_mm", "thickness_mm", "count",
                                                "base_area", "cells", "emissivity", "tip"]),
                               st.one_of(st.floats(min_value=-10, max_value=500),
                                         st.sampled_from(["straight", "annular", "steel",
                                                          "adiabatic"]))).map(list),
                     max_size=10).map(lambda rows: [["temp_base", 80],
                                                    ["temp_fluid", 20]] + rows),
}


@pytest.mark.parametrize("name", FINS)
@settings(max_examples=80, deadline=DEADLINE_MS,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])
@given(data=st.data())
def test_any_cell_values_give_a_result_or_a_one_line_text(name, data):
    check_result(name, call_with_drawn(name, data.draw, spec_rows, scalars))


@pytest.mark.parametrize("name", FINS)
@settings(max_examples=60, deadline=DEADLINE_MS,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])
@given(data=st.data())
def test_plausible_inputs_reach_the_engine_and_never_raise(name, data):
    spec = REGISTRY[name]
    check_result(name, spec.function(*[data.draw(PLAUSIBLE[a.name]) for a in spec.args]))


@pytest.mark.parametrize("name", FINS)
@pytest.mark.parametrize("bad", ["#N/A", "nonsense", True, math.nan, dt.datetime(2026, 12, 2),
                                 [[1, 2], [3, 4]]])
def test_a_bad_optional_argument_is_named_even_with_blank_required_ones(name, bad):
    check_bad_optional_named(name, bad)


_SPEC_NUMBERS = st.one_of(st.floats(min_value=1e-6, max_value=1e6),
                          st.floats(allow_nan=False, allow_infinity=False),
                          st.integers(min_value=-5, max_value=10**7))
_SPEC_KEYS = ["h", "temp_base", "temp_fluid", "length_mm", "thickness_mm", "width_mm",
              "count", "base_area", "contact_resistance", "target_heat_rate", "cells",
              "emissivity", "temp_surroundings", "h_coefficient", "h_exponent",
              "tube_diameter_mm", "fin_diameter_mm", "diameter_mm", "conductivity",
              "temp_tip"]
_SPEC_TEXTS = {"tip": ["convective", "adiabatic", "temperature", "infinite"],
               "profile": ["rectangular", "triangular", "parabolic"],
               "corrected_length": [True, False]}


@st.composite
def near_valid_specs(draw):
    """A valid heat-sink or finned-tube spec with a few values replaced (reaches the array,
    the sizing and the non-linear finite volumes)."""
    if draw(st.booleans()):
        base = {r[0]: r[1] for r in SINK[1:]}
    else:
        base = {"kind": "annular", "conductivity": 200.0, "h": 58.0, "temp_base": 80.0,
                "temp_fluid": 20.0, "tube_diameter_mm": 25.4, "fin_diameter_mm": 57.15,
                "thickness_mm": 0.38, "count": 100, "base_area": 0.08}
    for key in draw(st.lists(st.sampled_from(_SPEC_KEYS), max_size=4)):
        base[key] = draw(_SPEC_NUMBERS)
    for key in draw(st.lists(st.sampled_from(list(_SPEC_TEXTS)), max_size=2)):
        base[key] = draw(st.sampled_from(_SPEC_TEXTS[key]))
    return [[k, v] for k, v in base.items()]


@settings(max_examples=200, deadline=DEADLINE_MS,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])
@given(spec=near_valid_specs(), quantity=st.sampled_from(
    [None, "array_heat_rate", "count_for_target", "length_for_target_mm",
     "fv_nonlinear_heat_rate"]))
def test_near_valid_fin_sets_never_raise(spec, quantity):
    check_result("HL_FINSET", uf.HL_FINSET(spec, True))
    check_result("HL_FINSET_VALUE", uf.HL_FINSET_VALUE(spec, quantity))
