"""Methylation analysis of a glycan residue: its partially methylated alditol acetate.

The classical sequence (Hakomori, J. Biochem. 55, 205, 1964; Ciucanu and
Kerek, Carbohydr. Res. 131, 209, 1984; Björndal, Hellerqvist, Lindberg and
Svensson, Angew. Chem. Int. Ed. Engl. 9, 610, 1970) is applied step by step
to the residue's RDKit structure (:func:`workbench.chem.residue.residue_mol`):

1. (uronic acids) carboxyl reduction before methylation (carbodiimide, then
   NaBD4): -COOH becomes -CD2OH (Taylor and Conrad, Biochemistry 11, 1383,
   1972 [from memory]);
2. permethylation: every free hydroxyl becomes OMe;
3. hydrolysis: every glycosidic bond is cleaved (the ``*`` residues leave,
   their oxygens become OH) and the ring opens to the carbonyl form;
4. reduction with NaBD4: the carbonyl carbon becomes CH(D)OH (aldoses) or
   C(D)(OH) of either configuration (2-ketoses: two C-2 epimeric alditols);
5. acetylation: every hydroxyl now free becomes OAc.

An acetamido group (GlcNAc) is N-methylated in step 2 and named
``2-deoxy-2-(N-methylacetamido)``.

Hence O-acetyl at the anomeric carbon, at the ring oxygen's carbon and at
every linked position; O-methyl elsewhere (common practice, REFERENCE_VALUES.md).
The deuterium at the anomeric carbon tells the two ends of a symmetric
alditol apart. Names follow IUPAC-IUBMB 2-Carb-19 and the usage of the
methods papers: substituent prefixes in alphabetical order, the parent
alditol numbered from the residue's own C-1 (the deuterated end), e.g.
``1,4,5-tri-O-acetyl-2,3,6-tri-O-methyl-D-glucitol-1-d``.

Cautions at the bench: methyl iodide is a toxic alkylating agent and a
suspected carcinogen (H351); sodium hydride with DMSO releases hydrogen and
the dimsyl anion can decompose violently on heating; NaOH/DMSO is
corrosive; trifluoroacetic acid and acetic anhydride are corrosive. Follow
the safety data sheets, local rules and the safety officer.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache

from rdkit import Chem

from workbench.chem.chain import LEFT, RIGHT, Chain
from workbench.chem.names import configurational_prefix
from workbench.chem.residue import Residue, residue_mol
from workbench.chem.smiles import canonical, quiet_rdkit
from workbench.errors import StructureError

__all__ = ["AlditolAcetate", "alditol_acetate", "pmaa_name", "REDUCTANTS"]

REDUCTANTS = ("NaBD4", "NaBH4")
_MULT = {1: "", 2: "di", 3: "tri", 4: "tetra", 5: "penta", 6: "hexa", 7: "hepta"}
_STEM = {4: "tetr", 5: "pent", 6: "hex", 7: "hept", 8: "oct", 9: "non"}


@dataclass(frozen=True)
class AlditolAcetate:
    """The partially methylated alditol acetate(s) of one residue.

    ``methyl`` and ``acetyl`` are the carbons (residue numbering) carrying
    O-methyl and O-acetyl groups; ``deuterium`` maps carbon -> D atoms;
    ``smiles`` holds one product (the two C-2 epimers for a 2-ketose) and
    ``names`` the systematic name(s), each list sorted.
    """

    methyl: tuple[int, ...]
    acetyl: tuple[int, ...]
    deuterium: tuple[tuple[int, int], ...]
    smiles: tuple[str, ...]
    names: tuple[str, ...]

    @property
    def name(self) -> str:
        """The name, or both epimers' names joined by `` + ``."""
        return " + ".join(self.names)

    def to_dict(self) -> dict:
        """JSON form."""
        return {
            "methyl": list(self.methyl),
            "acetyl": list(self.acetyl),
            "deuterium": {str(k): n for k, n in self.deuterium},
            "smiles": list(self.smiles),
            "names": list(self.names),
        }


