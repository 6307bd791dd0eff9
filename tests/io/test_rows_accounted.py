"""Every data row of a CSV line list reaches the output (issue 14, "Rows vanish").

A tag starting with ``#`` is a line, not a comment; a comment row is one whose first cell starts with ``#`` and
whose other cells are empty. A quote opened and not closed on its line errors that row alone: the rows after it
read exactly as they do without the bad row. The cells are the test's own.
"""

from __future__ import annotations

import csv
import io

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from boresize.errors import InputError
from boresize.io.csv_reader import parse_csv_text
from boresize.io.line_items import RowFault, line_items
from boresize.io.rows import UNBALANCED_QUOTE
from boresize.io.safety import restore
from boresize.model import Line

HEADER = "tag,fluid,flow,pressure,temperature,notes\n"
GOOD = ["P-1,water,10 t/h,5 barg,30 degC,\n", "P-2,water,12 t/h,6 barg,35 degC,\"two\nlines\"\n",
        "P-3,water,14 t/h,7 barg,40 degC,x\x0cy\u2028z\n"]
EXPECTED = ("a closing quote in the same cell (\"1,5\"), or no quote at the start of a cell; a quote inside a quoted "
            "cell is written twice (\"\")")


def _items(text):
    return line_items(parse_csv_text(text).pairs()).items


def _message(quoted, tag):
    return (f"line {tag}: row: the quote opened in {quoted!r} does not close on its line, so its cells are not "
            f"read (the rows after it are read as written); expected {EXPECTED}")


def test_a_tag_starting_with_a_hash_is_a_line_and_a_hash_row_alone_is_a_comment():
    items = _items("# rev 2, issued for design\n" + HEADER + "#12-P-001,water,10 t/h,5 barg,30 degC,\n"
                   "# a comment row\n" + "".join(GOOD))
    assert [item.tag for item in items] == ["#12-P-001", "P-1", "P-2", "P-3"]
    assert all(isinstance(item, Line) for item in items)


@pytest.mark.parametrize(("bad", "quoted"), [
    ("Q-1,water,\"10 t/h,5 barg,30 degC,\n", '"10 t/h,5 barg,30 degC,'),
    ("Q-1,water,10 t/h,5 barg,30 degC,\"a note\n", '"a note'),
])
@pytest.mark.parametrize("where", [0, 1, 3])
def test_an_unbalanced_quote_errors_its_row_and_the_other_rows_are_unchanged(bad, quoted, where):
    clean = _items(HEADER + "".join(GOOD))
    rows = list(GOOD)
    rows.insert(where, bad)
    items = _items(HEADER + "".join(rows))
    fault = items[where]
    assert isinstance(fault, RowFault)
    assert fault.tag == "Q-1"
    assert str(fault.error) == _message(quoted, "Q-1")
    assert items[:where] + items[where + 1:] == clean


def test_a_quote_that_closes_on_a_later_line_without_a_separator_is_a_multi_line_cell():
    items = _items(HEADER + "".join(GOOD))
    assert items[1].extra == (("notes", "two\nlines"),)


def test_an_unbalanced_quote_in_the_header_stops_the_file_naming_its_line():
    with pytest.raises(InputError) as err:
        parse_csv_text("# note\ntag,fluid,\"flow,pressure,temperature\nP-1,water,10 t/h,5 barg,30 degC\n", "l.csv")
    assert str(err.value) == ("header: the quote opened in '\"flow,pressure,temperature' on line 2 of l.csv (its "
                              "header) does not close on its line; expected column names without quotes, or each "
                              "quote closed in its cell")


CELL_CHARS = st.sampled_from(list("ab1 ,;\"'#\n\r\t-/.") + ["\x00", "\x0c", "\u2028", "\r\n", '""', "t/h"])


@settings(max_examples=150, deadline=None, derandomize=True)
@given(rows=st.lists(st.tuples(st.lists(CELL_CHARS, min_size=1, max_size=8).map("".join),
                               st.lists(CELL_CHARS, max_size=8).map("".join)), min_size=1, max_size=6))
def test_every_row_written_by_a_csv_writer_is_read_back(rows):
    # A row whose tag starts with "#" is a line (its fluid cell below is never empty); quotes, newlines, NUL,
    # form feeds and U+2028 inside cells change no row count.
    buffer = io.StringIO()
    writer = csv.writer(buffer)  # lines end in CRLF, so a cell holding CR or LF is quoted
    writer.writerow(["tag", "fluid", "flow", "pressure", "temperature", "notes"])
    written = [(f"T{n}{tag}", notes) for n, (tag, notes) in enumerate(rows)]
    for tag, notes in written:
        writer.writerow([tag, "water", "10 t/h", "5 barg", "30 degC", notes])
    parsed = parse_csv_text(buffer.getvalue())
    assert [row["tag"] for row in parsed.rows] == [restore(tag.strip()).strip() for tag, _ in written]
    assert all(UNBALANCED_QUOTE not in row for row in parsed.rows)
