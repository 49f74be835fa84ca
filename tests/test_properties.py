"""Property-based checks of the construction engine (hypothesis)."""

import numpy as np
from hypothesis import given, settings
from hypothesis import strategies as st

from heatledger import AirLayer, BridgedLayer, Construction, Layer

thickness = st.floats(0.001, 0.5)
conductivity = st.floats(0.01, 60.0)
directions = st.sampled_from(["up", "horizontal", "down"])


@st.composite
def layers(draw):
    kind = draw(st.sampled_from(["material", "declared", "air", "bridged"]))
    d = draw(thickness)
    if kind == "material":
        return Layer(d, draw(conductivity))
    if kind == "declared":
        return Layer(d, resistance=draw(st.floats(0.01, 5.0)))
    if kind == "air":
        return AirLayer(min(d, 0.3))
    f = draw(st.floats(0.05, 0.5))
    return BridgedLayer(d, [(draw(conductivity), 1 - f), (draw(conductivity), f)])


stacks = st.lists(layers(), min_size=1, max_size=6)
temps = st.tuples(st.floats(-30.0, 40.0), st.floats(-30.0, 40.0))


@settings(max_examples=60, deadline=None)
@given(stacks, directions, st.floats(0.001, 0.3), st.floats(0.02, 0.05))
def test_adding_insulation_never_raises_u(stack, heat_flow, d_ins, lam):
    # source: EN ISO 6946:2017 6.7.1: a layer adds a positive resistance in series
    before = Construction(stack, heat_flow)
    after = Construction(stack + [Layer(d_ins, lam)], heat_flow)
    assert after.u_value <= before.u_value * (1 + 1e-12)


@settings(max_examples=60, deadline=None)
@given(st.lists(st.one_of(st.builds(Layer, thickness, conductivity),
                          st.builds(lambda d: AirLayer(min(d, 0.3)), thickness)),
                min_size=1, max_size=6), directions, st.randoms())
def test_layer_order_does_not_change_u(stack, heat_flow, rnd):
    # series resistances commute (EN ISO 6946 6.7.1); bridged layers are excluded because
    # their sections combine with the other layers
    shuffled = list(stack)
    rnd.shuffle(shuffled)
    a = Construction(stack, heat_flow).u_value
    b = Construction(shuffled, heat_flow).u_value
    assert abs(a - b) <= 1e-12 * a


@settings(max_examples=60, deadline=None)
@given(stacks, directions, temps, st.integers(1, 8))
def test_temperatures_monotonic_and_balanced(stack, heat_flow, tt, nodes):
    # source: steady 1-D conduction without sources (Incropera & DeWitt 6th ed. section 3.1):
    # the heat flux is uniform, so the temperature falls monotonically between the ambients
    t_in, t_out = tt
    con = Construction(stack, heat_flow)
    res = con.temperatures(t_in, t_out, nodes_per_layer=nodes)
    profile = np.concatenate(([t_in], res.interface_temperatures, [t_out]))
    nodes_all = np.sort(np.concatenate((res.temperature, res.interface_temperatures)))
    tol = 1e-9 * max(1.0, abs(t_in), abs(t_out))
    diffs = np.diff(profile)
    if t_in >= t_out:
        assert (diffs <= tol).all()
    else:
        assert (diffs >= -tol).all()
    lo, hi = min(t_in, t_out), max(t_in, t_out)
    assert nodes_all.min() >= lo - tol and nodes_all.max() <= hi + tol
    # energy balance to 1e-9 relative (issue 2); exact flux U * delta T
    assert abs(res.energy_residual) < 1e-9
    assert abs(res.heat_flux - con.u_value_uncorrected * (t_in - t_out)) <= 1e-9 * max(
        1.0, abs(res.heat_flux))
