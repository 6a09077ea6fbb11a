"""Preparing and opening the workbench notebook for ``stereosieve lab`` (file edge; no widget imports).

:func:`prepare_lab` puts the project file and a workbench notebook side by
side in one folder: a missing project defaults to a copy of the invented demo
project, and an existing notebook or project is never overwritten (the
chemist's work in it is kept). :func:`launch_lab` starts JupyterLab on the
notebook; it is the only function here that starts a process.
"""

from __future__ import annotations

import json
import logging
import os
import shutil
import subprocess
import sys
import tempfile
from dataclasses import dataclass
from pathlib import Path

from workbench.data import DEMO_PROJECT, NOTEBOOK_TEMPLATE, data_path
from workbench.errors import WorkbenchError
from workbench.evidence.project import load_project

__all__ = ["LabError", "LabFiles", "DEMO_COPY", "PLACEHOLDER", "prepare_lab", "launch_lab", "notebook_for"]

log = logging.getLogger(__name__)

DEMO_COPY = "stereosieve_demo.json"
PLACEHOLDER = "__PROJECT__"


class LabError(WorkbenchError, ValueError):
    """The workbench notebook cannot be prepared where asked (the message names the path)."""


@dataclass(frozen=True)
class LabFiles:
    """The project file and the notebook beside it; ``created`` lists what this call wrote."""

    project: Path
    notebook: Path
    created: tuple[Path, ...]


def notebook_for(project: Path) -> Path:
    """The workbench notebook that belongs beside ``project`` (``x.json`` -> ``x.workbench.ipynb``)."""
    return project.with_name(f"{project.stem}.workbench.ipynb")


def _write_atomic(text: str, target: Path) -> None:
    fd, tmp = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".tmp", dir=str(target.parent))
    try:
        with os.fdopen(fd, "w", encoding="utf-8") as handle:
            handle.write(text)
        os.replace(tmp, target)
    except BaseException:
        if os.path.exists(tmp):
            os.unlink(tmp)
        raise


def _notebook_text(project_name: str) -> str:
    """The template with the project's file name filled in."""
    template = json.loads(data_path(NOTEBOOK_TEMPLATE).read_text(encoding="utf-8"))
    for cell in template["cells"]:
        if cell["cell_type"] != "code":
            continue
        source = "".join(cell["source"]) if isinstance(cell["source"], list) else cell["source"]
        cell["source"] = source.replace(PLACEHOLDER, project_name.replace("\\", "\\\\").replace('"', '\\"'))
    return json.dumps(template, indent=1, ensure_ascii=False) + "\n"


def prepare_lab(project: str | os.PathLike[str] | None = None, directory: str | os.PathLike[str] = ".") -> LabFiles:
    """Make sure a project file and its workbench notebook exist side by side; return their paths.

    With no ``project``, the demo project is copied to ``directory`` as
    :data:`DEMO_COPY` (an existing copy is reused). The project is validated
    first (a bad file raises :class:`~workbench.errors.ProjectError`).
    """
    created: list[Path] = []
    if project is None:
        folder = Path(directory)
        if not folder.is_dir():
            raise LabError(f"{folder}: no such folder for the demo project")
        target = folder / DEMO_COPY
        if not target.exists():
            shutil.copyfile(data_path(DEMO_PROJECT), target)
            created.append(target)
            log.info("copied the demo project to %s", target)
    else:
        target = Path(project)
        if target.is_dir():
            raise LabError(f"{target}: is a folder; give a project file such as {target / 'my_sugar.json'}")
    load_project(target)
    notebook = notebook_for(target)
    if not notebook.exists():
        _write_atomic(_notebook_text(target.name), notebook)
        created.append(notebook)
        log.info("wrote the workbench notebook %s", notebook)
    return LabFiles(target, notebook, tuple(created))


def launch_lab(notebook: Path, browser: bool = True) -> int:
    """Start JupyterLab on ``notebook`` (blocks until JupyterLab stops); returns its exit code."""
    command = [sys.executable, "-m", "jupyterlab", notebook.name]
    if not browser:
        command.append("--no-browser")
    log.info("starting %s in %s", " ".join(command), notebook.parent)
    return subprocess.call(command, cwd=str(notebook.parent.resolve()))
