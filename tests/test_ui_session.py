"""The session behind the panels: every change re-solves through the core; files are saved atomically.

The survivor counts checked here follow from the demo project through the engine, whose chemistry is
checked against published values in test_engine.py and test_reactions.py (common practice: the UI is
tested on its state, not on chemistry).
"""

from __future__ import annotations

import json
import os

import pytest

from workbench.chem.names import display_name
from workbench.errors import ObservationError, ProjectError, ScopeError
from workbench.evidence import engine
from workbench.ui.session import Session, SessionError


@pytest.fixture()
def solve_calls(monkeypatch):
    calls = []
    real = engine.solve

    def spy(project, disabled=()):
        calls.append(tuple(disabled))
        return real(project, disabled=disabled)

    monkeypatch.setattr(engine, "solve", spy)
    return calls


def _names(session, uid="S1"):
    return [display_name(c) for c in session.solution.survivors[uid]]


def test_opening_solves_once(demo_file, solve_calls):
    session = Session.open(demo_file)
    assert solve_calls == [()]
    assert _names(session) == ["D-galactose"]  # D-galactose: meso aldaric acid + tagatose osazone (REFERENCE_VALUES)


def test_switching_off_re_solves_without_it_and_keeps_it_in_the_file(demo_file, solve_calls):
    session = Session.open(demo_file)
    seen = []
    session.subscribe(lambda s: seen.append(len(s.solution.survivors["S1"])))
    session.set_enabled("E6", False)
    assert solve_calls[-1] == ("E6",)
    assert _names(session) == ["D-allose", "D-galactose"]
    assert seen == [2]
    assert "E6" in {o.id for o in session.project.observations}
    assert not session.dirty  # a what-if is not an edit
    session.set_enabled("E6", True)
    assert _names(session) == ["D-galactose"]


def test_record_checks_then_adds_and_replaces(demo_file):
    session = Session.open(demo_file)
    session.set_enabled("E6", False)
    obs = session.record({"id": "E7", "kind": "different", "members": ["S1", "D-allose"]})
    assert obs.id == "E7" and _names(session) == ["D-galactose"] and session.dirty
    session.record({"id": "E7", "kind": "different", "members": ["S1", "D-galactose"]})
    assert len(session.project.observations) == 7 and _names(session) == ["D-allose"]


def test_check_names_the_field_at_fault(demo_file):
    session = Session.open(demo_file)
    with pytest.raises(ObservationError) as err:
        session.check({"id": "E9", "kind": "carbon_count", "unknown": "S1", "value": 2})
    assert err.value.field == "value" and "below the smallest" in err.value.problem
    with pytest.raises(ObservationError) as err:
        session.check({"id": "E9", "kind": "carbon_count", "unknown": "S9", "value": 6})
    assert err.value.field == "unknown" and "no unknown has id 'S9'" in err.value.problem
    with pytest.raises(ObservationError) as err:
        session.check(
            {"id": "E9", "kind": "chain_shortening", "method": "ruff", "substrate": "S1", "product": "D-glucse"}
        )
    assert err.value.field == "product" and "D-glucose" in err.value.problem  # the suggestion


def test_delete_and_undo(demo_file):
    session = Session.open(demo_file)
    session.delete("E6")
    assert _names(session) == ["D-allose", "D-galactose"]
    restored = session.undo_delete()
    assert restored.id == "E6" and _names(session) == ["D-galactose"]
    with pytest.raises(SessionError, match="nothing to undo"):
        session.undo_delete()
    with pytest.raises(SessionError, match="no observation has id 'E42'"):
        session.delete("E42")


def test_unknowns_and_scopes_go_through_the_core(demo_file):
    session = Session.open(demo_file)
    session.set_unknown("S1", "a label", {"carbons": [6], "carbonyl": ["aldose"]})
    assert session.solution.scope_counts["S1"] == 16
    with pytest.raises(ProjectError, match="not a chain length"):
        session.set_unknown("S1", "", {"carbons": [12]})
    assert session.solution.scope_counts["S1"] == 16  # the bad scope changed nothing
    session.set_unknown("S2")
    assert session.project.unknown_ids == ("S1", "S2")
    with pytest.raises(SessionError, match="used by E1"):
        session.remove_unknown("S1")
    session.remove_unknown("S2")
    assert session.project.unknown_ids == ("S1",)
    assert issubclass(ScopeError, ValueError)


def test_save_is_atomic_and_a_failed_save_keeps_the_old_file(demo_file, monkeypatch):
    session = Session.open(demo_file)
    session.set_title("renamed")
    session.save()
    assert json.loads(demo_file.read_text(encoding="utf-8"))["title"] == "renamed"
    assert not session.dirty
    session.set_title("never written")

    def boom(src, dst):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(os, "replace", boom)
    with pytest.raises(OSError):
        session.save()
    assert json.loads(demo_file.read_text(encoding="utf-8"))["title"] == "renamed"
    assert sorted(p.name for p in demo_file.parent.iterdir()) == ["demo.json"]
    assert session.dirty


def test_load_of_a_bad_file_keeps_the_open_project(demo_file, tmp_path):
    session = Session.open(demo_file)
    bad = tmp_path / "bad.json"
    bad.write_text("{not json", encoding="utf-8")
    with pytest.raises(ProjectError, match="malformed JSON"):
        session.load(bad)
    assert session.path == demo_file and _names(session) == ["D-galactose"]


def test_save_without_a_file_name_says_what_to_do(demo_file):
    session = Session(Session.open(demo_file).project)
    with pytest.raises(SessionError, match="no file name yet"):
        session.save()


def test_plan_respects_the_what_if(demo_file):
    session = Session.open(demo_file)
    assert session.plan().experiments == ()  # solved: nothing to rank
    session.set_enabled("E6", False)
    ranked = session.plan()
    assert ranked.experiments and all(e.unknown == "S1" for e in ranked.experiments)
