"""Periodate oxidation and Smith degradation of one residue inside a glycan.

Both are computed on the residue's RDKit structure
(:func:`workbench.chem.residue.residue_mol`), with the general rules of
:mod:`workbench.chem.periodate`: the aglycone and every linked oxygen carry
another residue (a ``*``), so only the residue's own free vicinal diols and
triols react. Amounts are mol per mol of residue in the polymer.

Smith degradation (Goldstein, Hay, Lewis and Smith, Methods Carbohydr. Chem.
5, 361, 1965; Abdel-Akher, Hamilton, Montgomery and Smith, J. Am. Chem. Soc.
74, 4970, 1952 [from memory]): periodate, then borohydride (aldehydes to
alcohols), then mild acid (the acyclic acetals left where the ring was cut
hydrolyse); the glycosidic bonds still standing are then cleaved by full
hydrolysis. The *fragment* of a residue is the product that holds its
ring-closing carbon: the polyol released from the ring oxygen's side
(glycerol, erythritol, D-/L-threitol, ethylene glycol ...), or the intact
sugar when no ring bond was cut. ``none`` stands for a fragment that is no
neutral polyol or sugar (a uronic acid's glyceric acid, say).

Cautions: sodium periodate is a strong oxidiser (H271), quench excess with
ethylene glycol; borohydride releases hydrogen with acid.
"""

from __future__ import annotations

import itertools
from dataclasses import dataclass
from functools import lru_cache

from rdkit import Chem

from workbench.chem.chain import LEFT, RIGHT, Chain
from workbench.chem.names import PREFIXES, display_name
from workbench.chem.parse import from_smiles, resolve
from workbench.chem.periodate import (
    _NAMES,
    _exhaust,
    _fragment_info,
    _hydrolyse_acyclic_acetals,
    _reduce_carbonyls,
    oxidise,
)
from workbench.chem.residue import Residue, residue_mol
from workbench.chem.smiles import canonical, is_achiral, quiet_rdkit, to_smiles
from workbench.errors import NameNotRecognisedError, StructureError

__all__ = [
    "ResiduePeriodate",
    "SmithFragment",
    "residue_periodate",
    "residue_smith",
    "polyol_names",
    "product_keys",
]


@dataclass(frozen=True)
class ResiduePeriodate:
    """IO4- consumed and HCOOH, HCHO formed, mol per mol of residue."""

    periodate: int
    formic_acid: int
    formaldehyde: int

    def as_tuple(self) -> tuple[float, float, float]:
        """(IO4-, HCOOH, HCHO) as floats."""
        return (float(self.periodate), float(self.formic_acid), float(self.formaldehyde))


@dataclass(frozen=True)
class SmithFragment:
    """The Smith-degradation fragment of a residue.

    ``kind`` is ``polyol``, ``sugar`` (no ring bond cut) or ``other``;
    ``key`` is the canonical SMILES compared with an observation (the open
    chain for a sugar); ``name`` what a chemist calls it.
    """

    kind: str
    key: str
    name: str
    periodate: int

    @property
    def flat(self) -> str:
        """The key without stereo (compared with names such as ``propane-1,2-diol``)."""
        mol = Chem.MolFromSmiles(self.key)
        return Chem.MolToSmiles(mol, isomericSmiles=False) if mol is not None else self.key

    def matches(self, keys: frozenset[str]) -> bool:
        """Does an observed product (its :func:`product_keys`) name this fragment?"""
        return self.key in keys or self.flat in keys

    @property
    def word(self) -> str:
        """The observation's word for it: the name, or ``none`` for a fragment that is no polyol or sugar."""
        return self.name if self.kind in ("polyol", "sugar") else "none"


@lru_cache(maxsize=65536)
def residue_periodate(residue: Residue) -> ResiduePeriodate:
    """Exhaustive periodate oxidation of the residue in the polymer (module notes)."""
    result = oxidise(residue_mol(residue))
    return ResiduePeriodate(result.periodate, result.formic_acid, result.formaldehyde)


# ------------------------------------------------------------------ polyol names
def _alditol(sides: tuple[str, ...]) -> Chain:
    n = len(sides) + 2
    return Chain(("CH2OH",) + ("CHOH",) * (n - 2) + ("CH2OH",), (None,) + sides + (None,))


def _polyol_name(sides: tuple[str, ...]) -> tuple[str, bool]:
    """IUPAC-IUBMB 2-Carb-19 name of an alditol (alphabetically first reading) and whether it is meso."""
    n = len(sides) + 2
    if n == 2:
        return "ethylene glycol", True
    if n == 3:
        return "glycerol", True
    chain = _alditol(sides)
    readings = []
    for c in (chain, chain.reversed()):
        pat = "".join("r" if s == RIGHT else "l" for s in c.sides if s)
        series = "D" if pat[-1] == "r" else "L"
        mirrored = pat if series == "D" else "".join("r" if x == "l" else "l" for x in pat)
        readings.append((PREFIXES[mirrored][:-1] + "itol", series))
    root, series = min(readings)
    meso = is_achiral(to_smiles(chain))
    return (root if meso else f"{series}-{root}"), meso


