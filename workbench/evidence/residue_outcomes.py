"""Predicted outcomes for glycan residue candidates, and the joint constraints of a polymer.

A residue unknown's candidates are :class:`~workbench.chem.residue.Residue`
values. The residue kinds are predicted from the residue's structure:
``methylation_analysis`` (O-methyl and O-acetyl positions of the partially
methylated alditol acetate, :mod:`workbench.chem.methylation`),
``periodate`` with substrate ``residue`` and ``smith_degradation``
(:mod:`workbench.chem.residue_periodate`) and ``anomer``. Every other unary
kind concerns the sugar the residue releases on hydrolysis and is judged on
that sugar (carbon count, series, rotation of the isolated sugar ...).

``molar_ratio`` with ``balance`` is the branching balance of a polymer: each
residue has one parent (through its anomeric oxygen) and as many children as
linked positions, so over all residues sum(L_i - 1) = -1 (the reducing end).
With molar amounts a_i of the residue types, |sum a_i (L_i - 1)| must stay
within ``tolerance`` x sum a_i (common practice: one extra non-reducing
terminal residue per branch point). It is one n-ary constraint over the
members' linked counts, posed through a hidden variable whose values are the
feasible vectors of linked counts (a star of binary constraints, which the
solver treats exactly).
"""

from __future__ import annotations

import itertools
from collections.abc import Callable
from functools import lru_cache
from typing import Any

from workbench.chem.methylation import alditol_acetate
from workbench.chem.names import display_name
from workbench.chem.parse import resolve
from workbench.chem.residue import Residue, ResidueScope
from workbench.chem.residue_periodate import SmithFragment, product_keys, residue_periodate, residue_smith
from workbench.evidence import outcomes
from workbench.evidence.network import AUXILIARY, Binary
from workbench.evidence.observations import Observation
from workbench.evidence.outcomes import REMOVAL_K, Verdict

__all__ = [
    "Choices",
    "RESIDUE_KINDS",
    "predict",
    "fits",
    "outcome_label",
    "balance_constraints",
    "feasible_counts",
    "residue_experiments",
]

RESIDUE_KINDS = ("methylation_analysis", "smith_degradation", "anomer", "ring_form")


class Choices(tuple):
    """The values of a hidden variable of the constraint network (not an unknown; never reported)."""

    __slots__ = ()


@lru_cache(maxsize=256)
def _sugar(name: str) -> Any:
    return resolve(name)


def _is_residue_kind(obs: Observation) -> bool:
    return obs.KIND in RESIDUE_KINDS or (obs.KIND == "periodate" and obs.substrate == "residue")


def predict(obs: Observation, residue: Residue) -> Any:
    """The predicted outcome of ``obs`` for ``residue`` (other kinds: for the sugar it releases)."""
    kind = obs.KIND
    if kind == "methylation_analysis":  # the GC-MS also tells which sugar's alditol it is
        pmaa = alditol_acetate(residue)
        return (pmaa.methyl, pmaa.acetyl, residue.chain)
    if kind == "smith_degradation":
        return residue_smith(residue)
    if kind == "anomer":
        return residue.anomer
    if kind == "ring_form":
        return residue.ring
    if kind == "periodate" and obs.substrate == "residue":
        return residue_periodate(residue).as_tuple()
    return outcomes.predict(obs, residue.chain)


def _positions(values: tuple[int, ...]) -> str:
    return ",".join(map(str, values)) or "none"


def outcome_label(kind: str, value: Any) -> str:
    """A short word for a predicted residue outcome."""
    if kind == "methylation_analysis":
        methyl, acetyl, *sugar = value
        of = f" ({display_name(sugar[0])})" if sugar and sugar[0] is not None else ""
        return f"OMe {_positions(methyl)}; OAc {_positions(acetyl)}{of}"
    if kind == "smith_degradation":
        return value.word if isinstance(value, SmithFragment) else str(value)
    if kind == "periodate":
        return outcomes.periodate_text(value[:3])
    return str(value)


