"""Files shipped with stereosieve: the invented demo project, the workbench notebook template, the 3D viewer.

``js/3Dmol-min.js`` is 3Dmol.js 2.5.5 (BSD-3-Clause, licence in
``js/3Dmol-LICENSE.txt``), taken unchanged from the npm package ``3dmol``; the
3D chairs inline it so that they never load anything from the network.
"""

from __future__ import annotations

from functools import cache
from importlib import resources
from pathlib import Path

__all__ = ["DEMO_PROJECT", "NOTEBOOK_TEMPLATE", "VIEWER_LIBRARY", "data_path", "viewer_library"]

DEMO_PROJECT = "demo_project.json"
NOTEBOOK_TEMPLATE = "workbench.ipynb"
VIEWER_LIBRARY = "js/3Dmol-min.js"


def data_path(name: str) -> Path:
    """Filesystem path of a packaged data file such as :data:`DEMO_PROJECT`."""
    target = resources.files(__name__).joinpath(name)
    if not target.is_file():
        raise FileNotFoundError(f"stereosieve data file {name!r} is missing from the installation")
    return Path(str(target))


@cache
def viewer_library() -> str:
    """The text of the shipped 3D viewer library (3Dmol.js), read once."""
    return data_path(VIEWER_LIBRARY).read_text(encoding="utf-8")
