"""What each CLI command does, over the Python API. Kept apart from argument parsing."""

from __future__ import annotations

import argparse
import sys
from collections.abc import Sequence
from pathlib import Path
from typing import TYPE_CHECKING, Any

from boresize.errors import BoresizeError

if TYPE_CHECKING:
    from boresize.io import LineList
    from boresize.model import LineResult
    from boresize.plugins import PluginHost
    from boresize.sizing.engine import Sizer
    from boresize.sizing.headroom import Headroom

__all__ = ["UsageError", "run_size", "run_criteria", "run_pipes", "run_diff"]


class UsageError(BoresizeError, ValueError):
    """The command line asks for something that cannot be done (exit code 2)."""


def _host(args: argparse.Namespace) -> PluginHost:
    from boresize.plugins import PluginHost

    return PluginHost.load(load_entry_points=not args.no_plugins)


def _single_row(args: argparse.Namespace) -> dict[str, str]:
    from boresize.cli.main import SINGLE_LINE_FIELDS

    row = {name.replace("-", "_"): getattr(args, name.replace("-", "_")) for name, _ in SINGLE_LINE_FIELDS}
    row = {k: v for k, v in row.items() if v is not None}
    row.setdefault("tag", "LINE-1")
    return row


def _line_list(args: argparse.Namespace) -> LineList:
    from boresize.io import LineList, read_line_list

    single = _single_row(args)
    if args.lines and len(single) > 1:
        raise UsageError(f"give either a line list ({args.lines}) or one line's options, not both")
    if args.lines and not Path(args.lines).is_file():
        raise UsageError(f"line list {args.lines!r} not found")
    if args.criteria and not Path(args.criteria).is_file():
        raise UsageError(f"criteria file {args.criteria!r} not found")
    if args.lines:
        return read_line_list(args.lines)
    if len(single) > 1:
        return LineList(rows=[single], units={}, source="command line", headers=list(single))
    raise UsageError("nothing to size: give a line list (LINES.csv) or --fluid, --flow, --pressure, --temperature")


def _check_roughness(args: argparse.Namespace) -> float | None:
    if not getattr(args, "corroded_roughness", None):
        return None
    from boresize.units import parse_quantity

    value = parse_quantity(args.corroded_roughness, "corroded-roughness", "length")
    if not value > 0:
        raise UsageError(f"--corroded-roughness {args.corroded_roughness!r} is not above zero")
    return value


def _size_list(args: argparse.Namespace, line_list: LineList,
               check_roughness: float | None = None) -> tuple[Sizer, list[LineResult]]:
    """Size a line list on ``args.workers`` processes; returns (sizer of this process, results)."""
    from boresize.sizing.batch import run_batch, spec_for
    from boresize.sizing.engine import Sizer

    if args.workers < 1:
        raise UsageError(f"--workers {args.workers} is below 1")
    every_size = bool(getattr(args, "every_size", False))
    spec = spec_for(args.criteria, not args.no_plugins, check_roughness, every_size=every_size)
    sizer = Sizer(_host(args), criteria_file=args.criteria, check_roughness=check_roughness, every_size=every_size)
    results = run_batch(line_list.pairs(), spec, sizer=sizer, workers=args.workers,
                        progress=getattr(args, "progress", False))
    return sizer, results


