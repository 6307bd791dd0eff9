"""The line's own property values (density and viscosity columns of the line list).

These values hold at the line's conditions only. The backend therefore refuses a call at any other
state point, for example at standard reference conditions to turn a standard gas volume into mass:
a density typed for 40 bar cannot give the density at 1 atm, and using it would silently give a
wrong mass flow.

Phase: the line's ``phase`` when given; otherwise "liquid" when the density exceeds
:data:`LIQUID_DENSITY_THRESHOLD` and "gas" below it (common practice: no process gas at line
conditions reaches 300 kg/m3 and few liquids fall below it; a dense supercritical fluid
should carry its phase). The model text says which rule was used.
"""

from __future__ import annotations

import functools
import importlib.metadata
import math

from boresize.errors import InputError
from boresize.model import FluidState, Line, Phase
from boresize.properties.base import DENSITY_RANGE, VISCOSITY_RANGE, describe_conditions
from boresize.properties.saturation import refuse_quality

__all__ = ["TableBackend", "LIQUID_DENSITY_THRESHOLD"]

#: Density above which a line without a stated phase is taken as liquid [kg/m3] (common practice).
LIQUID_DENSITY_THRESHOLD = 300.0

#: Relative tolerance for "the line's own conditions" [-].
_SAME_POINT = 1e-9


class TableBackend:
    """Density and viscosity as given on the line (``line.density`` [kg/m3], ``line.viscosity`` [Pa s])."""

    id = "table"
    title = "Line list values"

    def version(self) -> str:
        """The boresize version (the values come from the line list itself)."""
        return _boresize_version()

    def handles(self, line: Line) -> bool:
        """True when the line gives both its density and its viscosity."""
        return line.density is not None and line.viscosity is not None

    def state(self, line: Line, pressure: float, temperature: float) -> FluidState:
        """The line's own values, valid at the line's pressure [Pa abs] and temperature [K] only.

        :raises InputError: density or viscosity missing or implausible (field "density" or
            "viscosity"), or a call at other conditions than the line's (field "flow": the only such
            call is the conversion of a standard gas volume)
        """
        refuse_quality(line, self.id)  # a saturated state by quality: pure fluids of coolprop only
        if line.phase == "two-phase":  # one density and viscosity cannot give each phase's properties
            raise InputError("phase two-phase needs each phase's density and viscosity and the vapour fraction, "
                             "from a backend that flashes; backend 'table' takes one density and viscosity",
                             field="phase", value="two-phase",
                             expected="liquid or gas with the line's own density and viscosity, or a two-phase line "
                                      "without them (coolprop with a quality, thermo, coolprop-mixture or gerg-2008)")
        density = _given(line.density, "density", "kg/m3", DENSITY_RANGE)
        viscosity = _given(line.viscosity, "viscosity", "Pa s", VISCOSITY_RANGE)
        _check_same_point(line, pressure, temperature)
        phase, rule = _phase(line, density)
        return FluidState(  # recorded whole (version, state point, vapour fraction): the engine need not copy it
            density=density,
            viscosity=viscosity,
            phase=phase,
            source=self.id,
            model=f"line list values ({rule})",
            family="given values",
            validity="the line's own values, taken as valid at its pressure and temperature",
            fluid_name=line.fluid or None,
            vapour_fraction=None if phase == "two-phase" else 0.0 if phase == "liquid" else 1.0,
            backend_version=_boresize_version(),
            pressure=pressure,
            temperature=temperature,
        )


@functools.cache
def _boresize_version() -> str:
    """The installed boresize's version, read once per process (a metadata look-up costs about 3 ms)."""
    return importlib.metadata.version("boresize")


def _given(value: float | None, field: str, unit: str, plausible: tuple[float, float]) -> float:
    """The given value [SI], or InputError naming the field when missing or implausible."""
    if value is None:
        raise InputError(
            f"{field} is missing; line list values need both density and viscosity",
            field=field, value=None,
            expected=f"a {field} in {unit} (or leave both blank to use a property backend)",
        )
    low, high = plausible
    if not (math.isfinite(value) and low <= value <= high):
        raise InputError(
            f"{field} {value:.6g} {unit} is outside the plausible range", field=field, value=value,
            expected=f"{low:g} to {high:g} {unit}",
        )
    return float(value)


def _check_same_point(line: Line, pressure: float, temperature: float) -> None:
    """Refuse a state point [Pa abs, K] other than the line's own."""
    same = math.isclose(pressure, line.pressure, rel_tol=_SAME_POINT) and math.isclose(
        temperature, line.temperature, rel_tol=_SAME_POINT
    )
    if not same:
        raise InputError(
            f"the line's own density and viscosity hold at "
            f"{describe_conditions(line.pressure, line.temperature)} only, not at "
            f"{describe_conditions(pressure, temperature)} (a standard-volume flow needs the density "
            f"at reference conditions)",
            field="flow", value=line.flow.value,
            expected="a mass or actual volume flow with line list values, "
            "or a fluid a property backend knows",
        )


def _phase(line: Line, density: float) -> tuple[Phase, str]:
    """Phase and the rule that gave it: the line's phase, else by density [kg/m3]."""
    if line.phase is not None:
        return line.phase, f"phase {line.phase} as given"
    if density > LIQUID_DENSITY_THRESHOLD:
        return "liquid", f"liquid since density > {LIQUID_DENSITY_THRESHOLD:g} kg/m3"
    return "gas", f"gas since density <= {LIQUID_DENSITY_THRESHOLD:g} kg/m3"
