"""Degradations and derivatisations as functions from a chain to product chains.

Each function applies a reaction rule to the structure (which carbons change
group) and returns the product chain(s), or a :class:`NotApplicable` that says
why the experiment gives no such product. Identity of products is decided by
canonical isomeric SMILES (RDKit); optical inactivity by comparing a product
with its mirror image (:func:`workbench.chem.smiles.is_achiral`).

Textbook rules (Collins and Ferrier, *Monosaccharides*, 1995; Carey,
*Organic Chemistry*, ch. 25 [from memory]):

- bromine water oxidises the aldehyde of an aldose to the aldonic acid;
  ketoses are not oxidised.
- warm dilute nitric acid oxidises both chain ends of an aldose (aldehyde and
  primary alcohol) to the aldaric acid; a ketose is cleaved (no aldaric acid)
  and a terminal CH3 (6-deoxy sugar) is not oxidised to a carboxyl.
- sodium borohydride reduces the carbonyl: one alditol from an aldose, the two
  C-2 epimeric alditols from a 2-ketose.
- phenylhydrazine (excess) converts C-1 and C-2 to the bis-phenylhydrazone
  (osazone), so sugars that differ only at C-1/C-2 give the same osazone;
  2-deoxy aldoses give only a phenylhydrazone.
- Kiliani-Fischer (HCN, then reduction) adds a carbon at C-1 and gives the two
  C-2 epimers; Ruff (H2O2/Fe3+ on the calcium aldonate) and Wohl (oxime,
  acetylation, loss of HCN) remove C-1 of an aldose with an OH at C-2.
"""

from __future__ import annotations

from dataclasses import dataclass

from workbench.chem.chain import LEFT, RIGHT, Chain
from workbench.chem.smiles import canonical, is_achiral, mirror_smiles, to_smiles

__all__ = [
    "NotApplicable",
    "aldonic_acid",
    "aldaric_acid",
    "alditols",
    "osazone",
    "extend",
    "shorten",
    "relation",
    "relation_of_sets",
    "is_optically_active",
]


@dataclass(frozen=True)
class NotApplicable:
    """The experiment gives no such product; ``reason`` says why, in words."""

    reason: str

    def __bool__(self) -> bool:
        return False


def aldonic_acid(chain: Chain) -> Chain | NotApplicable:
    """Bromine-water product: C-1 aldehyde to carboxylic acid."""
    if chain.carbonyl != "aldose":
        return NotApplicable("a ketose has no aldehyde for bromine water to oxidise")
    return chain.replace(1, "COOH")


def aldaric_acid(chain: Chain) -> Chain | NotApplicable:
    """Nitric-acid product: both chain ends to carboxylic acids."""
    if chain.carbonyl != "aldose":
        return NotApplicable("nitric acid cleaves a ketose; no aldaric acid forms")
    last = chain.groups[-1]
    if last == "CH3":
        return NotApplicable("the terminal CH3 of a deoxy sugar is not oxidised; no diacid forms")
    if last not in ("CH2OH", "COOH"):
        return NotApplicable(f"the terminal {last} cannot become a carboxylic acid")
    out = chain.replace(1, "COOH")
    return out.replace(chain.carbons, "COOH")


def alditols(chain: Chain) -> tuple[Chain, ...] | NotApplicable:
    """Borohydride products: the alditol of an aldose, the two C-2 epimers of a ketose."""
    if chain.carbonyl == "aldose":
        return (chain.replace(1, "CH2OH"),)
    if chain.carbonyl == "ketose":
        if chain.carbons < 3:
            return NotApplicable("chain too short")
        right = chain.replace(2, "CHOH", RIGHT)
        left = chain.replace(2, "CHOH", LEFT)
        if to_smiles(right) == to_smiles(left):
            return (right,)
        return (right, left)
    return NotApplicable("no carbonyl group to reduce")


def osazone(chain: Chain) -> Chain | NotApplicable:
    """Phenylosazone: C-1 and C-2 as phenylhydrazones."""
    if chain.carbonyl == "aldose":
        if chain.groups[1] not in ("CHOH", "CHNH2"):
            return NotApplicable("C-2 carries no OH or NH2; only a phenylhydrazone forms")
    elif chain.carbonyl == "ketose":
        if chain.groups[0] != "CH2OH":
            return NotApplicable("C-1 carries no OH; only a phenylhydrazone forms")
    else:
        return NotApplicable("no free carbonyl group")
    out = chain.replace(1, "CHNNPh")
    return out.replace(2, "CNNPh")


def extend(chain: Chain) -> tuple[Chain, Chain] | NotApplicable:
    """Kiliani-Fischer chain extension: the two C-2 epimers one carbon longer."""
    if chain.carbonyl != "aldose":
        return NotApplicable("Kiliani-Fischer on a ketose gives a branched 2-C-(hydroxymethyl) acid, not an aldose")
    if chain.carbons >= 9:
        return NotApplicable("products longer than 9 carbons are outside the catalogue")
    groups = ("CHO", "CHOH") + chain.groups[1:]
    right = Chain(groups, (None, RIGHT) + chain.sides[1:])
    left = Chain(groups, (None, LEFT) + chain.sides[1:])
    return (right, left)


def shorten(chain: Chain) -> Chain | NotApplicable:
    """Ruff or Wohl degradation: lose C-1; C-2 becomes the new aldehyde."""
    if chain.carbonyl != "aldose":
        return NotApplicable("Ruff and Wohl degradations start from an aldose")
    if chain.groups[1] != "CHOH":
        return NotApplicable("C-2 carries no OH, so no new aldehyde can form")
    if chain.carbons < 4:
        return NotApplicable("the product would be glycolaldehyde, outside the catalogue")
    return Chain(("CHO",) + chain.groups[2:], (None,) + chain.sides[2:])


def is_optically_active(products: Chain | tuple[Chain, ...]) -> bool:
    """True when any product differs from its mirror image."""
    items = products if isinstance(products, tuple) else (products,)
    return any(not is_achiral(to_smiles(p)) for p in items)


def relation(smiles_a: str, smiles_b: str) -> str:
    """``identical``, ``enantiomeric`` or ``different`` for two structures."""
    a, b = canonical(smiles_a), canonical(smiles_b)
    if a == b:
        return "identical"
    if a == mirror_smiles(b):
        return "enantiomeric"
    return "different"


def relation_of_sets(a: frozenset[str], b: frozenset[str]) -> str:
    """Relation between two product sets (a ketose gives two alditols).

    ``identical`` when the sets share a product; ``enantiomeric`` when a
    product of one is the mirror image of a product of the other (and none is
    shared); otherwise ``different``. Members are canonical SMILES.
    """
    if a & b:
        return "identical"
    if {mirror_smiles(x) for x in a} & b:
        return "enantiomeric"
    return "different"
