"""Vicinal proton couplings 3J(H,H) by the Haasnoot-de Leeuw-Altona equation.

Haasnoot, de Leeuw and Altona, Tetrahedron 36, 2783 (1980), parameter set
with the beta effect (REFERENCE_VALUES.md)::

    3J = P1 cos^2(phi) + P2 cos(phi) + P3
         + sum_i dchi_i [P4 + P5 cos^2(xi_i phi + P6 |dchi_i|)]
    dchi_i = (chi_alpha,i - chi_H) + P7 sum_j (chi_beta,ij - chi_H)

``phi`` is the H-C-C-H torsion (IUPAC sign), the sum runs over the non-
hydrogen substituents of the two coupled carbons, and ``xi_i`` is +1 when,
looking from the substituent's carbon along the C-C bond, the substituent
stands clockwise from the coupled proton on the same carbon, -1 when
anticlockwise (so an electronegative substituent antiperiplanar to the other
coupled proton lowers J, as the equation intends). Huggins electronegativities
H 2.20, C 2.60, O 3.50 [memory]; N 3.05 is also Huggins' value [memory], not in
the reference table.

Two paths:

- fast (:func:`ring_couplings`): torsions and orientations of the idealised
  chair (:func:`workbench.conformers.chair.ideal_chair` with ring torsions of
  54 deg, so gauche H-C-C-H torsions of about 54-66 deg and anti about
  175 deg), Boltzmann-weighted over the two chairs with Angyal's free
  energies; pure Python with cached tables, for the engine.
- 3D (:mod:`workbench.conformers.conformer`): the same equation on the
  dihedrals measured on MMFF94 geometries (:func:`coupling_from_atoms`).
"""

from __future__ import annotations

import math
from collections.abc import Iterable
from functools import cache
from typing import TYPE_CHECKING

import numpy as np

from workbench.chem.chain import Chain
from workbench.chem.smiles import RingForm
from workbench.conformers.chair import (
    CHAIRS,
    DOWN,
    PYRANOSE_RING_TORSION_DEG,
    UP,
    axial_face,
    ideal_chair,
    other_face,
)
from workbench.conformers.equilibrium import chair_weights, pyranose_layouts
from workbench.conformers.layout import RingLayout, RingPosition, ring_layout
from workbench.errors import StructureError

if TYPE_CHECKING:
    from numpy.typing import ArrayLike

__all__ = [
    "HLA_PARAMETERS",
    "ELECTRONEGATIVITY",
    "dihedral_deg",
    "orientation_sign",
    "group_electronegativity",
    "hla_coupling",
    "proton_labels",
    "chair_couplings",
    "form_couplings",
    "ring_couplings",
    "pyranose_couplings",
]

# Haasnoot, de Leeuw and Altona 1980, set with beta effect: Hz, Hz, Hz, Hz, Hz, deg, dimensionless.
HLA_PARAMETERS = {"P1": 13.70, "P2": -0.73, "P3": 0.0, "P4": 0.56, "P5": -2.47, "P6": 16.9, "P7": -0.14}
# Huggins electronegativities (Pauling units) [memory]; N not in REFERENCE_VALUES.md.
ELECTRONEGATIVITY = {"H": 2.20, "C": 2.60, "N": 3.05, "O": 3.50}


def dihedral_deg(p0: ArrayLike, p1: ArrayLike, p2: ArrayLike, p3: ArrayLike) -> float:
    """Torsion angle p0-p1-p2-p3 in degrees (-180, 180], IUPAC sign convention."""
    a, b, c, d = (np.asarray(p, dtype=float) for p in (p0, p1, p2, p3))
    b0, b1, b2 = a - b, c - b, d - c
    b1n = b1 / np.linalg.norm(b1)
    v = b0 - np.dot(b0, b1n) * b1n
    w = b2 - np.dot(b2, b1n) * b1n
    x = float(np.dot(v, w))
    y = float(np.dot(np.cross(b1n, v), w))
    return math.degrees(math.atan2(y, x))


def orientation_sign(proton: ArrayLike, carbon: ArrayLike, partner: ArrayLike, substituent: ArrayLike) -> int:
    """HLA ``xi``: +1 if ``substituent`` stands clockwise from ``proton``.

    Viewed from ``carbon`` (which bears both) along the bond to ``partner``.
    A clockwise turn seen by that viewer is a right-handed turn about the
    viewing direction.
    """
    c = np.asarray(carbon, dtype=float)
    axis = np.asarray(partner, dtype=float) - c
    h = np.asarray(proton, dtype=float) - c
    s = np.asarray(substituent, dtype=float) - c
    return 1 if float(np.dot(np.cross(h, s), axis)) > 0 else -1


def group_electronegativity(alpha: str, beta: Iterable[str] = ()) -> float:
    """HLA ``dchi`` of a substituent atom ``alpha`` bearing the atoms ``beta``."""
    chi_h = ELECTRONEGATIVITY["H"]
    try:
        value = ELECTRONEGATIVITY[alpha] - chi_h
        value += HLA_PARAMETERS["P7"] * sum(ELECTRONEGATIVITY[b] - chi_h for b in beta)
    except KeyError as err:
        raise StructureError(f"no electronegativity for element {err.args[0]!r}; known: H, C, N, O") from err
    return value


def hla_coupling(phi_deg: float, substituents: Iterable[tuple[float, int]]) -> float:
    """3J(H,H) in Hz for torsion ``phi_deg`` and substituents given as ``(dchi, xi)``."""
    p = HLA_PARAMETERS
    phi = math.radians(phi_deg)
    j = p["P1"] * math.cos(phi) ** 2 + p["P2"] * math.cos(phi) + p["P3"]
    for dchi, xi in substituents:
        if dchi == 0.0:
            continue
        angle = xi * phi_deg + p["P6"] * abs(dchi)
        j += dchi * (p["P4"] + p["P5"] * math.cos(math.radians(angle)) ** 2)
    return j


