"""The bad-input corpus: every kind of mistake a line list, a criteria file or a plugin can make.

Each file in tests/corpus/ holds one kind of mistake; tests/corpus/expected.toml gives, for each bad
input in it, the exact message, the field at fault, the value as given and what was expected. A bad
row must give an ``error`` result for that line only, and every other line must still be in the JSON
output, in input order; a bad file (or criteria file, or plugin) must stop the run with exit code 2
and the message on stderr, and print nothing on stdout. The contract is the README's ("one entry per
input line, in input order ... for status error, error (a message naming the field at fault)"; exit
code 2 for a usage error; no traceback); how to add a case is in DEVELOPERS.md.
"""

from __future__ import annotations

import contextlib
import functools
import io
import json
import os
import sys
from collections.abc import Iterator
from importlib.metadata import EntryPoint
from pathlib import Path
from typing import Any
from unittest import mock

import pytest

from boresize.cli import main

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover
    import tomli as tomllib

CORPUS = Path(__file__).parent / "corpus"
EXPECTED = tomllib.loads((CORPUS / "expected.toml").read_text(encoding="utf-8"))
CASES: list[dict[str, Any]] = EXPECTED["case"]
FILES: dict[str, dict[str, Any]] = EXPECTED["file"]
ROW_CASES = [c for c in CASES if "tag" in c]
FILE_CASES = [c for c in CASES if "tag" not in c]
_HELPERS = {"xlsx/make_xlsx.py", "expected.toml"}


@contextlib.contextmanager
def _in_corpus(plugins: list[str]) -> Iterator[None]:
    """Run from the corpus folder (messages name files as given), with ``plugins`` as the only entry points."""
    def entry_points(group: str) -> list[EntryPoint]:
        return [EntryPoint(*spec.split(" = "), group) for spec in plugins] if group == "boresize" else []

    from boresize.sizing import batch

    # The process's sizers are cached by spec, not by which entry points exist: one built by an earlier test with
    # the real entry points would hide this case's plugins (a test-order failure), so each case starts clean.
    batch.clear_sizers()
    here = os.getcwd()
    os.chdir(CORPUS)
    try:
        with mock.patch("boresize.plugins.entry_points", entry_points), \
                mock.patch.object(sys, "path", [str(CORPUS / "plugins"), *sys.path]):
            yield
    finally:
        os.chdir(here)
        batch.clear_sizers()


@functools.cache
def _run(file: str) -> tuple[int, str, str]:
    """Exit code, stdout and stderr of ``boresize size ... --json`` on one corpus file (run once per file)."""
    spec = FILES[file]
    plugins = spec.get("plugins", [])
    argv = ["size", *spec.get("args", [file]), "--json", *([] if plugins else ["--no-plugins"])]
    out, err = io.StringIO(), io.StringIO()
    with _in_corpus(plugins), contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        code = main(argv)
    return code, out.getvalue(), err.getvalue()


def _lines(file: str) -> list[dict[str, Any]]:
    code, out, err = _run(file)
    assert code in (0, 1), f"{file}: exit code {code}, stderr {err!r}"
    return json.loads(out)["lines"]


def _at(file: str, tag: str, occurrence: int) -> dict[str, Any]:
    matches = [line for line in _lines(file) if line["tag"] == tag]
    assert len(matches) >= occurrence, f"{file}: line {tag} (occurrence {occurrence}) is not in the output"
    return matches[occurrence - 1]


def test_the_corpus_holds_at_least_30_distinct_bad_inputs() -> None:
    ids = [case["id"] for case in CASES]
    assert len(ids) == len(set(ids)), "case ids must be unique"
    distinct = {(c["file"], c.get("tag"), c.get("occurrence", 1)) for c in CASES}
    assert len(distinct) == len(CASES), "two cases describe the same bad input"
    assert len(CASES) >= 30
    for case in CASES:
        assert {"id", "file", "field", "value", "expected", "message"} <= set(case), case["id"]


def test_every_corpus_file_has_its_expected_errors_and_every_case_its_file() -> None:
    on_disk = {p.relative_to(CORPUS).as_posix() for p in CORPUS.rglob("*") if p.is_file()} - _HELPERS
    on_disk = {p for p in on_disk if "__pycache__" not in p}
    used = {name.split(":")[0] for name in FILES}  # "plugins/corpus_plugins.py:OBJECT" is one object of that file
    used |= {arg for spec in FILES.values() for arg in spec.get("args", []) if "." in arg}
    used |= {name for spec in FILES.values() for name in spec.get("data", [])}  # files a criteria file names
    assert on_disk == used, "every corpus file needs a [file.NAME] table in expected.toml, and the reverse"
    assert {c["file"] for c in CASES} <= set(FILES)


@pytest.mark.parametrize("case", ROW_CASES, ids=[c["id"] for c in ROW_CASES])
def test_a_bad_row_gives_its_exact_error_on_its_own_line(case: dict[str, Any]) -> None:
    line = _at(case["file"], case["tag"], case.get("occurrence", 1))
    message = line.get("error")
    assert line["status"] == "error", f"{case['id']}: the line was {line['status']}, not an error"
    assert message == case["message"]
    assert line["error_field"] == case["field"]
    assert case["value"] in message and case["expected"] in message
    assert "internal error" not in message and "Traceback" not in message


@pytest.mark.parametrize("case", FILE_CASES, ids=[c["id"] for c in FILE_CASES])
def test_a_bad_file_stops_the_run_with_its_exact_error(case: dict[str, Any]) -> None:
    code, out, err = _run(case["file"])
    assert (code, out) == (2, ""), f"{case['id']}: exit code {code}"
    assert err.strip() == case["message"]
    assert err.startswith(f"boresize: error: {case['field']}: ") or case["field"] == ""
    assert case["value"] in err and case["expected"] in err
    assert "internal error" not in err and "Traceback" not in err


ROW_FILES = sorted({c["file"] for c in ROW_CASES} | {f for f, spec in FILES.items() if "lines" in spec})


@pytest.mark.parametrize("file", ROW_FILES)
def test_every_other_line_is_still_in_the_output_in_order(file: str) -> None:
    lines = _lines(file)
    assert [line["tag"] for line in lines] == FILES[file]["lines"]
    bad = {(c["tag"], c.get("occurrence", 1)) for c in ROW_CASES if c["file"] == file}
    seen: dict[str, int] = {}
    for line in lines:
        seen[line["tag"]] = seen.get(line["tag"], 0) + 1
        if (line["tag"], seen[line["tag"]]) not in bad:
            assert line["status"] in ("pass", "fail"), f"{file}: line {line['tag']}: {line.get('error')}"
            assert line["nps"], f"{file}: line {line['tag']} has no size"


@pytest.mark.parametrize("file", ROW_FILES)
def test_every_corpus_document_validates_against_the_shipped_schema(file: str) -> None:
    from jsonschema import Draft202012Validator

    from boresize.api import document_schema

    code, out, _ = _run(file)
    problems = [f"{list(e.absolute_path)}: {e.message}"
                for e in Draft202012Validator(document_schema()).iter_errors(json.loads(out))]
    assert problems == [], f"{file}: {problems[:3]}"
