"""The one run path: run_lines() from every kind of line list, the Run writing every output format, and
the criteria file read afresh after an edit.

The reference of each kind of input is the same demo line list read from its path: every other way in
must give the same JSON entries. The files written are read back with the standard library's JSON, CSV
and HTML parsers and with openpyxl.
"""

from __future__ import annotations

import csv
import hashlib
import json
import subprocess
import sys
from html.parser import HTMLParser
from pathlib import Path
from typing import Any

import openpyxl
import pandas as pd
import pytest

from boresize import InputError, make_line, size, size_many
from boresize.api import LineList, Run, run_lines

DEMO = Path(__file__).resolve().parents[2] / "examples" / "demo-unit"
LINES, CRITERIA = DEMO / "lines.csv", DEMO / "criteria.toml"


@pytest.fixture(scope="module")
def reference() -> Run:
    return run_lines(LINES, CRITERIA, plugins=False)


def _lines(doc: dict[str, Any]) -> list[dict[str, Any]]:
    return json.loads(json.dumps(doc["lines"]))


def test_a_path_gives_the_line_list_as_read_and_its_record(reference: Run) -> None:
    digest = hashlib.sha256(LINES.read_bytes()).hexdigest()
    with open(LINES, encoding="utf-8", newline="") as handle:
        rows = list(csv.DictReader(handle))
    assert [r.tag for r in reference.results] == list(dict.fromkeys(row["tag"] for row in rows))
    assert reference.line_list.headers == next(csv.reader(LINES.open(encoding="utf-8")))
    assert (reference.line_list.source, reference.line_list.digest) == (str(LINES), digest)
    assert reference.trace.lines_sha256 == digest and reference.trace.criteria_source == str(CRITERIA)
    assert reference.summary() == (f"{len(reference.results)} lines: "
                                   f"{sum(r.status == 'pass' for r in reference.results)} pass, "
                                   f"{sum(r.status == 'fail' for r in reference.results)} fail, 0 error"
                                   "; 1 with a pressure in a bare unit (neither g nor a: see the line's notes)")


def test_an_open_file_gives_the_same_results(reference: Run) -> None:
    with open(LINES, encoding="utf-8") as handle:
        run = run_lines(handle, CRITERIA, plugins=False)
    assert _lines(run.document()) == _lines(reference.document())
    assert run.line_list.digest == reference.line_list.digest


def test_standard_input_through_the_command_line_gives_the_same_results(reference: Run) -> None:
    exe = Path(sys.executable).with_name("boresize")
    proc = subprocess.run([str(exe), "size", "-", "--criteria", str(CRITERIA), "--json", "--no-plugins"],
                          input=LINES.read_text(encoding="utf-8"), capture_output=True, text=True, timeout=300)
    doc = json.loads(proc.stdout)
    assert proc.returncode == (0 if reference.passed else 1), proc.stderr
    assert doc["lines_source"] == "<stdin>"
    assert doc["traceability"]["lines_sha256"] == reference.line_list.digest
    assert _lines(doc) == _lines(reference.document())


def test_a_dataframe_gives_the_same_results(reference: Run) -> None:
    frame = pd.read_csv(LINES, dtype=str, keep_default_na=False)
    run = run_lines(frame, CRITERIA, plugins=False)
    assert _lines(run.document()) == _lines(reference.document())
    assert run.line_list.source == "<DataFrame>"


def test_lines_give_the_results_of_size_many() -> None:
    water = make_line(tag="W-1", fluid="water", flow="45 t/h", pressure="9 barg", temperature="30 degC")
    cases = [make_line(tag="W-2", fluid="water", flow=f"{flow} t/h", pressure="6 barg", temperature="25 degC",
                       case=name) for flow, name in ((80, "normal"), (96, "maximum"))]
    run = run_lines([water, cases], plugins=False)
    assert [r.to_dict() for r in run.results] == [r.to_dict() for r in size_many([water, cases], plugins=False)]
    assert run.line_list.source == "<lines>" and len(run.results[1].cases) == 2


def test_something_else_is_refused_naming_what_is_accepted() -> None:
    with pytest.raises(InputError, match=r"^lines: a int is not a line list; expected a path, '-', an open file, "
                                         r"a DataFrame, a LineList, or Lines$"):
        run_lines(42)  # type: ignore[arg-type]


def test_the_run_writes_every_format(reference: Run, tmp_path: Path) -> None:
    written = {suffix: reference.write(tmp_path / f"out{suffix}") for suffix in (".json", ".csv", ".xlsx", ".html")}
    assert json.loads(written[".json"].read_text(encoding="utf-8")) == json.loads(json.dumps(reference.document()))
    with open(written[".csv"], encoding="utf-8-sig", newline="") as handle:
        table = list(csv.reader(handle))
    data_rows = sum(1 for _ in csv.DictReader(LINES.open(encoding="utf-8")))
    assert table[0][:len(reference.line_list.headers)] == reference.line_list.headers
    assert len(table) == 1 + data_rows  # a row per input row, cases included
    assert openpyxl.load_workbook(written[".xlsx"]).sheetnames == ["cover", "lines", "candidates"]
    html = written[".html"].read_text(encoding="utf-8")
    HTMLParser().feed(html)
    assert all(r.tag in html for r in reference.results) and reference.line_list.digest in html


