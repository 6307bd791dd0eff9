"""The command line: JSON contract of the README, exit codes, errors without tracebacks."""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

import pytest

from boresize.cli import main

ROOT = Path(__file__).resolve().parents[2]
DEMO = ROOT / "examples" / "demo-unit"
CONTRACT_KEYS = {"tag", "status", "nps", "schedule", "inside_diameter_mm", "velocity_m_s", "dp_kpa_per_100m",
                 "density_kg_m3", "viscosity_mpa_s", "controlling", "verdicts"}


def _run(capsys, *argv: str) -> tuple[int, str, str]:
    code = main(["size", *argv, "--no-plugins"] if argv and argv[0] != "--" else list(argv))
    out, err = capsys.readouterr()
    return code, out, err


def test_demo_json_follows_the_contract(capsys):
    code, out, _ = _run(capsys, str(DEMO / "lines.csv"), "--criteria", str(DEMO / "criteria.toml"), "--json")
    doc = json.loads(out)
    tags = [line["tag"] for line in doc["lines"]]
    # one entry per line: the rows of a line's operating cases share its tag
    csv_tags = list(dict.fromkeys(row.split(",")[0] for row in (DEMO / "lines.csv").read_text().splitlines()[1:]
                                  if row.strip()))
    assert tags == csv_tags
    for line in doc["lines"]:
        assert CONTRACT_KEYS <= set(line)
        assert line["status"] in ("pass", "fail", "error")
        if line["status"] == "error":
            assert line["error"]
        for verdict in line["verdicts"]:
            assert {"criterion", "status", "value", "limit", "unit", "reason"} <= set(verdict)
        if line["status"] != "error":  # the calculation record names its property source, version and method
            assert line["property_source"] and line["property_backend_version"] and line["drop_method"]
            assert line["choked"] is False
    assert code == (0 if all(line["status"] == "pass" for line in doc["lines"]) else 1)
    assert "screening" in doc["caution"]


def test_table_output_carries_the_caution(capsys):
    code, out, _ = _run(capsys, str(DEMO / "lines.csv"), "--criteria", str(DEMO / "criteria.toml"))
    assert "140-P-001" in out and "CAUTION" in out and "competent engineer" in out
    assert code in (0, 1)


def test_one_line_from_options(capsys):
    code, out, _ = _run(capsys, "--tag", "X-1", "--fluid", "water", "--flow", "20 t/h", "--pressure", "3 barg",
                        "--temperature", "25 degC", "--json")
    line = json.loads(out)["lines"][0]
    assert (code, line["tag"], line["status"]) == (0, "X-1", "pass")


def test_bad_line_is_an_error_entry_and_exit_1(tmp_path, capsys):
    csv = tmp_path / "lines.csv"
    csv.write_text("tag,fluid,flow,pressure,temperature\nA,water,10 t/h,3 barg,20 degC\n"
                   "B,water,10 bar,3 barg,20 degC\nC,water,12 t/h,3 barg,20 degC\n")
    code, out, err = _run(capsys, str(csv), "--json")
    lines = json.loads(out)["lines"]
    assert code == 1
    assert [line["status"] for line in lines] == ["pass", "error", "pass"]
    assert lines[1]["error"].startswith("line B: flow: ")
    assert "Traceback" not in err


@pytest.mark.parametrize("argv", [["size", "no-such-file.csv"], ["size", "--bogus"], ["size"],
                                  ["size", str(DEMO / "lines.csv"), "--criteria", "missing.toml"]])
def test_usage_errors_exit_2_without_traceback(argv, capsys):
    try:
        code = main(argv)
    except SystemExit as exc:  # argparse exits 2 itself on unknown options
        code = exc.code
    _, err = capsys.readouterr()
    assert code == 2
    assert "Traceback" not in err and "error" in err


def test_bad_criteria_file_is_a_clear_usage_error(tmp_path, capsys):
    bad = tmp_path / "c.toml"
    bad.write_text('[service.liquid]\nvelocty = { max = "3 m/s" }\n')
    code, _, err = _run(capsys, str(DEMO / "lines.csv"), "--criteria", str(bad))
    assert code == 2
    assert "service.liquid.velocty: unknown criterion 'velocty'" in err


