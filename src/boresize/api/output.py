"""Writing a run to files, the kind chosen by the extension: .json, .csv, .xlsx or .html.

The table :data:`WRITERS` maps an extension to a function ``(path, run)``; every writer takes the run
(its results, the line list as read, its traceability record). A new output format is one entry here.
"""

from __future__ import annotations

from collections.abc import Iterable, Callable
from pathlib import Path
from typing import TYPE_CHECKING

from boresize.errors import InputError

if TYPE_CHECKING:
    from boresize.api.run import Run

__all__ = ["OUTPUT_SUFFIXES", "WRITERS", "check_output", "strict_json", "write_run"]


def strict_json(payload: object) -> str:
    """``payload`` as indented JSON without NaN or Infinity (see :func:`boresize.io.document.dumps_strict`)."""
    from boresize.io.document import dumps_strict

    return dumps_strict(payload)


def _json(path: Path, run: Run) -> None:
    path.write_text(strict_json(run.document()) + "\n", encoding="utf-8")


def _csv(path: Path, run: Run) -> None:
    from boresize.io.csv_writer import write_csv

    write_csv(path, run.results, run.line_list.headers or None)


def _xlsx(path: Path, run: Run) -> None:
    from boresize.io.xlsx import write_xlsx

    write_xlsx(path, run.results, run.line_list.headers or None)


def _html(path: Path, run: Run) -> None:
    from boresize.report.html import write_html

    write_html(path, run.results, trace=run.trace.to_dict(), title=run.line_list.source,
               headers=run.line_list.headers or None, units=run.line_list.units)


#: extension -> the writer of that kind of file
WRITERS: dict[str, Callable[[Path, Run], None]] = {".json": _json, ".csv": _csv, ".xlsx": _xlsx, ".html": _html}
OUTPUT_SUFFIXES = tuple(WRITERS)


def check_output(path: str | Path, inputs: Iterable[str | Path] = ()) -> Path:
    """The path, if its extension names a kind boresize writes, its folder exists, it is not a folder itself
    and it is none of ``inputs`` (the line list read: an output never overwrites what it was made from).

    :raises InputError: (field "output") naming the path and what is accepted
    """
    target = Path(path)
    if target.is_dir():
        raise InputError(f"{str(path)!r} is a folder", field="output", value=str(path),
                         expected=f"a file name ending in {', '.join(OUTPUT_SUFFIXES)}")
    if any(Path(given).is_file() and target.resolve() == Path(given).resolve() for given in inputs):
        raise InputError(f"{str(path)!r} is the line list being read", field="output", value=str(path),
                         expected="another file name: an output never overwrites its input")
    if target.suffix.lower() not in WRITERS:
        raise InputError(f"cannot tell what to write to {str(path)!r} from its extension", field="output",
                         value=str(path), expected=f"a file ending in {', '.join(OUTPUT_SUFFIXES)}")
    if not target.parent.is_dir():
        raise InputError(f"folder {str(target.parent)!r} does not exist", field="output", value=str(path),
                         expected="a file in an existing folder")
    return target


def write_run(path: str | Path, run: Run) -> Path:
    """Write ``run`` to ``path`` in the kind its extension names; returns the path written.

    :raises InputError: (field "output") an unknown extension, a missing folder, a file that cannot be written
    """
    target = check_output(path, [run.line_list.source])
    try:
        WRITERS[target.suffix.lower()](target, run)
    except OSError as exc:
        raise InputError(f"cannot write {str(path)!r}: {exc.strerror or exc}", field="output", value=str(path),
                         expected="a file this user may write") from exc
    return target
