"""Former performance cliffs of the engine and planner, each beside its clean baseline.

Run: ``python benchmarks/bench_cliffs.py [case ...]`` (cases: contradiction, cycle, lookahead, many).
Prints wall-clock seconds per case; the projects are invented and built here.

- ``contradiction``: about 1,000 observations on 100 unknowns, clean and with one
  contradictory observation added (the minimal-conflict search);
- ``cycle``: four unknowns over broad scopes in a cycle of ``same_product`` relations;
- ``lookahead``: ``plan --lookahead`` on 40 unknowns linked by relations;
- ``many``: about 1,000 unknowns linked in a chain plus one cycle (the witness search).
"""

from __future__ import annotations

import sys
import time
from collections.abc import Callable
from pathlib import Path
from typing import Any

from workbench.evidence import project_from_dict, solve
from workbench.evidence.planner import plan

sys.path.insert(0, str(Path(__file__).resolve().parent.parent / "tests"))

from projects import linked_project, project_dict  # noqa: E402

BROAD = {"carbons": [4, 5, 6, 7], "modifications": ["any"]}
HEXOSES = {"carbons": [5, 6]}


def contradiction_project(unknowns: int = 100, contradictory: bool = True) -> dict[str, Any]:
    """Ten consistent unary observations per unknown (about 1,000), optionally one that cannot hold."""
    obs: list[dict[str, Any]] = []
    for i in range(unknowns):
        u = f"U{i}"
        rows: list[dict[str, Any]] = [
            {"kind": "carbon_count", "value": 6},
            {"kind": "bromine_water", "result": "oxidised"},
            {"kind": "reducing_test", "result": "positive"},
            {"kind": "ketose_test", "result": "negative"},
            {"kind": "series", "value": "D"},
            {"kind": "aldaric_acid", "optically_active": True},
            {"kind": "alditol", "optically_active": True},
            {"kind": "molecular_formula", "value": "C6H12O6"},
            {"kind": "carbon_count", "value": 6},
            {"kind": "series", "value": "D"},
        ]
        for j, row in enumerate(rows):
            obs.append({"id": f"E{i}_{j}", "unknown": u, **row})
    if contradictory:
        obs.insert(len(obs) // 2, {"id": "BAD", "kind": "carbon_count", "unknown": "U7", "value": 5})
    return project_dict(
        [{"id": f"U{i}", "scope": HEXOSES} for i in range(unknowns)],
        obs,
        "invented: many consistent observations" + (" and one contradiction" if contradictory else ""),
    )


def cycle_project(size: int = 4, closed: bool = True, relation: str = "enantiomeric") -> dict[str, Any]:
    """``size`` unknowns over broad scopes, consecutive ones with related osazones; closed into a cycle."""
    n = size if closed else size - 1
    obs = [
        {
            "id": f"R{i}",
            "kind": "same_product",
            "reaction": "osazone",
            "members": [f"U{i}", f"U{(i + 1) % size}"],
            "relation": relation,
        }
        for i in range(n)
    ]
    return project_dict(
        [{"id": f"U{i}", "scope": BROAD} for i in range(size)],
        obs,
        f"invented: {size} unknowns, {'a cycle' if closed else 'a path'} of {relation}-osazone relations",
    )


def timed(label: str, fn: Callable[[], object]) -> float:
    t = time.perf_counter()
    fn()
    took = time.perf_counter() - t
    print(f"  {label:<58} {took:8.2f} s", flush=True)
    return took


def main(cases: list[str]) -> None:
    if "contradiction" in cases:
        print("contradiction among about 1,000 observations:")
        clean = project_from_dict(contradiction_project(contradictory=False))
        bad = project_from_dict(contradiction_project())
        a = timed(f"clean solve ({len(clean.observations)} observations)", lambda: solve(clean))
        b = timed(f"one contradictory observation ({len(bad.observations)})", lambda: solve(bad))
        print(f"  ratio {b / a:.1f}x")
    if "cycle" in cases:
        print("four unknowns over broad scopes linked by enantiomeric-osazone relations:")
        a = timed(
            "clean: a cycle of same-osazone relations",
            lambda: solve(project_from_dict(cycle_project(relation="identical"))),
        )
        timed("a path of enantiomeric-osazone relations", lambda: solve(project_from_dict(cycle_project(closed=False))))
        b = timed("a cycle of enantiomeric-osazone relations", lambda: solve(project_from_dict(cycle_project())))
        print(f"  ratio {b / a:.1f}x")
    if "lookahead" in cases:
        print("plan on 40 linked unknowns:")
        p = project_from_dict(linked_project(40, scope=HEXOSES))
        s = solve(p)
        timed("plan", lambda: plan(p, solution=s))
        timed("plan --lookahead", lambda: plan(p, solution=s, lookahead=True))
    if "many" in cases:
        print("about 1,000 unknowns linked by relations:")
        p = project_from_dict(linked_project(1000, cycle=False))
        timed("1,000 unknowns, a chain (forest)", lambda: solve(p))
        q = project_from_dict(linked_project(1000))
        timed("1,000 unknowns, a chain and one cycle", lambda: solve(q))


if __name__ == "__main__":
    main(sys.argv[1:] or ["contradiction", "cycle", "lookahead", "many"])
