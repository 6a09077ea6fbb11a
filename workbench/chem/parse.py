"""Reading a structure back: SMILES (open chain or ring form) to a Chain.

A cyclic hemiacetal or methyl glycoside is opened at the anomeric carbon
first; the open chain is then read carbon by carbon, and every stereocentre's
Fischer side is found by comparing CIP labels with a chain built all-right,
checked by equality of canonical SMILES.
"""

from __future__ import annotations

import itertools
from dataclasses import dataclass

from rdkit import Chem
from rdkit.Chem import rdCIPLabeler

from workbench.chem.chain import LEFT, RIGHT, STEREO_GROUPS, Chain
from workbench.chem.names import display_name, from_name, ring_name
from workbench.chem.smiles import RingForm, canonical, quiet_rdkit, ring_forms, to_smiles
from workbench.chem.symbols import ULOSONIC_REASON, from_symbol, symbol_in_capitals
from workbench.errors import NameNotRecognisedError, StructureError

__all__ = ["Compound", "from_smiles", "read_compound", "resolve", "open_ring"]


def _is_methyl(atom: Chem.Atom) -> bool:
    return atom.GetSymbol() == "C" and atom.GetDegree() == 1 and atom.GetTotalNumHs() == 3


def open_ring(mol: Chem.Mol) -> Chem.Mol:
    """Open a pyranose/furanose hemiacetal or methyl glycoside to the carbonyl form.

    Molecules without such a ring are returned unchanged.
    """
    rw = Chem.RWMol(mol)
    ring_info = rw.GetRingInfo()
    for ring in ring_info.AtomRings():
        if len(ring) not in (5, 6):
            continue
        oxygens = [i for i in ring if rw.GetAtomWithIdx(i).GetSymbol() == "O"]
        if len(oxygens) != 1:
            continue
        ring_o = oxygens[0]
        for nb in rw.GetAtomWithIdx(ring_o).GetNeighbors():
            exo = [x for x in nb.GetNeighbors() if x.GetSymbol() == "O" and x.GetIdx() not in ring]
            if not exo:
                continue
            anomeric, exo_o = nb, exo[0]
            methyls = [x for x in exo_o.GetNeighbors() if x.GetIdx() != anomeric.GetIdx()]
            if methyls and not all(_is_methyl(x) for x in methyls):
                continue
            rw.RemoveBond(ring_o, anomeric.GetIdx())
            rw.GetBondBetweenAtoms(anomeric.GetIdx(), exo_o.GetIdx()).SetBondType(Chem.BondType.DOUBLE)
            for x in sorted((m.GetIdx() for m in methyls), reverse=True):
                rw.RemoveAtom(x)
            anomeric.SetChiralTag(Chem.ChiralType.CHI_UNSPECIFIED)
            for atom in rw.GetAtoms():
                atom.SetNoImplicit(False)
                atom.SetNumExplicitHs(0)
            out = rw.GetMol()
            Chem.SanitizeMol(out)
            Chem.AssignStereochemistry(out, cleanIt=True, force=True)
            return out
    return mol


_ACETAMIDO = Chem.MolFromSmarts("[CX4;H1]-[NX3;H1]-[CX3](=O)-[CH3]")


def _acetyl_carbons(mol: Chem.Mol) -> set[int]:
    """Carbons of N-acetyl groups (the C=O and its CH3), which are not chain carbons."""
    return {idx for match in mol.GetSubstructMatches(_ACETAMIDO) for idx in (match[2], match[4])}


def _acetamido_nitrogens(mol: Chem.Mol) -> set[int]:
    return {match[1] for match in mol.GetSubstructMatches(_ACETAMIDO)}


