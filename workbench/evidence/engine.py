"""The engine: narrow every unknown of a project jointly, with a trail and conflicts.

Unary observations filter each unknown's catalogue; relational observations
become binary constraints (:mod:`workbench.evidence.network`). Survivors are
exactly the candidates that occur in at least one assignment of all unknowns
satisfying every observation. The trail replays the observations in order and
records what each one eliminated; when the evidence is contradictory, minimal
conflicting sets of observations are found by divide and conquer in
:mod:`workbench.evidence.conflicts` (each set is a minimal unsatisfiable
subset: drop any one member and the rest can hold).
"""

from __future__ import annotations

import functools
import itertools
import logging
from collections.abc import Callable, Iterable, Iterator, Mapping, Sequence
from dataclasses import dataclass, field
from typing import TYPE_CHECKING

import numpy as np

from workbench.chem import reactions
from workbench.chem.catalogue import Scope, catalogue
from workbench.chem.chain import Chain
from workbench.chem.names import display_name
from workbench.chem.predictions import predict as record_of
from workbench.chem.smiles import mirror_smiles
from workbench.evidence import tables
from workbench.evidence.conflicts import conflict_sets
from workbench.evidence.network import (
    AUXILIARY,
    WILD,
    Binary,
    components,
    enumerate_solutions,
    find_solution,
    supported_domains,
)
from workbench.evidence.observations import Observation
from workbench.evidence.outcomes import Verdict, fits, passes, product_key
from workbench.evidence.posterior import (
    ENUMERATION_LIMIT,
    SUSPECT_ENUMERATION_LIMIT,
    Posterior,
    joint_posterior,
    rank_suspects,
    unary_weights,
)
from workbench.evidence.project import Project
from workbench.evidence.residue_outcomes import Choices, balance_constraints

if TYPE_CHECKING:
    import pandas as pd

__all__ = ["TrailStep", "Solution", "solve", "constraints_of", "unary_domains", "is_consistent", "joint_worlds"]

log = logging.getLogger(__name__)


@dataclass(frozen=True)
class TrailStep:
    """What one observation did, in order.

    ``status`` is ``applied``, ``disabled`` (switched off for a what-if) or
    ``contradicts`` (it cannot hold with the observations before it, so it
    was set aside for the rest of the replay). ``counts`` are the survivors of
    every unknown after this step.
    """

    observation: str
    status: str
    eliminated: dict[str, tuple[Chain, ...]]
    counts: dict[str, int]
    reasons: Mapping[str, Mapping[Chain, str]] = field(default_factory=dict)


