"""Saved notebooks and pages without the inlined 3D viewer library; the 3D views carry it once per session."""

from __future__ import annotations

import copy
import json
import subprocess
import sys
from pathlib import Path

import pytest

from workbench.data import viewer_library
from workbench.display.molview import NOT_STARTED, Mark, Scene, loader_html, viewer_html
from workbench.saved_views import LEFT_OUT, slim_file, slim_notebook, slim_text
from workbench.ui.notebook import SAVE_HOOK, lab_command

ROOT = Path(__file__).resolve().parent.parent
SCRIPT = ROOT / "scripts" / "slim_saved_views.py"
SCENE = Scene("a caption", "molblock text", (Mark("O1 ax", 0.0, 1.0, 2.0, "#c4622d"),))
WIDGET_STATE = "application/vnd.jupyter.widget-state+json"
WIDGET_VIEW = "application/vnd.jupyter.widget-view+json"


def _library_copies(text: str) -> int:
    return text.count("var exports, module, define;")  # written once per inlined copy by library_script


def _view(uid: str, library: str | None) -> str:
    return viewer_html([SCENE], library, uid=uid)


def _notebook(library: str) -> dict:
    """A saved notebook as JupyterLab writes it: a box shown in a cell holding an Output widget with a view,
    a layout model, a button; one view in a cell output; one model that no view shows any more."""
    output = {"output_type": "display_data", "data": {"text/html": _view("a", library), "text/plain": "3D"}}
    inner = {"output_type": "display_data", "data": {WIDGET_VIEW: {"model_id": "btn", "version_major": 2}}}
    layout = {"width": "300px", "height": None, "border_top": None, "_view_count": None}
    models = {
        "box": {"model_name": "VBoxModel", "state": {"children": ["IPY_MODEL_out"], "layout": "IPY_MODEL_lay"}},
        "out": {"model_name": "OutputModel", "state": {"outputs": [output, inner]}},
        "lay": {"model_name": "LayoutModel", "model_module": "@jupyter-widgets/base", "state": layout},
        "btn": {"model_name": "ButtonModel", "model_module": "@jupyter-widgets/controls", "state": {"tooltip": None}},
        "old": {"model_name": "HTMLModel", "state": {"value": "a panel row replaced long ago"}},
    }
    cell_output = copy.deepcopy(output)
    cell_output["data"]["text/html"] = _view("b", library).splitlines(keepends=True)  # stored as a list of lines
    shown = {"output_type": "display_data", "data": {WIDGET_VIEW: {"model_id": "box"}, "text/plain": "box"}}
    return {
        "cells": [{"cell_type": "code", "id": "c1", "source": "", "metadata": {}, "outputs": [cell_output, shown]}],
        "metadata": {"widgets": {WIDGET_STATE: {"state": models, "version_major": 2, "version_minor": 0}}},
        "nbformat": 4,
        "nbformat_minor": 5,
    }


def test_views_without_the_library_wait_for_the_page_copy():
    html = _view("w1", None)
    assert _library_copies(html) == 0 and "setTimeout(draw, 100)" in html  # waits, then says why it failed
    assert "NOT_STARTED" not in html and NOT_STARTED.replace("'", "&#x27;") in html  # words without a script
    assert "the 3Dmol.js library did not load" in html
    loader = loader_html("window.$3Dmol = {};")
    assert "window.$3Dmol = {};" in loader and 'class="ss-3d-loader"' in loader


def test_slim_text_removes_every_inlined_copy_of_the_real_library_and_keeps_the_views():
    library = viewer_library()
    page = _view("p1", library) + loader_html(library) + _view("p2", None)
    assert _library_copies(page) == 2
    slim, n = slim_text(page)
    assert n == 2 and _library_copies(slim) == 0 and slim.count(LEFT_OUT) == 2
    assert len(slim) < len(page) - 2 * len(library) + 2_000  # the library text itself is gone
    assert slim.count("ss3d-p1-0") == 1 and slim.count("setTimeout(draw, 100)") == 2  # views and scripts kept
    assert slim_text(slim) == (slim, 0)  # idempotent


