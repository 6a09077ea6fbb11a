"""The workbench in JupyterLab in a real (headless) browser: run, record, what-if, 3D offline, saved views untrusted.

What a person sees is checked on the rendered page; screenshots are written to
``$STEREOSIEVE_SHOTS/stereosieve-browser-shots`` (a temporary folder by default).
"""

from __future__ import annotations

import json
import os
import shutil
import signal
import subprocess
import sys
import time
import urllib.request
from pathlib import Path

import pytest
from lab_helpers import ROOT, free_port, shot

from workbench.data import DEMO_PROJECT, data_path
from workbench.ui.notebook import prepare_lab

pytestmark = pytest.mark.browser

_REPRS = ("VBox(children", "IPython.core.display", "py3Dmol.view", "HBox(children")


def _four_left_project(folder: Path) -> Path:
    """The invented demo project with its first four observations: D-/L-allose and D-/L-galactose remain."""
    data = json.loads(data_path(DEMO_PROJECT).read_text(encoding="utf-8"))
    data["observations"] = data["observations"][:4]
    target = folder / "four_left.json"
    target.write_text(json.dumps(data, indent=1), encoding="utf-8")
    return target


def _accept_kernel(page) -> None:
    """Answer JupyterLab's "Select Kernel" question (a fresh server asks it for a new notebook) with Python 3."""
    dialog = page.locator(".jp-Dialog", has_text="Select Kernel")
    try:
        dialog.wait_for(state="visible", timeout=5_000)
    except Exception:  # no question asked
        return
    dialog.locator("button", has_text="Select").first.click()
    dialog.wait_for(state="hidden")


def _open_and_run(page, lab: str, notebook: str) -> None:
    page.goto(f"{lab}/lab/tree/{notebook}")
    page.wait_for_selector(".jp-Notebook .jp-Cell", state="visible")
    page.wait_for_selector(".jp-Notebook-ExecutionIndicator[data-status='idle']", timeout=90_000)
    _accept_kernel(page)
    for _attempt in range(3):
        _accept_kernel(page)
        page.locator(".lm-MenuBar-itemLabel", has_text="Run").first.click()
        page.locator(".lm-Menu-itemLabel", has_text="Run All Cells").first.click()
        try:
            page.wait_for_selector(".ss-live .ss-board-panel", state="visible", timeout=90_000)
            return
        except Exception:  # the kernel was not ready for the first request: ask again
            shot(page, "run-all-waiting")
    raise AssertionError("the workbench did not appear after Run All Cells")


def _header(page) -> str:
    return page.locator(".ss-live").first.inner_text()


@pytest.fixture()
def workbench_notebook(lab_root):
    project = _four_left_project(lab_root)
    files = prepare_lab(project, lab_root)
    return files.notebook.name


def test_run_all_record_an_observation_and_the_board_shrinks(lab, browser_page, workbench_notebook):
    page = browser_page
    _open_and_run(page, lab, workbench_notebook)
    page.wait_for_function("document.querySelector('.ss-live').innerText.includes('S1: 4 left')")
    # side by side at 1,400 px with the file browser open: the candidates stand beside the form, not below it
    form = page.locator(".ss-form").first.bounding_box()
    tabs = page.locator(".ss-live .widget-tab").first.bounding_box()
    assert tabs["x"] > form["x"] + form["width"] - 20 and abs(tabs["y"] - form["y"]) < 120
    page.locator(".ss-form select").first.select_option(
        label="D/L series: configuration at the highest-numbered stereocentre"
    )
    series_d = page.locator(".ss-form").first.get_by_role("button", name="D", exact=True)
    series_d.wait_for(state="visible")  # the form has rebuilt its fields for the new kind
    series_d.click()
    page.locator(".ss-form button", has_text="Record").first.click()
    page.wait_for_function("document.querySelector('.ss-live').innerText.includes('S1: 2 left')", timeout=60_000)
    # the chosen toggle button stands out: filled with the accent colour
    chosen = page.locator(".ss-plan-panel button.widget-toggle-button.mod-active").first  # ranking rule, stable
    assert chosen.evaluate("b => getComputedStyle(b).backgroundColor") == "rgb(47, 111, 98)"
    shot(page, "workbench-recorded")
    assert "S1 (2)" in page.locator(".ss-board-panel .lm-TabBar-tab").first.inner_text()
    # the survivor list of the chairs panel followed the change without a console error
    bad = [e for e in page.console_errors if "Select" in e or "index" in e.lower() or "options" in e.lower()]
    assert bad == []
    assert page.offsite == []


