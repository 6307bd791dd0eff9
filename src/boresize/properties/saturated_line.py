"""A line given by its quality: its temperature set to CoolProp's saturation temperature at its pressure.

Kept apart from :mod:`boresize.properties.saturation` (the checks and messages every backend shares), which the
CoolProp backend imports: this step imports the backend.
"""

from __future__ import annotations

import math
from dataclasses import replace

from boresize.errors import InputError
from boresize.model import Line
from boresize.properties.coolprop import coolprop_saturation
from boresize.properties.saturation import _SIDES, SATURATION_MARGIN, celsius_text, check_quality

__all__ = ["saturated_line"]


def saturated_line(line: Line) -> Line:
    """``line`` (which gives a quality) with its temperature set to the saturation temperature at its pressure.

    :raises InputError: a quality outside 0 to 1, a mixture, another backend,
        given density or viscosity, a pressure outside the saturation curve, a temperature or a phase that
        disagrees with the quality (field named in each)
    """
    quality = line.quality
    if quality is None:
        return line
    check_quality(line, quality)
    name, t_sat = coolprop_saturation(line.fluid, line.pressure)
    if math.isfinite(line.temperature) and abs(line.temperature - t_sat) > SATURATION_MARGIN:
        raise InputError(
            f"temperature {celsius_text(line.temperature)} disagrees with the saturation temperature "
            f"{celsius_text(t_sat)} of {name} at {line.pressure / 1e5:.6g} bar abs (quality {quality:g})",
            field="temperature", value=line.temperature,
            expected=f"the temperature left blank or 'saturated', or within {SATURATION_MARGIN:g} K of "
                     f"{celsius_text(t_sat)}")
    side = _SIDES.get(quality, "two-phase")
    if line.phase is not None and line.phase != side:
        what = {"gas": "saturated vapour", "liquid": "saturated liquid"}.get(side, "two-phase")
        raise InputError(f"phase {line.phase} disagrees with quality {quality:g} ({what})", field="phase",
                         value=line.phase, expected=f"phase {side} or none with quality {quality:g}")
    return replace(line, temperature=t_sat)
