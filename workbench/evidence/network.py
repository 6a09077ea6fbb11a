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
from collections.abc import Callable, Hashable, Iterable, Iterator, Mapping
from dataclasses import dataclass

from workbench.chem.chain import Chain

__all__ = [
    "AUXILIARY",
    "WILD",
    "Binary",
    "TokenIndex",
    "arc_consistent",
    "find_solution",
    "supported_domains",
    "two_core",
]

Domains = dict[str, list[Chain]]

# The first character of every variable that is not an unknown (a known sugar named in a relation, a
# hidden variable): a control character, which no id of a project file may hold, so no id can collide.
AUXILIARY = "\x1f"


class _Wild:
    """The token of a value that may pair with any value (e.g. a doubtful product, which matches anything)."""

    def __repr__(self) -> str:
        return "WILD"


WILD: Hashable = _Wild()


class TokenIndex:
    """Values of one end of a constraint by token, to find a value's possible partners without a scan.

    A value whose tokens hold :data:`WILD` is a possible partner of every
    value, and every value is a possible partner of it.
    """

    def __init__(self, values: Iterable[Chain], tokens: Callable[[Chain], Iterable[Hashable]]) -> None:
        self.values = list(values)
        self.buckets: dict[Hashable, list[Chain]] = defaultdict(list)
        self.wild: list[Chain] = []
        for y in self.values:
            ts = tuple(tokens(y))
            if WILD in ts:
                self.wild.append(y)
                continue
            for t in ts:
                self.buckets[t].append(y)

    def partners(self, tokens: Iterable[Hashable]) -> Iterator[Chain]:
        """The indexed values that may pair with a value of these tokens (each once)."""
        ts = tuple(tokens)
        if WILD in ts:
            yield from self.values
            return
        seen: set[Chain] = set()
        for t in ts:
            for y in self.buckets.get(t, ()):
                if y not in seen:
                    seen.add(y)
                    yield y
        yield from self.wild


@dataclass(frozen=True)
class Binary:
    """A binary constraint ``test(value_of_a, value_of_b)`` from observation ``source``.

    ``tokens_a``/``tokens_b``, when given, map a value to hashable tokens such
    that the test can only hold when the token sets intersect or one of them
    holds :data:`WILD`; they let the solver find supports through an index
    (:class:`TokenIndex`) instead of a scan. ``viable``, when
    given, is a test every value at either end must pass for the constraint to
    hold at all (e.g. "gives the product"); values failing it are dropped
    without a scan.
    """

    a: str
    b: str
    test: Callable[[Chain, Chain], bool]
    source: str
    tokens_a: Callable[[Chain], Iterable[Hashable]] | None = None
    tokens_b: Callable[[Chain], Iterable[Hashable]] | None = None
    viable: Callable[[Chain], bool] | None = None

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
    mine = domains[var]
    if c.viable is not None:
        others = [y for y in others if c.viable(y)]
        mine = [x for x in mine if c.viable(x)] if others else []
    if mine_tokens is not None and their_tokens is not None:
        index = TokenIndex(others, their_tokens)
        for x in mine:
            if any(c.holds(var, x, y) for y in index.partners(mine_tokens(x))):
                kept.append(x)
    else:
        for x in mine:
            if any(c.holds(var, x, y) for y in others):
                kept.append(x)
    changed = len(kept) != len(domains[var])
    domains[var] = kept
    return changed


def _by_var(constraints: list[Binary]) -> dict[str, list[Binary]]:
    by_var: dict[str, list[Binary]] = defaultdict(list)
    for c in constraints:
        by_var[c.a].append(c)
        by_var[c.b].append(c)
    return by_var


def arc_consistent(
    domains: Domains,
    constraints: list[Binary],
    changed: str | None = None,
    by_var: dict[str, list[Binary]] | None = None,
    around: Iterable[str] | None = None,
) -> bool:
    """AC-3 in place; False when a domain becomes empty.

    With ``changed``, the domains are taken to be arc consistent already
    except for the variable ``changed`` (just narrowed), so only the arcs
    pointing at it are revised first. With ``around``, they are taken to be
    arc consistent on every constraint between two variables outside
    ``around`` (narrowed variables, ends of new constraints), so only the
    constraints touching ``around`` are revised first, both ways.
    """
    by_var = _by_var(constraints) if by_var is None else by_var
    if changed is not None:
        queue = [(c.other(changed), c) for c in by_var[changed]]
    elif around is not None:
        touching = {id(c): c for v in around for c in by_var.get(v, ())}
        queue = [(c.a, c) for c in touching.values()] + [(c.b, c) for c in touching.values()]
    else:
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
    constraints = _merge(constraints)
    if not arc_consistent(work, constraints):
        return None
    return _search(work, constraints)


