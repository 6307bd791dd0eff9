"""The plugin host: built-ins through the same hooks, entry points, duplicates, faulty plugins."""

from __future__ import annotations

import os
import subprocess
import sys
import textwrap
from pathlib import Path

import pytest

import boresize.plugins as plugins_module
from boresize.criteria.base import Criterion
from boresize.sizing.engine import Sizer
from boresize.errors import PluginError
from boresize.hookspecs import hookimpl
from boresize.io.rows import line_from_row
from boresize.plugins import PluginHost
from boresize.api import size_rows


def test_no_manager_is_built_at_import_time():
    assert not any(type(v).__name__ == "PluginManager" for v in vars(plugins_module).values())


def test_builtins_are_registered_through_the_hooks(host):
    assert {"erosional", "drop-per-length", "velocity"} <= set(host.criteria.ids())
    assert {"coolprop", "table"} <= set(host.backends.ids())
    assert "default" in host.pipe_classes
    assert host.criteria.owner("erosional") == "boresize.criteria.builtin"


class _Twin(Criterion):
    id = "velocity"
    title = "another velocity"
    source = "test"


class _TwinPlugin:
    @hookimpl
    def boresize_register_criteria(self, register):
        register.add(_Twin())


def test_duplicate_criterion_id_names_both_plugins():
    with pytest.raises(PluginError) as info:
        PluginHost.load(load_entry_points=False, extra=[_TwinPlugin()])
    assert str(info.value) == ("criterion id 'velocity' is registered twice: by plugin 'boresize.criteria.builtin' "
                               "and by plugin '_TwinPlugin'; uninstall one of them or rename the id")


class _Boom(Criterion):
    id = "boom"
    title = "raises"
    source = "test"

    def evaluate(self, context):
        raise ZeroDivisionError("division by zero in company rule")


class _WrongType(Criterion):
    id = "wrong-type"
    title = "returns a string"
    source = "test"

    def evaluate(self, context):
        return "pass"


class _FaultyPlugin:
    @hookimpl
    def boresize_register_criteria(self, register):
        register.add(_Boom())
        register.add(_WrongType())


def _criteria_file(tmp_path: Path) -> Path:
    path = tmp_path / "criteria.toml"
    path.write_text(textwrap.dedent("""
        [service.faulty]
        phase = "liquid"
        boom = {}
        wrong-type = {}
        velocity = { max = "3 m/s" }
    """))
    return path


def test_a_plugin_that_raises_gives_an_error_verdict_naming_it_and_the_batch_goes_on(tmp_path):
    host = PluginHost.load(load_entry_points=False, extra=[_FaultyPlugin()])
    sizer = Sizer(host, criteria_file=_criteria_file(tmp_path))
    rows = [
        ({"tag": "F-1", "fluid": "water", "flow": "10 t/h", "pressure": "3 barg", "temperature": "20 degC",
          "service": "faulty"}, {}),
        ({"tag": "F-2", "fluid": "water", "flow": "10 t/h", "pressure": "3 barg", "temperature": "20 degC",
          "service": "liquid"}, {}),
    ]
    first, second = size_rows(rows, sizer=sizer)
    assert first.status == "error"
    assert "criterion 'boom' of plugin '_FaultyPlugin' raised ZeroDivisionError" in first.error
    boom = [v for v in first.candidates[0].verdicts if v.criterion == "boom"][0]
    wrong = [v for v in first.candidates[0].verdicts if v.criterion == "wrong-type"][0]
    assert boom.status == "error" and wrong.status == "error"
    assert "returned str, not a Verdict" in wrong.reason
    assert second.status == "pass"


def test_entry_points_are_loaded(tmp_path, monkeypatch):
    # A minimal installed distribution: a dist-info folder with an entry point in group "boresize".
    (tmp_path / "acme_rule.py").write_text(textwrap.dedent("""
        from boresize.plugin import Criterion, hookimpl, verdict

        class AcmeRule(Criterion):
            id = "acme-rule"
            title = "Acme rule"
            source = "company"
            def evaluate(self, context):
                return verdict(self, "pass", "always fine")

        @hookimpl
        def boresize_register_criteria(register):
            register.add(AcmeRule())
    """))
    info = tmp_path / "acme_rule-1.0.dist-info"
    info.mkdir()
    (info / "METADATA").write_text("Metadata-Version: 2.1\nName: acme-rule\nVersion: 1.0\n")
    (info / "entry_points.txt").write_text("[boresize]\nacme = acme_rule\n")
    monkeypatch.syspath_prepend(str(tmp_path))
    host = PluginHost.load()
    assert "acme-rule" in host.criteria
    assert host.criteria.owner("acme-rule") == "acme"
    sys.modules.pop("acme_rule", None)


