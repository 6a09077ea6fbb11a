"""3D conformers of the ring forms: ETKDG embedding, MMFF94 chairs, puckering.

For a pyranose, every embedded geometry (RDKit ETKDGv3, fixed seed) is driven
into each chair in turn by MMFF94 torsion restraints on the six ring
torsions (with the improper dihedral of every stereocentre held, so that no
centre inverts on the way), then released and minimised freely. Each result
is labelled by its Cremer-Pople puckering
(:mod:`workbench.conformers.puckering`): a ring that escapes to a boat or
skew is labelled as such and never passed off as a chair; a chair that is
no MMFF94 minimum is kept as its restrained geometry and marked so. Both
chairs are reported for every pyranose whose chair MMFF94 can hold (a
restrained chair more than 25 kcal/mol above the best minimum is dropped as
a distorted geometry). The face of a substituent is read from the local ring
plane (a configurational property); in a chair it is axial when it stands
on that chair's axial face of its ring atom. Furanoses
are embedded and minimised freely and labelled as envelopes or twists.

Results are deterministic (fixed seeds, one thread) and cached per chain,
ring form and settings. MMFF94 energies are force-field energies in
kcal/mol, by default in the gas phase (dielectric 1, plain MMFF94), where
intramolecular hydrogen bonds are overweighted and chairs with many axial
hydroxyls are favoured; ``ConformerSettings(dielectric=78.4)`` screens the
electrostatics by water's dielectric constant (a crude stand-in for
solvation; it agrees better with Angyal's chair preferences but flattens the
rings slightly). Either way they are reported beside, not instead of,
Angyal's free energies in water, and the display conformer of a pyranose is
by default the chair Angyal's scheme prefers.
"""

from __future__ import annotations

import logging
import math
import time
from collections.abc import Callable, Iterable
from dataclasses import dataclass, field
from functools import lru_cache
from typing import Any, cast

import numpy as np
from rdkit import Chem
from rdkit.Chem import rdDistGeom, rdForceFieldHelpers, rdMolTransforms
from rdkit.ForceField.rdForceField import ForceField
from rdkit.Geometry import Point3D

from workbench.chem.chain import Chain
from workbench.chem.smiles import RingForm, quiet_rdkit, ring_forms, to_mol
from workbench.conformers.chair import CHAIRS, DOWN, UP, axial_face, chair_from_label, chair_label, ideal_chair
from workbench.conformers.coupling import dihedral_deg, group_electronegativity, hla_coupling, orientation_sign
from workbench.conformers.equilibrium import GAS_CONSTANT_KCAL, ROOM_TEMPERATURE_K, chair_weights
from workbench.conformers.layout import ring_layout
from workbench.conformers.puckering import Puckering, mean_plane, puckering
from workbench.errors import StructureError

__all__ = [
    "ConformerSettings",
    "Conformer",
    "RingConformers",
    "ChairComparison",
    "Progress",
    "ring_conformers",
    "conformer_library",
    "conformer_mol",
    "conformer_molblock",
    "chair_comparison",
    "AnomerComparison",
    "anomer_comparison",
    "ring_couplings_3d",
]

log = logging.getLogger(__name__)

Progress = Callable[[int, int, str], None]
"""Progress callback: ``progress(done, total, what)``; no UI library involved."""

_IN_PLANE_A = 0.1  # angstrom: a ring atom this close to the mean plane has no clear axial side
_RESTRAINT_KCAL = 100.0  # MMFF torsion restraint force constant, kcal mol-1 rad-2
_RESTRAINT_WINDOW_DEG = 10.0
_CHIRALITY_KCAL = 1000.0  # restraint on each stereocentre's improper dihedral, kcal mol-1 rad-2
_CHIRALITY_WINDOW_DEG = 15.0
_RESTRAINED_ITERATIONS = 200  # minimiser steps under restraints: enough to reach the chair
_EXTRA_ROUNDS = 3  # further embeddings (new seeds) when a chair was not reached
_MAX_STRAIN_KCAL = 25.0  # a restrained chair further above the best minimum is a distorted geometry, not kept
_SAME_MINIMUM_KCAL = 1e-3  # two minimised geometries this close in energy are taken as one minimum