def _chain_atoms(mol: Chem.Mol) -> list[int]:
    """Carbon atoms of the sugar chain in order C-1 ... C-n."""
    acetyl = _acetyl_carbons(mol)
    carbons = [
        a for a in mol.GetAtoms() if a.GetSymbol() == "C" and not _is_methyl_ether(a) and a.GetIdx() not in acetyl
    ]
    ids = {a.GetIdx() for a in carbons}
    if mol.GetRingInfo().NumRings():
        raise StructureError("a ring remains after opening any hemiacetal; not a monosaccharide")
    ends = [a for a in carbons if sum(1 for n in a.GetNeighbors() if n.GetIdx() in ids) <= 1]
    if len(carbons) < 3 or len(ends) != 2:
        raise StructureError("the carbons do not form one unbranched chain of 3 or more")
    order = [ends[0].GetIdx()]
    while len(order) < len(carbons):
        nxt = [
            n.GetIdx()
            for n in mol.GetAtomWithIdx(order[-1]).GetNeighbors()
            if n.GetIdx() in ids and n.GetIdx() not in order
        ]
        if len(nxt) != 1:
            raise StructureError("the carbon chain is branched")
        order.append(nxt[0])
    return order


def _is_methyl_ether(atom: Chem.Atom) -> bool:
    return _is_methyl(atom) and atom.GetNeighbors()[0].GetSymbol() == "O"


def _group(mol: Chem.Mol, idx: int, terminal: bool) -> str:
    atom = mol.GetAtomWithIdx(idx)
    hs = atom.GetTotalNumHs()
    subs = []
    for bond in atom.GetBonds():
        other = bond.GetOtherAtom(atom)
        if other.GetSymbol() == "C" and not _is_methyl_ether(other):
            continue
        subs.append((other.GetSymbol(), bond.GetBondTypeAsDouble(), other))
    kinds = sorted((s, o) for s, o, _ in subs)
    if kinds == [("O", 2.0)]:
        return "CHO" if terminal else "CO"
    if kinds == [("O", 1.0), ("O", 2.0)] and terminal:
        return "COOH"
    if kinds == []:
        return "CH3" if terminal else "CH2"
    if kinds == [("N", 1.0)] and hs == 1 and not terminal:
        n = subs[0][2]
        if n.GetTotalNumHs() == 2:
            return "CHNH2"
        if n.GetTotalNumHs() == 1 and n.GetIdx() in _acetamido_nitrogens(mol):
            return "CHNHAc"
    if kinds == [("O", 1.0)]:
        o = subs[0][2]
        if o.GetTotalNumHs() == 1:
            return "CH2OH" if terminal else "CHOH"
        if not terminal and any(_is_methyl(n) for n in o.GetNeighbors()):
            return "CHOMe"
    raise StructureError(f"carbon with substituents {kinds} is not a group stereosieve models")


def _cip(mol: Chem.Mol) -> dict[int, str]:
    m = Chem.Mol(mol)
    rdCIPLabeler.AssignCIPLabels(m)
    return {a.GetIdx(): a.GetProp("_CIPCode") for a in m.GetAtoms() if a.HasProp("_CIPCode")}


def from_smiles(smiles: str) -> Chain:
    """The chain of a monosaccharide given as SMILES (open chain or ring form)."""
    with quiet_rdkit():
        mol = Chem.MolFromSmiles(smiles)
    if mol is None:
        raise NameNotRecognisedError(smiles, "RDKit cannot read it as SMILES")
    mol = open_ring(mol)
    order = _chain_atoms(mol)
    groups = [_group(mol, idx, i in (0, len(order) - 1)) for i, idx in enumerate(order)]
    if groups[-1] == "CHO" or (groups[-2] == "CO" and groups[1] != "CO") or (len(groups) == 3 and groups[-1] == "CH3"):
        order.reverse()
        groups.reverse()
    stereo = [i for i, g in enumerate(groups) if g in STEREO_GROUPS]
    found = {a for a, _ in Chem.FindMolChiralCenters(mol, includeUnassigned=True, useLegacyImplementation=False)}
    unassigned = [
        i + 1 for i in stereo if mol.GetAtomWithIdx(order[i]).GetChiralTag() == Chem.ChiralType.CHI_UNSPECIFIED
    ]
    if unassigned or not found >= {order[i] for i in stereo}:
        raise StructureError(f"the configuration of C-{', C-'.join(map(str, unassigned or stereo))} is not given")
    all_right = Chain(tuple(groups), tuple(RIGHT if i in stereo else None for i in range(len(groups))))
    if not all_right.is_sugar:
        raise StructureError(f"{all_right.pattern} is not an aldose or 2-ketose")
    if all_right.carbonyl == "ketose" and groups[0] == "COOH":
        raise StructureError(ULOSONIC_REASON)
    target = canonical(Chem.MolToSmiles(mol))
    ref = _cip(Chem.MolFromSmiles(to_smiles(all_right)))
    ref_mol = Chem.MolFromSmiles(to_smiles(all_right))
    mine = _cip(mol)
    match = mol.GetSubstructMatch(ref_mol)  # ref atom i -> mol atom match[i]
    inverse = {m: r for r, m in enumerate(match)}
    sides: list[str | None] = [None] * len(groups)
    for i in stereo:
        r = inverse.get(order[i])
        same = r is not None and ref.get(r) == mine.get(order[i])
        sides[i] = RIGHT if same else LEFT
    guess = Chain(tuple(groups), tuple(sides))
    if to_smiles(guess) == target:
        return guess
    for combo in itertools.product((RIGHT, LEFT), repeat=len(stereo)):  # CIP can mislead; search
        trial = list(sides)
        for i, s in zip(stereo, combo, strict=True):
            trial[i] = s
        chain = Chain(tuple(groups), tuple(trial))
        if to_smiles(chain) == target:
            return chain
    raise StructureError("no configuration of the chain reproduces the SMILES")


