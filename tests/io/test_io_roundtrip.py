"""Acceptance: the demo line list (3 cases on some lines) goes CSV -> XLSX -> results with nothing lost.

The CSV is read with Python's own ``csv`` module and the workbook with openpyxl, both outside boresize,
and every input cell is compared; then the workbook is read back as a line list and sized again.
"""

from __future__ import annotations

import csv
import json
from collections import Counter
from pathlib import Path

import openpyxl
import pytest

from boresize.api import size_rows
from boresize.sizing.engine import Sizer
from boresize.io import document, read_line_list
from boresize.io.xlsx import write_xlsx

DEMO = Path(__file__).resolve().parents[2] / "examples" / "demo-unit"


@pytest.fixture(scope="module")
def demo_sizer(host) -> Sizer:
    return Sizer(host, criteria_file=DEMO / "criteria.toml")


def _csv_cells() -> tuple[list[str], list[list[str]]]:
    with open(DEMO / "lines.csv", encoding="utf-8", newline="") as handle:
        rows = [row for row in csv.reader(handle) if any(cell.strip() for cell in row)]
    return rows[0], rows[1:]


def _text(value: object) -> str:
    """openpyxl's value as the text a line list holds (integral floats without '.0')."""
    if value is None:
        return ""
    if isinstance(value, float) and value.is_integer():
        return str(int(value))
    return str(value)


def test_demo_has_lines_with_three_or_more_cases():
    header, rows = _csv_cells()
    column = header.index("case")
    counts = Counter(row[0] for row in rows if row[column])
    assert sum(1 for n in counts.values() if n >= 3) >= 2


def test_demo_round_trips_csv_to_xlsx_to_results(tmp_path, demo_sizer):
    header, rows = _csv_cells()
    line_list = read_line_list(DEMO / "lines.csv")
    results = size_rows(line_list.pairs(), sizer=demo_sizer)
    book_path = tmp_path / "demo.xlsx"
    write_xlsx(book_path, results, line_list.headers)

    # every input cell, as openpyxl reads it, equals the CSV cell as Python's csv module reads it
    sheet = openpyxl.load_workbook(book_path)["lines"]
    written = [[_text(c.value) for c in row] for row in sheet.iter_rows()]
    assert written[0][:len(header)] == header
    assert [row[:len(header)] for row in written[1:]] == rows
    assert all(h.startswith("result.") for h in written[0][len(header):])

    # read back as a line list: same headers, units and cells; sizing it gives the same document
    again = read_line_list(book_path)
    assert again.headers == line_list.headers
    assert again.units == line_list.units
    assert again.rows == line_list.rows
    first = document(results, criteria_source="c", lines_source="l")
    second = document(size_rows(again.pairs(), sizer=demo_sizer), criteria_source="c", lines_source="l")
    assert json.dumps(second, sort_keys=True) == json.dumps(first, sort_keys=True)


def test_candidates_sheet_lists_every_rated_size_of_every_case(tmp_path, demo_sizer):
    line_list = read_line_list(DEMO / "lines.csv")
    results = size_rows(line_list.pairs(), sizer=demo_sizer)
    write_xlsx(tmp_path / "demo.xlsx", results, line_list.headers)
    sheet = openpyxl.load_workbook(tmp_path / "demo.xlsx")["candidates"]
    rows = list(sheet.iter_rows(values_only=True))
    expected = sum(len(case.candidates) for r in results for case in (r.cases or (r,)))
    assert len(rows) - 1 == expected
    selected = {(row[0], row[1] or "") for row in rows[1:] if row[11] == "yes"}
    cases = {(r.tag, case.line.case or "" if case.line else "") for r in results if r.selected
             for case in (r.cases or (r,))}
    assert selected == cases  # each case of each line marks the line's selected size once


def test_csv_output_keeps_input_columns_and_round_trips(tmp_path, demo_sizer):
    from boresize.io.csv_writer import write_csv

    header, rows = _csv_cells()
    line_list = read_line_list(DEMO / "lines.csv")
    write_csv(tmp_path / "out.csv", size_rows(line_list.pairs(), sizer=demo_sizer), line_list.headers)
    with open(tmp_path / "out.csv", encoding="utf-8-sig", newline="") as handle:
        out = list(csv.reader(handle))
    assert out[0][:len(header)] == header
    assert [row[:len(header)] for row in out[1:]] == rows
    assert read_line_list(tmp_path / "out.csv").rows == line_list.rows
