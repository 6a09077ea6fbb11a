"""The ``stereosieve`` command (Contract 2 in DESIGN.md).

Exit codes: 0 done; 2 bad input (message names the file, observation id or
field and what is wrong); 3 contradictory evidence; 1 only for a bug.
Each sub-command is one ``_cmd_*`` function; the heavy imports happen inside
them so that ``stereosieve --help`` stays fast.
"""

from __future__ import annotations

import argparse
import json
import sys
from collections.abc import Callable, Sequence

from workbench.errors import ContradictionError, WorkbenchError

EXIT_OK, EXIT_BUG, EXIT_BAD_INPUT, EXIT_CONTRADICTION = 0, 1, 2, 3


def _print_json(data: object) -> None:
    print(json.dumps(data, indent=2, ensure_ascii=False))


# ----------------------------------------------------------------- predict
def _cmd_predict(args: argparse.Namespace) -> int:
    from workbench.chem.parse import resolve
    from workbench.report_text import identity_json, predict_json, predict_text

    chain = resolve(args.sugar)
    if args.json:
        data = identity_json(chain)
        data["predictions"] = predict_json(chain)
        _print_json(data)
    else:
        print(predict_text(chain))
    return EXIT_OK


# ----------------------------------------------------------------- catalogue
def _cmd_catalogue(args: argparse.Namespace) -> int:
    from workbench.chem.catalogue import Scope, catalogue
    from workbench.report_text import identity_json

    scope = Scope(
        carbons=tuple(args.carbons),
        carbonyl=tuple(args.carbonyl),
        series=tuple(args.series),
        modifications=tuple(args.modifications),
    )
    members = catalogue(scope)
    if args.json:
        _print_json({"scope": scope.to_dict(), "count": len(members), "members": [identity_json(c) for c in members]})
        return EXIT_OK
    print(f"{len(members)} candidates in scope {scope.to_dict()}")
    print(f"{'#':>5}  {'name':<38} {'systematic name':<48} formula")
    for i, c in enumerate(members, 1):
        row = identity_json(c)
        print(f"{i:>5}  {row['name']:<38} {row['systematic_name']:<48} {c.formula}")
    return EXIT_OK


# ----------------------------------------------------------------- solve / validate
def _cmd_solve(args: argparse.Namespace) -> int:
    from workbench.evidence.engine import solve
    from workbench.evidence.project import load_project
    from workbench.report_text import solution_json, solution_text

    project = load_project(args.project)
    solution = solve(project, disabled=tuple(args.without or ()))
    if args.json:
        _print_json(solution_json(solution))
    else:
        print(solution_text(solution))
    return EXIT_CONTRADICTION if solution.contradictory else EXIT_OK


def _cmd_validate(args: argparse.Namespace) -> int:
    from workbench.chem.catalogue import catalogue
    from workbench.evidence.project import load_project

    project = load_project(args.project)
    print(f"{args.project}: valid stereosieve project '{project.title}'")
    for u in project.unknowns:
        print(f"  unknown {u.id}: {len(catalogue(u.scope))} candidates in scope {u.scope.to_dict()}")
    print(f"  {len(project.observations)} observation(s)")
    return EXIT_OK


# ----------------------------------------------------------------- plan
def _cmd_plan(args: argparse.Namespace) -> int:
    from workbench.evidence.planner import plan
    from workbench.evidence.project import load_project
    from workbench.report_text import plan_text

    project = load_project(args.project)
    result = plan(project, unknown=args.unknown, lookahead=args.lookahead, ranking=args.rank, limit=args.top)
    if args.json:
        _print_json(result.to_dict())
    else:
        print(plan_text(result))
    return (
        EXIT_CONTRADICTION
        if (not result.experiments and result.advice and "contradictory" in result.advice[0])
        else EXIT_OK
    )


