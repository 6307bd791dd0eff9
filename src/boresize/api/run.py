"""One run: a line list in, every line sized or checked, a :class:`Run` out that writes itself anywhere.

The one path from a line list to files, for scripts, notebooks and the ``boresize`` command alike::

    run = run_lines("lines.csv", "criteria.toml", workers=2)
    run.write("results.xlsx")        # .json, .jsonl, .csv, .xlsx, .html or .pdf, chosen by the extension
    run.document()                   # the JSON document as a dict
    print(run.table())               # the terminal table

The line list may be a path, an open file, ``"-"`` (standard input, CSV), a pandas DataFrame, a
:class:`~boresize.io.LineList`, or Lines (and lists of one line's cases). Rows are read into Lines by
the readers; a row that cannot be read is a result with status ``error`` and the others go on.
"""

from __future__ import annotations

import hashlib
import sys
import time
from collections.abc import Callable, Iterable, Mapping, Sequence
from concurrent.futures import Executor
from dataclasses import dataclass, field, replace
from pathlib import Path
from typing import IO, TYPE_CHECKING, Any, Literal, Union, cast

from boresize.api.calls import Item as LineItem, checked_item, default_sizer, reread_item
from boresize.api.result import SizingResult
from boresize.errors import InputError
from boresize.io.csv_reader import LineList
from boresize.io.document_block import DocumentBlock, document_block as as_document_block
from boresize.io.line_items import LazyItems
from boresize.model import Line, LineResult
from boresize.report.trace import Traceability, traceability
from boresize.sizing.batch import ExecutorLike, SizedItems, SizerSpec, run_items, spec_for, summary, summary_text
from boresize.sizing.headroom import Headroom
from boresize.sizing.scan import RATED_ABOVE
from boresize.units import BarePressure, bare_pressure_mode

if TYPE_CHECKING:
    import pandas as pd

    from boresize.api.output import StreamedOutput
    from boresize.io.line_items import Cells
    from boresize.sizing.engine import Sizer

__all__ = ["KEEP", "SLOW_CRITERION_SECONDS", "SLOW_CRITERION_SHARE", "CriterionTime", "LineSource", "Run", "Tally",
           "read_lines", "roughness_value", "run_lines", "size_dataframe", "size_rows"]

#: What :func:`run_lines` reads lines from.
LineSource = Union[str, Path, IO[str], IO[bytes], "pd.DataFrame", LineList, Iterable[LineItem]]


#: What a run keeps of each line's result: ``full`` (every rated candidate, for the JSON document, the workbook's
#: candidates sheet and the HTML report) or ``selected`` (the selected size and its verdicts: what the CSV and the
#: table show; measured: about a third of the memory a line's full result takes, see benchmarks/bench_scale.py)
KEEP = ("full", "selected")
Keep = Literal["full", "selected"]
#: Outputs a run that kept only the selected sizes can still write (they never read the other candidates).
LEAN_OUTPUTS = (".csv",)

#: A criterion is noted as slow (``boresize size`` on stderr) when its evaluate took more than this many
#: seconds in all over the run ...
SLOW_CRITERION_SECONDS = 1.0
#: ... and more than this share of the sizing time (the run's wall time times its worker processes).
SLOW_CRITERION_SHARE = 0.2


@dataclass(frozen=True)
class CriterionTime:
    """The seconds one criterion's evaluate took over a run, summed over its calls and processes."""

    ident: str
    plugin: str  #: the plugin (or source) that provides it
    seconds: float


@dataclass
class Tally:
    """What a run that kept no results (``run_lines(count_only=True)``) counted as each line was sized: enough for its
    summary, its exit status and its error messages, whatever the number of lines."""

    lines: int = 0
    passed: int = 0
    failed: int = 0
    errors: int = 0
    bare_pressure: int = 0  #: lines with a pressure in a bare unit
    two_phase: int = 0  #: lines two-phase in any case
    error_texts: list[str] = field(default_factory=list)  #: each error line's message, in input order

    def add(self, result: LineResult) -> None:
        from boresize.io.document import two_phase_count
        from boresize.model import bare_pressure_count

        self.lines += 1
        self.passed += result.status == "pass"
        self.failed += result.status == "fail"
        self.errors += result.status == "error"
        self.bare_pressure += bare_pressure_count([result])
        self.two_phase += two_phase_count([result])
        if result.error:
            self.error_texts.append(result.error)


