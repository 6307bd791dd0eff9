"""Rating mode: how much more flow a line can carry at its size ("headroom").

For the size a line gives (``nps``), or the size sizing selects, the flow is scaled until a criterion
fails; the boundary, as a percentage of the design flow, is the headroom. The design flow is the
line's flow as given, WITHOUT the design margin (the margin is a sizing allowance; headroom says how
much of it, and more, the line really has). At 100 % + headroom at least one criterion fails; just
below it (within :data:`TOLERANCE`) every criterion passes. A line that fails at its design flow has a
negative headroom: the flow it can carry is below the design flow.

The search brackets the boundary by doubling (or halving) the flow, then bisects. Every trial is an
ordinary :meth:`boresize.sizing.engine.Sizer.run` of the line checked at the fixed size, so every installed
criterion, the fittings, static head and the compressible method all take part.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, replace
from typing import Any

from boresize.sizing.engine import Sizer
from boresize.model import PASSING_STATUSES, Line, LineResult

__all__ = ["TOLERANCE", "Headroom", "find_headroom", "headroom", "headroom_to_dict"]

TOLERANCE = 1e-4
"""Relative width of the flow interval that brackets the boundary when the search stops [-]."""
_UP, _DOWN = 1024.0, 1.0 / 1024.0  # the search gives up beyond these multiples of the design flow


@dataclass(frozen=True)
class Headroom:
    """The headroom of one line at one size.

    :param percent: boundary flow / design flow - 1, in percent; None when no boundary was found
    :param nps: the size rated; :param limited_by: criteria that fail at the boundary
    :param note: how the result was reached, in plain words
    """

    tag: str
    percent: float | None
    nps: str | None
    limited_by: tuple[str, ...]
    note: str


def _trial(sizer: Sizer, line: Line, nps: str) -> Callable[[float], LineResult]:
    """A function running ``line`` at size ``nps`` with its flow times a factor, without design margin."""
    def run(factor: float) -> LineResult:
        flow = replace(line.flow, value=line.flow.value * factor)
        return sizer.run(replace(line, flow=flow, nps=nps, design_margin=0.0))
    return run


def _bracket(passes: Callable[[float], bool]) -> tuple[float, float] | None:
    """(passing factor, failing factor) around the boundary above the lowest passing flow, or None."""
    if passes(1.0):
        low, high = 1.0, 2.0
        while passes(high):
            low, high = high, high * 2.0
            if high > _UP:
                return None
        return low, high
    high, low = 1.0, 0.5
    while not passes(low):
        high, low = low, low / 2.0
        if low < _DOWN:
            return None
    return low, high


def find_headroom(sizer: Sizer, line: Line, *, tolerance: float = TOLERANCE) -> Headroom:
    """The headroom of ``line`` at its size (checked lines) or at the size sizing selects.

    :param sizer: the sizer whose criteria judge the line
    :param tolerance: relative width of the final bracket [-]
    :returns: a :class:`Headroom`; ``percent`` is None when the line cannot be rated (its error is the
        note) or no boundary lies between 1/1024 and 1024 times the design flow
    """
    base = sizer.run(line)
    if base.selected is None:
        return Headroom(line.tag, None, None, (), base.error or "no size to rate")
    nps = base.selected.candidate.nps
    unjudged = [v.reason for v in base.selected.verdicts if v.status == "error"]
    if unjudged:  # an unjudged criterion fails at every flow: there is no boundary to find
        return Headroom(line.tag, None, nps, (), f"no headroom at NPS {nps}: a criterion cannot judge it: {unjudged[0]}")
    run = _trial(sizer, line, nps)
    bracket = _bracket(lambda factor: run(factor).status == "pass")
    if bracket is None:
        return Headroom(line.tag, None, nps, (), f"no criterion boundary between {_DOWN:g} and {_UP:g} times the "
                        f"design flow at NPS {nps}")
    low, high = bracket
    while high / low - 1.0 > tolerance:
        middle = 0.5 * (low + high)
        low, high = (middle, high) if run(middle).status == "pass" else (low, middle)
    failing = run(high)
    limited = tuple(v.criterion for v in (failing.selected.verdicts if failing.selected else ())
                    if v.status not in PASSING_STATUSES)
    return Headroom(line.tag, (high - 1.0) * 100.0, nps, limited,
                    f"at NPS {nps} the flow can rise to {high * 100.0:.4g} % of the design flow (design margin "
                    f"not applied) before {', '.join(limited) or 'a criterion'} fails")


def headroom(sizer: Sizer, line: Line) -> float | None:
    """Headroom of ``line`` in percent of its design flow (negative when it fails at that flow), or None."""
    return find_headroom(sizer, line).percent


def headroom_to_dict(result: Headroom) -> dict[str, Any]:
    """Keys to merge into the line's JSON entry (``--headroom``)."""
    return {
        "headroom_percent": None if result.percent is None else float(f"{result.percent:.4g}"),
        "headroom_nps": result.nps,
        "headroom_limited_by": list(result.limited_by),
        "headroom_note": result.note,
    }
