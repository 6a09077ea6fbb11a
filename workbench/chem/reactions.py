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
  primary alcohol) to the aldaric acid; a ketose is cleaved (no aldaric acid).
  A terminal CH3 (6-deoxy sugar) is not oxidised to a carboxyl, but the chain
  is attacked, and amino sugars are deaminated: both are doubtful, so they
  give :class:`Uncertain` (no prediction, kept and flagged).
- sodium borohydride reduces the carbonyl: one alditol from an aldose, the two
  C-2 epimeric alditols from a 2-ketose.
- phenylhydrazine (excess) converts C-1 and C-2 to the bis-phenylhydrazone
  (osazone), so sugars that differ only at C-1/C-2 give the same osazone;
  2-deoxy aldoses give only a phenylhydrazone.
- Kiliani-Fischer (HCN, then reduction) adds a carbon at C-1 and gives the two
  C-2 epimers; Ruff (H2O2/Fe3+ on the calcium aldonate) and Wohl (oxime,
  acetylation, loss of HCN) remove C-1 of an aldose with an OH at C-2.
- an aldonic acid closes to the 1,4-lactone (gamma, five-membered) when C-4
  carries OH and to the 1,5-lactone (delta, six-membered) when C-5 does; the
  gamma-lactone is the more stable at equilibrium, the delta-lactone is the
  first product of bromine-water oxidation of a pyranose (Isbell and Frush,
  1930s [from memory]).
- Fehling, Benedict and Tollens reagents are reduced by every free aldose
  and by 2-ketoses too: in the hot alkaline reagent a 2-ketose enolises
  (Lobry de Bruyn-Alberda van Ekenstein) to the 1,2-enediol, which is
  oxidised, so fructose is a reducing sugar even though bromine water (acid,
  no enolisation) leaves it unchanged. Glycosides and alditols are negative.
- the Seliwanoff test (resorcinol in hot HCl) turns cherry-red within about
  a minute for a 2-ketose that can dehydrate to a 2-furaldehyde
  (5-hydroxymethylfurfural from a hexulose, furfural from a pentulose);
  aldoses give colour only after long heating (isomerisation first).

Cautions for the bench (the cautions table is built elsewhere): nitric acid
is an oxidiser with NO2 fumes; bromine is fatal if inhaled; phenylhydrazine is
toxic and a suspected carcinogen; cyanide (Kiliani-Fischer) must be kept
alkaline in a hood; borohydride releases hydrogen with acid or water.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from typing import Literal

from rdkit import Chem

from workbench.chem.chain import LEFT, RIGHT, Chain
from workbench.chem.smiles import _write, canonical, is_achiral, mirror_smiles, quiet_rdkit, to_smiles
from workbench.errors import StructureError

__all__ = [
    "NotApplicable",
    "Uncertain",
    "Outcome",
    "Lactone",
    "bromine_water",
    "reducing_test",
    "ketose_test",
    "lactones",
    "aldonic_acid",
    "aldaric_acid",
    "alditols",
    "osazone",
    "extend",
    "extension_parent",
    "shorten",
    "relation",
    "relation_of_sets",
    "relation_to",
    "is_optically_active",
]


@dataclass(frozen=True)
class NotApplicable:
    """The experiment gives no such product; ``reason`` says why, in words."""

    reason: str

    def __bool__(self) -> Literal[False]:
        return False


@dataclass(frozen=True)
class Uncertain:
    """The chemistry is doubtful: no prediction is made; candidates are kept and flagged.

    ``reason`` reads "uncertain, because ..." and names the source of the
    doubt. Like :class:`NotApplicable` it is falsy (no product to compare),
    but the evidence layer maps it to "no prediction", never to "no product".
    """

    reason: str

    def __post_init__(self) -> None:
        if not self.reason.startswith("uncertain, because "):
            raise StructureError(f"an Uncertain reason must start 'uncertain, because ': {self.reason!r}")

    def __bool__(self) -> Literal[False]:
        return False


