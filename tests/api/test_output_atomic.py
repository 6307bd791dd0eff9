"""Outputs are written whole or not at all: a temporary file beside the target, renamed over it when
complete. A failing writer, a Ctrl-C and a SIGKILL while writing all leave the earlier file intact.

The line list is the demo unit's (examples/demo-unit/lines.csv); the large one is the same rows repeated
under new tags, so that writing it takes long enough to be caught in the act.
"""

from __future__ import annotations

import errno
import os
import stat
from pathlib import Path

import pytest

from boresize import InputError
from boresize.api import Run, output, run_lines

DEMO = Path(__file__).resolve().parents[2] / "examples" / "demo-unit"
LINES, CRITERIA = DEMO / "lines.csv", DEMO / "criteria.toml"


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