# ---------------------------------------------------------------- fast path
@cache
def _ideal_fragment(chair: str, p: int, f1: str, f2: str) -> tuple[float, tuple[int, int, int, int]]:
    """Torsion and xi signs on the ideal chair for H on (p, f1) and H on (p+1, f2).

    The xi signs are for: ring atom p-1, the other substituent of p, ring
    atom p+2, the other substituent of p+1.
    """
    geo = ideal_chair(chair, PYRANOSE_RING_TORSION_DEG)
    q = p + 1
    h1, h2 = geo.substituent(p, f1), geo.substituent(q % 6, f2)
    c1, c2 = geo.ring[p], geo.ring[q % 6]
    phi = dihedral_deg(h1, c1, c2, h2)
    xi = (
        orientation_sign(h1, c1, c2, geo.ring[(p - 1) % 6]),
        orientation_sign(h1, c1, c2, geo.substituent(p, other_face(f1))),
        orientation_sign(h2, c2, c1, geo.ring[(q + 1) % 6]),
        orientation_sign(h2, c2, c1, geo.substituent(q % 6, other_face(f2))),
    )
    return phi, xi


def _ring_atom_element(layout: RingLayout, q: int) -> str:
    return "O" if q % layout.size == 0 else "C"


def _ring_neighbour_dchi(layout: RingLayout, q: int, away: int) -> float:
    """dchi of ring atom ``q`` seen from its ring neighbour; ``away`` is q's other ring neighbour."""
    element = _ring_atom_element(layout, q)
    if element == "O":
        return group_electronegativity("O", ("C",))
    pos = layout.at(q)
    beta = [pos.up.element, pos.down.element, _ring_atom_element(layout, away)]
    return group_electronegativity("C", beta)


def proton_labels(layout: RingLayout, pos: RingPosition, chair: str) -> dict[str, str]:
    """Names of the protons on ring carbon ``pos`` by face: ``H3``, or ``H5ax``/``H5eq`` for CH2.

    For a CH2 ring carbon, ax/eq refer to ``chair`` (the anomer's preferred one).
    """
    if pos.hydrogens == 2:
        ax = axial_face(chair, pos.position)
        return {ax: f"H{pos.carbon}ax", other_face(ax): f"H{pos.carbon}eq"}
    return {face: f"H{pos.carbon}" for face in (UP, DOWN) if pos.on(face).is_hydrogen}


def chair_couplings(layout: RingLayout, chair: str, name_chair: str | None = None) -> dict[str, float]:
    """3J(H,H) (Hz) around a pyranose ring in the ideal ``chair``.

    Proton names of CH2 groups refer to ``name_chair`` (default ``chair``).
    """
    if layout.size != 6:
        raise StructureError(f"{layout.form.key}: the ideal-chair path needs a pyranose")
    naming = name_chair or chair
    out: dict[str, float] = {}
    for p in range(1, 5):
        a, b = layout.at(p), layout.at(p + 1)
        la, lb = proton_labels(layout, a, naming), proton_labels(layout, b, naming)
        if not la or not lb:
            continue
        d_prev = _ring_neighbour_dchi(layout, p - 1, (p - 2) % 6)
        d_next = _ring_neighbour_dchi(layout, (p + 2) % 6, (p + 3) % 6)
        for f1, n1 in la.items():
            o1 = a.on(other_face(f1))
            d1 = group_electronegativity(o1.element, o1.beta) if not o1.is_hydrogen else 0.0
            for f2, n2 in lb.items():
                o2 = b.on(other_face(f2))
                d2 = group_electronegativity(o2.element, o2.beta) if not o2.is_hydrogen else 0.0
                phi, xi = _ideal_fragment(chair, p, f1, f2)
                subs = ((d_prev, xi[0]), (d1, xi[1]), (d_next, xi[2]), (d2, xi[3]))
                out[f"{n1}-{n2}"] = hla_coupling(phi, subs)
    return out


@cache
def _form_couplings(layout: RingLayout) -> tuple[tuple[str, float], ...]:
    weights = chair_weights(layout)
    preferred = CHAIRS[0] if weights[0] >= weights[1] else CHAIRS[1]
    per_chair = [chair_couplings(layout, c, preferred) for c in CHAIRS]
    return tuple((key, sum(w * j[key] for w, j in zip(weights, per_chair, strict=True))) for key in per_chair[0])


def form_couplings(layout: RingLayout) -> dict[str, float]:
    """3J(H,H) (Hz) of one pyranose anomer, Boltzmann-averaged over its chairs (Angyal energies)."""
    return dict(_form_couplings(layout))


def ring_couplings(chain: Chain) -> dict[str, dict[str, float]]:
    """Predicted ring 3J(H,H) (Hz) of every pyranose form, keyed ``alpha_pyranose`` ...

    Pairs are named from the anomeric end, ``H1-H2`` (aldoses) or ``H3-H4``
    (2-ketoses); CH2 protons as ``H5ax``/``H5eq`` in the preferred chair.
    Furanose forms are not predicted by this fast path (their rings
    pseudorotate; see :func:`workbench.conformers.conformer.ring_couplings_3d`).
    """
    return {lay.form.key: form_couplings(lay) for lay in pyranose_layouts(chain)}


def pyranose_couplings(chain: Chain, form: RingForm) -> dict[str, float]:
    """Fast-path couplings (Hz) of one pyranose ``form`` of ``chain``."""
    return form_couplings(ring_layout(chain, form))