@dataclass(frozen=True)
class ConformerSettings:
    """How conformers are generated.

    ``embeddings`` ETKDG geometries per ring form (each driven into both
    chairs), random ``seed``, minimiser ``max_iterations``, and the MMFF94
    ``dielectric`` constant (constant-dielectric model; 1.0 is gas phase,
    78.4 water at 25 C [memory]).
    """

    embeddings: int = 4
    seed: int = 20_251_101
    max_iterations: int = 2000
    dielectric: float = 1.0

    def __post_init__(self) -> None:
        if self.embeddings < 1 or self.max_iterations < 10:
            raise StructureError("ConformerSettings: embeddings >= 1 and max_iterations >= 10 are required")
        if not self.dielectric >= 1.0:
            raise StructureError(f"ConformerSettings: dielectric must be >= 1, got {self.dielectric}")


DEFAULT_SETTINGS = ConformerSettings()


@dataclass(frozen=True)
class Conformer:
    """One MMFF94-minimised geometry of a ring form.

    ``energy_kcal`` is the MMFF94 energy (kcal/mol); ``shape`` the ring shape
    (``4C1``, ``1C4``, ``half-chair`` (theta 30-60 or 120-150 deg, envelopes
    included), ``boat/skew``, or for furanoses an envelope ``3E``/
    ``E3`` or twist ``3T2``); ``chair`` is ``"A"``/``"B"`` or None;
    ``axial``/``equatorial`` name the non-hydrogen ring substituents
    (``O1``, ``C6``) of a six-membered ring: in a chair, axial means on the
    chair's axial face of that atom; in other shapes, pseudo-axial (on the
    side to which the atom puckers, or for an atom within 0.1 angstrom of the
    mean plane the bond nearer the normal). ``restrained``
    marks a chair that is no MMFF94 minimum: its geometry is the one held by
    the ring-torsion restraints, its energy that of MMFF94 without them.
    """

    conf_id: int
    energy_kcal: float
    puckering: Puckering
    shape: str
    chair: str | None
    axial: tuple[str, ...]
    equatorial: tuple[str, ...]
    faces: tuple[tuple[str, str], ...]  # (substituent label, "up"/"down") of every heavy substituent
    restrained: bool = False  # True: no free MMFF94 minimum in this chair; geometry held by ring restraints


@dataclass(frozen=True, eq=False)
class RingConformers:
    """All conformers found for one ring form, lowest MMFF energy first.

    ``mol`` holds them as RDKit conformers (with hydrogens); ``ring_atoms``
    are the atom indices of the ring in ring order (ring O first, then the
    anomeric carbon); ``carbons`` the chain numbers of the ring carbons.
    """

    chain: Chain
    form: RingForm
    mol: Chem.Mol = field(repr=False)
    ring_atoms: tuple[int, ...]
    carbons: tuple[int, ...]
    conformers: tuple[Conformer, ...]
    seconds: float

    @property
    def anomeric(self) -> int:
        """Chain number of the anomeric carbon."""
        return self.carbons[0]

    def chair_names(self) -> dict[str, str]:
        """IUPAC names of chairs A and B for this ring (six-membered rings only)."""
        return {c: chair_label(c, self.anomeric) for c in CHAIRS}

    def best(self, chair: str | None = None) -> Conformer:
        """The conformer to show: lowest MMFF94 energy of ``chair`` (``"4C1"``, ``"1C4"``, ``"A"``, ``"B"``).

        With ``chair`` None: for a pyranose, the chair Angyal's scheme prefers
        (so the display agrees with the predictions even where MMFF94 prefers
        the other chair); for a furanose, the lowest MMFF94 energy overall
        (``conformers[0]`` is always the lowest MMFF94 energy). A freely
        minimised conformer is preferred to a restrained one.
        """
        if chair is None and self.form.ring == "pyranose":
            a, b = chair_weights(ring_layout(self.chain, self.form))
            chair = "A" if a >= b else "B"
        key = None if chair is None else (chair if chair in CHAIRS else chair_from_label(chair, self.anomeric))
        ranked = sorted(self.conformers, key=lambda c: (c.restrained, c.energy_kcal))
        for conf in ranked:
            if key is None or conf.chair == key:
                return conf
        raise StructureError(f"{self.form.key}: no {chair} chair conformer was found")

    def positions(self, conf_id: int) -> np.ndarray:
        """Coordinates (angstrom) of every atom of conformer ``conf_id``."""
        return np.asarray(self.mol.GetConformer(conf_id).GetPositions())


