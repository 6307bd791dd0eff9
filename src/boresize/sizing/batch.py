"""Running many lines: in this process, or on worker processes, with a progress bar. The one batch runner
of the API's calls (:func:`boresize.api.run_lines`, :func:`boresize.api.size_many`, the DataFrame path).

The plugin manager cannot be pickled, so a worker never receives a :class:`~boresize.sizing.engine.Sizer`:
it takes its sizer for a :class:`SizerSpec` (criteria file and its content digest, whether to load entry
points, corroded roughness) from :func:`shared_sizer`, once, in the executor's initializer: a worker forked
from a parent that holds a sizer for that spec finds the parent's there, any other builds its own. The
parent sends whole lines (:data:`Item`) in chunks. Results come back in input order whatever order the chunks finish in. A line's fault stays on
that line (an ``error`` result). So does a worker process that dies (a plugin's ``os._exit``, SIGKILL, memory
running out): the chunks it left are run again one at a time on a fresh process, and a line that ends that
process too gets an ``error`` result saying so (:data:`WORKER_DIED`); the other lines are sized.

Any executor can be passed: an object with ``submit`` and ``map`` (:class:`ExecutorLike`: a thread pool, a dask
``Client`` or its ``get_executor()``) whose futures have ``result()``; the task builds the worker's sizer on
first use when no initializer did. The criteria travel by content (:attr:`SizerSpec.criteria_content`), and the
chunks are sized by the executor's worker count where it says it (:func:`executor_workers`).
"""

from __future__ import annotations

import gc
import hashlib
import math
import multiprocessing
import sys
import threading
from collections import deque
from collections.abc import Callable, Iterator, Sequence
from concurrent.futures import Executor, Future, ProcessPoolExecutor, as_completed
from concurrent.futures.process import BrokenProcessPool
from contextlib import AbstractContextManager, contextmanager, nullcontext
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any, Protocol, TextIO, Union, runtime_checkable

from boresize.errors import BoresizeError, InputError
from boresize.io.line_items import RowFault
from boresize.model import Line, LineResult, bare_pressure_count, bare_pressure_note
from boresize.sizing import cases as _cases
from boresize.sizing.engine import RATED_ABOVE, Sizer
from boresize.sizing.selection import error_result

__all__ = ["PROGRESS_THRESHOLD", "ExecutorLike", "Item", "executor_workers", "is_executor", "SizedItems", "SizerSpec", "clear_sizers", "process_pool", "run_items", "run_chunks", "shared_sizer", "WORKER_DIED",
           "size_item", "spec_for", "summary", "summary_text"]

#: A run of at least this many lines shows a progress bar on a terminal without being asked [lines].
PROGRESS_THRESHOLD = 50
#: One line to size: a Line, a row the reader could not read, or one line's cases (Lines or faults).
Item = Union[Line, RowFault, Sequence[Union[Line, RowFault]]]
_SIZERS: dict[SizerSpec, Sizer] = {}


class SizedItems(Protocol):
    """Lines that say how many they are and are read once, in order, as they are sized
    (:class:`~boresize.io.line_items.LazyItems`); a sequence is one too."""

    def __len__(self) -> int: ...

    def __iter__(self) -> Iterator[Item]: ...


@runtime_checkable
class ExecutorLike(Protocol):
    """What a batch needs of an executor: ``submit(fn, *args)`` returning a future with ``result()``, and
    ``map`` (concurrent.futures executors, dask's ``Client`` and ``ClientExecutor``, loky, ...)."""

    def submit(self, fn: Callable[..., Any], /, *args: Any, **kwargs: Any) -> Any: ...

    def map(self, fn: Callable[..., Any], *iterables: Any, **kwargs: Any) -> Any: ...


def is_executor(value: object) -> bool:
    """True when ``value`` has callable ``submit`` and ``map`` (duck-typed, not only concurrent.futures); a class
    (``ThreadPoolExecutor`` not called) is not one."""
    return (not isinstance(value, type) and callable(getattr(value, "submit", None))
            and callable(getattr(value, "map", None)))


