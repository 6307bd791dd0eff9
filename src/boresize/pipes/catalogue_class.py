"""A pipe class over a catalogue other than ASME B36.10M/B36.19M: a user's CSV or a fluids.piping table.

``[pipe_class.NAME]`` with ``catalogue = "pvc-sch40"`` (a built-in name, see
:data:`boresize.pipes.fluids_tables.BUILTIN_CATALOGUES`) or ``catalogue = "pipes/pe100.csv"`` (a CSV file,
relative to the criteria file; see :mod:`boresize.pipes.tables`). Sizes keep the catalogue's names and are
offered smallest inside diameter first.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass, replace
from pathlib import Path

from boresize.errors import CatalogueError, CriteriaFileError, InputError
from boresize.model import Candidate
from boresize.pipes.catalogue import Catalogue, normalise_nps
from boresize.pipes.classes import PipeClass, _check_roughness, _material, _roughness, asme_class_from_table
from boresize.pipes.fluids_tables import BUILTIN_CATALOGUES, builtin_sizes
from boresize.pipes.tables import TableSize, read_table_file, size_key

__all__ = ["CATALOGUE_CLASS_KEYS", "CataloguePipeClass", "catalogue_class_from_table", "pipe_class_from_table"]

#: Keys of a ``[pipe_class.NAME]`` table that names a catalogue; only ``catalogue`` is required.
CATALOGUE_CLASS_KEYS = ("catalogue", "material", "roughness", "schedule", "sizes")


@dataclass(frozen=True)
class CataloguePipeClass(PipeClass):
    """A pipe class whose sizes come from ``table`` (names as written; lengths in metres).

    :param catalogue: the catalogue's name or file, for the record
    :param table: every size of the catalogue; ``schedule`` picks one series when it has several
    """

    catalogue: str = ""
    table: tuple[TableSize, ...] = ()

    def __post_init__(self) -> None:
        where = f"pipe_class.{self.name}"
        series = sorted({size.schedule for size in self.table})
        if self.schedule not in series:
            raise InputError(f"catalogue {self.catalogue} has several schedules; the class names none"
                             if not self.schedule else f"catalogue {self.catalogue} has no schedule {self.schedule!r}",
                             field=f"{where}.schedule", value=self.schedule,
                             expected=f"one of {', '.join(repr(s) for s in series)}")
        offered = [size for size in self.table if size.schedule == self.schedule]
        by_key = {size_key(size.name): size.name for size in offered}
        if not self.sizes:
            object.__setattr__(self, "sizes", tuple(size.name for size in offered))
        names = []
        for item in self.sizes:
            name = by_key.get(size_key(str(item)))
            if name is None or isinstance(item, bool):
                raise InputError(f"catalogue {self.catalogue} has no size {item!r}", field=f"{where}.sizes",
                                 value=item, expected=f"one of {', '.join(by_key.values())}")
            names.append(name)
        if len(set(names)) != len(names):
            raise InputError("a size is listed more than once", field=f"{where}.sizes", value=list(self.sizes),
                             expected="each size once")
        order = {size.name: index for index, size in enumerate(offered)}
        object.__setattr__(self, "sizes", tuple(sorted(names, key=order.__getitem__)))
        _check_roughness(self.roughness, f"{where}.roughness")

    def schedule_for(self, nps: str | float | int) -> str:
        return self.schedule

    def _size(self, name: str | float | int) -> TableSize | None:
        key = size_key(str(name))
        try:
            label: str | None = normalise_nps(name)
        except InputError:
            label = None
        for size in self.table:
            if size.schedule == self.schedule and (size_key(size.name) == key or (
                    label is not None and _nps_label(size.name) == label)):
                return size
        return None

    def candidate(self, nps: str | float | int, catalogue: Catalogue | None = None) -> Candidate:
        """The candidate named ``nps`` (as the catalogue writes it, or the same NPS); lengths in metres."""
        size = self._size(nps)
        if size is None:
            names = ", ".join(s.name for s in self.table if s.schedule == self.schedule)
            raise CatalogueError(f"pipe class {self.name!r} (catalogue {self.catalogue}) has no size {nps!r}"
                                 f"{' in schedule ' + self.schedule if self.schedule else ''}; sizes: {names}")
        return Candidate(nps=size.name, nps_value=size.nps_value, schedule=size.schedule,
                         outside_diameter=size.outside_diameter, wall=size.wall,
                         inside_diameter=size.inside_diameter,
                         roughness=self.roughness if size.roughness is None else size.roughness,
                         pipe_class=self.name)

    def candidates(self, catalogue: Catalogue | None = None) -> tuple[Candidate, ...]:
        """Every size of the class, smallest inside diameter first."""
        found = [self.candidate(name) for name in self.sizes]
        return tuple(sorted(found, key=lambda c: c.inside_diameter))

    def check(self, catalogue: Catalogue | None = None) -> None:
        """Nothing to check: the sizes were matched to the catalogue when the class was built."""


def _nps_label(name: str) -> str | None:
    try:
        return normalise_nps(name)
    except InputError:
        return None


def catalogue_class_from_table(name: str, table: Mapping[str, object], folder: Path | None,
                               material: str | None, roughness: float | None) -> CataloguePipeClass:
    """Build the class of a ``[pipe_class.NAME]`` table with a ``catalogue`` key (other keys already read:
    ``material`` and ``roughness`` in SI, or None when the table leaves them to the catalogue).

    :raises CriteriaFileError: an unknown catalogue, a bad catalogue file (naming its file, line and column),
        or sizes and a schedule the catalogue does not hold
    """
    where = f"pipe_class.{name}"
    unknown = sorted(set(table) - set(CATALOGUE_CLASS_KEYS))
    if unknown:
        raise CriteriaFileError(f"unknown key {unknown[0]!r} in a class that names a catalogue",
                                field=f"{where}.{unknown[0]}", value=unknown[0],
                                expected=f"one of {', '.join(CATALOGUE_CLASS_KEYS)}")
    reference = table["catalogue"]
    if not isinstance(reference, str) or not reference.strip():
        raise CriteriaFileError("catalogue must be a built-in name or a CSV file", field=f"{where}.catalogue",
                                value=reference, expected=_expected_catalogue())
    reference = reference.strip()
    builtin = BUILTIN_CATALOGUES.get(reference.lower())
    if builtin is not None:
        sizes, label = builtin_sizes(builtin.name), f"{builtin.name} ({builtin.standard}, via fluids.piping)"
        material = material or builtin.material
    elif reference.lower().endswith((".csv", ".txt")):
        path = Path(reference) if folder is None else folder / reference
        sizes, label = read_table_file(path, f"{where}.catalogue"), str(path)
    else:
        raise CriteriaFileError(f"unknown pipe catalogue {reference!r}", field=f"{where}.catalogue",
                                value=reference, expected=_expected_catalogue())
    if roughness is None and any(size.roughness is None for size in sizes):
        raise CriteriaFileError(f"no roughness: catalogue {label} has no roughness column", field=f"{where}.roughness",
                                value=None, expected='roughness = 0.0015 (mm) in the class, or a "roughness [mm]" column')
    if roughness is not None:
        sizes = tuple(replace(size, roughness=None) for size in sizes)  # the class's roughness wins
    schedule = table.get("schedule", _only_series(sizes))
    if not isinstance(schedule, (str, int)) or isinstance(schedule, bool):
        raise CriteriaFileError("schedule must be the catalogue's series name", field=f"{where}.schedule",
                                value=schedule, expected=f"one of {', '.join(sorted({s.schedule for s in sizes}))}")
    chosen = table.get("sizes", ())
    if isinstance(chosen, (str, bytes)) or not isinstance(chosen, Sequence) or ("sizes" in table and not chosen):
        raise CriteriaFileError("sizes must be a non-empty list of the catalogue's size names", field=f"{where}.sizes",
                                value=chosen, expected='a list such as ["DN 110", "DN 160"]')
    try:
        return CataloguePipeClass(name=name, material=material or "as the catalogue", schedule=str(schedule),
                                  roughness=roughness if roughness is not None else min(
                                      s.roughness or 0.0 for s in sizes),
                                  sizes=tuple(str(s) for s in chosen),
                                  catalogue=label, table=sizes)
    except InputError as exc:
        raise CriteriaFileError(exc.message, field=exc.field, value=exc.value, expected=exc.expected) from None


def _only_series(sizes: tuple[TableSize, ...]) -> str:
    """The catalogue's one series (the class need not name it); several make the class name one."""
    series = sorted({size.schedule for size in sizes})
    return series[0] if len(series) == 1 else ""


def _expected_catalogue() -> str:
    return f"one of {', '.join(BUILTIN_CATALOGUES)}, or a CSV file (path relative to the criteria file)"


def pipe_class_from_table(name: str, table: Mapping[str, object], folder: Path | None = None) -> PipeClass:
    """A criteria file's ``[pipe_class.NAME]`` table as a pipe class: over the ASME catalogue
    (:func:`boresize.pipes.classes.asme_class_from_table`), or, with a ``catalogue`` key (a built-in name or a CSV
    file relative to ``folder``), over that catalogue; ``material`` and ``roughness`` are then optional.

    :raises CriteriaFileError: an unknown or missing key, or a value that cannot be read (the field names it)
    """
    if not (isinstance(table, Mapping) and "catalogue" in table):
        return asme_class_from_table(name, table)
    where = f"pipe_class.{name}"
    try:
        material = _material(table["material"], f"{where}.material") if "material" in table else None
        roughness = _roughness(table["roughness"], f"{where}.roughness") if "roughness" in table else None
    except CriteriaFileError:
        raise
    except InputError as exc:
        raise CriteriaFileError(exc.message, field=exc.field, value=exc.value, expected=exc.expected) from None
    return catalogue_class_from_table(name, table, folder, material, roughness)
