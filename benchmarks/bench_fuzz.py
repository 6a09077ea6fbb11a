"""The full seeded fuzz run: malformed project files through solve, validate, plan and report.

Run: ``python benchmarks/bench_fuzz.py [--count 10000] [--seed 20241202] [--timeout 60]``.
Cases come from tests/fuzzing.py (mutations of the sample projects, one
category and one command per case, all fixed by the seed); every command runs
in-process through ``workbench.cli.main``. Prints the exit-code table
(category x exit code; ``traceback`` and ``hang`` are failures), the slowest
runs and every failure with its case number for replay. A partial table is
printed every 500 cases, so a long run can be read while it goes.
"""

from __future__ import annotations

import argparse
import collections
import json
import sys
import tempfile
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent / "tests"))

from fuzzing import CATEGORIES, Outcome, cases, run_case  # noqa: E402

CODES: tuple[int | str, ...] = (0, 2, 3, 1, "traceback", "hang")


def table(outcomes: list[Outcome]) -> str:
    counts: dict[str, collections.Counter] = {c: collections.Counter() for c in CATEGORIES}
    for o in outcomes:
        counts[o.case.category][o.code] += 1
    head = f"{'category':<16}" + "".join(f"{str(c):>11}" for c in CODES) + f"{'total':>8}{'max s':>8}"
    lines = [head, "-" * len(head)]
    for cat in CATEGORIES:
        mine = [o for o in outcomes if o.case.category == cat]
        slowest = max((o.seconds for o in mine), default=0.0)
        lines.append(f"{cat:<16}" + "".join(f"{counts[cat][c]:>11}" for c in CODES) + f"{len(mine):>8}{slowest:>8.1f}")
    total = collections.Counter(o.code for o in outcomes)
    lines.append(f"{'all':<16}" + "".join(f"{total[c]:>11}" for c in CODES) + f"{len(outcomes):>8}")
    return "\n".join(lines)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__)
    parser.add_argument("--count", type=int, default=10_000)
    parser.add_argument("--seed", type=int, default=20_241_202)
    parser.add_argument("--timeout", type=int, default=60, help="seconds before a run counts as a hang")
    parser.add_argument("--part", default="0/1", help="K/N: run only the cases whose number is K modulo N")
    parser.add_argument("--first", type=int, default=0, help="skip the cases numbered below this")
    parser.add_argument("--save", metavar="FILE.json", help="also write every outcome (for joining parts)")
    args = parser.parse_args()
    k, n = (int(x) for x in args.part.split("/"))
    start = time.perf_counter()
    outcomes: list[Outcome] = []
    with tempfile.TemporaryDirectory() as folder:
        for case in cases(args.seed, args.count, scale=2):
            if case.number % n != k or case.number < args.first:
                continue
            outcomes.append(run_case(case, Path(folder), timeout_s=args.timeout))
            if len(outcomes) % 500 == 0:
                print(f"\n{len(outcomes)} cases, {time.perf_counter() - start:.0f} s", flush=True)
                print(table(outcomes), flush=True)
    wall = time.perf_counter() - start
    print(f"\n== {len(outcomes)} cases (seed {args.seed}) in {wall:.0f} s ==")
    print(table(outcomes))
    over = [o for o in outcomes if o.seconds > 10]
    print(f"\nruns over 10 s: {len(over)}")
    print("slowest runs:")
    for o in sorted(outcomes, key=lambda o: -o.seconds)[:12]:
        print(
            f"  case {o.case.number:>5} {o.case.category:<15} {o.case.command:<9} exit {o.code!s:<9} {o.seconds:7.2f} s"
        )
    if args.save:
        rows = [[o.case.number, o.case.category, o.case.command, o.code, round(o.seconds, 3)] for o in outcomes]
        Path(args.save).write_text(json.dumps(rows), encoding="utf-8")
    failures = [o for o in outcomes if o.code not in (0, 2, 3)]
    print(f"\nfailures: {len(failures)}")
    for o in failures[:40]:
        print(f"  case {o.case.number} {o.case.category} {o.case.command}: {o.code} {o.detail}")


if __name__ == "__main__":
    main()
