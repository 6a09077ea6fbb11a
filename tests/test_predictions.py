"""The cached prediction record, its JSON form, and properties over the whole catalogue."""

from __future__ import annotations

import dataclasses
import json

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from rdkit import Chem

from workbench.chem import LEFT, RIGHT, Chain, Scope, catalogue, resolve, to_smiles
from workbench.chem.predictions import PRODUCT_REACTIONS, predict, predictions_json, product_relation
from workbench.chem.reactions import NotApplicable, relation
from workbench.cli import main
from workbench.errors import ObservationError

EVERYTHING = catalogue(Scope(carbons=tuple(range(3, 10)), modifications=("any",)))
FLIP = {RIGHT: LEFT, LEFT: RIGHT}


def _inverted(smiles: str) -> str:
    """The mirror image, derived here: every tetrahedral mark written in the SMILES swapped (@ <-> @@),
    then canonicalised by RDKit. Independent of the code's own mirror helper [common practice]."""
    swapped = smiles.replace("@@", "\0").replace("@", "@@").replace("\0", "@")
    return Chem.CanonSmiles(swapped)


def _mirror_chain(chain: Chain) -> Chain:
    """The enantiomer in the Fischer projection: every stereocentre's heteroatom to the other side."""
    return Chain(chain.groups, tuple(FLIP.get(side) if side else side for side in chain.sides))


CONTRACT_KEYS = {
    "aldaric_acid",
    "aldonic_acid",
    "alditol",
    "osazone",
    "bromine_water",
    "reducing_test",
    "periodate",
    "chain_extension",
    "chain_shortening",
}


def test_prediction_is_cached_and_frozen():
    chain = resolve("D-glucose")
    record = predict(chain)
    assert predict(resolve("D-glucose")) is record
    with pytest.raises(dataclasses.FrozenInstanceError):
        record.osazone = "C"  # type: ignore[misc]


def test_json_has_the_contract_keys_and_is_fresh():
    data = predictions_json(resolve("D-glucose"))
    assert CONTRACT_KEYS <= set(data)
    json.dumps(data)  # plain data only
    data["periodate"] = None
    assert predictions_json(resolve("D-glucose"))["periodate"] is not None


def test_json_for_d_glucose():
    data = predictions_json(resolve("D-glucose"))
    # DESIGN.md key shapes; values: textbook facts (Carey ch. 25) [common practice]
    assert data["aldaric_acid"]["optically_active"] is True
    assert "1,5-lactone (delta)" in data["aldonic_acid"]["lactone"]
    assert data["alditol"]["optically_active"] is True and len(data["alditol"]["smiles"]) == 1
    assert data["bromine_water"] == {"result": "oxidised"}
    assert data["reducing_test"] == {"result": "positive"}
    # Kiliani-Fischer on D-glucose: D-glycero-D-gulo- and D-glycero-D-ido-heptose [from memory]
    assert data["chain_extension"] == {"products": ["D-glycero-D-gulo-heptose", "D-glycero-D-ido-heptose"]}
    assert data["chain_shortening"] == {"product": "D-arabinose"}
    # periodate: REFERENCE_VALUES.md [common practice; Jackson and Hudson 1937, from memory]
    assert data["periodate"]["free"] == {"periodate": 5, "formic_acid": 5, "formaldehyde": 1, "co2": 0}
    assert data["periodate"]["alditol"] == {"periodate": 5, "formic_acid": 4, "formaldehyde": 2, "co2": 0}
    assert data["periodate"]["methyl_pyranoside"] == {"periodate": 2, "formic_acid": 1, "formaldehyde": 0, "co2": 0}
    assert data["periodate"]["methyl_furanoside"] == {"periodate": 2, "formic_acid": 0, "formaldehyde": 1, "co2": 0}


def test_json_for_a_ketose_and_a_triose():
    fructose = predictions_json(resolve("D-fructose"))
    # a ketose gives no aldaric or aldonic acid, two alditols (DESIGN.md; Carey ch. 25)
    assert fructose["aldaric_acid"] is None and fructose["aldonic_acid"] is None
    assert len(fructose["alditol"]["smiles"]) == 2
    assert fructose["bromine_water"] == {"result": "unchanged"}
    assert fructose["reducing_test"] == {"result": "positive"}
    assert fructose["ketose_test"] == {"result": "positive"}
    assert fructose["chain_extension"] is None and fructose["chain_shortening"] is None
    assert "aldaric_acid" in fructose["not_applicable"]
    triose = predictions_json(resolve("D-glyceraldehyde"))
    # a triose cannot close a furanose or pyranose ring [common practice]
    assert triose["periodate"]["methyl_pyranoside"] is None
    assert triose["periodate"]["methyl_furanoside"] is None
    assert "too short" in triose["not_applicable"]["periodate.methyl_alpha_furanoside"]


