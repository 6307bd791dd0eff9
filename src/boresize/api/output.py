"""Writing a run to files, the kind chosen by the extension: .json, .jsonl, .csv, .xlsx, .html or .pdf.

The table :data:`WRITERS` maps an extension to a function ``(path, run)``; every writer takes the run
(its results, the line list as read, its traceability record). A new output format is one entry here.

A file is written whole or not at all: the writer writes a temporary file beside the target
(``.NAME.boresize-tmp-XXXX.EXT``, same folder so the rename stays on one file system), which replaces the
target (:func:`os.replace`) only once complete. On any failure the temporary file is removed and an earlier
file of that name is left as it was. A process killed outright (SIGKILL, power loss) cannot remove its
temporary file: the target is still intact, and a ``.boresize-tmp`` file may remain to be deleted.
"""

from __future__ import annotations

import os
import stat
import tempfile
from collections.abc import Callable, Iterable, Sequence
from pathlib import Path
from typing import IO, TYPE_CHECKING, cast

from boresize.errors import InputError

if TYPE_CHECKING:
    from boresize.api.run import Run
    from boresize.model import LineResult
    from boresize.sizing.headroom import Headroom

__all__ = ["OUTPUT_SUFFIXES", "STREAMED_SUFFIXES", "WRITERS", "StreamedOutput", "check_output", "check_outputs", "strict_json", "write_run"]


def strict_json(payload: object) -> str:
    """``payload`` as indented JSON without NaN or Infinity (see :func:`boresize.io.document.dumps_strict`)."""
    from boresize.io.document import dumps_strict

    return dumps_strict(payload)


def _json(path: Path, run: Run) -> None:
    path.write_text(strict_json(run.document()) + "\n", encoding="utf-8")


def _jsonl(path: Path, run: Run) -> None:
    """JSON Lines: one record per line, each the JSON document's entry for it (the ``lines`` items, with headroom
    when asked for), written one at a time: never the whole document in memory."""
    from boresize.io.document import dumps_record, result_to_dict
    from boresize.sizing.headroom import headroom_to_dict

    rooms = run.headrooms or ()
    with open(path, "w", encoding="utf-8", newline="\n") as handle:
        for number, result in enumerate(run.results):
            entry = result_to_dict(result)
            if number < len(rooms):
                entry.update(headroom_to_dict(rooms[number]))
            handle.write(dumps_record(entry) + "\n")


def _csv(path: Path, run: Run) -> None:
    from boresize.io.csv_writer import write_csv

    write_csv(path, run.results, run.line_list.headers or None)


def _xlsx(path: Path, run: Run) -> None:
    from boresize.io.xlsx import write_xlsx

    block = run.document_block
    write_xlsx(path, run.results, run.line_list.headers or None, trace=run.trace.to_dict(),
               document=dict(block.rows()) if block is not None else None)


def _html(path: Path, run: Run) -> None:
    from boresize.report.html import write_html

    write_html(path, run.results, trace=run.trace.to_dict(), title=page_title(run),
               headers=run.line_list.headers or None, units=run.line_list.units, document=run.document_block)


def _pdf(path: Path, run: Run) -> None:
    from boresize.report.pdf import write_pdf

    write_pdf(path, run.results, trace=run.trace.to_dict(), title=page_title(run),
              headers=run.line_list.headers or None, units=run.line_list.units, document=run.document_block)


def page_title(run: Run) -> str:
    """A title for an output page: the document block's number and project, else the line list's file name
    (never its folder: a title must not show a local path)."""
    if run.document_block is not None and run.document_block.title:
        return run.document_block.title
    return Path(run.line_list.source).name or run.line_list.source


#: extension -> the writer of that kind of file
WRITERS: dict[str, Callable[[Path, Run], None]] = {".json": _json, ".jsonl": _jsonl, ".csv": _csv, ".xlsx": _xlsx,
                                                   ".html": _html, ".pdf": _pdf}
