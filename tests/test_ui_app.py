"""The whole workbench and ``stereosieve lab`` (notebook preparation only: nothing is started)."""

from __future__ import annotations

import json
import shutil
from pathlib import Path

import pytest

from workbench.cli import main
from workbench.errors import ProjectError
from workbench.ui import Workbench
from workbench.ui import notebook as lab
from workbench.ui.base import snapshot_bundle
from workbench.ui.session import Session

SAMPLES = Path(__file__).resolve().parent.parent / "sample_projects"


@pytest.fixture()
def bench(demo_file):
    return Workbench.open(demo_file)


def test_workbench_wires_the_panels_to_one_session(bench):
    assert {bench.form.session, bench.ledger.session, bench.board.session, bench.planner.session} == {bench.session}
    assert bench.tabs.titles == ("Candidates", "What to try next", "Chairs in 3D", "Project")
    assert "S1: 1 left" in bench.header.value


def test_what_if_in_the_ledger_reaches_board_header_and_planner(bench):
    bench.ledger.switches["E6"].value = False
    assert bench.board.survivor_names("S1") == ["D-allose", "D-galactose"]
    assert "what-if: E6 off" in bench.header.value
    assert bench.planner.plan.experiments


def test_edit_button_loads_the_form_and_prepare_fills_it(bench):
    bench.ledger.rows.children[2].children[2].click()  # edit E3
    assert bench.form.editing == "E3" and bench.form.kind.value == "molecular_formula"
    bench.session.set_enabled("E6", False)
    bench.planner.choice.value = 0
    bench.planner.prepare_button.click()
    assert bench.form.kind.value == bench.planner.plan.experiments[0].kind
    assert bench.form.editing is None


def test_static_snapshot_carries_evidence_survivors_and_drawings(bench):
    bench.session.set_enabled("E6", False)
    html = bench.snapshot_html()
    assert "<b>E6</b>" in html and "switched off" in html  # the ledger
    # survivors drawn in characters (a sanitiser strips SVG and scripts but keeps <pre>)
    assert html.count('class="ss-fischer-text"') >= 2 and "D-allose" in html
    assert "<svg" not in html and "<script" not in html and "<style" not in html
    assert "ss-narrowing-table" in html and "What to try next" in html
    bundle = snapshot_bundle(html, "workbench")
    assert "readers without a running kernel" in bundle["text/html"]
    assert not bundle["text/plain"].startswith("<")  # a sentence, not an object's repr


def test_prepare_entry_works_straight_after_the_automatic_ranking(bench):
    bench.session.set_enabled("E6", False)  # re-ranked automatically; nothing chosen by hand
    assert bench.planner.choice.value == 0  # the best suggestion is selected
    bench.planner.prepare_button.click()
    assert bench.form.kind.value == bench.planner.plan.experiments[0].kind
    assert "Prepared" in bench.planner.notices.text


def test_callback_errors_are_shown_on_the_panel(bench):
    bench.form.kind.value = "carbon_count"
    bench.form.editors["value"].control.value = "12"
    bench.form.record_button.click()
    assert "above the largest allowed value 9" in bench.form.editors["value"].message.value
    assert "Not recorded" in bench.form.notices.text


def test_workbench_from_a_project_object():
    from workbench.evidence import load_project

    wb = Workbench(load_project(SAMPLES / "rare_pentose_epimerisation.json"), follow_plan=False)
    assert wb.planner.plan is None and isinstance(wb.session, Session)
    assert wb.board.survivor_names("H2") == ["L-altrose"]


# ------------------------------------------------------------------ stereosieve lab
def test_prepare_lab_copies_the_demo_and_writes_the_notebook_beside_it(tmp_path):
    files = lab.prepare_lab(None, directory=tmp_path)
    assert files.project == tmp_path / lab.DEMO_COPY and files.notebook == tmp_path / "stereosieve_demo.workbench.ipynb"
    assert set(files.created) == {files.project, files.notebook}
    nb = json.loads(files.notebook.read_text(encoding="utf-8"))
    code = "".join("".join(c["source"]) for c in nb["cells"] if c["cell_type"] == "code")
    assert 'PROJECT = "stereosieve_demo.json"' in code and lab.PLACEHOLDER not in code
    assert nb["nbformat"] == 4


