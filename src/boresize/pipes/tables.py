"""Pipe catalogues beyond ASME B36.10M / B36.19M: a user's CSV file, read and checked cell by cell.

A user catalogue is a CSV file whose heading names ``size``, ``OD``, ``wall`` or ``ID``, and optionally
``roughness`` and ``schedule``; each length column carries its unit in the heading (``OD [mm]``, ``OD (in)``,
``od_mm``). A size is kept as written (``DN 110``, ``110 mm``, ``4``); sizes are ordered by inside diameter.
Every length handed out is in metres. Lines starting with ``#`` are comments.
"""

from __future__ import annotations

import csv
import math
import re
from dataclasses import dataclass
from pathlib import Path

from boresize.errors import CriteriaFileError, InputError
from boresize.pipes.catalogue import normalise_nps, nps_value

__all__ = ["LENGTH_UNITS", "TableSize", "read_table_file", "read_table_text", "size_key"]

#: Length units a heading may give, in metres (no pint: a catalogue is read before any line).
LENGTH_UNITS: dict[str, float] = {"mm": 1e-3, "cm": 1e-2, "m": 1.0, "in": 0.0254, "inch": 0.0254,
                                  "inches": 0.0254, '"': 0.0254, "um": 1e-6, "µm": 1e-6, "μm": 1e-6}
_COLUMNS: dict[str, tuple[str, ...]] = {
    "size": ("size", "nominal size", "name", "nps", "dn"),
    "od": ("od", "outside diameter", "outer diameter", "do"),
    "wall": ("wall", "wall thickness", "thickness", "t"),
    "id": ("id", "inside diameter", "inner diameter", "di", "bore"),
    "roughness": ("roughness", "absolute roughness", "epsilon"),
    "schedule": ("schedule", "sch", "series", "class", "sdr"),
}
_NAME_OF = {alias: column for column, aliases in _COLUMNS.items() for alias in aliases}
_HEADING = re.compile(r"(?P<name>.+?)\s*(?:[\[(]\s*(?P<unit>[^\])]*?)\s*[\])])?\s*")
_EXAMPLE = "size,OD [mm],wall [mm],roughness [mm] (or ID [mm] instead of wall; schedule optional)"
#: Largest roughness a catalogue row may give [m] (as a pipe class: riveted steel, Moody 1944, tops at 9 mm).
_MAX_ROUGHNESS_MM = 10.0


@dataclass(frozen=True)
class TableSize:
    """One size of a catalogue other than ASME B36.10M/B36.19M (lengths in metres).

    :param name: the size as the catalogue writes it ("DN 110", "4")
    :param schedule: the wall series ("40", "SDR 11", "medium"); empty when the catalogue has one series
    :param roughness: the row's absolute roughness [m], or None when the catalogue gives none
    :param nps_value: the NPS the name reads as, else the inside diameter in inches (for fittings and
        criteria banded by NPS) [-]
    """

    name: str
    schedule: str
    outside_diameter: float
    wall: float
    inside_diameter: float
    roughness: float | None
    nps_value: float
    source: str


def size_key(name: str) -> str:
    """The form two size names are compared in: case and spacing ignored ("dn110" == "DN 110")."""
    return re.sub(r"[\s\-_]+", "", name).casefold()


def nominal_value(name: str, inside_diameter: float) -> float:
    """The NPS ``name`` reads as (``"4"``, ``"DN 100"`` -> 4.0), else the inside diameter in inches."""
    try:
        return nps_value(normalise_nps(name))
    except InputError:
        return inside_diameter / 0.0254


def read_table_file(path: Path, field: str) -> tuple[TableSize, ...]:
    """Read the catalogue CSV at ``path``; every fault is a CriteriaFileError naming the file, line and column."""
    try:
        text = path.read_text(encoding="utf-8-sig")
    except OSError as exc:
        raise CriteriaFileError(f"cannot read pipe catalogue {path}: {exc.strerror}", field=field,
                                value=str(path), expected="a readable CSV file: " + _EXAMPLE) from None
    except UnicodeDecodeError:
        raise CriteriaFileError(f"pipe catalogue {path} is not UTF-8 text", field=field, value=str(path),
                                expected="a CSV file saved as UTF-8") from None
    return read_table_text(text, str(path), field)


def read_table_text(text: str, source: str, field: str) -> tuple[TableSize, ...]:
    """Read a catalogue CSV given as text; ``source`` names it in messages."""
    rows = [(number, cells) for number, cells in enumerate(csv.reader(text.splitlines()), start=1)
            if cells and any(c.strip() for c in cells) and not cells[0].lstrip().startswith("#")]
    if not rows:
        raise CriteriaFileError(f"pipe catalogue {source} has no heading", field=field, value=source,
                                expected="a heading such as " + _EXAMPLE)
    heading_line, heading = rows[0]
    columns = _columns(heading, source, heading_line, field)
    if len(rows) == 1:
        raise CriteriaFileError(f"pipe catalogue {source} has no rows after the heading", field=field,
                                value=source, expected="one row per size")
    sizes: dict[tuple[str, str], tuple[int, TableSize]] = {}
    for number, cells in rows[1:]:
        size = _row(cells, columns, heading, f"{source}, line {number}", field)
        key = (size_key(size.name), size.schedule)
        if key in sizes:
            raise CriteriaFileError(f"{source}, line {number}: size {size.name!r}"
                                    f"{' schedule ' + size.schedule if size.schedule else ''} is listed twice "
                                    f"(first on line {sizes[key][0]})", field=field, value=size.name,
                                    expected="each size (and schedule) once")
        sizes[key] = (number, size)
    return tuple(sorted((s for _, s in sizes.values()), key=lambda s: (s.inside_diameter, s.name)))


