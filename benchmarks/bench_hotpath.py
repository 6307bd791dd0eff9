"""Benchmark: the per-line CPU cost of reading and sizing a line list in one process, without start-up.

Issue 19's per-line figure: the list is read (``read_line_list`` then ``line_items``: each row to a ``Line``) and
sized line by line through one ``Sizer`` (the demo unit's criteria) with a fresh plugin host each round, so that
the property caches start empty as in a run of the command line. Prints the CPU seconds of this process for each
phase, the least of ``--repeat`` rounds, and the milliseconds per line. A round before the timed ones imports
CoolProp, pint and the criteria (start-up is not measured here; ``bench_scale.py`` measures the whole command).

With ``--trick NAME`` it measures one trick of the hot path instead: rounds with the trick and without it
(switched off by patching) alternate, and it prints the median CPU seconds of the sizing phase of each and the
gain in % of the time without it:

* ``stdout-swap``: the engine's counted swap of stdout to stderr instead of ``contextlib.redirect_stdout``.
* ``lean-records``: ``dict-filled`` and ``one-text`` together, each under 10 % alone:
* ``dict-filled``: the hot records (``Hydraulics``, ``Verdict``, ``CandidateResult``, ``FluidState``,
  ``CriterionContext``) filled through their ``__dict__`` (``boresize.model.filled_through_dict``) instead of
  the ``__init__`` ``@dataclass(frozen=True)`` writes, one ``object.__setattr__`` a field;
* ``one-text``: ``criteria.limits.judge_range`` writes only the reason text it returns, not all three endings.

With ``--rating`` a trick is measured on the rating of the candidates alone (``Sizer._rate_all``; each line's
properties and service found outside the timing), the least of the rounds printed beside the medians.

    PYTHONPATH=src python benchmarks/bench_hotpath.py --lines 2000
    PYTHONPATH=src python benchmarks/bench_hotpath.py --trick stdout-swap --repeat 5
    PYTHONPATH=src python benchmarks/bench_hotpath.py --trick lean-records --rating --repeat 11
"""

from __future__ import annotations

import argparse
import contextlib
import statistics
import sys
from collections.abc import Iterator
from typing import Any
import tempfile
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))

from bench_scale import build_pure_list  # noqa: E402

from boresize.criteria import drop_per_length, mach, momentum, velocity  # noqa: E402
from boresize.criteria.base import verdict  # noqa: E402
from boresize.io.line_items import line_items  # noqa: E402
from boresize.io.read import read_line_list  # noqa: E402
from boresize.model import PLAIN_INITS, Line  # noqa: E402
from boresize.plugins import PluginHost  # noqa: E402
from boresize.sizing.engine import Sizer  # noqa: E402

import boresize.sizing.engine as engine  # noqa: E402

CRITERIA = Path(__file__).resolve().parents[1] / "examples" / "demo-unit" / "criteria.toml"


def rating_round(path: Path) -> tuple[float, float, int]:
    """(CPU seconds reading and preparing, CPU seconds rating, lines) of one round that rates each line's
    candidates alone (``Sizer._rate_all`` on each line made ready by ``Sizer._prepare`` outside the timing)."""
    start = time.process_time()
    items = line_items(read_line_list(path).pairs()).items
    sizer = Sizer(PluginHost.load(load_entry_points=False), criteria_file=CRITERIA)
    ready = [sizer._prepare(item) for item in items if isinstance(item, Line)]
    begin = time.process_time()
    for p in ready:
        sizer._rate_all(p)
    return begin - start, time.process_time() - begin, len(items)


def one_round(path: Path) -> tuple[float, float, int]:
    """(CPU seconds reading, CPU seconds sizing, lines) of one round."""
    start = time.process_time()
    items = line_items(read_line_list(path).pairs()).items
    read = time.process_time()
    sizer = Sizer(PluginHost.load(load_entry_points=False), criteria_file=CRITERIA)
    begin = time.process_time()
    for item in items:
        if isinstance(item, Line):
            sizer.run_safely(item)
        elif isinstance(item, tuple):
            sizer.run_cases([case for case in item if isinstance(case, Line)])
    return read - start, time.process_time() - begin, len(items)


