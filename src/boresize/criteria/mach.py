"""``mach``: the highest Mach number v/c along the line below a maximum, c from the equation of state.

The Mach number is checked at the inlet and, when a compressible rating gives it, at the outlet, where
the expanded gas runs fastest; the higher one is judged.

Above Mach 0.3 or so the incompressible drop used for rating underestimates the real drop, and noise
and vibration rise; flare and vent headers are usually allowed more (common practice).
"""

from __future__ import annotations

from collections.abc import Mapping

from boresize.criteria.base import Criterion, CriterionContext, OptionSpec, verdict
from boresize.criteria.limits import check_range, judge_range
from boresize.model import Verdict

__all__ = ["MachLimit"]


class MachLimit(Criterion):
    id = "mach"
    size_trend = "larger-passes"  # v, and with it v/c, falls as the bore grows
    march_only_worsens = True  # the outlet Mach number grows as the gas expands along the line
    title = "Mach number maximum (speed of sound from the equation of state)"
    phases = frozenset({"gas"})
    source = "company practice (the shipped values are common practice); c from the property backend's EOS"
    options = (OptionSpec("max", "dimensionless", None, None, "highest Mach number v/c"),)

    def check_options(self, values: Mapping[str, float], where: str) -> None:
        check_range(values, where, "-", 1.0)

    def evaluate(self, context: CriterionContext) -> Verdict:
        inlet = context.hydraulics.mach
        outlet = getattr(context.hydraulics, "outlet_mach", None)  # set by a compressible rating
        if inlet is None and outlet is None:
            return verdict(self, "error", f"Mach number not judged: the speed of sound of line {context.line.tag} "
                           f"is unknown (backend {context.state.source!r} gives none); name the fluid so that a "
                           f"backend gives it (a line's own density and viscosity carry none) or judge the line "
                           f"in a service without mach (criteria file)")
        where = "outlet" if outlet is not None and (inlet is None or outlet > inlet) else "inlet"
        mach = outlet if where == "outlet" else inlet
        return judge_range(self, mach, context.options, f"Mach number at the {where}", "-", 1.0)  # type: ignore[arg-type]
