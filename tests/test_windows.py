"""Tests of heatledger.windows (EN ISO 10077-1 whole-window U-value)."""

from __future__ import annotations

import inspect
import math
import re

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from heatledger import windows
from heatledger.errors import HeatLedgerError
from heatledger.windows import (
    declared_window,
    perimeter_lower_bound,
    psi_glazing_default,
    psi_glazing_table,
    window,
    window_with_shutter_u,
)
from tests.tolerances import ATOL_ROUND_OFF, RTOL_ROUND_OFF

atol_same_equation = ATOL_ROUND_OFF  # tests/tolerances.py


def iso10077_window_u(parts_g, parts_f, edges_g, parts_p=(), edges_p=()):
    """EN ISO 10077-1 whole-window equation written out from the sums, independently.

    source: EN ISO 10077-1:2017 clause 6 (Uw = (sum Ag Ug + sum Af Uf + sum lg psig
    + sum Ap Up + sum lp psip) / (sum Ag + sum Af + sum Ap)); from memory, [source: iso10077-1, 6].
    """
    num = 0.0
    den = 0.0
    for a, u in (*parts_g, *parts_f, *parts_p):
        num += a * u
        den += a
    for length, psi in (*edges_g, *edges_p):
        num += length * psi
    return num / den


# ----------------------------------------------------------------------------- the equation


def test_single_light_window_by_hand():
    # An invented single-light window of 1.23 m x 1.48 m overall with a 0.1 m frame all round
    # (scenario of our own). Glazed opening 1.03 m x 1.28 m.
    aw = 1.23 * 1.48
    ag = 1.03 * 1.28
    af = aw - ag
    lg = 2 * (1.03 + 1.28)
    # source: EN ISO 10077-1:2017 clause 6 equation, from memory [source: iso10077-1]
    expected = (ag * 1.1 + af * 1.3 + lg * 0.08) / aw
    got = window(ag, af, 1.1, 1.3, lg, 0.08, window_area=aw).u_value
    assert got == pytest.approx(expected, abs=atol_same_equation)
    # and by hand: (1.3184*1.1 + 0.5020*1.3 + 4.62*0.08)/1.8204
    #            = (1.4502 + 0.6526 + 0.3696)/1.8204 = 2.4724/1.8204 = 1.3582
    atol_hand = 5e-4  # the hand sum above is carried to 4-5 figures
    assert got == pytest.approx(1.3582, abs=atol_hand)


def test_window_with_panel_matches_written_out_sums():
    got = window(1.0, 0.5, 0.7, 1.2, 4.2, 0.04, panel_area=0.4, panel_u=0.9,
                 panel_perimeter=2.6, psi_panel=0.02)
    expected = iso10077_window_u([(1.0, 0.7)], [(0.5, 1.2)], [(4.2, 0.04)],
                                 [(0.4, 0.9)], [(2.6, 0.02)])
    assert got.u_value == pytest.approx(expected, abs=atol_same_equation)
    assert got.area == pytest.approx(1.9)
    assert got.heat_loss_coefficient == pytest.approx(got.u_value * got.area)
    assert got.frame_fraction == pytest.approx(0.5 / 1.9)
    terms = (got.glazing_term, got.frame_term, got.glazing_edge_term, got.panel_term,
             got.panel_edge_term)
    assert sum(terms) == pytest.approx(got.heat_loss_coefficient)
    assert "10077-1" in got.method


@settings(max_examples=60, deadline=None)
@given(
    ag=st.floats(0.2, 6.0), af=st.floats(0.0, 2.0), ug=st.floats(0.4, 5.8),
    uf=st.floats(0.6, 7.0), psi=st.floats(-0.02, 0.12), extra=st.floats(1.0, 3.0),
)
def test_window_u_property_against_independent_equation(ag, af, ug, uf, psi, extra):
    lg = 4.0 * math.sqrt(ag) * extra  # always a possible perimeter
    got = window(ag, af, ug, uf, lg, psi).u_value
    expected = iso10077_window_u([(ag, ug)], [(af, uf)], [(lg, psi)])
    assert got == pytest.approx(expected, rel=RTOL_ROUND_OFF, abs=atol_same_equation)


@settings(max_examples=40, deadline=None)
@given(u=st.floats(0.5, 5.0), ag=st.floats(0.2, 5.0), af=st.floats(0.05, 2.0))
def test_equal_u_and_no_edge_loss_gives_that_u(u, ag, af):
    # a weighted mean of equal values is that value (no published source needed: algebra)
    assert window(ag, af, u, u, 4.0 * math.sqrt(ag), 0.0).u_value == pytest.approx(u,
                                                                                   rel=RTOL_ROUND_OFF)


