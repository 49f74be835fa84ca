"""Physical constants, computed from the exact defining constants of the SI.

Since the 2019 revision of the SI the Planck constant, the Boltzmann constant, the speed of
light and the Avogadro constant are exact by definition, so every constant heatledger needs
follows from them with no measured digits typed in. Computing them here keeps
``import heatledger`` from loading ``scipy.constants`` (about 0.1 s); a test compares every
value below with ``scipy.constants`` (CODATA).

References
----------
BIPM, *The International System of Units (SI)*, 9th edition (2019), Table 1 (defining
constants) and 2.3.1; the Stefan-Boltzmann constant sigma = 2 pi^5 k^4 / (15 h^3 c^2).

Sources: [source: bipm-si].
"""

from __future__ import annotations

import math

__all__ = [
    "PLANCK",
    "BOLTZMANN",
    "SPEED_OF_LIGHT",
    "AVOGADRO",
    "GAS_CONSTANT",
    "STEFAN_BOLTZMANN",
    "ZERO_CELSIUS",
    "STANDARD_ATMOSPHERE",
    "SECONDS_PER_HOUR",
]

#: Planck constant, exact (SI 2019). [J s]
PLANCK = 6.62607015e-34
#: Boltzmann constant, exact (SI 2019). [J/K]
BOLTZMANN = 1.380649e-23
#: Speed of light in vacuum, exact. [m/s]
SPEED_OF_LIGHT = 299792458.0
#: Avogadro constant, exact (SI 2019). [1/mol]
AVOGADRO = 6.02214076e23
#: Molar gas constant R = N_A k. [J/(mol K)]
GAS_CONSTANT = AVOGADRO * BOLTZMANN
#: Stefan-Boltzmann constant sigma = 2 pi^5 k^4 / (15 h^3 c^2). [W/(m2 K4)]
STEFAN_BOLTZMANN = (2.0 * math.pi**5 * BOLTZMANN**4
                    / (15.0 * PLANCK**3 * SPEED_OF_LIGHT**2))
#: The Celsius zero on the kelvin scale, exact by definition. [K]
ZERO_CELSIUS = 273.15
#: One standard atmosphere, exact by definition. [Pa]
STANDARD_ATMOSPHERE = 101325.0
#: Seconds in one hour. [s]
SECONDS_PER_HOUR = 3600.0
