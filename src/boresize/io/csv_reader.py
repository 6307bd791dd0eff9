"""Reading a line list from CSV: headers with optional default units, one row per line case."""

from __future__ import annotations

import csv
import io
from dataclasses import dataclass, field
from pathlib import Path

from boresize.errors import InputError
from boresize.lines import parse_header

__all__ = ["LineList", "read_csv", "parse_csv_text"]


@dataclass
class LineList:
    """Rows as ``field -> cell text``, the default unit of each field, and where they came from."""

    rows: list[dict[str, str]]
    units: dict[str, str | None]
    source: str
    headers: list[str] = field(default_factory=list)

    def pairs(self) -> list[tuple[dict[str, str], dict[str, str | None]]]:
        return [(row, self.units) for row in self.rows]


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
    return parse_csv_text(text, str(path))


def parse_csv_text(text: str, source: str = "<text>") -> LineList:
    """Parse CSV text; blank rows are skipped, duplicate columns are an error naming them."""
    lines = [ln for ln in text.splitlines() if ln.strip() and not ln.lstrip().startswith("#")]
    if not lines:
        raise InputError(f"{source} holds no header row", field="lines", value=source,
                         expected="a header row such as tag,fluid,flow,pressure,temperature")
    dialect = _dialect(lines[0])
    reader = csv.reader(io.StringIO("\n".join(lines)), dialect)
    raw_headers = next(reader)
    headers = [parse_header(h) for h in raw_headers]
    names = [h.field for h in headers]
    duplicates = sorted({n for n in names if n and names.count(n) > 1})
    if duplicates:
        raise InputError(f"column {duplicates[0]!r} appears twice in {source}", field="header",
                         value=duplicates[0], expected="each column once")
    rows = []
    for cells in reader:
        if not any(c.strip() for c in cells):
            continue
        rows.append({name: cell.strip() for name, cell in zip(names, cells) if name})
    units = {h.field: h.unit for h in headers if h.field}
    return LineList(rows=rows, units=units, source=source, headers=raw_headers)


def _dialect(header: str) -> type[csv.Dialect]:
    counts = {sep: header.count(sep) for sep in (",", ";", "\t")}
    separator = max(counts, key=lambda sep: counts[sep])

    class Dialect(csv.excel):
        delimiter = separator

    return Dialect
