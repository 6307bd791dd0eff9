"""A worker process that dies (os._exit or SIGKILL inside a plugin's evaluate) costs only its lines (issue 14).

The workers are forked (sizing/batch.py ``process_pool``), so a patch of ``size_item`` made here is what they run.
"""

from __future__ import annotations

import os
import signal
import sys
from typing import Any
from unittest import mock

import pytest

from boresize.io.rows import line_from_row
from boresize.sizing import batch

pytestmark = pytest.mark.skipif(sys.platform != "linux", reason="workers are forked on Linux only")
WATER = {"fluid": "water", "flow": "20 t/h", "pressure": "5 barg", "temperature": "20 degC"}
REAL = batch.size_item


def _dies(sizer: Any, item: Any) -> Any:
    if item.tag == "DIE-EXIT":
        os._exit(3)
    if item.tag == "DIE-KILL":
        os.kill(os.getpid(), signal.SIGKILL)
    return REAL(sizer, item)


def test_a_dying_worker_errors_its_lines_and_the_others_are_sized() -> None:
    tags = ["OK-1", "DIE-EXIT", "OK-2", "OK-3", "DIE-KILL", "OK-4"]  # chunks of two: each death shares its chunk
    items = [line_from_row({"tag": tag, **WATER}) for tag in tags]
    with mock.patch.object(batch, "size_item", _dies):
        results = batch.run_items(items, workers=2, chunk_size=2, progress=False)
    assert [r.tag for r in results] == tags
    for result in results:
        if result.tag.startswith("DIE"):
            assert result.status == "error"
            assert result.error == f"line {result.tag}: {batch.WORKER_DIED}"
        else:
            assert result.status == "pass" and result.selected is not None
