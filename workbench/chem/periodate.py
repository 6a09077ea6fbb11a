"""Periodate (Malaprade) oxidation and the Smith degradation on RDKit molecules.

The rule is applied to the molecule itself, so it holds for any polyol-type
structure (open-chain sugars, alditols, methyl glycosides, glycerol, ethylene
glycol, amino, deoxy and uronic variants):

1. A carbon is *active* when it carries a free OH, NH2 or =O (a C-O or C-N
   bond to a heteroatom with no other heavy neighbour) and is no more
   oxidised than an aldehyde, counting ether oxygens too (so alcohols,
   hemiacetal carbons, aldehydes and ketones are active; carboxylic acids,
   esters and fully etherified carbons such as a glycosidic C-1 are not).
2. Every single C-C bond between two active carbons is cleaved at once,
   one IO4- per bond: vicinal diols, alpha-hydroxy and alpha-amino carbonyls,
   alpha-amino alcohols and 1,2-dicarbonyls (Malaprade 1928; Jackson, *Org.
   React.* 2, 341, 1944 [from memory]).
3. Each cleaved carbon gains one bond to oxygen per cleaved bond, keeping its
   hydrogens: CH2OH -> HCHO, CH(OH) cleaved twice -> HCOOH, CHO cleaved once
   -> HCOOH, a ketone cleaved twice -> CO2. A cleaved C-NH2 ends as C=O and
   ammonia (the imine hydrolyses).

Conventions as carbohydrate chemists count them (state them when comparing
with a measurement):

- The free sugar is computed on its open chain. The ring form reacts in
  practice: C-1 of a pyranose leaves as a formyl ester of O-5, which
  hydrolyses in the aqueous medium and frees O-5 for further cleavage; such
  formyl esters are counted as formic acid once hydrolysed, and the totals
  then equal the open-chain totals (:func:`oxidise` with
  ``hydrolyse_formates=True`` does this step by step).
- A carbon cleaved on both sides in one pass is counted at its final level
  (the 2-ketose C-2 as CO2), as the textbook stoichiometries do.
- alpha-Hydroxy acids (aldonic acids, the C-5/C-6 of a uronic acid) are
  oxidised only slowly and are not cleaved: a uronic acid's last two carbons
  leave as glyoxylic acid. Over-oxidation of formic acid and of the active
  methylene of malondialdehyde-type fragments (2-deoxy sugars) is not counted.
- Quantities are mol per mol of substrate; a ketose's two epimeric alditols
  have the same constitution, so the same counts.

Caution for the bench: sodium periodate is a strong oxidiser (H271); excess
periodate is destroyed with ethylene glycol before work-up.
"""

from __future__ import annotations

import logging
from collections import Counter
from dataclasses import dataclass
from functools import lru_cache

from rdkit import Chem
from rdkit.Chem import rdCIPLabeler

from workbench.chem.chain import Chain
from workbench.chem.reactions import NotApplicable, alditols
from workbench.chem.smiles import RingForm, _mol_from, canonical, is_achiral, quiet_rdkit, to_smiles
from workbench.errors import ObservationError, StructureError

__all__ = [
    "SUBSTRATES",
    "Fragment",
    "PeriodateResult",
    "SmithResult",
    "oxidise",
    "periodate_oxidation",
    "smith",
    "smith_degradation",
    "substrate_smiles",
]

logger = logging.getLogger(__name__)

SUBSTRATES = ("free", "alditol", "methyl_pyranoside", "methyl_furanoside")

