"""Benchmark: a 2,000-line list sized on 2 worker processes, against the bare property-call floor.

The line list is the demo unit's lines repeated with flows scaled 0.6-1.4x and temperatures moved
+/-5 K (deterministic), every row its own line. The floor is the time bare CoolProp calls take for the
same lines, without any sizing, three ways:

* ``PropsSI`` once per line: ``PropsSI("D", ...)`` and ``PropsSI("V", ...)`` (CoolProp's plain call);
* ``AbstractState`` once per line: one reused ``AbstractState("HEOS", fluid)`` per fluid, ``update(PT)``
  then density and viscosity (the fastest way CoolProp offers; measured here: 6-60 us);
* ``AbstractState`` at every state point boresize asked its CoolProp backend for (recorded in a
  one-process run): gas lines are marched along their length, which needs many points per size.

Both sides are timed in a process that has imported CoolProp, as the floor must be (the import costs
about 2 s, once per process, whatever the work). The boresize run is the CLI's: the parent builds its
sizer and sizes the first line before the pool forks, so workers inherit the import and the sizer; the
wall clock runs from reading the line list to the last result back in the parent (process start-up
included). The one-off costs of a run (CoolProp import, building the sizer) are printed beside it.
Lines whose density and viscosity are given (table values) cost nothing in the floor. The target
(issue "The line list workflow") is a boresize total under 1.5x the ``PropsSI`` floor, the bare property
call; the script prints every ratio and says whether the target is met. The ``AbstractState`` floors are
printed for reference: against them the ratio shows what the sizing itself (hydraulics and verdicts of
about four sizes a line, in Python) costs beyond the properties. Not run by the unit tests: ``make bench``.

Run: ``.venv/bin/python benchmarks/bench_batch.py [--lines 2000] [--workers 2] [--no-progress]``
"""

from __future__ import annotations

import argparse
import csv
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "examples" / "demo-unit"
TARGET = 1.5
Point = tuple[str, float, float]


def build_line_list(count: int, folder: Path, pure_only: bool = False, digits: int = 4) -> Path:
    """Write a ``count``-line CSV made from the demo lines (no cases: every row is a line), varied
    deterministically; ``pure_only`` keeps the demo's CoolProp lines (no table values); tags get ``digits``."""
    with open(DEMO / "lines.csv", encoding="utf-8") as handle:
        reader = csv.DictReader(handle)
        headers = [h for h in reader.fieldnames or () if h != "case"]
        demo = [row for row in reader if not (pure_only and row["density"])]
    path = folder / f"lines-{count}.csv"
    with open(path, "w", encoding="utf-8", newline="") as handle:
        writer = csv.DictWriter(handle, headers, extrasaction="ignore")
        writer.writeheader()
        for i in range(count):
            row = dict(demo[i % len(demo)])
            scale = 0.6 + 0.8 * ((i * 7919) % 1000) / 1000.0
            number, unit = row["flow"].split(" ", 1)
            row["flow"] = f"{float(number) * scale:.5g} {unit}"
            t_number, t_unit = row["temperature"].split(" ", 1)
            row["temperature"] = f"{float(t_number) + ((i * 104729) % 100) / 10.0 - 5.0:.3f} {t_unit}"
            row["tag"] = f"{row['tag']}-{i:0{digits}d}"
            writer.writerow(row)
    return path


def run_boresize(path: Path, workers: int, progress: bool) -> tuple[float, int, dict[str, float]]:
    """Wall-clock seconds for the whole run as the CLI does it (start-up of the worker processes included),
    the lines, and the one-off costs paid before it (CoolProp import, building the sizer) [s]."""
    start = time.perf_counter()
    import CoolProp.CoolProp  # noqa: F401  # the floor is timed after this import too

    imported = time.perf_counter()
    from boresize.api import default_sizer, run_lines
    from boresize.sizing.batch import spec_for

    default_sizer(spec_for(DEMO / "criteria.toml", False, None))  # the sizer run_lines takes
    built = time.perf_counter()
    results = run_lines(path, DEMO / "criteria.toml", plugins=False, workers=workers, progress=progress).results
    total = time.perf_counter() - built
    statuses = {s: sum(1 for r in results if r.status == s) for s in ("pass", "fail", "error")}
    print(f"boresize: {len(results)} lines, {statuses}")
    return total, len(results), {"CoolProp import": imported - start, "sizer build": built - imported}


