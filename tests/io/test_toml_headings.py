"""TOML line lists take the same keys as CSV headings: a unit in parentheses or brackets, and the alias table.

Numbers: 1 ft = 0.3048 m exactly (international foot, NIST SP 811, App. B); 1 bar = 1e5 Pa and 1 atm = 101325 Pa
(SI definitions, ISO 80000-4).
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest

from boresize import run_lines
from boresize.io.csv_reader import parse_csv_text
from boresize.io.line_items import line_items
from boresize.io.toml_lines import read_toml_lines
from boresize.model import Line

TOML = '''
[units]
temperature = "degC"

[[line]]
tag = "T-1"
fluid = "water"
"Mass Flow (t/h)" = 45
"pressure [barg]" = 5
temperature = 30
"length (m)" = 120
"Elevation change [m]" = 3
"NPS (in)" = 4

[[line]]
tag = "T-2"
"Fluid Name" = "water"
"flow [t/h]" = 45
"Operating Pressure (bara)" = 5
temperature = 30
"Pipe Length (ft)" = 300

  [[line.case]]
  case = "normal"
  [[line.case]]
  case = "maximum"
  "Pipe Length" = "100 m"
'''
CSV = ("tag,fluid,Mass Flow (t/h),pressure [barg],temperature [degC],length (m),Elevation change [m],NPS (in)\n"
       "T-1,water,45,5,30,120,3,4\n")


def _lines(text: str, tmp_path: Path) -> list[Line]:
    path = tmp_path / "lines.toml"
    path.write_text(text, encoding="utf-8")
    items = line_items(read_toml_lines(path).pairs()).items
    return [line for item in items for line in ((item,) if isinstance(item, Line) else item)]  # type: ignore[misc]


def test_units_in_keys_and_aliases_read_as_in_a_csv_heading(tmp_path: Path) -> None:
    t1, normal, maximum = _lines(TOML, tmp_path)
    csv = line_items(parse_csv_text(CSV, "lines.csv").pairs()).items[0]
    assert isinstance(csv, Line) and t1 == csv
    assert (t1.flow.value, t1.length, t1.elevation, t1.nps) == (12.5, 120.0, 3.0, "4")
    assert math.isclose(t1.pressure, 5e5 + 101325.0)
    assert math.isclose(normal.length, 300 * 0.3048) and maximum.length == 100.0  # the case's own key wins
    assert normal.pressure == 5e5 and normal.bare_pressures == ()


def test_a_key_unit_of_the_wrong_dimension_or_a_bare_pressure_is_named_on_its_line(tmp_path: Path) -> None:
    path = tmp_path / "lines.toml"
    path.write_text(TOML.replace('"length (m)" = 120', '"length (kg)" = 120')
                    .replace('"Operating Pressure (bara)"', '"Operating Pressure (bar)"'), encoding="utf-8")
    run = run_lines(path, plugins=False)
    assert run.results[0].error == ("line T-1: length: '120 [kg]' is a mass, not a length; expected a length "
                                    "(m, mm, km, ft, in)")
    assert run.results[1].cases[0].notes[0] == \
        "pressure '5 [bar]' read as absolute (5 bara); write barg or bara to say which"
    assert run.document()["summary"]["bare_pressure"] == 1


def test_a_heading_with_two_units_is_refused_not_ignored() -> None:
    import pytest

    from boresize.errors import InputError

    text = "tag,fluid,flow,pressure,temperature,length [m] (ft)\nA,water,45 t/h,9 barg,30 degC,120\n"
    with pytest.raises(InputError) as info:
        parse_csv_text(text, "lines.csv")
    assert str(info.value) == ("header: column 'length [m] (ft)' in lines.csv names 'length' with more than one unit "
                               "or a unit before other words; expected one unit in brackets or parentheses at the "
                               "end, e.g. 'length [m]'")


def test_an_extra_column_whose_parentheses_hold_no_unit_is_kept_not_refused():
    # "Flow (design) notes" starts with a column's name, but "(design)" is no unit: a column of the user's own
    text = ("tag,fluid,flow,pressure,temperature,Flow (design) notes,length [m] total\n"
            "A,water,45 t/h,9 barg,30 degC,see datasheet,120\n")
    from boresize.errors import InputError

    with pytest.raises(InputError, match="'length \\[m\\] total' in lines.csv names 'length'"):
        parse_csv_text(text, "lines.csv")  # "[m]" is a unit before other words: which length is meant is unclear
    rows = parse_csv_text(text.replace(",length [m] total", "").replace(",120\n", "\n"), "lines.csv").rows
    assert rows[0]["flow"] == "45 t/h" and "see datasheet" in rows[0].values()