@settings(max_examples=40, deadline=None)
@given(psi1=st.floats(0.0, 0.1), dpsi=st.floats(1e-4, 0.1))
def test_more_edge_loss_raises_u(psi1, dpsi):
    assert window(1.3, 0.5, 1.1, 1.3, 4.6, psi1 + dpsi).u_value > window(1.3, 0.5, 1.1, 1.3, 4.6,
                                                                       psi1).u_value


def test_arrays_work_elementwise():
    ags = np.array([1.0, 1.5, 2.0])
    got = window(ags, 0.5, 1.1, 1.4, 4.0 * np.sqrt(ags) + 0.5, 0.06).u_value
    assert isinstance(got, np.ndarray) and got.shape == (3,)
    for i, ag in enumerate(ags):
        assert got[i] == pytest.approx(window(float(ag), 0.5, 1.1, 1.4,
                                                4.0 * math.sqrt(ag) + 0.5, 0.06).u_value)


def test_result_is_not_rounded_and_rounding_is_separate():
    from heatledger.constructions import round_significant

    u = window(1.2, 0.4, 1.1, 1.4, 4.6, 0.08).u_value
    expected = (1.2 * 1.1 + 0.4 * 1.4 + 4.6 * 0.08) / 1.6  # source: EN ISO 10077-1 eq. [M]
    assert u == pytest.approx(expected, abs=atol_same_equation)
    assert u != round(u, 2)
    # source: EN ISO 10077-1:2017, U_w stated to two significant figures [M]
    assert round_significant(u) == 1.4


def test_shutter_adds_resistance_in_series():
    # source: EN ISO 10077-1:2017, U_ws = 1/(1/U_w + dR), from memory [source: iso10077-1]
    assert window_with_shutter_u(1.4, 0.15) == pytest.approx(1.0 / (1.0 / 1.4 + 0.15))
    assert window_with_shutter_u(1.4, 0.0) == pytest.approx(1.4)


def test_declared_window_records_source():
    d = declared_window(1.2, source="invented product declaration (demo)", area=1.8)
    assert d.u_value == 1.2 and d.area == 1.8 and "declared" in d.method
    with pytest.raises(HeatLedgerError, match="source"):
        declared_window(1.2, source="  ")
    with pytest.raises(HeatLedgerError, match="u_value"):
        declared_window(-1.0, source="x")


# ----------------------------------------------------------------------------- bad input


def test_negative_area_rejected():
    with pytest.raises(HeatLedgerError, match="frame_area must not be negative"):
        window(1.0, -0.2, 1.1, 1.4, 4.0, 0.08)


def test_frame_area_larger_than_window_rejected():
    with pytest.raises(HeatLedgerError, match="frame_area must not be larger than the window"):
        window(0.2, 1.5, 1.1, 1.4, 2.0, 0.08, window_area=1.2)


def test_parts_must_add_up_to_stated_window_area():
    with pytest.raises(HeatLedgerError, match="must equal window_area"):
        window(1.0, 0.3, 1.1, 1.4, 4.0, 0.08, window_area=1.6)


def test_perimeter_too_short_for_rectangle_names_the_rule():
    # a 1 m2 pane needs at least 4 m of edge (the square)
    with pytest.raises(HeatLedgerError, match=r"at least 4 sqrt\(A\)"):
        window(1.0, 0.3, 1.1, 1.4, 3.9, 0.08)
    window(1.0, 0.3, 1.1, 1.4, 4.0, 0.08)  # the square itself is fine


def test_round_pane_needs_shape_any():
    a = 0.5
    circle = 2.0 * math.sqrt(math.pi * a)  # isoperimetric bound, the circle
    with pytest.raises(HeatLedgerError, match='glazing_shape "any"'):
        window(a, 0.2, 1.1, 1.4, circle, 0.08)
    assert window(a, 0.2, 1.1, 1.4, circle, 0.08, glazing_shape="any").u_value > 0
    with pytest.raises(HeatLedgerError, match=r"2 sqrt\(pi A\)"):
        window(a, 0.2, 1.1, 1.4, 0.99 * circle, 0.08, glazing_shape="any")


def test_perimeter_lower_bound_values():
    # source: isoperimetric inequality P >= 2 sqrt(pi A); square P = 4 sqrt(A) (geometry)
    assert perimeter_lower_bound(9.0) == pytest.approx(12.0)
    assert perimeter_lower_bound(math.pi, "any") == pytest.approx(2.0 * math.pi)
    with pytest.raises(HeatLedgerError, match='"rectilinear" or "any"'):
        perimeter_lower_bound(1.0, "oval")


def test_zero_total_area_and_non_numbers_rejected():
    with pytest.raises(HeatLedgerError, match="greater than zero"):
        window(0.0, 0.0, 1.1, 1.4, 0.0, 0.08)
    with pytest.raises(HeatLedgerError, match="glazing_u must be a number"):
        window(1.0, 0.3, "one", 1.4, 4.0, 0.08)
    with pytest.raises(HeatLedgerError, match="finite"):
        window(1.0, 0.3, math.nan, 1.4, 4.0, 0.08)


