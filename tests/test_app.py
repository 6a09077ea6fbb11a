"""``stereosieve app`` (the panels as a Voila page) and ``stereosieve lab --port`` / pass-through options."""

from __future__ import annotations

import json
import os
import re
import shutil
import signal
import socket
import subprocess
import sys
import time
import urllib.request
from pathlib import Path

import pytest

import workbench.ui.notebook as lab
from workbench.cli import main

ROOT = Path(__file__).resolve().parent.parent
SAMPLES = ROOT / "sample_projects"


def test_lab_command_line_takes_port_browser_and_passes_options_through(monkeypatch):
    monkeypatch.setattr(os, "geteuid", lambda: 1000)
    command = lab.lab_command(Path("/x/p.workbench.ipynb"), browser=False, port=9123, extra=["--ServerApp.token=abc"])
    assert command[1:4] == ["-m", "jupyterlab", "p.workbench.ipynb"]
    assert "--no-browser" in command and "--port=9123" in command and "--allow-root" not in command
    assert command[-1] == "--ServerApp.token=abc"  # passed on last, unchanged


def test_lab_as_root_adds_allow_root_once(monkeypatch):
    monkeypatch.setattr(os, "geteuid", lambda: 0)
    assert lab.lab_command(Path("n.ipynb")).count("--allow-root") == 1
    assert lab.lab_command(Path("n.ipynb"), extra=["--allow-root"]).count("--allow-root") == 1


def test_lab_command_hands_port_and_options_to_the_launcher(tmp_path, monkeypatch):
    calls = []
    monkeypatch.setattr(lab, "launch_lab", lambda notebook, **options: calls.append(options) or 0)
    project = tmp_path / "p.json"
    shutil.copyfile(SAMPLES / "rare_pentose_epimerisation.json", project)
    assert main(["lab", str(project), "--port", "9200", "--no-browser", "--", "--ServerApp.token=x", "--debug"]) == 0
    assert calls == [{"browser": False, "port": 9200, "extra": ["--ServerApp.token=x", "--debug"]}]


def test_bad_port_and_misplaced_pass_through_exit_2(tmp_path, capsys):
    assert main(["lab", "--prepare-only", "--dir", str(tmp_path), "--port", "70000"]) == 2
    assert main(["lab", "--prepare-only", "--dir", str(tmp_path), "--port", "eighty"]) == 2
    assert main(["solve", str(SAMPLES / "rare_pentose_epimerisation.json"), "--", "--debug"]) == 2
    assert "only for lab and app" in capsys.readouterr().err


def test_app_notebook_is_one_cell_showing_the_panels(tmp_path):
    project = tmp_path / "my project's file.json"
    shutil.copyfile(SAMPLES / "rare_pentose_epimerisation.json", project)
    nb = json.loads(lab.app_notebook_text(project))
    (cell,) = nb["cells"]
    assert cell["cell_type"] == "code" and repr(str(project.resolve())) in cell["source"]
    assert ".widget" in cell["source"]
    command = lab.app_command(tmp_path / "n.ipynb", browser=False, port=8999)
    assert command[1:3] == ["-m", "voila"] and "--strip_sources=True" in command and "--port=8999" in command


def test_app_command_prepares_the_project_and_starts_the_page(tmp_path, monkeypatch, capsys):
    calls = []
    monkeypatch.setattr(lab, "launch_app", lambda project, **options: calls.append((project, options)) or 0)
    assert main(["app", "--dir", str(tmp_path), "--no-browser", "--port", "9300"]) == 0
    assert calls == [(tmp_path / lab.DEMO_COPY, {"browser": False, "port": 9300, "extra": []})]
    assert main(["app", str(tmp_path / "missing.json")]) == 2


def _free_port() -> int:
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


def test_app_serves_the_panels_without_code_and_stops_cleanly(tmp_path):
    pytest.importorskip("voila")
    project = tmp_path / "p.json"
    shutil.copyfile(SAMPLES / "red_seaweed_deoxyhexose.json", project)
    port = _free_port()
    env = {**os.environ, "PYTHONPATH": str(ROOT), "TMPDIR": str(tmp_path)}
    command = [sys.executable, "-m", "workbench.cli", "app", str(project), "--no-browser", "--port", str(port)]
    server = subprocess.Popen(command, cwd=tmp_path, env=env, stdout=subprocess.PIPE, stderr=subprocess.STDOUT)
    try:
        page = ""
        deadline = time.monotonic() + 90
        while time.monotonic() < deadline and server.poll() is None:
            try:
                with urllib.request.urlopen(f"http://127.0.0.1:{port}/", timeout=60) as reply:
                    page = reply.read().decode("utf-8")
                break
            except OSError:
                time.sleep(0.5)
        assert "application/vnd.jupyter.widget-view+json" in page  # the panels are there ...
        assert "Workbench.open" not in page and "from workbench" not in page  # ... the code is not
        # no stylesheet or script from another site (the stock page links Font Awesome from a CDN)
        assert not re.search(r"""(?<![-\w])(?:href|src)=["']https?://(?!127\.0\.0\.1|localhost)""", page), page[
            max(0, page.find("https://") - 300) : page.find("https://") + 200
        ]
    finally:
        server.send_signal(signal.SIGTERM)
        output = server.communicate(timeout=30)[0].decode("utf-8", "replace")
    assert "Traceback" not in output, output
    assert not list(tmp_path.glob("stereosieve-app-*"))  # the page's temporary folder is gone
