"""Mutation testing of the chemistry and evidence layers (cosmic-ray), bounded in time.

Not part of CI (far too slow). Run by hand from the repository root, for example::

    python scripts/mutation_run.py --sample 200 --minutes 35
    python scripts/mutation_run.py --modules workbench/chem/reactions.py --sample 0

What it does:

1. copies ``workbench/``, ``tests/`` and ``pyproject.toml`` into a scratch folder, so that a run
   that is interrupted never leaves a mutated file in the working tree;
2. writes a cosmic-ray configuration there and lets ``cosmic-ray init`` list every mutation of the
   chosen modules (default: every module of ``workbench/chem`` and ``workbench/evidence``);
3. skips the operators that only make noise (bit and shift operators, ``is`` comparisons, variable
   shuffling, removing a decorator such as ``@cache``) and, with ``--sample N``, keeps a seeded random
   sample of N mutations spread over the modules in proportion to their size;
4. runs each mutation against a fast targeted test subset (``pytest -x``) until done or until
   ``--minutes`` of wall time have passed;
5. prints the score (killed / tested) and every surviving mutation with its file, line, operator and
   the source line, and writes the same as JSON (``--out``).

``--recheck FILE`` re-runs only the survivors listed in an earlier JSON report (after new tests were
written), so a triage can be confirmed without a full run.

Requires ``cosmic-ray`` (in the ``test`` extra of pyproject.toml).
"""

from __future__ import annotations

import argparse
import json
import random
import shutil
import subprocess
import sys
import tempfile
import time
from collections import defaultdict
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
DEFAULT_PACKAGES = ("workbench/chem", "workbench/evidence")
# Tests that exercise the chemistry and evidence layers and run in well under a minute.
DEFAULT_TESTS = (
    "tests/test_reactions.py",
    "tests/test_periodate.py",
    "tests/test_catalogue.py",
    "tests/test_smiles.py",
    "tests/test_names.py",
    "tests/test_parse.py",
    "tests/test_predictions.py",
    "tests/test_engine.py",
    "tests/test_planner.py",
    "tests/test_project.py",
    "tests/test_one_rule.py",
    "tests/test_blind_spots.py",
    "tests/test_anomeric_reference.py",
    "tests/test_names_in_use.py",
    "tests/test_residue_chem.py",
)
# Operators whose mutants are almost all crashes or equivalents in this code base.
EXCLUDED_OPERATORS = (
    r"core/ReplaceBinaryOperator_.*_(BitOr|BitAnd|BitXor|LShift|RShift|Pow|Mod|FloorDiv)",
    r"core/ReplaceBinaryOperator_(BitOr|BitAnd|BitXor|LShift|RShift|Pow|Mod|FloorDiv)_.*",
    r"core/ReplaceComparisonOperator_.*_(Is|IsNot)$",
    r"core/ReplaceUnaryOperator_.*Invert.*",
    r"core/VariableReplacer",
    r"core/VariableInserter",
    r"core/RemoveDecorator",
)


def _modules(packages: list[str]) -> list[str]:
    out: list[str] = []
    for entry in packages:
        path = ROOT / entry
        if path.is_file():
            out.append(entry)
        else:
            out += sorted(str(p.relative_to(ROOT)) for p in path.glob("*.py") if p.name != "__init__.py")
    return out


def _scratch_copy() -> Path:
    work = Path(tempfile.mkdtemp(prefix="stereosieve-mutation-"))
    shutil.copytree(ROOT / "workbench", work / "workbench", ignore=shutil.ignore_patterns("__pycache__"))
    shutil.copytree(ROOT / "tests", work / "tests", ignore=shutil.ignore_patterns("__pycache__"))
    shutil.copy2(ROOT / "pyproject.toml", work / "pyproject.toml")
    return work


def _test_command(tests: list[str]) -> str:
    present = [t for t in tests if (ROOT / t).exists()]
    return f"{sys.executable} -m pytest -x -q -p no:cacheprovider --no-header " + " ".join(present)


def _write_config(work: Path, modules: list[str], tests: list[str], timeout: float) -> Path:
    mods = ", ".join(json.dumps(m) for m in modules)
    excluded = ", ".join(json.dumps(e) for e in EXCLUDED_OPERATORS)
    text = (
        "[cosmic-ray]\n"
        f"module-path = [{mods}]\n"
        f"timeout = {timeout}\n"
        "excluded-modules = []\n"
        f"test-command = {json.dumps(_test_command(tests))}\n"
        '\n[cosmic-ray.distributor]\nname = "local"\n'
        f"\n[cosmic-ray.filters.operators-filter]\nexclude-operators = [{excluded}]\n"
    )
    config = work / "mutation.toml"
    config.write_text(text)
    return config