def test_criteria_and_pipes_listings(capsys):
    assert main(["criteria", "--no-plugins"]) == 0
    out = capsys.readouterr().out
    assert "erosional" in out and "pump-suction" in out
    assert main(["pipes", "--no-plugins"]) == 0
    assert "default" in capsys.readouterr().out
    assert main(["pipes", "--nps", "4", "--no-plugins"]) == 0
    assert "102.26" in capsys.readouterr().out  # NPS 4 Sch 40 ID, ASME B36.10M


def test_help_does_not_import_coolprop():
    # measured here: importing CoolProp costs ~2.5 s; --help must not pay it.
    code = ("import sys; from boresize.cli import main\n"
            "try:\n    main(['--help'])\nexcept SystemExit:\n    pass\n"
            "print('CoolProp' in sys.modules)")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True).stdout
    assert out.strip().endswith("False")


def test_console_script_runs_without_traceback(tmp_path):
    exe = Path(sys.executable).with_name("boresize")
    proc = subprocess.run([str(exe), "size", "--fluid", "water", "--flow", "abc t/h", "--pressure", "3 barg",
                           "--temperature", "20 degC", "--no-plugins"], capture_output=True, text=True)
    assert proc.returncode == 1
    assert "Traceback" not in proc.stderr + proc.stdout
    assert "flow" in proc.stdout


@pytest.mark.parametrize("argv", [["--help"], ["size", "--help"], ["criteria", "--help"], ["pipes", "--help"]])
def test_every_help_page_prints(argv, capsys):
    with pytest.raises(SystemExit) as info:
        main(argv)
    assert info.value.code == 0
    assert "usage: boresize" in capsys.readouterr().out


def test_headroom_option_reports_the_flow_a_velocity_limit_allows(tmp_path, capsys):
    # Only a velocity limit of 3 m/s: the boundary flow is 3 m/s x rho x bore area. Bore of NPS 4 Sch 40 from
    # the fluids library (ASME B36.10M), density of water at 20 degC and 5 barg from CoolProp (IAPWS-95).
    import math

    from CoolProp.CoolProp import PropsSI
    from fluids.piping import nearest_pipe

    criteria = tmp_path / "c.toml"
    criteria.write_text('[service.only-velocity]\nphase = "liquid"\nvelocity = { max = "3 m/s" }\n')
    code, out, _ = _run(capsys, "--tag", "H-1", "--fluid", "water", "--flow", "72 t/h", "--pressure", "5 barg",
                        "--temperature", "20 degC", "--nps", "4", "--service", "only-velocity",
                        "--criteria", str(criteria), "--headroom", "--json")
    entry = json.loads(out)["lines"][0]
    rho = PropsSI("D", "T", 293.15, "P", 601325.0, "Water")
    bore = nearest_pipe(NPS=4, schedule="40")[1]
    expected = (3.0 * rho * math.pi * bore**2 / 4) / (72_000 / 3600) - 1.0
    assert code == 0
    assert entry["headroom_percent"] == pytest.approx(expected * 100, abs=0.05)
    assert entry["headroom_limited_by"] == ["velocity"]


def test_every_size_rates_from_the_smallest_and_selects_the_same(capsys):
    # The selection's definition (smallest passing size, every size rated from the smallest) against the guided
    # scan the CLI uses by default; the record of --every-size starts at the pipe class's smallest size.
    args = (str(DEMO / "lines.csv"), "--criteria", str(DEMO / "criteria.toml"), "--json")
    guided = json.loads(_run(capsys, *args)[1])["lines"]
    every = json.loads(_run(capsys, *args, "--every-size")[1])["lines"]
    keys = ("status", "nps", "schedule", "controlling", "verdicts", "governing")
    assert [[g.get(k) for k in keys] for g in guided] == [[e.get(k) for k in keys] for e in every]
    sized = [(g, e) for g, e in zip(guided, every) if g["mode"] == "size" and g["status"] == "pass"]
    assert sized and all(e["candidates"][0]["nps"] == "1/2" for _, e in sized)  # the default class starts at 1/2
    assert sum(len(g["candidates"]) for g, _ in sized) < sum(len(e["candidates"]) for _, e in sized)


