"""Size or check lines: properties, candidates, hydraulics, verdicts, selection.

Sizing picks the smallest allowed candidate that every applicable criterion passes. Checking
judges the one size the line gives (``nps``). Every candidate is rated with the exact Colebrook
friction factor; the Swamee-Jain diameter is only a first guess shown in the record.
"""

from __future__ import annotations

import math
import sys
import threading
from bisect import bisect_left
from collections.abc import Callable, Mapping, Sequence
from dataclasses import replace
from pathlib import Path
from time import perf_counter
from types import MappingProxyType
from typing import Any, NamedTuple

from boresize.sizing import cases as _cases
from boresize.sizing.services import Service, SizingConfig, load_config
from boresize.criteria.base import CriterionContext
from boresize.errors import BoresizeError, InputError
from boresize.hydraulics.darcy import require_roughness
from boresize.hydraulics.compressible import GasProperties, GasState
from boresize.hydraulics.line import is_gas, rate_line
from boresize.model import Candidate, CandidateResult, FluidState, Hydraulics, Line, LineResult, Mode, Verdict
from boresize.pipes import PipeClass
from boresize.plugins import PluginHost
from boresize.sizing.selection import build_result, error_result, error_verdict, internal_error, select, verdict_fault
from boresize.properties.select import choose_backend, flow_note, fluid_state, mass_flow_of
from boresize.sizing.scan import RATED_ABOVE, criterion_trends, rated_span, start_diameter
from boresize.sizing.service_phase import check_phase, default_service, phase_group

__all__ = ["RATED_ABOVE", "Sizer"]



#: A service's (criterion, options) pairs, options in SI.
Judges = tuple[tuple[Any, Mapping[str, float]], ...]


class _Prepared(NamedTuple):
    """One line case made ready for rating (SI): properties, service, pipe class, sizing mass flow [kg/s]."""

    line: Line
    state: FluidState
    service: Service
    pipe_class: PipeClass
    mass_flow: float
    margin: float
    mode: Mode
    notes: tuple[str, ...]
    start: float  # diameter the guided candidate scan starts from [m]
    judges: Judges  # the service's (criterion, options) pairs that apply to the fluid's phase
    letdown: bool  # a liquid line its service rates as two-phase past its flash point (_letdown)


class _StdoutToStderr:
    """Standard output goes to standard error while any thread's criteria judge, restored when the last one is done
    (a plugin's print() must not corrupt --json on stdout). Counted under a lock: contextlib's redirect_stdout, used
    on threads sizing at once, could restore another thread's stderr as stdout for good. Kept for that, not speed:
    measured -0.8 % against redirect_stdout (benchmarks/bench_hotpath.py --trick stdout-swap --repeat 5)."""

    def __init__(self) -> None:
        self._lock = threading.Lock()
        self._depth = 0
        self._saved: Any = None

    def __enter__(self) -> None:
        with self._lock:
            if not self._depth:
                self._saved, sys.stdout = sys.stdout, sys.stderr
            self._depth += 1

    def __exit__(self, *exc: object) -> None:
        with self._lock:
            self._depth -= 1
            if not self._depth:
                sys.stdout, self._saved = self._saved, None


_QUIET = _StdoutToStderr()


