"""The pipe catalogue: outside diameters and walls of ASME B36.10M and ASME B36.19M pipe.

The data live in ``pipes/data/*.csv``, one row per NPS x schedule, in millimetres as the standards
print them. They are read and checked once, on first use (:func:`load_catalogue`), and handed out
in SI: every length on a :class:`PipeSize` is in metres. The inside diameter is never stored; it is
computed as OD - 2 x wall when a row is read.

Sources: ASME B36.10M-2018 "Welded and Seamless Wrought Steel Pipe", Table 1; ASME B36.19M-2018
"Stainless Steel Pipe", Table 1.

A size may be given as a DN (``"DN 100"``, ``"DN100"``): it is read as the NPS of the ISO 6708 / ASME B36.10M
correspondence (:data:`DN_BY_NPS`) and handed out as that NPS.
"""

from __future__ import annotations

import functools
import math
import re
from collections.abc import Iterable, Iterator
from dataclasses import dataclass
from decimal import Decimal, InvalidOperation
from fractions import Fraction
from importlib import resources
from os import PathLike
from pathlib import Path

from boresize.errors import CatalogueError, InputError

__all__ = [
    "DATA_FILES", "DN_BY_NPS", "NPS_LABELS", "SCHEDULES", "Catalogue", "PipeSize", "load_catalogue", "normalise_nps",
    "normalise_schedule", "nps_value", "read_catalogue_file", "read_catalogue_text",
]

#: Every nominal pipe size the catalogue knows, as the trade writes it, in increasing order.
NPS_LABELS: tuple[str, ...] = (
    "1/8", "1/4", "3/8", "1/2", "3/4", "1", "1-1/4", "1-1/2", "2", "2-1/2", "3", "3-1/2", "4", "5",
    "6", "8", "10", "12", "14", "16", "18", "20", "22", "24", "26", "28", "30", "32", "34", "36",
    "38", "40", "42", "44", "46", "48",
)
#: Wall designations: B36.10M schedule numbers and weight classes, then the B36.19M "S" schedules.
SCHEDULES: tuple[str, ...] = (
    "10", "20", "30", "40", "60", "80", "100", "120", "140", "160", "STD", "XS", "XXS",
    "5S", "10S", "40S", "80S",
)
#: The shipped data files, read in this order.
DATA_FILES: tuple[str, ...] = ("asme_b36_10m.csv", "asme_b36_19m.csv")
HEADER = ("nps", "od_mm", "schedule", "wall_mm")

#: The DN (ISO 6708) of each NPS, as ASME B36.10M-2018 and B36.19M-2018 list them beside the NPS: DN 6, 8, 10,
#: 15, 20, 25, 32, 40, 50, 65, 80, 90 up to NPS 3-1/2, then 25 x NPS (DN 100 = NPS 4 ... DN 1200 = NPS 48).
#: The same pairs as the fluids library's ``fluids.piping.NPSS10`` / ``SS10DN`` (tests/pipes check them).
DN_BY_NPS: dict[str, int] = {
    **dict(zip(NPS_LABELS[:12], (6, 8, 10, 15, 20, 25, 32, 40, 50, 65, 80, 90))),
    **{label: 25 * int(label) for label in NPS_LABELS[12:]},
}
_NPS_BY_DN = {dn: label for label, dn in DN_BY_NPS.items()}
_DN_TEXT = re.compile(r"DN[\s\-]*(?P<dn>\d+)(?:\.0*)?", flags=re.IGNORECASE)
_DN_ANYWHERE = re.compile(r"\bDN\b|\bDN\d|\d\s*DN\b|\bmm\b", flags=re.IGNORECASE)
_UNICODE_FRACTIONS = {"½": "1/2", "¼": "1/4", "¾": "3/4", "⅛": "1/8", "⅜": "3/8", "⅝": "5/8", "⅞": "7/8"}
_NPS_TEXT = re.compile(
    r"(?P<whole>\d+)(?:[\s-]+(?P<num>\d+)/(?P<den>\d+))?|(?P<fnum>\d+)/(?P<fden>\d+)|(?P<dec>\d*\.\d+)"
)
_SCHEDULE_ALIASES = {
    "STD": "STD", "STANDARD": "STD", "XS": "XS", "XH": "XS", "EXTRASTRONG": "XS",
    "XXS": "XXS", "XXH": "XXS", "DOUBLEEXTRASTRONG": "XXS",
}


def _label_fraction(label: str) -> Fraction:
    whole, _, fraction = label.partition("-")
    return Fraction(whole) + (Fraction(fraction) if fraction else 0)


_NPS_BY_VALUE = {_label_fraction(label): label for label in NPS_LABELS}
_VALUE_BY_LABEL = {label: float(_label_fraction(label)) for label in NPS_LABELS}
_VALID_NPS = f"one of {', '.join(NPS_LABELS)}"


