"""Closest rivals of an unknown's answer: other survivors by probability, then the latest removed."""

from __future__ import annotations

import math
from pathlib import Path

from projects import FOUR_LINKED_GLUCOSE

from workbench.chem import display_name
from workbench.evidence import load_project, project_from_dict, solve
from workbench.evidence.rivals import closest_rivals, survivor_probabilities

SAMPLES = Path(__file__).resolve().parent.parent / "sample_projects"


def test_deoxyhexose_rivals_are_removed_by_the_last_records_epimers_first():
    solution = solve(load_project(SAMPLES / "red_seaweed_deoxyhexose.json"))
    rivals = closest_rivals(solution, "U1", limit=3)
    last_step = len(solution.trail) - 1
    assert all(r.step >= last_step - 1 and r.removed_by for r in rivals)
    # L-fucose (6-deoxy-L-galactose) and L-quinovose (6-deoxy-L-glucose) differ at C-4 only (common practice)
    assert display_name(rivals[0].chain) == "L-quinovose" and rivals[0].inverted == (4,)
    assert all(len(r.inverted or ()) == 1 for r in rivals)  # single epimers lead among equals


def test_survivors_share_belief_and_rank_as_rivals():
    project = project_from_dict(FOUR_LINKED_GLUCOSE)
    solution = solve(project)
    shares = survivor_probabilities(solution, "R1")
    # a 4-linked alpha-glucopyranosyl or a 5-linked alpha-glucofuranosyl residue give the same alditol
    # acetate (methylation analysis, Bjoerndal et al. 1970 [memory]); nothing weighs one over the other
    assert len(shares) == 2 and math.isclose(sum(shares.values()), 1.0)
    first = closest_rivals(solution, "R1")[0]
    assert first.survives and first.probability is not None and first.inverted is None
    removed = closest_rivals(solution, "R1", limit=10)[1:]
    by_anomer = len(solution.trail[-1].eliminated["R1"])  # the beta forms of the two survivors
    assert by_anomer == 2 and [r.removed_by for r in removed[:3]] == ["E2", "E2", "E1"]
