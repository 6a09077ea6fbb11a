"""One rule per qualitative test: predict, solve and plan give the same answer everywhere.

The reducing-sugar test (hot alkaline Cu(II)/Ag(I)) and the resorcinol/HCl ketose
test are decided from the structure (which hydroxyls the mechanism needs), and the
three paths that use them must agree on every candidate of the largest catalogue:
the prediction record behind ``predict --json``, the engine's filtering in ``solve``
and the planner's partition of the survivors in ``plan``. Hand-derived expectations
for deoxy ketoses follow, with the chemical reasoning written beside each.
"""

from __future__ import annotations

from collections import defaultdict

import pytest
from projects import over_scope

from workbench.chem.catalogue import Scope, catalogue
from workbench.chem.chain import Chain
from workbench.chem.names import display_name
from workbench.chem.predictions import predict as record_of
from workbench.chem.predictions import predictions_json
from workbench.evidence import solve
from workbench.evidence.planner import _unary_outcomes, plan

LARGEST = Scope(carbons=tuple(range(3, 10)), modifications=("any",))
TESTS = ("reducing_test", "ketose_test")


def _record_answer(kind: str, chain: Chain) -> str:
    return getattr(record_of(chain), kind).result


@pytest.fixture(scope="module")
def largest() -> tuple[Chain, ...]:
    return catalogue(LARGEST)


@pytest.fixture(scope="module")
def by_template(largest) -> dict[tuple[str, ...], list[Chain]]:
    groups: dict[tuple[str, ...], list[Chain]] = defaultdict(list)
    for chain in largest:
        groups[chain.groups].append(chain)
    return groups


@pytest.mark.parametrize("kind", TESTS)
def test_predict_record_answers_the_same_for_every_stereoisomer_of_a_constitution(kind, by_template):
    # Both tests depend on which carbons carry OH, not on configuration [common practice]:
    # every candidate's record gives its constitution's answer, and the predict --json block
    # of one stereoisomer per constitution (152 in the largest catalogue) reports the same word.
    for chains in by_template.values():
        answers = {_record_answer(kind, c) for c in chains}
        assert len(answers) == 1, (kind, chains[0].pattern, answers)
        assert predictions_json(chains[0])[kind]["result"] in answers


@pytest.mark.parametrize("kind", TESTS)
@pytest.mark.parametrize("observed", ["positive", "negative"])
def test_solve_keeps_exactly_the_candidates_predict_answers_with(kind, observed, by_template):
    project = over_scope(LARGEST.to_dict(), [{"id": "T", "kind": kind, "unknown": "X", "result": observed}], ("X",))
    sol = solve(project)
    survivors = set(sol.survivors["X"])
    expected = {c for chains in by_template.values() if _record_answer(kind, chains[0]) == observed for c in chains}
    assert survivors == expected
    assert bool(expected) != bool(sol.conflicts)  # a contradiction only when nothing fits


@pytest.mark.parametrize("kind", TESTS)
def test_plan_partitions_the_whole_catalogue_as_predict_answers(kind, largest, by_template):
    answer = {c: _record_answer(kind, chains[0]) for chains in by_template.values() for c in chains}
    labels = dict(zip(largest, _unary_outcomes(kind, {"unknown": "X"}, largest), strict=True))
    assert labels == answer


DEOXY_HEXULOSES = {
    "carbons": [6],
    "carbonyl": ["ketose"],
    "series": ["D"],
    "modifications": ["none", "deoxy:1", "deoxy:3", "deoxy:1,3", "deoxy:4", "deoxy:5", "deoxy:6"],
}


def test_plan_outcomes_name_the_same_deoxy_ketoses_as_the_records():
    scope = DEOXY_HEXULOSES
    project = over_scope(scope, [], ("X",))
    chains = catalogue(Scope.from_dict(scope))
    result = plan(project, limit=200)
    for kind in TESTS:
        (exp,) = [e for e in result.experiments if e.kind == kind]
        expected: dict[str, set[str]] = defaultdict(set)
        for c in chains:
            expected[_record_answer(kind, c)].add(display_name(c))
        assert {k: set(v) for k, v in exp.outcomes.items()} == dict(expected)


