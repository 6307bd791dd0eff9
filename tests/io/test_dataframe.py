"""DataFrames in and out (boresize.io.dataframe): the same lines as the CSV reader, the same table as the CSV writer."""

from __future__ import annotations

import io
import math

import numpy as np
import pandas as pd
import pint
import pytest
from CoolProp.CoolProp import PropsSI
from fluids.piping import nearest_pipe

from boresize import InputError, read_dataframe, results_dataframe, size_dataframe
from boresize.io.csv_reader import parse_csv_text, read_csv
from boresize.io.csv_writer import csv_cell, write_csv
from boresize.io.dataframe import lines_dataframe, result_columns
from boresize.api import size_rows

LINES_CSV = """tag,fluid,flow,pressure [barg],temperature [degC],length [m],service,nps,case
W-1,water,45 t/h,9,30,120,liquid,,
W-2,water,80 t/h,6,25,60,pump-discharge,,normal
W-2,water,96 t/h,6.5,25,60,pump-discharge,,maximum
T-3,toluene,18 t/h,4,60,90,liquid,3,
M-4,methanol,=6 t/h,3,35,40,liquid,,
"""


@pytest.fixture(scope="module")
def csv_list():
    return parse_csv_text(LINES_CSV)


def test_a_frame_read_from_the_csv_gives_the_csv_readers_lines(csv_list):
    frame = pd.read_csv(io.StringIO(LINES_CSV))  # pandas turns 120 into an int and the empty cells into NaN
    got = read_dataframe(frame)
    assert got.rows == [{k: v for k, v in row.items()} for row in csv_list.rows]
    assert got.units == csv_list.units and got.headers == csv_list.headers


def test_units_in_a_second_header_level_or_in_a_first_row():
    text = "tag,fluid,flow,pressure,temperature\n,,t/h,barg,degC\nA,water,45,9,30\n"
    expected = {"tag": "A", "fluid": "water", "flow": "45", "pressure": "9", "temperature": "30"}
    two_levels = read_dataframe(pd.read_csv(io.StringIO(text), header=[0, 1]))
    first_row = read_dataframe(pd.read_csv(io.StringIO(text), dtype=str))
    for got in (two_levels, first_row):
        assert got.rows == [expected]
        assert (got.units["flow"], got.units["pressure"], got.units["temperature"]) == ("t/h", "barg", "degC")
    assert first_row.headers == ["tag", "fluid", "flow [t/h]", "pressure [barg]", "temperature [degC]"]
    plain = pd.DataFrame({"tag": ["A"], "fluid": ["water"], "flow": ["45 t/h"], "pressure": ["9 barg"],
                          "temperature": ["30 degC"]})
    assert read_dataframe(plain).rows[0]["flow"] == "45 t/h"  # a data row is not taken for units
    kept = read_dataframe(pd.read_csv(io.StringIO(text), dtype=str), units_row=False)
    assert [row["flow"] for row in kept.rows] == ["t/h", "45"] and kept.units["flow"] is None


def test_cells_may_be_numbers_nan_and_pint_quantities():
    ureg = pint.UnitRegistry()
    frame = pd.DataFrame({"tag": ["A", "B"], "fluid": ["water", "water"],
                          "flow": [ureg.Quantity(45, "t/h"), "12.5 kg/s"],
                          "pressure [bar]": [np.float64(10.0), 10],
                          "temperature": ["30 degC", ureg.Quantity(30, "degC")],
                          "length [m]": [np.nan, 80.5]})
    rows = read_dataframe(frame).rows
    assert rows[0]["flow"] == "45 metric_ton/hour" and rows[1]["temperature"] == "30 degC"
    assert rows[0]["pressure"] == "10" and rows[0]["length"] == "" and rows[1]["length"] == "80.5"


