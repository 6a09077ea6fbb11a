"""The next-experiment planner: information, partitions, classic distinctions, cautions."""

from __future__ import annotations

import math
from pathlib import Path

import pytest
from projects import over_scope

from workbench.chem import reactions, resolve
from workbench.evidence import load_project, solve
from workbench.evidence.planner import entropy_bits, plan

DATA = Path(__file__).parent / "data"


def hexose_project(observations=()):
    return over_scope({"carbons": [6], "carbonyl": ["aldose"], "series": ["D"]}, observations, title="a D-aldohexose")


def find(p, kind, **fields):
    for e in p.experiments:
        if e.kind == kind and all(e.fields.get(k) == v for k, v in fields.items()):
            return e
    raise AssertionError(f"no {kind} {fields}")


def test_information_is_the_entropy_of_the_partition():
    result = plan(hexose_project(), ranking="information", limit=200)
    assert result.experiments
    for e in result.experiments:
        sizes = [len(v) for v in e.outcomes.values()]
        everyone = sorted(n for v in e.outcomes.values() for n in v)
        assert len(everyone) == 8 and len(set(everyone)) == 8  # an exact partition of the survivors
        if e.kind in ("specific_rotation", "anomer_ratio", "coupling_constant"):
            # measured quantities: mutual information with a noisy reading, at most the prior entropy
            assert 0 < e.information_bits <= math.log2(8) + 1e-9
            continue
        assert math.isclose(e.information_bits, entropy_bits(sizes))
        assert math.isclose(e.expected_remaining, sum(n * n for n in sizes) / sum(sizes))


def test_a_noisy_reading_tells_apart_only_what_its_error_allows():
    # equilibrium rotations: D-glucose +52.7 and D-galactose +80.2 (Bruice 8th ed.), D-mannose +14.6
    # (handbook): far apart against about 2.5 deg of combined error, so nearly log2(3) bits;
    # the anomer ratios of glucose and galactose are predicted alike, so little is learnt from them
    from workbench.chem.parse import resolve
    from workbench.evidence.planner import _noisy_information

    three = [resolve(n) for n in ("D-glucose", "D-galactose", "D-mannose")]
    bits, left = _noisy_information("specific_rotation", {"unknown": "U"}, three, [1 / 3] * 3)
    assert bits == pytest.approx(math.log2(3), abs=0.02) and left == pytest.approx(1.0, abs=0.05)
    two = [resolve(n) for n in ("D-glucose", "D-galactose")]
    bits, _ = _noisy_information("anomer_ratio", {"unknown": "U"}, two, [0.5, 0.5])
    assert bits < 0.1


def test_entropy_of_even_split():
    assert entropy_bits([4, 4]) == 1.0 and entropy_bits([8]) == 0.0 and math.isclose(entropy_bits([1] * 8), 3.0)


def test_nitric_acid_separates_allose_and_galactose():
    # Classic: of the eight D-aldohexoses only D-allose and D-galactose give meso
    # aldaric acids (Carey, Organic Chemistry, ch. 25 [from memory]; REFERENCE_VALUES.md)
    e = find(plan(hexose_project(), limit=200), "aldaric_acid")
    assert sorted(e.outcomes["optically inactive (meso)"]) == ["D-allose", "D-galactose"]
    assert len(e.outcomes["optically active"]) == 6
    assert math.isclose(e.information_bits, entropy_bits([2, 6]))
    assert any("nitric acid" in c for c in e.cautions)
    assert any("safety officer" in c for c in e.cautions)


def test_osazone_with_reference_separates_its_c2_epimer_pair():
    # glucose and mannose share an osazone (Fischer; REFERENCE_VALUES.md)
    e = find(plan(hexose_project(), limit=200), "same_product", reaction="osazone", members=["U", "D-glucose"])
    assert sorted(e.outcomes["identical"]) == ["D-glucose", "D-mannose"]
    assert any("Phenylhydrazine" in c for c in e.cautions)


def test_predicted_partition_agrees_with_chemistry_module():
    e = find(plan(hexose_project(), limit=200), "alditol")
    for outcome, group in e.outcomes.items():
        for name in group:
            active = reactions.is_optically_active(reactions.alditols(resolve(name)))
            assert active == (outcome == "optically active")


def test_solved_unknown_gets_no_recommendation():
    result = plan(load_project(DATA / "fischer_glucose.json"))
    assert result.experiments == ()
    assert "solved" in result.advice[0]


def test_contradictory_project_gets_advice_on_what_to_repeat():
    result = plan(load_project(DATA / "contradictory.json"))
    assert result.experiments == ()
    assert "contradictory" in result.advice[0]
    assert any("E2" in a for a in result.advice) and any("E4" in a for a in result.advice)


def test_lookahead_finds_pairs_that_split_further():
    result = plan(hexose_project(), lookahead=True)
    assert result.pairs
    best = result.pairs[0]
    assert best.information_bits >= max(best.first.information_bits, best.second.information_bits)
    assert best.information_bits <= 3.0 + 1e-9


def test_ranking_by_value_prefers_cheaper_experiments_of_equal_information():
    result = plan(hexose_project(), limit=200)
    values = [e.value for e in result.experiments]
    assert values == sorted(values, reverse=True)


def test_plan_respects_earlier_evidence():
    p = hexose_project([{"id": "E1", "kind": "aldaric_acid", "unknown": "U", "optically_active": False}])
    assert len(solve(p).survivors["U"]) == 2
    e = find(plan(p, limit=200), "same_product", reaction="osazone", members=["U", "D-talose"])
    assert e.outcomes == {"different": ("D-allose",), "identical": ("D-galactose",)}
