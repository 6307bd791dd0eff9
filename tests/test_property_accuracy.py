"""The property accuracy table of README.md is the output of ``benchmarks/property_accuracy.py``.

The script computes its references with CoolProp (reference equations, HEOS mixtures, incompressible
solutions); this test runs it and checks that README shows exactly its rows, so the table stays true as the
automatic choice of property model changes.
"""

from __future__ import annotations

import importlib.util
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


def _script():  # type: ignore[no-untyped-def]
    spec = importlib.util.spec_from_file_location("property_accuracy", ROOT / "benchmarks" / "property_accuracy.py")
    assert spec is not None and spec.loader is not None
    module = importlib.util.module_from_spec(spec)
    sys.modules[spec.name] = module  # its dataclasses look their module up there
    spec.loader.exec_module(module)
    return module


def _readme_table() -> list[str]:
    lines = (ROOT / "README.md").read_text("utf-8").splitlines()
    start = next(i for i, line in enumerate(lines) if line.startswith("| family | model"))
    rows = []
    for line in lines[start:]:
        if not line.startswith("|"):
            break
        rows.append(line)
    return rows


def test_the_readme_table_is_the_scripts_output():
    text, faults = _script().table()
    rows = text.splitlines()
    assert faults == []  # every point a state: a refused point would hide a family's deviation
    assert len(rows) == 2 + 9 and all(row.count(" | ") == 4 for row in rows[:1] + rows[2:])
    assert _readme_table() == rows, "rerun: python benchmarks/property_accuracy.py, and paste its table into README"
