"""Residue unknowns in the project file, the engine, the planner and the command line.

Expected outcomes follow the rules of REFERENCE_VALUES.md, "Glycan residues" (methylation analysis after
Björndal et al. 1970; periodate and Smith degradation after Goldstein, Hay, Lewis and Smith 1965;
common practice, recalled from memory); each check names its source.
"""

from __future__ import annotations

import json

import projects
import pytest

from workbench.cli import main
from workbench.errors import ProjectError
from workbench.evidence import project_from_dict, solve
from workbench.evidence.planner import plan
from workbench.evidence.residue_outcomes import feasible_counts

GLC = {"sugars": ["D-glucose"]}


def _names(solution, uid):
    return sorted(r.name for r in solution.survivors[uid])


def test_residue_unknown_enumerates_rings_anomers_and_linkages():
    # D-glucose: 2 rings x 2 anomers x (1 + 4 + 6) linkage sets of at most two of four free positions
    project = projects.project([{"id": "R1", "type": "residue", "scope": GLC}], [])
    assert solve(project).scope_counts["R1"] == 44


def test_the_default_residue_scope_holds_the_n_acetyl_hexosamines():
    # chitin is (1->4)-linked 2-acetamido-2-deoxy-beta-D-glucopyranose; its linkage analysis gives the
    # 4-linked GlcNAc alditol acetate, methyl at O-3 and O-6, acetyl at C-1, C-4, C-5 (common practice)
    project = projects.project(
        [{"id": "R", "type": "residue"}],
        [
            {
                "id": "M1",
                "kind": "methylation_analysis",
                "unknown": "R",
                "methyl": [3, 6],
                "acetyl": [1, 4, 5],
                "sugar": "N-acetyl-D-glucosamine",
            },
            {"id": "A1", "kind": "anomer", "unknown": "R", "value": "beta"},
            {"id": "F1", "kind": "ring_form", "unknown": "R", "value": "pyranose"},
        ],
    )
    assert _names(solve(project), "R") == ["->4)-beta-D-GlcpNAc-(1->"]


def test_four_linked_pyranose_and_five_linked_furanose_stay_ambiguous():
    # a 4-linked pyranose and a 5-linked furanose give the same alditol acetate, the same periodate uptake
    # (1 IO4-, no HCOOH) and the same Smith fragment (erythritol) (REFERENCE_VALUES.md, common practice)
    project = project_from_dict(projects.FOUR_LINKED_GLUCOSE_OXIDISED)
    solution = solve(project)
    assert _names(solution, "R1") == ["->4)-alpha-D-Glcp-(1->", "->5)-alpha-D-Glcf-(1->"]
    # the planner proposes what separates them
    best = plan(project).experiments[0]
    assert best.kind == "ring_form" and len(best.outcomes) == 2
    separated = project.with_observation(
        projects.project(
            [{"id": "R1", "type": "residue"}],
            [{"id": "E5", "kind": "ring_form", "unknown": "R1", "value": "pyranose"}],
        ).observations[0]
    )
    assert _names(solve(separated), "R1") == ["->4)-alpha-D-Glcp-(1->"]


def test_periodate_separates_linkage_types_of_a_galactan():
    # 3-linked hexopyranosyl: no periodate consumed; 6-linked: 2 IO4-, 1 HCOOH (REFERENCE_VALUES.md)
    observations = [
        projects.residue_periodate("E1", periodate=2.0, formic_acid=1.0),
        {"id": "E2", "kind": "ring_form", "unknown": "R1", "value": "pyranose"},
        {"id": "E3", "kind": "anomer", "unknown": "R1", "value": "beta"},
    ]
    scope = {"sugars": ["D-galactose"], "max_linked": 1}
    solution = solve(projects.project([{"id": "R1", "type": "residue", "scope": scope}], observations))
    assert _names(solution, "R1") == ["->6)-beta-D-Galp-(1->", "beta-D-Galp-(1->"]


