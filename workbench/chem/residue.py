"""Glycan residues: one monosaccharide unit of an oligo- or polysaccharide.

A :class:`Residue` is a sugar (a :class:`~workbench.chem.chain.Chain` of the
catalogue) in one ring form (pyranose or furanose), one anomeric
configuration (alpha or beta, IUPAC-IUBMB 2-Carb-6.2) and with a set of
*linked positions*: the carbons, other than the anomeric one, whose oxygen
carries another residue (empty for a non-reducing terminal residue). The
anomeric oxygen always carries the next residue towards the reducing end
(DESIGN.md, Contract 5: residues not at the reducing end).

:func:`residue_mol` builds the residue as an RDKit glycoside in which the
aglycone and every linked position carry a dummy atom ``*`` (the rest of the
polymer); each chain carbon carries its locant as the integer atom property
``locant``. Every prediction (methylation analysis in
:mod:`workbench.chem.methylation`, periodate and Smith degradation in
:mod:`workbench.chem.residue_periodate`) is computed from that structure.

Names: IUPAC condensed form (IUPAC-IUBMB 1996, 2-Carb-37 and -38),
``->4)-alpha-D-Glcp-(1->``; :attr:`Residue.display` writes the same with
arrows and Greek letters, ``→4)-α-D-Glcp-(1→``.
"""

from __future__ import annotations

import itertools
import re
from collections.abc import Iterator
from dataclasses import dataclass
from functools import cached_property, lru_cache

from rdkit import Chem

from workbench.chem.catalogue import Scope, catalogue
from workbench.chem.chain import Chain
from workbench.chem.names import display_name, systematic_name
from workbench.chem.smiles import RingForm, _write, canonical, quiet_rdkit, ring_forms
from workbench.chem.symbols import symbol
from workbench.errors import ScopeError, StructureError

__all__ = [
    "RINGS",
    "ANOMERS",
    "DEFAULT_RESIDUE_SCOPE",
    "Residue",
    "ResidueScope",
    "free_positions",
    "residue_catalogue",
    "residue_mol",
    "residue_smiles",
    "sugar_symbol",
]

RINGS = ("pyranose", "furanose")
ANOMERS = ("alpha", "beta")

# Symbols the IUPAC list (chem.symbols) lacks: 2-ketopentoses, and 6-deoxyhexoses and hexuronic acids
# without a trivial name, written "6d" + or + "A" after the parent's symbol (2-Carb-38 [from memory]).
_EXTRA_SYMBOLS = {"ribulose": "Rul", "xylulose": "Xul"}
_HEXOSE_SYMBOLS = {
    "allo": "All",
    "altro": "Alt",
    "gluco": "Glc",
    "manno": "Man",
    "gulo": "Gul",
    "ido": "Ido",
    "galacto": "Gal",
    "talo": "Tal",
}


def sugar_symbol(chain: Chain) -> tuple[str, str]:
    """(series, symbol) of a sugar for condensed names, e.g. ``("D", "Glc")``.

    IUPAC symbols come from :func:`workbench.chem.symbols.symbol`; sugars
    with no symbol are written with their systematic name in square
    brackets (no series, which the name already carries).
    """
    series = chain.series or ""
    found = symbol(chain)
    if found is not None:
        head, _, sym = found.partition("-")
        return (head, sym) if head in ("D", "L") and sym else ("", found)
    name = display_name(chain)
    stem = name[2:] if name[:2] in ("D-", "L-") else name
    if stem in _EXTRA_SYMBOLS:
        return series, _EXTRA_SYMBOLS[stem]
    system = systematic_name(chain)
    word = system.split("-")[-2].split(" ")[0] if system.count("-") >= 2 else ""
    if chain.carbons == 6 and chain.carbonyl == "aldose" and chain.deoxy_positions == (6,) and word in _HEXOSE_SYMBOLS:
        return series, "6d" + _HEXOSE_SYMBOLS[word]
    if chain.is_uronic and chain.carbons == 6 and word in _HEXOSE_SYMBOLS:
        return series, _HEXOSE_SYMBOLS[word] + "A"
    return "", f"[{system}]"


def _anomeric(chain: Chain) -> int:
    return 1 if chain.carbonyl == "aldose" else 2


def _ring_carbon(chain: Chain, ring: str) -> int:
    return _anomeric(chain) + (4 if ring == "pyranose" else 3)