def two_core(variables: Iterable[str], neighbours: Mapping[str, Iterable[str]]) -> set[str]:
    """The variables on or between cycles: leaves (at most one neighbour left) peeled off until none is.

    Empty exactly when the graph is a forest (parallel edges merged beforehand).
    """
    order = list(dict.fromkeys(variables))  # the caller's order, so the peeling is the same on every run
    core = set(order)
    nbrs = {v: [u for u in neighbours.get(v, ()) if u in core] for v in order}
    degree = {v: len(n) for v, n in nbrs.items()}
    stack = [v for v, k in degree.items() if k <= 1]
    while stack:
        v = stack.pop()
        if v not in core:
            continue
        core.discard(v)
        for u in nbrs[v]:
            if u in core:
                degree[u] -= 1
                if degree[u] <= 1:
                    stack.append(u)
    return core


def _cyclic_core(domains: Domains, by_var: dict[str, list[Binary]]) -> set[str]:
    """Variables of more than one value that lie on or between cycles of constraints among such variables."""
    open_vars = [v for v, d in domains.items() if len(d) > 1]
    return two_core(open_vars, {v: [c.other(v) for c in by_var[v]] for v in open_vars})


def _tree_solution(domains: Domains, by_var: dict[str, list[Binary]]) -> dict[str, Chain] | None:
    """A solution read off arc-consistent domains whose open variables form a forest (no backtracking).

    Each open variable takes a value that agrees with its already assigned
    neighbours; on an arc-consistent forest one always exists (Freuder 1982).
    None if a check fails (which would mean the premise does not hold).
    """
    assignment: dict[str, Chain] = {v: d[0] for v, d in domains.items() if len(d) == 1}
    for start in domains:
        if start in assignment:
            continue
        queue = [start]
        while queue:
            v = queue.pop()
            if v in assignment:
                continue
            value = next(
                (
                    y
                    for y in domains[v]
                    if all(c.holds(v, y, assignment[c.other(v)]) for c in by_var[v] if c.other(v) in assignment)
                ),
                None,
            )
            if value is None:
                return None
            assignment[v] = value
            queue.extend(c.other(v) for c in by_var[v] if c.other(v) not in assignment)
    return assignment


def _search(domains: Domains, constraints: list[Binary]) -> dict[str, Chain] | None:
    """Maintained-arc-consistency search on arc-consistent ``domains`` (iterative, so depth is no limit).

    Only variables on cycles are branched on (a cycle cutset): once the open
    variables form a forest, a solution is read off without search.
    Constraints must be merged (one per pair of variables).
    """
    by_var = _by_var(constraints)
    frames: list[tuple[Domains, str, Iterator[Chain]]] = []
    current: Domains | None = domains
    while True:
        if current is not None:
            core = _cyclic_core(current, by_var)
            if not core:
                found = _tree_solution(current, by_var)
                if found is not None and all(c.test(found[c.a], found[c.b]) for c in constraints):
                    return found
            else:
                var = min(core, key=lambda v: (len(current[v]), -len(by_var[v]), v))  # type: ignore[index]
                frames.append((current, var, iter(list(current[var]))))
        current = None
        while frames and current is None:
            parent, var, values = frames[-1]
            for value in values:
                trial = dict(parent)
                trial[var] = [value]
                if arc_consistent(trial, constraints, changed=var, by_var=by_var):
                    current = trial
                    break
            else:
                frames.pop()
        if current is None:
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

        checks = [c.viable for c in group if c.viable is not None]

        def viable(x: Chain, checks=checks) -> bool:
            return all(check(x) for check in checks)

        keyed = next(((c, same) for c, same in parts if c.tokens_a is not None and c.tokens_b is not None), None)
        source = "+".join(c.source for c in group)
        if keyed is None:
            merged.append(Binary(a, b, test, source, viable=viable if checks else None))
        else:
            c, same = keyed
            ta, tb = (c.tokens_a, c.tokens_b) if same else (c.tokens_b, c.tokens_a)
            merged.append(Binary(a, b, test, source, ta, tb, viable if checks else None))
    return merged


