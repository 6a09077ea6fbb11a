"""The closest rivals of each unknown's answer, and the share of belief each survivor holds.

A rival is a candidate an author must argue away: a survivor that ranks
below the leading one, or an eliminated candidate that lasted longest in the
trail (removed by the latest observations). Among candidates removed by the
same observation, those nearest the leading survivor in structure come first
(the same constitution, fewest stereocentres inverted: its epimers).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

from workbench.chem.chain import Chain

__all__ = ["Rival", "closest_rivals", "survivor_probabilities"]


@dataclass(frozen=True)
class Rival:
    """One rival of an unknown's answer.

    ``removed_by`` is the id of the observation that eliminated it (empty for
    a survivor), ``step`` its index in the trail (the trail's length for a
    survivor), ``reason`` why it was removed, ``probability`` its share of
    belief (survivors only, else ``None``), ``inverted`` the carbons (numbered
    from C-1) whose configuration differs from the leading survivor's, or
    ``None`` for another constitution or when nothing survives.
    """

    chain: Any  # a Chain, or a glycan Residue (Contract 5)
    removed_by: str
    step: int
    reason: str
    probability: float | None
    inverted: tuple[int, ...] | None = None

    @property
    def survives(self) -> bool:
        """True for a survivor that ranks below the leading one."""
        return not self.removed_by


def survivor_probabilities(solution, uid: str) -> dict[Chain, float]:
    """Each survivor of ``uid`` with its probability (they sum to 1; empty when nothing survives).

    The posterior of the solution (``solution.probabilities``, Contract 3).
    Where the engine gives none (contradictory evidence leaves no posterior),
    a uniform share over the survivors: every survivor fits every applied
    observation, so without weights none is preferred.
    """
    survivors = solution.survivors[uid]
    if not survivors:
        return {}
    given = solution.probabilities.get(uid)
    if given:
        return {c: float(given.get(c, 0.0)) for c in survivors}
    share = 1.0 / len(survivors)
    return {c: share for c in survivors}


def _distance(a: Any, b: Any) -> int:
    """Stereocentres that differ between two chains of one constitution; large for another constitution.

    A glycan residue (Contract 5) adds one for another ring size, one for the
    other anomer and one per linked position not shared.
    """
    if b is None:
        return 0
    if not isinstance(a, Chain) or not isinstance(b, Chain):
        if isinstance(a, Chain) or isinstance(b, Chain):
            return 1000
        extra = (a.ring != b.ring) + (a.anomer != b.anomer) + len(set(a.linked) ^ set(b.linked))
        return _distance(a.chain, b.chain) + extra
    if a.groups != b.groups:
        return 100 + sum(x != y for x, y in zip(a.groups, b.groups, strict=False)) + abs(len(a.groups) - len(b.groups))
    return sum(x != y for x, y in zip(a.sides, b.sides, strict=True))


def _inverted(a: Any, b: Any) -> tuple[int, ...] | None:
    """Carbons (1-based) whose configuration differs between chains of one constitution (not residues)."""
    if not isinstance(a, Chain) or not isinstance(b, Chain) or a.groups != b.groups:
        return None
    return tuple(i + 1 for i, (x, y) in enumerate(zip(a.sides, b.sides, strict=True)) if x != y)


def closest_rivals(solution, uid: str, limit: int = 6) -> tuple[Rival, ...]:
    """Up to ``limit`` rivals of ``uid``'s leading survivor, closest first.

    First the other survivors by probability (highest first), then the
    eliminated candidates, latest removed first; ties go to the candidate
    nearest the leading survivor in structure.
    """
    probabilities = survivor_probabilities(solution, uid)
    ranked = sorted(probabilities, key=lambda c: -probabilities[c])
    leader = ranked[0] if ranked else None
    end = len(solution.trail)
    out = [Rival(c, "", end, "", probabilities[c], _inverted(c, leader)) for c in ranked[1:]]
    removed: list[tuple[int, int, int, Rival]] = []
    order = 0
    for index, step in enumerate(solution.trail):
        reasons = step.reasons.get(uid, {})
        for chain in step.eliminated.get(uid, ()):
            rival = Rival(chain, step.observation, index, reasons.get(chain, ""), None, _inverted(chain, leader))
            removed.append((-index, _distance(chain, leader), order, rival))
            order += 1
    out += [r for *_, r in sorted(removed, key=lambda item: item[:3])]
    return tuple(out[:limit])