@dataclass(frozen=True)
class Run:
    """The results of one run, the line list as read, and the record of what produced them.

    :param results: one result per line, in the order of each line's first row
    :param line_list: the line list as read (headers, units, source, SHA-256); no rows when given Lines
    :param trace: the traceability record (versions, backends, criteria set, input digest, date)
    :param headrooms: each line's headroom at its size, when asked for
    :param criterion_times: the seconds each criterion's evaluate took (in the order the criteria were first
        timed); empty when the run did not time them
    :param sizing_seconds: the sizing time the shares of :meth:`slow_criteria` are of: the run's wall time
        times its worker processes
    :param document_block: the calculation sheet's project, number, revision, signatures (the HTML page's head)
    :param keep: what was kept of each result (:data:`KEEP`): ``selected`` writes only CSV and the table
    :param tally: the counts of a run that kept no result (``count_only``): its ``results`` are then empty, and it
        gives its summary, :attr:`passed` and error messages, and writes nothing more (its streamed outputs are
        written)
    """

    results: tuple[SizingResult, ...]
    line_list: LineList
    trace: Traceability
    headrooms: tuple[Headroom, ...] | None = None
    criterion_times: tuple[CriterionTime, ...] = ()
    sizing_seconds: float = 0.0
    document_block: DocumentBlock | None = None
    keep: Keep = "full"
    #: (path, None) for each output :func:`run_lines` wrote as lines were sized, (path, the error) for one it could not
    streamed: tuple[tuple[Path, InputError | None], ...] = ()
    tally: Tally | None = None

    def _need_results(self, what: str) -> None:
        """:raises InputError: (field "count_only") when this run kept no result, only counts."""
        if self.tally is not None:
            raise InputError(f"{what} needs each line's result, and this run kept only counts (count_only=True: its "
                             f"outputs were written as lines were sized)", field="count_only", value=True,
                             expected="a run made with count_only=False (the default), or its outputs given as "
                                      "run_lines(stream=...)")

    def _need_full(self, what: str) -> None:
        """:raises InputError: (field "keep") when this run kept only each line's selected size."""
        self._need_results(what)
        if self.keep != "full":
            raise InputError(f"{what} needs every rated size of each line, and this run kept only the selected "
                             f"ones (keep={self.keep!r})", field="keep", value=self.keep,
                             expected=f"a run made with keep='full' (the default), or an output ending in "
                                      f"{', '.join(LEAN_OUTPUTS)}")

    @property
    def criterion_seconds(self) -> dict[str, float]:
        """Criterion id -> seconds its evaluate took over the run (in the JSON summary's ``criterion_seconds`` only
        when :meth:`document` is asked for timings: a document without them is the same for the same input)."""
        return {t.ident: t.seconds for t in self.criterion_times}

    def slow_criteria(self) -> list[CriterionTime]:
        """The criteria whose time is over :data:`SLOW_CRITERION_SECONDS` and :data:`SLOW_CRITERION_SHARE` of
        the sizing time, slowest first."""
        limit = max(SLOW_CRITERION_SECONDS, SLOW_CRITERION_SHARE * self.sizing_seconds)
        return sorted((t for t in self.criterion_times if t.seconds > limit), key=lambda t: -t.seconds)

    @property
    def passed(self) -> bool:
        """True when there are lines and every one passed."""
        if self.tally is not None:
            return self.tally.lines > 0 and self.tally.passed == self.tally.lines
        return bool(self.results) and all(r.status == "pass" for r in self.results)

    @property
    def error_texts(self) -> list[str]:
        """Each error line's message, in input order (``boresize size --quiet`` prints them)."""
        if self.tally is not None:
            return list(self.tally.error_texts)
        return [r.error for r in self.results if r.error]

    def summary(self) -> str:
        """One line: how many lines were sized or checked, passed, failed and had errors."""
        if self.tally is not None:
            t = self.tally
            return summary_text(t.lines, t.passed, t.failed, t.errors, t.bare_pressure)
        return summary(self.results)

    def two_phase_caution(self) -> str | None:
        """The caution on two-phase lines when the run has any (the table prints it itself), else None."""
        from boresize.io.document import TWO_PHASE_CAUTION, two_phase_count

        count = self.tally.two_phase if self.tally is not None else two_phase_count(self.results)
        return f"{count} two-phase line{'s' if count > 1 else ''}: {TWO_PHASE_CAUTION}" if count else None

    def document(self, timings: bool = False) -> dict[str, Any]:
        """The JSON document (``boresize size --json``), with each line's headroom when asked for.

        :param timings: add each criterion's seconds (``summary.criterion_seconds``; they differ from run to run,
            so a document without them is byte-identical for the same input)
        """
        from boresize.io.document import document
        from boresize.sizing.headroom import headroom_to_dict

        self._need_full("the JSON document")
        doc = document(self.results, criteria_source=self.trace.criteria_source,
                       lines_source=self.line_list.source, traceability=self.trace.to_dict(),
                       criterion_seconds=self.criterion_seconds if timings else None,
                       document_block=dict(self.document_block.rows()) if self.document_block else None)
        for entry, room in zip(doc["lines"], self.headrooms or ()):
            entry.update(headroom_to_dict(room))
        return doc

    def table(self) -> str:
        """The terminal table (and the headroom list when asked for)."""
        from boresize.report.terminal import render_table

        self._need_results("the table")
        text = render_table(self.results, self.trace.criteria_source, self.trace.criteria_set)
        return text + (_headroom_text(self.headrooms) if self.headrooms is not None else "")

    def write(self, path: str | Path, document: DocumentBlock | Mapping[str, Any] | str | Path | None = None) -> Path:
        """Write the run to ``path``: .json, .jsonl, .csv, .xlsx, .html or .pdf by its extension; returns the path.

        :param document: a document block for this file (a TOML file's path, a mapping of its keys or a
            :class:`~boresize.io.document_block.DocumentBlock`) instead of the run's own

        Written to a temporary file beside ``path`` and renamed over it when complete: an earlier file of that
        name is replaced whole or left intact.

        :raises InputError: (field "output") an extension boresize does not write, a missing or unwritable
            folder, a read-only file, a file that cannot be written (the earlier one is then left as it was)
        """
        from boresize.api.output import WRITERS, check_output, write_run

        suffix = check_output(path).suffix.lower()  # a path that is not text or a Path: an InputError naming it
        if suffix in WRITERS:  # an unknown one: write_run names it
            (self._need_results if suffix in LEAN_OUTPUTS else self._need_full)(f"writing {str(path)!r}")
        block = as_document_block(document)
        return write_run(path, self if block is None else replace(self, document_block=block))


