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


def test_tomllib_recursion_on_deep_nesting_is_an_input_error_naming_the_file(tmp_path: Path) -> None:
    from boresize.errors import InputError
    from boresize.io.toml_lines import read_toml_lines

    path = tmp_path / "deep.toml"
    path.write_text('[[line]]\ntag = "X"\nflow = ' + "[" * 10_000 + "]" * 10_000 + "\n", encoding="utf-8")
    try:
        read_toml_lines(path)
    except InputError as exc:
        assert exc.field == "lines" and exc.value == str(path) and "too deeply" in str(exc)
    else:
        raise AssertionError("no error")


def test_one_bad_toml_cell_is_its_lines_error_only() -> None:
    from boresize.io.line_items import RowFault, line_items
    from boresize.io.toml_lines import lines_from_document

    good = {"fluid": "water", "flow": "20 t/h", "pressure": "5 barg", "temperature": "20 degC"}
    document = {"line": [{"tag": "A", **good}, {"tag": "B", **good, "length": True},
                         {"tag": "C", **good, "case": ["normal", "max"]}, {"tag": "D", **good}]}
    items = line_items(lines_from_document(document).pairs()).items
    assert [type(item).__name__ for item in items] == ["Line", "RowFault", "RowFault", "Line"]
    bad, case = items[1], items[2]
    assert isinstance(bad, RowFault) and isinstance(case, RowFault)
    assert str(bad.error) == ('line B: length: true is a boolean, neither text nor a number; expected text '
                              '(such as "45 t/h" or "5 barg") or a number')
    assert case.error.field == "case" and "['normal', 'max']" in str(case.error)  # type: ignore[attr-defined]


def test_a_bad_toml_cell_on_the_only_line_is_still_that_lines_error(tmp_path: Path) -> None:
    from boresize.io.line_items import RowFault, line_items
    from boresize.io.read import read_line_list

    path = tmp_path / "one.toml"  # was a whole-file error (line[1].fluid), now the line's own, as for any line
    path.write_text('[[line]]\ntag = "A"\nfluid = true\nflow = "1 t/h"\npressure = "1 barg"\ntemperature = "20 degC"\n'
                    '[[line]]\ntag = "B"\nfluid = "water"\nflow = "1 t/h"\npressure = "1 barg"\ntemperature = "20 degC"\n'
                    '[[line.case]]\nflow = "2 t/h"\n', encoding="utf-8")
    items = line_items(read_line_list(path).pairs()).items
    assert isinstance(items[0], RowFault) and items[0].error.field == "fluid"  # type: ignore[attr-defined]
    assert isinstance(items[1], RowFault) and "has no case name" in str(items[1].error)


def _cli(argv: list[str], folder: Path) -> tuple[int, str, str]:
    import contextlib
    import io
    import os

    from boresize.cli import main

    out, err = io.StringIO(), io.StringIO()
    here = os.getcwd()
    os.chdir(folder)
    try:
        with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
            code = main(argv)
    finally:
        os.chdir(here)
    return code, out.getvalue(), err.getvalue()


GOOD = "tag,fluid,flow,pressure,temperature\nA-1,water,20 t/h,5 barg,20 degC\n"


def test_two_outputs_naming_one_file_stop_the_run_before_sizing(tmp_path: Path) -> None:
    (tmp_path / "lines.csv").write_text(GOOD, encoding="utf-8")
    (tmp_path / "link.csv").symlink_to(tmp_path / "a.csv")
    for second in ("./a.csv", "link.csv", str(tmp_path / "a.csv")):
        code, out, err = _cli(["size", "lines.csv", "--no-plugins", "-o", "a.csv", "-o", second], tmp_path)
        assert (code, out) == (2, "")
        assert err == (f"boresize: error: output: 'a.csv' and {second!r} name the same file; expected a different "
                       "file for each output\n")
        assert not (tmp_path / "a.csv").exists()


def test_a_csv_cell_over_the_field_limit_is_its_rows_error_and_the_other_rows_are_read() -> None:
    import csv

    from boresize.io.csv_reader import parse_csv_text
    from boresize.io.line_items import RowFault, line_items

    limit = csv.field_size_limit()  # 131072 unless changed (Python documentation of csv.field_size_limit)
    big = "x" * (limit + 1)
    text = (f"tag,fluid,flow,pressure,temperature,notes\nA,water,20 t/h,5 barg,20 degC,\nB,water,20 t/h,5 barg,"
            f"20 degC,{big}\nC,water,20 t/h,5 barg,20 degC,\"{big}\"\nD,water,20 t/h,5 barg,20 degC,\n")
    items = line_items(parse_csv_text(text, "l.csv").pairs()).items
    assert [type(i).__name__ for i in items] == ["Line", "RowFault", "RowFault", "Line"]
    b, c = items[1], items[2]
    assert isinstance(b, RowFault) and isinstance(c, RowFault)
    assert str(b.error) == (f"line B: notes: a cell of {limit + 1} characters on line 3 of l.csv is over the limit "
                            f"of {limit} characters a cell may hold; expected a cell of at most {limit} characters")
    assert c.tag == "C" and f"over the limit of {limit}" in str(c.error)


def test_a_full_disk_while_writing_is_an_error_per_output_and_the_earlier_file_stays(tmp_path: Path) -> None:
    import errno
    from unittest import mock

    def full(*args: object, **kwargs: object) -> None:
        raise OSError(errno.ENOSPC, "No space left on device")

    (tmp_path / "lines.csv").write_text(GOOD, encoding="utf-8")
    for name in ("out.xlsx", "out.csv", "out.json", "out.html"):
        (tmp_path / name).write_bytes(b"earlier")
    patches = [mock.patch("openpyxl.Workbook.save", full), mock.patch("boresize.io.csv_writer.write_csv", full),
               mock.patch("boresize.api.output.strict_json", full), mock.patch("boresize.api.output._html", full)]
    for patch in patches:
        patch.start()
    try:
        code, _, err = _cli(["size", "lines.csv", "--no-plugins", "-o", "out.xlsx", "-o", "out.csv", "-o", "out.json",
                             "-o", "out.html"], tmp_path)
    finally:
        for patch in patches:
            patch.stop()
    assert code == 2 and "Traceback" not in err and "internal error" not in err
    assert "boresize: error: output: cannot write 'out.xlsx': No space left on device" in err
    for name in ("out.xlsx", "out.json"):
        assert (tmp_path / name).read_bytes() == b"earlier"
    assert sorted(p.name for p in tmp_path.iterdir() if "boresize-tmp" in p.name) == []