def free_positions(chain: Chain, ring: str) -> tuple[int, ...]:
    """Carbons whose oxygen is free in the ring form: a hydroxyl other than the anomeric and the ring oxygen."""
    skip = {_anomeric(chain), _ring_carbon(chain, ring)}
    return tuple(i + 1 for i, code in enumerate(chain.groups) if code in ("CHOH", "CH2OH") and i + 1 not in skip)


@dataclass(frozen=True)
class Residue:
    """One residue: sugar, ring, anomer and the sorted positions that carry other residues."""

    chain: Chain
    ring: str
    anomer: str
    linked: tuple[int, ...] = ()

    def __post_init__(self) -> None:
        if self.ring not in RINGS:
            raise StructureError(f"ring must be one of {', '.join(RINGS)}, got {self.ring!r}")
        if self.anomer not in ANOMERS:
            raise StructureError(f"anomer must be one of {', '.join(ANOMERS)}, got {self.anomer!r}")
        if RingForm(self.ring, self.anomer) not in ring_forms(self.chain):
            raise StructureError(f"{display_name(self.chain)} cannot form a {self.ring} ring")
        linked = tuple(sorted(set(self.linked)))
        if linked != tuple(self.linked):
            object.__setattr__(self, "linked", linked)
        free = free_positions(self.chain, self.ring)
        wrong = [k for k in linked if k not in free]
        if wrong:
            raise StructureError(
                f"{display_name(self.chain)} {self.ring}: O-{wrong[0]} is not a free hydroxyl; "
                f"linkable positions are {', '.join(map(str, free)) or 'none'}"
            )

    def __hash__(self) -> int:
        """Hash computed once: residues key the engine's caches."""
        cached = self.__dict__.get("_hash")
        if cached is None:
            cached = hash((self.chain, self.ring, self.anomer, self.linked))
            object.__setattr__(self, "_hash", cached)
        return cached

    # ------------------------------------------------------------ derived values
    @property
    def anomeric_carbon(self) -> int:
        """C-1 of an aldose, C-2 of a 2-ketose."""
        return _anomeric(self.chain)

    @property
    def ring_carbon(self) -> int:
        """The carbon whose oxygen closes the ring (C-5 aldopyranose, C-4 aldofuranose, C-6/C-5 ketoses)."""
        return _ring_carbon(self.chain, self.ring)

    @property
    def free_positions(self) -> tuple[int, ...]:
        """Positions with a free hydroxyl in the ring form (linked or not)."""
        return free_positions(self.chain, self.ring)

    @property
    def unsubstituted(self) -> tuple[int, ...]:
        """Positions whose hydroxyl stays free in the polymer."""
        return tuple(k for k in self.free_positions if k not in self.linked)

    @property
    def sugar(self) -> str:
        """The sugar's name, e.g. ``D-glucose``."""
        return display_name(self.chain)

    @property
    def is_terminal(self) -> bool:
        """A non-reducing terminal residue (no other residue attached)."""
        return not self.linked

    @property
    def is_branch_point(self) -> bool:
        """Two or more residues attached: one extra non-reducing end per extra branch."""
        return len(self.linked) >= 2

    @cached_property
    def symbol(self) -> str:
        """Condensed symbol with ring letter, e.g. ``alpha-D-Glcp``, ``beta-D-GlcpNAc``, ``alpha-L-IdopA``.

        The ring letter follows the parent's symbol, before a suffix for an
        amino, N-acetyl or uronic group (IUPAC-IUBMB 1996, 2-Carb-38).
        """
        series, sym = sugar_symbol(self.chain)
        head = f"{self.anomer}-{series}-" if series else f"{self.anomer}-"
        m = re.match(r"^(?P<root>.*[a-z])(?P<suffix>NAc|NGc|N|A)$", sym)
        if m:
            return f"{head}{m['root']}{self.ring[0]}{m['suffix']}"
        return f"{head}{sym}{self.ring[0]}"

    @cached_property
    def name(self) -> str:
        """IUPAC condensed form, e.g. ``->4)-alpha-D-Glcp-(1->`` (terminal: ``alpha-D-Glcp-(1->``)."""
        head = f"->{','.join(map(str, self.linked))})-" if self.linked else ""
        return f"{head}{self.symbol}-({self.anomeric_carbon}->"

    @property
    def display(self) -> str:
        """The condensed name with arrows and Greek letters, e.g. ``→4)-α-D-Glcp-(1→``."""
        return self.name.replace("->", "\u2192").replace("alpha", "\u03b1").replace("beta", "\u03b2")

    @property
    def smiles(self) -> str:
        """Canonical SMILES of the residue with ``*`` for the aglycone and each attached residue."""
        return residue_smiles(self)

    def __str__(self) -> str:
        return self.name

    def to_dict(self) -> dict:
        """Survivor form of Contract 5: sugar, ring, anomer, linked_positions, name."""
        return {
            "sugar": self.sugar,
            "ring": self.ring,
            "anomer": self.anomer,
            "linked_positions": list(self.linked),
            "name": self.name,
        }


