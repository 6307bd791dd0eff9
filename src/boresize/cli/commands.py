"""What each CLI command does, over the public API (:mod:`boresize.api`). Kept apart from argument parsing."""

from __future__ import annotations

import argparse
import sys
from pathlib import Path
from typing import cast

from boresize import api
from boresize.api import tools
from boresize.api.output import STREAMED_SUFFIXES
from boresize.api.run import LEAN_OUTPUTS, Keep
from boresize.cli.fields import SINGLE_LINE_FIELDS, print_json
from boresize.errors import InputError, UsageError, printable

__all__ = ["UsageError", "run_size", "run_criteria", "run_pipes", "run_diff", "run_schema"]


QUIET_CAUTION = ("screening calculations: check them against the applicable codes and your company's standards "
                 "before use")


def _single_row(args: argparse.Namespace) -> dict[str, str]:
    row = {name.replace("-", "_"): getattr(args, name.replace("-", "_")) for name, _ in SINGLE_LINE_FIELDS}
    row = {k: v for k, v in row.items() if v is not None}
    row.setdefault("tag", "LINE-1")
    return row


def _lines(args: argparse.Namespace) -> str | api.LineList:
    """The line list to size: a file's path, the list read from standard input (``-``), or one line from the
    options."""
    single = _single_row(args)
    if args.lines and len(single) > 1:
        raise UsageError(f"give either a line list ({args.lines}) or one line's options, not both")
    if args.lines and args.lines != "-" and not Path(args.lines).is_file():
        raise UsageError(f"line list {args.lines!r} not found")
    if args.format and args.lines != "-":
        raise UsageError(f"--format {args.format} is for a line list on standard input (-); a file's extension "
                         "gives its format")
    _check_criteria(args)
    if args.lines == "-":
        return api.read_lines("-", format=args.format)
    if args.lines:
        return str(args.lines)
    if len(single) > 1:
        return api.LineList(rows=[single], units={}, source="command line", headers=list(single))
    raise UsageError("nothing to size: give a line list (LINES.csv) or --fluid, --flow, --pressure, --temperature")


def _check_criteria(args: argparse.Namespace) -> None:
    if args.criteria and not Path(args.criteria).is_file():
        raise UsageError(f"criteria file {args.criteria!r} not found")


def _workers(args: argparse.Namespace) -> int:
    if args.workers < 1:
        raise UsageError(f"--workers {args.workers} is below 1")
    return int(args.workers)


def _check_outputs(paths: list[str], lines: str | api.LineList) -> list[Path] | None:
    """Every ``-o`` checked before any sizing (two naming one file refused); each unusable one reported with its
    path. None if any is."""
    outputs: list[Path] = []
    for checked in api.check_outputs(paths, [lines] if isinstance(lines, str) else []):
        if isinstance(checked, InputError):
            print(f"boresize: error: {printable(str(checked), newlines=True)}", file=sys.stderr)
        else:
            outputs.append(checked)
    return outputs if len(outputs) == len(paths) else None


def _write_outputs(run: api.Run, outputs: list[Path], quiet: bool = False) -> bool:
    """Write every output it can (those streamed as lines were sized are already written, or failed): one that
    fails is reported with its path and the others still written."""
    written = True
    streamed = dict(run.streamed)
    for path in outputs:
        try:
            if path in streamed:
                if streamed[path] is not None:
                    raise cast(InputError, streamed[path])
            else:
                run.write(path)
        except InputError as exc:
            print(f"boresize: error: {printable(str(exc), newlines=True)}", file=sys.stderr)
            written = False
            continue
        if not quiet:
            print(f"boresize: wrote {printable(str(path))}", file=sys.stderr)
    return written


def _note_slow_criteria(run: api.Run) -> None:
    """A note on stderr for each criterion over the slow limits (see :meth:`boresize.api.Run.slow_criteria`)."""
    for slow in run.slow_criteria():
        share = slow.seconds / run.sizing_seconds if run.sizing_seconds > 0 else 1.0
        print(f"boresize: note: criterion {printable(slow.ident)} (plugin {printable(slow.plugin)}) "
              f"took {slow.seconds:.1f} s, "
              f"{share:.0%} of the {run.sizing_seconds:.1f} s of sizing", file=sys.stderr)


