"""Periodate oxidation and Smith degradation against published stoichiometries."""

from __future__ import annotations

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from workbench.chem import RingForm, Scope, catalogue, resolve, to_smiles
from workbench.chem.periodate import (
    SUBSTRATES,
    oxidise,
    periodate_oxidation,
    smith,
    smith_degradation,
)
from workbench.chem.reactions import NotApplicable
from workbench.errors import ObservationError, StructureError, WorkbenchError

ALDOHEXOSES = catalogue(Scope(carbons=(6,), carbonyl=("aldose",)))
KETOHEXOSES = catalogue(Scope(carbons=(6,), carbonyl=("ketose",)))
ALDOPENTOSES = catalogue(Scope(carbons=(5,), carbonyl=("aldose",)))
EVERYTHING = catalogue(Scope(carbons=tuple(range(3, 10)), modifications=("any",)))


def _counts(result) -> tuple[int, int, int, int]:
    return (result.periodate, result.formic_acid, result.formaldehyde, result.co2)


@pytest.mark.parametrize("chain", ALDOHEXOSES, ids=str)
def test_open_chain_aldohexose(chain):
    # 5 IO4-, 5 HCOOH, 1 HCHO (REFERENCE_VALUES.md, periodate) [common practice]
    assert _counts(periodate_oxidation(chain, "free")) == (5, 5, 1, 0)


@pytest.mark.parametrize("chain", KETOHEXOSES, ids=str)
def test_open_chain_2_ketohexose(chain):
    # 5 IO4-, 3 HCOOH, 2 HCHO, 1 CO2 [common practice]
    assert _counts(periodate_oxidation(chain, "free")) == (5, 3, 2, 1)


@pytest.mark.parametrize("chain", ALDOHEXOSES + KETOHEXOSES, ids=str)
def test_hexitol(chain):
    # hexitol: 5 IO4-, 4 HCOOH, 2 HCHO [common practice]
    assert _counts(periodate_oxidation(chain, "alditol")) == (5, 4, 2, 0)


def test_glycerol_and_ethylene_glycol():
    # glycerol 2 IO4-, 1 HCOOH, 2 HCHO; ethylene glycol 1, 0, 2 [common practice]
    assert _counts(oxidise("OCC(O)CO")) == (2, 1, 2, 0)
    assert _counts(oxidise("OCCO")) == (1, 0, 2, 0)


@pytest.mark.parametrize("anomer", ["alpha", "beta"])
@pytest.mark.parametrize("chain", ALDOHEXOSES, ids=str)
def test_methyl_hexopyranoside(chain, anomer):
    # 2 IO4-, 1 HCOOH from C-3 (Jackson and Hudson, JACS 59, 994, 1937 [from memory];
    # Abdel-Akher et al., Nature 171, 474, 1953)
    result = periodate_oxidation(chain, "methyl_pyranoside", anomer)
    assert (result.periodate, result.formic_acid, result.formaldehyde) == (2, 1, 0)


@pytest.mark.parametrize("chain", ALDOHEXOSES, ids=str)
def test_methyl_hexofuranoside(chain):
    # 2 IO4-, no HCOOH, 1 HCHO (Jackson and Hudson 1937 [from memory]; Abdel-Akher et al. 1953)
    result = periodate_oxidation(chain, "methyl_furanoside")
    assert (result.periodate, result.formic_acid, result.formaldehyde) == (2, 0, 1)


@pytest.mark.parametrize("chain", ALDOPENTOSES, ids=str)
def test_methyl_pentofuranoside(chain):
    # 1 IO4-, no formic acid (Jackson and Hudson 1937 [from memory])
    result = periodate_oxidation(chain, "methyl_furanoside")
    assert (result.periodate, result.formic_acid) == (1, 0)


def test_methyl_pentopyranoside_matches_hexopyranoside_consumption():
    # methyl pentopyranosides also take 2 IO4- and give 1 HCOOH (Jackson and Hudson 1937 [from memory])
    result = periodate_oxidation(resolve("D-xylose"), "methyl_pyranoside")
    assert (result.periodate, result.formic_acid) == (2, 1)


def test_6_deoxy_terminus_gives_acetaldehyde():
    # the CH3-CHOH end leaves as acetaldehyde, not formaldehyde [common practice]
    result = periodate_oxidation(resolve("L-rhamnose"), "free")
    assert _counts(result) == (4, 4, 0, 0)
    assert result.amount("acetaldehyde") == 1


def test_uronic_acid_gives_glyoxylic_acid():
    # alpha-hydroxy acids resist periodate: C-5/C-6 leave as glyoxylic acid [common practice]
    result = periodate_oxidation(resolve("D-glucuronic acid"), "free")
    assert result.amount("glyoxylic acid") == 1
    assert result.formaldehyde == 0


