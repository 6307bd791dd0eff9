"""What every criterion shares: option specs with units, the evaluation context, verdict helpers.

A criterion is any object with ``id``, ``title``, ``phases``, ``source``, ``options`` (a tuple of
:class:`OptionSpec`) and ``evaluate(context) -> Verdict``, and optionally the traits the sizing core
reads (see :class:`Criterion`). :class:`Criterion` is a convenient base class; plugins may use it or not.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass
from typing import Any, Literal

from boresize.errors import CriteriaFileError, InputError
from boresize.model import Candidate, FluidState, Hydraulics, Line, Verdict, VerdictStatus
from boresize.units import QuantityKind, parse_quantity

__all__ = ["OptionSpec", "CriterionContext", "Criterion", "SizeTrend", "parse_options", "verdict"]

#: How a criterion's fails respond to the pipe size (see :class:`Criterion`).
SizeTrend = Literal["larger-passes", "falls-with-size"]


@dataclass(frozen=True)
class OptionSpec:
    """One option of a criterion.

    :param name: key in the criteria file
    :param kind: the quantity kind it is parsed as (see :func:`boresize.units.parse_quantity`)
    :param default: value used when the service does not give one (a string with its unit), or None
    :param default_unit: unit for a bare number in the criteria file
    :param help: one line for ``boresize criteria``
    """

    name: str
    kind: QuantityKind
    default: str | float | None = None
    default_unit: str | None = None
    help: str = ""


@dataclass(frozen=True)
class CriterionContext:
    """Everything a criterion may look at for one candidate. Options are SI floats by name."""

    line: Line
    state: FluidState
    candidate: Candidate
    hydraulics: Hydraulics
    options: Mapping[str, float]
    service: str


def parse_options(criterion: Any, given: Mapping[str, object], where: str) -> dict[str, float]:
    """Validate and convert a criterion's options from the criteria file into SI floats.

    :param where: the place in the file, e.g. ``service.liquid.velocity``, used in messages
    """
    specs = {spec.name: spec for spec in criterion.options}
    unknown = sorted(set(given) - set(specs))
    if unknown:
        raise CriteriaFileError(
            f"unknown option {unknown[0]!r} for criterion {criterion.id!r}",
            field=where,
            value=unknown[0],
            expected=f"one of {', '.join(sorted(specs)) or '(no options)'}",
        )
    values: dict[str, float] = {}
    for name, spec in specs.items():
        raw = given.get(name, spec.default)
        if raw is None:
            continue
        try:
            values[name] = parse_quantity(raw, f"{where}.{name}", spec.kind, spec.default_unit)
        except InputError as exc:
            raise CriteriaFileError(exc.message, field=exc.field, value=exc.value, expected=exc.expected) from exc
    check = getattr(criterion, "check_options", None)
    if check is not None:
        check(values, where)
    return values


def verdict(
    criterion: Any,
    status: VerdictStatus,
    reason: str,
    *,
    value: float | None = None,
    limit: float | None = None,
    unit: str = "",
    utilisation: float | None = None,
) -> Verdict:
    """Build a Verdict carrying the criterion's id and source."""
    return Verdict(criterion.id, status, (reason,), criterion.source, value, limit, unit, utilisation)


class Criterion:
    """Base for criteria: set id, title, phases, source and options; implement evaluate.

    The sizing core knows nothing of a criterion but what it declares. Besides the required attributes, a
    criterion may declare these traits (the defaults here mean "unknown", which is always right and only
    slower); built-in criteria declare theirs exactly as a plugin does:

    - ``size_trend``: how its fails respond to the pipe size, so that the guided scan may walk instead of
      rating every size from the smallest. ``"larger-passes"``: any fail is cured by a larger size (a minimum
      bore, an NPSH-like margin). ``"falls-with-size"``: the verdict's ``value`` falls as the size grows (at a
      fixed mass flow), so a value above its ``limit`` is cured by a larger size and one below it (a minimum)
      by a smaller one. None: unknown, a fail sends the scan back to every size.
    - ``diameter_at_limit(options, line, state, mass_flow, roughness)``: the inside diameter [m] at which the
      criterion's limit (from ``options``, SI) is just met at ``mass_flow`` [kg/s] with ``roughness`` [m], or
      None. The guided scan starts from the largest proposal; it is only a starting point.
    - ``proposes_first_guess``: True when that diameter is the one the calculation record shows as the first
      guess (``first_guess_id_mm``); the first criterion of a service that says so and gives one is used.

    Declare a trait only when it holds for every line and option: the scan trusts it to skip sizes.
    """

    id: str = ""
    title: str = ""
    phases: frozenset[str] = frozenset({"liquid", "gas"})
    source: str = ""
    options: tuple[OptionSpec, ...] = ()
    size_trend: SizeTrend | None = None
    proposes_first_guess: bool = False

    def evaluate(self, context: CriterionContext) -> Verdict:  # pragma: no cover - abstract
        raise NotImplementedError

    def diameter_at_limit(self, options: Mapping[str, float], line: Line, state: FluidState, mass_flow: float,
                          roughness: float) -> float | None:
        """The inside diameter [m] at which this criterion's limit is just met, or None (no proposal)."""
        return None

    def __repr__(self) -> str:
        return f"<criterion {self.id}>"