def run_single_recording(path: Path) -> tuple[float, list[Point]]:
    """Seconds for the run in one process, and every (fluid, p, T) point boresize asked CoolProp for."""
    from boresize.api import size_rows
    from boresize.io import read_line_list
    from boresize.sizing.batch import spec_for

    sizer = spec_for(DEMO / "criteria.toml", False, None).build()  # its own: property caches start empty
    backend = sizer.host.backends.get("coolprop")
    asked: list[Point] = []
    plain_state = backend.state

    def recording_state(line, pressure, temperature):  # type: ignore[no-untyped-def]
        asked.append((backend.resolve(line.fluid), pressure, temperature))
        return plain_state(line, pressure, temperature)

    backend.state = recording_state  # wraps the public method of this one instance
    line_list = read_line_list(path)
    start = time.perf_counter()
    size_rows(line_list.pairs(), sizer=sizer)
    return time.perf_counter() - start, asked


def line_points(path: Path) -> list[Point]:
    """(CoolProp name, pressure [Pa abs], temperature [K]) of each line whose properties CoolProp gives."""
    from boresize.io import read_line_list
    from boresize.io.rows import line_from_row
    from boresize.properties.coolprop import CoolPropBackend

    backend, points = CoolPropBackend(), []
    line_list = read_line_list(path)
    for position, row in enumerate(line_list.rows, start=1):
        line = line_from_row(row, line_list.units, position)
        if line.density is None or line.viscosity is None:
            points.append((backend.resolve(line.fluid), line.pressure, line.temperature))
    return points


def time_props_si(points: list[Point]) -> float:
    """Seconds for PropsSI density and viscosity at every point."""
    from CoolProp import CoolProp as CP

    start = time.perf_counter()
    for name, p, t in points:
        CP.PropsSI("D", "T", t, "P", p, name)
        CP.PropsSI("V", "T", t, "P", p, name)
    return time.perf_counter() - start


def time_abstract_state(points: list[Point]) -> float:
    """Seconds for update(PT) + density + viscosity on one reused AbstractState per fluid at every point."""
    from CoolProp import CoolProp as CP

    states = {name: CP.AbstractState("HEOS", name) for name, _, _ in points}
    start = time.perf_counter()
    for name, p, t in points:
        state = states[name]
        try:
            state.update(CP.PT_INPUTS, p, t)
            state.rhomass()
            state.viscosity()
        except ValueError:  # a point CoolProp refuses (on the saturation line) still cost its call
            pass
    return time.perf_counter() - start


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--lines", type=int, default=2000)
    parser.add_argument("--workers", type=int, default=2)
    parser.add_argument("--no-progress", action="store_true")
    args = parser.parse_args()
    with tempfile.TemporaryDirectory() as folder:
        path = build_line_list(args.lines, Path(folder))
        total, count, once = run_boresize(path, args.workers, not args.no_progress)
        single, asked = run_single_recording(path)
        points = line_points(path)
    print(f"boresize --workers {args.workers}: {total:.2f} s = {total / count * 1e6:.0f} us/line (reading, worker "
          f"start-up and results back included); one process, warm: {single:.2f} s = {single / count * 1e6:.0f} "
          f"us/line; paid once per run before that: " + ", ".join(f"{k} {v:.2f} s" for k, v in once.items()))
    floors = (("PropsSI D+V once per line", time_props_si(points), len(points)),
              ("AbstractState update+D+V once per line", time_abstract_state(points), len(points)),
              ("AbstractState at every point boresize asked for", time_abstract_state(asked), len(asked)))
    for number, (name, floor, calls) in enumerate(floors):
        ratio = total / floor if floor > 0 else float("inf")
        verdict = (f"target under {TARGET}x: {'met' if ratio < TARGET else 'NOT met'}" if number == 0 else
                   "for reference: CoolProp's fastest call, what the sizing itself costs beyond properties")
        print(f"floor {name}: {floor:.3f} s ({calls} calls) = {floor / count * 1e6:.0f} us/line; boresize total / "
              f"floor = {ratio:.1f}x ({verdict})")

if __name__ == "__main__":
    main()
