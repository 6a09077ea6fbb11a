"""Pure structure model and chemistry on RDKit (no UI imports)."""

from workbench.chem.catalogue import DEFAULT_SCOPE, Modification, Scope, catalogue, enumerate_scope, scope_size
from workbench.chem.chain import LEFT, RIGHT, Chain
from workbench.chem.names import display_name, from_name, systematic_name, trivial_name
from workbench.chem.parse import from_smiles, resolve
from workbench.chem.smiles import RingForm, is_achiral, ring_forms, to_inchi, to_inchikey, to_mol, to_smiles

__all__ = [
    "Chain",
    "DEFAULT_SCOPE",
    "LEFT",
    "Modification",
    "RIGHT",
    "RingForm",
    "Scope",
    "catalogue",
    "display_name",
    "enumerate_scope",
    "from_name",
    "from_smiles",
    "is_achiral",
    "resolve",
    "ring_forms",
    "scope_size",
    "systematic_name",
    "to_inchi",
    "to_inchikey",
    "to_mol",
    "to_smiles",
    "trivial_name",
]
