"""Running a whole line list: in this process, or on worker processes, with a progress bar.

The plugin manager cannot be pickled, so a worker never receives a :class:`~boresize.sizing.engine.Sizer`:
it builds its own from a :class:`SizerSpec` (criteria file path, whether to load entry points,
corroded roughness) once, in the executor's initializer, or, forked from a parent that passes the
sizer it built from that spec, keeps the parent's. The parent sends the rows of whole lines in
chunks. Results come back in input order whatever order the chunks finish in. A line's fault
stays on that line (an ``error`` result); only a worker process that dies stops the batch.

Any :class:`concurrent.futures.Executor` can be passed (a thread pool, a cluster's executor): the
task builds the worker's sizer on first use when no initializer did.
"""

from __future__ import annotations

import gc
import math
import multiprocessing
import os
import pickle
import tempfile
import sys
import threading
from collections.abc import Callable, Iterable, Iterator, Mapping, Sequence, Sized
from concurrent.futures import Executor, Future, ProcessPoolExecutor, as_completed
from concurrent.futures.process import BrokenProcessPool
from contextlib import AbstractContextManager, contextmanager, nullcontext
from dataclasses import dataclass
from pathlib import Path
from typing import Any, TextIO

from boresize.sizing.cases import Row, group_rows
from boresize.sizing.engine import Sizer
from boresize.errors import BoresizeError, InputError
from boresize.model import LineResult

__all__ = ["PROGRESS_THRESHOLD", "SizerSpec", "process_pool", "run_batch", "run_chunks", "shared_sizer", "spec_for",
           "summary"]

#: A run of at least this many lines shows a progress bar on a terminal without being asked [lines].
PROGRESS_THRESHOLD = 50
_SIZERS: dict[SizerSpec, Sizer] = {}
_SIZERS_LOCK = threading.Lock()


@dataclass(frozen=True)
class SizerSpec:
    """Everything a worker needs to build the same :class:`Sizer` as the parent (picklable).

    :param criteria_file: path of the criteria TOML, or None for the shipped sets
    :param load_entry_points: False to use only boresize's built-in plugins
    :param check_roughness: corroded roughness for checked lines [m], or None
    :param every_size: rate every size of the pipe class (see :class:`~boresize.sizing.engine.Sizer`)
    """

    criteria_file: str | None = None
    load_entry_points: bool = True
    check_roughness: float | None = None
    every_size: bool = False

    def build(self) -> Sizer:
        from boresize.plugins import PluginHost

        host = PluginHost.load(load_entry_points=self.load_entry_points)
        return Sizer(host, criteria_file=self.criteria_file, check_roughness=self.check_roughness,
                     every_size=self.every_size)


def shared_sizer(spec: SizerSpec) -> Sizer:
    """This process's sizer for ``spec``, built once (loading plugins and criteria costs time); thread-safe."""
    with _SIZERS_LOCK:
        if spec not in _SIZERS:
            _SIZERS[spec] = spec.build()
        return _SIZERS[spec]


class _CollectorPause:
    """Pauses the cyclic garbage collector while a batch builds or receives its results; restores it after.

    A result is about 430 objects a line (dataclasses, tuples, floats, strings), none in a reference cycle;
    the collections made while they pile up traverse everything alive, again and again: they made unpickling
    a 2,000-line batch in the parent 2.5-4x slower and sizing in one process about 25 % slower. The objects
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


_COLLECTOR_PAUSE = _CollectorPause()


def _init_worker(spec: SizerSpec, sizer: Sizer | None = None) -> None:
    """Executor initializer: keep the sizer the parent forked with, else build the worker's own for ``spec``."""
    _COLLECTOR_PAUSE.after_fork()
    if sizer is not None:
        with _SIZERS_LOCK:
            _SIZERS[spec] = sizer
    shared_sizer(spec)


def _run_chunk(spec: SizerSpec, chunk: Sequence[Sequence[Row]]) -> list[LineResult]:
    sizer = shared_sizer(spec)
    return [sizer.run_line_rows(group) for group in chunk]


def _chunks(groups: Sequence[Sequence[Row]], workers: int, size: int | None) -> list[Sequence[Sequence[Row]]]:
    """Chunks of whole lines: about eight per worker (a balance of load against pickling), 1-64 lines each."""
    size = size or max(1, min(64, math.ceil(len(groups) / (max(workers, 1) * 8))))
    return [groups[i:i + size] for i in range(0, len(groups), size)]


def process_pool(workers: int, spec: SizerSpec, *, sizer: Sizer | None = None) -> ProcessPoolExecutor:
    """A pool of ``workers`` processes, each building its sizer for ``spec`` before its first task.

    :param sizer: a sizer built from ``spec`` in this process: forked workers inherit it instead of building
        their own (loading plugins and criteria again costs 0.3-1 s a process); ignored where workers are spawned
    """
    # fork on Linux: the workers inherit the imported modules (pint, plugins) instead of importing again.
    # All workers are forked at the first submit, before the progress bar starts its thread. A forked
    # process receives the initializer's arguments as they are in memory: the sizer is not pickled.
    context = multiprocessing.get_context("fork") if sys.platform == "linux" else None
    inherited = sizer if context is not None else None
    return ProcessPoolExecutor(workers, mp_context=context, initializer=_init_worker, initargs=(spec, inherited))


