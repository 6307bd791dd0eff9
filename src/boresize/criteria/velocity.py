"""``velocity``: the mean velocity within a maximum and, optionally, above a minimum."""

from __future__ import annotations

from collections.abc import Mapping

from boresize.criteria.base import Criterion, CriterionContext, OptionSpec
from boresize.criteria.limits import check_range, judge_range
from boresize.model import Verdict

__all__ = ["VelocityLimits"]


class VelocityLimits(Criterion):
    id = "velocity"
    title = "Velocity limits"
    source = "company practice (the shipped values are common practice)"
    options = (
        OptionSpec("max", "velocity", None, "m/s", "highest mean velocity"),
        OptionSpec("min", "velocity", None, "m/s", "lowest mean velocity (settling of solids, fouling)"),
    )

    def check_options(self, values: Mapping[str, float], where: str) -> None:
        check_range(values, where, "m/s", 1.0)

    def evaluate(self, context: CriterionContext) -> Verdict:
        return judge_range(self, context.hydraulics.velocity, context.options, "velocity", "m/s", 1.0)