# Names of the small fragments, keyed by SMILES without stereo. A pair gives
# (name when achiral or meso, name when chiral).
_NAMES: dict[str, tuple[str, str]] = {
    "O=CO": ("formic acid", ""),
    "C=O": ("formaldehyde", ""),
    "O=C=O": ("carbon dioxide", ""),
    "N": ("ammonia", ""),
    "CO": ("methanol", ""),
    "CCO": ("ethanol", ""),
    "CC=O": ("acetaldehyde", ""),
    "CC(=O)O": ("acetic acid", ""),
    "O=CC(=O)O": ("glyoxylic acid", ""),
    "O=C(O)C(=O)O": ("oxalic acid", ""),
    "O=CC=O": ("glyoxal", ""),
    "O=CCO": ("glycolaldehyde", ""),
    "O=C(O)CO": ("glycolic acid", ""),
    "OCCO": ("ethylene glycol", ""),
    "OCC(O)CO": ("glycerol", ""),
    "OCCCO": ("propane-1,3-diol", ""),
    "O=CCC=O": ("malondialdehyde", ""),
    "O=CCCO": ("3-hydroxypropanal", ""),
    "CC(O)CO": ("propane-1,2-diol", "propane-1,2-diol"),
    "CC(O)C=O": ("lactaldehyde", "lactaldehyde"),
    "O=CC(O)CO": ("glyceraldehyde", "glyceraldehyde"),
    "O=C(CO)CO": ("dihydroxyacetone", ""),
    "O=C(O)C(O)CO": ("glyceric acid", "glyceric acid"),
    "OCC(O)C(O)CO": ("erythritol", "threitol"),
    "CC(O)C(O)CO": ("butane-1,2,3-triol", "butane-1,2,3-triol"),
}
_FORMIC, _FORMALDEHYDE, _CO2 = "O=CO", "C=O", "O=C=O"


@dataclass(frozen=True)
class Fragment:
    """One product of a degradation: canonical isomeric SMILES and mol per mol substrate."""

    smiles: str
    count: int
    carbons: int
    name: str | None = None

    def __post_init__(self) -> None:
        if self.count < 1:
            raise StructureError(f"fragment {self.smiles}: count must be at least 1, got {self.count}")

    @property
    def label(self) -> str:
        """The name where there is one, else the SMILES."""
        return self.name or self.smiles


@dataclass(frozen=True)
class PeriodateResult:
    """Outcome of exhaustive periodate oxidation, mol per mol of substrate.

    ``periodate`` is the IO4- consumed (one per cleaved C-C bond, over every
    pass); ``formic_acid``, ``formaldehyde`` and ``co2`` are the classical
    titration/assay products; ``other`` holds every further fragment
    (acetaldehyde, glyoxylic acid, ammonia, the dialdehyde of a glycoside...)
    with its count. ``carbons_in``/``carbons_out`` are the carbon balance: C
    atoms in one substrate molecule and in all its products.
    """

    substrate: str
    smiles: str
    periodate: int
    formic_acid: int
    formaldehyde: int
    co2: int
    other: tuple[Fragment, ...]
    carbons_in: int
    carbons_out: int

    def __post_init__(self) -> None:
        for field in ("periodate", "formic_acid", "formaldehyde", "co2"):
            if getattr(self, field) < 0:
                raise StructureError(f"periodate result: {field} cannot be negative")

    @property
    def balanced(self) -> bool:
        """True when the products hold every carbon of the substrate."""
        return self.carbons_in == self.carbons_out

    def counts(self) -> dict[str, int]:
        """The four observable quantities keyed as in the ``periodate`` observation."""
        return {
            "periodate": self.periodate,
            "formic_acid": self.formic_acid,
            "formaldehyde": self.formaldehyde,
            "co2": self.co2,
        }

    def amount(self, smiles_or_name: str) -> int:
        """mol per mol of one product, looked up by name or SMILES (0 if absent)."""
        total = {"formic acid": self.formic_acid, "formaldehyde": self.formaldehyde, "carbon dioxide": self.co2}
        if smiles_or_name in total:
            return total[smiles_or_name]
        for frag in self.other:
            if smiles_or_name in (frag.name, frag.smiles):
                return frag.count
        return 0


@dataclass(frozen=True)
class SmithResult:
    """Products of the Smith degradation (periodate, borohydride, mild acid).

    ``products`` are the fragments after reduction and hydrolysis of the
    acyclic acetals, mol per mol of glycoside (methanol from the aglycone
    included); ``periodate`` the IO4- consumed in the first step.
    """

    substrate: str
    smiles: str
    periodate: int
    products: tuple[Fragment, ...]

    @property
    def names(self) -> tuple[str, ...]:
        """Product labels, largest first."""
        return tuple(f.label for f in self.products)


