"""What each CLI command does, over the Python API. Kept apart from argument parsing."""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from boresize.errors import BoresizeError

__all__ = ["UsageError", "run_size", "run_criteria", "run_pipes"]


class UsageError(BoresizeError, ValueError):
    """The command line asks for something that cannot be done (exit code 2)."""


def _host(args: argparse.Namespace):  # type: ignore[no-untyped-def]
    from boresize.plugins import PluginHost

    return PluginHost.load(load_entry_points=not args.no_plugins)


def _single_row(args: argparse.Namespace) -> dict[str, str]:
    from boresize.cli import SINGLE_LINE_FIELDS

    row = {name.replace("-", "_"): getattr(args, name.replace("-", "_")) for name, _ in SINGLE_LINE_FIELDS}
    row = {k: v for k, v in row.items() if v is not None}
    row.setdefault("tag", "LINE-1")
    return row


def run_size(args: argparse.Namespace) -> int:
    from boresize.engine import Sizer
    from boresize.io import document, read_csv
    from boresize.report.table import render_table

    single = _single_row(args)
    if args.lines and len(single) > 1:
        raise UsageError(f"give either a line list ({args.lines}) or one line's options, not both")
    if args.lines and not Path(args.lines).is_file():
        raise UsageError(f"line list {args.lines!r} not found")
    if args.criteria and not Path(args.criteria).is_file():
        raise UsageError(f"criteria file {args.criteria!r} not found")
    if args.lines:
        line_list = read_csv(args.lines)
        pairs, source = line_list.pairs(), args.lines
    elif len(single) > 1:
        pairs, source = [(single, {})], "command line"
    else:
        raise UsageError("nothing to size: give a line list (LINES.csv) or --fluid, --flow, --pressure, --temperature")
    sizer = Sizer(_host(args), criteria_file=args.criteria)
    results = sizer.run_rows(pairs)
    if args.json:
        from boresize.cli import print_json

        print_json(document(results, criteria_source=sizer.config.origin, lines_source=source))
    else:
        sys.stdout.write(render_table(results, sizer.config))
    return 0 if results and all(r.status == "pass" for r in results) else 1


def run_criteria(args: argparse.Namespace) -> int:
    from boresize.config import load_config
    from boresize.report.listing import render_criteria

    host = _host(args)
    sys.stdout.write(render_criteria(host, load_config(host, args.criteria)))
    return 0


def run_pipes(args: argparse.Namespace) -> int:
    from boresize.config import load_config
    from boresize.report.listing import render_nps, render_pipe_classes

    host = _host(args)
    if args.nps:
        sys.stdout.write(render_nps(args.nps))
    else:
        sys.stdout.write(render_pipe_classes(load_config(host, args.criteria)))
    return 0
