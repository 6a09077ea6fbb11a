"""Pure structure model and chemistry on RDKit (no UI imports)."""

from workbench.chem.catalogue import DEFAULT_SCOPE, Modification, Scope, catalogue, enumerate_scope, scope_size
from workbench.chem.chain import LEFT, RIGHT, Chain
from workbench.chem.names import display_name, from_name, systematic_name, trivial_name
from workbench.chem.parse import from_smiles, resolve
from workbench.chem.periodate import PeriodateResult, SmithResult, oxidise, periodate_oxidation, smith_degradation
from workbench.chem.predictions import Prediction, predict, predictions_json, product_relation
from workbench.chem.reactions import NotApplicable, Outcome
from workbench.chem.smiles import RingForm, is_achiral, ring_forms, to_inchi, to_inchikey, to_mol, to_smiles

__all__ = [
    "Chain",
    "DEFAULT_SCOPE",
    "LEFT",
    "Modification",
    "NotApplicable",
    "Outcome",
    "PeriodateResult",
    "Prediction",
    "RIGHT",
    "RingForm",
    "Scope",
    "SmithResult",
    "catalogue",
    "display_name",
    "enumerate_scope",
    "from_name",
    "from_smiles",
    "is_achiral",
    "oxidise",
    "periodate_oxidation",
    "predict",
    "predictions_json",
    "product_relation",
    "resolve",
    "ring_forms",
    "scope_size",
    "smith_degradation",
    "systematic_name",
    "to_inchi",
    "to_inchikey",
    "to_mol",
    "to_smiles",
    "trivial_name",
]