@dataclass(frozen=True)
class Solution:
    """The outcome of :func:`solve`."""

    project: Project
    scope_counts: dict[str, int]
    survivors: dict[str, tuple[Chain, ...]]
    trail: tuple[TrailStep, ...]
    conflicts: tuple[tuple[str, ...], ...]
    relief: dict[str, dict[str, tuple[Chain, ...]]]
    flags: dict[str, dict[Chain, tuple[str, ...]]]
    disabled: tuple[str, ...] = ()
    # Contract 3: posterior over each unknown's survivors (sums to 1), its entropy in bits, how it was
    # summed, the unary weights behind it, and the observations most likely wrong when they conflict.
    probabilities: dict[str, dict[Chain, float]] = field(default_factory=dict)
    entropy: dict[str, float] = field(default_factory=dict)
    posterior_methods: dict[str, str] = field(default_factory=dict)
    weights: dict[str, dict[Chain, float]] = field(default_factory=dict)
    suspects: tuple[tuple[str, float], ...] = ()

    def probability(self, uid: str, chain: Chain) -> float:
        """Posterior probability of ``chain`` for unknown ``uid`` (0 when it did not survive)."""
        return self.probabilities.get(uid, {}).get(chain, 0.0)

    def ranked(self, uid: str) -> tuple[Chain, ...]:
        """Survivors of ``uid``, most probable first (ties keep the catalogue order)."""
        order = {c: i for i, c in enumerate(self.survivors[uid])}
        return tuple(sorted(self.survivors[uid], key=lambda c: (-self.probability(uid, c), order[c])))

    @property
    def contradictory(self) -> bool:
        """True when no assignment satisfies all the (enabled) evidence."""
        return bool(self.conflicts)

    def _repr_html_(self) -> str:
        from workbench.display.board import solution_html

        return solution_html(self)

    def eliminated_by(self, uid: str) -> dict[Chain, str]:
        """For each eliminated candidate of ``uid``, the id of the observation that removed it."""
        out: dict[Chain, str] = {}
        for step in self.trail:
            for chain in step.eliminated.get(uid, ()):
                out.setdefault(chain, step.observation)
        return out

    def reason(self, uid: str, chain: Chain) -> str:
        """Why ``chain`` was eliminated from ``uid`` (empty if it survives)."""
        for step in self.trail:
            if chain in step.eliminated.get(uid, ()):
                text = step.reasons.get(uid, {}).get(chain, "")
                return f"{step.observation}: {text}" if text else step.observation
        return ""

    def to_frame(self) -> pd.DataFrame:
        """The survivors of every unknown as a DataFrame (:func:`workbench.frames.survivors_frame`)."""
        from workbench.frames import survivors_frame

        return survivors_frame(self)

    def unknowns_frame(self) -> pd.DataFrame:
        """One summary row per unknown (:func:`workbench.frames.unknowns_frame`)."""
        from workbench.frames import unknowns_frame

        return unknowns_frame(self)

    def residues_frame(self) -> pd.DataFrame:
        """The surviving candidates of residue unknowns (:func:`workbench.frames.residues_frame`)."""
        from workbench.frames import residues_frame

        return residues_frame(self)

    def trail_frame(self) -> pd.DataFrame:
        """Every elimination with its observation and reason (:func:`workbench.frames.trail_frame`)."""
        from workbench.frames import trail_frame

        return trail_frame(self)

    def narrowing_frame(self) -> pd.DataFrame:
        """Candidates left per unknown after each step (:func:`workbench.frames.narrowing_frame`)."""
        from workbench.frames import narrowing_frame

        return narrowing_frame(self)

    def suspects_frame(self) -> pd.DataFrame:
        """The observations most likely wrong, best first (:func:`workbench.frames.suspects_frame`)."""
        from workbench.frames import suspects_frame

        return suspects_frame(self)

    def conflicts_frame(self) -> pd.DataFrame:
        """The minimal conflicting sets, one row per member (:func:`workbench.frames.conflicts_frame`)."""
        from workbench.frames import conflicts_frame

        return conflicts_frame(self)


# ------------------------------------------------------------------ building
def _ref(project: Project, member: str) -> tuple[str, Chain | None]:
    """Variable name for a member: the unknown's id, or :data:`AUXILIARY` + name for a known sugar."""
    target = project.member(member)
    if isinstance(target, str):
        return target, None
    return f"{AUXILIARY}{member}", target


def _shortened(chain: Chain) -> Chain | None:
    return record_of(chain).chain_shortening


@functools.cache
def _extension_parent(chain: Chain) -> Chain | None:
    """The aldose that Kiliani-Fischer extension turns into ``chain`` (if any)."""
    return reactions.extension_parent(chain)


@functools.cache
def _doubtful(reaction: str, chain: Chain) -> bool:
    """No prediction for ``chain``'s product (the chemistry is doubtful): a relation on it keeps the candidate."""
    return record_of(chain).uncertain(reaction) is not None


def _doubtful_members(
    project: Project, obs: Observation, survivors: Mapping[str, Sequence[Chain]]
) -> Iterable[tuple[str, Chain, str]]:
    """(unknown, survivor, reason) where a relation rests on a product the model does not predict."""
    if obs.KIND == "same_product":
        reaction, members = obs.reaction, list(obs.members)
    elif obs.KIND == "chain_shortening":
        reaction, members = "chain_shortening", [obs.substrate]
    else:
        return
    for uid in members:
        if uid in project.unknown_ids:
            for c in survivors[uid]:
                why = record_of(c).uncertain(reaction)
                if why:
                    yield uid, c, why


@functools.cache
def _mirror_key(reaction: str, chain: Chain) -> frozenset[str]:
    """Canonical SMILES of the mirror images of the products of ``reaction`` (empty if none forms)."""
    return frozenset(mirror_smiles(x) for x in product_key(reaction, chain) or ())


@functools.cache
def _gives(reaction: str):
    """A test: does the compound give a product of ``reaction`` at all, or a doubtful one (every relation needs one)."""

    def test(c: Chain) -> bool:
        return product_key(reaction, c) is not None or _doubtful(reaction, c)

    return test