@contextmanager
def _progress(total: int, show: bool | None, stream: TextIO | None) -> Iterator[Callable[[int], None]]:
    """A rich progress bar on stderr when asked for (``show``), or by default on a terminal for long runs."""
    out = stream or sys.stderr
    if show is None:
        show = total >= PROGRESS_THRESHOLD and out.isatty()
    if not show:
        yield lambda n: None
        return
    from rich.console import Console
    from rich.progress import BarColumn, MofNCompleteColumn, Progress, TextColumn, TimeElapsedColumn, \
        TimeRemainingColumn

    console = Console(file=out, force_terminal=out.isatty() or None)
    columns = (TextColumn("sizing"), BarColumn(), MofNCompleteColumn(), TextColumn("lines"), TimeElapsedColumn(),
               TimeRemainingColumn())
    with Progress(*columns, console=console, transient=False) as bar:
        task = bar.add_task("sizing", total=total)
        yield lambda n: bar.advance(task, n)


def run_batch(rows: Iterable[tuple[Mapping[str, object], Mapping[str, str | None]]], spec: SizerSpec | None = None,
              *, sizer: Sizer | None = None, executor: Executor | None = None, workers: int = 1,
              progress: bool | None = None, chunk_size: int | None = None,
              progress_stream: TextIO | None = None) -> list[LineResult]:
    """Size or check every line of a line list; one result per line (cases grouped), in input order.

    :param rows: (field -> cell, field -> default unit) per row, e.g. ``LineList.pairs()``
    :param spec: how workers build their sizer (also used here when ``sizer`` is not given)
    :param sizer: the sizer to use in this process; in a parallel run (with ``spec``, from which it must be
        built) it sizes the first line here before the workers start, and the worker processes started here
        (forked) keep it, with the property libraries it imported, instead of building their own from ``spec``
    :param executor: any executor to run chunks on (it is not shut down here)
    :param workers: worker processes to start when no executor is given (1 runs here)
    :param progress: True/False to force the progress bar on or off; None shows it on a terminal for long runs
    :raises InputError: a parallel run given a ``sizer`` but no ``spec`` (workers could not rebuild it)
    :raises BoresizeError: a worker process died (the line at fault is not known)
    """
    groups = group_rows(rows)
    parallel = executor is not None or workers > 1
    if parallel and spec is None and sizer is not None:
        raise InputError("a parallel run cannot send a Sizer to its workers", field="spec", value=None,
                         expected="a SizerSpec from which each worker builds its own sizer")
    spec = spec or SizerSpec()
    if not parallel:
        local = sizer or spec.build()
        results = []
        with _COLLECTOR_PAUSE, _progress(len(groups), progress, progress_stream) as advance:
            for group in groups:
                results.append(local.run_line_rows(group))
                advance(1)
        return results
    head = [sizer.run_line_rows(groups[0])] if sizer is not None and groups else []
    return head + _run_parallel(groups[len(head):], spec, sizer, executor, workers, progress, chunk_size,
                                progress_stream, len(groups))


def _run_parallel(groups: Sequence[Sequence[Row]], spec: SizerSpec, sizer: Sizer | None, executor: Executor | None,
                  workers: int, progress: bool | None, chunk_size: int | None, stream: TextIO | None,
                  total: int) -> list[LineResult]:
    if not groups:
        return []

    def bar() -> AbstractContextManager[Callable[[int], None]]:
        return _progress(total, progress, stream)

    def here(chunk: Sequence[Sequence[Row]]) -> list[LineResult]:
        return [sizer.run_line_rows(group) for group in chunk]  # type: ignore[union-attr]

    return run_chunks(_run_chunk, spec, _chunks(groups, workers, chunk_size), executor=executor, workers=workers,
                      retry_hint="--workers 1", progress=bar, already_done=total - len(groups), sizer=sizer,
                      local=here if sizer is not None else None)