def _keep(json: bool, outputs: list[Path]) -> Keep:
    """``selected`` when nothing written after the run reads the other rated sizes (the table, CSV files; the
    streamed outputs, :func:`_streamed`, are written as lines are sized), else ``full``.
    measured: 50,000 lines to CSV, peak memory see benchmarks/bench_scale.py and README (Performance)."""
    lean = not json and all(path.suffix.lower() in LEAN_OUTPUTS for path in outputs if path not in _streamed(outputs))
    return "selected" if lean else "full"


def _streamed(outputs: list[Path]) -> list[Path]:
    """The outputs written as each line is sized (.csv, .jsonl): never the whole run in memory.
    measured: 50,000 lines to .jsonl, peak memory see benchmarks/bench_scale.py and README (Performance)."""
    return [path for path in outputs if path.suffix.lower() in STREAMED_SUFFIXES]


def _count_only(args: argparse.Namespace, outputs: list[Path]) -> bool:
    """Keep counts, not results, when nothing after the run reads them: ``--quiet`` (no table), no ``--json``, and
    every output written as lines are sized (:func:`_streamed`).
    measured: 10,000 lines to CSV peak at 155 MB against 212 MB keeping the selected sizes (`/usr/bin/time -f %M`,
    `--workers 1 --quiet -o x.csv`); benchmarks/bench_scale.py (e) prints the growth per 1,000 lines."""
    return bool(args.quiet and not args.json and outputs and len(_streamed(outputs)) == len(outputs))


def run_size(args: argparse.Namespace) -> int:
    """Size the lines; exit 0 all pass, 1 some fail or error, 2 a usage error or any output not written."""
    lines = _lines(args)
    outputs = _check_outputs(args.output, lines)
    if outputs is None:
        return 2
    document = api.read_document_block(args.document) if args.document else None
    roughness = api.roughness_value(args.corroded_roughness, "corroded-roughness") if args.corroded_roughness \
        else None
    progress = False if args.quiet and args.progress is None else args.progress
    run = api.run_lines(lines, args.criteria, workers=_workers(args), every_size=args.every_size,
                        corroded_roughness=roughness, plugins=not args.no_plugins, progress=progress,
                        headroom=args.headroom, bare_pressure=args.bare_pressure, document=document,
                        keep=_keep(args.json, outputs), stream=_streamed(outputs),
                        count_only=_count_only(args, outputs))
    written = _write_outputs(run, outputs, args.quiet)
    _note_slow_criteria(run)
    if args.timings:
        for spent in sorted(run.criterion_times, key=lambda t: -t.seconds):
            print(f"boresize: time: criterion {printable(spent.ident)} (plugin {printable(spent.plugin)}) "
                  f"{spent.seconds:.3f} s", file=sys.stderr)
    if args.json:
        print_json(run.document(timings=args.timings))
    if args.quiet:
        for error in run.error_texts:
            print(f"boresize: error: {printable(error)}", file=sys.stderr)
        print(f"boresize: {QUIET_CAUTION}", file=sys.stderr)
    elif args.json:
        print(f"boresize: {run.summary()}", file=sys.stderr)
    else:
        sys.stdout.write(run.table())
    two_phase = run.two_phase_caution()
    if two_phase and (args.quiet or args.json):  # the table prints it itself
        print(f"boresize: caution: {two_phase}", file=sys.stderr)
    if not written:
        return 2
    return 0 if run.passed else 1


def run_diff(args: argparse.Namespace) -> int:
    _check_criteria(args)
    diff = tools.compare_revisions(args.old, args.new, criteria=args.criteria, plugins=not args.no_plugins,
                                   workers=_workers(args))
    if args.json:
        print_json(diff.to_dict())
    else:
        sys.stdout.write(printable(tools.diff_text(diff, args.old, args.new), newlines=True))
    return 0 if diff.empty else 1


def run_criteria(args: argparse.Namespace) -> int:
    listing = tools.criteria_text(args.criteria, plugins=not args.no_plugins)
    sys.stdout.write(printable(listing, newlines=True))
    return 0


def run_pipes(args: argparse.Namespace) -> int:
    if args.nps:
        sys.stdout.write(tools.nps_text(args.nps))
    else:
        classes = tools.pipe_classes_text(args.criteria, plugins=not args.no_plugins)
        sys.stdout.write(printable(classes, newlines=True))
    return 0


def run_schema(args: argparse.Namespace) -> int:
    """The JSON Schema of the results document, as shipped in the package."""
    print_json(api.document_schema())
    return 0
