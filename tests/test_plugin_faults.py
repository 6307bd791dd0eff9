"""Plugins that misbehave inside ``evaluate`` (issue 14): each fault is an error verdict naming the plugin, on its
own line, and never changes another line, stops the run, or corrupts the output."""

from __future__ import annotations

import textwrap
from pathlib import Path
from typing import Any

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