def test_contradictory_residue_evidence_reports_its_minimal_conflict():
    # a 3-linked hexopyranosyl consumes no periodate (REFERENCE_VALUES.md), so methylation (3-linked) and an
    # uptake of 2 mol cannot both hold; the anomer record is not part of the conflict
    observations = [
        {"id": "E1", "kind": "anomer", "unknown": "R1", "value": "beta"},
        {"id": "E2", "kind": "methylation_analysis", "unknown": "R1", "methyl": [2, 4, 6], "acetyl": [1, 3, 5]},
        projects.residue_periodate("E3", periodate=2.0, formic_acid=1.0),
    ]
    solution = solve(projects.project([{"id": "R1", "type": "residue", "scope": GLC}], observations))
    assert solution.contradictory
    assert [sorted(c) for c in solution.conflicts] == [["E2", "E3"]]


def test_branching_balance_forces_the_other_residue_terminal():
    # one extra non-reducing terminal residue per branch point (common practice): with equal amounts of a
    # 4,6-branched residue and a second residue type, the second must be terminal
    observations = [
        {"id": "E1", "kind": "methylation_analysis", "unknown": "R1", "methyl": [2, 3], "acetyl": [1, 4, 5, 6]},
        {"id": "E2", "kind": "molar_ratio", "members": ["R1", "R2"], "amounts": [1, 1]},
    ]
    unknowns = [
        {"id": "R1", "type": "residue", "scope": {"sugars": ["D-glucose"], "ring": ["pyranose"]}},
        {"id": "R2", "type": "residue", "scope": {"sugars": ["D-glucose"], "ring": ["pyranose"]}},
    ]
    solution = solve(projects.project(unknowns, observations))
    assert {len(r.linked) for r in solution.survivors["R2"]} == {0}
    assert len(solution.survivors["R2"]) == 2  # alpha or beta terminal Glcp
    # without the balance the amounts say nothing about linkage
    loose = [observations[0], {**observations[1], "balance": False}]
    assert len(solve(projects.project(unknowns, loose)).survivors["R2"]) == 2 * 11


def test_feasible_counts_of_the_balance():
    # a linear chain (all 1-linked) balances; 1 branch point needs 1 extra terminal residue (common practice)
    assert (1, 1) in feasible_counts((5.0, 5.0), [range(3), range(3)], 0.1)
    assert feasible_counts((1.0, 1.0), [range(2, 3), range(3)], 0.05) == [(2, 0)]


def test_sugar_level_kinds_judge_the_released_sugar():
    # the carbon count of the sugar released by hydrolysis: a pentose residue has 5 carbons (definition)
    observations = [{"id": "E1", "kind": "carbon_count", "unknown": "R1", "value": 5}]
    scope = {"sugars": ["D-glucose", "D-xylose"], "ring": ["pyranose"], "anomer": ["beta"], "max_linked": 0}
    solution = solve(projects.project([{"id": "R1", "type": "residue", "scope": scope}], observations))
    assert _names(solution, "R1") == ["beta-D-Xylp-(1->"]


def test_solve_json_carries_the_residue_fields(tmp_path, capsys):
    data = projects.project_dict(
        [{"id": "R1", "type": "residue", "scope": {"sugars": ["L-rhamnose"], "ring": ["pyranose"]}}],
        [
            {"id": "E1", "kind": "methylation_analysis", "unknown": "R1", "methyl": [3, 4], "acetyl": [1, 2, 5]},
            {"id": "E2", "kind": "anomer", "unknown": "R1", "value": "alpha"},
        ],
        title="json",
    )
    path = tmp_path / "p.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    assert main(["solve", str(path), "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    (survivor,) = out["unknowns"]["R1"]["survivors"]
    # DESIGN.md Contract 5 fields; 2-linked alpha-L-Rhap [IUPAC condensed form, 2-Carb-38]
    assert survivor["sugar"] == "L-rhamnose"
    assert (survivor["ring"], survivor["anomer"], survivor["linked_positions"]) == ("pyranose", "alpha", [2])
    assert survivor["name"] == "->2)-alpha-L-Rhap-(1->"