def run_lines(lines: LineSource, criteria: str | Path | None = None, *, workers: int = 1,
              executor: Executor | ExecutorLike | None = None, every_size: bool = False,
              corroded_roughness: str | float | None = None,
              plugins: bool = True, progress: bool | None = False, headroom: bool = False,
              units_row: bool | None = None, bare_pressure: BarePressure | None = None,
              document: DocumentBlock | Mapping[str, Any] | str | Path | None = None, keep: Keep = "full",
              stream: Sequence[str | Path] = (), count_only: bool = False) -> Run:
    """Size (or check) every line of a line list; see the module docstring for what ``lines`` may be.

    :param criteria: a criteria TOML file (the shipped sets when None)
    :param workers: worker processes to size on (1: this process alone)
    :param executor: any object with ``submit`` and ``map`` to size on instead (a concurrent.futures executor, a
        dask ``Client``; not shut down here); the criteria go to its workers by content
    :param every_size: rate every size of the pipe class (same selection, slower)
    :param corroded_roughness: absolute roughness for lines checked at a given NPS ("0.5 mm", or metres)
    :param plugins: False to use only boresize's built-in plugins (no entry points)
    :param progress: True/False for a progress bar on stderr; None shows it on a terminal for long runs
    :param headroom: also rate each line at its size: how much more flow it carries before a criterion fails
    :param units_row: for a DataFrame, as :func:`boresize.io.dataframe.read_dataframe`'s
    :param bare_pressure: how a pressure in a bare unit (``9 psi``, a header's ``[bar]``: neither g nor a) is read:
        ``absolute`` (None, the default for rows read, as documented), ``gauge`` (101325 Pa added) or ``error`` (the
        line is an error naming the field); Lines given keep how they were made unless it is given. Each such line
        has a note, and the summary counts them
    :param document: the calculation sheet's document block (project, unit, number, revision, date, prepared,
        checked, approved, notes): a TOML file's path, a mapping of those keys or a DocumentBlock; read before sizing
    :param keep: ``full`` (default) keeps every rated candidate of each line; ``selected`` only the selected size
        and its verdicts, dropping the rest as each line is sized (memory for long lists; the run then writes only
        CSV and the table, :data:`KEEP`)
    :param stream: .csv and .jsonl files written as each line is sized (one line's rows at a time, each file renamed
        into place at the end: :class:`~boresize.api.output.StreamedOutput`), so that a long run need not keep what
        only they read; :attr:`Run.streamed` says which were written. Byte for byte what :meth:`Run.write` writes
    :param count_only: keep no result, only counts (:class:`Tally`: the summary, :attr:`Run.passed`, each error
        line's message): with ``stream``, memory that does not grow with the number of lines (one process: rows
        read are parsed as they are sized and a line list read here lets go of its rows). The run then writes
        nothing more and has no table or document
    :raises InputError: an unreadable line list, a bad option (naming it), a bad document block, a ``stream`` path
        that cannot be written
    """
    if isinstance(workers, bool) or not isinstance(workers, int) or workers < 1:
        raise InputError(f"workers {workers!r} is not a whole number of 1 or more", field="workers", value=workers,
                         expected="1 or more processes")
    if keep not in KEEP:
        raise InputError(f"keep {keep!r} is not known", field="keep", value=keep, expected=" or ".join(KEEP))
    block = as_document_block(document)
    roughness = None if corroded_roughness is None else roughness_value(corroded_roughness)
    mode = None if bare_pressure is None else bare_pressure_mode(bare_pressure)
    # the sizes above the selected one are rated only for outputs that show them: the full record (kept, or
    # streamed to .jsonl); a table or CSV shows the selected size, the same with or without them.
    # measured: sizing the 2,000-line benchmark list 0.82-0.92 s to 0.50-0.51 s CPU, 38-45 % less (least of 4;
    # benchmarks/bench_sizes_above.py, on a machine loaded by other work)
    full_record = (keep == "full" and not count_only) or any(not str(path).lower().endswith(LEAN_OUTPUTS)
                                                              for path in stream)
    spec = spec_for(criteria, plugins, roughness, every_size=every_size,
                    sizes_above=RATED_ABOVE if full_record else 0)
    lazy = count_only and workers == 1 and executor is None
    line_list, items, cells = _read(lines, units_row, mode, lazy=lazy)
    sizer = default_sizer(spec)
    streams = _open_streams(stream, line_list)
    seconds: dict[str, float] = {}
    rooms: list[Headroom] = []
    tally = Tally() if count_only else None
    own_cells: Callable[[], tuple[Cells, ...]] | None = None
    if isinstance(items, LazyItems):
        own_cells = items.take_cells
    elif cells is not None:
        own_cells = iter(cells).__next__

    def each(result: LineResult) -> LineResult | None:
        """Each line as it is sized: its cells joined, its headroom rated, written to the streams, kept (lean) or
        counted."""
        done: LineResult = SizingResult.of(result if own_cells is None else _with_cells(result, own_cells()))
        room = _headroom(sizer, done) if headroom and (streams or tally) else None  # else rated after the run
        if room is not None and tally is None:
            rooms.append(room)
        for output in streams:
            output.add(done, room)
        if tally is not None:
            tally.add(done)
            return None
        return SizingResult.of(_lean(done)) if keep == "selected" else done

    start = time.perf_counter()
    try:
        results = run_items(items, spec, sizer=sizer, executor=executor, workers=workers, progress=progress,
                            retry_hint="one process (workers=1, or --workers 1 on the command line)",
                            criterion_seconds=seconds, each=each)
    except BaseException:
        for output in streams:
            output.discard()
        raise
    wall = (time.perf_counter() - start) * (workers if executor is None else 1)
    times = tuple(CriterionTime(ident, _owner(sizer, ident), spent) for ident, spent in seconds.items())
    trace = _trace(sizer, spec, line_list, str(criteria) if criteria else sizer.config.origin)
    if headroom and not streams and tally is None:
        rooms = [_headroom(sizer, r) for r in results]
    written = tuple(_commit(output) for output in streams)
    return Run(cast(tuple[SizingResult, ...], tuple(results)), line_list, trace,
               tuple(rooms) if headroom and tally is None else None, times, wall, block, keep, written, tally)


