"""Paths, flags and small helpers shared by the browser tests (see conftest.py)."""

from __future__ import annotations

import os
import socket
import tempfile
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
CHROMIUM = os.environ.get("STEREOSIEVE_CHROMIUM", "/usr/bin/chromium")
FLAGS = [
    "--no-sandbox",
    "--disable-gpu",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
    "--no-first-run",
]
SHOTS = Path(os.environ.get("STEREOSIEVE_SHOTS", tempfile.gettempdir())) / "stereosieve-browser-shots"


def free_port() -> int:
    """A TCP port free on 127.0.0.1 now."""
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


def shot(page, name: str) -> Path:
    """Save a screenshot (for a person to look at) and return its path."""
    SHOTS.mkdir(parents=True, exist_ok=True)
    path = SHOTS / f"{name}.png"
    page.screenshot(path=str(path), full_page=False)
    return path