def test_cli_predict_json(capsys):
    assert main(["predict", "D-galactose", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    # galactaric (mucic) acid and galactitol are meso (Carey ch. 25) [from memory]
    assert data["predictions"]["aldaric_acid"]["optically_active"] is False
    assert data["predictions"]["alditol"]["optically_active"] is False


def test_product_relations_between_candidates():
    glc, gul, fru = resolve("D-glucose"), resolve("L-gulose"), resolve("D-fructose")
    # D-glucitol = L-gulitol; D-glucose and D-fructose share the osazone (Carey ch. 25)
    assert product_relation(glc, gul, "alditol") == "identical"
    assert product_relation(glc, fru, "osazone") == "identical"
    assert product_relation(glc, fru, "alditol") == "identical"  # D-glucitol from both
    assert product_relation(glc, resolve("L-glucose"), "aldaric_acid") == "enantiomeric"
    assert product_relation(glc, resolve("D-mannose"), "aldaric_acid") == "different"
    result = product_relation(glc, fru, "aldaric_acid")
    assert isinstance(result, NotApplicable) and "ketose" in result.reason


def test_unknown_reaction_word():
    with pytest.raises(ObservationError):
        predict(resolve("D-glucose")).products("ozonolysis")


def test_every_reaction_word_gives_the_textbook_products_of_glucose():
    record = predict(resolve("D-glucose"))
    smiles = {n: to_smiles(resolve(n)) for n in ("D-arabinose", "D-glycero-D-gulo-heptose", "D-glycero-D-ido-heptose")}
    expected = {
        # glucose and mannose share the osazone (REFERENCE_VALUES.md, Fischer)
        "osazone": predict(resolve("D-mannose")).products("osazone"),
        # D-glucaric = L-gularic acid; D-glucitol = L-gulitol (REFERENCE_VALUES.md)
        "aldaric_acid": predict(resolve("L-gulose")).products("aldaric_acid"),
        "alditol": predict(resolve("L-gulose")).products("alditol"),
        # the aldonic acid of D-glucose is not that of its C-2 epimer (no shared product) [common practice]
        "aldonic_acid": record.products("aldonic_acid") - predict(resolve("D-mannose")).products("aldonic_acid"),
        # Kiliani-Fischer: the two C-2 epimeric heptoses, D-glycero-D-gulo and D-glycero-D-ido [from memory]
        "chain_extension": frozenset({smiles["D-glycero-D-gulo-heptose"], smiles["D-glycero-D-ido-heptose"]}),
        # Wohl and Ruff: D-glucose -> D-arabinose (REFERENCE_VALUES.md)
        "chain_shortening": frozenset({smiles["D-arabinose"]}),
    }
    assert set(expected) == set(PRODUCT_REACTIONS)
    for reaction, products in expected.items():
        assert record.products(reaction) == products and len(products) in (1, 2), reaction


# ------------------------------------------------------------------ properties
PROPERTY = settings(max_examples=200, deadline=None)


@PROPERTY
@given(st.sampled_from(EVERYTHING))
def test_aldaric_acids_of_enantiomers_are_enantiomers_or_both_meso(chain):
    a, b = predict(chain).aldaric_acid, predict(_mirror_chain(chain)).aldaric_acid
    if a is None:
        assert b is None
        return
    # mirror-image substrates give mirror-image products [common practice]
    assert _inverted(a) == Chem.CanonSmiles(b)
    # a product identical to its mirror image is meso: optically inactive
    assert predict(chain).aldaric_acid_active == (_inverted(a) != Chem.CanonSmiles(a))


def _c2_epimer(chain: Chain) -> Chain | None:
    if chain.carbonyl != "aldose" or chain.groups[1] not in ("CHOH", "CHNH2"):
        return None
    return chain.replace(2, chain.groups[1], FLIP[chain.sides[1]])


def _ketose_partner(chain: Chain) -> Chain | None:
    if chain.carbonyl != "aldose" or chain.groups[1] != "CHOH":
        return None
    return Chain(("CH2OH", "CO") + chain.groups[2:], (None, None) + chain.sides[2:])


@PROPERTY
@given(st.sampled_from(EVERYTHING))
def test_c2_epimers_share_an_osazone(chain):
    # osazone formation destroys C-1/C-2 configuration (Carey ch. 25) [common practice]
    for partner in (_c2_epimer(chain), _ketose_partner(chain)):
        if partner is not None:
            assert predict(partner).osazone == predict(chain).osazone is not None


@PROPERTY
@given(st.sampled_from(EVERYTHING))
def test_alditols_of_a_ketose_are_c2_epimers(chain):
    if chain.carbonyl != "ketose":
        return
    expected = {to_smiles(chain.replace(2, "CHOH", side)) for side in (RIGHT, LEFT)}
    # borohydride attacks either face of C-2 (Carey ch. 25) [common practice]
    assert set(predict(chain).alditols) == expected
    if len(expected) == 2:
        first, second = sorted(expected)
        # epimers are diastereomers; with no other stereocentre they are enantiomers
        achiral_ketose = not chain.stereocentres
        assert relation(first, second) == ("enantiomeric" if achiral_ketose else "different")
        # a racemate from an achiral ketose is optically inactive [common practice]
        if achiral_ketose:
            assert predict(chain).alditol_active is False


@PROPERTY
@given(st.sampled_from(EVERYTHING))
def test_optical_activity_means_not_superimposable_on_mirror_image(chain):
    record = predict(chain)
    # DESIGN.md: inactive = the product (mixture) is identical to its mirror image
    for products, active in (
        (record.alditols, record.alditol_active),
        ((record.aldaric_acid,), record.aldaric_acid_active),
    ):
        if products and products[0]:
            mixture = {Chem.CanonSmiles(s) for s in products}
            assert active == ({_inverted(s) for s in products} != mixture)


@PROPERTY
@given(st.sampled_from(EVERYTHING))
def test_periodate_carbon_balance_over_catalogue(chain):
    for key, result in predict(chain).periodate:
        if result is None:
            assert predict(chain).reason(f"periodate.{key}")
            continue
        methyl = 1 if key.startswith("methyl") else 0
        acetyl = 2 * chain.groups.count("CHNHAc")
        # carbon is conserved: chain length plus the glycoside's methyl and any N-acetyl [common practice]
        assert result.carbons_out == chain.carbons + methyl + acetyl


@PROPERTY
@given(st.sampled_from(EVERYTHING), st.sampled_from(EVERYTHING), st.sampled_from(PRODUCT_REACTIONS[:4]))
def test_product_relation_is_symmetric(a, b, reaction):
    forward, backward = product_relation(a, b, reaction), product_relation(b, a, reaction)
    if isinstance(forward, NotApplicable):
        assert isinstance(backward, NotApplicable)
    else:
        assert forward == backward


def test_record_is_filled_lazily_one_field_at_a_time():
    # the engine asks one experiment over thousands of candidates: only that field may be computed
    from workbench.chem.predictions import Prediction

    record = Prediction(resolve("D-gulose"))  # a fresh record, not the shared cached one
    _ = record.aldaric_acid_active
    assert "aldaric_acid_active" in vars(record)
    assert not {"osazone", "periodate", "smith", "alditols", "chain_extension"} & set(vars(record))


def test_engine_and_predict_read_the_same_record_for_the_tests():
    # one rule, one place: the observation layer and predict --json agree on every test outcome
    from workbench.evidence.observations import OBSERVATION_TYPES
    from workbench.evidence.outcomes import predict as observed_outcome

    for chain in catalogue(Scope(carbons=(4, 5, 6), modifications=("any",))):
        data = predictions_json(chain)
        for kind in ("bromine_water", "reducing_test", "ketose_test"):
            probe = OBSERVATION_TYPES[kind]("?", unknown="U", result="positive" if "test" in kind else "oxidised")
            assert observed_outcome(probe, chain) == data[kind]["result"]


def test_fructose_is_reducing_and_gives_the_ketose_test():
    # D-fructose reduces Fehling's solution and gives Seliwanoff's red colour (Carey ch. 25) [common practice]
    from workbench.evidence.observations import OBSERVATION_TYPES
    from workbench.evidence.outcomes import predict as observed_outcome

    fru = resolve("D-fructose")
    assert observed_outcome(OBSERVATION_TYPES["reducing_test"]("?", unknown="U", result="positive"), fru) == "positive"
    assert observed_outcome(OBSERVATION_TYPES["ketose_test"]("?", unknown="U", result="positive"), fru) == "positive"
