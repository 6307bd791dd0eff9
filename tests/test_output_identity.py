"""Byte-identity of the outputs on a fixed line list: the proof that a speed or memory change left results alone.

``tests/golden/identity-lines.csv`` is the demo unit's 17 rows (cases, table values, a check at a given NPS) and
15 more (GERG-2008 and aqueous mixtures, hydrogen, air, US units, cases, six rows that are errors). It is sized
with the demo criteria on one process, without entry-point plugins, and each output compared byte for byte
with its golden file (``tests/golden/identity.*``, written by this code; the numbers are boresize's own with the
CoolProp and thermo versions of the shared environment). The JSON document is compared with its
``traceability`` and ``boresize_version`` keys removed: they hold the run's date and library versions, which
change from run to run and machine to machine, not results. The CSV and JSON Lines files are compared whole.

A change that is meant to change results rewrites the golden files with ``BORESIZE_REGOLD=1`` (and says why in
its commit).
"""

from __future__ import annotations

import json
import os
from pathlib import Path

import pytest

from boresize.api import run_lines
from boresize.api.output import WRITERS, strict_json
from boresize.errors import InputError

ROOT = Path(__file__).resolve().parents[1]
GOLDEN = ROOT / "tests" / "golden"
LINES = "tests/golden/identity-lines.csv"  # relative: the document names its sources as given
CRITERIA = "examples/demo-unit/criteria.toml"
VARYING = ("traceability", "boresize_version")  # date and versions: not results


def _comparable(path: Path) -> bytes:
    """The bytes to compare: the file as written, for JSON with the :data:`VARYING` keys removed."""
    if path.suffix == ".json":
        document = json.loads(path.read_text(encoding="utf-8"))
        for key in VARYING:
            document.pop(key, None)
        return (strict_json(document) + "\n").encode("utf-8")
    return path.read_bytes()


@pytest.fixture(scope="module")
def run():  # type: ignore[no-untyped-def]
    here = Path.cwd()
    os.chdir(ROOT)
    try:
        return run_lines(LINES, CRITERIA, plugins=False, workers=1)
    finally:
        os.chdir(here)


@pytest.mark.parametrize("suffix", [s for s in (".csv", ".json", ".jsonl") if s in WRITERS])
def test_output_is_byte_identical_to_its_golden_file(run, suffix: str, tmp_path: Path) -> None:  # type: ignore[no-untyped-def]
    written = _comparable(run.write(tmp_path / f"identity{suffix}"))
    golden = GOLDEN / f"identity{suffix}"
    if os.environ.get("BORESIZE_REGOLD") == "1":
        golden.write_bytes(written)
    assert golden.is_file(), f"no golden file {golden}: write it with BORESIZE_REGOLD=1"
    assert written == golden.read_bytes(), f"{suffix} output differs from {golden}"


def test_each_json_lines_record_is_the_documents_entry_for_its_line(run, tmp_path: Path) -> None:  # type: ignore[no-untyped-def]
    records = [json.loads(text) for text in run.write(tmp_path / "x.jsonl").read_text(encoding="utf-8").splitlines()]
    assert records == json.loads(run.write(tmp_path / "x.json").read_text(encoding="utf-8"))["lines"]


def test_a_run_keeping_only_the_selected_sizes_writes_the_same_csv(tmp_path: Path) -> None:
    """keep="selected" (what ``boresize size -o x.csv`` uses) drops the other rated sizes, not a byte of the CSV."""
    here = Path.cwd()
    os.chdir(ROOT)
    try:
        lean = run_lines(LINES, CRITERIA, plugins=False, workers=1, keep="selected")
    finally:
        os.chdir(here)
    assert all(not r.candidates and all(not c.candidates for c in r.cases) for r in lean.results)
    written = lean.write(tmp_path / "lean.csv")
    assert written.read_bytes() == (GOLDEN / "identity.csv").read_bytes()
    for refused in ("lean.json", "lean.xlsx", "lean.html"):
        with pytest.raises(InputError, match=r"kept only the selected ones \(keep='selected'\)") as caught:
            lean.write(tmp_path / refused)
        assert caught.value.field == "keep" and not (tmp_path / refused).exists()
    with pytest.raises(InputError, match="cannot tell what to write") as unknown:  # the extension is the fault
        lean.write(tmp_path / "lean.txt")
    assert unknown.value.field == "output"
    with pytest.raises(InputError, match="the JSON document needs every rated size"):
        lean.document()


def test_keep_must_be_known() -> None:
    with pytest.raises(InputError, match=r"keep 'lean' is not known") as caught:
        run_lines(LINES, CRITERIA, plugins=False, keep="lean")  # type: ignore[arg-type]
    assert caught.value.expected == "full or selected"


def test_the_fixed_list_covers_what_it_says(run) -> None:  # type: ignore[no-untyped-def]
    statuses = [r.status for r in run.results]
    assert len(run.results) == 24 and statuses.count("error") == 6 and statuses.count("fail") == 1
    assert any(len(r.cases) > 1 for r in run.results)


@pytest.mark.parametrize("keep", ["full", "selected"])
@pytest.mark.parametrize("workers", [1, 2])
def test_outputs_streamed_as_lines_are_sized_are_byte_identical(tmp_path: Path, keep: str, workers: int) -> None:
    """run_lines(stream=...) writes .csv and .jsonl one line at a time (what ``boresize size -o`` uses): the same
    bytes as the golden files, nothing left beside them, on one process and on two."""
    here = Path.cwd()
    os.chdir(ROOT)
    try:
        run = run_lines(LINES, CRITERIA, plugins=False, workers=workers, keep=keep,  # type: ignore[arg-type]
                        stream=[tmp_path / "s.csv", tmp_path / "s.jsonl"])
    finally:
        os.chdir(here)
    assert run.streamed == ((tmp_path / "s.csv", None), (tmp_path / "s.jsonl", None))
    assert (tmp_path / "s.csv").read_bytes() == (GOLDEN / "identity.csv").read_bytes()
    assert (tmp_path / "s.jsonl").read_bytes() == (GOLDEN / "identity.jsonl").read_bytes()
    assert sorted(p.name for p in tmp_path.iterdir()) == ["s.csv", "s.jsonl"]
    assert len(run.results) == 24


def test_a_stream_path_that_cannot_be_written_is_refused_before_sizing(tmp_path: Path) -> None:
    for bad, message in ((tmp_path / "x.xlsx", "cannot be written as lines are sized"),
                         (tmp_path / "no" / "x.csv", "does not exist"),
                         (ROOT / LINES, "is the line list being read")):
        with pytest.raises(InputError, match=message) as caught:
            run_lines(ROOT / LINES, CRITERIA, plugins=False, stream=[bad])
        assert caught.value.field == "output" and not bad.exists() or bad == ROOT / LINES
    assert list(tmp_path.iterdir()) == []
