"""Reported sums do not depend on the order of their terms, bit for bit.

R_T = Rsi + Σ R + Rse (EN ISO 6946:2017, 6.7.1) and a room's H_T = Σ A U + Σ ψ l + Σ χ
(EN 12831-1:2017, clause 6) are sums, so exact arithmetic gives the same value for any order
of the layers or elements. A plain running sum in floating point does not (its last bit
depends on the order, and Python 3.12 changed how ``sum`` adds floats); the engine adds
with ``math.fsum``, the correctly rounded sum, so these results are the same on every
machine and Python, and for every order of input. Checked: exact equality.
"""

from __future__ import annotations

import itertools

from heatledger import Construction, Layer
from heatledger.heatloss import Element, Room, Ventilation

# invented layers (thickness [m], conductivity [W/(m K)]) whose running sums differ in the
# last bit between some orders
LAYERS = [(0.0125, 0.25), (0.1, 0.035), (0.215, 0.77), (0.05, 0.13), (0.102, 0.77),
          (0.02, 1.0)]
# invented elements (area [m2], U [W/(m2 K)])
ELEMENTS = [(12.3, 0.27), (2.1, 1.3), (16.7, 0.17), (7.9, 0.31), (3.3, 0.9), (0.7, 2.9)]


def test_total_resistance_is_the_same_for_every_order_of_the_layers():
    totals = {Construction([Layer(d, lam) for d, lam in order]).total_resistance
              for order in itertools.permutations(LAYERS)}
    # source: EN ISO 6946:2017, 6.7.1, R_T = Rsi + R_1 + ... + R_n + Rse (a sum: order-free)
    assert len(totals) == 1, sorted(float.hex(t) for t in totals)


def _room(elements) -> Room:
    return Room(name="Invented room", temp_inside=20.0, volume=40.0,
                elements=[Element(f"element {i}", a, u) for i, (a, u) in elements],
                ventilation=Ventilation("air_change", ventilation_rate=0.5))


def test_room_transmission_is_the_same_for_every_order_of_the_elements():
    loads = {(r.transmission_coefficient, r.design_heat_load)
             for r in (_room(order).heat_load(-8.0)
                       for order in itertools.permutations(enumerate(ELEMENTS)))}
    # source: EN 12831-1:2017, clause 6, H_T = sum of A U e_k over the elements (order-free)
    assert len(loads) == 1, loads