@dataclass(frozen=True)
class ChairComparison:
    """Chair energies of one pyranose form by Angyal's scheme and by MMFF94 (kcal/mol).

    ``mmff_kcal`` are the lowest MMFF94 energies found in each chair
    relative to the lower one (with the settings' dielectric screening);
    ``agree`` says whether both favour the same chair. MMFF94 energies are
    potential energies of single minima, Angyal's values free energies in water.
    """

    form: str
    angyal_kcal: dict[str, float]
    mmff_kcal: dict[str, float | None]
    angyal_preferred: str
    mmff_preferred: str | None
    agree: bool


@dataclass(frozen=True)
class AnomerComparison:
    """Alpha vs beta pyranose by Angyal's scheme and by MMFF94 (kcal/mol).

    ``angyal_kcal`` is G(beta) - G(alpha) from Angyal's scheme (each anomer
    a Boltzmann mixture of its chairs); ``mmff_kcal`` is E(beta) - E(alpha)
    of the lowest MMFF94 minima (the anomers are diastereomers with the
    same atom types, so their force-field energies compare). Negative
    favours beta. ``agree`` says whether both favour the same anomer.
    """

    angyal_kcal: float
    mmff_kcal: float
    angyal_preferred: str
    mmff_preferred: str
    agree: bool


# ---------------------------------------------------------------- ring perception
def _ring_order(mol: Chem.Mol, size: int) -> tuple[int, ...]:
    """Atom indices of the sugar ring: ring O, anomeric carbon, ..., closing carbon."""
    for ring in mol.GetRingInfo().AtomRings():
        if len(ring) != size:
            continue
        members = set(ring)
        oxygens = [i for i in ring if mol.GetAtomWithIdx(i).GetSymbol() == "O"]
        if len(oxygens) != 1:
            continue
        ring_o = mol.GetAtomWithIdx(oxygens[0])
        start = None
        for nb in ring_o.GetNeighbors():
            if any(x.GetSymbol() == "O" and x.GetIdx() not in members for x in nb.GetNeighbors()):
                start = nb.GetIdx()
        if start is None:
            continue
        order = [oxygens[0], start]
        while len(order) < size:
            nxt = [
                n.GetIdx()
                for n in mol.GetAtomWithIdx(order[-1]).GetNeighbors()
                if n.GetIdx() in members and n.GetIdx() not in order
            ]
            order.append(nxt[0])
        return tuple(order)
    raise StructureError("no sugar ring (one ring oxygen next to a hemiacetal carbon) found")


def _substituent_labels(mol: Chem.Mol, ring: tuple[int, ...], anomeric: int) -> dict[int, str]:
    """Label (``O1``, ``C6``, ``N2``) of every exocyclic heavy atom bonded to the ring."""
    members = set(ring)
    labels: dict[int, str] = {}
    for p, idx in enumerate(ring[1:], start=1):
        carbon = anomeric + p - 1
        for nb in mol.GetAtomWithIdx(idx).GetNeighbors():
            if nb.GetIdx() in members or nb.GetSymbol() == "H":
                continue
            if nb.GetSymbol() == "C":
                number = 1 if p == 1 else carbon + 1
                labels[nb.GetIdx()] = f"C{number}"
            else:
                labels[nb.GetIdx()] = f"{nb.GetSymbol()}{carbon}"
    return labels


@lru_cache(maxsize=2)
def _ring_torsion_targets(chair: str) -> tuple[tuple[int, int, int, int, float], ...]:
    """Ring torsions (ring positions and degrees) of the ideal ``chair``."""
    geo = ideal_chair(chair)
    out = []
    for p in range(6):
        idx = (p, (p + 1) % 6, (p + 2) % 6, (p + 3) % 6)
        angle = dihedral_deg(*(geo.ring[i] for i in idx))
        out.append((*idx, angle))
    return tuple(out)


