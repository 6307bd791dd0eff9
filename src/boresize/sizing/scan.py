"""Which way a failing criterion points: the guided candidate scan's knowledge of the criteria.

Sizing selects the smallest size that passes every criterion. Rating every size from the smallest up
finds it whatever the criteria do, but most of that work rates sizes far too small. When every
criterion that applies to a line is *monotone in size* (once it passes at a size it passes at every
larger one, or once it fails it fails at every larger one), the sizes that pass are one unbroken run
and a fail says which way to move: the scan can start near the first-guess diameter and walk.

What the scan knows of a criterion is what the criterion declares (the traits documented on
:class:`boresize.criteria.Criterion`; built-ins declare theirs like any plugin): ``size_trend`` says which way
its fails point, ``diameter_at_limit`` proposes where to start.

- ``"larger-passes"``: any fail is cured by a larger size (NPSH margin, flashing, Mach, ...);
- ``"falls-with-size"``: the judged value falls as the size grows, so a value above its limit is cured
  by a larger size and a value below its limit (a minimum) by a smaller one (velocity, drop per length).

A criterion without a trend, an ``error`` verdict, limits banded by NPS that shrink as sizes grow, or a
size failing in both directions sends the engine back to rating every size from the smallest: the
scan never selects a size the full scan would not, and it never skips a size without a reason.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Iterable, Mapping, Sequence
from typing import Any

from boresize.criteria.bands import BandedCriterion
from boresize.criteria.base import SizeTrend
from boresize.errors import BoresizeError
from boresize.model import PASSING_STATUSES, Candidate, CandidateResult, FluidState, Line, Verdict

__all__ = ["RATED_ABOVE", "SizeTrend", "criterion_trends", "declared_trend", "direction", "rated_span",
           "start_diameter", "trend_of"]

#: Sizes rated above the selected one when sizing, for the calculation record (one size below to two above); the
#: selection needs none of them, so a run whose outputs show only the selected size rates none (``Sizer.sizes_above``).
RATED_ABOVE = 2
#: rate(i) -> the results of candidate ``i`` in every case of the line (rated once, then remembered).
Rate = Callable[[int], Sequence[CandidateResult]]


def declared_trend(criterion: Any) -> SizeTrend | None:
    """The criterion's declared ``size_trend`` when it is one the scan knows, else None (unknown)."""
    trend = getattr(criterion, "size_trend", None)
    return trend if trend in ("larger-passes", "falls-with-size") else None


def trend_of(criterion: Any, pressure: float, candidates: Sequence[Candidate]) -> SizeTrend | None:
    """The criterion's trend on a line at inlet ``pressure`` [Pa abs] over ``candidates``, or None (unknown).

    The trend is the criterion's declared ``size_trend``. A criterion banded by NPS keeps it only when, over the
    candidates, no limit of a later band is below the one before it (a limit that shrinks as sizes grow can make
    a larger size fail again); a ``larger-passes`` criterion keeps it only when its options are the same in every
    band.
    """
    trend = declared_trend(criterion)
    if trend is None or not isinstance(criterion, BandedCriterion):
        return trend
    return trend if _bands_keep(criterion, trend, pressure, candidates) else None


def _bands_keep(banded: Any, trend: SizeTrend, pressure: float, candidates: Sequence[Candidate]) -> bool:
    """True when the bands that judge ``candidates`` (in order) keep the criterion monotone in size."""
    previous: Mapping[str, float] | None = None
    last_nps = -1.0
    for candidate in candidates:
        if candidate.nps_value < last_nps:  # sizes out of NPS order: bands could jump back
            return False
        last_nps = candidate.nps_value
        band = banded.band_for(candidate.nps_value, pressure)
        if band is None:
            return False
        options = band.options
        if previous is not None and options is not previous:
            if trend == "larger-passes" and options != previous:
                return False
            if any(options.get(key, value) < value for key, value in previous.items()) or \
                    set(options) != set(previous):
                return False
        previous = options
    return True


