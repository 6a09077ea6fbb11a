"""Planner time for 8 and for 64 survivors, with and without two-step look-ahead.

Run: ``python benchmarks/bench_planner.py``. Prints wall-clock seconds (cold = first call
in the process, warm = median of three later calls).
"""

from __future__ import annotations

import statistics
import time

from workbench.evidence import project_from_dict
from workbench.evidence.planner import plan


def project(scope: dict) -> object:
    return project_from_dict(
        {"format": "stereosieve-project", "version": 1, "title": "bench", "unknowns": [{"id": "U", "scope": scope}]}
    )


def main() -> None:
    cases = {
        "8 survivors (D-aldohexoses)": {"carbons": [6], "carbonyl": ["aldose"], "series": ["D"]},
        "64 survivors (D- and L-aldooctoses)": {"carbons": [8], "carbonyl": ["aldose"]},
    }
    for label, scope in cases.items():
        p = project(scope)
        for look in (False, True):
            t = time.perf_counter()
            result = plan(p, lookahead=look)
            cold = time.perf_counter() - t
            warm = []
            for _ in range(3):
                t = time.perf_counter()
                plan(p, lookahead=look)
                warm.append(time.perf_counter() - t)
            n = sum(len(v) for v in result.experiments[0].outcomes.values()) if result.experiments else 0
            print(
                f"{label:<52} look-ahead={look!s:<5} survivors={n:<3} cold {cold:.2f} s, warm {statistics.median(warm):.3f} s"
            )


if __name__ == "__main__":
    main()
