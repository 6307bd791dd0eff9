"""What every criterion shares: option specs with units, the evaluation context, verdict helpers.

A criterion is any object with ``id``, ``title``, ``phases``, ``source``, ``options`` (a tuple of
:class:`OptionSpec`) and ``evaluate(context) -> Verdict``. :class:`Criterion` is a convenient base
class; plugins may use it or not.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, fields
from typing import Any

from boresize.errors import CriteriaFileError, InputError
from boresize.model import Candidate, FluidState, Hydraulics, Line, Verdict, VerdictStatus
from boresize.units import QuantityKind, parse_quantity

__all__ = ["OptionSpec", "CriterionContext", "Criterion", "parse_options", "verdict"]


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


@dataclass(frozen=True, init=False)
class CriterionContext:
    """Everything a criterion may look at for one candidate. Options are SI floats by name."""

    line: Line
    state: FluidState
    candidate: Candidate
    hydraulics: Hydraulics
    options: Mapping[str, float]
    service: str

    def __init__(self, line: Line, state: FluidState, candidate: Candidate, hydraulics: Hydraulics,
                 options: Mapping[str, float], service: str) -> None:
        # One context per criterion per candidate: filling the instance dict costs a third of the generated
        # frozen __init__ (one object.__setattr__ a field). The fields stay read-only (frozen).
        self.__dict__.update(line=line, state=state, candidate=candidate, hydraulics=hydraulics, options=options,
                             service=service)


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
    if not _FILL_VERDICT:
        return Verdict(criterion.id, status, (reason,), criterion.source, value, limit, unit, utilisation)
    built = _new_object(Verdict)
    built.__dict__.update(criterion=criterion.id, status=status, reasons=(reason,), source=criterion.source,
                          value=value, limit=limit, unit=unit, utilisation=utilisation)
    return built


# verdict() runs for every criterion on every candidate. Verdict's generated frozen __init__ sets each field
# through object.__setattr__; filling the instance dict gives the same object for a third of the cost, as long
# as Verdict has exactly the fields filled above and neither __post_init__ nor __slots__ (else: the __init__).
_new_object = object.__new__
_FILL_VERDICT = (tuple(f.name for f in fields(Verdict)) == ("criterion", "status", "reasons", "source", "value",
                                                            "limit", "unit", "utilisation")
                 and not hasattr(Verdict, "__post_init__") and not hasattr(Verdict, "__slots__"))


class Criterion:
    """Base for built-in criteria: set id, title, phases, source and options; implement evaluate."""

    id: str = ""
    title: str = ""
    phases: frozenset[str] = frozenset({"liquid", "gas"})
    source: str = ""
    options: tuple[OptionSpec, ...] = ()

    def evaluate(self, context: CriterionContext) -> Verdict:  # pragma: no cover - abstract
        raise NotImplementedError

    def __repr__(self) -> str:
        return f"<criterion {self.id}>"