def test_a_plugin_that_cannot_import_is_named(tmp_path, monkeypatch):
    info = tmp_path / "broken-1.0.dist-info"
    info.mkdir()
    (info / "METADATA").write_text("Metadata-Version: 2.1\nName: broken\nVersion: 1.0\n")
    (info / "entry_points.txt").write_text("[boresize]\nbroken = no_such_module_here\n")
    monkeypatch.syspath_prepend(str(tmp_path))
    with pytest.raises(PluginError, match="plugin 'broken' .* failed to load: ModuleNotFoundError"):
        PluginHost.load()


def test_line_from_row_is_the_same_line_the_engine_sees():
    line = line_from_row({"tag": "A", "fluid": "water", "flow": "1 kg/s", "pressure": "2 bar",
                          "temperature": "300 K"})
    assert (line.flow.value, line.pressure, line.temperature) == (1.0, 2e5, 300.0)


def _criteria_command(trace: str | None) -> subprocess.CompletedProcess[str]:
    """``python -m boresize criteria --no-plugins`` in a fresh process, with BORESIZE_TRACE_HOOKS set or not."""
    env = {k: v for k, v in os.environ.items() if k not in ("PYTHONPATH", "BORESIZE_TRACE_HOOKS")}
    env["PYTHONPATH"] = str(Path(plugins_module.__file__).resolve().parents[1])
    if trace is not None:
        env["BORESIZE_TRACE_HOOKS"] = trace
    return subprocess.run([sys.executable, "-m", "boresize", "criteria", "--no-plugins"], env=env,
                          capture_output=True, text=True, timeout=120)


def test_trace_hooks_prints_each_hook_call_with_its_plugin_and_what_it_registered():
    run = _criteria_command("1")
    assert run.returncode == 0 and "Installed criteria:" in run.stdout
    assert run.stderr.splitlines() == [
        "boresize: trace: boresize_register_criteria(register) of plugin 'boresize.criteria.builtin' registered "
        "criterion erosional, drop-per-length, velocity, npsh-margin, gravity-drain, flashing, momentum, "
        "noise-velocity, mach, outlet-pressure, property-crosscheck, flow-regime, line-feasibility",
        "boresize: trace: boresize_register_property_backends(register) of plugin 'boresize.properties.builtin' "
        "registered property backend table, coolprop, aqueous, aqueous-mixing, coolprop-mixture, gerg-2008, thermo",
        "boresize: trace: boresize_register_pipe_classes(register) of plugin 'boresize.pipes.builtin' registered "
        "pipe class default",
    ]


@pytest.mark.parametrize("trace", [None, "", "0"])
def test_without_trace_hooks_nothing_is_traced(trace: str | None):
    run = _criteria_command(trace)
    assert (run.returncode, run.stderr) == (0, "")


class _Quiet:
    @hookimpl
    def boresize_register_pipe_classes(self, register):
        pass


def test_a_plugin_that_registers_nothing_is_traced_after_the_builtins(monkeypatch, capsys):
    monkeypatch.setenv("BORESIZE_TRACE_HOOKS", "1")
    PluginHost.load(load_entry_points=False, extra=[_Quiet()])
    lines = capsys.readouterr().err.splitlines()
    assert [line.split(" registered ")[0] for line in lines] == [
        "boresize: trace: boresize_register_criteria(register) of plugin 'boresize.criteria.builtin'",
        "boresize: trace: boresize_register_property_backends(register) of plugin 'boresize.properties.builtin'",
        "boresize: trace: boresize_register_pipe_classes(register) of plugin 'boresize.pipes.builtin'",
        "boresize: trace: boresize_register_pipe_classes(register) of plugin '_Quiet'",
    ]
    assert lines[-1].endswith(" registered nothing")
