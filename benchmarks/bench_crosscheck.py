"""Benchmark: what ``property-crosscheck`` would add to the 2,000-line benchmark list if every service used it.

The line list is ``bench_batch.py``'s (the demo unit's lines repeated, flows and temperatures varied). The lines
are sized in one process with the demo's criteria (the sizer built and one line sized before the clock starts,
as the command line's start-up does); then the criterion's second property evaluation (once per line, the
criterion's own cache cold) is timed for every line's state. The import of the second library (thermo, about
5-7 s) is paid once per process and printed apart. The cost decides whether the criterion is in the shipped
services (a few percent) or opt-in (a criteria file names it: ``property-crosscheck = {}``).

Run: ``.venv/bin/python benchmarks/bench_crosscheck.py [--lines 2000]``
"""

from __future__ import annotations

import argparse
import tempfile
import time
from pathlib import Path

from bench_batch import DEMO, build_line_list

#: Above this fraction of the sizing time the criterion ships opt-in (the issue: "more than a few percent").
OPT_IN_ABOVE = 0.05


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--lines", type=int, default=2000)
    args = parser.parse_args()
    from boresize.api import size_rows
    from boresize.criteria.property_crosscheck import PropertyCrosscheck
    from boresize.io import read_line_list
    from boresize.sizing.batch import spec_for

    sizer = spec_for(DEMO / "criteria.toml", False, None).build()
    with tempfile.TemporaryDirectory() as folder:
        line_list = read_line_list(build_line_list(args.lines, Path(folder)))
    pairs = list(line_list.pairs())
    size_rows(pairs[:1], sizer=sizer)
    start = time.perf_counter()
    results = size_rows(pairs, sizer=sizer)
    sizing = time.perf_counter() - start
    judged = [(r.line, r.state) for r in results if r.line is not None and r.state is not None]
    start = time.perf_counter()
    import thermo  # noqa: F401  # the second library's import, paid once per process

    imported = time.perf_counter() - start
    criterion, errors = PropertyCrosscheck(), 0
    start = time.perf_counter()
    for line, state in judged:
        errors += isinstance(criterion._comparison(line, state), str)
    second = time.perf_counter() - start
    share = second / sizing
    print(f"sizing {len(results)} lines, one process: {sizing:.2f} s = {sizing / len(results) * 1e6:.0f} us/line")
    print(f"second opinion for {len(judged)} line states: {second:.2f} s = {second / max(len(judged), 1) * 1e6:.0f} "
          f"us/line ({errors} without one), +{share * 100:.0f} % of the sizing; thermo import {imported:.2f} s once")
    print(f"shipped {'opt-in' if share > OPT_IN_ABOVE else 'in every service'} (opt-in above "
          f"{OPT_IN_ABOVE * 100:.0f} %)")


if __name__ == "__main__":
    main()