def _five_ring_shape(xyz: np.ndarray, names: list[str], normal: np.ndarray) -> str:
    """Envelope (``3E``, ``E3``) or twist (``3T2``) of a five-membered ring."""
    best_env, best_rms = None, math.inf
    for j in range(5):
        others = np.delete(xyz, j, axis=0)
        centre = others.mean(axis=0)
        _, _, vt = np.linalg.svd(others - centre)
        plane_normal = vt[2]
        rms = float(np.sqrt(np.mean(((others - centre) @ plane_normal) ** 2)))
        if rms < best_rms:
            best_env, best_rms = j, rms
    assert best_env is not None
    centre = xyz.mean(axis=0)
    z = (xyz - centre) @ normal
    if best_rms < 0.06:  # angstrom: four atoms coplanar
        j = best_env
        return f"{names[j]}E" if z[j] > 0 else f"E{names[j]}"
    # twist: the adjacent pair most displaced on opposite sides of the other three
    best_pair, best_split = (0, 1), -math.inf
    for j in range(5):
        k = (j + 1) % 5
        rest = [i for i in range(5) if i not in (j, k)]
        c = xyz[rest].mean(axis=0)
        n = np.cross(xyz[rest[1]] - xyz[rest[0]], xyz[rest[2]] - xyz[rest[0]])
        n /= np.linalg.norm(n)
        if np.dot(n, normal) < 0:
            n = -n
        dj, dk = float((xyz[j] - c) @ n), float((xyz[k] - c) @ n)
        if dj * dk < 0 and abs(dj - dk) > best_split:
            best_pair, best_split = ((j, k) if dj > 0 else (k, j)), abs(dj - dk)
    up, down = best_pair
    return f"{names[up]}T{names[down]}"


def _face(xyz: np.ndarray, ring: tuple[int, ...], position: int, atom: int) -> str:
    """Haworth face (``"up"``/``"down"``) of exocyclic ``atom`` on ring ``position``.

    Measured against the local plane of the ring atom and its two ring
    neighbours, oriented by the ring numbering: a configurational property,
    the same in every conformer (checked against the ideal chairs).
    """
    c = xyz[ring[position]]
    prev, nxt = xyz[ring[position - 1]], xyz[ring[(position + 1) % len(ring)]]
    local = np.cross(prev - c, nxt - c)
    return UP if float(np.dot(local, xyz[atom] - c)) > 0 else DOWN


def _describe(
    mol: Chem.Mol,
    conf_id: int,
    ring: tuple[int, ...],
    labels: dict[int, str],
    anomeric: int,
    energy: float,
    restrained: bool,
) -> Conformer:
    xyz = np.asarray(mol.GetConformer(conf_id).GetPositions())
    ring_xyz = xyz[list(ring)]
    pucker = puckering(ring_xyz)
    _, normal = mean_plane(ring_xyz)
    members = set(ring)
    axial: list[str] = []
    equatorial: list[str] = []
    faces: list[tuple[str, str]] = []
    for p, idx in enumerate(ring[1:], start=1):
        exo = [n.GetIdx() for n in mol.GetAtomWithIdx(idx).GetNeighbors() if n.GetIdx() not in members]
        pucker_z = pucker.z[p]
        for j in exo:
            if j not in labels:
                continue
            face = _face(xyz, ring, p, j)
            faces.append((labels[j], face))
            if len(ring) == 6 and pucker.chair_type is not None:
                is_axial = face == axial_face(pucker.chair_type, p)  # the chair's axial face at this atom
            elif abs(pucker_z) > _IN_PLANE_A:
                is_axial = face == (UP if pucker_z > 0 else DOWN)  # pseudo-axial: the way the atom puckers
            else:
                cos = [
                    abs(float(np.dot(xyz[k] - xyz[idx], normal)) / float(np.linalg.norm(xyz[k] - xyz[idx])))
                    for k in exo
                ]
                is_axial = cos[exo.index(j)] >= max(cos)
            (axial if is_axial else equatorial).append(labels[j])
    chair = pucker.chair_type if len(ring) == 6 else None
    if len(ring) == 6:
        theta = pucker.theta or 0.0
        shape = chair_label(chair, anomeric) if chair else ("boat/skew" if 60 <= theta <= 120 else "half-chair")
    else:
        names = ["O"] + [str(anomeric + p) for p in range(4)]
        shape = _five_ring_shape(ring_xyz, names, normal)
        axial, equatorial = [], []
    return Conformer(conf_id, energy, pucker, shape, chair, tuple(axial), tuple(equatorial), tuple(faces), restrained)


def _same_configuration(mol: Chem.Mol, conf_id: int, reference: str) -> bool:
    probe = Chem.Mol(mol, confId=conf_id)
    probe = Chem.RemoveHs(probe)
    Chem.AssignStereochemistryFrom3D(probe)
    return Chem.MolToSmiles(probe) == reference


