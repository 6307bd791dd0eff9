"""One line list, identical results through the CLI, the API, DataFrames and every kind of executor.

The reference is the CLI's JSON (``boresize size --json``); every other path must give the same entries
(the ``input`` echo aside: the API has no input cells). Executors: in this process, a thread pool, a process
pool, the default worker processes, and a dask.distributed LocalCluster's executor. Results travel back by
pickle, so a path that lost or rounded anything would show here.
"""

from __future__ import annotations

import csv
import io
import json
import subprocess
import sys
from collections.abc import Callable
from concurrent.futures import ProcessPoolExecutor, ThreadPoolExecutor
from pathlib import Path
from typing import Any

import pandas as pd
import pytest

import boresize.api as api
import boresize.sizing.batch as batch
from boresize import Line, make_line, size_many

LINES_CSV = """tag,fluid,flow,pressure [barg],temperature [degC],length [m],service,nps,case
W-1,water,45 t/h,9,30,120,liquid,,
W-2,water,80 t/h,6,25,60,pump-discharge,,normal
W-2,water,96 t/h,6.5,25,60,pump-discharge,,maximum
W-3,water,30 t/h,5,20,40,liquid,2,
T-4,toluene,18 t/h,4,60,90,liquid,3,
G-5,nitrogen,1500 Nm3/h,6,20,120,gas,,
ST-6,steam,5 t/h,10,200,200,steam,,
H-7,water,20 t/h,3,200,50,liquid,,
CW-8,water,300 m3/h,4,28,250,cooling-water,,normal
CW-8,water,340 m3/h,3.8,33,250,cooling-water,,summer
M-9,methanol,12 t/h,3,35,60,liquid,,
"""
# H-7 is an engine error on purpose (water at 200 degC and 3 barg is steam, IAPWS-IF97): errors must match too.
TIME_LIMIT_S = 180.0  # bound on the dask test, cluster start included


@pytest.fixture(scope="module")
def lines_file(tmp_path_factory) -> Path:
    path = tmp_path_factory.mktemp("executors") / "lines.csv"
    path.write_text(LINES_CSV, encoding="utf-8")
    return path


@pytest.fixture(scope="module")
def reference(lines_file) -> list[dict[str, Any]]:
    exe = Path(sys.executable).with_name("boresize")
    proc = subprocess.run([str(exe), "size", str(lines_file), "--json", "--no-plugins"], capture_output=True,
                          text=True, timeout=300)
    assert proc.returncode == 1, proc.stderr  # H-7 is an error
    entries = json.loads(proc.stdout)["lines"]
    assert [e["status"] for e in entries].count("error") == 1
    return [_comparable(e) for e in entries]


@pytest.fixture(scope="module")
def items() -> list[Line | tuple[Line, ...]]:
    """The same line list built with make_line: header units through ``units=``, cases grouped by tag."""
    reader = csv.reader(io.StringIO(LINES_CSV))
    header = next(reader)
    names = [h.split(" [")[0] for h in header]
    units = {"pressure": "barg", "temperature": "degC", "length": "m"}
    grouped: dict[str, list[Line]] = {}
    for cells in reader:
        row = {n: c for n, c in zip(names, cells) if c}
        grouped.setdefault(row["tag"], []).append(make_line(**row, units=units))
    return [group[0] if len(group) == 1 else tuple(group) for group in grouped.values()]


def _comparable(entry: dict[str, Any]) -> dict[str, Any]:
    """An entry as JSON gives it back, without the input echo."""
    plain = json.loads(json.dumps(entry))
    plain.pop("input", None)
    for case in plain.get("cases", []):
        case.pop("input", None)
    return plain


def _entries(results: list[Any]) -> list[dict[str, Any]]:
    return [_comparable(r.to_dict()) for r in results]


def test_api_in_this_process(items, reference):
    assert _entries(size_many(items, plugins=False)) == reference


def test_dataframe_path(reference):
    frame = pd.read_csv(io.StringIO(LINES_CSV))
    assert _entries(list(api.run_lines(frame, plugins=False).results)) == reference


def test_size_dataframe_gives_the_results_file_of_the_same_lines(lines_file):
    from boresize.io.dataframe import results_dataframe

    run = api.run_lines(lines_file, plugins=False)
    table = api.size_dataframe(pd.read_csv(io.StringIO(LINES_CSV), dtype=str, keep_default_na=False),
                               plugins=False)
    pd.testing.assert_frame_equal(table, results_dataframe(run.results, run.line_list.headers))


def test_thread_pool(items, reference):
    with ThreadPoolExecutor(max_workers=2) as pool:
        assert _entries(size_many(items, executor=pool, plugins=False, chunk_size=2)) == reference


def test_process_pool(items, reference):
    with ProcessPoolExecutor(max_workers=2) as pool:
        assert _entries(size_many(items, executor=pool, plugins=False, chunk_size=3)) == reference


def test_worker_processes_start_by_default_for_a_large_batch(monkeypatch):
    started: list[int] = []
    real = batch.process_pool

    def spy(workers: int, spec, **options) -> ProcessPoolExecutor:  # type: ignore[no-untyped-def]
        started.append(workers)
        return real(workers, spec, **options)

    monkeypatch.setattr(batch, "process_pool", spy)
    lines = [make_line(tag=f"L-{i}", fluid="water", flow=f"{10 + i % 50} t/h", pressure="5 barg",
                       temperature="30 degC", density="996 kg/m3", viscosity="0.8 cP")
             for i in range(api.PROCESS_THRESHOLD)]
    parallel = size_many(lines, plugins=False)
    assert len(started) == 1 and started[0] >= 1
    assert _entries(parallel) == _entries(size_many(lines, workers=1, plugins=False))
    assert len(started) == 1  # workers=1 stays in this process
    size_many(lines[:-1], plugins=False)
    assert len(started) == 1  # below the threshold: no processes