def _product_test(reaction: str, relation: str):
    """The pair test of a relation between products (:func:`reactions.relation_of_sets`, read per relation:
    a shared product makes them identical; otherwise a product mirroring one of the other's, enantiomeric)."""

    def test(x: Chain, y: Chain) -> bool:
        kx, ky = product_key(reaction, x), product_key(reaction, y)
        if kx is None or ky is None:
            return _doubtful(reaction, x) or _doubtful(reaction, y)
        shared = not kx.isdisjoint(ky)
        if relation == "identical":
            return shared
        if relation == "different":
            return not shared
        if relation == "enantiomeric":
            return not shared and not kx.isdisjoint(_mirror_key(reaction, y))
        return reactions.relation_of_sets(kx, ky) == relation

    return test


def constraints_of(project: Project, obs: Observation) -> tuple[list[Binary], dict[str, Chain]]:
    """Binary constraints of a relational observation, and the known sugars it names."""
    fixed: dict[str, Chain] = {}

    def ref(member: str) -> str:
        name, chain = _ref(project, member)
        if chain is not None:
            fixed[name] = chain
        return name

    out: list[Binary] = []
    kind = obs.KIND
    if kind == "same_product":
        names = [ref(m) for m in obs.members]
        test = _product_test(obs.reaction, obs.relation)
        tokens = mirrored = None
        # a doubtful product matches anything: its compound is indexed as a partner of every value
        if obs.relation == "identical":

            def tokens(c: Chain, r: str = obs.reaction):
                return (WILD,) if _doubtful(r, c) else (product_key(r, c) or ())

        elif obs.relation == "enantiomeric":  # index the mirror images: no scan of every pair

            def tokens(c: Chain, r: str = obs.reaction):
                return (WILD,) if _doubtful(r, c) else (product_key(r, c) or ())

            def mirrored(c: Chain, r: str = obs.reaction):
                return (WILD,) if _doubtful(r, c) else _mirror_key(r, c)

        # one product per compound: identity is transitive, so a chain of pairs says it all
        transitive = obs.relation == "identical" and obs.reaction != "alditol"
        pairs = list(itertools.pairwise(names)) if transitive else list(itertools.combinations(names, 2))
        for a, b in pairs:
            other_tokens = tokens if mirrored is None else mirrored
            out.append(Binary(a, b, test, obs.id, tokens, other_tokens, _gives(obs.reaction)))
    elif kind == "different":
        names = [ref(m) for m in obs.members]
        for a, b in itertools.combinations(names, 2):
            out.append(Binary(a, b, lambda x, y: x != y, obs.id))
    elif kind == "chain_extension":
        sub = ref(obs.substrate)
        prods = [ref(p) for p in obs.products]
        for p in prods:
            out.append(
                Binary(
                    sub,
                    p,
                    lambda s, q: s.carbonyl == "aldose" and _extension_parent(q) == s,
                    obs.id,
                    lambda s: (s,),
                    lambda q: (x for x in (_extension_parent(q),) if x is not None),
                )
            )
        if len(prods) == 2:
            out.append(Binary(prods[0], prods[1], lambda x, y: x != y, obs.id))
    elif kind == "chain_shortening":
        sub, prod = ref(obs.substrate), ref(obs.product)
        substrates = list(catalogue(project.unknown(sub).scope)) if sub in project.unknown_ids else list(fixed.values())
        wild = any(_doubtful("chain_shortening", c) for c in substrates)  # doubtful: any product kept, no index
        out.append(
            Binary(
                sub,
                prod,
                lambda s, q: _shortened(s) == q or _doubtful("chain_shortening", s),
                obs.id,
                None if wild else (lambda s: (x for x in (_shortened(s),) if x is not None)),
                None if wild else (lambda q: (q,)),
            )
        )
    elif kind == "molar_ratio":  # the branching balance of a polymer's residues (a hidden variable)
        cons, hidden = balance_constraints(obs, {u.id: u.scope for u in project.unknowns})
        out += cons
        fixed.update(hidden)  # type: ignore[arg-type]
    else:
        raise ValueError(f"{kind} is not relational")
    return out, fixed


def _kept(obs: Observation, chains: Sequence[Chain]) -> list[Chain]:
    """The candidates a unary observation keeps (through the outcome table where one applies)."""
    kept = tables.keep(obs, chains, fits)
    return kept if kept is not None else [c for c in chains if passes(obs, c)]