def test_a_line_list_goes_to_a_frame_and_back_like_a_csv_file(tmp_path, csv_list):
    frame = lines_dataframe(csv_list)
    assert list(frame.columns) == csv_list.headers
    again = read_dataframe(frame)
    assert (again.rows, again.units) == (csv_list.rows, csv_list.units)
    frame.to_csv(tmp_path / "lines.csv", index=False)
    from_file = read_csv(tmp_path / "lines.csv")
    assert (from_file.rows, from_file.units, from_file.headers) == (csv_list.rows, csv_list.units, csv_list.headers)


def _cell(value: object) -> str:
    """The CSV writer's text of a frame cell; pandas keeps an empty cell as None or NaN."""
    return "" if value is None or (isinstance(value, float) and math.isnan(value)) else csv_cell(value)


def test_the_results_frame_holds_the_cells_of_the_csv_results_file(tmp_path, csv_list, sizer):
    results = size_rows(csv_list.pairs(), sizer=sizer)
    frame = results_dataframe(results, csv_list.headers)
    write_csv(tmp_path / "results.csv", results, csv_list.headers)
    written = pd.read_csv(tmp_path / "results.csv", dtype=str, keep_default_na=False, encoding="utf-8-sig")
    # the same cells; the result columns named as the JSON keys (velocity_m_s), not as the CSV's headings
    assert list(frame.columns) == list(csv_list.headers) + result_columns(csv_list.headers)
    assert [[_cell(v) for v in row] for row in frame.itertuples(index=False)] == written.values.tolist()
    back = read_dataframe(frame)  # the result columns are skipped, as the CSV reader skips result.*
    assert (back.rows, back.units) == (csv_list.rows, csv_list.units)


def test_size_dataframe_sizes_every_row_with_outside_checks():
    frame = pd.DataFrame({"tag": ["W-1", "bad"], "fluid": ["water", "water"], "flow [t/h]": [45, -1],
                          "pressure [barg]": [9, 9], "temperature [degC]": [30, 30]})
    table = size_dataframe(frame, plugins=False)
    assert list(table["tag"]) == ["W-1", "bad"]
    assert list(table["status"]) == ["pass", "error"]
    assert "flow" in table["error"][1] and "'-1' is not above zero" in table["error"][1]
    # Velocity of 12.5 kg/s of water (CoolProp IAPWS-95 density) in the selected Sch 40 size (fluids' ASME table).
    _, di, _, _ = nearest_pipe(NPS=float(table["result_nps"][0]), schedule="40")
    rho = PropsSI("D", "T", 303.15, "P", 1001325.0, "Water")
    assert table["velocity_m_s"][0] == pytest.approx(12.5 / rho / (math.pi * di**2 / 4), rel=1e-5)


REORDERED_CSV = """tag,fluid,flow,pressure [barg],temperature [degC],service,case
W-2,water,80 t/h,6,25,pump-discharge,normal
W-1,water,45 t/h,9,30,liquid,
W-2,water,96 t/h,6.5,25,pump-discharge,maximum
X-9,unobtainium,1 t/h,2,3,,
"""


@pytest.fixture(scope="module")
def reordered():
    frame = pd.read_csv(io.StringIO(REORDERED_CSV), dtype=str, keep_default_na=False)
    frame.index = pd.Index([101, 7, 55, 3], name="row")
    return frame, size_dataframe(frame, plugins=False)


def test_the_input_index_and_row_order_are_kept(reordered):
    frame, table = reordered  # W-2's two cases are one line, sized together, yet come back on their own rows
    assert table.index.equals(frame.index) and table.index.name == "row"
    assert list(table["tag"]) == ["W-2", "W-1", "W-2", "X-9"] and list(table["case"]) == ["normal", "", "maximum", ""]
    assert list(table["status"])[3] == "error" and list(table["line_status"])[:3] == ["pass"] * 3
    assert read_dataframe(table).rows == read_dataframe(frame).rows  # out and in again, result columns skipped


