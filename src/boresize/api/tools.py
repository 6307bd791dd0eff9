"""What the ``boresize`` command shows besides a run: the criteria and pipe listings, two revisions compared.

Each returns text (or a value with ``to_dict()``), so a script can show the same as the command line.
"""

from __future__ import annotations

import json
from pathlib import Path
from typing import Any

from boresize.api.run import run_lines
from boresize.errors import InputError
from boresize.report.diff import Diff
from boresize.units.quantities import leave_dask_out_of_pint

__all__ = ["Diff", "compare_revisions", "leave_dask_out_of_pint", "criteria_text", "diff_text", "nps_text", "pipe_classes_text",
           "read_revision"]


def _config(criteria: str | Path | None, plugins: bool) -> Any:
    from boresize.plugins import PluginHost
    from boresize.sizing.services import load_config

    host = PluginHost.load(load_entry_points=plugins)
    return host, load_config(host, criteria)


def criteria_text(criteria: str | Path | None = None, *, plugins: bool = True) -> str:
    """The installed criteria with their options, and the criteria sets by service (``boresize criteria``)."""
    from boresize.report.listing import render_criteria

    return render_criteria(*_config(criteria, plugins))


def pipe_classes_text(criteria: str | Path | None = None, *, plugins: bool = True) -> str:
    """The pipe classes of the shipped sets and of ``criteria`` (``boresize pipes``)."""
    from boresize.report.listing import render_pipe_classes

    return render_pipe_classes(_config(criteria, plugins)[1])


def nps_text(nps: str) -> str:
    """Every schedule of one NPS from the catalogue (``boresize pipes --nps``)."""
    from boresize.report.listing import render_nps

    return render_nps(nps)


def read_revision(path: str | Path, *, criteria: str | Path | None = None, plugins: bool = True,
                  workers: int = 1) -> dict[str, Any]:
    """A results document: read from a .json file, or made by sizing a line list.

    :raises InputError: (field "revision") a missing file, or a .json file that is not a results document
    """
    source = Path(path)
    if not source.is_file():
        raise InputError(f"{str(path)!r} not found", field="revision", value=str(path),
                         expected="a results .json file or a line list")
    if source.suffix.lower() != ".json":
        return run_lines(source, criteria, plugins=plugins, workers=workers).document()
    try:
        doc = json.loads(source.read_text(encoding="utf-8"))
    except (UnicodeDecodeError, json.JSONDecodeError) as exc:
        raise InputError(f"{path} is not a JSON results document: {exc}", field="revision", value=str(path),
                         expected="the JSON of 'boresize size --json'") from None
    if not isinstance(doc, dict) or not isinstance(doc.get("lines"), list):
        raise InputError(f"{path} is not a boresize results document (no 'lines' list)", field="revision",
                         value=str(path), expected="the JSON of 'boresize size --json'")
    for number, entry in enumerate(doc["lines"], start=1):
        if not isinstance(entry, dict) or not isinstance(entry.get("tag"), str) or not entry["tag"]:
            shown = str(entry.get("tag") if isinstance(entry, dict) else entry)[:60]
            raise InputError(f"{path}: line {number} of 'lines' has no tag ({shown!r})", field="revision",
                             value=shown, expected="each line an object with its tag, as 'boresize size --json' "
                             "writes")
    return doc


def compare_revisions(old: str | Path, new: str | Path, *, criteria: str | Path | None = None, plugins: bool = True,
                      workers: int = 1) -> Diff:
    """What changed between two revisions (results .json files, or line lists sized first)."""
    from boresize.report.diff import compare

    options: dict[str, Any] = {"criteria": criteria, "plugins": plugins, "workers": workers}
    return compare(read_revision(old, **options), read_revision(new, **options))


def diff_text(diff: Diff, old_name: str, new_name: str) -> str:
    """The differences as text for the terminal."""
    from boresize.report.diff import render_diff

    return render_diff(diff, old_name, new_name)