# Hand-derived expectations for 2-ketohexoses of the D-arabino (fructose) configuration, written
# as Fischer patterns from C-1 down. Reasoning (mechanisms from memory: Lobry de Bruyn-Alberda van
# Ekenstein enolisation; the acid dehydration of a ketofuranose to 5-(hydroxymethyl)furfural):
# - reducing test: the hot alkaline reagent oxidises the enediol formed by enolisation, which needs an
#   OH on a carbon next to the C-2 ketone (C-1 gives the 1,2-enediol, C-3 the 2,3-enediol). A ketone
#   with no alpha-OH (acetone-like) is not oxidised [common practice].
# - ketose test: fructose -> HMF (C6H12O6 - 3 H2O = C6H6O3) keeps C-1 as the aldehyde (its OH is the
#   aldehyde oxygen), loses O-2, O-3 and O-4 as water and closes the furan with O-5. Without O-1 or
#   O-3 or O-4 the three waters cannot leave at the oxidation level of a 2-furaldehyde (3-deoxy:
#   C6H12O5 has one O too few for HMF, and the furan would need C-6 reduced to CH3); without O-5
#   there is no furan oxygen. No 2-furaldehyde, no fast red resorcinol dye [from memory].
DEOXY_KETOSE_EXPECTATIONS = [
    # pattern, reducing, ketose test, why
    ("CH2OH-CO-CHOH(l)-CHOH(r)-CHOH(r)-CH2OH", "positive", "positive", "D-fructose: OH at C-1 and C-3; HMF"),
    ("CH3-CO-CHOH(l)-CHOH(r)-CHOH(r)-CH2OH", "positive", "negative", "1-deoxy: C-3 OH enolises; no C-1 aldehyde"),
    ("CH2OH-CO-CH2-CHOH(r)-CHOH(r)-CH2OH", "positive", "negative", "3-deoxy: C-1 OH enolises; O-3 missing"),
    ("CH3-CO-CH2-CHOH(r)-CHOH(r)-CH2OH", "negative", "negative", "1,3-dideoxy: no alpha-OH at all"),
    ("CH2OH-CO-CHOH(l)-CH2-CHOH(r)-CH2OH", "positive", "negative", "4-deoxy: O-4 missing"),
    ("CH2OH-CO-CHOH(l)-CHOH(r)-CH2-CH2OH", "positive", "negative", "5-deoxy: no furan oxygen"),
    ("CH2OH-CO-CHOH(l)-CHOH(r)-CHOH(r)-CH3", "positive", "positive", "6-deoxy: 5-methylfurfural"),
    ("CH2OH-CO-CHOH(l)-CHOH(r)-CH2OH", "positive", "positive", "D-xylulose (pentulose): furfural"),
    ("CH2OH-CO-CHOH(r)-CH2OH", "positive", "negative", "tetrulose: four carbons cannot close a 2-furaldehyde"),
    ("CH3-CO-CH2OH", "positive", "negative", "1-deoxyglycerone (hydroxyacetone): alpha-OH at C-3"),
]


@pytest.mark.parametrize(("pattern", "reducing", "ketose", "why"), DEOXY_KETOSE_EXPECTATIONS)
def test_deoxy_ketose_outcomes_by_hand(pattern, reducing, ketose, why):
    chain = Chain.from_pattern(pattern)
    assert chain.carbonyl == "ketose", why
    assert _record_answer("reducing_test", chain) == reducing, why
    assert _record_answer("ketose_test", chain) == ketose, why
    # and the engine: an observation of the opposite answer removes the sugar, the right one keeps it
    # ("any" has no 1,3-dideoxy variant, so it is named)
    scope = {"carbons": [chain.carbons], "carbonyl": ["ketose"], "modifications": ["any", "deoxy:1,3"]}
    for kind, right in (("reducing_test", reducing), ("ketose_test", ketose)):
        wrong = "negative" if right == "positive" else "positive"
        kept = solve(over_scope(scope, [{"id": "T", "kind": kind, "unknown": "X", "result": right}], ("X",)))
        gone = solve(over_scope(scope, [{"id": "T", "kind": kind, "unknown": "X", "result": wrong}], ("X",)))
        assert chain in kept.survivors["X"], (why, kind)
        assert chain not in gone.survivors["X"], (why, kind)
