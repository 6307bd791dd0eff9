"""The command line's outputs: several --output files by extension, --workers, --progress, check options.

Files are read back with outside readers: json, csv, openpyxl and the standard library's HTML parser.
"""

from __future__ import annotations

import csv
import json
from html.parser import HTMLParser
from pathlib import Path

import openpyxl
import pytest

from boresize.cli import main

DEMO = Path(__file__).resolve().parents[2] / "examples" / "demo-unit"
CONTRACT_KEYS = {"tag", "status", "nps", "schedule", "inside_diameter_mm", "velocity_m_s", "dp_kpa_per_100m",
                 "density_kg_m3", "viscosity_mpa_s", "controlling", "verdicts"}


def test_several_outputs_in_one_run(tmp_path, capsys):
    outs = [tmp_path / f"r.{ext}" for ext in ("json", "csv", "xlsx", "html")]
    code = main(["size", str(DEMO / "lines.csv"), "--criteria", str(DEMO / "criteria.toml"), "--no-plugins",
                 "--workers", "2", *[arg for out in outs for arg in ("--output", str(out))]])
    captured = capsys.readouterr()
    assert code in (0, 1) and "140-P-001" in captured.out  # the table still goes to stdout
    for out in outs:
        assert f"boresize: wrote {out}" in captured.err
    doc = json.loads(outs[0].read_text())
    tags = list(dict.fromkeys(row["tag"] for row in csv.DictReader(open(DEMO / "lines.csv", encoding="utf-8"))))
    assert [line["tag"] for line in doc["lines"]] == tags
    for line in doc["lines"]:
        assert CONTRACT_KEYS <= set(line)
        assert (len(line["cases"]) >= 3) == (line["tag"] in ("140-P-002", "140-CW-010", "140-G-030"))
        for case in line["cases"]:
            assert CONTRACT_KEYS <= set(case) and case["case"]
        if line["cases"]:
            assert line["case"] in {c["case"] for c in line["cases"]}
            assert set(line["governing"].values()) <= {c["case"] for c in line["cases"]}
    assert doc["traceability"]["lines_sha256"]
    with open(outs[1], encoding="utf-8-sig", newline="") as handle:
        assert sum(1 for _ in csv.reader(handle)) == 1 + 16  # header + one row per input row
    assert openpyxl.load_workbook(outs[2]).sheetnames == ["cover", "lines", "candidates"]
    HTMLParser().feed(outs[3].read_text(encoding="utf-8"))
    assert code == (0 if all(line["status"] == "pass" for line in doc["lines"]) else 1)


def test_json_mode_puts_the_summary_on_stderr(capsys):
    code = main(["size", "--fluid", "water", "--flow", "20 t/h", "--pressure", "3 barg", "--temperature", "25 degC",
                 "--json", "--no-plugins", "--progress"])
    captured = capsys.readouterr()
    assert code == 0
    # no timings unless asked for (--timings): the same input gives the same document
    assert json.loads(captured.out)["summary"] == {"lines": 1, "pass": 1, "fail": 0, "error": 0, "bare_pressure": 0}
    assert "1 line: 1 pass, 0 fail, 0 error" in captured.err
    assert "1/1" in captured.err  # the progress bar, asked for


@pytest.mark.parametrize(("argv", "message"), [
    (["--output", "r.ods"], "output: cannot tell what to write to 'r.ods' from its extension"),
    (["--output", "no-such-folder/r.json"], "output: folder 'no-such-folder' does not exist"),
    (["--workers", "0"], "--workers 0 is below 1"),
    (["--corroded-roughness", "0.5"], "corroded-roughness: missing unit in '0.5'"),
    (["--corroded-roughness", "0.5 bar"], "corroded-roughness: '0.5 bar' is a pressure"),
])
def test_bad_run_options_are_usage_errors(argv, message, capsys):
    code = main(["size", str(DEMO / "lines.csv"), "--no-plugins", *argv])
    err = capsys.readouterr().err
    assert code == 2 and message in err and "Traceback" not in err


def test_check_option_and_schedule_from_the_command_line(capsys):
    # NPS 2 Sch 80 inside diameter from fluids' ASME B36.10M table.
    from fluids.piping import nearest_pipe

    code = main(["size", "--fluid", "water", "--flow", "5 t/h", "--pressure", "3 barg", "--temperature", "25 degC",
                 "--nps", "2", "--schedule", "80", "--corroded-roughness", "0.5 mm", "--json", "--no-plugins"])
    line = json.loads(capsys.readouterr().out)["lines"][0]
    assert code in (0, 1)
    assert (line["mode"], line["nps"], line["schedule"]) == ("check", "2", "80")
    assert line["inside_diameter_mm"] == pytest.approx(nearest_pipe(NPS=2, schedule="80")[1] * 1e3, abs=0.01)
    assert line["roughness_mm"] == pytest.approx(0.5)
