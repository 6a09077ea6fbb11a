"""The HTML report (pure rendering, atomic writing) and the ``stereosieve report`` command.

Chemical expectations: D-allose and D-galactose give meso aldaric acids (REFERENCE_VALUES.md; Carey,
Organic Chemistry, ch. 25, from memory); the cautions are those of REFERENCE_VALUES.md (ICSC 1670 etc.).
"""

from __future__ import annotations

import os
import re
from html import escape as html_escape
from html.parser import HTMLParser
from pathlib import Path

import pytest

from workbench.cli import main
from workbench.data import DEMO_PROJECT, data_path
from workbench.errors import WorkbenchError
from workbench.evidence import load_project, solve
from workbench.evidence.planner import plan
from workbench.report import ReportError, render_report, write_report

SAMPLES = Path(__file__).resolve().parent.parent / "sample_projects"
STAMP = "2025-01-01T12:00+00:00"


class _Balance(HTMLParser):
    """Counts open elements to check the document is balanced."""

    VOID = {"meta", "br", "img", "link", "input", "hr"}

    def __init__(self) -> None:
        super().__init__()
        self.stack: list[str] = []
        self.errors: list[str] = []

    def handle_starttag(self, tag, attrs):
        if tag not in self.VOID:
            self.stack.append(tag)

    def handle_startendtag(self, tag, attrs):
        pass

    def handle_endtag(self, tag):
        if not self.stack or self.stack[-1] != tag:
            self.errors.append(f"unexpected </{tag}> with open {self.stack[-3:]}")
            return
        self.stack.pop()


def _balanced(html: str) -> bool:
    checker = _Balance()
    checker.feed(html)
    return not checker.errors and not checker.stack


@pytest.fixture(scope="module")
def demo():
    project = load_project(data_path(DEMO_PROJECT))
    without_osazone = project.without("E6")  # leave two survivors so the planner has work to do
    solution = solve(without_osazone)
    return without_osazone, solution, plan(without_osazone, solution=solution)


def test_report_holds_every_section(demo):
    project, solution, ranking = demo
    html = render_report(project, solution, ranking, generated=STAMP)
    assert html.startswith("<!DOCTYPE html>")
    for heading in ("Summary", "Unknowns", "Evidence ledger", "Narrowing", "Candidates", "Next experiments"):
        assert f"<h2>{heading}</h2>" in html
    assert project.title in html and STAMP in html
    for obs in project.observations:
        assert f"<b>{obs.id}</b>" in html  # every observation in the ledger
    assert 'class="ss-narrowing"' in html  # the narrowing chart
    assert html.count('class="ss-fischer"') == 2  # D-allose and D-galactose drawn
    assert "D-allose" in html and "D-galactose" in html
    assert "Eliminated candidates (91)" in html and "predicted unchanged, observed oxidised" in html
    assert _balanced(html)


def test_report_is_self_contained(demo):
    html = render_report(*demo, generated=STAMP)
    assert "<script" not in html and "<link" not in html and "<img" not in html
    links = re.findall(r"(?:href|src)=\"(https?://[^\"]+)\"", html)
    assert links == []


def test_report_shows_cautions_with_the_safety_deferral(demo):
    project, solution, ranking = demo
    html = render_report(project, solution, ranking, generated=STAMP)
    shown = [c for exp in ranking.experiments[:8] for c in exp.cautions]
    assert shown  # the demo's ranking includes a borohydride reduction (REFERENCE_VALUES: ICSC 1670)
    for caution in shown:
        assert html_escape(caution) in html
    assert "Sodium borohydride" in html
    assert "safety data sheet" in html and "safety officer" in html


def test_report_of_contradictory_project_explains_the_conflict():
    project = load_project(SAMPLES / "contradictory_hexose_records.json")
    solution = solve(project)
    html = render_report(project, solution, plan(project, solution=solution), generated=STAMP)
    assert "<h2>Contradictions</h2>" in html and "cannot all hold" in html
    assert "<b>E3, E4</b>" in html and "without <b>E4</b>" in html
    assert "no candidate fits all the evidence" in html
    assert _balanced(html)


def test_report_without_plan_has_no_next_experiments(demo):
    project, solution, _ = demo
    html = render_report(project, solution, None, generated=STAMP)
    assert "Next experiments" not in html


def test_write_report_replaces_atomically_and_leaves_no_temporary_file(tmp_path):
    target = tmp_path / "r.html"
    write_report("<p>first</p>", target)
    write_report("<p>second</p>", target)
    assert target.read_text(encoding="utf-8") == "<p>second</p>"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["r.html"]


def test_failed_write_keeps_the_old_report(tmp_path, monkeypatch):
    target = tmp_path / "r.html"
    write_report("<p>kept</p>", target)

    def boom(src, dst):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(os, "replace", boom)
    with pytest.raises(ReportError, match="No space left"):
        write_report("<p>lost</p>", target)
    assert target.read_text(encoding="utf-8") == "<p>kept</p>"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["r.html"]


def test_write_report_refuses_bad_targets(tmp_path):
    with pytest.raises(ReportError, match="does not exist"):
        write_report("x", tmp_path / "missing" / "r.html")
    with pytest.raises(ReportError, match="is a folder"):
        write_report("x", tmp_path)
    project = tmp_path / "p.json"
    project.write_text("{}", encoding="utf-8")
    with pytest.raises(ReportError, match="refusing to overwrite"):
        write_report("x", project, protect=(project,))
    assert project.read_text(encoding="utf-8") == "{}"
    assert issubclass(ReportError, WorkbenchError)


def test_report_command_writes_the_file(tmp_path, capsys):
    out = tmp_path / "demo.html"
    assert main(["report", str(data_path(DEMO_PROJECT)), "-o", str(out)]) == 0
    assert "D-galactose" in out.read_text(encoding="utf-8")
    assert str(out) in capsys.readouterr().out


def test_report_command_on_contradictory_evidence_writes_and_exits_3(tmp_path, capsys):
    out = tmp_path / "c.html"
    assert main(["report", str(SAMPLES / "contradictory_hexose_records.json"), "-o", str(out)]) == 3
    assert out.exists()
    assert "{E3, E4}" in capsys.readouterr().err


def test_report_command_bad_input_exits_2(tmp_path, capsys):
    project = SAMPLES / "gum_exudate_four_sugars.json"
    before = project.read_text(encoding="utf-8")
    assert main(["report", str(project), "-o", str(tmp_path / "nowhere" / "x.html")]) == 2
    assert main(["report", str(project), "-o", str(project)]) == 2
    assert project.read_text(encoding="utf-8") == before
    assert main(["report", str(tmp_path / "missing.json"), "-o", str(tmp_path / "x.html")]) == 2
    bad = tmp_path / "bad.json"
    bad.write_text('{"format": "stereosieve-project", "version": 1, "unknowns": []}', encoding="utf-8")
    assert main(["report", str(bad), "-o", str(tmp_path / "x.html")]) == 2
    err = capsys.readouterr().err
    assert "does not exist" in err and "refusing to overwrite" in err and "no such file" in err
    assert not (tmp_path / "x.html").exists()


def test_report_command_needs_an_output(capsys):
    assert main(["report", str(data_path(DEMO_PROJECT))]) == 2