@dataclass(frozen=True)
class Outcome:
    """What a qualitative test shows (``result`` in the observation's words) and why."""

    result: str
    reason: str

    def __post_init__(self) -> None:
        if self.result not in _RESULT_WORDS:
            raise StructureError(f"test result {self.result!r} is not one of {', '.join(_RESULT_WORDS)}")


_RESULT_WORDS = ("positive", "negative", "oxidised", "unchanged")


@dataclass(frozen=True)
class Lactone:
    """An intramolecular ester of an aldonic acid: C-1 acylates O-``position``."""

    position: int  # 4 (gamma, five-membered ring) or 5 (delta, six-membered)
    smiles: str

    @property
    def ring(self) -> str:
        """``gamma`` for the 1,4-lactone, ``delta`` for the 1,5-lactone."""
        return {4: "gamma", 5: "delta"}[self.position]

    @property
    def label(self) -> str:
        """E.g. ``1,4-lactone (gamma)``."""
        return f"1,{self.position}-lactone ({self.ring})"


def bromine_water(chain: Chain) -> Outcome:
    """Bromine water (buffered, mildly acidic): aldoses oxidised, ketoses unchanged."""
    if chain.carbonyl == "aldose":
        return Outcome("oxidised", "the C-1 aldehyde is oxidised to the aldonic acid")
    if chain.carbonyl == "ketose":
        return Outcome("unchanged", "a ketose has no aldehyde, and in acid it does not enolise to one")
    return Outcome("unchanged", "no free aldehyde group")


def _bears_oxygen_or_nitrogen(chain: Chain, carbon: int) -> bool:
    return 1 <= carbon <= chain.carbons and chain.groups[carbon - 1] in ("CH2OH", "CHOH", "CHNH2")


def reducing_test(chain: Chain) -> Outcome:
    """Fehling, Benedict or Tollens test (hot alkaline Cu(II) or Ag(I)).

    Positive for every free aldose and for a 2-ketose with OH (or NH2) on a
    carbon next to the carbonyl: base-catalysed enolisation gives the
    enediol, which the reagent oxidises. This is why fructose is reducing.
    """
    if chain.carbonyl == "aldose":
        return Outcome("positive", "the free aldehyde reduces the reagent")
    if chain.carbonyl == "ketose":
        if _bears_oxygen_or_nitrogen(chain, 1) or _bears_oxygen_or_nitrogen(chain, 3):
            return Outcome(
                "positive",
                "the alpha-hydroxy ketone enolises in the hot alkaline reagent to an enediol, which is oxidised",
            )
        return Outcome("negative", "no OH next to the ketone, so no enediol can form")
    return Outcome("negative", "no free carbonyl group (glycoside or alditol)")


def ketose_test(chain: Chain) -> Outcome:
    """Seliwanoff test (resorcinol, hot HCl): fast red colour for a 2-ketose.

    Positive when the ketose can dehydrate to a 2-furaldehyde: C-1 a CH2OH
    (it becomes the aldehyde), OH at C-3 and C-4 (lost as water) and at C-5
    (the furan oxygen). Aldoses react only on prolonged heating: negative.
    """
    if chain.carbonyl != "ketose":
        why = "an aldose dehydrates only slowly (faint colour after long heating)" if chain.carbonyl else "no carbonyl"
        return Outcome("negative", why)
    if chain.carbons < 5:
        return Outcome("negative", f"a {chain.carbons}-carbon ketose is too short to close a furan ring")
    needs = {1: ("CH2OH",), 3: ("CHOH",), 4: ("CHOH",), 5: ("CHOH", "CH2OH")}
    missing = [k for k, ok in needs.items() if chain.groups[k - 1] not in ok]
    if missing:
        where = ", ".join(f"C-{k}" for k in missing)
        return Outcome("negative", f"no OH at {where}, so no 2-furaldehyde can form")
    product = "furfural" if chain.carbons == 5 else "a 5-(hydroxyalkyl)furfural"
    return Outcome("positive", f"the ketose dehydrates quickly to {product}, which gives the red resorcinol dye")