def _within(seconds: float, task: Callable[[], Any]) -> Any:
    """Run ``task`` on a thread and fail the test when it takes longer than ``seconds``."""
    pool = ThreadPoolExecutor(max_workers=1)
    try:
        return pool.submit(task).result(timeout=seconds)
    finally:
        pool.shutdown(wait=False)


def test_dask_local_cluster(items, reference):
    distributed = pytest.importorskip("distributed")

    def on_cluster() -> list[Any]:
        with distributed.LocalCluster(n_workers=2, threads_per_worker=1, processes=True, dashboard_address=None) \
                as cluster, distributed.Client(cluster) as client:
            return size_many(items, executor=client.get_executor(), plugins=False, chunk_size=2)

    assert _entries(_within(TIME_LIMIT_S, on_cluster)) == reference


class _SubmitMapOnly:
    """A duck-typed executor: ``submit`` and ``map`` only, not a concurrent.futures.Executor; it runs each task
    when it is submitted and says it has 3 workers (``_max_workers``), so chunks follow that count."""

    _max_workers = 3

    def __init__(self) -> None:
        self.submitted = 0

    def submit(self, fn, /, *args, **kwargs):  # type: ignore[no-untyped-def]
        self.submitted += 1
        value = fn(*args, **kwargs)

        class Done:
            def result(self, timeout=None):  # type: ignore[no-untyped-def]
                return value

        return Done()

    def map(self, fn, *iterables):  # type: ignore[no-untyped-def]
        return map(fn, *iterables)


def test_a_duck_typed_executor_gives_the_serial_results(items, reference):
    from concurrent.futures import Executor

    executor = _SubmitMapOnly()
    assert not isinstance(executor, Executor)
    assert _entries(size_many(items, executor=executor, plugins=False)) == reference
    # 10 items on 3 workers: about eight chunks a worker, 1 line each (batch._chunks), so 10 tasks
    assert executor.submitted == len(items)
    assert _entries(list(api.run_lines(items, plugins=False, executor=_SubmitMapOnly()).results)) == reference


def test_executor_workers_reads_pools_and_dask_clients():
    class Client:  # dask.distributed.Client's nthreads(): worker address -> threads, for the whole cluster
        def nthreads(self):  # type: ignore[no-untyped-def]
            return {"tcp://a:1": 4, "tcp://b:1": 8}

    class ClientExecutor:  # Client.get_executor() holds its client in _client
        _client = Client()

    with ThreadPoolExecutor(max_workers=5) as pool:
        assert batch.executor_workers(pool) == 5
    assert batch.executor_workers(Client()) == 12
    assert batch.executor_workers(ClientExecutor()) == 12
    assert batch.executor_workers(object()) is None


@pytest.mark.parametrize("bad", ["pool", 3, object(), type("OnlySubmit", (), {"submit": lambda self, fn: None})(),
                                 ThreadPoolExecutor])  # the class, not called
def test_an_object_without_submit_and_map_is_refused(items, bad):
    from boresize.errors import InputError

    with pytest.raises(InputError, match="is not an executor") as caught:
        size_many(items[:1], executor=bad, plugins=False)
    assert caught.value.field == "executor" and "submit() and map()" in caught.value.expected
    with pytest.raises(InputError, match="is not an executor"):
        api.run_lines(items[:1], plugins=False, executor=bad)


CRITERIA_TOML = """version = "deleted-file test"
[service.liquid]
phase = "liquid"
velocity = { max = "0.5 m/s" }
"""


class _DeletesTheFileFirst:
    """Deletes the criteria file at the first submit, then runs every task on a spawned process (a fresh
    interpreter: no sizer inherited from this one), as a cluster's worker on another machine would."""

    def __init__(self, path: Path, pool: ProcessPoolExecutor) -> None:
        self.path, self.pool = path, pool

    def submit(self, fn, /, *args):  # type: ignore[no-untyped-def]
        self.path.unlink(missing_ok=True)
        return self.pool.submit(fn, *args)

    def map(self, fn, *iterables):  # type: ignore[no-untyped-def]
        return self.pool.map(fn, *iterables)


def test_criteria_deleted_after_the_run_starts_still_reach_the_workers(tmp_path):
    import multiprocessing

    criteria = tmp_path / "criteria.toml"
    criteria.write_text(CRITERIA_TOML, encoding="utf-8")
    lines = [make_line(tag=f"V-{i}", fluid="water", flow=f"{10 + i} t/h", pressure="5 barg", temperature="30 degC",
                       service="liquid") for i in range(4)]
    serial = size_many(lines, criteria=criteria, plugins=False, workers=1)
    with ProcessPoolExecutor(1, mp_context=multiprocessing.get_context("spawn")) as pool:
        remote = size_many(lines, _DeletesTheFileFirst(criteria, pool), criteria=criteria, plugins=False)
    assert not criteria.exists()
    assert _entries(remote) == _entries(serial)
    # the file's 0.5 m/s limit, not the shipped liquid set's, judged every line on the worker
    limits = [v["limit"] for e in _entries(remote) for v in e["verdicts"] if v["criterion"] == "velocity"]
    assert len(limits) == len(lines) and all(limit == pytest.approx(0.5) for limit in limits)
