"""Benchmark: what each speed trick of the batch runner (:mod:`boresize.sizing.batch`) gains on a 2,000-line run.

Each trick is switched off in a child process by replacing the piece that does it (the runner's code has
no switches), and the run is timed from the call of :func:`boresize.api.run_lines` to its return (the sizer
built before, as the command line's start-up does). Runs with and without the trick are interleaved and
the medians compared, for a busy machine. The tricks, and the case each names:

* ``gc-pause``: the cyclic garbage collector paused while results pile up (one process, and 2 workers);
* ``fork``: workers forked from the parent inherit its imports and its sizer (off: spawned workers import
  boresize and build their own sizer), 2 workers.

Two more were measured this way and removed for gaining less than 10 % with 2 workers (late 2026, medians
of 5 on the busy 2-core machine): the parent sizing chunks from the end of the list beside its workers
(+7 %, and -44 % in another round), and workers beside it returning results through temporary pickle files
(+4 %).

Run: ``.venv/bin/python benchmarks/bench_tricks.py [--lines 2000] [--repeats 3] [--trick NAME ...]``
"""

from __future__ import annotations

import argparse
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path
from types import SimpleNamespace

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "examples" / "demo-unit"
#: trick -> the worker counts of the case it names
CASES = {"gc-pause": (1, 2), "fork": (2,)}


class _NoPause:
    def __enter__(self) -> None:
        return None

    def __exit__(self, *exc: object) -> None:
        return None

    def after_fork(self) -> None:
        return None


def _switch_off(trick: str) -> None:
    """Replace the piece of the batch runner that does ``trick`` with the plain way."""
    import boresize.sizing.batch as batch

    if trick == "gc-pause":
        batch._COLLECTOR_PAUSE = _NoPause()  # type: ignore[assignment]
    elif trick == "fork":
        import multiprocessing

        batch.multiprocessing = SimpleNamespace(  # type: ignore[assignment]
            get_context=lambda method: multiprocessing.get_context("spawn"))


def child(path: str, workers: int, off: str) -> None:
    """Time one run (printed in seconds) with ``off`` switched off ("none": every trick on)."""
    import CoolProp.CoolProp  # noqa: F401  # imported before timing, as the command line's start-up has

    from boresize.api import default_sizer, run_lines
    from boresize.sizing.batch import spec_for

    if off != "none":
        _switch_off(off)
    default_sizer(spec_for(DEMO / "criteria.toml", False, None))
    start = time.perf_counter()
    run = run_lines(path, DEMO / "criteria.toml", plugins=False, workers=workers)
    print(f"{time.perf_counter() - start:.4f} {len(run.results)}")


def _time(path: Path, workers: int, off: str) -> float:
    out = subprocess.run([sys.executable, __file__, "--child", str(path), str(workers), off], capture_output=True,
                         text=True, check=True).stdout
    return float(out.split()[0])


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--lines", type=int, default=2000)
    parser.add_argument("--repeats", type=int, default=3)
    parser.add_argument("--trick", action="append", choices=sorted(CASES))
    parser.add_argument("--child", nargs=3, help=argparse.SUPPRESS)
    args = parser.parse_args()
    if args.child:
        child(args.child[0], int(args.child[1]), args.child[2])
        return
    sys.path.insert(0, str(ROOT / "benchmarks"))
    from bench_batch import build_line_list

    with tempfile.TemporaryDirectory() as folder:
        path = build_line_list(args.lines, Path(folder))
        for trick in args.trick or sorted(CASES):
            for workers in CASES[trick]:
                on: list[float] = []
                off: list[float] = []
                for _ in range(args.repeats):  # interleaved: a busy machine slows both alike
                    on.append(_time(path, workers, "none"))
                    off.append(_time(path, workers, trick))
                with_it, without = statistics.median(on), statistics.median(off)
                print(f"{trick:<14} workers {workers}: with {with_it:.2f} s, without {without:.2f} s (medians of "
                      f"{args.repeats}); gain {(without - with_it) / without * 100:+.0f} %", flush=True)


if __name__ == "__main__":
    main()