def test_an_output_of_an_unknown_kind_is_refused(reference: Run, tmp_path: Path) -> None:
    with pytest.raises(InputError, match=r"^output: cannot tell what to write to '.*out\.ods' from its extension; "
                                         r"expected a file ending in \.json, \.jsonl, \.csv, \.xlsx, \.html, \.pdf$"):
        reference.write(tmp_path / "out.ods")


def test_headroom_goes_into_the_document_and_the_table() -> None:
    rows = [{"tag": "W-1", "fluid": "water", "flow": "20 t/h", "pressure": "5 barg", "temperature": "20 degC"}]
    run = run_lines(LineList(rows=rows, units={}, source="test", headers=list(rows[0])), plugins=False,
                    headroom=True)
    entry = run.document()["lines"][0]
    assert run.headrooms is not None and entry["headroom_percent"] == float(f"{run.headrooms[0].percent:.4g}")
    assert "Headroom at the selected or given size" in run.table() and "W-1" in run.table()


def test_an_edited_criteria_file_gives_its_new_limit(tmp_path: Path) -> None:
    criteria = tmp_path / "criteria.toml"
    line = make_line(tag="W-1", fluid="water", flow="20 t/h", pressure="5 barg", temperature="20 degC",
                     service="lab")

    def velocity_limit(limit: str) -> float | None:
        criteria.write_text(f'[service.lab]\nphase = "liquid"\nvelocity = {{ max = "{limit}" }}\n', encoding="utf-8")
        result = size(line, criteria=criteria, plugins=False)
        return next(v.limit for v in result.selected.verdicts if v.criterion == "velocity")  # type: ignore[union-attr]

    assert velocity_limit("3 m/s") == pytest.approx(3.0)
    assert velocity_limit("1.5 m/s") == pytest.approx(1.5)  # same path, new content: the new limit


def test_an_output_that_cannot_be_written_is_named(reference: Run, tmp_path: Path,
                                                   monkeypatch: pytest.MonkeyPatch) -> None:
    import errno

    from boresize.api import output

    def full_disk(path: Path, run: Run) -> None:
        raise OSError(errno.ENOSPC, "No space left on device")

    monkeypatch.setitem(output.WRITERS, ".json", full_disk)
    with pytest.raises(InputError, match=r"^output: cannot write '.*out\.json': No space left on device; expected a "
                                         r"file this user may write$"):
        reference.write(tmp_path / "out.json")


def test_standard_input_that_is_not_utf8_is_named(monkeypatch: pytest.MonkeyPatch) -> None:
    import io

    monkeypatch.setattr(sys, "stdin", io.TextIOWrapper(io.BytesIO(b"tag,fluid\n\xff\xfe,x\n")))
    with pytest.raises(InputError, match=r"^lines: <stdin> is not UTF-8 text; expected a line list saved as UTF-8$"):
        run_lines("-", plugins=False)


def test_a_generator_of_lines_is_read_like_a_list() -> None:
    water = [make_line(tag=f"G-{i}", fluid="water", flow="45 t/h", pressure="9 barg", temperature="30 degC")
             for i in range(2)]
    run = run_lines((line for line in water), plugins=False)
    assert [r.to_dict() for r in run.results] == [r.to_dict() for r in size_many(water, plugins=False)]


def test_no_lines_at_all_is_named() -> None:
    with pytest.raises(InputError, match=r"^lines: no lines given; expected one or more Lines from make_line\(\), "
                                         r"or a line list to read$"):
        run_lines([])


def test_an_output_never_overwrites_the_line_list_it_was_made_from(tmp_path: Path) -> None:
    lines = tmp_path / "lines.csv"
    lines.write_bytes(LINES.read_bytes())
    run = run_lines(lines, CRITERIA, plugins=False)
    with pytest.raises(InputError, match=r"^output: '.*lines\.csv' is the line list being read; expected another "
                                         r"file name: an output never overwrites its input$"):
        run.write(tmp_path / "." / "lines.csv")  # the same file, spelt another way
    assert lines.read_bytes() == LINES.read_bytes()


def test_an_output_that_is_a_folder_is_named(reference: Run, tmp_path: Path) -> None:
    folder = tmp_path / "out.csv"
    folder.mkdir()
    with pytest.raises(InputError, match=r"^output: '.*out\.csv' is a folder; expected a file name ending in "
                                         r"\.json, \.jsonl, \.csv, \.xlsx, \.html, \.pdf$"):
        reference.write(folder)


def test_the_command_line_refuses_to_overwrite_its_input_before_sizing(tmp_path: Path) -> None:
    lines = tmp_path / "lines.csv"
    lines.write_bytes(LINES.read_bytes())
    done = subprocess.run([sys.executable, "-m", "boresize", "size", str(lines), "-o", str(lines)],
                          capture_output=True, text=True, timeout=300)
    assert done.returncode == 2 and "Traceback" not in done.stderr
    assert done.stderr == (f"boresize: error: output: {str(lines)!r} is the line list being read; expected another "
                           f"file name: an output never overwrites its input\n")
    assert lines.read_bytes() == LINES.read_bytes()


def test_a_criteria_file_that_is_not_text_is_named(tmp_path: Path) -> None:
    from boresize import CriteriaFileError

    binary = tmp_path / "criteria.toml"
    binary.write_bytes(b"\x00\x01\xff\xfe[service]")
    with pytest.raises(CriteriaFileError, match=r"^criteria: .*criteria\.toml is not UTF-8 text; expected a TOML file "
                                                r"saved as UTF-8$"):
        run_lines(LINES, binary, plugins=False)