class Sizer:
    """Sizes and checks lines with the installed plugins and a criteria configuration.

    :param host: the plugin host (built with entry points when not given)
    :param config: services and pipe classes (the shipped set when not given)
    :param criteria_file: a criteria TOML to load instead of passing ``config``
    :param check_roughness: absolute roughness [m] for lines checked at a given NPS that give no
        ``roughness`` of their own (a corroded existing line); None keeps the pipe class's
    :param every_size: rate every size of the pipe class from the smallest (slower; the record then shows
        all the sizes below the selected one) instead of the guided scan of :mod:`boresize.sizing.scan`
    :param sizes_above: sizes rated above the selected one, for the record only (:data:`RATED_ABOVE`, the
        default; 0 for a run whose outputs show only the selected size: same selection, same numbers, fewer
        candidates in ``LineResult.candidates``)
    """

    def __init__(self, host: PluginHost | None = None, config: SizingConfig | None = None,
                 criteria_file: str | Path | None = None, *, check_roughness: float | None = None,
                 every_size: bool = False, sizes_above: int = RATED_ABOVE) -> None:
        if isinstance(sizes_above, bool) or not isinstance(sizes_above, int) or sizes_above < 0:
            raise InputError(f"sizes_above {sizes_above!r} is not a whole number of 0 or more", field="sizes_above",
                             value=sizes_above, expected=f"0 or more sizes (default {RATED_ABOVE})")
        self.host = host or PluginHost.load()
        self.config = config or load_config(self.host, criteria_file)
        self.check_roughness = check_roughness
        self.every_size = every_size
        self.sizes_above = sizes_above
        #: a failing check names the smallest passing size of its pipe class (rates the class: headroom's trials
        #: turn it off)
        self.name_passing_size = True
        #: (pipe class, NPS, schedule) -> its candidates, keyed by content
        self._candidates: dict[tuple[PipeClass, str | None, str | None], tuple[Candidate, ...]] = {}
        #: each thread's seconds spent in each criterion's evaluate (criterion id -> seconds), summed since built;
        #: per thread so that chunks sized on threads of one process are timed apart (see criterion_seconds)
        self._spent = threading.local()

    # -- one line -----------------------------------------------------------------------------
    def run(self, line: Line) -> LineResult:
        """Check the line if it gives an NPS, else size it. Faults become an ``error`` result."""
        try:
            return self._run(line)
        except BoresizeError as exc:
            return error_result(line.tag, exc, line=line, mode="check" if line.nps else "size")

    def _run(self, line: Line) -> LineResult:
        prepared = self._prepare(line)
        rated = self._rate_all(prepared)
        result = self._finish(prepared, rated, select(rated) if prepared.mode == "size" else rated[0])
        return self._passing_size(result, [prepared])

    def _passing_size(self, result: LineResult, ready: Sequence[_Prepared]) -> LineResult:
        """A failing check names the smallest size of its pipe class that passes every case, sized as sizing
        sizes (the same properties, service, roughness and design margin; the class's schedules)."""
        if result.mode != "check" or result.status != "fail" or not self.name_passing_size:
            return result
        sized = [p._replace(line=replace(p.line, nps=None, schedule=None), mode="size") for p in ready]
        name = ready[0].pipe_class.name
        try:
            rated = self._rate_cases(sized)
        except BoresizeError as exc:
            return replace(result, notes=result.notes + (f"the sizes of pipe class {name} could not be rated: {exc}",))
        index, passed = _cases.common_index(rated, "size")
        nps = rated[0][index].candidate.nps if passed and index is not None else None
        note = (f"the smallest size of pipe class {name} that passes is NPS {nps}" if nps is not None
                else f"no size of pipe class {name} passes")
        return replace(result, smallest_passing_nps=nps, notes=result.notes + (note,))

    def _prepare(self, line: Line) -> _Prepared:
        mode: Mode = "check" if line.nps else "size"
        notes: tuple[str, ...] = tuple(read.note for read in line.bare_pressures)  # how each pressure in a bare unit was read
        if mode == "check" and line.roughness is None and self.check_roughness is not None:
            line = replace(line, roughness=self.check_roughness)
            notes += (f"checked with corroded roughness {self.check_roughness * 1e3:g} mm",)
        state = fluid_state(self.host, line)
        service = self._service(line, state)
        pipe_class = self.config.pipe_class(line.pipe_class or service.pipe_class)
        margin = line.design_margin if line.design_margin is not None else service.design_margin
        mass_flow = mass_flow_of(self.host, line, state) * (1.0 + margin)
        converted = flow_note(line, state)
        notes += (converted,) if converted else ()
        start = start_diameter(service, line, state, mass_flow,
                               line.roughness if line.roughness is not None else pipe_class.roughness)
        letdown = _letdown(service, state)
        if letdown and state.vapour_pressure is None and state.bubble_pressure is None:
            # where it flashes is unknown: unevaluated is not a pass (a liquid-only service judges it by flashing)
            raise InputError(f"service {service.name!r} rates a liquid line as two-phase past its bubble pressure, "
                             f"which the {state.source} backend does not give for {line.fluid}",
                             field="vapour_pressure", value="",
                             expected="the line's vapour_pressure, a backend that gives it, or a liquid-only service"
                             ).for_line(line.tag)
        return _Prepared(line, state, service, pipe_class, mass_flow, margin, mode, notes, start,
                         _applicable(service, state.phase), letdown)

    def _rate_all(self, p: _Prepared) -> tuple[CandidateResult, ...]:
        return self._rate_cases([p])[0]

    def _rate_cases(self, ready: Sequence[_Prepared]) -> list[tuple[CandidateResult, ...]]:
        """Rate every case's candidates around the smallest size that passes in every case, and
        :attr:`sizes_above` sizes above it (the record shows one size below to two above by default).

        The guided scan (:mod:`boresize.sizing.scan`) starts near the first-guess diameter and walks; when it cannot
        prove its answer (a criterion without a known trend fails, an error verdict, nothing passes), or
        ``every_size`` is set, every size is rated from the smallest, as the selection is defined."""
        candidates = self._candidates_of(ready[0].line, ready[0].pipe_class)
        _check_roughness(ready[0].line, candidates[0])
        memo: dict[int, list[CandidateResult]] = {}

        def rate(i: int) -> list[CandidateResult]:
            if i not in memo:
                memo[i] = [self._rate(p, candidates[i]) for p in ready]
            return memo[i]

        pressures = {p.line.pressure for p in ready}
        trends = criterion_trends([c for p in ready for c, _ in p.service.criteria], pressures, candidates)
        span = rated_span(len(candidates), rate, trends, bisect_left([c.inside_diameter for c in candidates],
                                                                     max(p.start for p in ready)),
                          every_size=self.every_size, above=self.sizes_above)
        return [tuple(memo[i][k] for i in range(span[0], span[1] + 1)) for k in range(len(ready))]

    def _candidates_of(self, line: Line, pipe_class: PipeClass) -> tuple[Candidate, ...]:
        """The class's sizes, or the one size a checked line gives (cached by content: building them costs more
        than rating)."""
        key = (pipe_class, line.nps, line.schedule)  # cached: +28-32 % on the demo case, benchmarks/bench_rating.py
        cached = self._candidates.get(key)
        if cached is None:
            cached = self._candidates[key] = _candidates(pipe_class, line)
        return cached

    def _finish(self, p: _Prepared, rated: tuple[CandidateResult, ...], selected: CandidateResult | None,
                closest_note: bool = True) -> LineResult:
        first_guess = _first_guess(p)
        result = build_result(p.line, p.state, p.service, rated, selected, p.mode, p.mass_flow, p.margin,
                         p.service.stamp, first_guess, closest_note)
        return replace(result, notes=result.notes + p.notes) if p.notes else result

    def _service(self, line: Line, state: FluidState) -> Service:
        name = line.service or default_service(line, state)
        if name not in self.config.services:
            raise InputError(f"unknown service {name!r}", field="service", value=name,
                             expected=f"one of {', '.join(self.config.service_names())}").for_line(line.tag)
        service = self.config.services[name]
        check_phase(line, state, service)
        return service

    def _rate(self, p: _Prepared, candidate: Candidate) -> CandidateResult:
        """Rate one candidate: a gas line whose drop exceeds the simple method's limit is marched, whatever its
        verdicts, so that every number it reports comes from the method its verdicts used."""
        hyd = self._hydraulics(p.line, p.state, candidate, p.mass_flow, p.service.two_phase_method, p.letdown)
        return CandidateResult(candidate, hyd, self._verdicts(p, candidate, hyd))

    def _hydraulics(self, line: Line, state: FluidState, candidate: Candidate, mass_flow: float,
                    two_phase_method: str | None = None, letdown: bool = False) -> Hydraulics:
        try:
            hyd = rate_line(line, state, candidate, mass_flow, properties=self._along(line, state, letdown),
                            two_phase_method=two_phase_method, letdown=letdown,
                            march_properties=self._gas_along(line) if is_gas(state) else None)
        except (OverflowError, ZeroDivisionError) as exc:
            raise _beyond_range(mass_flow, f"in NPS {candidate.nps}") from exc
        isfinite = math.isfinite  # an inf drop would fail every size, a NaN pass it
        if not (isfinite(hyd.velocity) and isfinite(hyd.reynolds) and isfinite(hyd.friction_factor)
                and isfinite(hyd.drop_per_length) and isfinite(hyd.total_drop)):
            raise _beyond_range(mass_flow, f"in NPS {candidate.nps}")
        return hyd

    def _along(self, line: Line, state: FluidState, letdown: bool = False) -> Callable[[float, float], FluidState]:
        """The properties along the line, (p [Pa abs], T [K]) -> FluidState: a pure fluid's two-phase state (or a
        letdown line's liquid) re-flashed at the inlet's enthalpy where its backend offers that (``isenthalpic``),
        else at (p, T)."""
        if (state.phase == "two-phase" or letdown) and state.source == "coolprop":
            isenthalpic = getattr(choose_backend(self.host, line), "isenthalpic", None)
            flash = isenthalpic(line, state) if isenthalpic is not None else None
            if flash is not None:
                return flash  # type: ignore[no-any-return]
        return lambda p, t: choose_backend(self.host, line).state(line, p, t)

    def _gas_along(self, line: Line) -> GasProperties:
        """What a gas march reads along the line, (p [Pa abs], T [K]) -> density, viscosity, speed of sound: the
        backend's ``gas_march`` where it offers one (the same floats and errors as its ``state``, cheaper), else
        its ``state``; the backend is found on the first point asked (most candidates are never marched)."""
        host, along = self.host, None

        def at(pressure: float, temperature: float) -> GasState:
            nonlocal along
            if along is None:
                backend = choose_backend(host, line)
                light = getattr(backend, "gas_march", None)
                along = (light(line) if light is not None else None) or (lambda p, t: backend.state(line, p, t))
            return along(pressure, temperature)  # type: ignore[no-any-return]
        # measured: +15-24 % sizing steam lines (4 runs), with gas_march (benchmarks/bench_rating.py --only gas-march)
        return at

    def _verdicts(self, p: _Prepared, candidate: Candidate, hyd: Hydraulics) -> tuple[Verdict, ...]:
        judge, line, state, name = self._judge, p.line, p.state, p.service.name
        judges = p.judges  # a letdown line that flashed is judged as the two-phase line it becomes
        if hyd.two_phase is not None and state.phase != "two-phase":
            judges = _applicable(p.service, "two-phase")
        with _QUIET:  # a plugin's print() must not corrupt --json on stdout
            return tuple([judge(criterion, CriterionContext(line, state, candidate, hyd, options, name))
                          for criterion, options in judges])

    def criterion_seconds(self) -> dict[str, float]:
        """Seconds this thread spent in each criterion's evaluate since the sizer was built (criterion id ->
        seconds); a batch reports the difference over its lines (:func:`boresize.sizing.batch.run_items`)."""
        return dict(self._spent.__dict__)

    def _judge(self, criterion: object, context: CriterionContext) -> Verdict:
        start = perf_counter()  # one clock pair a call: 0.4 us, 35 calls a demo line: under 1 % of its sizing
        try:
            result = criterion.evaluate(context)  # type: ignore[attr-defined]
        except KeyboardInterrupt:  # the user's Ctrl-C stops the run (the CLI exits 130)
            raise
        except BaseException as exc:  # a plugin's fault, sys.exit() too: an error verdict naming it, the batch goes on
            return self._fault(criterion, f"raised {type(exc).__name__}" + (f": {exc}" if str(exc) else ""))
        finally:
            spent, ident = self._spent.__dict__, str(getattr(criterion, "id", "?"))
            spent[ident] = spent.get(ident, 0.0) + (perf_counter() - start)
        if not isinstance(result, Verdict):
            return self._fault(criterion, f"returned {type(result).__name__}, not a Verdict")
        fault = verdict_fault(result, getattr(criterion, "id", None))
        return self._fault(criterion, fault) if fault else result

    def _fault(self, criterion: object, what: str) -> Verdict:
        ident = getattr(criterion, "id", "?")
        return error_verdict(ident, self.host.criteria.owner(ident), what)

    # -- one line, several operating cases ---------------------------------------------------
    def run_cases(self, lines: Sequence[Line]) -> LineResult:
        """Size (or check) one line over its operating cases (one :class:`Line` per case, same tag).

        Sizing takes the smallest candidate that passes every case; the result carries every case's
        result in ``cases`` and, per criterion, the governing case (see :mod:`boresize.sizing.cases`).
        Faults of one case make the line an ``error`` whose message names the case; never raises.
        """
        if len(lines) == 1:
            return self.run_safely(lines[0])
        named = _cases.name_cases(lines)
        mode: Mode = "check" if named[0].nps else "size"
        try:
            return self._run_cases(named, mode)
        except BoresizeError as exc:
            failed = [error_result(line.tag, exc, line=line, mode=mode) for line in named]
            return _cases.cases_error(named[0].tag, failed, mode)
        except Exception as exc:  # a bug: report it on the line, never lose the line
            failed = [internal_error(line, exc) for line in named]
            return _cases.cases_error(named[0].tag, failed, mode)

    def _run_cases(self, lines: tuple[Line, ...], mode: Mode) -> LineResult:
        _cases.check_cases(lines)
        prepared: list[_Prepared | LineResult] = []
        for line in lines:
            try:
                prepared.append(self._prepare(line))
            except BoresizeError as exc:
                prepared.append(_cases.case_error(error_result(line.tag, exc, line=line, mode=mode), str(line.case)))
        if any(isinstance(p, LineResult) for p in prepared):
            each = [p if isinstance(p, LineResult) else self.run_safely(p.line) for p in prepared]
            return _cases.cases_error(lines[0].tag, each, mode)
        ready = [p for p in prepared if isinstance(p, _Prepared)]
        classes = {p.pipe_class.name for p in ready}
        if len(classes) > 1:
            raise InputError(f"the cases' services use different pipe classes: {', '.join(sorted(classes))}",
                             field="pipe_class", value=", ".join(sorted(classes)),
                             expected="one pipe class for every case of a line").for_line(lines[0].tag)
        rated = self._rate_cases(ready)
        index, passed = _cases.common_index(rated, mode)
        if index is None:
            each = [self._finish(p, r, None) for p, r in zip(ready, rated)]
            return _cases.cases_error(lines[0].tag, each, mode, f"line {lines[0].tag}: no candidate size could "
                                      f"be rated in every case", "criteria")
        each = [self._finish(p, r, r[index], closest_note=False) for p, r in zip(ready, rated)]
        return self._passing_size(_cases.combine(each, passed, mode), ready)

    def run_safely(self, line: Line) -> LineResult:
        """:meth:`run`, but an unexpected fault (a bug) is also an ``error`` result, never lost."""
        try:
            return self.run(line)
        except Exception as exc:  # report, don't lose the line; the message asks for a bug report
            return internal_error(line, exc)


