"""Minimal conflicting sets and the solver's search at depth: checked against brute force.

The minimality definition (every proper subset consistent) is the usual one for minimal unsatisfiable
subsets (common practice); the brute force is the reference, not the code's own output.
"""

from __future__ import annotations

import itertools
import random
import sys

from projects import linked_project

from workbench.evidence.conflicts import conflict_sets, minimal_conflict
from workbench.evidence.engine import solve
from workbench.evidence.project import project_from_dict


def _consistent_under(rules: list[frozenset[int]]):
    """Items are ints; a set is inconsistent when it contains one of ``rules`` entirely."""

    def consistent(items: list[int]) -> bool:
        have = set(items)
        return not any(rule <= have for rule in rules)

    return consistent


def _all_minimal(items: list[int], consistent) -> set[frozenset[int]]:
    out = set()
    for k in range(1, len(items) + 1):
        for combo in itertools.combinations(items, k):
            s = frozenset(combo)
            if not consistent(list(s)) and all(consistent([x for x in s if x != y]) for y in s):
                out.add(s)
    return out


def test_every_set_found_is_a_true_minimal_conflict_on_random_cases():
    rng = random.Random(12)
    for _ in range(60):
        items = list(range(rng.randint(3, 11)))
        rules = [frozenset(rng.sample(items, rng.randint(1, 3))) for _ in range(rng.randint(1, 3))]
        consistent = _consistent_under(rules)
        truth = _all_minimal(items, consistent)
        first = minimal_conflict(items, consistent)
        assert frozenset(first) in truth
        assert first == sorted(first)  # in the given order
        found = conflict_sets(items, consistent, key=str)
        assert found and all(frozenset(int(x) for x in s) in truth for s in found)
        assert len(set(found)) == len(found)


def test_a_conflict_among_a_thousand_items_takes_few_checks():
    items = list(range(1000))
    calls = []

    def consistent(sub: list[int]) -> bool:
        calls.append(1)
        return not ({137, 802} <= set(sub))

    progress: list[tuple[int, int]] = []
    assert minimal_conflict(items, consistent, progress=lambda s, c: progress.append((s, c))) == [137, 802]
    assert len(calls) < 60  # deletion one by one would need 1,000
    assert progress and progress[-1][1] == len(calls)


def test_many_linked_unknowns_with_a_cycle_need_no_deep_recursion():
    # A hexose osazone is shared by the two C-2 epimeric aldoses and the 2-ketose (e.g. D-glucose,
    # D-mannose, D-fructose: Fischer; common textbook fact), so each of the 4 D-osazones admits three
    # different unknowns: U0 (series D) may be any of the 8 D-aldohexoses and 4 D-2-ketohexoses.
    project = project_from_dict(linked_project(300))
    limit = sys.getrecursionlimit()
    sys.setrecursionlimit(250)  # a recursive search over 300 linked unknowns would exceed this
    try:
        solution = solve(project)
    finally:
        sys.setrecursionlimit(limit)
    assert not solution.contradictory
    names = {c.carbonyl for c in solution.survivors["U0"]}
    assert names == {"aldose", "ketose"}
    assert len(solution.survivors["U0"]) == 12
    assert all(c.series == "D" for c in solution.survivors["U0"])
