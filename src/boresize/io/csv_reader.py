"""Reading a line list from CSV: headers with optional default units, one row per line case.

Columns whose header starts with ``result.`` are boresize's own output (see :mod:`boresize.io.sheet_rows`)
and are skipped, so that a results file can be read back as a line list; cells that the writer
neutralised against formula injection (a leading apostrophe) are restored.
"""

from __future__ import annotations

import csv
import hashlib
import re
from collections.abc import Iterator
from dataclasses import dataclass, field
from pathlib import Path

from boresize.errors import InputError
from boresize.io.safety import restore
from boresize.io.rows import ALIASES, BEYOND_HEADER, COLUMNS, REQUIRED, UNBALANCED_QUOTE, Header, not_read, \
    parse_header

__all__ = ["RESULT_PREFIX", "LineList", "read_csv", "parse_csv_text", "file_digest", "check_header", "surplus_cells",
           "read_header", "make_line_list"]

#: Header prefix of the columns boresize adds to a line list; readers skip them.
RESULT_PREFIX = "result."


@dataclass
class LineList:
    """Rows as ``field -> cell text``, the default unit of each field, and where they came from.

    :param headers: the input column headers as written (``"length [m]"``), result columns left out
    :param digest: SHA-256 of the file read, for the traceability record
    :param row_units: per row, default units that row's own keys give (a TOML key ``"length (m)"``), over ``units``
    """

    rows: list[dict[str, str]]
    units: dict[str, str | None]
    source: str
    headers: list[str] = field(default_factory=list)
    digest: str | None = None
    row_units: list[dict[str, str]] = field(default_factory=list)

    def pairs(self) -> list[tuple[dict[str, str], dict[str, str | None]]]:
        if not self.row_units:
            return [(row, self.units) for row in self.rows]
        own = self.row_units + [{}] * (len(self.rows) - len(self.row_units))
        return [(row, {**self.units, **units} if units else self.units) for row, units in zip(self.rows, own)]


def read_csv(path: str | Path) -> LineList:
    """Read a CSV line list (UTF-8, with or without BOM; comma, semicolon or tab separated)."""
    try:
        text = Path(path).read_text(encoding="utf-8-sig")
    except OSError as exc:
        raise InputError(f"cannot read {path}: {exc.strerror}", field="lines", value=str(path),
                         expected="a readable CSV file") from exc
    except UnicodeDecodeError as exc:
        raise InputError(f"{path} is not UTF-8 text", field="lines", value=str(path),
                         expected="a CSV file saved as UTF-8") from exc
    line_list = parse_csv_text(text, str(path))
    line_list.digest = file_digest(path)
    return line_list


def file_digest(path: str | Path) -> str:
    """SHA-256 of a file's bytes, as hex."""
    return hashlib.sha256(Path(path).read_bytes()).hexdigest()


def parse_csv_text(text: str, source: str = "<text>") -> LineList:
    """Parse CSV text; blank rows and comment rows are skipped, duplicate columns are an error naming them.

    A comment row is one whose first cell starts with ``#`` and whose other cells are empty (before the header,
    any row whose first cell starts with ``#``): a tag such as ``#12-P-001`` with other cells is a line. A row
    opening a quote that its line does not close is an error row of its own and the rows after it are read as
    written, so that every data row is a line of the output.
    """
    text = text.removeprefix("\ufeff")  # a byte-order mark left by a reader that kept it
    lines = _PHYSICAL_LINE.findall(text)
    head = next((ln for ln in lines if ln.strip() and not ln.lstrip().startswith("#")), None)
    if head is None:
        raise InputError(f"{source} holds no header row", field="lines", value=source,
                         expected="a header row such as tag,fluid,flow,pressure,temperature")
    dialect = _dialect(head)
    raw_headers: list[str] | None = None
    names: list[str] = []
    headers: list[Header] = []
    rows = []
    for number, cells, quoted in _records(lines, dialect):
        if cells and cells[0] == TOO_LONG:
            length, column, cells = cells[1], cells[2], cells[3:]
            name = raw_headers[int(column)].strip() if raw_headers and column and int(column) < len(raw_headers) \
                else "row"
            fault = InputError(f"a cell of {length} characters on line {number} of {source} is over the limit of "
                               f"{_field_limit()} characters a cell may hold", field="header" if raw_headers is None
                               else parse_header(name).field if name != "row" else "row", value=f"{length} characters",
                               expected=f"a cell of at most {_field_limit()} characters")
            if raw_headers is None:
                raise fault
            rows.append({**{n: restore(c.strip()).strip() for n, c in zip(names, cells) if n}, **not_read(fault)})
            continue
        if not any(c.strip() for c in cells) or _comment(cells, before_header=raw_headers is None):
            continue
        if raw_headers is None:
            if quoted is not None:
                raise InputError(f"the quote opened in {quoted!r} on line {number} of {source} (its header) does "
                                 "not close on its line", field="header", value=quoted,
                                 expected="column names without quotes, or each quote closed in its cell")
            raw_headers = cells
            headers, names = read_header(raw_headers, source)
            continue
        row = {**{name: restore(cell.strip()).strip() for name, cell in zip(names, cells) if name},
               **surplus_cells(raw_headers, cells)}
        if quoted is not None:
            row = {**{k: v for k, v in row.items() if k != BEYOND_HEADER}, UNBALANCED_QUOTE: quoted}
        rows.append(row)
    if raw_headers is None:
        raise InputError(f"{source} holds no header row", field="lines", value=source,
                         expected="a header row such as tag,fluid,flow,pressure,temperature")
    if not rows:
        raise InputError(f"{source} has a header but no lines", field="lines", value=source,
                         expected="one row per line case below the header")
    return make_line_list(rows, headers, names, raw_headers, source)


