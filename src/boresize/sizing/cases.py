"""Operating cases: several rows of a line list that share a tag and name a ``case``.

A line is often given for several operating cases (normal, maximum, minimum, start-up ...), each
with its own flow, pressure and temperature. They are one line: the size chosen is the smallest that
passes every case, and for each criterion the case with the highest utilisation at that size governs
it. The line's controlling criterion is the one that fails on the next smaller size in any case (the worst
such fail); every case carries the line's. These helpers check and combine per-case results; the engine does
the rating (the readers group rows into lines: :mod:`boresize.io.line_items`).

A row without a ``case`` value is a line of its own, exactly as before cases existed (two such rows
with the same tag stay two lines, and the second is refused as a duplicate tag).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import replace

from boresize.errors import InputError
from boresize.model import CandidateResult, Line, LineResult, Mode
from boresize.sizing.selection import SMALLEST_NOTE, controlling_below

__all__ = ["check_cases", "name_cases", "common_index", "combine", "case_error", "cases_error"]


def name_cases(lines: Sequence[Line]) -> tuple[Line, ...]:
    """Give an unnamed case the name ``case N`` (N its 1-based place), so every case can be named."""
    return tuple(line if line.case else replace(line, case=f"case {i}") for i, line in enumerate(lines, start=1))


def check_cases(lines: Sequence[Line]) -> None:
    """The cases of one line must name each case once and agree on the pipe (class, NPS, schedule).

    :raises InputError: naming the field at fault and the values the cases give
    """
    tag = lines[0].tag
    names = [line.case for line in lines]
    twice = [name for name in names if names.count(name) > 1]
    if twice:
        raise InputError(f"case {twice[0]!r} appears {names.count(twice[0])} times", field="case", value=twice[0],
                         expected="each case name once per line").for_line(tag)
    for name in ("pipe_class", "nps", "schedule"):
        given = {getattr(line, name) for line in lines}
        if len(given) > 1:
            shown = ", ".join(f"{getattr(line, name) or '(none)'} (case {line.case})" for line in lines)
            raise InputError(f"the cases give different values: {shown}", field=name, value=shown,
                             expected=f"one {name} for every case of a line (a line is one pipe)").for_line(tag)


def _clean(result: CandidateResult) -> bool:
    return result.worst is not None and not any(v.status == "error" for v in result.verdicts)


def _utilisation(result: CandidateResult) -> float:
    """The worst utilisation of a clean candidate (see :func:`_clean`); 0 where it has none."""
    worst = result.worst
    return (worst.utilisation or 0.0) if worst is not None else 0.0


def common_index(rated: Sequence[Sequence[CandidateResult]], mode: Mode) -> tuple[int | None, bool]:
    """Index of the candidate to show for every case, and whether every case passes there.

    Size mode: the smallest candidate that every case passes; when none does, the candidate whose
    highest utilisation over the cases is lowest (None if no candidate could be rated in every case).
    Check mode: the one candidate the line gives.
    """
    if mode == "check":
        return 0, all(r[0].passed for r in rated)
    count = min(len(r) for r in rated)
    for i in range(count):
        if all(r[i].passed for r in rated):
            return i, True
    scores = [(max(_utilisation(r[i]) for r in rated), i)
              for i in range(count) if all(_clean(r[i]) for r in rated)]
    return (min(scores)[1] if scores else None), False


def _governing(cases: Sequence[LineResult]) -> dict[str, tuple[float, str]]:
    """Per criterion id: (highest utilisation at the selected size, the case it comes from)."""
    best: dict[str, tuple[float, str]] = {}
    for case in cases:
        for verdict in case.selected.verdicts if case.selected else ():
            if verdict.utilisation is None:
                continue
            if verdict.criterion not in best or verdict.utilisation > best[verdict.criterion][0]:
                best[verdict.criterion] = (verdict.utilisation, str(case.line.case if case.line else ""))
    return best


def combine(cases: Sequence[LineResult], passed: bool, mode: Mode) -> LineResult:
    """One line's result from its case results (all rated at the same candidate).

    The line's own fields come from the governing case: the one whose worst utilisation is highest
    (the first such case in input order on a tie). Status: pass only when every case passes.
    """
    def worst(case: LineResult) -> float:
        w = case.selected.worst if case.selected else None
        return w.utilisation if w is not None and w.utilisation is not None else float("-inf")

    main = max(cases, key=worst)
    notes = []
    if not passed and mode == "size" and main.selected is not None:
        notes.append(f"no size the pipe class allows passes every case; closest is NPS {main.selected.candidate.nps}")
    controlling = main.controlling
    if passed and mode == "size" and main.selected is not None:
        controlling = _controlling(cases, main.selected)
        if controlling is None and cases[0].candidates and cases[0].candidates[0] is cases[0].selected:
            notes.append(SMALLEST_NOTE.format(nps=main.selected.candidate.nps))
    notes += [f"case {c.line.case if c.line else '?'}: {note}" for c in cases for note in c.notes]
    governing = tuple((criterion, case) for criterion, (_, case) in _governing(cases).items())
    each = tuple(replace(c, controlling=controlling) for c in cases)
    return replace(main, status="pass" if passed else "fail", notes=tuple(notes), cases=each,
                   governing=governing, raw={}, controlling=controlling)


def _controlling(cases: Sequence[LineResult], selected: CandidateResult) -> str | None:
    """The criterion that fails on the size below the selected one in any case (the worst such fail)."""
    index = next((i for i, c in enumerate(cases[0].candidates) if c.candidate == selected.candidate), None)
    if index is None:
        return None
    below = controlling_below([c.candidates for c in cases], index)
    return below[0] if below else None


def case_error(result: LineResult, case: str) -> LineResult:
    """An error result of one case, its message naming the case after the line tag."""
    message = result.error or "error"
    prefix = f"line {result.tag}: "
    if message.startswith(prefix):
        message = f"line {result.tag}, case {case}: {message[len(prefix):]}"
    else:
        message = f"case {case}: {message}"
    line = replace(result.line, case=case) if result.line is not None else None
    return replace(result, error=message, line=line)


def cases_error(tag: str, cases: Sequence[LineResult], mode: Mode, message: str | None = None,
                field: str | None = None) -> LineResult:
    """The error result of a line whose case(s) could not be rated; ``cases`` keeps every case's result."""
    failed = [c for c in cases if c.status == "error"]
    first = failed[0] if failed else None
    return LineResult(tag=tag, status="error", mode=mode,
                      line=first.line if first else None, error=message or (first.error if first else None),
                      error_field=field or (first.error_field if first else None), cases=tuple(cases))