def test_prepare_lab_never_overwrites_the_chemist_s_files(tmp_path):
    first = lab.prepare_lab(None, directory=tmp_path)
    first.notebook.write_text(first.notebook.read_text(encoding="utf-8").replace('wb"', 'wb  "'), encoding="utf-8")
    mine = first.notebook.read_text(encoding="utf-8")
    again = lab.prepare_lab(None, directory=tmp_path)
    assert again.created == () and again.notebook.read_text(encoding="utf-8") == mine


def test_prepare_lab_for_a_given_project(tmp_path):
    project = tmp_path / "gum.json"
    shutil.copyfile(SAMPLES / "gum_exudate_four_sugars.json", project)
    files = lab.prepare_lab(project)
    assert files.notebook == tmp_path / "gum.workbench.ipynb" and files.created == (files.notebook,)
    nb = json.loads(files.notebook.read_text(encoding="utf-8"))
    assert 'PROJECT = "gum.json"' in "".join(nb["cells"][1]["source"])


def test_prepare_lab_refuses_a_bad_project(tmp_path):
    bad = tmp_path / "bad.json"
    bad.write_text("[]", encoding="utf-8")
    with pytest.raises(ProjectError):
        lab.prepare_lab(bad)
    assert not (tmp_path / "bad.workbench.ipynb").exists()
    with pytest.raises(lab.LabError, match="is a folder"):
        lab.prepare_lab(tmp_path)


def test_lab_command_prepare_only_starts_nothing(tmp_path, monkeypatch, capsys):
    started = []
    monkeypatch.setattr(lab, "launch_lab", lambda *a, **k: started.append(a) or 0)
    assert main(["lab", "--prepare-only", "--dir", str(tmp_path)]) == 0
    assert started == [] and "stereosieve_demo.workbench.ipynb" in capsys.readouterr().out


def test_lab_command_hands_the_notebook_to_the_launcher(tmp_path, monkeypatch):
    started = []
    monkeypatch.setattr(
        lab, "launch_lab", lambda notebook, browser=True, **_options: started.append((notebook, browser)) or 0
    )
    project = tmp_path / "p.json"
    shutil.copyfile(SAMPLES / "rare_pentose_epimerisation.json", project)
    assert main(["lab", str(project), "--no-browser"]) == 0
    assert started == [(tmp_path / "p.workbench.ipynb", False)]


def test_lab_command_bad_input_exits_2(tmp_path, monkeypatch):
    monkeypatch.setattr(lab, "launch_lab", lambda *a, **k: pytest.fail("must not start"))
    assert main(["lab", str(tmp_path / "missing.json")]) == 2
    assert main(["lab", "--dir", str(tmp_path / "nowhere")]) == 2


# ------------------------------------------------------------------ rich display of core objects
class _Formatter:
    def __init__(self) -> None:
        self.types: dict = {}

    def for_type(self, cls, fn) -> None:
        self.types[cls] = fn


class _Shell:
    def __init__(self) -> None:
        self.display_formatter = type("DF", (), {"formatters": {"text/html": _Formatter(), "text/plain": _Formatter()}})


class _Printer:
    def __init__(self) -> None:
        self.out = ""

    def text(self, s: str) -> None:
        self.out += s


def test_formatters_render_solutions_projects_and_plans_without_touching_the_core():
    from workbench.evidence import load_project, solve
    from workbench.evidence.engine import Solution
    from workbench.ui.formatters import register_formatters

    assert register_formatters() is False  # no IPython shell in a test run
    shell = _Shell()
    assert register_formatters(shell) is True
    html = shell.display_formatter.formatters["text/html"].types
    solution = solve(load_project(SAMPLES / "gum_exudate_four_sugars.json"))
    assert "L-rhamnose" in html[Solution](solution) and "ss-fischer" in html[Solution](solution)
    printer = _Printer()
    shell.display_formatter.formatters["text/plain"].types[Solution](solution, printer, False)
    assert "C: 1 of 24 left: L-rhamnose" in printer.out
