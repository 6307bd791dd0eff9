"""Time per criterion (issue 14): each criterion's evaluate is timed over the run, the totals are in the run's
summary (``criterion_seconds``), and ``boresize size`` notes on stderr a criterion over the slow limits."""

from __future__ import annotations

import json
import os
import re
import subprocess
import sys
import time
from pathlib import Path
from typing import Any

from boresize.api import SLOW_CRITERION_SECONDS, SLOW_CRITERION_SHARE, CriterionTime, Run
from boresize.criteria.base import Criterion, verdict
from boresize.hookspecs import hookimpl
from boresize.io.line_items import line_items
from boresize.model import Verdict
from boresize.plugins import PluginHost
from boresize.sizing.batch import run_items
from boresize.sizing.engine import Sizer

WATER = {"fluid": "water", "flow": "20 t/h", "pressure": "5 barg", "temperature": "20 degC"}

PLUGIN = """
import time
from boresize.plugin import Criterion, hookimpl, verdict

LOADED = time.perf_counter()  # before the run starts (plugins load first)

class Sleepy(Criterion):
    id = "sleepy"
    title = "sleeps on its first call"
    source = "test"
    slept = False
    def evaluate(self, context):
        if not Sleepy.slept:
            Sleepy.slept = True
            # over SLOW_CRITERION_SECONDS (1 s), and longer than all the run before it (property libraries
            # loading on a busy machine included): over half of the sizing time, whatever the machine
            time.sleep(max(1.5, 1.2 * (time.perf_counter() - LOADED)))
        return verdict(self, "pass", "always fine")

@hookimpl
def boresize_register_criteria(register):
    register.add(Sleepy())
"""

CRITERIA = """
[service.sleepy]
phase = "liquid"
velocity = { max = "3 m/s" }
sleepy = {}

[service.liquid]
phase = "liquid"
velocity = { max = "3 m/s" }
"""


def _cli(tmp_path: Path, service: str) -> subprocess.CompletedProcess[str]:
    """``boresize size lines.csv --json`` with the plugin above installed as an entry point (a dist-info folder)."""
    (tmp_path / "sleepy_rule.py").write_text(PLUGIN, encoding="utf-8")
    info = tmp_path / "sleepy_rule-1.0.dist-info"
    info.mkdir(exist_ok=True)
    (info / "METADATA").write_text("Metadata-Version: 2.1\nName: sleepy-rule\nVersion: 1.0\n")
    (info / "entry_points.txt").write_text("[boresize]\nsleepy = sleepy_rule\n")
    (tmp_path / "criteria.toml").write_text(CRITERIA, encoding="utf-8")
    water = ",".join(WATER.values())
    (tmp_path / "lines.csv").write_text(f"tag,service,{','.join(WATER)}\nL-1,{service},{water}\n"
                                        f"L-2,liquid,{water}\n", encoding="utf-8")
    src = str(Path(__file__).resolve().parents[1] / "src")
    env = {**os.environ, "PYTHONPATH": os.pathsep.join([str(tmp_path), src])}
    return subprocess.run([sys.executable, "-m", "boresize", "size", "lines.csv", "--criteria", "criteria.toml",
                           "--json", "--timings"], cwd=tmp_path, env=env, capture_output=True, text=True, timeout=120)


def test_a_slow_plugin_is_noted_with_its_time_and_a_fast_builtin_is_not(tmp_path: Path) -> None:
    done = _cli(tmp_path, "sleepy")
    assert done.returncode == 0, done.stderr
    seconds = json.loads(done.stdout)["summary"]["criterion_seconds"]
    assert seconds["sleepy"] >= 1.5 and seconds["velocity"] < SLOW_CRITERION_SECONDS
    notes = [line for line in done.stderr.splitlines() if line.startswith("boresize: note: criterion")]
    assert len(notes) == 1, done.stderr
    assert re.fullmatch(r"boresize: note: criterion sleepy \(plugin sleepy\) took \d+\.\d s, \d+% of the "
                        r"\d+\.\d s of sizing", notes[0]), notes


def test_fast_builtins_get_no_note(tmp_path: Path) -> None:
    done = _cli(tmp_path, "liquid")  # the sleepy plugin is loaded but no line uses it
    assert done.returncode == 0, done.stderr
    assert "note: criterion" not in done.stderr
    seconds = json.loads(done.stdout)["summary"]["criterion_seconds"]
    assert "velocity" in seconds and "sleepy" not in seconds  # only criteria that judged a line are timed
    assert re.search(r"^boresize: time: criterion velocity \(plugin boresize\.criteria\.builtin\) \d+\.\d{3} s$",
                     done.stderr, re.M), done.stderr


class _Slow(Criterion):
    id = "slow"
    title = "sleeps 10 ms a call"
    source = "test"
    phases = frozenset({"liquid"})

    def evaluate(self, context: Any) -> Verdict:
        time.sleep(0.01)
        return verdict(self, "pass", "fine")


class _Plugin:
    @hookimpl
    def boresize_register_criteria(self, register: Any) -> None:
        register.add(_Slow())


def test_run_items_sums_the_seconds_of_each_criterion(tmp_path: Path) -> None:
    path = tmp_path / "criteria.toml"
    path.write_text('[service.slow]\nphase = "liquid"\nvelocity = { max = "3 m/s" }\nslow = {}\n', encoding="utf-8")
    sizer = Sizer(PluginHost.load(load_entry_points=False, extra=[_Plugin()]), criteria_file=path)
    items = line_items([({"tag": f"S-{i}", "service": "slow", **WATER}, {}) for i in range(3)]).items
    seconds: dict[str, float] = {}
    calls_before = sizer.criterion_seconds().get("slow", 0.0)
    run_items(items, sizer=sizer, criterion_seconds=seconds)
    assert calls_before == 0.0 and seconds["slow"] >= 3 * 0.01  # at least one 10 ms call a line
    assert 0.0 < seconds["velocity"] < seconds["slow"]
    again: dict[str, float] = {}
    run_items(items[:1], sizer=sizer, criterion_seconds=again)  # a later run counts only its own lines
    assert again["slow"] < seconds["slow"]


def test_slow_criteria_need_both_limits() -> None:
    times = (CriterionTime("a", "p", 5.0), CriterionTime("b", "p", 0.9), CriterionTime("c", "p", 3.0))
    run = Run((), None, None, criterion_times=times, sizing_seconds=20.0)  # type: ignore[arg-type]
    # 20 % of 20 s is 4 s: only "a"; with 10 s of sizing, 2 s: "a" and "c" (b is under 1 s)
    assert [t.ident for t in run.slow_criteria()] == ["a"]
    run = Run((), None, None, criterion_times=times, sizing_seconds=10.0)  # type: ignore[arg-type]
    assert [t.ident for t in run.slow_criteria()] == ["a", "c"]
    assert (SLOW_CRITERION_SECONDS, SLOW_CRITERION_SHARE) == (1.0, 0.2)
