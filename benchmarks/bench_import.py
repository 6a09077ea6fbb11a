"""Import time of the core packages and of the display/command-line layer, each in a fresh interpreter.

Run: ``python benchmarks/bench_import.py``. Prints seconds per group (median of three runs). The
test suite checks only that the core imports no UI library; speed is measured here.
"""

from __future__ import annotations

import json
import statistics
import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
GROUPS = {
    "core (chem, evidence, conformers)": ["workbench.chem", "workbench.evidence", "workbench.conformers"],
    "display, report, lab, cli": ["workbench.display", "workbench.report", "workbench.ui.notebook", "workbench.cli"],
    "notebook app (widgets)": ["workbench.ui.app"],
}
_PROBE = """
import importlib, json, time
start = time.perf_counter()
for name in {wanted!r}:
    importlib.import_module(name)
print(json.dumps(time.perf_counter() - start))
"""


def _seconds(modules: list[str]) -> float:
    out = subprocess.run(
        [sys.executable, "-c", _PROBE.format(wanted=modules)], cwd=ROOT, capture_output=True, text=True, check=True
    ).stdout
    return float(json.loads(out.strip().splitlines()[-1]))


def main() -> None:
    print(f"{'group':<36} {'median s':>9} {'runs':>24}")
    for label, modules in GROUPS.items():
        runs = [_seconds(modules) for _ in range(3)]
        print(f"{label:<36} {statistics.median(runs):9.3f}   {', '.join(f'{r:.3f}' for r in runs)}")


if __name__ == "__main__":
    main()
