"""The core imports no UI library, and imports quickly (checked in a fresh interpreter).

The layering rule is common practice (STYLE.md principle 1, after datamol); no chemistry is checked here.
"""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
UI_LIBRARIES = ("ipywidgets", "IPython", "py3Dmol", "matplotlib")
IMPORT_BUDGET_S = 5.0  # generous: RDKit alone takes about a second on a slow machine

_PROBE = """
import importlib, importlib.util, json, sys, time
wanted = {wanted!r}
start = time.perf_counter()
imported = []
for name in wanted:
    if name == "workbench.conformers" and importlib.util.find_spec(name) is None:
        continue
    importlib.import_module(name)
    imported.append(name)
seconds = time.perf_counter() - start
print(json.dumps({{"imported": imported, "seconds": seconds,
                  "ui": [m for m in {ui!r} if m in sys.modules]}}))
"""


def _probe(modules: list[str]) -> dict:
    code = _PROBE.format(wanted=modules, ui=list(UI_LIBRARIES))
    out = subprocess.run(
        [sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True, check=True, timeout=120
    ).stdout
    return json.loads(out.strip().splitlines()[-1])


def test_core_packages_import_no_ui_library():
    result = _probe(["workbench.chem", "workbench.evidence", "workbench.conformers"])
    print(f"\ncore import time: {result['seconds']:.3f} s for {', '.join(result['imported'])}")
    assert result["ui"] == []
    assert result["seconds"] < IMPORT_BUDGET_S


def test_display_layer_report_and_lab_preparation_import_no_ui_library():
    result = _probe(["workbench.display", "workbench.report", "workbench.ui.notebook", "workbench.cli"])
    print(f"\ndisplay/report/lab import time: {result['seconds']:.3f} s")
    assert result["ui"] == []


def test_ui_package_is_where_the_widget_libraries_come_in():
    result = _probe(["workbench.ui.app"])
    assert {"ipywidgets", "IPython", "py3Dmol"} <= set(result["ui"])
