"""Readers bounded by what a file holds, and a clear message for each input past a limit (issue 14).

The limits are Python's and the file formats': the csv module's field limit (``csv.field_size_limit()``,
131072 characters by default, Python documentation of :mod:`csv`), the last cell of an XLSX sheet
(XFD1048576: 16,384 columns by 1,048,576 rows, ECMA-376 / the spreadsheet program's specification limits),
and the recursion of :mod:`tomllib` on deeply nested arrays.
"""

from __future__ import annotations

import time
from pathlib import Path

from openpyxl import Workbook
from openpyxl.styles import Font

from boresize.io.xlsx import read_xlsx

LINE = ["water", "20 t/h", "5 barg", "20 degC"]


def _stray_workbook(path: Path, value: object) -> None:
    book = Workbook()
    sheet = book.active
    sheet.title = "lines"
    for row in (["tag", "fluid", "flow", "pressure", "temperature"], ["A-1", *LINE], ["A-2", *LINE]):
        sheet.append(row)
    sheet["XFD1048576"].value = value
    sheet["XFD1048576"].font = Font(bold=True)
    book.save(path)


def test_an_xlsx_with_a_stray_cell_at_the_last_cell_is_read_fast(tmp_path: Path) -> None:
    path = tmp_path / "stray.xlsx"
    _stray_workbook(path, None)  # formatted, no value: the sheet's dimension says A1:XFD1048576
    assert path.stat().st_size < 10_000
    start = time.perf_counter()
    lines = read_xlsx(path)
    assert time.perf_counter() - start < 10  # rows x columns would be 1.7e10 cells: never allocated
    assert [row["tag"] for row in lines.rows] == ["A-1", "A-2"]


def test_a_stray_value_at_the_last_cell_is_a_row_error_naming_the_cell(tmp_path: Path) -> None:
    path = tmp_path / "stray.xlsx"
    _stray_workbook(path, "x")
    rows = read_xlsx(path).rows
    assert [row["tag"] for row in rows] == ["A-1", "A-2", ""]
    assert rows[2]["(beyond the header)"] == "'x' in XFD1048576"