def executor_workers(executor: object) -> int | None:
    """How many tasks ``executor`` runs at once, where it says: ``_max_workers`` (concurrent.futures, loky),
    ``max_workers``, or a dask client's threads over the whole cluster (``nthreads()``; a ``ClientExecutor`` through
    its client); None when unknown."""
    for name in ("_max_workers", "max_workers"):
        count = getattr(executor, name, None)
        if isinstance(count, int) and not isinstance(count, bool) and count >= 1:
            return count
    client = getattr(executor, "_client", executor)
    nthreads = getattr(client, "nthreads", None)
    if not callable(nthreads):
        return None
    try:
        threads = nthreads()
    except (OSError, TimeoutError, RuntimeError, ValueError, TypeError, AttributeError):  # a closed client
        return None
    if isinstance(threads, dict):
        total = sum(n for n in threads.values() if isinstance(n, int) and not isinstance(n, bool))
        return total if total >= 1 else None
    return None
_SIZERS_LOCK = threading.Lock()


@dataclass(frozen=True)
class SizerSpec:
    """Everything a worker needs to build the same :class:`Sizer` as the parent (picklable).

    Two specs are equal only when the criteria file's bytes are (``criteria_digest``): a sizer built for
    a file is never used after the file is edited.

    :param criteria_file: path of the criteria TOML, or None for the shipped sets
    :param load_entry_points: False to use only boresize's built-in plugins
    :param check_roughness: corroded roughness for checked lines [m], or None
    :param every_size: rate every size of the pipe class (see :class:`~boresize.sizing.engine.Sizer`)
    :param sizes_above: sizes rated above the selected one for the record (see
        :class:`~boresize.sizing.engine.Sizer`)
    :param criteria_digest: SHA-256 of the criteria file's bytes (None: no file, or it cannot be read)
    :param criteria_name: the criteria file as the caller named it: messages name it so where it is that file
    :param criteria_content: the criteria file's bytes as the caller read them (None: no file, or it cannot be
        read): workers size with these, so a worker needs no copy of the file (a cluster's machines) and a file
        edited or deleted after the run starts changes nothing
    """

    criteria_file: str | None = None
    load_entry_points: bool = True
    check_roughness: float | None = None
    every_size: bool = False
    criteria_digest: str | None = None
    criteria_name: str | None = field(default=None, compare=False)
    criteria_content: bytes | None = field(default=None, compare=False, repr=False)
    sizes_above: int = RATED_ABOVE

    def build(self) -> Sizer:
        from boresize.plugins import PluginHost
        from boresize.sizing.services import load_config

        host = PluginHost.load(load_entry_points=self.load_entry_points)
        named = self.criteria_name
        path = named if named and str(Path(named).resolve()) == self.criteria_file else self.criteria_file
        config = None if path is None else load_config(host, path, self.criteria_content)
        return Sizer(host, config, check_roughness=self.check_roughness, every_size=self.every_size,
                     sizes_above=self.sizes_above)


def shared_sizer(spec: SizerSpec) -> Sizer:
    """This process's sizer for ``spec``, built once (loading plugins and criteria costs time); thread-safe.

    A sizer built for an earlier content of the same criteria file is dropped.
    """
    with _SIZERS_LOCK:
        if spec not in _SIZERS:
            for old in [s for s in _SIZERS if s.criteria_file == spec.criteria_file and s != spec
                        and s.criteria_digest != spec.criteria_digest]:
                del _SIZERS[old]
            _SIZERS[spec] = spec.build()
        return _SIZERS[spec]


def clear_sizers() -> None:
    """Forget this process's built sizers (:func:`shared_sizer`), so the next run loads plugins and criteria anew:
    for a caller that changes which plugins are installed while the process lives (an embedding program, a test
    that replaces the entry points)."""
    with _SIZERS_LOCK:
        _SIZERS.clear()


def spec_for(criteria_file: str | Path | None, load_entry_points: bool, check_roughness: float | None, *,
             every_size: bool = False, sizes_above: int = RATED_ABOVE) -> SizerSpec:
    """A spec with the criteria file's bytes as they are now (sent to workers by content) and their digest; the
    path made absolute names the file in messages."""
    if not criteria_file:
        return SizerSpec(None, load_entry_points, check_roughness, every_size, sizes_above=sizes_above)
    path = Path(criteria_file).resolve()
    try:
        content: bytes | None = path.read_bytes()
    except OSError:  # the sizer's build names the file it cannot read
        content = None
    digest = None if content is None else hashlib.sha256(content).hexdigest()
    return SizerSpec(str(path), load_entry_points, check_roughness, every_size, digest, str(criteria_file), content,
                     sizes_above)


