"""SMILES (open chain and ring forms) back to structures."""

from __future__ import annotations

import pytest

from workbench.chem import RingForm, catalogue, from_smiles, resolve, ring_forms, to_smiles
from workbench.chem.catalogue import Scope
from workbench.errors import NameNotRecognisedError, StructureError


def test_every_ring_form_of_the_hexoses_opens_to_its_sugar():
    for chain in catalogue(Scope(carbons=(5, 6))):
        assert from_smiles(to_smiles(chain)) == chain
        for form in ring_forms(chain):
            assert from_smiles(to_smiles(chain, form)) == chain


def test_methyl_glycoside_resolves_to_parent():
    # methyl alpha-D-glucopyranoside (CAS 97-30-3), SMILES written by hand [common practice]
    assert from_smiles("CO[C@H]1O[C@H](CO)[C@@H](O)[C@H](O)[C@H]1O") == resolve("D-glucose")
    form = RingForm("pyranose", "beta", methyl=True)
    assert from_smiles(to_smiles(resolve("D-galactose"), form)) == resolve("D-galactose")


def test_reversed_smiles_and_non_canonical_order_are_read():
    # D-glucose written from C-6 upwards
    assert from_smiles("OC[C@@H](O)[C@@H](O)[C@H](O)[C@@H](O)C=O") == resolve("D-glucose")


@pytest.mark.parametrize(
    "smiles",
    [
        "OCC(O)C(O)C(O)C(O)C=O",  # no configuration given
        "CC(C)C=O",  # branched
        "OC[C@@H](O)[C@@H](O)[C@H](O)[C@@H](O)CO",  # an alditol, not a sugar
    ],
)
def test_unusable_smiles_are_refused(smiles):
    with pytest.raises((StructureError, NameNotRecognisedError)):
        from_smiles(smiles)
