"""``drop-per-length``: frictional pressure drop per 100 m of straight pipe within limits."""

from __future__ import annotations

from dataclasses import replace

from collections.abc import Mapping

from boresize.criteria.base import Criterion, CriterionContext, OptionSpec, verdict
from boresize.criteria.limits import check_range, judge_range
from boresize.hydraulics import swamee_jain_diameter
from boresize.model import FluidState, Line, Verdict

__all__ = ["DropPerLength", "PA_PER_M_PER_KPA_100M"]

# 1 kPa/100 m = 1000 Pa / 100 m = 10 Pa/m
PA_PER_M_PER_KPA_100M = 10.0


class DropPerLength(Criterion):
    id = "drop-per-length"
    #: two-phase: the drop the two-phase hydraulics give
    phases = frozenset({"liquid", "gas", "two-phase"})
    size_trend = "falls-with-size"  # Darcy-Weisbach: dp/L ~ D^-5 at a fixed mass flow
    proposes_first_guess = True  # the record's first guess is the Swamee-Jain diameter of the maximum drop
    title = "Pressure drop per length (Darcy-Weisbach, Colebrook)"
    source = "company practice (the shipped values are common practice); drop by Darcy-Weisbach with Colebrook (1939)"
    options = (
        OptionSpec("max", "drop_per_length", None, "kPa/100 m", "highest frictional drop per 100 m"),
        OptionSpec("min", "drop_per_length", None, "kPa/100 m", "lowest drop per 100 m (economic size, gravity flow)"),
    )

    def check_options(self, values: Mapping[str, float], where: str) -> None:
        check_range(values, where, "kPa/100 m", PA_PER_M_PER_KPA_100M)

    def evaluate(self, context: CriterionContext) -> Verdict:
        judged = self._judge(context)
        two = context.hydraulics.two_phase
        if two is None:
            return judged
        # the drop of a two-phase line is the correlation's, not Darcy-Weisbach's: the source names what was used
        return replace(judged, source=f"company practice (the shipped values are common practice); drop by the "
                                      f"two-phase {two.method} method as recorded (fluids.two_phase)")

    def _judge(self, context: CriterionContext) -> Verdict:
        h = context.hydraulics
        if h.choked and "max" in context.options:  # the marched drop covers only the length reached (0 if choked
            shown = h.drop_per_length / PA_PER_M_PER_KPA_100M  # at the inlet): no drop carries this flow here
            limit = context.options["max"] / PA_PER_M_PER_KPA_100M
            return verdict(self, "fail", f"choked flow: no drop carries this flow through this size (the mean "
                           f"{shown:.3g} kPa/100 m covers only the length reached)", value=shown, limit=limit,
                           unit="kPa/100 m", utilisation=max(1.0, shown / limit))
        return judge_range(self, h.drop_per_length, context.options, "drop", "kPa/100 m", PA_PER_M_PER_KPA_100M)

    def diameter_at_limit(self, options: Mapping[str, float], line: Line, state: FluidState, mass_flow: float,
                          roughness: float) -> float | None:
        """The bore at which the drop per length equals ``max``: the explicit Swamee-Jain (1976) diameter."""
        limit = options.get("max")
        if limit is None or not limit > 0:
            return None
        return swamee_jain_diameter(mass_flow / state.density, limit, state.density, state.viscosity, roughness)
