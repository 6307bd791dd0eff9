"""The results workbook a person can use (issue 17): fitted widths, number formats by quantity, a filter, frozen
headings, pass/fail fills, a limit beside each verdict value, rounded candidates and a cover sheet.

The numbers checked are the workbook's own against the JSON document of the same run (written by the same
``size`` command); the SHA-256 of the criteria file is checked against hashlib.
"""

from __future__ import annotations

import hashlib
import json
from pathlib import Path

import openpyxl
import pytest

from boresize.cli import main
from boresize.io.xlsx import write_xlsx
from boresize.io.xlsx_sheet import CAUTION, DOCUMENT_FIELDS, STATUS_FILLS

DEMO = Path(__file__).resolve().parents[2] / "examples" / "demo-unit"


@pytest.fixture(scope="module")
def book(tmp_path_factory) -> tuple[openpyxl.Workbook, dict]:
    folder = tmp_path_factory.mktemp("book")
    code = main(["size", str(DEMO / "lines.csv"), "--criteria", str(DEMO / "criteria.toml"), "--no-plugins",
                 "-o", str(folder / "r.xlsx"), "-o", str(folder / "r.json")])
    assert code == 1  # the demo has one failing line (140-FO-050), which the fills must show
    return openpyxl.load_workbook(folder / "r.xlsx"), json.loads((folder / "r.json").read_text())


def _column(sheet, heading: str) -> list:
    head = [c.value for c in sheet[1]]
    return [row[head.index(heading)] for row in sheet.iter_rows(min_row=2)]


def test_sheets_cover_first_lines_and_candidates(book):
    assert book[0].sheetnames == ["cover", "lines", "candidates"]


@pytest.mark.parametrize("name", ["lines", "candidates"])
def test_widths_fit_the_headings_filter_and_frozen_heading_row(book, name):
    sheet = book[0][name]
    for cell in sheet[1]:
        assert sheet.column_dimensions[cell.column_letter].width > len(cell.value), cell.value
    assert sheet.auto_filter.ref == f"A1:{sheet[1][-1].column_letter}{sheet.max_row}"
    assert sheet.freeze_panes == "B2"


@pytest.mark.parametrize(("heading", "fmt"), [
    ("result.velocity [m/s]", "0.00"), ("result.outlet pressure [bar abs]", "0.000"),
    ("result.drop per length [kPa/100 m]", "0.0"), ("result.total drop [kPa]", "0.0"),
    ("result.utilisation", "0%"), ("result.inside diameter [mm]", "0.0"),
])
def test_result_numbers_carry_a_format_by_quantity(book, heading, fmt):
    cells = [c for c in _column(book[0]["lines"], heading) if isinstance(c.value, float)]
    assert cells and {c.number_format for c in cells} == {fmt}


def test_input_cells_keep_the_general_format(book):
    assert {c.number_format for c in _column(book[0]["lines"], "length [m]")} == {"General"}


def test_a_limit_column_beside_each_verdict_value(book):
    sheet, doc = book
    head = [c.value for c in sheet["lines"][1]]
    values = [h for h in head if h.startswith("result.") and " value" in h]
    assert "result.drop-per-length value [kPa/100 m]" in values
    for h in values:
        assert head[head.index(h) + 1] == h.replace(" value", " limit")
    limits = [c.value for c in _column(sheet["lines"], "result.drop-per-length limit [kPa/100 m]")]
    first = doc["lines"][0]
    assert limits[0] == next(v["limit"] for v in first["verdicts"] if v["criterion"] == "drop-per-length")


def test_pass_and_fail_are_filled_and_written(book):
    sheet = book[0]["lines"]
    for cell in _column(sheet, "result.status"):
        assert cell.value in ("pass", "fail")
        assert cell.fill.start_color.rgb.endswith(STATUS_FILLS[cell.value])
    failing = [c for c in _column(sheet, "result.drop-per-length status") if c.value == "fail"]
    assert failing and all(c.fill.start_color.rgb.endswith(STATUS_FILLS["fail"]) for c in failing)
    assert STATUS_FILLS["pass"] != STATUS_FILLS["fail"]


def test_candidates_are_rounded_as_the_json_document(book):
    sheet, doc = book
    velocities = [c.value for c in _column(sheet["candidates"], "velocity [m/s]")]
    assert all(v == float(f"{v:.6g}") for v in velocities)
    first = doc["lines"][0]["candidates"]
    assert velocities[:len(first)] == [c["velocity_m_s"] for c in first]
    assert {c.number_format for c in _column(sheet["candidates"], "velocity [m/s]")} == {"0.00"}


def test_cover_sheet_traceability_and_caution(book):
    sheet, doc = book
    cover = {row[0].value: row[1].value for row in sheet["cover"].iter_rows(min_row=3) if row[0].value}
    trace = doc["traceability"]
    assert sheet["cover"]["A2"].value == f"CAUTION: {CAUTION}"
    assert "competent engineer" in CAUTION and "local codes govern" in CAUTION
    assert cover["tool"] == f"boresize {trace['boresize_version']}"
    assert cover["run date (UTC)"] == trace["date"]
    assert cover["criteria file"] == "criteria.toml"
    assert cover["criteria file SHA-256"] == hashlib.sha256((DEMO / "criteria.toml").read_bytes()).hexdigest()
    assert cover["criteria set versions"] == trace["criteria_set"]
    assert cover["line list"] == "lines.csv"  # the name alone, never the local folder
    assert all(str(DEMO) not in str(v) for v in cover.values())
    assert cover["lines"] == "10 lines sized: 9 pass, 1 fail, 0 error"
    assert all(name in cover for name in DOCUMENT_FIELDS)


def test_document_block_hook_fills_the_cover(tmp_path, book):
    block = {"project": "Demo unit", "number": "CALC-140-001", "revision": "B", "prepared": "=cmd", "notes": None}
    path = tmp_path / "d.xlsx"
    write_xlsx(path, [], None, trace={}, document=block)
    cover = openpyxl.load_workbook(path)["cover"]
    cells = {row[0].value: row[1] for row in cover.iter_rows(min_row=3) if row[0].value}
    assert cells["project"].value == "Demo unit" and cells["revision"].value == "B"
    assert cells["prepared"].value == "=cmd" and cells["prepared"].data_type == "s"  # text, never a formula
    assert cells["notes"].value is None and cells["lines"].value == "0 lines sized: 0 pass, 0 fail, 0 error"


def test_built_in_criteria_have_no_file_to_hash(tmp_path):
    path = tmp_path / "b.xlsx"
    write_xlsx(path, [], None, trace={"criteria_source": "built-in", "lines_source": "/home/me/secret/l.csv"})
    cells = {row[0].value: row[1].value for row in openpyxl.load_workbook(path)["cover"].iter_rows(min_row=3)}
    assert cells["criteria file"] == "built-in criteria"
    assert cells["criteria file SHA-256"] == "(none: built-in criteria)"
    assert cells["line list"] == "l.csv"
