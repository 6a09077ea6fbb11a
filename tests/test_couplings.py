"""Ring 3J(H,H) by the Haasnoot-de Leeuw-Altona equation, against textbook values."""

from __future__ import annotations

import pytest

from workbench.chem import resolve
from workbench.chem.smiles import RingForm
from workbench.conformers import hla_coupling, ring_couplings, ring_couplings_3d
from workbench.conformers.coupling import group_electronegativity, pyranose_couplings

BETA_P = RingForm("pyranose", "beta")

# Free sugars in D2O, J(H1,H2) in Hz (REFERENCE_VALUES.md, textbook ranges [memory]);
# being recalled, they are checked with a 1 Hz margin.
J12_TEXTBOOK = {
    ("D-glucose", "alpha_pyranose"): (3.7, 3.8),
    ("D-glucose", "beta_pyranose"): (7.9, 8.0),
    ("D-galactose", "alpha_pyranose"): (3.8, 4.0),
    ("D-galactose", "beta_pyranose"): (7.8, 8.0),
    ("D-mannose", "alpha_pyranose"): (1.7, 1.9),
    ("D-mannose", "beta_pyranose"): (0.0, 1.0),
}


@pytest.mark.parametrize(("name", "form"), sorted(J12_TEXTBOOK))
def test_j12_within_textbook_range(name, form):
    # Textbook ranges from memory (REFERENCE_VALUES.md), +/- 1 Hz.
    low, high = J12_TEXTBOOK[(name, form)]
    j = ring_couplings(resolve(name))[form]["H1-H2"]
    assert low - 1.0 <= j <= high + 1.0


def test_j12_orders_the_anomers_like_the_textbook():
    # Textbook ranges from memory: beta-Glc > alpha-Glc > alpha-Man > beta-Man.
    glc, man = ring_couplings(resolve("D-glucose")), ring_couplings(resolve("D-mannose"))
    values = [
        glc["beta_pyranose"]["H1-H2"],
        glc["alpha_pyranose"]["H1-H2"],
        man["alpha_pyranose"]["H1-H2"],
        man["beta_pyranose"]["H1-H2"],
    ]
    assert values == sorted(values, reverse=True)


@pytest.mark.parametrize("pair", ["H2-H3", "H3-H4", "H4-H5"])
def test_trans_diaxial_couplings_of_beta_glucopyranose(pair):
    # REFERENCE_VALUES.md [memory]: beta-Glcp J2,3, J3,4, J4,5 about 9-10 Hz.
    j = ring_couplings(resolve("D-glucose"))["beta_pyranose"][pair]
    assert 8.5 <= j <= 10.5


def test_methyl_beta_glucopyranoside_j12():
    # Faijes et al., Carbohydr. Res. 341, 2055 (2006): beta-glycoside J1,2 7.8 Hz.
    j = pyranose_couplings(resolve("D-glucose"), RingForm("pyranose", "beta", methyl=True))["H1-H2"]
    assert j == pytest.approx(7.8, abs=0.7)


def test_3d_path_agrees_with_fast_path_for_beta_glucopyranose():
    # Cross-check of our two paths (no outside value): dihedrals measured on MMFF94 chairs.
    fast = ring_couplings(resolve("D-glucose"))["beta_pyranose"]
    measured = ring_couplings_3d(resolve("D-glucose"), BETA_P)
    assert set(fast) == set(measured)
    for pair, j in fast.items():
        assert measured[pair] == pytest.approx(j, abs=1.5)
    assert min(measured[p] for p in ("H2-H3", "H3-H4", "H4-H5")) > 8.0  # trans-diaxial, [memory] 9-10 Hz


def test_3d_path_names_ch2_protons_like_the_fast_path():
    fast = ring_couplings(resolve("D-xylose"))["beta_pyranose"]
    measured = ring_couplings_3d(resolve("D-xylose"), BETA_P)
    assert set(fast) == set(measured) == {"H1-H2", "H2-H3", "H3-H4", "H4-H5ax", "H4-H5eq"}


def test_furanose_couplings_come_from_3d_conformers():
    got = ring_couplings_3d(resolve("D-ribose"), RingForm("furanose", "beta"))
    assert set(got) == {"H1-H2", "H2-H3", "H3-H4"}
    assert all(0.0 <= j <= 12.0 for j in got.values())


def test_ketose_pairs_start_at_h3_h4():
    pairs = ring_couplings(resolve("D-fructose"))["beta_pyranose"]
    assert list(pairs)[0] == "H3-H4"
    assert {"H5-H6ax", "H5-H6eq"} <= set(pairs)


def test_pentopyranose_names_c5_protons_axial_and_equatorial():
    pairs = ring_couplings(resolve("D-xylose"))["beta_pyranose"]
    # Large J4,5ax and small J4,5eq of beta-xylopyranose are textbook facts [memory]; qualitative check.
    assert pairs["H4-H5ax"] > 8.0 > 6.0 > pairs["H4-H5eq"]


def test_enantiomers_have_equal_couplings():
    d, ell = ring_couplings(resolve("D-glucose")), ring_couplings(resolve("L-glucose"))
    assert set(d) == set(ell)
    for form in d:
        assert ell[form] == pytest.approx(d[form])


def test_hla_equation_without_substituents():
    # Haasnoot et al. 1980: at phi = 180 deg, J = P1 - P2 + P3 = 13.70 + 0.73 Hz.
    assert hla_coupling(180.0, []) == pytest.approx(14.43)
    assert hla_coupling(90.0, []) == pytest.approx(0.0, abs=1e-12)


def test_electronegative_substituent_antiperiplanar_to_a_proton_lowers_j():
    # The orientation term of Haasnoot et al. 1980: at phi +60 deg an O anti to the other proton
    # has xi = -1 and lowers J; the same O gauche to both protons (xi = +1) raises it.
    oh = group_electronegativity("O", ("H",))
    assert oh == pytest.approx(1.30)
    assert hla_coupling(60.0, [(oh, -1)]) < hla_coupling(60.0, []) < hla_coupling(60.0, [(oh, +1)])
