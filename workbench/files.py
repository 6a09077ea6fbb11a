"""File writing at the edges: atomic replacement so a failed write never destroys a saved file."""

from __future__ import annotations

import os
import tempfile
from pathlib import Path

__all__ = ["write_text_atomic"]


def write_text_atomic(path: str | os.PathLike[str], text: str) -> None:
    """Write UTF-8 ``text`` to ``path`` through a temporary file in the same folder, then replace.

    The previous content stays intact if anything fails before the final
    ``os.replace``; the temporary file is removed in that case.
    """
    target = Path(path)
    fd, tmp = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".tmp", dir=str(target.parent or "."))
    try:
        with os.fdopen(fd, "w", encoding="utf-8") as handle:
            handle.write(text)
            handle.flush()
            os.fsync(handle.fileno())
        os.replace(tmp, target)
    except BaseException:
        if os.path.exists(tmp):
            os.unlink(tmp)
        raise
