"""Ledger, candidate board, next-experiment and project panels, tested on their widget state (no kernel)."""

from __future__ import annotations

import json
import shutil
from pathlib import Path

import pytest

from workbench.evidence import engine
from workbench.ui.board import CandidateBoard
from workbench.ui.ledger import LedgerPanel
from workbench.ui.planning import NextExperimentPanel
from workbench.ui.project_panel import ProjectPanel
from workbench.ui.session import Session

SAMPLES = Path(__file__).resolve().parent.parent / "sample_projects"


@pytest.fixture()
def demo(demo_file):
    return Session.open(demo_file)


@pytest.fixture()
def gum(tmp_path):
    target = tmp_path / "gum.json"
    shutil.copyfile(SAMPLES / "gum_exudate_four_sugars.json", target)
    return Session.open(target)


# ------------------------------------------------------------------ ledger
def test_ledger_switch_off_re_solves_and_the_board_follows(demo, monkeypatch):
    ledger = LedgerPanel(demo)
    board = CandidateBoard(demo)
    calls = []
    real = engine.solve
    monkeypatch.setattr(engine, "solve", lambda p, disabled=(): calls.append(tuple(disabled)) or real(p, disabled))
    ledger.switches["E6"].value = False
    assert calls == [("E6",)]
    assert demo.disabled == {"E6"}
    assert board.survivor_names("S1") == ["D-allose", "D-galactose"]
    assert "switched off" in ledger.rows.children[5].children[1].value
    ledger.all_on.click()
    assert board.survivor_names("S1") == ["D-galactose"]


def test_ledger_rows_show_id_kind_values_who_when_and_note(demo):
    ledger = LedgerPanel(demo)
    text = ledger.rows.children[3].children[1].value
    assert "<b>E4</b>" in text and "aldaric acid" in text and "optically active: no" in text
    assert "demo 2024-03-06" in text and "Warm dilute HNO3" in text and "S1 -12" in text


def test_ledger_delete_undo_and_edit(demo):
    edited = []
    ledger = LedgerPanel(demo, on_edit=edited.append)
    delete_e6 = ledger.rows.children[5].children[3]
    delete_e6.click()
    assert [o.id for o in demo.project.observations] == ["E1", "E2", "E3", "E4", "E5"]
    assert ledger.undo_button.description == "Undo delete E6" and not ledger.undo_button.disabled
    ledger.undo_button.click()
    assert [o.id for o in demo.project.observations][-1] == "E6"
    ledger.rows.children[0].children[2].click()
    assert [o.id for o in edited] == ["E1"]


def test_ledger_snapshot_is_the_static_ledger(demo):
    html = LedgerPanel(demo).snapshot_html()
    assert "ss-ledger" in html and "<b>E6</b>" in html


# ------------------------------------------------------------------ board
def test_board_has_a_tab_per_unknown_with_counts(gum):
    board = CandidateBoard(gum)
    assert list(board.pages) == ["A", "B", "C", "D"]
    assert board.tabs.titles == ("A (1)", "B (1)", "C (1)", "D (1)")
    assert "L-rhamnose" in board.pages["C"].value and "ss-fischer" in board.pages["C"].value
    assert "ss-narrowing" in board.overview.value


def test_board_redraws_after_an_evidence_change(gum):
    board = CandidateBoard(gum)
    gum.set_enabled("E9", False)  # the uronic acid's series: D-glucuronic or L-guluronic acid remain
    assert sorted(board.survivor_names("D")) == ["D-glucuronic acid", "L-guluronic acid"]
    assert board.tabs.titles[3] == "D (2)"
    # D-glucuronic (C-2..C-5 r l r r) and L-guluronic acid (l l r l) differ at C-2 and C-5
    # (D-gulo = r r l r, IUPAC-IUBMB 1996, 2-Carb-8.2).
    assert "configuration still open (C-2, C-5)" in board.pages["D"].value


def test_board_where_is_answers_with_the_eliminating_observation(demo):
    board = CandidateBoard(demo)
    board.query.value = "D-glucose"
    assert "eliminated from S1 by E4" in board.answer.value
    board.query.value = "D-galactose"
    assert "survives" in board.answer.value
    board.query.value = "D-glucosamine"
    assert "not in the scope of S1" in board.answer.value
    board.query.value = "not a sugar at all"
    # the complaint replaces the earlier answer: nothing stale about D-glucosamine is left on show
    assert "not a sugar stereosieve knows" in board.answer.value and "glucosamine" not in board.answer.value


