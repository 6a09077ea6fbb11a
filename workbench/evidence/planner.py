"""The next-experiment planner: which experiment tells the survivors apart best.

For every unknown that still has several survivors, every experiment the
workbench can predict is applied to each survivor; survivors with the same
predicted outcome form one group. With a uniform prior over the unknown's
survivors, the information of the experiment is the Shannon entropy of that
partition,

    H = -sum_i (n_i / N) log2(n_i / N)   [bits],

and the expected number of survivors afterwards is sum_i n_i^2 / N. Numeric
outcomes (periodate amounts, rotations, couplings) are grouped by what the
instrument can tell apart: values closer than the observation's default
tolerance fall in one group (single linkage along the sorted values).

Under uncertainty (Contract 3) the units are weighed by the posterior of
the solution (:attr:`Solution.probabilities`; joint worlds by the product of
their candidates' weights), so the information of a logic experiment is the
entropy of its outcome distribution under the posterior. A measured quantity
(rotation, anomer ratio, coupling) is scored by the mutual information
between the candidate and the noisy reading: each candidate predicts a
Gaussian reading with the combined error ``sqrt(sigma^2 + se^2)`` (the kind's
default sigma and the prediction's standard error), an uncalibrated one a
flat reading, a ring form it cannot close a reading of its own, and

    I = sum_c p_c integral f_c(y) log2(f_c(y) / sum_c' p_c' f_c'(y)) dy   [bits]

is summed on a grid. Its expected number of survivors afterwards is
``2 ** (H - I)`` (H the entropy of the candidates' probabilities).

Ranking: information per unit of effort (see :mod:`workbench.evidence.costs`),
or by information alone. A two-step look-ahead scores pairs of experiments by
the entropy of their joint partition.
"""

from __future__ import annotations

import dataclasses
import itertools
import math
from collections import defaultdict
from collections.abc import Callable, Hashable, Sequence
from dataclasses import dataclass
from functools import cache
from typing import TYPE_CHECKING, Any

import numpy as np

from workbench.chem import reactions
from workbench.chem.chain import Chain
from workbench.chem.names import display_name
from workbench.chem.parse import resolve
from workbench.evidence import tables
from workbench.evidence.costs import Cost, cautions_of, cost_of
from workbench.evidence.engine import Solution, joint_worlds, solve
from workbench.evidence.observations import DEFAULT_SIGMA
from workbench.evidence.outcomes import FLAT_DENSITY, NO_PREDICTION, outcome_label, product_key
from workbench.evidence.project import Project
from workbench.evidence.residue_outcomes import residue_experiments
from workbench.evidence.tables import column_key

if TYPE_CHECKING:
    import pandas as pd

__all__ = ["Experiment", "ExperimentPair", "Plan", "plan", "entropy_bits", "REFERENCE_SUGARS"]

# Sugars a carbohydrate laboratory can usually buy as references [common practice].
REFERENCE_SUGARS: tuple[str, ...] = (
    "D-glyceraldehyde",
    "D-erythrose",
    "D-threose",
    "D-ribose",
    "D-arabinose",
    "L-arabinose",
    "D-xylose",
    "D-lyxose",
    "2-deoxy-D-ribose",
    "D-glucose",
    "D-mannose",
    "D-galactose",
    "D-allose",
    "D-talose",
    "D-fructose",
    "L-sorbose",
    "D-tagatose",
    "D-psicose",
    "L-rhamnose",
    "L-fucose",
    "D-glucosamine",
    "D-galactosamine",
    "D-glucuronic acid",
    "D-galacturonic acid",
    "D-sedoheptulose",
)

_TOLERANCE = {"periodate": 0.2, "specific_rotation": 5.0, "anomer_ratio": 0.1, "coupling_constant": 1.5}


@dataclass(frozen=True)
class Experiment:
    """One candidate experiment with its predicted outcomes for the survivors."""

    kind: str
    fields: dict[str, Any]
    unknown: str
    information_bits: float
    expected_remaining: float
    outcomes: dict[str, tuple[str, ...]]
    cost: Cost
    cautions: tuple[str, ...]
    title: str = ""

    @property
    def value(self) -> float:
        """Information per unit of effort (bits per effort unit)."""
        return self.information_bits / max(self.cost.effort, 0.1)

    def to_dict(self) -> dict:
        """JSON form (Contract 2)."""
        return {
            "kind": self.kind,
            **self.fields,
            "title": self.title,
            "information_bits": round(self.information_bits, 4),
            "expected_remaining": round(self.expected_remaining, 3),
            "outcomes": {k: list(v) for k, v in self.outcomes.items()},
            "cost": self.cost.to_dict(),
            "bits_per_effort": round(self.value, 4),
            "cautions": list(self.cautions),
        }


