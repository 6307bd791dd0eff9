"""Headings as the trade writes them (issue 14, "Headings ignored"): units in parentheses, usual aliases.

A heading that is not read feeds nothing and its default is used: `NPS (in)` ignored sized a line meant
for checking at NPS 1. The numbers below are the cells of the test's own line lists.
"""

from __future__ import annotations

import pytest

from boresize.errors import InputError
from boresize.io import read_line_list
from boresize.io.csv_reader import parse_csv_text
from boresize.io.rows import ALIASES, COLUMNS, line_from_row, parse_header


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


def test_the_trades_usual_headings_feed_their_columns():
    trade = parse_csv_text("Line No,Fluid,Mass Flow [t/h],Operating Pressure,Operating Temperature,"
                           "Pipe Length [m],Elevation change [m],Design Margin (%),NPS (in)\n"
                           "P-1,water,10,5 barg,30 degC,250,3,20,1\n")
    plain = parse_csv_text("tag,fluid,flow [t/h],pressure,temperature,length [m],elevation [m],design_margin [%],"
                           "nps [in]\nP-1,water,10,5 barg,30 degC,250,3,20,1\n")
    assert trade.rows == plain.rows and trade.units == plain.units
    line = line_from_row(trade.rows[0], trade.units)
    assert (line.length, line.elevation, line.nps) == (250.0, 3.0, "1")


def test_every_alias_feeds_a_column_and_is_in_the_readme():
    from pathlib import Path

    readme = (Path(__file__).parents[2] / "README.md").read_text(encoding="utf-8")
    for alias, column in ALIASES.items():
        assert column in COLUMNS, alias
        assert parse_header(alias.replace("_", " ").title()).field == column
        assert alias.replace("_", " ") in readme, alias


def test_a_heading_close_to_an_alias_is_an_error_naming_it():
    with pytest.raises(InputError) as err:
        parse_csv_text("tag,fluid,flow,pressure,temperature,Pipe Lenght [m]\nP-1,water,10 t/h,5 barg,30 degC,9\n",
                       "l.csv")
    assert str(err.value).startswith("header: unknown column 'Pipe Lenght [m]' in l.csv (close to 'pipe_length'); "
                                     "expected 'pipe_length' if that is meant")


def test_a_column_and_its_alias_both_given_is_an_error():
    with pytest.raises(InputError) as err:
        parse_csv_text("tag,Line No,fluid,flow,pressure,temperature\nP-1,1,water,10 t/h,5 barg,30 degC\n", "l.csv")
    assert str(err.value) == "header: column 'tag' appears twice in l.csv; expected each column once"


def test_toml_keys_take_the_aliases_and_a_key_given_twice_is_an_error(tmp_path):
    path = tmp_path / "lines.toml"
    path.write_text('[[line]]\n"Line No" = "P-1"\nfluid = "water"\n"Mass Flow" = "10 t/h"\n'
                    '"Operating Pressure" = "5 barg"\n"Operating Temperature" = "30 degC"\n"Pipe Length" = "250 m"\n',
                    encoding="utf-8")
    lines = read_line_list(path)
    assert lines.rows == [{"tag": "P-1", "fluid": "water", "flow": "10 t/h", "pressure": "5 barg",
                           "temperature": "30 degC", "length": "250 m"}]
    path.write_text('[[line]]\ntag = "P-1"\n"Line No" = "P-2"\nfluid = "water"\nflow = "1 t/h"\n'
                    'pressure = "5 barg"\ntemperature = "30 degC"\n', encoding="utf-8")
    with pytest.raises(InputError) as err:
        read_line_list(path)
    assert str(err.value) == ("line[1].Line No: line[1] gives 'tag' twice (as 'Line No' and as 'tag'); "
                              "expected one key for 'tag'")


# DN headings (ISO 6708 designations; the NPS each maps to: ASME B36.10M-2018 Table 1)
def test_a_dn_column_feeds_nps_and_reads_bare_numbers_as_dn():
    text = ("tag,fluid,flow [t/h],pressure [barg],temperature [degC],DN\n"
            "A,water,50,5,20,100\nB,water,50,5,20,DN 150\nC,water,50,5,20,25\n")
    lines = parse_csv_text(text)
    assert [line_from_row(row, lines.units).nps for row in lines.rows] == ["4", "6", "1"]


@pytest.mark.parametrize(("heading", "cell", "nps"), [("DN (mm)", "80", "3"), ("dn", "80.0", "3"),
                                                      ("Nominal Diameter", "300", "12"), ("NPS", "DN 300", "12")])
def test_dn_headings(heading, cell, nps):
    header = parse_header(heading)
    line = line_from_row({"tag": "T", "fluid": "water", "flow": "1 kg/s", "pressure": "2 bar", "temperature": "20 degC",
                          "nps": cell}, units={"nps": header.unit})
    assert line.nps == nps


def test_a_dn_heading_in_inches_is_refused():
    header = parse_header("DN (in)")
    with pytest.raises(InputError, match=r"a DN has no unit but mm, not 'in'"):
        line_from_row({"tag": "T", "fluid": "water", "flow": "1 kg/s", "pressure": "2 bar", "temperature": "20 degC",
                       "nps": "4"}, units={"nps": header.unit})
