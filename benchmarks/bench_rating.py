"""Benchmark: what each speed trick of the rating path gains, sizing a fixed list through one ``Sizer``.

Each trick is measured on the case it names, with and without it, in one process: the list is sized once to
warm the property caches, then the two variants run in turn on every
50 lines (interleaved, the order alternating, CPU time of this process, so that a busy machine slows both alike), and the script prints the median time of each and the gain of the
trick in % of the time without it. The project keeps a trick only where it gains at least 10 % on its case
(DEVELOPERS.md); a kept trick carries a one-line comment with the figure printed here.

The tricks are installed and removed here by patching, whatever the source holds, so that a trick taken out
can be measured again:

* ``verdict-dict``: ``criteria.base.verdict`` builds the frozen ``Verdict`` by filling its ``__dict__``
  instead of the generated ``__init__`` (one ``object.__setattr__`` a field);
* ``context-dict``: the same for ``CriterionContext.__init__``;
* ``hydraulics-dict``: the same for ``Hydraulics`` in ``hydraulics.line`` (when every field is given);
* ``candidates-cache``: the Sizer keeps each pipe class's candidates (keyed by content) instead of building
  them for every line;
* ``bands-memo``: the Sizer remembers, per list of candidates, whether a banded criterion's bands keep its
  trend, instead of checking the bands for every line (case: lines on services with banded limits);
* ``gas-march``: a marched gas line reads its points through the coolprop backend's ``gas_march`` (density,
  viscosity and speed of sound only) instead of its full ``state()`` with the backend chosen at each point
  (case: steam lines; the property caches are cleared before each variant's turn, as a list sized once meets
  its march points once).

Cases: ``demo`` is the 2,000-line list of ``bench_batch.py`` (the demo unit's lines with flows and
temperatures varied); ``steam`` its steam lines (a tenth of the pure-fluid list, many of them marched);
``banded`` is 400 lines on the shipped services with banded limits (pump suctions:
velocity banded by NPS; gas by pressure: momentum and drop banded by pressure).

Run: ``.venv/bin/python benchmarks/bench_rating.py [--lines 2000] [--repeat 7] [--only NAME]``
"""

from __future__ import annotations

import argparse
import statistics
import sys
import tempfile
import time
from collections.abc import Callable, Iterator, Sequence
from contextlib import contextmanager
from dataclasses import dataclass, fields
from pathlib import Path
from typing import Any

sys.path.insert(0, str(Path(__file__).resolve().parent))
from bench_batch import DEMO, build_line_list  # noqa: E402

import boresize.criteria.base as criteria_base  # noqa: E402
import boresize.hydraulics.line as hydraulics_line  # noqa: E402
from boresize.api import make_line  # noqa: E402
from boresize.io.read import read_line_list  # noqa: E402
from boresize.io.rows import line_from_row  # noqa: E402
from boresize.model import Hydraulics, Line, Verdict  # noqa: E402
from boresize.plugins import PluginHost  # noqa: E402
from boresize.properties.select import choose_backend  # noqa: E402
from boresize.criteria.bands import BandedCriterion  # noqa: E402
from boresize.sizing import engine, scan  # noqa: E402

Patch = Callable[[bool], Any]  # install (True) or remove (False) a trick; returns what undo needs


# -- the tricks, both ways ------------------------------------------------------------------------------------
def _verdict_filled(criterion: Any, status: Any, reason: str, *, value: float | None = None,
                    limit: float | None = None, unit: str = "", utilisation: float | None = None) -> Verdict:
    built = object.__new__(Verdict)
    built.__dict__.update(criterion=criterion.id, status=status, reasons=(reason,), source=criterion.source,
                          value=value, limit=limit, unit=unit, utilisation=utilisation)
    return built


def _verdict_plain(criterion: Any, status: Any, reason: str, *, value: float | None = None,
                   limit: float | None = None, unit: str = "", utilisation: float | None = None) -> Verdict:
    return Verdict(criterion.id, status, (reason,), criterion.source, value, limit, unit, utilisation)


@contextmanager
def verdict_dict(on: bool) -> Iterator[None]:
    """Every ``verdict`` name the criteria modules imported, pointed at one of the two builders."""
    original = criteria_base.verdict
    holders = [m for name, m in sorted(sys.modules.items())
               if name.startswith("boresize") and getattr(m, "verdict", None) is original]
    for module in holders:
        module.verdict = _verdict_filled if on else _verdict_plain  # type: ignore[attr-defined]
    try:
        yield
    finally:
        for module in holders:
            module.verdict = original  # type: ignore[attr-defined]


