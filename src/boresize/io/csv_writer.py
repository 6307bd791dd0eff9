"""Writing results as CSV: the input columns as given, then the result columns (see :mod:`boresize.io.sheet_rows`).

Text that a spreadsheet would run as a formula is neutralised (:mod:`boresize.io.safety`); numbers
are written as numbers. UTF-8 with a byte-order mark, so that spreadsheet programs read the units'
characters right.
"""

from __future__ import annotations

import csv
from collections.abc import Sequence
from pathlib import Path
from typing import Any

from boresize.io.safety import neutralise
from boresize.io.sheet_rows import candidate_rows, result_rows
from boresize.model import LineResult

__all__ = ["write_csv", "csv_cell"]


def csv_cell(value: Any) -> str:
    """One cell's text: empty for None, numbers as Python writes them, text neutralised."""
    if value is None:
        return ""
    if isinstance(value, bool):
        return "yes" if value else "no"
    if isinstance(value, (int, float)):
        return repr(value) if isinstance(value, float) else str(value)
    return neutralise(str(value))


def write_csv(path: str | Path, results: Sequence[LineResult], headers: Sequence[str] | None = None,
              candidates: bool = False) -> None:
    """Write one row per input row (``candidates=True``: one row per rated candidate instead)."""
    head, rows = candidate_rows(results) if candidates else result_rows(results, headers)
    with open(path, "w", encoding="utf-8-sig", newline="") as handle:
        writer = csv.writer(handle)
        writer.writerow([csv_cell(h) for h in head])
        for row in rows:
            writer.writerow([csv_cell(v) for v in row])