# ------------------------------------------------------------------ structure
def _backbone(mol: Chem.Mol) -> list[int]:
    """Chain carbons in written order (C-1 first): not O-methyl carbons nor the acetyl of NHAc."""
    amide = {
        a.GetIdx()
        for a in mol.GetAtoms()
        if a.GetAtomicNum() == 6
        and any(n.GetAtomicNum() == 7 for n in a.GetNeighbors())
        and any(b.GetBondType() == Chem.BondType.DOUBLE for b in a.GetBonds())
    }  # the C=O of an acetamido group
    out = []
    for atom in mol.GetAtoms():
        if atom.GetAtomicNum() != 6 or atom.GetIdx() in amide:
            continue
        nbrs = atom.GetNeighbors()
        if len(nbrs) == 1 and (nbrs[0].GetAtomicNum() == 8 or nbrs[0].GetIdx() in amide):
            continue  # the methyl of OMe or of an acetyl
        out.append(atom.GetIdx())
    return out


def _free_oxygen(atom: Chem.Atom) -> Chem.Atom | None:
    for nb in atom.GetNeighbors():
        if nb.GetAtomicNum() == 8 and nb.GetDegree() == 1:
            bond = atom.GetOwningMol().GetBondBetweenAtoms(atom.GetIdx(), nb.GetIdx())
            if bond.GetBondType() == Chem.BondType.SINGLE:
                return nb
    return None


@lru_cache(maxsize=65536)
def _marked(residue: Residue) -> Chem.Mol:
    chain = residue.chain
    written = _write(chain, RingForm(residue.ring, residue.anomer, methyl=True))
    with quiet_rdkit():
        mol = Chem.MolFromSmiles(written)
    if mol is None:  # pragma: no cover - the writer is tested on the whole catalogue
        raise StructureError(f"RDKit could not read the glycoside {written!r}")
    backbone = _backbone(mol)
    if len(backbone) != chain.carbons:  # pragma: no cover
        raise StructureError(f"{residue}: found {len(backbone)} chain carbons, expected {chain.carbons}")
    rw = Chem.RWMol(mol)
    for k, idx in enumerate(backbone, 1):
        rw.GetAtomWithIdx(idx).SetIntProp("locant", k)
    anomeric = rw.GetAtomWithIdx(backbone[residue.anomeric_carbon - 1])
    for o in anomeric.GetNeighbors():
        if o.GetAtomicNum() != 8 or o.IsInRing():
            continue
        for c in o.GetNeighbors():
            if c.GetIdx() != anomeric.GetIdx() and c.GetAtomicNum() == 6:
                c.SetAtomicNum(0)  # the aglycone: the next residue towards the reducing end
                c.SetNoImplicit(True)
                c.SetNumExplicitHs(0)
    for k in residue.linked:
        oxygen = _free_oxygen(rw.GetAtomWithIdx(backbone[k - 1]))
        if oxygen is None:  # pragma: no cover - Residue validates the positions
            raise StructureError(f"{residue}: no free hydroxyl at C-{k}")
        dummy = rw.AddAtom(Chem.Atom(0))
        rw.AddBond(oxygen.GetIdx(), dummy, Chem.BondType.SINGLE)
    out = rw.GetMol()
    with quiet_rdkit():
        Chem.SanitizeMol(out)
    return out


def residue_mol(residue: Residue) -> Chem.Mol:
    """A fresh RDKit molecule of the residue: ``*`` on the aglycone and the linked oxygens.

    Every chain carbon has the integer property ``locant`` (1 ... n).
    """
    return Chem.Mol(_marked(residue))


@lru_cache(maxsize=65536)
def residue_smiles(residue: Residue) -> str:
    """Canonical isomeric SMILES of :func:`residue_mol`."""
    return canonical(Chem.MolToSmiles(_marked(residue)))


# ------------------------------------------------------------------ scope
_RESIDUE_KEYS = ("ring", "anomer", "max_linked")


