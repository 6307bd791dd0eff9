"""A line list's rows as the lines the engine sizes: grouped into lines (operating cases), parsed into Lines.

Reading stops at text: every row becomes a :class:`~boresize.model.Line`, or a :class:`RowFault` naming
what is wrong with it, so that one bad row never stops the others. Rows that share a tag and name a
``case`` are one line (see :mod:`boresize.sizing.cases`); the rows' cells as given stay with each line
(:attr:`LineItems.cells`) for the writers, which show a line's input beside its result.
"""

from __future__ import annotations

from collections import deque
from collections.abc import Iterable, Iterator, Mapping, Sequence
from dataclasses import dataclass
from typing import Literal, Union

from boresize.errors import BoresizeError
from boresize.io.rows import DUPLICATE_TAG, line_from_row
from boresize.model import Line
from boresize.units import BarePressure

__all__ = ["Cells", "LazyItems", "LineItem", "LineItems", "Row", "RowFault", "group_rows", "line_items"]

#: One input row: (1-based position, field -> cell, field -> default unit).
Row = tuple[int, Mapping[str, object], Mapping[str, "str | None"]]
#: One row's cells as text, as the writers show them (field -> cell).
Cells = dict[str, str]


@dataclass(frozen=True)
class RowFault:
    """A row that could not be read as a line: the sizing reports it as an ``error`` result.

    :param tag: the row's tag, or ``row N`` when it gives none
    :param mode: what the row asked for: ``check`` when it gives an NPS, else ``size``
    :param case: the row's case name ("" when it names none)
    :param error: what is wrong, naming the field and the value
    """

    tag: str
    mode: Literal["size", "check"]
    case: str
    error: BoresizeError


#: What one line of a line list is to the engine: a Line, a row that could not be read, or the
#: cases of one line (each a Line or a fault).
LineItem = Union[Line, RowFault, tuple[Union[Line, RowFault], ...]]


@dataclass(frozen=True)
class LineItems:
    """The lines of a line list, in the order of each line's first row, with each line's rows' cells."""

    items: tuple[LineItem, ...]
    cells: tuple[tuple[Cells, ...], ...]


def _cell(row: Mapping[str, object], name: str) -> str:
    value = row.get(name)
    return "" if value is None else str(value).strip()


def group_rows(pairs: Iterable[tuple[Mapping[str, object], Mapping[str, str | None]]]) -> list[list[Row]]:
    """Group rows into lines, in the order of each line's first row.

    Rows with the same tag and a non-empty ``case`` are one line; every other row is a line alone.
    """
    groups: list[list[Row]] = []
    by_tag: dict[str, list[Row]] = {}
    first: dict[str, int] = {}  # tag -> the row that began its line: a later line with that tag is refused
    for position, (row, units) in enumerate(pairs, start=1):
        tag, case = _cell(row, "tag"), _cell(row, "case")
        if tag and case and tag in by_tag:
            by_tag[tag].append((position, row, units))
            continue
        if tag in first:
            row = {**row, DUPLICATE_TAG: f"row {first[tag]}"}
        elif tag:
            first[tag] = position
        group: list[Row] = [(position, row, units)]
        groups.append(group)
        if tag and case:
            by_tag[tag] = group
    return groups


def _parsed(position: int, row: Mapping[str, object], units: Mapping[str, str | None],
            bare_pressure: BarePressure = "absolute") -> Line | RowFault:
    try:
        return line_from_row(row, units, position, bare_pressure)
    except BoresizeError as exc:
        return RowFault(str(row.get("tag") or f"row {position}"), "check" if row.get("nps") else "size",
                        _cell(row, "case"), exc)


def _item(group: Sequence[Row], bare_pressure: BarePressure = "absolute") -> LineItem:
    parsed = tuple(_parsed(position, row, units, bare_pressure) for position, row, units in group)
    return parsed[0] if len(parsed) == 1 else parsed


def line_items(pairs: Iterable[tuple[Mapping[str, object], Mapping[str, str | None]]],
               bare_pressure: BarePressure = "absolute") -> LineItems:
    """The lines of ``pairs`` ((field -> cell, field -> default unit) per row, e.g. ``LineList.pairs()``); a pressure
    in a bare unit (``9 psi``) read as ``bare_pressure`` says (absolute, gauge or an error)."""
    groups = group_rows(pairs)
    return LineItems(tuple(_item(group, bare_pressure) for group in groups), tuple(_cells(group) for group in groups))


def _cells(group: Sequence[Row]) -> tuple[Cells, ...]:
    return tuple({str(k): "" if v is None else str(v) for k, v in row.items()} for _, row, _ in group)


class LazyItems:
    """The lines of ``pairs`` as :func:`line_items` gives them, each parsed only when iteration reaches it and its
    rows let go once parsed: a run sizing them one at a time holds one line's Line and cells, not every line's.
    Rows are grouped (operating cases, duplicate tags) before the first line is given, as :func:`line_items` does.
    measured: with the run's counts kept instead of results (``count_only``), 10,000 lines to CSV peak at 155 MB
    against 212 MB, 1,000 lines 144 against 150 MB (`/usr/bin/time -f %M boresize size lines-N.csv -o x.csv
    --workers 1 --quiet`, bench_scale.py's lists; 2 cores, load average 6); bench_scale.py (e) prints the growth.

    :attr:`cells` holds the cells of each line given and not yet taken (:meth:`take_cells`): one line's when each
    is taken as its line is sized.
    """

    def __init__(self, pairs: Iterable[tuple[Mapping[str, object], Mapping[str, str | None]]],
                 bare_pressure: BarePressure = "absolute") -> None:
        self._groups = deque(group_rows(pairs))
        self._count = len(self._groups)
        self._bare_pressure = bare_pressure
        self.cells: deque[tuple[Cells, ...]] = deque()

    def __len__(self) -> int:
        return self._count

    def __iter__(self) -> Iterator[LineItem]:
        while self._groups:
            group = self._groups.popleft()
            self.cells.append(_cells(group))
            yield _item(group, self._bare_pressure)

    def take_cells(self) -> tuple[Cells, ...]:
        """The cells of the earliest line given whose cells were not yet taken."""
        return self.cells.popleft()
