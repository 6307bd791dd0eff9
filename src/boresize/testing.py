"""Helpers for testing a plugin: a criterion's context or verdict for a line at one NPS, or a line sized with
the plugin, each in one call.

The fluid state, the candidate and its hydraulics are worked out the real way: the line is checked at the
given size through :func:`boresize.api.check`, exactly as a sizing run rates that size. The engine holds the
built-in plugins, the ``plugins`` given (as an installed entry point would load them; installed entry points are
left out) and the services of ``criteria`` (the shipped sets when None)::

    from boresize.testing import run_criterion

    result = run_criterion(RackMinimumSize(), {"tag": "U-1", "fluid": "water", "flow": "0.5 t/h",
                                               "pressure": "4 barg", "temperature": "20 degC"}, "1-1/2",
                           options={"min_nps": 2})
    assert result.status == "fail"
"""

from __future__ import annotations

from collections.abc import Iterable, Mapping
from dataclasses import replace
from pathlib import Path
from typing import TYPE_CHECKING, Any, Union

from boresize.api import check, make_line, size
from boresize.api.result import SizingResult
from boresize.criteria.base import CriterionContext, parse_options
from boresize.errors import BoresizeError, InputError, PluginError
from boresize.model import Line, Verdict
from boresize.plugins import PluginHost
from boresize.registry import check_criterion
from boresize.sizing.selection import verdict_fault
from boresize.sizing.service_phase import phase_group

if TYPE_CHECKING:
    from boresize.criteria.protocol import CriterionProtocol
    from boresize.sizing.engine import Sizer

__all__ = ["LineInput", "criterion_context", "run_criterion", "size_line", "plugin_sizer"]

#: A Line, or the keyword arguments of :func:`boresize.make_line` (text values such as ``"45 t/h"``).
LineInput = Union[Line, Mapping[str, Any]]


def plugin_sizer(plugins: Iterable[object] = (), criteria: str | Path | None = None) -> Sizer:
    """An engine with the built-in plugins, then ``plugins``, and the services of ``criteria``.

    :param plugins: plugin modules or objects, registered as an installed entry point would be
    :raises PluginError: a plugin registers something that breaks the contract
    :raises CriteriaFileError: the criteria file names a criterion, option or pipe class these plugins lack
    """
    from boresize.sizing.engine import Sizer

    return Sizer(PluginHost.load(load_entry_points=False, extra=plugins), criteria_file=criteria)




def criterion_context(line: LineInput, nps: str | float, *, criterion: CriterionProtocol | None = None,
                      options: Mapping[str, object] | None = None, schedule: str | int | None = None,
                      plugins: Iterable[object] = (), criteria: str | Path | None = None,
                      sizer: Sizer | None = None) -> CriterionContext:
    """The context a criterion receives for ``line`` at ``nps`` (in ``schedule``, else the pipe class's).

    :param line: a Line, or make_line's keyword arguments (``{"tag": "P-1", "fluid": "water", ...}``)
    :param criterion: the criterion whose option specs read ``options`` (defaults filled in, SI floats)
    :param options: the criterion's options as a criteria file gives them (``{"max": "3 m/s"}``)
    :param plugins: plugin modules or objects the engine registers (their backends, pipe classes, criteria)
    :param criteria: a criteria TOML whose services and pipe classes the engine uses
    :param sizer: an engine to use instead of one built from ``plugins`` and ``criteria`` (build it once with
        :func:`plugin_sizer` for many calls: a new engine loads its property backends again)
    :raises InputError: the line or the options cannot be read, or the line cannot be rated at ``nps``
    :raises BoresizeError: the engine could not rate the line (a property backend's fault, for example)
    """
    given = _line(line)
    result = check(given, nps, schedule=schedule, plugins=False, sizer=_engine(plugins, criteria, sizer))
    if result.selected is None or result.state is None or result.line is None:
        result.raise_for_error()
        raise BoresizeError(f"line {given.tag}: no rated candidate at NPS {nps}")  # pragma: no cover - defensive
    seen = replace(result.line, nps=given.nps, schedule=given.schedule)  # as a sizing run gives it
    service = result.service or ""
    return CriterionContext(seen, result.state, result.selected.candidate, result.selected.hydraulics,
                            _options(criterion, options, service), service)


def run_criterion(criterion: CriterionProtocol, line: LineInput, nps: str | float, *,
                  options: Mapping[str, object] | None = None, schedule: str | int | None = None,
                  plugins: Iterable[object] = (), criteria: str | Path | None = None,
                  sizer: Sizer | None = None) -> Verdict:
    """Evaluate ``criterion`` on ``line`` at ``nps`` and return its Verdict (see :func:`criterion_context`).

    The criterion is first checked as registration checks it, and its Verdict as the engine checks it; an
    exception raised by ``evaluate`` reaches the test as it is (the engine would turn it into an ``error``
    verdict).

    :raises PluginError: the criterion breaks the protocol, or returns something that is not a valid Verdict
    :raises InputError: the line's phase at its conditions is not one the criterion judges
    """
    check_criterion(criterion, type(criterion).__module__)
    context = criterion_context(line, nps, criterion=criterion, options=options, schedule=schedule,
                                plugins=plugins, criteria=criteria, sizer=sizer)
    phase = context.state.phase
    if phase not in criterion.phases and phase_group(phase) not in criterion.phases:
        raise InputError(f"criterion {criterion.id!r} judges {', '.join(sorted(criterion.phases))}; the engine "
                         f"does not call it for this {phase} line", field="phase", value=phase,
                         expected=f"a line whose fluid is {' or '.join(sorted(criterion.phases))} at its "
                                  "conditions", tag=context.line.tag)
    verdict = criterion.evaluate(context)
    if not isinstance(verdict, Verdict):
        raise PluginError(f"criterion {criterion.id!r} returned {type(verdict).__name__}, not a Verdict")
    fault = verdict_fault(verdict, criterion.id)
    if fault:
        raise PluginError(f"criterion {criterion.id!r} {fault}")
    return verdict


def size_line(line: LineInput, *, plugins: Iterable[object] = (), criteria: str | Path | None = None,
              nps: str | float | None = None, sizer: Sizer | None = None) -> SizingResult:
    """Size ``line`` (or check it at ``nps``, or at the NPS it gives) with ``plugins`` registered after the
    built-ins and the services of ``criteria``.

    :returns: the result of :func:`boresize.size`, errors included (``status == "error"``)
    :raises CriteriaFileError: the criteria file names a criterion, option or pipe class these plugins lack
    """
    engine, given = _engine(plugins, criteria, sizer), _line(line)
    return check(given, nps, plugins=False, sizer=engine) if nps is not None else size(given, plugins=False,
                                                                                      sizer=engine)


def _engine(plugins: Iterable[object], criteria: str | Path | None, sizer: Sizer | None) -> Sizer | None:
    """The engine to run on: the one given, a new one for ``plugins`` and ``criteria``, or None for the public
    API's own (built-in plugins, shipped sets), built once: a context for water at NPS 2 took 80 ms on a new
    engine and 0.2 ms on that one (the property backends load again in a new engine)."""
    plugins = tuple(plugins)
    if sizer is not None or (not plugins and criteria is None):
        return sizer
    return plugin_sizer(plugins, criteria)


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