@lru_cache(maxsize=1)
def polyol_names() -> dict[str, str]:
    """Canonical SMILES -> name of every unbranched acyclic polyol with 2 to 6 carbons."""
    out: dict[str, str] = {}
    for n in range(2, 7):
        for sides in itertools.product((RIGHT, LEFT), repeat=max(n - 2, 0)):
            smiles = to_smiles(_alditol(tuple(sides)))
            out.setdefault(smiles, _polyol_name(tuple(sides))[0])
    return out


@lru_cache(maxsize=1)
def _keys_by_name() -> dict[str, frozenset[str]]:
    """lower-case polyol name (with or without D-/L-) -> accepted SMILES keys."""
    out: dict[str, set[str]] = {}
    for smiles, name in polyol_names().items():
        out.setdefault(name.lower(), set()).add(smiles)
        if name[:2] in ("D-", "L-"):
            out.setdefault(name[2:].lower(), set()).add(smiles)
    out["ethane-1,2-diol"] = out["ethylene glycol"]
    # deoxy polyols such as propane-1,2-diol, any configuration; a word that already names a configured
    # polyol keeps only its configuration (erythritol is never a threitol, REFERENCE_VALUES.md, Smith fragments)
    configured = set(out)
    for flat, (achiral, chiral) in _NAMES.items():
        mol = Chem.MolFromSmiles(flat)
        if all(a.GetAtomicNum() in (6, 8) for a in mol.GetAtoms()) and "=" not in flat and "O" in flat:
            for word in {achiral, chiral} - {""} - configured:
                out.setdefault(word.lower(), set()).add(flat)
    return {k: frozenset(v) for k, v in out.items()}


def product_keys(name: str) -> frozenset[str]:
    """The SMILES keys an observed Smith product stands for (a polyol or a sugar name).

    ``threitol`` without D/L stands for both enantiomers. Raises
    :class:`NameNotRecognisedError` for a name that is neither.
    """
    text = name.strip()
    polyols = _keys_by_name()
    if text.lower() in polyols:
        return polyols[text.lower()]
    try:
        return frozenset({to_smiles(resolve(text))})
    except NameNotRecognisedError as err:
        raise NameNotRecognisedError(
            name, "not a polyol (glycerol, erythritol, D-threitol, ethylene glycol ...) nor a sugar name"
        ) from err


# ------------------------------------------------------------------ Smith degradation
def _cut_dummies(mol: Chem.Mol) -> Chem.Mol:
    rw = Chem.RWMol(mol)
    for idx in sorted((a.GetIdx() for a in rw.GetAtoms() if a.GetAtomicNum() == 0), reverse=True):
        for nb in rw.GetAtomWithIdx(idx).GetNeighbors():
            nb.SetNoImplicit(False)
            nb.SetNumExplicitHs(0)
        rw.RemoveAtom(idx)
    out = rw.GetMol()
    with quiet_rdkit():
        Chem.SanitizeMol(out)
    return out


def _is_polyol(mol: Chem.Mol) -> bool:
    if mol.GetRingInfo().NumRings():
        return False
    for atom in mol.GetAtoms():
        if atom.GetAtomicNum() not in (6, 8):
            return False
        if atom.GetAtomicNum() == 8 and (atom.GetDegree() != 1 or atom.GetTotalNumHs() != 1):
            return False
    return True


@lru_cache(maxsize=65536)
def residue_smith(residue: Residue) -> SmithFragment:
    """The Smith-degradation fragment of ``residue`` (the module notes define it)."""
    mol = residue_mol(residue)
    oxidised, used, _ = _exhaust(mol, True)
    products = _cut_dummies(_hydrolyse_acyclic_acetals(_reduce_carbonyls(oxidised)))
    target = residue.ring_carbon
    for piece in Chem.GetMolFrags(products, asMols=True, sanitizeFrags=True):
        if not any(a.HasProp("locant") and a.GetIntProp("locant") == target for a in piece.GetAtoms()):
            continue
        smiles = canonical(Chem.MolToSmiles(piece))
        if piece.GetRingInfo().NumRings():
            try:
                chain = from_smiles(smiles)
            except (StructureError, NameNotRecognisedError):
                return SmithFragment("other", smiles, smiles, used)
            return SmithFragment("sugar", to_smiles(chain), display_name(chain), used)
        info = _fragment_info(smiles)[1]
        if _is_polyol(piece):
            name = polyol_names().get(smiles) or info or smiles
            return SmithFragment("polyol", smiles, name, used)
        return SmithFragment("other", smiles, info or smiles, used)
    raise StructureError(f"{residue}: the ring-closing carbon was lost in the Smith degradation")  # pragma: no cover