def fits(obs: Observation, residue: Residue) -> Any:
    """:class:`~workbench.evidence.outcomes.Verdict` of ``obs`` on ``residue``."""
    if not _is_residue_kind(obs):
        verdict = outcomes.fits(obs, residue.chain)
        reason = f"{residue.sugar}: {verdict.reason}" if verdict.reason else ""
        return Verdict(verdict.fits, reason, verdict.flagged, verdict.likelihood, verdict.z)
    kind = obs.KIND
    predicted = predict(obs, residue)  # the verdict depends on the residue only through this value
    if kind == "methylation_analysis":
        if obs.sugar and _sugar(obs.sugar) != predicted[2]:
            return Verdict(False, f"the alditol acetate is of {obs.sugar}, not of {display_name(predicted[2])}")
        ok = predicted[:2] == (tuple(obs.methyl), tuple(obs.acetyl))
        observed = outcome_label(kind, (tuple(obs.methyl), tuple(obs.acetyl), None))
        if not ok:
            name = alditol_acetate(residue).name  # same for every residue of this predicted value
            return Verdict(False, f"predicted {outcome_label(kind, predicted)} ({name}), observed {observed}")
        return Verdict(True)
    if kind == "smith_degradation":
        if obs.product == "none":
            ok = predicted.word == "none"
        else:
            ok = predicted.kind in ("polyol", "sugar") and predicted.matches(product_keys(obs.product))
        if not ok:
            return Verdict(False, f"predicted {predicted.word}, observed {obs.product}")
        return Verdict(True)
    if kind in ("anomer", "ring_form"):
        if predicted != obs.value:
            return Verdict(False, f"the residue is {predicted}, observed {obs.value}")
        return Verdict(True)
    observed_amounts = (obs.periodate, obs.formic_acid, obs.formaldehyde)
    # counts are exact; the reading removes beyond REMOVAL_K standard uncertainties (Contract 3)
    bound = REMOVAL_K * (obs.effective_sigma or 0.0)
    measured = [(p, o) for p, o in zip(predicted, observed_amounts, strict=True) if o is not None]
    if all(abs(p - o) <= bound + 1e-9 for p, o in measured):
        return Verdict(True)
    return Verdict(
        False, f"predicted {outcome_label(kind, predicted)}, observed {outcome_label(kind, observed_amounts)}"
    )


# ------------------------------------------------------------------ the polymer
def feasible_counts(amounts: tuple[float, ...], ranges: list[range], tolerance: float) -> list[tuple[int, ...]]:
    """Vectors of linked counts (one per residue type) that satisfy the branching balance."""
    total = sum(amounts)
    out = []
    for counts in itertools.product(*ranges):
        imbalance = sum(a * (n - 1) for a, n in zip(amounts, counts, strict=True))
        if abs(imbalance) <= tolerance * total + 1e-9:
            out.append(counts)
    return out


def balance_constraints(obs: Observation, scopes: dict[str, Any]) -> tuple[list[Binary], dict[str, Choices]]:
    """Binary constraints and the hidden variable of a ``molar_ratio`` observation (none without ``balance``)."""
    if not obs.balance:
        return [], {}
    ranges = []
    for member in obs.members:
        scope = scopes[member]
        top = scope.max_linked if isinstance(scope, ResidueScope) else 0
        ranges.append(range(0, top + 1))
    hidden = f"{AUXILIARY}balance:{obs.id}"
    vectors = Choices(feasible_counts(tuple(obs.amounts), ranges, obs.tolerance))
    out = []
    for i, member in enumerate(obs.members):
        out.append(Binary(hidden, member, _same_count(i), obs.id, _count_of_vector(i), _linked_count))
    return out, {hidden: vectors}


def _same_count(i: int) -> Callable[[Any, Any], bool]:
    def test(vector: Any, residue: Any) -> bool:
        return bool(vector[i] == len(residue.linked))

    return test


def _count_of_vector(i: int) -> Callable[[Any], tuple[int]]:
    def tokens(vector: Any) -> tuple[int]:
        return (vector[i],)

    return tokens


def _linked_count(residue: Any) -> tuple[int]:
    return (len(residue.linked),)


def residue_experiments(uid: str) -> list[tuple[str, str, dict[str, Any]]]:
    """(kind, title, fields) of every experiment the planner weighs for a residue unknown."""
    return [
        (
            "methylation_analysis",
            f"methylation analysis of the polymer: alditol acetate of {uid} (GC-MS)",
            {},
        ),
        ("periodate", f"periodate uptake and formic acid of the polymer, per {uid}", {"substrate": "residue"}),
        ("smith_degradation", f"Smith degradation of the polymer: fragment of {uid}", {}),
        ("anomer", f"anomeric configuration of {uid} (1H/13C NMR or a specific glycosidase)", {}),
        ("ring_form", f"ring size of {uid} (13C NMR of the polymer)", {}),
        ("carbon_count", f"carbons of the sugar of {uid} (after hydrolysis)", {}),
        ("series", f"D/L series of the sugar of {uid} (after hydrolysis)", {}),
    ]
