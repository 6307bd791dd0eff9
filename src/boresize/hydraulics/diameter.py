"""Inside diameter for a target frictional drop per length (SI floats in and out).

``swamee_jain_diameter`` is an explicit FIRST GUESS, used to start the search through the pipe
class; ``exact_diameter`` solves Darcy-Weisbach with the friction factor boresize rates pipes
with, so the record can show how far the guess was off.
"""

from __future__ import annotations

import math

from boresize.errors import InputError
from boresize.hydraulics.darcy import drop_per_length as _darcy_drop
from boresize.hydraulics.darcy import flow_area, require_positive
from boresize.hydraulics.friction import darcy_friction_factor

__all__ = ["swamee_jain_diameter", "exact_diameter"]

_MAX_RELATIVE_ROUGHNESS = 0.9  # the search never looks at pipes rougher than this (e/D)


def _check_inputs(
    volume_flow: float, drop_per_length: float, density: float, viscosity: float, roughness: float
) -> None:
    require_positive(volume_flow, "volume_flow", "m3/s")
    require_positive(drop_per_length, "drop_per_length", "Pa/m")
    require_positive(density, "density", "kg/m3")
    require_positive(viscosity, "viscosity", "Pa s")
    if not (math.isfinite(roughness) and roughness >= 0.0):
        raise InputError(f"{roughness!r} m is not usable", field="roughness", value=roughness,
                         expected="a finite roughness >= 0 m")


def swamee_jain_diameter(
    volume_flow: float, drop_per_length: float, density: float, viscosity: float, roughness: float
) -> float:
    """Explicit estimate of the inside diameter giving a frictional drop per length (Swamee-Jain).

    D = 0.66 [e^1.25 (L Q^2 / (g h_f))^4.75 + nu Q^9.4 (L / (g h_f))^5.2]^0.04, with
    L / (g h_f) = rho / (dp/L) so that g cancels, and nu = mu / rho.

    A FIRST GUESS only: against the exact Colebrook diameter it is typically 0.5-2 % too large
    for water lines (the drop at that diameter is a few per cent below target); use
    :func:`exact_diameter` or rate real pipe sizes with
    :func:`boresize.hydraulics.darcy.rate_pipe` for the answer.

    :param volume_flow: actual volume flow Q [m3/s], > 0
    :param drop_per_length: target frictional drop per length [Pa/m], > 0
    :param density: [kg/m3], > 0
    :param viscosity: dynamic viscosity [Pa s], > 0
    :param roughness: absolute roughness e [m], >= 0
    :returns: inside diameter [m]
    :raises InputError: naming the first input that is not usable

    Reference: P. K. Swamee and A. K. Jain, "Explicit equations for pipe-flow problems",
    J. Hydraulics Div. ASCE 102(5):657-664 (1976).
    """
    _check_inputs(volume_flow, drop_per_length, density, viscosity, roughness)
    length_term = density / drop_per_length  # L / (g h_f) [s2/m]
    kinematic = viscosity / density
    rough = roughness**1.25 * (volume_flow * volume_flow * length_term) ** 4.75
    viscous = kinematic * volume_flow**9.4 * length_term**5.2
    diameter: float = 0.66 * (rough + viscous) ** 0.04  # float ** float is typed Any (it may be complex)
    return diameter


def _drop_at(diameter: float, volume_flow: float, density: float, viscosity: float,
             roughness: float) -> float:
    """Frictional drop per length [Pa/m] of ``volume_flow`` in a pipe of ``diameter`` [m]."""
    v = volume_flow / flow_area(diameter)
    f, _ = darcy_friction_factor(density * v * diameter / viscosity, roughness / diameter)
    return _darcy_drop(f, density, v, diameter)


def exact_diameter(
    volume_flow: float, drop_per_length: float, density: float, viscosity: float, roughness: float
) -> float:
    """Inside diameter at which the Darcy-Weisbach drop per length equals the target.

    Solved with Brent's method on D, bracketed around :func:`swamee_jain_diameter`. The
    friction factor is boresize's own (:func:`~boresize.hydraulics.friction.darcy_friction_factor`:
    64/Re below Re 2000, the larger of 64/Re and exact Colebrook above), so the result agrees with
    :func:`~boresize.hydraulics.darcy.rate_pipe`. If the target falls in the jump of f at
    Re = 2000, the diameter of that jump is returned (the smallest D whose drop does not
    exceed the target).

    :param volume_flow: actual volume flow [m3/s], > 0
    :param drop_per_length: target frictional drop per length [Pa/m], > 0
    :param density: [kg/m3], > 0
    :param viscosity: dynamic viscosity [Pa s], > 0
    :param roughness: absolute roughness [m], >= 0
    :returns: inside diameter [m], to a relative tolerance of about 1e-13
    :raises InputError: naming the first input that is not usable, or ``drop_per_length``
        when the target needs a pipe with e/D above 0.9
    """
    from scipy.optimize import brentq  # import on first use: scipy.optimize costs ~0.5 s

    guess = swamee_jain_diameter(volume_flow, drop_per_length, density, viscosity, roughness)

    def excess(diameter: float) -> float:
        return _drop_at(diameter, volume_flow, density, viscosity, roughness) - drop_per_length

    floor = roughness / _MAX_RELATIVE_ROUGHNESS
    low, high = max(0.5 * guess, floor), 2.0 * guess
    while excess(low) < 0.0:
        if low <= floor:
            raise InputError(
                f"{drop_per_length!r} Pa/m needs a pipe rougher than e/D = {_MAX_RELATIVE_ROUGHNESS}",
                field="drop_per_length", value=drop_per_length,
                expected=f"a drop per length reachable with a pipe of roughness {roughness!r} m",
            )
        low = max(0.5 * low, floor)
    while excess(high) > 0.0:
        high *= 2.0
    return float(brentq(excess, low, high, xtol=1e-300, rtol=1e-13))
