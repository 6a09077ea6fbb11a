"""Size and build time of the HTML report for every sample project and the demo.

Run: ``python benchmarks/bench_report.py``. For each project: the report's
size in kB (UTF-8, with the next-experiment ranking as ``stereosieve report``
writes it), the number of eliminated candidates it lists, and the wall-clock
time to solve, plan and render, in seconds. The largest is named last.
"""

from __future__ import annotations

import time
from pathlib import Path

from workbench.data import DEMO_PROJECT, data_path
from workbench.evidence import load_project, solve
from workbench.evidence.planner import plan
from workbench.report import render_report

ROOT = Path(__file__).resolve().parent.parent


def main() -> None:
    paths = sorted((ROOT / "sample_projects").glob("*.json")) + [data_path(DEMO_PROJECT)]
    sizes: dict[str, int] = {}
    print(f"{'project':<40} {'kB':>8} {'eliminated':>11} {'seconds':>8}")
    for path in paths:
        start = time.perf_counter()
        project = load_project(path)
        solution = solve(project)
        html = render_report(project, solution, plan(project, solution=solution, limit=8))
        seconds = time.perf_counter() - start
        size = len(html.encode("utf-8"))
        sizes[path.name] = size
        gone = sum(solution.scope_counts[u] - len(solution.survivors[u]) for u in project.unknown_ids)
        print(f"{path.name:<40} {size / 1024:>8.1f} {gone:>11} {seconds:>8.2f}")
    largest = max(sizes, key=lambda name: sizes[name])
    print(f"largest report: {largest}, {sizes[largest] / 1024:.1f} kB ({sizes[largest]} bytes)")


if __name__ == "__main__":
    main()
