"""Control and format characters in echoed text (issue 14): escaped in the terminal table and in CLI messages,
kept exact in the data outputs (JSON, CSV)."""

from __future__ import annotations

import csv
import json
from pathlib import Path

import pytest

from boresize.cli.main import main
from boresize.report.printable import printable

# ESC [31m (red), BEL, CR and U+202E (right-to-left override): each changes what a terminal shows if printed raw.
HOSTILE = "T-\x1b[31m1\x07\r\u202e9"
SHOWN = "T-\\x1b[31m1\\x07\\r\\u202e9"


def test_printable_escapes_as_python_writes_escapes():
    assert printable(HOSTILE) == SHOWN
    assert printable("a\nb\tc") == "a\\nb\\tc" and printable("a\nb", newlines=True) == "a\nb"
    assert printable("P-101 °C µ ñ 水") == "P-101 °C µ ñ 水"  # printable text is untouched
    assert printable("\u2028\u2066\x00\x7f\U000e0001") == "\\u2028\\u2066\\x00\\x7f\\U000e0001"
    assert printable(SHOWN) == SHOWN  # escaping twice changes nothing


def _lines(tmp_path: Path, fluid: str = "water") -> Path:
    path = tmp_path / "lines.csv"
    with path.open("w", encoding="utf-8", newline="") as handle:
        csv.writer(handle).writerows([("tag", "fluid", "flow", "pressure", "temperature"),
                                      (HOSTILE, fluid, "20 t/h", "5 barg", "20 degC")])
    return path


def test_a_hostile_tag_is_escaped_in_the_table_and_exact_in_json_and_csv(tmp_path, capsys):
    lines = _lines(tmp_path)
    assert main(["size", str(lines), "--no-plugins", "-o", str(tmp_path / "out.csv"),
                 "-o", str(tmp_path / "out.json")]) == 0
    out = capsys.readouterr().out
    # the CSV reader reads the quoted CR of the cell as a line break: the tag as read is the data
    assert SHOWN.replace("\\r", "\\n") in out and not any(ch in out for ch in "\x1b\x07\r\u202e")
    tag = json.loads((tmp_path / "out.json").read_text(encoding="utf-8"))["lines"][0]["tag"]
    assert tag == HOSTILE.replace("\r", "\n")
    with (tmp_path / "out.csv").open(encoding="utf-8", newline="") as handle:
        assert any(tag in row for row in csv.reader(handle))  # the exact text, as data


def test_an_error_message_echoing_a_value_is_escaped_on_stderr(tmp_path, capsys):
    criteria = tmp_path / "criteria.toml"
    criteria.write_text('[service."liq\\u001b[31m\\u0007\\r\\u202e"]\nphase = "liquid"\nbogus = {}\n',
                        encoding="utf-8")
    assert main(["size", str(_lines(tmp_path)), "--no-plugins", "--criteria", str(criteria)]) == 2
    err = capsys.readouterr().err
    assert err.startswith("boresize: error: service.liq\\x1b[31m\\x07\\r\\u202e.bogus: unknown criterion 'bogus'")
    assert not any(ch in err for ch in "\x1b\x07\r\u202e")


@pytest.mark.parametrize("fluid", ["wat\x1b[31mer", "water\u202e"])
def test_a_line_error_echoing_a_value_is_escaped_in_the_table(tmp_path, capsys, fluid):
    assert main(["size", str(_lines(tmp_path, fluid)), "--no-plugins"]) == 1
    out = capsys.readouterr().out
    assert "  ERROR line T-\\x1b[31m1\\x07\\n\\u202e9: fluid: " in out
    assert not any(ch in out for ch in "\x1b\x07\r\u202e")


def test_a_tag_given_on_the_command_line_keeps_its_cr_escaped(capsys):
    assert main(["size", "--tag", HOSTILE, "--fluid", "water", "--flow", "20 t/h", "--pressure", "5 barg",
                 "--temperature", "20 degC", "--no-plugins"]) == 0
    out = capsys.readouterr().out
    assert out.splitlines()[2].startswith(SHOWN + "  ") and not any(ch in out for ch in "\x1b\x07\r\u202e")
