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

import datetime
import sys
from collections.abc import Mapping
from pathlib import Path
from typing import Any

from boresize.errors import InputError
from boresize.io.csv_reader import LineList, check_header, file_digest
from boresize.io.rows import NOT_READ, not_read, parse_header

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
    except RecursionError as exc:  # tomllib recurses once per nested array or inline table
        raise InputError(f"{path} nests arrays or tables too deeply to be read", field="lines", value=str(path),
                         expected="a UTF-8 TOML file with [[line]] tables, each key a text or a number") from exc
    line_list = lines_from_document(document, str(path))
    line_list.digest = file_digest(path)
    return line_list


#: The TOML types that are not a cell's text or number, by the Python type tomllib reads them as.
_TOML_TYPES = ((bool, "a boolean"), (datetime.datetime, "a date-time"), (datetime.date, "a date"),
               (datetime.time, "a time"), (dict, "a table"), (list, "an array"))


def _shown(value: Any) -> str:
    """A value as the TOML file wrote it (``true``, ``2026-01-02``), shortened to 60 characters."""
    text = str(value).lower() if isinstance(value, bool) else \
        value.isoformat() if isinstance(value, (datetime.date, datetime.time)) else repr(value)
    return text if len(text) <= 60 else text[:57] + "..."


def _cell(value: Any, where: str) -> str:
    if isinstance(value, bool) or not isinstance(value, (str, int, float)):
        kind = next((name for t, name in _TOML_TYPES if isinstance(value, t)), type(value).__name__)
        raise InputError(f"{_shown(value)} is {kind}, neither text nor a number", field=where, value=_shown(value),
                         expected='text (such as "45 t/h" or "5 barg") or a number')
    return value.strip() if isinstance(value, str) else repr(value) if isinstance(value, float) else str(value)


def _fields(table: Mapping[str, Any], where: str, units: dict[str, str | None] | None = None) -> dict[str, str]:
    """A line's (or case's) keys as cells by field; the first key that is not a cell makes the row that error
    (the rows of the other lines are read). ``units`` gets each key's unit (``"length (m)"``: m), None for a
    key without one."""
    cells: dict[str, str] = {}
    given: dict[str, str] = {}  # field -> the key that gave it (an alias and its column both given is an error)
    fault: dict[str, str] = {}
    for key, value in table.items():
        if key == "case" and isinstance(value, list):
            continue
        header = parse_header(key)
        name = header.field
        if units is not None:
            units[name] = header.unit
        if name in cells:  # as a column given twice in CSV: the whole list's fault
            raise InputError(f"{where} gives {name!r} twice (as {key!r} and as {given[name]!r})", field=f"{where}.{key}",
                             value=key, expected=f"one key for {name!r}")
        given[name] = key
        try:
            if name == "fluid" and isinstance(value, (list, dict)):  # a composition (issue 3)
                from boresize.properties.composition import composition_text

                value = composition_text(value)
            cells[name] = _cell(value, name)
        except InputError as exc:
            fault = fault or not_read(exc)
            cells.setdefault(name, "")  # the column is still given: only this line is at fault
    return {**cells, **fault}


def _case_tables(cases: list[Any], where: str) -> dict[str, str]:
    """A fault when ``case`` is an array of anything but tables (``case = ["normal", "max"]``), else {}."""
    if all(isinstance(case, dict) for case in cases):
        return {}
    return not_read(InputError(f"{_shown(cases)} is an array of names, not of case tables", field="case",
                               value=_shown(cases), expected='one [[line.case]] table per operating case, each '
                               'with case = "NAME" and the keys it changes, or case = "NAME" for a single case'))


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
        if not isinstance(table, dict):
            rows.append(not_read(InputError(f"{where} is {_shown(table)}, not a table", field="line",
                                            value=_shown(table), expected="a [[line]] table of keys")))
            row_units.append({})
            continue
        base_units: dict[str, str | None] = {}
        base = _fields(table, where, base_units)
        cases = table.get("case")
        if not isinstance(cases, list) or not cases:
            rows.append(base)
            row_units.append(_given(base_units))
            continue
        fault = _case_tables(cases, where)
        if fault:
            rows.append({**base, **fault})
            row_units.append(_given(base_units))
            continue
        for index, case in enumerate(cases, start=1):
            case_units: dict[str, str | None] = {}
            fields = _fields(case, f"{where}.case[{index}]", case_units)
            row_units.append(_given({**base_units, **case_units}))
            if not fields.get("case"):  # named by its place, so that it stays one of its line's cases
                fields = {**fields, "case": f"case[{index}]", **({} if NOT_READ in fields else not_read(InputError(
                    f"{where}.case[{index}] has no case name", field="case", value="",
                    expected='a case name such as "normal" or "maximum"')))}
            rows.append({**base, **fields})
    headers = list(dict.fromkeys(key for row in rows for key in row if key != NOT_READ))
    check_header(headers, headers, source)  # a misspelt key ("lenght") would be ignored: refuse it
    shown = [f"{h} [{units[h]}]" if units.get(h) else h for h in headers]
    return LineList(rows=rows, units={h: units.get(h) for h in headers}, source=source, headers=shown,
                    row_units=row_units)


def _given(units: Mapping[str, str | None]) -> dict[str, str]:
    """The units a row's keys give (a key without one leaves the field to the [units] table)."""
    return {name: unit for name, unit in units.items() if unit}