def size_item(sizer: Sizer, item: Item) -> LineResult:
    """One line's result: a Line sized or checked, a row fault as an ``error``, or one line's cases."""
    if isinstance(item, Line):
        return sizer.run_safely(item)
    if isinstance(item, RowFault):
        return _fault_result(item)
    if len(item) == 1:
        return size_item(sizer, item[0])
    if not any(isinstance(case, RowFault) for case in item):
        return sizer.run_cases([case for case in item if isinstance(case, Line)])
    each = [_cases.case_error(_fault_result(c), c.case) if isinstance(c, RowFault) else sizer.run_safely(c)
            for c in item]
    first = item[0]
    mode = first.mode if isinstance(first, RowFault) else "check" if first.nps else "size"
    return _cases.cases_error(each[0].tag, each, mode)


def _fault_result(fault: RowFault) -> LineResult:
    return error_result(fault.tag, fault.error, mode=fault.mode)


class _CollectorPause:
    """Pauses the cyclic garbage collector while a batch builds or receives its results; restores it after.

    A result is about 430 objects a line (dataclasses, tuples, floats, strings), none in a reference cycle;
    the collections made while they pile up traverse everything alive, again and again (the figures are at
    ``_COLLECTOR_PAUSE`` below). The objects
    alive at the start (modules, the sizer) are frozen, so that workers forked meanwhile, which collect as
    usual, leave them alone (the recipe of the ``gc.freeze`` documentation); at the end, freezing again and
    unfreezing moves the results to the oldest generation without traversing them. Objects the caller froze
    stay frozen (then this pause freezes nothing). Nested and concurrent pauses: the outermost restores.
    """

    def __init__(self) -> None:
        self.depth = 0
        self._restore = (True, False)  # (collector was enabled, this pause froze)
        self._lock = threading.Lock()

    def __enter__(self) -> None:
        with self._lock:
            if self.depth == 0:
                self._restore = (gc.isenabled(), gc.get_freeze_count() == 0)
                gc.disable()
                if self._restore[1]:
                    gc.freeze()
            self.depth += 1

    def __exit__(self, *exc_info: object) -> None:
        with self._lock:
            self.depth -= 1
            if self.depth == 0:
                enabled, froze = self._restore
                if froze:
                    gc.freeze()
                    gc.unfreeze()
                if enabled:
                    gc.enable()

    def after_fork(self) -> None:
        """In a worker forked during a pause: collect as the parent did before it (the frozen objects stay)."""
        if self.depth:
            self.depth, self._lock = 0, threading.Lock()
            if self._restore[0]:
                gc.enable()


# benchmarks/bench_tricks.py gc-pause, 2,000 lines (late 2026, medians of 5): 12 % faster here, 20 % on 2 workers.
_COLLECTOR_PAUSE = _CollectorPause()


def _init_worker(spec: SizerSpec) -> None:
    """Executor initializer: the worker's sizer for ``spec`` (a forked worker finds the parent's in the cache)."""
    _COLLECTOR_PAUSE.after_fork()
    shared_sizer(spec)


class TimedResults(list):  # type: ignore[type-arg]
    """A chunk's results, with the seconds its lines spent in each criterion (``criterion_seconds``)."""

    criterion_seconds: dict[str, float]


def _run_chunk(spec: SizerSpec, chunk: Sequence[Item]) -> list[LineResult]:
    """A worker's task: size a chunk of lines with the worker's own sizer (plain LineResults travel back, with
    the chunk's seconds per criterion)."""
    sizer = shared_sizer(spec)
    before = sizer.criterion_seconds()
    done = TimedResults(size_item(sizer, item) for item in chunk)
    done.criterion_seconds = _since(before, sizer.criterion_seconds())
    return done


def _since(before: dict[str, float], after: dict[str, float]) -> dict[str, float]:
    return {ident: seconds - before.get(ident, 0.0) for ident, seconds in after.items()
            if seconds > before.get(ident, 0.0)}


def _add(total: dict[str, float] | None, more: dict[str, float]) -> None:
    if total is not None:
        for ident, seconds in more.items():
            total[ident] = total.get(ident, 0.0) + seconds