@dataclass(frozen=True)
class Compound:
    """What a name or SMILES stands for: a free sugar, a methyl glycoside of it, or an alditol.

    ``chain`` is the sugar (for a glycoside, its parent sugar; for an
    alditol, the alditol itself); ``glycoside`` is the methyl glycoside's
    ring form, None otherwise.
    """

    chain: Chain
    glycoside: RingForm | None = None

    @property
    def kind(self) -> str:
        """``sugar``, ``glycoside`` or ``alditol``."""
        if self.glycoside is not None:
            return "glycoside"
        return "alditol" if self.chain.is_alditol else "sugar"


def _glycoside_of(chain: Chain, smiles: str) -> RingForm | None:
    """The methyl glycoside ring form that ``smiles`` writes, if it is one."""
    target = canonical(smiles)
    for ring in ("pyranose", "furanose"):
        for anomer in ("alpha", "beta"):
            form = RingForm(ring, anomer, methyl=True)
            if RingForm(ring, anomer) in ring_forms(chain) and to_smiles(chain, form) == target:
                return form
    return None


def read_compound(text: str) -> Compound:
    """A free sugar, methyl glycoside or alditol from a name or a SMILES."""
    ring = ring_name(text)
    if ring is not None and ring[3]:
        chain, ring_word, anomer, _ = ring
        return Compound(chain, RingForm(ring_word, anomer or "alpha", methyl=True))
    try:
        return Compound(from_name(text))
    except NameNotRecognisedError as name_error:
        try:
            return Compound(from_symbol(text))  # IUPAC symbols: GlcNAc, L-Rha, LDmanHep
        except NameNotRecognisedError as symbol_error:
            if "ulosonic" in symbol_error.reason or "ulosonic" in text:
                raise NameNotRecognisedError(text, ULOSONIC_REASON) from symbol_error
        if any(ch in text for ch in "=@[]()") or text.strip().isupper():
            spelt = symbol_in_capitals(text)
            try:
                chain = from_smiles(text.strip())
            except NameNotRecognisedError:
                if spelt is not None:  # GLCNAC, KDO: a symbol in capitals that is no SMILES
                    return read_compound(spelt)
                raise
            except StructureError as err:
                if spelt is not None:
                    return read_compound(spelt)
                raise NameNotRecognisedError(text, str(err)) from err
            with quiet_rdkit():
                return Compound(chain, _glycoside_of(chain, text.strip()))
        raise name_error


def resolve(text: str) -> Chain:
    """A sugar (or a parent alditol) from a trivial name, a systematic name or a SMILES.

    A methyl glycoside is refused: it has no free carbonyl, so it is not the
    free sugar (non-reducing, no osazone); name the parent sugar instead, or
    use :func:`read_compound` to predict the glycoside itself.
    """
    compound = read_compound(text)
    if compound.glycoside is not None:
        parent = display_name(compound.chain)
        raise NameNotRecognisedError(
            text,
            f"a methyl glycoside is not the free sugar {parent} (no free carbonyl: non-reducing, no osazone, "
            f"no alditol); only `predict` handles glycosides; to mean the sugar, name it",
            (parent,),
        )
    return compound.chain
