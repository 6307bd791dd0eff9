"""Benchmark: sizing with the record's sizes above the selected one (the default) against without them.

``Sizer(sizes_above=0)`` is what a run asks for when its outputs show only the selected size (the table, CSV): the
selection needs no size above the one it selects; the record shows two (:data:`boresize.sizing.scan.RATED_ABOVE`).
Both sizers size bench_scale's 2,000-line pure-fluid list in this process (properties, rating, selection; the list
read once before), alternately, ``--repeats`` times; the least CPU time of each is printed with the gain, and
that the selected sizes, their numbers and verdicts are the same.

Run: ``.venv/bin/python benchmarks/bench_sizes_above.py [--lines 2000] [--repeats 4]``
"""

from __future__ import annotations

import argparse
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT / "src"))
sys.path.insert(0, str(Path(__file__).resolve().parent))


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--lines", type=int, default=2000)
    parser.add_argument("--repeats", type=int, default=4)
    args = parser.parse_args()

    from bench_scale import build_pure_list

    from boresize.io import read_line_list
    from boresize.io.rows import line_from_row
    from boresize.plugins import PluginHost
    from boresize.sizing.engine import RATED_ABOVE, Sizer

    host = PluginHost.load()
    criteria = ROOT / "examples" / "demo-unit" / "criteria.toml"
    sizers = {above: Sizer(host, criteria_file=criteria, sizes_above=above) for above in (RATED_ABOVE, 0)}
    with tempfile.TemporaryDirectory() as folder:
        line_list = read_line_list(build_pure_list(args.lines, Path(folder)))
    lines = [line_from_row(row, line_list.units, n) for n, row in enumerate(line_list.rows, start=1)]
    best = {above: float("inf") for above in sizers}
    results = {}
    for _ in range(args.repeats):
        for above, sizer in sizers.items():
            start = time.process_time()
            results[above] = [sizer.run_safely(line) for line in lines]
            best[above] = min(best[above], time.process_time() - start)
    same = all(a.status == b.status and (a.selected is None) == (b.selected is None)
               and (a.selected is None or (a.selected.candidate, a.selected.hydraulics, a.selected.verdicts)
                    == (b.selected.candidate, b.selected.hydraulics, b.selected.verdicts))
               for a, b in zip(results[RATED_ABOVE], results[0]))
    rated = {above: sum(len(r.candidates) for r in rs) for above, rs in results.items()}
    print(f"{args.lines} lines, least of {args.repeats}: sizes above {RATED_ABOVE}: {best[RATED_ABOVE]:.3f} s CPU "
          f"({rated[RATED_ABOVE]} sizes rated); none: {best[0]:.3f} s ({rated[0]}): "
          f"{1 - best[0] / best[RATED_ABOVE]:.1%} less; same selections, numbers and verdicts: {same}")


if __name__ == "__main__":
    main()
