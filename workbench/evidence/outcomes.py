"""What each kind of experiment predicts for a candidate, and whether an observation fits.

Every prediction is read from the candidate's one cached record
(:func:`workbench.chem.predictions.predict`); this module only maps an
observation to the field it needs and compares. Unary kinds map a candidate
to a predicted outcome (:func:`predict`); an
observation fits a candidate when the observed value equals the prediction,
or lies within the observation's tolerance for measured amounts
(:func:`fits`). Relational kinds use product keys (:func:`product_key`): the
set of canonical SMILES of the products of one reaction.

Where the model has no prediction (no published rotation, no ring form to
couple) the candidate is kept and flagged rather than eliminated.
"""

from __future__ import annotations

import re
from dataclasses import dataclass
from typing import Any

from workbench.chem.chain import Chain
from workbench.chem.names import display_name
from workbench.chem.predictions import predict as record_of
from workbench.evidence.observations import Observation

__all__ = ["NO_PREDICTION", "Verdict", "predict", "fits", "product_key", "outcome_label", "formula_counts"]


class _NoPrediction:
    """Marker: the model predicts nothing here (the candidate is kept and flagged)."""

    def __repr__(self) -> str:
        return "NO_PREDICTION"

    def __reduce__(self) -> str:
        return "NO_PREDICTION"  # pickled by name: one marker per process (outcome tables)


NO_PREDICTION: Any = _NoPrediction()


@dataclass(frozen=True)
class Verdict:
    """Whether an observation fits a candidate, and why not (or why it is only flagged)."""

    fits: bool
    reason: str = ""
    flagged: bool = False


# ---------------------------------------------------------------- predictions
def product_key(reaction: str, chain: Chain) -> frozenset[str] | None:
    """Canonical SMILES of the products of ``reaction`` (None if none forms), from the chain's record."""
    return record_of(chain).products(reaction) or None


def formula_counts(text: str) -> dict[str, int] | None:
    """Element counts of a Hill formula such as ``C6H12O6``; None if unreadable."""
    clean = text.replace(" ", "")
    if not re.fullmatch(r"([A-Z][a-z]?\d*)+", clean):
        return None
    counts: dict[str, int] = {}
    for el, num in re.findall(r"([A-Z][a-z]?)(\d*)", clean):
        counts[el] = counts.get(el, 0) + (int(num) if num else 1)
    return counts


def _periodate(chain: Chain, substrate: str) -> tuple[float, float, float, float] | None:
    """(IO4-, HCOOH, HCHO, CO2) in mol per mol substrate, or None if the substrate cannot exist."""
    result = record_of(chain).periodate_for(substrate)
    if not result:
        return None
    return (float(result.periodate), float(result.formic_acid), float(result.formaldehyde), float(result.co2))


def _physical(kind: str, chain: Chain, obs: Observation) -> Any:
    record = record_of(chain)
    if kind == "specific_rotation":
        published = record.rotation
        if published is not None and published.equilibrium is not None:
            return float(published.equilibrium)
        sign = record.rotation_sign  # some sugars have only a published sign
        return NO_PREDICTION if sign is None else ("sign", sign)
    if kind == "anomer_ratio":
        if chain.has_nitrogen:  # Angyal's scheme has no NH2/NHAc terms; not borrowed from the parent sugar
            return NO_PREDICTION
        if chain.carbonyl == "ketose":
            # Angyal's pyranose scheme misses D-fructose by 0.2 (0.26 vs 0.03 alpha of the pyranoses;
            # Barclay et al., Carbohydr. Res. 347, 136, 2012), so ketoses are kept, not judged
            return NO_PREDICTION
        alpha = record.pyranose_alpha
        return NO_PREDICTION if alpha is None else alpha
    if kind == "coupling_constant":
        if obs.form not in record.ring_form_keys:
            return None  # this ring form cannot exist for the candidate
        value = record.couplings.get(obs.form, {}).get(obs.pair)  # furanoses: no fast prediction, kept
        return NO_PREDICTION if value is None else float(value)
    raise ValueError(kind)


