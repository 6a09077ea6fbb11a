"""Solve times: a four-unknown project, one unknown over the largest scope, growth with unknowns.

Run: ``python benchmarks/bench_engine.py``. Prints wall-clock medians (s).
"""

from __future__ import annotations

import sys
import time
from pathlib import Path

from timing import median_seconds

from workbench.chem.catalogue import Scope, catalogue
from workbench.evidence import load_project, project_from_dict, solve

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT / "tests"))

from projects import LARGEST, over_scope, project_dict  # noqa: E402


def chain_project(n: int, scope: dict) -> dict:
    """n unknowns linked in a chain of same-osazone and different relations, plus unary evidence."""
    unknowns = [{"id": f"U{i}", "scope": scope} for i in range(n)]
    obs = [{"id": "E0", "kind": "aldaric_acid", "unknown": "U0", "optically_active": True}]
    for i in range(1, n):
        obs.append(
            {
                "id": f"R{i}",
                "kind": "same_product",
                "reaction": "osazone",
                "members": [f"U{i - 1}", f"U{i}"],
                "relation": "identical",
            }
        )
        obs.append({"id": f"D{i}", "kind": "alditol", "unknown": f"U{i}", "optically_active": True})
    return project_dict(unknowns, obs, f"{n} linked unknowns")


def main() -> None:
    t = time.perf_counter()
    big = catalogue(Scope(carbons=tuple(range(3, 10)), modifications=("any",)))
    print(f"largest scope: {len(big)} candidates enumerated in {time.perf_counter() - t:.3f} s")
    fischer = load_project(ROOT / "tests" / "data" / "fischer_glucose.json")
    print(f"four-unknown Fischer project: {median_seconds(lambda: solve(fischer)):.4f} s (median of 3)")
    one_big = over_scope(
        LARGEST,
        [
            {"id": "E1", "kind": "bromine_water", "unknown": "U", "result": "oxidised"},
            {"id": "E2", "kind": "aldaric_acid", "unknown": "U", "optically_active": False},
            {"id": "E3", "kind": "carbon_count", "unknown": "U", "value": 6},
        ],
        title="one unknown, largest scope",
    )
    t = time.perf_counter()
    solve(one_big)
    cold = time.perf_counter() - t
    print(f"one unknown over the largest scope: cold {cold:.3f} s, warm {median_seconds(lambda: solve(one_big)):.3f} s")
    scope6 = {"carbons": [5, 6], "series": ["D", "L"]}
    for n in (1, 2, 3, 4, 6, 8):
        p = project_from_dict(chain_project(n, scope6))
        solve(p)
        print(
            f"{n} linked unknowns (scope 5-6 carbons, {len(catalogue(Scope(carbons=(5, 6))))} each): {median_seconds(lambda p=p: solve(p)):.4f} s"
        )
    for n in (1, 2, 4):
        p = project_from_dict(chain_project(n, LARGEST))
        t = time.perf_counter()
        solve(p)
        print(f"{n} linked unknowns over the largest scope: {time.perf_counter() - t:.3f} s")
    tri = chain_project(3, LARGEST)
    tri["observations"].append({"id": "X", "kind": "different", "members": ["U0", "U1", "U2"]})
    p = project_from_dict(tri)
    t = time.perf_counter()
    solve(p)
    print(
        f"3 unknowns over the largest scope with a cycle (osazone chain + pairwise different): {time.perf_counter() - t:.3f} s"
    )


if __name__ == "__main__":
    main()