def test_a_what_if_switch_in_the_ledger(lab, browser_page, workbench_notebook):
    page = browser_page
    _open_and_run(page, lab, workbench_notebook)
    page.wait_for_function("document.querySelector('.ss-live').innerText.includes('S1: 4 left')")
    page.locator(".ss-ledger-panel input[type=checkbox]").nth(3).uncheck()  # E4, the meso aldaric acid
    page.wait_for_function("document.querySelector('.ss-live').innerText.includes('what-if: E4 off')")
    assert "S1: 16 left" in _header(page)  # all D- and L-aldohexoses again
    shot(page, "workbench-what-if")


def test_a_survivor_in_3d_with_no_network(lab, browser_page, workbench_notebook):
    page = browser_page
    _open_and_run(page, lab, workbench_notebook)
    page.locator(".ss-live .lm-TabBar-tab", has_text="Chairs in 3D").first.click()
    page.locator(".ss-chairs-panel button", has_text="Show in 3D").first.click()
    page.wait_for_selector(".ss-3d[data-state='ready'], .ss-3d[data-state='failed']", timeout=180_000)
    state = page.locator(".ss-3d").first.get_attribute("data-state")
    page.locator(".ss-3d").first.scroll_into_view_if_needed()
    shot(page, "workbench-3d")
    assert state == "ready", page.locator(".ss-3d-note").first.inner_text()
    assert page.locator(".ss-3d canvas").count() >= 1
    assert page.offsite == []  # nothing fetched from a CDN or anywhere else
    assert "py3Dmol.view" not in page.locator(".ss-chairs-panel").first.inner_text()


def test_3d_views_share_the_page_library_and_the_saved_notebook_leaves_it_out(
    lab, lab_root, browser_page, workbench_notebook
):
    page = browser_page
    _open_and_run(page, lab, workbench_notebook)
    page.locator(".ss-live .lm-TabBar-tab", has_text="Chairs in 3D").first.click()
    panel = page.locator(".ss-chairs-panel").first
    panel.locator("button", has_text="Show in 3D").first.click()
    page.wait_for_selector(".ss-3d[data-state='ready']", timeout=180_000)
    first = page.locator(".ss-3d").first.get_attribute("id")
    panel.locator("select").nth(1).select_option(label="α-pyranose")  # another ring form, drawn anew
    panel.locator("button", has_text="Show in 3D").first.click()
    page.wait_for_function(
        f"(() => {{ const v = document.querySelector('.ss-3d'); return v && v.id !== {first!r} "
        "&& v.getAttribute('data-state') === 'ready'; })()",
        timeout=180_000,
    )
    assert page.locator(".ss-3d-loader").count() >= 1  # the library came once, through the session's loader
    page.locator(".ss-3d").first.scroll_into_view_if_needed()
    shot(page, "workbench-3d-again")
    saved = lab_root / workbench_notebook
    before = saved.stat().st_mtime_ns
    for _attempt in range(3):  # File > Save Notebook (asked again if the menu missed the click)
        page.locator(".lm-MenuBar-itemLabel", has_text="File").first.click()
        item = page.locator(".lm-Menu-itemLabel", has_text="Save Notebook").first
        item.wait_for(state="visible")
        item.click()
        deadline = time.monotonic() + 30
        while time.monotonic() < deadline and (
            saved.stat().st_mtime_ns == before or "ss3d-" not in saved.read_text(encoding="utf-8")
        ):
            time.sleep(0.5)
        if saved.stat().st_mtime_ns != before:
            break
    text = saved.read_text(encoding="utf-8")
    assert "ss3d-" in text and "application/vnd.jupyter.widget-state+json" in text  # saved with its widget state
    assert text.count("var exports, module, define;") == 0  # no copy of the library in the file
    assert "library left out of the saved copy" in text  # the session's loader was saved, slimmed on the way
    assert len(text.encode("utf-8")) < 500_000  # the library alone is 538 KB
    assert page.offsite == []


def test_a_saved_notebook_opened_untrusted_reads(lab, lab_root, browser_page):
    # the quick-start notebook as saved in the repository (executed, widget state included), never trusted here
    shutil.copyfile(ROOT / "notebooks" / "01_quick_start.ipynb", lab_root / "received.ipynb")
    page = browser_page
    page.goto(f"{lab}/lab/tree/received.ipynb")
    here = ".jp-NotebookPanel:not(.lm-mod-hidden)"  # this notebook's tab, not one a test before left open
    page.wait_for_selector(f"{here} .jp-Notebook .ss-fischer-text", state="attached", timeout=90_000)
    # JupyterLab renders outputs as they come into view: wait for the cards rather than count at once
    page.wait_for_function(
        f"document.querySelectorAll('{here} .jp-OutputArea-output .ss-fischer-text').length >= 3", timeout=60_000
    )
    cards = page.locator(f"{here} .jp-OutputArea-output .ss-fischer-text")
    first = cards.first
    first.scroll_into_view_if_needed()
    first.wait_for(state="visible", timeout=30_000)
    assert "──┼──" in first.inner_text() and "CHO" in first.inner_text()
    assert len(first.inner_text().splitlines()) >= 11  # drawn line by line, not run-on text
    saved = page.locator(f"{here} .ss-snapshot").first
    saved.scroll_into_view_if_needed()
    saved.wait_for(state="visible", timeout=30_000)
    shot(page, "untrusted-saved-view")
    text = page.locator(f"{here} .jp-Notebook").first.inner_text()
    for repr_text in _REPRS:
        assert repr_text not in text


