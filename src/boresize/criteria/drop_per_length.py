"""``drop-per-length``: frictional pressure drop per 100 m of straight pipe within limits."""

from __future__ import annotations

from collections.abc import Mapping

from boresize.criteria.base import Criterion, CriterionContext, OptionSpec
from boresize.criteria.limits import check_range, judge_range
from boresize.model import Verdict

__all__ = ["DropPerLength", "PA_PER_M_PER_KPA_100M"]

# 1 kPa/100 m = 1000 Pa / 100 m = 10 Pa/m
PA_PER_M_PER_KPA_100M = 10.0


class DropPerLength(Criterion):
    id = "drop-per-length"
    title = "Pressure drop per length (Darcy-Weisbach, Colebrook)"
    source = "company practice (the shipped values are common practice); drop by Darcy-Weisbach with Colebrook (1939)"
    options = (
        OptionSpec("max", "drop_per_length", None, "kPa/100 m", "highest frictional drop per 100 m"),
        OptionSpec("min", "drop_per_length", None, "kPa/100 m", "lowest drop per 100 m (economic size, gravity flow)"),
    )

    def check_options(self, values: Mapping[str, float], where: str) -> None:
        check_range(values, where, "kPa/100 m", PA_PER_M_PER_KPA_100M)

    def evaluate(self, context: CriterionContext) -> Verdict:
        return judge_range(self, context.hydraulics.drop_per_length, context.options, "drop",
                           "kPa/100 m", PA_PER_M_PER_KPA_100M)