OUTPUT_SUFFIXES = tuple(WRITERS)


def check_output(path: str | Path, inputs: Iterable[str | Path] = ()) -> Path:
    """The path, if its extension names a kind boresize writes, its folder exists, it is not a folder itself
    and it is none of ``inputs`` (the line list read: an output never overwrites what it was made from).

    :raises InputError: (field "output") naming the path and what is accepted
    """
    if not isinstance(path, (str, os.PathLike)) or isinstance(os.fspath(path), bytes):
        raise InputError(f"output {path!r} is not a file path", field="output", value=repr(path),
                         expected=f"a file path (text or pathlib.Path) ending in {', '.join(OUTPUT_SUFFIXES)}")
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
    if not os.access(target.parent, os.W_OK | os.X_OK):
        raise InputError(f"cannot write {str(path)!r}: folder {str(target.parent)!r} is not writable",
                         field="output", value=str(path), expected="a file in a folder this user may write")
    if target.exists() and not os.access(target, os.W_OK):
        raise InputError(f"cannot write {str(path)!r}: the file is read-only", field="output", value=str(path),
                         expected="a file this user may write")
    return target


def check_outputs(paths: Iterable[str | Path], inputs: Iterable[str | Path] = ()) -> list[Path | InputError]:
    """:func:`check_output` for each path, and no two naming the same file (``a.csv``, ``./a.csv``, a symbolic
    link to it, a hard link): each path's Path, or the InputError (field "output") that refuses it."""
    inputs = list(inputs)
    checked: list[Path | InputError] = []
    seen: list[tuple[str, str | Path]] = []  # (the file a path names, the path as given)
    for path in paths:
        try:
            target = check_output(path, inputs)
            names = os.path.realpath(target)
            earlier = next((given for name, given in seen if name == names or _same_file(name, names)), None)
            if earlier is not None:
                raise InputError(f"{str(earlier)!r} and {str(path)!r} name the same file", field="output",
                                 value=str(path), expected="a different file for each output")
            seen.append((names, path))
            checked.append(target)
        except InputError as exc:
            checked.append(exc)
    return checked


def _same_file(a: str, b: str) -> bool:
    """Two existing paths naming one file (hard links); False when either does not exist."""
    try:
        return os.path.samefile(a, b)
    except OSError:
        return False


def _mode(target: Path) -> int:
    """The permissions the written file gets: those of the file it replaces, else what the umask allows."""
    try:
        return stat.S_IMODE(target.stat().st_mode)
    except FileNotFoundError:
        umask = os.umask(0)
        os.umask(umask)
        return 0o666 & ~umask


def _write_atomic(target: Path, write: Callable[[Path], None]) -> None:
    """Run ``write`` on a temporary file beside ``target``, then rename it over ``target``; on any failure
    (an exception, Ctrl-C) remove the temporary file and leave ``target`` as it was."""
    target = Path(os.path.realpath(target))  # a symbolic link stays a link: the file it names is replaced
    handle, name = tempfile.mkstemp(prefix=f".{target.name}.boresize-tmp-", suffix=target.suffix,
                                    dir=target.parent)
    os.close(handle)
    temporary = Path(name)
    done = False
    try:
        write(temporary)
        os.chmod(temporary, _mode(target))
        os.replace(temporary, target)
        done = True
    finally:
        if not done:
            temporary.unlink(missing_ok=True)


#: Outputs that can be written as each line's result arrives (:class:`StreamedOutput`), never holding the run.
STREAMED_SUFFIXES = (".csv", ".jsonl")


