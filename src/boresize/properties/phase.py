"""Two-phase lines: why single-phase sizing stops, and a labelled screen of the mixture.

A line that is two-phase at its conditions with a known vapour fraction is a two-phase line
(:mod:`boresize.sizing.service_phase`). One whose vapour fraction is not fixed (a pure fluid on its
saturation curve, given by pressure and temperature) is an error asking for a quality. The message gives, for screening only, the homogeneous (no-slip) density and
the API RP 14E erosional velocity of the mixture at that density with C = 100 (US units), which is the
standard's own two-phase use of its formula (API RP 14E, 5th ed., 1991, section 2.5, whose gas/liquid
mixture density is the no-slip density at flowing conditions written in field units).
"""

from __future__ import annotations

from boresize.errors import InputError
from boresize.model import FluidState, Line

__all__ = ["SCREEN_C_US", "two_phase_screen", "two_phase_error", "describe_line_conditions"]

#: API RP 14E constant C for continuous service [(ft/s)(lb/ft3)^0.5] (API RP 14E, 5th ed., section 2.5).
SCREEN_C_US = 100.0


def describe_line_conditions(line: Line) -> str:
    """The line's conditions as "40 degC and 11 bar abs"."""
    return f"{line.temperature - 273.15:.4g} degC and {line.pressure / 1e5:.5g} bar abs"


def two_phase_screen(state: FluidState) -> tuple[float, float] | None:
    """(homogeneous density [kg/m3], API RP 14E erosional velocity at C = 100 US [m/s]) of a two-phase
    state whose vapour fraction is known, else None (a pure fluid on its saturation curve)."""
    if state.phase != "two-phase" or state.vapour_fraction is None:
        return None
    from boresize.hydraulics.erosional import C_US_TO_SI, erosional_velocity

    return state.density, erosional_velocity(state.density, SCREEN_C_US * C_US_TO_SI)


def two_phase_error(line: Line, state: FluidState) -> InputError:
    """The error for a line that is two-phase at its conditions (tied to the line's tag).

    The message names the fluid, the conditions, the property source, the vapour mass fraction, the
    bubble and dew pressures when known, says that single-phase sizing does not apply, and adds the
    labelled screen of :func:`two_phase_screen` when the vapour fraction is known.
    """
    conditions = describe_line_conditions(line)
    facts = [state.source]
    if state.vapour_fraction is not None:
        facts.append(f"vapour mass fraction {state.vapour_fraction:.3g}")
    for label, value in (("bubble", state.bubble_pressure), ("dew", state.dew_pressure)):
        if value is not None:
            facts.append(f"{label} pressure {value / 1e5:.4g} bar abs")
    if state.bubble_pressure is None and state.vapour_pressure is not None:
        facts.append(f"vapour pressure {state.vapour_pressure / 1e5:.4g} bar abs")
    message = (f"{state.fluid_name or line.fluid} is two-phase at {conditions} ({', '.join(facts)}); "
               f"single-phase sizing does not apply")
    screen = two_phase_screen(state)
    if screen is not None:
        density, velocity = screen
        message += (f". Screen only, not a sizing: homogeneous density {density:.4g} kg/m3, API RP 14E mixture "
                    f"erosional velocity {velocity:.3g} m/s (C = 100, US units)")
    else:
        message += ("; the vapour fraction is not fixed by pressure and temperature on the saturation curve: "
                    "give the line's quality (vapour mass fraction)")
    return InputError(message, field="temperature", value=conditions,
                      expected="a quality (vapour mass fraction, 0 to 1) for a two-phase line, or a liquid or gas "
                               "state").for_line(line.tag)
