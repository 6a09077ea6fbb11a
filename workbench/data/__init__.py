"""Files shipped with stereosieve: the invented demo project and the workbench notebook template."""

from __future__ import annotations

from importlib import resources
from pathlib import Path

__all__ = ["DEMO_PROJECT", "NOTEBOOK_TEMPLATE", "data_path"]

DEMO_PROJECT = "demo_project.json"
NOTEBOOK_TEMPLATE = "workbench.ipynb"


def data_path(name: str) -> Path:
    """Filesystem path of a packaged data file such as :data:`DEMO_PROJECT`."""
    target = resources.files(__name__).joinpath(name)
    if not target.is_file():
        raise FileNotFoundError(f"stereosieve data file {name!r} is missing from the installation")
    return Path(str(target))
