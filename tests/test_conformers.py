"""3D chairs, puckering and Angyal chair preferences."""

from __future__ import annotations

import math
import subprocess
import sys

import numpy as np
import pytest
from rdkit import Chem

from workbench.chem import resolve
from workbench.chem.smiles import RingForm
from workbench.conformers import (
    chair_comparison,
    chair_energy,
    chair_preferences,
    conformer_library,
    conformer_mol,
    conformer_molblock,
    puckering,
    ring_conformers,
    ring_layout,
)
from workbench.conformers.chair import DOWN, PYRANOSE_RING_TORSION_DEG, UP, ideal_chair
from workbench.conformers.conformer import ConformerSettings
from workbench.conformers.coupling import dihedral_deg
from workbench.errors import StructureError

BETA_P = RingForm("pyranose", "beta")
ALPHA_P = RingForm("pyranose", "alpha")


# ---------------------------------------------------------------- puckering
def test_ideal_chairs_sit_at_the_poles_of_the_puckering_sphere():
    # Cremer and Pople 1975: a chair has theta 0 or 180 deg; O5,C1..C5 order puts 4C1 at 0.
    assert puckering(ideal_chair("A").ring).theta == pytest.approx(0.0, abs=1e-6)
    assert puckering(ideal_chair("B").ring).theta == pytest.approx(180.0, abs=1e-6)


def test_planar_ring_has_no_puckering_amplitude():
    hexagon = np.array([[math.cos(a), math.sin(a), 0.0] for a in np.arange(6) * math.pi / 3])
    assert puckering(hexagon).amplitude == pytest.approx(0.0, abs=1e-12)


def test_puckering_rejects_a_three_atom_ring():
    with pytest.raises(StructureError):
        puckering(np.zeros((3, 3)))


def test_ideal_chair_has_the_requested_ring_torsion():
    geo = ideal_chair("A", 54.0)
    torsions = [abs(dihedral_deg(*(geo.ring[(p + k) % 6] for k in range(4)))) for p in range(6)]
    assert torsions == pytest.approx([54.0] * 6, abs=0.01)


# ---------------------------------------------------------------- Angyal chairs
def test_beta_d_glucopyranose_prefers_4c1_with_every_substituent_equatorial():
    # Angyal, Angew. Chem. Int. Ed. 8, 157 (1969) [memory]: beta-D-Glcp 4C1, all equatorial.
    glc = resolve("D-glucose")
    assert chair_preferences(glc)["beta_pyranose"].preferred == "4C1"
    chair = chair_energy(ring_layout(glc, BETA_P), "A")
    assert chair.label == "4C1"
    assert chair.axial == ()
    assert set(chair.equatorial) == {"O1", "O2", "O3", "O4", "C6"}


def test_beta_l_glucopyranose_prefers_1c4():
    # Mirror image of the 4C1 beta-D-glucopyranose (Angyal 1969 [memory]).
    assert chair_preferences(resolve("L-glucose"))["beta_pyranose"].preferred == "1C4"


def test_angyal_worked_result_for_glucose():
    # REFERENCE_VALUES.md, Angyal 1968-69 [memory]: beta-D-Glcp 2.05, alpha 2.40 kcal/mol (4C1).
    glc = resolve("D-glucose")
    assert chair_energy(ring_layout(glc, BETA_P), "A").kcal == pytest.approx(2.05, abs=1e-9)
    assert chair_energy(ring_layout(glc, ALPHA_P), "A").kcal == pytest.approx(2.40, abs=1e-9)


def test_ketopyranose_chairs_are_named_from_c2():
    # Names by IUPAC-IUBMB 2-Carb-7.3 (C-2 is the lowest-numbered ring carbon); that
    # beta-D-fructopyranose adopts the 2C5 chair is from memory.
    prefs = chair_preferences(resolve("D-fructose"))
    assert prefs["beta_pyranose"].preferred == "2C5"


def test_energy_terms_explain_the_sum():
    a = chair_energy(ring_layout(resolve("D-mannose"), BETA_P), "A")
    assert sum(t.kcal for t in a.terms) == pytest.approx(a.kcal)
    assert any("anomeric" in t.text for t in a.terms)


# ---------------------------------------------------------------- 3D conformers
def test_mmff_finds_both_chairs_of_beta_d_glucopyranose():
    found = ring_conformers(resolve("D-glucose"), BETA_P)
    shapes = {c.shape for c in found.conformers}
    assert {"4C1", "1C4"} <= shapes
    assert found.conformers[0].shape == "4C1"  # lowest MMFF94 energy
    assert found.best("4C1").axial == ()  # Angyal 1969 [memory]: all equatorial
    assert set(found.best("1C4").axial) == {"O1", "O2", "O3", "O4", "C6"}


def test_mmff_lowest_beta_l_glucopyranose_is_1c4():
    found = ring_conformers(resolve("L-glucose"), BETA_P)
    assert found.conformers[0].shape == "1C4"