def _fixed_domains(fixed: dict) -> dict[str, list]:
    """One-value domains of named sugars; the values of hidden variables (:class:`Choices`)."""
    return {name: list(v) if isinstance(v, Choices) else [v] for name, v in fixed.items()}


def _scope_domains(project: Project) -> dict[str, list[Chain]]:
    return {u.id: list(catalogue(u.scope)) for u in project.unknowns}


@functools.lru_cache(maxsize=8192)
def _kept_in_scope(obs: Observation, scope: Scope) -> frozenset[Chain]:
    """The candidates of ``scope`` a unary observation keeps, computed once per observation and scope."""
    return frozenset(_kept(obs, list(catalogue(scope))))


def unary_domains(project: Project, observations: Iterable[Observation]) -> dict[str, list[Chain]]:
    """Each unknown's candidates that fit every unary observation given.

    Unary filters are independent per candidate, so each observation's kept
    set over the unknown's scope is cached and the domains are intersections.
    """
    domains = _scope_domains(project)
    for obs in observations:
        if obs.UNARY:
            try:
                keep = _kept_in_scope(obs, project.unknown(obs.unknown).scope)
            except TypeError:  # an observation with an unhashable field: filter directly
                domains[obs.unknown] = _kept(obs, domains[obs.unknown])
                continue
            domains[obs.unknown] = [c for c in domains[obs.unknown] if c in keep]
    return domains


def _relations(project: Project, observations: Iterable[Observation]) -> tuple[list[Binary], dict[str, Chain]]:
    """Binary constraints of every relational observation, and the known sugars they name."""
    constraints: list[Binary] = []
    fixed: dict[str, Chain] = {}
    for obs in observations:
        if not obs.UNARY:
            cons, named = constraints_of(project, obs)
            constraints += cons
            fixed.update(named)
    return constraints, fixed


def _network(project: Project, observations: Iterable[Observation]):
    obs_list = list(observations)
    domains = unary_domains(project, obs_list)
    constraints, fixed = _relations(project, obs_list)
    domains.update(_fixed_domains(fixed))
    return domains, constraints


def _survivors(project: Project, observations: Iterable[Observation]) -> dict[str, list[Chain]] | None:
    domains, constraints = _network(project, observations)
    if any(not d for d in domains.values()):
        return None
    out = supported_domains(domains, constraints)
    if out is None:
        return None
    return {k: v for k, v in out.items() if not k.startswith(AUXILIARY)}


def is_consistent(project: Project, observations: Iterable[Observation]) -> bool:
    """True when some assignment of all unknowns satisfies every observation given."""
    domains, constraints = _network(project, observations)
    if any(not d for d in domains.values()):
        return False
    return find_solution(domains, constraints) is not None


# ------------------------------------------------------------------ conflicts
class _SubsetNetworks:
    """Networks of many subsets of the same observations, for the conflict search and the relief.

    Each unary observation's kept candidates and each relation's constraints
    are computed once and reused (unary filters are independent per candidate).
    """

    def __init__(self, project: Project) -> None:
        self.project = project
        self.scope = _scope_domains(project)
        self.kept: dict[str, frozenset[Chain]] = {}
        self.relations: dict[str, tuple[list[Binary], dict[str, Chain]]] = {}

    def network(self, subset: Iterable[Observation]) -> tuple[dict[str, list], list[Binary]]:
        domains: dict[str, list] = dict(self.scope)
        constraints: list[Binary] = []
        fixed: dict[str, Chain] = {}
        for obs in subset:
            if obs.UNARY:
                if obs.id not in self.kept:
                    self.kept[obs.id] = frozenset(_kept(obs, self.scope[obs.unknown]))
                keep = self.kept[obs.id]
                domains[obs.unknown] = [c for c in domains[obs.unknown] if c in keep]
            else:
                if obs.id not in self.relations:
                    self.relations[obs.id] = constraints_of(self.project, obs)
                cons, named = self.relations[obs.id]
                constraints += cons
                fixed.update(named)
        domains.update(_fixed_domains(fixed))
        return domains, constraints

    def consistent(self, subset: list[Observation]) -> bool:
        domains, constraints = self.network(subset)
        return all(domains.values()) and find_solution(domains, constraints) is not None

    def survivors(self, subset: list[Observation]) -> dict[str, list[Chain]] | None:
        domains, constraints = self.network(subset)
        out = supported_domains(domains, constraints) if all(domains.values()) else None
        return None if out is None else {k: v for k, v in out.items() if not k.startswith(AUXILIARY)}