def _open_streams(paths: Sequence[str | Path], line_list: LineList) -> list[StreamedOutput]:
    """A streamed output for each path (checked first, every one, before any is opened).

    :raises InputError: (field "output") a path :func:`check_output` refuses, one not .csv or .jsonl, a CSV for
        a line list without headers (Lines given: its columns are known only once every line is sized)
    """
    from boresize.api.output import STREAMED_SUFFIXES, StreamedOutput, check_outputs

    checked = check_outputs(paths, [line_list.source])
    for path, target in zip(paths, checked):
        if isinstance(target, InputError):
            raise target
        suffix = target.suffix.lower()
        if suffix not in STREAMED_SUFFIXES or (suffix == ".csv" and not line_list.headers):
            raise InputError(f"{str(path)!r} cannot be written as lines are sized", field="output", value=str(path),
                             expected=f"a file ending in {', '.join(STREAMED_SUFFIXES)} (a CSV only for a line "
                                      "list read from a file), or Run.write after the run")
    opened: list[StreamedOutput] = []
    try:
        for target in checked:
            opened.append(StreamedOutput(cast(Path, target), line_list.headers))
    except OSError as exc:
        for output in opened:
            output.discard()
        raise InputError(f"cannot write {str(target)!r}: {exc.strerror or exc}", field="output",
                         value=str(target), expected="a file this user may write") from exc
    return opened


