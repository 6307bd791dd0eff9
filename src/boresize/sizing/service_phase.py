"""Which service judges a line, and whether the fluid's phase at the line's conditions fits it.

A line without a service gets ``liquid`` or ``gas`` by its phase. A liquid service whose conditions
put the fluid in vapour (or the reverse) is an error naming the conditions, never a number; a
two-phase state is reported as such (single-phase sizing does not apply).
"""

from __future__ import annotations

from boresize.sizing.services import Service
from boresize.errors import InputError
from boresize.model import FluidState, Line
from boresize.properties.phase import two_phase_error

__all__ = ["check_phase", "conditions_text", "default_service", "phase_group"]


_GROUPS = {"supercritical": "gas", "two-phase": "two-phase"}


def phase_group(phase: str) -> str:
    return _GROUPS.get(phase, phase)


def default_service(line: Line, state: FluidState) -> str:
    if state.phase == "two-phase":
        raise two_phase_error(line, state)
    phase = line.phase or phase_group(state.phase)
    return "liquid" if phase == "liquid" else "gas"


def check_phase(line: Line, state: FluidState, service: Service) -> None:
    if state.phase == "two-phase":
        raise two_phase_error(line, state)
    wanted = line.phase or service.phase
    found = phase_group(state.phase)
    if wanted is None or wanted == found:
        return
    saturation = ""
    if state.vapour_pressure is not None:
        saturation = f", vapour pressure {state.vapour_pressure / 1e5:.4g} bar abs"
    raise InputError(
        f"{state.fluid_name or line.fluid} is {state.phase} at {conditions_text(line)}{saturation} "
        f"({state.source}); service {service.name!r} needs a {wanted}",
        field="temperature", value=conditions_text(line),
        expected=f"conditions at which the fluid is {wanted}, or a {found} service").for_line(line.tag)


def conditions_text(line: Line) -> str:
    return f"{line.temperature - 273.15:.4g} degC and {line.pressure / 1e5:.5g} bar abs"
