"""The ``stereosieve`` command (Contract 2 in DESIGN.md).

Exit codes: 0 done; 2 bad input (message names the file, observation id or
field and what is wrong); 3 contradictory evidence; 1 only for a bug.
Each sub-command is one ``_cmd_*`` function; the heavy imports happen inside
them so that ``stereosieve --help`` stays fast.
"""

from __future__ import annotations

import argparse
import json
import os
import sys
from collections.abc import Callable, Sequence

from workbench.errors import ContradictionError, WorkbenchError
from workbench.escaping import json_text, terminal_text
from workbench.inputs import valid_text

EXIT_OK, EXIT_BUG, EXIT_BAD_INPUT, EXIT_CONTRADICTION = 0, 1, 2, 3


def _print_json(data: object) -> None:
    """JSON on stdout (Contract 2); control, bidi and surrogate characters written as escapes."""
    print(json_text(json.dumps(data, indent=2, ensure_ascii=False, allow_nan=False)))


def _say(text: object = "") -> None:
    """A line for the terminal: text from project files cannot send escape sequences to it."""
    print(terminal_text(text))


def _warn(text: object) -> None:
    """A message on stderr, escaped like :func:`_say`."""
    print(terminal_text(f"stereosieve: {text}"), file=sys.stderr)


# ----------------------------------------------------------------- predict
def _cmd_predict(args: argparse.Namespace) -> int:
    from workbench.chem.parse import read_compound
    from workbench.report_text import compound_text, identity_json, predict_json, predict_text

    compound = read_compound(args.sugar)
    chain = compound.chain
    if compound.kind != "sugar":  # a methyl glycoside or an alditol is predicted as itself
        from workbench.chem.derivatives import compound_json

        data = compound_json(compound)
        if args.json:
            _print_json(data)
        else:
            _say(compound_text(data))
        return EXIT_OK
    if args.json:
        data = identity_json(chain)
        data["predictions"] = predict_json(chain)
        _print_json(data)
    else:
        _say(predict_text(chain))
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
    _say(f"{len(members)} candidates in scope {scope.to_dict()}")
    _say(f"{'#':>5}  {'name':<38} {'systematic name':<48} formula")
    for i, c in enumerate(members, 1):
        row = identity_json(c)
        _say(f"{i:>5}  {row['name']:<38} {row['systematic_name']:<48} {c.formula}")
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
        _say(solution_text(solution))
    return EXIT_CONTRADICTION if solution.contradictory else EXIT_OK


def _cmd_validate(args: argparse.Namespace) -> int:
    from workbench.chem.catalogue import catalogue
    from workbench.evidence.project import load_project

    project = load_project(args.project)
    _say(f"{args.project}: valid stereosieve project '{project.title}'")
    for u in project.unknowns:
        _say(f"  unknown {u.id}: {len(catalogue(u.scope))} candidates in scope {u.scope.to_dict()}")
    _say(f"  {len(project.observations)} observation(s)")
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
        _say(plan_text(result))
    return EXIT_CONTRADICTION if result.contradictory else EXIT_OK


# ----------------------------------------------------------------- demo
def _cmd_demo(args: argparse.Namespace) -> int:
    from workbench.data import DEMO_PROJECT, data_path
    from workbench.evidence.engine import solve
    from workbench.evidence.project import project_from_dict
    from workbench.report_text import solution_json, solution_text

    path = data_path(DEMO_PROJECT)
    project = project_from_dict(json.loads(path.read_text(encoding="utf-8")), source=str(path))
    solution = solve(project)
    if args.json:
        _print_json(solution_json(solution))
    else:
        _say("stereosieve demo: an invented project, solved step by step\n")
        _say(solution_text(solution))
        _say("\nTry it yourself: 'stereosieve lab' opens this project in the notebook workbench.")
    return EXIT_OK


# ----------------------------------------------------------------- report
def _cmd_report(args: argparse.Namespace) -> int:
    from workbench.evidence.engine import solve
    from workbench.evidence.project import load_project
    from workbench.report import check_report_path, render_report, write_report

    check_report_path(args.output, protect=(args.project,))  # refuse a bad output before the work
    project = load_project(args.project)
    solution = solve(project, disabled=tuple(args.without or ()))
    plan_result = None
    if not args.no_plan:
        from workbench.evidence.planner import plan

        plan_result = plan(project, solution=solution, limit=args.top)
    target = write_report(render_report(project, solution, plan_result), args.output, protect=(args.project,))
    _say(f"report written to {target}")
    if solution.contradictory:
        sets = "; ".join("{" + ", ".join(c) + "}" for c in solution.conflicts)
        _warn(f"the evidence is contradictory: {sets} (the report explains the conflict)")
        return EXIT_CONTRADICTION
    return EXIT_OK


