"""Pure display functions other than the Fischer projection: chart, tables, plan, chairs (tested as strings)."""

from __future__ import annotations

import xml.etree.ElementTree as ET
from dataclasses import dataclass, field
from pathlib import Path

import pytest

from workbench.chem import resolve
from workbench.chem.smiles import RingForm
from workbench.display import (
    SAFETY_DEFERRAL,
    board_html,
    chair_svg,
    conflicts_html,
    eliminated_html,
    kinds_html,
    ledger_html,
    narrowing_chart,
    narrowing_svg,
    plan_html,
    ring_predictions_html,
    solution_html,
    trail_html,
)
from workbench.evidence import OBSERVATION_TYPES, load_project, solve

SAMPLES = Path(__file__).resolve().parent.parent / "sample_projects"
SVG = "{http://www.w3.org/2000/svg}"


@pytest.fixture(scope="module")
def gum():
    return solve(load_project(SAMPLES / "gum_exudate_four_sugars.json"))


@pytest.fixture(scope="module")
def clash():
    return solve(load_project(SAMPLES / "contradictory_hexose_records.json"))


def _point_y(svg: str, label: str) -> float:
    root = ET.fromstring(svg)
    for c in root.iter(f"{SVG}circle"):
        title = c.findtext(f"{SVG}title") or ""
        if title.startswith(label + " "):
            return float(c.get("cy"))
    raise AssertionError(label)


def test_narrowing_chart_drops_with_the_counts():
    svg = narrowing_svg(["E1", "E2", "E3"], {"U1": [64, 32, 32, 1]})
    assert _point_y(svg, "E1") < _point_y(svg, "E3")  # fewer candidates, lower on the page
    assert _point_y(svg, "E1") == _point_y(svg, "E2")  # no change, same height


def test_narrowing_chart_is_logarithmic():
    svg = narrowing_svg(["a", "b", "c"], {"U": [64, 16, 4, 1]})
    ya, yb, yc = (_point_y(svg, x) for x in "abc")
    assert yb - ya == pytest.approx(yc - yb, abs=0.2)  # each quartering is one equal step (0.1 px rounding)


def test_narrowing_chart_marks_switched_off_and_contradicting_steps():
    svg = narrowing_svg(["E1", "E2", "E3"], {"U1": [8, 4, 4, 4]}, ["applied", "disabled", "contradicts"])
    root = ET.fromstring(svg)
    titles = [t.text for t in root.iter(f"{SVG}title")]
    assert any(t.startswith("E2 (disabled)") for t in titles)
    assert any(t.startswith("E3 (contradicts)") for t in titles)


def test_narrowing_chart_rejects_counts_that_do_not_match_the_labels():
    with pytest.raises(ValueError, match="expected 3"):
        narrowing_svg(["E1", "E2"], {"U1": [8, 4]})


def test_narrowing_chart_of_a_solution_has_one_line_per_unknown(gum):
    root = ET.fromstring(narrowing_chart(gum))
    assert [p.get("data-series") for p in root.iter(f"{SVG}path") if p.get("data-series")] == ["A", "B", "C", "D"]


def test_ledger_lists_every_observation_with_its_effect_and_escapes_notes(gum):
    html = ledger_html(gum.project, gum)
    for obs in gum.project.observations:
        assert f"<b>{obs.id}</b>" in html
    assert "mixed melting point" in html
    assert "in use" in html and "A -" in html
    assert ledger_html(gum.project.without(*[o.id for o in gum.project.observations])).count("No observations") == 1


def test_trail_and_eliminated_tables(gum):
    trail = trail_html(gum)
    assert trail.count("<tr>") == 1 + 1 + len(gum.trail)  # header, scope, one per step
    elim = eliminated_html(gum, "B")
    # L-galactose also gives mucic acid (meso, REFERENCE_VALUES) and is removed by the D series record E5.
    assert "L-galactose" in elim and "E5" in elim


def test_eliminated_table_is_capped_with_a_count(gum):
    html = eliminated_html(gum, "B", limit=3)
    assert html.count("<tr>") == 4 and "more by" in html


def test_conflicts_box_names_the_sets_and_the_relief(clash, gum):
    html = conflicts_html(clash)
    assert "<b>E3, E4</b> cannot all hold" in html and "without <b>E3</b>" in html
    assert conflicts_html(gum) == ""


