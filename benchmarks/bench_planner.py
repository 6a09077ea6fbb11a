"""Planner time for 8 and for 64 survivors, with and without two-step look-ahead.

Run: ``python benchmarks/bench_planner.py``. Prints wall-clock seconds (cold = first call
in the process, warm = median of three later calls).
"""

from __future__ import annotations

import sys
import time
from pathlib import Path

from timing import median_seconds

from workbench.evidence.planner import plan

sys.path.insert(0, str(Path(__file__).resolve().parent.parent / "tests"))

from projects import over_scope  # noqa: E402


def main() -> None:
    cases = {
        "8 survivors (D-aldohexoses)": {"carbons": [6], "carbonyl": ["aldose"], "series": ["D"]},
        "64 survivors (D- and L-aldooctoses)": {"carbons": [8], "carbonyl": ["aldose"]},
    }
    for label, scope in cases.items():
        p = over_scope(scope, title="bench")
        for look in (False, True):
            t = time.perf_counter()
            result = plan(p, lookahead=look)
            cold = time.perf_counter() - t
            warm = median_seconds(lambda p=p, look=look: plan(p, lookahead=look), repeat=3)
            n = sum(len(v) for v in result.experiments[0].outcomes.values()) if result.experiments else 0
            print(f"{label:<52} look-ahead={look!s:<5} survivors={n:<3} cold {cold:.2f} s, warm {warm:.3f} s")


if __name__ == "__main__":
    main()