#: One physical line with its ending: only CR, LF and CRLF end a line (a form feed or U+2028 in a cell does not).
_PHYSICAL_LINE = re.compile(r"[^\r\n]*(?:\r\n|\r|\n)|[^\r\n]+\Z")


def _comment(cells: list[str], before_header: bool) -> bool:
    """A comment row: its first cell starts with ``#`` and its other cells are empty; before the header, any row
    whose first cell starts with ``#`` (no line can come before the header)."""
    if not cells or not cells[0].lstrip().startswith("#"):
        return False
    return before_header or not any(c.strip() for c in cells[1:])


def _records(lines: list[str], dialect: type[csv.Dialect]) -> Iterator[tuple[int, list[str], str | None]]:
    """Each CSV record of ``lines``: (number of its first line, cells, the text from an unbalanced quote or None).

    A record whose quote runs past its line and does not close as a cell's quote (see :func:`_unbalanced`)
    opened a quote that its line does not close: that line alone is the record, and reading resumes on the
    next line.
    """
    start = 0
    while start < len(lines):
        reader = csv.reader(iter(lines[start:]), dialect)
        consumed = 0
        try:
            for cells in reader:
                first, end = start + consumed, start + reader.line_num
                consumed = reader.line_num
                if _unbalanced(lines[first:end], dialect, at_end=end == len(lines)):
                    alone = next(csv.reader([lines[first]], dialect), [""])
                    yield first + 1, alone, '"' + alone[-1].rstrip("\r\n") if alone else '"'
                    start = first + 1
                    break
                yield first + 1, cells, None
            else:
                return
        except csv.Error as exc:
            if "field limit" not in str(exc):
                raise
            first = start + consumed  # the record holding the cell over the limit: that line alone, as written
            yield first + 1, _unreadable(lines[first], dialect), None
            start = first + 1


#: The csv module's field limit (csv.field_size_limit(), 131072 characters unless a program changed it).
def _field_limit() -> int:
    return csv.field_size_limit()


def _unreadable(line: str, dialect: type[csv.Dialect]) -> list[str]:
    """A line holding a cell over the csv module's field limit, split at its separators up to its first quote (a
    quoted cell may hold separators), after :data:`TOO_LONG`, the longest cell's length and its column."""
    limit = _field_limit()
    quote = line.find('"')
    cells = line.rstrip("\r\n").split(dialect.delimiter) if quote < 0 else line[:quote].split(dialect.delimiter)[:-1]
    column = next((i for i, c in enumerate(cells) if len(c) > limit), None)
    longest = len(cells[column]) if column is not None else len(line.rstrip("\r\n")) - max(quote, 0)  # quote on
    return [TOO_LONG, str(longest), "" if column is None else str(column),
            *("" if len(c) > limit else c for c in cells)]


#: First cell of :func:`_unreadable`'s row (followed by the cell's length, its column or "", then the cells).
TOO_LONG = "\x00(cell over the field limit)"


def _unbalanced(record: list[str], dialect: type[csv.Dialect], at_end: bool) -> bool:
    """True when the record's opening quote does not close as a cell's quote should: read strictly, a record
    running past its first line fails where the swallowed rows' own quotes stand (``',' expected after '"'``) or
    at the end of the file; a one-line record only when its quote is still open at the end of the file. A quoted
    cell holding line breaks, closed by a quote before a separator, reads as one cell."""
    if len(record) < 2 and not at_end:
        return False

    class Strict(dialect):  # type: ignore[valid-type, misc]
        strict = True

    try:
        list(csv.reader(iter(record), Strict))
    except csv.Error as exc:
        return len(record) > 1 or "unexpected end of data" in str(exc)
    return False


