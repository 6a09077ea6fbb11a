"""Chemists' words for file identifiers, conformation labels, and the conventional order of stereoisomers."""

from __future__ import annotations

from workbench.chem import Scope, resolve
from workbench.chem.catalogue import catalogue
from workbench.chem.names import display_name
from workbench.chem.order import in_configurational_order
from workbench.evidence.observations import OBSERVATION_TYPES, observation_from_dict
from workbench.evidence.outcomes import outcome_label
from workbench.glossary import (
    conformation_html,
    conformation_text,
    conformations_html,
    field_name,
    kind_name,
    observation_text,
    term,
)


def test_identifiers_read_as_chemists_write_them():
    assert term("alpha_pyranose") == "α-pyranose"
    assert term("methyl_pyranoside") == "methyl pyranoside"
    assert term("aldaric_acid") == "aldaric acid"
    assert term("co2") == "CO₂"
    assert kind_name("same_product") == "product comparison"
    assert field_name("periodate", "co2") == "CO₂ formed"
    assert field_name("specific_rotation", "value") == "[α]D"


def test_every_observation_kind_has_a_name_without_underscores():
    for kind in OBSERVATION_TYPES:
        assert "_" not in kind_name(kind)
        for spec in OBSERVATION_TYPES[kind].SPECS:
            assert "_" not in field_name(kind, spec.name)


def test_an_observation_in_words_has_no_raw_identifier():
    obs = observation_from_dict(
        {
            "id": "E7",
            "kind": "periodate",
            "unknown": "U1",
            "substrate": "methyl_pyranoside",
            "periodate": 2.0,
            "formic_acid": 1.0,
            "formaldehyde": 0.0,
            "co2": 0.0,
        }
    )
    text = observation_text(obs)
    assert text.startswith("E7 periodate oxidation:")
    assert "substrate: methyl pyranoside" in text and "CO₂ formed: 0 mol/mol" in text
    assert "methyl_pyranoside" not in text and "co2" not in text


def test_chair_descriptors_have_raised_and_lowered_indices():
    # IUPAC 2-Carb-7.2: 4C1 is written with 4 as superscript before C and 1 as subscript after it.
    assert conformation_html("4C1") == "<sup>4</sup>C<sub>1</sub>"
    assert conformations_html("1C4 (2C5) & C6") == "<sup>1</sup>C<sub>4</sub> (<sup>2</sup>C<sub>5</sub>) &amp; C6"
    assert conformation_text("4C1 (5C2 for 2-ketoses)") == "⁴C₁ (⁵C₂ for 2-ketoses)"


def test_reasons_carry_units():
    assert outcome_label("coupling_constant", 3.19) == "3.19 Hz"
    assert outcome_label("specific_rotation", 52.7) == "52.70°"


def test_aldohexoses_in_the_conventional_order():
    # The Fischer-Rosanoff family tree order, all alt glc man gul ido gal tal [common practice].
    names = [display_name(c) for c in in_configurational_order(catalogue(Scope(carbons=(6,), carbonyl=("aldose",))))]
    order = ["allose", "altrose", "glucose", "mannose", "gulose", "idose", "galactose", "talose"]
    assert names == [f"D-{n}" for n in order] + [f"L-{n}" for n in order]


def test_pentoses_and_ketohexoses_in_the_conventional_order():
    # ribose, arabinose, xylose, lyxose; psicose, fructose, sorbose, tagatose [common practice].
    pentoses = [
        display_name(c)
        for c in in_configurational_order(catalogue(Scope(carbons=(5,), carbonyl=("aldose",), series=("D",))))
    ]
    assert pentoses == ["D-ribose", "D-arabinose", "D-xylose", "D-lyxose"]
    shuffled = [resolve(n) for n in ("D-tagatose", "D-fructose", "D-sorbose", "D-psicose")]
    assert [display_name(c) for c in in_configurational_order(shuffled)][1:] == [
        "D-fructose",
        "D-sorbose",
        "D-tagatose",
    ]