def _commit(output: StreamedOutput) -> tuple[Path, InputError | None]:
    try:
        return output.commit(), None
    except InputError as exc:
        return output.path, exc


def _lean(result: LineResult) -> LineResult:
    """The result without its rated candidates (its selected one, verdicts and cases' selected ones kept)."""
    return replace(result, candidates=(), cases=tuple(_lean(c) for c in result.cases))


def _owner(sizer: Sizer, ident: str) -> str:
    """The plugin that provides criterion ``ident`` ("?" for an id no plugin registered)."""
    try:
        return sizer.host.criteria.owner(ident)
    except (KeyError, LookupError):
        return "?"


def size_rows(rows: Iterable[tuple[Any, Any]], *, sizer: Sizer | None = None,
              spec: SizerSpec | None = None) -> list[LineResult]:
    """Size rows ((field -> cell, field -> default unit) pairs, e.g. ``LineList.pairs()``) in this process;
    one result per line (cases grouped), each with its rows' cells (``raw``) for the writers."""
    from boresize.io.line_items import line_items

    read = line_items(rows)
    results = run_items(read.items, spec, sizer=sizer or default_sizer(spec or spec_for(None, True, None)),
                        progress=False)
    return [_with_cells(result, own) for result, own in zip(results, read.cells)]


def roughness_value(value: str | float, field: str = "corroded_roughness") -> float:
    """A roughness [m] from text with its unit ("0.5 mm") or a number in metres.

    :raises InputError: naming ``field``: no unit, not a length, not above zero
    """
    if isinstance(value, str):
        from boresize.units import parse_quantity

        number = parse_quantity(value, field, "length")
    else:
        number = float(value)
    if not number > 0:
        raise InputError(f"{value!r} is not above zero", field=field, value=value, expected="a roughness above zero")
    return number


STDIN_FORMATS = ("csv", "toml", "xlsx")


def read_lines(lines: LineSource, units_row: bool | None = None, *, format: str | None = None) -> LineList:
    """A line list from a path, ``"-"`` (standard input), an open file, a DataFrame or a LineList.

    :param format: for ``"-"``: ``csv``, ``toml`` or ``xlsx``; None sniffs it (a zip, ``PK``, is XLSX; text whose
        first line that is neither blank nor a ``#`` comment starts with ``[`` is TOML; anything else is CSV)
    :raises InputError: (field "lines") something else, an unreadable file, empty standard input
    """
    from boresize.io import read_line_list
    from boresize.io.csv_reader import parse_csv_text

    if format is not None and format not in STDIN_FORMATS:
        raise InputError(f"format {format!r} is not known", field="format", value=format,
                         expected=" or ".join(STDIN_FORMATS))
    if isinstance(lines, LineList):
        return lines
    if isinstance(lines, str) and lines == "-":
        stdin = getattr(sys.stdin, "buffer", sys.stdin)  # bytes where there are: a bad encoding is named, not raised
        return _from_stdin(stdin.read(), format, parse_csv_text)
    if isinstance(lines, (str, Path)):
        return read_line_list(lines)
    if hasattr(lines, "read"):
        handle = cast(IO[Any], lines)
        return _from_text(handle.read(), str(getattr(handle, "name", "<file>")), parse_csv_text)
    if type(lines).__module__.partition(".")[0] == "pandas" and hasattr(lines, "columns"):
        from boresize.io.dataframe import read_dataframe

        return read_dataframe(cast("pd.DataFrame", lines), units_row=units_row)
    raise InputError(f"a {type(lines).__name__} is not a line list", field="lines", value=repr(lines)[:80],
                     expected="a path, '-', an open file, a DataFrame, a LineList, or Lines")


