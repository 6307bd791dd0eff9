"""Writing results to files, the kind chosen by the extension: .json, .csv, .xlsx or .html."""

from __future__ import annotations

import json
from collections.abc import Mapping, Sequence
from pathlib import Path
from typing import Any

from boresize.errors import InputError
from boresize.io.csv_reader import LineList
from boresize.io.document import document
from boresize.model import LineResult

__all__ = ["OUTPUT_SUFFIXES", "check_output", "write_output"]

OUTPUT_SUFFIXES = (".json", ".csv", ".xlsx", ".html")


def check_output(path: str | Path) -> Path:
    """The path, if its extension names a kind boresize writes and its folder exists.

    :raises InputError: (field "output") naming the path and the kinds accepted
    """
    target = Path(path)
    if target.suffix.lower() not in OUTPUT_SUFFIXES:
        raise InputError(f"cannot tell what to write to {str(path)!r} from its extension", field="output",
                         value=str(path), expected=f"a file ending in {', '.join(OUTPUT_SUFFIXES)}")
    if not target.parent.is_dir():
        raise InputError(f"folder {str(target.parent)!r} does not exist", field="output", value=str(path),
                         expected="a file in an existing folder")
    return target


def write_output(path: str | Path, results: Sequence[LineResult], *, line_list: LineList | None,
                 trace: Mapping[str, Any], criteria_source: str, lines_source: str) -> Path:
    """Write ``results`` to ``path`` in the kind its extension names; returns the path written."""
    target = check_output(path)
    suffix = target.suffix.lower()
    headers = line_list.headers if line_list is not None else None
    if suffix == ".json":
        doc = document(results, criteria_source=criteria_source, lines_source=lines_source, traceability=trace)
        target.write_text(json.dumps(doc, indent=2, ensure_ascii=False) + "\n", encoding="utf-8")
    elif suffix == ".csv":
        from boresize.io.csv_writer import write_csv

        write_csv(target, results, headers)
    elif suffix == ".xlsx":
        from boresize.io.xlsx import write_xlsx

        write_xlsx(target, results, headers)
    else:
        from boresize.report.html import write_html

        write_html(target, results, trace=trace, title=lines_source, headers=headers,
                   units=line_list.units if line_list is not None else None)
    return target