# --------------------------------------------------------------- molecule rules
def _free_heteroatoms(atom: Chem.Atom) -> tuple[int, list[int], int]:
    """(bond order to free O/N, indices of those atoms, ether-type O/N bonds)."""
    level, free, ethers = 0, [], 0
    for bond in atom.GetBonds():
        other = bond.GetOtherAtom(atom)
        if other.GetSymbol() not in ("O", "N"):
            continue
        if other.GetDegree() == 1:
            level += int(bond.GetBondTypeAsDouble())
            free.append(other.GetIdx())
        else:
            ethers += 1
    return level, free, ethers


# Rule 1 as SMARTS, run inside RDKit: a carbon bonded to a free O/N (no other
# heavy neighbour), with at most two bonds to heteroatoms in all, counting a
# double bond twice (the same bookkeeping as :func:`_free_heteroatoms`).
_ACTIVE = "[#6;$([#6]-,=[O,N;D1]);!$([#6](~[O,N])(~[O,N])~[O,N]);!$([#6](=[O,N])~[O,N]);!$([#6](=[O,N])=[O,N])]"
_CLEAVABLE = Chem.MolFromSmarts(f"{_ACTIVE}-{_ACTIVE}")
_CARBON = Chem.MolFromSmarts("[#6]")


def _cleavable(mol: Chem.Mol) -> list[tuple[int, int]]:
    """Single C-C bonds whose two carbons are both active."""
    return [(i, j) for i, j in mol.GetSubstructMatches(_CLEAVABLE, uniquify=True, maxMatches=10_000)]


def _set_level(rw: Chem.RWMol, idx: int, level: int, drop: list[int]) -> None:
    """Give carbon ``idx`` ``level`` bonds to fresh oxygens (as =O, then OH)."""
    atom = rw.GetAtomWithIdx(idx)
    atom.SetChiralTag(Chem.ChiralType.CHI_UNSPECIFIED)
    atom.SetNoImplicit(False)
    atom.SetNumExplicitHs(0)
    _, free, _ = _free_heteroatoms(atom)
    drop.extend(free)
    doubles, singles = divmod(level, 2)
    for order, n in ((Chem.BondType.DOUBLE, doubles), (Chem.BondType.SINGLE, singles)):
        for _ in range(n):
            o = rw.AddAtom(Chem.Atom(8))
            rw.AddBond(idx, o, order)


def _finish(rw: Chem.RWMol, drop: list[int]) -> Chem.Mol:
    for idx in sorted(set(drop), reverse=True):
        rw.RemoveAtom(idx)
    mol = rw.GetMol()
    with quiet_rdkit():
        Chem.SanitizeMol(mol)
    return mol


def _cleave(mol: Chem.Mol, bonds: list[tuple[int, int]]) -> tuple[Chem.Mol, int]:
    """Cleave ``bonds`` at once (rule 3); returns the product and NH3 released."""
    rw = Chem.RWMol(mol)
    broken: Counter[int] = Counter()
    for i, j in bonds:
        rw.RemoveBond(i, j)
        broken[i] += 1
        broken[j] += 1
    drop: list[int] = []
    ammonia = 0
    for idx, n in broken.items():
        level, free, _ = _free_heteroatoms(rw.GetAtomWithIdx(idx))
        ammonia += sum(1 for f in free if rw.GetAtomWithIdx(f).GetSymbol() == "N")
        _set_level(rw, idx, level + n, drop)
    return _finish(rw, drop), ammonia


_FORMYL_ESTER = Chem.MolFromSmarts("[CX3H1](=O)-[OX2]-[#6]")


def _hydrolyse_formates(mol: Chem.Mol) -> tuple[Chem.Mol, int]:
    """Split every formyl ester H-C(=O)-O-R to HCOOH + HO-R; returns (mol, esters)."""
    matches = mol.GetSubstructMatches(_FORMYL_ESTER)
    if not matches:
        return mol, 0
    rw = Chem.RWMol(mol)
    for c, _, o, _ in matches:
        rw.RemoveBond(c, o)
        new = rw.AddAtom(Chem.Atom(8))
        rw.AddBond(c, new, Chem.BondType.SINGLE)
        rw.GetAtomWithIdx(o).SetNoImplicit(False)
    return _finish(rw, []), len(matches)


def _carbons(mol: Chem.Mol) -> int:
    return len(mol.GetSubstructMatches(_CARBON, maxMatches=100_000))


