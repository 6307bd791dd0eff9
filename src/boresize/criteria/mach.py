"""``mach``: the highest Mach number v/c along the line below a maximum, c from the equation of state.

A line rated with one density is judged at the inlet. A marched gas line is judged at the highest Mach
number its march met (``peak_mach``: usually the outlet, where the expanded gas runs fastest), and the
reason says where (:mod:`boresize.criteria.along`).

Above Mach 0.3 or so the incompressible drop used for rating underestimates the real drop, and noise
and vibration rise; flare and vent headers are usually allowed more (common practice).
"""

from __future__ import annotations

from collections.abc import Mapping

from boresize.criteria.along import place
from boresize.criteria.base import Criterion, CriterionContext, OptionSpec, verdict
from boresize.criteria.limits import check_range, judge_range
from boresize.model import Verdict

__all__ = ["MachLimit"]


class MachLimit(Criterion):
    id = "mach"
    size_trend = "larger-passes"  # v, and with it v/c, falls as the bore grows
    title = "Mach number maximum (speed of sound from the equation of state)"
    phases = frozenset({"gas"})
    source = "company practice (the shipped values are common practice); c from the property backend's EOS"
    options = (OptionSpec("max", "dimensionless", None, None, "highest Mach number v/c"),)

    def check_options(self, values: Mapping[str, float], where: str) -> None:
        check_range(values, where, "-", 1.0)

    def evaluate(self, context: CriterionContext) -> Verdict:
        h = context.hydraulics
        if h.mach is None:
            return verdict(self, "error", f"Mach number not judged: the speed of sound of line {context.line.tag} "
                           f"is unknown (backend {context.state.source!r} gives none); name the fluid so that a "
                           f"backend gives it (a line's own density and viscosity carry none) or judge the line "
                           f"in a service without mach (criteria file)")
        if h.peak_mach is None or h.peak_mach_position is None:  # one velocity all along: the inlet's
            return judge_range(self, h.mach, context.options, "Mach number at the inlet", "-", 1.0)
        at_outlet = h.outlet_mach is not None and h.peak_mach >= h.outlet_mach
        where = place(h, h.peak_mach_position, at_outlet, f"{h.mach:.3g}")
        return judge_range(self, h.peak_mach, context.options, "Mach number", "-", 1.0, where)
