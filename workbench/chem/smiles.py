"""Writing a :class:`~workbench.chem.chain.Chain` as SMILES and RDKit molecules.

Open chains are written from C-1 downwards with every stereocentre as
``[C@H](X)`` or ``[C@@H](X)`` between its chain neighbours; ``[C@H](X)`` puts X
on the right of the Fischer projection (neighbour order previous carbon, H, X,
next carbon). Ring forms (pyranose, furanose, their methyl glycosides) are
written the same way with the ring oxygen as a branch of the ring-closing
carbon; the anomeric centre's tag is derived from its Fischer arrangement.

alpha/beta follow the IUPAC anomeric reference atom rule (2-Carb-6.2): alpha
when the exocyclic anomeric oxygen is formally cis, in the Fischer projection,
to the oxygen on the anomeric reference atom. With one configurational prefix
(up to four centres) that atom is the configurational atom, the
highest-numbered centre; with several prefixes it is the highest-numbered
centre of the group next to the anomeric centre, i.e. of the first four
centres counted from C-1 (2-Carb-8.3): C-5 of L-glycero-D-manno-heptose, as in
"methyl L-glycero-alpha-D-manno-heptopyranoside".
"""

from __future__ import annotations

import contextlib
from collections.abc import Iterator
from dataclasses import dataclass
from functools import cache, lru_cache

from rdkit import Chem, rdBase

from workbench.chem.chain import GROUPS, LEFT, RIGHT, Chain
from workbench.errors import StructureError

__all__ = [
    "RING_FORMS",
    "RingForm",
    "quiet_rdkit",
    "to_smiles",
    "to_mol",
    "canonical",
    "mirror_smiles",
    "is_achiral",
    "ring_form",
    "ring_forms",
    "reference_atom",
    "reference_side",
    "to_inchi",
    "to_inchikey",
]

_RING_DIGIT = "9"


@contextlib.contextmanager
def quiet_rdkit() -> Iterator[None]:
    """Silence RDKit's own logger inside the block, then restore it."""
    rdBase.DisableLog("rdApp.*")
    try:
        yield
    finally:
        rdBase.EnableLog("rdApp.*")


@dataclass(frozen=True)
class RingForm:
    """A cyclic form: ring size (5 furanose, 6 pyranose), anomer, aglycone."""

    ring: str  # "pyranose" | "furanose"
    anomer: str  # "alpha" | "beta"
    methyl: bool = False  # methyl glycoside instead of free hemiacetal

    @property
    def key(self) -> str:
        """Key used in JSON, e.g. ``alpha_pyranose`` or ``methyl_beta_furanoside``."""
        if self.methyl:
            return f"methyl_{self.anomer}_{self.ring[:-1]}ide"
        return f"{self.anomer}_{self.ring}"


RING_FORMS: tuple[RingForm, ...] = tuple(
    RingForm(ring, anomer) for ring in ("pyranose", "furanose") for anomer in ("alpha", "beta")
)

_REFERENCE_ORDER = ("up", "left", "right", "down")  # a Fischer centre read as '@'


def _parity(order: list[str], reference: tuple[str, ...]) -> int:
    """0 if ``order`` is an even permutation of ``reference``, else 1."""
    perm = [reference.index(x) for x in order]
    swaps = 0
    for i in range(len(perm)):
        while perm[i] != i:
            j = perm[i]
            perm[i], perm[j] = perm[j], perm[i]
            swaps += 1
    return swaps % 2


def _tag(written: list[str], fischer: dict[str, str]) -> str:
    """Chirality tag for neighbours ``written`` (SMILES order) of a Fischer centre.

    ``fischer`` maps ``up``/``down``/``left``/``right`` to neighbour labels.
    """
    where = {label: pos for pos, label in fischer.items()}
    order = [where[label] for label in written]
    return "@" if _parity(order, _REFERENCE_ORDER) == 0 else "@@"


def _ring_positions(chain: Chain, ring: str) -> tuple[int, int]:
    """(anomeric carbon, ring-closing carbon), 1-based, or raise if impossible."""
    kind = chain.carbonyl
    if kind is None or not chain.is_sugar:
        raise StructureError(f"{chain}: only an aldose or 2-ketose can form a ring")
    anomeric = 1 if kind == "aldose" else 2
    closing = anomeric + (4 if ring == "pyranose" else 3)
    if closing > chain.carbons:
        raise StructureError(f"{chain}: too short for a {ring} ring")
    if chain.groups[closing - 1] not in ("CHOH", "CH2OH"):
        raise StructureError(f"{chain}: C-{closing} has no hydroxyl to close a {ring} ring")
    return anomeric, closing


# Centres per configurational prefix (IUPAC-IUBMB 2-Carb-8.3).
_PREFIX_GROUP = 4


def reference_atom(chain: Chain) -> int:
    """The anomeric reference atom (1-based carbon number), IUPAC-IUBMB 2-Carb-6.2.

    The highest-numbered stereocentre of the configurational prefix group
    next to the anomeric centre. Prefixes cover groups of four centres counted
    from C-1 (2-Carb-8.3), so this is the fourth centre when there are more
    than four (C-5 of a heptose or octose, C-6 of an oct-2-ulose) and the
    highest-numbered one otherwise (the configurational atom that gives D/L).
    """
    centres = chain.stereocentres
    if not centres:
        raise StructureError(f"{chain}: no stereocentre, so alpha/beta are undefined")
    return centres[min(_PREFIX_GROUP, len(centres)) - 1]


def reference_side(chain: Chain) -> str:
    """Fischer side (``right``/``left``) of the heteroatom on the anomeric reference atom."""
    return chain.sides[reference_atom(chain) - 1] or RIGHT