def test_board_and_solution_html(gum, clash):
    board = board_html(gum, "C")
    assert "1 of 24 candidates remain" in board and "L-rhamnose" in board and "ss-fischer" in board
    whole = solution_html(clash)
    assert "The evidence is contradictory" in whole and "No candidate survives" in whole


def test_kinds_table_lists_every_observation_kind_with_units():
    html = kinds_html(OBSERVATION_TYPES)
    for kind in OBSERVATION_TYPES:
        assert f">{kind}<" in html
    assert "periodate (IO₄⁻ consumed) [mol/mol]" in html  # the file's field name, the chemist's words, the unit
    assert "co2 (CO₂ formed) [mol/mol] (optional)" in html


@dataclass
class _Cost:
    material_mg: float = 50
    hours: float = 8
    hazard: int = 2


@dataclass
class _Exp:
    kind: str
    fields: dict
    information_bits: float
    expected_remaining: float
    outcomes: dict
    cost: object = field(default_factory=_Cost)
    cautions: tuple = ()
    title: str = ""
    unknown: str = "U1"


@dataclass
class _Plan:
    experiments: tuple
    advice: tuple = ()
    pairs: tuple = ()
    ranking: str = "value"


def test_plan_shows_information_cost_outcomes_cautions_and_deferral():
    exp = _Exp(
        "aldaric_acid",
        {"unknown": "U1"},
        1.0,
        2.0,
        {"active": ("D-glucose", "D-mannose"), "meso": ("D-allose", "D-galactose")},
        cautions=("Concentrated nitric acid is a strong oxidiser (ICSC 0183).",),
        title="nitric acid on U1",
    )
    html = plan_html(_Plan((exp,)))
    assert "nitric acid on U1" in html and "1.00 bit" in html and "about 2.0 candidates" in html
    assert "about 8 h" in html and "50 mg" in html and "serious hazard" in html
    assert "D-allose, D-galactose" in html
    assert "ICSC 0183" in html and SAFETY_DEFERRAL.replace("'", "&#x27;") in html


def test_plan_without_hazard_has_no_caution_box_and_shows_advice():
    quiet = _Exp("specific_rotation", {"unknown": "U1"}, 0.5, 3.0, {"+52": ("D-glucose",)}, title="polarimetry")
    html = plan_html(_Plan((quiet,), advice=("Every unknown is solved.",)))
    assert "ss-cautions" not in html and "Every unknown is solved." in html


def test_chair_of_beta_d_glucopyranose_has_every_group_equatorial():
    # beta-D-glucopyranose 4C1: all non-hydrogen substituents equatorial (Angyal 1969; textbook fact [memory]).
    from workbench.conformers import ring_layout

    chain = resolve("D-glucose")
    root = ET.fromstring(chair_svg(ring_layout(chain, RingForm("pyranose", "beta")), "A"))
    heavy = {t.get("data-label"): t.get("data-position") for t in root.iter(f"{SVG}text") if t.get("data-label")}
    assert {k: v for k, v in heavy.items() if not k.startswith("H")} == {
        "O1": "equatorial",
        "O2": "equatorial",
        "O3": "equatorial",
        "O4": "equatorial",
        "C6": "equatorial",
    }


def test_chair_of_alpha_d_glucopyranose_has_an_axial_anomeric_oh():
    # alpha-D-glucopyranose 4C1: O1 axial (IUPAC-IUBMB 1996, 2-Carb-6/7 [common practice]).
    from workbench.conformers import ring_layout

    root = ET.fromstring(chair_svg(ring_layout(resolve("D-glucose"), RingForm("pyranose", "alpha")), "A"))
    positions = {t.get("data-label"): t.get("data-position") for t in root.iter(f"{SVG}text") if t.get("data-label")}
    assert positions["O1"] == "axial" and positions["O2"] == "equatorial"


def test_ring_predictions_table_of_beta_glucopyranose():
    html = ring_predictions_html(resolve("D-glucose"), RingForm("pyranose", "beta"))
    # Preferred chair 4C1; large trans-diaxial J1,2 of beta-Glcp, 7.8-8.0 Hz (REFERENCE_VALUES [memory]).
    assert "Preferred chair: <b><sup>4</sup>C<sub>1</sub></b>" in html  # 4C1 written with IUPAC indices (2-Carb-7.2)
    assert "H1-H2" in html and "Hz" in html
