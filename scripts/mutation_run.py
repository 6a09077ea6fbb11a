"""Mutation testing of the chemistry and evidence layers (cosmic-ray), bounded in time.

Not part of CI (far too slow). Run by hand from the repository root, for example::

    python scripts/mutation_run.py --sample 160 --minutes 35
    python scripts/mutation_run.py --modules workbench/chem/reactions.py --sample 0

What it does:

1. copies ``workbench/``, ``tests/`` and ``pyproject.toml`` into a scratch folder, so that a run
   that is interrupted never leaves a mutated file in the working tree;
2. writes a cosmic-ray configuration there and lets ``cosmic-ray init`` list every mutation of the
   chosen modules (default: every module of ``workbench/chem`` and ``workbench/evidence``);
3. skips the operators that only make noise (bit and shift operators, ``is`` comparisons, variable
   shuffling, removing a decorator such as ``@cache``) and, with ``--sample N``, keeps a seeded random
   sample of N mutations spread over the modules in proportion to their size;
4. runs each mutation against a fast test subset targeted at its module (``MODULE_TESTS``,
   ``pytest -x``; a small picker finds the mutated module), until done or ``--minutes`` have passed;
5. prints the score (killed / tested) and every surviving mutation with its file, line, operator and
   the source line, and writes the same as JSON (``--out``).

``--recheck FILE`` re-runs only the survivors listed in an earlier JSON report (after new tests were
written), so a triage can be confirmed without a full run.

Requires ``cosmic-ray`` (the ``mutation`` extra of pyproject.toml: ``pip install ".[mutation]"``).
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
from pathlib import Path
from typing import Any

ROOT = Path(__file__).resolve().parent.parent
DEFAULT_PACKAGES = ("workbench/chem", "workbench/evidence")
# Fast targeted tests per module (file stem); a module not listed gets FALLBACK_TESTS.
_CHEM = ("test_reactions", "test_one_rule", "test_blind_spots", "test_predictions")
MODULE_TESTS: dict[str, tuple[str, ...]] = {
    "reactions": _CHEM,
    "predictions": ("test_one_rule", "test_predictions", "test_blind_spots", "test_reactions"),
    "periodate": ("test_periodate", "test_blind_spots", "test_predictions"),
    "smiles": ("test_smiles", "test_blind_spots", "test_anomeric_reference", "test_reactions"),
    "chain": ("test_smiles", "test_catalogue", "test_blind_spots", "test_reactions"),
    "catalogue": ("test_catalogue", "test_one_rule", "test_smiles"),
    "names": ("test_names", "test_names_in_use", "test_parse"),
    "parse": ("test_parse", "test_names", "test_names_in_use"),
    "symbols": ("test_names_in_use", "test_names", "test_parse"),
    "derivatives": ("test_modified_sugars", "test_reactions", "test_predictions"),
    "methylation": ("test_residue_chem", "test_residue_engine"),
    "residue": ("test_residue_chem", "test_residue_engine"),
    "residue_periodate": ("test_residue_chem", "test_residue_engine"),
    "residue_outcomes": ("test_residue_engine", "test_residue_chem"),
    "engine": ("test_blind_spots", "test_engine", "test_one_rule", "test_samples"),
    "network": ("test_blind_spots", "test_engine", "test_uncertainty"),
    "posterior": ("test_uncertainty", "test_engine", "test_conflicts"),
    "outcomes": ("test_blind_spots", "test_one_rule", "test_engine", "test_samples"),
    "planner": ("test_planner", "test_one_rule"),
    "costs": ("test_planner", "test_report"),
    "observations": ("test_project", "test_engine", "test_schema"),
    "project": ("test_project", "test_schema", "test_engine"),
    "schema": ("test_schema", "test_project"),
    "merge": ("test_merge", "test_project"),
    "rivals": ("test_report", "test_engine"),
    "tables": ("test_tables", "test_engine"),
}
FALLBACK_TESTS = ("test_engine", "test_predictions", "test_project")
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
    for folder in ("workbench", "tests"):
        shutil.copytree(ROOT / folder, work / folder, ignore=shutil.ignore_patterns("__pycache__"))
    shutil.copytree(ROOT / "workbench", work / "pristine", ignore=shutil.ignore_patterns("__pycache__"))
    shutil.copy2(ROOT / "pyproject.toml", work / "pyproject.toml")
    return work


def _tests_for(stem: str, chosen: list[str] | None) -> list[str]:
    if chosen:
        return chosen
    return [f"tests/{t}.py" for t in MODULE_TESTS.get(stem, FALLBACK_TESTS) if (ROOT / "tests" / f"{t}.py").exists()]


# Run by cosmic-ray for each mutant: finds the one mutated module (it differs from the pristine
# copy) and runs the tests targeted at that module, stopping at the first failure.
_PICKER = """
import subprocess, sys
from pathlib import Path
work = Path(__file__).resolve().parent
targets = {targets!r}
fallback = {fallback!r}
changed = [p.stem for p in (work / "workbench").rglob("*.py")
           if p.read_bytes() != (work / "pristine" / p.relative_to(work / "workbench")).read_bytes()]
tests = targets.get(changed[0], fallback) if changed else fallback
sys.exit(subprocess.call([sys.executable, "-m", "pytest", "-x", "-q", "-p", "no:cacheprovider", "--no-header", *tests],
                         cwd=work, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL))