def read_header(raw_headers: list[str], source: str) -> tuple[list[Header], list[str]]:
    """Parse a header row: each column's field and unit, and the field names read (result columns, headed
    ``result.``, as ""). A column given twice, a missing required column or a near-miss name is an error."""
    headers = [parse_header(h) for h in raw_headers]
    names = ["" if h.field.startswith(RESULT_PREFIX) else h.field for h in headers]
    duplicates = sorted({n for n in names if n and names.count(n) > 1})
    if duplicates:
        raise InputError(f"column {duplicates[0]!r} appears twice in {source}", field="header",
                         value=duplicates[0], expected="each column once")
    check_header(names, raw_headers, source)
    return headers, names


def make_line_list(rows: list[dict[str, str]], headers: list[Header], names: list[str], raw_headers: list[str],
                   source: str, digest: str | None = None) -> LineList:
    """The LineList of rows read under ``read_header``'s columns (result columns left out)."""
    units = {h.field: h.unit for h, name in zip(headers, names) if name}
    kept = [text for text, name in zip(raw_headers, names) if name]
    return LineList(rows=rows, units=units, source=source, headers=kept, digest=digest)


def _dialect(header: str) -> type[csv.Dialect]:
    counts = {sep: header.count(sep) for sep in (",", ";", "\t")}
    separator = max(counts, key=lambda sep: counts[sep])

    class Dialect(csv.excel):
        delimiter = separator

    return Dialect


def _holds_a_unit(text: str) -> bool:
    """Whether a bracketed part of a heading reads as a unit ("[m]", "(ft)"; not "(design)")."""
    from boresize.units.quantities import is_unit

    return any(group.strip() and is_unit(group) for group in re.findall(r"[\[(]([^\])]*)[\])]", text))


def check_header(names: list[str], raw_headers: list[str], source: str) -> None:
    """Refuse a header that is not one, lacks a required column, or misspells a column ("lenght"):
    a misspelt column would be ignored and its default used, a silently wrong answer.

    :param names: the field of each header (as :func:`~boresize.io.rows.parse_header` gives it)
    :raises InputError: field "header", naming the column and what was expected
    """
    shown = ", ".join(raw_headers)
    if not set(names) & set(COLUMNS):
        raise InputError(f"the first row of {source} ({shown}) names none of the columns", field="header",
                         value=shown, expected=f"a header row first, naming at least {', '.join(REQUIRED)}")
    for name, text in zip(names, raw_headers):
        stem = re.split(r"_?[\[(]", name, maxsplit=1)[0]
        if stem != name and ALIASES.get(stem, stem) in COLUMNS and _holds_a_unit(text):
            # "length [m] (ft)": no unit can be read from it; "Flow (design) notes" holds none, so it is an extra
            raise InputError(f"column {text.strip()!r} in {source} names {ALIASES.get(stem, stem)!r} with more than "
                             "one unit or a unit before other words", field="header", value=text.strip(),
                             expected=f"one unit in brackets or parentheses at the end, e.g. '{stem} [m]'")
        near = [c for c in (*COLUMNS, *ALIASES) if name and name not in COLUMNS and _near_miss(name, c)]
        if near:
            raise InputError(f"unknown column {text.strip()!r} in {source} (close to {near[0]!r})", field="header",
                             value=text.strip(), expected=f"{near[0]!r} if that is meant, or a name that is not a "
                             f"near-miss of a column ({', '.join(COLUMNS)})")
    missing = [c for c in REQUIRED if c not in names]
    if missing:
        raise InputError(f"the header of {source} has no column {', '.join(map(repr, missing))}", field="header",
                         value=shown, expected=f"the columns {', '.join(REQUIRED)} (the others are optional)")


def _near_miss(word: str, column: str) -> bool:
    """Within two edits (one for short words) of ``column``: insert, delete, change or swap two neighbours."""
    if len(word) < 3:
        return False
    a, b = word, column
    d = [[i + j if i * j == 0 else 0 for j in range(len(b) + 1)] for i in range(len(a) + 1)]
    for i in range(1, len(a) + 1):
        for j in range(1, len(b) + 1):
            d[i][j] = min(d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + (a[i - 1] != b[j - 1]))
            if i > 1 and j > 1 and a[i - 1] == b[j - 2] and a[i - 2] == b[j - 1]:
                d[i][j] = min(d[i][j], d[i - 2][j - 2] + 1)
    return d[-1][-1] <= (1 if len(word) < 5 else 2)


def surplus_cells(raw_headers: list[str], cells: list[str]) -> dict[str, str]:
    """The row's non-empty cells under no header (beyond the last column, or under a blank header cell), under
    :data:`~boresize.io.rows.BEYOND_HEADER`; empty cells, as spreadsheets export them, are not surplus."""
    heads = list(raw_headers) + [""] * max(0, len(cells) - len(raw_headers))
    surplus = [str(c).strip() for c, head in zip(cells, heads) if str(c).strip() and not str(head).strip()]
    return {BEYOND_HEADER: ", ".join(repr(cell) for cell in surplus)} if surplus else {}
