"""The range of a pure fluid's CoolProp equation of state: its fixed points and limits, and the check that a
(pressure, temperature) pair lies inside it and is not solid (:mod:`boresize.properties.coolprop`)."""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

from boresize.errors import InputError
from boresize.properties.base import ZERO_CELSIUS

__all__ = ["Limits", "check_range"]


@dataclass(frozen=True)
class Limits:
    """Fixed points and range of one fluid's equation of state (SI: K, Pa, kg/mol)."""

    t_triple: float
    p_triple: float
    t_critical: float
    p_critical: float
    rho_critical: float
    t_max: float
    p_max: float
    molar_mass: float


def _celsius(temperature: float) -> str:
    """A temperature [K] written in degC for messages."""
    return f"{round(temperature - ZERO_CELSIUS, 2):g} degC"


def check_range(state: Any, name: str, limits: Limits, pressure: float, temperature: float) -> None:
    """Raise InputError when (pressure [Pa abs], temperature [K]) is outside the EOS range or solid."""
    if not pressure > 0.0:
        raise InputError(f"{pressure:g} Pa is not an absolute pressure", field="pressure",
                         value=pressure, expected="a pressure above zero (absolute)")
    if pressure > limits.p_max:
        raise InputError(
            f"{pressure / 1e5:.6g} bar abs is above the upper limit of the {name} equation of state",
            field="pressure", value=pressure, expected=f"at most {limits.p_max / 1e5:.6g} bar abs for {name}")
    if temperature > limits.t_max:
        raise InputError(
            f"{_celsius(temperature)} is above the upper limit of the {name} equation of state",
            field="temperature", value=temperature, expected=f"at most {_celsius(limits.t_max)} for {name}")
    if temperature < limits.t_triple:
        raise InputError(
            f"{name} would be solid at {_celsius(temperature)}: below its triple point "
            f"{_celsius(limits.t_triple)} ({limits.t_triple:.2f} K)",
            field="temperature", value=temperature,
            expected=f"at least {_celsius(limits.t_triple)} for {name}")
    melting = _melting_temperature(state, limits, pressure)
    if melting is not None and temperature < melting:
        raise InputError(
            f"{name} would be solid at {_celsius(temperature)} and {pressure / 1e5:.6g} bar abs: "
            f"below its melting temperature {_celsius(melting)} at that pressure",
            field="temperature", value=temperature, expected=f"at least {_celsius(melting)} for {name}")


def _melting_temperature(state: Any, limits: Limits, pressure: float) -> float | None:
    """Melting temperature [K] at ``pressure`` [Pa abs], or None when the fluid has no melting line
    there (then CoolProp's own flash still refuses a solid state, reported as PropertyError)."""
    if not state.has_melting_line() or pressure <= limits.p_triple:
        return None
    from CoolProp import CoolProp as CP

    try:
        return float(state.melting_line(CP.iT, CP.iP, pressure))
    except ValueError:  # pressure outside the melting-line correlation's range
        return None
