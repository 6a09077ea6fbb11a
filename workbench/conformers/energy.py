"""Angyal's conformational free-energy scheme for pyranose chairs.

The free energy of a chair is a sum of pairwise interaction terms read off
the axial/equatorial pattern of an ideal chair (Angyal, Angew. Chem. Int.
Ed. 8, 157, 1969; Aust. J. Chem. 21, 2737, 1968). Values in kcal/mol, water,
as listed in REFERENCE_VALUES.md (Angyal 1968-69 [memory], matching the kJ
table of the *Encyclopedia of Physical Science and Technology*, 3rd ed.,
2001, "Carbohydrates", Table V):

- syn-axial (1,3-diaxial) O/O 1.5, O/C 2.5;
- an axial O or C against each syn-axial hydrogen: O/H 0.45, C/H 0.9;
- gauche on neighbouring ring carbons (eq/eq or ax/eq): O/O 0.35, O/C 0.45;
- anomeric effect of an OH in water, 0.55 (1.0 when the oxygen on the
  neighbouring ring carbon, O-2 of an aldose, is axial), charged to the chair
  whose anomeric oxygen is equatorial.

Generalisation (ours, stated so it can be judged): NH2 and OMe count as O;
CH2OH, CH3, COOH and longer chains count as C. A syn-axial C/C pair, which
occurs only in 2-ketoheptopyranoses and longer (C-1 against C-7), is not in
the table; we charge 3.7 kcal/mol, the 1,3-diaxial dimethyl interaction of
cyclohexane (Allinger and Miller, J. Am. Chem. Soc. 83, 2145, 1961 [memory]),
and say so in the term's text. A gauche C/C pair between neighbouring ring
carbons cannot occur for an unbranched chain. The ring oxygen carries no
substituents and so contributes no terms. Check: beta-D-glucopyranose 4C1
2.05, alpha 2.40 kcal/mol (Angyal's worked result).
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import cache

from workbench.conformers.chair import CHAIRS, axial_face, chair_label, other_face
from workbench.conformers.layout import RingLayout, Substituent
from workbench.errors import StructureError

__all__ = [
    "SYN_AXIAL_KCAL",
    "AXIAL_H_KCAL",
    "GAUCHE_KCAL",
    "ANOMERIC_KCAL",
    "ANOMERIC_O2_AXIAL_KCAL",
    "Term",
    "ChairEnergy",
    "chair_energy",
    "chair_energies",
]

# kcal/mol; sources in the module docstring.
SYN_AXIAL_KCAL: dict[frozenset[str], float] = {
    frozenset({"O"}): 1.5,
    frozenset({"O", "C"}): 2.5,
    frozenset({"C"}): 3.7,  # extrapolated, see module docstring
}
AXIAL_H_KCAL: dict[str, float] = {"O": 0.45, "C": 0.9}
GAUCHE_KCAL: dict[frozenset[str], float] = {frozenset({"O"}): 0.35, frozenset({"O", "C"}): 0.45}
ANOMERIC_KCAL = 0.55
ANOMERIC_O2_AXIAL_KCAL = 1.0

_SYN_AXIAL_PAIRS = ((1, 3), (2, 4), (3, 5), (1, 5))  # 1,3-related ring carbons of a pyranose
_NEIGHBOURS = ((1, 2), (2, 3), (3, 4), (4, 5))


@dataclass(frozen=True)
class Term:
    """One interaction of the scheme: what it is and its free energy (kcal/mol)."""

    text: str
    kcal: float


@dataclass(frozen=True)
class ChairEnergy:
    """Free energy of one chair (kcal/mol) with its axial/equatorial pattern.

    ``axial`` and ``equatorial`` list substituent labels (``O1``, ``C6`` ...);
    hydrogens are left out. ``terms`` explains the sum.
    """

    chair: str  # "A" or "B"
    label: str  # IUPAC name, e.g. "4C1"
    kcal: float
    axial: tuple[str, ...]
    equatorial: tuple[str, ...]
    terms: tuple[Term, ...]


def _pattern(layout: RingLayout, chair: str) -> tuple[dict[int, Substituent], dict[int, Substituent]]:
    """(axial, equatorial) substituent of each ring carbon, keyed by ring position 1-5."""
    ax: dict[int, Substituent] = {}
    eq: dict[int, Substituent] = {}
    for pos in layout.positions:
        face = axial_face(chair, pos.position)
        ax[pos.position] = pos.on(face)
        eq[pos.position] = pos.on(other_face(face))
    return ax, eq


def _score(layout: RingLayout, chair: str, explain: bool) -> tuple[float, list[Term]]:
    ax, eq = _pattern(layout, chair)
    total = 0.0
    terms: list[Term] = []
    value: float | None  # kcal/mol; a gauche pair may have no term (None)
    for i, j in _SYN_AXIAL_PAIRS:
        a, b = ax[i], ax[j]
        ka, kb = a.kind, b.kind
        if ka == "H" and kb == "H":
            continue
        if ka != "H" and kb != "H":
            value = SYN_AXIAL_KCAL[frozenset({ka, kb})]
            total += value
            if explain:
                extra = " (C/C extrapolated from cyclohexane)" if ka == kb == "C" else ""
                terms.append(Term(f"syn-axial {a.label}/{b.label}{extra}", value))
        else:
            heavy = a if ka != "H" else b
            value = AXIAL_H_KCAL[heavy.kind]
            total += value
            if explain:
                partner = layout.at(j if heavy is a else i).carbon
                terms.append(Term(f"axial {heavy.label} against H{partner}", value))
    for i, j in _NEIGHBOURS:
        for x_ax, x in ((True, ax[i]), (False, eq[i])):
            if x.kind == "H":
                continue
            for y_ax, y in ((True, ax[j]), (False, eq[j])):
                if y.kind == "H" or (x_ax and y_ax):
                    continue  # diaxial neighbours are anti, not gauche
                value = GAUCHE_KCAL.get(frozenset({x.kind, y.kind}))
                if value is None:
                    raise StructureError(f"{layout.chain}: no gauche term for {x.label}/{y.label}")
                total += value
                if explain:
                    terms.append(Term(f"gauche {x.label}/{y.label}", value))
    exo_label = f"O{layout.anomeric}"
    if eq[1].label == exo_label:
        o2_axial = ax[2].kind == "O"
        value = ANOMERIC_O2_AXIAL_KCAL if o2_axial else ANOMERIC_KCAL
        total += value
        if explain:
            why = f", {ax[2].label} axial" if o2_axial else ""
            terms.append(Term(f"anomeric effect lost, {exo_label} equatorial{why}", value))
    return total, terms


def chair_energy(layout: RingLayout, chair: str) -> ChairEnergy:
    """Angyal free energy (kcal/mol) of pyranose ``layout`` in ``chair`` with its terms."""
    if layout.size != 6:
        raise StructureError(f"{layout.form.key}: Angyal's chair scheme applies to pyranoses only")
    total, terms = _score(layout, chair, explain=True)
    ax, eq = _pattern(layout, chair)
    axial = tuple(s.label for s in ax.values() if not s.is_hydrogen)
    equatorial = tuple(s.label for s in eq.values() if not s.is_hydrogen)
    return ChairEnergy(chair, chair_label(chair, layout.anomeric), round(total, 10), axial, equatorial, tuple(terms))


@cache
def chair_energies(layout: RingLayout) -> tuple[float, float]:
    """Angyal free energies (kcal/mol) of chairs A and B, without the explanation (fast)."""
    if layout.size != 6:
        raise StructureError(f"{layout.form.key}: Angyal's chair scheme applies to pyranoses only")
    a, _ = _score(layout, CHAIRS[0], explain=False)
    b, _ = _score(layout, CHAIRS[1], explain=False)
    return a, b