def test_a_slimmed_saved_notebook_opened_trusted_restores_its_widgets(lab, lab_root, browser_page):
    # the shipped quick-start notebook holds only the widget models its views show, layouts without unset values
    target = lab_root / "trusted.ipynb"
    shutil.copyfile(ROOT / "notebooks" / "01_quick_start.ipynb", target)
    env = dict(os.environ, JUPYTER_DATA_DIR=str(lab_root.parent / f"{lab_root.name}-jupyter" / "data"))
    subprocess.run([sys.executable, "-m", "nbformat.sign", str(target)], env=env, check=True, capture_output=True)
    page = browser_page
    page.goto(f"{lab}/lab/tree/trusted.ipynb")
    here = ".jp-NotebookPanel:not(.lm-mod-hidden)"  # this notebook's tab, not one a test before left open
    page.wait_for_selector(f"{here} .jp-Notebook .jp-Cell", state="attached")
    page.wait_for_selector(".jp-Notebook-ExecutionIndicator[data-status='idle']", timeout=90_000)
    restored = (
        f"(() => {{ const p = document.querySelector({here + ' .ss-live'!r}); return !!p && "
        "p.innerText.includes('Record a result') && p.innerText.includes('Chairs in 3D'); })()"
    )
    scroller = f"{here} .jp-WindowedPanel-outer"  # JupyterLab draws cells as they scroll into view
    deadline = time.monotonic() + 90
    while not page.evaluate(restored):  # the widgets drawn from the saved state, layouts and all
        if time.monotonic() > deadline:
            shot(page, "trusted-saved-widgets-missing")
            raise AssertionError("the workbench widgets were not restored from the saved state")
        page.evaluate(f"document.querySelector({scroller!r})?.scrollBy(0, 700)")
        time.sleep(0.5)
    page.wait_for_timeout(1_000)  # let the cells around it render (scrolled to above)
    shot(page, "trusted-saved-widgets")
    missing = [e for e in page.console_errors if "model" in e.lower() and ("not found" in e.lower() or "find" in e)]
    assert missing == []


def test_the_same_notebook_as_nbconvert_html_reads_offline(tmp_path, browser_page):
    source = tmp_path / "received.ipynb"
    shutil.copyfile(ROOT / "notebooks" / "01_quick_start.ipynb", source)
    subprocess.run([sys.executable, "-m", "nbconvert", "--to", "html", str(source)], check=True, capture_output=True)
    page = browser_page
    page.goto((tmp_path / "received.html").as_uri())
    cards = page.locator(".ss-fischer-text")
    cards.first.wait_for(state="visible")
    assert cards.count() >= 3 and "──┼──" in cards.first.inner_text()
    assert page.locator(".ss-snapshot").first.is_visible()
    shot(page, "nbconvert-html")
    for repr_text in _REPRS:
        assert repr_text not in page.locator("body").inner_text()


def test_the_app_page_shows_the_panels(lab_root, browser_page):
    project = _four_left_project(lab_root)
    port = free_port()
    env = dict(os.environ, PYTHONPATH=os.pathsep.join([str(ROOT), os.environ.get("PYTHONPATH", "")]))
    process = subprocess.Popen(
        [sys.executable, "-m", "workbench.cli", "app", str(project), "--no-browser", "--port", str(port)],
        env=env,
        stdout=subprocess.DEVNULL,
        stderr=subprocess.DEVNULL,
        start_new_session=True,
    )
    try:
        deadline = time.monotonic() + 90
        while True:
            try:
                with urllib.request.urlopen(f"http://127.0.0.1:{port}/", timeout=2):
                    break
            except OSError:
                assert process.poll() is None and time.monotonic() < deadline, "the app did not start"
                time.sleep(0.5)
        page = browser_page
        page.goto(f"http://127.0.0.1:{port}/")
        page.wait_for_selector(".ss-live .ss-board-panel", state="visible", timeout=180_000)
        assert "S1: 4 left" in page.locator(".ss-live").first.inner_text()
        assert page.locator(".jp-InputArea, .jp-CodeMirrorEditor").count() == 0  # panels only, no code
        shot(page, "app-page")
        assert page.offsite == []  # the page template links nothing outside (no CDN)
    finally:
        os.killpg(process.pid, signal.SIGTERM)
        try:
            process.wait(timeout=20)
        except subprocess.TimeoutExpired:
            os.killpg(process.pid, signal.SIGKILL)
