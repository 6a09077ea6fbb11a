"""Probabilities over the survivors: a posterior from the likelihoods, joint over linked unknowns.

Contract 3 (DESIGN.md). The prior is uniform over each unknown's scope. Logic
(unary outcomes and relations) keeps or removes; every quantitative
observation weighs each surviving candidate by its likelihood, mixed with a
flat likelihood by the observation's reliability
(:func:`workbench.evidence.outcomes.weight`). A joint assignment of all
unknowns that satisfies every relation has the product of its candidates'
weights; the probability of a candidate is the sum over the assignments
that contain it, normalised per unknown.

How the sum is taken, per group of linked unknowns (known sugars named in a
relation are one-value variables of the group):

- one unknown alone: its weights, normalised;
- relations forming a forest (after merging parallel relations between the
  same two unknowns): exact sum-product message passing, two passes; each
  message is a sum over the partner's candidates, found through the
  relation's product index (identity of products, parent/child of a chain
  extension or shortening) so it costs about the number of matching pairs;
- relations with a cycle: exact enumeration of the joint assignments of
  the unknowns on cycles (the 2-core), up to :data:`ENUMERATION_LIMIT`,
  with sum-product for the trees that hang off them;
- a joint space above that limit, or a relation without an index between
  two domains whose product exceeds :data:`PAIR_LIMIT`: the unknowns of the
  group keep their own weights (every survivor already belongs to some
  consistent assignment, so only the relative weights are approximate) and
  the method says ``approximate``.

Cost: forests grow linearly with the number of linked unknowns (one message
per relation and direction); enumeration grows with the number of joint
assignments, which the logic usually keeps small.

When the evidence conflicts, :func:`rank_suspects` weighs the hypotheses
"exactly these observations are wrong" (at most two at a time) by the
prior chance that each record is wrong (``1 - reliability``, at least
:data:`MIN_WRONG` so that a record marked certain can still be suspected), the
flat likelihood of a wrong record and the evidence of the remaining
observations, and reports each observation's probability of being wrong.
"""

from __future__ import annotations

import itertools
import math
from collections import defaultdict, deque
from collections.abc import Callable, Hashable, Iterable, Mapping, Sequence
from dataclasses import dataclass, field

from workbench.chem.chain import Chain
from workbench.evidence import tables
from workbench.evidence.network import Binary, TokenIndex, components, enumerate_solutions, two_core
from workbench.evidence.observations import Observation
from workbench.evidence.outcomes import fits, flat_likelihood, weight

__all__ = [
    "ENUMERATION_LIMIT",
    "MIN_WRONG",
    "PAIR_LIMIT",
    "Posterior",
    "entropy_bits",
    "joint_posterior",
    "rank_suspects",
    "unary_weights",
]

ENUMERATION_LIMIT = 50_000
PAIR_LIMIT = 4_000_000
# Pairs of a message summed one by one for values whose products are doubtful (they pair with anything).
WILD_PAIR_LIMIT = 200_000
MIN_WRONG = 0.01
_MAX_DROPPED = 2
# At most this many drop-one/drop-two hypotheses are weighed when ranking suspects (each is a full
# re-solve); among many conflicting records the ranking then covers the first ones in project order.
MAX_SUSPECT_CHECKS = 24
# Joint assignments enumerated per cyclic group when weighing a suspect hypothesis (beyond: approximate).
SUSPECT_ENUMERATION_LIMIT = 2_000

Weights = dict[str, dict[Chain, float]]


@dataclass(frozen=True)
class Posterior:
    """Per-unknown probabilities of the survivors, their entropy and the evidence.

    ``log_evidence`` is the natural logarithm of the sum over consistent
    joint assignments of the product of weights, divided by the number of
    joint assignments of the scopes (the uniform prior). ``methods`` says
    per unknown how its probabilities were summed; ``weights`` holds the
    unary weights of every survivor the sum started from.
    """

    probabilities: dict[str, dict[Chain, float]]
    entropy: dict[str, float]
    log_evidence: float
    methods: dict[str, str] = field(default_factory=dict)
    weights: Weights = field(default_factory=dict)


def entropy_bits(probabilities: Iterable[float]) -> float:
    """Shannon entropy in bits of a normalised distribution."""
    return -sum(p * math.log2(p) for p in probabilities if p > 0)