def direction(verdict: Verdict, trend: SizeTrend | None) -> int | None:
    """Which way a verdict sends the scan: 0 when it passes, +1 to a larger size, -1 to a smaller one,
    None when it cannot say (an error verdict, no trend, a fail without a value and limit to compare)."""
    if verdict.status in PASSING_STATUSES:
        return 0
    if verdict.status != "fail" or trend is None:
        return None
    if trend == "larger-passes":
        return 1
    if verdict.value is None or verdict.limit is None or verdict.value == verdict.limit:
        return None
    return 1 if verdict.value > verdict.limit else -1


def criterion_trends(criteria: Iterable[Any], pressures: Iterable[float],
                     candidates: Sequence[Candidate]) -> dict[str, SizeTrend | None]:
    """Criterion id -> its trend over ``candidates`` at every inlet pressure of the line's cases (None if any
    case leaves it unknown, or the cases disagree)."""
    trends: dict[str, SizeTrend | None] = {}
    pressures = tuple(pressures)
    for criterion in criteria:
        for pressure in pressures:
            trend = trend_of(criterion, pressure, candidates)
            known = trends.setdefault(criterion.id, trend)
            if known != trend:
                trends[criterion.id] = None
    return trends


def rated_span(count: int, rate: Rate, trends: Mapping[str, SizeTrend | None], start: int, *,
               every_size: bool = False, above: int = RATED_ABOVE) -> tuple[int, int]:
    """(first, last) index of the candidates rated to select the smallest size that passes every case.

    The guided walk from index ``start`` when it can prove its answer, else (or with ``every_size``) every size
    from the smallest up to ``above`` (:data:`RATED_ABOVE` unless given; 0: none) past the first that passes.
    Indices between first and last have all been rated through ``rate``.
    """
    if not every_size and count > 2:
        span = _walk(count, rate, trends, min(start, count - 1), above)
        if span is not None:
            return span
    first_pass: int | None = None
    for i in range(count):
        passed = all(r.passed for r in rate(i))
        if first_pass is None and passed:
            first_pass = i
        if first_pass is not None and i - first_pass >= above:
            return 0, i
    return 0, count - 1


def _walk(count: int, rate: Rate, trends: Mapping[str, SizeTrend | None], i: int,
          above: int = RATED_ABOVE) -> tuple[int, int] | None:
    """Walk from index ``i`` to the smallest passing size; None when a step cannot be proved."""
    low = high = i

    def way(i: int) -> int | None:  # 0 pass, +1 go larger, -1 go smaller, None: cannot tell
        ways = {direction(v, trends.get(v.criterion)) for r in rate(i) for v in r.verdicts} - {0}
        return ways.pop() if len(ways) == 1 else (0 if not ways else None)

    step = way(i)
    while step == 1 and i + 1 < count:  # too small: up to the first that passes
        i = high = i + 1
        step = way(i)
    while step == -1 and i > 0:  # too large (below a minimum): down to one that passes
        i = low = i - 1
        step = way(i)
    if step != 0:
        return None  # nothing passes, or a fail that does not say which way: rate every size
    while i > 0:  # a pass: down while the smaller one passes too
        below = way(i - 1)
        low = min(low, i - 1)
        if below is None or below == -1:
            return None
        if below == 1:
            break
        i -= 1
    for larger in range(i + 1, min(i + above, count - 1) + 1):  # for the record only: selection is done
        rate(larger)
        high = max(high, larger)
    return low, high


def start_diameter(service: Any, line: Line, state: FluidState, mass_flow: float, roughness: float) -> float:
    """Where the guided scan starts [m]: the largest of the diameters at which the service's criteria say their
    limits are just met (their ``diameter_at_limit``), or 0 (the smallest size) when none proposes one. Only a
    starting point: the walk goes from it to the size the criteria select.

    :param mass_flow: sizing mass flow [kg/s]; :param roughness: absolute roughness [m] (the line's, else its
        pipe class's)
    """
    start = 0.0
    for criterion, options in service.criteria:
        at_limit = getattr(criterion, "diameter_at_limit", None)
        if at_limit is None:
            continue
        try:
            proposed = at_limit(options, line, state, mass_flow, roughness)
        except (OverflowError, ValueError, ZeroDivisionError, BoresizeError):
            continue  # no start from this limit: another, or the smallest size
        if isinstance(proposed, (int, float)) and math.isfinite(proposed) and proposed > start:
            start = float(proposed)
    return start