def predict(obs: Observation, chain: Chain) -> Any:
    """The predicted outcome of ``obs``'s experiment for ``chain``.

    Returns a plain value (word, bool, number or tuple of numbers), None when
    the experiment gives no such product, or :data:`NO_PREDICTION`.
    """
    if not isinstance(chain, Chain):  # a glycan residue (chem.residue.Residue)
        from workbench.evidence import residue_outcomes

        return residue_outcomes.predict(obs, chain)
    kind = obs.KIND
    if kind == "carbon_count":
        return chain.carbons
    if kind == "series":
        return chain.series
    if kind == "bromine_water":
        return record_of(chain).bromine_water.result
    if kind == "reducing_test":
        return record_of(chain).reducing_test.result
    if kind == "ketose_test":
        return record_of(chain).ketose_test.result
    if kind == "aldaric_acid":
        record = record_of(chain)
        return NO_PREDICTION if record.uncertain("aldaric_acid") else record.aldaric_acid_active
    if kind == "alditol":
        return record_of(chain).alditol_active
    if kind == "molecular_formula":
        return chain.formula
    if kind == "periodate":
        return _periodate(chain, obs.substrate)
    if kind in ("specific_rotation", "anomer_ratio", "coupling_constant"):
        return _physical(kind, chain, obs)
    raise ValueError(f"{kind} is not a unary kind")


def _observed(obs: Observation) -> Any:
    kind = obs.KIND
    if kind in ("carbon_count", "series", "molecular_formula", "specific_rotation", "coupling_constant"):
        return obs.value
    if kind in ("bromine_water", "reducing_test", "ketose_test"):
        return obs.result
    if kind in ("aldaric_acid", "alditol"):
        return obs.optically_active
    if kind == "anomer_ratio":
        return obs.alpha_fraction
    if kind == "periodate":
        return (obs.periodate, obs.formic_acid, obs.formaldehyde, obs.co2)
    raise ValueError(kind)


def outcome_label(kind: str, value: Any) -> str:
    """A short word for a predicted outcome, for tables and planner outcomes."""
    if value is NO_PREDICTION:
        return "no prediction"
    if kind in ("methylation_analysis", "smith_degradation") or (
        kind == "periodate" and isinstance(value, tuple) and len(value) == 3
    ):
        from workbench.evidence import residue_outcomes

        return residue_outcomes.outcome_label(kind, value)
    if value is None:
        return "no product" if kind in ("aldaric_acid", "alditol") else "does not apply"
    if kind in ("aldaric_acid", "alditol"):
        return "optically active" if value else "optically inactive (meso)"
    if kind == "specific_rotation" and isinstance(value, tuple):
        return "dextrorotatory (sign only)" if value[1] > 0 else "laevorotatory (sign only)"
    if kind == "periodate":
        p, f, h, c = value
        co2 = "" if c is None else f", CO2 {c:g}"
        return f"IO4- {p:g}, HCOOH {f:g}, HCHO {h:g}{co2}"
    if isinstance(value, float):
        return f"{value:.2f}"
    return str(value)


def fits(obs: Observation, chain: Chain) -> Verdict:
    """Does the observation fit this candidate? With the reason when it does not."""
    if not isinstance(chain, Chain):  # a glycan residue (chem.residue.Residue)
        from workbench.evidence import residue_outcomes

        return residue_outcomes.fits(obs, chain)
    predicted = predict(obs, chain)
    observed = _observed(obs)
    kind = obs.KIND
    if predicted is NO_PREDICTION:
        why = record_of(chain).uncertain(kind) if kind == "aldaric_acid" else None
        return Verdict(True, f"{kind}: no prediction for {display_name(chain)} ({why or 'no model value'}); kept", True)
    if predicted is None:
        reason = {
            "aldaric_acid": "gives no aldaric acid (ketose cleaved or terminal CH3 not oxidised)",
            "alditol": "has no carbonyl to reduce",
            "periodate": f"cannot exist as the {getattr(obs, 'substrate', '')} substrate",
            "coupling_constant": f"cannot form the {getattr(obs, 'form', '')} ring",
        }.get(kind, "gives no such product")
        return Verdict(False, f"{display_name(chain)} {reason}")
    if kind == "molecular_formula":
        ok = formula_counts(str(observed)) == formula_counts(predicted)
    elif kind == "periodate":
        tol = obs.tolerance
        pairs = list(zip(predicted[:3], observed[:3], strict=True))
        if observed[3] is not None:
            pairs.append((predicted[3], observed[3]))
        ok = all(abs(p - o) <= tol + 1e-9 for p, o in pairs)
    elif kind == "specific_rotation" and isinstance(predicted, tuple):
        # only the sign is published: an observed value of the other sign beyond the tolerance eliminates
        ok = float(observed) * predicted[1] >= -obs.tolerance - 1e-9
        if ok:
            return Verdict(True, f"{kind}: only the sign of [alpha]D of {display_name(chain)} is published; kept", True)
    elif kind in ("specific_rotation", "anomer_ratio", "coupling_constant"):
        ok = abs(float(predicted) - float(observed)) <= obs.tolerance + 1e-9
    else:
        ok = predicted == observed
    if ok:
        return Verdict(True)
    return Verdict(False, f"predicted {outcome_label(kind, predicted)}, observed {outcome_label(kind, observed)}")
