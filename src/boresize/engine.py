"""Size or check lines: properties, candidates, hydraulics, verdicts, selection.

Sizing picks the smallest allowed candidate that every applicable criterion passes. Checking
judges the one size the line gives (``nps``). Every candidate is rated with the exact Colebrook
friction factor; the Swamee-Jain diameter is only a first guess shown in the record.
"""

from __future__ import annotations

from collections.abc import Iterable, Mapping, Sequence
from pathlib import Path

from boresize.config import Service, SizingConfig, load_config
from boresize.criteria.base import CriterionContext
from boresize.errors import BoresizeError, InputError, PropertyError
from boresize.hydraulics import swamee_jain_diameter
from boresize.hydraulics.line import rate_line
from boresize.model import Candidate, CandidateResult, FluidState, Line, LineResult, Verdict
from boresize.plugins import PluginHost
from boresize.properties.select import fluid_state, mass_flow_of

__all__ = ["Sizer"]


class Sizer:
    """Sizes and checks lines with the installed plugins and a criteria configuration.

    :param host: the plugin host (built with entry points when not given)
    :param config: services and pipe classes (the shipped set when not given)
    :param criteria_file: a criteria TOML to load instead of passing ``config``
    """

    def __init__(self, host: PluginHost | None = None, config: SizingConfig | None = None,
                 criteria_file: str | Path | None = None) -> None:
        self.host = host or PluginHost.load()
        self.config = config or load_config(self.host, criteria_file)

    # -- one line -----------------------------------------------------------------------------
    def run(self, line: Line) -> LineResult:
        """Check the line if it gives an NPS, else size it. Faults become an ``error`` result."""
        try:
            return self._run(line)
        except BoresizeError as exc:
            return error_result(line.tag, exc, line=line, mode="check" if line.nps else "size")

    def _run(self, line: Line) -> LineResult:
        mode = "check" if line.nps else "size"
        state = fluid_state(self.host, line)
        service = self._service(line, state)
        pipe_class = self.config.pipe_class(line.pipe_class or service.pipe_class)
        margin = line.design_margin if line.design_margin is not None else service.design_margin
        mass_flow = mass_flow_of(self.host, line, state) * (1.0 + margin)
        if line.nps:
            candidates: Sequence[Candidate] = (pipe_class.candidate(line.nps),)
        else:
            candidates = pipe_class.candidates()
        rated = tuple(self._rate(line, state, service, c, mass_flow) for c in candidates)
        selected = _select(rated) if mode == "size" else rated[0]
        return _result(line, state, service, rated, selected, mode, mass_flow, margin, self.config.version,
                       self._first_guess(service, state, mass_flow, pipe_class.roughness))

    def _service(self, line: Line, state: FluidState) -> Service:
        name = line.service or _default_service(line, state)
        if name not in self.config.services:
            raise InputError(f"unknown service {name!r}", field="service", value=name,
                             expected=f"one of {', '.join(self.config.service_names())}").for_line(line.tag)
        service = self.config.services[name]
        _check_phase(line, state, service)
        return service

    def _rate(self, line: Line, state: FluidState, service: Service, candidate: Candidate,
              mass_flow: float) -> CandidateResult:
        hyd = rate_line(line, state, candidate, mass_flow)
        verdicts = []
        for criterion, options in service.criteria:
            if state.phase not in criterion.phases and _phase_group(state.phase) not in criterion.phases:
                continue
            context = CriterionContext(line, state, candidate, hyd, options, service.name)
            verdicts.append(self._judge(criterion, context))
        return CandidateResult(candidate, hyd, tuple(verdicts))

    def _judge(self, criterion: object, context: CriterionContext) -> Verdict:
        ident = getattr(criterion, "id", "?")
        try:
            result = criterion.evaluate(context)  # type: ignore[attr-defined]
        except Exception as exc:  # a plugin's fault: an error verdict naming it, the batch goes on
            return _error_verdict(ident, self.host.criteria.owner(ident), f"raised {type(exc).__name__}: {exc}")
        if not isinstance(result, Verdict):
            return _error_verdict(ident, self.host.criteria.owner(ident),
                                  f"returned {type(result).__name__}, not a Verdict")
        return result

    def _first_guess(self, service: Service, state: FluidState, mass_flow: float, roughness: float) -> float | None:
        for criterion, options in service.criteria:
            if criterion.id == "drop-per-length" and "max" in options:
                return swamee_jain_diameter(mass_flow / state.density, options["max"], state.density,
                                            state.viscosity, roughness)
        return None

    # -- many lines ---------------------------------------------------------------------------
    def run_rows(self, rows: Iterable[tuple[Mapping[str, object], Mapping[str, str | None]]]) -> list[LineResult]:
        """Parse and run rows in order; a bad row gives an ``error`` result and the others go on."""
        from boresize.lines import line_from_row

        results = []
        for position, (row, units) in enumerate(rows, start=1):
            try:
                line = line_from_row(row, units, position)
            except BoresizeError as exc:
                tag = str(row.get("tag") or f"row {position}")
                results.append(error_result(tag, exc, mode="check" if row.get("nps") else "size"))
                continue
            results.append(self.run_safely(line))
        return results

    def run_safely(self, line: Line) -> LineResult:
        """:meth:`run`, but an unexpected fault (a bug) is also an ``error`` result, never lost."""
        try:
            return self.run(line)
        except Exception as exc:  # report, don't lose the line; the message asks for a bug report
            return LineResult(tag=line.tag, status="error", mode="check" if line.nps else "size", line=line,
                              error=f"line {line.tag}: internal error {type(exc).__name__}: {exc} (please report it)")


