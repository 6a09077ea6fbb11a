"""Figures for the outcome tables: cold plan against cold solve, a warm evidence change, first open.

Run: ``python benchmarks/bench_tables.py``. Prints, each as a ratio measured in
this one run:

1. cold ``solve`` and cold ``plan`` over the broadest scope (C3-C9, every
   modification: 4,336 candidates, one observation), each in a fresh process
   (``python -m workbench.cli``), with the tables as shipped and the disk cache
   (a) empty and (b) filled by an earlier run;
2. a warm evidence change over that scope (switching an observation off and on,
   then re-solving) against a bare numpy filter over the same columns;
3. the first open of the whole notebook workbench on that project in a fresh
   process (every panel built, the plan ranked), in seconds.

CPU seconds of the measured process (steady when other work shares the
machine), and wall-clock where said; medians of a few runs.
"""

from __future__ import annotations

import json
import os
import resource
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT / "tests"))

from projects import FIVE_READINGS, project_dict  # noqa: E402

# FIVE_READINGS (one unknown over the broadest scope, five invented readings) with its first reading only
ONE_OBSERVATION = project_dict(
    FIVE_READINGS["unknowns"],
    FIVE_READINGS["observations"][:1],
    "Benchmark (invented): an unknown of unknown chain length",
)


def _run(args: list[str], env: dict[str, str]) -> float:
    """CPU seconds (user + system) of one fresh ``python -m workbench.cli`` process."""
    before = resource.getrusage(resource.RUSAGE_CHILDREN)
    subprocess.run(
        [sys.executable, "-m", "workbench.cli", *args],
        cwd=ROOT,
        env=env,
        check=False,
        stdout=subprocess.DEVNULL,
        stderr=subprocess.DEVNULL,
    )
    after = resource.getrusage(resource.RUSAGE_CHILDREN)
    return (after.ru_utime - before.ru_utime) + (after.ru_stime - before.ru_stime)


def cold_commands(path: Path) -> None:
    with tempfile.TemporaryDirectory() as cache:
        env = dict(os.environ, STEREOSIEVE_CACHE_DIR=cache)
        first_solve = _run(["solve", str(path)], env)
        first_plan = _run(["plan", str(path)], env)  # first plan ever on this machine: fills the cache
        solves = [_run(["solve", str(path)], env) for _ in range(3)]
        plans = [_run(["plan", str(path)], env) for _ in range(3)]
    s, p = statistics.median(solves), statistics.median(plans)
    print("1. cold commands over the broadest scope (4,336 candidates), fresh processes, CPU seconds")
    print(
        f"   empty disk cache:  solve {first_solve:.2f} s, plan {first_plan:.2f} s, ratio {first_plan / first_solve:.1f}x"
    )
    print(f"   filled disk cache: solve {s:.2f} s, plan {p:.2f} s, ratio {p / s:.1f}x (median of 3)")


def warm_change() -> None:
    import numpy as np

    from workbench.evidence import engine, project_from_dict, tables

    project = project_from_dict(FIVE_READINGS)
    engine.solve(project)  # warm: columns and names filled
    times, cpu = [], []
    for i in range(11):
        t, c = time.perf_counter(), time.process_time()
        engine.solve(project, disabled=("E2",) if i % 2 == 0 else ())
        times.append(time.perf_counter() - t)
        cpu.append(time.process_time() - c)
    chains = list(engine._scope_domains(project)["U1"])
    observations = list(project.observations)
    columns = [tables.codes(tables.observation_key(o), chains)[0] for o in observations]
    ok = []
    for obs in observations:
        got, _ = tables.codes(tables.observation_key(obs), chains)
        kept = set(engine._kept(obs, chains))
        ok.append(np.unique([g for g, c in zip(got, chains, strict=True) if c in kept]))
    bare, bare_cpu = [], []
    for _ in range(101):
        t, c = time.perf_counter(), time.process_time()
        mask = np.ones(len(chains), dtype=bool)
        for col, good in zip(columns, ok, strict=True):
            mask &= np.isin(col, good)
        bare.append(time.perf_counter() - t)
        bare_cpu.append(time.process_time() - c)
    w, b = statistics.median(times), statistics.median(bare)
    wc, bc = statistics.median(cpu), statistics.median(bare_cpu)
    print("2. warm evidence change over the broadest scope (five observations, E2 switched off and on)")
    print(
        f"   wall: engine.solve {1000 * w:.2f} ms; bare numpy filter over the same columns {1000 * b:.3f} ms;"
        f" difference {1000 * (w - b):.2f} ms ({int(mask.sum())} left)"
    )
    print(
        f"   CPU time of this process (steadier on a shared machine): solve {1000 * wc:.2f} ms,"
        f" bare filter {1000 * bc:.3f} ms, difference {1000 * (wc - bc):.2f} ms"
    )


def first_open(path: Path) -> None:
    # In a notebook the kernel has IPython loaded already; the first open then pays our imports and the panels.
    code = (
        "import time; t0 = time.process_time()\n"
        "import IPython, ipywidgets\n"
        "t = time.process_time()\n"
        "from workbench.ui.app import Workbench\n"
        f"bench = Workbench.open({str(path)!r})\n"
        "t1 = time.process_time()\n"
        "print(t - t0, t1 - t)\n"
    )
    runs, kernel = [], []
    for _ in range(3):
        out = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True, check=True)
        before, panels = map(float, out.stdout.strip().splitlines()[-1].split())
        runs.append(panels)
        kernel.append(before)
    print("3. first open of the whole workbench on the broadest-scope project, fresh process, CPU seconds")
    print(
        f"   every panel built (imports of workbench included, plan ranked): {statistics.median(runs):.2f} s;"
        f" IPython and ipywidgets, loaded before by any kernel: {statistics.median(kernel):.2f} s (medians of 3)"
    )


def main() -> None:
    with tempfile.TemporaryDirectory() as tmp:
        path = Path(tmp) / "broad.json"
        path.write_text(json.dumps(ONE_OBSERVATION))
        cold_commands(path)
        warm_change()
        first_open(path)


if __name__ == "__main__":
    main()
