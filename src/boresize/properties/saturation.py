"""Saturated lines: a pure fluid given by pressure and quality, and a state too close to saturation to size.

Quality. A line may give its vapour mass fraction (``quality``) instead of a temperature: 1 is saturated
vapour, 0 saturated liquid, and the pressure alone then fixes the state (CoolProp's PQ flash). The line's
temperature becomes the saturation temperature at its pressure (:func:`saturated_line`, called where the
line is built, so that the record and the gas march use it); a temperature given beside a quality must
agree with it within :data:`SATURATION_MARGIN`. A quality between 0 and 1 is a two-phase line: saturated
liquid and vapour at the line's pressure, mixed without slip (:mod:`boresize.properties.coolprop`). A quality is for pure fluids CoolProp knows; a mixture, another backend
or a line that gives its own density or viscosity is an error.

Near saturation. A pure fluid whose temperature lies within :data:`SATURATION_MARGIN` of the saturation
temperature at its pressure, given without a quality or a phase, may be either side of the curve, and the
two sides differ in density by one to three orders of magnitude. The pure-fluid backend records that
saturation temperature (``FluidState.saturation_temperature``); :mod:`boresize.sizing.service_phase` sizes
the line on the side the pressure and temperature give only when its service's phase is that side, and
otherwise stops it with :func:`near_saturation_error`, which gives the saturation temperature and asks
for a quality or a phase.

Why 0.5 K: line lists commonly write temperatures to the whole degree Celsius (common practice), so a
written temperature within half a degree of the saturation temperature cannot say which side the fluid is
on; the same half degree lets a rounded saturation temperature stand beside a quality.
"""

from __future__ import annotations

import math
from typing import Any

from boresize.errors import InputError
from boresize.model import FluidState, Line
from boresize.properties.base import ZERO_CELSIUS, is_mixture

__all__ = ["SATURATION_MARGIN", "check_quality", "saturation_near", "near_saturation_error", "refuse_quality",
           "celsius_text"]

#: Distance from the saturation temperature within which a (p, T) state is too close to size without a
#: quality or a phase, and within which a temperature given with a quality must agree [K] (common practice:
#: line-list temperatures are written to the whole degree).
SATURATION_MARGIN = 0.5

_SIDES = {0.0: "liquid", 1.0: "gas"}
_ASK = "a quality (1 saturated vapour, 0 saturated liquid) or the line's phase (liquid or gas)"


def celsius_text(temperature: float) -> str:
    """A temperature [K] as "179.88 degC" (two decimals: the margin is half a degree)."""
    return f"{temperature - ZERO_CELSIUS:.2f} degC"


def refuse_quality(line: Line, backend: str) -> None:
    """InputError for a line with a quality reaching a backend that does not take one (mixtures, tables)."""
    if line.quality is not None:
        raise InputError(f"quality {line.quality:g} is for pure fluids of the coolprop backend; backend {backend!r} "
                         f"does not take a quality", field="quality", value=line.quality,
                         expected="a temperature instead of a quality (saturated mixtures are not supported yet)")


def check_quality(line: Line, quality: float) -> None:
    """InputError unless the quality is from 0 to 1 (between them a two-phase line) of a pure fluid whose
    properties the coolprop backend computes."""
    if not (math.isfinite(quality) and 0.0 <= quality <= 1.0):
        raise InputError(f"quality {quality:g} is outside 0 to 1", field="quality", value=quality,
                         expected="a vapour mass fraction from 0 to 1, e.g. 1, 0 or '100 %'")
    if is_mixture(line.fluid):
        raise InputError(f"quality {quality:g} is given for the mixture {line.fluid!r}: a saturated state by "
                         f"quality is available for pure fluids only", field="quality", value=quality,
                         expected="a pure fluid, or a temperature instead of a quality")
    if line.backend not in (None, "coolprop"):
        refuse_quality(line, line.backend)
    if line.density is not None or line.viscosity is not None:
        raise InputError(f"quality {quality:g} takes the saturated state from the equation of state; the line "
                         f"also gives its own density or viscosity", field="quality", value=quality,
                         expected="a quality without density and viscosity, or a temperature with them")


def saturation_near(state: Any, pressure: float, temperature: float, dp_dt: float, vapour_pressure: float,
                    curve: tuple[float, float]) -> float | None:
    """The saturation temperature at ``pressure`` [K] when ``temperature`` [K] lies within
    :data:`SATURATION_MARGIN` of it, else None.

    ``state`` is the fluid's CoolProp AbstractState (updated here); ``vapour_pressure`` [Pa] and ``dp_dt``
    [Pa/K] are the saturation pressure and its slope at ``temperature``, which screen out far states
    without a flash (Clausius-Clapeyron slope: a first-order estimate, widened twice over); ``curve`` the
    triple-point and critical pressures [Pa abs] between which the saturation curve runs."""
    if not curve[0] <= pressure < curve[1] or dp_dt <= 0.0:
        return None
    if abs(pressure - vapour_pressure) > 2.0 * SATURATION_MARGIN * dp_dt:
        return None
    from CoolProp import CoolProp as CP

    state.update(CP.PQ_INPUTS, pressure, 0.0)
    t_sat = float(state.T())
    return t_sat if abs(temperature - t_sat) <= SATURATION_MARGIN else None


def near_saturation_error(line: Line, state: FluidState, service: str | None = None,
                          wanted: str | None = None) -> InputError:
    """The error for a pure fluid within the margin of saturation with neither quality nor phase (tied to
    the line's tag); ``service`` and ``wanted`` name a service whose phase is the other side."""
    t_sat = state.saturation_temperature if state.saturation_temperature is not None else line.temperature
    fluid = state.fluid_name or line.fluid
    message = (f"{fluid} at {celsius_text(line.temperature)} and {line.pressure / 1e5:.6g} bar abs is within "
               f"{SATURATION_MARGIN:g} K of its saturation temperature {celsius_text(t_sat)} ({state.source}): "
               f"liquid or vapour is not fixed by pressure and temperature; give {_ASK}")
    if service is not None and wanted is not None:
        message += f"; service {service!r} needs a {wanted}"
    return InputError(message, field="temperature", value=line.temperature,
                      expected=f"{_ASK}, or a temperature more than {SATURATION_MARGIN:g} K from "
                               f"{celsius_text(t_sat)}").for_line(line.tag)