@dataclass(frozen=True)
class ExperimentPair:
    """Two experiments done one after the other, scored by their joint partition."""

    first: Experiment
    second: Experiment
    information_bits: float
    expected_remaining: float

    def to_dict(self) -> dict:
        """JSON form."""
        return {
            "first": self.first.title,
            "second": self.second.title,
            "information_bits": round(self.information_bits, 4),
            "expected_remaining": round(self.expected_remaining, 3),
        }


@dataclass(frozen=True)
class Plan:
    """Experiments best first, optional pairs, and advice in words."""

    experiments: tuple[Experiment, ...]
    pairs: tuple[ExperimentPair, ...] = ()
    advice: tuple[str, ...] = ()
    solved: tuple[str, ...] = ()
    ranking: str = "value"
    contradictory: bool = False

    def to_dict(self) -> dict:
        """``plan --json`` (Contract 2)."""
        return {
            "experiments": [e.to_dict() for e in self.experiments],
            "pairs": [p.to_dict() for p in self.pairs],
            "advice": list(self.advice),
            "solved": list(self.solved),
            "ranking": self.ranking,
            "contradictory": self.contradictory,
        }

    def to_frame(self) -> pd.DataFrame:
        """The ranking as a DataFrame, best first (:func:`workbench.frames.plan_frame`)."""
        from workbench.frames import plan_frame

        return plan_frame(self)


def entropy_bits(sizes: Sequence[int]) -> float:
    """Shannon entropy (bits) of a partition with these group sizes (uniform prior)."""
    total = sum(sizes)
    if total == 0:
        return 0.0
    return -sum((n / total) * math.log2(n / total) for n in sizes if n)


def _entropy_of(weights: Sequence[float]) -> float:
    """Shannon entropy (bits) of outcome weights (normalised here)."""
    total = sum(weights)
    if total <= 0:
        return 0.0
    return max(0.0, -sum((w / total) * math.log2(w / total) for w in weights if w > 0))


# Reading ranges for the information of a measured quantity (the flat density's range, FLAT_DENSITY).
_GRID = {
    "anomer_ratio": (0.0, 1.0, 401),
    "coupling_constant": (0.0, 12.0, 481),
    "specific_rotation": (-150.0, 150.0, 601),
}


def _noisy_information(
    kind: str, params: dict, survivors: Sequence[Chain], probs: Sequence[float]
) -> tuple[float, float]:
    """Mutual information (bits) between candidate and noisy reading, and 2**(H - I) (see module docstring)."""
    probe_fields = {k: v for k, v in params.items() if k != "unknown"}
    lo, hi, points = _GRID[kind]
    grid = np.linspace(lo, hi, points)
    step = grid[1] - grid[0]
    sigma = DEFAULT_SIGMA[kind]
    flat = np.full_like(grid, FLAT_DENSITY[kind])
    densities: dict[tuple, np.ndarray] = {}
    mass: dict[tuple, float] = defaultdict(float)
    impossible = 0.0
    # one calibrated estimate per distinct value (outcome tables), with the probability mass it carries
    got, found_values = tables.codes(tables.estimate_key(kind, **probe_fields), survivors)
    code_mass = np.bincount(got, weights=np.asarray(probs, dtype=float), minlength=len(found_values))
    for code in np.flatnonzero(code_mass > 0).tolist():
        p = float(code_mass[code])
        found = found_values[code]
        if found is None:
            impossible += p
            continue
        if found is NO_PREDICTION or (found.se is None and not found.sign):
            key: tuple = ("flat",)
        elif found.sign:
            key = ("sign", found.sign)
        else:
            key = ("gauss", round(found.value, 4), round(math.sqrt(sigma**2 + found.se**2), 4))
        if key not in densities:
            if key[0] == "flat":
                densities[key] = flat
            elif key[0] == "sign":
                densities[key] = flat * np.where(grid * key[1] > 0, 1.6, 0.4)
            else:
                mu, s = key[1], key[2]
                densities[key] = np.exp(-0.5 * ((grid - mu) / s) ** 2) / (s * math.sqrt(2 * math.pi))
        mass[key] += p
    total = impossible + sum(mass.values())
    if total <= 0:
        return 0.0, 0.0
    info = 0.0
    if impossible > 0:
        info += (impossible / total) * math.log2(total / impossible)
    if mass:
        keys = list(mass)
        dens = np.array([densities[k] for k in keys])
        weights = np.array([mass[k] / total for k in keys])
        mix = weights @ dens
        with np.errstate(divide="ignore", invalid="ignore"):
            ratio = np.where(dens > 0, np.log2(np.maximum(dens, 1e-300) / np.maximum(mix, 1e-300)), 0.0)
        per_key = (dens * ratio).sum(axis=1) * step
        info += float(weights @ per_key)
    prior = _entropy_of(list(probs))
    info = min(max(info, 0.0), prior)
    return info, 2 ** (prior - info)


