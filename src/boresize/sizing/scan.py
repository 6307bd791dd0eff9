"""Which way a failing criterion points: the guided candidate scan's knowledge of the criteria.

Sizing selects the smallest size that passes every criterion. Rating every size from the smallest up
finds it whatever the criteria do, but most of that work rates sizes far too small. When every
criterion that applies to a line is *monotone in size* (once it passes at a size it passes at every
larger one, or once it fails it fails at every larger one), the sizes that pass are one unbroken run
and a fail says which way to move: the scan can start near the first-guess diameter and walk.

A criterion says how its fails respond to size through ``size_trend`` (an optional attribute; the
built-ins' are given here):

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
from typing import Any, Literal

from boresize.errors import BoresizeError
from boresize.hydraulics import swamee_jain_diameter
from boresize.model import PASSING_STATUSES, Candidate, CandidateResult, FluidState, Verdict

__all__ = ["BUILTIN_TRENDS", "BandsMemo", "RATED_ABOVE", "SizeTrend", "criterion_trends", "direction", "rated_span",
           "start_diameter", "trend_of"]

#: Sizes rated above the selected one when sizing (the calculation record shows one below to two above).
RATED_ABOVE = 2
#: rate(i) -> the results of candidate ``i`` in every case of the line (rated once, then remembered).
Rate = Callable[[int], Sequence[CandidateResult]]

SizeTrend = Literal["larger-passes", "falls-with-size"]

#: The built-in criteria's trends. Velocity, drop, momentum, Mach, the Froude number and the noise velocity fall
#: as the bore grows at a fixed mass flow (Darcy-Weisbach: v ~ D^-2, dp/L ~ D^-5); NPSH available, the lowest
#: pressure on the line and the outlet pressure rise with the bore (less friction), and choking goes away.
BUILTIN_TRENDS: Mapping[str, SizeTrend] = {
    "drop-per-length": "falls-with-size",
    "velocity": "falls-with-size",
    "erosional": "larger-passes",
    "momentum": "larger-passes",
    "noise-velocity": "larger-passes",
    "mach": "larger-passes",
    "gravity-drain": "larger-passes",
    "npsh-margin": "larger-passes",
    "flashing": "larger-passes",
    "outlet-pressure": "larger-passes",
}

#: (id of a banded criterion, id of the candidates, which pressure bounds hold) -> (criterion, candidates, whether
#: its bands keep its trend): the same for every line of a list, so judged once; the objects are kept with the
#: answer, so that a reused id never returns another's. The caller owns it (a Sizer: it dies with its config).
BandsMemo = dict[tuple[int, int, tuple[bool, ...]], tuple[Any, Sequence[Candidate], bool]]


def trend_of(criterion: Any, pressure: float, candidates: Sequence[Candidate],
             memo: BandsMemo | None = None) -> SizeTrend | None:
    """The criterion's trend on a line at inlet ``pressure`` [Pa abs] over ``candidates``, or None (unknown).

    A built-in criterion (from this package) takes its trend from :data:`BUILTIN_TRENDS`; any other from its
    ``size_trend`` attribute. A criterion banded by NPS keeps its trend only when, over the candidates, no
    limit of a later band is below the one before it (a limit that shrinks as sizes grow can make a larger
    size fail again); a ``larger-passes`` criterion keeps it only when its options are the same in every band.
    ``memo`` remembers that judgement for the next line.
    """
    inner = getattr(criterion, "inner", None)
    base = inner if inner is not None and hasattr(criterion, "band_for") else criterion
    trend = _declared(base)
    if trend is None or base is criterion:
        return trend
    signature = tuple(b.up_to_pressure is None or pressure <= b.up_to_pressure for b in criterion.bands)
    key = (id(criterion), id(candidates), signature)
    memo = {} if memo is None else memo
    kept = memo.get(key)
    if kept is None or kept[0] is not criterion or kept[1] is not candidates:
        kept = memo[key] = (criterion, candidates, _bands_keep(criterion, trend, pressure, candidates))
    return trend if kept[2] else None


def _declared(criterion: Any) -> SizeTrend | None:
    if type(criterion).__module__.startswith("boresize.criteria."):
        return BUILTIN_TRENDS.get(getattr(criterion, "id", ""))
    trend = getattr(criterion, "size_trend", None)
    return trend if trend in ("larger-passes", "falls-with-size") else None


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


def criterion_trends(criteria: Iterable[Any], pressures: Iterable[float], candidates: Sequence[Candidate],
                     memo: BandsMemo | None = None) -> dict[str, SizeTrend | None]:
    """Criterion id -> its trend over ``candidates`` at every inlet pressure of the line's cases (None if any
    case leaves it unknown, or the cases disagree)."""
    trends: dict[str, SizeTrend | None] = {}
    pressures = tuple(pressures)
    for criterion in criteria:
        for pressure in pressures:
            trend = trend_of(criterion, pressure, candidates, memo)
            known = trends.setdefault(criterion.id, trend)
            if known != trend:
                trends[criterion.id] = None
    return trends


def rated_span(count: int, rate: Rate, trends: Mapping[str, SizeTrend | None], start: int, *,
               every_size: bool = False) -> tuple[int, int]:
    """(first, last) index of the candidates rated to select the smallest size that passes every case.

    The guided walk from index ``start`` when it can prove its answer, else (or with ``every_size``) every size
    from the smallest up to :data:`RATED_ABOVE` past the first that passes. Indices between first and last
    have all been rated through ``rate``.
    """
    if not every_size and count > 2:
        span = _walk(count, rate, trends, min(start, count - 1))
        if span is not None:
            return span
    first_pass: int | None = None
    for i in range(count):
        passed = all(r.passed for r in rate(i))
        if first_pass is None and passed:
            first_pass = i
        if first_pass is not None and i - first_pass >= RATED_ABOVE:
            return 0, i
    return 0, count - 1


def _walk(count: int, rate: Rate, trends: Mapping[str, SizeTrend | None], i: int) -> tuple[int, int] | None:
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
    for above in range(i + 1, min(i + RATED_ABOVE, count - 1) + 1):
        rate(above)
        high = max(high, above)
    return low, high


def start_diameter(service: Any, pressure: float, state: FluidState, mass_flow: float, roughness: float) -> float:
    """Where the guided scan starts [m]: the larger of the diameters at which the service's drop-per-length and
    velocity maxima are just met (Swamee-Jain; continuity), or 0 (the smallest size) when it gives neither. Only a
    starting point: the walk goes from it to the size the criteria select.

    :param pressure: inlet pressure [Pa abs] (picks pressure bands); :param mass_flow: [kg/s];
    :param roughness: absolute roughness [m] (the line's, else its pipe class's)
    """
    volume_flow, start = mass_flow / state.density, 0.0
    for criterion, options in service.criteria:
        limit = _plain_max(criterion, options, pressure)
        if limit is None or criterion.id not in ("drop-per-length", "velocity"):
            continue
        try:
            if criterion.id == "velocity":
                start = max(start, math.sqrt(4.0 * volume_flow / (math.pi * limit)))
            else:
                start = max(start, swamee_jain_diameter(volume_flow, limit, state.density, state.viscosity,
                                                        roughness))
        except (OverflowError, ValueError, ZeroDivisionError, BoresizeError):
            continue  # no start from this limit: another, or the smallest size
    return start


def _plain_max(criterion: Any, options: Mapping[str, float], pressure: float) -> float | None:
    """The criterion's ``max`` option, or a banded one's for the largest sizes at ``pressure`` [Pa abs]."""
    band_for = getattr(criterion, "band_for", None)
    if band_for is not None:
        band = band_for(math.inf, pressure)
        options = band.options if band is not None else {}
    limit = options.get("max")
    return limit if limit is not None and limit > 0 else None
