"""The look of the results workbook: number formats by quantity, fitted widths, filter, frozen headings,
pass/fail fills, the verdict columns (value, limit, status of each criterion) and the cover sheet.

Numbers in the cells keep the JSON document's rounding (6 significant figures, utilisation 4: the rule of
``io/document.py``); the number formats only choose how many decimals are shown. Pass and fail are told
apart by the status text itself and by a fill from a colour-blind-safe pair (Okabe-Ito blue and orange).
"""

from __future__ import annotations

import hashlib
from collections.abc import Mapping, Sequence
from pathlib import Path
from typing import Any

from boresize.io.csv_reader import RESULT_PREFIX
from boresize.io.document import verdict_to_dict
from boresize.io.safety import FORMULA_STARTS
from boresize.io.sheet_rows import case_rows
from boresize.model import LineResult

__all__ = ["CAUTION", "DOCUMENT_FIELDS", "NUMBER_FORMATS", "STATUS_FILLS", "number_format", "verdict_columns",
           "style_sheet", "write_cover", "put_document_block"]

CAUTION = ("boresize results are screening calculations. They must be checked by a competent engineer against "
           "the applicable codes and the company's standards before use; local codes govern.")

#: the document block's fields, in the order the cover sheet shows them
DOCUMENT_FIELDS = ("project", "unit", "number", "revision", "date", "prepared", "checked", "approved", "notes")

#: (words in a heading, number format), the first match wins: decimals chosen per quantity and unit
NUMBER_FORMATS: tuple[tuple[str, str], ...] = (
    ("utilisation", "0%"), ("reynolds", "#,##0"), ("friction factor", "0.0000"),
    ("velocity", "0.00"), ("[m/s]", "0.00"), ("inside diameter", "0.0"), ("[mm]", "0.0"),
    ("per length", "0.0"), ("[kpa/100 m]", "0.0"), ("drop [kpa]", "0.0"), ("[kpa]", "0.0"),
    ("[bar abs]", "0.000"), ("[bar", "0.000"), ("pressure", "0.000"), ("density", "0.00"), ("[kg/m3]", "0.00"),
    ("viscosity", "0.0000"), ("[mpa s]", "0.0000"), ("mach", "0.000"), ("[m]", "0.0"), ("[%]", "0.0"),
)

#: status text -> fill colour: Okabe-Ito blue (pass) and orange (fail), grey for an error or a warning
STATUS_FILLS = {"pass": "A6D1F0", "fail": "F5C57A", "error": "BFBFBF", "warn": "F5C57A"}


def number_format(heading: str) -> str | None:
    """The number format for a column of numbers under ``heading``, or None (left General)."""
    text = heading.lower()
    return next((fmt for words, fmt in NUMBER_FORMATS if words in text), None)


def _verdicts(case: LineResult) -> dict[str, Mapping[str, Any]]:
    """The selected size's verdicts as the record has them (its ``verdicts``), without building the whole record."""
    return {v.criterion: verdict_to_dict(v) for v in case.selected.verdicts} if case.selected else {}


def verdict_columns(results: Sequence[LineResult]) -> tuple[list[str], list[list[Any]]]:
    """For each criterion judged at a selected size: value, limit (beside it) and status columns, one row per
    input row as :func:`boresize.io.sheet_rows.result_rows` orders them. The unit is in the heading when the
    criterion has one unit throughout, else a unit column follows."""
    rows = [_verdicts(case) for line in results for case in case_rows(line)]
    names = list(dict.fromkeys(name for row in rows for name in row))
    head: list[str] = []
    columns: list[list[Any]] = [[] for _ in rows]
    for name in names:
        units = {str(row[name].get("unit") or "") for row in rows if name in row}
        one = units.pop() if len(units) == 1 else None
        suffix = f" [{one}]" if one else ""
        head += [f"{RESULT_PREFIX}{name} value{suffix}", f"{RESULT_PREFIX}{name} limit{suffix}",
                 f"{RESULT_PREFIX}{name} status"]
        if one is None:
            head.append(f"{RESULT_PREFIX}{name} unit")
        for cells, row in zip(columns, rows):
            v = row.get(name) or {}
            cells += [v.get("value"), v.get("limit"), v.get("status")]
            if one is None:
                cells.append(v.get("unit"))
    return head, columns


def _shown(value: Any, fmt: str | None) -> int:
    """About how many characters a cell shows."""
    if value is None:
        return 0
    if isinstance(value, (int, float)) and not isinstance(value, bool) and fmt:
        decimals = len(fmt.split(".")[1].rstrip("%")) if "." in fmt else 0
        return len(f"{value:,.{decimals}f}") + (1 if "%" in fmt else 0)
    return max((len(part) for part in str(value).splitlines()), default=0)