def _expected_remaining(sizes: Sequence[float]) -> float:
    total = sum(sizes)
    return sum(n * n for n in sizes) / total if total else 0.0


def _cluster(values: dict[Hashable, float], tolerance: float) -> dict[Hashable, Hashable]:
    """Group numeric outcomes: neighbours closer than ``tolerance`` share a group label.

    Keys are anything hashable (candidates, or the codes of distinct values).
    """
    digits = 2 if tolerance < 0.5 else 1
    order = sorted(values, key=lambda c: values[c])
    labels: dict[Hashable, Hashable] = {}
    group: list[Hashable] = []

    def close(g: list[Hashable]) -> None:
        lo, hi = f"{values[g[0]]:.{digits}f}", f"{values[g[-1]]:.{digits}f}"
        label = lo if lo == hi else f"{lo} to {hi}"
        for c in g:
            labels[c] = label

    for c in order:
        if group and values[c] - values[group[-1]] > tolerance:
            close(group)
            group = []
        group.append(c)
    if group:
        close(group)
    return labels


@cache
def _reference(name: str) -> Chain:
    return resolve(name)


def _unary_outcomes(kind: str, params: dict, survivors: Sequence[Chain]) -> list[Hashable]:
    """The outcome label of every survivor, in order, read from the outcome table (one label per value)."""
    probe_params = {k: v for k, v in params.items() if k != "unknown"}
    got, vals = tables.codes(column_key(kind, **probe_params), survivors)
    present = [int(c) for c in np.unique(got)]
    label_of: dict[Hashable, Hashable] = {}
    if kind in _TOLERANCE and kind != "periodate":
        numeric: dict[Hashable, float] = {
            c: vals[c] for c in present if isinstance(vals[c], (int, float)) and vals[c] is not NO_PREDICTION
        }
        label_of.update(_cluster(numeric, _TOLERANCE[kind]))
    for c in present:
        if c not in label_of:
            label_of[c] = outcome_label(kind, vals[c])
    return [label_of[c] for c in got.tolist()]


def _coupling_pairs(survivors: Sequence[Chain], form: str) -> list[str]:
    """Proton pairs with a predicted coupling in ``form`` for any survivor (ring order).

    Which protons a ring carries depends on the constitution only (a deoxy
    carbon has two, an H2ax and an H2eq), so one survivor per constitution is
    read (at most 64 constitutions), not the first survivors of the list.
    """
    seen: dict[str, None] = {}
    one_each: dict[tuple[str, ...], Chain] = {}
    for c in survivors:
        one_each.setdefault(c.groups, c)
    for pairs in tables.values(f"derived|coupling_pairs_{form}", list(one_each.values())[:64]):
        for pair in pairs:
            seen.setdefault(pair, None)
    return list(seen)


