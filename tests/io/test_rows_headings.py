"""Headings as the trade writes them (issue 14, "Headings ignored"): units in parentheses, usual aliases.

A heading that is not read feeds nothing and its default is used: `NPS (in)` ignored sized a line meant
for checking at NPS 1. The numbers below are the cells of the test's own line lists.
"""

from __future__ import annotations

import pytest

from boresize.errors import InputError
from boresize.io.csv_reader import parse_csv_text
from boresize.io.rows import line_from_row, parse_header


@pytest.mark.parametrize(("text", "field", "unit"), [
    ("Length (m)", "length", "m"),
    ("length [m]", "length", "m"),
    ("NPS (in)", "nps", "in"),
    ("Design Margin (%)", "design_margin", "%"),
    ("Flow (t/h)", "flow", "t/h"),
    ("Pipe Class", "pipe_class", None),
])
def test_units_in_parentheses_read_like_units_in_brackets(text, field, unit):
    header = parse_header(text)
    assert (header.field, header.unit) == (field, unit)


def test_a_line_list_with_parenthesised_units_reads_like_the_bracketed_one():
    paren = parse_csv_text("Tag,Fluid,Flow (t/h),Pressure,Temperature,Length (m),NPS (in),Design Margin (%)\n"
                           "P-1,water,10,5 barg,30 degC,250,1,20\n")
    bracket = parse_csv_text("tag,fluid,flow [t/h],pressure,temperature,length [m],nps [in],design_margin [%]\n"
                             "P-1,water,10,5 barg,30 degC,250,1,20\n")
    a = line_from_row(paren.rows[0], paren.units)
    b = line_from_row(bracket.rows[0], bracket.units)
    assert a == b
    assert (a.length, a.nps, a.design_margin) == (250.0, "1", pytest.approx(0.20))


def test_an_nps_header_in_millimetres_is_refused_not_read_as_inches():
    lines = parse_csv_text("tag,fluid,flow,pressure,temperature,NPS (mm)\nP-1,water,10 t/h,5 barg,30 degC,25\n")
    with pytest.raises(InputError) as err:
        line_from_row(lines.rows[0], lines.units)
    assert str(err.value) == ("line P-1: nps: an NPS is in inches, not 'mm'; expected the nominal pipe size in "
                              "inches (a header 'NPS' or 'NPS (in)'), e.g. '6'")
