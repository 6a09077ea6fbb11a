"""The conventional order of stereoisomers: the order of the Fischer family tree of the aldoses.

Chemists list the D-aldohexoses as allose, altrose, glucose, mannose, gulose,
idose, galactose, talose (and the pentoses ribose, arabinose, xylose, lyxose;
the 2-ketohexoses psicose, fructose, sorbose, tagatose) [common practice: the
Fischer-Rosanoff family tree]. In that order the configuration at the carbon
next to the carbonyl alternates fastest: read on the D-form, each stereocentre
below the reference atom counts as a binary digit (hydroxyl right 0, left 1),
the first stereocentre the least significant. An L-sugar takes the place of
its D-enantiomer among the L-sugars, which follow the D-sugars of the same constitution.
"""

from __future__ import annotations

from collections.abc import Iterable

from workbench.chem.chain import LEFT, Chain

__all__ = ["configurational_key", "in_configurational_order"]

_CARBONYL_RANK = {"aldose": 0, "ketose": 1, None: 2}


def configurational_key(chain: Chain) -> tuple:
    """Sort key: constitution (chain length, carbonyl, groups), then series (D first), then the family-tree index."""
    series = chain.series
    d_form = chain.mirror() if series == "L" else chain
    centres = d_form.stereocentres[:-1]  # the last one is the configurational (reference) atom
    index = sum(1 << k for k, carbon in enumerate(centres) if d_form.sides[carbon - 1] == LEFT)
    return (chain.carbons, _CARBONYL_RANK.get(chain.carbonyl, 2), chain.groups, 0 if series != "L" else 1, index)


def in_configurational_order(chains: Iterable[Chain]) -> list[Chain]:
    """``chains`` sorted in the conventional order (all, alt, glc, man, gul, ido, gal, tal for aldohexoses).

    Candidates that are not chains (glycan residues) keep the order they came in.
    """
    items = list(chains)
    if not all(isinstance(c, Chain) for c in items):
        return items
    return sorted(items, key=configurational_key)
