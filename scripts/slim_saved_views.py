"""Leave the inlined 3D viewer library out of saved notebooks and HTML pages (idempotent).

Usage: ``python scripts/slim_saved_views.py [FILE_OR_FOLDER ...]`` (default:
the repository's ``notebooks`` folder). Every ``.ipynb`` and ``.html`` file
named or found (not recursing into hidden folders) is slimmed in place by
:func:`workbench.saved_views.slim_file`; one line per file gives its size
before and after (bytes) and what was removed. A second run changes nothing.
Exit 2, with the file named, if a file cannot be read or is not a notebook.
"""

from __future__ import annotations

import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from workbench.saved_views import slim_file  # noqa: E402 (after the path set-up)


def _files(args: list[str]) -> list[Path]:
    found: list[Path] = []
    for arg in args or [str(ROOT / "notebooks")]:
        path = Path(arg)
        if path.is_dir():
            found += sorted(
                p
                for p in path.rglob("*")
                if p.suffix in (".ipynb", ".html") and not any(part.startswith(".") for part in p.parts)
            )
        elif path.is_file():
            found.append(path)
        else:
            raise ValueError(f"{path}: no such file or folder")
    return found


def main(argv: list[str]) -> int:
    try:
        for path in _files(argv):
            done = slim_file(path)
            print(
                f"{path}: {done.before:,} -> {done.after:,} bytes "
                f"({done.copies} library copies, {done.orphans} unshown widget models, "
                f"{done.nulls} unset layout values removed)"
            )
    except (ValueError, OSError, UnicodeDecodeError) as err:
        print(f"slim_saved_views: {err}", file=sys.stderr)
        return 2
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
