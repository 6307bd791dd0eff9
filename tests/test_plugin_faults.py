"""Plugins that misbehave inside ``evaluate`` (issue 14): each fault is an error verdict naming the plugin, on its
own line, and never changes another line, stops the run, or corrupts the output."""

from __future__ import annotations

import json
import os
import subprocess
import sys
import textwrap
from pathlib import Path
from typing import Any

import pytest

from boresize.api import size_rows
from boresize.criteria.base import Criterion, OptionSpec, verdict
from boresize.hookspecs import hookimpl
from boresize.model import Verdict
from boresize.plugins import PluginHost
from boresize.sizing.engine import Sizer

# One water line, 20 t/h (the bad-input corpus's line, tests/io/corpus/plugins/lines.csv).
WATER = {"fluid": "water", "flow": "20 t/h", "pressure": "5 barg", "temperature": "20 degC"}


class _Greedy(Criterion):
    """A velocity limit that, on lines tagged WRITE-..., tries to tighten its own ``max`` for every later line."""

    id = "greedy-velocity"
    title = "writes to its options"
    source = "test"
    phases = frozenset({"liquid"})
    options = (OptionSpec("max", "velocity", default="3 m/s"),)

    def evaluate(self, context: Any) -> Verdict:
        if context.line.tag.startswith("WRITE"):
            context.options["max"] = 0.1  # 0.1 m/s would size every later line far larger
        value, limit = context.hydraulics.velocity, context.options["max"]
        return verdict(self, "pass" if value <= limit else "fail", f"velocity {value:.3g} m/s", value=value,
                       limit=limit, unit="m/s", utilisation=value / limit)


class _Plugin:
    def __init__(self, *criteria: object) -> None:
        self.criteria = criteria

    @hookimpl
    def boresize_register_criteria(self, register: Any) -> None:
        for criterion in self.criteria:
            register.add(criterion)


def _sizer(tmp_path: Path, *criteria: Criterion) -> Sizer:
    path = tmp_path / "criteria.toml"
    path.write_text("".join(textwrap.dedent(f"""
        [service.{c.id}]
        phase = "liquid"
        {c.id} = {{}}
    """) for c in criteria), encoding="utf-8")
    return Sizer(PluginHost.load(load_entry_points=False, extra=[_Plugin(*criteria)]), criteria_file=path)


def _row(tag: str, service: str) -> tuple[dict[str, str], dict[str, Any]]:
    return {"tag": tag, "service": service, **WATER}, {}


def test_options_are_read_only_and_a_write_changes_no_later_line(tmp_path: Path) -> None:
    sizer = _sizer(tmp_path, _Greedy())
    before, written, after = size_rows([_row("SAME-1", "greedy-velocity"), _row("WRITE-1", "greedy-velocity"),
                                        _row("SAME-2", "greedy-velocity")], sizer=sizer)
    assert written.status == "error"
    assert written.error == ("line WRITE-1: criterion 'greedy-velocity' of plugin '_Plugin' raised TypeError: "
                             "'mappingproxy' object does not support item assignment")
    assert before.status == after.status == "pass"
    assert after.selected is not None and before.selected is not None
    assert after.selected.candidate.nps == before.selected.candidate.nps


class _Returns(Criterion):
    """Returns the verdict it was built with (fields over a sound pass at 1 m/s against 3 m/s)."""

    title = "returns a given verdict"
    source = "test"
    phases = frozenset({"liquid"})

    def __init__(self, ident: str, **fields: Any) -> None:
        self.id = ident
        self.fields = {"criterion": ident, "status": "pass", "reasons": ("given",), "source": "test", "value": 1.0,
                       "limit": 3.0, "unit": "m/s", "utilisation": 1.0 / 3.0, **fields}

    def evaluate(self, context: Any) -> Verdict:
        return Verdict(**self.fields)


BAD_VERDICTS = [
    ("claims-velocity", {"criterion": "velocity"},
     "returned a verdict for criterion 'velocity', not its own id 'claims-velocity'"),
    ("status-ok", {"status": "ok"}, "returned status 'ok', not one of pass, fail, warn, not-applicable, error"),
    ("nan-value", {"value": float("nan")}, "returned value nan, not a number"),
    ("inf-value", {"value": float("inf")},
     "returned value inf, not a finite number (only a fail's utilisation may be infinite)"),
    ("minus-inf-limit", {"limit": float("-inf")},
     "returned limit -inf, not a finite number (only a fail's utilisation may be infinite)"),
    ("inf-pass", {"utilisation": float("inf")},
     "returned utilisation inf, not a finite number (only a fail's utilisation may be infinite)"),
    ("minus-inf-fail", {"status": "fail", "utilisation": float("-inf")},
     "returned utilisation -inf, not a finite number (only a fail's utilisation may be infinite)"),
]


def test_each_bad_verdict_is_an_error_naming_the_plugin_and_the_other_lines_are_sized(tmp_path: Path) -> None:
    criteria = [_Returns(ident, **fields) for ident, fields, _ in BAD_VERDICTS]
    rows = [_row(f"L-{ident}", ident) for ident, _, _ in BAD_VERDICTS]
    results = size_rows([_row("OK-1", "liquid"), *rows, _row("OK-2", "liquid")], sizer=_sizer(tmp_path, *criteria))
    assert [r.status for r in results] == ["pass", *["error"] * len(BAD_VERDICTS), "pass"]
    for result, (ident, _, what) in zip(results[1:], BAD_VERDICTS):
        assert result.error == f"line L-{ident}: criterion {ident!r} of plugin '_Plugin' {what}"