# ----------------------------------------------------------------------------- psi_g table


def test_psi_table_rows_match_references_and_carry_sources():
    # from memory: EN ISO 10077-1:2006 Tables E.1/E.2 (Annex G in 2017)
    # [source: iso10077-1, Annex G]
    recalled = {
        ("wood_or_pvc", "uncoated", "conventional"): 0.06,
        ("wood_or_pvc", "low_e", "conventional"): 0.08,
        ("metal_thermal_break", "uncoated", "conventional"): 0.08,
        ("metal_thermal_break", "low_e", "conventional"): 0.11,
        ("metal_no_thermal_break", "uncoated", "conventional"): 0.02,
        ("metal_no_thermal_break", "low_e", "conventional"): 0.05,
        ("wood_or_pvc", "uncoated", "warm_edge"): 0.05,
        ("wood_or_pvc", "low_e", "warm_edge"): 0.06,
        ("metal_thermal_break", "uncoated", "warm_edge"): 0.06,
        ("metal_thermal_break", "low_e", "warm_edge"): 0.08,
    }
    rows = psi_glazing_table()
    assert {(r.frame, r.glazing, r.spacer): r.psi_glazing for r in rows} == recalled
    assert all(r.source.strip() and "[M]" in r.source for r in rows)
    assert psi_glazing_default("Metal_Thermal_Break", "low_e") == 0.11
    assert psi_glazing_default("wood_or_pvc", "low_e", spacer="warm_edge") == 0.06


def test_psi_missing_combination_lists_the_table():
    with pytest.raises(HeatLedgerError, match="the table has: .*warm_edge"):
        psi_glazing_default("metal_no_thermal_break", "low_e", spacer="warm_edge")


def test_psi_table_from_user_file(tmp_path):
    f = tmp_path / "psi.csv"
    f.write_text("# user table\nframe,glazing,spacer,psi_glazing,source\n"
                 "timber,triple,foam,0.035,invented declared value (test)\n", encoding="utf-8")
    assert psi_glazing_default("timber", "triple", spacer="foam", path=f) == 0.035
    f.write_text("frame,glazing,spacer,psi_glazing,source\n"
                 "timber,triple,foam,0.035,\n", encoding="utf-8")
    with pytest.raises(HeatLedgerError, match="source must all be filled in"):
        psi_glazing_table(f)
    f.write_text("frame,glazing,spacer,psi_glazing,source\n"
                 "a,b,c,0.03,x\na,b,c,0.04,y\n", encoding="utf-8")
    with pytest.raises(HeatLedgerError, match="appears twice"):
        psi_glazing_table(f)


# ----------------------------------------------------------------------------- docstrings


def _parameter_units_missing(obj) -> list[str]:
    doc = inspect.getdoc(obj) or ""
    m = re.search(r"^Parameters\n-+\n(.*?)(?:\n\n[A-Z][a-z]+\n-+\n|\Z)", doc, re.S | re.M)
    if not m:
        return []
    missing = []
    blocks = re.split(r"\n(?=\S)", m.group(1).strip("\n"))
    for block in blocks:
        head, _, desc = block.partition("\n")
        if not re.search(r"\[[^\]]+\]\s*$", desc.strip()):
            missing.append(f"{obj.__qualname__}: {head.strip()}")
    return missing


@pytest.mark.parametrize("modname", ["windows", "ground", "heatloss"])
def test_every_public_parameter_has_a_unit(modname):
    import importlib

    mod = importlib.import_module(f"heatledger.{modname}")
    missing: list[str] = []
    for name in mod.__all__:
        obj = getattr(mod, name)
        if inspect.isfunction(obj) or inspect.isclass(obj):
            missing += _parameter_units_missing(obj)
            if inspect.isclass(obj):
                for mname, meth in vars(obj).items():
                    if not mname.startswith("_") and inspect.isfunction(meth):
                        missing += _parameter_units_missing(meth)
    assert not missing, "parameters without a unit in brackets: " + "; ".join(missing)


def test_module_reference_and_memory_flags():
    assert "EN ISO 10077-1:2017" in windows.__doc__
    assert "[M" in windows.__doc__


@pytest.mark.parametrize("modname", ["windows", "ground", "heatloss"])
def test_public_functions_state_equation_and_reference(modname):
    import importlib

    mod = importlib.import_module(f"heatledger.{modname}")
    lacking = []
    for name in mod.__all__:
        obj = getattr(mod, name)
        if inspect.isfunction(obj):
            doc = inspect.getdoc(obj) or ""
            for section in ("Parameters", "Returns", "Raises", "Notes", "References"):
                if not re.search(rf"^{section}\n-+$", doc, re.M):
                    lacking.append(f"{name}: {section}")
    assert not lacking, "docstring sections missing: " + "; ".join(lacking)