def test_board_shows_the_conflict(tmp_path):
    target = tmp_path / "c.json"
    shutil.copyfile(SAMPLES / "contradictory_hexose_records.json", target)
    board = CandidateBoard(Session.open(target))
    assert "The evidence is contradictory" in board.conflicts.value and "E3, E4" in board.conflicts.value
    board.session.set_enabled("E4", False)
    assert board.conflicts.value == "" and board.survivor_names("X") == ["D-allose", "D-galactose"]


# ------------------------------------------------------------------ next experiment
def test_next_experiment_ranks_with_cautions_and_the_safety_line(demo):
    demo.set_enabled("E6", False)
    panel = NextExperimentPanel(demo)
    html = panel.output.value
    assert panel.plan.experiments and "bit" in html
    assert "safety data sheet" in html and "safety officer" in html
    assert "Sodium borohydride" in html  # cautions as the planner gives them (REFERENCE_VALUES: ICSC 1670)


def test_next_experiment_follows_changes_and_hands_a_suggestion_to_the_form(demo):
    prepared = []
    panel = NextExperimentPanel(demo, on_prepare=lambda kind, fields: prepared.append((kind, fields)))
    assert panel.plan.experiments == () and "solved" in panel.output.value
    demo.set_enabled("E6", False)
    assert panel.plan.experiments  # re-ranked after the change
    panel.choice.value = 0
    panel.prepare_button.click()
    assert prepared and prepared[0][0] == panel.plan.experiments[0].kind
    panel.ranking.value = "information"
    assert panel.plan.ranking == "information"


def test_next_experiment_on_contradictory_evidence_gives_advice(tmp_path):
    target = tmp_path / "c.json"
    shutil.copyfile(SAMPLES / "contradictory_hexose_records.json", target)
    panel = NextExperimentPanel(Session.open(target))
    assert panel.plan.experiments == () and "contradictory" in panel.output.value
    assert panel.prepare_button.disabled


# ------------------------------------------------------------------ project
def test_project_panel_title_scope_and_unknowns(demo):
    panel = ProjectPanel(demo)
    panel.title.value = "A new title"
    assert demo.project.title == "A new title" and demo.dirty
    editor = panel.editors["S1"]
    for n, button in editor.carbons.items():
        button.value = n == 6
    editor.carbonyl["ketose"].value = False
    editor.apply_button.click()
    assert demo.solution.scope_counts["S1"] == 16
    panel.new_id.value = "S2"
    panel.add_button.click()
    assert demo.project.unknown_ids == ("S1", "S2") and "S2" in panel.editors
    panel.editors["S2"].remove_button.click()
    assert demo.project.unknown_ids == ("S1",)


def test_project_panel_shows_a_bad_scope_inline_and_changes_nothing(demo):
    panel = ProjectPanel(demo)
    editor = panel.editors["S1"]
    editor.modifications.value = "deoxy:x"
    editor.apply_button.click()
    assert "positions must be integers" in panel.notices.text
    assert demo.solution.scope_counts["S1"] == 93


def test_project_panel_saves_and_asks_before_discarding(demo, tmp_path):
    panel = ProjectPanel(demo)
    panel.title.value = "edited"
    other = tmp_path / "other.json"
    shutil.copyfile(SAMPLES / "gum_exudate_four_sugars.json", other)
    panel.path.value = str(other)
    panel.open_button.click()
    assert "unsaved changes" in panel.notices.text and demo.project.title == "edited"
    panel.open_button.click()
    assert demo.project.unknown_ids == ("A", "B", "C", "D") and not demo.dirty
    copy = tmp_path / "copy.json"
    panel.path.value = str(copy)
    panel.save_button.click()
    assert json.loads(copy.read_text(encoding="utf-8"))["unknowns"][0]["id"] == "A"
    assert "saved" in panel.state.value


def test_project_panel_shows_a_missing_file_error(demo, tmp_path):
    panel = ProjectPanel(demo)
    panel.path.value = str(tmp_path / "nope.json")
    panel.open_button.click()
    assert "no such file" in panel.notices.text