def test_an_infinite_utilisation_on_a_fail_is_kept(tmp_path: Path) -> None:
    # A fail that no size can meet (the built-in minimum velocity at zero flow, src/boresize/criteria/limits.py).
    never = _Returns("never-met", status="fail", utilisation=float("inf"))
    (result,) = size_rows([_row("L-1", "never-met")], sizer=_sizer(tmp_path, never))
    assert result.status == "fail"
    assert result.selected is not None and result.selected.verdicts[0].utilisation == float("inf")


PLUGIN = """
import sys
from boresize.plugin import Criterion, hookimpl, verdict

class Exits(Criterion):
    id = "exits"
    title = "calls sys.exit()"
    source = "test"
    def evaluate(self, context):
        sys.exit()

class Chatty(Criterion):
    id = "chatty"
    title = "prints while it judges"
    source = "test"
    def evaluate(self, context):
        print("chatty judges NPS", context.candidate.nps)
        return verdict(self, "pass", "always fine")

@hookimpl
def boresize_register_criteria(register):
    register.add(Exits())
    register.add(Chatty())
"""

CRITERIA = """
[service.exits]
phase = "liquid"
velocity = { max = "3 m/s" }
exits = {}

[service.chatty]
phase = "liquid"
velocity = { max = "3 m/s" }
chatty = {}
"""


def _cli(tmp_path: Path) -> subprocess.CompletedProcess[str]:
    """``boresize size lines.csv --json`` with the plugin above installed as an entry point (a dist-info folder, as
    tests/test_plugins.py installs one)."""
    (tmp_path / "faulty_rule.py").write_text(PLUGIN, encoding="utf-8")
    info = tmp_path / "faulty_rule-1.0.dist-info"
    info.mkdir()
    (info / "METADATA").write_text("Metadata-Version: 2.1\nName: faulty-rule\nVersion: 1.0\n")
    (info / "entry_points.txt").write_text("[boresize]\nfaulty = faulty_rule\n")
    (tmp_path / "criteria.toml").write_text(CRITERIA, encoding="utf-8")
    water = ",".join(WATER.values())
    (tmp_path / "lines.csv").write_text(f"tag,service,{','.join(WATER)}\nOK-1,liquid,{water}\n"
                                        f"EXIT-1,exits,{water}\nCHAT-1,chatty,{water}\nOK-2,liquid,{water}\n",
                                        encoding="utf-8")
    src = str(Path(__file__).resolve().parents[1] / "src")
    env = {**os.environ, "PYTHONPATH": os.pathsep.join([str(tmp_path), src])}
    return subprocess.run([sys.executable, "-m", "boresize", "size", "lines.csv", "--criteria", "criteria.toml",
                           "--json"], cwd=tmp_path, env=env, capture_output=True, text=True, timeout=120)


def test_sys_exit_in_a_plugin_errors_its_line_and_print_goes_to_stderr(tmp_path: Path) -> None:
    done = _cli(tmp_path)
    assert done.returncode == 1, done.stderr
    lines = {line["tag"]: line for line in json.loads(done.stdout)["lines"]}  # stdout is one valid JSON document
    assert [lines[tag]["status"] for tag in ("OK-1", "EXIT-1", "CHAT-1", "OK-2")] == ["pass", "error", "pass", "pass"]
    assert lines["EXIT-1"]["error"] == "line EXIT-1: criterion 'exits' of plugin 'faulty' raised SystemExit"
    assert "chatty judges NPS" in done.stderr
    assert "Traceback" not in done.stderr


class _Interrupted(Criterion):
    id = "interrupted"
    title = "the user presses Ctrl-C while it judges"
    source = "test"
    phases = frozenset({"liquid"})

    def evaluate(self, context: Any) -> Verdict:
        raise KeyboardInterrupt


def test_a_real_ctrl_c_in_a_plugin_still_stops_the_run(tmp_path: Path) -> None:
    from boresize.io.rows import line_from_row

    sizer = _sizer(tmp_path, _Interrupted())
    with pytest.raises(KeyboardInterrupt):
        sizer.run(line_from_row({"tag": "L-1", "service": "interrupted", **WATER}))


def _refuse(constant: str) -> None:
    raise ValueError(f"not strict JSON: {constant}")


def test_json_is_strict_an_infinite_utilisation_is_null_with_a_note(tmp_path: Path) -> None:
    from boresize.io.document import document, dumps_strict

    never = _Returns("never-met", status="fail", utilisation=float("inf"))
    results = size_rows([_row("L-1", "never-met")], sizer=_sizer(tmp_path, never))
    text = dumps_strict(document(results, criteria_source="test", lines_source="test"))
    (line,) = json.loads(text, parse_constant=_refuse)["lines"]
    assert line["utilisation"] is None
    assert "lines[0].utilisation inf is written as null (JSON has no NaN or infinity)" in line["notes"]
    assert line["verdicts"][0]["criterion"] == "never-met" and line["verdicts"][0]["utilisation"] is None


def test_dumps_strict_names_each_non_finite_number_in_the_nearest_notes() -> None:
    from boresize.io.document import dumps_strict

    payload = {"lines": [{"notes": ["kept"], "verdicts": [{"value": float("nan"), "limit": 3.0}]}],
               "total": float("-inf")}
    assert json.loads(dumps_strict(payload), parse_constant=_refuse) == {
        "lines": [{"notes": ["kept", "lines[0].verdicts[0].value nan is written as null (JSON has no NaN or "
                             "infinity)"], "verdicts": [{"value": None, "limit": 3.0}]}],
        "total": None}
