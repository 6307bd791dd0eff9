"""Line lists from XLSX and TOML read the same as the CSV they stand for.

Workbooks are written here with openpyxl itself (a spreadsheet as a user would save it), TOML with
plain text; the expectation is the CSV reading of the same table.
"""

from __future__ import annotations

import openpyxl
import pytest

from boresize.errors import InputError
from boresize.io import read_line_list
from boresize.io.csv_reader import parse_csv_text

CSV = ("tag,fluid,flow [t/h],pressure,temperature,length [m],case\n"
       "P-1,water,45,9 barg,30 degC,180,normal\nP-1,water,54,9.5 barg,30 degC,180,maximum\n"
       "P-2,water,20.5,5 barg,25 degC,60,\n")


def _book(tmp_path, rows, sheet_title="Sheet"):
    book = openpyxl.Workbook()
    sheet = book.active
    sheet.title = sheet_title
    for row in rows:
        sheet.append(row)
    path = tmp_path / "lines.xlsx"
    book.save(path)
    return path


def test_xlsx_with_numbers_reads_like_the_csv(tmp_path):
    rows = [["tag", "fluid", "flow [t/h]", "pressure", "temperature", "length [m]", "case"],
            ["P-1", "water", 45, "9 barg", "30 degC", 180.0, "normal"],
            ["P-1", "water", 54, "9.5 barg", "30 degC", 180, "maximum"],
            [None, None, None, None, None, None, None],  # a blank row, as spreadsheets leave them
            ["P-2", "water", 20.5, "5 barg", "25 degC", 60, None]]
    got, want = read_line_list(_book(tmp_path, rows)), parse_csv_text(CSV)
    assert (got.rows, got.units, got.headers) == (want.rows, want.units, want.headers)
    assert len(got.digest) == 64


def test_xlsx_prefers_a_sheet_named_lines(tmp_path):
    book = openpyxl.Workbook()
    book.active.append(["notes", "nothing to see"])
    lines = book.create_sheet("lines")
    lines.append(["tag", "fluid", "flow", "pressure", "temperature"])
    lines.append(["A", "water", "5 t/h", "3 barg", "20 degC"])
    book.save(tmp_path / "b.xlsx")
    assert read_line_list(tmp_path / "b.xlsx").rows[0]["tag"] == "A"


def test_xlsx_formula_without_saved_value_is_an_error_naming_the_cell(tmp_path):
    rows = [["tag", "fluid", "flow", "pressure", "temperature"], ["A", "water", "=2*3", "3 barg", "20 degC"]]
    with pytest.raises(InputError, match=r"lines: cell C2 holds a formula without a saved value"):
        read_line_list(_book(tmp_path, rows))


def test_not_a_workbook_is_an_input_error(tmp_path):
    path = tmp_path / "fake.xlsx"
    path.write_text("tag,fluid\n")
    with pytest.raises(InputError, match=r"lines: cannot read .*fake.xlsx as an XLSX workbook"):
        read_line_list(path)


def test_toml_cases_inherit_the_line_and_read_like_the_csv(tmp_path):
    path = tmp_path / "lines.toml"
    path.write_text('[units]\nflow = "t/h"\nlength = "m"\n\n'
                    '[[line]]\ntag = "P-1"\nfluid = "water"\nflow = 45\npressure = "9 barg"\n'
                    'temperature = "30 degC"\nlength = 180\n'
                    '[[line.case]]\ncase = "normal"\n'
                    '[[line.case]]\ncase = "maximum"\nflow = 54\npressure = "9.5 barg"\n\n'
                    '[[line]]\ntag = "P-2"\nfluid = "water"\nflow = 20.5\npressure = "5 barg"\n'
                    'temperature = "25 degC"\nlength = 60\n')
    got, want = read_line_list(path), parse_csv_text(CSV)
    strip = [{k: v for k, v in row.items() if v} for row in want.rows]
    assert got.rows == strip
    assert got.units["flow"] == "t/h" and got.units["length"] == "m"


@pytest.mark.parametrize(("text", "message"), [
    ('[[line]]\ntag = "A"\nfluid = "water"\nflow = "1 t/h"\npressure = "1 barg"\ntemperature = "20 degC"\n'
     'lenght = 5\n', r"header: unknown column 'lenght'.*close to 'length'"),
    ('[line_list]\n', r"line_list: unknown table or key 'line_list'"),
    ('[[line]\n', r"lines: .* is not valid TOML"),
])
def test_toml_mistakes_are_input_errors_naming_the_key(tmp_path, text, message):
    path = tmp_path / "bad.toml"
    path.write_text(text)
    with pytest.raises(InputError, match=message):
        read_line_list(path)


def test_unknown_extension_is_refused():
    with pytest.raises(InputError, match=r"lines: cannot tell the kind of line list 'x.ods'.*expected a file ending"):
        read_line_list("x.ods")
