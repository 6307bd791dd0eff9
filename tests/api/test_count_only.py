"""run_lines(count_only=True): a run that keeps counts instead of results, its outputs streamed (issue 19: memory
flat in the number of lines). The fixed list is tests/golden/identity-lines.csv (24 lines, 6 errors, 1 fail: see
tests/test_output_identity.py); its golden CSV and JSON Lines are the bytes a streamed run must write."""

from __future__ import annotations

import os
from collections.abc import Iterator
from pathlib import Path

import pytest

from boresize.api import run_lines
from boresize.errors import InputError
from boresize.io import read_line_list
from boresize.io.line_items import LazyItems, line_items

ROOT = Path(__file__).resolve().parents[2]
GOLDEN = ROOT / "tests" / "golden"
LINES = "tests/golden/identity-lines.csv"
CRITERIA = "examples/demo-unit/criteria.toml"


@pytest.fixture
def at_root() -> Iterator[None]:
    here = Path.cwd()
    os.chdir(ROOT)
    try:
        yield
    finally:
        os.chdir(here)


@pytest.mark.parametrize("workers", [1, 2])
def test_a_counting_run_streams_the_same_bytes_and_says_the_same(tmp_path: Path, at_root: None, workers: int) -> None:
    full = run_lines(LINES, CRITERIA, plugins=False, workers=1)
    counted = run_lines(LINES, CRITERIA, plugins=False, workers=workers, keep="selected", count_only=True,
                        stream=[tmp_path / "s.csv", tmp_path / "s.jsonl"])
    assert counted.results == () and counted.tally is not None
    assert (tmp_path / "s.csv").read_bytes() == (GOLDEN / "identity.csv").read_bytes()
    assert (tmp_path / "s.jsonl").read_bytes() == (GOLDEN / "identity.jsonl").read_bytes()
    assert counted.summary() == full.summary() and counted.passed is full.passed is False
    assert counted.error_texts == full.error_texts and len(counted.error_texts) == 6
    assert counted.two_phase_caution() == full.two_phase_caution()
    if workers == 1:  # read as sized: the run's line list lets go of its rows
        assert counted.line_list.rows == [] and counted.line_list.headers == full.line_list.headers


def test_a_counting_run_writes_nothing_more(tmp_path: Path, at_root: None) -> None:
    counted = run_lines(LINES, CRITERIA, plugins=False, count_only=True, stream=[tmp_path / "s.csv"])
    for name in ("x.csv", "x.jsonl", "x.json", "x.xlsx", "x.html"):
        with pytest.raises(InputError, match="this run kept only counts") as caught:
            counted.write(tmp_path / name)
        assert caught.value.field == "count_only" and not (tmp_path / name).exists()
    for asked in (counted.table, counted.document):
        with pytest.raises(InputError, match="kept only counts"):
            asked()


def test_lazy_items_are_the_line_items(at_root: None) -> None:
    """Parsed one at a time, with the same cells, cases grouped and duplicate tags refused as before."""
    pairs = read_line_list(LINES).pairs()
    eager = line_items(pairs)
    lazy = LazyItems(pairs)
    assert len(lazy) == len(eager.items)
    got = []
    for item in lazy:
        got.append((repr(item), lazy.take_cells()))  # repr: a row's fault holds an exception (no ==)
        assert not lazy.cells  # one line's cells at a time
    assert got == [(repr(item), cells) for item, cells in zip(eager.items, eager.cells)]
