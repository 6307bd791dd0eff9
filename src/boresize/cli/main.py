"""The ``boresize`` command: a thin shell over the Python API.

Exit codes: 0 every line passed, 1 a line failed or errored, 2 a usage error (bad option, unreadable
file, bad criteria file). No Python traceback reaches the user: faults of boresize's own error tree are
printed as one message; anything else is reported as an internal error with a request to report it.
"""

from __future__ import annotations

import argparse
import os
import sys
from collections.abc import Sequence

from boresize import __version__
from boresize.cli.fields import SINGLE_LINE_FIELDS
from boresize.errors import BoresizeError, UsageError, printable

__all__ = ["main", "build_parser"]

CAUTION_SHORT = ("Screening calculations: check them against the applicable codes and your company's standards "
                 "(a competent engineer must review them; local codes govern).")

def build_parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(
        prog="boresize",
        description="Size and check process piping lines from stream conditions.",
        epilog=CAUTION_SHORT,
    )
    parser.add_argument("--version", action="version", version=f"boresize {__version__}")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND")
    size = sub.add_parser("size", help="size (or check) the lines of a line list, or one line from options",
                          epilog=CAUTION_SHORT)
    size.add_argument("lines", nargs="?", help="line list: CSV, XLSX or TOML, or - to read it from standard input "
                                               "(omit to give one line with the options below)")
    size.add_argument("--format", choices=("csv", "toml", "xlsx"),
                      help="the format of the line list on standard input (-); default: sniffed (a zip is XLSX, "
                           "text starting with [ is TOML, else CSV)")
    size.add_argument("--quiet", "-q", action="store_true",
                      help="no table and no summary; stderr keeps errors and one line of caution (screening "
                           "calculations); the exit code says pass (0) or fail/error (1)")
    size.add_argument("--criteria", metavar="FILE.toml", help="criteria sets and pipe classes to use")
    size.add_argument("--json", action="store_true", help="print one JSON document instead of the table")
    size.add_argument("--no-plugins", action="store_true", help="use only boresize's built-in plugins")
    _add_run_options(size)
    single = size.add_argument_group("one line from options")
    for name, text in SINGLE_LINE_FIELDS:
        single.add_argument(f"--{name}", help=text)
    crit = sub.add_parser("criteria", help="list the installed criteria and the criteria sets by service")
    crit.add_argument("--criteria", metavar="FILE.toml", help="a criteria file to list as well")
    crit.add_argument("--no-plugins", action="store_true", help="use only boresize's built-in plugins")
    pipes = sub.add_parser("pipes", help="list pipe classes, or the catalogue sizes of one NPS")
    pipes.add_argument("--criteria", metavar="FILE.toml", help="a criteria file whose pipe classes to list")
    pipes.add_argument("--nps", help="show every schedule of this NPS (ASME B36.10M / B36.19M)")
    pipes.add_argument("--no-plugins", action="store_true", help="use only boresize's built-in plugins")
    sub.add_parser("schema", help="print the JSON Schema (draft 2020-12) of the results document (--json, .json)")
    _add_diff(sub.add_parser("diff", help="compare two revisions: result JSON files, or line lists (sized first)",
                             epilog="Exit code 0 when nothing changed, 1 when something did, 2 for a usage error."))
    return parser


def _add_diff(diff: argparse.ArgumentParser) -> None:
    diff.add_argument("old", help="the earlier revision: results .json, or a line list (.csv, .xlsx, .toml)")
    diff.add_argument("new", help="the later revision, likewise")
    diff.add_argument("--criteria", metavar="FILE.toml", help="criteria for sizing a line list")
    diff.add_argument("--json", action="store_true", help="print the differences as one JSON document")
    diff.add_argument("--no-plugins", action="store_true", help="use only boresize's built-in plugins")
    diff.add_argument("--workers", type=int, default=1, metavar="N", help="worker processes for sizing line lists")