def _columns(heading: list[str], source: str, line: int, field: str) -> dict[str, tuple[int, float]]:
    """Column -> (index, metres per unit) from the heading; 1.0 for the text columns."""
    found: dict[str, tuple[int, float]] = {}
    for index, cell in enumerate(heading):
        match = _HEADING.fullmatch(cell.strip())
        name, unit = (match["name"].strip().lower(), match["unit"]) if match else (cell.strip().lower(), None)
        for suffix in ("mm", "in", "m"):  # od_mm, wall_in
            if unit is None and name.endswith(f"_{suffix}") and name[:-len(suffix) - 1] in _NAME_OF:
                name, unit = name[:-len(suffix) - 1], suffix
        where = f"{source}, line {line}, column {index + 1} {cell.strip()!r}"
        column = _NAME_OF.get(name.replace("_", " "))
        if column is None:
            raise CriteriaFileError(f"{where}: unknown column", field=field, value=cell,
                                    expected=f"one of {', '.join(_COLUMNS)}: " + _EXAMPLE)
        if column in found:
            raise CriteriaFileError(f"{where}: column {column} given twice", field=field, value=cell,
                                    expected="each column once")
        text_column = column in ("size", "schedule")
        if not text_column and (unit is None or unit.strip().lower() not in LENGTH_UNITS):
            raise CriteriaFileError(f"{where}: no length unit in the heading" if unit is None
                                    else f"{where}: unknown length unit {unit!r}", field=field, value=cell,
                                    expected=f"the unit in the heading, e.g. '{column} [mm]'; units: mm, cm, m, in, um")
        found[column] = (index, 1.0 if text_column else LENGTH_UNITS[str(unit).strip().lower()])
    where = f"{source}, line {line} (heading)"
    for needed in ("size", "od"):
        if needed not in found:
            raise CriteriaFileError(f"{where}: no {needed} column", field=field, value=",".join(heading),
                                    expected="a heading such as " + _EXAMPLE)
    if ("wall" in found) == ("id" in found):
        raise CriteriaFileError(f"{where}: give a wall column or an ID column, {'not both' if 'wall' in found else 'one of them'}",
                                field=field, value=",".join(heading), expected="a heading such as " + _EXAMPLE)
    return found


def _row(cells: list[str], columns: dict[str, tuple[int, float]], heading: list[str], where: str,
         field: str) -> TableSize:
    if len(cells) != len(heading):
        raise CriteriaFileError(f"{where}: {len(cells)} cells, the heading has {len(heading)}", field=field,
                                value=",".join(cells), expected="one cell per heading column: " + ",".join(heading))

    def cell(column: str) -> str:
        return cells[columns[column][0]].strip() if column in columns else ""

    def length(column: str) -> float:
        index, scale = columns[column]
        text = cells[index].strip()
        try:
            value = float(text)
        except ValueError:
            value = math.nan
        if not math.isfinite(value) or value <= 0:
            raise CriteriaFileError(f"{where}, column {heading[index].strip()!r}: value {text!r} is not a positive "
                                    "length", field=field, value=text,
                                    expected=f"a positive number in the heading's unit ({heading[index].strip()})")
        return value * scale

    name = cell("size")
    if not name or not name.isprintable():
        raise CriteriaFileError(f"{where}, column {heading[columns['size'][0]].strip()!r}: "
                                f"{'empty size' if not name else f'size {name!r} holds control characters'}", field=field,
                                value=name, expected="a size name as the trade writes it, e.g. 'DN 110' or '4'")
    od = length("od")
    wall = length("wall") if "wall" in columns else None
    inside = od - 2 * wall if wall is not None else length("id")
    if inside <= 0 or inside >= od:
        column = "wall" if wall is not None else "id"
        shown = heading[columns[column][0]].strip()
        raise CriteriaFileError(f"{where}, column {shown!r}: value {cell(column)!r} leaves no bore in OD "
                                f"{cell('od')}", field=field, value=cell(column),
                                expected="a wall under half the OD" if wall is not None else "an ID under the OD")
    roughness = None
    if "roughness" in columns:
        text = cell("roughness")
        roughness = float(text) * columns["roughness"][1] if _number(text) is not None else math.nan
        if not 0.0 <= roughness <= _MAX_ROUGHNESS_MM * 1e-3:
            shown = heading[columns["roughness"][0]].strip()
            raise CriteriaFileError(f"{where}, column {shown!r}: value {text!r} is not a roughness", field=field,
                                    value=text, expected=f"an absolute roughness from 0 to {_MAX_ROUGHNESS_MM:g} mm "
                                                         "in the heading's unit (0.0015 mm for plastic)")
    return TableSize(name=name, schedule=cell("schedule"), outside_diameter=od, wall=(od - inside) / 2,
                     inside_diameter=inside, roughness=roughness, nps_value=nominal_value(name, inside),
                     source=where.split(", line")[0])


def _number(text: str) -> float | None:
    try:
        value = float(text)
    except ValueError:
        return None
    return value if math.isfinite(value) else None