def _plain_judge_range(criterion: object, value_si: float, options: Any, noun: str, unit: str, scale: float,
                       where: str = "") -> Any:
    """``limits.judge_range`` before ``one-text``: the three endings of a reason written for every verdict."""
    shown = value_si / scale
    high, low = options.get("max"), options.get("min")
    util_high = value_si / high if high else 0.0
    util_low = low / value_si if low and value_si > 0 else (float("inf") if low else 0.0)
    above = f" {unit} above the maximum {high / scale:.3g} {unit}" if high is not None else ""
    below = f" {unit} below the minimum {low / scale:.3g} {unit}" if low is not None else ""
    bounds = " and ".join(text for text in (f"at most {high / scale:.3g} {unit}" if high is not None else "",
                                            f"at least {low / scale:.3g} {unit}" if low is not None else "") if text)
    within = f" {unit} is {bounds}"
    if high is not None and value_si > high:
        return verdict(criterion, "fail", f"{noun} {shown:.3g}{above}{where}", value=shown, limit=high / scale,
                       unit=unit, utilisation=util_high)
    if low is not None and value_si < low:
        return verdict(criterion, "fail", f"{noun} {shown:.3g}{below}{where}", value=shown, limit=low / scale,
                       unit=unit, utilisation=util_low)
    binding = high if util_high >= util_low else low
    return verdict(criterion, "pass", f"{noun} {shown:.3g}{within}{where}", value=shown,
                   limit=(binding or 0.0) / scale, unit=unit, utilisation=max(util_high, util_low))


_DICT_FILLED = [(cls, "__init__", init) for cls, init in PLAIN_INITS.items()]
_ONE_TEXT = [(module, "judge_range", _plain_judge_range) for module in (velocity, drop_per_length, momentum, mach)]

#: trick -> (object, attribute, the value without the trick)
OFF: dict[str, list[tuple[Any, str, Any]]] = {
    "stdout-swap": [(engine, "_QUIET", contextlib.redirect_stdout(sys.stderr))],
    "dict-filled": _DICT_FILLED,
    "one-text": _ONE_TEXT,
    "lean-records": _DICT_FILLED + _ONE_TEXT,
}


@contextlib.contextmanager
def switched_off(trick: str, off: bool) -> Iterator[None]:
    kept = [(owner, name, getattr(owner, name)) for owner, name, _ in OFF[trick]]
    if off:
        for owner, name, plain in OFF[trick]:
            setattr(owner, name, plain)
    try:
        yield
    finally:
        for owner, name, value in kept:
            setattr(owner, name, value)


def measure(trick: str, path: Path, repeat: int, rating: bool = False) -> None:
    """Rounds with and without ``trick``, alternating which goes first; ``rating``: time the rating alone."""
    round_of = rating_round if rating else one_round
    times: dict[bool, list[float]] = {True: [], False: []}
    for i in range(repeat):
        for off in ((False, True) if i % 2 else (True, False)):
            with switched_off(trick, off):
                times[off].append(round_of(path)[1])
    on, off = statistics.median(times[False]), statistics.median(times[True])
    least_on, least_off = min(times[False]), min(times[True])
    print(f"{trick}: {'rate' if rating else 'size'} {off:.3f} s CPU without, {on:.3f} s with (medians of {repeat}): "
          f"{(off - on) / off:+.1%}; least {least_off:.3f} s without, {least_on:.3f} s with: "
          f"{(least_off - least_on) / least_off:+.1%}")


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--lines", type=int, default=2000)
    parser.add_argument("--repeat", type=int, default=3)
    parser.add_argument("--trick", choices=sorted(OFF))
    parser.add_argument("--rating", action="store_true", help="with --trick: time the rating of the candidates "
                        "alone (each line's properties and service found outside the timing)")
    args = parser.parse_args()
    with tempfile.TemporaryDirectory() as folder:
        path = build_pure_list(args.lines, Path(folder))
        one_round(path)  # start-up: imports and registries
        if args.trick:
            measure(args.trick, path, args.repeat, args.rating)
            return
        rounds = [one_round(path) for _ in range(args.repeat)]
    read, size = min(r[0] for r in rounds), min(r[1] for r in rounds)
    count = rounds[0][2]
    print(f"{count} lines: read {read:.3f} s CPU ({read / count * 1e3:.3f} ms a line), "
          f"size {size:.3f} s CPU ({size / count * 1e3:.3f} ms a line), least of {args.repeat}")


if __name__ == "__main__":
    main()
