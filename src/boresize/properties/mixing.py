"""Kernels for mixture properties: COSTALD liquid volume, homogeneous two-phase density and viscosity,
fraction conversions. SI floats in and out; ``chemicals`` is imported inside the one kernel that needs it.
"""

from __future__ import annotations

import math
from collections.abc import Sequence

__all__ = [
    "COSTALD_MAX_TR",
    "costald_liquid_volume",
    "homogeneous_density",
    "mcadams_viscosity",
    "mole_fractions",
    "mass_fractions",
    "molar_mass",
]

#: Highest reduced temperature T/Tcm at which COSTALD is used [-]. Hankinson & Thomson give
#: 0.25 < Tr < 0.95; measured against CoolProp for propane at 45 bar, the compressed-liquid form is
#: within 0.2 % up to Tr 0.95 and 15 % off at Tr 0.98.
COSTALD_MAX_TR = 0.95

#: Molar gas constant [J/(mol K)] (CODATA 2018, exact).
_R = 8.314462618


def costald_liquid_volume(temperature: float, pressure: float, bubble_pressure: float | None,
                          xs: Sequence[float], tcs: Sequence[float], vcs: Sequence[float],
                          omegas: Sequence[float], saturated: float | None = None) -> float | None:
    """Molar volume of a liquid (pure or mixture), corrected for pressure [m3/mol].

    Saturated volume: ``saturated`` when given (e.g. from data correlations), else Hankinson &
    Thomson's corresponding-states liquid density (COSTALD) with their mixing rules for Tcm, V*m and
    omega_m, the characteristic volume V* and omega_SRK taken as the critical volume and acentric
    factor. Compressed liquid above ``bubble_pressure``: the Tait-type correction of Thomson, Brobst &
    Hankinson with Pcm = (0.291 - 0.080 omega_m) R Tcm / V*m.

    :param temperature: [K]; :param pressure: [Pa abs]
    :param bubble_pressure: vapour (pure) or bubble (mixture) pressure at ``temperature`` [Pa abs];
        None or not below ``pressure``: the saturated volume is returned
    :param xs: mole fractions [-]; :param tcs: critical temperatures [K]
    :param vcs: critical volumes [m3/mol]; :param omegas: acentric factors [-]
    :param saturated: saturated liquid molar volume at ``temperature`` [m3/mol], if known
    :return: molar volume [m3/mol], or None when T/Tcm >= :data:`COSTALD_MAX_TR` (out of range)

    Sources: R. W. Hankinson, G. H. Thomson, AIChE J. 25 (1979) 653-663, doi:10.1002/aic.690250412;
    G. H. Thomson, K. R. Brobst, R. W. Hankinson, AIChE J. 28 (1982) 671-676, doi:10.1002/aic.690280420.
    """
    from chemicals.volume import COSTALD, COSTALD_compressed, COSTALD_mixture_parameters

    tcm, vcm, omega = COSTALD_mixture_parameters(list(xs), list(tcs), list(vcs), list(omegas))
    if not temperature / tcm < COSTALD_MAX_TR:
        return None
    if saturated is None:
        saturated = COSTALD(temperature, tcm, vcm, omega)
    if bubble_pressure is None or not pressure > bubble_pressure:
        return float(saturated)
    pcm = (0.291 - 0.080 * omega) * _R * tcm / vcm
    return float(COSTALD_compressed(temperature, pressure, bubble_pressure, tcm, pcm, omega, saturated))


def homogeneous_density(quality: float, gas_density: float, liquid_density: float) -> float:
    """No-slip (homogeneous) two-phase density [kg/m3]: 1/rho = x/rho_g + (1 - x)/rho_l.

    :param quality: vapour mass fraction x [-]
    :param gas_density: [kg/m3]; :param liquid_density: [kg/m3]

    >>> round(homogeneous_density(0.5, 10.0, 1000.0), 3)
    19.802
    """
    return 1.0 / (quality / gas_density + (1.0 - quality) / liquid_density)


def mcadams_viscosity(quality: float, gas_viscosity: float, liquid_viscosity: float) -> float:
    """Homogeneous two-phase viscosity by McAdams' rule [Pa s]: 1/mu = x/mu_g + (1 - x)/mu_l.

    Source: W. H. McAdams, W. K. Woods, L. C. Heroman, Trans. ASME 64 (1942) 193-200.

    :param quality: vapour mass fraction x [-]
    :param gas_viscosity: [Pa s]; :param liquid_viscosity: [Pa s]
    """
    return 1.0 / (quality / gas_viscosity + (1.0 - quality) / liquid_viscosity)


def molar_mass(zs: Sequence[float], molar_masses: Sequence[float]) -> float:
    """Mean molar mass [kg/mol] of mole fractions ``zs`` [-] of components of ``molar_masses`` [kg/mol]."""
    return math.fsum(z * m for z, m in zip(zs, molar_masses))


def mass_fractions(zs: Sequence[float], molar_masses: Sequence[float]) -> tuple[float, ...]:
    """Mass fractions [-] from mole fractions ``zs`` [-] and molar masses [kg/mol]."""
    mean = molar_mass(zs, molar_masses)
    return tuple(z * m / mean for z, m in zip(zs, molar_masses))


def mole_fractions(ws: Sequence[float], molar_masses: Sequence[float]) -> tuple[float, ...]:
    """Mole fractions [-] from mass fractions ``ws`` [-] and molar masses [kg/mol]."""
    moles = [w / m for w, m in zip(ws, molar_masses)]
    total = math.fsum(moles)
    return tuple(n / total for n in moles)