def unary_weights(
    observations: Sequence[Observation], survivors: Mapping[str, Sequence[Chain]], mixed: bool = True
) -> Weights:
    """Each survivor's weight: the product over unary observations of its (reliability-mixed) likelihood.

    With ``mixed`` False the pure likelihoods are used (the record taken as
    right), as the suspects ranking needs.
    """
    out: Weights = {u: dict.fromkeys(chains, 1.0) for u, chains in survivors.items()}
    for obs in observations:
        if not obs.UNARY or obs.unknown not in out:
            continue
        mine = out[obs.unknown]
        chains = list(mine)
        # a logic outcome's verdict depends only on the predicted value: judged once per value (outcome tables)
        judged = tables.verdicts(obs, chains, fits) or [fits(obs, chain) for chain in chains]
        for chain, verdict in zip(chains, judged, strict=True):
            mine[chain] *= weight(obs, verdict) if mixed else verdict.likelihood
    return out


# ------------------------------------------------------------------ pair factors
@dataclass(frozen=True)
class _Edge:
    """All relations between two variables, as one 0/1 factor."""

    a: str
    b: str
    parts: tuple[Binary, ...]

    def holds(self, var: str, value: Chain, other: Chain) -> bool:
        return all(c.holds(var, value, other) for c in self.parts)

    def other(self, var: str) -> str:
        return self.b if var == self.a else self.a

    def tokens(self, var: str) -> tuple[Binary, Callable[[Chain], Iterable[Hashable]]] | None:
        """A relation of this pair with an index on both ends, and the token function of ``var``'s end."""
        for c in self.parts:
            if c.tokens_a is not None and c.tokens_b is not None:
                return c, (c.tokens_a if var == c.a else c.tokens_b)
        return None


def _edges(constraints: Sequence[Binary]) -> list[_Edge]:
    groups: dict[frozenset[str], list[Binary]] = defaultdict(list)
    for c in constraints:
        groups[frozenset((c.a, c.b))].append(c)
    return [_Edge(g[0].a, g[0].b, tuple(g)) for g in groups.values()]


class _TooLarge(Exception):
    """A message without an index over too many pairs."""


def _message(edge: _Edge, source: str, belief: dict[Chain, float], target: list[Chain]) -> dict[Chain, float]:
    """``m(y) = sum_x belief(x) [relation(x, y)]`` for every ``y`` of ``target``."""
    out: dict[Chain, float] = {}
    keyed = edge.tokens(source)
    if keyed is not None:
        relation, source_tokens = keyed
        target_var = edge.other(source)
        target_tokens = relation.tokens_a if target_var == relation.a else relation.tokens_b
        assert target_tokens is not None
        index = TokenIndex((x for x, bx in belief.items() if bx > 0), source_tokens)
        if index.wild and len(index.wild) * len(target) > WILD_PAIR_LIMIT:
            raise _TooLarge  # values that pair with anything (doubtful products), too many to sum pair by pair
        for y in target:
            out[y] = sum(belief[x] for x in index.partners(target_tokens(y)) if edge.holds(source, x, y))
        return out
    if len(belief) * len(target) > PAIR_LIMIT:
        raise _TooLarge
    for y in target:
        out[y] = sum(bx for x, bx in belief.items() if bx > 0 and edge.holds(source, x, y))
    return out


def _normalised(message: dict[Chain, float]) -> tuple[dict[Chain, float], float]:
    total = sum(message.values())
    if total <= 0:
        return message, 0.0
    return {k: v / total for k, v in message.items()}, total


def _enumerated(
    group: list[str],
    domains: dict[str, list[Chain]],
    weights: Weights,
    constraints: list[Binary],
    limit: int = ENUMERATION_LIMIT,
) -> tuple[dict[str, dict[Chain, float]], float, int] | None:
    worlds = enumerate_solutions({v: domains[v] for v in group}, constraints, limit)
    if worlds is None:
        return None
    beliefs: dict[str, dict[Chain, float]] = {v: dict.fromkeys(domains[v], 0.0) for v in group}
    total = 0.0
    for w in worlds:
        product = 1.0
        for v in group:
            product *= weights[v][w[v]]
        total += product
        for v in group:
            beliefs[v][w[v]] += product
    if total <= 0:
        return {}, float("-inf"), len(worlds)
    return beliefs, math.log(total), len(worlds)