# ----------------------------------------------------------------- export / merge / schema
def _write_or_print(text: str, output: str | None, protect: tuple[str, ...], what: str, example: str) -> None:
    """``text`` to the file ``output`` (checked, atomic, umask) or to standard output."""
    from workbench.files import check_output, write_text_atomic

    if output is None:  # data for a pipe as it is; on a terminal, controls from the file shown as escapes
        sys.stdout.write(terminal_text(text) if sys.stdout.isatty() else text)
        return
    target = check_output(output, protect, what=what, example=example)
    written = write_text_atomic(target, text)
    print(terminal_text(f"{what} written to {written}"), file=sys.stderr)


def _cmd_export(args: argparse.Namespace) -> int:
    from workbench.evidence.engine import solve
    from workbench.evidence.project import load_project
    from workbench.export import export_text
    from workbench.files import check_output

    if args.output is not None:
        check_output(args.output, (args.project,), what="export", example=f"survivors.{args.format}")
    solution = solve(load_project(args.project))
    if solution.contradictory:
        sets = "; ".join("{" + ", ".join(c) + "}" for c in solution.conflicts)
        _warn(f"the evidence is contradictory: {sets}; nothing survives to export")
        return EXIT_CONTRADICTION
    _write_or_print(export_text(solution, args.format), args.output, (args.project,), "export", "survivors.sdf")
    return EXIT_OK


def _read_json(path: str) -> object:
    """A parsed JSON file under the input guard; :class:`ProjectError` naming the file when it cannot be used."""
    from workbench.inputs import read_project_json

    return read_project_json(path)


def _cmd_merge(args: argparse.Namespace) -> int:
    from workbench.evidence.merge import merge_projects
    from workbench.evidence.project import dumps_project
    from workbench.files import check_output, write_text_atomic

    target = check_output(args.output, (), what="merged project", example="merged.json")
    merged = merge_projects(_read_json(args.first), _read_json(args.second), (args.first, args.second))
    written = write_text_atomic(target, dumps_project(merged.project))
    for note in merged.notes:
        _say(f"note: {note}")
    project = merged.project
    _say(
        f"merged {args.first} and {args.second} into {written}: {len(project.unknowns)} unknown(s), "
        f"{len(project.observations)} observation(s); {len(merged.shared)} kept once, "
        f"{len(merged.added)} added from {args.second}"
    )
    return EXIT_OK


def _cmd_schema(args: argparse.Namespace) -> int:
    from workbench.evidence.schema import project_schema

    text = json.dumps(project_schema(), indent=2, ensure_ascii=False) + "\n"
    _write_or_print(text, args.output, (), "schema", "project.schema.json")
    return EXIT_OK


# ----------------------------------------------------------------- lab / app
def _cmd_lab(args: argparse.Namespace) -> int:
    from workbench.ui.notebook import launch_lab, prepare_lab

    files = prepare_lab(args.project, directory=args.dir)
    for path in files.created:
        _say(f"created {path}")
    _say(f"project  {files.project}")
    _say(f"notebook {files.notebook}")
    if args.prepare_only:
        return EXIT_OK
    code = launch_lab(files.notebook, browser=not args.no_browser, port=args.port, extra=args.passthrough)
    return EXIT_OK if code == 0 else EXIT_BUG


def _cmd_app(args: argparse.Namespace) -> int:
    from workbench.ui.notebook import launch_app, prepare_project

    project, created = prepare_project(args.project, directory=args.dir)
    for path in created:
        _say(f"created {path}")
    _say(f"project  {project}")
    code = launch_app(project, browser=not args.no_browser, port=args.port, extra=args.passthrough)
    return EXIT_OK if code == 0 else EXIT_BUG


