"""Type-check the package as part of the one test command (mypy settings live in pyproject.toml)."""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parent.parent


def test_mypy_finds_nothing():
    pytest.importorskip("mypy")
    # common practice (STYLE.md principle 11): one command runs ruff, the type checker and pytest
    proc = subprocess.run(
        [sys.executable, "-m", "mypy", "workbench"],
        cwd=ROOT,
        capture_output=True,
        text=True,
    )
    assert proc.returncode == 0, proc.stdout + proc.stderr
