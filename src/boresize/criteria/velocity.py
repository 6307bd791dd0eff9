"""``velocity``: the mean velocity within a maximum and, optionally, above a minimum.

On a marched gas line the maximum judges the fastest point along the line and the minimum the slower end
(:mod:`boresize.criteria.along`); the reason says where.
"""

from __future__ import annotations

import math
from collections.abc import Mapping

from boresize.criteria.along import slowest_point, worst_point
from boresize.criteria.base import Criterion, CriterionContext, OptionSpec
from boresize.criteria.limits import check_range, judge_range
from boresize.model import FluidState, Line, Verdict

__all__ = ["VelocityLimits"]


class VelocityLimits(Criterion):
    id = "velocity"
    size_trend = "falls-with-size"  # v = 4 Q / (pi D^2) at a fixed mass flow
    title = "Velocity limits"
    source = "company practice (the shipped values are common practice)"
    options = (
        OptionSpec("max", "velocity", None, "m/s", "highest mean velocity"),
        OptionSpec("min", "velocity", None, "m/s", "lowest mean velocity (settling of solids, fouling)"),
    )

    def check_options(self, values: Mapping[str, float], where: str) -> None:
        check_range(values, where, "m/s", 1.0)

    def evaluate(self, context: CriterionContext) -> Verdict:
        if context.hydraulics.peak_velocity is None:  # one velocity all along (liquid, simple method)
            return judge_range(self, context.hydraulics.velocity, context.options, "velocity", "m/s", 1.0)
        high, low = context.options.get("max"), context.options.get("min")
        judged = []
        if high is not None:
            fast = worst_point(context)
            judged.append(judge_range(self, fast.velocity, {"max": high}, "velocity", "m/s", 1.0, fast.where))
        if low is not None:
            slow = slowest_point(context)
            judged.append(judge_range(self, slow.velocity, {"min": low}, "velocity", "m/s", 1.0, slow.where))
        failed = [v for v in judged if v.status == "fail"]
        return max(failed or judged, key=lambda v: v.utilisation or 0.0)

    def diameter_at_limit(self, options: Mapping[str, float], line: Line, state: FluidState, mass_flow: float,
                          roughness: float) -> float | None:
        """The bore at which the mean velocity equals ``max`` (continuity: D = sqrt(4 Q / (pi v_max)))."""
        limit = options.get("max")
        if limit is None or not limit > 0:
            return None
        return math.sqrt(4.0 * (mass_flow / state.density) / (math.pi * limit))