def _conflict_sets(project: Project, observations: list[Observation], networks: _SubsetNetworks | None = None):
    """Several minimal conflicting sets (see :mod:`workbench.evidence.conflicts`)."""
    networks = networks or _SubsetNetworks(project)
    return conflict_sets(observations, networks.consistent, key=lambda o: o.id)


# ------------------------------------------------------------------ solving
_WORDS = {
    "chain_extension": "Kiliani-Fischer relation",
    "chain_shortening": "Ruff/Wohl relation",
    "different": "requirement to be a different compound",
    "molar_ratio": "branching balance (one more terminal residue than branch points)",
}


def _explain_relational(project: Project, obs: Observation, uid: str, chain: Chain) -> str:
    """Why ``chain`` cannot be ``uid`` under relational ``obs``, as specific as the data allow."""
    others = [m for m in obs.references() if m != uid]
    known = [m for m in others if m not in project.unknown_ids]
    if obs.KIND == "same_product" and known:
        mine = product_key(obs.reaction, chain)
        if mine is None:
            return f"it gives no {obs.reaction.replace('_', ' ')}"
        for ref in known:
            target = project.member(ref)
            theirs = None if isinstance(target, str) else product_key(obs.reaction, target)
            if theirs is None:
                continue
            rel = reactions.relation_of_sets(mine, theirs)
            wanted_ok = rel != "identical" if obs.relation == "different" else rel == obs.relation
            if not wanted_ok:
                return f"its {obs.reaction.replace('_', ' ')} and that of {ref} are {rel}, observed {obs.relation}"
    if obs.KIND == "chain_shortening" and obs.substrate == uid and known:
        product = _shortened(chain)
        made = display_name(product) if product else "nothing"
        return f"its Ruff/Wohl product would be {made}, observed {obs.product}"
    what = _WORDS.get(obs.KIND, f"{getattr(obs, 'relation', '')} {getattr(obs, 'reaction', '')} relation".strip())
    return f"no candidate of {', '.join(others)} fits the {what} with it, given the evidence so far"


def _explain_knock_on(project: Project, obs: Observation, uid: str, applied: list[Observation]) -> str:
    links = [o.id for o in applied if not o.UNARY and uid in o.references() and obs.unknown in o.references()]
    via = f" (linked through {', '.join(links)})" if links else ""
    return f"{obs.id} removed every partner it could have in {obs.unknown}{via}"


def _reason(project: Project, obs: Observation, uid: str, applied: tuple[Observation, ...], chain: Chain) -> str:
    """Why ``obs`` (after ``applied``) removed ``chain`` from ``uid``."""
    if obs.UNARY and obs.unknown == uid:
        verdict = fits(obs, chain)
        return verdict.reason if not verdict.fits else "no partner survives"
    if obs.UNARY:
        return _explain_knock_on(project, obs, uid, list(applied))
    if uid in obs.references():
        return _explain_relational(project, obs, uid, chain)
    return f"{obs.id} removed every partner it could have in a linked unknown"


class _Reasons(Mapping[Chain, str]):
    """Eliminated candidate -> reason, each reason worded on first reading (most are never read)."""

    def __init__(self, chains: tuple[Chain, ...], explain: Callable[[Chain], str]) -> None:
        self._chains = chains
        self._keys: frozenset[Chain] | None = None
        self._explain = explain
        self._done: dict[Chain, str] = {}

    def __getitem__(self, chain: Chain) -> str:
        if chain not in self._done:
            if self._keys is None:
                self._keys = frozenset(self._chains)
            if chain not in self._keys:
                raise KeyError(chain)
            self._done[chain] = self._explain(chain)
        return self._done[chain]

    def __iter__(self) -> Iterator[Chain]:
        return iter(self._chains)

    def __len__(self) -> int:
        return len(self._chains)

    def __repr__(self) -> str:
        return f"<{len(self._chains)} reasons, worded when read>"


def _gone(before: Sequence[Chain], after: Sequence[Chain]) -> tuple[Chain, ...]:
    """The candidates of ``before`` not in ``after``, in order (compared as table rows where possible)."""
    if not before:
        return ()
    lost = ~np.isin(tables.rows(before), tables.rows(after))
    return tuple(before[i] for i in np.flatnonzero(lost).tolist())