@dataclass(frozen=True)
class PipeSize:
    """One NPS x schedule of the catalogue.

    :param nps: nominal pipe size as the trade writes it ("1-1/2")
    :param nps_value: the NPS as a number (1.5) [-]
    :param schedule: wall designation ("40", "STD", "40S")
    :param outside_diameter: [m]
    :param wall: nominal wall thickness [m]
    :param inside_diameter: outside_diameter - 2 x wall [m]
    :param standard: the standard and edition the row comes from ("ASME B36.10M-2018")
    """

    nps: str
    nps_value: float
    schedule: str
    outside_diameter: float
    wall: float
    inside_diameter: float
    standard: str


# Texts already read, text -> label (texts only: 1, 1.0 and True are equal keys, and True is no NPS). Only
# valid texts are kept, so an unknown one always reaches the full reader and its error. A line list repeats
# a few spellings; the bound only guards against an endless stream of new ones.
# measured: +43 % on rows-nps, NPS and schedule together (benchmarks/bench_parsing.py nps-texts)
_LABEL_BY_TEXT: dict[str, str] = {label: label for label in NPS_LABELS}
_SCHEDULE_BY_TEXT: dict[str, str] = {name: name for name in SCHEDULES}
_TEXTS_KEPT = 1024


def nps_value(nps: str | float | int) -> float:
    """The numeric value of an NPS (``"1-1/2"`` -> 1.5) [-]; unknown sizes raise InputError."""
    return _VALUE_BY_LABEL[normalise_nps(nps)]


def normalise_nps(value: object, field: str = "nps") -> str:
    """Return the trade label of an NPS: ``1.5``, ``"1 1/2"``, ``"1½"``, ``'NPS 1-1/2"'`` -> ``"1-1/2"``.

    :raises InputError: the value is not a nominal pipe size the catalogue knows
    """
    if type(value) is str:
        label = _LABEL_BY_TEXT.get(value)
        if label is not None:
            return label
    dn = _DN_TEXT.fullmatch(value.strip()) if isinstance(value, str) else None
    if dn is not None:
        label = _nps_of_dn(int(dn["dn"]), value, field)
    else:
        number = _nps_fraction(value)
        label = _NPS_BY_VALUE.get(number) if number is not None else None
    if label is None:
        if isinstance(value, str) and _DN_ANYWHERE.search(value):
            raise InputError(f"cannot read {value!r} as a DN or an NPS", field=field, value=value,
                             expected="a DN written 'DN 100' or 'DN100', or an NPS in inches such as '4'")
        raise InputError(f"unknown NPS {value!r}", field=field, value=value, expected=_VALID_NPS)
    if type(value) is str:
        _remember(_LABEL_BY_TEXT, value, label)
    return label


def _nps_of_dn(dn: int, value: object, field: str) -> str:
    """The NPS of DN ``dn``; a DN without one raises InputError naming the nearest DN (or the two, if as near)."""
    label = _NPS_BY_DN.get(dn)
    if label is not None:
        return label
    gap = min(abs(known - dn) for known in _NPS_BY_DN)
    nearest = " or ".join(f"DN {known} (NPS {_NPS_BY_DN[known]})" for known in sorted(_NPS_BY_DN)
                          if abs(known - dn) == gap)
    raise InputError(f"DN {dn} has no NPS in ASME B36.10M/B36.19M; nearest {nearest}", field=field, value=value,
                     expected=f"a DN from {min(_NPS_BY_DN)} to {max(_NPS_BY_DN)} that pairs with an NPS, "
                              "e.g. DN 100 (NPS 4)")


def _remember(texts: dict[str, str], text: str, label: str) -> None:
    """Keep ``text`` -> ``label``; past the bound, forget the texts read before (the labels themselves stay)."""
    if len(texts) >= _TEXTS_KEPT:
        kept = {name: name for name in texts.values()}
        texts.clear()
        texts.update(kept)
    texts[text] = label


def _nps_fraction(value: object) -> Fraction | None:
    if isinstance(value, bool):
        return None
    if isinstance(value, (int, float)):
        return Fraction(value) if math.isfinite(value) else None
    if not isinstance(value, str):
        return None
    text = value.strip()
    for char, plain in _UNICODE_FRACTIONS.items():
        text = text.replace(char, f" {plain}")
    text = re.sub(r"^NPS\s*", "", text.strip(), flags=re.IGNORECASE)
    text = re.sub(r"\s*(?:\"|''|in\.?|inch(?:es)?)$", "", text, flags=re.IGNORECASE).strip()
    match = _NPS_TEXT.fullmatch(text)
    if match is None or any(d is not None and int(d) == 0 for d in (match["den"], match["fden"])):
        return None
    if match["dec"]:
        return Fraction(match["dec"])
    if match["fnum"]:
        return Fraction(int(match["fnum"]), int(match["fden"]))
    whole = Fraction(int(match["whole"]))
    return whole + Fraction(int(match["num"]), int(match["den"])) if match["num"] else whole