def test_2_deoxy_sugar_gives_malondialdehyde():
    # the basis of the thiobarbituric acid assay for 2-deoxy sugars
    # (Waravdekar and Saslaw, 1959 [from memory]); over-oxidation not counted
    result = periodate_oxidation(resolve("2-deoxy-D-ribose"), "free")
    assert result.amount("malondialdehyde") == 1
    assert _counts(result) == (2, 1, 1, 0)


def test_amino_alcohol_is_cleaved_and_releases_ammonia():
    # alpha-amino alcohols are cleaved like diols [common practice]
    result = periodate_oxidation(resolve("D-glucosamine"), "free")
    assert _counts(result) == (5, 5, 1, 0)
    assert result.amount("ammonia") == 1


def test_ring_form_with_formate_hydrolysis_equals_open_chain():
    # Convention: the formyl ester from C-1 of a pyranose is counted as formic
    # acid once hydrolysed, giving the open-chain totals (computed cross-check)
    glucose = resolve("D-glucose")
    ring = oxidise(to_smiles(glucose, RingForm("pyranose", "beta")))
    assert ring.counts() == periodate_oxidation(glucose, "free").counts()
    unhydrolysed = oxidise(to_smiles(glucose, RingForm("pyranose", "beta")), hydrolyse_formates=False)
    assert unhydrolysed.periodate == 3 and any("OC=O" in f.smiles or "O=CO" in f.smiles for f in unhydrolysed.other)


def test_methyl_alpha_d_hexopyranosides_give_one_dialdehyde():
    # Jackson and Hudson (JACS 59, 994, 1937) [from memory]: every methyl
    # alpha-D-aldohexopyranoside gives the same dialdehyde; the beta anomers
    # give another one
    d_hexoses = [c for c in ALDOHEXOSES if c.series == "D"]

    def dialdehyde(chain, anomer):
        result = periodate_oxidation(chain, "methyl_pyranoside", anomer)
        return max(result.other, key=lambda f: f.carbons).smiles

    alphas = {dialdehyde(c, "alpha") for c in d_hexoses}
    betas = {dialdehyde(c, "beta") for c in d_hexoses}
    assert len(alphas) == 1 and len(betas) == 1 and alphas != betas


def test_smith_degradation_of_methyl_glucopyranoside():
    # glycerol + glycolaldehyde (+ methanol) (Abdel-Akher, Hamilton, Montgomery
    # and Smith, JACS 74, 4970, 1952 [from memory])
    result = smith_degradation(resolve("D-glucose"), "pyranose")
    assert {"glycerol", "glycolaldehyde", "methanol"} <= set(result.names)


def test_smith_degradation_of_pentopyranoside_and_6_deoxy_hexopyranoside():
    # pentopyranosides give ethylene glycol, 6-deoxyhexopyranosides
    # propane-1,2-diol (Smith degradation practice [from memory])
    assert "ethylene glycol" in smith_degradation(resolve("D-xylose"), "pyranose").names
    names = smith_degradation(resolve("L-rhamnose"), "pyranose").names
    assert any(n.endswith("propane-1,2-diol") for n in names)


def test_smith_accepts_any_glycoside_smiles():
    # methyl alpha-D-glucopyranoside written by hand (PubChem-style SMILES [from memory])
    result = smith("CO[C@H]1O[C@H](CO)[C@@H](O)[C@H](O)[C@H]1O")
    assert "glycerol" in result.names and result.periodate == 2


@pytest.mark.parametrize(
    ("name", "substrate", "word"),
    [
        ("D-erythrose", "methyl_pyranoside", "too short"),
        ("D-glyceraldehyde", "methyl_furanoside", "too short"),
        ("dihydroxyacetone", "methyl_furanoside", "too short"),
    ],
)
def test_forms_that_cannot_exist_say_why(name, substrate, word):
    result = periodate_oxidation(resolve(name), substrate)
    assert isinstance(result, NotApplicable) and word in result.reason


def test_ring_closing_carbon_without_oh_says_why():
    chain = next(c for c in EVERYTHING if c.carbons == 5 and c.groups[4] == "CH3" and c.carbonyl == "aldose")
    result = periodate_oxidation(chain, "methyl_pyranoside")
    assert isinstance(result, NotApplicable) and "hydroxyl" in result.reason


def test_bad_substrate_word_is_an_observation_error():
    with pytest.raises(ObservationError) as info:
        periodate_oxidation(resolve("D-glucose"), "pyranose")
    assert isinstance(info.value, WorkbenchError) and isinstance(info.value, ValueError)
    assert "methyl_pyranoside" in str(info.value)


def test_bad_smiles_is_a_structure_error():
    with pytest.raises(StructureError):
        oxidise("C(O")


