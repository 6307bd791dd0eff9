"""pandas: a DataFrame of streams in (one row per line case), a DataFrame of results out.

The frame in has the columns of a CSV line list. A cell may carry its unit (``"65 t/h"``) or be a
plain number whose unit the column gives: in the header (``"flow [t/h]"``), in a second header level
(``pd.read_csv(..., header=[0, 1])``), or in a first row of units (tag and fluid empty, ``t/h`` under
flow). Cells may also be pint Quantities. Empty cells (None, NaN) are empty.

A frame without a tag column whose index is named ``tag`` (or a tag heading such as ``line_no``), or holds
text, takes its tags from the index.

The frame out has one row per input row (units row and empty rows left out), in input order, under the input
frame's index: the input columns as given, then the result columns, named by :func:`result_columns`: the keys
of the case's JSON entry (:func:`boresize.io.document.result_to_dict`: ``status``, ``nps``, ``velocity_m_s``,
``dp_kpa_per_100m`` ...) plus ``line_status`` (the line's own status over its cases) and ``governs`` (the cases
whose result set the line's size), each with a ``result_`` prefix only where it is also the name of a line-list
column (``result_nps``, ``result_schedule``, ``result_service``, ``result_phase``) or of one of the frame's own columns. Read back with :func:`read_dataframe` the result columns are
skipped, so a frame goes out and in like a CSV file.
"""

from __future__ import annotations

import math
import numbers
import re
from collections.abc import Sequence
from typing import TYPE_CHECKING

from boresize.errors import InputError
from boresize.io.csv_reader import RESULT_PREFIX, LineList, check_header, surplus_cells
from boresize.io.safety import restore
from boresize.io.rows import COLUMNS, parse_header
from boresize.io.sheet_rows import RESULT_COLUMNS
from boresize.model import LineResult

if TYPE_CHECKING:
    import pandas as pd

__all__ = ["lines_dataframe", "read_dataframe", "result_columns", "results_dataframe"]

RESULT_PREFIX_SNAKE = "result_"  # before a result column's name that is also an input column's

_RESULT_KEYS = tuple(key for _, key in RESULT_COLUMNS)
_UNNAMED = re.compile(r"^Unnamed: \d+(_level_\d+)?$")  # what pandas names a blank header cell


def read_dataframe(frame: pd.DataFrame, *, units_row: bool | None = None, source: str = "<DataFrame>") -> LineList:
    """A line list from a DataFrame (see the module docstring for where units may be given).

    :param units_row: True when the first row holds units, False when it is a line; None tells by its
        flow cell (a units row has text that does not start with a number there)
    :raises InputError: field "header" for a missing, doubled or misspelt column; field "lines" for a
        frame without lines
    """
    return _read(frame, units_row, source)[0]


def _read(frame: pd.DataFrame, units_row: bool | None, source: str) -> tuple[LineList, list[int], bool]:
    """The line list, the position in ``frame`` of each of its rows, and whether the tags came from the index."""
    frame, from_index = _tags_from_index(frame)
    headers = [_header_text(column) for column in frame.columns]
    records = [list(row) for row in frame.itertuples(index=False, name=None)]
    if units_row is None:
        units_row = _looks_like_units(headers, records)
    first = 0
    if units_row and records:
        headers = [_with_unit(head, _text(unit)) for head, unit in zip(headers, records[0])]
        first = 1
    line_list, kept = _line_list(headers, records[first:], source)
    return line_list, [first + k for k in kept], from_index


def _tags_from_index(frame: pd.DataFrame) -> tuple[pd.DataFrame, bool]:
    """``frame`` with its index as the tag column, when it has no tag column and its index is named as one
    (``tag``, ``line_no`` ...) or is unnamed text; else ``frame`` unchanged."""
    import pandas as pd

    if any(parse_header(_header_text(c)).field == "tag" for c in frame.columns) or isinstance(frame.index, pd.MultiIndex):
        return frame, False
    name = frame.index.name
    if name is not None:
        if parse_header(str(name)).field != "tag":
            return frame, False
    elif isinstance(frame.index, pd.RangeIndex) or not all(isinstance(v, str) for v in frame.index):
        return frame, False
    tags = [_text(v) for v in frame.index]
    frame = frame.copy()
    frame.insert(0, "tag" if name is None else str(name), tags)
    return frame.reset_index(drop=True), True