def _chunks(items: Sequence[Item], workers: int, size: int | None) -> list[Sequence[Item]]:
    """Chunks of whole lines: about eight per worker (a balance of load against pickling), 1-64 lines each."""
    size = size or max(1, min(64, math.ceil(len(items) / (max(workers, 1) * 8))))
    return [items[i:i + size] for i in range(0, len(items), size)]


def process_pool(workers: int, spec: SizerSpec) -> ProcessPoolExecutor:
    """A pool of ``workers`` processes, each with its sizer for ``spec`` before its first task.

    On Linux the workers are forked: they inherit the imported modules (pint, plugins, property libraries)
    and this process's sizer for ``spec`` (:func:`shared_sizer`) instead of importing and building again.
    """
    # benchmarks/bench_tricks.py fork, 2,000 lines on 2 workers: 1.1 s forked, 8.7 s spawned (medians of 5).
    # All workers are forked at the first submit, before the progress bar starts its thread.
    context = multiprocessing.get_context("fork") if sys.platform == "linux" else None
    return ProcessPoolExecutor(workers, mp_context=context, initializer=_init_worker, initargs=(spec,))


@contextmanager
def _progress(total: int, show: bool | None, stream: TextIO | None) -> Iterator[Callable[[int], None]]:
    """A rich progress bar on stderr when asked for (``show``), or by default on a terminal for long runs."""
    out = stream or sys.stderr
    if show is None:
        show = total >= PROGRESS_THRESHOLD and out.isatty()
    if not show:
        yield lambda n: None
        return
    from boresize.optional import needs

    with needs("the progress bar (--progress)"):
        from rich.console import Console
        from rich.progress import BarColumn, MofNCompleteColumn, Progress, TextColumn, TimeElapsedColumn, \
            TimeRemainingColumn

    console = Console(file=out, force_terminal=out.isatty() or None)
    columns = (TextColumn("sizing"), BarColumn(), MofNCompleteColumn(), TextColumn("lines"), TimeElapsedColumn(),
               TimeRemainingColumn())
    with Progress(*columns, console=console, transient=False) as bar:
        task = bar.add_task("sizing", total=total)
        yield lambda n: bar.advance(task, n)


def run_items(items: SizedItems, spec: SizerSpec | None = None, *, sizer: Sizer | None = None,
              executor: Executor | ExecutorLike | None = None, workers: int = 1, progress: bool | None = None,
              chunk_size: int | None = None, progress_stream: TextIO | None = None,
              retry_hint: str = "--workers 1", criterion_seconds: dict[str, float] | None = None,
              each: Callable[[LineResult], LineResult | None] | None = None) -> list[LineResult]:
    """Size or check every line; one result per item, in input order.

    :param items: the lines (see :data:`Item`), e.g. :func:`boresize.io.line_items.line_items`'s; in this process
        any sized iterable (read as it is sized: :class:`~boresize.io.line_items.LazyItems`), else a sequence
    :param spec: how workers build their sizer (also used here when ``sizer`` is not given)
    :param sizer: the sizer to use in this process; in a parallel run on processes started here it sizes the
        first line before they start, so that forked workers inherit the property libraries it loaded
    :param executor: any executor to run chunks on (:class:`ExecutorLike`; it is not shut down here)
    :param workers: worker processes to start when no executor is given (1: size here, start none)
    :param progress: True/False to force the progress bar on or off; None shows it on a terminal for long runs
    :param chunk_size: lines per task (default: about eight tasks per worker, 1 to 64 lines each; the workers are
        the executor's own count where it says it, :func:`executor_workers`, else ``workers``)
    :param retry_hint: how the caller asks for one process, for the message when a worker dies
    :param criterion_seconds: given, the seconds spent in each criterion's evaluate over these lines are added
        to it (criterion id -> seconds, summed over every process)
    :param each: given, what is kept of each result is ``each(result)``, applied as each line is sized here (so a
        run in this process never holds the full results of all lines at once), or as each chunk comes back; a
        result for which it returns None is not kept (the list returned then holds only those kept)
    :raises InputError: a parallel run given a ``sizer`` but no ``spec`` (workers could not rebuild it), an
        executor without ``submit`` and ``map``
    """
    if executor is not None and not is_executor(executor):
        raise InputError(f"a {type(executor).__name__} is not an executor", field="executor",
                         value=repr(executor)[:80], expected="an object with submit() and map() (a "
                         "concurrent.futures executor, a dask Client) or None")
    parallel = executor is not None or workers > 1
    if parallel and spec is None and sizer is not None:
        raise InputError("a parallel run cannot send a Sizer to its workers", field="spec", value=None,
                         expected="a SizerSpec from which each worker builds its own sizer")
    spec = spec or SizerSpec()

    def bar() -> AbstractContextManager[Callable[[int], None]]:
        return _progress(len(items), progress, progress_stream)

    if not parallel:
        engine = sizer or spec.build()
        before = engine.criterion_seconds()
        results: list[LineResult] = []
        with _COLLECTOR_PAUSE, bar() as advance:
            for item in items:
                result = size_item(engine, item)
                kept = result if each is None else each(result)
                if kept is not None:
                    results.append(kept)
                advance(1)
        _add(criterion_seconds, _since(before, engine.criterion_seconds()))
        return results
    items = items if isinstance(items, Sequence) else list(items)
    head: list[LineResult] = []
    if sizer is not None and executor is None and items:
        before = sizer.criterion_seconds()
        head = [size_item(sizer, items[0])]
        _add(criterion_seconds, _since(before, sizer.criterion_seconds()))
    rest = items[len(head):]
    if not rest:
        return head
    count = (executor_workers(executor) if executor is not None else None) or workers
    if each is not None:
        head = [kept for kept in map(each, head) if kept is not None]
    return head + run_chunks(_run_chunk, spec, _chunks(rest, count, chunk_size), executor=executor,
                             workers=workers, retry_hint=retry_hint, progress=bar, already_done=len(head),
                             lost=_lost, criterion_seconds=criterion_seconds, each=each)