@settings(max_examples=200, deadline=None)
@given(st.sampled_from(EVERYTHING), st.sampled_from(SUBSTRATES), st.sampled_from(["alpha", "beta"]))
def test_carbon_balance_adds_up(chain, substrate, anomer):
    result = periodate_oxidation(chain, substrate, anomer)
    if isinstance(result, NotApplicable):
        return
    methyl = 1 if substrate.startswith("methyl") else 0
    acetyl = 2 * chain.groups.count("CHNHAc")
    # conservation of carbon (chain length, plus the aglycone methyl and any N-acetyl) [common practice]
    assert result.carbons_in == chain.carbons + methyl + acetyl
    assert result.carbons_out == result.carbons_in and result.balanced


@settings(max_examples=200, deadline=None)
@given(st.sampled_from(EVERYTHING), st.sampled_from(SUBSTRATES))
def test_enantiomers_consume_the_same_periodate(chain, substrate):
    a = periodate_oxidation(chain, substrate)
    b = periodate_oxidation(chain.mirror(), substrate)
    if isinstance(a, NotApplicable):
        assert isinstance(b, NotApplicable)
        return
    # mirror images react identically with an achiral reagent [common practice]
    assert a.counts() == b.counts()


@settings(max_examples=200, deadline=None)
@given(st.sampled_from(EVERYTHING))
def test_periodate_of_free_sugar_cleaves_every_bond_between_functional_carbons(chain):
    functional = {"CHO", "CO", "CH2OH", "CHOH", "CHNH2"}
    bonds = sum(1 for a, b in zip(chain.groups, chain.groups[1:], strict=False) if a in functional and b in functional)
    # one IO4- per cleaved C-C bond between carbons bearing OH, =O or NH2 (REFERENCE_VALUES.md)
    assert periodate_oxidation(chain, "free").periodate == bonds


# ------------------------------------------------------------------ uptake alone (products not measured)
def _uptake_project(unknown: dict, substrate: str, **amounts: float) -> dict:
    return {
        "format": "stereosieve-project",
        "version": 1,
        "title": "periodate uptake only",
        "unknowns": [unknown],
        "observations": [
            {"id": "P1", "kind": "periodate", "unknown": unknown["id"], "substrate": substrate, **amounts}
        ],
    }


def test_uptake_alone_is_a_complete_record_and_keeps_the_true_sugar():
    from workbench.evidence import project_from_dict, solve

    # methyl hexofuranoside 2 IO4-, methyl pentofuranoside 1 (Jackson and Hudson, J. Am. Chem. Soc. 59,
    # 994, 1937 [memory]): uptake alone keeps the aldohexoses and removes the aldopentoses
    scope = {"carbons": [5, 6], "carbonyl": ["aldose"]}
    p = project_from_dict(_uptake_project({"id": "U", "scope": scope}, "methyl_furanoside", periodate=2.0))
    survivors = solve(p).survivors["U"]
    assert resolve("D-glucose") in survivors and resolve("D-galactose") in survivors
    assert not any(c.carbons == 5 for c in survivors)
    # an open-chain aldohexose consumes 5 (common practice): uptake alone removes every aldopentose (4)
    q = project_from_dict(_uptake_project({"id": "U", "scope": {"carbons": [5, 6]}}, "free", periodate=5.0))
    left = solve(q).survivors["U"]
    assert resolve("D-glucose") in left and not any(c.carbons == 5 and c.carbonyl == "aldose" for c in left)


def test_a_measured_product_still_counts_when_another_is_left_out():
    from workbench.evidence import project_from_dict, solve

    # aldohexose 5 IO4-, 5 HCOOH; 2-ketohexose 5 IO4-, 3 HCOOH (common practice)
    p = project_from_dict(
        _uptake_project({"id": "U", "scope": {"carbons": [6]}}, "free", periodate=5.0, formic_acid=3.0)
    )
    left = solve(p).survivors["U"]
    assert resolve("D-fructose") in left and resolve("D-glucose") not in left
    text = solve(p).trail[0].reasons["U"][resolve("D-glucose")]
    assert "observed IO4- 5, HCOOH 3" in text and "HCHO" not in text.split("observed")[1]


def test_residue_uptake_alone_keeps_the_linkage():
    from workbench.evidence import project_from_dict, solve

    # a 4-linked hexopyranosyl residue consumes 1 IO4- and gives no formic acid (C-2-C-3 glycol only);
    # a 6-linked one consumes 2 and gives 1 HCOOH (Hay, Lewis and Smith, Methods Carbohydr. Chem. 5, 357,
    # 1965 [memory]; common practice)
    unknown = {"id": "R", "type": "residue", "scope": {"sugars": ["D-glucose"], "ring": ["pyranose"]}}
    p = project_from_dict(_uptake_project(unknown, "residue", periodate=1.0))
    names = {r.name for r in solve(p).survivors["R"]}
    assert "->4)-alpha-D-Glcp-(1->" in names and "->6)-alpha-D-Glcp-(1->" not in names
