"""The structure model: an unbranched carbon chain, one group per carbon.

A :class:`Chain` is read from C-1 downwards, as in a Fischer projection. Each
carbon carries a group code (see :data:`GROUPS`) and, where the carbon is a
stereocentre, the side of the Fischer projection its heteroatom stands on
(``"right"`` or ``"left"``). The same value object models the sugars
themselves (candidates) and their products (alditols, aldonic and aldaric
acids, osazones), so that every product can be written as SMILES, named and
drawn by the same code.

D/L follows IUPAC-IUBMB 2-Carb-4.2: the side of the heteroatom on the
highest-numbered stereocentre (right = D).
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from functools import cached_property

from workbench.errors import StructureError

__all__ = [
    "GROUPS",
    "STEREO_GROUPS",
    "RIGHT",
    "LEFT",
    "Chain",
    "Group",
    "register_svg_renderer",
]

# The display layer registers its Fischer-projection drawer here on import, so
# that the structure model draws itself in a notebook without importing the
# display layer (the dependencies point downwards only).
_svg_renderer: Callable[[Chain], str] | None = None


def register_svg_renderer(renderer: Callable[[Chain], str] | None) -> None:
    """Set the function that draws a :class:`Chain` as SVG for ``_repr_svg_`` (None: no drawing)."""
    global _svg_renderer
    _svg_renderer = renderer


RIGHT = "right"
LEFT = "left"


@dataclass(frozen=True)
class Group:
    """One carbon's group: its code, where it may stand, and its atoms.

    ``branches`` are SMILES fragments bonded to the carbon (written as SMILES
    branches); ``formula`` counts C, H, N, O of the carbon and its branches.
    """

    code: str
    terminal: bool  # may stand at a chain end
    internal: bool  # may stand inside the chain
    stereo: bool  # carbon is a stereocentre inside a chain (CHX)
    hydrogens: int  # H on the carbon itself
    branches: tuple[str, ...]
    formula: tuple[int, int, int, int]  # C, H, N, O of carbon plus branches
    oxidation_label: str


_PH = "c1ccccc1"

GROUPS: dict[str, Group] = {
    g.code: g
    for g in (
        Group("CHO", True, False, False, 1, ("=O",), (1, 1, 0, 1), "aldehyde"),
        Group("CO", False, True, False, 0, ("=O",), (1, 0, 0, 1), "ketone"),
        Group("CH2OH", True, False, False, 2, ("O",), (1, 3, 0, 1), "primary alcohol"),
        Group("CH3", True, False, False, 3, (), (1, 3, 0, 0), "methyl (deoxy)"),
        Group("CH2", False, True, False, 2, (), (1, 2, 0, 0), "methylene (deoxy)"),
        Group("CHOH", False, True, True, 1, ("O",), (1, 2, 0, 1), "secondary alcohol"),
        Group("CHNH2", False, True, True, 1, ("N",), (1, 3, 1, 0), "amine"),
        Group("CHNHAc", False, True, True, 1, ("NC(C)=O",), (3, 5, 1, 1), "acetamido (N-acetyl amine)"),
        Group("CHOMe", False, True, True, 1, ("OC",), (2, 4, 0, 1), "methyl ether"),
        Group("COOH", True, False, False, 0, ("=O", "O"), (1, 1, 0, 2), "carboxylic acid"),
        Group("CHNNPh", True, False, False, 1, ("=NN" + _PH,), (7, 7, 2, 0), "phenylhydrazone"),
        Group("CNNPh", False, True, False, 0, ("=NN" + _PH,), (7, 6, 2, 0), "phenylhydrazone"),
    )
}
STEREO_GROUPS = frozenset(code for code, g in GROUPS.items() if g.stereo)

# The heteroatom (as written in ``branches``) that decides a stereocentre's side.
_SIDE_ATOM = {"CHOH": "O", "CHNH2": "N", "CHNHAc": "N", "CHOMe": "O"}


@dataclass(frozen=True)
class Chain:
    """An unbranched carbon chain C-1 ... C-n with a group and side per carbon.

    ``groups[i]`` is the group code of C-(i+1); ``sides[i]`` is ``"right"`` or
    ``"left"`` for a stereocentre and ``None`` otherwise.
    """

    groups: tuple[str, ...]
    sides: tuple[str | None, ...]

    def __post_init__(self) -> None:
        n = len(self.groups)
        if n < 2:
            raise StructureError(f"a chain needs at least 2 carbons, got {n}")
        if len(self.sides) != n:
            raise StructureError(f"{n} groups but {len(self.sides)} sides")
        for i, (code, side) in enumerate(zip(self.groups, self.sides, strict=True)):
            group = GROUPS.get(code)
            if group is None:
                raise StructureError(f"C-{i + 1}: unknown group {code!r}; known: {', '.join(GROUPS)}")
            end = i in (0, n - 1)
            if end and not group.terminal:
                raise StructureError(f"C-{i + 1}: group {code} cannot end a chain")
            if not end and not group.internal:
                raise StructureError(f"C-{i + 1}: group {code} cannot stand inside a chain")
            if group.stereo and side not in (RIGHT, LEFT):
                raise StructureError(f"C-{i + 1}: stereocentre {code} needs side 'right' or 'left', got {side!r}")
            if not group.stereo and side is not None:
                raise StructureError(f"C-{i + 1}: {code} is not a stereocentre but has side {side!r}")

    def __hash__(self) -> int:
        """Hash of (groups, sides), computed once: chains key every cache of the workbench."""
        cached = self.__dict__.get("_hash")
        if cached is None:
            cached = hash((self.groups, self.sides))
            object.__setattr__(self, "_hash", cached)
        return cached

    # ----------------------------------------------------------- derived values
    @property
    def carbons(self) -> int:
        """Number of carbons in the chain."""
        return len(self.groups)

    @cached_property
    def stereocentres(self) -> tuple[int, ...]:
        """1-based numbers of the carbons that are stereocentres, ascending."""
        return tuple(i + 1 for i, g in enumerate(self.groups) if g in STEREO_GROUPS)

    @property
    def carbonyl(self) -> str | None:
        """``"aldose"`` (aldehyde at C-1), ``"ketose"`` (ketone at C-2) or None."""
        if self.groups[0] == "CHO":
            return "aldose"
        if self.carbons > 2 and self.groups[1] == "CO" and "CHO" not in self.groups:
            return "ketose"
        return None

    @property
    def is_sugar(self) -> bool:
        """True for an aldose or 2-ketose with no second carbonyl: a candidate."""
        return self.carbonyl is not None and self.groups.count("CO") + self.groups.count("CHO") == 1

    @property
    def is_alditol(self) -> bool:
        """A parent alditol: CH2OH, CH(OH) only, CH2OH (the borohydride product of a parent aldose)."""
        inner = set(self.groups[1:-1])
        return self.carbons >= 3 and self.groups[0] == self.groups[-1] == "CH2OH" and inner <= {"CHOH"}

    @property
    def series(self) -> str | None:
        """``"D"`` or ``"L"`` from the highest-numbered stereocentre (2-Carb-4.2)."""
        if not self.stereocentres:
            return None
        return "D" if self.sides[self.stereocentres[-1] - 1] == RIGHT else "L"

    @property
    def formula(self) -> str:
        """Molecular formula in Hill order, e.g. ``C6H12O6``."""
        c = h = n = o = 0
        for code in self.groups:
            dc, dh, dn, do = GROUPS[code].formula
            c, h, n, o = c + dc, h + dh, n + dn, o + do
        parts = [("C", c), ("H", h), ("N", n), ("O", o)]
        return "".join(f"{el}{k if k > 1 else ''}" for el, k in parts if k)

    @cached_property
    def deoxy_positions(self) -> tuple[int, ...]:
        """Carbons that carry H in place of the usual OH (CH3 or CH2)."""
        out = []
        for i, code in enumerate(self.groups):
            if code in ("CH3", "CH2"):
                out.append(i + 1)
        return tuple(out)

    @cached_property
    def amino_positions(self) -> tuple[int, ...]:
        """Carbons that carry NH2 in place of OH."""
        return tuple(i + 1 for i, code in enumerate(self.groups) if code == "CHNH2")

    @cached_property
    def acetamido_positions(self) -> tuple[int, ...]:
        """Carbons that carry NHAc (an N-acetylated amino group) in place of OH."""
        return tuple(i + 1 for i, code in enumerate(self.groups) if code == "CHNHAc")

    @property
    def has_nitrogen(self) -> bool:
        """True for amino and N-acetyl amino sugars (models calibrated on O-sugars do not cover them)."""
        return bool(self.amino_positions or self.acetamido_positions)

    @cached_property
    def methoxy_positions(self) -> tuple[int, ...]:
        """Carbons that carry OMe in place of OH."""
        return tuple(i + 1 for i, code in enumerate(self.groups) if code == "CHOMe")

    @property
    def is_uronic(self) -> bool:
        """An aldose whose last carbon is a carboxylic acid."""
        return self.carbonyl == "aldose" and self.groups[-1] == "COOH"

    def side_atom(self, carbon: int) -> str:
        """The heteroatom symbol (O or N) whose side defines stereocentre ``carbon``."""
        return _SIDE_ATOM[self.groups[carbon - 1]]

    # ----------------------------------------------------------- transformations
    def mirror(self) -> Chain:
        """The enantiomer: every stereocentre's side swapped."""
        flip = {RIGHT: LEFT, LEFT: RIGHT, None: None}
        return Chain(self.groups, tuple(flip[s] for s in self.sides))

    def reversed(self) -> Chain:
        """The same molecule read from the other end.

        Turning a Fischer projection upside down (180 degrees in the plane)
        swaps left and right, so every side flips as the order reverses.
        """
        flip = {RIGHT: LEFT, LEFT: RIGHT, None: None}
        return Chain(self.groups[::-1], tuple(flip[s] for s in self.sides[::-1]))

    def replace(self, carbon: int, group: str, side: str | None = None) -> Chain:
        """A new chain with C-``carbon`` given ``group`` (and ``side`` if stereo)."""
        i = carbon - 1
        groups = self.groups[:i] + (group,) + self.groups[i + 1 :]
        sides = self.sides[:i] + (side,) + self.sides[i + 1 :]
        return Chain(groups, sides)

    @property
    def pattern(self) -> str:
        """Compact text: groups with r/l marks, e.g. ``CHO-CHOH(r)-...-CH2OH``."""
        return "-".join(f"{g}({s[0]})" if s else g for g, s in zip(self.groups, self.sides, strict=True))

    def __str__(self) -> str:
        return self.pattern

    def _repr_svg_(self) -> str | None:
        """The Fischer projection drawn by the renderer the display layer registered (None before)."""
        return None if _svg_renderer is None else _svg_renderer(self)

    @classmethod
    def from_pattern(cls, text: str) -> Chain:
        """Inverse of :attr:`pattern`."""
        groups: list[str] = []
        sides: list[str | None] = []
        for token in text.split("-"):
            token = token.strip()
            if token.endswith(")") and "(" in token:
                code, mark = token[:-1].split("(")
                side = {"r": RIGHT, "l": LEFT}.get(mark)
                if side is None:
                    raise StructureError(f"bad side mark {mark!r} in {text!r}; use r or l")
            else:
                code, side = token, None
            groups.append(code)
            sides.append(side)
        return cls(tuple(groups), tuple(sides))