def _lost(item: Item, cause: str) -> LineResult:
    """The ``error`` result of a line whose worker process died while sizing it."""
    first = item if isinstance(item, (Line, RowFault)) else item[0]
    mode = first.mode if isinstance(first, RowFault) else "check" if first.nps else "size"
    return error_result(first.tag, BoresizeError(cause), mode=mode)


def run_chunks(task: Callable[[SizerSpec, Any], list[Any]], spec: SizerSpec, chunks: Sequence[Sequence[Any]], *,
               executor: Executor | ExecutorLike | None, workers: int, retry_hint: str,
               progress: Callable[[], AbstractContextManager[Callable[[int], None]]] | None = None,
               already_done: int = 0, lost: Callable[[Any, str], Any] | None = None,
               criterion_seconds: dict[str, float] | None = None,
               each: Callable[[Any], Any | None] | None = None) -> list[Any]:
    """Run ``task(spec, chunk)`` for every chunk on ``executor`` (or on ``workers`` processes started here and
    shut down after); results come back in chunk order, whatever order the chunks finish in.

    :param retry_hint: how the caller asks for one process, for the message when a worker dies
    :param progress: makes the progress bar, entered after every chunk is submitted (a forked pool starts its
        processes at the first submit, before the bar's thread); advanced by the lines of each finished chunk
    :param already_done: lines done before (shown on the bar from the start)
    :param lost: the result of one item whose worker process died (given the item and the cause); with it, the
        chunks a dead worker left unfinished are run again one by one on a fresh process, and an item that ends
        that process too gets ``lost``'s result
    :param criterion_seconds: given, each chunk's seconds per criterion (a :class:`TimedResults`') are added to it
    :param each: given, what is kept of each result is ``each(result)`` (None: nothing), applied in chunk order as
        soon as every earlier chunk is back, so a run that streams its results to a file (or counts them) holds
        only the chunks that finished ahead of an earlier one, not every result until the end
    :raises BoresizeError: a worker process died and no ``lost`` was given
    """
    pool: Executor | ExecutorLike = executor or process_pool(workers, spec)
    done: list[list[Any] | None] = [None for _ in chunks]
    emitted = [0]  # chunks before this index have been through ``each``

    def emit() -> None:
        # measured: 10,000 lines on 2 workers to CSV with --quiet (bench_scale's list), the parent's peak 316 MB
        # -> 143 MB, CPU time unchanged within the noise (12-15.5 s either way; /usr/bin/time, 2 runs each)
        while each is not None and emitted[0] < len(done) and done[emitted[0]] is not None:
            i = emitted[0]
            done[i] = [kept for kept in map(each, done[i] or ()) if kept is not None]
            emitted[0] += 1

    try:
        with _COLLECTOR_PAUSE:
            futures = [(pool.submit(task, spec, chunk), i) for i, chunk in enumerate(chunks)]
            with (progress or nullcontext)() as advance:
                step = advance if advance is not None else (lambda n: None)
                step(already_done)
                for future, i in _finished(futures):
                    try:
                        done[i] = chunk = future.result()
                    except BrokenProcessPool:
                        if lost is None:
                            raise
                        continue
                    _add(criterion_seconds, getattr(chunk, "criterion_seconds", {}))
                    step(len(chunks[i]))
                    del chunk
                    emit()
                left = [i for i, chunk in enumerate(done) if chunk is None]
                if lost is not None and left:
                    for i, results in zip(left, _isolated(task, spec, [chunks[i] for i in left], lost)):
                        done[i] = results
                        _add(criterion_seconds, getattr(results, "criterion_seconds", {}))
                        step(len(results))
                        emit()
    except BrokenProcessPool as exc:
        raise BoresizeError(f"a worker process stopped unexpectedly ({exc}); run again with {retry_hint} to "
                            f"find the line that stops it") from exc
    finally:
        if executor is None and isinstance(pool, Executor):
            pool.shutdown(wait=True, cancel_futures=True)
    return [result for chunk in done for result in chunk or ()]


