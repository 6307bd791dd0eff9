"""Output safety: text a spreadsheet would run as a formula is neutralised in CSV and XLSX.

Rule source: OWASP, "CSV Injection" (https://owasp.org/www-community/attacks/CSV_Injection): cells
starting with =, +, -, @, tab or carriage return are read as formulas; prefix them with an apostrophe.
The XLSX side is checked with openpyxl reading the file as a spreadsheet program would.
"""

from __future__ import annotations

import csv

import openpyxl
import pytest

from boresize.io import read_line_list
from boresize.io.csv_writer import write_csv
from boresize.io.safety import as_number, neutralise, restore
from boresize.io.xlsx import write_xlsx
from boresize.model import LineResult

HOSTILE = {"tag": '=HYPERLINK("http://example.invalid","x")', "fluid": "@SUM(A1:A2)", "flow": "+1 t/h",
           "pressure": "-3 barg", "temperature": "\t20 degC", "length": "-3", "elevation": "-2.5",
           "service": "liquid"}
HEADERS = list(HOSTILE)


def _results() -> list[LineResult]:
    return [LineResult(tag=HOSTILE["tag"], status="error", mode="size", raw=dict(HOSTILE), error="=cmd|' /C calc'!A0")]


@pytest.mark.parametrize(("text", "expected"), [
    ("=1+2", "'=1+2"), ("+1 t/h", "'+1 t/h"), ("-3 barg", "'-3 barg"), ("@SUM(A1)", "'@SUM(A1)"),
    ("\tx", "'\tx"), ("\rx", "'\rx"),  # OWASP's list
    ("-3", "-3"), ("+5", "+5"), ("-1.5e3", "-1.5e3"),  # plain numbers are numbers, not formulas
    ("-inf", "'-inf"), ("water", "water"), ("", ""),
])
def test_neutralise_follows_owasp(text, expected):
    assert neutralise(text) == expected
    assert restore(neutralise(text)) == text


def test_csv_cells_are_neutralised_but_negative_numbers_stay(tmp_path):
    write_csv(tmp_path / "out.csv", _results(), HEADERS)
    with open(tmp_path / "out.csv", encoding="utf-8-sig", newline="") as handle:
        header, row = list(csv.reader(handle))[:2]
    cells = dict(zip(header, row))
    assert cells["tag"].startswith("'=HYPERLINK")
    assert cells["fluid"] == "'@SUM(A1:A2)"
    assert cells["flow"] == "'+1 t/h"
    assert cells["pressure"] == "'-3 barg"
    assert cells["temperature"] == "'\t20 degC"
    assert (cells["length"], cells["elevation"]) == ("-3", "-2.5")
    assert cells["result.error"].startswith("'=cmd")


def test_xlsx_stores_formula_text_as_text_and_negative_numbers_as_numbers(tmp_path):
    write_xlsx(tmp_path / "out.xlsx", _results(), HEADERS)
    sheet = openpyxl.load_workbook(tmp_path / "out.xlsx")["lines"]
    header = [c.value for c in sheet[1]]
    cells = {name: cell for name, cell in zip(header, sheet[2])}
    for name in ("tag", "fluid", "flow", "pressure", "result.error"):
        assert cells[name].data_type == "s", name  # text, never a formula ('f')
        assert cells[name].quotePrefix, name
    assert cells["tag"].value == HOSTILE["tag"]
    assert (cells["length"].data_type, cells["length"].value) == ("n", -3)
    assert (cells["elevation"].data_type, cells["elevation"].value) == ("n", -2.5)


@pytest.mark.parametrize("suffix", [".csv", ".xlsx"])
def test_neutralised_files_read_back_unchanged(tmp_path, suffix):
    path = tmp_path / f"out{suffix}"
    (write_csv if suffix == ".csv" else write_xlsx)(path, _results(), HEADERS)
    # cells are read stripped of surrounding white space, as every line list cell is
    assert read_line_list(path).rows == [{k: v.strip() for k, v in HOSTILE.items()}]


@pytest.mark.parametrize(("text", "number"), [("25", 25), ("0.5", 0.5), ("-3", -3), ("0.50", None),
                                               ("1e3", None), ("25 m", None), (" 25", None), ("nan", None)])
def test_only_cells_that_survive_as_numbers_become_numbers(text, number):
    assert as_number(text) == number