def _header_text(column: object) -> str:
    """Header text of a column: "flow [t/h]" from a ("flow", "t/h") pair of a two-level header."""
    if isinstance(column, tuple):
        name, unit = (_blank(str(column[0])), _blank(str(column[1]))) if len(column) == 2 else (str(column), "")
        return _with_unit(name, unit)
    return _blank(str(column))


def _blank(text: str) -> str:
    return "" if _UNNAMED.match(text.strip()) else text.strip()


def _with_unit(header: str, unit: str) -> str:
    if not unit or not header or "[" in header:
        return header
    return f"{header} [{unit}]"


def _looks_like_units(headers: list[str], records: list[list[object]]) -> bool:
    fields = [parse_header(h).field for h in headers]
    if not records or "flow" not in fields:
        return False
    flow = _text(records[0][fields.index("flow")])
    return bool(flow) and not re.match(r"\s*[+-]?(\d|\.\d)", flow)


def _line_list(headers: list[str], records: list[list[object]], source: str) -> tuple[LineList, list[int]]:
    """The line list, and the index in ``records`` of each of its rows (empty records are left out)."""
    parsed = [parse_header(h) for h in headers]
    fields = {h.field for h in parsed}
    ours = set(_RESULT_KEYS) <= {f.removeprefix(RESULT_PREFIX_SNAKE) for f in fields}  # a results frame read back
    skipped = [h.field.startswith(RESULT_PREFIX) or (ours and _is_result_column(h.field, fields)) for h in parsed]
    names = ["" if skip else h.field for h, skip in zip(parsed, skipped)]
    doubled = sorted({n for n in names if n and names.count(n) > 1})
    if doubled:
        raise InputError(f"column {doubled[0]!r} appears twice in {source}", field="header", value=doubled[0],
                         expected="each column once")
    check_header(names, headers, source)
    rows, kept = [], []
    for position, record in enumerate(records):
        cells = [_text(value) for value in record]
        if not any(cells):
            continue
        kept.append(position)
        row = {name: cell for name, cell in zip(names, cells) if name}
        row.update(surplus_cells([h if n else "" for h, n in zip(headers, names)],
                                 [c if not skip else "" for c, skip in zip(cells, skipped)]))
        rows.append(row)
    if not rows:
        raise InputError(f"{source} has a header but no lines", field="lines", value=source,
                         expected="one row per line case")
    units = {h.field: h.unit for h, name in zip(parsed, names) if name}
    return LineList(rows=rows, units=units, source=source, headers=[h for h, n in zip(headers, names) if n]), kept


def _is_result_column(field: str, fields: set[str]) -> bool:
    """A result column of a results frame read back; a key beside its ``result_`` form is the frame's own column."""
    if field.startswith(RESULT_PREFIX_SNAKE):
        return field.removeprefix(RESULT_PREFIX_SNAKE) in _RESULT_KEYS
    return field in _RESULT_KEYS and field not in COLUMNS and RESULT_PREFIX_SNAKE + field not in fields


def _text(value: object) -> str:
    """A cell as line-list text: "" for None/NaN/NA, exact text for numbers, pint Quantities with their unit."""
    if value is None:
        return ""
    if isinstance(value, str):
        return restore(value.strip()).strip()
    if hasattr(value, "magnitude") and hasattr(value, "units"):
        from boresize.io.values import quantity_text

        return quantity_text(value, "cell")
    if isinstance(value, bool):
        return str(value)
    if isinstance(value, numbers.Integral):
        return str(int(value))
    if isinstance(value, numbers.Real):  # 9.0 from a column pandas made float (9, 6.5) reads back as "9"
        number = float(value)
        if math.isnan(number):
            return ""
        return str(int(number)) if number.is_integer() and abs(number) < 1e15 else repr(number)
    return "" if _is_missing(value) else str(value).strip()


