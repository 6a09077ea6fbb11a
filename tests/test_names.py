"""Names <-> structures against IUPAC-IUBMB nomenclature and handbook identities."""

from __future__ import annotations

import pytest

from workbench.chem import catalogue, from_name, resolve, systematic_name, to_inchikey, to_smiles, trivial_name
from workbench.chem.catalogue import Scope
from workbench.chem.names import configurational_prefix, ring_name
from workbench.chem.parse import read_compound
from workbench.chem.smiles import RingForm
from workbench.errors import NameNotRecognisedError

BIG = Scope(carbons=(3, 4, 5, 6, 7, 8, 9), modifications=("any",))


@pytest.mark.parametrize(
    ("trivial", "systematic"),
    [
        # IUPAC-IUBMB 1996, 2-Carb-8.2 (aldoses) and 2-Carb-10 (deoxy sugars)
        ("D-glucose", "D-gluco-hexose"),
        ("D-mannose", "D-manno-hexose"),
        ("D-ribose", "D-ribo-pentose"),
        ("D-erythrose", "D-erythro-tetrose"),
        # REFERENCE_VALUES.md: D-fructose = D-arabino-hex-2-ulose, L-sorbose = L-xylo-hex-2-ulose [memory]
        ("D-fructose", "D-arabino-hex-2-ulose"),
        ("L-sorbose", "L-xylo-hex-2-ulose"),
        # L-rhamnose = 6-deoxy-L-mannose; L-fucose = 6-deoxy-L-galactose (IUPAC-IUBMB 2-Carb-10)
        ("L-rhamnose", "6-deoxy-L-manno-hexose"),
        ("L-fucose", "6-deoxy-L-galacto-hexose"),
        ("2-deoxy-D-ribose", "2-deoxy-D-erythro-pentose"),
        # 2-Carb-11: amino sugars named as amino-deoxy sugars
        ("D-glucosamine", "2-amino-2-deoxy-D-gluco-hexose"),
        ("D-galactosamine", "2-amino-2-deoxy-D-galacto-hexose"),
        # abequose 3,6-dideoxy-D-xylo-hexose; colitose its L enantiomer (Collins and Ferrier) [memory]
        ("D-abequose", "3,6-dideoxy-D-xylo-hexose"),
        ("colitose", "3,6-dideoxy-L-xylo-hexose"),
        ("D-sedoheptulose", "D-altro-hept-2-ulose"),
        ("D-glucuronic acid", "D-gluco-hexuronic acid"),
    ],
)
def test_trivial_names_resolve_to_handbook_structures(trivial, systematic):
    assert systematic_name(from_name(trivial)) == systematic
    assert from_name(trivial) == from_name(systematic)


def test_rhamnose_and_fucose_are_mirror_images_of_deoxy_d_sugars():
    # L-rhamnose is 6-deoxy-L-mannose: same InChIKey as the mirrored 6-deoxy-D-mannose
    assert to_inchikey(from_name("L-rhamnose")) == to_inchikey(from_name("6-deoxy-D-manno-hexose").mirror())
    assert to_inchikey(from_name("L-fucose")) == to_inchikey(from_name("6-deoxy-D-galacto-hexose").mirror())


def test_multiple_prefixes_follow_2_carb_8_3():
    # IUPAC-IUBMB 2-Carb-8.3: D-glycero-D-gluco-heptose; the group farthest from C-1 first
    chain = from_name("D-glycero-D-gluco-heptose")
    assert chain.sides[1:5] == from_name("D-glucose").sides[1:5]
    assert chain.series == "D"
    assert configurational_prefix(["right", "left", "right", "right", "left"]) == "L-glycero-D-gluco"
    # Kiliani-Fischer of D-galactose gives D-glycero-L-manno-heptose among its products [from memory]
    assert systematic_name(from_name("D-glycero-L-manno-heptose")) == "D-glycero-L-manno-heptose"


def test_every_catalogue_member_round_trips_through_its_names():
    # name -> structure -> name for all 3-9 carbon candidates, modifications included
    for chain in catalogue(BIG):
        assert from_name(systematic_name(chain)) == chain
        trivial = trivial_name(chain)
        if trivial:
            assert from_name(trivial) == chain


def test_systematic_names_are_unique_over_the_largest_scope():
    names = [systematic_name(c) for c in catalogue(BIG)]
    assert len(names) == len(set(names))
    smiles = [to_smiles(c) for c in catalogue(BIG)]
    assert len(smiles) == len(set(smiles))


@pytest.mark.parametrize("bad", ["glucose", "D-glucos", "D-bananose", "D-gluco-heptose"])
def test_bad_names_are_refused_with_a_reason(bad):
    with pytest.raises(NameNotRecognisedError) as err:
        from_name(bad)
    assert bad in str(err.value)


def test_bare_trivial_name_suggests_both_series():
    with pytest.raises(NameNotRecognisedError) as err:
        from_name("glucose")
    assert err.value.suggestions == ("D-glucose", "L-glucose")


def test_misspelling_gets_close_suggestions():
    with pytest.raises(NameNotRecognisedError) as err:
        from_name("D-galactos")
    assert "D-galactose" in err.value.suggestions


def test_resolve_accepts_names_and_smiles():
    assert resolve("D-glucose") == resolve("O=C[C@H](O)[C@@H](O)[C@H](O)[C@H](O)CO")


@pytest.mark.parametrize(
    ("name", "parent", "form"),
    [
        # ring-form names: IUPAC-IUBMB 2-Carb-6 (anomers) and 2-Carb-33 (glycosides)
        ("alpha-D-glucopyranose", "D-glucose", RingForm("pyranose", "alpha")),
        ("\u03b2-D-fructofuranose", "D-fructose", RingForm("furanose", "beta")),
        ("methyl alpha-L-rhamnopyranoside", "L-rhamnose", RingForm("pyranose", "alpha", methyl=True)),
        ("beta-D-ribofuranose", "D-ribose", RingForm("furanose", "beta")),
    ],
)
def test_ring_form_names_resolve_to_the_ring_smiles(name, parent, form):
    chain, ring, anomer, methyl = ring_name(name)
    assert RingForm(ring, anomer, methyl) == form
    compound = read_compound(name)
    assert compound.chain == chain == from_name(parent)
    assert compound.glycoside == (form if methyl else None)
    # the named ring form and the parsed ring SMILES agree (parse.from_smiles opens the ring)
    assert read_compound(to_smiles(chain, form)) == compound
    if not methyl:  # a free ring form is the sugar; a glycoside is not (2-Carb-33)
        assert resolve(name) == chain


def test_impossible_ring_form_name_is_refused():
    with pytest.raises(NameNotRecognisedError):
        from_name("alpha-D-erythropyranose")


def test_synonyms_in_common_use():
    # dextrose = D-glucose, levulose = D-fructose, allulose = psicose (Merck Index synonyms [from memory])
    assert from_name("dextrose") == from_name("D-glucose")
    assert from_name("levulose") == from_name("D-fructose")
    assert from_name("D-allulose") == from_name("D-psicose")
    assert from_name("D-erythro-pentulose") == from_name("D-ribulose")  # locant 2 understood
