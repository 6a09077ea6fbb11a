"""Notebook views (ipywidgets, IPython display): the only package that imports UI libraries.

Every panel is a view over a :class:`Session`; all computation is a call into
the core (:mod:`workbench.evidence`, :mod:`workbench.conformers`) and all
drawing a call into the pure display layer (:mod:`workbench.display`).
Importing this package registers HTML formatters for core objects when an
IPython shell is running. The names are loaded lazily, so ``workbench.ui.notebook``
(used by ``stereosieve lab``) does not pull in the widget libraries.
"""

from __future__ import annotations

import importlib
from typing import Any

__all__ = [
    "CandidateBoard",
    "ChairPanel",
    "EvidenceForm",
    "LedgerPanel",
    "NextExperimentPanel",
    "ProjectPanel",
    "Session",
    "SessionError",
    "Workbench",
    "register_formatters",
]

_WHERE = {
    "CandidateBoard": "workbench.ui.board",
    "ChairPanel": "workbench.ui.chairs",
    "EvidenceForm": "workbench.ui.entry",
    "LedgerPanel": "workbench.ui.ledger",
    "NextExperimentPanel": "workbench.ui.planning",
    "ProjectPanel": "workbench.ui.project_panel",
    "Session": "workbench.ui.session",
    "SessionError": "workbench.ui.session",
    "Workbench": "workbench.ui.app",
    "register_formatters": "workbench.ui.formatters",
}


def __getattr__(name: str) -> Any:
    if name in _WHERE:
        value = getattr(importlib.import_module(_WHERE[name]), name)
        globals()[name] = value
        if name == "Workbench":
            from workbench.ui.formatters import register_formatters

            register_formatters()
        return value
    raise AttributeError(f"module 'workbench.ui' has no attribute {name!r}")


def __dir__() -> list[str]:
    return sorted(__all__)