def style_sheet(sheet: Any, head: Sequence[str], *, widest: int = 60, formatted: str = "") -> None:
    """Number formats by heading (only the columns whose heading starts with ``formatted``: the input cells stay
    as given), pass/fail fills on status columns (``passes`` yes/no too), fitted widths (never narrower than
    the heading), a filter over the table and the heading row frozen with the first column."""
    from openpyxl.styles import Alignment, PatternFill
    from openpyxl.utils import get_column_letter

    fills = {status: PatternFill("solid", start_color=colour, end_color=colour)
             for status, colour in STATUS_FILLS.items()}
    for column, heading in enumerate(head, start=1):
        fmt = number_format(heading) if heading.startswith(formatted) else None
        is_status = heading.lower().endswith("status")
        if heading == "passes":
            is_status, fills["yes"], fills["no"] = True, fills["pass"], fills["fail"]
        width = 0
        for (cell,) in sheet.iter_rows(min_row=2, min_col=column, max_col=column):
            if fmt and isinstance(cell.value, (int, float)) and not isinstance(cell.value, bool):
                cell.number_format = fmt
            if is_status and cell.value in fills:
                cell.fill = fills[cell.value]
            width = max(width, _shown(cell.value, fmt))
        letter = get_column_letter(column)
        sheet.column_dimensions[letter].width = max(len(heading) + 3, min(width + 2, widest))
        sheet.cell(row=1, column=column).alignment = Alignment(vertical="top")
    if head:
        sheet.auto_filter.ref = f"A1:{get_column_letter(len(head))}{max(sheet.max_row, 1)}"
    sheet.freeze_panes = "B2"


def _sha256(path: str) -> str:
    """The SHA-256 of the criteria file, or why there is none (built-in criteria, a file no longer there)."""
    if not path or path.startswith("(") or path == "built-in":
        return "(none: built-in criteria)"
    try:
        return hashlib.sha256(Path(path).read_bytes()).hexdigest()
    except OSError as exc:
        return f"(not read: {type(exc).__name__})"


def _counts(results: Sequence[LineResult]) -> str:
    counted = {status: sum(1 for r in results if r.status == status) for status in ("pass", "fail", "error")}
    return (f"{len(results)} line{'' if len(results) == 1 else 's'} sized: {counted['pass']} pass, {counted['fail']} fail, "
            f"{counted['error']} error")


def _text(sheet: Any, row: int, column: int, value: Any) -> None:
    """A text cell, never a formula (formula-like text quote-prefixed)."""
    if value in (None, ""):
        return
    cell = sheet.cell(row=row, column=column)
    cell.value = str(value)
    cell.data_type = "s"
    if str(value).startswith(FORMULA_STARTS):
        cell.quotePrefix = True


def put_document_block(sheet: Any, document: Mapping[str, Any] | None, row: int) -> int:
    """The document block (project, unit, number, revision, date, prepared, checked, approved, notes) on the
    cover sheet from ``row``; returns the next free row. None or an empty mapping writes a blank block, one row
    a field, to fill in by hand. This is the hook the ``--document`` option of the record fills."""
    from openpyxl.styles import Font

    given = dict(document or {})
    sheet.cell(row=row, column=1, value="Document").font = Font(bold=True)
    for offset, name in enumerate(DOCUMENT_FIELDS, start=1):
        sheet.cell(row=row + offset, column=1, value=name)
        _text(sheet, row + offset, 2, given.get(name))
    return row + len(DOCUMENT_FIELDS) + 2


def write_cover(book: Any, results: Sequence[LineResult], trace: Mapping[str, Any] | None,
                document: Mapping[str, Any] | None = None) -> Any:
    """The cover sheet, first in the book: title, the screening caution, the document block and traceability
    (tool version, run date, criteria file and its SHA-256, criteria set versions, the line list's file name
    without its folder, counts)."""
    from openpyxl.styles import Alignment, Font

    sheet = book.create_sheet("cover", 0)
    trace = trace or {}
    sheet.cell(row=1, column=1, value="boresize line sizing: results workbook").font = Font(bold=True, size=14)
    caution = sheet.cell(row=2, column=1, value=f"CAUTION: {CAUTION}")
    caution.font = Font(bold=True)
    caution.alignment = Alignment(wrap_text=True, vertical="top")
    sheet.merge_cells("A2:B2")
    sheet.row_dimensions[2].height = 48
    row = put_document_block(sheet, document, 4)
    sheet.cell(row=row, column=1, value="Traceability").font = Font(bold=True)
    criteria = str(trace.get("criteria_source") or "")
    services = trace.get("services") or {}
    lines_source = str(trace.get("lines_source") or "")
    facts = [
        ("tool", f"boresize {trace.get('boresize_version', '')}".strip()),
        ("run date (UTC)", trace.get("date")),
        ("criteria file", Path(criteria).name if criteria not in ("", "built-in") else "built-in criteria"),
        ("criteria file SHA-256", _sha256(criteria)),
        ("criteria set versions", trace.get("criteria_set")),
        *((f"service {name}", stamp) for name, stamp in services.items()),
        ("line list", Path(lines_source).name if lines_source else ""),
        ("line list SHA-256", trace.get("lines_sha256")),
        ("lines", _counts(results)),
        ("python", trace.get("python")),
        *((f"library {name}", version) for name, version in (trace.get("libraries") or {}).items()),
    ]
    for offset, (name, value) in enumerate(facts, start=1):
        sheet.cell(row=row + offset, column=1, value=name)
        _text(sheet, row + offset, 2, value)
    sheet.column_dimensions["A"].width = 26
    sheet.column_dimensions["B"].width = 90
    return sheet
