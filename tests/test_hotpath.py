"""Issue 19's hot path: what a Sizer keeps from one line (CoolProp's states per point, the candidates per pipe
class) never changes another line's result, and a plugin's print() never reaches stdout (which may carry --json),
also with threads sizing at once.

Two lines that differ only in the fluid text are sized in both orders through one Sizer and against a fresh one.
The numbers are not asserted here (the properties tests hold them against CoolProp); only that what is kept is what
would be computed.
"""

from __future__ import annotations

import io
import sys
import threading
from typing import Any

import pytest

from boresize.api import make_line
from boresize.model import Line, LineResult
from boresize.plugins import PluginHost
from boresize.sizing.engine import Sizer


def _line(tag: str, fluid: str, **extra: Any) -> Line:
    return make_line(tag, fluid, "20 t/h", "5 barg", "30 degC", length="100 m", **extra)


def _key(result: LineResult) -> tuple[Any, ...]:
    """What a line's result says: status, size, properties and every verdict."""
    return (result.status, result.selected.candidate.nps if result.selected else None, result.error,
            result.state.fluid_name if result.state else None, result.state.density if result.state else None,
            result.state.validity if result.state else None,
            tuple((v.criterion, v.status, v.reasons) for v in (result.selected.verdicts if result.selected else ())))


@pytest.mark.parametrize(("first", "second"), [
    ("water", "methane"),  # a liquid and a gas: another fluid name, EOS limits and validity text
    ("water", "Water"),  # two spellings of one fluid: the same answer
    ("water", "unobtainium"),  # a known fluid, then an unknown one: an error, never the cached name
    ("water", "water:0.5, ethanol:0.5"),  # a pure fluid, then a mixture: another backend
])
def test_two_lines_that_differ_only_in_the_fluid_text(first: str, second: str) -> None:
    a, b = _line("A", first), _line("B", second)
    host = PluginHost.load(load_entry_points=False)
    shared = Sizer(host)
    forward = [_key(shared.run(line)) for line in (a, b)]
    backward = [_key(shared.run(line)) for line in (b, a)][::-1]
    fresh = [_key(Sizer(PluginHost.load(load_entry_points=False)).run(line)) for line in (a, b)]
    assert forward == backward == fresh


def test_a_plugin_print_goes_to_stderr_and_stdout_comes_back(host: PluginHost,
                                                              capsys: pytest.CaptureFixture[str]) -> None:
    """A criterion that prints while it judges writes to stderr (stdout may carry --json); stdout is restored
    after it, also when it raises and when threads size at once."""
    criterion = host.criteria.get("velocity")
    evaluate = criterion.evaluate

    def noisy(context: Any) -> Any:
        print("noise from a plugin")
        return evaluate(context)

    criterion.evaluate = noisy
    try:
        sizer = Sizer(host)
        stdout = sys.stdout
        result = sizer.run(_line("P", "water"))
        assert sys.stdout is stdout and result.status in ("pass", "fail")
        captured = capsys.readouterr()
        assert "noise" not in captured.out and "noise from a plugin" in captured.err
        errors: list[BaseException] = []

        def size_some() -> None:
            try:
                for _ in range(5):
                    sizer.run(_line("P", "water"))
            except BaseException as exc:  # noqa: BLE001 - reported by the assertion below
                errors.append(exc)

        threads = [threading.Thread(target=size_some) for _ in range(4)]
        for thread in threads:
            thread.start()
        for thread in threads:
            thread.join()
        assert not errors and sys.stdout is stdout
        assert "noise" not in capsys.readouterr().out
    finally:
        del criterion.evaluate


def test_stdout_is_restored_when_a_criterion_raises(host: PluginHost) -> None:
    criterion = host.criteria.get("velocity")

    def broken(context: Any) -> Any:
        raise KeyboardInterrupt

    criterion.evaluate = broken
    saved = sys.stdout
    sys.stdout = io.StringIO()
    try:
        stdout = sys.stdout
        with pytest.raises(KeyboardInterrupt):
            Sizer(host).run(_line("K", "water"))
        assert sys.stdout is stdout
    finally:
        sys.stdout = saved
        del criterion.evaluate