def test_slim_text_finds_the_library_in_a_json_escaped_page_too():
    page = json.dumps({"html": _view("j", "window.$3Dmol = {};")}).replace("</", "<\\/")  # as an HTML export
    slim, n = slim_text(page)
    assert n == 1 and "window.$3Dmol = {};" not in slim and json.loads(slim.replace("<\\/", "</"))


def test_slim_notebook_empties_outputs_and_keeps_only_what_a_view_shows():
    notebook = _notebook("window.$3Dmol = {};")
    # one copy in the cell, one in the Output widget; three unset layout values; one model no view shows
    assert slim_notebook(notebook) == (2, 3, 1)
    models = notebook["metadata"]["widgets"][WIDGET_STATE]["state"]
    assert sorted(models) == ["box", "btn", "lay", "out"]  # children, layout and a view inside an output kept
    assert models["lay"]["state"] == {"width": "300px"}  # the layout default is unset for every attribute
    assert models["btn"]["state"] == {"tooltip": None}  # other models keep their values
    assert "window.$3Dmol = {};" not in json.dumps(notebook)
    assert slim_notebook(notebook) == (0, 0, 0)


def test_slim_file_rewrites_once_and_reports_sizes(tmp_path):
    path = tmp_path / "n.ipynb"
    path.write_text(json.dumps(_notebook(viewer_library()), indent=1), encoding="utf-8")
    done = slim_file(path)
    assert done.copies == 2 and done.orphans == 1 and done.after < done.before - 2 * 500_000
    assert done.after == path.stat().st_size
    text = path.read_text(encoding="utf-8")
    again = slim_file(path)
    assert (again.copies, again.nulls, again.orphans, again.before, again.after) == (0, 0, 0, done.after, done.after)
    assert path.read_text(encoding="utf-8") == text
    page = tmp_path / "n.html"
    page.write_text(f"<html><body>{_view('h', viewer_library())}</body></html>", encoding="utf-8")
    assert slim_file(page).copies == 1 and _library_copies(page.read_text(encoding="utf-8")) == 0


def test_the_script_slims_a_folder_and_refuses_a_broken_notebook_with_exit_2(tmp_path):
    (tmp_path / "a.ipynb").write_text(json.dumps(_notebook("window.$3Dmol = {};")), encoding="utf-8")
    run = subprocess.run([sys.executable, str(SCRIPT), str(tmp_path)], capture_output=True, text=True)
    assert run.returncode == 0 and "a.ipynb" in run.stdout and "2 library copies" in run.stdout
    (tmp_path / "broken.ipynb").write_text("{not json", encoding="utf-8")
    run = subprocess.run([sys.executable, str(SCRIPT), str(tmp_path / "broken.ipynb")], capture_output=True, text=True)
    assert run.returncode == 2 and "broken.ipynb: not a notebook" in run.stderr and "Traceback" not in run.stderr


def test_jupyter_saves_through_the_hook_without_the_library(tmp_path):
    manager_module = pytest.importorskip("jupyter_server.services.contents.filemanager")
    manager = manager_module.FileContentsManager(root_dir=str(tmp_path), pre_save_hook=SAVE_HOOK)  # as lab runs
    manager.save({"type": "notebook", "format": "json", "content": _notebook(viewer_library())}, "saved.ipynb")
    text = (tmp_path / "saved.ipynb").read_text(encoding="utf-8")
    assert _library_copies(text) == 0 and LEFT_OUT in text and "ss3d-a-0" in text
    assert f"--ContentsManager.pre_save_hook={SAVE_HOOK}" in lab_command(tmp_path / "saved.ipynb")


def test_the_shipped_notebooks_carry_no_copy_of_the_library():
    for path in sorted((ROOT / "notebooks").glob("*.ipynb")):
        assert _library_copies(path.read_text(encoding="utf-8")) == 0, f"{path.name}: run scripts/slim_saved_views.py"