def _candidates(pipe_class: PipeClass, line: Line) -> tuple[Candidate, ...]:
    """Every size the class offers, or the one a checked line gives (in its own schedule when it gives one)."""
    if not line.nps:
        return pipe_class.candidates()
    if not line.schedule:
        return (pipe_class.candidate(line.nps),)
    return (replace(pipe_class, schedule=line.schedule, schedule_by_nps=()).candidate(line.nps),)


def _check_roughness(line: Line, smallest: Candidate) -> None:
    """A line's own roughness must be below the smallest candidate's bore, whichever sizes the scan rates."""
    if line.roughness is not None:
        try:
            require_roughness(line.roughness, smallest.inside_diameter)
        except InputError as exc:
            raise exc.for_line(line.tag) from None


def _beyond_range(mass_flow: float, where: str) -> InputError:
    """The error of a flow so large or so small that the hydraulics leave floating-point range."""
    return InputError(f"sizing flow {mass_flow:.6g} kg/s is beyond the range the hydraulics can compute {where}",
                      field="flow", value=mass_flow, expected="a flow of process-plant size; check its unit")


def _applicable(service: Service, phase: str) -> Judges:
    """The service's (criterion, options) pairs that judge a fluid in ``phase``; each line's options are a read-only
    copy (a plugin that wrote to its options would change every later line judged with them)."""
    group = phase_group(phase)
    return tuple((c, MappingProxyType(dict(o))) for c, o in service.criteria if phase in c.phases or group in c.phases)


def _letdown(service: Service, state: FluidState) -> bool:
    """A liquid line whose service also accepts two-phase lines: rated two-phase past its flash point."""
    return state.phase == "liquid" and "two-phase" in service.accepts


def _first_guess(p: _Prepared) -> float | None:
    """The diameter the record shows as the first guess [m]: that of the first of the service's criteria that
    proposes one (``proposes_first_guess``; the built-in drop-per-length's Swamee-Jain diameter), at the pipe
    class's roughness; None when none does."""
    for criterion, options in p.service.criteria:
        if getattr(criterion, "proposes_first_guess", False):
            try:
                guess = criterion.diameter_at_limit(options, p.line, p.state, p.mass_flow, p.pipe_class.roughness)
            except OverflowError as exc:
                raise _beyond_range(p.mass_flow, "for the first-guess diameter") from exc
            if guess is not None:
                return float(guess)
    return None

