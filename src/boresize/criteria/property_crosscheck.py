"""``property-crosscheck``: the line's properties against a second, independent property backend.

Density and viscosity, and for a liquid the vapour (or bubble) pressure where both backends give one, are
computed again at the line's inlet pressure and temperature by a backend independent of the line's own
(:func:`boresize.properties.second_opinion.independent_backend`: CoolProp checked with thermo, thermo with
CoolProp). The value is the largest relative difference, |second - line's| / line's, in %; above ``warn`` the
verdict warns, above ``fail`` it fails. The reason names the quantity that differs most, both values and both
models. A line with no independent backend (its own density and viscosity, a brine only CoolProp models) or whose
second backend fails gets ``error`` saying why: unevaluated is never a pass.

Properties do not depend on the pipe size: the second state is computed once per line (fluid, pressure,
temperature, phase hint and basis; a bounded cache here), not once per candidate. The verdict is the same at
every size, so the sizes that pass are all or none: the monotone case the guided scan needs (``larger-passes``).
"""

from __future__ import annotations

import threading
from collections.abc import Mapping
from dataclasses import dataclass

from boresize.criteria.base import Criterion, CriterionContext, OptionSpec, verdict
from boresize.criteria.protocol import KNOWN_PHASES
from boresize.errors import BoresizeError, CriteriaFileError, InputError
from boresize.model import FluidState, Line, Verdict, VerdictStatus
from boresize.properties.second_opinion import NoSecondOpinion, backend_state, independent_backend

__all__ = ["PropertyCrosscheck", "Comparison"]

#: Second states kept (one per line state point); the cache is emptied when full.
_CACHE_SIZE = 4096
_LOCK = threading.Lock()


@dataclass(frozen=True)
class Difference:
    """One quantity of both backends: name, display unit and scale (SI -> unit), both values [SI]."""

    name: str
    unit: str
    scale: float
    first: float
    second: float

    @property
    def relative(self) -> float:
        """|second - first| / first [-]."""
        return abs(self.second - self.first) / abs(self.first)


@dataclass(frozen=True)
class Comparison:
    """The second backend's view of a line: its id and model, its phase, the quantities compared, and notes."""

    backend: str
    model: str
    phase: str
    differences: tuple[Difference, ...]
    notes: tuple[str, ...] = ()


def _model(state: FluidState) -> str:
    """A model text short enough for a reason: up to its first ';'."""
    return state.model.split(";")[0].strip()


def compare(line: Line, state: FluidState) -> Comparison:
    """The line's state against the independent backend's at the line's inlet pressure and temperature.

    :raises NoSecondOpinion: no independent backend for this line
    :raises BoresizeError: the second backend refused or failed (its message)
    """
    backend_id, fluid = independent_backend(line, state)
    try:
        second = backend_state(backend_id, line, line.pressure, line.temperature, fluid=fluid)
    except InputError as exc:  # without the line's tag: the text is kept for every line at this state point
        untagged = InputError(exc.message, field=exc.field, value=exc.value, expected=exc.expected)
        raise NoSecondOpinion(f"the second backend {backend_id} could not evaluate {fluid!r}: {untagged}") from exc
    except BoresizeError as exc:
        raise NoSecondOpinion(f"the second backend {backend_id} could not evaluate {fluid!r}: {exc}") from exc
    pairs = [Difference("density", "kg/m3", 1.0, state.density, second.density),
             Difference("viscosity", "mPa s", 1e3, state.viscosity, second.viscosity)]
    notes: list[str] = []
    if state.phase == "liquid" and state.vapour_pressure is not None:
        name = "bubble pressure" if state.bubble_pressure is not None else "vapour pressure"
        if second.vapour_pressure is not None and state.vapour_pressure > 0.0:
            pairs.append(Difference(name, "bar abs", 1e-5, state.vapour_pressure, second.vapour_pressure))
        else:
            notes.append(f"{name} not compared: {backend_id} gives none")
    if second.phase != state.phase:
        notes.append(f"phases differ: {state.phase} ({state.source}) against {second.phase} ({backend_id})")
    return Comparison(backend_id, _model(second), second.phase, tuple(pairs), tuple(notes))


class PropertyCrosscheck(Criterion):
    id = "property-crosscheck"
    # The verdict does not depend on the size: every size passes or none does, which is monotone in size.
    size_trend = "larger-passes"
    title = "Density, viscosity and vapour pressure against a second, independent property backend"
    phases = KNOWN_PHASES
    source = "common practice: a second property model as a check (CoolProp against thermo)"
    options = (
        OptionSpec("warn", "dimensionless", "5 %", None, "largest relative difference without a warning"),
        OptionSpec("fail", "dimensionless", "15 %", None, "largest relative difference that does not fail"),
    )

    def __init__(self) -> None:
        self._seen: dict[tuple[object, ...], Comparison | str] = {}

    def check_options(self, values: Mapping[str, float], where: str) -> None:
        for name in ("warn", "fail"):
            value = values.get(name)
            if value is not None and not 0.0 < value <= 1.0:
                raise CriteriaFileError(f"{name} {value:g} is outside 0 to 100 %", field=f"{where}.{name}",
                                        value=value, expected=f'a relative difference such as {name} = "5 %" '
                                                              f"(or {name} = 0.05)")
        warn, fail = values.get("warn", 0.05), values.get("fail", 0.15)
        if warn > fail:
            raise CriteriaFileError(f"warn {warn:.4g} is above fail {fail:.4g}", field=f"{where}.warn", value=warn,
                                    expected="warn at or below fail")

    def evaluate(self, context: CriterionContext) -> Verdict:
        found = self._comparison(context.line, context.state)
        if isinstance(found, str):
            return verdict(self, "error", f"properties not cross-checked: {found}")
        warn, fail = context.options.get("warn", 0.05), context.options.get("fail", 0.15)
        worst = max(found.differences, key=lambda d: d.relative)
        value = worst.relative
        state = context.state
        status: VerdictStatus
        if value > fail:
            status, words = "fail", f"above the fail limit {fail * 100:.3g} %"
        elif value > warn:
            status, words = "warn", f"above the warning limit {warn * 100:.3g} % (fails above {fail * 100:.3g} %)"
        else:
            status, words = "pass", f"within the warning limit {warn * 100:.3g} %"
        others = ", ".join(f"{d.name} {d.relative * 100:.3g} %" for d in found.differences if d is not worst)
        reason = (f"{worst.name} differs by {value * 100:.3g} %, {words}: {worst.first * worst.scale:.5g} {worst.unit} "
                  f"from {state.source} ({_model(state)}) against {worst.second * worst.scale:.5g} {worst.unit} "
                  f"from {found.backend} ({found.model}); {others}")
        reason += "".join(f"; {note}" for note in found.notes)
        return verdict(self, status, reason, value=value * 100, limit=fail * 100, unit="%",
                       utilisation=value / fail)

    def _comparison(self, line: Line, state: FluidState) -> Comparison | str:
        """The comparison for the line's state point, once per line (cached), or why there is none."""
        key = (state.source, state.model, line.fluid, line.extra, line.eos, line.phase, line.quality, line.pressure,
               line.temperature, state.density, state.viscosity, state.vapour_pressure, state.phase)
        with _LOCK:
            if key in self._seen:
                return self._seen[key]
        try:
            found: Comparison | str = compare(line, state)
        except NoSecondOpinion as exc:
            found = str(exc)
        with _LOCK:
            if len(self._seen) >= _CACHE_SIZE:
                self._seen.clear()
            self._seen[key] = found
        return found
