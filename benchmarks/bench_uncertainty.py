"""Contract 3 timings: probabilities after an evidence edit, the planner under noise, cold solve.

Run: ``PYTHONPATH=. python benchmarks/bench_uncertainty.py``. Prints wall-clock
medians (s). Goals (issue 10): evidence edit to updated probabilities for one
unknown over the largest scope <= 50 ms warm; planner on 64 survivors <= 0.5 s.
"""

from __future__ import annotations

import sys
import time
from pathlib import Path

from timing import median_seconds

from workbench.chem.catalogue import Scope, catalogue
from workbench.evidence import solve
from workbench.evidence.planner import plan

sys.path.insert(0, str(Path(__file__).resolve().parent.parent / "tests"))

from projects import LARGEST, over_scope  # noqa: E402


def project(observations: list[dict], scope: dict, n_unknowns: int = 1, links: list[dict] | None = None):
    ids = [f"U{i}" for i in range(n_unknowns)] if n_unknowns > 1 else ["U"]
    return over_scope(scope, observations + (links or []), ids, "benchmark (invented readings)")


def main() -> None:
    size = len(catalogue(Scope(carbons=tuple(range(3, 10)), modifications=("any",))))
    base = [
        {"id": "E1", "kind": "bromine_water", "unknown": "U", "result": "oxidised"},
        {"id": "E2", "kind": "carbon_count", "unknown": "U", "value": 6},
    ]
    t = time.perf_counter()
    solve(project(base, LARGEST))
    print(f"cold solve, one unknown over the largest scope ({size} candidates): {time.perf_counter() - t:.3f} s")
    print(f"warm solve, same project: {median_seconds(lambda: solve(project(base, LARGEST)), repeat=5):.4f} s")
    # an evidence edit: a new anomer ratio reading, then a changed value; survivors and probabilities redone
    for value in (0.40, 0.55):
        edited = base + [{"id": "E3", "kind": "anomer_ratio", "unknown": "U", "alpha_fraction": value, "sigma": 0.03}]
        p = project(edited, LARGEST)
        solve(p)
        sol = solve(p)
        print(
            f"evidence edit (anomer ratio {value}) -> probabilities of {len(sol.survivors['U'])} survivors "
            f"over the largest scope, warm: {median_seconds(lambda p=p: solve(p), repeat=5):.4f} s"
        )
    rot = base + [{"id": "E3", "kind": "specific_rotation", "unknown": "U", "value": 40.0, "reliability": 0.8}]
    p = project(rot, LARGEST)
    solve(p)
    print(f"evidence edit (rotation, reliability 0.8), warm: {median_seconds(lambda: solve(p), repeat=5):.4f} s")
    octoses = project([], {"carbons": [8], "carbonyl": ["aldose"], "series": ["D", "L"]})
    sol = solve(octoses)
    t = time.perf_counter()
    plan(octoses, solution=sol)
    cold = time.perf_counter() - t
    warm = median_seconds(lambda: plan(octoses, solution=sol), repeat=3)
    print(f"planner on {len(sol.survivors['U'])} survivors: first {cold:.3f} s, warm {warm:.3f} s")
    noisy = project(
        [{"id": "E1", "kind": "specific_rotation", "unknown": "U", "value": 10.0, "sigma": 5.0}],
        {"carbons": [8], "carbonyl": ["aldose"], "series": ["D", "L"]},
    )
    sol = solve(noisy)
    print(
        f"planner on {len(sol.survivors['U'])} survivors with a non-uniform posterior: "
        f"{median_seconds(lambda: plan(noisy, solution=sol), repeat=3):.3f} s"
    )
    for n in (2, 4, 6, 8):
        links = [
            {
                "id": f"R{i}",
                "kind": "same_product",
                "reaction": "osazone",
                "members": [f"U{i - 1}", f"U{i}"],
                "relation": "identical",
            }
            for i in range(1, n)
        ]
        obs = [{"id": f"Q{i}", "kind": "anomer_ratio", "unknown": f"U{i}", "alpha_fraction": 0.4} for i in range(n)]
        p = project(obs, {"carbons": [5, 6], "series": ["D", "L"]}, n, links)
        sol = solve(p)
        print(
            f"{n} linked unknowns (osazone chain, 36 candidates each, {sol.posterior_methods['U0']}): "
            f"{median_seconds(lambda p=p: solve(p), repeat=3):.4f} s"
        )
    cyc = [{"id": "X", "kind": "different", "members": ["U0", "U1", "U2"]}]
    obs = [{"id": f"Q{i}", "kind": "anomer_ratio", "unknown": f"U{i}", "alpha_fraction": 0.4} for i in range(3)]
    p = project(obs, {"carbons": [5, 6], "series": ["D", "L"]}, 3, cyc)
    sol = solve(p)
    print(f"3 unknowns in a cycle ({sol.posterior_methods['U0']}): {median_seconds(lambda: solve(p), repeat=3):.4f} s")


if __name__ == "__main__":
    main()