def _locants(mol: Chem.Mol) -> dict[int, int]:
    """Carbon atom index -> locant along an unbranched chain (IUPAC-style).

    Numbered from the end that gives the carbonyl carbons, then the
    oxygen-bearing carbons, the lowest locants; empty if branched or cyclic.
    """
    carbons = [a for a in mol.GetAtoms() if a.GetSymbol() == "C"]
    if not carbons or mol.GetRingInfo().NumRings():
        return {}
    ends = [a for a in carbons if sum(n.GetSymbol() == "C" for n in a.GetNeighbors()) <= 1]
    if len(ends) != 2 and len(carbons) > 1:
        return {}
    order = [ends[0].GetIdx()] if ends else [carbons[0].GetIdx()]
    while len(order) < len(carbons):
        nxt = [n.GetIdx() for n in mol.GetAtomWithIdx(order[-1]).GetNeighbors() if n.GetSymbol() == "C"]
        nxt = [i for i in nxt if i not in order]
        if len(nxt) != 1:
            return {}
        order.append(nxt[0])

    def score(path: list[int]) -> tuple[list[int], list[int]]:
        carbonyl, oxygenated = [], []
        for k, idx in enumerate(path, 1):
            level, _, ethers = _free_heteroatoms(mol.GetAtomWithIdx(idx))
            if level >= 2:
                carbonyl.append(k)
            if level or ethers:
                oxygenated.append(k)
        return carbonyl, oxygenated

    best = min((order, order[::-1]), key=score)
    return {idx: k for k, idx in enumerate(best, 1)}


def _name(mol: Chem.Mol, smiles: str) -> str | None:
    """Trivial name of a small fragment, with located CIP labels when it is chiral."""
    flat = Chem.MolToSmiles(mol, isomericSmiles=False)
    names = _NAMES.get(flat)
    if names is None:
        return None
    if is_achiral(smiles):
        return names[0]
    labelled = Chem.Mol(mol)
    rdCIPLabeler.AssignCIPLabels(labelled)
    where = _locants(labelled)
    labels = sorted(
        (where.get(a.GetIdx(), 0), a.GetProp("_CIPCode")) for a in labelled.GetAtoms() if a.HasProp("_CIPCode")
    )
    text = ",".join(f"{k or ''}{cip}" for k, cip in labels)
    return f"({text})-{names[1]}" if labels else names[1]


def _fragments(mol: Chem.Mol, ammonia: int) -> Counter[str]:
    out: Counter[str] = Counter()
    for piece in Chem.MolToSmiles(mol).split("."):
        out[canonical(piece)] += 1  # re-read: drops tags on centres that are no longer stereogenic
    if ammonia:
        out["N"] += ammonia
    out.pop("O", None)  # water is not a product worth listing
    return out


@lru_cache(maxsize=8192)
def _fragment_info(smiles: str) -> tuple[int, str | None]:
    """(carbons, trivial name) of one fragment."""
    mol = Chem.MolFromSmiles(smiles)
    return _carbons(mol), _name(mol, smiles)


def _fragment_records(found: Counter[str], skip: tuple[str, ...] = ()) -> tuple[Fragment, ...]:
    records = []
    for smiles, count in found.items():
        if smiles in skip:
            continue
        records.append(Fragment(smiles, count, *_fragment_info(smiles)))
    records.sort(key=lambda f: (-f.carbons, f.smiles))
    return tuple(records)


def _as_mol(substrate: Chem.Mol | str) -> Chem.Mol:
    if isinstance(substrate, Chem.Mol):
        return Chem.Mol(substrate)
    return Chem.Mol(_mol_from(substrate))  # raises StructureError for bad SMILES


def _canonical_input(substrate: Chem.Mol | str) -> str:
    """Canonical SMILES of a Mol or SMILES input (the cache key of the results)."""
    if isinstance(substrate, Chem.Mol):
        return canonical(Chem.MolToSmiles(substrate))
    if not isinstance(substrate, str):
        raise StructureError(f"expected an RDKit Mol or a SMILES string, got {type(substrate).__name__}")
    return canonical(substrate)


