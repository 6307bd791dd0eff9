"""Outputs are written whole or not at all: a temporary file beside the target, renamed over it when
complete. A failing writer, a Ctrl-C and a SIGKILL while writing all leave the earlier file intact.

The line list is the demo unit's (examples/demo-unit/lines.csv); the large one is the same rows repeated
under new tags, so that writing it takes long enough to be caught in the act.
"""

from __future__ import annotations

import errno
import os
import signal
import stat
import subprocess
import sys
import time
from pathlib import Path

import pytest

from boresize import InputError
from boresize.api import Run, output, run_lines

DEMO = Path(__file__).resolve().parents[2] / "examples" / "demo-unit"
LINES, CRITERIA = DEMO / "lines.csv", DEMO / "criteria.toml"
SRC = Path(__file__).resolve().parents[2] / "src"


@pytest.fixture(scope="module")
def reference() -> Run:
    return run_lines(LINES, CRITERIA, plugins=False)


def _leftovers(folder: Path) -> list[str]:
    return sorted(p.name for p in folder.iterdir() if ".boresize-tmp-" in p.name)


@pytest.mark.parametrize("suffix", [".json", ".csv", ".xlsx", ".html"])
def test_each_kind_is_written_through_a_temporary_file_that_is_renamed(reference: Run, tmp_path: Path,
                                                                       suffix: str,
                                                                       monkeypatch: pytest.MonkeyPatch) -> None:
    seen: list[Path] = []
    writer = output.WRITERS[suffix]

    def spy(path: Path, run: Run) -> None:
        seen.append(path)
        writer(path, run)

    monkeypatch.setitem(output.WRITERS, suffix, spy)
    target = tmp_path / f"out{suffix}"
    target.write_text("earlier\n", encoding="utf-8")
    reference.write(target)
    assert len(seen) == 1 and seen[0].parent == tmp_path and seen[0] != target
    assert seen[0].name.startswith(f".out{suffix}.boresize-tmp-") and seen[0].suffix == suffix
    assert target.read_bytes() != b"earlier\n" and target.stat().st_size > 100
    assert _leftovers(tmp_path) == []


def test_a_writer_failing_half_way_leaves_the_earlier_file_and_no_temporary(reference: Run, tmp_path: Path,
                                                                            monkeypatch: pytest.MonkeyPatch) -> None:
    def full_disk(path: Path, run: Run) -> None:
        path.write_text("tag,res", encoding="utf-8")  # half a file, then the disk is full
        raise OSError(errno.ENOSPC, "No space left on device")

    monkeypatch.setitem(output.WRITERS, ".csv", full_disk)
    target = tmp_path / "out.csv"
    target.write_text("earlier\n", encoding="utf-8")
    with pytest.raises(InputError, match=r"^output: cannot write '.*out\.csv': No space left on device; expected a "
                                         r"file this user may write$"):
        reference.write(target)
    assert target.read_text(encoding="utf-8") == "earlier\n"
    assert _leftovers(tmp_path) == []


def test_a_ctrl_c_while_writing_leaves_the_earlier_file_and_no_temporary(reference: Run, tmp_path: Path,
                                                                         monkeypatch: pytest.MonkeyPatch) -> None:
    def interrupted(path: Path, run: Run) -> None:
        path.write_text("{", encoding="utf-8")
        raise KeyboardInterrupt

    monkeypatch.setitem(output.WRITERS, ".json", interrupted)
    target = tmp_path / "out.json"
    target.write_text("{}\n", encoding="utf-8")
    with pytest.raises(KeyboardInterrupt):
        reference.write(target)
    assert target.read_text(encoding="utf-8") == "{}\n"
    assert _leftovers(tmp_path) == []


def test_the_replaced_file_keeps_its_permissions_and_a_new_one_follows_the_umask(reference: Run,
                                                                                 tmp_path: Path) -> None:
    kept = tmp_path / "kept.json"
    kept.write_text("{}\n", encoding="utf-8")
    kept.chmod(0o640)
    reference.write(kept)
    assert stat.S_IMODE(kept.stat().st_mode) == 0o640
    umask = os.umask(0o022)
    try:
        fresh = reference.write(tmp_path / "fresh.json")
    finally:
        os.umask(umask)
    assert stat.S_IMODE(fresh.stat().st_mode) == 0o644  # 0o666 less the umask, not mkstemp's 0o600


def test_a_symbolic_link_stays_a_link_to_the_file_written(reference: Run, tmp_path: Path) -> None:
    real = tmp_path / "real.json"
    real.write_text("{}\n", encoding="utf-8")
    link = tmp_path / "link.json"
    link.symlink_to(real)
    reference.write(link)
    assert link.is_symlink() and real.stat().st_size > 100


def test_a_folder_that_cannot_be_written_is_named_before_writing(reference: Run, tmp_path: Path,
                                                                 monkeypatch: pytest.MonkeyPatch) -> None:
    # the tests may run as root, for whom every folder is writable: the check's own answer is replaced
    monkeypatch.setattr(output.os, "access", lambda path, mode: Path(path) != tmp_path)
    with pytest.raises(InputError, match=r"^output: cannot write '.*out\.csv': folder '.*' is not writable; "
                                         r"expected a file in a folder this user may write$"):
        output.check_output(tmp_path / "out.csv")
    assert _leftovers(tmp_path) == [] and not (tmp_path / "out.csv").exists()


