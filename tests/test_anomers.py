"""Alpha/beta pyranose equilibria by Angyal's scheme, against published compositions."""

from __future__ import annotations

import pytest

from workbench.chem import Scope, catalogue, resolve
from workbench.conformers import anomer_fractions, physical_json, physical_notes
from workbench.conformers.equilibrium import FRACTION_KEYS


def _pool(alpha: float, beta: float) -> tuple[float, float]:
    """Published alpha/beta pyranose fractions renormalised to the pyranose pool."""
    return alpha / (alpha + beta), beta / (alpha + beta)


# Angyal, Angew. Chem. Int. Ed. 8, 157 (1969); Adv. Carbohydr. Chem. Biochem. 42, 15 (1984)
# [memory, +/- 0.05]; compared within the pyranose pool because furanoses are not predicted.
ANGYAL_COMPOSITION = {
    "D-glucose": (0.38, 0.62),
    "D-mannose": (0.655, 0.345),
    "D-galactose": (0.30, 0.64),
    "D-xylose": (0.365, 0.63),
    "D-lyxose": (0.70, 0.28),
    "D-arabinose": (0.60, 0.355),
}


@pytest.mark.parametrize("name", sorted(ANGYAL_COMPOSITION))
def test_pyranose_fractions_within_published_range(name):
    # Angyal 1969/1984 [memory]: tolerance +/- 0.05 as REFERENCE_VALUES.md asks.
    alpha, beta = _pool(*ANGYAL_COMPOSITION[name])
    got = anomer_fractions(resolve(name))
    assert got["alpha_pyranose"] == pytest.approx(alpha, abs=0.05)
    assert got["beta_pyranose"] == pytest.approx(beta, abs=0.05)


def test_glucose_worked_example_gives_64_percent_beta():
    # REFERENCE_VALUES.md, Angyal 1968-69 [memory]: 2.05 vs 2.40 kcal/mol, 64 % beta.
    assert anomer_fractions(resolve("D-glucose"))["beta_pyranose"] == pytest.approx(0.64, abs=0.01)


def test_mannose_worked_example_gives_68_percent_alpha():
    # REFERENCE_VALUES.md, Angyal 1968-69 [memory]: mannose 68 % alpha.
    assert anomer_fractions(resolve("D-mannose"))["alpha_pyranose"] == pytest.approx(0.68, abs=0.01)


@pytest.mark.parametrize("name", ["D-glucose", "D-galactose", "D-allose", "D-gulose", "D-ribose", "D-xylose"])
def test_beta_pyranose_is_the_majority(name):
    # Angyal 1984 [memory], qualitative: beta-pyranose dominates for Glc, Gal, All, Gul, Rib, Xyl.
    got = anomer_fractions(resolve(name))
    assert got["beta_pyranose"] > got["alpha_pyranose"]


@pytest.mark.parametrize("name", ["D-mannose", "D-arabinose", "D-lyxose", "D-talose"])
def test_alpha_pyranose_is_the_majority(name):
    # Angyal 1984 [memory], qualitative: alpha-pyranose dominates for Man, Ara, Lyx, Tal.
    got = anomer_fractions(resolve(name))
    assert got["alpha_pyranose"] > got["beta_pyranose"]


def test_fructose_beta_pyranose_dominates_the_pyranose_pool():
    # Barclay et al., Carbohydr. Res. 347, 136 (2012): beta-p 0.682 against alpha-p 0.027 in D2O.
    got = anomer_fractions(resolve("D-fructose"))
    assert got["beta_pyranose"] > 0.5


def test_enantiomers_have_equal_fractions():
    d, ell = anomer_fractions(resolve("D-galactose")), anomer_fractions(resolve("L-galactose"))
    assert d == pytest.approx(ell)


def test_furanose_and_open_chain_are_not_predicted():
    got = anomer_fractions(resolve("D-glucose"))
    assert got["alpha_furanose"] is None and got["beta_furanose"] is None and got["open_chain"] is None
    assert got["alpha_pyranose"] + got["beta_pyranose"] == pytest.approx(1.0)


def test_a_tetrose_has_no_pyranose():
    got = anomer_fractions(resolve("D-erythrose"))
    assert got["alpha_pyranose"] == got["beta_pyranose"] == 0.0
    assert physical_json(resolve("D-erythrose"))["chairs"] == {}
    assert any("pyranose" in note for note in physical_notes(resolve("D-erythrose")))


def test_returned_dicts_are_fresh_copies():
    chain = resolve("D-glucose")
    first = anomer_fractions(chain)
    first["alpha_pyranose"] = 99.0
    assert anomer_fractions(chain)["alpha_pyranose"] < 1.0


def test_physical_json_works_for_every_chain_of_a_wide_scope():
    # D series only (enantiomers are checked above); trioses to nonoses, every modification.
    chains = catalogue(Scope(carbons=(3, 4, 5, 6, 7, 8, 9), series=("D",), modifications=("any",)))
    for chain in chains:
        data = physical_json(chain)
        assert set(data) == {"anomers", "chairs", "couplings"}
        assert set(data["anomers"]) == set(FRACTION_KEYS)
        if chain.has_nitrogen:  # Angyal's scheme has no NH2/NHAc terms: not predicted, not borrowed
            assert data["anomers"]["alpha_pyranose"] is None and data["anomers"]["beta_pyranose"] is None
        else:
            pyr = data["anomers"]["alpha_pyranose"] + data["anomers"]["beta_pyranose"]
            assert pyr == pytest.approx(1.0, abs=0.002) or pyr == 0.0
        assert set(data["chairs"]) == set(data["couplings"])
        for entry in data["chairs"].values():
            assert entry["preferred"][1] == "C" and entry["energy_gap_kcal"] >= 0
        if chain.carbonyl == "ketose":
            assert all(not k.startswith("H1") for pairs in data["couplings"].values() for k in pairs)
