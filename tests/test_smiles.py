"""Structure -> SMILES/InChI, checked against CIP descriptors in IUPAC names."""

from __future__ import annotations

import pytest
from rdkit import Chem
from rdkit.Chem import rdCIPLabeler

from workbench.chem import RingForm, catalogue, resolve, ring_forms, to_inchikey, to_smiles
from workbench.chem.catalogue import Scope
from workbench.chem.smiles import canonical, is_achiral, mirror_smiles


def cip_of_chain(name: str) -> str:
    """CIP labels of the chain stereocentres in chain order (C-1 first)."""
    chain = resolve(name)
    mol = Chem.MolFromSmiles(to_smiles(chain))
    rdCIPLabeler.AssignCIPLabels(mol)
    # walk the carbon chain from C-1 (the carbonyl end by construction of the SMILES)
    labels = {}
    for atom in mol.GetAtoms():
        if atom.HasProp("_CIPCode"):
            labels[atom.GetIdx()] = atom.GetProp("_CIPCode")
    order = _chain_order(mol, chain)
    return "".join(labels[i] for i in order if i in labels)


def _chain_order(mol, chain):
    from workbench.chem.parse import _chain_atoms

    order = _chain_atoms(mol)
    first = mol.GetAtomWithIdx(order[0])
    c1_is_carbonyl = any(b.GetBondTypeAsDouble() == 2 for b in first.GetBonds())
    if chain.carbonyl == "aldose" and not c1_is_carbonyl:
        order.reverse()
    if chain.carbonyl == "ketose":
        second = mol.GetAtomWithIdx(order[1])
        if not any(b.GetBondTypeAsDouble() == 2 for b in second.GetBonds()):
            order.reverse()
    return order


# CIP sets of the open-chain D-aldoses and ketoses. D-glucose (2R,3S,4R,5R):
# Bentley, Biochem. Educ. 26, 205 (1998). The others follow from the same
# Fischer patterns (IUPAC-IUBMB 2-Carb-8.2) and are the descriptors of their
# IUPAC names [from memory]; fructose (3S,4R,5R), L-sorbose (3S,4R,5S) and
# D-glucosamine (2R,3R,4S,5R) as listed in REFERENCE_VALUES.md [memory].
@pytest.mark.parametrize(
    ("name", "cip"),
    [
        ("D-glyceraldehyde", "R"),
        ("D-erythrose", "RR"),
        ("D-threose", "SR"),
        ("D-ribose", "RRR"),
        ("D-arabinose", "SRR"),
        ("D-xylose", "RSR"),
        ("D-lyxose", "SSR"),
        ("D-allose", "RRRR"),
        ("D-altrose", "SRRR"),
        ("D-glucose", "RSRR"),
        ("D-mannose", "SSRR"),
        ("D-gulose", "RRSR"),
        ("D-idose", "SRSR"),
        ("D-galactose", "RSSR"),
        ("D-talose", "SSSR"),
        ("D-fructose", "SRR"),
        ("L-sorbose", "SRS"),
        ("D-glucosamine", "RRSR"),
    ],
)
def test_open_chain_cip_matches_iupac_names(name, cip):
    assert cip_of_chain(name) == cip


def test_design_smiles_conventions():
    # Conventions checked with RDKit's CIP labeller (DESIGN.md, "Conventions")
    assert to_smiles(resolve("D-glucose")) == canonical("O=C[C@H](O)[C@@H](O)[C@H](O)[C@H](O)CO")
    assert to_smiles(resolve("D-fructose")) == canonical("OCC(=O)[C@@H](O)[C@H](O)[C@H](O)CO")
    assert to_smiles(resolve("D-glucosamine")) == canonical("O=C[C@H](N)[C@@H](O)[C@H](O)[C@H](O)CO")
    alpha = to_smiles(resolve("D-glucose"), RingForm("pyranose", "alpha"))
    assert alpha == canonical("OC[C@H]1O[C@H](O)[C@H](O)[C@@H](O)[C@@H]1O")
    beta = to_smiles(resolve("D-glucose"), RingForm("pyranose", "beta"))
    assert beta == canonical("OC[C@H]1O[C@@H](O)[C@H](O)[C@@H](O)[C@@H]1O")


def test_glucose_inchikey():
    # Standard InChIKey of open-chain D-glucose (aldehydo form), PubChem [from memory]
    assert to_inchikey(resolve("D-glucose")) == "GZCGUPFRVQAUEE-SLPGGIOYSA-N"