def _add_run_options(size: argparse.ArgumentParser) -> None:
    size.add_argument("--output", "-o", action="append", default=[], metavar="FILE",
                      help="write the results to FILE: .json, .jsonl (JSON Lines: one record a line), .csv, .xlsx (with a "
                           "candidates sheet), .html (the calculation report) or .pdf (the paged calculation sheet); "
                           "repeat for several. Every FILE is checked before sizing; each is "
                           "written to a temporary file beside it and renamed when complete, so an earlier file "
                           "is replaced whole or left intact; one that cannot be written is reported with its "
                           "path, the others are still written, and the exit code is 2")
    size.add_argument("--workers", type=int, default=1, metavar="N",
                      help="size on N worker processes started for the run (default 1: in this process alone)")
    size.add_argument("--progress", action=argparse.BooleanOptionalAction, default=None,
                      help="show a progress bar on stderr (default: on a terminal, for 50 lines or more)")
    size.add_argument("--corroded-roughness", metavar="LENGTH",
                      help="check lines that give an NPS with this absolute roughness, e.g. '0.5 mm' "
                           "(a line's own roughness column wins)")
    size.add_argument("--bare-pressure", choices=("absolute", "gauge", "error"), default="absolute",
                      help="how a pressure in a bare unit (9 psi, 0.5 bar, a header's [bar]: neither g nor a) is read: "
                           "absolute (the default, as documented), gauge (101.325 kPa added) or error (the line is an "
                           "error naming the field); each such line has a note and the summary counts them")
    size.add_argument("--timings", action="store_true",
                      help="print the seconds each criterion took on stderr (and, with --json, in the summary's "
                           "criterion_seconds); a criterion over 1 s and 20%% of the sizing gets a note regardless")
    size.add_argument("--every-size", action="store_true",
                      help="rate every size of the pipe class from the smallest, instead of walking from the "
                           "first-guess diameter (same selection, slower; the record shows every size below)")
    size.add_argument("--document", metavar="FILE.toml",
                      help="the calculation sheet's document block (project, unit, number, revision, date, prepared, "
                           "checked, approved, notes as key = \"value\" lines), shown at the top of the HTML report")
    size.add_argument("--headroom", action="store_true",
                      help="also rate each line at its size: how much more flow (%% of the design flow) it "
                           "carries before a criterion fails")


def main(argv: Sequence[str] | None = None) -> int:
    try:
        return _dispatch(build_parser(), argv)
    except (UsageError, BoresizeError) as exc:
        print(f"boresize: error: {printable(str(exc), newlines=True)}", file=sys.stderr)
        return 2
    except KeyboardInterrupt:
        print("boresize: interrupted", file=sys.stderr)
        return 130
    except Exception as exc:  # the last guard: no traceback reaches the user
        from boresize.errors import missing_module

        missing = missing_module(exc, None) if isinstance(exc, ModuleNotFoundError) else None
        if missing is not None:  # an optional module an output imports outside boresize.optional.needs
            print(f"boresize: error: {missing}", file=sys.stderr)
            return 2
        print(f"boresize: internal error {type(exc).__name__}: {printable(str(exc), newlines=True)}\n"
              f"Please report it with the input that "
              f"caused it; run with BORESIZE_DEBUG=1 for the traceback.", file=sys.stderr)
        if os.environ.get("BORESIZE_DEBUG"):
            raise
        return 2


def _dispatch(parser: argparse.ArgumentParser, argv: Sequence[str] | None) -> int:
    args = parser.parse_args(argv)
    if args.command is None:
        parser.print_help()
        return 2
    from boresize.api.tools import leave_dask_out_of_pint

    leave_dask_out_of_pint()  # before anything imports pint
    import boresize.cli.commands  # the API loads only when a command runs: --help and --version stay quick

    return int(getattr(boresize.cli.commands, f"run_{args.command}")(args))


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