def sniff_format(data: bytes) -> str:
    """``xlsx`` for a zip (``PK``), ``toml`` when the first line neither blank nor a ``#`` comment starts with ``[``
    (``[[line]]``, a table), else ``csv``."""
    if data.startswith(b"PK"):
        return "xlsx"
    for raw in data.lstrip(b"\xef\xbb\xbf").splitlines():
        text = raw.strip()
        if text and not text.startswith(b"#"):
            return "toml" if text.startswith(b"[") else "csv"
    return "csv"


def _from_stdin(read: str | bytes, format: str | None, parse_csv: Callable[[str, str], LineList]) -> LineList:
    data = read if isinstance(read, bytes) else read.encode("utf-8")
    if not data.strip():
        raise InputError("standard input is empty: nothing to size", field="lines", value="-",
                         expected="a line list (CSV, TOML or XLSX) piped in, e.g. boresize size - < lines.csv")
    kind = format or sniff_format(data)
    if kind == "xlsx":
        return _xlsx_bytes(data, "<stdin>")
    try:
        return _from_text(data, "<stdin>", parse_csv, toml=kind == "toml")
    except InputError as exc:
        if format is None and kind == "toml" and exc.field == "lines":  # a CSV whose first cell starts with [
            raise InputError(exc.message, field=exc.field, value=exc.value,
                             expected=f"{exc.expected} (read as TOML because its first line starts with [; "
                                      "--format csv reads it as CSV)") from None
        raise


def _xlsx_bytes(data: bytes, source: str) -> LineList:
    """An XLSX line list from its bytes (read through a private temporary file; errors name ``source``)."""
    import tempfile

    from boresize.io.xlsx import read_xlsx

    if not data.startswith(b"PK"):
        raise InputError(f"{source} is not an XLSX workbook (it does not start as a zip file does, with PK)",
                         field="lines", value=source, expected="an .xlsx workbook's bytes, or --format csv or toml")
    with tempfile.TemporaryDirectory(prefix="boresize-stdin-") as folder:
        path = Path(folder) / "stdin.xlsx"
        path.write_bytes(data)
        try:
            line_list = read_xlsx(path)
        except InputError as exc:
            raise InputError(exc.message.replace(str(path), source), field=exc.field,
                             value=source if exc.value == str(path) else exc.value, expected=exc.expected,
                             tag=exc.tag) from None
    line_list.source = source
    line_list.digest = hashlib.sha256(data).hexdigest()
    return line_list


def _from_text(text: str | bytes, source: str, parse_csv: Callable[[str, str], LineList],
               toml: bool | None = None) -> LineList:
    """A line list from the text of a file: TOML when ``toml`` (None: when its name ends in .toml), else CSV;
    digest of its bytes."""
    data = text if isinstance(text, bytes) else text.encode("utf-8")
    try:
        decoded = data.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        raise InputError(f"{source} is not UTF-8 text", field="lines", value=source,
                         expected="a line list saved as UTF-8") from exc
    if source.lower().endswith(".toml") if toml is None else toml:
        import tomllib

        from boresize.io.toml_lines import lines_from_document

        try:
            line_list = lines_from_document(tomllib.loads(decoded), source)
        except tomllib.TOMLDecodeError as exc:
            raise InputError(f"{source} is not valid TOML: {exc}", field="lines", value=source,
                             expected="a TOML line list") from exc
    else:
        line_list = parse_csv(decoded, source)
    line_list.digest = hashlib.sha256(data).hexdigest()
    return line_list


