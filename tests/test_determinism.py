"""Determinism: the same input gives byte-identical JSON from the CLI, across runs and across worker counts.

Each run is a separate ``boresize`` process with its own hash seed (``PYTHONHASHSEED``), so an output
that leaned on the iteration order of a set or dict of strings, on a worker's finishing order or on
process state would show here. The time of the run (``traceability.date``) is the one thing allowed
to differ: ``RUN_TIME_KEYS`` lists where it is. The contract is the README's: "one entry per input line, in input order".
"""

from __future__ import annotations

import contextlib
import io
import json
import os
import subprocess
import sys
from pathlib import Path
from typing import Any

import pytest

from boresize.cli import main

#: Where the JSON document carries the time of the run (not a result): removed before comparing.
RUN_TIME_KEYS = (("traceability", "date"),)
BORESIZE = Path(sys.executable).with_name("boresize")

LINES = """\
tag,fluid,flow,pressure,temperature,length,service,density,viscosity,nps,case
D-W1,water,45 t/h,1.2 barg,30 degC,25 m,pump-suction,,,,
D-W2,water,120 m3/h,9 barg,40 degC,180 m,pump-discharge,,,,
D-CW,water,320 m3/h,4 barg,28 degC,250 m,cooling-water,,,,
D-HC,toluene,18 t/h,3 barg,60 degC,120 m,liquid,,,,
D-G1,methane,12000 Sm3/h,6 barg,25 degC,300 m,gas,,,,
D-G2,nitrogen,450 Nm3/h,7 barg,20 degC,150 m,gas-by-pressure,,,,
D-ST,steam,8 t/h,3.5 barg,180 degC,200 m,steam,,,,
D-FO,heavy fuel oil,12 m3/h,4 barg,80 degC,60 m,liquid,950 kg/m3,120 cP,3,
D-C1,water,30 t/h,5 barg,20 degC,100 m,liquid,,,,normal
D-C1,water,39 t/h,5 barg,20 degC,100 m,liquid,,,,maximum
D-FAIL,water,2000 t/h,5 barg,20 degC,100 m,liquid,,,2,
D-ERR,water,20 bar,5 barg,20 degC,100 m,liquid,,,,
D-G3,carbon dioxide,2 t/h,15 barg,40 degC,90 m,,,,,
"""


def _without_run_time(document: dict[str, Any]) -> dict[str, Any]:
    for *parents, key in RUN_TIME_KEYS:
        holder: Any = document
        for name in parents:
            holder = holder.get(name, {}) if isinstance(holder, dict) else {}
        if isinstance(holder, dict):
            holder.pop(key, None)
    return document


def _run(lines: Path, seed: int, *options: str) -> str:
    """stdout of ``boresize size LINES --json --no-plugins OPTIONS`` in a fresh process, run-time keys removed."""
    env = {**os.environ, "PYTHONHASHSEED": str(seed)}
    done = subprocess.run([str(BORESIZE), "size", str(lines), "--json", "--no-plugins", *options],
                          capture_output=True, text=True, env=env, timeout=300, cwd=lines.parent)
    assert done.returncode in (0, 1), done.stderr
    assert "Traceback" not in done.stderr and "internal error" not in done.stdout, done.stderr
    document = json.loads(done.stdout)
    return json.dumps(_without_run_time(document), indent=2, ensure_ascii=False)


def _has_workers_option() -> bool:
    out = io.StringIO()
    with contextlib.redirect_stdout(out), pytest.raises(SystemExit):
        main(["size", "--help"])
    return "--workers" in out.getvalue()


@pytest.fixture(scope="module")
def line_list(tmp_path_factory: pytest.TempPathFactory) -> Path:
    path = tmp_path_factory.mktemp("determinism") / "lines.csv"
    path.write_text(LINES, encoding="utf-8")
    return path


WORKERS = _has_workers_option()


@pytest.fixture(scope="module")
def first_run(line_list: Path) -> str:
    return _run(line_list, 1)


def test_the_input_gives_one_entry_per_line_in_input_order(first_run: str) -> None:
    tags = [line["tag"] for line in json.loads(first_run)["lines"]]
    # D-C1's two rows are the operating cases of one line: one entry.
    assert tags == ["D-W1", "D-W2", "D-CW", "D-HC", "D-G1", "D-G2", "D-ST", "D-FO", "D-C1", "D-FAIL", "D-ERR",
                    "D-G3"]
    statuses = {line["tag"]: line["status"] for line in json.loads(first_run)["lines"]}
    assert (statuses["D-FAIL"], statuses["D-ERR"]) == ("fail", "error")


def test_two_runs_give_byte_identical_json(line_list: Path, first_run: str) -> None:
    # The second run also asks for one worker explicitly (when the option exists): the same output.
    assert _run(line_list, 2, *(["--workers", "1"] if WORKERS else [])) == first_run


@pytest.mark.skipif(not WORKERS, reason="no --workers option yet")
def test_two_workers_give_byte_identical_json(line_list: Path, first_run: str) -> None:
    assert _run(line_list, 3, "--workers", "2") == first_run