def _experiments_for(
    uid: str, survivors: Sequence[Chain], others: Sequence[str]
) -> list[tuple[str, dict, str, Callable]]:
    """(kind, fields, title, outcome function) for every experiment on ``uid``."""
    out: list[tuple[str, dict, str, Callable]] = []

    def unary(kind: str, title: str, **params: Any) -> None:
        fields = {"unknown": uid, **params}
        out.append((kind, fields, title, lambda s, k=kind, p=fields: _unary_outcomes(k, p, s)))

    if survivors and not isinstance(survivors[0], Chain):  # glycan residues: their own experiments, same tables
        for kind, title, params in residue_experiments(uid):
            fields = {"unknown": uid, **params}
            out.append((kind, fields, title, lambda s, k=kind, p=fields: _unary_outcomes(k, p, s)))
        return out

    unary("carbon_count", f"count the carbons of {uid}")
    unary("molecular_formula", f"molecular formula of {uid} (HRMS)")
    unary("series", f"D/L series of {uid} (degrade to glyceraldehyde)")
    unary("bromine_water", f"bromine water on {uid}")
    unary("reducing_test", f"reducing-sugar test on {uid}")
    unary("ketose_test", f"resorcinol/HCl ketose test on {uid}")
    unary("aldaric_acid", f"nitric acid on {uid}: is the aldaric acid optically active?")
    unary("alditol", f"borohydride reduction of {uid}: is the alditol optically active?")
    for substrate in ("free", "alditol", "methyl_pyranoside", "methyl_furanoside"):
        what = {"free": "free sugar", "alditol": "alditol"}.get(substrate, substrate.replace("_", " "))
        unary("periodate", f"periodate uptake and products of the {what} of {uid}", substrate=substrate)
    unary("specific_rotation", f"equilibrium specific rotation of {uid}")
    unary("anomer_ratio", f"alpha:beta pyranose ratio of {uid} by 1H NMR")
    for form in ("alpha_pyranose", "beta_pyranose"):
        for pair in _coupling_pairs(survivors, form):
            unary("coupling_constant", f"3J({pair}) of the {form.replace('_', ' ')} of {uid}", form=form, pair=pair)
    for reaction in ("osazone", "alditol", "aldaric_acid"):
        for ref in REFERENCE_SUGARS:
            ref_chain = _reference(ref)
            ref_key = product_key(reaction, ref_chain)
            if ref_key is None:
                continue

            def rel(s: Sequence[Chain], r: str = reaction, rk: frozenset = ref_key) -> list[Hashable]:
                got, vals = tables.codes(f"product|{r}", s)
                to_reference = reactions.relation_to(rk)
                words = {  # one relation per distinct product set
                    c: "no product" if vals[c] is None else to_reference(vals[c]) for c in np.unique(got).tolist()
                }
                return [words[c] for c in got.tolist()]

            fields = {"reaction": reaction, "members": [uid, ref]}
            out.append(
                ("same_product", fields, f"compare the {reaction.replace('_', ' ')} of {uid} with that of {ref}", rel)
            )
    for other in others:
        del other  # relations between unknowns are scored jointly below

    def extension(s: Sequence[Chain]) -> list[Hashable]:
        return tables.values("derived|extension_aldaric", s)

    def shortening(s: Sequence[Chain]) -> list[Hashable]:
        return tables.values("derived|shortening_aldaric", s)

    out.append(
        (
            "chain_extension",
            {"method": "kiliani_fischer", "substrate": uid, "then": "aldaric_acid"},
            f"Kiliani-Fischer extension of {uid}, then nitric acid on both products",
            extension,
        )
    )
    out.append(
        (
            "chain_shortening",
            {"method": "ruff", "substrate": uid, "then": "aldaric_acid"},
            f"Ruff degradation of {uid}, then nitric acid on the product",
            shortening,
        )
    )
    return out