def _exhaust(mol: Chem.Mol, hydrolyse_formates: bool) -> tuple[Chem.Mol, int, int]:
    """Oxidise until no cleavable bond remains; returns (products, IO4-, NH3)."""
    used = ammonia = 0
    for _ in range(mol.GetNumAtoms()):  # every pass removes at least one bond
        bonds = _cleavable(mol)
        if not bonds:
            if not hydrolyse_formates:
                break
            mol, esters = _hydrolyse_formates(mol)
            if not esters or not _cleavable(mol):
                break
            continue
        mol, nh3 = _cleave(mol, bonds)
        used += len(bonds)
        ammonia += nh3
    return mol, used, ammonia


@lru_cache(maxsize=8192)
def _oxidise_smiles(smiles: str, hydrolyse_formates: bool, label: str) -> PeriodateResult:
    mol = _as_mol(smiles)
    products, used, ammonia = _exhaust(mol, hydrolyse_formates)
    found = _fragments(products, ammonia)
    other = _fragment_records(found, skip=(_FORMIC, _FORMALDEHYDE, _CO2))
    carbons_out = sum(f.carbons * f.count for f in other) + found[_FORMIC] + found[_FORMALDEHYDE] + found[_CO2]
    result = PeriodateResult(
        substrate=label,
        smiles=canonical(smiles),
        periodate=used,
        formic_acid=found[_FORMIC],
        formaldehyde=found[_FORMALDEHYDE],
        co2=found[_CO2],
        other=other,
        carbons_in=_carbons(mol),
        carbons_out=carbons_out,
    )
    logger.debug("periodate on %s: %s", smiles, result.counts())
    return result


def oxidise(substrate: Chem.Mol | str, hydrolyse_formates: bool = True, label: str = "") -> PeriodateResult:
    """Exhaustive periodate oxidation of any molecule (RDKit Mol or SMILES).

    With ``hydrolyse_formates`` (default) formyl esters formed from ring
    carbons are hydrolysed, counted as formic acid, and the freed hydroxyl is
    oxidised further, as in the aqueous reaction (see the module notes).
    """
    return _oxidise_smiles(_canonical_input(substrate), hydrolyse_formates, label)


# --------------------------------------------------------------- sugar substrates
def _check_substrate(substrate: str) -> None:
    if substrate not in SUBSTRATES:
        raise ObservationError(
            None, "substrate", f"unknown substrate {substrate!r}; use one of {', '.join(SUBSTRATES)}"
        )


def substrate_smiles(chain: Chain, substrate: str, anomer: str = "alpha") -> str | NotApplicable:
    """SMILES of the compound actually oxidised, or why it cannot be made.

    ``free``: the open chain; ``alditol``: the (first) borohydride product;
    ``methyl_pyranoside``/``methyl_furanoside``: the methyl glycoside of
    ``anomer`` (the counts do not depend on the anomer).
    """
    _check_substrate(substrate)
    if anomer not in ("alpha", "beta"):
        raise ObservationError(None, "anomer", f"anomer must be 'alpha' or 'beta', got {anomer!r}")
    if substrate == "free":
        return to_smiles(chain)
    if substrate == "alditol":
        products = alditols(chain)
        if isinstance(products, NotApplicable):
            return products
        return to_smiles(products[0])
    ring = "pyranose" if substrate == "methyl_pyranoside" else "furanose"
    try:
        return to_smiles(chain, RingForm(ring, anomer, methyl=True))
    except StructureError as err:
        return NotApplicable(f"no methyl {ring[:-1]}ide: {err}")


def periodate_oxidation(
    chain: Chain, substrate: str = "free", anomer: str = "alpha"
) -> PeriodateResult | NotApplicable:
    """Periodate oxidation of a sugar as ``substrate`` (one of :data:`SUBSTRATES`).

    Returns the counts in mol per mol, or :class:`NotApplicable` when that
    substrate cannot exist (a chain too short for the ring, no OH on the
    ring-closing carbon, no carbonyl to reduce).
    """
    smiles = substrate_smiles(chain, substrate, anomer)
    if isinstance(smiles, NotApplicable):
        return smiles
    label = substrate if substrate in ("free", "alditol") else f"methyl_{anomer}_{substrate.split('_')[1]}"
    return _oxidise_smiles(smiles, True, label)