# ----------------------------------------------------------------- demo
def _cmd_demo(args: argparse.Namespace) -> int:
    from workbench.chem.catalogue import DEFAULT_SCOPE, Scope, catalogue

    print("stereosieve demo: a tour of the catalogue (the demo project arrives with the engine)")
    print(f"default scope: {len(catalogue(DEFAULT_SCOPE))} candidates")
    big = Scope(carbons=(3, 4, 5, 6, 7, 8, 9), modifications=("any",))
    print(f"3-9 carbons, any modification: {len(catalogue(big))} candidates")
    return EXIT_OK


# ----------------------------------------------------------------- registry
Handler = Callable[[argparse.Namespace], int]
_HANDLERS: dict[str, Handler] = {
    "predict": _cmd_predict,
    "catalogue": _cmd_catalogue,
    "demo": _cmd_demo,
    "solve": _cmd_solve,
    "validate": _cmd_validate,
    "plan": _cmd_plan,
}


def build_parser() -> argparse.ArgumentParser:
    """The argument parser with every sub-command."""
    parser = argparse.ArgumentParser(
        prog="stereosieve",
        description="Assign the constitution and configuration of an unknown monosaccharide from the evidence.",
    )
    sub = parser.add_subparsers(dest="command", required=True)
    p = sub.add_parser("predict", help="what every experiment would show for one sugar (name or SMILES)")
    p.add_argument("sugar", help="a trivial or systematic name, or a SMILES (open chain or ring form)")
    p.add_argument("--json", action="store_true", help="print JSON (Contract 2)")
    c = sub.add_parser("catalogue", help="list the candidates of a scope")
    c.add_argument("--carbons", type=int, nargs="+", default=[3, 4, 5, 6, 7])
    c.add_argument("--carbonyl", nargs="+", default=["aldose", "ketose"], choices=["aldose", "ketose"])
    c.add_argument("--series", nargs="+", default=["D", "L"], choices=["D", "L"])
    c.add_argument("--modifications", nargs="+", default=["none"])
    c.add_argument("--json", action="store_true")
    s = sub.add_parser("solve", help="narrow every unknown of a project; show survivors, trail and conflicts")
    s.add_argument("project", help="project file (JSON)")
    s.add_argument("--json", action="store_true", help="print JSON (Contract 2)")
    s.add_argument("--without", nargs="+", metavar="ID", help="switch these observations off (what-if)")
    v = sub.add_parser("validate", help="check a project file and report every problem")
    v.add_argument("project", help="project file (JSON)")
    pl = sub.add_parser("plan", help="rank the next experiments by how well they split the survivors")
    pl.add_argument("project", help="project file (JSON)")
    pl.add_argument("--unknown", metavar="ID", help="plan for this unknown only")
    pl.add_argument("--json", action="store_true", help="print JSON (Contract 2)")
    pl.add_argument("--lookahead", action="store_true", help="also score pairs of experiments (two steps)")
    pl.add_argument("--rank", choices=["value", "information"], default="value", help="bits per effort, or bits alone")
    pl.add_argument("--top", type=int, default=15, help="how many experiments to list")
    d = sub.add_parser("demo", help="run the bundled demo project headless and print the narrowing")
    d.add_argument("--json", action="store_true")
    return parser


def main(argv: Sequence[str] | None = None) -> int:
    """Entry point of the console script; returns the exit code."""
    parser = build_parser()
    try:
        args = parser.parse_args(argv)
    except SystemExit as exc:  # argparse exits 2 on bad usage already
        return int(exc.code or 0)
    try:
        return _HANDLERS[args.command](args)
    except ContradictionError as err:
        print(f"stereosieve: {err}", file=sys.stderr)
        return EXIT_CONTRADICTION
    except WorkbenchError as err:
        print(f"stereosieve: {err}", file=sys.stderr)
        return EXIT_BAD_INPUT
    except (OSError, UnicodeDecodeError) as err:
        print(f"stereosieve: {err}", file=sys.stderr)
        return EXIT_BAD_INPUT


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
