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


# ------------------------------------------------------------------ rivals, authorship, outputs
def _section(html: str, heading: str) -> str:
    start = html.index(f"<h2>{heading}</h2>")
    end = html.find("<h2>", start + 1)
    return html[start:end]


def test_deoxyhexose_report_names_the_epimers_removed_last_as_rivals():
    project = load_project(SAMPLES / "red_seaweed_deoxyhexose.json")
    html = render_report(project, solve(project), None, generated=STAMP)
    rivals = _section(html, "Closest rivals")
    # L-fucose is 6-deoxy-L-galactose; its C-2, C-3 and C-4 epimers are 6-deoxy-L-talose, 6-deoxy-L-gulose and
    # 6-deoxy-L-glucose (L-quinovose) (configurational prefixes, IUPAC-IUBMB 2-Carb-8; common practice).
    # The sample's last two records are the couplings that tell galacto from these.
    last = [o.id for o in project.observations][-2:]
    for epimer in ("6-deoxy-L-talo-hexose", "6-deoxy-L-gulo-hexose", "L-quinovose"):
        assert epimer in rivals
    rows = re.findall(r"<tr>(.*?)</tr>", rivals)[1:]
    assert rows and all(any(f"<b>{oid}</b>" in row for oid in last) for row in rows)
    assert "invented 2025-01-27" in rivals  # who recorded the removing observation, and when
    # glucose and galactose are C-4 epimers, talose and galactose C-2 epimers (common practice)
    assert re.search(r"L-quinovose</b><br><span[^>]*>C-4 epimer", rivals)
    assert re.search(r"6-deoxy-L-talo-hexose</b><br><span[^>]*>C-2 epimer", rivals)
    # the eliminated table leads with the latest removals, so the epimers appear although 275 were removed
    candidates = _section(html, "Candidates")
    table = candidates[candidates.index("ss-eliminated") :]
    assert "L-quinovose" in table[:4000] and "6-deoxy-L-talo-hexose" in table


def test_rivals_of_an_open_question_are_the_other_survivors_with_their_shares(demo):
    project, solution, _ = demo
    html = render_report(project, solution, None, generated=STAMP)
    rivals = _section(html, "Closest rivals")
    # two survivors left (D-allose and D-galactose, both meso aldaric acids): each holds half
    assert "still possible (50%)" in rivals


def test_ledger_shows_who_recorded_each_observation_and_when():
    project = load_project(SAMPLES / "gum_exudate_four_sugars.json")
    html = render_report(project, solve(project), None, generated=STAMP)
    ledger = _section(html, "Evidence ledger")
    for obs in project.observations:
        for text in (obs.by, obs.recorded):
            if text:
                assert html_escape(text) in ledger


def test_report_has_no_external_reference_at_all():
    for path in sorted(SAMPLES.glob("*.json")):
        project = load_project(path)
        solution = solve(project)
        html = render_report(project, solution, plan(project, solution=solution), generated=STAMP)
        # the only URL allowed is the SVG namespace name, which is an identifier, never fetched
        urls = set(re.findall(r"https?://[^\s\"'<>)]+", html)) - {"http://www.w3.org/2000/svg"}
        assert urls == set(), path.name
        assert "<script" not in html and "@import" not in html and "url(" not in html


def test_report_follows_the_umask_and_refuses_devices_and_folders(tmp_path, capsys):
    saved = os.umask(0o002)
    try:
        out = tmp_path / "r.html"
        assert main(["report", str(SAMPLES / "rare_pentose_epimerisation.json"), "-o", str(out), "--no-plan"]) == 0
        assert out.stat().st_mode & 0o777 == 0o664  # 0666 less the umask (POSIX open(2), common practice)
    finally:
        os.umask(saved)
    assert main(["report", str(SAMPLES / "rare_pentose_epimerisation.json"), "-o", "/dev/null"]) == 2
    assert main(["report", str(SAMPLES / "rare_pentose_epimerisation.json"), "-o", str(tmp_path)]) == 2
    err = capsys.readouterr().err
    assert "device or special file" in err and "is a folder" in err
    with pytest.raises(ReportError, match="device"):
        write_report("x", "/dev/null")


def test_report_through_a_symlink_writes_the_target(tmp_path):
    real = tmp_path / "real.html"
    real.write_text("old", encoding="utf-8")
    link = tmp_path / "link.html"
    link.symlink_to(real)
    write_report("<p>new</p>", link)
    assert link.is_symlink() and real.read_text(encoding="utf-8") == "<p>new</p>"