"""


def _write_config(work: Path, modules: list[str], tests: list[str] | None, timeout: float) -> Path:
    stems = {Path(m).stem for m in modules}
    targets = {stem: _tests_for(stem, tests) for stem in stems}
    picker = work / "pick_tests.py"
    picker.write_text(_PICKER.format(targets=targets, fallback=_tests_for("", tests)))
    mods = ", ".join(json.dumps(m) for m in modules)
    excluded = ", ".join(json.dumps(e) for e in EXCLUDED_OPERATORS)
    text = (
        "[cosmic-ray]\n"
        f"module-path = [{mods}]\n"
        f"timeout = {timeout}\n"
        "excluded-modules = []\n"
        f"test-command = {json.dumps(f'{sys.executable} {picker}')}\n"
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
            rng = random.Random(seed)
            chosen = {i.job_id for i in rng.sample(pending, n)}  # spread over the modules by their size
        skip = [item.job_id for item in pending if item.job_id not in chosen]
        db.set_multiple_results(skip, WorkResult(output="not sampled", worker_outcome=WorkerOutcome.SKIPPED))
        return len(chosen)


def _report(session: Path, work: Path, tests: list[str] | None) -> dict[str, Any]:
    from cosmic_ray.work_db import WorkDB, use_db
    from cosmic_ray.work_item import TestOutcome, WorkerOutcome

    out: dict[str, Any] = {"tested": 0, "killed": 0, "survived": 0, "survivors": [], "per_module": {}}
    with use_db(str(session), WorkDB.Mode.open) as db:
        for item, result in db.completed_work_items:
            if result.worker_outcome == WorkerOutcome.SKIPPED:
                continue
            m = item.mutations[0]
            path = str(m.module_path)
            row = out["per_module"].setdefault(path, {"tested": 0, "killed": 0, "survived": 0})
            out["tested"] += 1
            row["tested"] += 1
            # an abnormal worker outcome (the mutant broke the import, or timed out) counts as killed
            if result.worker_outcome == WorkerOutcome.NORMAL and result.test_outcome == TestOutcome.SURVIVED:
                out["survived"] += 1
                row["survived"] += 1
                lines = (work / path).read_text().splitlines()
                out["survivors"].append(
                    {
                        "module": path,
                        "line": m.start_pos[0],
                        "operator": m.operator_name,
                        "occurrence": m.occurrence,
                        "source": lines[m.start_pos[0] - 1].strip(),
                        "tests": _tests_for(Path(path).stem, tests),
                    }
                )
            else:
                out["killed"] += 1
                row["killed"] += 1
    out["score"] = round(out["killed"] / out["tested"], 4) if out["tested"] else None
    out["survivors"].sort(key=lambda x: (x["module"], x["line"]))
    return out


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--modules", nargs="*", default=list(DEFAULT_PACKAGES), help="files or package folders")
    parser.add_argument("--tests", nargs="*", help="test files to run per mutant (default: per module, MODULE_TESTS)")
    parser.add_argument("--sample", type=int, default=160, help="mutations to test (0: all)")
    parser.add_argument("--seed", type=int, default=15)
    parser.add_argument("--minutes", type=float, default=35.0, help="wall-time budget of the mutant runs")
    parser.add_argument("--timeout", type=float, default=240.0, help="seconds per mutant before it counts as killed")
    parser.add_argument("--out", default="mutation_report.json")
    parser.add_argument("--recheck", help="JSON report whose survivors are run again")
    parser.add_argument("--keep", action="store_true", help="keep the scratch folder")
    args = parser.parse_args(argv)
    if shutil.which("cosmic-ray") is None:
        print("cosmic-ray is not installed: pip install cosmic-ray", file=sys.stderr)
        return 2
    keep: set[tuple[str, int, str]] | None = None
    modules = _modules(args.modules)
    if args.recheck:
        old = json.loads(Path(args.recheck).read_text())
        keep = {(s["module"], s["line"], s["operator"]) for s in old["survivors"]}
        modules = sorted({s["module"] for s in old["survivors"]})
    work = _scratch_copy()
    try:
        config = _write_config(work, modules, args.tests, args.timeout)
        session = work / "session.sqlite"
        subprocess.run(["cosmic-ray", "init", str(config), str(session)], cwd=work, check=True)
        subprocess.run(["cr-filter-operators", str(session), str(config)], cwd=work, check=True)
        count = _sample(session, args.sample, args.seed, keep)
        print(f"{len(modules)} modules, {count} mutations to test, budget {args.minutes:g} min", flush=True)
        start = time.monotonic()
        proc = subprocess.Popen(
            ["cosmic-ray", "exec", str(config), str(session)],
            cwd=work,
            stdout=subprocess.DEVNULL,
            stderr=subprocess.DEVNULL,
        )
        try:
            proc.wait(timeout=args.minutes * 60)
        except subprocess.TimeoutExpired:
            proc.terminate()
            proc.wait(timeout=60)
            print("wall-time budget reached; reporting the mutations tested so far", flush=True)
        report = _report(session, work, args.tests)
        report["minutes"] = round((time.monotonic() - start) / 60, 1)
        report["planned"] = count
        Path(args.out).write_text(json.dumps(report, indent=2) + "\n")
        print(
            f"tested {report['tested']} of {count}, killed {report['killed']}, survived {report['survived']}, "
            f"score {report['score']}, {report['minutes']} min"
        )
        for module, row in sorted(report["per_module"].items()):
            print(f"  {module:<40} tested {row['tested']:>3}  survived {row['survived']:>3}")
        for x in report["survivors"]:
            print(f"  SURVIVED {x['module']}:{x['line']}  {x['operator']}  | {x['source']}")
    finally:
        if args.keep:
            print(f"scratch folder kept: {work}")
        else:
            shutil.rmtree(work, ignore_errors=True)
    return 0


if __name__ == "__main__":
    sys.exit(main())
