"""Lint as part of the one test command (ruff settings live in pyproject.toml)."""

from __future__ import annotations

import shutil
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parent.parent


@pytest.mark.skipif(shutil.which("ruff") is None and sys.platform != "linux", reason="ruff not installed")
def test_ruff_finds_nothing():
    # common practice: lint clean, including the no-print rule (T20) for the library
    proc = subprocess.run(
        [sys.executable, "-m", "ruff", "check", "workbench", "tests", "benchmarks", "scripts"],
        cwd=ROOT,
        capture_output=True,
        text=True,
    )
    assert proc.returncode == 0, proc.stdout + proc.stderr