def _core_and_trees(
    group: list[str],
    domains: dict[str, list[Chain]],
    weights: Weights,
    constraints: list[Binary],
    edges: list[_Edge],
    limit: int,
) -> tuple[dict[str, dict[Chain, float]], float, int, int] | None:
    """Exact marginals and log Z of a linked group: enumeration on its cycles, sum-product on the rest.

    The variables off the 2-core hang in trees, each joined to the core at one
    variable. Their messages (leaves inward) become extra weights of the core
    variables they join; the joint assignments of the core alone are then
    enumerated (at most ``limit``), and messages go back out into the trees
    from the core marginals. Exact: conditioning on the core leaves a forest
    (Pearl's cutset conditioning, *Probabilistic Reasoning in Intelligent
    Systems*, 1988, ch. 4.3). A group without a cycle is one tree: its first
    variable is the root, and this is plain two-pass sum-product. Returns
    ``(beliefs, log Z, core assignments, unknowns on cycles)`` (0 and 0 for
    a tree) or None above the limit.
    """
    nbrs: dict[str, list[_Edge]] = defaultdict(list)
    for e in edges:
        nbrs[e.a].append(e)
        nbrs[e.b].append(e)
    cyclic = two_core(group, {v: [e.other(v) for e in es] for v, es in nbrs.items()})
    core = cyclic or {group[0]}
    parent: dict[str, tuple[str, _Edge]] = {}
    order: list[str] = []  # tree variables, nearest the core first
    queue = deque(sorted(core, key=group.index))
    seen = set(core)
    while queue:
        v = queue.popleft()
        for e in nbrs[v]:
            u = e.other(v)
            if u not in seen:
                seen.add(u)
                parent[u] = (v, e)
                order.append(u)
                queue.append(u)
    msgs: dict[tuple[str, str], dict[Chain, float]] = {}
    log_scale = 0.0

    def belief(v: str, skip: str | None) -> dict[Chain, float]:
        b = dict(weights[v])
        for e in nbrs[v]:
            u = e.other(v)
            if u == skip or (u, v) not in msgs:
                continue
            m = msgs[(u, v)]
            for x in b:
                b[x] *= m.get(x, 0.0)
        return b

    for v in reversed(order):  # the trees, leaves inward to the core
        p, e = parent[v]
        m, scale = _normalised(_message(e, v, belief(v, p), domains[p]))
        if scale <= 0:
            return {}, float("-inf"), 0, len(cyclic)
        msgs[(v, p)] = m
        log_scale += math.log(scale)
    inner = {v: belief(v, None) for v in core}  # weights times the messages of the trees they carry
    if cyclic:
        members = [v for v in group if v in core]
        found = _enumerated(members, domains, inner, [c for c in constraints if c.a in core and c.b in core], limit)
        if found is None:
            return None
        beliefs, log_z, count = found
    else:  # a tree: the root's belief is its marginal
        beliefs, count = dict(inner), 0
        total = sum(next(iter(inner.values())).values())
        log_z = math.log(total) if total > 0 else float("-inf")
    if log_z == float("-inf"):
        return {}, log_z, count, len(cyclic)
    for v in order:  # back out into the trees
        p, e = parent[v]
        if p in core:
            # the core marginal without this tree's message (where the message is 0, so is every
            # belief it reaches on the tree side: the value used there does not matter)
            up = msgs[(v, p)]
            rest = {x: (bx / up[x] if up.get(x, 0.0) > 0 else 0.0) for x, bx in beliefs[p].items()}
        else:
            rest = belief(p, v)
        msgs[(p, v)], _ = _normalised(_message(e, p, rest, domains[v]))
    for v in order:
        beliefs[v] = belief(v, None)
    return beliefs, log_scale + log_z, count, len(cyclic)