def aldonic_acid(chain: Chain) -> Chain | NotApplicable:
    """Bromine-water product: C-1 aldehyde to carboxylic acid."""
    if chain.carbonyl != "aldose":
        return NotApplicable("a ketose has no aldehyde for bromine water to oxidise")
    return chain.replace(1, "COOH")


def _lactone_smiles(acid: Chain, position: int) -> str:
    """Close the ester ring from C-1 of ``acid`` onto O-``position``."""
    with quiet_rdkit():
        mol = Chem.MolFromSmiles(_write(acid, None))  # atoms in writing order, C-1 first
    c1 = next(a.GetIdx() for a in mol.GetAtoms() if a.GetSymbol() == "C")
    order = [c1]
    while len(order) < position:
        nxt = [n.GetIdx() for n in mol.GetAtomWithIdx(order[-1]).GetNeighbors() if n.GetSymbol() == "C"]
        order.append(next(i for i in nxt if i not in order))

    def free_oxygen(idx: int, order_: float) -> int:
        atom = mol.GetAtomWithIdx(idx)
        return next(
            n.GetIdx()
            for n in atom.GetNeighbors()
            if n.GetSymbol() == "O"
            and n.GetDegree() == 1
            and mol.GetBondBetweenAtoms(idx, n.GetIdx()).GetBondTypeAsDouble() == order_
        )

    rw = Chem.RWMol(mol)
    rw.AddBond(c1, free_oxygen(order[-1], 1.0), Chem.BondType.SINGLE)
    rw.RemoveAtom(free_oxygen(c1, 1.0))
    out = rw.GetMol()
    Chem.SanitizeMol(out)
    return canonical(Chem.MolToSmiles(out))


def lactones(chain: Chain) -> tuple[Lactone, ...] | NotApplicable:
    """The lactones the aldonic acid of ``chain`` can form (1,4 gamma and/or 1,5 delta).

    A ring needs a free OH on C-4 (gamma) or C-5 (delta); deoxy or amino at
    that carbon rules it out (an amine would give a lactam instead).
    """
    acid = aldonic_acid(chain)
    if isinstance(acid, NotApplicable):
        return acid
    out = tuple(
        Lactone(k, _lactone_smiles(acid, k))
        for k in (4, 5)
        if k <= acid.carbons and acid.groups[k - 1] in ("CHOH", "CH2OH")
    )
    if not out:
        return NotApplicable("no OH at C-4 or C-5, so the aldonic acid cannot close a gamma or delta lactone")
    return out


def aldaric_acid(chain: Chain) -> Chain | NotApplicable | Uncertain:
    """Nitric-acid product: both chain ends to carboxylic acids."""
    if chain.is_alditol:
        return NotApplicable("an alditol: nitric acid on alditols is not predicted here")
    if chain.carbonyl != "aldose":
        return NotApplicable("nitric acid cleaves a ketose's chain next to the carbonyl; no aldaric acid forms")
    if chain.amino_positions or chain.acetamido_positions:
        return Uncertain(
            "uncertain, because nitrous species in nitric acid deaminate amino sugars (glucosamine gives a "
            "2,5-anhydro diacid [from memory]), and hot acid frees an N-acetyl amine first; no diacid is predicted"
        )
    last = chain.groups[-1]
    if last == "CH3":
        return Uncertain(
            "uncertain, because the terminal CH3 is not oxidised to a carboxyl, yet nitric acid attacks the "
            "chain of a methyl sugar (L-rhamnose gives a trihydroxyglutaric acid [from memory]); which diacid "
            "forms, and whether it is optically active, is not predicted"
        )
    if last not in ("CH2OH", "COOH"):
        return NotApplicable(f"the terminal {last} cannot become a carboxylic acid")
    out = chain.replace(1, "COOH")
    return out.replace(chain.carbons, "COOH")


def _is_reduced(chain: Chain) -> bool:
    """No group that borohydride reduces or that marks a product of another reaction (a polyol)."""
    return chain.carbonyl is None and not set(chain.groups) & {"CHO", "CO", "COOH", "CHNNPh", "CNNPh"}