def _write(chain: Chain, form: RingForm | None) -> str:
    """The SMILES text of ``chain`` open (``form`` None) or in ring ``form``."""
    n = chain.carbons
    anomeric = closing = 0
    exo_side = ""
    if form is not None:
        anomeric, closing = _ring_positions(chain, form.ring)
        ref = reference_side(chain)
        other = LEFT if ref == RIGHT else RIGHT
        exo_side = ref if form.anomer == "alpha" else other
    parts: list[str] = []
    for i, code in enumerate(chain.groups):
        k = i + 1
        group = GROUPS[code]
        branches = list(group.branches)
        if k == closing:
            branches = [f"O{_RING_DIGIT}"]
        first, last = k == 1, k == n
        h = f"H{group.hydrogens}" if group.hydrogens > 1 else ("H" if group.hydrogens else "")
        if k == anomeric:
            exo = "OC" if form and form.methyl else "O"
            written: list[str] = []
            if not first:
                written.append("prev")
            if h:
                written.append("H")
            written += ["ring", "exo"]
            written.append("next")
            # Fischer-Tollens projection of a ring form: the ring bond leaves
            # the anomeric carbon upwards; the exocyclic O and the remaining
            # group (H of an aldose, C-1 of a 2-ketose) stand left and right.
            fischer = {"up": "ring", "down": "next"}
            fischer[exo_side] = "exo"
            fischer[LEFT if exo_side == RIGHT else RIGHT] = "H" if chain.carbonyl == "aldose" else "prev"
            if first:  # SMILES: implicit H of a leading atom is its first neighbour
                written = ["H"] + [w for w in written if w != "H"]
            tag = _tag(written, fischer)
            parts.append(f"[C{tag}{h}]{_RING_DIGIT}({exo})")
            continue
        if group.stereo:
            side = chain.sides[i]
            tag = "@" if side == RIGHT else "@@"
            if k == closing:
                parts.append(f"[C{tag}H](O{_RING_DIGIT})")
            else:
                parts.append(f"[C{tag}H]" + "".join(f"({b})" for b in branches))
            continue
        atom = "C"
        if first and branches and branches[0] == "=O":
            # "O=C..." reads better than "C(=O)..."; order does not matter here.
            parts.append(branches[0][1:] + "=" + atom + "".join(f"({b})" for b in branches[1:]))
            continue
        if last and branches and not branches[-1].startswith("=") and len(branches) == 1:
            parts.append(atom + branches[0])
            continue
        parts.append(atom + "".join(f"({b})" for b in branches))
    return "".join(parts)


@cache
def to_smiles(chain: Chain, form: RingForm | None = None) -> str:
    """Canonical isomeric SMILES of ``chain`` (open chain, or a ring ``form``)."""
    return canonical(_write(chain, form))


@lru_cache(maxsize=4096)
def _mol_from(smiles: str) -> Chem.Mol:
    with quiet_rdkit():
        mol = Chem.MolFromSmiles(smiles)
    if mol is None:
        raise StructureError(f"RDKit could not read SMILES {smiles!r}")
    return mol


def to_mol(chain: Chain, form: RingForm | None = None) -> Chem.Mol:
    """A fresh RDKit molecule of ``chain`` (a copy; callers may modify it)."""
    return Chem.Mol(_mol_from(to_smiles(chain, form)))


@cache
def canonical(smiles: str) -> str:
    """RDKit canonical isomeric SMILES of any SMILES text."""
    return Chem.MolToSmiles(_mol_from(smiles))


@cache
def mirror_smiles(smiles: str) -> str:
    """Canonical SMILES of the mirror image: every tetrahedral centre inverted."""
    mol = Chem.Mol(_mol_from(smiles))
    for atom in mol.GetAtoms():
        tag = atom.GetChiralTag()
        if tag == Chem.ChiralType.CHI_TETRAHEDRAL_CW:
            atom.SetChiralTag(Chem.ChiralType.CHI_TETRAHEDRAL_CCW)
        elif tag == Chem.ChiralType.CHI_TETRAHEDRAL_CCW:
            atom.SetChiralTag(Chem.ChiralType.CHI_TETRAHEDRAL_CW)
    return Chem.MolToSmiles(mol)


def is_achiral(smiles: str) -> bool:
    """True when the molecule is superimposable on its mirror image (meso or achiral)."""
    return canonical(smiles) == mirror_smiles(smiles)


def ring_form(ring: str, anomer: str, methyl: bool = False) -> RingForm:
    """Validated :class:`RingForm` from words."""
    if ring not in ("pyranose", "furanose"):
        raise StructureError(f"ring must be 'pyranose' or 'furanose', got {ring!r}")
    if anomer not in ("alpha", "beta"):
        raise StructureError(f"anomer must be 'alpha' or 'beta', got {anomer!r}")
    return RingForm(ring, anomer, methyl)


def ring_forms(chain: Chain) -> tuple[RingForm, ...]:
    """The free ring forms ``chain`` can adopt (empty for chains that cannot close)."""
    out = []
    for form in RING_FORMS:
        try:
            _ring_positions(chain, form.ring)
            reference_side(chain)
        except StructureError:
            continue
        out.append(form)
    return tuple(out)


@cache
def to_inchi(chain: Chain, form: RingForm | None = None) -> str:
    """Standard InChI of ``chain`` (open chain by default)."""
    with quiet_rdkit():
        return Chem.MolToInchi(_mol_from(to_smiles(chain, form)))


@cache
def to_inchikey(chain: Chain, form: RingForm | None = None) -> str:
    """Standard InChIKey of ``chain`` (open chain by default)."""
    with quiet_rdkit():
        return Chem.MolToInchiKey(_mol_from(to_smiles(chain, form)))
