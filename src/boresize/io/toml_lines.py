"""Reading a line list from TOML: one ``[[line]]`` table per line, with optional ``[[line.case]]`` tables.

::

    [units]                      # optional: the default unit of bare numbers, per column
    length = "m"

    [[line]]
    tag = "140-P-001"
    fluid = "water"
    flow = "45 t/h"
    pressure = "1.2 barg"
    temperature = "30 degC"
    length = 25

    [[line.case]]                # each case inherits the line's keys and overrides some
    case = "normal"
    [[line.case]]
    case = "maximum"
    flow = "54 t/h"

Keys are the CSV column names (case-insensitive, spaces or dashes for ``_``). Values are text or
numbers; a number takes the column's default unit from ``[units]``.
"""

from __future__ import annotations

import sys
from collections.abc import Mapping
from pathlib import Path
from typing import Any

from boresize.errors import InputError
from boresize.io.csv_reader import LineList, check_header, file_digest
from boresize.io.rows import parse_header

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover
    import tomli as tomllib

__all__ = ["read_toml_lines", "lines_from_document"]

TOP_KEYS = ("line", "units")


def read_toml_lines(path: str | Path) -> LineList:
    """Read a TOML line list (see the module docstring for the layout)."""
    try:
        document = tomllib.loads(Path(path).read_text(encoding="utf-8"))
    except OSError as exc:
        raise InputError(f"cannot read {path}: {exc.strerror}", field="lines", value=str(path),
                         expected="a readable TOML file") from exc
    except (UnicodeDecodeError, tomllib.TOMLDecodeError) as exc:
        raise InputError(f"{path} is not valid TOML: {exc}", field="lines", value=str(path),
                         expected="a UTF-8 TOML file with [[line]] tables") from exc
    line_list = lines_from_document(document, str(path))
    line_list.digest = file_digest(path)
    return line_list


def _cell(value: Any, where: str) -> str:
    if isinstance(value, bool) or not isinstance(value, (str, int, float)):
        raise InputError(f"{value!r} is neither text nor a number", field=where, value=value,
                         expected='text such as "45 t/h" or a number')
    return value.strip() if isinstance(value, str) else repr(value) if isinstance(value, float) else str(value)


def _fields(table: Mapping[str, Any], where: str, units: dict[str, str | None] | None = None) -> dict[str, str]:
    """The cells of a line or case table by field; ``units`` gets each key's unit (``"length (m)"``: m), None
    for a key without one."""
    cells: dict[str, str] = {}
    given: dict[str, str] = {}  # field -> the key that gave it (an alias and its column both given is an error)
    for key, value in table.items():
        if key == "case" and isinstance(value, list):
            continue
        if parse_header(key).field == "fluid" and isinstance(value, (list, dict)):  # a composition (issue 3)
            from boresize.properties.composition import composition_text

            value = composition_text(value)
        header = parse_header(key)
        name = header.field
        if units is not None:
            units[name] = header.unit
        if name in cells:
            raise InputError(f"{where} gives {name!r} twice (as {key!r} and as {given[name]!r})", field=f"{where}.{key}",
                             value=key, expected=f"one key for {name!r}")
        given[name] = key
        cells[name] = _cell(value, f"{where}.{key}")
    return cells


def lines_from_document(document: Mapping[str, Any], source: str = "<toml>") -> LineList:
    """Rows from a parsed TOML document: one per line, or one per case of a line that has cases."""
    unknown = sorted(set(document) - set(TOP_KEYS))
    if unknown:
        raise InputError(f"unknown table or key {unknown[0]!r} in {source}", field=unknown[0], value=unknown[0],
                         expected="[[line]] tables and an optional [units] table")
    units = {parse_header(k).field: _cell(v, f"units.{k}") for k, v in document.get("units", {}).items()}
    lines = document.get("line", [])
    if not isinstance(lines, list) or not lines:
        raise InputError(f"{source} holds no [[line]] table", field="line", value=source,
                         expected="one [[line]] table per line")
    rows: list[dict[str, str]] = []
    row_units: list[dict[str, str]] = []  # per row, the units its keys give ("length (m)"), over [units]
    for number, table in enumerate(lines, start=1):
        where = f"line[{number}]"
        base_units: dict[str, str | None] = {}
        base = _fields(table, where, base_units)
        cases = table.get("case")
        if not isinstance(cases, list):
            rows.append(base)
            row_units.append(_given(base_units))
            continue
        for index, case in enumerate(cases, start=1):
            case_units: dict[str, str | None] = {}
            fields = _fields(case, f"{where}.case[{index}]", case_units)
            row_units.append(_given({**base_units, **case_units}))
            if not fields.get("case"):
                raise InputError("a case without a name", field=f"{where}.case[{index}].case", value="",
                                 expected='a case name such as "normal" or "maximum"')
            rows.append({**base, **fields})
    headers = list(dict.fromkeys(key for row in rows for key in row))
    check_header(headers, headers, source)  # a misspelt key ("lenght") would be ignored: refuse it
    shown = [f"{h} [{units[h]}]" if units.get(h) else h for h in headers]
    return LineList(rows=rows, units={h: units.get(h) for h in headers}, source=source, headers=shown,
                    row_units=row_units)


def _given(units: Mapping[str, str | None]) -> dict[str, str]:
    """The units a row's keys give (a key without one leaves the field to the [units] table)."""
    return {name: unit for name, unit in units.items() if unit}
