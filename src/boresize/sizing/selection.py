"""The outcome of rating a line: which candidate is selected, and the LineResult that reports it.

Sizing selects the smallest candidate that passes every criterion; when none does, the record shows
the closest (lowest worst utilisation). Faults become ``error`` results carrying the field at fault.

The *controlling* criterion of a sized line is the one that forced the selection up: the criterion that fails
on the next smaller size (the worst failing one there). When the selected size is the smallest the pipe class
allows, no criterion controls (``controlling`` is None and a note says so). When no size passes, and for a
checked line (a given NPS), it is the criterion with the highest utilisation at the size shown: the one
furthest past its limit, or, on a passing check, the one nearest to it.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from typing import get_args

from boresize.errors import InputError, PropertyError
from boresize.hydraulics.friction import LAMINAR_LIMIT, TURBULENT_LIMIT
from boresize.model import CandidateResult, FluidState, Line, LineResult, Mode, Verdict, VerdictStatus
from boresize.sizing.services import Service

__all__ = ["SMALLEST_NOTE", "build_result", "closest", "controlling_below", "controlling_utilisation", "error_result",
           "error_verdict", "internal_error", "select", "verdict_fault"]

#: The note of a line sized to the smallest size its pipe class allows (``{nps}``: that size).
SMALLEST_NOTE = "NPS {nps} is the smallest size the pipe class allows: no criterion controls the size"


def internal_error(line: Line, exc: Exception) -> LineResult:
    return LineResult(tag=line.tag, status="error", mode="check" if line.nps else "size", line=line,
                      error=f"line {line.tag}: internal error {type(exc).__name__}: {exc} (please report it)")


_STATUSES: tuple[str, ...] = get_args(VerdictStatus)


def verdict_fault(verdict: Verdict, ident: str | None = None) -> str | None:
    """What is wrong with a criterion's verdict, or None: another criterion's id (``ident``: the criterion's own),
    an unknown status, a number that is not a number, NaN or infinite. A NaN drop compares false with every limit
    and would read as a pass; an infinity cannot be written to JSON. The one infinity allowed is the utilisation
    of a fail that no size can meet (a minimum velocity at zero flow, no pressure left for the drop)."""
    if ident is not None and verdict.criterion != ident:
        return f"returned a verdict for criterion {verdict.criterion!r}, not its own id {ident!r}"
    if verdict.status not in _STATUSES:
        return f"returned status {verdict.status!r}, not one of {', '.join(_STATUSES)}"
    value, limit, utilisation, finite = verdict.value, verdict.limit, verdict.utilisation, math.isfinite
    if ((value is None or (type(value) is float and finite(value)))
            and (limit is None or (type(limit) is float and finite(limit)))
            and (utilisation is None or (type(utilisation) is float and finite(utilisation)))):
        return None  # the common case (finite floats, or None), without the loop below
    for name in ("value", "limit", "utilisation"):
        number = getattr(verdict, name)
        if number is None:
            continue
        if isinstance(number, bool) or not isinstance(number, (int, float)) or math.isnan(number):
            return f"returned {name} {number!r}, not a number"
        if not math.isfinite(number) and not (name == "utilisation" and number > 0 and verdict.status == "fail"):
            return (f"returned {name} {number!r}, not a finite number (only a fail's utilisation may be "
                    f"infinite)")
    return None


def error_verdict(ident: str, plugin: str, what: str) -> Verdict:
    return Verdict(criterion=ident, status="error", reasons=(f"criterion {ident!r} of plugin {plugin!r} {what}",),
                   source=f"plugin {plugin}")


def select(rated: Sequence[CandidateResult]) -> CandidateResult | None:
    """Smallest candidate (by inside diameter) that passes every criterion."""
    for result in rated:
        if result.passed:
            return result
    return None


def closest(rated: Sequence[CandidateResult]) -> CandidateResult | None:
    """When none passes: the candidate whose worst utilisation is lowest (the best that is on offer)."""
    scored = [(worst.utilisation, r) for r in rated
              if (worst := r.worst) is not None and worst.utilisation is not None
              and not any(v.status == "error" for v in r.verdicts)]
    best = min(scored, key=lambda item: item[0], default=None)
    return best[1] if best is not None else None


def build_result(line: Line, state: FluidState, service: Service, rated: tuple[CandidateResult, ...],
            selected: CandidateResult | None, mode: Mode, mass_flow: float, margin: float, version: str,
            first_guess: float | None, closest_note: bool = True) -> LineResult:
    """The result of one line (or one case of a line: ``closest_note`` False leaves the line-wide notes to
    :func:`boresize.sizing.cases.combine`)."""
    notes = []
    shown = selected if selected is not None else closest(rated)
    if shown is None:
        errors = [v.reason for r in rated for v in r.verdicts if v.status == "error"]
        return LineResult(tag=line.tag, status="error", mode=mode, line=line, state=state, candidates=rated,
                          error=f"line {line.tag}: {errors[0] if errors else 'no candidate size could be rated'}",
                          error_field="criteria", service=service.name, criteria_set=version)
    passed = shown.passed and selected is not None
    if not passed and mode == "size" and closest_note:
        notes.append(f"no size the pipe class allows passes every criterion; closest is NPS {shown.candidate.nps}")
    if passed and mode == "size" and closest_note and rated and rated[0] is shown:
        notes.append(SMALLEST_NOTE.format(nps=shown.candidate.nps))
    if any(v.status == "error" for v in shown.verdicts):
        notes.append("a criterion could not judge this size (error verdict)")
    if shown.hydraulics.regime == "transition":
        notes.append(f"Reynolds number in the transition zone ({LAMINAR_LIMIT:g}-{TURBULENT_LIMIT:g}): "
                     f"turbulent (Colebrook) friction used")
    if passed and mode == "size":
        below = controlling_below([rated], rated.index(shown))
        controlling = below[0] if below else None
    else:
        worst = shown.worst
        controlling = worst.criterion if worst else None
    return LineResult(
        tag=line.tag, status="pass" if passed else "fail", mode=mode, line=line, state=state,
        selected=shown, candidates=rated, controlling=controlling,
        notes=tuple(notes), service=service.name, criteria_set=version, sizing_flow=mass_flow,
        first_guess_diameter=first_guess, design_margin=margin,
    )


def controlling_below(rated: Sequence[Sequence[CandidateResult]], index: int) -> tuple[str, int] | None:
    """The criterion that fails on the size below ``index`` (the next smaller size) in any of a line's cases
    (``rated``: per case, the candidates rated, in the same order), with the case's place. Of the verdicts that
    fail there (a fail before an error verdict), the one whose criterion is nearest its limit at the size selected
    (the highest utilisation there, in the same case): the binding one. Several criteria often fail on the size
    below, and the one furthest past its limit there is not the one that binds (a short water line whose outlet
    falls below zero absolute on the size below fails flashing without bound, yet at the size chosen its drop per
    length is at 81 % and its flashing margin at 0.2 %). Ties, and criteria with no utilisation at the size
    selected, go to the worst fail on the size below (no utilisation counting as unbounded).
    None when ``index`` is the first size rated (the smallest the pipe class allows: the scan always rates the
    size below the one it selects) or nothing fails there.
    """
    if index <= 0:
        return None
    found: list[tuple[int, float, float, str, int]] = []
    for k, case in enumerate(rated):
        above = {v.criterion: v.utilisation for v in case[index].verdicts} if index < len(case) else {}
        for verdict in case[index - 1].verdicts:
            if verdict.status in ("fail", "error"):
                rank = 1 if verdict.status == "fail" else 0
                there = above.get(verdict.criterion)
                found.append((rank, there if there is not None and math.isfinite(there) else -math.inf,
                              verdict.utilisation if verdict.utilisation is not None else math.inf,
                              verdict.criterion, k))
    if not found:
        return None
    best = max(found, key=lambda item: (item[0], item[1], item[2]))
    return best[3], best[4]


def controlling_utilisation(result: LineResult) -> tuple[float | None, str | None]:
    """The controlling criterion's utilisation at the size shown (the highest over a line's cases) and the case
    it comes from (None for a line without cases); (None, None) when no criterion controls."""
    if result.controlling is None:
        return None, None
    shown = [(c.selected, c.line.case if c.line else None) for c in result.cases] or [(result.selected, None)]
    best: tuple[float | None, str | None] = (None, None)
    for selected, case in shown:
        for verdict in selected.verdicts if selected else ():
            if verdict.criterion == result.controlling and verdict.utilisation is not None \
                    and (best[0] is None or verdict.utilisation > best[0]):
                best = (verdict.utilisation, case)
    return best


def error_result(tag: str, exc: BaseException, *, line: Line | None = None, mode: Mode = "size") -> LineResult:
    """An ``error`` LineResult carrying the message and, where known, the field at fault."""
    message = str(exc)
    if isinstance(exc, InputError) and not exc.tag:
        message = str(exc.for_line(tag))
    elif not isinstance(exc, InputError):
        message = f"line {tag}: {message}"
    field = exc.field if isinstance(exc, InputError) else ("fluid" if isinstance(exc, PropertyError) else None)
    return LineResult(tag=tag, status="error", mode=mode, line=line, error=message, error_field=field,
                      notes=tuple(r.note for r in line.bare_pressures) if line is not None else ())
