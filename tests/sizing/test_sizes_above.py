"""Sizes rated above the selected one (``Sizer(sizes_above=...)``): for the record only, never for the selection.

The record shows one size below the selected one to two above (:data:`boresize.sizing.scan.RATED_ABOVE`); a run
whose outputs show only the selected size (the table, CSV) rates none above it. The reference here is the
default sizer on the same lines: the selection, its numbers and its verdicts must be the same, and the CSV
written the same byte for byte as its golden file (tests/golden/identity.csv, see tests/test_output_identity.py).
"""

from __future__ import annotations

import os
from pathlib import Path
from typing import Any

import pytest

from boresize.api import make_line, run_lines
from boresize.errors import InputError
from boresize.sizing.engine import Sizer
from boresize.sizing.scan import RATED_ABOVE

ROOT = Path(__file__).resolve().parents[2]
CRITERIA = ROOT / "examples" / "demo-unit" / "criteria.toml"


def _lines() -> list[Any]:
    """Lines whose selection the walk proves from different sides: a liquid sized up from a small first guess,
    a gas line (marched at the size below), a line whose first guess is the smallest size, and one at the top of
    the class (nothing above it to rate). Conditions of our own; the reference is the default sizer."""
    return [
        make_line(tag="W-1", fluid="water", flow="60 t/h", pressure="9 barg", temperature="30 degC", length="180 m",
                  service="pump-discharge"),
        make_line(tag="G-1", fluid="methane", flow="8 t/h", pressure="12 barg", temperature="25 degC",
                  length="400 m", service="gas"),
        make_line(tag="S-1", fluid="water", flow="0.2 t/h", pressure="3 barg", temperature="20 degC", length="10 m",
                  service="liquid"),
        make_line(tag="B-1", fluid="water", flow="5000 t/h", pressure="10 barg", temperature="20 degC",
                  length="100 m", service="cooling-water"),
    ]


@pytest.fixture(scope="module")
def sizers() -> tuple[Sizer, Sizer]:
    full = Sizer(criteria_file=CRITERIA)
    return full, Sizer(full.host, full.config, sizes_above=0)


def test_no_size_above_changes_no_selection_number_or_verdict(sizers: tuple[Sizer, Sizer]) -> None:
    full, lean = sizers
    for line in _lines():
        a, b = full.run(line), lean.run(line)
        assert a.status == b.status and a.status != "error", (line.tag, a.error, b.error)
        assert a.selected is not None and b.selected is not None
        assert b.selected.candidate == a.selected.candidate
        assert b.selected.hydraulics == a.selected.hydraulics
        assert b.selected.verdicts == a.selected.verdicts
        assert (b.controlling, b.notes) == (a.controlling, a.notes)
        # the lean record ends at the selected size; the full one goes up to RATED_ABOVE further where the class has
        # them, and both start at the same size below
        assert b.candidates[-1] is b.selected or b.candidates[-1].candidate == b.selected.candidate
        assert [c.candidate for c in a.candidates[:len(b.candidates)]] == [c.candidate for c in b.candidates]
        above = len(a.candidates) - len(b.candidates)
        assert 0 <= above <= RATED_ABOVE


def test_every_size_stops_at_the_first_that_passes(sizers: tuple[Sizer, Sizer]) -> None:
    full, _ = sizers
    every = Sizer(full.host, full.config, every_size=True, sizes_above=0)
    line = _lines()[0]
    result, reference = every.run(line), full.run(line)
    assert result.selected is not None and reference.selected is not None
    assert result.selected.candidate == reference.selected.candidate
    assert result.candidates[-1].candidate == result.selected.candidate
    assert all(not c.passed for c in result.candidates[:-1])  # every size below the selected one fails


@pytest.mark.parametrize("bad", [-1, 1.5, True, "2", None])
def test_sizes_above_must_be_a_whole_number_of_0_or_more(bad: Any) -> None:
    with pytest.raises(InputError) as caught:
        Sizer(criteria_file=CRITERIA, sizes_above=bad)
    assert caught.value.field == "sizes_above" and "0 or more" in str(caught.value)


def test_a_csv_run_rates_no_size_above_and_writes_the_golden_bytes(tmp_path: Path) -> None:
    """keep='selected' (what the command line asks for a table or CSV) rates no size above; the CSV is still the
    golden file byte for byte (tests/test_output_identity.py writes it from a full run)."""
    here = Path.cwd()
    os.chdir(ROOT)
    try:
        run = run_lines("tests/golden/identity-lines.csv", "examples/demo-unit/criteria.toml", plugins=False,
                        workers=1, keep="selected", stream=[tmp_path / "identity.csv"], count_only=True)
    finally:
        os.chdir(here)
    assert run.streamed and run.streamed[0][1] is None
    assert (tmp_path / "identity.csv").read_bytes() == (ROOT / "tests" / "golden" / "identity.csv").read_bytes()


def test_a_run_that_streams_the_full_record_still_rates_the_sizes_above(tmp_path: Path) -> None:
    """.jsonl carries every rated size: a count-only run streaming it rates them as a full run does, byte for byte
    the golden file."""
    here = Path.cwd()
    os.chdir(ROOT)
    try:
        run_lines("tests/golden/identity-lines.csv", "examples/demo-unit/criteria.toml", plugins=False, workers=1,
                  stream=[tmp_path / "identity.jsonl"], count_only=True)
    finally:
        os.chdir(here)
    assert (tmp_path / "identity.jsonl").read_bytes() == (ROOT / "tests" / "golden" / "identity.jsonl").read_bytes()
