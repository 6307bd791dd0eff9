"""Pipe classes: the sizes, schedules, material and roughness a project allows for a service.

A pipe class turns into :class:`boresize.model.Candidate` objects (SI: metres) through the
catalogue. Classes come from code (plugins, :data:`DEFAULT_PIPE_CLASS`) or from the criteria
file's ``[pipe_class.NAME]`` tables (:func:`pipe_class_from_table`).
"""

from __future__ import annotations

import math
from collections.abc import Iterable, Mapping, Sequence
from dataclasses import dataclass
from typing import cast

from boresize.errors import CatalogueError, CriteriaFileError, InputError
from boresize.model import Candidate
from boresize.pipes.catalogue import Catalogue, load_catalogue, normalise_nps, normalise_schedule, nps_value

__all__ = ["CLASS_KEYS", "DEFAULT_PIPE_CLASS", "MAX_ROUGHNESS", "PipeClass", "asme_class_from_table"]

#: Keys of a ``[pipe_class.NAME]`` table; the first three are required.
CLASS_KEYS = ("material", "roughness", "schedule", "sizes", "min_nps")
_REQUIRED_KEYS = CLASS_KEYS[:3]
#: Largest absolute roughness accepted [m]: riveted steel, the roughest pipe on Moody's chart, is 0.9-9 mm
#: (L. F. Moody, "Friction factors for pipe flow", Trans. ASME 66, 1944). Larger values are unit mistakes.
MAX_ROUGHNESS = 0.010


@dataclass(frozen=True)
class PipeClass:
    """A named pipe class.

    :param name: the class name used by lines and services ("default", "CS150")
    :param material: what the pipe is made of, for the record ("carbon steel")
    :param roughness: absolute roughness [m]
    :param schedule: the schedule used at every size without an override ("40")
    :param sizes: the NPS labels the class allows; normalised and sorted increasing on creation
    :param schedule_by_nps: per-size overrides of ``schedule``, e.g. ``(("14", "STD"),)``
    :param min_nps: smallest NPS offered for sizing (sizes below it are skipped), or None

    Names are normalised on creation (``1.5`` -> ``"1-1/2"``, ``"sch 40"`` -> ``"40"``); a value that
    cannot be read raises InputError whose field reads like ``pipe_class.NAME.sizes``.
    """

    name: str
    material: str
    roughness: float
    schedule: str
    sizes: tuple[str, ...]
    schedule_by_nps: tuple[tuple[str, str], ...] = ()
    min_nps: str | None = None

    def __post_init__(self) -> None:
        where = f"pipe_class.{self.name}"
        object.__setattr__(self, "sizes", _normalised_sizes(self.sizes, f"{where}.sizes"))
        object.__setattr__(self, "schedule", normalise_schedule(self.schedule, f"{where}.schedule"))
        object.__setattr__(self, "schedule_by_nps", _normalised_overrides(self.schedule_by_nps, where))
        if self.min_nps is not None:
            floor = normalise_nps(self.min_nps, f"{where}.min_nps")
            object.__setattr__(self, "min_nps", floor)
            if nps_value(self.sizes[-1]) < nps_value(floor):
                raise InputError(f"min_nps {floor} is above every size of the class", field=f"{where}.min_nps",
                                 value=floor, expected=f"an NPS not above {self.sizes[-1]}")
        _check_roughness(self.roughness, f"{where}.roughness")

    def schedule_for(self, nps: str | float | int) -> str:
        """The schedule this class uses at ``nps`` (its override, else the class schedule)."""
        label = normalise_nps(nps)
        return dict(self.schedule_by_nps).get(label, self.schedule)

    def candidate(self, nps: str | float | int, catalogue: Catalogue | None = None) -> Candidate:
        """The candidate at ``nps`` in this class's schedule, also for an NPS outside ``sizes``
        (a line that names its size is checked at that size). Lengths in metres.

        :raises CatalogueError: the catalogue has no such wall (the message lists the schedules at that NPS)
        """
        size = (catalogue or load_catalogue()).get(nps, self.schedule_for(nps))
        return Candidate(nps=size.nps, nps_value=size.nps_value, schedule=size.schedule,
                         outside_diameter=size.outside_diameter, wall=size.wall,
                         inside_diameter=size.inside_diameter, roughness=self.roughness, pipe_class=self.name)

    def candidates(self, catalogue: Catalogue | None = None) -> tuple[Candidate, ...]:
        """Every size the class offers for sizing (``min_nps`` applied), smallest inside diameter first."""
        catalogue = catalogue or load_catalogue()
        floor = nps_value(self.min_nps) if self.min_nps is not None else 0.0
        found = [self.candidate(nps, catalogue) for nps in self.sizes if nps_value(nps) >= floor]
        return tuple(sorted(found, key=lambda c: c.inside_diameter))

    def check(self, catalogue: Catalogue | None = None) -> None:
        """Raise CatalogueError if a size of the class (or an override) has no wall in its schedule."""
        missing = _first_missing(self, catalogue or load_catalogue())
        if missing is not None:
            nps, schedule, available = missing
            raise CatalogueError(f"pipe class {self.name!r}: no schedule {schedule} at NPS {nps}; "
                                 f"schedules at NPS {nps}: {available}")


