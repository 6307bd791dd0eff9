"""Choosing the property backend for a line, and turning its flow into a mass flow.

A line that names a backend (``backend`` column) gets that one. Otherwise a line that gives both
density and viscosity uses them (backend ``table``, recorded as the source); otherwise the first
registered backend whose ``handles(line)`` is true serves it.
"""

from __future__ import annotations

from typing import Any

from boresize.errors import InputError
from boresize.model import FluidState, Line
from boresize.plugins import PluginHost

__all__ = ["choose_backend", "fluid_state", "mass_flow_of"]


def choose_backend(host: PluginHost, line: Line) -> Any:
    """The backend object that serves ``line`` (InputError naming the field when none does)."""
    if line.backend:
        if line.backend not in host.backends:
            raise InputError(f"unknown property backend {line.backend!r}", field="backend", value=line.backend,
                             expected=f"one of {', '.join(host.backends.ids())}").for_line(line.tag)
        return host.backends.get(line.backend)
    if line.density is not None and line.viscosity is not None and "table" in host.backends:
        return host.backends.get("table")
    for backend in host.backends:
        if backend.id != "table" and backend.handles(line):
            return backend
    for backend in host.backends:  # let a backend that resolves names explain (close matches)
        resolve = getattr(backend, "resolve", None)
        if resolve is not None and line.density is None and line.viscosity is None:
            try:
                resolve(line.fluid)
            except InputError as exc:
                raise exc.for_line(line.tag) from None
    given = "density" if line.density is not None else "viscosity" if line.viscosity is not None else None
    hint = f"; {given} was given but not both density and viscosity" if given else ""
    raise InputError(f"no property backend knows fluid {line.fluid!r}{hint}", field="fluid", value=line.fluid,
                     expected="a pure fluid by name, CoolProp name or CAS number, or both density and viscosity"
                     ).for_line(line.tag)


def fluid_state(host: PluginHost, line: Line) -> FluidState:
    """Properties at the line's inlet pressure and temperature."""
    backend = choose_backend(host, line)
    try:
        return backend.state(line, line.pressure, line.temperature)
    except InputError as exc:
        raise (exc if exc.tag else exc.for_line(line.tag)) from None


def mass_flow_of(host: PluginHost, line: Line, state: FluidState) -> float:
    """Mass flow [kg/s] from the line's flow: mass as is, actual volume times the line density,
    standard volume times the density at the stated reference conditions (same backend)."""
    flow = line.flow
    if flow.basis == "mass":
        return flow.value
    if flow.basis == "volume":
        return flow.value * state.density
    if flow.reference_p is None or flow.reference_t is None:
        raise InputError("standard volume flow without reference conditions", field="flow", value=flow,
                         expected="Sm3/h, Nm3/h, scf/h or MMSCFD").for_line(line.tag)
    backend = choose_backend(host, line)
    if backend.id == "table":
        raise InputError(
            "a standard volume flow needs the fluid's density at reference conditions, which line-list "
            "density and viscosity do not give", field="flow", value=flow.reference_name,
            expected="a mass or actual volume flow, or a fluid the equation of state knows").for_line(line.tag)
    reference = backend.state(line, flow.reference_p, flow.reference_t)
    if reference.phase not in ("gas", "supercritical"):
        raise InputError(
            f"{line.fluid} is {reference.phase} at the reference conditions ({flow.reference_name}); a standard "
            f"volume is a gas volume", field="flow", value=flow.reference_name,
            expected="a mass or actual volume flow for a liquid").for_line(line.tag)
    return flow.value * reference.density
