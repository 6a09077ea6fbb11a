"""A small exact constraint solver for the unknowns of a project.

Variables are the unknowns (and fixed known sugars); domains are candidate
chains; constraints are binary tests. Every relational observation of the
project decomposes into binary constraints (pairwise identity of products,
pairwise distinctness, substrate-product of a chain extension or shortening).

:func:`supported_domains` returns, for every variable, exactly the values that
occur in at least one complete assignment satisfying every constraint:
arc consistency (AC-3) first, then for each remaining value a search for a
witness solution (backtracking with maintained arc consistency), reusing
witnesses found earlier so most values are confirmed without a new search.
"""

from __future__ import annotations

from collections import defaultdict
from collections.abc import Callable, Hashable, Iterable
from dataclasses import dataclass

from workbench.chem.chain import Chain

__all__ = ["Binary", "arc_consistent", "find_solution", "supported_domains"]

Domains = dict[str, list[Chain]]


@dataclass(frozen=True)
class Binary:
    """A binary constraint ``test(value_of_a, value_of_b)`` from observation ``source``.

    ``tokens_a``/``tokens_b``, when given, map a value to hashable tokens such
    that the test can only hold when the token sets intersect; they let the
    solver find supports through an index instead of a scan.
    """

    a: str
    b: str
    test: Callable[[Chain, Chain], bool]
    source: str
    tokens_a: Callable[[Chain], Iterable[Hashable]] | None = None
    tokens_b: Callable[[Chain], Iterable[Hashable]] | None = None

    def holds(self, var: str, value: Chain, other: Chain) -> bool:
        """The test with ``value`` for ``var`` (either end) and ``other`` for the other end."""
        return self.test(value, other) if var == self.a else self.test(other, value)

    def other(self, var: str) -> str:
        """The variable at the other end from ``var``."""
        return self.b if var == self.a else self.a


def _revise(domains: Domains, var: str, c: Binary) -> bool:
    """Remove values of ``var`` with no support in the other end; True if any removed."""
    other = c.other(var)
    others = domains[other]
    mine_tokens = c.tokens_a if var == c.a else c.tokens_b
    their_tokens = c.tokens_b if var == c.a else c.tokens_a
    kept: list[Chain] = []
    if mine_tokens is not None and their_tokens is not None:
        index: dict[Hashable, list[Chain]] = defaultdict(list)
        for y in others:
            for t in their_tokens(y):
                index[t].append(y)
        for x in domains[var]:
            if any(c.holds(var, x, y) for t in mine_tokens(x) for y in index.get(t, ())):
                kept.append(x)
    else:
        for x in domains[var]:
            if any(c.holds(var, x, y) for y in others):
                kept.append(x)
    changed = len(kept) != len(domains[var])
    domains[var] = kept
    return changed


def arc_consistent(domains: Domains, constraints: list[Binary]) -> bool:
    """AC-3 in place; False when a domain becomes empty."""
    by_var: dict[str, list[Binary]] = defaultdict(list)
    for c in constraints:
        by_var[c.a].append(c)
        by_var[c.b].append(c)
    queue = [(c.a, c) for c in constraints] + [(c.b, c) for c in constraints]
    queued = set((v, id(c)) for v, c in queue)
    while queue:
        var, c = queue.pop()
        queued.discard((var, id(c)))
        if _revise(domains, var, c):
            if not domains[var]:
                return False
            for c2 in by_var[var]:
                if c2 is c:
                    continue
                nxt = c2.other(var)
                if (nxt, id(c2)) not in queued:
                    queue.append((nxt, c2))
                    queued.add((nxt, id(c2)))
    return all(domains.values())


def find_solution(domains: Domains, constraints: list[Binary]) -> dict[str, Chain] | None:
    """One complete assignment satisfying every constraint, or None (MAC search)."""
    work = {v: list(d) for v, d in domains.items()}
    if not arc_consistent(work, constraints):
        return None
    return _search(work, constraints)


def _search(domains: Domains, constraints: list[Binary]) -> dict[str, Chain] | None:
    open_vars = [v for v, d in domains.items() if len(d) > 1]
    if not open_vars:
        assignment = {v: d[0] for v, d in domains.items()}
        return assignment if all(c.test(assignment[c.a], assignment[c.b]) for c in constraints) else None
    var = min(open_vars, key=lambda v: len(domains[v]))
    for value in domains[var]:
        trial = {v: list(d) for v, d in domains.items()}
        trial[var] = [value]
        if arc_consistent(trial, constraints):
            found = _search(trial, constraints)
            if found is not None:
                return found
    return None


def supported_domains(domains: Domains, constraints: list[Binary]) -> Domains | None:
    """Exactly the values of each variable that belong to some solution; None if none exists."""
    work = {v: list(d) for v, d in domains.items()}
    if not arc_consistent(work, constraints):
        return None
    first = _search({v: list(d) for v, d in work.items()}, constraints)
    if first is None:
        return None
    by_var: dict[str, list[Binary]] = defaultdict(list)
    for c in constraints:
        by_var[c.a].append(c)
        by_var[c.b].append(c)
    witnesses = [first]
    supported: dict[str, set[Chain]] = {v: {first[v]} for v in work}
    for var in work:
        if not by_var[var]:
            supported[var] = set(work[var])  # unconstrained: any value joins any solution
            continue
        for value in list(work[var]):
            if value in supported[var]:
                continue
            if _repairs(var, value, witnesses, by_var[var], supported):
                continue
            trial = {v: list(d) for v, d in work.items()}
            trial[var] = [value]
            sol = find_solution(trial, constraints)
            if sol is None:
                work[var].remove(value)
                continue
            witnesses.append(sol)
            for v, val in sol.items():
                supported[v].add(val)
    return {v: [x for x in work[v] if x in supported[v]] for v in work}


def _repairs(var: str, value: Chain, witnesses: list[dict[str, Chain]], cons: list[Binary], supported) -> bool:
    """True if swapping ``value`` into a known solution keeps every constraint of ``var``."""
    for sol in witnesses[-8:]:
        if all(c.holds(var, value, sol[c.other(var)]) for c in cons):
            supported[var].add(value)
            return True
    return False