def normalise_schedule(value: object, field: str = "schedule") -> str:
    """Return the catalogue's name of a wall designation.

    ``40``, ``"Sch 40"``, ``"SCH40"`` -> ``"40"``; ``"40s"`` -> ``"40S"``; ``"std"`` -> ``"STD"``;
    ``"xs"``, ``"XH"`` -> ``"XS"``; ``"XXH"`` -> ``"XXS"``.

    :raises InputError: the value names no schedule of ASME B36.10M or B36.19M
    """
    if type(value) is str:
        known = _SCHEDULE_BY_TEXT.get(value)
        if known is not None:
            return known
    label = _schedule_label(value)
    if label not in SCHEDULES:
        raise InputError(f"unknown schedule {value!r}", field=field, value=value,
                         expected=f"one of {', '.join(SCHEDULES)}")
    if type(value) is str:
        _remember(_SCHEDULE_BY_TEXT, value, label)
    return label


def _schedule_label(value: object) -> str | None:
    if isinstance(value, bool):
        return None
    if isinstance(value, float) and value.is_integer():
        value = int(value)
    if isinstance(value, int):
        return str(value)
    if not isinstance(value, str):
        return None
    text = re.sub(r"[\s.\-_]", "", value.upper())
    text = re.sub(r"^SCH(?:EDULE)?", "", text)
    if text in _SCHEDULE_ALIASES:
        return _SCHEDULE_ALIASES[text]
    match = re.fullmatch(r"0*(\d+)(S?)", text)
    return f"{int(match[1])}{match[2]}" if match else text


def _schedule_order(size: PipeSize) -> tuple[float, int]:
    return size.wall, SCHEDULES.index(size.schedule)


class Catalogue:
    """Pipe sizes by NPS and schedule (all lengths in metres).

    :param entries: the rows; the same NPS x schedule twice raises CatalogueError
    """

    def __init__(self, entries: Iterable[PipeSize]) -> None:
        self._entries: dict[tuple[str, str], PipeSize] = {}
        for entry in entries:
            key = (entry.nps, entry.schedule)
            if key in self._entries:
                raise CatalogueError(f"NPS {entry.nps} schedule {entry.schedule} is listed twice "
                                     f"({self._entries[key].standard} and {entry.standard})")
            self._entries[key] = entry
        by_nps: dict[str, list[PipeSize]] = {}
        for entry in self._entries.values():
            by_nps.setdefault(entry.nps, []).append(entry)
        self._sizes = tuple(sorted(by_nps, key=nps_value))
        self._schedules = {nps: tuple(e.schedule for e in sorted(rows, key=_schedule_order))
                           for nps, rows in by_nps.items()}

    def get(self, nps: str | float | int, schedule: str | int) -> PipeSize:
        """The size ``nps`` in ``schedule``.

        :raises InputError: ``nps`` or ``schedule`` is not a name the catalogue knows
        :raises CatalogueError: the standards list no such wall at that NPS (message lists those that exist)
        """
        label, name = normalise_nps(nps), normalise_schedule(schedule)
        try:
            return self._entries[(label, name)]
        except KeyError:
            available = ", ".join(self.schedules(label)) or "none"
            raise CatalogueError(f"no schedule {name} at NPS {label} (given: nps={nps!r}, "
                                 f"schedule={schedule!r}); schedules at NPS {label}: {available}") from None

    def sizes(self) -> tuple[str, ...]:
        """Every NPS label in the catalogue, in increasing order."""
        return self._sizes

    def schedules(self, nps: str | float | int) -> tuple[str, ...]:
        """The schedules listed at ``nps``, thinnest wall first (empty if the NPS has no rows)."""
        return self._schedules.get(normalise_nps(nps), ())

    def has(self, nps: str | float | int, schedule: str | int) -> bool:
        """True if the catalogue holds ``nps`` in ``schedule`` (names it cannot read raise InputError)."""
        return (normalise_nps(nps), normalise_schedule(schedule)) in self._entries

    def __iter__(self) -> Iterator[PipeSize]:
        return iter(self._entries.values())

    def __len__(self) -> int:
        return len(self._entries)


