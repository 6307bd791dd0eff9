"""Results of a parallel run travel back from the worker processes unchanged, at little cost.

The reference of every check here is the same line list sized in this process: a transfer (pickling
in a worker, unpickling here) must give results that compare equal, field by field, to the ones
sized here. Whether those numbers are right is checked against the fluids library and CoolProp in
tests/test_engine.py and tests/test_batch.py; here only the way back is under test. Also checked:
forked workers keep the sizer the parent built (no second plugin and criteria load), and the
garbage collector, paused in the parent while results arrive, is restored as it was.
"""

from __future__ import annotations

import gc
import os
import pickle
import sys
from collections.abc import Sequence
from pathlib import Path

import pytest

from boresize.sizing import batch
from boresize.io.line_items import line_items
from boresize.sizing.batch import SizerSpec, run_items, run_chunks, spec_for
from boresize.sizing.engine import Sizer
from boresize.io import read_line_list
from boresize.model import LineResult

DEMO = Path(__file__).resolve().parents[2] / "examples" / "demo-unit"
FORK_ONLY = pytest.mark.skipif(sys.platform != "linux", reason="workers are forked on Linux only")


@pytest.fixture(scope="module")
def spec() -> SizerSpec:
    return spec_for(DEMO / "criteria.toml", False, None)


@pytest.fixture(scope="module")
def pairs() -> list:  # type: ignore[type-arg]
    return list(read_line_list(DEMO / "lines.csv").pairs())


@pytest.fixture(scope="module")
def reference(spec: SizerSpec, pairs: list) -> list[LineResult]:  # type: ignore[type-arg]
    """The demo lines sized in this process, one sizer built from ``spec``."""
    return run_items(_items(pairs), sizer=spec.build())


def test_the_demo_lines_give_every_kind_of_result(reference: list[LineResult]) -> None:
    # The transfer checks below mean something only if the results hold what a transfer could lose.
    assert {r.status for r in reference} >= {"pass", "fail"}
    assert any(r.cases for r in reference) and any(r.state and r.state.phase == "gas" for r in reference)
    assert all(r.candidates for r in reference if r.status != "error")


def test_a_pickled_result_loads_equal_to_the_original(reference: list[LineResult]) -> None:
    loaded = pickle.loads(pickle.dumps(reference, protocol=pickle.HIGHEST_PROTOCOL))
    assert loaded == reference
    assert [type(r.selected.hydraulics) for r in loaded if r.selected] == \
        [type(r.selected.hydraulics) for r in reference if r.selected]


@pytest.mark.parametrize("chunk_size", [None, 2])
def test_results_from_workers_equal_the_results_sized_here(spec: SizerSpec, pairs: list,  # type: ignore[type-arg]
                                                            reference: list[LineResult],
                                                            chunk_size: int | None) -> None:
    # As the CLI runs --workers 2: the parent builds its sizer from the spec and passes both.
    parallel = run_items(_items(pairs), spec, sizer=spec.build(), workers=2, chunk_size=chunk_size)
    assert [r.tag for r in parallel] == [r.tag for r in reference]
    assert parallel == reference


@FORK_ONLY
def test_forked_workers_keep_the_parent_sizer(spec: SizerSpec, pairs: list,  # type: ignore[type-arg]
                                              reference: list[LineResult],
                                              monkeypatch: pytest.MonkeyPatch) -> None:
    sizer = batch.shared_sizer(spec)  # this process's sizer for the spec, as run_lines() takes it

    def no_second_build(self: SizerSpec) -> Sizer:
        raise AssertionError("a worker built its own sizer")

    monkeypatch.setattr(SizerSpec, "build", no_second_build)  # the forked workers inherit the patch
    assert run_items(_items(pairs), spec, sizer=sizer, workers=2, chunk_size=3) == reference


def _collector_state(spec: SizerSpec, chunk: Sequence[int]) -> list[bool]:
    """A worker's task: is the garbage collector enabled in this worker?"""
    return [gc.isenabled() for _ in chunk]


@FORK_ONLY
def test_workers_forked_while_the_parent_waits_collect_garbage(spec: SizerSpec) -> None:
    states = run_chunks(_collector_state, spec, [[1], [2], [3]], executor=None, workers=2,  # type: ignore[arg-type]
                        retry_hint="--workers 1")
    assert states == [True, True, True]


@pytest.mark.parametrize("workers", [1, 2])
@pytest.mark.parametrize("enabled", [True, False])
def test_the_collector_is_restored_after_a_run(spec: SizerSpec, pairs: list,  # type: ignore[type-arg]
                                               enabled: bool, workers: int) -> None:
    was = gc.isenabled()
    (gc.enable if enabled else gc.disable)()
    try:
        run_items(_items(pairs[:3]), spec, sizer=spec.build(), workers=workers)
        assert gc.isenabled() is enabled
        assert gc.get_freeze_count() == 0
    finally:
        (gc.enable if was else gc.disable)()


@pytest.mark.parametrize("workers", [1, 2])
def test_objects_the_caller_froze_stay_frozen(spec: SizerSpec, pairs: list,  # type: ignore[type-arg]
                                              workers: int) -> None:
    gc.freeze()
    try:
        frozen = gc.get_freeze_count()
        run_items(_items(pairs[:3]), spec, sizer=spec.build(), workers=workers)
        assert 0 < gc.get_freeze_count() <= frozen  # none unfrozen (a few may be freed), none added
        assert gc.isenabled()
    finally:
        gc.unfreeze()


def _whose(spec: SizerSpec, chunk: Sequence[int]) -> list[tuple[int, int]]:
    """A worker's task: (item, process id) for every item of the chunk."""
    return [(item, os.getpid()) for item in chunk]


def test_chunks_come_back_in_input_order_from_the_workers(spec: SizerSpec) -> None:
    chunks = [[2 * i, 2 * i + 1] for i in range(30)]
    done = run_chunks(_whose, spec, chunks, executor=None, workers=2, retry_hint="--workers 1")  # type: ignore[arg-type]
    assert [item for item, _ in done] == list(range(60))  # in input order, each item once
    assert os.getpid() not in {pid for _, pid in done}  # the workers sized them all


def _items(pairs):  # type: ignore[no-untyped-def]
    """The lines of (row, units) pairs, read as the run reads them."""
    return line_items(pairs).items


def test_clear_sizers_makes_the_next_run_build_its_sizer_anew(spec: SizerSpec) -> None:
    # An embedding program that installs a plugin while it runs calls clear_sizers(); the sizer built before
    # (with the old plugins) must not answer for the spec after it.
    before = batch.shared_sizer(spec)
    assert batch.shared_sizer(spec) is before  # cached while nothing is cleared
    batch.clear_sizers()
    after = batch.shared_sizer(spec)
    assert after is not before
    assert batch.shared_sizer(spec) is after