def test_result_columns_are_the_json_keys(reordered):
    frame, table = reordered
    assert "velocity_m_s" in table.columns and not any(" " in c or "[" in c for c in table.columns[len(frame.columns):])
    assert [c for c in table.columns if c.startswith("result_")] == ["result_nps", "result_schedule", "result_service",
                                                                          "result_phase", "result_two_phase_method"]
    from boresize.api import run_lines
    from boresize.io.sheet_rows import case_rows

    cases = {(c.tag, c.line.case if c.line else ""): c for r in run_lines(frame, plugins=False).results
             for c in case_rows(r)}
    entry = cases[("W-1", None)].to_dict() if ("W-1", None) in cases else cases[("W-1", "")].to_dict()
    row = table[table["tag"] == "W-1"].iloc[0]
    for column in result_columns(list(frame.columns)):
        key = column.removeprefix("result_")
        if key in entry and not isinstance(entry[key], (list, dict)):
            assert row[column] == entry[key] or (entry[key] is None and pd.isna(row[column])), column


@pytest.mark.parametrize("name", ["tag", "line_no", None])
def test_a_frame_indexed_by_tag_takes_its_tags_from_the_index(name):
    frame = pd.DataFrame({"fluid": ["water", "water"], "flow [t/h]": [45, 20], "pressure [barg]": [9, 9],
                          "temperature [degC]": [30, 30]}, index=pd.Index(["P-1", "P-2"], name=name))
    assert [row["tag"] for row in read_dataframe(frame).rows] == ["P-1", "P-2"]
    table = size_dataframe(frame, plugins=False)
    assert table.index.equals(frame.index) and "tag" not in table.columns and "line_no" not in table.columns
    assert list(table["status"]) == ["pass", "pass"]


def test_a_numbered_index_does_not_supply_tags():
    frame = pd.DataFrame({"fluid": ["water"], "flow": ["45 t/h"], "pressure": ["9 barg"], "temperature": ["30 degC"]},
                         index=[5])
    with pytest.raises(InputError, match="no column 'tag'"):
        read_dataframe(frame)


@pytest.mark.parametrize(("frame", "field", "pattern"), [
    (pd.DataFrame({"tag": ["A"], "fluid": ["water"], "flow": ["1 t/h"], "pressure": ["1 bar"]}), "header",
     r"has no column 'temperature'"),
    (pd.DataFrame({"tag": ["A"], "fluid": ["water"], "flow": ["1 t/h"], "pressure": ["1 bar"],
                   "temperature": ["300 K"], "lenght": ["3 m"]}), "header", r"unknown column 'lenght'"),
    (pd.DataFrame([["A", "water", "1 t/h", "1 bar", "300 K", "x"]],
                  columns=["tag", "fluid", "flow", "pressure", "temperature", "Flow"]), "header",
     r"column 'flow' appears twice"),
    (pd.DataFrame({"tag": [], "fluid": [], "flow": [], "pressure": [], "temperature": []}), "lines",
     r"has a header but no lines"),
])
def test_bad_frames_raise_errors_naming_the_field(frame, field, pattern):
    with pytest.raises(InputError, match=pattern) as info:
        read_dataframe(frame)
    assert info.value.field == field


def test_a_frame_column_named_as_a_result_key_stays_the_frames():
    frame = pd.DataFrame({"tag": ["A", "A"], "velocity_m_s": [1, 2], "fluid": ["water", "water"],
                          "flow [t/h]": [45, 45], "pressure [barg]": [9, 9], "temperature [degC]": [30, 30]},
                         index=["p", "q"])
    table = size_dataframe(frame, plugins=False)  # the second A is an error (tag given twice): its row keeps its label
    assert list(table.index) == ["p", "q"] and list(table["status"]) == ["pass", "error"]
    assert list(table["velocity_m_s"]) == ["1", "2"] and table["result_velocity_m_s"].iloc[0] > 0
    assert [row["velocity_m_s"] for row in read_dataframe(table).rows] == ["1", "2"]
