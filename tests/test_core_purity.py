"""The core imports no UI library (checked in a fresh interpreter).

How long the import takes is measured by ``benchmarks/bench_import.py``, not asserted here.

The layering rule is common practice (STYLE.md principle 1, after datamol); no chemistry is checked here.
"""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
UI_LIBRARIES = ("ipywidgets", "IPython", "py3Dmol", "matplotlib")

_PROBE = """
import importlib, json, sys
wanted = {wanted!r}
for name in wanted:
    importlib.import_module(name)
print(json.dumps({{"imported": wanted, "ui": [m for m in {ui!r} if m in sys.modules]}}))
"""


def _probe(modules: list[str]) -> dict:
    code = _PROBE.format(wanted=modules, ui=list(UI_LIBRARIES))
    out = subprocess.run(
        [sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True, check=True, timeout=120
    ).stdout
    return json.loads(out.strip().splitlines()[-1])


def test_core_packages_import_no_ui_library():
    result = _probe(["workbench.chem", "workbench.evidence", "workbench.conformers"])
    assert result["ui"] == []


def test_display_layer_report_and_lab_preparation_import_no_ui_library():
    result = _probe(["workbench.display", "workbench.report", "workbench.ui.notebook", "workbench.cli"])
    assert result["ui"] == []


def test_ui_package_is_where_the_widget_libraries_come_in():
    result = _probe(["workbench.ui.app"])
    assert {"ipywidgets", "IPython"} <= set(result["ui"])
    assert "py3Dmol" not in result["ui"]  # the 3D viewer is our own inlined 3Dmol.js page, never a CDN loader


def _guarded_own_imports(path: Path) -> list[int]:
    """Lines where an import of our own package sits in a try whose handler catches ImportError."""
    import ast

    found = []
    for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
        if not isinstance(node, ast.Try):
            continue
        own = any(
            isinstance(stmt, ast.ImportFrom)
            and (stmt.module or "").startswith("workbench")
            or isinstance(stmt, ast.Import)
            and any(a.name.startswith("workbench") for a in stmt.names)
            for stmt in node.body
        )
        names = {n.id for h in node.handlers if h.type is not None for n in ast.walk(h.type) if isinstance(n, ast.Name)}
        if own and names & {"ImportError", "ModuleNotFoundError", "Exception"}:
            found.append(node.lineno)
    return found


def test_our_own_layers_are_imported_not_guarded():
    # A broken layer must fail loudly: an ImportError around our own import turns an import bug into
    # "no prediction, candidate kept" (common practice: optional guards only for optional third parties).
    offenders = {
        str(p.relative_to(ROOT)): lines
        for p in sorted((ROOT / "workbench").rglob("*.py"))
        if (lines := _guarded_own_imports(p))
    }
    assert offenders == {}
