"""Hostile strings are inert in every sink: report HTML, board/narrowing/chart HTML, terminal and JSON output.

No chemistry is checked here. The hostile strings are common practice in security testing (markup,
event handlers, ANSI escape sequences ECMA-48 CSI/OSC, C1 controls, Unicode bidi overrides UAX #9).
"""

from __future__ import annotations

import json
from html.parser import HTMLParser
from pathlib import Path

import pytest
from projects import project_dict

from workbench.cli import main
from workbench.display.board import board_html, solution_html
from workbench.display.chart import narrowing_chart
from workbench.display.tables import conflicts_html, ledger_html, project_html, trail_html
from workbench.escaping import html_text, json_text, terminal_text
from workbench.evidence import project_from_dict, solve
from workbench.evidence.planner import plan
from workbench.report import render_report

MARKUP = '<img src=x onerror="alert(1)">'
ESCAPES = "\x1b]0;owned\x07\x1b[2J\x9b31m\u202e"
HOSTILE = MARKUP + ESCAPES
UID = "U<b>&amp;"  # ids may hold markup characters (shown as text) but no control characters (refused)


def _project(contradictory: bool = False) -> dict:
    obs = [
        {"id": MARKUP, "kind": "carbon_count", "unknown": UID, "value": 6, "note": HOSTILE, "by": HOSTILE},
        {"id": "E2</td><script>", "kind": "series", "unknown": UID, "value": "D", "note": HOSTILE},
    ]
    if contradictory:
        obs.append({"id": "E3" + MARKUP, "kind": "carbon_count", "unknown": UID, "value": 5})
    return project_dict([{"id": UID, "label": HOSTILE, "scope": {"carbons": [5, 6]}}], obs, HOSTILE)


class _Tags(HTMLParser):
    def __init__(self) -> None:
        super().__init__()
        self.tags: list[str] = []
        self.handlers: list[str] = []

    def handle_starttag(self, tag, attrs):
        self.tags.append(tag)
        self.handlers += [name for name, _ in attrs if name.startswith("on")]


def _inert_html(html: str) -> None:
    parser = _Tags()
    parser.feed(html)
    assert "img" not in parser.tags and not parser.handlers
    for ch in ("\x1b", "\x07", "\x9b", "\u202e"):
        assert ch not in html


@pytest.mark.parametrize("contradictory", [False, True])
def test_html_sinks_show_hostile_text_as_text(contradictory):
    project = project_from_dict(_project(contradictory))
    solution = solve(project)
    uid = project.unknown_ids[0]
    for html in (
        render_report(project, solution, plan(project, solution=solution), generated="2024-01-01T00:00"),
        solution_html(solution),
        board_html(solution, uid),
        trail_html(solution),
        narrowing_chart(solution),
        ledger_html(project, solution),
        project_html(project),
        conflicts_html(solution) if contradictory else "",
    ):
        _inert_html(html)
    assert "&lt;img" in trail_html(solution)


def _run(tmp_path: Path, capsys, *argv: str) -> tuple[int, str, str]:
    path = tmp_path / "p.json"
    path.write_text(json.dumps(_project("contra" in argv)), encoding="utf-8")
    code = main([a if a != "P" else str(path) for a in argv if a != "contra"])
    out, err = capsys.readouterr()
    return code, out, err


@pytest.mark.parametrize(
    "argv",
    [
        ("solve", "P"),
        ("solve", "P", "contra"),
        ("plan", "P"),
        ("plan", "P", "--lookahead"),
        ("validate", "P"),
        ("solve", "P", "--without", "E9\x1b[2J"),
    ],
)
def test_terminal_output_carries_no_escape_sequence(tmp_path, capsys, argv):
    code, out, err = _run(tmp_path, capsys, *argv)
    assert code in (0, 2, 3)
    for ch in ("\x1b", "\x07", "\x9b", "\u202e"):
        assert ch not in out and ch not in err
    assert "Traceback" not in err


@pytest.mark.parametrize(
    "argv", [("solve", "P", "--json"), ("solve", "P", "--json", "contra"), ("plan", "P", "--json")]
)
def test_json_output_stays_valid_and_keeps_the_text(tmp_path, capsys, argv):
    code, out, _ = _run(tmp_path, capsys, *argv)
    assert code in (0, 3)
    for ch in ("\x1b", "\x9b", "\u202e"):
        assert ch not in out
    data = json.loads(out)  # the escapes decode back to the original text
    if argv[0] == "solve":
        assert data["title"] == HOSTILE


@pytest.mark.parametrize("bad", ["E1\nE1b", "E1\x1b[2J", "E1\u2028x", "E1\u202e", "E1\tx"])
@pytest.mark.parametrize("where", ["observation", "unknown"])
def test_ids_with_control_characters_are_refused(tmp_path, capsys, bad, where):
    """An id is one line: a newline or escape in it could forge lines of the terminal output."""
    data = _project()
    if where == "observation":
        data["observations"][1]["id"] = bad
    else:
        data["unknowns"][0]["id"] = bad
        for o in data["observations"]:
            o["unknown"] = bad
    path = tmp_path / "p.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    assert main(["solve", str(path)]) == 2
    out, err = capsys.readouterr()
    assert "field 'id'" in err and "control characters" in err
    assert bad not in err and "\n" not in out


def test_a_title_with_a_newline_stays_on_one_line(tmp_path, capsys):
    data = _project()
    data["title"] = "Batch 7\nAll checks passed"
    path = tmp_path / "p.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    assert main(["solve", str(path)]) == 0
    out, _ = capsys.readouterr()
    assert "Project: Batch 7\\x0aAll checks passed" in out.splitlines()


def test_the_helpers_one_by_one():
    assert html_text('<a href="x">&') == "&lt;a href=&quot;x&quot;&gt;&amp;"
    assert "\ufffd" in html_text("a\ud800b") and "\x1b" not in html_text("\x1b[2J")
    assert terminal_text("a\x1b[2Jb\x9bc\u202ed\ud800") == "a\\x1b[2Jb\\x9bc\\u202ed\\ud800"
    assert terminal_text("line\nnext\tcol") == "line\nnext\tcol"
    assert terminal_text("line\nnext", one_line=True) == "line\\x0anext"
    assert json.loads(json_text(json.dumps("\u202e\x9b\ud800", ensure_ascii=False))) == "\u202e\x9b\ud800"