def _normalised_sizes(sizes: object, field: str) -> tuple[str, ...]:
    if isinstance(sizes, (str, bytes)) or not isinstance(sizes, Sequence) or not sizes:
        raise InputError("sizes must be a non-empty list of NPS", field=field, value=sizes,
                         expected='a list such as ["2", "3", "4", "6"]')
    labels = [normalise_nps(item, field) for item in sizes]
    twice = sorted({label for label in labels if labels.count(label) > 1}, key=nps_value)
    if twice:
        raise InputError(f"NPS {twice[0]} is listed more than once", field=field, value=list(sizes),
                         expected="each NPS once")
    return tuple(sorted(labels, key=nps_value))


def _normalised_overrides(pairs: Iterable[tuple[object, object]] | Mapping[object, object],
                          where: str) -> tuple[tuple[str, str], ...]:
    result: dict[str, str] = {}
    items = pairs.items() if isinstance(pairs, Mapping) else pairs  # a mapping {"14": "STD"} is accepted too
    for nps, schedule in items:
        field = f"{where}.schedule.{nps}"
        label = normalise_nps(nps, field)
        if label in result:
            raise InputError(f"NPS {label} has two schedule overrides", field=field, value=nps,
                             expected="one override per NPS")
        result[label] = normalise_schedule(schedule, field)
    return tuple(sorted(result.items(), key=lambda item: nps_value(item[0])))


def _check_roughness(roughness: object, field: str) -> None:
    if isinstance(roughness, bool) or not isinstance(roughness, (int, float)):
        shown = repr(roughness)
    elif not math.isfinite(roughness) or not 0.0 <= roughness <= MAX_ROUGHNESS:
        shown = f"{roughness * 1000:g} mm"
    else:
        return
    raise InputError(f"roughness {shown} is out of range", field=field, value=roughness,
                     expected=f"an absolute roughness from 0 to {MAX_ROUGHNESS * 1000:g} mm "
                              "(0.045 mm for commercial steel)")


def _first_missing(pipe_class: PipeClass, catalogue: Catalogue) -> tuple[str, str, str] | None:
    """The first (NPS, schedule, schedules available there) the catalogue does not hold, or None."""
    for nps in (*pipe_class.sizes, *(n for n, _ in pipe_class.schedule_by_nps)):
        schedule = pipe_class.schedule_for(nps)
        if not catalogue.has(nps, schedule):
            return nps, schedule, ", ".join(catalogue.schedules(nps)) or "none"
    return None


# The default class (README, "Your own criteria and pipe classes"): carbon steel, Sch 40, preferred sizes only (no 1-1/4, 2-1/2, 3-1/2, 5).
# Roughness 0.045 mm: commercial steel, common practice (L. F. Moody, Trans. ASME 66, 1944; Crane TP-410
# gives 0.0018 in = 0.046 mm). ASME B36.10M-2018 lists no Sch 40 wall at NPS 22, 26, 28 and 30; there the
# class takes STD (9.53 mm), the lighter neighbour of the missing wall, explicitly. A company narrows the
# list (many avoid NPS 22, 26 and 34) with its own [pipe_class.NAME] table.
DEFAULT_PIPE_CLASS = PipeClass(
    name="default",
    material="carbon steel",
    roughness=0.045e-3,
    schedule="40",
    sizes=("1/2", "3/4", "1", "1-1/2", "2", "3", "4", "6", "8", "10", "12", "14", "16", "18", "20", "22",
           "24", "26", "28", "30", "32", "34", "36"),
    schedule_by_nps=(("22", "STD"), ("26", "STD"), ("28", "STD"), ("30", "STD")),
)