def _embed(mol: Chem.Mol, count: int, seed: int) -> list[int]:
    """ETKDGv3 embeddings (fixed seed, one thread); random starts if the default fails."""
    params: Any = rdDistGeom.ETKDGv3()  # rdkit's stubs type the parameters' properties wrongly
    params.randomSeed = seed
    params.numThreads = 1
    params.clearConfs = False
    with quiet_rdkit():
        ids = list(rdDistGeom.EmbedMultipleConfs(mol, count, params))
        if not ids:
            params.useRandomCoords = True
            ids = list(rdDistGeom.EmbedMultipleConfs(mol, count, params))
    return ids


def _restrain_chair(
    ff: ForceField, ring: tuple[int, ...], chair: str, centres: list[tuple[int, int, int, int, float]]
) -> None:
    """Add ring-torsion restraints towards ``chair`` and chirality restraints on every stereocentre."""
    for i, j, k, m, angle in _ring_torsion_targets(chair):
        ff.MMFFAddTorsionConstraint(
            ring[i],
            ring[j],
            ring[k],
            ring[m],
            False,
            angle - _RESTRAINT_WINDOW_DEG,
            angle + _RESTRAINT_WINDOW_DEG,
            _RESTRAINT_KCAL,
        )
    for a, c, b, d, angle in centres:
        ff.MMFFAddTorsionConstraint(
            a, c, b, d, False, angle - _CHIRALITY_WINDOW_DEG, angle + _CHIRALITY_WINDOW_DEG, _CHIRALITY_KCAL
        )


def _chirality_probes(mol: Chem.Mol, conf_id: int) -> list[tuple[int, int, int, int, float]]:
    """An improper dihedral (neighbour, centre, neighbour, neighbour) per stereocentre, in degrees.

    Its sign is the centre's handedness; restraining it keeps a centre from
    inverting while the ring is driven from one chair to the other.
    """
    conf = mol.GetConformer(conf_id)
    out = []
    for atom in mol.GetAtoms():
        if atom.GetChiralTag() == Chem.ChiralType.CHI_UNSPECIFIED:
            continue
        nb = [n.GetIdx() for n in atom.GetNeighbors()]
        angle = rdMolTransforms.GetDihedralDeg(conf, nb[0], atom.GetIdx(), nb[1], nb[2])
        out.append((nb[0], atom.GetIdx(), nb[1], nb[2], angle))
    return out


