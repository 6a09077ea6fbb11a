"""Preparing and opening the workbench for ``stereosieve lab`` and ``stereosieve app`` (file edge; no widget imports).

:func:`prepare_lab` puts the project file and a workbench notebook side by
side in one folder: a missing project defaults to a copy of the invented demo
project, and an existing notebook or project is never overwritten (the
chemist's work in it is kept). :func:`launch_lab` starts JupyterLab on the
notebook; :func:`launch_app` serves the panels alone (no code) as a Voila
page from a one-cell notebook in a temporary folder. These two are the only
functions here that start a process.
"""

from __future__ import annotations

import json
import logging
import os
import shutil
import signal
import subprocess
import sys
import tempfile
import threading
from collections.abc import Sequence
from dataclasses import dataclass
from pathlib import Path

from workbench.data import DEMO_PROJECT, NOTEBOOK_TEMPLATE, data_path
from workbench.errors import WorkbenchError
from workbench.evidence.project import load_project
from workbench.files import write_text_atomic

__all__ = [
    "LabError",
    "LabFiles",
    "DEMO_COPY",
    "PLACEHOLDER",
    "app_notebook_text",
    "lab_command",
    "app_command",
    "prepare_lab",
    "prepare_project",
    "launch_lab",
    "launch_app",
    "run_server",
    "notebook_for",
    "SAVE_HOOK",
]

log = logging.getLogger(__name__)

SAVE_HOOK = "workbench.saved_views.pre_save_hook"
"""The Jupyter server hook (import string) that slims each notebook as JupyterLab saves it."""

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


def _notebook_text(project_name: str) -> str:
    """The template with the project's file name filled in."""
    template = json.loads(data_path(NOTEBOOK_TEMPLATE).read_text(encoding="utf-8"))
    for cell in template["cells"]:
        if cell["cell_type"] != "code":
            continue
        source = "".join(cell["source"]) if isinstance(cell["source"], list) else cell["source"]
        cell["source"] = source.replace(PLACEHOLDER, project_name.replace("\\", "\\\\").replace('"', '\\"'))
    return json.dumps(template, indent=1, ensure_ascii=False) + "\n"


