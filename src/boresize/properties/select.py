"""Choosing the property backend for a line, and turning its flow into a mass flow.

A line that names a backend (``backend`` column: ``coolprop``, ``gerg-2008``, ``thermo``, ``coolprop-mixture``,
``table`` or a plugin's id) gets that one. Otherwise a line that gives both density and viscosity uses
them (backend ``table``, recorded as the source); otherwise the first registered backend whose
``handles(line)`` is true serves it: with the built-ins, a pure fluid CoolProp knows -> ``coolprop``;
water with an alcohol or glycol (``mass: water 0.7, ethanol 0.3``, ``MEG 30%``) -> ``aqueous``; water with TEG, DEG,
MEA, DEA, MDEA or several solutes -> ``aqueous-mixing``; another
CoolProp incompressible liquid or brine (``NaCl 10%``) -> ``coolprop-mixture``; a mixture of GERG-2008
components only (``methane:0.9, ethane:0.1``) -> ``gerg-2008``; another mixture or a component only the
chemicals database knows -> ``thermo``.

A standard-volume flow (Sm3/h, Nm3/h, scf, MMSCFD) becomes a mass flow with the density that the
same backend gives at the unit's reference conditions, so a mixture's standard volume uses its EOS.
A molar flow (kmol/h, lbmol/h) becomes a mass flow with the molar mass of the line's state; the record says so
(:func:`flow_note`).
"""

from __future__ import annotations

from dataclasses import replace
from typing import Any

from boresize.errors import BoresizeError, InputError, PropertyError
from boresize.model import FluidState, Line
from boresize.plugins import PluginHost
from boresize.properties.base import check_plausible

__all__ = ["checked_state", "choose_backend", "flow_note", "fluid_state", "mass_flow_of"]

_PHASES = ("liquid", "gas", "two-phase", "supercritical", "dense")


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
                     expected="a pure fluid by name, CoolProp name or CAS number, a mixture such as "
                              "'methane:0.9, ethane:0.1', or both density and viscosity").for_line(line.tag)


def fluid_state(host: PluginHost, line: Line) -> FluidState:
    """Properties at the line's inlet pressure and temperature, with the line's own ``vapour_pressure`` where the
    backend gives none (the line's own density and viscosity, CoolProp's incompressible liquids and brines).

    :raises InputError: (field "vapour_pressure") one given where the backend computes its own, for a fluid that is
        not a liquid, or above the inlet pressure
    """
    state = _state_of(host, choose_backend(host, line), line, line.pressure, line.temperature)
    given = line.vapour_pressure
    if given is None:
        return state

    def refuse(message: str, expected: str) -> InputError:
        return InputError(message, field="vapour_pressure", value=given, expected=expected, tag=line.tag)

    if state.vapour_pressure is not None:
        raise refuse(f"a vapour pressure is given, but backend {state.source!r} computes its own "
                     f"({state.vapour_pressure / 1e5:.4g} bar abs)",
                     "vapour_pressure only where the backend gives none (the line's own density and viscosity, "
                     "brines); leave it blank otherwise")
    if state.phase != "liquid":
        raise refuse(f"a vapour pressure is given for a {state.phase} line",
                     "vapour_pressure only for a liquid line (leave it blank otherwise)")
    if given > line.pressure:
        raise refuse(f"vapour pressure {given / 1e5:.4g} bar abs is above the inlet pressure {line.pressure / 1e5:.4g} "
                     f"bar abs: the liquid would boil at the inlet",
                     "a vapour pressure at or below the inlet pressure (absolute)")
    return replace(state, vapour_pressure=given)


def _state_of(host: PluginHost, backend: Any, line: Line, pressure: float, temperature: float) -> FluidState:
    """``backend.state`` at ``pressure`` [Pa abs] and ``temperature`` [K], checked (:func:`checked_state`) and
    recorded whole."""
    state = checked_state(backend, line, pressure, temperature, _who(host, backend))
    return _recorded(state, backend, pressure, temperature)