@pytest.mark.parametrize("name", ["D-fructose", "L-rhamnose", "D-glucuronic acid", "D-glucosamine"])
def test_3d_faces_and_axial_pattern_match_the_ideal_chair(name):
    chain = resolve(name)
    for form in (ALPHA_P, BETA_P):
        layout = ring_layout(chain, form)
        expected = {s.label: f for p in layout.positions for f in (UP, DOWN) if not (s := p.on(f)).is_hydrogen}
        found = ring_conformers(chain, form)
        for conf in found.conformers:
            assert dict(conf.faces) == expected
        for chair in ("A", "B"):
            assert sorted(found.best(chair).axial) == sorted(chair_energy(layout, chair).axial)


def test_conformers_are_deterministic():
    chain = resolve("D-xylose")
    settings = ConformerSettings(embeddings=2, seed=7)
    first = ring_conformers(chain, BETA_P, settings)
    from workbench.conformers.conformer import _compute

    _compute.cache_clear()
    second = ring_conformers(chain, BETA_P, settings)
    assert first is not second
    assert [c.energy_kcal for c in first.conformers] == pytest.approx([c.energy_kcal for c in second.conformers])
    assert np.allclose(first.positions(0), second.positions(0))


def test_conformers_are_cached():
    chain = resolve("D-glucose")
    assert ring_conformers(chain, BETA_P) is ring_conformers(chain, BETA_P)


def test_conformer_mol_for_display_has_one_3d_conformer():
    mol = conformer_mol(resolve("D-glucose"), BETA_P, "1C4")
    assert mol.GetNumConformers() == 1
    assert mol.GetConformer().Is3D()
    assert mol.GetProp("shape") == "1C4"
    block = conformer_molblock(resolve("D-glucose"), BETA_P)
    assert "V2000" in block and Chem.MolFromMolBlock(block, removeHs=False).GetNumAtoms() == mol.GetNumAtoms()


def test_display_conformer_follows_angyal_not_mmff():
    # alpha-D-allopyranose: Angyal's scheme prefers 4C1 (Angyal 1969 [memory]: Allp is 4C1);
    # gas-phase MMFF94 may rank a hydrogen-bonded 1C4 lower. The view follows Angyal.
    allose = resolve("D-allose")
    assert ring_conformers(allose, ALPHA_P).best().shape == "4C1"
    assert conformer_mol(allose, ALPHA_P).GetProp("shape") == "4C1"


def test_furanose_conformers_are_envelopes_or_twists():
    found = ring_conformers(resolve("D-ribose"), RingForm("furanose", "beta"))
    for conf in found.conformers:
        assert conf.chair is None
        assert "E" in conf.shape or "T" in conf.shape


def test_library_reports_progress():
    calls = []
    chains = [resolve("D-xylose"), resolve("D-lyxose")]
    out = conformer_library(chains, forms=[BETA_P], progress=lambda done, total, what: calls.append((done, total)))
    assert len(out) == 2
    assert calls == [(1, 2), (2, 2)]


def test_missing_ring_form_is_refused():
    with pytest.raises(StructureError):
        ring_conformers(resolve("D-erythrose"), BETA_P)


def test_chair_comparison_reports_angyal_and_mmff():
    cmp = chair_comparison(resolve("D-glucose"), BETA_P)
    assert cmp.angyal_preferred == cmp.mmff_preferred == "4C1"
    assert cmp.agree
    assert cmp.mmff_kcal["4C1"] == 0.0 and cmp.mmff_kcal["1C4"] > 0


def test_anomer_comparison_reports_angyal_and_mmff():
    from workbench.conformers import anomer_comparison

    cmp = anomer_comparison(resolve("D-glucose"))
    # Angyal 1969 [memory]: beta-D-glucopyranose favoured in water by 0.35 kcal/mol.
    assert cmp.angyal_preferred == "beta"
    assert cmp.angyal_kcal == pytest.approx(-0.35, abs=0.01)
    assert isinstance(cmp.mmff_kcal, float)


def test_fast_path_ring_torsion_matches_mmff_chairs():
    # Our own cross-check: the ideal-chair torsion is the mean of the MMFF94 chairs.
    torsions = []
    for name in ("D-glucose", "D-mannose", "D-galactose"):
        for form in (ALPHA_P, BETA_P):
            found = ring_conformers(resolve(name), form)
            for chair in ("A", "B"):
                xyz = found.positions(found.best(chair).conf_id)[list(found.ring_atoms)]
                torsions += [abs(dihedral_deg(*(xyz[(p + k) % 6] for k in range(4)))) for p in range(6)]
    assert float(np.mean(torsions)) == pytest.approx(PYRANOSE_RING_TORSION_DEG, abs=3.0)


def test_core_import_pulls_in_no_ui_library():
    code = (
        "import sys, workbench.conformers\n"
        "bad = [m for m in ('ipywidgets', 'IPython', 'py3Dmol', 'matplotlib') if m in sys.modules]\n"
        "print(','.join(bad))"
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert out.stdout.strip() == ""
