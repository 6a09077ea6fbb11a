"""The evidence form, tested on its widget state (no kernel): generated fields, inline messages, recording.

Chemical expectations (meso aldaric acids of allose and galactose; shared osazones) come from
REFERENCE_VALUES.md, from memory of the textbook facts listed there.
"""

from __future__ import annotations

import pytest

from workbench.chem.names import display_name
from workbench.evidence import OBSERVATION_TYPES, engine
from workbench.ui.board import CandidateBoard
from workbench.ui.entry import EvidenceForm
from workbench.ui.session import Session


@pytest.fixture()
def session(demo_file):
    s = Session.open(demo_file)
    s.delete("E6")  # two survivors left: D-allose, D-galactose
    return s


@pytest.mark.parametrize("kind", list(OBSERVATION_TYPES))
def test_every_kind_gets_a_form_generated_from_its_field_specs(session, kind):
    form = EvidenceForm(session, kind=kind)
    assert list(form.editors) == [spec.name for spec in OBSERVATION_TYPES[kind].SPECS]


def test_recording_calls_the_core_and_the_board_shows_the_survivors(session, monkeypatch):
    form = EvidenceForm(session, kind="same_product")
    board = CandidateBoard(session)
    assert "D-allose" in board.pages["S1"].value
    calls = []
    real = engine.solve
    monkeypatch.setattr(engine, "solve", lambda p, disabled=(): calls.append(p) or real(p, disabled=disabled))
    form.editors["reaction"].set("osazone")
    form.editors["members"].set(["S1", "D-tagatose"])
    form.editors["relation"].set("identical")
    obs = form.record()
    assert obs is not None and obs.id == "E6"
    assert len(calls) == 1  # one solve per change
    # D-galactose and D-tagatose share the osazone (REFERENCE_VALUES: osazones); D-allose does not.
    assert board.survivor_names("S1") == ["D-galactose"]
    assert "D-allose" not in board.pages["S1"].value.split("Eliminated")[0]
    assert "Recorded E6" in form.notices.text
    assert form.id_box.value == "E7"  # ready for the next entry


def test_a_value_below_the_minimum_is_shown_under_its_field(session):
    form = EvidenceForm(session, kind="carbon_count")
    form.editors["unknown"].set("S1")
    form.editors["value"].control.value = "2"
    assert "below the smallest allowed value 3" in form.editors["value"].message.value
    assert form.record() is None
    assert len(session.project.observations) == 5


def test_text_that_is_not_a_number_gets_the_core_s_message(session):
    form = EvidenceForm(session, kind="specific_rotation")
    form.editors["unknown"].set("S1")
    form.editors["value"].control.value = "plus eighty"
    assert "expected a number" in form.editors["value"].message.value


def test_missing_fields_are_reported_only_on_record(session):
    form = EvidenceForm(session, kind="aldaric_acid")
    form.editors["unknown"].set("S1")
    assert form.errors() == {}  # nothing chosen yet: no complaint while typing
    assert form.record() is None
    assert "missing" in form.editors["optically_active"].message.value


def test_unknown_sugar_name_is_flagged_with_a_suggestion(session):
    form = EvidenceForm(session, kind="chain_shortening")
    form.editors["method"].set("ruff")
    form.editors["substrate"].set("S1")
    form.editors["product"].set("D-lyxos")
    message = form.editors["product"].message.value
    assert "neither an unknown id" in message and "D-lyxose" in message


def test_bad_date_is_shown_on_the_meta_line(session):
    form = EvidenceForm(session, kind="series")
    form.editors["unknown"].set("S1")
    form.editors["value"].set("D")
    form.recorded.value = "yesterday"
    assert "not an ISO 8601 date" in form.meta_message.value


def test_relational_fields_offer_unknowns_and_known_sugars(session):
    session.set_unknown("S2", "a second sample")
    form = EvidenceForm(session, kind="chain_extension")
    options = list(form.editors["substrate"].control.options)
    assert options[:2] == ["S1", "S2"] and "D-arabinose" in options and "L-rhamnose" in options
    picker = form.editors["products"]._picker
    assert "S2" in picker.options and "D-glucose" in picker.options
    picker.value = "D-glucose"  # choosing from the picker adds the member
    assert form.editors["products"].control.value == ["D-glucose"]


def test_unary_fields_offer_the_project_s_unknowns(session):
    form = EvidenceForm(session, kind="bromine_water")
    assert list(form.editors["unknown"].control.options) == ["S1"]
    assert form.editors["unknown"].control.value == "S1"  # the only one is chosen
    assert [value for _label, value in form.editors["result"].control.options] == ["oxidised", "unchanged"]


def test_edit_loads_an_observation_and_saving_replaces_it(session):
    form = EvidenceForm(session)
    form.load(session.project.observation("E4"))
    assert form.kind.value == "aldaric_acid" and form.editors["optically_active"].get() is False
    assert form.record_button.description == "Save E4"
    form.editors["optically_active"].set(True)
    form.record()
    assert session.project.observation("E4").optically_active is True
    # D-aldohexoses with an optically active aldaric acid: all but allose and galactose (REFERENCE_VALUES).
    assert sorted(display_name(c) for c in session.solution.survivors["S1"]) == [
        "D-altrose",
        "D-glucose",
        "D-gulose",
        "D-idose",
        "D-mannose",
        "D-talose",
    ]


def test_prefill_from_a_planner_suggestion_keeps_known_fields_only(session):
    form = EvidenceForm(session)
    form.prefill("chain_extension", {"method": "kiliani_fischer", "substrate": "S1", "then": "aldaric_acid"})
    assert form.kind.value == "chain_extension"
    assert form.editors["method"].get() == "kiliani_fischer" and form.editors["substrate"].get() == "S1"
    assert form.editors["products"].get() is None


def test_errors_in_callbacks_are_shown_not_swallowed(session, monkeypatch):
    form = EvidenceForm(session, kind="series")
    form.editors["unknown"].set("S1")
    form.editors["value"].set("D")

    def broken(_obs):
        raise RuntimeError("disk on fire")

    monkeypatch.setattr(session, "record", broken)
    form.record_button.click()
    assert "RuntimeError: disk on fire" in form.notices.text
    assert isinstance(form.notices.last_error, RuntimeError)


def test_choices_are_labelled_in_chemists_words_and_keep_the_file_values(session):
    form = EvidenceForm(session, kind="periodate")
    substrate = form.editors["substrate"].control
    assert ("methyl pyranoside", "methyl_pyranoside") in list(substrate.options)
    substrate.value = "methyl_pyranoside"
    assert form.values()["substrate"] == "methyl_pyranoside"  # the file keeps the identifier
    assert "CO₂ formed" in form.editors["co2"].label.value