def checked_state(backend: Any, line: Line, pressure: float, temperature: float, who: str) -> FluidState:
    """``backend.state`` at ``pressure`` [Pa abs] and ``temperature`` [K], with a plugin's fault named: an
    exception outside boresize's tree, a wrong type, an unknown phase or an implausible value is a PropertyError
    naming ``who`` (the backend, and its plugin where known)."""
    try:
        state = backend.state(line, pressure, temperature)
    except InputError as exc:
        raise (exc if exc.tag else exc.for_line(line.tag)) from None
    except BoresizeError:
        raise
    except Exception as exc:  # a plugin's fault: named, and the batch goes on
        raise PropertyError(f"{who} raised {type(exc).__name__}: {exc}") from exc
    if not isinstance(state, FluidState):
        raise PropertyError(f"{who} returned {type(state).__name__}, not a FluidState")
    if state.phase not in _PHASES:
        raise PropertyError(f"{who} returned phase {state.phase!r}, not one of {', '.join(_PHASES)}")
    check_plausible(state.density, state.viscosity, backend=getattr(backend, "id", type(backend).__name__),
                    fluid=line.fluid, pressure=pressure, temperature=temperature)
    return state


def _who(host: PluginHost, backend: Any) -> str:
    """The backend and the plugin that registered it, for the message of a fault."""
    return f"property backend {backend.id!r} of plugin {host.backends.owner(backend.id)!r}"


def _recorded(state: FluidState, backend: Any, pressure: float, temperature: float) -> FluidState:
    """The state with its backend version, state point [Pa abs, K] and, for one phase, its vapour mass
    fraction (0 liquid, 1 gas) filled in where the backend left them out (a dense fluid, above its critical
    point, has none)."""
    quality = state.vapour_fraction
    if quality is None and state.phase not in ("two-phase", "dense"):
        quality = 0.0 if state.phase == "liquid" else 1.0
    if (state.backend_version is not None and state.pressure is not None and state.temperature is not None
            and quality == state.vapour_fraction):
        return state
    return replace(state, backend_version=state.backend_version or str(backend.version()), vapour_fraction=quality,
                   pressure=state.pressure if state.pressure is not None else pressure,
                   temperature=state.temperature if state.temperature is not None else temperature)


def _molar_mass(line: Line, state: FluidState) -> float:
    """The state's molar mass [kg/mol], or an error naming what a molar flow needs."""
    molar_mass = state.molar_mass
    if molar_mass is None or not molar_mass > 0:
        raise InputError(
            f"a molar flow ({line.flow.value * 3.6:.6g} kmol/h) needs the stream's molar mass, which the "
            f"{state.source} backend does not give"
            + (" (the line's own density and viscosity)" if state.source == "table" else ""),
            field="flow", value=f"{line.flow.value * 3.6:.6g} kmol/h",
            expected="a mass or volume flow (kg/h, m3/h), or a fluid a property backend knows (its molar mass then "
                     "converts the flow)").for_line(line.tag)
    return molar_mass


def flow_note(line: Line, state: FluidState) -> str | None:
    """How a molar flow became a mass flow (the molar mass used and where it came from), else None."""
    if line.flow.basis != "molar":
        return None
    molar_mass = _molar_mass(line, state)
    return (f"molar flow {line.flow.value * 3.6:.6g} kmol/h read as {line.flow.value * molar_mass * 3600:.6g} kg/h "
            f"with molar mass {molar_mass * 1000:.6g} kg/kmol ({state.fluid_name or line.fluid}, {state.source})")


def mass_flow_of(host: PluginHost, line: Line, state: FluidState) -> float:
    """Mass flow [kg/s] from the line's flow: mass as is, actual volume times the line density,
    standard volume times the density at the stated reference conditions (same backend)."""
    flow = line.flow
    if flow.basis == "mass":
        return flow.value
    if flow.basis == "volume":
        return flow.value * state.density
    if flow.basis == "molar":
        return flow.value * _molar_mass(line, state)
    if flow.reference_p is None or flow.reference_t is None:
        raise InputError("standard volume flow without reference conditions", field="flow", value=flow,
                         expected="Sm3/h, Nm3/h, scf/h or MMSCFD").for_line(line.tag)
    backend = choose_backend(host, line)
    if backend.id == "table":
        raise InputError(
            "a standard volume flow needs the fluid's density at reference conditions, which line-list "
            "density and viscosity do not give", field="flow", value=flow.reference_name,
            expected="a mass or actual volume flow, or a fluid the equation of state knows").for_line(line.tag)
    reference = _state_of(host, backend, line, flow.reference_p, flow.reference_t)
    if reference.phase not in ("gas", "supercritical"):
        raise InputError(
            f"{line.fluid} is {reference.phase} at the reference conditions ({flow.reference_name}); a standard "
            f"volume is a gas volume", field="flow", value=flow.reference_name,
            expected="a mass or actual volume flow for a liquid").for_line(line.tag)
    return flow.value * reference.density