def alditols(chain: Chain) -> tuple[Chain, ...] | NotApplicable:
    """Borohydride products: the alditol of an aldose, the two C-2 epimers of a ketose.

    An alditol is left unchanged, so it stands for itself (a relation member
    named ``D-glucitol`` compares with the alditols of the unknowns); so does a
    deoxy or otherwise modified alditol such as L-rhamnitol (no carbonyl,
    carboxyl or hydrazone left to reduce).
    """
    if chain.is_alditol or _is_reduced(chain):
        return (chain,)
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


def osazone(chain: Chain) -> Chain | NotApplicable | Uncertain:
    """Phenylosazone: C-1 and C-2 as phenylhydrazones.

    A 2-O-methyl aldose gives the parent sugar's osazone with loss of
    methanol (classical methylation work [from memory]); a 2-amino aldose
    gives the parent's osazone (D-glucosamine gives D-glucosazone [common
    practice]). For a 2-acetamido aldose no prediction is made.
    """
    if chain.carbonyl == "aldose" and chain.groups[1] == "CHOMe":
        return osazone(chain.replace(2, "CHOH", chain.sides[1]))
    if chain.carbonyl == "aldose" and chain.groups[1] == "CHNHAc":
        return Uncertain(
            "uncertain, because an N-acetyl group at C-2 must be lost (as acetamide) before the osazone can form; "
            "whether the parent's osazone forms under the usual conditions is not predicted [from memory]"
        )
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


def extension_parent(chain: Chain) -> Chain | None:
    """The aldose that Kiliani-Fischer extension turns into ``chain`` (C-1 removed, structurally)."""
    if chain.carbonyl != "aldose" or chain.groups[1] != "CHOH" or chain.carbons < 4:
        return None
    return Chain(("CHO",) + chain.groups[2:], (None,) + chain.sides[2:])


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


def shorten(chain: Chain) -> Chain | NotApplicable | Uncertain:
    """Ruff or Wohl degradation: lose C-1; C-2 becomes the new aldehyde.

    A uronic acid is not predicted: after bromine water both chain ends are
    alpha-hydroxy acids, so Ruff's oxidative decarboxylation may act at either
    end, and the Wohl sequence meets a free carboxyl.
    """
    if chain.carbonyl != "aldose":
        return NotApplicable("Ruff and Wohl degradations start from an aldose")
    if chain.is_uronic:
        return Uncertain(
            "uncertain, because after bromine water both ends of a uronic acid are alpha-hydroxy acids, so "
            "Ruff's decarboxylation may remove either end carbon (from memory); the product is not predicted"
        )
    if chain.groups[1] != "CHOH":
        return NotApplicable("C-2 carries no OH, so no new aldehyde can form")
    if chain.carbons < 4:
        return NotApplicable("the product would be glycolaldehyde, outside the catalogue")
    return Chain(("CHO",) + chain.groups[2:], (None,) + chain.sides[2:])


def is_optically_active(products: Chain | tuple[Chain, ...]) -> bool:
    """True when the product (mixture) rotates plane-polarised light.

    One product: active unless it is superimposable on its mirror image
    (meso or achiral). Two products (the C-2 epimeric alditols of a ketose):
    active if either is, except when the two are each other's mirror image;
    that happens only for a ketose with no stereocentre (e.g. 1-deoxy
    glycerone), whose achiral carbonyl is attacked equally from both faces,
    giving a racemate [common practice].
    """
    items = products if isinstance(products, tuple) else (products,)
    found = {to_smiles(p) for p in items}
    if len(found) > 1 and {mirror_smiles(s) for s in found} == found:
        return False
    return any(not is_achiral(s) for s in found)


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
        return "identical"  # the common case, and no mirror image needed
    return relation_to(b)(a)


def relation_to(b: frozenset[str]) -> Callable[[frozenset[str]], str]:
    """:func:`relation_of_sets` of many product sets ``a`` against one ``b`` (its mirror images found once)."""
    mirrored = frozenset(mirror_smiles(x) for x in b)

    def relation(a: frozenset[str]) -> str:
        if a & b:
            return "identical"
        if a & mirrored:
            return "enantiomeric"
        return "different"

    return relation
