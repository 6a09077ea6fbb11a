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


def _merge(constraints: list[Binary]) -> list[Binary]:
    """One conjunctive constraint per pair of variables (arc consistency is exact on trees only then)."""
    groups: dict[frozenset[str], list[Binary]] = defaultdict(list)
    for c in constraints:
        groups[frozenset((c.a, c.b))].append(c)
    merged: list[Binary] = []
    for group in groups.values():
        if len(group) == 1:
            merged.append(group[0])
            continue
        a, b = group[0].a, group[0].b
        parts = [(c, c.a == a) for c in group]

        def test(x: Chain, y: Chain, parts=parts) -> bool:
            return all(c.test(x, y) if same else c.test(y, x) for c, same in parts)

        keyed = next(((c, same) for c, same in parts if c.tokens_a is not None and c.tokens_b is not None), None)
        if keyed is None:
            merged.append(Binary(a, b, test, "+".join(c.source for c in group)))
        else:
            c, same = keyed
            ta, tb = (c.tokens_a, c.tokens_b) if same else (c.tokens_b, c.tokens_a)
            merged.append(Binary(a, b, test, "+".join(x.source for x in group), ta, tb))
    return merged


def _condition_on_singletons(domains: Domains, constraints: list[Binary]) -> list[Binary] | None:
    """Fold constraints touching a one-value variable into filters on the other end (exact)."""
    remaining = list(constraints)
    changed = True
    while changed:
        changed = False
        kept: list[Binary] = []
        for c in remaining:
            da, db = domains[c.a], domains[c.b]
            if len(da) == 1 or len(db) == 1:
                if len(da) == 1:
                    domains[c.b] = [y for y in db if c.test(da[0], y)]
                if len(domains[c.b]) == 1 or len(db) == 1:
                    domains[c.a] = [x for x in domains[c.a] if any(c.test(x, y) for y in domains[c.b])]
                if not domains[c.a] or not domains[c.b]:
                    return None
                changed = True
                continue
            kept.append(c)
        remaining = kept
    return remaining


def _is_forest(variables: Iterable[str], constraints: list[Binary]) -> bool:
    """True when the constraint graph (parallel edges already merged) has no cycle."""
    names = list(variables)
    return len(constraints) == len(names) - len(components(names, constraints))


def supported_domains(domains: Domains, constraints: list[Binary]) -> Domains | None:
    """Exactly the values of each variable that belong to some solution; None if none exists.

    Parallel constraints are merged and one-value variables folded in; if the
    remaining constraint graph is a forest, arc consistency alone is exact
    (Freuder, J. ACM 29, 24, 1982); otherwise every value is confirmed by a
    witness solution.
    """
    work = {v: list(d) for v, d in domains.items()}
    constraints = _merge(constraints)
    if not arc_consistent(work, constraints):
        return None
    reduced = _condition_on_singletons(work, constraints)
    if reduced is None or not arc_consistent(work, reduced):
        return None
    constraints = reduced
    if _is_forest(work, constraints):
        return work
    first = _search({v: list(d) for v, d in work.items()}, constraints)
    if first is None:
        return None
    by_var: dict[str, list[Binary]] = defaultdict(list)
    for c in constraints:
        by_var[c.a].append(c)
        by_var[c.b].append(c)
    finder = _WitnessFinder(work, constraints, by_var)
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
            sol = finder.find(var, value)
            if sol is None:
                work[var].remove(value)
                finder.removed(var, value)
                continue
            witnesses.append(sol)
            for v, val in sol.items():
                supported[v].add(val)
    return {v: [x for x in work[v] if x in supported[v]] for v in work}


