"""API RP 14E erosional velocity, v_e = C / sqrt(rho_m) (SI floats)."""

from __future__ import annotations

import math

__all__ = ["C_US_TO_SI", "erosional_velocity"]

# C in US units is (ft/s)*(lb/ft3)^0.5. 1 ft = 0.3048 m and 1 lb = 0.45359237 kg exactly (NIST SP 811),
# so 1 lb/ft3 = 0.45359237 / 0.3048**3 kg/m3 and C_SI = C_US * 0.3048 * sqrt(lb/ft3 in kg/m3) = 1.2199 C_US.
C_US_TO_SI = 0.3048 * math.sqrt(0.45359237 / 0.3048**3)


def erosional_velocity(density: float, c_si: float) -> float:
    """API RP 14E (5th ed., 1991, section 2.5) erosional velocity [m/s].

    :param density: fluid (or homogeneous mixture) density [kg/m3]
    :param c_si: empirical constant in SI form, (m/s)*(kg/m3)^0.5; C_US = 100 gives C_SI = 121.99

    >>> round(erosional_velocity(1000.0, 100 * C_US_TO_SI), 3)
    3.858
    """
    return c_si / math.sqrt(density)