@lru_cache(maxsize=512)
def _compute(chain: Chain, form: RingForm, settings: ConformerSettings) -> RingConformers:
    start = time.perf_counter()
    size = 6 if form.ring == "pyranose" else 5
    base = to_mol(chain, form)
    reference = Chem.MolToSmiles(base)
    mol = Chem.AddHs(base)
    ids = _embed(mol, settings.embeddings, settings.seed)
    if not ids:
        raise StructureError(f"{chain}: RDKit could not embed the {form.key} form in 3D")
    props = rdForceFieldHelpers.MMFFGetMoleculeProperties(mol)
    if props is None:
        raise StructureError(f"{chain}: MMFF94 has no parameters for the {form.key} form")
    props.SetMMFFDielectricModel(1)  # constant dielectric
    props.SetMMFFDielectricConstant(settings.dielectric)
    ring = _ring_order(mol, size)
    anomeric = ring_layout(chain, form).anomeric
    labels = _substituent_labels(mol, ring, anomeric)
    out = Chem.Mol(mol)
    out.RemoveAllConformers()
    found: list[tuple[float, int, bool, str | None]] = []  # (MMFF energy, conformer id, restrained, chair)
    held: dict[str, tuple[float, np.ndarray]] = {}  # best restrained geometry per chair (angstrom)

    def keep(xyz: np.ndarray, energy: float, restrained: bool = False) -> None:
        chair = puckering(xyz[list(ring)]).chair_type if size == 6 else None
        if any(abs(energy - e) < _SAME_MINIMUM_KCAL and r == restrained for e, _, r, _ in found):
            return  # the same minimum reached from another start
        conf = Chem.Conformer(len(xyz))
        for i, (x, y, z) in enumerate(xyz):
            conf.SetAtomPosition(i, Point3D(float(x), float(y), float(z)))
        conf.Set3D(True)
        new_id = out.AddConformer(conf, assignId=True)
        found.append((energy, new_id, restrained, chair))

    def free_chair(chair: str) -> bool:
        return any(ch == chair and not r for _, _, r, ch in found)

    def reached(chair: str) -> bool:
        """A free minimum in ``chair``, or a restrained one not absurdly strained."""
        if free_chair(chair):
            return True
        if chair not in held or not found:
            return False
        return held[chair][0] <= min(e for e, *_ in found) + _MAX_STRAIN_KCAL

    def relax(work: Chem.Mol) -> None:
        ff = rdForceFieldHelpers.MMFFGetMoleculeForceField(work, props)
        ff.Minimize(maxIts=settings.max_iterations)
        if _same_configuration(work, -1, reference):
            keep(np.asarray(work.GetConformer().GetPositions()), float(ff.CalcEnergy()))
        else:
            log.debug("%s %s: a conformer changed configuration and was dropped", chain, form.key)

    with quiet_rdkit():
        if size == 5:
            for cid in ids:
                relax(Chem.Mol(mol, confId=cid))
        else:
            targets: tuple[str, ...] = CHAIRS
            for round_ in range(_EXTRA_ROUNDS + 1):
                if round_:  # a chair was reached neither freely nor sanely restrained: new starts
                    targets = tuple(c for c in CHAIRS if not reached(c))
                    if not targets:
                        break
                    ids = _embed(mol, settings.embeddings, settings.seed + round_)
                for cid in ids:
                    for target in targets:
                        work = Chem.Mol(mol, confId=cid)
                        ff = rdForceFieldHelpers.MMFFGetMoleculeForceField(work, props)
                        _restrain_chair(ff, ring, target, _chirality_probes(work, -1))
                        ff.Minimize(maxIts=_RESTRAINED_ITERATIONS)
                        if not _same_configuration(work, -1, reference):
                            log.debug("%s %s: restrained %s inverted a centre; dropped", chain, form.key, target)
                            continue
                        energy = float(rdForceFieldHelpers.MMFFGetMoleculeForceField(work, props).CalcEnergy())
                        if energy < held.get(target, (math.inf,))[0]:
                            held[target] = (energy, np.asarray(work.GetConformer().GetPositions()))
                        relax(work)
            for target in CHAIRS:
                if not free_chair(target) and reached(target):
                    log.debug("%s %s: chair %s is no MMFF94 minimum; kept restrained", chain, form.key, target)
                    keep(held[target][1], held[target][0], restrained=True)
    if not found:
        raise StructureError(f"{chain}: no MMFF94 conformer of the {form.key} form kept its configuration")
    found.sort()
    conformers = tuple(_describe(out, cid, ring, labels, anomeric, e, r) for e, cid, r, _ in found)
    carbons = tuple(anomeric + p for p in range(size - 1))
    seconds = time.perf_counter() - start
    log.debug("%s %s: %d conformers in %.3f s", chain, form.key, len(conformers), seconds)
    return RingConformers(chain, form, out, ring, carbons, conformers, seconds)


def _check_form(chain: Chain, form: RingForm) -> None:
    if RingForm(form.ring, form.anomer) not in ring_forms(chain):
        keys = ", ".join(f.key for f in ring_forms(chain)) or "none"
        raise StructureError(f"{chain}: no {form.key} form; possible ring forms: {keys}")


def ring_conformers(chain: Chain, form: RingForm, settings: ConformerSettings = DEFAULT_SETTINGS) -> RingConformers:
    """MMFF94 conformers of one ring form of ``chain`` (cached; about 0.1-0.3 s cold)."""
    _check_form(chain, form)
    return _compute(chain, form, settings)


def conformer_library(
    chains: Iterable[Chain],
    forms: Iterable[RingForm] | None = None,
    progress: Progress | None = None,
    settings: ConformerSettings = DEFAULT_SETTINGS,
) -> dict[tuple[Chain, str], RingConformers]:
    """Conformers of every ring form of many chains, keyed ``(chain, form.key)``.

    ``forms`` limits the ring forms (default: all that each chain can adopt);
    ``progress(done, total, what)`` is called after each ring form.
    """
    wanted = None if forms is None else tuple(forms)
    jobs = []
    for chain in chains:
        for form in ring_forms(chain):
            if wanted is None or form in wanted:
                jobs.append((chain, form))
    out: dict[tuple[Chain, str], RingConformers] = {}
    for done, (chain, form) in enumerate(jobs, start=1):
        out[(chain, form.key)] = ring_conformers(chain, form, settings)
        if progress is not None:
            progress(done, len(jobs), f"{chain} {form.key}")
    return out


