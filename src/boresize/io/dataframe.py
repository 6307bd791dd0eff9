"""pandas: a DataFrame of streams in (one row per line case), a DataFrame of results out.

The frame in has the columns of a CSV line list. A cell may carry its unit (``"65 t/h"``) or be a
plain number whose unit the column gives: in the header (``"flow [t/h]"``), in a second header level
(``pd.read_csv(..., header=[0, 1])``), or in a first row of units (tag and fluid empty, ``t/h`` under
flow). Cells may also be pint Quantities. Empty cells (None, NaN) are empty.

The frame out has the rows and columns of the CSV results file (:mod:`boresize.io.sheet_rows`): the input
columns as given, then ``result.*`` columns. Read back with :func:`read_dataframe` the result columns
are skipped, as the CSV reader skips them, so a frame goes out and in like a CSV file.
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
from boresize.io.rows import parse_header
from boresize.model import LineResult

if TYPE_CHECKING:
    import pandas as pd

__all__ = ["lines_dataframe", "read_dataframe", "results_dataframe"]

_UNNAMED = re.compile(r"^Unnamed: \d+(_level_\d+)?$")  # what pandas names a blank header cell


def read_dataframe(frame: pd.DataFrame, *, units_row: bool | None = None, source: str = "<DataFrame>") -> LineList:
    """A line list from a DataFrame (see the module docstring for where units may be given).

    :param units_row: True when the first row holds units, False when it is a line; None tells by its
        flow cell (a units row has text that does not start with a number there)
    :raises InputError: field "header" for a missing, doubled or misspelt column; field "lines" for a
        frame without lines
    """
    headers = [_header_text(column) for column in frame.columns]
    records = [list(row) for row in frame.itertuples(index=False, name=None)]
    if units_row is None:
        units_row = _looks_like_units(headers, records)
    if units_row and records:
        headers = [_with_unit(head, _text(unit)) for head, unit in zip(headers, records[0])]
        records = records[1:]
    return _line_list(headers, records, source)


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


def _line_list(headers: list[str], records: list[list[object]], source: str) -> LineList:
    parsed = [parse_header(h) for h in headers]
    names = ["" if h.field.startswith(RESULT_PREFIX) else h.field for h in parsed]
    doubled = sorted({n for n in names if n and names.count(n) > 1})
    if doubled:
        raise InputError(f"column {doubled[0]!r} appears twice in {source}", field="header", value=doubled[0],
                         expected="each column once")
    check_header(names, headers, source)
    rows = []
    for record in records:
        cells = [_text(value) for value in record]
        if not any(cells):
            continue
        row = {name: cell for name, cell in zip(names, cells) if name}
        row.update(surplus_cells([h if n else "" for h, n in zip(headers, names)],
                                 [c if not h.field.startswith(RESULT_PREFIX) else "" for c, h in zip(cells, parsed)]))
        rows.append(row)
    if not rows:
        raise InputError(f"{source} has a header but no lines", field="lines", value=source,
                         expected="one row per line case")
    units = {h.field: h.unit for h, name in zip(parsed, names) if name}
    return LineList(rows=rows, units=units, source=source, headers=[h for h, n in zip(headers, names) if n])


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


def results_dataframe(results: Sequence[LineResult], headers: Sequence[str] | None = None) -> pd.DataFrame:
    """Results as the CSV results file lays them out: input columns, then ``result.*`` columns.

    :param headers: the input headers as written (default: the fields the results' rows hold)
    """
    import pandas as pd

    from boresize.io.sheet_rows import result_rows

    head, rows = result_rows(results, headers)
    return pd.DataFrame(rows, columns=head)