def test_a_read_only_file_is_named_and_not_replaced(reference: Run, tmp_path: Path,
                                                    monkeypatch: pytest.MonkeyPatch) -> None:
    target = tmp_path / "out.json"
    target.write_text("{}\n", encoding="utf-8")
    monkeypatch.setattr(output.os, "access", lambda path, mode: Path(path) != target)
    with pytest.raises(InputError, match=r"^output: cannot write '.*out\.json': the file is read-only; expected a "
                                         r"file this user may write$"):
        reference.write(target)
    assert target.read_text(encoding="utf-8") == "{}\n"


def test_every_unusable_output_is_named_before_any_sizing(tmp_path: Path,
                                                          capsys: pytest.CaptureFixture[str]) -> None:
    from boresize.cli.main import main

    missing, unknown, good = tmp_path / "no" / "out.csv", tmp_path / "out.ods", tmp_path / "out.json"
    code = main(["size", str(LINES), "--criteria", str(CRITERIA), "--no-plugins",
                 "-o", str(missing), "-o", str(good), "-o", str(unknown)])
    captured = capsys.readouterr()
    assert code == 2 and captured.out == ""  # nothing sized: no table
    assert captured.err == (f"boresize: error: output: folder {str(missing.parent)!r} does not exist; expected a "
                            f"file in an existing folder\n"
                            f"boresize: error: output: cannot tell what to write to {str(unknown)!r} from its "
                            f"extension; expected a file ending in .json, .jsonl, .csv, .xlsx, .html, .pdf\n")
    assert not good.exists()


def test_one_output_failing_does_not_stop_the_others(tmp_path: Path, capsys: pytest.CaptureFixture[str],
                                                     monkeypatch: pytest.MonkeyPatch) -> None:
    from boresize.cli.main import main

    def full_disk(path: Path, run: Run) -> None:
        raise OSError(errno.ENOSPC, "No space left on device")

    monkeypatch.setitem(output.WRITERS, ".xlsx", full_disk)
    book, table, document = tmp_path / "out.xlsx", tmp_path / "out.csv", tmp_path / "out.json"
    book.write_bytes(b"earlier")
    code = main(["size", str(LINES), "--criteria", str(CRITERIA), "--no-plugins",
                 "-o", str(table), "-o", str(book), "-o", str(document)])
    captured = capsys.readouterr()
    assert code == 2 and "140-P-001" in captured.out  # the table is still printed
    assert captured.err == (f"boresize: wrote {table}\n"
                            f"boresize: error: output: cannot write {str(book)!r}: No space left on device; "
                            f"expected a file this user may write\n"
                            f"boresize: wrote {document}\n")
    assert book.read_bytes() == b"earlier" and table.stat().st_size > 100 and document.stat().st_size > 100
    assert _leftovers(tmp_path) == []


def _big_line_list(path: Path, count: int) -> Path:
    """``count`` water lines, flows, pressures, temperatures and lengths varied so that no two are alike."""
    rows = ["tag,fluid,flow,pressure,temperature,length [m]"]
    rows += [f"BIG-{i:05d},water,{10 + i % 90} t/h,{2 + i % 8} barg,{20 + i % 50} degC,{50 + i % 200}"
             for i in range(count)]
    path.write_text("\n".join(rows) + "\n", encoding="utf-8")
    return path


@pytest.mark.parametrize("suffix", [".csv", ".xlsx"])
def test_a_run_killed_while_writing_leaves_the_earlier_file_intact(reference: Run, tmp_path: Path,
                                                                  suffix: str) -> None:
    """SIGKILL once the temporary file appears: the target is the earlier file byte for byte. A killed
    process cannot remove its temporary file, so at most that one ``.boresize-tmp`` file remains."""
    target = reference.write(tmp_path / f"same{suffix}")
    earlier = target.read_bytes()
    big = _big_line_list(tmp_path / "big.csv", 3000)  # writing 3,000 rows takes a few tenths of a second or more
    env = {**os.environ, "PYTHONPATH": os.pathsep.join(filter(None, [str(SRC), os.environ.get("PYTHONPATH")]))}
    process = subprocess.Popen([sys.executable, "-m", "boresize", "size", str(big), "--no-plugins",
                                "-o", str(target)], stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, env=env)
    deadline = time.monotonic() + 60
    caught = False
    try:
        while time.monotonic() < deadline and process.poll() is None:
            if _leftovers(tmp_path):
                os.kill(process.pid, signal.SIGKILL)
                caught = True
                break
            time.sleep(0.001)
    finally:
        if process.poll() is None and not caught:
            process.kill()
        _, err = process.communicate(timeout=60)
    assert caught, f"the run ended before its temporary file was seen: {err.decode()!r}"
    assert process.returncode == -signal.SIGKILL
    assert target.read_bytes() == earlier
    left = _leftovers(tmp_path)
    assert len(left) == 1 and left[0].startswith(f".same{suffix}.boresize-tmp-") and left[0].endswith(suffix)


@pytest.mark.parametrize("bad", [5, None, b"results.csv", ["results.csv"], 1.5])
def test_an_output_that_is_not_a_path_is_an_input_error_naming_it(reference: Run, tmp_path: Path, bad: object) -> None:
    """Run.write and run_lines(stream=...) refuse a value that is not text or a Path with the field and the value,
    not a TypeError from deep inside the path handling."""
    for attempt in (lambda: reference.write(bad),  # type: ignore[arg-type]
                    lambda: run_lines(LINES, CRITERIA, plugins=False, keep="selected", stream=[bad])):  # type: ignore[list-item]
        with pytest.raises(InputError) as caught:
            attempt()
        assert caught.value.field == "output" and repr(bad) in str(caught.value) and "file path" in str(caught.value)
    assert not list(tmp_path.iterdir())
