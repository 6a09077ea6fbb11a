"""File writing at the edges: atomic replacement, the user's umask, symlinks followed, outputs checked.

:func:`write_text_atomic` writes a temporary file beside the target and then
replaces the target, so a failed write never destroys a saved file. The new
file gets the permissions a plain ``open(path, "w")`` would give (the
existing file's mode when it is replaced, else 0666 less the umask), a path
that is a symlink has its *target* written (the link stays), and temporary
files left behind by a killed process are removed on the next write.
:func:`check_output` refuses outputs that would destroy input or cannot
hold a file (a folder, a device, the input project itself).
"""

from __future__ import annotations

import glob
import logging
import os
import re
import stat
import tempfile
import time
from collections.abc import Iterable
from pathlib import Path

from workbench.errors import WorkbenchError

__all__ = ["OutputError", "check_output", "current_umask", "write_text_atomic", "TEMP_MARK", "ORPHAN_AGE_S"]

log = logging.getLogger(__name__)

TEMP_MARK = ".stereosieve-"
"""Part of every temporary file name: ``.<target name>.stereosieve-<random>.tmp``."""

ORPHAN_AGE_S = 600.0
"""A temporary file older than this many seconds belongs to no running write and is removed."""


class OutputError(WorkbenchError, ValueError):
    """An output path that cannot or must not be written; the message names the path and the fix."""


def current_umask() -> int:
    """The process umask (read from /proc where it exists, so no other thread sees it changed)."""
    try:
        with open("/proc/self/status", encoding="ascii") as status:
            for line in status:
                if line.startswith("Umask:"):
                    return int(line.split()[1], 8)
    except (OSError, ValueError, IndexError):
        pass
    mask = os.umask(0o022)
    os.umask(mask)
    return mask


def _resolved(path: Path) -> Path:
    """The file a write to ``path`` should change: the end of a symlink chain, else ``path`` itself."""
    if path.is_symlink():
        return Path(os.path.realpath(path))
    return path


def check_output(
    path: str | os.PathLike[str],
    protect: Iterable[str | os.PathLike[str]] = (),
    what: str = "output",
    example: str = "output.txt",
) -> Path:
    """The path to write ``what`` to, after refusing what must not be written.

    Raises :class:`OutputError` when ``path`` is a folder, a device, a pipe or
    a socket (anything but a regular file), when its folder does not exist, or
    when it is (or links to) one of the ``protect`` files, such as the project
    the output is made from. ``what`` names the output and ``example`` a file
    name in the messages.
    """
    target = Path(path)
    real = _resolved(target)
    if real.is_dir():
        raise OutputError(f"{target}: is a folder; give a file name such as {target / example}")
    if real.exists() and not stat.S_ISREG(real.stat().st_mode):
        raise OutputError(f"{target}: is a device or special file, not a regular file; choose a file name")
    folder = real.parent if str(real.parent) else Path(".")
    if not folder.is_dir():
        raise OutputError(f"{target}: the folder {folder} does not exist; create it or choose another path")
    if real.exists():
        for other in protect:
            other_path = Path(other)
            if other_path.exists() and os.path.samefile(real, other_path):
                raise OutputError(
                    f"{target}: is the input file {other_path}; refusing to overwrite it with the {what}, "
                    "choose another name"
                )
    return target


def _is_temporary(leftover: Path, name: str) -> bool:
    """True for our temporary files of ``name``: ``.NAME.stereosieve-*.tmp``, or ``.NAME.XXXXXXXX.tmp`` of old versions."""
    middle = leftover.name[len(name) + 2 : -len(".tmp")]
    if leftover.name.startswith(f".{name}{TEMP_MARK}"):
        return True
    return re.fullmatch(r"[a-z0-9_]{8}", middle) is not None  # tempfile's random part, as older versions named them


def _remove_orphans(folder: Path, name: str) -> None:
    """Delete temporary files of ``name`` in ``folder`` older than :data:`ORPHAN_AGE_S` (a killed write)."""
    cutoff = time.time() - ORPHAN_AGE_S
    for leftover in folder.glob(f".{glob.escape(name)}.*.tmp"):
        if not _is_temporary(leftover, name):
            continue
        try:
            if leftover.is_file() and not leftover.is_symlink() and leftover.stat().st_mtime < cutoff:
                leftover.unlink()
                log.info("removed the orphaned temporary file %s", leftover)
        except OSError:  # another process removed or replaced it meanwhile: nothing left to clean
            continue


def write_text_atomic(path: str | os.PathLike[str], text: str) -> Path:
    """Write UTF-8 ``text`` to ``path`` through a temporary file in the same folder, then replace.

    The previous content stays intact if anything fails before the final
    ``os.replace``; the temporary file is removed in that case. A symlink at
    ``path`` is followed (its target is rewritten, the link kept). Returns the
    path of the file actually written.
    """
    target = _resolved(Path(path))
    folder = target.parent if str(target.parent) else Path(".")
    try:
        mode = stat.S_IMODE(target.stat().st_mode)
    except FileNotFoundError:
        mode = 0o666 & ~current_umask()
    _remove_orphans(folder, target.name)
    fd, tmp = tempfile.mkstemp(prefix=f".{target.name}{TEMP_MARK}", suffix=".tmp", dir=str(folder))
    try:
        with os.fdopen(fd, "w", encoding="utf-8") as handle:
            handle.write(text)
            handle.flush()
            os.fchmod(handle.fileno(), mode)
            os.fsync(handle.fileno())
        os.replace(tmp, target)
    except BaseException:
        if os.path.exists(tmp):
            os.unlink(tmp)
        raise
    return target