def _context_filled(self: Any, line: Any, state: Any, candidate: Any, hydraulics: Any, options: Any,
                    service: Any) -> None:
    self.__dict__.update(line=line, state=state, candidate=candidate, hydraulics=hydraulics, options=options,
                         service=service)


@dataclass(frozen=True)
class _PlainContext:  # its generated frozen __init__ is the plain one (object.__setattr__ a field)
    line: Any
    state: Any
    candidate: Any
    hydraulics: Any
    options: Any
    service: Any


@contextmanager
def context_dict(on: bool) -> Iterator[None]:
    cls = criteria_base.CriterionContext
    original = cls.__dict__["__init__"]
    cls.__init__ = _context_filled if on else _PlainContext.__init__  # type: ignore[method-assign]
    try:
        yield
    finally:
        cls.__init__ = original  # type: ignore[method-assign]


_HYDRAULICS_FIELDS = frozenset(f.name for f in fields(Hydraulics))


def _hydraulics_filled(**values: Any) -> Hydraulics:
    """``Hydraulics(**values)``, built by filling the instance dict when ``values`` names every field."""
    if values.keys() != _HYDRAULICS_FIELDS:
        return Hydraulics(**values)
    built = object.__new__(Hydraulics)
    built.__dict__.update(values)
    return built


@contextmanager
def hydraulics_dict(on: bool) -> Iterator[None]:
    """The name ``Hydraulics`` in ``hydraulics.line`` (which builds every candidate's), pointed at the filler."""
    original = hydraulics_line.Hydraulics
    hydraulics_line.Hydraulics = _hydraulics_filled if on else original  # type: ignore[assignment,misc]
    try:
        yield
    finally:
        hydraulics_line.Hydraulics = original  # type: ignore[misc]


@contextmanager
def candidates_cache(on: bool) -> Iterator[None]:
    """Without: the class's candidates built for every line."""
    original = engine.Sizer._candidates_of

    def uncached(self: engine.Sizer, line: Line, pipe_class: Any) -> Any:
        return engine._candidates(pipe_class, line)

    engine.Sizer._candidates_of = original if on else uncached  # type: ignore[method-assign]
    try:
        yield
    finally:
        engine.Sizer._candidates_of = original  # type: ignore[method-assign]


_BANDS_MEMO: dict[tuple[Any, int, tuple[bool, ...]], tuple[Any, Any, Any]] = {}


def _trend_memoised(criterion: Any, pressure: float, candidates: Any) -> Any:
    """``scan.trend_of``, remembering a banded criterion's answer per (criterion, candidates, pressure bounds);
    the objects are kept with the answer, so that a reused id never returns another's."""
    if not isinstance(criterion, BandedCriterion):
        return _TREND_OF(criterion, pressure, candidates)
    key = (criterion, id(candidates), tuple(b.up_to_pressure is None or pressure <= b.up_to_pressure
                                            for b in criterion.bands))
    kept = _BANDS_MEMO.get(key)
    if kept is None or kept[1] is not candidates:
        kept = _BANDS_MEMO[key] = (criterion, candidates, _TREND_OF(criterion, pressure, candidates))
    return kept[2]


_TREND_OF = scan.trend_of


@contextmanager
def bands_memo(on: bool) -> Iterator[None]:
    """With: the guided scan remembers whether a banded criterion's bands keep its trend, for the next line."""
    scan.trend_of = _trend_memoised if on else _TREND_OF
    try:
        yield
    finally:
        scan.trend_of = _TREND_OF


_HOSTS: list[PluginHost] = []  # the sizer's host, whose backends' caches gas-march clears


@contextmanager
def gas_march(on: bool) -> Iterator[None]:
    """Without: the march asks the backend's full ``state()`` at every point, the backend chosen at each."""
    original = engine.Sizer._gas_along

    def full(self: engine.Sizer, line: Line) -> Any:
        host = self.host
        return lambda p, t: choose_backend(host, line).state(line, p, t)

    for host in _HOSTS:
        for backend in host.backends:
            getattr(backend, "cache_clear", lambda: None)()
    engine.Sizer._gas_along = original if on else full  # type: ignore[method-assign]
    try:
        yield
    finally:
        engine.Sizer._gas_along = original  # type: ignore[method-assign]