def run_chunks(task: Callable[[SizerSpec, Any], list[LineResult]], spec: SizerSpec, chunks: Sequence[Sized], *,
               executor: Executor | None, workers: int, retry_hint: str,
               progress: Callable[[], AbstractContextManager[Callable[[int], None]]] | None = None,
               already_done: int = 0, sizer: Sizer | None = None,
               local: Callable[[Any], list[LineResult]] | None = None) -> list[LineResult]:
    """Run ``task(spec, chunk)`` for every chunk on ``executor`` (or on processes started here and shut down
    after); results come back in chunk order, whatever order the chunks finish in.

    Without an executor, ``workers`` processes share the work. Given ``local`` (the same work done in this
    process), this process is one of them: it starts ``workers - 1`` and takes chunks from the end of the list
    while they take them from the start (a chunk no process has begun is cancelled in the pool and run here),
    so that its share of the results never has to be pickled and sent back.

    :param retry_hint: how the caller asks for one process, for the message when a worker dies
    :param progress: makes the progress bar, entered after every chunk is submitted (a forked pool starts its
        processes at the first submit, before the bar's thread); advanced by the lines of each finished chunk
    :param sizer: a sizer built from ``spec`` here, for the worker processes started here to inherit
    :param local: ``chunk -> results`` in this process (``task`` with this process's sizer)
    :raises BoresizeError: a worker process died
    """
    if executor is None and local is not None and workers <= 1:  # this process is the only one
        with _COLLECTOR_PAUSE, (progress or nullcontext)() as advance:
            step = advance if advance is not None else (lambda n: None)
            step(already_done)
            return [result for chunk in chunks for result in _advanced(local(chunk), step)]
    if executor is None:
        started = workers - 1 if local is not None else workers
        pool: Executor = process_pool(started, spec, sizer=sizer)
    else:
        pool, local = executor, None
    try:
        with _COLLECTOR_PAUSE:
            return _collect(task, spec, chunks, pool, progress, already_done, local)
    except BrokenProcessPool as exc:
        raise BoresizeError(f"a worker process stopped unexpectedly ({exc}); run again with {retry_hint} to "
                            f"find the line that stops it") from exc
    finally:
        if executor is None:
            pool.shutdown(wait=True, cancel_futures=True)


def _collect(task: Callable[[SizerSpec, Any], list[LineResult]], spec: SizerSpec, chunks: Sequence[Sized],
             pool: Executor, progress: Callable[[], AbstractContextManager[Callable[[int], None]]] | None,
             already_done: int, local: Callable[[Any], list[LineResult]] | None) -> list[LineResult]:
    """Submit every chunk; run here the chunks (from the end) no worker has begun; gather in chunk order.

    Working beside its own pool, this process has the workers leave their results in files of a private
    temporary folder and send back only the file's path: a chunk's results (~200 kB pickled) sent through
    the pool's pipe need this process's receiving thread, which gets the interpreter only between the sizing
    done here, so the workers would stall on a full pipe (measured: a third of their time).
    """
    with tempfile.TemporaryDirectory(prefix="boresize-") if local is not None else nullcontext() as folder:
        futures: list[Future[str | list[LineResult]]]  # a file's path, or the results themselves
        if folder is not None:
            futures = [pool.submit(_run_to_file, task, spec, c, folder) for c in chunks]
        else:
            futures = [pool.submit(task, spec, c) for c in chunks]
        done: list[Any] = [None] * len(chunks)
        with (progress or nullcontext)() as advance:
            step = advance if advance is not None else (lambda n: None)
            step(already_done)  # the lines already sized in this process
            for i in reversed(range(len(chunks)) if local is not None else ()):
                if local is None or not futures[i].cancel():
                    break  # a worker has it, so it has (or will have) every chunk before it
                done[i] = local(chunks[i])
                step(len(chunks[i]))
                for j, future in enumerate(futures):  # what the workers finished meanwhile
                    if done[j] is None and future.done() and not future.cancelled():
                        done[j] = future.result()
                        step(len(chunks[j]))
            waiting = {future: i for i, future in enumerate(futures) if done[i] is None}
            for future in as_completed(waiting):
                done[waiting[future]] = future.result()
                step(len(chunks[waiting[future]]))
        return [result for chunk in done for result in (_load(chunk) if isinstance(chunk, str) else chunk)]


def _advanced(results: list[LineResult], step: Callable[[int], None]) -> list[LineResult]:
    step(len(results))
    return results


def _run_to_file(task: Callable[[SizerSpec, Any], list[LineResult]], spec: SizerSpec, chunk: Any,
                 folder: str) -> str:
    """A worker's chunk with its results pickled into a new file of ``folder``; returns the file's path."""
    results = task(spec, chunk)
    handle, path = tempfile.mkstemp(suffix=".pickle", dir=folder)
    with os.fdopen(handle, "wb") as out:
        pickle.dump(results, out, protocol=pickle.HIGHEST_PROTOCOL)
    return path


def _load(path: str) -> list[LineResult]:
    """The results a worker left in ``path`` (a file of this run's private folder, written by this program)."""
    with open(path, "rb") as source:
        results: list[LineResult] = pickle.load(source)
        return results


def summary(results: Sequence[LineResult]) -> str:
    """One line: how many lines were sized or checked, passed, failed and had errors."""
    counts = {s: sum(1 for r in results if r.status == s) for s in ("pass", "fail", "error")}
    return f"{len(results)} lines: {counts['pass']} pass, {counts['fail']} fail, {counts['error']} error"


def spec_for(criteria_file: str | Path | None, load_entry_points: bool, check_roughness: float | None, *,
             every_size: bool = False) -> SizerSpec:
    """A spec with the criteria path made absolute (workers may not share the parent's working directory)."""
    path = str(Path(criteria_file).resolve()) if criteria_file else None
    return SizerSpec(path, load_entry_points, check_roughness, every_size)
