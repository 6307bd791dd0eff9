"""Line lists and results as XLSX workbooks (openpyxl).

Reading: the sheet named ``lines`` if there is one, else the first sheet; the first non-empty row
holds the headers (as in CSV, with optional default units in brackets). Numbers become text as
Python writes them (an integral value without ``.0``); a formula cell gives its saved value.

Writing: sheet ``cover`` the screening caution, the document block and traceability; sheet ``lines`` the
input columns as given, the result columns, and each criterion's value, limit and status at the selected
size; sheet ``candidates`` every rated candidate (numbers to the JSON document's 6 significant figures). The
look (number formats, widths, filter, fills, cover) is in :mod:`boresize.io.xlsx_sheet`. Text that a spreadsheet would run as a formula is stored as
text with the quote-prefix style, never as a formula (:mod:`boresize.io.safety`).
"""

from __future__ import annotations

import datetime
import zipfile
from collections.abc import Mapping, Sequence
from pathlib import Path
from typing import Any

from boresize.errors import InputError
from boresize.io.csv_reader import RESULT_PREFIX, LineList, file_digest, make_line_list, read_header, surplus_cells
from boresize.io.rows import BEYOND_HEADER
from boresize.io.document import _r6
from boresize.io.safety import FORMULA_STARTS, as_number, restore
from boresize.io.sheet_rows import candidate_rows, result_rows
from boresize.model import LineResult

__all__ = ["read_xlsx", "write_xlsx", "cell_text"]


def cell_text(value: Any) -> str:
    """A cell's value as line-list text: ``25.0`` -> ``"25"``, ``0.1`` -> ``"0.1"``, None -> ``""``."""
    if value is None:
        return ""
    if isinstance(value, bool):
        return str(value).lower()
    if isinstance(value, float):
        return str(int(value)) if value.is_integer() and abs(value) < 1e15 else repr(value)
    if isinstance(value, (datetime.date, datetime.time)):
        return value.isoformat()
    return restore(str(value).strip()).strip()


def _open(path: str | Path, data_only: bool) -> Any:
    from boresize.optional import needs

    with needs("reading a .xlsx line list"):
        from openpyxl import load_workbook
        from openpyxl.utils.exceptions import InvalidFileException

    try:
        return load_workbook(path, read_only=True, data_only=data_only)
    except (OSError, ValueError, KeyError, zipfile.BadZipFile, InvalidFileException) as exc:
        raise InputError(f"cannot read {path} as an XLSX workbook ({type(exc).__name__}: {exc})", field="lines",
                         value=str(path), expected="an .xlsx file saved by a spreadsheet program") from exc


def _line_sheet(book: Any) -> Any:
    """The sheet named ``lines``, else the first; its cells read as stored, not up to its declared dimension."""
    sheet = book["lines"] if "lines" in book.sheetnames else book.worksheets[0]
    if hasattr(sheet, "reset_dimensions"):
        # A stray cell at XFD1048576 declares 2**20 rows by 2**14 columns: read only the cells the file holds.
        sheet.reset_dimensions()
    return sheet


def _present(row: Sequence[Any]) -> list[Any]:
    """A row's cells up to its last cell holding a value (trailing formatted but empty cells left off)."""
    end = len(row)
    while end and getattr(row[end - 1], "value", None) is None:
        end -= 1
    return list(row[:end])


def _sheet_rows(path: str | Path) -> list[tuple[int, list[Any]]]:
    """The cells of the line sheet that hold values, row by row (rows without a value left off); formula cells
    replaced by their saved values. Memory and time follow the cells present, not the sheet's dimension."""
    book = _open(path, data_only=False)
    kept: dict[int, list[Any]] = {}
    for number, row in enumerate(_line_sheet(book).iter_rows(), start=1):
        cells = _present(row) if row else []
        if cells:
            kept[number] = cells
    book.close()
    formulas = {(r, c) for r, row in kept.items() for c, cell in enumerate(row) if cell.data_type == "f"}
    values = {r: [cell.value for cell in row] for r, row in kept.items()}
    if formulas:
        rows_with_formulas = {r for r, _ in formulas}
        saved = _open(path, data_only=True)
        cached: dict[int, tuple[Any, ...]] = {}
        for number, row in enumerate(_line_sheet(saved).iter_rows(values_only=True), start=1):
            if number in rows_with_formulas:
                cached[number] = tuple(row)
            if number >= max(rows_with_formulas):
                break
        saved.close()
        for r, c in sorted(formulas):
            value = cached.get(r, ())[c] if c < len(cached.get(r, ())) else None
            if value is None:
                name = kept[r][c].coordinate
                raise InputError(f"cell {name} holds a formula without a saved value", field="lines", value=name,
                                 expected="a workbook saved by a spreadsheet program, or the value typed in")
            values[r][c] = value
    return [(r, values[r]) for r in sorted(values)]