# ----------------------------------------------------------------- mutarotation
def _cmd_mutarotation(args: argparse.Namespace) -> int:
    from workbench.conformers.curve_file import read_curve
    from workbench.conformers.mutarotation import fit_mutarotation
    from workbench.errors import FitError

    if (args.alpha is None) != (args.beta is None):
        raise FitError("give both --alpha and --beta (the pure anomers' rotations), or --sugar NAME")
    if args.sugar and args.alpha is not None:
        raise FitError("give either --sugar or --alpha/--beta, not both")
    alpha, beta, rotation_source, sugar = args.alpha, args.beta, None, None
    if args.sugar:
        from workbench.chem.names import display_name
        from workbench.chem.parse import resolve
        from workbench.conformers.polarimetry import published_rotation

        chain = resolve(args.sugar)
        sugar = display_name(chain)
        record = published_rotation(chain)
        if record is not None and record.alpha is not None and record.beta is not None:
            alpha, beta, rotation_source = record.alpha, record.beta, record.source
    curve = read_curve(args.curve)
    fit = fit_mutarotation(curve.times_min, curve.rotations, alpha=alpha, beta=beta)
    data = fit.to_dict()
    data["file"] = curve.source
    if sugar is not None:
        data["sugar"] = sugar
        data["rotation_source"] = rotation_source
    if args.json:
        _print_json(data)
        return EXIT_OK
    _say(f"mutarotation fit of {curve.source} ({fit.points} points, first-order approach to equilibrium)")
    _say(f"  rate_constant_per_min  {fit.rate_constant_per_min:.5g}")
    _say(f"  half_life_min          {fit.half_life_min:.4g}")
    _say(f"  initial_rotation       {fit.initial_rotation:.2f}")
    _say(f"  equilibrium_rotation   {fit.equilibrium_rotation:.2f}")
    _say(f"  rmse                   {fit.rmse:.3g}")
    if fit.beta_fraction is not None:
        _say(
            f"  beta_fraction          {fit.beta_fraction:.3f}  (two-state model, alpha {alpha:+.1f}, beta {beta:+.1f})"
        )
        if rotation_source:
            _say(f"  anomer rotations from  {rotation_source}")
    elif sugar is not None:
        _say(f"  beta_fraction          unknown: no published alpha and beta rotations for {sugar}")
    else:
        _say("  beta_fraction          unknown: give --alpha and --beta, or --sugar NAME")
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
    "mutarotation": _cmd_mutarotation,
    "report": _cmd_report,
    "lab": _cmd_lab,
    "app": _cmd_app,
    "export": _cmd_export,
    "merge": _cmd_merge,
    "schema": _cmd_schema,
}