def _flagged(obs: Observation, chains: Sequence[Chain]) -> list[tuple[Chain, Verdict]]:
    """The survivors of unary ``obs`` that are kept only with a flag, with their verdicts."""
    judged = tables.verdicts(obs, chains, fits) if chains and isinstance(chains[0], Chain) else None
    if judged is None:
        return [(c, v) for c in chains if (v := fits(obs, c)).flagged]
    # judged once per value; the flagged ones are worded for each candidate (the reason names it)
    return [(c, fits(obs, c)) for c, v in zip(chains, judged, strict=True) if v.flagged]


def solve(project: Project, disabled: Iterable[str] = ()) -> Solution:
    """Survivors of every unknown, the elimination trail and any conflicts."""
    off = tuple(disabled)
    active = [o for o in project.observations if o.id not in off]
    scope = _scope_domains(project)
    # the catalogue's own cached tuples: the outcome tables know their rows from earlier solves
    current: dict[str, tuple[Chain, ...]] = {u.id: catalogue(u.scope) for u in project.unknowns}
    applied: list[Observation] = []
    trail: list[TrailStep] = []
    flags: dict[str, dict[Chain, list[str]]] = {u: {} for u in project.unknown_ids}
    constraints: list[Binary] = []
    fixed: dict[str, Chain] = {}
    for obs in project.observations:
        if obs.id in off:
            trail.append(TrailStep(obs.id, "disabled", {}, {u: len(current[u]) for u in current}))
            continue
        # Survivors of observations 1..k lie within those of 1..k-1, so each step starts from `current`.
        domains = {k: list(v) for k, v in current.items()}
        new_cons: list[Binary] = []
        new_fixed: dict[str, Chain] = {}
        if obs.UNARY:
            domains[obs.unknown] = _kept(obs, current[obs.unknown])
        else:
            new_cons, new_fixed = constraints_of(project, obs)
        domains.update(_fixed_domains({**fixed, **new_fixed}))
        # `current` holds supported (so arc-consistent) domains of `constraints`: only what this
        # observation touches needs propagating, and the known sugars and hidden variables, whose
        # domains start afresh at every step.
        touched = {obs.unknown} if obs.UNARY else {v for c in new_cons for v in (c.a, c.b)}
        touched |= set(fixed) | set(new_fixed)
        empty = any(not d for d in domains.values())
        result = None if empty else supported_domains(domains, constraints + new_cons, around=touched)
        trial = None if result is None else {k: tuple(v) for k, v in result.items() if not k.startswith(AUXILIARY)}
        if trial is None:
            trail.append(TrailStep(obs.id, "contradicts", {}, {u: len(current[u]) for u in current}))
            continue
        eliminated: dict[str, tuple[Chain, ...]] = {}
        reasons: dict[str, Mapping[Chain, str]] = {}
        for uid in project.unknown_ids:
            if len(trial[uid]) == len(current[uid]):
                continue  # survivors only ever shrink: nothing gone
            gone = _gone(current[uid], trial[uid])
            if gone:
                eliminated[uid] = gone
                reasons[uid] = _Reasons(gone, functools.partial(_reason, project, obs, uid, tuple(applied)))
        if obs.UNARY:
            for c, verdict in _flagged(obs, trial[obs.unknown]):
                flags[obs.unknown].setdefault(c, []).append(f"{obs.id}: {verdict.reason}")
        for uid, c, why in _doubtful_members(project, obs, trial):
            flags[uid].setdefault(c, []).append(f"{obs.id}: no prediction for {display_name(c)} ({why}); kept")
        applied.append(obs)
        constraints += new_cons
        fixed.update(new_fixed)
        current = dict(trial)
        trail.append(TrailStep(obs.id, "applied", eliminated, {u: len(current[u]) for u in current}, reasons))
    conflicts: list[tuple[str, ...]] = []
    relief: dict[str, dict[str, tuple[Chain, ...]]] = {}
    clean = all(step.status != "contradicts" for step in trail)
    final: Mapping[str, Sequence[Chain]] | None = current if clean else _survivors(project, active)
    if final is None:
        networks = _SubsetNetworks(project)
        conflicts = _conflict_sets(project, active, networks)
        for oid in sorted({o for c in conflicts for o in c}, key=[o.id for o in active].index):
            rest = [o for o in active if o.id != oid]
            alt = networks.survivors(rest)
            if alt is not None:
                relief[oid] = {u: tuple(alt[u]) for u in project.unknown_ids}
        final = {u: () for u in project.unknown_ids}
    suspects: list[tuple[str, float]] = []
    post = None
    if conflicts:
        suspects = _suspects(project, active, conflicts)
    else:
        post = _posterior(project, active, final, scope)
    return Solution(
        project=project,
        scope_counts={u: len(scope[u]) for u in project.unknown_ids},
        survivors={u: tuple(final[u]) for u in project.unknown_ids},
        trail=tuple(trail),
        conflicts=tuple(conflicts),
        relief=relief,
        flags=_final_flags(flags, final),
        disabled=off,
        probabilities=post.probabilities if post else {},
        entropy=post.entropy if post else {},
        posterior_methods=post.methods if post else {},
        weights=post.weights if post else {},
        suspects=tuple(suspects),
    )


