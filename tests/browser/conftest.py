"""JupyterLab in headless Chromium (Debian's package, driven by Playwright): fixtures for the browser tests.

The browser tests run with ``python -m pytest -m browser``; a plain ``python -m
pytest`` skips them. They need ``/usr/bin/chromium`` (``apt-get install
chromium``) and the ``playwright`` Python package; Playwright's own browser
downloads are never used. JupyterLab runs on a free local port with no token,
in a temporary root folder, with its own Jupyter data and runtime folders (no
trust database or settings from the machine). Every request to another host is
refused and recorded, so a test can assert that nothing went to the network.
"""

from __future__ import annotations

import os
import shutil
import signal
import subprocess
import sys
import tempfile
import time
import urllib.request
from pathlib import Path

import pytest
from lab_helpers import CHROMIUM, FLAGS, ROOT, free_port

from workbench.ui.notebook import SAVE_HOOK


def pytest_collection_modifyitems(config, items):
    """Skip the browser tests unless ``-m browser`` selects them (they need Chromium and take a minute)."""
    selected = "browser" in (config.getoption("-m") or "")
    for item in items:
        if item.get_closest_marker("browser") is None:  # (keywords would also match a folder named "browser")
            continue
        if not selected:
            item.add_marker(pytest.mark.skip(reason="browser tests run with: python -m pytest -m browser"))
        elif not Path(CHROMIUM).exists():
            item.add_marker(pytest.mark.skip(reason=f"no Chromium at {CHROMIUM} (apt-get install chromium)"))


@pytest.fixture(scope="session")
def lab_root():
    folder = Path(tempfile.mkdtemp(prefix="stereosieve-lab-"))
    yield folder
    shutil.rmtree(folder, ignore_errors=True)


@pytest.fixture(scope="session")
def lab(lab_root):
    """Base URL of a JupyterLab server on ``lab_root`` (started here, stopped after the session)."""
    port = free_port()
    home = lab_root.parent / f"{lab_root.name}-jupyter"
    env = dict(os.environ)
    env.update(
        PYTHONPATH=os.pathsep.join([str(ROOT), env.get("PYTHONPATH", "")]).rstrip(os.pathsep),
        JUPYTER_DATA_DIR=str(home / "data"),
        JUPYTER_RUNTIME_DIR=str(home / "runtime"),
        JUPYTER_CONFIG_DIR=str(home / "config"),
    )
    # as `stereosieve lab` runs it: notebooks slimmed on save; widget state saved with them (as the shipped ones)
    settings = home / "config" / "lab" / "user-settings" / "@jupyter-widgets" / "jupyterlab-manager"
    settings.mkdir(parents=True, exist_ok=True)
    (settings / "plugin.jupyterlab-settings").write_text('{"saveState": true}', encoding="utf-8")
    command = [
        sys.executable,
        "-m",
        "jupyterlab",
        f"--ContentsManager.pre_save_hook={SAVE_HOOK}",
        "--no-browser",
        f"--port={port}",
        "--ip=127.0.0.1",
        f"--ServerApp.root_dir={lab_root}",
        "--IdentityProvider.token=",
        "--ServerApp.password=",
        "--ServerApp.disable_check_xsrf=True",
        "--LabApp.news_url=None",
        "--LabApp.check_for_updates_class=jupyterlab.NeverCheckForUpdate",
    ]
    if hasattr(os, "geteuid") and os.geteuid() == 0:
        command.append("--allow-root")
    log = open(lab_root.parent / f"{lab_root.name}-server.log", "w")  # noqa: SIM115 (closed below)
    process = subprocess.Popen(command, env=env, stdout=log, stderr=subprocess.STDOUT, start_new_session=True)
    url = f"http://127.0.0.1:{port}"
    deadline = time.monotonic() + 90
    while True:
        try:
            with urllib.request.urlopen(f"{url}/api/status", timeout=2):
                break
        except OSError:
            if process.poll() is not None or time.monotonic() > deadline:
                process.kill()
                raise RuntimeError(f"JupyterLab did not start; see {log.name}") from None
            time.sleep(0.5)
    yield url
    os.killpg(process.pid, signal.SIGTERM)
    try:
        process.wait(timeout=20)
    except subprocess.TimeoutExpired:
        os.killpg(process.pid, signal.SIGKILL)
    log.close()
    shutil.rmtree(home, ignore_errors=True)


@pytest.fixture()
def browser_page(tmp_path):
    """A fresh headless Chromium page (own profile); ``page.offsite`` lists every refused outside request."""
    playwright_api = pytest.importorskip("playwright.sync_api")
    with playwright_api.sync_playwright() as p:
        context = p.chromium.launch_persistent_context(
            str(tmp_path / "profile"),
            executable_path=CHROMIUM,
            headless=True,
            args=FLAGS,
            viewport={"width": 1400, "height": 900},
        )
        offsite: list[str] = []
        errors: list[str] = []

        def route(r):
            host = r.request.url.split("/")[2] if "://" in r.request.url else ""
            if r.request.url.startswith(("data:", "blob:", "file:")) or host.split(":")[0] in (
                "127.0.0.1",
                "localhost",
            ):
                r.continue_()
            else:
                offsite.append(r.request.url)
                r.abort()

        context.route("**/*", route)
        page = context.pages[0] if context.pages else context.new_page()
        page.on("console", lambda m: errors.append(m.text) if m.type == "error" else None)
        page.on("pageerror", lambda e: errors.append(str(e)))
        page.offsite = offsite  # type: ignore[attr-defined]
        page.console_errors = errors  # type: ignore[attr-defined]
        page.set_default_timeout(60_000)
        yield page
        context.close()
