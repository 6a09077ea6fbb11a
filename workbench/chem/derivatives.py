"""Predictions for compounds that are not free sugars: methyl glycosides and alditols.

``stereosieve predict "methyl alpha-D-glucopyranoside"`` must answer for the
glycoside, not for the free sugar: the anomeric carbon is a full acetal, so
there is no free carbonyl (common practice; Collins and Ferrier,
*Monosaccharides*, 1995 [from memory]):

- Fehling, Benedict and Tollens tests are negative (glycosides are stable to
  the hot alkaline reagent); bromine water leaves the glycoside unchanged;
  phenylhydrazine gives no osazone; borohydride has nothing to reduce;
  Kiliani-Fischer, Ruff and Wohl do not apply.
- Hot acid hydrolyses glycosides, so the Seliwanoff test (hot HCl) of a
  ketoside is positive, as for sucrose [common practice], and nitric acid
  acts on the liberated sugar: no prediction is made for the glycoside.
- Periodate cleaves the ring's diol units (the methyl glycoside counts of
  :mod:`workbench.chem.periodate`).

An alditol (D-glucitol, sorbitol) has no carbonyl either: it is its own
borohydride product and is cleaved by periodate as a polyol.
"""

from __future__ import annotations

from rdkit import Chem
from rdkit.Chem.rdMolDescriptors import CalcMolFormula

from workbench.chem.names import display_name, systematic_name, trivial_name
from workbench.chem.parse import Compound
from workbench.chem.periodate import oxidise, periodate_oxidation, smith_degradation
from workbench.chem.reactions import is_optically_active
from workbench.chem.smiles import quiet_rdkit, to_inchikey, to_smiles

__all__ = ["compound_name", "compound_json"]


def compound_name(compound: Compound) -> str:
    """``methyl alpha-D-glucopyranoside`` (2-Carb-33), or the sugar's or alditol's name."""
    chain, form = compound.chain, compound.glycoside
    if form is None:
        return display_name(chain)
    ring = form.ring[:-1] + "ide"
    trivial = trivial_name(chain)
    if trivial and trivial[:2] in ("D-", "L-") and trivial.endswith("ose") and " " not in trivial:
        return f"methyl {form.anomer}-{trivial[:2]}{trivial[2:-2]}{ring}"
    return f"methyl {form.anomer}-{ring} of {systematic_name(chain)}"


def _no(reason: str, out: dict, key: str) -> None:
    out[key] = None
    out["not_applicable"][key] = reason


def _glycoside_predictions(compound: Compound) -> dict:
    chain, form = compound.chain, compound.glycoside
    assert form is not None
    out: dict = {"not_applicable": {}}
    acetal = "the anomeric carbon is a full acetal (no free carbonyl)"
    for key in ("aldonic_acid", "alditol", "osazone", "chain_extension", "chain_shortening"):
        _no(acetal, out, key)
    _no("hot nitric acid hydrolyses the glycoside first; no prediction for the glycoside as such", out, "aldaric_acid")
    out["bromine_water"] = {"result": "unchanged"}
    out["reducing_test"] = {"result": "negative"}
    ketoside = chain.carbonyl == "ketose"
    out["ketose_test"] = {"result": "positive" if ketoside else "negative"}
    out["test_reasons"] = {
        "bromine_water": acetal,
        "reducing_test": "a glycoside is stable to the hot alkaline reagent: " + acetal,
        "ketose_test": (
            "hot HCl hydrolyses the ketoside; the freed ketose gives the fast colour"
            if ketoside
            else "an aldoside gives no fast colour"
        ),
    }
    substrate = f"methyl_{form.ring[:-1]}ide"
    periodate = periodate_oxidation(chain, substrate, form.anomer)
    out["periodate"] = {substrate: periodate.counts() if periodate else None}
    smith = smith_degradation(chain, form.ring, form.anomer)
    out["smith_degradation"] = (
        {"periodate": smith.periodate, "products": [f.label for f in smith.products]} if smith else None
    )
    return out


def _alditol_predictions(compound: Compound) -> dict:
    chain = compound.chain
    out: dict = {"not_applicable": {}}
    none = "an alditol has no carbonyl group"
    for key in ("aldonic_acid", "osazone", "chain_extension", "chain_shortening"):
        _no(none, out, key)
    _no("nitric acid on alditols is not predicted here", out, "aldaric_acid")
    out["alditol"] = {"smiles": [to_smiles(chain)], "optically_active": is_optically_active(chain)}
    out["bromine_water"] = {"result": "unchanged"}
    out["reducing_test"] = {"result": "negative"}
    out["ketose_test"] = {"result": "negative"}
    out["test_reasons"] = {key: none for key in ("bromine_water", "reducing_test", "ketose_test")}
    out["periodate"] = {"alditol": oxidise(to_smiles(chain), label="alditol").counts()}
    return out


def compound_json(compound: Compound) -> dict:
    """Identity and ``predictions`` of a glycoside or alditol, keyed like ``predict --json``."""
    chain = compound.chain
    smiles = to_smiles(chain, compound.glycoside)
    with quiet_rdkit():
        formula = CalcMolFormula(Chem.MolFromSmiles(smiles))
    out: dict = {
        "name": compound_name(compound),
        "compound": compound.kind,
        "parent": display_name(chain) if compound.kind == "glycoside" else None,
        "systematic_name": systematic_name(chain),
        "smiles": smiles,
        "inchikey": to_inchikey(chain, compound.glycoside),
        "carbons": chain.carbons,
        "series": chain.series,
        "formula": formula,
    }
    if compound.kind == "glycoside":
        out["predictions"] = _glycoside_predictions(compound)
    elif compound.kind == "alditol":
        out["predictions"] = _alditol_predictions(compound)
    else:
        raise ValueError(f"{out['name']} is a free sugar: use workbench.chem.predictions")
    return out
