"""``line-feasibility``: the line can carry the flow at this size at all. Every service has it; no file drops it.

A line fails, whatever its service's limits, when:

- the outlet pressure (inlet pressure less every drop: friction, fittings, static head, allowances, and
  acceleration for a compressible line) is at or below zero absolute: no flow reaches the line end against it
  (a liquid line with a large rise, an allowance larger than the inlet pressure);
- the flow chokes: a gas line reaches its sonic limit (or leaves the property backend's range) before its end;
- a loss credits the line: a negative friction drop (negative length), a fitting with a negative count, K or
  equivalent length, or a negative allowance (``fixed_drop``). Losses are 0 or more by physics; a pressure
  gain (a pump, a falling line) is not a loss: the elevation column gives the static gain.

The criterion has no options and never says ``not-applicable``: the services of the shipped sets and of every
criteria file get it appended (see :mod:`boresize.sizing.services`). A feasible line gets ``pass`` with no
utilisation (the criterion is a condition, not a limit to come close to), so it never reads as controlling; a
failing one gets the total drop as a fraction of the inlet pressure, at least 1 (1 = outlet at zero absolute).

The fails on the outlet pressure and on choking are cured by a larger size (less friction); a negative loss
fails at every size, so the guided scan finds no passing size and falls back to rating every size.
"""

from __future__ import annotations

from typing import get_args

from boresize.criteria.base import Criterion, CriterionContext, verdict
from boresize.model import Hydraulics, Line, Phase, Verdict

__all__ = ["FEASIBILITY_ID", "LineFeasibility", "negative_losses"]

FEASIBILITY_ID = "line-feasibility"
_BAR = 1e5  # Pa per bar


def negative_losses(line: Line, h: Hydraulics) -> list[str]:
    """Each loss of the line that is below zero, as a phrase for the reason (empty when none is)."""
    found = []
    if line.length < 0 or h.drop < 0:
        found.append(f"friction drop {h.drop / _BAR:.4g} bar (length {line.length:g} m)")
    # A fitting's negative count, K or equivalent length is refused when the fittings are read
    # (hydraulics.fittings); what reaches here is the sum, from a plugin's or a hand-built Hydraulics.
    if h.fittings_drop < 0:
        found.append(f"fittings drop {h.fittings_drop / _BAR:.4g} bar (sum of K {h.fittings_k:.4g})")
    if h.fixed_drop < 0 or line.fixed_drop < 0:
        found.append(f"allowance (fixed_drop) {line.fixed_drop / _BAR:.4g} bar")
    return found


class LineFeasibility(Criterion):
    id = FEASIBILITY_ID
    size_trend = "larger-passes"  # outlet pressure and choking: less friction in a larger bore; see the docstring
    title = "The line can carry the flow (outlet above zero absolute, not choked, no negative loss)"
    phases = frozenset(get_args(Phase))  # every phase: a line that cannot flow fails whatever it carries
    source = "physics: flow needs a positive absolute pressure at the line end, below the sonic limit, and " \
             "losses of 0 or more"
    options = ()

    def evaluate(self, context: CriterionContext) -> Verdict:
        h, line = context.hydraulics, context.line
        credits = negative_losses(line, h)
        if h.outlet_pressure is None and not h.choked and not credits:
            return _without_outlet(self, h, line)
        outlet = h.outlet_pressure if h.outlet_pressure is not None else line.pressure - h.total_drop
        shown = outlet / _BAR
        utilisation = max(1.0, h.total_drop / line.pressure)
        if credits:
            return verdict(self, "fail", f"a loss credits the line: {'; '.join(credits)}; losses must be 0 or more "
                           f"(a pressure gain is not a loss)", value=shown, limit=0.0, unit="bar abs",
                           utilisation=utilisation)
        if h.choked:
            return verdict(self, "fail", f"{_choke_text(h, line)}: the line cannot carry the flow at this size "
                           f"({_parts(h)})", value=shown, limit=0.0, unit="bar abs", utilisation=utilisation)
        if outlet <= 0.0:
            return verdict(self, "fail", f"outlet pressure {shown:.4g} bar abs at the {_outlet_place(line)} is at "
                           f"or below zero absolute: the line cannot carry the flow at this size (inlet "
                           f"{line.pressure / _BAR:.4g} bar abs, {_parts(h)})", value=shown, limit=0.0,
                           unit="bar abs", utilisation=utilisation)
        return verdict(self, "pass", f"the line can carry the flow: outlet pressure {shown:.4g} bar abs above zero "
                       f"absolute, not choked, no negative loss", value=shown, limit=0.0, unit="bar abs")


def _without_outlet(criterion: LineFeasibility, h: Hydraulics, line: Line) -> Verdict:
    """No outlet pressure from the line's method: a fail when even the drop it gives (a lower bound, e.g. the
    simple method's on a gas line) leaves none at the outlet, else ``error`` (unjudged is never a pass)."""
    bound = line.pressure - h.total_drop
    if bound <= 0.0:
        return verdict(criterion, "fail", f"outlet pressure at most {bound / _BAR:.4g} bar abs at the "
                       f"{_outlet_place(line)}, at or below zero absolute: the line cannot carry the flow at this "
                       f"size ({_parts(h)})", value=bound / _BAR, limit=0.0, unit="bar abs",
                       utilisation=max(1.0, h.total_drop / line.pressure))
    return verdict(criterion, "error", f"line feasibility not judged: the line's method gives no outlet pressure at "
                   f"this size ({h.method})")


def _choke_text(h: Hydraulics, line: Line) -> str:
    if h.choke_length is not None:
        return f"choked flow: the flow chokes {h.choke_length:.4g} m from the inlet of the {line.length:.4g} m line"
    return "choked flow: the line reaches its sonic limit before its end"


def _outlet_place(line: Line) -> str:
    if line.elevation > 0:
        return f"outlet, {line.elevation:.4g} m above the inlet"
    return "outlet"


def _parts(h: Hydraulics) -> str:
    """The drop's parts in bar, for the reason."""
    parts = [("friction", h.drop), ("fittings", h.fittings_drop), ("static", h.static_drop),
             ("acceleration", h.acceleration_drop), ("allowances", h.fixed_drop)]
    shown = ", ".join(f"{name} {value / _BAR:.4g}" for name, value in parts if value)
    return f"total drop {h.total_drop / _BAR:.4g} bar" + (f": {shown}" if shown else "")