@dataclass(frozen=True)
class ResidueScope(Scope):
    """What a residue unknown may be: the sugars (the keys of :class:`Scope`), rings, anomers, linkage.

    Defaults: the pentoses, hexoses, 6-deoxyhexoses, hexuronic acids and
    2-acetamido-2-deoxy aldoses (GlcNAc, GalNAc, ManNAc ...) of both series,
    aldoses and 2-ketoses (carbons 5-6, modifications none, deoxy:6, uronic,
    acetamido:2); both rings, both anomers, at most 2 linked positions.
    With ``sugars`` (names) the candidates are those sugars, filtered by the
    other sugar keys only where they are given.
    """

    carbons: tuple[int, ...] = (5, 6)
    modifications: tuple[str, ...] = ("none", "deoxy:6", "uronic", "acetamido:2")
    ring: tuple[str, ...] = RINGS
    anomer: tuple[str, ...] = ANOMERS
    max_linked: int = 2

    def __post_init__(self) -> None:
        super().__post_init__()
        for r in self.ring:
            if r not in RINGS:
                raise ScopeError(f"scope 'ring': {r!r} is not 'pyranose' or 'furanose'")
        for a in self.anomer:
            if a not in ANOMERS:
                raise ScopeError(f"scope 'anomer': {a!r} is not 'alpha' or 'beta'")
        if not self.ring or not self.anomer:
            raise ScopeError("scope 'ring' and 'anomer' may not be empty lists")
        m = self.max_linked
        if isinstance(m, bool) or not isinstance(m, int) or not 0 <= m <= 4:
            raise ScopeError(f"scope 'max_linked': {m!r} is not a whole number from 0 to 4")
        for chain in catalogue(self.sugar_scope):
            if chain.amino_positions or chain.methoxy_positions:
                raise ScopeError(
                    f"scope: {display_name(chain)} cannot be a residue here; free amino and O-methyl sugars "
                    "are not modelled as glycan residues (N-acetyl sugars such as GlcNAc are)"
                )

    @property
    def sugar_scope(self) -> Scope:
        """The plain :class:`Scope` of the sugars."""
        return Scope(self.carbons, self.carbonyl, self.series, self.modifications, self.sugars)

    @classmethod
    def from_dict(cls, data: dict) -> ResidueScope:
        """The residue scope of a project file's ``scope`` object (missing keys take defaults)."""
        keys = ("carbons", "carbonyl", "series", "modifications", "sugars", "ring", "anomer")
        unknown = set(data) - set(keys) - {"max_linked"}
        if unknown:
            raise ScopeError(f"unknown scope key(s) {sorted(unknown)}; use {', '.join(keys)}, max_linked")
        kwargs: dict = {}
        if "sugars" in data:  # named sugars: the other sugar keys filter only where given
            kwargs.update(carbons=tuple(range(3, 10)), modifications=("none",))
        for key in keys:
            if key in data:
                if not isinstance(data[key], list):
                    raise ScopeError(f"scope '{key}' must be a list, got {type(data[key]).__name__}")
                kwargs[key] = tuple(data[key])
        if "max_linked" in data:
            kwargs["max_linked"] = data["max_linked"]
        return cls(**kwargs)

    def to_dict(self) -> dict:
        """The project-file form of this scope."""
        return {
            **super().to_dict(),
            "ring": list(self.ring),
            "anomer": list(self.anomer),
            "max_linked": self.max_linked,
        }

    def candidates(self) -> tuple[Residue, ...]:  # type: ignore[override]
        """Every residue of this scope (:func:`residue_catalogue`)."""
        return residue_catalogue(self)


DEFAULT_RESIDUE_SCOPE = ResidueScope()


def _enumerate(scope: ResidueScope) -> Iterator[Residue]:
    for chain in catalogue(scope.sugar_scope):
        forms = ring_forms(chain)
        for ring in scope.ring:
            for anomer in scope.anomer:
                if RingForm(ring, anomer) not in forms:
                    continue
                free = free_positions(chain, ring)
                for size in range(0, min(scope.max_linked, len(free)) + 1):
                    for linked in itertools.combinations(free, size):
                        yield Residue(chain, ring, anomer, linked)


@lru_cache(maxsize=64)
def residue_catalogue(scope: ResidueScope = DEFAULT_RESIDUE_SCOPE) -> tuple[Residue, ...]:
    """Every residue of ``scope`` in a fixed order (sugar, ring, anomer, linkage); cached per scope."""
    return tuple(_enumerate(scope))