def _sample(session: Path, n: int, seed: int, keep: set[tuple[str, int, str]] | None) -> int:
    """Mark all pending items but a seeded sample (or the ``keep`` set) as skipped; return how many stay."""
    from cosmic_ray.work_db import WorkDB, use_db
    from cosmic_ray.work_item import WorkerOutcome, WorkResult

    with use_db(str(session), WorkDB.Mode.open) as db:
        pending = list(db.pending_work_items)
        if keep is not None:
            chosen = {
                item.job_id
                for item in pending
                for m in item.mutations
                if (str(m.module_path), m.start_pos[0], m.operator_name) in keep
            }
        elif n <= 0 or n >= len(pending):
            return len(pending)
        else:
            by_module: dict[str, list] = defaultdict(list)
            for item in pending:
                by_module[str(item.mutations[0].module_path)].append(item)
            rng = random.Random(seed)
            chosen = set()
            for items in by_module.values():
                share = max(1, round(n * len(items) / len(pending)))
                chosen |= {i.job_id for i in rng.sample(items, min(share, len(items)))}
        skip = [item.job_id for item in pending if item.job_id not in chosen]
        db.set_multiple_results(skip, WorkResult(output="not sampled", worker_outcome=WorkerOutcome.SKIPPED))
        return len(chosen)


def _report(session: Path, work: Path) -> dict:
    from cosmic_ray.work_db import WorkDB, use_db
    from cosmic_ray.work_item import TestOutcome, WorkerOutcome

    killed = survived = incompetent = 0
    survivors = []
    with use_db(str(session), WorkDB.Mode.open) as db:
        for item, result in db.completed_work_items:
            if result.worker_outcome == WorkerOutcome.SKIPPED:
                continue
            if result.worker_outcome != WorkerOutcome.NORMAL:
                incompetent += 1  # the mutant broke the import or timed out: counted as killed below
                continue
            if result.test_outcome == TestOutcome.SURVIVED:
                survived += 1
                for m in item.mutations:
                    path = str(m.module_path)
                    lines = (work / path).read_text().splitlines()
                    survivors.append(
                        {
                            "module": path,
                            "line": m.start_pos[0],
                            "operator": m.operator_name,
                            "occurrence": m.occurrence,
                            "source": lines[m.start_pos[0] - 1].strip(),
                            "job": item.job_id,
                        }
                    )
            else:
                killed += 1
    tested = killed + survived + incompetent
    return {
        "tested": tested,
        "killed": killed + incompetent,
        "survived": survived,
        "score": round((killed + incompetent) / tested, 4) if tested else None,
        "survivors": sorted(survivors, key=lambda s: (s["module"], s["line"])),
    }


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--modules", nargs="*", default=list(DEFAULT_PACKAGES), help="files or package folders")
    parser.add_argument("--tests", nargs="*", default=list(DEFAULT_TESTS), help="test files to run per mutant")
    parser.add_argument("--sample", type=int, default=200, help="mutations to test (0: all)")
    parser.add_argument("--seed", type=int, default=15)
    parser.add_argument("--minutes", type=float, default=35.0, help="wall-time budget of the run")
    parser.add_argument("--timeout", type=float, default=240.0, help="seconds per mutant before it counts as killed")
    parser.add_argument("--out", default="mutation_report.json")
    parser.add_argument("--recheck", help="JSON report whose survivors are run again")
    parser.add_argument("--keep", action="store_true", help="keep the scratch folder")
    args = parser.parse_args(argv)
    if shutil.which("cosmic-ray") is None:
        print("cosmic-ray is not installed: pip install cosmic-ray", file=sys.stderr)
        return 2
    keep = None
    modules = _modules(args.modules)
    if args.recheck:
        old = json.loads(Path(args.recheck).read_text())
        keep = {(s["module"], s["line"], s["operator"]) for s in old["survivors"]}
        modules = sorted({s["module"] for s in old["survivors"]})
    work = _scratch_copy()
    try:
        config = _write_config(work, modules, args.tests, args.timeout)
        session = work / "session.sqlite"
        base = subprocess.run(_test_command(args.tests).split(), cwd=work, capture_output=True, text=True)
        if base.returncode != 0:
            print("the unmutated test subset fails; fix it first:\n" + base.stdout[-2000:], file=sys.stderr)
            return 1
        subprocess.run(["cosmic-ray", "init", str(config), str(session)], cwd=work, check=True)
        subprocess.run(["cr-filter-operators", str(session), str(config)], cwd=work, check=True)
        count = _sample(session, args.sample, args.seed, keep)
        print(f"{len(modules)} modules, {count} mutations to test, budget {args.minutes:g} min", flush=True)
        start = time.monotonic()
        proc = subprocess.Popen(["cosmic-ray", "exec", str(config), str(session)], cwd=work)
        try:
            proc.wait(timeout=args.minutes * 60)
        except subprocess.TimeoutExpired:
            proc.terminate()
            proc.wait(timeout=60)
            print("wall-time budget reached; reporting the mutations tested so far", flush=True)
        report = _report(session, work)
        report["minutes"] = round((time.monotonic() - start) / 60, 1)
        report["modules"] = modules
        Path(args.out).write_text(json.dumps(report, indent=2) + "\n")
        print(
            f"tested {report['tested']}, killed {report['killed']}, survived {report['survived']}, "
            f"score {report['score']}, {report['minutes']} min"
        )
        for s in report["survivors"]:
            print(f"  {s['module']}:{s['line']}  {s['operator']}  | {s['source']}")
    finally:
        if args.keep:
            print(f"scratch folder kept: {work}")
        else:
            shutil.rmtree(work, ignore_errors=True)
    return 0


if __name__ == "__main__":
    sys.exit(main())
