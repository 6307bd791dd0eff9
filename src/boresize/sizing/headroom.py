"""Rating mode: the window of flows a line passes at its size ("headroom").

For the size a line gives (``nps``), or the size sizing selects, the flow is scaled until a criterion
fails, upwards (a maximum: velocity, drop, ...) and downwards (a minimum: velocity, ...). The design
flow is the line's flow as given, WITHOUT the design margin (the margin is a sizing allowance; headroom
says how much of it, and more, the line really has). The passing window runs from the lower to the
upper boundary: at each boundary at least one criterion fails, just inside it (within :data:`TOLERANCE`)
every criterion passes.

- ``percent`` (the headroom): upper boundary / design flow - 1, in percent; negative when the line fails
  at its design flow with the window below it;
- ``decrease_percent``: 1 - lower boundary / design flow, in percent (how much less flow before a minimum
  fails); negative when the window lies above the design flow; None when no criterion fails down to
  1/1024 of the design flow.

A line that fails at its design flow is searched for the nearest passing flow, alternately below and
above, in steps of a factor of the square root of two; between two steps that fail different limits (a
maximum above, a minimum below) the flow is bisected, so that a window narrower than a step is found too. The search brackets each boundary by doubling (or halving) the flow, then
bisects. Every trial is an
ordinary :meth:`boresize.sizing.engine.Sizer.run` of the line checked at the fixed size, so every installed
criterion, the fittings, static head and the compressible method all take part.
"""

from __future__ import annotations

import copy
import math
from collections.abc import Callable
from dataclasses import dataclass, replace
from typing import Any

from boresize.sizing.engine import Sizer
from boresize.model import PASSING_STATUSES, Line, LineResult

__all__ = ["TOLERANCE", "Headroom", "find_headroom", "headroom", "headroom_to_dict"]

TOLERANCE = 1e-4
"""Relative width of the flow interval that brackets the boundary when the search stops [-]."""
_UP, _DOWN = 1024.0, 1.0 / 1024.0  # the search gives up beyond these multiples of the design flow
_STEP = 2.0 ** 0.5  # the search for a passing flow when the design flow fails


@dataclass(frozen=True)
class Headroom:
    """The passing window of one line at one size.

    :param percent: upper boundary flow / design flow - 1, in percent; None when no criterion fails up to
        :data:`_UP` times the design flow, or no flow passes
    :param nps: the size rated; :param limited_by: criteria that fail at the upper boundary
    :param note: how the result was reached, in plain words
    :param decrease_percent: 1 - lower boundary flow / design flow, in percent; None when no criterion fails
        down to :data:`_DOWN` times the design flow, or no flow passes
    :param low_limited_by: criteria that fail at the lower boundary
    """

    tag: str
    percent: float | None
    nps: str | None
    limited_by: tuple[str, ...]
    note: str
    decrease_percent: float | None = None
    low_limited_by: tuple[str, ...] = ()


def _trial(sizer: Sizer, line: Line, nps: str) -> Callable[[float], LineResult]:
    """A function running ``line`` at size ``nps`` with its flow times a factor, without design margin (a failing
    trial does not look for the smallest passing size)."""
    sizer = copy.copy(sizer)
    sizer.name_passing_size = False

    def run(factor: float) -> LineResult:
        flow = replace(line.flow, value=line.flow.value * factor)
        return sizer.run(replace(line, flow=flow, nps=nps, design_margin=0.0))
    return run


def _passing_factor(trial: Callable[[float], LineResult]) -> float | None:
    """A flow factor at which the line passes: 1 when the design flow does, else the nearest on a grid of
    :data:`_STEP` between :data:`_DOWN` and :data:`_UP` (below first on a tie), else one found between two grid
    flows that fail different limits (a maximum above, a minimum below: the window can be narrower than a step);
    None when none is found."""
    if trial(1.0).status == "pass":
        return 1.0
    tried = [1.0]
    factor = _STEP
    while factor <= _UP:
        for each in (1.0 / factor, factor):
            if trial(each).status == "pass":
                return each
            tried.append(each)
        factor *= _STEP
    tried.sort()
    for low, high in zip(tried, tried[1:]):
        found = _between(trial, low, high)
        if found is not None:
            return found
    return None


def _fails(result: LineResult) -> set[tuple[str, bool]]:
    """What fails: (criterion, whether its value is below its limit) for each failing verdict."""
    verdicts = result.selected.verdicts if result.selected else ()
    return {(v.criterion, v.value is not None and v.limit is not None and v.value < v.limit)
            for v in verdicts if v.status not in PASSING_STATUSES}


def _between(trial: Callable[[float], LineResult], low: float, high: float) -> float | None:
    """A passing factor between ``low`` and ``high`` when they fail different limits, narrowed by bisection while
    the middle fails only the limits of one side; None otherwise."""
    below, above = _fails(trial(low)), _fails(trial(high))
    while below and above and not below & above and high / low - 1.0 > TOLERANCE:
        middle = math.sqrt(low * high)
        result = trial(middle)
        if result.status == "pass":
            return middle
        fails = _fails(result)
        if fails and fails <= below:
            low = middle
        elif fails and fails <= above:
            high = middle
        else:
            return None
    return None