# --------------------------------------------------------------- Smith degradation
def _reduce_carbonyls(mol: Chem.Mol) -> Chem.Mol:
    """Borohydride: aldehydes and ketones to alcohols; acids and esters untouched.

    A ketone gives a new centre of unspecified configuration (both epimers).
    """
    rw = Chem.RWMol(mol)
    for atom in rw.GetAtoms():
        if atom.GetSymbol() != "C":
            continue
        level, free, ethers = _free_heteroatoms(atom)
        if level + ethers != 2:
            continue
        for idx in free:
            bond = rw.GetBondBetweenAtoms(atom.GetIdx(), idx)
            if bond.GetBondType() == Chem.BondType.DOUBLE and rw.GetAtomWithIdx(idx).GetSymbol() == "O":
                bond.SetBondType(Chem.BondType.SINGLE)
                atom.SetNoImplicit(False)
                atom.SetNumExplicitHs(0)
                atom.SetChiralTag(Chem.ChiralType.CHI_UNSPECIFIED)
    return _finish(rw, [])


def _hydrolyse_acyclic_acetals(mol: Chem.Mol) -> Chem.Mol:
    """Mild acid: an acetal carbon outside any ring goes to C=O, its ethers to OH.

    Intact glycoside rings (no bond cleaved) survive these conditions.
    """
    rw = Chem.RWMol(mol)
    targets = []
    for atom in rw.GetAtoms():
        if atom.GetSymbol() != "C" or atom.IsInRing():
            continue
        ethers = [
            n.GetIdx()
            for n in atom.GetNeighbors()
            if n.GetSymbol() == "O"
            and n.GetDegree() == 2
            and not rw.GetBondBetweenAtoms(atom.GetIdx(), n.GetIdx()).IsInRing()
        ]
        if len(ethers) == 2:
            targets.append((atom.GetIdx(), ethers))
    drop: list[int] = []
    for idx, ethers in targets:
        for o in ethers:
            rw.RemoveBond(idx, o)
            rw.GetAtomWithIdx(o).SetNoImplicit(False)
        level, _, _ = _free_heteroatoms(rw.GetAtomWithIdx(idx))
        _set_level(rw, idx, level + 2, drop)
    return _finish(rw, drop)


@lru_cache(maxsize=8192)
def _smith_smiles(smiles: str, label: str) -> SmithResult:
    mol = _as_mol(smiles)
    oxidised, used, ammonia = _exhaust(mol, hydrolyse_formates=True)
    reduced = _reduce_carbonyls(oxidised)
    hydrolysed = _hydrolyse_acyclic_acetals(reduced)
    products = _fragment_records(_fragments(hydrolysed, ammonia))
    return SmithResult(label, canonical(smiles), used, products)


def smith(substrate: Chem.Mol | str, label: str = "") -> SmithResult:
    """Smith degradation of any glycoside-type molecule (RDKit Mol or SMILES)."""
    return _smith_smiles(_canonical_input(substrate), label)


def smith_degradation(chain: Chain, ring: str = "pyranose", anomer: str = "alpha") -> SmithResult | NotApplicable:
    """Smith degradation of the methyl ``ring`` glycoside of ``chain``.

    Periodate cleaves the ring's diol units, borohydride reduces the
    aldehydes to alcohols, and mild acid hydrolyses the now acyclic acetal
    at C-1: polyols (ethylene glycol, glycerol, erythritol/threitol-type),
    glycolaldehyde from C-1/C-2 and methanol from the aglycone (Abdel-Akher,
    Hamilton, Montgomery and Smith, J. Am. Chem. Soc. 74, 4970, 1952
    [from memory]). The anomeric centre is destroyed, so both anomers give
    the same products unless no ring bond is cleaved. Caution: periodate is
    a strong oxidiser (H271); borohydride releases hydrogen with acid.
    """
    if ring not in ("pyranose", "furanose"):
        raise ObservationError(None, "ring", f"ring must be 'pyranose' or 'furanose', got {ring!r}")
    smiles = substrate_smiles(chain, f"methyl_{ring[:-1]}ide", anomer)
    if isinstance(smiles, NotApplicable):
        return smiles
    return _smith_smiles(smiles, f"methyl_{anomer}_{ring[:-1]}ide")