# ------------------------------------------------------------------ steps on the molecule
def _deuterium(rw: Chem.RWMol, idx: int, n: int) -> None:
    for _ in range(n):
        d = Chem.Atom(1)
        d.SetIsotope(2)
        new = rw.AddAtom(d)
        rw.AddBond(idx, new, Chem.BondType.SINGLE)


def _reset(atom: Chem.Atom) -> None:
    atom.SetNoImplicit(False)
    atom.SetNumExplicitHs(0)


def _sanitised(rw: Chem.RWMol) -> Chem.RWMol:
    mol = rw.GetMol()
    with quiet_rdkit():
        Chem.SanitizeMol(mol)
    return Chem.RWMol(mol)


def _chain_atoms(mol: Chem.Mol) -> dict[int, int]:
    return {a.GetIntProp("locant"): a.GetIdx() for a in mol.GetAtoms() if a.HasProp("locant")}


def _free_hydroxyls(mol: Chem.Mol) -> list[int]:
    """Oxygens with one heavy neighbour, a carbon, by a single bond, and one H."""
    out = []
    for atom in mol.GetAtoms():
        if atom.GetAtomicNum() != 8 or atom.GetDegree() != 1 or atom.GetTotalNumHs() != 1:
            continue
        nb = atom.GetNeighbors()[0]
        if nb.GetAtomicNum() == 6:
            out.append(atom.GetIdx())
    return out


def _reduce_carboxyl(rw: Chem.RWMol) -> Chem.RWMol:
    drop = []
    for idx in _chain_atoms(rw).values():
        atom = rw.GetAtomWithIdx(idx)
        doubles = [
            b.GetOtherAtomIdx(idx)
            for b in atom.GetBonds()
            if b.GetBondType() == Chem.BondType.DOUBLE and b.GetOtherAtom(atom).GetAtomicNum() == 8
        ]
        singles = [
            b.GetOtherAtomIdx(idx)
            for b in atom.GetBonds()
            if b.GetBondType() == Chem.BondType.SINGLE and b.GetOtherAtom(atom).GetAtomicNum() == 8
        ]
        if doubles and singles and not atom.IsInRing():  # a carboxylic acid
            rw.RemoveBond(idx, doubles[0])
            drop.append(doubles[0])
            _deuterium(rw, idx, 2)
            _reset(atom)
    for i in sorted(drop, reverse=True):
        rw.RemoveAtom(i)
    return _sanitised(rw)


def _amide_nh(mol: Chem.Mol) -> list[int]:
    """Nitrogens of secondary amides (the NHAc of an N-acetyl sugar)."""
    out = []
    for atom in mol.GetAtoms():
        if atom.GetAtomicNum() != 7 or atom.GetTotalNumHs() != 1:
            continue
        for nb in atom.GetNeighbors():
            if any(b.GetBondType() == Chem.BondType.DOUBLE for b in nb.GetBonds()) and nb.GetAtomicNum() == 6:
                out.append(atom.GetIdx())
                break
    return out


def _alkylate(rw: Chem.RWMol, acyl: bool) -> Chem.RWMol:
    if not acyl:  # permethylation also N-methylates an acetamido group
        for n in _amide_nh(rw):
            c = rw.AddAtom(Chem.Atom(6))
            rw.AddBond(n, c, Chem.BondType.SINGLE)
            _reset(rw.GetAtomWithIdx(n))
    for o in _free_hydroxyls(rw):
        c = rw.AddAtom(Chem.Atom(6))
        rw.AddBond(o, c, Chem.BondType.SINGLE)
        if acyl:  # O-C(=O)-CH3
            oxo = rw.AddAtom(Chem.Atom(8))
            rw.AddBond(c, oxo, Chem.BondType.DOUBLE)
            me = rw.AddAtom(Chem.Atom(6))
            rw.AddBond(c, me, Chem.BondType.SINGLE)
        _reset(rw.GetAtomWithIdx(o))
    return _sanitised(rw)


