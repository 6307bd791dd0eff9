"""The JSON writers give json.dumps's bytes (issue 19: speed work may not change a byte).

:func:`boresize.io.document.dumps_strict` writes ``json.dumps(payload, indent=2, ensure_ascii=False,
allow_nan=False)`` with its own writer, and :func:`dumps_record` the same values on one line; a NaN or infinity is
written as null with a note (the walk :func:`_finite` then the json module: the bytes as they were before the fast
paths). The reference here is always the json module itself, over made-up payloads (hypothesis: odd text, every
kind of number, nesting, keys that are not text), the fixed identity list's records and, in the slow sweep, the
2,000-line list of ``benchmarks/bench_scale.py``. The rounding helpers ``_r6``/``_r4`` are checked against the f-string rounding they replaced.
"""

from __future__ import annotations

import json
import os
import sys
from pathlib import Path
from typing import Any

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from boresize.io.document import _finite, _r4, _r6, document, dumps_record, dumps_strict, result_to_dict

ROOT = Path(__file__).resolve().parents[2]
QUICK = settings(max_examples=300, deadline=None, derandomize=True, suppress_health_check=[HealthCheck.too_slow])
SWEEP = settings(max_examples=3000, deadline=None, suppress_health_check=[HealthCheck.too_slow])
BUDGETS = [pytest.param(QUICK, id="quick"), pytest.param(SWEEP, id="sweep", marks=pytest.mark.slow)]

def _with_notes(entry: dict[str, Any]) -> dict[str, Any]:
    """An object with ``notes`` (where a NaN or infinity is named), as a line's entry has."""
    return {**entry, "notes": []}


#: Text with every code point the encoders treat apart: controls, quote, backslash, slash, non-ASCII, the line and
#: paragraph separators, lone surrogates, astral characters.
ODD = st.text(st.one_of(st.sampled_from('\x00\x01\x1f\x7f"\\/\n\r\t\b\f\u2028\u2029\ud800\udfff\ufeff€漢😀 {}[],:'),
                        st.characters(blacklist_categories=())), max_size=12)
NUMBERS = st.one_of(st.floats(), st.integers(), st.sampled_from([0.0, -0.0, 1e-5, 1e16, 5e-324, 1.7976931348623157e308]))
LEAVES = st.one_of(st.none(), st.booleans(), NUMBERS, ODD)
KEYS = st.one_of(ODD, ODD, ODD, st.integers(), st.floats(allow_nan=False), st.booleans(), st.none())
PAYLOADS = st.recursive(LEAVES, lambda inner: st.one_of(
    st.lists(inner, max_size=5), st.lists(inner, max_size=3).map(tuple),
    st.dictionaries(KEYS, inner, max_size=5), st.dictionaries(ODD, inner, max_size=5).map(_with_notes)),
    max_leaves=40)


def _as_before(payload: object, indent: int | None) -> str:
    separators = None if indent else (",", ":")
    return json.dumps(_finite(payload, "", None), indent=indent, ensure_ascii=False, allow_nan=False,
                      separators=separators)


def _finite_only(payload: object) -> bool:
    try:
        json.dumps(payload, allow_nan=False)
    except ValueError:
        return False
    return True


@pytest.mark.parametrize("budget", BUDGETS)
def test_the_writers_give_the_json_modules_bytes_for_any_payload(budget: settings) -> None:
    @budget
    @given(PAYLOADS)
    def check(payload: Any) -> None:
        for ours, indent in ((dumps_strict, 2), (dumps_record, None)):
            try:
                expected = _as_before(payload, indent)
            except ValueError:  # an infinite key: refused before too
                with pytest.raises(ValueError):
                    ours(payload)
                return
            assert ours(payload) == expected
        if _finite_only(payload):
            assert dumps_strict(payload) == json.dumps(payload, indent=2, ensure_ascii=False, allow_nan=False)
            assert dumps_record(payload) == json.dumps(payload, ensure_ascii=False, allow_nan=False,
                                                       separators=(",", ":"))

    check()


@pytest.mark.parametrize("budget", BUDGETS)
def test_rounding_to_6_and_4_figures_is_rs(budget: settings) -> None:
    @budget
    @given(st.one_of(st.none(), NUMBERS, st.floats(min_value=-1e6, max_value=1e6)))
    def check(value: float | None) -> None:
        for fast, digits in ((_r6, 6), (_r4, 4)):
            expected = None if value is None else float(f"{value:.{digits}g}")  # the rounding before _r6/_r4
            got = fast(value)
            assert repr(got) == repr(expected)  # repr: -0.0 against 0.0, and nan equal to itself

    check()


def test_the_identity_lists_records_are_written_as_json_writes_them() -> None:
    """Every line and case of tests/golden/identity-lines.csv (passes, a fail, errors, cases, two-phase, mixtures)."""
    from boresize.api import run_lines

    here = Path.cwd()
    os.chdir(ROOT)
    try:
        run = run_lines("tests/golden/identity-lines.csv", "examples/demo-unit/criteria.toml", plugins=False,
                        workers=1)
    finally:
        os.chdir(here)
    entries = [result_to_dict(one) for result in run.results for one in (result, *result.cases)]
    assert len(entries) > len(run.results)
    for entry in entries:
        assert dumps_strict(entry) == json.dumps(entry, indent=2, ensure_ascii=False, allow_nan=False)
        assert dumps_record(entry) == json.dumps(entry, ensure_ascii=False, allow_nan=False, separators=(",", ":"))


@pytest.mark.slow
def test_the_2000_line_documents_bytes_are_the_json_modules(tmp_path: Path) -> None:
    """The speed benchmark's 2,000 pure-fluid lines (benchmarks/bench_scale.py): the whole document and its records."""
    from boresize.api import run_lines

    sys.path.insert(0, str(ROOT / "benchmarks"))
    try:
        from bench_scale import build_pure_list
    finally:
        sys.path.remove(str(ROOT / "benchmarks"))
    lines = build_pure_list(2000, tmp_path)
    run = run_lines(lines, ROOT / "examples" / "demo-unit" / "criteria.toml", plugins=False, workers=1)
    doc = document(run.results, criteria_source="criteria.toml", lines_source="lines-2000.csv")
    assert len(doc["lines"]) == 2000
    assert dumps_strict(doc) == json.dumps(doc, indent=2, ensure_ascii=False, allow_nan=False)
    for entry in doc["lines"]:
        assert dumps_record(entry) == json.dumps(entry, ensure_ascii=False, allow_nan=False, separators=(",", ":"))