def run_size(args: argparse.Namespace) -> int:
    from boresize.sizing.batch import summary
    from boresize.io import document, write_output
    from boresize.io.write import check_output
    from boresize.report.terminal import render_table
    from boresize.report.trace import traceability

    outputs = [check_output(path) for path in args.output]
    line_list = _line_list(args)
    sizer, results = _size_list(args, line_list, _check_roughness(args))
    trace = traceability(sizer, lines_source=line_list.source, lines_digest=line_list.digest)
    rooms = _headrooms(sizer, results) if args.headroom else None
    for path in outputs:
        write_output(path, results, line_list=line_list, trace=trace, criteria_source=sizer.config.origin,
                     lines_source=line_list.source)
        print(f"boresize: wrote {path}", file=sys.stderr)
    if args.json:
        from boresize.cli.main import print_json

        doc = document(results, criteria_source=sizer.config.origin, lines_source=line_list.source,
                       traceability=trace)
        if rooms is not None:
            from boresize.sizing.headroom import headroom_to_dict

            for entry, room in zip(doc["lines"], rooms):
                entry.update(headroom_to_dict(room))
        print_json(doc)
        print(f"boresize: {summary(results)}", file=sys.stderr)
    else:
        sys.stdout.write(render_table(results, sizer.config))
        if rooms is not None:
            sys.stdout.write(_render_headrooms(rooms))
    return 0 if results and all(r.status == "pass" for r in results) else 1


def _headrooms(sizer: Sizer, results: Sequence[LineResult]) -> list[Headroom]:
    """Headroom of each line at the size it got (its governing case's conditions)."""
    from dataclasses import replace

    from boresize.sizing.headroom import Headroom, find_headroom

    rooms: list[Headroom] = []
    for result in results:
        if result.line is None or result.selected is None:
            rooms.append(Headroom(result.tag, None, None, (), result.error or "no size to rate"))
            continue
        line = replace(result.line, nps=result.selected.candidate.nps, schedule=result.selected.candidate.schedule)
        rooms.append(find_headroom(sizer, line))
    return rooms


def _render_headrooms(rooms: Sequence[Headroom]) -> str:
    out = ["", "Headroom at the selected or given size (flow beyond the design flow before a criterion fails):"]
    for room in rooms:
        shown = "-" if room.percent is None else f"{room.percent:+.1f} %"
        out.append(f"  {room.tag:<14} {shown:>9}  {room.note}")
    return "\n".join(out) + "\n"


def _revision(path: str, args: argparse.Namespace) -> dict[str, Any]:
    """A results document: read from JSON, or made by sizing a line list."""
    import json

    from boresize.io import document, read_line_list

    if not Path(path).is_file():
        raise UsageError(f"{path!r} not found")
    if Path(path).suffix.lower() == ".json":
        try:
            doc = json.loads(Path(path).read_text(encoding="utf-8"))
        except (UnicodeDecodeError, json.JSONDecodeError) as exc:
            raise UsageError(f"{path} is not a JSON results document: {exc}") from None
        if not isinstance(doc, dict) or not isinstance(doc.get("lines"), list):
            raise UsageError(f"{path} is not a boresize results document (no 'lines' list)")
        return doc
    line_list = read_line_list(path)
    sizer, results = _size_list(args, line_list)
    return document(results, criteria_source=sizer.config.origin, lines_source=path)


def run_diff(args: argparse.Namespace) -> int:
    from boresize.report.diff import compare, render_diff

    if args.criteria and not Path(args.criteria).is_file():
        raise UsageError(f"criteria file {args.criteria!r} not found")
    diff = compare(_revision(args.old, args), _revision(args.new, args))
    if args.json:
        from boresize.cli.main import print_json

        print_json(diff.to_dict())
    else:
        sys.stdout.write(render_diff(diff, args.old, args.new))
    return 0 if diff.empty else 1


def run_criteria(args: argparse.Namespace) -> int:
    from boresize.sizing.services import load_config
    from boresize.report.listing import render_criteria

    host = _host(args)
    sys.stdout.write(render_criteria(host, load_config(host, args.criteria)))
    return 0


def run_pipes(args: argparse.Namespace) -> int:
    from boresize.sizing.services import load_config
    from boresize.report.listing import render_nps, render_pipe_classes

    host = _host(args)
    if args.nps:
        sys.stdout.write(render_nps(args.nps))
    else:
        sys.stdout.write(render_pipe_classes(load_config(host, args.criteria)))
    return 0