def _score(
    kind: str,
    fields: dict,
    title: str,
    uid: str,
    labels: list[Hashable],
    names: list[str],
    unit_weights: Sequence[float] | None = None,
) -> Experiment:
    """Score one experiment over its units (joint worlds, or the unknown's survivors).

    ``labels[i]`` is the predicted outcome in unit i and ``names[i]`` what the
    user sees for that unit (a survivor name, or ``U1=..., U2=...``);
    ``unit_weights[i]`` its posterior weight (uniform when None). The
    information is the entropy of the outcome weights; the expected number of
    survivors afterwards is the weighted mean of distinct names per outcome.
    """
    # one pass in C per step: label codes, weight per code (bincount), distinct (code, name) pairs in order
    code_of: dict[str, int] = {}
    codes = [code_of.setdefault(str(label), len(code_of)) for label in labels]
    unit = np.ones(len(codes)) if unit_weights is None else np.asarray(unit_weights, dtype=float)
    per_code = np.bincount(np.asarray(codes, dtype=np.int64), weights=unit, minlength=len(code_of)).tolist()
    words = list(code_of)
    weights: dict[str, float] = {words[k]: per_code[k] for k in range(len(words))}
    groups: dict[str, dict[str, None]] = {w: {} for w in words}
    for k, name in dict.fromkeys(zip(codes, names, strict=True)):
        groups[words[k]][name] = None
    total = sum(weights.values())
    cost = cost_of(kind, fields.get("reaction"))
    return Experiment(
        kind=kind,
        fields=fields,
        unknown=uid,
        information_bits=_entropy_of(list(weights.values())),
        expected_remaining=sum(weights[k] / total * len(groups[k]) for k in weights) if total else 0.0,
        outcomes={k: tuple(v) for k, v in sorted(groups.items())},
        cost=cost,
        cautions=tuple(cautions_of(cost)),
        title=title,
    )


def _pair_experiments(uid: str, others: Sequence[str], worlds: list[dict[str, Chain]]):
    """Compare the products of two unknowns (same osazone / alditol / aldaric acid?)."""
    for other in others:
        if other not in worlds[0]:
            continue
        pairs = [(w[uid], w[other]) for w in worlds]
        distinct = dict.fromkeys(pairs)  # many worlds share a pair: each pair is named and judged once
        named = {(a, b): f"{uid}={display_name(a)}, {other}={display_name(b)}" for a, b in distinct}
        names = [named[pair] for pair in pairs]
        for reaction in ("osazone", "alditol", "aldaric_acid"):
            judged: dict[tuple[Chain, Chain], Hashable] = {}
            for a, b in distinct:
                ka, kb = product_key(reaction, a), product_key(reaction, b)
                judged[(a, b)] = "no product" if ka is None or kb is None else reactions.relation_of_sets(ka, kb)
            labels: list[Hashable] = [judged[pair] for pair in pairs]
            fields = {"reaction": reaction, "members": [uid, other]}
            title = f"compare the {reaction.replace('_', ' ')} of {uid} with that of {other}"
            yield "same_product", fields, title, labels, names


def _world_weights(solution: Solution, worlds: list[dict[str, Chain]]) -> list[float] | None:
    """Posterior weight of each joint world: the product of its candidates' unary weights, normalised."""
    if not solution.weights:
        return None
    out = []
    for w in worlds:
        x = 1.0
        for u, c in w.items():
            x *= solution.weights.get(u, {}).get(c, 1.0)
        out.append(x)
    total = sum(out)
    return [x / total for x in out] if total > 0 else None


def _advice_for_conflicts(solution: Solution) -> list[str]:
    counts: dict[str, int] = defaultdict(int)
    for c in solution.conflicts:
        for oid in c:
            counts[oid] += 1
    lines = ["The evidence is contradictory; no experiment is ranked until the conflict is resolved."]
    if solution.suspects:
        ranked = ", ".join(f"{oid} ({p:.2f})" for oid, p in solution.suspects[:4])
        lines.append(f"Most likely wrong, with the chance that the record is wrong: {ranked}.")
    for oid in sorted(counts, key=lambda o: (-counts[o], o)):
        obs = solution.project.observation(oid)
        left = solution.relief.get(oid)
        after = ""
        if left:
            after = "; without it: " + ", ".join(f"{u} {len(cs)} left" for u, cs in left.items())
        lines.append(
            f"Repeat or re-check {oid} ({obs.describe()}): in {counts[oid]} of {len(solution.conflicts)} "
            f"conflicting set(s){after}."
        )
    return lines