def _finished(futures: list[tuple[Any, int]]) -> Iterator[tuple[Any, int]]:
    """The (future, chunk index) pairs as they finish (concurrent.futures futures), else in submission order (any
    other future: its ``result()`` waits)."""
    # Each pair is let go once yielded (the list emptied, the index popped): a finished future holds its chunk's
    # results, which the caller keeps only as long as it needs them.
    if all(isinstance(future, Future) for future, _ in futures):
        index = dict(futures)
        futures.clear()
        for future in as_completed(index):
            yield future, index.pop(future)
    else:
        pending = deque(futures)
        futures.clear()
        while pending:
            yield pending.popleft()


#: Why an item has no result of its own when its worker process ended (``lost`` in :func:`run_chunks`).
WORKER_DIED = ("the worker process sizing it ended unexpectedly (a plugin ending its process, such as os._exit, "
               "a signal such as SIGKILL, or the memory running out); the other lines are sized")


def _isolated(task: Callable[[SizerSpec, Any], list[Any]], spec: SizerSpec, chunks: Sequence[Sequence[Any]],
              lost: Callable[[Any, str], Any]) -> list[list[Any]]:
    """The chunks a dead worker left unfinished, run again one at a time on one fresh process (replaced when it
    ends); a chunk that ends it is run item by item, so that only an item that ends its process gets ``lost``'s
    result."""
    shared_sizer(spec)  # built here once, so that each process forked below inherits it
    pool: list[ProcessPoolExecutor] = []

    def attempt(chunk: Sequence[Any]) -> list[Any] | None:
        if not pool:
            pool.append(process_pool(1, spec))
        try:
            return pool[0].submit(task, spec, chunk).result()
        except BrokenProcessPool:
            pool.pop().shutdown(wait=True, cancel_futures=True)
            return None

    def run(chunk: Sequence[Any]) -> list[Any]:
        results = attempt(chunk)
        if results is not None:
            return results
        if len(chunk) == 1:
            return [lost(chunk[0], WORKER_DIED)]
        return [result for item in chunk for result in run([item])]

    try:
        return [run(chunk) for chunk in chunks]
    finally:
        for executor in pool:
            executor.shutdown(wait=True, cancel_futures=True)


def summary(results: Sequence[LineResult]) -> str:
    """One line: how many lines were sized or checked, passed, failed and had errors, and how many gave a pressure
    in a bare unit (when any did)."""
    counts = {s: sum(1 for r in results if r.status == s) for s in ("pass", "fail", "error")}
    return summary_text(len(results), counts["pass"], counts["fail"], counts["error"], bare_pressure_count(results))


def summary_text(lines: int, passed: int, failed: int, errors: int, bare: int) -> str:
    """:func:`summary`'s line from its counts (a run that kept counts instead of results, ``count_only``)."""
    return f"{lines} line{'' if lines == 1 else 's'}: {passed} pass, {failed} fail, {errors} error" + bare_pressure_note(bare)


