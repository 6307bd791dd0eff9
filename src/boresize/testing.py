"""Helpers for testing a plugin's criteria: a context or a verdict from a line at one NPS, in one call.

The fluid state, the candidate and its hydraulics are worked out the real way: the line is checked at the
given size through :func:`boresize.api.check`, with the shipped criteria sets (or the criteria file and the
sizer given), exactly as a sizing run would rate that size::

    from boresize.testing import run_criterion

    result = run_criterion(RackMinimumSize(), {"tag": "U-1", "fluid": "water", "flow": "0.5 t/h",
                                               "pressure": "4 barg", "temperature": "20 degC"}, "1-1/2",
                           options={"min_nps": 2})
    assert result.status == "fail"
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import replace
from pathlib import Path
from typing import TYPE_CHECKING, Any, Union

from boresize.api import check, make_line
from boresize.criteria.base import CriterionContext, parse_options
from boresize.errors import BoresizeError, InputError, PluginError
from boresize.model import Line, Verdict
from boresize.registry import check_criterion
from boresize.sizing.selection import verdict_fault
from boresize.sizing.service_phase import phase_group

if TYPE_CHECKING:
    from boresize.criteria.protocol import CriterionProtocol
    from boresize.sizing.engine import Sizer

__all__ = ["LineInput", "criterion_context", "run_criterion"]

#: A Line, or the keyword arguments of :func:`boresize.make_line` (text values such as ``"45 t/h"``).
LineInput = Union[Line, Mapping[str, Any]]


def criterion_context(line: LineInput, nps: str | float, *, criterion: CriterionProtocol | None = None,
                      options: Mapping[str, object] | None = None, schedule: str | int | None = None,
                      criteria: str | Path | None = None, plugins: bool = False,
                      sizer: Sizer | None = None) -> CriterionContext:
    """The context a criterion receives for ``line`` at ``nps`` (in ``schedule``, else the pipe class's).

    :param line: a Line, or make_line's keyword arguments (``{"tag": "P-1", "fluid": "water", ...}``)
    :param criterion: the criterion whose option specs read ``options`` (defaults filled in, SI floats)
    :param options: the criterion's options as a criteria file gives them (``{"max": "3 m/s"}``)
    :param criteria: a criteria TOML whose services and pipe classes the engine uses (the shipped sets when None)
    :param plugins: True to load installed plugins (their property backends, pipe classes, criteria)
    :param sizer: an engine to use instead of one built from ``criteria`` and ``plugins``
    :raises InputError: the line or the options cannot be read, or the line cannot be rated at ``nps``
    :raises BoresizeError: the engine could not rate the line (a property backend's fault, for example)
    """
    given = _line(line)
    result = check(given, nps, schedule=schedule, criteria=criteria, plugins=plugins, sizer=sizer)
    if result.selected is None or result.state is None or result.line is None:
        result.raise_for_error()
        raise BoresizeError(f"line {given.tag}: no rated candidate at NPS {nps}")  # pragma: no cover - defensive
    seen = replace(result.line, nps=given.nps, schedule=given.schedule)  # as a sizing run gives it
    service = result.service or ""
    return CriterionContext(seen, result.state, result.selected.candidate, result.selected.hydraulics,
                            _options(criterion, options, service), service)


def run_criterion(criterion: CriterionProtocol, line: LineInput, nps: str | float, *,
                  options: Mapping[str, object] | None = None, schedule: str | int | None = None,
                  criteria: str | Path | None = None, plugins: bool = False, sizer: Sizer | None = None) -> Verdict:
    """Evaluate ``criterion`` on ``line`` at ``nps`` and return its Verdict (see :func:`criterion_context`).

    The criterion is first checked as registration checks it, and its Verdict as the engine checks it; an
    exception raised by ``evaluate`` reaches the test as it is (the engine would turn it into an ``error``
    verdict).

    :raises PluginError: the criterion breaks the protocol, or returns something that is not a valid Verdict
    :raises InputError: the line's phase at its conditions is not one the criterion judges
    """
    check_criterion(criterion, type(criterion).__module__)
    context = criterion_context(line, nps, criterion=criterion, options=options, schedule=schedule,
                                criteria=criteria, plugins=plugins, sizer=sizer)
    phase = context.state.phase
    if phase not in criterion.phases and phase_group(phase) not in criterion.phases:
        raise InputError(f"criterion {criterion.id!r} judges {', '.join(sorted(criterion.phases))}; the engine "
                         f"does not call it for this {phase} line", field="phase", value=phase,
                         expected=f"a line whose fluid is {' or '.join(sorted(criterion.phases))} at its "
                                  "conditions", tag=context.line.tag)
    verdict = criterion.evaluate(context)
    if not isinstance(verdict, Verdict):
        raise PluginError(f"criterion {criterion.id!r} returned {type(verdict).__name__}, not a Verdict")
    fault = verdict_fault(verdict)
    if fault:
        raise PluginError(f"criterion {criterion.id!r} {fault}")
    return verdict


def _line(line: LineInput) -> Line:
    if isinstance(line, Line):
        return line
    if isinstance(line, Mapping):
        return make_line(**line)
    raise InputError(f"a {type(line).__name__} is not a line", field="line", value=repr(line)[:80],
                     expected="a Line, or make_line's keyword arguments as a dict")


def _options(criterion: CriterionProtocol | None, given: Mapping[str, object] | None,
             service: str) -> dict[str, float]:
    if criterion is None:
        if given:
            raise InputError("options given without the criterion whose option specs read them", field="options",
                             value=dict(given), expected="criterion= with the options, or no options")
        return {}
    return parse_options(criterion, given or {}, f"service.{service}.{criterion.id}")