class _WitnessFinder:
    """Complete backtracking search for one solution with a given value fixed.

    Variables are assigned outward from the fixed one; candidates for a
    variable come from a token index of a constraint to an assigned
    neighbour, so equality-like relations are followed directly. A node
    budget guards the rare hard case, which then falls back to the
    arc-consistency search (also complete), so the answer stays exact.
    """

    BUDGET = 20000

    def __init__(self, work: Domains, constraints: list[Binary], by_var: dict[str, list[Binary]]) -> None:
        self.work = work
        self.constraints = constraints
        self.by_var = by_var
        self.alive = {v: set(d) for v, d in work.items()}
        self.index: dict[tuple[int, str], dict[Hashable, list[Chain]]] = {}
        for c in constraints:
            if c.tokens_a is None or c.tokens_b is None:
                continue
            for end, tokens in ((c.a, c.tokens_a), (c.b, c.tokens_b)):
                table: dict[Hashable, list[Chain]] = defaultdict(list)
                for x in work[end]:
                    for t in tokens(x):
                        table[t].append(x)
                self.index[(id(c), end)] = table

    def removed(self, var: str, value: Chain) -> None:
        self.alive[var].discard(value)

    def _order(self, start: str) -> list[str]:
        order, seen = [start], {start}
        i = 0
        while i < len(order):
            for c in self.by_var[order[i]]:
                o = c.other(order[i])
                if o not in seen:
                    seen.add(o)
                    order.append(o)
            i += 1
        return order + [v for v in self.work if v not in seen]

    def _candidates(self, var: str, assignment: dict[str, Chain]) -> Iterable[Chain]:
        for c in self.by_var[var]:
            o = c.other(var)
            if o in assignment and (id(c), var) in self.index:
                tokens = c.tokens_a if o == c.a else c.tokens_b
                assert tokens is not None
                seen: set[Chain] = set()
                table = self.index[(id(c), var)]
                for t in tokens(assignment[o]):
                    for y in table.get(t, ()):
                        if y not in seen and y in self.alive[var]:
                            seen.add(y)
                            yield y
                return
        yield from (y for y in self.work[var] if y in self.alive[var])

    def find(self, var: str, value: Chain) -> dict[str, Chain] | None:
        order = self._order(var)
        assignment: dict[str, Chain] = {var: value}
        nodes = 0

        def consistent(v: str, y: Chain) -> bool:
            return all(c.holds(v, y, assignment[c.other(v)]) for c in self.by_var[v] if c.other(v) in assignment)

        def extend(i: int) -> bool | None:
            nonlocal nodes
            if i == len(order):
                return True
            v = order[i]
            for y in self._candidates(v, assignment):
                nodes += 1
                if nodes > self.BUDGET:
                    return None
                if consistent(v, y):
                    assignment[v] = y
                    res = extend(i + 1)
                    if res is not False:
                        return res
                    del assignment[v]
            return False

        if not consistent(var, value):
            return None
        result = extend(1)
        if result is True:
            return dict(assignment)
        if result is None:  # budget exhausted: decide with the complete MAC search
            trial = {v: [x for x in d if x in self.alive[v]] for v, d in self.work.items()}
            trial[var] = [value]
            return find_solution(trial, self.constraints)
        return None


def _repairs(var: str, value: Chain, witnesses: list[dict[str, Chain]], cons: list[Binary], supported) -> bool:
    """True if swapping ``value`` into a known solution keeps every constraint of ``var``."""
    for sol in witnesses[-8:]:
        if all(c.holds(var, value, sol[c.other(var)]) for c in cons):
            supported[var].add(value)
            return True
    return False


def enumerate_solutions(domains: Domains, constraints: list[Binary], limit: int) -> list[dict[str, Chain]] | None:
    """Every complete solution (at most ``limit``; None when there are more).

    Meant for domains already reduced by :func:`supported_domains`, where every
    value extends to a solution, so the backtracking rarely dead-ends.
    """
    constraints = _merge(constraints)
    by_var: dict[str, list[Binary]] = defaultdict(list)
    for c in constraints:
        by_var[c.a].append(c)
        by_var[c.b].append(c)
    if not domains:
        return [{}]
    finder = _WitnessFinder(domains, constraints, by_var)
    order = finder._order(next(iter(domains)))
    out: list[dict[str, Chain]] = []
    assignment: dict[str, Chain] = {}

    def walk(i: int) -> bool:
        if i == len(order):
            out.append(dict(assignment))
            return len(out) <= limit
        v = order[i]
        for y in finder._candidates(v, assignment):
            if all(c.holds(v, y, assignment[c.other(v)]) for c in by_var[v] if c.other(v) in assignment):
                assignment[v] = y
                if not walk(i + 1):
                    return False
                del assignment[v]
        return True

    return out if walk(0) else None


def components(variables: Iterable[str], constraints: list[Binary]) -> list[list[str]]:
    """Connected groups of variables under the constraints, in first-seen order."""
    parent = {v: v for v in variables}

    def root(v: str) -> str:
        while parent[v] != v:
            parent[v] = parent[parent[v]]
            v = parent[v]
        return v

    for c in constraints:
        parent[root(c.a)] = root(c.b)
    groups: dict[str, list[str]] = {}
    for v in parent:
        groups.setdefault(root(v), []).append(v)
    return list(groups.values())