def _condition_on_singletons(domains: Domains, constraints: list[Binary], narrowed: set[str]) -> list[Binary] | None:
    """Fold constraints touching a one-value variable into filters on the other end (exact).

    Variables whose domains the folding narrows are added to ``narrowed``.
    """
    remaining = list(constraints)
    changed = True
    while changed:
        changed = False
        kept: list[Binary] = []
        for c in remaining:
            da, db = domains[c.a], domains[c.b]
            if len(da) == 1 or len(db) == 1:
                before = len(da), len(db)
                if len(da) == 1:
                    domains[c.b] = [y for y in db if c.test(da[0], y)]
                if len(domains[c.b]) == 1 or len(db) == 1:
                    domains[c.a] = [x for x in domains[c.a] if any(c.test(x, y) for y in domains[c.b])]
                if not domains[c.a] or not domains[c.b]:
                    return None
                narrowed.update(v for v, n in zip((c.a, c.b), before, strict=True) if len(domains[v]) != n)
                changed = True
                continue
            kept.append(c)
        remaining = kept
    return remaining


def _is_forest(variables: Iterable[str], constraints: list[Binary]) -> bool:
    """True when the constraint graph (parallel edges already merged) has no cycle."""
    names = list(variables)
    return len(constraints) == len(names) - len(components(names, constraints))


def supported_domains(
    domains: Domains, constraints: list[Binary], around: Iterable[str] | None = None
) -> Domains | None:
    """Exactly the values of each variable that belong to some solution; None if none exists.

    Parallel constraints are merged and one-value variables folded in; if the
    remaining constraint graph is a forest, arc consistency alone is exact
    (Freuder, J. ACM 29, 24, 1982); otherwise every value is confirmed by a
    witness solution.

    ``around`` is a promise of the caller that the domains are arc consistent
    on every constraint between variables outside it (for instance supported
    domains of the same network, then one variable narrowed or one relation
    added, ``around`` naming the narrowed variable or the relation's ends):
    arc consistency then starts from those variables only, so a project
    replayed one observation at a time costs no pass over every constraint
    per observation.
    """
    work = {v: list(d) for v, d in domains.items()}
    constraints = _merge(constraints)
    by_var = _by_var(constraints)
    if not arc_consistent(work, constraints, by_var=by_var, around=around):
        return None
    narrowed: set[str] = set()
    reduced = _condition_on_singletons(work, constraints, narrowed)
    if reduced is None:
        return None
    if narrowed and not arc_consistent(work, reduced, around=narrowed):
        return None
    constraints = reduced
    if _is_forest(work, constraints):
        return work
    # Only the cyclic core needs witnesses. The rest hangs off it in trees, each joined to the core
    # at one variable at most, so once the core's domains are exact, arc consistency makes the
    # trees' domains exact as well (the forest argument applied to each tree from its root); and
    # with arc-consistent trees, every solution of the core alone extends to the whole network.
    by_var = _by_var(constraints)
    core = _cyclic_core(work, by_var)
    sub = {v: work[v] for v in work if v in core}
    exact = _witnessed(sub, [c for c in constraints if c.a in core and c.b in core])
    if exact is None:
        return None
    work.update(exact)
    if not arc_consistent(work, constraints, by_var=by_var, around=core):
        return None
    return work


def _witnessed(work: Domains, constraints: list[Binary]) -> Domains | None:
    """Supported values of an arc-consistent network, each confirmed by a witness solution."""
    first = _search({v: list(d) for v, d in work.items()}, constraints)
    if first is None:
        return None
    by_var = _by_var(constraints)
    finder = _WitnessFinder(work, constraints, by_var)
    witnesses = [first]
    supported: dict[str, set[Chain]] = {v: {first[v]} for v in work}
    for var in work:
        if not by_var[var]:
            supported[var] = set(work[var])  # unconstrained: any value joins any solution
            continue
        dead: set[Chain] = set()
        for value in list(work[var]):
            if value in supported[var] or value not in finder.alive[var]:
                continue
            if _repairs(var, value, witnesses, by_var[var], supported):
                continue
            sol = finder.find(var, value)  # ``var`` is fixed, so its own dead values do not matter here
            if sol is None:
                dead.add(value)
                continue
            witnesses.append(sol)
            for v, val in sol.items():
                supported[v].add(val)
        if dead:
            # No solution holds these values: drop them together and restore arc consistency from ``var``
            # once, so that the other variables' domains stay arc consistent (what the cutset search
            # needs) and smaller.
            work[var] = [x for x in work[var] if x not in dead]
            if not arc_consistent(work, constraints, changed=var, by_var=by_var):
                return None
            finder.sync()
    return {v: [x for x in work[v] if x in supported[v]] for v in work}