def joint_posterior(
    domains: dict[str, list[Chain]],
    weights: Weights,
    constraints: Sequence[Binary],
    scope_sizes: dict[str, int],
    limit: int = ENUMERATION_LIMIT,
) -> Posterior:
    """Probabilities of every unknown's survivors, joint over the relations (see the module docstring).

    ``limit`` caps the joint assignments enumerated for a group with a cycle
    (beyond it the group is ``approximate``).

    ``domains`` holds the survivors of every unknown and the one-value
    variables of known sugars (whose names start with
    :data:`~workbench.evidence.network.AUXILIARY`); ``weights`` the unary
    weights of the unknowns' survivors (known sugars and auxiliary variables, which have
    no weights, weigh 1 and are not reported); ``scope_sizes`` the number of
    candidates of each unknown's scope (for the evidence).
    """
    full_weights: Weights = {v: weights.get(v) or dict.fromkeys(d, 1.0) for v, d in domains.items()}
    cons = [c for c in constraints if c.a in domains and c.b in domains]
    probabilities: dict[str, dict[Chain, float]] = {}
    methods: dict[str, str] = {}
    log_evidence = -sum(math.log(n) for n in scope_sizes.values() if n > 0)
    for group in components(domains, cons):
        members = set(group)
        sub = [c for c in cons if c.a in members]
        edges = _edges(sub)
        method = "single unknown"
        beliefs: dict[str, dict[Chain, float]] | None = None
        log_z = 0.0
        if not edges:
            beliefs = {v: dict(full_weights[v]) for v in group}
            log_z = sum(math.log(s) if (s := sum(beliefs[v].values())) > 0 else float("-inf") for v in group)
        else:
            try:
                found = _core_and_trees(group, domains, full_weights, sub, edges, limit)
            except _TooLarge:
                found = None
            if found is not None:
                beliefs, log_z, count, cyclic = found
                if not cyclic:
                    method = "exact: sum-product on a forest of relations"
                else:
                    method = f"exact: enumeration of {count} joint assignments"
                    if cyclic < len(group):
                        method += f" of the {cyclic} unknowns on cycles, sum-product on the rest"
        if beliefs is None:
            beliefs = {v: dict(full_weights[v]) for v in group}
            log_z = sum(math.log(max(sum(b.values()), 1e-300)) for b in beliefs.values())
            method = "approximate: joint space too large, each unknown weighed alone"
        log_evidence += log_z
        for v in group:
            if v not in weights:
                continue  # a known sugar or an auxiliary variable of a relation: not reported
            b = beliefs.get(v, {})
            total = sum(b.values())
            probabilities[v] = (
                {c: x / total for c, x in b.items()} if total > 0 else dict.fromkeys(domains[v], 1 / len(domains[v]))
            )
            methods[v] = method
    return Posterior(
        probabilities=probabilities,
        entropy={u: entropy_bits(p.values()) for u, p in probabilities.items()},
        log_evidence=log_evidence,
        methods=methods,
        weights={v: w for v, w in full_weights.items() if v in weights},
    )


# ------------------------------------------------------------------ suspects
def rank_suspects(
    candidates: Sequence[Observation],
    evidence_without: Callable[[frozenset[str]], float | None],
) -> list[tuple[str, float]]:
    """``(observation id, probability that it is wrong)`` best first, for conflicting observations.

    ``candidates`` are the observations in some minimal conflicting set;
    ``evidence_without(dropped)`` returns the log evidence of the other
    observations (taken as right), or None when they still conflict.
    Hypotheses drop one observation, or two where no single one resolves
    the conflict; each weighs ``prod (1 - r) * flat`` over the dropped,
    ``prod r`` over the kept candidates, times the evidence of the rest.
    """

    def wrong(o: Observation) -> float:
        return max(1.0 - o.effective_reliability, MIN_WRONG)

    by_id = {o.id: o for o in candidates}
    checks = 0  # hypotheses tried: each one re-solves the project, so their number is bounded
    log_right = sum(math.log(1 - wrong(o)) for o in candidates)
    hypotheses: list[tuple[frozenset[str], float]] = []
    resolved: list[frozenset[str]] = []
    for size in range(1, _MAX_DROPPED + 1):
        for combo in itertools.combinations(by_id, size):
            dropped = frozenset(combo)
            if any(r <= dropped for r in resolved):
                continue
            if checks >= MAX_SUSPECT_CHECKS:
                break
            checks += 1
            log_rest = evidence_without(dropped)
            if log_rest is None or log_rest == float("-inf"):
                continue
            resolved.append(dropped)
            score = log_right + log_rest
            for oid in dropped:
                o = by_id[oid]
                score += math.log(wrong(o)) - math.log(1 - wrong(o)) + math.log(flat_likelihood(o))
            hypotheses.append((dropped, score))
        if hypotheses:
            break
    if not hypotheses:
        return []
    top = max(s for _, s in hypotheses)
    total = sum(math.exp(s - top) for _, s in hypotheses)
    chance: dict[str, float] = defaultdict(float)
    for dropped, s in hypotheses:
        for oid in dropped:
            chance[oid] += math.exp(s - top) / total
    return sorted(((oid, p) for oid, p in chance.items()), key=lambda t: (-t[1], t[0]))