def conformer_mol(
    chain: Chain, form: RingForm, chair: str | None = None, settings: ConformerSettings = DEFAULT_SETTINGS
) -> Chem.Mol:
    """An RDKit molecule (with hydrogens) holding one 3D conformer, for display.

    ``chair`` picks ``"4C1"``/``"1C4"`` (``"2C5"``/``"5C2"`` for 2-ketoses, or
    ``"A"``/``"B"``); None gives :meth:`RingConformers.best` (a pyranose in
    the chair Angyal's scheme prefers). Properties ``shape``, ``form`` and
    ``mmff_kcal`` are set.
    """
    found = ring_conformers(chain, form, settings)
    conf = found.best(chair)
    mol = Chem.Mol(found.mol, confId=conf.conf_id)
    mol.SetProp("_Name", f"{chain} {form.key} {conf.shape}")
    mol.SetProp("shape", conf.shape)
    mol.SetProp("form", form.key)
    mol.SetDoubleProp("mmff_kcal", conf.energy_kcal)
    return mol


def conformer_molblock(
    chain: Chain, form: RingForm, chair: str | None = None, settings: ConformerSettings = DEFAULT_SETTINGS
) -> str:
    """MDL molblock (V2000, with hydrogens) of :func:`conformer_mol`."""
    return Chem.MolToMolBlock(conformer_mol(chain, form, chair, settings))


def chair_comparison(chain: Chain, form: RingForm, settings: ConformerSettings = DEFAULT_SETTINGS) -> ChairComparison:
    """Both chairs of a pyranose form by Angyal's scheme and by MMFF94 (kcal/mol)."""
    if form.ring != "pyranose":
        raise StructureError(f"{form.key}: chairs exist for pyranoses only")
    from workbench.conformers.energy import chair_energies

    found = ring_conformers(chain, form, settings)
    names = found.chair_names()
    layout = ring_layout(chain, form)
    a, b = chair_energies(layout)
    angyal = {names["A"]: a, names["B"]: b}
    mmff_raw: dict[str, float | None] = {}
    for c in CHAIRS:
        energies = [x.energy_kcal for x in found.conformers if x.chair == c]
        mmff_raw[names[c]] = min(energies) if energies else None
    known = [v for v in mmff_raw.values() if v is not None]
    low = min(known) if known else 0.0
    mmff = {k: (None if v is None else v - low) for k, v in mmff_raw.items()}
    angyal_pref = names["A"] if a <= b else names["B"]
    mmff_pref = min((k for k in mmff if mmff[k] is not None), key=lambda k: cast(float, mmff[k]), default=None)
    return ChairComparison(form.key, angyal, mmff, angyal_pref, mmff_pref, angyal_pref == mmff_pref)


def anomer_comparison(chain: Chain, settings: ConformerSettings = DEFAULT_SETTINGS) -> AnomerComparison:
    """Alpha vs beta pyranose of ``chain`` by Angyal's scheme and by MMFF94 (kcal/mol)."""
    from workbench.conformers.equilibrium import GAS_CONSTANT_KCAL as R
    from workbench.conformers.equilibrium import anomer_fractions

    forms = {f.anomer: f for f in ring_forms(chain) if f.ring == "pyranose"}
    if set(forms) != {"alpha", "beta"}:
        raise StructureError(f"{chain}: no alpha and beta pyranose to compare")
    fractions = anomer_fractions(chain)
    rt = R * ROOM_TEMPERATURE_K
    # both pyranose forms exist (checked above), so their fractions are numbers, never None
    angyal = -rt * math.log(cast(float, fractions["beta_pyranose"]) / cast(float, fractions["alpha_pyranose"]))
    lowest = {
        anomer: min(c.energy_kcal for c in ring_conformers(chain, form, settings).conformers if not c.restrained)
        for anomer, form in forms.items()
    }
    mmff = lowest["beta"] - lowest["alpha"]
    ang_pref = "beta" if angyal < 0 else "alpha"
    mm_pref = "beta" if mmff < 0 else "alpha"
    return AnomerComparison(angyal, mmff, ang_pref, mm_pref, ang_pref == mm_pref)