def test_contradiction_exits_3_and_bad_residue_input_exits_2(tmp_path, capsys):
    base = {"format": "stereosieve-project", "version": 1, "title": "t"}
    contradictory = {
        **base,
        "unknowns": [{"id": "R1", "type": "residue", "scope": GLC}],
        "observations": [
            {"id": "E1", "kind": "smith_degradation", "unknown": "R1", "product": "glycerol"},
            {"id": "E2", "kind": "smith_degradation", "unknown": "R1", "product": "erythritol"},
        ],
    }
    path = tmp_path / "c.json"
    path.write_text(json.dumps(contradictory), encoding="utf-8")
    assert main(["solve", str(path)]) == 3
    capsys.readouterr()
    bad = {
        **base,
        "unknowns": [{"id": "U1"}],
        "observations": [{"id": "E1", "kind": "anomer", "unknown": "U1", "value": "alpha"}],
    }
    path.write_text(json.dumps(bad), encoding="utf-8")
    assert main(["validate", str(path)]) == 2
    assert "E1" in capsys.readouterr().err


@pytest.mark.parametrize(
    ("unknowns", "observation", "words"),
    [
        ([{"id": "U1"}], {"kind": "methylation_analysis", "unknown": "U1", "methyl": [2], "acetyl": [1]}, "residue"),
        (
            [{"id": "R1", "type": "residue"}],
            {"kind": "methylation_analysis", "unknown": "R1", "methyl": [2, 3], "acetyl": [3]},
            "both",
        ),
        (
            [{"id": "R1", "type": "residue"}],
            {"kind": "methylation_analysis", "unknown": "R1", "methyl": [12], "acetyl": [1]},
            "outside",
        ),
        (
            [{"id": "R1", "type": "residue"}],
            {"kind": "smith_degradation", "unknown": "R1", "product": "glycerine"},
            "polyol",
        ),
        (
            [{"id": "R1", "type": "residue"}, {"id": "R2", "type": "residue"}],
            {"kind": "molar_ratio", "members": ["R1", "R2"], "amounts": [1]},
            "amount",
        ),
        (
            [{"id": "R1", "type": "residue"}],
            {"kind": "same_product", "reaction": "alditol", "members": ["R1", "D-glucose"], "relation": "identical"},
            "free sugars",
        ),
    ],
)
def test_bad_residue_observations_are_named(unknowns, observation, words):
    with pytest.raises(ProjectError) as err:
        projects.project(unknowns, [{"id": "E9", **observation}])
    assert "E9" in str(err.value) and words in str(err.value)


@pytest.mark.parametrize(
    ("unknown", "words"),
    [
        ({"id": "R1", "type": "oligomer"}, "type"),
        ({"id": "R1", "type": "residue", "scope": {"ring": ["septanose"]}}, "ring"),
        ({"id": "R1", "type": "residue", "scope": {"max_linked": 7}}, "max_linked"),
        ({"id": "R1", "type": "residue", "scope": {"sugars": ["D-glucosamine"]}}, "amino"),
    ],
)
def test_bad_residue_unknowns_are_named(unknown, words):
    with pytest.raises(ProjectError) as err:
        projects.project([unknown], [])
    assert "R1" in str(err.value) and words in str(err.value)


def test_planner_cautions_for_methylation_analysis():
    # methyl iodide: toxic alkylating agent, suspected carcinogen; NaH/DMSO (REFERENCE_VALUES.md, hazards)
    project = projects.project([{"id": "R1", "type": "residue", "scope": GLC}], [])
    experiments = {e.kind: e for e in plan(project, limit=50).experiments}
    cautions = " ".join(experiments["methylation_analysis"].cautions)
    assert "Methyl iodide" in cautions and "carcinogen" in cautions and "hydride" in cautions
    assert "safety data sheet" in cautions and "safety officer" in cautions
    assert "periodate" in " ".join(experiments["smith_degradation"].cautions).lower()