# Commands that hand the options after "--" to the server they start.
_PASSTHROUGH = ("lab", "app")


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
    mu = sub.add_parser("mutarotation", help="fit a polarimetry time course (first-order approach to equilibrium)")
    mu.add_argument("curve", help="CSV file with columns time_min,specific_rotation")
    mu.add_argument("--alpha", type=float, metavar="DEG", help="[alpha]D of the pure alpha anomer")
    mu.add_argument("--beta", type=float, metavar="DEG", help="[alpha]D of the pure beta anomer")
    mu.add_argument("--sugar", metavar="NAME", help="take the anomers' rotations from the published table")
    mu.add_argument("--json", action="store_true", help="print JSON")
    d = sub.add_parser("demo", help="run the bundled demo project headless and print the narrowing")
    d.add_argument("--json", action="store_true")
    r = sub.add_parser("report", help="write a self-contained HTML report of a project")
    r.add_argument("project", help="project file (JSON)")
    r.add_argument("-o", "--output", required=True, metavar="FILE.html", help="where to write the report")
    r.add_argument("--without", nargs="+", metavar="ID", help="switch these observations off (what-if)")
    r.add_argument("--no-plan", action="store_true", help="leave out the next-experiment ranking")
    r.add_argument("--top", type=int, default=8, help="how many next experiments to list")
    lab = sub.add_parser("lab", help="open JupyterLab on the workbench notebook for a project (default: the demo)")
    lab.add_argument("project", nargs="?", help="project file (JSON); default: a copy of the demo project here")
    lab.add_argument("--dir", default=".", help="where to put the demo copy when no project is given")
    lab.add_argument("--prepare-only", action="store_true", help="write the notebook, do not start JupyterLab")
    lab.add_argument("--no-browser", action="store_true", help="start JupyterLab without opening a browser")
    lab.add_argument("--port", type=_port, metavar="N", help="serve on this port (default: JupyterLab's choice)")
    lab.epilog = "Options after '--' go to JupyterLab unchanged, e.g. stereosieve lab p.json -- --ServerApp.token=abc"
    ap = sub.add_parser("app", help="the workbench panels alone (no code) as a standalone page (Voila)")
    ap.add_argument("project", nargs="?", help="project file (JSON); default: a copy of the demo project here")
    ap.add_argument("--dir", default=".", help="where to put the demo copy when no project is given")
    ap.add_argument("--port", type=_port, metavar="N", help="serve on this port (default 8866 or the next free)")
    ap.add_argument("--no-browser", action="store_true", help="start the page server without opening a browser")
    ap.epilog = "Options after '--' go to Voila unchanged."
    ex = sub.add_parser("export", help="write the survivors of every unknown as SDF or CSV")
    ex.add_argument("project", help="project file (JSON)")
    ex.add_argument("--format", required=True, choices=["sdf", "csv"], help="SDF (RDKit, with properties) or CSV")
    ex.add_argument("-o", "--output", metavar="FILE", help="where to write (default: standard output)")
    me = sub.add_parser("merge", help="combine two collaborators' project files (clashing ids are named, exit 2)")
    me.add_argument("first", metavar="A.json", help="the first project file (its title and order come first)")
    me.add_argument("second", metavar="B.json", help="the second project file")
    me.add_argument("-o", "--output", required=True, metavar="OUT.json", help="where to write the merged project")
    sc = sub.add_parser("schema", help="print the JSON Schema (draft 2020-12) of the project file")
    sc.add_argument("-o", "--output", metavar="FILE", help="where to write (default: standard output)")
    return parser


def _port(text: str) -> int:
    """A TCP port number for ``--port`` (1-65535)."""
    try:
        port = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"{text!r} is not a port number") from None
    if not 0 < port < 65536:
        raise argparse.ArgumentTypeError(f"{port} is not a port number from 1 to 65535")
    return port


# Arguments read as text (names, ids, modification words), not as file paths: a path may hold any
# bytes the file system allows, text must be valid Unicode.
_TEXT_ARGUMENTS = ("sugar", "modifications", "without", "unknown")


def _garbled_text_argument(args: argparse.Namespace) -> str:
    """A message if a text argument holds bytes that are not UTF-8 (Python keeps them as lone surrogates)."""
    for dest in _TEXT_ARGUMENTS:
        value = getattr(args, dest, None)
        for text in [value] if isinstance(value, str) else value or ():
            if isinstance(text, str) and not valid_text(text):
                return f"argument '{dest}' is not valid UTF-8 text: {terminal_text(text, one_line=True)}"
    return ""


def main(argv: Sequence[str] | None = None) -> int:
    """Entry point of the console script; returns the exit code."""
    parser = build_parser()
    words = list(sys.argv[1:] if argv is None else argv)
    passthrough: list[str] = []
    if "--" in words:
        cut = words.index("--")
        words, passthrough = words[:cut], words[cut + 1 :]
    try:
        args = parser.parse_args(words)
    except SystemExit as exc:  # argparse exits 2 on bad usage already
        return int(exc.code or 0)
    if passthrough and args.command not in _PASSTHROUGH:
        print(
            f"stereosieve {args.command}: options after '--' are only for {' and '.join(_PASSTHROUGH)}", file=sys.stderr
        )
        return EXIT_BAD_INPUT
    args.passthrough = passthrough
    garbled = _garbled_text_argument(args)
    if garbled:
        _warn(f"{args.command}: {garbled}")
        return EXIT_BAD_INPUT
    try:
        return _HANDLERS[args.command](args)
    except BrokenPipeError:  # output piped into `head` and closed early: not an error of the input
        sys.stdout = open(os.devnull, "w")  # noqa: SIM115 - keep Python from complaining at exit
        return EXIT_OK
    except ContradictionError as err:
        _warn(err)
        return EXIT_CONTRADICTION
    except WorkbenchError as err:
        _warn(err)
        return EXIT_BAD_INPUT
    except (OSError, UnicodeDecodeError) as err:
        _warn(err)
        return EXIT_BAD_INPUT


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
