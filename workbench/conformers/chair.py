"""The ideal chair: ring geometry, chair names and axial faces.

A pyranose ring is handled by ring position ``p``: 0 is the ring oxygen,
1 the anomeric carbon, ..., 5 the ring-closing carbon. Substituents stand on
the "up" or "down" face, the faces of a Haworth formula drawn with the
numbering clockwise seen from above (ring O at the back right). Two chairs
exist:

- chair ``"A"``: Cremer-Pople theta near 0 deg; ring positions 0, 2, 4 are
  puckered up, so their axial bonds point up and those of 1, 3, 5 down. For an
  aldopyranose this is 4C1 (C-4 above, C-1 below the reference plane); for a
  2-ketopyranose it is 5C2.
- chair ``"B"``: theta near 180 deg, the ring flipped: 1C4 (aldoses), 2C5
  (2-ketoses).

Chair names follow IUPAC-IUBMB 2-Carb-7.3 (reference plane chosen so that the
lowest-numbered ring carbon is exoplanar). The idealised geometry
(:func:`ideal_chair`) has one ring torsion for all six ring bonds; at 60 deg
it is the diamond lattice (vicinal H-C-C-H torsions exactly 60 deg gauche and
180 deg anti). The coupling fast path uses :data:`PYRANOSE_RING_TORSION_DEG`,
the mean ring torsion we measure on MMFF94 pyranose chairs, which opens the
ax/eq and narrows the eq/eq gauche torsions the way real pyranose rings do.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from functools import cache

import numpy as np

from workbench.errors import StructureError

__all__ = [
    "CHAIRS",
    "PYRANOSE_RING_TORSION_DEG",
    "UP",
    "DOWN",
    "IdealChair",
    "axial_face",
    "chair_label",
    "chair_from_label",
    "ideal_chair",
    "other_face",
]

CHAIRS = ("A", "B")
UP = "up"
DOWN = "down"

BOND_LENGTH = 1.50  # angstrom; a mean of C-C (1.53) and C-O (1.43) for the ideal ring
# Mean |ring torsion| (deg) of the MMFF94 chairs of the ten aldohexo- and aldopentopyranoses,
# both anomers and both chairs, from workbench.conformers.conformer (our computation,
# 54.4 +/- 4.1 deg; checked by tests/test_conformers.py).
PYRANOSE_RING_TORSION_DEG = 54.0


def other_face(face: str) -> str:
    """The opposite face."""
    return DOWN if face == UP else UP


def axial_face(chair: str, position: int) -> str:
    """Face to which the axial bond of ring ``position`` (0-5) points in ``chair``."""
    if chair not in CHAIRS:
        raise StructureError(f"chair must be one of {CHAIRS}, got {chair!r}")
    even = position % 2 == 0
    return UP if even == (chair == "A") else DOWN


def chair_label(chair: str, anomeric: int) -> str:
    """IUPAC name of ``chair`` for a pyranose whose anomeric carbon is C-``anomeric``.

    ``chair_label("A", 1) == "4C1"``; ``chair_label("B", 2) == "2C5"``.
    """
    top = anomeric + 3
    if chair == "A":
        return f"{top}C{anomeric}"
    if chair == "B":
        return f"{anomeric}C{top}"
    raise StructureError(f"chair must be one of {CHAIRS}, got {chair!r}")


def chair_from_label(label: str, anomeric: int) -> str:
    """Inverse of :func:`chair_label`: ``"4C1"`` -> ``"A"`` for an aldopyranose."""
    for chair in CHAIRS:
        if chair_label(chair, anomeric) == label:
            return chair
    names = ", ".join(chair_label(c, anomeric) for c in CHAIRS)
    raise StructureError(f"unknown chair {label!r} for this ring; use {names} (or A/B)")


@dataclass(frozen=True)
class IdealChair:
    """Coordinates (angstrom) of an ideal chair and its exocyclic bond directions.

    ``ring[p]`` is the position of ring atom ``p``; ``bond[p][face]`` the unit
    vector of the exocyclic bond of atom ``p`` that points to ``face``
    (axial or equatorial, whichever lies on that face).
    """

    chair: str
    ring: np.ndarray
    bond: tuple[dict[str, np.ndarray], ...]

    def substituent(self, position: int, face: str) -> np.ndarray:
        """Position of a substituent atom on ``face`` of ring atom ``position``."""
        return self.ring[position] + BOND_LENGTH * self.bond[position][face]


@cache
def ideal_chair(chair: str, ring_torsion_deg: float = 60.0) -> IdealChair:
    """An idealised chair ``"A"`` or ``"B"`` with all ring torsions +/-``ring_torsion_deg``.

    The ring has D3d symmetry: ring atom ``p`` sits at azimuth -60 p deg, so
    that seen from +z the numbering runs clockwise and +z is the "up" face
    (the Cremer-Pople normal). Every ring bond is :data:`BOND_LENGTH` long;
    the ring bond angle follows from the torsion (109.47 deg at 60 deg,
    111.7 deg at 54 deg). The two exocyclic bonds of each ring atom lie in the
    plane bisecting its ring angle, 109.47 deg apart; the one nearer the
    normal is axial. At 60 deg this is the diamond lattice: torsions of
    exactly 60 deg (gauche) and 180 deg (anti).
    """
    if chair not in CHAIRS:
        raise StructureError(f"chair must be one of {CHAIRS}, got {chair!r}")
    if not 30.0 <= ring_torsion_deg <= 70.0:
        raise StructureError(f"ring torsion must lie between 30 and 70 deg, got {ring_torsion_deg}")

    def ring_for(rise: float) -> np.ndarray:
        half = BOND_LENGTH * rise / 2.0
        radius = BOND_LENGTH * math.sqrt(1.0 - rise * rise)
        xyz = np.zeros((6, 3))
        for p in range(6):
            angle = -math.pi / 3.0 * p
            up = axial_face(chair, p) == UP
            xyz[p] = (radius * math.cos(angle), radius * math.sin(angle), half if up else -half)
        return xyz

    lo, hi = 1e-3, 0.95  # rise between neighbours as a fraction of the bond length
    for _ in range(60):
        mid = 0.5 * (lo + hi)
        if abs(_torsion(*ring_for(mid)[0:4])) < ring_torsion_deg:
            lo = mid
        else:
            hi = mid
    ring = ring_for(0.5 * (lo + hi))
    half_angle = math.radians(109.4712206) / 2.0
    bonds: list[dict[str, np.ndarray]] = []
    for p in range(6):
        face = axial_face(chair, p)
        b1 = ring[(p - 1) % 6] - ring[p]
        b2 = ring[(p + 1) % 6] - ring[p]
        b1 /= np.linalg.norm(b1)
        b2 /= np.linalg.norm(b2)
        outward = -(b1 + b2)
        outward /= np.linalg.norm(outward)
        normal = np.cross(b1, b2)
        normal /= np.linalg.norm(normal)
        if (normal[2] > 0) != (face == UP):
            normal = -normal
        axial = math.cos(half_angle) * outward + math.sin(half_angle) * normal
        equatorial = math.cos(half_angle) * outward - math.sin(half_angle) * normal
        bonds.append({face: axial, other_face(face): equatorial})
    return IdealChair(chair, ring, tuple(bonds))


def _torsion(a: np.ndarray, b: np.ndarray, c: np.ndarray, d: np.ndarray) -> float:
    """Torsion a-b-c-d in degrees (IUPAC sign)."""
    b0, b1, b2 = a - b, c - b, d - c
    b1 = b1 / np.linalg.norm(b1)
    v = b0 - np.dot(b0, b1) * b1
    w = b2 - np.dot(b2, b1) * b1
    return math.degrees(math.atan2(float(np.dot(np.cross(b1, v), w)), float(np.dot(v, w))))