def _surplus(raw_headers: list[str], number: int, row: list[str]) -> dict[str, str]:
    """The row's cells under no header, each with its cell name (``'x' in XFD1048576``)."""
    from openpyxl.utils import get_column_letter

    if not surplus_cells(raw_headers, row):
        return {}
    heads = raw_headers + [""] * max(0, len(row) - len(raw_headers))
    shown = [f"{cell!r} in {get_column_letter(c + 1)}{number}" for c, (cell, head) in enumerate(zip(row, heads))
             if cell and not head.strip()]
    return {BEYOND_HEADER: ", ".join(shown)}


def read_xlsx(path: str | Path) -> LineList:
    """Read an XLSX line list (result columns, headed ``result.``, are skipped)."""
    rows = [(number, [cell_text(v) for v in row]) for number, row in _sheet_rows(path)]
    rows = [(number, row) for number, row in rows if any(row)]
    if not rows:
        raise InputError(f"{path} holds no header row", field="lines", value=str(path),
                         expected="a header row such as tag,fluid,flow,pressure,temperature")
    raw_headers = rows[0][1]
    headers, names = read_header(raw_headers, str(path))
    width = len(raw_headers)
    data = [{**{name: cell for name, cell in zip(names, row + [""] * (width - len(row))) if name},
             **_surplus(raw_headers, number, row)} for number, row in rows[1:]]
    return make_line_list(data, headers, names, raw_headers, str(path), file_digest(path))


def _put(sheet: Any, row: int, column: int, value: Any, text_cells: bool = True) -> None:
    """One cell: numbers as numbers; text as text (formula-like text quote-prefixed, never a formula)."""
    if value is None or value == "":
        return
    cell = sheet.cell(row=row, column=column)
    if isinstance(value, str):
        number = as_number(value) if text_cells else None
        if number is not None:
            cell.value = number
            return
        cell.value = value
        cell.data_type = "s"
        if value.startswith(FORMULA_STARTS):
            cell.quotePrefix = True
        return
    cell.value = value


def _fill(sheet: Any, head: Sequence[str], rows: Sequence[Sequence[Any]], formatted: str = "") -> None:
    from openpyxl.styles import Font

    from boresize.io.xlsx_sheet import style_sheet

    for column, text in enumerate(head, start=1):
        _put(sheet, 1, column, text, text_cells=False)
        sheet.cell(row=1, column=column).font = Font(bold=True)
    for r, row in enumerate(rows, start=2):
        for column, value in enumerate(row, start=1):
            _put(sheet, r, column, value)
    style_sheet(sheet, head, formatted=formatted)


def _rounded(rows: Sequence[Sequence[Any]]) -> list[list[Any]]:
    """Floats to 6 significant figures, as the JSON document has them (``io/document.py``)."""
    return [[_r6(v) if isinstance(v, float) else v for v in row] for row in rows]


def write_xlsx(path: str | Path, results: Sequence[LineResult], headers: Sequence[str] | None = None, *,
               trace: Mapping[str, Any] | None = None, document: Mapping[str, Any] | None = None) -> None:
    """Write sheets ``cover`` (caution, document block, traceability ``trace`` as
    :meth:`~boresize.report.trace.Traceability.to_dict` gives it), ``lines`` (input columns, then results and
    verdicts) and ``candidates``. ``document``: the document block (project, unit, number, revision, date,
    prepared, checked, approved, notes), left blank when None."""
    from boresize.optional import needs

    with needs(f"the .xlsx workbook {path}"):
        from openpyxl import Workbook

    from boresize.io.xlsx_sheet import verdict_columns, write_cover

    book = Workbook()
    lines = book.active
    lines.title = "lines"
    head, rows = result_rows(results, headers)
    extra_head, extra = verdict_columns(results)
    _fill(lines, head + extra_head, [row + more for row, more in zip(rows, extra)], formatted=RESULT_PREFIX)
    candidates_head, candidates = candidate_rows(results)
    _fill(book.create_sheet("candidates"), candidates_head, _rounded(candidates))
    write_cover(book, results, trace, document)
    book.active = 0
    book.save(path)
