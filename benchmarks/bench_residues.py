"""Glycan residues: size of the candidate space, and solve/plan times for a five-residue-type polysaccharide.

Run: ``python benchmarks/bench_residues.py``. Prints counts and wall-clock
times (s): the first call in a fresh process (every residue structure built
and predicted) and the median of repeated calls (predictions cached).

The outcome tables' disk cache is off (``STEREOSIEVE_CACHE=off``) unless set
otherwise. The polysaccharide is the invented sample project
``sample_projects/fictional_arabinogalactan_residues.json``, solved twice:
with its own scopes (the four sugars found in the hydrolysate) and with every
residue unknown widened to the default residue scope (with and without the
sugar named in the methylation records; without it every candidate's alditol
acetate is computed).
"""

from __future__ import annotations

import copy
import json
import os
import statistics
import time
from collections import Counter
from pathlib import Path

os.environ.setdefault("STEREOSIEVE_CACHE", "off")  # cold figures: no outcome tables from an earlier run

from workbench.chem.residue import DEFAULT_RESIDUE_SCOPE, residue_catalogue
from workbench.evidence import project_from_dict, solve
from workbench.evidence.planner import plan

ROOT = Path(__file__).resolve().parent.parent
SAMPLE = ROOT / "sample_projects" / "fictional_arabinogalactan_residues.json"


def timed(fn, repeat: int = 3) -> tuple[float, float]:
    """(first call, median of the next ``repeat`` calls) in seconds."""
    t = time.perf_counter()
    fn()
    first = time.perf_counter() - t
    times = []
    for _ in range(repeat):
        t = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t)
    return first, statistics.median(times)


def main() -> None:
    t = time.perf_counter()
    space = residue_catalogue(DEFAULT_RESIDUE_SCOPE)
    built = time.perf_counter() - t
    sugars = {r.chain for r in space}
    print(f"default residue scope: {DEFAULT_RESIDUE_SCOPE.to_dict()}")
    print(f"  sugars {len(sugars)}, residue candidates {len(space)} (enumerated in {built:.3f} s)")
    by_kind = Counter((r.chain.carbons, r.chain.carbonyl, r.ring) for r in space)
    for (n, carbonyl, ring), count in sorted(by_kind.items()):
        print(f"    C{n} {carbonyl:<7} {ring:<9} {count:>5}")
    by_links = Counter(len(r.linked) for r in space)
    print("  by number of linked positions: " + ", ".join(f"{k}: {v}" for k, v in sorted(by_links.items())))

    data = json.loads(SAMPLE.read_text(encoding="utf-8"))
    wide = copy.deepcopy(data)
    for unknown in wide["unknowns"]:
        unknown.pop("scope", None)
    blind = copy.deepcopy(wide)
    for obs in blind["observations"]:
        obs.pop("sugar", None)
    variants = (
        ("sample scopes (4 sugars)", data),
        ("default residue scope, no sugar named in the methylation records", blind),
        ("default residue scope", wide),
    )
    for label, project_data in variants:
        project = project_from_dict(project_data)
        first, warm = timed(lambda p=project: solve(p))
        solution = solve(project)
        counts = {u: len(v) for u, v in solution.survivors.items()}
        print(f"{label}: scope {sum(solution.scope_counts.values())} candidates over 5 unknowns, survivors {counts}")
        print(f"  solve: first {first:.3f} s, then {warm:.3f} s")
        first, warm = timed(lambda p=project, s=solution: plan(p, solution=s))
        best = plan(project, solution=solution).experiments[:1]
        print(f"  plan:  first {first:.3f} s, then {warm:.3f} s; best: {best[0].title if best else '-'}")


if __name__ == "__main__":
    main()
