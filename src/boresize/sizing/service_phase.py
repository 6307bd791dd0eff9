"""Which service judges a line, and whether the fluid's phase at the line's conditions fits it.

A line without a service gets ``liquid`` or ``gas`` by its phase (a dense fluid ``liquid``, the shipped
general liquid service accepting it). A service accepts the phases it names (``phase = "gas"`` or
``phase = ["liquid", "dense"]``): a line in another phase is an error naming the conditions and the
services that accept it, never a number. A two-phase state whose vapour fraction is known is a two-phase
line, judged by a service that accepts "two-phase" (the default for a line without a service is
``two-phase``); one of unknown vapour fraction (a pure fluid on its saturation curve) asks for a quality. A pure fluid within the saturation margin with neither quality nor phase is sized only by
a service whose phase is the side its pressure and temperature give
(:mod:`boresize.properties.saturation`).

Which criteria judge a phase (:func:`phase_group`): a criterion names the phases it judges; a
``supercritical`` or ``dense`` fluid is also judged by the criteria named for ``gas``, since its density
follows the pressure (Mach) and it has no saturation curve (the vapour-pressure, NPSH and free-surface
checks named for ``liquid`` need one). A criterion may name ``dense`` to judge dense fluids only.
"""

from __future__ import annotations

from boresize.errors import InputError
from boresize.model import FluidState, Line
from boresize.properties.phase import two_phase_error
from boresize.properties.saturation import near_saturation_error
from boresize.sizing.services import Service

__all__ = ["check_phase", "conditions_text", "default_service", "phase_group", "service_phase"]


_GROUPS = {"supercritical": "gas", "dense": "gas", "two-phase": "two-phase"}
#: The phase a service names that a fluid's phase fits (a supercritical fluid below its critical density is a gas).
_SERVICE_PHASE = {"supercritical": "gas"}


def phase_group(phase: str) -> str:
    """The criteria group of ``phase``: a criterion that names either judges it (see the module docstring)."""
    return _GROUPS.get(phase, phase)


def service_phase(phase: str) -> str:
    """The phase a service must name to accept a fluid in ``phase`` ("liquid", "gas", "dense")."""
    return _SERVICE_PHASE.get(phase, phase)


def default_service(line: Line, state: FluidState) -> str:
    if _near_saturation(line, state) or (state.phase == "two-phase" and state.vapour_fraction is None):
        raise _two_phase_or_near(line, state)
    if state.phase == "two-phase":
        return "two-phase"
    phase = line.phase or service_phase(state.phase)
    return "gas" if phase == "gas" else "liquid"


def check_phase(line: Line, state: FluidState, service: Service) -> None:
    """InputError unless ``service`` accepts the line's phase (naming the services in force that do)."""
    found = service_phase(state.phase)
    accepts = service.accepts
    if _near_saturation(line, state):
        if state.phase == "two-phase" or not accepts or found not in accepts:
            raise near_saturation_error(line, state, service.name, "/".join(accepts) or None)
        return
    if state.phase == "two-phase":
        _check_two_phase(line, state, service)
        return
    if line.phase is not None:  # the line's own phase, when given, is what its state must be
        accepts = (line.phase,)
    if not accepts or found in accepts:
        return
    wanted = " or ".join(accepts)
    why = f"the line's phase is {line.phase}" if line.phase is not None else f"service {service.name!r} needs a {wanted} line"
    if line.phase == "two-phase":
        raise InputError(
            f"{state.fluid_name or line.fluid} is {state.phase} at {conditions_text(line)} ({state.source}); the "
            f"line's phase is two-phase (a pure fluid's two-phase line is given by its pressure and quality)",
            field="phase", value="two-phase",
            expected=f"the phase left blank or {found}, or a quality between 0 and 1 for a pure fluid"
        ).for_line(line.tag)
    saturation = ""
    if state.vapour_pressure is not None:
        saturation = f", vapour pressure {state.vapour_pressure / 1e5:.4g} bar abs"
    takers = dict(service.takers).get(found, ())
    where = f"; services that accept a {found} fluid: {', '.join(takers)}" if takers else ""
    raise InputError(
        f"{state.fluid_name or line.fluid} is {state.phase} at {conditions_text(line)}{saturation} "
        f"({state.source}); {why}{where}",
        field="temperature", value=conditions_text(line),
        expected=f"conditions at which the fluid is {wanted}, or a service that accepts a {found} fluid"
    ).for_line(line.tag)


def _check_two_phase(line: Line, state: FluidState, service: Service) -> None:
    """A two-phase state is a two-phase line when its vapour fraction is known and its service accepts
    "two-phase" (or names no phase while the line's phase says two-phase); else an error naming the services
    that accept two-phase lines."""
    if state.vapour_fraction is None:  # on the saturation curve of a pure fluid: quality unknown
        raise two_phase_error(line, state)
    if line.phase not in (None, "two-phase"):  # the line's own phase, when given, is what its state must be
        raise InputError(
            f"{state.fluid_name or line.fluid} is two-phase at {conditions_text(line)} ({state.source}, vapour mass "
            f"fraction {state.vapour_fraction:.3g}); the line's phase is {line.phase}", field="phase",
            value=line.phase, expected=f"phase two-phase or none, or conditions at which the fluid is {line.phase}"
        ).for_line(line.tag)
    if "two-phase" in service.accepts or (not service.accepts and line.phase == "two-phase"):
        return
    takers = dict(service.takers).get("two-phase", ())
    use = f"; use service {' or '.join(takers)}" if takers else "; no service in force accepts a two-phase line"
    wanted = " or ".join(service.accepts) or "a single phase"
    raise InputError(
        f"{state.fluid_name or line.fluid} is two-phase at {conditions_text(line)} ({state.source}, vapour mass "
        f"fraction {state.vapour_fraction:.3g}); service {service.name!r} judges {wanted} lines only{use}",
        field="service", value=service.name,
        expected=f"a service that accepts two-phase lines ({', '.join(takers) or 'phase two-phase'}), "
                 f"or conditions at which the fluid is {wanted}").for_line(line.tag)


def _near_saturation(line: Line, state: FluidState) -> bool:
    """A pure fluid within the saturation margin whose line gives neither quality nor phase."""
    return state.saturation_temperature is not None and line.quality is None and line.phase is None


def _two_phase_or_near(line: Line, state: FluidState) -> InputError:
    return near_saturation_error(line, state) if _near_saturation(line, state) else two_phase_error(line, state)


def conditions_text(line: Line) -> str:
    return f"{line.temperature - 273.15:.4g} degC and {line.pressure / 1e5:.5g} bar abs"
