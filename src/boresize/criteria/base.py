"""What every criterion shares: option specs with units, the evaluation context, verdict helpers.

A criterion is any object with ``id``, ``title``, ``phases``, ``source``, ``options`` (a tuple of
:class:`OptionSpec`) and ``evaluate(context) -> Verdict``, and optionally the traits the sizing core
reads (see :class:`Criterion`). :class:`Criterion` is a convenient base class; plugins may use it or not.
"""

from __future__ import annotations

import math
import numbers
from collections.abc import Mapping
from dataclasses import dataclass
from typing import Any, Literal

from boresize.errors import CriteriaFileError, InputError
from boresize.model import Candidate, FluidState, Hydraulics, Line, Verdict, VerdictStatus, filled_through_dict
from boresize.units import QuantityKind, format_unit_help, parse_quantity

__all__ = ["OptionSpec", "CriterionContext", "Criterion", "SizeTrend", "chosen", "documented_unit", "option_text", "parse_options", "verdict"]

#: How a criterion's fails respond to the pipe size (see :class:`Criterion`).
SizeTrend = Literal["larger-passes", "falls-with-size"]


@dataclass(frozen=True)
class OptionSpec:
    """One option of a criterion.

    :param name: key in the criteria file
    :param kind: the quantity kind it is parsed as (see :func:`boresize.units.parse_quantity`). A criteria
        file must give an option of any kind but ``"dimensionless"`` with its unit (``max = "3 m/s"``): a bare
        number there is an error, as in a line list
    :param default: value used when the service does not give one (a string with its unit), or None
    :param default_unit: the unit the option is documented in: the example of the message for a bare number,
        the unit ``boresize criteria`` shows it in, and the unit of a bare number in ``default``
    :param help: one line for ``boresize criteria``
    :param flag: a true/false option (``warn_only = true``), shown as true or false
    :param choices: the names a list option may hold (``fail = ["slug"]``); its value reaches the criterion as
        a float whose bit i is set when ``choices[i]`` is listed (:func:`chosen` reads it back)
    """

    name: str
    kind: QuantityKind
    default: str | float | None = None
    default_unit: str | None = None
    help: str = ""
    flag: bool = False
    choices: tuple[str, ...] = ()


def chosen(spec: OptionSpec, value: float) -> tuple[str, ...]:
    """The names a list option's value holds (see :attr:`OptionSpec.choices`)."""
    mask = int(value)
    return tuple(name for i, name in enumerate(spec.choices) if mask >> i & 1)


def _example_choice(spec: OptionSpec) -> str:
    return spec.default.split(",")[0].strip() if isinstance(spec.default, str) else spec.choices[0]


def _choices_value(spec: OptionSpec, raw: object, field: str) -> float:
    """A list of names (or one name, or a comma-separated text) to the bit mask of :attr:`OptionSpec.choices`."""
    names = [n.strip() for n in raw.split(",")] if isinstance(raw, str) else raw
    if not isinstance(names, (list, tuple)) or not all(isinstance(n, str) for n in names):
        raise CriteriaFileError(f"{spec.name} = {raw!r} is not a list of names", field=field, value=raw,
                                expected=f'a list of names such as {spec.name} = ["{_example_choice(spec)}"]')
    mask = 0
    for name in names:
        if name not in spec.choices:
            raise CriteriaFileError(f"unknown name {name!r} in {spec.name}", field=field, value=name,
                                    expected=f"names from {', '.join(spec.choices)}")
        mask |= 1 << spec.choices.index(name)
    return float(mask)


@filled_through_dict
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
        field = f"{where}.{name}"
        given_here = name in given
        raw = given[name] if given_here else spec.default
        if raw is None:
            continue
        if spec.choices:
            values[name] = _choices_value(spec, raw, field)
            continue
        if given_here:
            _check_given(spec, raw, field)
            if spec.flag:  # true/false (or 1/0), checked above
                raw = float(raw)  # type: ignore[arg-type]
        try:  # a value from the file carries its own unit; only a declared default takes default_unit
            values[name] = parse_quantity(raw, field, spec.kind, None if given_here else spec.default_unit)
        except InputError as exc:
            raise CriteriaFileError(exc.message, field=exc.field, value=exc.value, expected=exc.expected) from exc
    check = getattr(criterion, "check_options", None)
    if check is not None:
        check(values, where)
    return values


def documented_unit(spec: OptionSpec) -> str | None:
    """The unit an option is written and shown in: its ``default_unit``, else the first unit its kind's help
    names (``barg`` for a pressure); None for a plain number."""
    if spec.kind == "dimensionless":
        return spec.default_unit
    if spec.default_unit:
        return spec.default_unit
    help_text = format_unit_help(spec.kind)  # "a velocity (m/s, ft/s)"
    return help_text.partition("(")[2].split(",")[0].rstrip(")").strip() or None


def _bare_number(raw: object) -> str | None:
    """The text of a value that is a number without a unit (50, 50.0, "50"), else None."""
    if isinstance(raw, numbers.Real) and not isinstance(raw, bool):
        text = str(raw) if isinstance(raw, numbers.Integral) else f"{float(raw):.15g}"  # 1e3 -> "1000"
    elif isinstance(raw, str):
        text = raw.strip()
    else:
        return None
    try:  # NaN and infinity are left to parse_quantity, which refuses them as not finite
        return text if math.isfinite(float(text)) else None
    except (ValueError, OverflowError):
        return None


def _check_given(spec: OptionSpec, raw: object, field: str) -> None:
    """A dimensional option given without a unit, or a flag given as anything but true/false: an error."""
    if spec.flag:
        if not (isinstance(raw, bool) or (isinstance(raw, (int, float)) and raw in (0, 1))):
            raise CriteriaFileError(f"{spec.name} = {raw!r} is not true or false", field=field, value=raw,
                                    expected=f"{spec.name} = true or {spec.name} = false")
        return
    if spec.kind == "dimensionless":
        return
    bare = _bare_number(raw)
    if bare is not None:
        noun = format_unit_help(spec.kind).partition(" (")[0]
        raise CriteriaFileError(f"{spec.name} = {bare} has no unit", field=field, value=raw,
                                expected=f'{noun} with its unit, e.g. {spec.name} = "{bare} {documented_unit(spec)}"')


def option_text(spec: OptionSpec, value: float) -> str:
    """An option's value [SI] as a user writes it: ``max = 40 kPa/100 m``, ``warn_only = true``, ``ratio = 1.1``."""
    if spec.flag:
        return f"{spec.name} = {'true' if value else 'false'}"
    if spec.choices:
        return f"{spec.name} = [{', '.join(repr(n) for n in chosen(spec, value))}]"
    unit = documented_unit(spec)
    if spec.kind == "dimensionless" or unit is None:
        return f"{spec.name} = {value:.6g}"
    try:  # linear in the unit (barg has an offset): two points of it give slope and offset
        one = parse_quantity(f"1 {unit}", spec.name, spec.kind)
        two = parse_quantity(f"2 {unit}", spec.name, spec.kind)
    except InputError:  # a plugin's unit that does not parse: show SI rather than fail a listing
        return f"{spec.name} = {value:.6g} (SI)"
    shown = (value - (2 * one - two)) / (two - one)
    return f"{spec.name} = {shown:.6g} {unit}"


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