def _phase_group(phase: str) -> str:
    return {"supercritical": "gas", "two-phase": "two-phase"}.get(phase, phase)


def _default_service(line: Line, state: FluidState) -> str:
    phase = line.phase or _phase_group(state.phase)
    if phase == "two-phase":
        raise InputError(
            f"{state.fluid_name or line.fluid} is two-phase at {_conditions(line)}; single-phase sizing does "
            f"not apply", field="temperature", value=_conditions(line),
            expected="a liquid or gas state, or a two-phase method (not yet available)").for_line(line.tag)
    return "liquid" if phase == "liquid" else "gas"


def _check_phase(line: Line, state: FluidState, service: Service) -> None:
    wanted = line.phase or service.phase
    found = _phase_group(state.phase)
    if wanted is None or wanted == found:
        return
    saturation = ""
    if state.vapour_pressure is not None:
        saturation = f", vapour pressure {state.vapour_pressure / 1e5:.4g} bar abs"
    raise InputError(
        f"{state.fluid_name or line.fluid} is {state.phase} at {_conditions(line)}{saturation} "
        f"({state.source}); service {service.name!r} needs a {wanted}",
        field="temperature", value=_conditions(line),
        expected=f"conditions at which the fluid is {wanted}, or a {found} service").for_line(line.tag)


def _conditions(line: Line) -> str:
    return f"{line.temperature - 273.15:.4g} degC and {line.pressure / 1e5:.5g} bar abs"


def _error_verdict(ident: str, plugin: str, what: str) -> Verdict:
    return Verdict(criterion=ident, status="error", reasons=(f"criterion {ident!r} of plugin {plugin!r} {what}",),
                   source=f"plugin {plugin}")


def _select(rated: Sequence[CandidateResult]) -> CandidateResult | None:
    """Smallest candidate (by inside diameter) that passes every criterion."""
    for result in rated:
        if result.passed:
            return result
    return None


def _closest(rated: Sequence[CandidateResult]) -> CandidateResult | None:
    """When none passes: the candidate whose worst utilisation is lowest (the best that is on offer)."""
    scored = [r for r in rated if r.worst is not None and not any(v.status == "error" for v in r.verdicts)]
    return min(scored, key=lambda r: r.worst.utilisation, default=None)  # type: ignore[union-attr]


def _result(line: Line, state: FluidState, service: Service, rated: tuple[CandidateResult, ...],
            selected: CandidateResult | None, mode: str, mass_flow: float, margin: float, version: str,
            first_guess: float | None) -> LineResult:
    notes = []
    shown = selected if selected is not None else _closest(rated)
    if shown is None:
        errors = [v.reason for r in rated for v in r.verdicts if v.status == "error"]
        return LineResult(tag=line.tag, status="error", mode=mode, line=line, state=state, candidates=rated,  # type: ignore[arg-type]
                          error=f"line {line.tag}: {errors[0] if errors else 'no candidate size could be rated'}",
                          error_field="criteria", service=service.name, criteria_set=version)
    passed = shown.passed and selected is not None
    if not passed and mode == "size":
        notes.append(f"no size the pipe class allows passes every criterion; closest is NPS {shown.candidate.nps}")
    if any(v.status == "error" for v in shown.verdicts):
        notes.append("a criterion could not judge this size (error verdict)")
    if shown.hydraulics.regime == "transition":
        notes.append("Reynolds number in the transition zone (2100-4000): turbulent (Colebrook) friction used")
    worst = shown.worst
    return LineResult(
        tag=line.tag, status="pass" if passed else "fail", mode=mode, line=line, state=state,  # type: ignore[arg-type]
        selected=shown, candidates=rated, controlling=worst.criterion if worst else None,
        notes=tuple(notes), service=service.name, criteria_set=version, sizing_flow=mass_flow,
        first_guess_diameter=first_guess,
    )


def error_result(tag: str, exc: BaseException, *, line: Line | None = None, mode: str = "size") -> LineResult:
    """An ``error`` LineResult carrying the message and, where known, the field at fault."""
    message = str(exc)
    if isinstance(exc, InputError) and not exc.tag:
        message = str(exc.for_line(tag))
    elif not isinstance(exc, InputError):
        message = f"line {tag}: {message}"
    field = exc.field if isinstance(exc, InputError) else ("fluid" if isinstance(exc, PropertyError) else None)
    return LineResult(tag=tag, status="error", mode=mode, line=line, error=message, error_field=field)  # type: ignore[arg-type]