def _final_flags(
    flags: dict[str, dict[Chain, list[str]]], final: Mapping[str, Sequence[Chain]]
) -> dict[str, dict[Chain, tuple[str, ...]]]:
    """The flags of the final survivors only (one set per unknown, not one per flag)."""
    out: dict[str, dict[Chain, tuple[str, ...]]] = {}
    for u, d in flags.items():
        alive = set(final[u])
        out[u] = {c: tuple(v) for c, v in d.items() if c in alive}
    return out


# ------------------------------------------------------------------ probabilities (evidence/posterior.py)
def _posterior(
    project: Project,
    observations: list[Observation],
    survivors: Mapping[str, Sequence[Chain]],
    scope: dict[str, list[Chain]] | None = None,
    mixed: bool = True,
    limit: int = ENUMERATION_LIMIT,
) -> Posterior:
    """The joint posterior over ``survivors`` (which must be consistent with ``observations``)."""

    constraints, fixed = _relations(project, observations)
    domains: dict[str, list[Chain]] = {u: list(survivors[u]) for u in project.unknown_ids}
    domains.update(_fixed_domains(fixed))
    weights = unary_weights(observations, {u: survivors[u] for u in project.unknown_ids}, mixed)
    sizes = {u: len((scope or _scope_domains(project))[u]) for u in project.unknown_ids}
    return joint_posterior(domains, weights, constraints, sizes, limit)


def _suspects(project: Project, active: list[Observation], conflicts: list[tuple[str, ...]]) -> list[tuple[str, float]]:
    involved = {oid for c in conflicts for oid in c}
    candidates = [o for o in active if o.id in involved]
    scope = _scope_domains(project)

    def evidence_without(dropped: frozenset[str]) -> float | None:
        rest = [o for o in active if o.id not in dropped]
        alt = _survivors(project, rest)
        if alt is None:
            return None
        return _posterior(project, rest, alt, scope, mixed=False, limit=SUSPECT_ENUMERATION_LIMIT).log_evidence

    return rank_suspects(candidates, evidence_without)


def joint_worlds(solution: Solution, limit: int = 20000) -> dict[str, list[dict[str, Chain]]]:
    """Joint assignments of linked unknowns: for each unknown, the solutions of its group.

    Unknowns linked by relations are enumerated together (a uniform prior over
    joint assignments); an unknown whose group has more than ``limit``
    solutions is left out, and the planner then treats its survivors alone.
    """
    project = solution.project
    if solution.contradictory:
        return {}
    active = [o for o in project.observations if o.id not in solution.disabled]
    domains: dict[str, list[Chain]] = {u: list(solution.survivors[u]) for u in project.unknown_ids}
    constraints, fixed = _relations(project, active)
    domains.update(_fixed_domains(fixed))
    out: dict[str, list[dict[str, Chain]]] = {}
    for group in components(domains, constraints):
        sub_domains = {v: domains[v] for v in group}
        sub_cons = [c for c in constraints if c.a in sub_domains]
        worlds = enumerate_solutions(sub_domains, sub_cons, limit)
        if worlds is None:
            continue
        clean = [{k: v for k, v in w.items() if not k.startswith(AUXILIARY)} for w in worlds]
        for v in group:
            if not v.startswith(AUXILIARY):
                out[v] = clean
    return out