class StreamedOutput:
    """A .csv or .jsonl output written one line at a time as results arrive, to a temporary file beside the target
    that :meth:`commit` renames over it (:meth:`discard`: removed, the target left as it was). The bytes are those
    :data:`WRITERS` write for the whole run (tests/test_output_identity.py). A write that fails (disk full) stops
    this output only: its temporary file is removed and :attr:`error` says why; the run goes on.
    measured: 50,000 lines (bench_scale.py's list) to .jsonl, `boresize size -o out.jsonl --workers 1`, peak
    478 MB against 908 MB when the run kept full records until written (2 cores, load average 6; /usr/bin/time).

    :param headers: the line list's input headers (a CSV output needs them before its first row)
    """

    def __init__(self, path: str | Path, headers: Sequence[str]) -> None:
        import csv

        from boresize.io.csv_writer import csv_cell
        from boresize.io.document import dumps_record, result_to_dict
        from boresize.io.sheet_rows import input_fields, line_rows, result_head

        self.path = Path(path)
        self.error: InputError | None = None
        self.target = Path(os.path.realpath(self.path))
        handle, name = tempfile.mkstemp(prefix=f".{self.target.name}.boresize-tmp-", suffix=self.target.suffix,
                                        dir=self.target.parent)
        os.close(handle)
        self.temporary = Path(name)
        self._cell, self._record, self._to_dict, self._rows = csv_cell, dumps_record, result_to_dict, line_rows
        self.csv = self.path.suffix.lower() == ".csv"
        self._fields = input_fields(headers)
        self._handle: IO[str] | None = None
        self._handle = open(self.temporary, "w", encoding="utf-8-sig" if self.csv else "utf-8",
                            newline="" if self.csv else "\n")
        self._writer = csv.writer(self._handle)
        if self.csv:
            self._guard(lambda: self._writer.writerow([csv_cell(h) for h in result_head(headers)]))

    def _guard(self, write: Callable[[], object]) -> None:
        if self._handle is None:
            return
        try:
            write()
        except OSError as exc:
            self.discard()
            self.error = InputError(f"cannot write {str(self.path)!r}: {exc.strerror or exc}", field="output",
                                    value=str(self.path), expected="a file this user may write")

    def add(self, result: LineResult, room: Headroom | None = None) -> None:
        """Write one line's rows (CSV: one per case) or record (JSON Lines, with its headroom when given)."""
        if self.csv:
            self._guard(lambda: self._writer.writerows([self._cell(v) for v in row]
                                                       for row in self._rows(result, self._fields)))
            return
        entry = self._to_dict(result)
        if room is not None:
            from boresize.sizing.headroom import headroom_to_dict

            entry.update(headroom_to_dict(room))
        self._guard(lambda: cast(IO[str], self._handle).write(self._record(entry) + "\n"))

    def commit(self) -> Path:
        """Close and rename over the target; the path as given.

        :raises InputError: (field "output") the write or the rename failed (the target is left as it was)
        """
        if self._handle is not None:
            def finish() -> None:
                cast(IO[str], self._handle).close()
                self._handle = None
                os.chmod(self.temporary, _mode(self.target))
                os.replace(self.temporary, self.target)

            self._guard(finish)
        if self.error is not None:
            raise self.error
        return self.path

    def discard(self) -> None:
        """Close and remove the temporary file (an earlier target is left as it was)."""
        if self._handle is not None:
            handle, self._handle = self._handle, None
            try:
                handle.close()
            except OSError:
                pass
        self.temporary.unlink(missing_ok=True)


def write_run(path: str | Path, run: Run) -> Path:
    """Write ``run`` to ``path`` in the kind its extension names; returns the path written.

    The file is written to a temporary name in the same folder and renamed over ``path`` once complete, so
    an earlier file of that name is either replaced whole or left intact.

    :raises InputError: (field "output") an unknown extension, a missing folder, a file that cannot be written
    """
    target = check_output(path, [run.line_list.source])
    writer = WRITERS[target.suffix.lower()]
    try:
        _write_atomic(target, lambda temporary: writer(temporary, run))
    except OSError as exc:
        raise InputError(f"cannot write {str(path)!r}: {exc.strerror or exc}", field="output", value=str(path),
                         expected="a file this user may write") from exc
    return target