def _hydrolyse(rw: Chem.RWMol, anomeric: int) -> Chem.RWMol:
    """Cleave the glycosidic bonds (drop the ``*`` atoms) and open the ring to the carbonyl."""
    dummies = sorted((a.GetIdx() for a in rw.GetAtoms() if a.GetAtomicNum() == 0), reverse=True)
    for d in dummies:
        for nb in rw.GetAtomWithIdx(d).GetNeighbors():
            _reset(nb)
        rw.RemoveAtom(d)
    rw = _sanitised(rw)
    c = rw.GetAtomWithIdx(_chain_atoms(rw)[anomeric])
    ring_o = [n.GetIdx() for n in c.GetNeighbors() if n.GetAtomicNum() == 8 and n.IsInRing()]
    exo_o = [n.GetIdx() for n in c.GetNeighbors() if n.GetAtomicNum() == 8 and not n.IsInRing()]
    if len(ring_o) != 1 or len(exo_o) != 1:  # pragma: no cover - residues are always ring glycosides
        raise StructureError("the anomeric carbon is not a ring acetal")
    rw.RemoveBond(c.GetIdx(), ring_o[0])
    _reset(rw.GetAtomWithIdx(ring_o[0]))
    rw.GetBondBetweenAtoms(c.GetIdx(), exo_o[0]).SetBondType(Chem.BondType.DOUBLE)
    _reset(rw.GetAtomWithIdx(exo_o[0]))
    c.SetChiralTag(Chem.ChiralType.CHI_UNSPECIFIED)
    _reset(c)
    return _sanitised(rw)


def _reduce(rw: Chem.RWMol, anomeric: int, deuterated: bool) -> Chem.RWMol:
    idx = _chain_atoms(rw)[anomeric]
    atom = rw.GetAtomWithIdx(idx)
    for b in atom.GetBonds():
        if b.GetBondType() == Chem.BondType.DOUBLE:
            b.SetBondType(Chem.BondType.SINGLE)
            _reset(b.GetOtherAtom(atom))
    _reset(atom)
    if deuterated:
        _deuterium(rw, idx, 1)
    return _sanitised(rw)


def _substituent(o: Chem.Atom, carbon: int) -> str | None:
    for nb in o.GetNeighbors():
        if nb.GetIdx() == carbon or nb.GetAtomicNum() != 6:
            continue
        if any(b.GetBondType() == Chem.BondType.DOUBLE for b in nb.GetBonds()):
            return "acetyl"
        if nb.GetDegree() == 1:
            return "methyl"
    return None


def _epimers(mol: Chem.Mol, idx: int) -> list[str]:
    """Canonical SMILES of both configurations at atom ``idx`` (the new C-2 of a ketose alditol)."""
    out = []
    for tag in (Chem.ChiralType.CHI_TETRAHEDRAL_CW, Chem.ChiralType.CHI_TETRAHEDRAL_CCW):
        m = Chem.Mol(mol)
        m.GetAtomWithIdx(idx).SetChiralTag(tag)
        out.append(canonical(Chem.MolToSmiles(m)))
    return sorted(set(out))


# ------------------------------------------------------------------ names
def _locants(positions: tuple[int, ...]) -> str:
    return ",".join(map(str, positions))


def _prefix(positions: tuple[int, ...], word: str) -> str:
    """``1,4,5-tri-O-acetyl``, ``2-O-methyl``, ``6-deoxy``."""
    mult = _MULT[len(positions)]
    return f"{_locants(positions)}-{mult + '-' if mult and word.startswith('O-') else mult}{word}"


def _parent(chain: Chain, sides: list[str]) -> str:
    """Alditol parent name from the stereocentre sides (lowest carbon first), e.g. ``D-glucitol``."""
    prefix = configurational_prefix(sides)
    words = prefix.split("-")
    if len(words) == 2 and chain.carbons <= 6:
        return f"{words[0]}-{words[1][:-1]}itol"
    return f"{prefix}-{_STEM[chain.carbons]}itol"