def read_catalogue_text(text: str, source: str = "<text>") -> tuple[PipeSize, ...]:
    """Read and check one catalogue CSV given as text (see ``pipes/data/*.csv`` for the layout).

    Lines starting with ``#`` are comments; one of them must read ``# standard: NAME``. The first
    other line is the header ``nps,od_mm,schedule,wall_mm``. Every row is checked: a known NPS and
    schedule, 0 < wall < OD/2, one OD per NPS, no NPS x schedule twice.

    :param source: the file name used in messages
    :raises CatalogueError: naming ``source``, the line number and the value at fault
    """
    standard = None
    rows: list[tuple[int, list[str]]] = []
    for number, line in enumerate(text.splitlines(), start=1):
        match = re.fullmatch(r"#\s*standard:\s*(.+)", line.strip(), flags=re.IGNORECASE)
        if match and standard is None:
            standard = match[1].strip()
        content = line.split("#", 1)[0].strip()
        if content:
            rows.append((number, [cell.strip() for cell in content.split(",")]))
    if standard is None:
        raise CatalogueError(f"{source}: no '# standard: NAME' comment line naming the standard and edition")
    if not rows or tuple(rows[0][1]) != HEADER:
        found = ",".join(rows[0][1]) if rows else "nothing"
        raise CatalogueError(f"{source}: header should be {','.join(HEADER)}, found {found}")
    if len(rows) == 1:
        raise CatalogueError(f"{source}: no rows after the header")
    places = [f"{source}, line {number}" for number, _ in rows[1:]]
    return _check_rows([(where, _parse_row(cells, where, standard)) for where, (_, cells) in zip(places, rows[1:])])


def _parse_row(cells: list[str], where: str, standard: str) -> PipeSize:
    if len(cells) != len(HEADER):
        raise CatalogueError(f"{where}: {len(cells)} cells {','.join(cells)!r}; expected {','.join(HEADER)}")
    try:
        nps, schedule = normalise_nps(cells[0]), normalise_schedule(cells[2])
    except InputError as exc:
        raise CatalogueError(f"{where}: {exc}") from None
    od_mm, wall_mm = _millimetres(cells[1], "od_mm", where), _millimetres(cells[3], "wall_mm", where)
    if wall_mm >= od_mm / 2:
        raise CatalogueError(f"{where}: wall_mm {cells[3]} is not less than half of od_mm {cells[1]}")
    # decimal arithmetic, so that 114.3 - 2 x 6.02 mm gives 0.10226 m exactly as printed
    return PipeSize(nps=nps, nps_value=nps_value(nps), schedule=schedule, outside_diameter=_metres(od_mm),
                    wall=_metres(wall_mm), inside_diameter=_metres(od_mm - 2 * wall_mm), standard=standard)


def _millimetres(cell: str, column: str, where: str) -> Decimal:
    try:
        value = Decimal(cell)
    except InvalidOperation:
        value = Decimal("NaN")
    if not value.is_finite() or value <= 0:
        raise CatalogueError(f"{where}: {column} {cell!r} is not a length above zero in mm")
    return value


def _metres(millimetres: Decimal) -> float:
    return float(millimetres.scaleb(-3))


def _check_rows(rows: list[tuple[str, PipeSize]]) -> tuple[PipeSize, ...]:
    """Reject an NPS x schedule given twice, and an NPS given with two outside diameters."""
    seen: dict[tuple[str, str], str] = {}
    ods: dict[str, tuple[float, str]] = {}
    for where, size in rows:
        key = (size.nps, size.schedule)
        if key in seen:
            raise CatalogueError(f"{where}: NPS {size.nps} schedule {size.schedule} already given at {seen[key]}")
        seen[key] = where
        first_od, first_where = ods.setdefault(size.nps, (size.outside_diameter, where))
        if size.outside_diameter != first_od:
            raise CatalogueError(f"{where}: od_mm {size.outside_diameter * 1000:g} for NPS {size.nps} differs "
                                 f"from {first_od * 1000:g} at {first_where}")
    return tuple(size for _, size in rows)


def read_catalogue_file(path: str | PathLike[str]) -> tuple[PipeSize, ...]:
    """Read and check one catalogue CSV file (see :func:`read_catalogue_text`)."""
    try:
        text = Path(path).read_text(encoding="utf-8")
    except OSError as exc:
        raise CatalogueError(f"cannot read pipe catalogue {path}: {exc.strerror}") from exc
    return read_catalogue_text(text, source=str(path))


@functools.cache
def load_catalogue() -> Catalogue:
    """The shipped catalogue (ASME B36.10M and B36.19M), read and checked once per process."""
    data = resources.files("boresize.pipes").joinpath("data")
    entries: list[PipeSize] = []
    for name in DATA_FILES:
        entries.extend(read_catalogue_text(data.joinpath(name).read_text(encoding="utf-8"), source=name))
    return Catalogue(entries)