TRICKS: dict[str, tuple[Callable[[bool], Any], str]] = {
    "verdict-dict": (verdict_dict, "demo"),
    "context-dict": (context_dict, "demo"),
    "hydraulics-dict": (hydraulics_dict, "demo"),
    "candidates-cache": (candidates_cache, "demo"),
    "bands-memo": (bands_memo, "banded"),
    "gas-march": (gas_march, "steam"),
}


# -- the cases ------------------------------------------------------------------------------------------------
def demo_lines(count: int) -> list[list[Line]]:
    with tempfile.TemporaryDirectory() as folder:
        listed = read_line_list(build_line_list(count, Path(folder)))
    return [[line_from_row(row, listed.units, position)] for position, row in enumerate(listed.rows, start=2)]


def steam_lines(count: int) -> list[list[Line]]:
    with tempfile.TemporaryDirectory() as folder:
        listed = read_line_list(build_line_list(count, Path(folder), pure_only=True, digits=5))
    return [[line_from_row(row, listed.units, position)] for position, row in enumerate(listed.rows, start=2)
            if row.get("service") == "steam"]


def banded_lines(count: int) -> list[list[Line]]:
    water = {"density": "998 kg/m3", "viscosity": "1.0 mPa.s"}  # about 20 degC (IAPWS-95, 3 figures)
    lines = []
    for i in range(count):
        scale = 0.5 + ((i * 7919) % 1000) / 1000.0
        if i % 2:
            lines.append(make_line(f"S-{i}", "water", f"{60 * scale:.4g} m3/h", "1.5 barg", "30 degC",
                                   service="pump-suction", length="20 m", source_pressure="1.5 barg",
                                   liquid_level="3 m", npsh_required="3 m", **water))
        else:
            lines.append(make_line(f"G-{i}", "methane", f"{40000 * scale:.5g} Sm3/h", f"{10 + i % 4 * 20} barg",
                                   "30 degC", service="gas-by-pressure", length="300 m"))
    return [[line] for line in lines]


def size_all(sizer: engine.Sizer, lines: Sequence[Sequence[Line]]) -> float:
    """CPU seconds of this process to size ``lines`` (CPU time: other processes on a busy machine do not count)."""
    start = time.process_time()
    for cases in lines:
        sizer.run_cases(list(cases))
    return time.process_time() - start


def measure(name: str, sizer: engine.Sizer, lines: Sequence[Sequence[Line]], repeat: int, chunk: int = 50) -> float:
    """Median CPU seconds of the list with and without the trick; prints and returns the gain in %.

    Interleaved finely: every ``chunk`` lines are sized both ways, in an order that alternates, so that a
    change of load on the machine falls on both variants alike."""
    patch, case = TRICKS[name]
    times: dict[bool, list[float]] = {True: [], False: []}
    for rep in range(repeat):
        total = {True: 0.0, False: 0.0}
        for number, first in enumerate(range(0, len(lines), chunk)):
            part = lines[first:first + chunk]
            for on in ((True, False) if (rep + number) % 2 == 0 else (False, True)):
                with patch(on):
                    total[on] += size_all(sizer, part)
        for on, seconds in total.items():
            times[on].append(seconds)
    with_, without = statistics.median(times[True]), statistics.median(times[False])
    gain = (without - with_) / without * 100.0
    print(f"{name:18s} case {case:7s} with {with_ * 1e3:8.1f} ms  without {without * 1e3:8.1f} ms  "
          f"gain {gain:+5.1f} %  ({repeat} repetitions interleaved by {chunk} lines, CPU-time medians)")
    return gain


def main(argv: Sequence[str] | None = None) -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--lines", type=int, default=2000, help="lines of the demo case (banded: a fifth)")
    parser.add_argument("--repeat", type=int, default=7)
    parser.add_argument("--only", choices=sorted(TRICKS), action="append")
    args = parser.parse_args(argv)
    sizer = engine.Sizer(PluginHost.load(load_entry_points=False), criteria_file=DEMO / "criteria.toml")
    _HOSTS.append(sizer.host)
    cases = {"demo": demo_lines(args.lines), "banded": banded_lines(max(args.lines // 5, 10)),
             "steam": steam_lines(args.lines)}
    for lines in cases.values():
        size_all(sizer, lines)  # warm the property caches
    for name in args.only or TRICKS:
        measure(name, sizer, cases[TRICKS[name][1]], args.repeat)


if __name__ == "__main__":
    main()