def pmaa_name(chain: Chain, sides: list[str], methyl, acetyl, deuterium: dict[int, int]) -> str:
    """Systematic name of a partially methylated alditol acetate (residue numbering)."""
    acetamido = tuple(sorted(chain.acetamido_positions))
    deoxy = tuple(sorted(set(chain.deoxy_positions) | set(acetamido)))
    parts = []
    if acetyl:
        parts.append(_prefix(tuple(acetyl), "O-acetyl"))
    if deoxy:
        parts.append(_prefix(deoxy, "deoxy"))
    if methyl:
        parts.append(_prefix(tuple(methyl), "O-methyl"))
    if acetamido:  # N-methylated by permethylation (alphabetically after O-methyl)
        mult = _MULT[len(acetamido)]
        parts.append(f"{_locants(acetamido)}-{mult + '-' if mult else ''}(N-methylacetamido)")
    name = "-".join(parts + [_parent(chain, sides)])
    if deuterium:
        where = [k for k in sorted(deuterium) for _ in range(deuterium[k])]
        count = len(where)
        name += f"-{_locants(tuple(where))}-d{count if count > 1 else ''}"
    return name


def _alditol_sides(chain: Chain, anomeric: int) -> list[list[str]]:
    """Stereocentre sides of the alditol(s), lowest carbon first; two lists (C-2 right/left) for a ketose."""
    base = {k: chain.sides[k - 1] or RIGHT for k in chain.stereocentres}
    if anomeric == 1:
        return [[base[k] for k in sorted(base)]]
    out = []
    for side in (RIGHT, LEFT):
        both = {**base, 2: side}
        out.append([both[k] for k in sorted(both)])
    return out


def alditol_acetate(residue: Residue, reductant: str = "NaBD4") -> AlditolAcetate:
    """The partially methylated alditol acetate of ``residue`` (module notes give the steps).

    Hydrolysis destroys the anomeric centre, so both anomers give the same
    product: it is computed once, on the alpha residue of the same sugar,
    ring and linkage (``tests/test_residue_chem.py`` checks this on the beta
    structures too).
    """
    if reductant not in REDUCTANTS:
        raise StructureError(f"reductant must be one of {', '.join(REDUCTANTS)}, got {reductant!r}")
    if residue.anomer != "alpha":
        residue = Residue(residue.chain, residue.ring, "alpha", residue.linked)
    return _alditol_acetate(residue, reductant)


@lru_cache(maxsize=65536)
def _alditol_acetate(residue: Residue, reductant: str) -> AlditolAcetate:
    a = residue.anomeric_carbon
    rw = Chem.RWMol(residue_mol(residue))
    rw = _reduce_carboxyl(rw)
    rw = _alkylate(rw, acyl=False)
    rw = _hydrolyse(rw, a)
    rw = _reduce(rw, a, reductant == "NaBD4")
    rw = _alkylate(rw, acyl=True)
    mol = rw.GetMol()
    methyl: list[int] = []
    acetyl: list[int] = []
    deuterium: dict[int, int] = {}
    for k, idx in sorted(_chain_atoms(mol).items()):
        atom = mol.GetAtomWithIdx(idx)
        for nb in atom.GetNeighbors():
            if nb.GetAtomicNum() == 8:
                kind = _substituent(nb, idx)
                if kind == "methyl":
                    methyl.append(k)
                elif kind == "acetyl":
                    acetyl.append(k)
            elif nb.GetAtomicNum() == 1 and nb.GetIsotope() == 2:
                deuterium[k] = deuterium.get(k, 0) + 1
    if residue.chain.carbonyl == "ketose":
        smiles = tuple(_epimers(mol, _chain_atoms(mol)[a]))
    else:
        smiles = (canonical(Chem.MolToSmiles(mol)),)
    names = tuple(
        sorted(
            pmaa_name(residue.chain, sides, tuple(methyl), tuple(acetyl), deuterium)
            for sides in _alditol_sides(residue.chain, a)
        )
    )
    return AlditolAcetate(tuple(methyl), tuple(acetyl), tuple(sorted(deuterium.items())), smiles, names)