class _WitnessFinder:
    """Complete backtracking search for one solution with a given value fixed.

    Variables are assigned outward from the fixed one; candidates for a
    variable come from a token index of a constraint to an assigned
    neighbour, so equality-like relations are followed directly. A node
    budget guards the rare hard case, which then falls back to the
    arc-consistency search (also complete), so the answer stays exact.
    """

    BUDGET = 60

    def __init__(self, work: Domains, constraints: list[Binary], by_var: dict[str, list[Binary]]) -> None:
        self.work = work
        self.constraints = constraints
        self.by_var = by_var
        self.alive = {v: set(d) for v, d in work.items()}
        self.index: dict[tuple[int, str], TokenIndex] = {}
        for c in constraints:
            if c.tokens_a is None or c.tokens_b is None:
                continue
            for end, tokens in ((c.a, c.tokens_a), (c.b, c.tokens_b)):
                self.index[(id(c), end)] = TokenIndex(work[end], tokens)

    def sync(self) -> None:
        """Take over the values removed from the shared domains since the last call."""
        for v, d in self.work.items():
            if len(d) != len(self.alive[v]):
                self.alive[v] = set(d)

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
                alive = self.alive[var]
                yield from (y for y in self.index[(id(c), var)].partners(tokens(assignment[o])) if y in alive)
                return
        yield from (y for y in self.work[var] if y in self.alive[var])

    def find(self, var: str, value: Chain) -> dict[str, Chain] | None:
        order = self._order(var)
        assignment: dict[str, Chain] = {var: value}

        def consistent(v: str, y: Chain) -> bool:
            return all(c.holds(v, y, assignment[c.other(v)]) for c in self.by_var[v] if c.other(v) in assignment)

        if not consistent(var, value):
            return None
        result = _depth_first(order, 1, assignment, self._candidates, consistent, self.BUDGET)
        if result is True:
            return dict(assignment)
        if result is None:  # budget exhausted: decide with the complete cutset search
            trial = dict(self.work)  # arc consistent (kept so by supported_domains)
            trial[var] = [value]
            if not arc_consistent(trial, self.constraints, changed=var, by_var=self.by_var):
                return None
            return _search(trial, self.constraints)
        return None


def _depth_first(
    order: list[str],
    start: int,
    assignment: dict[str, Chain],
    candidates: Callable[[str, dict[str, Chain]], Iterable[Chain]],
    consistent: Callable[[str, Chain], bool],
    budget: int | None = None,
    on_complete: Callable[[dict[str, Chain]], bool] | None = None,
) -> bool | None:
    """Backtracking over ``order[start:]`` with an explicit stack (no recursion, so any depth).

    Returns True when every variable is assigned (``assignment`` then holds
    the solution), False when none exists, None when more than ``budget``
    candidates were tried. With ``on_complete``, each complete assignment is
    passed to it and the search goes on while it returns True (the result is
    then False once all were seen, or True if it asked to stop).
    """
    nodes = 0
    stack: list[Iterator[Chain]] = []
    i = start
    if i == len(order):
        if on_complete is None:
            return True
        return not on_complete(assignment)
    stack.append(iter(candidates(order[i], assignment)))
    while stack:
        v = order[i]
        advanced = False
        for y in stack[-1]:
            nodes += 1
            if budget is not None and nodes > budget:
                return None
            if consistent(v, y):
                assignment[v] = y
                advanced = True
                break
        if not advanced:
            stack.pop()
            i -= 1
            if stack:
                del assignment[order[i]]
            continue
        if i + 1 == len(order):
            if on_complete is None:
                return True
            if not on_complete(assignment):
                return True
            del assignment[v]
            continue
        i += 1
        stack.append(iter(candidates(order[i], assignment)))
    return False


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

    def consistent(v: str, y: Chain) -> bool:
        return all(c.holds(v, y, assignment[c.other(v)]) for c in by_var[v] if c.other(v) in assignment)

    def collect(found: dict[str, Chain]) -> bool:
        out.append(dict(found))
        return len(out) <= limit

    assignment: dict[str, Chain] = {}
    stopped = _depth_first(order, 0, assignment, finder._candidates, consistent, on_complete=collect)
    return None if stopped else out


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