def _anomeric_cip(smiles: str, carbons_in_ring: int) -> str:
    mol = Chem.MolFromSmiles(smiles)
    rdCIPLabeler.AssignCIPLabels(mol)
    for atom in mol.GetAtoms():
        o_neighbours = [n for n in atom.GetNeighbors() if n.GetSymbol() == "O"]
        if atom.GetSymbol() == "C" and atom.IsInRing() and len(o_neighbours) == 2:
            return atom.GetProp("_CIPCode")
    raise AssertionError("no anomeric carbon")


@pytest.mark.parametrize(
    ("name", "form", "cip"),
    [
        # alpha-D-glucopyranose (2S,...), beta (2R,...): DESIGN.md conventions and
        # IUPAC-IUBMB 2-Carb-6.2 [common practice]
        ("D-glucose", RingForm("pyranose", "alpha"), "S"),
        ("D-glucose", RingForm("pyranose", "beta"), "R"),
        # beta-D-fructopyranose (2R,3S,4R,5R)-2-(hydroxymethyl)oxane-2,3,4,5-tetrol [from memory]
        ("D-fructose", RingForm("pyranose", "beta"), "R"),
        # beta-D-fructofuranose (2R,3S,4S,5R) [from memory]; consistent with the
        # (2S)-oxolan-2-yl descriptor of the fructosyl unit in sucrose's IUPAC name
        ("D-fructose", RingForm("furanose", "beta"), "R"),
    ],
)
def test_anomeric_descriptors(name, form, cip):
    assert _anomeric_cip(to_smiles(resolve(name), form), 6) == cip


def _faces(smiles: str) -> str:
    """'cis' or 'trans' for the exocyclic anomeric O and the exocyclic C on the ring O's other neighbour.

    Geometry from an RDKit embedding: the side of the ring each substituent
    points to (relative to the other substituent on the same atom).
    """
    import numpy as np
    from rdkit.Chem import AllChem

    mol = Chem.AddHs(Chem.MolFromSmiles(smiles))
    AllChem.EmbedMolecule(mol, randomSeed=7)
    ring = next(r for r in mol.GetRingInfo().AtomRings() if len(r) in (5, 6))
    pos = mol.GetConformer().GetPositions()
    centre = pos[list(ring)].mean(0)
    normal = np.linalg.svd(pos[list(ring)] - centre)[2][2]

    def height(i):
        return float(np.dot(pos[i] - centre, normal))

    ring_o = next(i for i in ring if mol.GetAtomWithIdx(i).GetSymbol() == "O")
    sides = {}
    for nb in mol.GetAtomWithIdx(ring_o).GetNeighbors():
        subs = [x.GetIdx() for x in nb.GetNeighbors() if x.GetIdx() not in ring]
        exo_o = [i for i in subs if mol.GetAtomWithIdx(i).GetSymbol() == "O"]
        heavy = exo_o or [i for i in subs if mol.GetAtomWithIdx(i).GetSymbol() == "C"]
        other = next(i for i in subs if i != heavy[0])
        sides["anomeric" if exo_o else "tail"] = height(heavy[0]) > height(other)
    return "cis" if sides["anomeric"] == sides["tail"] else "trans"


@pytest.mark.parametrize("name", ["D-glucose", "D-galactose", "L-rhamnose", "D-fructose", "D-sedoheptulose"])
def test_beta_d_anomer_has_o1_cis_to_terminal_group_in_3d(name):
    # Haworth rule for D-sugars: in the beta anomer the anomeric OH is on the
    # same face as the exocyclic carbon of the reference atom [common practice];
    # equivalent to IUPAC-IUBMB 2-Carb-6.2 for these rings.
    chain = resolve(name)
    ring = "furanose" if chain.carbonyl == "ketose" else "pyranose"
    beta = _faces(to_smiles(chain, RingForm(ring, "beta")))
    alpha = _faces(to_smiles(chain, RingForm(ring, "alpha")))
    if chain.series == "D":
        assert (beta, alpha) == ("cis", "trans")
    else:  # for L sugars the same rule holds with faces mirrored: still cis for beta
        assert (beta, alpha) == ("cis", "trans")


def test_mirror_of_every_hexose_is_its_enantiomer():
    # Enantiomer pairing: L = mirror of D (IUPAC-IUBMB 2-Carb-4) [common practice]
    for chain in catalogue(Scope(carbons=(6,))):
        assert mirror_smiles(to_smiles(chain)) == to_smiles(chain.mirror())
        assert not is_achiral(to_smiles(chain))


def test_ring_forms_follow_chain_length():
    assert ring_forms(resolve("D-erythrose")) == (RingForm("furanose", "alpha"), RingForm("furanose", "beta"))
    assert len(ring_forms(resolve("D-glucose"))) == 4
    assert ring_forms(resolve("D-glyceraldehyde")) == ()