def prepare_project(
    project: str | os.PathLike[str] | None = None, directory: str | os.PathLike[str] = "."
) -> tuple[Path, tuple[Path, ...]]:
    """The validated project file to open, and the files this call created.

    With no ``project``, the demo project is copied to ``directory`` as
    :data:`DEMO_COPY` (an existing copy is reused). A bad file raises
    :class:`~workbench.errors.ProjectError`.
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
    return target, tuple(created)


def prepare_lab(project: str | os.PathLike[str] | None = None, directory: str | os.PathLike[str] = ".") -> LabFiles:
    """Make sure a project file and its workbench notebook exist side by side; return their paths.

    The project comes from :func:`prepare_project`; an existing notebook is
    kept as it is.
    """
    target, made = prepare_project(project, directory)
    created = list(made)
    notebook = notebook_for(target)
    if not notebook.exists():
        write_text_atomic(notebook, _notebook_text(target.name))
        created.append(notebook)
        log.info("wrote the workbench notebook %s", notebook)
    return LabFiles(target, notebook, tuple(created))


def run_server(command: Sequence[str], cwd: Path, env: dict[str, str] | None = None) -> int:
    """Run a server process until it stops; returns its exit code.

    A SIGTERM to this process (or Ctrl-C) stops the server too, so no server
    outlives the command and temporary folders are removed on the way out.
    """
    process = subprocess.Popen(list(command), cwd=str(cwd), env=env)

    def _stop(signum: int, _frame: object) -> None:
        raise SystemExit(128 + signum)

    previous = signal.signal(signal.SIGTERM, _stop) if threading.current_thread() is threading.main_thread() else None
    try:
        return process.wait()
    except KeyboardInterrupt:  # Ctrl-C: the user stopped the server; not a failure
        return 0
    finally:
        if process.poll() is None:
            process.terminate()
            try:
                process.wait(timeout=15)
            except subprocess.TimeoutExpired:
                process.kill()
                process.wait()
        if previous is not None:
            signal.signal(signal.SIGTERM, previous)


def _is_root() -> bool:
    """True when running as root (JupyterLab then needs ``--allow-root``, e.g. in a container)."""
    return hasattr(os, "geteuid") and os.geteuid() == 0


def lab_command(notebook: Path, browser: bool = True, port: int | None = None, extra: Sequence[str] = ()) -> list[str]:
    """The JupyterLab command line for ``notebook``; ``extra`` options go last, as given.

    Notebooks are slimmed as they are saved (:func:`workbench.saved_views.pre_save_hook`: the 3D viewer
    library, which a saved view cannot run, is left out of the file).
    """
    command = [sys.executable, "-m", "jupyterlab", notebook.name, f"--ContentsManager.pre_save_hook={SAVE_HOOK}"]
    if not browser:
        command.append("--no-browser")
    if port is not None:
        command.append(f"--port={port}")
    if _is_root() and "--allow-root" not in extra:
        command.append("--allow-root")
    return command + list(extra)


def launch_lab(notebook: Path, browser: bool = True, port: int | None = None, extra: Sequence[str] = ()) -> int:
    """Start JupyterLab on ``notebook`` (blocks until JupyterLab stops); returns its exit code."""
    command = lab_command(notebook, browser, port, extra)
    log.info("starting %s in %s", " ".join(command), notebook.parent)
    return run_server(command, notebook.parent.resolve())


def app_notebook_text(project: Path) -> str:
    """A one-cell notebook that shows the workbench panels on ``project`` (an absolute path), nothing else."""
    path = str(project.resolve())
    source = (
        "from workbench.ui import Workbench\n\n"
        f"Workbench.open({path!r}).widget  # the panels only; Voila hides this code\n"
    )
    notebook = {
        "cells": [
            {
                "cell_type": "code",
                "id": "panels",
                "execution_count": None,
                "metadata": {},
                "outputs": [],
                "source": source,
            }
        ],
        "metadata": {
            "kernelspec": {"display_name": "Python 3", "language": "python", "name": "python3"},
            "language_info": {"name": "python"},
        },
        "nbformat": 4,
        "nbformat_minor": 5,
    }
    return json.dumps(notebook, indent=1, ensure_ascii=False) + "\n"


# The page template shipped in workbench/data/voila/templates: Voila's "lab" page without its links to a CDN.
APP_TEMPLATE = "stereosieve-offline"


def app_environment() -> dict[str, str]:
    """The environment of the page server: the package's data folder first on the Jupyter data path,
    where Voila finds :data:`APP_TEMPLATE`."""
    data = str(Path(__file__).resolve().parent.parent / "data")
    env = dict(os.environ)
    env["JUPYTER_PATH"] = os.pathsep.join(p for p in (data, env.get("JUPYTER_PATH", "")) if p)
    return env


def app_command(notebook: Path, browser: bool = True, port: int | None = None, extra: Sequence[str] = ()) -> list[str]:
    """The Voila command line that serves ``notebook`` as a page without code (and without any CDN)."""
    command = [sys.executable, "-m", "voila", str(notebook), "--strip_sources=True", f"--template={APP_TEMPLATE}"]
    if not browser:
        command.append("--no-browser")
    if port is not None:
        command.append(f"--port={port}")
    return command + list(extra)


def launch_app(project: Path, browser: bool = True, port: int | None = None, extra: Sequence[str] = ()) -> int:
    """Serve the panels on ``project`` as a standalone page (blocks until Voila stops); returns its exit code.

    The page's notebook lives in a temporary folder removed afterwards;
    saving in the page writes ``project``.
    """
    with tempfile.TemporaryDirectory(prefix="stereosieve-app-") as folder:
        notebook = Path(folder) / "stereosieve.ipynb"
        write_text_atomic(notebook, app_notebook_text(project))
        command = app_command(notebook, browser, port, extra)
        log.info("starting %s", " ".join(command))
        return run_server(command, project.resolve().parent, env=app_environment())