def _read(lines: LineSource, units_row: bool | None, bare_pressure: BarePressure | None = None, lazy: bool = False,
          ) -> tuple[LineList, SizedItems, tuple[tuple[Cells, ...], ...] | None]:
    """(the line list, the lines to size, each line's rows' cells) from any line source.

    :param lazy: the lines as :class:`~boresize.io.line_items.LazyItems` (parsed as they are sized, cells taken
        from it), and a line list read here (not given as a LineList) without its rows, which the items hold
        until each is parsed
    """
    given = _given_lines(lines)
    if given is not None:
        items = [reread_item(checked_item(value, i), bare_pressure) for i, value in enumerate(given, start=1)]
        return LineList(rows=[], units={}, source="<lines>"), items, None
    from boresize.io.line_items import line_items

    line_list = read_lines(lines, units_row)
    if lazy:
        lazy_items = LazyItems(line_list.pairs(), bare_pressure or "absolute")
        if line_list is not lines:
            line_list = replace(line_list, rows=[], row_units=[])
        return line_list, lazy_items, None
    read = line_items(line_list.pairs(), bare_pressure or "absolute")
    return line_list, read.items, read.cells


def _given_lines(lines: object) -> list[Any] | None:
    """Lines (and lists of one line's cases) from a Line or any iterable of them, generators included; None when
    ``lines`` is something else to read (a path, a file, a DataFrame, a LineList).

    :raises InputError: (field "lines") an empty iterable: nothing to size
    """
    if isinstance(lines, Line):
        return [lines]
    if isinstance(lines, (str, bytes, Path, LineList)) or hasattr(lines, "read") or hasattr(lines, "columns") \
            or not isinstance(lines, Iterable):
        return None
    given = list(lines)
    if not given:
        raise InputError("no lines given", field="lines", value="[]",
                         expected="one or more Lines from make_line(), or a line list to read")
    return given if all(isinstance(v, (Line, list, tuple)) for v in given) else None


def _with_cells(result: LineResult, cells: Sequence[Cells]) -> LineResult:
    """The result with its rows' cells as given (``raw``; for a line of cases, each case's own)."""
    if len(cells) == 1:
        return replace(result, raw=cells[0])
    return replace(result, cases=tuple(replace(c, raw=raw) for c, raw in zip(result.cases, cells)))


def _trace(sizer: Sizer, spec: SizerSpec, line_list: LineList, criteria_source: str) -> Traceability:
    """The run's record; ``criteria_source`` names the criteria file as the caller gave it."""
    host, config = sizer.host, sizer.config
    services = {name: getattr(config.services[name], "stamp", name) for name in config.service_names()}
    return traceability(backends=list(host.backends), owner=host.backends.owner, criteria_set=config.version,
                        criteria_source=criteria_source, services=services, check_roughness=spec.check_roughness,
                        lines_source=line_list.source, lines_digest=line_list.digest)


def _headroom(sizer: Sizer, result: LineResult) -> Headroom:
    """Headroom of a line at the size it got (its governing case's conditions)."""
    from boresize.sizing.headroom import find_headroom

    if result.line is None or result.selected is None:
        return Headroom(result.tag, None, None, (), result.error or "no size to rate")
    chosen = result.selected.candidate
    return find_headroom(sizer, replace(result.line, nps=chosen.nps, schedule=chosen.schedule))


def _headroom_text(rooms: Sequence[Headroom]) -> str:
    out = ["", "Headroom at the selected or given size (flow beyond the design flow before a criterion fails):"]
    for room in rooms:
        shown = "-" if room.percent is None else f"{room.percent:+.1f} %"
        out.append(f"  {room.tag:<14} {shown:>9}  {room.note}")
    return "\n".join(out) + "\n"


def size_dataframe(frame: pd.DataFrame, *, criteria: str | Path | None = None, plugins: bool = True,
                   executor: Executor | ExecutorLike | None = None, workers: int = 1,
                   units_row: bool | None = None) -> pd.DataFrame:
    """Size (or check) every line of a DataFrame of streams; the results as
    :func:`boresize.io.dataframe.results_dataframe` lays them out (input columns, then the result columns named as
    the JSON keys, ``velocity_m_s`` ...), one row per input row in input order, under the input frame's index (a
    frame indexed by tag keeps that index, which supplies the tag column).

    Rows are grouped into lines (operating cases) as a CSV line list's are; a bad row gives an
    ``error`` row and the others go on. ``executor`` and ``workers`` as in :func:`run_lines`.
    """
    from boresize.io.dataframe import in_input_order, results_dataframe, size_frame_rows

    line_list, positions, from_index = size_frame_rows(frame, units_row)
    run = run_lines(line_list, criteria, plugins=plugins, executor=executor, workers=workers)
    table = results_dataframe(run.results, run.line_list.headers)
    return in_input_order(table, run.results, run.line_list, positions, frame, from_index)