def plan(
    project: Project,
    unknown: str | None = None,
    lookahead: bool = False,
    ranking: str = "value",
    solution: Solution | None = None,
    limit: int = 25,
) -> Plan:
    """Rank the next experiments for ``project`` (or one ``unknown`` of it).

    ``ranking`` is ``"value"`` (information per effort) or ``"information"``.
    """
    if ranking not in ("value", "information"):
        raise ValueError(f"ranking must be 'value' or 'information', got {ranking!r}")
    sol = solution or solve(project)
    if sol.contradictory:
        return Plan((), (), tuple(_advice_for_conflicts(sol)), (), ranking, contradictory=True)
    targets = [unknown] if unknown else list(project.unknown_ids)
    for t in targets:
        if t not in project.unknown_ids:
            from workbench.errors import ObservationError

            raise ObservationError(None, "unknown", f"no unknown has id {t!r} (ids: {', '.join(project.unknown_ids)})")
    solved = tuple(u for u in targets if len(sol.survivors[u]) <= 1)
    worlds = joint_worlds(sol)
    experiments: list[Experiment] = []
    labels_of: dict[int, tuple[str, list[Hashable]]] = {}
    done_pairs: set[frozenset[str]] = set()

    unit_weights: dict[str, list[float] | None] = {}

    def add(kind: str, fields: dict, title: str, uid: str, labels: list[Hashable], names: list[str], unit: str) -> None:
        exp = _score(kind, fields, title, uid, labels, names, unit_weights.get(unit))
        if kind in _GRID and not project.unknown(uid).is_residue:
            survivors = sol.survivors[uid]
            probs = [sol.probability(uid, c) for c in survivors] if sol.probabilities else [1.0] * len(survivors)
            params = {k: v for k, v in fields.items()}
            bits, left = _noisy_information(kind, params, survivors, probs)
            exp = dataclasses.replace(exp, information_bits=bits, expected_remaining=left)
        if exp.information_bits > 1e-9:
            experiments.append(exp)
            labels_of[id(exp)] = (unit, labels)

    for uid in targets:
        survivors = sol.survivors[uid]
        if len(survivors) <= 1:
            continue
        mine = worlds.get(uid)
        # outcome functions return one label per survivor, in order; units are joint worlds or survivors
        if mine:
            row_of = {c: i for i, c in enumerate(survivors)}
            rows = [row_of[w[uid]] for w in mine]
            names = tables.values("derived|display_name", survivors)
            unit_names = [names[i] for i in rows]
            unit_weights[f"worlds:{uid}"] = _world_weights(sol, mine)
        else:
            unit_names = tables.values("derived|display_name", survivors)
            if sol.probabilities.get(uid):
                unit_weights[uid] = [sol.probability(uid, c) for c in survivors]
        for kind, fields, title, fn in _experiments_for(uid, survivors, ()):
            per_survivor = fn(survivors)
            if mine:
                add(kind, fields, title, uid, [per_survivor[i] for i in rows], unit_names, f"worlds:{uid}")
            else:
                add(kind, fields, title, uid, list(per_survivor), unit_names, uid)
        if mine and not project.unknown(uid).is_residue:
            others = [u for u in project.unknown_ids if u != uid and frozenset((uid, u)) not in done_pairs]
            others = [u for u in others if not project.unknown(u).is_residue]
            for kind, fields, title, labels, names in _pair_experiments(uid, others, mine):
                done_pairs.add(frozenset(fields["members"]))
                add(kind, fields, title, uid, labels, names, f"worlds:{uid}")
    key = (
        (lambda e: (-e.value, -e.information_bits))
        if ranking == "value"
        else (lambda e: (-e.information_bits, -e.value))
    )
    experiments.sort(key=key)
    pairs: list[ExperimentPair] = []
    if lookahead:
        pool = sorted(experiments, key=lambda e: -e.information_bits)[:30]
        for a, b in itertools.combinations(pool, 2):
            unit_a, la = labels_of[id(a)]
            unit_b, lb = labels_of[id(b)]
            if unit_a != unit_b:
                continue
            joint: dict[tuple, float] = defaultdict(float)
            uw = unit_weights.get(unit_a)
            for i, (x, y) in enumerate(zip(la, lb, strict=True)):
                joint[(x, y)] += 1.0 if uw is None else uw[i] * len(la)
            sizes = list(joint.values())
            pairs.append(ExperimentPair(a, b, _entropy_of(sizes), _expected_remaining(sizes)))
        pairs.sort(key=lambda p: (-p.information_bits, p.first.cost.effort + p.second.cost.effort))
        pairs = pairs[:10]
    advice: list[str] = []
    if solved and len(solved) == len(targets):
        advice.append("Every unknown asked about is solved: no further experiment is needed.")
    elif not experiments:
        advice.append("No experiment in the workbench's repertoire tells the remaining survivors apart.")
    return Plan(tuple(experiments[:limit]), tuple(pairs), tuple(advice), solved, ranking)