def test_the_command_line_imports_only_the_public_api():
    import ast

    allowed = ("boresize", "boresize.api", "boresize.errors")
    reached = {}
    for path in sorted((ROOT / "src" / "boresize" / "cli").glob("*.py")):
        for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
            names = [node.module or ""] if isinstance(node, ast.ImportFrom) else \
                [a.name for a in node.names] if isinstance(node, ast.Import) else []
            for name in names:
                if name.startswith("boresize") and name not in allowed and \
                        not name.startswith(("boresize.api.", "boresize.cli")):
                    reached.setdefault(path.name, []).append(name)
    assert reached == {}


def test_a_usage_error_is_of_the_error_tree_and_still_importable_from_the_commands():
    from boresize.cli.commands import UsageError as FromCommands
    from boresize.errors import BoresizeError, UsageError

    assert FromCommands is UsageError and issubclass(UsageError, BoresizeError)


def test_a_line_list_on_standard_input_is_read_as_csv(capsys, monkeypatch):
    import io

    text = "tag,fluid,flow,pressure,temperature\nW-1,water,20 t/h,3 barg,25 degC\n"
    monkeypatch.setattr(sys, "stdin", io.StringIO(text))
    code, out, _ = _run(capsys, "-", "--json")
    doc = json.loads(out)
    assert code == 0 and doc["lines_source"] == "<stdin>" and [line["tag"] for line in doc["lines"]] == ["W-1"]
    assert doc["lines"][0]["input"] == {"tag": "W-1", "fluid": "water", "flow": "20 t/h", "pressure": "3 barg",
                                        "temperature": "25 degC"}


def test_one_saturated_line_by_quality_and_one_with_its_vapour_pressure(capsys):
    import json

    from CoolProp.CoolProp import PropsSI

    code, out, _ = _run(capsys, "--fluid", "water", "--flow", "8 t/h", "--pressure", "10 bar", "--quality", "1",
                        "--json")
    entry = json.loads(out)["lines"][0]
    # saturated steam at 10 bar abs (CoolProp, Q = 1), to the 6 significant figures of the record
    assert code == 0 and entry["density_kg_m3"] == pytest.approx(PropsSI("D", "P", 1e6, "Q", 1, "Water"), rel=1e-5)
    code, out, _ = _run(capsys, "--fluid", "fuel oil", "--density", "950 kg/m3", "--viscosity", "120 cP",
                        "--flow", "10 t/h", "--pressure", "4 barg", "--temperature", "60 degC",
                        "--vapour-pressure", "0.02 bar", "--json")
    entry = json.loads(out)["lines"][0]
    assert code == 0 and entry["vapour_pressure_bar_abs"] == pytest.approx(0.02)


_ONE_CSV = "tag,fluid,flow,pressure,temperature\nW-1,water,20 t/h,3 barg,25 degC\n"
_ONE_TOML = '[[line]]\ntag = "W-1"\nfluid = "water"\nflow = "20 t/h"\npressure = "3 barg"\ntemperature = "25 degC"\n'


class _Stdin:
    """Standard input with a binary buffer, as a pipe gives."""

    def __init__(self, data: bytes) -> None:
        import io

        self.buffer = io.BytesIO(data)


def test_standard_input_sniffs_csv_toml_and_xlsx(capsys, monkeypatch, tmp_path):
    for data in (_ONE_CSV.encode(), _ONE_TOML.encode(), b"# a comment first\n" + _ONE_TOML.encode()):
        monkeypatch.setattr(sys, "stdin", _Stdin(data))
        code, out, _ = _run(capsys, "-", "--json")
        doc = json.loads(out)
        assert (code, doc["lines_source"], [line["tag"] for line in doc["lines"]]) == (0, "<stdin>", ["W-1"])
    csv = tmp_path / "lines.csv"
    csv.write_text(_ONE_CSV, encoding="utf-8")
    assert _run(capsys, str(csv), "-o", str(tmp_path / "lines.xlsx"))[0] == 0
    data = (tmp_path / "lines.xlsx").read_bytes()
    for extra in ([], ["--format", "xlsx"]):
        monkeypatch.setattr(sys, "stdin", _Stdin(data))
        code, out, _ = _run(capsys, "-", "--json", *extra)
        doc = json.loads(out)
        assert (code, doc["lines_source"], [line["tag"] for line in doc["lines"]]) == (0, "<stdin>", ["W-1"])
        assert doc["traceability"]["lines_sha256"] == __import__("hashlib").sha256(data).hexdigest()


