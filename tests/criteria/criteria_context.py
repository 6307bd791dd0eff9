"""A CriterionContext built by hand, for tests of single criteria (every number SI).

The hydraulics are the numbers given, so that a test can sit a value exactly on a limit; for the context the
engine computes for a real line at one NPS, use :func:`boresize.testing.criterion_context`.
"""

from __future__ import annotations

import math
from dataclasses import replace
from typing import Any

from boresize.criteria.base import CriterionContext
from boresize.model import Candidate, Flow, FluidState, Hydraulics, Line
from boresize.pipes import nps_value


def make_context(*, velocity: float = 1.0, density: float = 1000.0, drop: float = 0.0, fittings: float = 0.0,
                 static: float = 0.0, fixed: float = 0.0, mach: float | None = None, nps: str = "4",
                 inside_diameter: float = 0.10226, options: dict[str, float] | None = None,
                 line: dict[str, Any] | None = None, state: dict[str, Any] | None = None,
                 service: str = "test") -> CriterionContext:
    """A context whose hydraulics are the given numbers (drop etc. in Pa, velocity in m/s)."""
    base_line = Line(tag="T-1", fluid="water", flow=Flow("mass", 1.0), pressure=2e5, temperature=300.0)
    base_state = FluidState(density=density, viscosity=1e-3, phase="liquid", source="test", model="test")
    area = math.pi * inside_diameter**2 / 4.0
    cand = Candidate(nps, nps_value(nps), "40", inside_diameter + 0.012, 0.006, inside_diameter, 4.5e-5)
    hyd = Hydraulics(mass_flow=velocity * area * density, volume_flow=velocity * area, velocity=velocity,
                     reynolds=1e5, friction_factor=0.02, regime="turbulent", drop_per_length=drop / 100.0,
                     drop=drop, momentum=density * velocity**2, mach=mach, fittings_drop=fittings,
                     static_drop=static, fixed_drop=fixed, total_drop=drop + fittings + static + fixed)
    return CriterionContext(replace(base_line, **(line or {})), replace(base_state, **(state or {})), cand, hyd,
                            options or {}, service)
