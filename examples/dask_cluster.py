"""Size a large line list on a dask cluster (here a local one: two worker processes, one thread each).

Invented scenario: 2,000 water and nitrogen lines of a fictional tank farm (no real plant). The dask ``Client``
itself is the executor (it has ``submit`` and ``map``); ``size_many`` sends the criteria file by content, so
the workers need no copy of it, and cuts the list into chunks by the cluster's thread count (about eight
chunks a thread). The same call works on a real cluster: ``Client("tcp://scheduler:8786")``, with boresize
installed on every worker.

Run: ``python examples/dask_cluster.py [--lines N] [--workers N]`` (needs ``pip install "boresize[dask]"``)
"""

from __future__ import annotations

import argparse
import time
from collections import Counter
from pathlib import Path

import boresize

CRITERIA = Path(__file__).resolve().parent / "demo-unit" / "criteria.toml"


def tank_farm(count: int) -> list[boresize.Line]:
    """``count`` invented lines: water transfers and nitrogen blanketing, flows spread over a decade."""
    lines = []
    for i in range(count):
        if i % 4 == 3:
            lines.append(boresize.make_line(tag=f"TF-N-{i:05d}", fluid="nitrogen", flow=f"{100 + i % 900} Nm3/h",
                                            pressure="6 barg", temperature="20 degC", length="80 m", service="gas"))
        else:
            lines.append(boresize.make_line(tag=f"TF-W-{i:05d}", fluid="water", flow=f"{5 + i % 95} t/h",
                                            pressure=f"{3 + i % 7} barg", temperature="25 degC", length="150 m",
                                            service="liquid"))
    return lines


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--lines", type=int, default=2000, help="how many lines to size (default 2000)")
    parser.add_argument("--workers", type=int, default=2, help="local worker processes (default 2)")
    args = parser.parse_args()
    from dask.distributed import Client, LocalCluster

    lines = tank_farm(args.lines)
    with LocalCluster(n_workers=args.workers, threads_per_worker=1, processes=True, dashboard_address=None) \
            as cluster, Client(cluster) as client:
        start = time.perf_counter()
        results = boresize.size_many(lines, executor=client, criteria=CRITERIA, plugins=False)
        seconds = time.perf_counter() - start
    counts = Counter(r.status for r in results)
    sizes = Counter(r.nps for r in results if r.nps)
    print(f"{len(results)} lines on {args.workers} dask workers in {seconds:.1f} s: "
          + ", ".join(f"{counts[s]} {s}" for s in ("pass", "fail", "error")))
    print("sizes: " + ", ".join(f"NPS {nps}: {n}" for nps, n in sorted(sizes.items(), key=lambda kv: -kv[1])[:6]))
    return 0 if not counts["error"] else 1


if __name__ == "__main__":
    raise SystemExit(main())
