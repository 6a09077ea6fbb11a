"""Ring layout: which substituent stands on which face of a ring form.

Pure Python and cached, fast enough for the constraint engine. The faces are
those of a Haworth formula (numbering clockwise seen from above): a
heteroatom on the right of the Fischer projection points down; at the
ring-closing carbon the rest of the chain points up when that carbon's
oxygen was on the right (D-pyranoses: C-6 up). The anomeric oxygen stands,
in the Fischer projection, on the side of the reference atom's oxygen for
alpha and on the other side for beta (IUPAC-IUBMB 2-Carb-6.2), and then
follows the same right-is-down rule.

The 3D conformers (:mod:`workbench.conformers.conformer`) measure the same
faces on MMFF geometries; the tests check that the two agree.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import cache

from workbench.chem.chain import GROUPS, RIGHT, Chain
from workbench.chem.smiles import RingForm, reference_side, ring_forms
from workbench.conformers.chair import DOWN, UP
from workbench.errors import StructureError

__all__ = [
    "Substituent",
    "RingPosition",
    "RingLayout",
    "ring_layout",
    "HYDROGEN",
]


@dataclass(frozen=True)
class Substituent:
    """An exocyclic atom on a ring carbon.

    ``element`` is H, C, N or O; ``beta`` lists the elements bonded to it
    other than the ring carbon (needed for the Haasnoot-Altona beta effect);
    ``label`` names it the way chemists do (``O1``, ``C6``, ``N2``, ``H3``).
    """

    element: str
    beta: tuple[str, ...]
    label: str

    @property
    def kind(self) -> str:
        """Class in Angyal's scheme: ``"O"`` (OH, OMe, NH2 alike), ``"C"`` or ``"H"``."""
        return "O" if self.element in ("O", "N") else self.element

    @property
    def is_hydrogen(self) -> bool:
        """True for a hydrogen atom."""
        return self.element == "H"


HYDROGEN = Substituent("H", (), "H")


@dataclass(frozen=True)
class RingPosition:
    """Ring position ``position`` (1 = anomeric carbon) of chain carbon ``carbon``."""

    position: int
    carbon: int
    up: Substituent
    down: Substituent

    def on(self, face: str) -> Substituent:
        """The substituent on ``face`` (``"up"`` or ``"down"``)."""
        return self.up if face == UP else self.down

    @property
    def hydrogens(self) -> int:
        """Number of hydrogens on this ring carbon."""
        return int(self.up.is_hydrogen) + int(self.down.is_hydrogen)


@dataclass(frozen=True)
class RingLayout:
    """A ring form laid out by position: ring O is position 0, then C-anomeric ... C-closing."""

    chain: Chain
    form: RingForm
    size: int
    anomeric: int
    positions: tuple[RingPosition, ...]
    exo_face: str  # face of the anomeric oxygen

    @property
    def closing(self) -> int:
        """Chain number of the ring-closing carbon."""
        return self.anomeric + self.size - 2

    def at(self, position: int) -> RingPosition:
        """The ring carbon at ``position`` (1 ... size-1)."""
        return self.positions[position - 1]


def _atoms(code: str) -> list[str]:
    """Elements bonded to a chain carbon with group ``code``, chain carbons excluded."""
    group = GROUPS[code]
    out = ["H"] * group.hydrogens
    for branch in group.branches:
        out.append(branch.lstrip("=")[0])
    return out


def _carbon_substituent(chain: Chain, carbon: int, towards: int) -> Substituent:
    """Chain carbon ``carbon`` seen as a substituent of its neighbour ``towards``."""
    beta = _atoms(chain.groups[carbon - 1])
    further = carbon + (carbon - towards)
    if 1 <= further <= chain.carbons:
        beta.append("C")
    return Substituent("C", tuple(beta), f"C{carbon}")


def _hetero_substituent(chain: Chain, carbon: int) -> Substituent:
    code = chain.groups[carbon - 1]
    if code == "CHOH":
        return Substituent("O", ("H",), f"O{carbon}")
    if code == "CHNH2":
        return Substituent("N", ("H", "H"), f"N{carbon}")
    if code == "CHNHAc":
        return Substituent("N", ("H", "C"), f"N{carbon}")
    if code == "CHOMe":
        return Substituent("O", ("C",), f"O{carbon}")
    raise StructureError(f"C-{carbon}: group {code} is not a ring carbon stereosieve lays out")


def _face_of(side: str | None) -> str:
    return DOWN if side == RIGHT else UP


@cache
def ring_layout(chain: Chain, form: RingForm) -> RingLayout:
    """The Haworth layout of ``chain`` in ring ``form`` (raises if the ring cannot form)."""
    if RingForm(form.ring, form.anomer) not in ring_forms(chain):
        raise StructureError(f"{chain}: cannot adopt the {form.key} form")
    size = 6 if form.ring == "pyranose" else 5
    anomeric = 1 if chain.carbonyl == "aldose" else 2
    closing = anomeric + size - 2
    reference_right = reference_side(chain) == RIGHT  # 2-Carb-6.2: not always the D/L atom
    exo_right = reference_right if form.anomer == "alpha" else not reference_right
    exo_face = DOWN if exo_right else UP
    positions: list[RingPosition] = []
    for p in range(1, size):
        k = anomeric + p - 1
        code = chain.groups[k - 1]
        if k == anomeric:
            exo = Substituent("O", ("C",) if form.methyl else ("H",), f"O{k}")
            if chain.carbonyl == "aldose":
                other = Substituent("H", (), f"H{k}")
            else:
                other = _carbon_substituent(chain, 1, towards=2)
            up, down = (exo, other) if exo_face == UP else (other, exo)
        elif k == closing:
            h = Substituent("H", (), f"H{k}")
            if k == chain.carbons:  # terminal CH2OH closes the ring: two hydrogens
                up, down = h, h
            else:
                rest = _carbon_substituent(chain, k + 1, towards=k)
                rest_face = UP if chain.sides[k - 1] == RIGHT else DOWN
                up, down = (rest, h) if rest_face == UP else (h, rest)
        else:
            h = Substituent("H", (), f"H{k}")
            if code == "CH2":
                up, down = h, h
            else:
                hetero = _hetero_substituent(chain, k)
                face = _face_of(chain.sides[k - 1])
                up, down = (hetero, h) if face == UP else (h, hetero)
        positions.append(RingPosition(p, k, up, down))
    return RingLayout(chain, form, size, anomeric, tuple(positions), exo_face)
