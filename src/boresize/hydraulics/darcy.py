"""Darcy-Weisbach hydraulics of one round pipe at one flow (SI floats in and out).

Frictional pressure drop of fully developed, incompressible single-phase flow:
dp/L = f/D * rho v^2 / 2, with f from :func:`boresize.hydraulics.friction.darcy_friction_factor`.
For a gas this holds while the drop stays small against the inlet pressure (a rule of thumb
is under about 10 %, common practice); longer gas lines need a compressible calculation.
"""

from __future__ import annotations

import math

from boresize.errors import InputError
from boresize.hydraulics.friction import Regime, darcy_friction_factor
from boresize.model import Hydraulics

__all__ = ["flow_area", "velocity", "reynolds", "drop_per_length", "rate_pipe"]

_INF = math.inf


def require_positive(value: float, field: str, unit: str) -> None:
    """Raise :class:`InputError` unless ``value`` is a finite number > 0.

    :param value: the value to check, in SI
    :param field: the name of the input, for the message
    :param unit: the SI unit of the value, for the message (e.g. "m", "kg/m3")
    """
    if not (math.isfinite(value) and value > 0.0):
        raise InputError(
            f"{value!r} {unit} is not usable",
            field=field,
            value=value,
            expected=f"a finite value > 0 {unit}",
        )


def flow_area(diameter: float) -> float:
    """Cross-section of a round pipe, pi D^2 / 4.

    :param diameter: inside diameter [m]
    :returns: flow area [m2]
    """
    return 0.25 * math.pi * diameter * diameter


def velocity(mass_flow: float, density: float, diameter: float) -> float:
    """Mean velocity in a round pipe, m / (rho A).

    :param mass_flow: [kg/s]
    :param density: [kg/m3]
    :param diameter: inside diameter [m]
    :returns: mean velocity [m/s]
    """
    return mass_flow / (density * flow_area(diameter))


def reynolds(density: float, velocity: float, diameter: float, viscosity: float) -> float:
    """Reynolds number rho v D / mu.

    :param density: [kg/m3]
    :param velocity: mean velocity [m/s]
    :param diameter: inside diameter [m]
    :param viscosity: dynamic viscosity [Pa s]
    :returns: Reynolds number [-]
    """
    return density * velocity * diameter / viscosity


def drop_per_length(friction_factor: float, density: float, velocity: float, diameter: float) -> float:
    """Frictional pressure drop per length by Darcy-Weisbach, f/D * rho v^2 / 2.

    :param friction_factor: Darcy friction factor [-]
    :param density: [kg/m3]
    :param velocity: mean velocity [m/s]
    :param diameter: inside diameter [m]
    :returns: pressure drop per length [Pa/m]
    """
    return friction_factor / diameter * 0.5 * density * velocity * velocity


def _check_rating_inputs(
    mass_flow: float,
    density: float,
    viscosity: float,
    inside_diameter: float,
    roughness: float,
    length: float,
) -> None:
    try:  # the common case in one expression (a NaN fails every comparison); else find the culprit below
        if (0.0 < mass_flow < _INF and 0.0 < density < _INF and 0.0 < viscosity < _INF
                and 0.0 < inside_diameter < _INF and 0.0 <= length < _INF and 0.0 <= roughness < inside_diameter):
            return
    except TypeError:  # not a number: the checks below raise what they always raised
        pass
    require_positive(mass_flow, "mass_flow", "kg/s")
    require_positive(density, "density", "kg/m3")
    require_positive(viscosity, "viscosity", "Pa s")
    require_positive(inside_diameter, "inside_diameter", "m")
    if not (math.isfinite(length) and length >= 0.0):
        raise InputError(f"{length!r} m is not usable", field="length", value=length,
                         expected="a finite length >= 0 m")
    require_roughness(roughness, inside_diameter)


def require_roughness(roughness: float, inside_diameter: float) -> None:
    """Raise InputError unless 0 <= ``roughness`` < ``inside_diameter`` (both [m])."""
    if not (math.isfinite(roughness) and 0.0 <= roughness < inside_diameter):
        raise InputError(
            f"{roughness!r} m is not usable",
            field="roughness",
            value=roughness,
            expected=f"a roughness >= 0 m and smaller than the inside diameter {inside_diameter!r} m",
        )


def rate_pipe(
    mass_flow: float,
    density: float,
    viscosity: float,
    inside_diameter: float,
    roughness: float,
    length: float,
    speed_of_sound: float | None = None,
) -> Hydraulics:
    """Hydraulics of one pipe at one flow: velocity, Re, friction factor, drops, rho v^2, Mach.

    :param mass_flow: [kg/s], > 0
    :param density: [kg/m3], > 0
    :param viscosity: dynamic viscosity [Pa s], > 0
    :param inside_diameter: [m], > 0
    :param roughness: absolute roughness [m], 0 <= roughness < inside_diameter
    :param length: straight length [m], >= 0
    :param speed_of_sound: [m/s], > 0, or None; when given, ``mach`` = v / c
    :returns: :class:`boresize.model.Hydraulics` with every field filled (``mach`` None
        without a speed of sound); ``drop`` = ``drop_per_length`` * ``length`` [Pa]
    :raises InputError: naming the first input that is not usable
    """
    v, re, f, regime, dpl, mach = _pipe_flow(mass_flow, density, viscosity, inside_diameter, roughness, length,
                                            speed_of_sound)
    return Hydraulics(
        mass_flow=mass_flow,
        volume_flow=mass_flow / density,
        velocity=v,
        reynolds=re,
        friction_factor=f,
        regime=regime,
        drop_per_length=dpl,
        drop=dpl * length,
        momentum=density * v * v,
        mach=mach,
    )


def _pipe_flow(mass_flow: float, density: float, viscosity: float, inside_diameter: float, roughness: float,
               length: float, speed_of_sound: float | None = None
               ) -> tuple[float, float, float, Regime, float, float | None]:
    """The numbers of :func:`rate_pipe` without building a :class:`~boresize.model.Hydraulics` (for callers
    that build one with more fields, once): inputs and checks as :func:`rate_pipe`.

    :returns: (velocity [m/s], Reynolds number [-], Darcy friction factor [-], regime, drop per length [Pa/m],
        Mach number [-] or None without a speed of sound)
    :raises InputError: naming the first input that is not usable
    """
    _check_rating_inputs(mass_flow, density, viscosity, inside_diameter, roughness, length)
    mach: float | None = None
    v = velocity(mass_flow, density, inside_diameter)
    if speed_of_sound is not None:
        require_positive(speed_of_sound, "speed_of_sound", "m/s")
        mach = v / speed_of_sound
    re = reynolds(density, v, inside_diameter, viscosity)
    f, regime = darcy_friction_factor(re, roughness / inside_diameter)
    return v, re, f, regime, drop_per_length(f, density, v, inside_diameter), mach