def test_format_forces_the_reading_of_standard_input(capsys, monkeypatch):
    monkeypatch.setattr(sys, "stdin", _Stdin(_ONE_TOML.encode()))
    code, _, err = _run(capsys, "-", "--format", "csv")
    assert code == 2 and err.startswith("boresize: error: header: ")  # TOML read as CSV has no such header
    monkeypatch.setattr(sys, "stdin", _Stdin(_ONE_CSV.encode()))
    code, _, err = _run(capsys, "-", "--format", "xlsx")
    assert (code, err) == (2, "boresize: error: lines: <stdin> is not an XLSX workbook (it does not start as a zip "
                              "file does, with PK); expected an .xlsx workbook's bytes, or --format csv or toml\n")


def test_a_bad_format_is_a_usage_error(capsys, monkeypatch):
    monkeypatch.setattr(sys, "stdin", _Stdin(_ONE_CSV.encode()))
    with pytest.raises(SystemExit) as exit_:
        main(["size", "-", "--format", "json"])
    assert exit_.value.code == 2 and capsys.readouterr().err.endswith(
        "boresize size: error: argument --format: invalid choice: 'json' (choose from 'csv', 'toml', 'xlsx')\n")
    code, _, err = _run(capsys, str(DEMO / "lines.csv"), "--format", "csv")
    assert (code, err) == (2, "boresize: error: --format csv is for a line list on standard input (-); a file's "
                              "extension gives its format\n")


@pytest.mark.parametrize("data", [b"", b"  \n\n", b"\r\n"])
def test_empty_standard_input_is_named(data, capsys, monkeypatch):
    monkeypatch.setattr(sys, "stdin", _Stdin(data))
    code, out, err = _run(capsys, "-")
    assert (code, out) == (2, "")
    assert err == ("boresize: error: lines: standard input is empty: nothing to size; expected a line list (CSV, "
                   "TOML or XLSX) piped in, e.g. boresize size - < lines.csv\n")


def test_quiet_prints_no_table_no_summary_but_errors_and_one_caution_line(capsys, monkeypatch, tmp_path):
    monkeypatch.setattr(sys, "stdin", _Stdin((_ONE_CSV + "B,water,10 bar,3 barg,20 degC\n").encode()))
    code, out, err = _run(capsys, "-", "--quiet", "-o", str(tmp_path / "r.json"))
    assert (code, out) == (1, "")
    assert err.splitlines() == [
        "boresize: error: line B: flow: '10 bar' is a pressure, not a flow; expected a mass flow (kg/h, t/h, kg/s, "
        "lb/h), a volume flow (m3/h, l/min, gpm), a standard gas volume flow (Sm3/h, Nm3/h, MMSCFD) or a molar flow (kmol/h, lbmol/h)",
        "boresize: screening calculations: check them against the applicable codes and your company's standards "
        "before use"]
    assert json.loads((tmp_path / "r.json").read_text(encoding="utf-8"))["summary"]["error"] == 1
    monkeypatch.setattr(sys, "stdin", _Stdin(_ONE_CSV.encode()))
    code, out, err = _run(capsys, "-", "--quiet", "--json")
    assert code == 0 and json.loads(out)["summary"]["pass"] == 1 and len(err.splitlines()) == 1


def test_a_csv_sniffed_as_toml_says_how_to_read_it_as_csv(capsys, monkeypatch):
    monkeypatch.setattr(sys, "stdin", _Stdin(b"[tag],fluid,flow\nA,water,1 t/h\n"))
    code, _, err = _run(capsys, "-")
    assert code == 2 and err.startswith("boresize: error: lines: <stdin> is not valid TOML: ")
    assert err.endswith("; expected a TOML line list (read as TOML because its first line starts with [; "
                        "--format csv reads it as CSV)\n")