def _edge(passes: Callable[[float], bool], inside: float, step: float, tolerance: float) -> float | None:
    """The first failing factor beyond ``inside`` (a passing one) in the direction of ``step`` (2 or 1/2),
    bisected to ``tolerance``; None when every factor up to :data:`_UP` (or down to :data:`_DOWN`) passes."""
    outside = inside * step
    while passes(outside):
        inside, outside = outside, outside * step
        if not _DOWN <= outside <= _UP:
            return None
    while abs(outside / inside - 1.0) > tolerance:
        middle = 0.5 * (inside + outside)
        inside, outside = (middle, outside) if passes(middle) else (inside, middle)
    return outside


def _failing(run: Callable[[float], LineResult], factor: float | None) -> tuple[str, ...]:
    """The criteria that fail at ``factor`` (none when it is None)."""
    result = run(factor) if factor is not None else None
    return tuple(v.criterion for v in (result.selected.verdicts if result and result.selected else ())
                 if v.status not in PASSING_STATUSES)


def find_headroom(sizer: Sizer, line: Line, *, tolerance: float = TOLERANCE) -> Headroom:
    """The passing window of ``line`` at its size (checked lines) or at the size sizing selects.

    :param sizer: the sizer whose criteria judge the line
    :param tolerance: relative width of the final brackets [-]
    :returns: a :class:`Headroom`; ``percent`` and ``decrease_percent`` are None when the line cannot be rated
        (its error is the note) or no flow between 1/1024 and 1024 times the design flow passes
    """
    base = sizer.run(line)
    if base.selected is None:
        return Headroom(line.tag, None, None, (), base.error or "no size to rate")
    nps = base.selected.candidate.nps
    unjudged = [v.reason for v in base.selected.verdicts if v.status == "error"]
    if unjudged:  # an unjudged criterion fails at every flow: there is no boundary to find
        return Headroom(line.tag, None, nps, (), f"no headroom at NPS {nps}: a criterion cannot judge it: {unjudged[0]}")
    run = _trial(sizer, line, nps)
    seen: dict[float, LineResult] = {}

    def trial(factor: float) -> LineResult:
        if factor not in seen:
            seen[factor] = run(factor)
        return seen[factor]

    def passes(factor: float) -> bool:
        return trial(factor).status == "pass"

    inside = _passing_factor(trial)
    if inside is None:
        return Headroom(line.tag, None, nps, _failing(trial, 1.0), f"at NPS {nps} no flow between {_DOWN:g} and "
                        f"{_UP:g} times the design flow passes every criterion")
    high, low = _edge(passes, inside, 2.0, tolerance), _edge(passes, inside, 0.5, tolerance)
    up, down = _failing(trial, high), _failing(trial, low)
    return Headroom(line.tag, None if high is None else (high - 1.0) * 100.0, nps, up, _note(nps, high, low, up, down),
                    None if low is None else (1.0 - low) * 100.0, down)


def _note(nps: str, high: float | None, low: float | None, up: tuple[str, ...], down: tuple[str, ...]) -> str:
    """The window in plain words (percentages of the design flow, design margin not applied)."""
    where = f"at NPS {nps} every criterion passes"
    flow = "of the design flow (design margin not applied)"
    above = f"above, {', '.join(up) or 'a criterion'} fails"
    below = f"below, {', '.join(down) or 'a criterion'} fails"
    if high is not None and low is not None:
        return f"{where} from {low * 100.0:.4g} % to {high * 100.0:.4g} % {flow}: {below}; {above}"
    if high is not None:
        return (f"{where} up to {high * 100.0:.4g} % {flow}: {above}; no criterion fails below, down to "
                f"{_DOWN:g} times the design flow")
    if low is not None:
        return (f"{where} from {low * 100.0:.4g} % {flow}: {below}; no criterion fails above, up to {_UP:g} times "
                f"the design flow")
    return f"{where} from {_DOWN:g} to {_UP:g} times the design flow (design margin not applied)"


def headroom(sizer: Sizer, line: Line) -> float | None:
    """Headroom of ``line`` in percent of its design flow (negative when it fails at that flow), or None."""
    return find_headroom(sizer, line).percent


def _pct(value: float | None) -> float | None:
    return None if value is None else float(f"{value:.4g}")


def headroom_to_dict(result: Headroom) -> dict[str, Any]:
    """Keys to merge into the line's JSON entry (``--headroom``)."""
    return {
        "headroom_percent": _pct(result.percent),
        "headroom_nps": result.nps,
        "headroom_limited_by": list(result.limited_by),
        "headroom_decrease_percent": _pct(result.decrease_percent),
        "headroom_low_limited_by": list(result.low_limited_by),
        "headroom_note": result.note,
    }
