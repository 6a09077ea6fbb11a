"""Ring puckering coordinates of Cremer and Pople, computed with numpy.

Cremer and Pople, J. Am. Chem. Soc. 97, 1354 (1975). The ring atoms are given
in ring order; for a glycopyranose the order used throughout stereosieve is
ring O, anomeric carbon, ..., ring-closing carbon (O5, C1 ... C5 of an
aldohexopyranose), for which the 4C1 chair has theta near 0 degrees and the
1C4 chair theta near 180 degrees. The mean-plane normal points to the side
from which the ring numbering runs clockwise (the "upper" face of a Haworth
formula).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from workbench.errors import StructureError

__all__ = [
    "Puckering",
    "mean_plane",
    "puckering",
]

_CHAIR_WINDOW_DEG = 30.0  # theta within 30 deg of 0 or 180: a chair (envelopes/half-chairs near 50)


@dataclass(frozen=True)
class Puckering:
    """Cremer-Pople coordinates of one ring.

    ``amplitude`` Q and the pairs ``q``/``phi`` are in angstrom and degrees.
    For six-membered rings ``theta`` (degrees, 0-180) places the ring on the
    sphere of chairs (poles), boats and skew-boats (equator). ``z`` are the
    displacements of the ring atoms from the mean plane (angstrom), in the
    order the atoms were given.
    """

    size: int
    amplitude: float
    q: tuple[float, ...]  # q_2, q_3, ... (angstrom)
    phi: tuple[float, ...]  # phi_2, ... (degrees, 0-360); one per q_m with m < N/2
    theta: float | None  # six-membered rings only (degrees)
    z: tuple[float, ...]

    def __post_init__(self) -> None:
        if self.size < 5:
            raise StructureError(f"puckering needs a ring of at least 5 atoms, got {self.size}")

    @property
    def is_chair(self) -> bool:
        """True for a six-membered ring within 30 degrees of a pole (a chair)."""
        return self.theta is not None and (self.theta < _CHAIR_WINDOW_DEG or self.theta > 180.0 - _CHAIR_WINDOW_DEG)

    @property
    def chair_type(self) -> str | None:
        """``"A"`` for theta below 30 deg (the 4C1 type), ``"B"`` above 150 (1C4 type), else None."""
        if self.theta is None:
            return None
        if self.theta < _CHAIR_WINDOW_DEG:
            return "A"
        if self.theta > 180.0 - _CHAIR_WINDOW_DEG:
            return "B"
        return None


def mean_plane(coords: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Centre and unit normal of the Cremer-Pople mean plane of a ring.

    ``coords`` is an (N, 3) array in ring order. The normal is
    ``R' x R''`` normalised (Cremer and Pople, eqs. 10-12): seen from its tip
    the ring numbering runs clockwise.
    """
    xyz = np.asarray(coords, dtype=float)
    if xyz.ndim != 2 or xyz.shape[1] != 3 or xyz.shape[0] < 5:
        raise StructureError(f"ring coordinates must be an (N>=5, 3) array, got shape {xyz.shape}")
    n = xyz.shape[0]
    centre = xyz.mean(axis=0)
    r = xyz - centre
    angles = 2.0 * math.pi * np.arange(n) / n
    r1 = (r * np.sin(angles)[:, None]).sum(axis=0)
    r2 = (r * np.cos(angles)[:, None]).sum(axis=0)
    normal = np.cross(r1, r2)
    length = float(np.linalg.norm(normal))
    if length < 1e-9:
        raise StructureError("degenerate ring coordinates: no mean plane")
    return centre, normal / length


def puckering(coords: np.ndarray) -> Puckering:
    """Cremer-Pople puckering coordinates of a ring given in ring order (angstrom)."""
    xyz = np.asarray(coords, dtype=float)
    centre, normal = mean_plane(xyz)
    z = (xyz - centre) @ normal
    n = len(z)
    j = np.arange(n)
    qs: list[float] = []
    phis: list[float] = []
    for m in range(2, (n - 1) // 2 + 1):
        c = math.sqrt(2.0 / n) * float(np.sum(z * np.cos(2.0 * math.pi * m * j / n)))
        s = -math.sqrt(2.0 / n) * float(np.sum(z * np.sin(2.0 * math.pi * m * j / n)))
        qs.append(math.hypot(c, s))
        phis.append(math.degrees(math.atan2(s, c)) % 360.0)
    theta = None
    if n % 2 == 0:
        q_half = math.sqrt(1.0 / n) * float(np.sum(z * (-1.0) ** j))
        qs.append(q_half)
        if n == 6:
            theta = math.degrees(math.atan2(qs[0], q_half))
    amplitude = float(math.sqrt(float(np.sum(z * z))))
    return Puckering(
        size=n,
        amplitude=amplitude,
        q=tuple(qs),
        phi=tuple(phis),
        theta=theta,
        z=tuple(float(v) for v in z),
    )
