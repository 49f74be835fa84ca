"""Bad sections are refused with a message that names the region or surface and the rule
(DEVELOPERS.md, "Design rules"; EN ISO 10211, 5 and 6, for what a section is)."""

from __future__ import annotations

import pytest

from heatledger import HeatLedgerError, Region, Section2D, Surface

WARM = Surface(0, 0, 1, 0, temperature=20, resistance=0.13, name="inside")
COLD = Surface(0, 1, 1, 1, temperature=0, resistance=0.04, name="outside")
BLOCK = Region(0, 0, 1, 1, 1.0, name="block")


@pytest.mark.parametrize(("make", "message"), [
    (lambda: Region(0, 0, 1, 1, 0.0, name="wood"),
     r'region "wood" conductivity must be greater than zero; got 0'),
    (lambda: Region(0, 0, 1, 1, -0.1, name="wood"),
     r'region "wood" conductivity must be greater than zero'),
    (lambda: Region(0, 0, 0, 1, 1.0, name="sliver"),
     r'region "sliver" has zero width x1 - x0'),
    (lambda: Region(0, 0.3, 1, 0.3, 1.0, name="sliver"),
     r'region "sliver" has zero height y1 - y0'),
    (lambda: Region(0, 0, float("nan"), 1, 1.0, name="r"),
     r'region "r" x1 must be a finite number'),
    (lambda: Surface(0, 0, 1, 1, temperature=0, resistance=0.1, name="slope"),
     r'surface "slope" from \(0, 0\) to \(1, 1\) m is slanted'),
    (lambda: Surface(0.5, 0, 0.5, 0, temperature=0, resistance=0.1, name="dot"),
     r'surface "dot" has zero length'),
    (lambda: Surface(0, 0, 1, 0, temperature=0, resistance=-0.1, name="neg"),
     r'surface "neg" resistance must not be negative'),
    (lambda: Surface(0, 0, 1, 0, temperature=0, resistance=0.1, name=""),
     r"every surface needs a name"),
])
def test_bad_parts_are_refused(make, message):
    with pytest.raises(HeatLedgerError, match=message):
        make()


def test_regions_with_a_gap_are_not_one_body():
    parts = [Region(0, 0, 1, 1, 1.0, name="left"), Region(1.2, 0, 2, 1, 1.0, name="right")]
    surfs = [Surface(0, 0, 1, 0, temperature=20, resistance=0.1, name="a"),
             Surface(1.2, 1, 2, 1, temperature=0, resistance=0.1, name="b")]
    with pytest.raises(HeatLedgerError, match=r'2 separate parts \(region "left" \(number 1\); '
                                              r'region "right" \(number 2\)\)'):
        Section2D(parts, surfs)


def test_regions_touching_at_a_corner_are_not_one_body():
    parts = [Region(0, 0, 1, 1, 1.0, name="a"), Region(1, 1, 2, 2, 1.0, name="b")]
    surfs = [Surface(0, 0, 1, 0, temperature=20, resistance=0.1, name="s1"),
             Surface(1, 2, 2, 2, temperature=0, resistance=0.1, name="s2")]
    with pytest.raises(HeatLedgerError, match="touching only at a corner"):
        Section2D(parts, surfs)


def test_a_hole_that_cuts_the_body_in_two_is_a_gap():
    # a later region cannot remove material, so a cut is a gap between two regions
    parts = [Region(0, 0, 1, 0.4, 1.0, name="lower"), Region(0, 0.6, 1, 1, 1.0, name="upper")]
    with pytest.raises(HeatLedgerError, match="do not form one connected body"):
        Section2D(parts, [WARM, COLD])


def test_a_hole_inside_the_body_is_allowed():
    ring = [Region(0, 0, 1, 0.2, 1.0, name="bottom"), Region(0, 0.8, 1, 1, 1.0, name="top"),
            Region(0, 0.2, 0.2, 0.8, 1.0, name="left"),
            Region(0.8, 0.2, 1, 0.8, 1.0, name="right")]
    res = Section2D(ring, [WARM, COLD]).solve(0.05)
    assert res.heat_flow("inside") > 0
    with pytest.raises(HeatLedgerError, match=r"the point \(0\.5, 0\.5\) m is not in the body"):
        res.temperature_at(0.5, 0.5)


@pytest.mark.parametrize(("surface", "message"), [
    (Surface(0, 0.5, 1, 0.5, temperature=0, resistance=0.04, name="middle"),
     r'surface "middle" does not lie on the outline of the body: near \(0\.5, 0\.5\) m it has '
     r"material on both sides"),
    (Surface(0, 1.5, 1, 1.5, temperature=0, resistance=0.04, name="above"),
     r'surface "above" does not lie on the outline.*it has no material'),
    (Surface(0, 1, 1.5, 1, temperature=0, resistance=0.04, name="overhang"),
     r'surface "overhang" does not lie on the outline of the body: near \(1\.25, 1\) m'),
])
def test_a_surface_off_the_outline_is_refused(surface, message):
    with pytest.raises(HeatLedgerError, match=message):
        Section2D([BLOCK], [WARM, surface])


def test_overlapping_and_duplicate_surfaces_are_refused():
    other = Surface(0.5, 0, 1, 0, temperature=5, resistance=0.1, name="patch")
    with pytest.raises(HeatLedgerError, match=r'surface "patch" overlaps surface "inside"'):
        Section2D([BLOCK], [WARM, COLD, other])
    twin = Surface(0, 0, 0, 1, temperature=0, resistance=0.1, name="inside")
    with pytest.raises(HeatLedgerError, match='two surfaces are named "inside"'):
        Section2D([BLOCK], [WARM, twin])


def test_surfaces_need_two_different_temperatures():
    same = Surface(0, 1, 1, 1, temperature=20, resistance=0.04, name="outside")
    with pytest.raises(HeatLedgerError, match="every surface has the ambient temperature 20 "
                                              "degC"):
        Section2D([BLOCK], [WARM, same])
    with pytest.raises(HeatLedgerError, match="got no surfaces"):
        Section2D([BLOCK], [])


def test_other_bad_calls_name_the_rule():
    with pytest.raises(HeatLedgerError, match="at least one region"):
        Section2D([], [WARM, COLD])
    with pytest.raises(HeatLedgerError, match=r"regions\[0\] must be a Region"):
        Section2D([(0, 0, 1, 1, 1.0)], [WARM, COLD])
    sec = Section2D([BLOCK], [WARM, COLD])
    with pytest.raises(HeatLedgerError, match="max_cell must be greater than zero"):
        sec.solve(0.0)
    res = sec.solve(0.1)
    with pytest.raises(HeatLedgerError, match=r'there is no surface "roof"; the surfaces are '
                                              r'"inside" or "outside"'):
        res.heat_flow("roof")
    with pytest.raises(HeatLedgerError, match=r'dimensions must be one of "internal", '
                                              r'"external" or "overall internal"; got '
                                              r'"sideways"'):
        res.psi([(0.3, 1.0)], dimensions="sideways")
    with pytest.raises(HeatLedgerError, match=r"flanking\[0\] must be a pair \(U-value, "
                                              r"length\); got 0\.3"):
        res.psi([0.3], dimensions="internal")
