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


def _as_before(payload: object, indent: int | None) -> str:
    """The writers' bytes as they were before the fast paths (issue 19): every value walked for NaN and infinity,
    then the json module (its pure-Python encoder when indented)."""
    from boresize.io.document import _finite

    separators = None if indent else (",", ":")
    return json.dumps(_finite(payload, "", None), indent=indent, ensure_ascii=False, allow_nan=False,
                      separators=separators)


_NAN, _INF = float("nan"), float("inf")
HOSTILE = {  # payloads on the fast paths' edges: each must give the bytes it gave before
    "nan at the top": {"notes": [], "utilisation": _NAN},
    "inf in a nested list": {"notes": ["given"], "verdicts": [{"value": 1.0, "limit": [0.0, -_INF]}]},
    "nested notes": {"notes": [], "cases": [{"notes": ["own"], "utilisation": _INF}, {"drop": _NAN}]},
    "no notes anywhere": {"a": [_NAN, 1.5], "b": {"c": -_INF}},
    "a bare nan": _NAN,
    "non-ASCII and control text": {"tag": "P-ü€漢😀\u2028\u2029\x00\x1f\"\\/\n\r\t", "notes": ["Δp ≤ 1 %"]},
    "empty containers": {"a": [], "b": {}, "c": [[], {}], "d": [[[]]], "": ""},
    "tuples and odd numbers": {"t": (1, 2.5, (True, None)), "big": 10**40, "neg0": -0.0, "tiny": 5e-324,
                               "huge": 1.7976931348623157e308, "bools": [True, False], "int-like": 1.0},
    "keys that are not text": {1: "one", 2.5: "x", None: "n", False: "f"},
    "many lines": {"notes": [], "lines": [{"tag": f"L-{n}", "v": n / 7, "notes": []} for n in range(3000)]},
    "inf on the last of many": {"lines": [{"notes": [], "v": float(n) if n < 499 else _INF} for n in range(500)]},
    "empty run": {"summary": {"lines": 0}, "lines": []},
}


@pytest.mark.parametrize("name", list(HOSTILE))
def test_the_fast_writers_give_the_bytes_the_walk_and_the_json_module_gave(name: str) -> None:
    from boresize.io.document import dumps_record, dumps_strict

    payload = HOSTILE[name]
    assert dumps_strict(payload) == _as_before(payload, 2)
    assert dumps_record(payload) == _as_before(payload, None)


def test_a_nan_or_infinity_in_a_record_is_written_as_null_with_its_note(run) -> None:  # type: ignore[no-untyped-def]
    """A line's entry with an infinite utilisation and a NaN verdict value (a fail no size can meet; the values are
    made up here, set on the fixed list's first passing line): null in the JSON, each named in the line's notes,
    the other lines' bytes as before."""
    from boresize.io.document import document, dumps_record, dumps_strict, result_to_dict

    doc = document(run.results, criteria_source=CRITERIA, lines_source=LINES)
    first = next(n for n, r in enumerate(run.results) if r.status == "pass")
    entry = doc["lines"][first]
    entry["utilisation"] = _INF
    entry["verdicts"][0]["value"] = _NAN
    written = json.loads(dumps_strict(doc))["lines"][first]
    assert written["utilisation"] is None and written["verdicts"][0]["value"] is None
    assert written["notes"][-2:] == [
        f"lines[{first}].utilisation inf is written as null (JSON has no NaN or infinity)",
        f"lines[{first}].verdicts[0].value nan is written as null (JSON has no NaN or infinity)"]
    assert dumps_strict(doc) == _as_before(doc, 2)
    record = json.loads(dumps_record(entry))
    assert record["notes"][-1] == "verdicts[0].value nan is written as null (JSON has no NaN or infinity)"
    assert dumps_record(entry) == _as_before(entry, None)
    assert [dumps_record(result_to_dict(r)) for r in run.results] == \
        [_as_before(result_to_dict(r), None) for r in run.results]


def test_a_circular_payload_is_still_refused() -> None:
    from boresize.io.document import dumps_record, dumps_strict

    loop: dict[str, object] = {"notes": []}
    loop["self"] = loop
    for dumps in (dumps_strict, dumps_record):
        with pytest.raises(RecursionError):
            dumps(loop)


def test_the_rows_values_are_the_records_own(run) -> None:  # type: ignore[no-untyped-def]
    """A CSV or workbook row reads sheet_values (a few keys), not the whole record: the same values, for every line
    and case of the fixed list (passes, a fail, errors, cases, two-phase and mixtures)."""
    from boresize.io.document import SHEET_KEYS, result_to_dict, sheet_values
    from boresize.io.sheet_rows import RESULT_COLUMNS

    assert {key for _, key in RESULT_COLUMNS} - {"line_status", "governs"} <= set(SHEET_KEYS)
    for result in run.results:
        for one in (result, *result.cases):
            entry = result_to_dict(one)
            assert sheet_values(one) == {key: entry.get(key) for key in SHEET_KEYS}
