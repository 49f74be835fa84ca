"""The physical constants heatledger computes from the SI defining constants, checked
against scipy.constants (CODATA, as published by NIST)."""

import math

import pytest
import scipy.constants as codata

from heatledger import _constants as c
from tests.tolerances import RTOL_CONSTANTS

RTOL_ROUNDING = RTOL_CONSTANTS  # tests/tolerances.py


@pytest.mark.parametrize(("ours", "reference"), [
    (c.STEFAN_BOLTZMANN, codata.Stefan_Boltzmann),  # source: CODATA via scipy.constants
    (c.GAS_CONSTANT, codata.R),                      # source: CODATA via scipy.constants
    (c.ZERO_CELSIUS, codata.zero_Celsius),           # source: SI definition of the kelvin
    (c.STANDARD_ATMOSPHERE, codata.atm),             # source: definition, 101 325 Pa
    (c.SECONDS_PER_HOUR, codata.hour),
    (c.BOLTZMANN, codata.k), (c.PLANCK, codata.h), (c.SPEED_OF_LIGHT, codata.c),
    (c.AVOGADRO, codata.N_A),
])
def test_constant_matches_codata(ours, reference):
    assert math.isclose(ours, reference, rel_tol=RTOL_ROUNDING)


def test_stefan_boltzmann_published_digits():
    # source: CODATA 2018, sigma = 5.670 374 419... e-8 W m-2 K-4 (exact, truncated)
    assert math.isclose(c.STEFAN_BOLTZMANN, 5.670374419e-8, rel_tol=1e-9)
