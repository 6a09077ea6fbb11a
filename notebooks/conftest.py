"""Let the notebook kernels that nbval starts import this checkout, whether or not it is installed."""

from __future__ import annotations

import os
from pathlib import Path

_ROOT = str(Path(__file__).resolve().parent.parent)
_paths = [p for p in os.environ.get("PYTHONPATH", "").split(os.pathsep) if p]
if _ROOT not in _paths:
    os.environ["PYTHONPATH"] = os.pathsep.join([_ROOT, *_paths])
