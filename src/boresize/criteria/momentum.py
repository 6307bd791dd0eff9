"""``momentum``: the momentum flux rho*v^2 below a maximum (gas and vapour lines, nozzles).

Company standards limit rho*v^2 to keep vibration, noise and erosion of fittings in check; they often
write the limit by pressure band, which the criteria file expresses with ``bands`` (see
:mod:`boresize.criteria.bands`). rho*v^2 is in Pa (kg m^-1 s^-2). On a marched gas line it is judged where
it is highest, the point of lowest density (:mod:`boresize.criteria.along`); the reason says where.
"""

from __future__ import annotations

from collections.abc import Mapping

from boresize.criteria.along import worst_point
from boresize.criteria.base import Criterion, CriterionContext, OptionSpec
from boresize.criteria.limits import check_range, judge_range
from boresize.model import Verdict

__all__ = ["Momentum"]


class Momentum(Criterion):
    id = "momentum"
    #: two-phase: rho_m v_m^2 at the no-slip mixture density
    phases = frozenset({"liquid", "gas", "two-phase"})
    size_trend = "larger-passes"  # rho*v^2 falls as the bore grows (v ~ D^-2 at a fixed mass flow)
    phases = frozenset({"liquid", "gas", "two-phase"})  # two-phase: rho_m v_m^2 at the no-slip density
    title = "Momentum flux rho*v^2 maximum"
    source = "company practice (the shipped values are common practice)"
    options = (OptionSpec("max", "pressure_difference", None, "Pa", "highest rho*v^2 (Pa = kg/(m s2))"),)

    def check_options(self, values: Mapping[str, float], where: str) -> None:
        check_range(values, where, "Pa", 1.0)

    def evaluate(self, context: CriterionContext) -> Verdict:
        if context.hydraulics.peak_velocity is None:  # one velocity all along (liquid, simple method)
            return judge_range(self, context.hydraulics.momentum, context.options, "rho*v^2", "Pa", 1.0)
        point = worst_point(context, f"{context.hydraulics.momentum:.3g} Pa")
        return judge_range(self, point.density * point.velocity**2, context.options, "rho*v^2", "Pa", 1.0,
                           point.where)