def _is_missing(value: object) -> bool:
    import pandas as pd

    try:
        return bool(pd.isna(value))
    except (TypeError, ValueError):  # an array-like cell: not missing, shown as text
        return False


def lines_dataframe(line_list: LineList) -> pd.DataFrame:
    """A line list (e.g. from :func:`boresize.io.read_csv`) as a DataFrame of text cells, headers as written."""
    import pandas as pd

    fields = [parse_header(h).field for h in line_list.headers]
    return pd.DataFrame([[row.get(f, "") for f in fields] for row in line_list.rows], columns=list(line_list.headers))


def result_columns(input_headers: Sequence[str]) -> list[str]:
    """The names of the result columns beside ``input_headers``: the JSON keys (module docstring), each with a
    ``result_`` prefix where it is a line-list column's name (``result_nps``, ``result_schedule``,
    ``result_service``, ``result_phase``, whether or not the frame has that column) or an input column's."""
    taken = set(COLUMNS) | {parse_header(h).field for h in input_headers} | {str(h).strip() for h in input_headers}
    return [RESULT_PREFIX_SNAKE + key if key in taken else key for key in _RESULT_KEYS]


def results_dataframe(results: Sequence[LineResult], headers: Sequence[str] | None = None) -> pd.DataFrame:
    """Results as a frame: one row per input row (a line's operating cases one each, in the order of the results),
    the input columns, then the result columns of :func:`result_columns`.

    :param headers: the input headers as written (default: the fields the results' rows hold)
    """
    import pandas as pd

    from boresize.io.sheet_rows import result_rows

    head, rows = result_rows(results, headers)
    shown = head[:len(head) - len(_RESULT_KEYS)]
    return pd.DataFrame(rows, columns=shown + result_columns(shown))


def size_frame_rows(frame: pd.DataFrame, units_row: bool | None) -> tuple[LineList, list[int], bool]:
    """For :func:`boresize.api.size_dataframe`: the line list, each row's position in ``frame``, and whether the
    tags came from the index."""
    return _read(frame, units_row, "<DataFrame>")


def in_input_order(table: pd.DataFrame, results: Sequence[LineResult], line_list: LineList, positions: list[int],
                   frame: pd.DataFrame, from_index: bool) -> pd.DataFrame:
    """``table`` (rows in the order of ``results``) in the input frame's row order, under its index labels; the tag
    column dropped when the tags came from the index (the index holds them)."""
    from boresize.io.sheet_rows import case_rows

    def cells(row: dict[str, str]) -> tuple[tuple[str, str], ...]:  # the marks a run adds ("(tag given before)") left out
        return tuple(sorted((k, v) for k, v in row.items() if not k.startswith("(")))

    waiting: dict[tuple[tuple[str, str], ...], list[int]] = {}
    for k, row in enumerate(line_list.rows):
        waiting.setdefault(cells(row), []).append(k)
    order: list[int | None] = []
    for line in results:
        for case in case_rows(line):
            queue = waiting.get(cells(case.raw))
            order.append(queue.pop(0) if queue else None)
    if len(order) != len(table) or None in order or len(order) != len(line_list.rows):
        return table  # a row the results do not give back as read: the results' order, a fresh index
    ranked = sorted(range(len(order)), key=lambda i: order[i])  # type: ignore[arg-type, return-value]
    out = table.iloc[ranked]
    out.index = frame.index[[positions[order[i]] for i in ranked]]  # type: ignore[index]
    if from_index:
        out = out.drop(columns=[c for c in out.columns[:1] if parse_header(str(c)).field == "tag"])
    return out