# ---------------------------------------------------------------- couplings on 3D geometry
def _proton_names(found: RingConformers, preferred: str | None) -> dict[int, str]:
    """Name of every ring proton: ``H3``; ``H5ax``/``H5eq`` (pyranose CH2); ``H2up``/``H2down`` (furanose CH2)."""
    mol = found.mol
    ring = found.ring_atoms
    xyz = found.positions(found.conformers[0].conf_id)
    names: dict[int, str] = {}
    for p, idx in enumerate(ring[1:], start=1):
        carbon = found.anomeric + p - 1
        hs = [n.GetIdx() for n in mol.GetAtomWithIdx(idx).GetNeighbors() if n.GetSymbol() == "H"]
        if len(hs) == 1:
            names[hs[0]] = f"H{carbon}"
        for h in hs if len(hs) == 2 else []:
            face = _face(xyz, ring, p, h)
            if preferred is None:
                names[h] = f"H{carbon}{face}"
            else:
                names[h] = f"H{carbon}{'ax' if axial_face(preferred, p) == face else 'eq'}"
    return names


def _couplings_of(found: RingConformers, conf_id: int, names: dict[int, str]) -> dict[str, float]:
    mol = found.mol
    xyz = found.positions(conf_id)
    ring = found.ring_atoms
    out: dict[str, float] = {}
    for p in range(1, len(ring) - 1):
        ca, cb = ring[p], ring[p + 1]
        for ha in (n.GetIdx() for n in mol.GetAtomWithIdx(ca).GetNeighbors() if n.GetIdx() in names):
            for hb in (n.GetIdx() for n in mol.GetAtomWithIdx(cb).GetNeighbors() if n.GetIdx() in names):
                phi = dihedral_deg(xyz[ha], xyz[ca], xyz[cb], xyz[hb])
                subs = []
                for carbon, partner, proton in ((ca, cb, ha), (cb, ca, hb)):
                    for nb in mol.GetAtomWithIdx(carbon).GetNeighbors():
                        s = nb.GetIdx()
                        if s in (partner, proton) or nb.GetSymbol() == "H":
                            continue
                        beta = [x.GetSymbol() for x in nb.GetNeighbors() if x.GetIdx() != carbon]
                        dchi = group_electronegativity(nb.GetSymbol(), beta)
                        xi = orientation_sign(xyz[proton], xyz[carbon], xyz[partner], xyz[s])
                        subs.append((dchi, xi))
                out[f"{names[ha]}-{names[hb]}"] = hla_coupling(phi, subs)
    return out


def _boltzmann(conformers: list[Conformer]) -> list[tuple[float, int]]:
    """(weight, conformer id) by MMFF94 energy at 25 C; weights sum to 1."""
    rt = GAS_CONSTANT_KCAL * ROOM_TEMPERATURE_K
    low = min(c.energy_kcal for c in conformers)
    raw = [(math.exp(-(c.energy_kcal - low) / rt), c.conf_id) for c in conformers]
    total = sum(w for w, _ in raw)
    return [(w / total, cid) for w, cid in raw]


def ring_couplings_3d(chain: Chain, form: RingForm, settings: ConformerSettings = DEFAULT_SETTINGS) -> dict[str, float]:
    """Ring 3J(H,H) (Hz) from dihedrals measured on the MMFF94 conformers.

    Within a chair (pyranoses) or over all conformers (furanoses), the
    couplings of the freely minimised conformers are Boltzmann-weighted by
    their MMFF94 energies at 25 C (a rough guide: force-field energies of
    single minima are not free energies in water). Pyranose chairs are then
    weighted by Angyal's chair populations at 25 C; a chair that is no MMFF94
    minimum contributes its restrained geometry.
    """
    found = ring_conformers(chain, form, settings)
    if form.ring == "pyranose":
        layout = ring_layout(chain, form)
        weights = dict(zip(CHAIRS, chair_weights(layout), strict=True))
        preferred = "A" if weights["A"] >= weights["B"] else "B"
        names = _proton_names(found, preferred)
        members = []
        for chair in CHAIRS:
            pool = [c for c in found.conformers if c.chair == chair and not c.restrained] or [found.best(chair)]
            members += [(weights[chair] * w, cid) for w, cid in _boltzmann(pool)]
    else:
        names = _proton_names(found, None)
        members = _boltzmann([c for c in found.conformers if not c.restrained])
    out: dict[str, float] = {}
    for weight, cid in members:
        for key, value in _couplings_of(found, cid, names).items():
            out[key] = out.get(key, 0.0) + weight * value
    return out
