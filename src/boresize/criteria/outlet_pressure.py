"""``outlet-pressure``: the pressure at the line end at or above what the receiver needs, or the drop in an allowance.

The minimum comes from the line (column ``min_outlet_pressure``, which wins: it belongs to that line's
receiver) or from the option ``min`` of the service; either may be gauge or absolute ("2 barg",
"3 bar"). The option ``max_drop`` limits the total drop (friction + fittings + static + allowances,
and acceleration for a compressible line). A choked line fails, with or without limits: it cannot
carry the flow at that size.
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from functools import cached_property

from boresize.criteria.base import Criterion, CriterionContext, OptionSpec, verdict
from boresize.errors import CriteriaFileError
from boresize.model import Hydraulics, Verdict

__all__ = ["OutletPressure"]

_BAR = 1e5  # Pa per bar


class OutletPressure(Criterion):
    id = "outlet-pressure"
    size_trend = "larger-passes"  # the outlet pressure rises with the bore (less friction)
    title = "Pressure at the line end (minimum for the receiver, or total drop allowance)"
    source = ("receiver requirement (line list) or company practice; total drop = friction + fittings + static "
              "+ allowances by Darcy-Weisbach, fittings and compressible methods as recorded")
    options = (
        OptionSpec("min", "pressure", None, None, "lowest pressure at the line end (barg or bar abs); the line's "
                   "min_outlet_pressure column wins"),
        OptionSpec("max_drop", "pressure_difference", None, "kPa", "highest total drop from inlet to outlet"),
    )

    def check_options(self, values: Mapping[str, float], where: str) -> None:
        drop = values.get("max_drop")
        if drop is not None and not drop > 0.0:
            raise CriteriaFileError(f"max_drop must be above zero, got {drop / 1e3:g} kPa", field=f"{where}.max_drop",
                                    value=drop / 1e3, expected="a positive pressure difference, e.g. '1.5 bar'")

    def evaluate(self, context: CriterionContext) -> Verdict:
        h, line = context.hydraulics, context.line
        minimum = line.min_outlet_pressure if line.min_outlet_pressure is not None else context.options.get("min")
        max_drop = context.options.get("max_drop")
        if h.choked and minimum is None and max_drop is None:
            return verdict(self, "fail", f"choked flow: the line reaches its sonic limit before its end at this "
                           f"size ({_parts(h)})", utilisation=1.0)
        if minimum is None and max_drop is None:
            return self._not_applicable
        if h.outlet_pressure is None:
            return verdict(self, "error", f"outlet pressure not judged: the line's method gives no outlet pressure "
                           f"at this size ({h.method})")
        judged = [v for v in (self._minimum(h, line.pressure, minimum), self._drop(h, max_drop)) if v is not None]
        failed = [v for v in judged if v.status == "fail"]
        return max(failed or judged, key=lambda v: v.utilisation if v.utilisation is not None else 0.0)

    @cached_property
    def _not_applicable(self) -> Verdict:
        """The same verdict for every candidate of a line without limits (built once: a Verdict is immutable)."""
        return verdict(self, "not-applicable", "no minimum outlet pressure (column min_outlet_pressure or "
                       "option min) and no max_drop option for this line")

    def _minimum(self, h: Hydraulics, inlet: float, minimum: float | None) -> Verdict | None:
        if minimum is None or h.outlet_pressure is None:
            return None
        available = inlet - minimum
        used = inlet - h.outlet_pressure
        utilisation = used / available if available > 0.0 else math.inf
        shown, limit = h.outlet_pressure / _BAR, minimum / _BAR
        if h.choked:
            return verdict(self, "fail", f"choked flow: the line reaches its sonic limit before its end at this size "
                           f"({_parts(h)})", value=shown, limit=limit, unit="bar abs",
                           utilisation=max(utilisation, 1.0))
        if h.outlet_pressure < minimum:
            return verdict(self, "fail", f"outlet pressure {shown:.4g} bar abs below the minimum {limit:.4g} bar abs "
                           f"({_parts(h)})", value=shown, limit=limit, unit="bar abs", utilisation=utilisation)
        return verdict(self, "pass", f"outlet pressure {shown:.4g} bar abs is at least the minimum {limit:.4g} bar "
                       f"abs ({_parts(h)})", value=shown, limit=limit, unit="bar abs", utilisation=utilisation)

    def _drop(self, h: Hydraulics, max_drop: float | None) -> Verdict | None:
        if max_drop is None:
            return None
        shown, limit = h.total_drop / _BAR, max_drop / _BAR
        utilisation = h.total_drop / max_drop
        if h.choked or h.total_drop > max_drop:
            what = "choked flow: the line reaches its sonic limit at this size" if h.choked else \
                f"total drop {shown:.4g} bar above the allowance {limit:.4g} bar"
            return verdict(self, "fail", f"{what} ({_parts(h)})", value=shown, limit=limit, unit="bar",
                           utilisation=max(utilisation, 1.0) if h.choked else utilisation)
        return verdict(self, "pass", f"total drop {shown:.4g} bar is within the allowance {limit:.4g} bar "
                       f"({_parts(h)})", value=shown, limit=limit, unit="bar", utilisation=utilisation)


def _parts(h: Hydraulics) -> str:
    """The drop's parts in bar, for the reason."""
    parts = [("friction", h.drop), ("fittings", h.fittings_drop), ("static", h.static_drop),
             ("acceleration", h.acceleration_drop), ("allowances", h.fixed_drop)]
    shown = ", ".join(f"{name} {value / _BAR:.3g}" for name, value in parts if value)
    return f"total drop {h.total_drop / _BAR:.4g} bar" + (f": {shown}" if shown else "")