def asme_class_from_table(name: str, table: Mapping[str, object]) -> PipeClass:
    """Build a pipe class from the criteria file's ``[pipe_class.NAME]`` table.

    Keys: ``material`` (text), ``roughness`` (a number in mm, or a length with its unit such as
    "0.045 mm" or "0.0018 in"), ``schedule`` (a schedule, or a table ``{ default = "40", "14" = "STD" }``),
    ``sizes`` (list of NPS; default: the default class's sizes), ``min_nps``. With a ``catalogue`` key (a
    built-in name or a CSV file, relative to ``folder``) the sizes come from that catalogue instead
    (:func:`boresize.pipes.catalogue_class.pipe_class_from_table` chooses; this is the ASME class).

    :raises CriteriaFileError: an unknown or missing key, or a value that cannot be read; the field reads
        like ``pipe_class.NAME.schedule`` and, for a size without its wall, the message lists the
        schedules that exist at that NPS
    """
    where = f"pipe_class.{name}"
    _check_keys(table, where)
    try:
        default, overrides = _schedule_table(table["schedule"], f"{where}.schedule")
        # The file's values as read (1.5, "sch 40"): PipeClass normalises them, or refuses them naming the field.
        pipe_class = PipeClass(
            name=name, material=_material(table["material"], f"{where}.material"),
            roughness=_roughness(table["roughness"], f"{where}.roughness"), schedule=default,
            sizes=cast("tuple[str, ...]", table.get("sizes", DEFAULT_PIPE_CLASS.sizes)),
            schedule_by_nps=cast("tuple[tuple[str, str], ...]", overrides),
            min_nps=cast("str | None", table.get("min_nps")),
        )
    except CriteriaFileError:
        raise
    except InputError as exc:
        raise CriteriaFileError(exc.message, field=exc.field, value=exc.value, expected=exc.expected) from None
    _check_catalogue(pipe_class, where, isinstance(table["schedule"], Mapping))
    return pipe_class


def _check_keys(table: object, where: str) -> None:
    if not isinstance(table, Mapping):
        raise CriteriaFileError("a pipe class must be a table", field=where, value=table,
                                expected=f"a table with keys {', '.join(CLASS_KEYS)}")
    unknown = sorted(set(table) - set(CLASS_KEYS))
    if unknown:
        raise CriteriaFileError(f"unknown key {unknown[0]!r}", field=f"{where}.{unknown[0]}", value=unknown[0],
                                expected=f"one of {', '.join(CLASS_KEYS)}, or catalogue (a built-in name or a CSV)")
    missing = [key for key in _REQUIRED_KEYS if key not in table]
    if missing:
        raise CriteriaFileError(f"missing key {missing[0]!r}", field=f"{where}.{missing[0]}", value=None,
                                expected=f"the keys {', '.join(_REQUIRED_KEYS)} (and optionally sizes, min_nps)")


def _schedule_table(value: object, field: str) -> tuple[str, tuple[tuple[str, object], ...]]:
    """The default schedule, normalised, and the per-NPS overrides as written (PipeClass normalises them)."""
    if not isinstance(value, Mapping):
        return normalise_schedule(value, field), ()
    if "default" not in value:
        raise CriteriaFileError("the schedule table has no 'default'", field=field, value=dict(value),
                                expected='a table such as { default = "40", "14" = "STD" }')
    overrides = tuple((str(nps), schedule) for nps, schedule in value.items() if nps != "default")
    return normalise_schedule(value["default"], f"{field}.default"), overrides


def _material(value: object, field: str) -> str:
    if not isinstance(value, str) or not value.strip():
        raise CriteriaFileError("material must be a non-empty text", field=field, value=value,
                                expected='a material such as "carbon steel"')
    return value.strip()


def _roughness(value: object, field: str) -> float:
    """A roughness in SI [m]: a bare number is in mm; a text carries its own length unit."""
    if isinstance(value, str):
        from boresize.units import parse_quantity  # pint costs ~0.5 s: load it only for a roughness with a unit

        return parse_quantity(value, field, "length", default_unit="mm")
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        raise CriteriaFileError("roughness must be a number in mm or a length with its unit", field=field,
                                value=value, expected='e.g. 0.045 or "0.045 mm" or "0.0018 in"')
    return float(value) / 1000.0


def _check_catalogue(pipe_class: PipeClass, where: str, table_form: bool) -> None:
    missing = _first_missing(pipe_class, load_catalogue())
    if missing is None:
        return
    nps, schedule, available = missing
    overridden = nps in dict(pipe_class.schedule_by_nps)
    field = f"{where}.schedule.{nps}" if overridden else (f"{where}.schedule.default" if table_form
                                                          else f"{where}.schedule")
    hint = f'list the sizes, or override it: schedule = {{ default = "{pipe_class.schedule}", "{nps}" = "STD" }}'
    raise CriteriaFileError(f"pipe class {pipe_class.name!r} has no schedule {schedule} at NPS {nps}",
                            field=field, value=schedule, expected=f"one of {available} at NPS {nps} ({hint})")
