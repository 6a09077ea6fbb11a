"""Time from an evidence change to the updated candidate board (the notebook's main loop).

Run: ``python benchmarks/bench_board.py``. A session with only the candidate
board subscribed; one "evidence change" is switching an observation off or
on in the ledger (``Session.set_enabled``), which re-solves through the core
and calls the board's update function. Also shown apart: the solve alone and
the board's redraw alone. Wall-clock medians in milliseconds, after one
warm-up change (caches of per-candidate predictions filled, as in a kernel
that has been open for a while); the cold first change is printed too.
"""

from __future__ import annotations

import statistics
import sys
import time
from pathlib import Path

from workbench.data import DEMO_PROJECT, data_path
from workbench.evidence import engine, load_project, project_from_dict
from workbench.ui.board import CandidateBoard
from workbench.ui.session import Session

sys.path.insert(0, str(Path(__file__).resolve().parent.parent / "tests"))

from projects import FIVE_READINGS  # noqa: E402

REPEATS = 9


def _ms(seconds: list[float]) -> str:
    return f"{1000 * statistics.median(seconds):8.1f} ms"


def measure(label: str, session: Session, toggle: str) -> None:
    """Median time of: evidence change -> solve -> board redrawn; then the parts alone."""
    board = CandidateBoard(session)
    t = time.perf_counter()
    session.set_enabled(toggle, False)  # cold: first change after opening
    cold = time.perf_counter() - t
    session.set_enabled(toggle, True)
    changes, solves, redraws = [], [], []
    for i in range(REPEATS):
        t = time.perf_counter()
        session.set_enabled(toggle, i % 2 == 1)
        changes.append(time.perf_counter() - t)
    for _ in range(REPEATS):
        t = time.perf_counter()
        engine.solve(session.project, disabled=tuple(session.disabled))
        solves.append(time.perf_counter() - t)
        t = time.perf_counter()
        board.refresh()
        redraws.append(time.perf_counter() - t)
    counts = {u: (session.solution.scope_counts[u], len(s)) for u, s in session.solution.survivors.items()}
    print(f"{label}")
    print(f"  candidates (scope, left): {counts}")
    print(f"  evidence change -> board updated: {_ms(changes)}   (cold first change {1000 * cold:.1f} ms)")
    print(f"    of which solve:                 {_ms(solves)}")
    print(f"    of which board redraw:          {_ms(redraws)}")


def measure_workbench(label: str, project, toggle: str) -> None:
    """The same change with every panel of the workbench listening (planner re-ranking included)."""
    from workbench.ui.app import Workbench

    bench = Workbench(project)
    times = []
    for i in range(REPEATS):
        t = time.perf_counter()
        bench.session.set_enabled(toggle, i % 2 == 1)
        times.append(time.perf_counter() - t)
    print(f"{label}: {_ms(times)}")


def main() -> None:
    t = time.perf_counter()
    opened = Session(project_from_dict(FIVE_READINGS))
    CandidateBoard(opened)
    print(
        f"opening the largest-scope project cold (first solve fills the caches, board drawn): "
        f"{1000 * (time.perf_counter() - t):.0f} ms"
    )
    demo = Session(load_project(data_path(DEMO_PROJECT)))
    measure("demo project (1 unknown, default scope), toggling E6", demo, "E6")
    big = Session(project_from_dict(FIVE_READINGS))
    measure("one unknown over the largest scope (C3-C9, modifications 'any'), toggling E4", big, "E4")
    measure("  same, toggling E2 (bromine water: the change that moves most candidates)", big, "E2")
    wide = Session(project_from_dict(FIVE_READINGS))
    wide.set_disabled(("E2", "E4", "E5"))
    measure("  same, only E1 and E3 in use (about 1900 survivors on the board), toggling E3", wide, "E3")

    measure_workbench("whole workbench, demo project, toggling E6", load_project(data_path(DEMO_PROJECT)), "E6")
    measure_workbench("whole workbench, largest scope, toggling E4", project_from_dict(FIVE_READINGS), "E4")


if __name__ == "__main__":
    main()
