"""Writing files at the edge: umask, symlinks, orphaned temporary files, refused outputs."""

from __future__ import annotations

import os
import stat
import time
from pathlib import Path

import pytest

from workbench.errors import WorkbenchError
from workbench.files import ORPHAN_AGE_S, TEMP_MARK, OutputError, check_output, current_umask, write_text_atomic


@pytest.fixture
def umask():
    """Set a umask for one test and restore the old one afterwards."""
    saved = os.umask(0o022)
    os.umask(saved)

    def set_mask(mask: int) -> None:
        os.umask(mask)

    yield set_mask
    os.umask(saved)


def _mode(path: Path) -> int:
    return stat.S_IMODE(path.stat().st_mode)


@pytest.mark.parametrize("mask, expected", [(0o022, 0o644), (0o002, 0o664), (0o077, 0o600), (0o027, 0o640)])
def test_a_new_file_follows_the_umask(tmp_path, umask, mask, expected):
    # POSIX open(2): a new file gets 0666 less the umask (common practice)
    umask(mask)
    assert current_umask() == mask
    target = tmp_path / "out.txt"
    write_text_atomic(target, "x")
    assert _mode(target) == expected
    plain = tmp_path / "plain.txt"
    plain.write_text("x")  # what any other program writing a new file would get
    assert _mode(target) == _mode(plain)


def test_replacing_a_file_keeps_its_mode(tmp_path, umask):
    umask(0o022)
    target = tmp_path / "shared.json"
    target.write_text("old")
    target.chmod(0o664)
    write_text_atomic(target, "new")
    assert target.read_text() == "new" and _mode(target) == 0o664


def test_saving_through_a_symlink_writes_the_target_and_keeps_the_link(tmp_path):
    real = tmp_path / "store" / "project.json"
    real.parent.mkdir()
    real.write_text("old")
    link = tmp_path / "project.json"
    link.symlink_to(real)
    written = write_text_atomic(link, "new")
    assert link.is_symlink() and os.readlink(link) == str(real)
    assert real.read_text() == "new" and written == real
    assert not list(tmp_path.glob(f"*{TEMP_MARK}*")) and not list(real.parent.glob(f"*{TEMP_MARK}*"))


def test_orphaned_temporary_files_are_removed_and_fresh_ones_kept(tmp_path):
    target = tmp_path / "report.html"
    stale = tmp_path / f".report.html{TEMP_MARK}abc123.tmp"
    fresh = tmp_path / f".report.html{TEMP_MARK}def456.tmp"  # another write in progress right now
    other = tmp_path / f".other.html{TEMP_MARK}abc123.tmp"  # belongs to another file
    older_style = tmp_path / ".report.html.k3j_9xq2.tmp"  # left by a version without the mark
    users = tmp_path / ".report.html.my notes.tmp"  # not ours: never touched
    for leftover in (stale, fresh, other, older_style, users):
        leftover.write_text("half a file")
    old = time.time() - ORPHAN_AGE_S - 60
    for leftover in (stale, other, older_style, users):
        os.utime(leftover, (old, old))
    write_text_atomic(target, "done")
    assert target.read_text() == "done"
    assert not stale.exists() and not older_style.exists()
    assert fresh.exists() and other.exists() and users.exists()


def test_a_failed_write_leaves_no_temporary_file(tmp_path, monkeypatch):
    target = tmp_path / "p.json"
    target.write_text("kept")

    def fail(*_args):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(os, "replace", fail)
    with pytest.raises(OSError):
        write_text_atomic(target, "lost")
    assert target.read_text() == "kept" and [p.name for p in tmp_path.iterdir()] == ["p.json"]


def test_check_output_refuses_folders_devices_and_inputs(tmp_path):
    with pytest.raises(OutputError, match="is a folder"):
        check_output(tmp_path, example="x.csv")
    with pytest.raises(OutputError, match="device or special file"):
        check_output("/dev/null")
    with pytest.raises(OutputError, match="does not exist"):
        check_output(tmp_path / "missing" / "out.csv")
    project = tmp_path / "p.json"
    project.write_text("{}")
    with pytest.raises(OutputError, match="is the input file"):
        check_output(project, protect=(project,))
    alias = tmp_path / "alias.json"
    alias.symlink_to(project)
    with pytest.raises(OutputError, match="is the input file"):
        check_output(alias, protect=(project,))
    fifo = tmp_path / "pipe"
    os.mkfifo(fifo)
    with pytest.raises(OutputError, match="special file"):
        check_output(fifo)
    assert check_output(tmp_path / "new.csv", protect=(project,)) == tmp_path / "new.csv"
    assert issubclass(OutputError, WorkbenchError) and issubclass(OutputError, ValueError)
