"""What each kind of experiment predicts for a candidate, whether an observation fits, and how well.

Every prediction is read from the candidate's one cached record
(:func:`workbench.chem.predictions.predict`); this module only maps an
observation to the field it needs and compares. Unary kinds map a candidate
to a predicted outcome (:func:`predict`); relational kinds use product keys
(:func:`product_key`): the set of canonical SMILES of the products of one
reaction.

Contract 3 (DESIGN.md). Chemical outcomes are logic: they fit or not.
Measured quantities (anomer ratio, couplings, rotation, periodate amounts)
are compared with calibrated predictions: with ``d`` the difference between
observed and predicted value, the measurement's standard uncertainty
``sigma`` (:attr:`Observation.effective_sigma`) and the prediction's standard
error ``se`` (:mod:`workbench.conformers.calibration`), the combined error is
``s = sqrt(sigma^2 + se^2)``, and

- ``|d| > REMOVAL_K * s`` removes the candidate (:data:`REMOVAL_K` = 4);
- inside that, the candidate is weighed by the Gaussian density
  ``exp(-d^2 / 2 s^2) / (s sqrt(2 pi))`` (:attr:`Verdict.likelihood`).

Why 4: a correct measurement of the true sugar lies beyond 4 combined
standard errors with probability 6e-5 (normal tails), so twenty quantitative
observations remove the truth less than once in 700 projects, while errors
estimated from four or five sugars per class may be somewhat low; with the
bias-corrected residual rule, no calibration sugar of a class of up to 17
can lie beyond 4 standard errors of its own class (Samuelson's inequality),
so every published value in the calibration file keeps its sugar.

Predictions without a standard error (an uncalibrated class, no published
rotation) keep the candidate, flag it and weigh it by the flat density of
the kind (:data:`FLAT_DENSITY`: what a reading tells about a candidate the
model knows nothing about). A rotation known only by its published sign is
weak evidence: the candidate is weighed by 1.6 times the flat density when
the observed sign agrees (or the reading is within 2 sigma of zero) and 0.4
times when it does not (a likelihood ratio of 4), and never removed.

Reliability ``r`` (the chance the record is right) mixes the two:
``weight = r * likelihood + (1 - r) * flat`` (:func:`weight`). Removal by
logic and by the 4-error rule does not depend on ``r``; when removals
conflict, ``r`` ranks the suspects (:mod:`workbench.evidence.posterior`).
"""

from __future__ import annotations

import math
import re
from collections.abc import Sequence
from dataclasses import dataclass
from functools import cache
from typing import Any

from workbench.chem.chain import Chain
from workbench.chem.names import display_name
from workbench.chem.predictions import predict as record_of
from workbench.evidence.observations import OBSERVATION_TYPES, Observation
from workbench.glossary import UNITS, quantity_text

__all__ = [
    "FLAT_DENSITY",
    "NO_PREDICTION",
    "QUANTITY_KINDS",
    "REMOVAL_K",
    "Verdict",
    "estimate",
    "fits",
    "flat_likelihood",
    "formula_counts",
    "outcome_label",
    "passes",
    "predict",
    "product_key",
    "weight",
]


class _NoPrediction:
    """Marker: the model predicts nothing here (the candidate is kept and flagged)."""

    def __repr__(self) -> str:
        return "NO_PREDICTION"

    def __reduce__(self) -> str:
        return "NO_PREDICTION"  # pickled by name: one marker per process (outcome tables)


NO_PREDICTION: Any = _NoPrediction()

REMOVAL_K = 4.0
QUANTITY_KINDS = ("periodate", "specific_rotation", "anomer_ratio", "coupling_constant")
# Flat density of a reading the model cannot predict: one over the range a reading of the kind
# spans in practice (alpha share 0-1; couplings 0-12 Hz; rotations -150 to +150 deg; each periodate
# amount 0-6 mol/mol). Unit: 1 / the kind's unit (per amount for periodate).
FLAT_DENSITY: dict[str, float] = {
    "anomer_ratio": 1.0,
    "coupling_constant": 1 / 12,
    "specific_rotation": 1 / 300,
    "periodate": 1 / 6,
}
_SIGN_AGREES, _SIGN_DISAGREES = 1.6, 0.4  # times the flat density: weak evidence, ratio 4


@dataclass(frozen=True)
class Verdict:
    """Whether an observation fits a candidate, why not (or why it is only flagged), and how well.

    ``likelihood`` is the density of the observed value given the candidate
    (1 / unit; 1 for a logic outcome that holds, 0 for one that does not);
    ``z`` the difference in combined standard errors for a calibrated
    quantity (None otherwise).
    """

    fits: bool
    reason: str = ""
    flagged: bool = False
    likelihood: float = 1.0
    z: float | None = None


# ---------------------------------------------------------------- predictions
@cache
def product_key(reaction: str, chain: Chain) -> frozenset[str] | None:
    """Canonical SMILES of the products of ``reaction`` (None if none forms), from the chain's record.

    Memoised per (reaction, chain): the relational constraints call it millions of times.
    """
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


def estimate(obs: Observation, chain: Chain) -> Any:
    """The calibrated prediction of a physical quantity for ``chain``.

    An :class:`~workbench.conformers.calibration.Estimate` (value, standard
    error, class, flags), None when the measured form cannot exist for the
    candidate (a ring it cannot close), or :data:`NO_PREDICTION`.
    """
    record = record_of(chain)
    kind = obs.KIND
    if kind == "specific_rotation":
        form = getattr(obs, "form", None) or "equilibrium"
        found = record.rotation_estimate if form == "equilibrium" else record.anomer_rotation(form)
        return NO_PREDICTION if found is None else found
    if kind == "anomer_ratio":
        found = record.alpha_share
        return NO_PREDICTION if found is None else found
    if kind == "coupling_constant":
        if obs.form not in record.ring_form_keys:
            return None  # this ring form cannot exist for the candidate
        found = record.coupling(obs.form, obs.pair)  # furanoses: no fast prediction, kept
        return NO_PREDICTION if found is None else found
    raise ValueError(f"{kind} is not a calibrated quantity")


def _physical(chain: Chain, obs: Observation) -> Any:
    """A calibrated value, ``("sign", +1/-1)``, None (form impossible) or NO_PREDICTION (also uncalibrated)."""
    found = estimate(obs, chain)
    if found is None or found is NO_PREDICTION:
        return found
    if found.sign:
        return ("sign", found.sign)
    if found.se is None:
        return NO_PREDICTION  # shown by predict --json with its flag, but never used to tell candidates apart
    return float(found.value)


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
        return _physical(chain, obs)
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
        return periodate_text(value)
    if isinstance(value, (int, float)) and kind in UNITS:
        return quantity_text(kind, float(value))
    if isinstance(value, float):
        return f"{value:.2f}"
    return str(value)


def periodate_text(amounts: Sequence[float | None]) -> str:
    """``IO4- 5, HCOOH 5, HCHO 1`` (mol/mol) for periodate, formic acid, formaldehyde and CO2; amounts
    not measured (None) are left out."""
    words = ("IO4-", "HCOOH", "HCHO", "CO2")
    return ", ".join(f"{w} {a:g}" for w, a in zip(words, amounts, strict=False) if a is not None)


def _gauss(d: float, s: float) -> float:
    return math.exp(-0.5 * (d / s) ** 2) / (s * math.sqrt(2 * math.pi))


def flat_likelihood(obs: Observation) -> float:
    """The likelihood of the record if it is wrong (a random reading or outcome).

    Quantities: :data:`FLAT_DENSITY` (periodate: per amount, for every amount
    given). Logic kinds: one over the number of outcomes the record could
    name (two for a yes/no test; seven carbon counts; three relations; ten
    formulas for a molecular formula).
    """
    kind = obs.KIND
    if kind == "periodate":
        amounts = sum(a is not None for a in (obs.periodate, obs.formic_acid, obs.formaldehyde, obs.co2))
        return FLAT_DENSITY["periodate"] ** amounts
    if kind in FLAT_DENSITY:
        return FLAT_DENSITY[kind]
    if kind == "carbon_count":
        return 1 / 7
    if kind == "molecular_formula":
        return 0.1
    if kind == "same_product":
        return 1 / 3
    spec = next((sp for sp in OBSERVATION_TYPES[kind].SPECS if sp.type == "choice" and sp.name == "result"), None)
    return 1 / len(spec.choices) if spec else 0.5


def weight(obs: Observation, verdict: Verdict) -> float:
    """``r * likelihood + (1 - r) * flat``: the candidate's weight under ``obs`` (Contract 3 reliability)."""
    r = obs.effective_reliability
    return r * verdict.likelihood + (1 - r) * flat_likelihood(obs)


def _quantity_verdict(obs: Observation, chain: Chain) -> Verdict:
    kind = obs.KIND
    sigma = obs.effective_sigma or 1.0  # every quantitative kind has a default
    flat = FLAT_DENSITY[kind]
    found = estimate(obs, chain)
    name = display_name(chain)
    if found is None:
        return Verdict(False, f"{name} cannot form the {getattr(obs, 'form', '')} ring", likelihood=0.0)
    if found is NO_PREDICTION:
        return Verdict(True, f"{kind}: no prediction for {name}; kept", True, flat)
    observed = obs.value if kind != "anomer_ratio" else obs.alpha_fraction
    if found.sign:
        agrees = float(observed) * found.sign > 0 or abs(float(observed)) <= 2 * sigma
        why = "agrees" if agrees else "disagrees"
        return Verdict(
            True,
            f"{kind}: only the sign of [alpha]D of {name} is published; the observed sign {why}; weak evidence, kept",
            True,
            flat * (_SIGN_AGREES if agrees else _SIGN_DISAGREES),
        )
    if found.se is None:
        note = "; ".join(found.flags)
        return Verdict(True, f"{kind}: {note} (predicted {found.value:.3g}{_unit(kind)} for {name})", True, flat)
    s = math.sqrt(sigma**2 + found.se**2)
    d = float(observed) - found.value
    z = d / s
    flagged = bool(found.flags)
    if abs(z) > REMOVAL_K:
        return Verdict(
            False,
            f"predicted {found.value:.3g} +/- {found.se:.2g}{_unit(kind)} ({found.sugar_class}), observed "
            f"{float(observed):.3g} +/- {sigma:.2g}{_unit(kind)}: {abs(z):.1f} combined standard errors apart "
            f"(more than {REMOVAL_K:g})",
            likelihood=0.0,
            z=z,
        )
    reason = f"{kind}: {'; '.join(found.flags)}" if flagged else ""
    return Verdict(True, reason, flagged, _gauss(d, s), z)


def _unit(kind: str) -> str:
    """The unit written after a quantity of ``kind`` in a reason (" Hz", "°", or nothing)."""
    unit = UNITS.get(kind, "")
    return unit if unit in ("", "°") else f" {unit}"


def _periodate_verdict(obs: Observation, chain: Chain) -> Verdict:
    predicted = _periodate(chain, obs.substrate)
    if predicted is None:
        return Verdict(False, f"{display_name(chain)} cannot exist as the {obs.substrate} substrate", likelihood=0.0)
    sigma = obs.effective_sigma or 1.0  # every quantitative kind has a default
    observed = (obs.periodate, obs.formic_acid, obs.formaldehyde, obs.co2)
    pairs = [(p, o) for p, o in zip(predicted, observed, strict=True) if o is not None]  # what was measured
    # stoichiometric counts are exact (standard error 0): only the measurement's sigma counts
    worst = max(abs(o - p) for p, o in pairs) / sigma
    if worst > REMOVAL_K:
        return Verdict(
            False,
            f"predicted {outcome_label('periodate', predicted)}, observed {outcome_label('periodate', observed)} "
            f"(an amount {worst:.1f} standard errors off; more than {REMOVAL_K:g})",
            likelihood=0.0,
            z=worst,
        )
    likelihood = 1.0
    for p, o in pairs:
        likelihood *= _gauss(o - p, sigma)
    return Verdict(True, likelihood=likelihood, z=worst)


_FITS = Verdict(True)


def passes(obs: Observation, chain: Chain) -> bool:
    """``fits(obs, chain).fits`` without building the reason (the engine's filter over whole scopes)."""
    kind = obs.KIND
    if kind in QUANTITY_KINDS or not isinstance(chain, Chain):
        return fits(obs, chain).fits
    predicted = predict(obs, chain)
    if predicted is NO_PREDICTION:
        return True
    if predicted is None:
        return False
    if kind == "molecular_formula":
        return formula_counts(str(_observed(obs))) == formula_counts(predicted)
    return bool(predicted == _observed(obs))


def fits(obs: Observation, chain: Chain) -> Verdict:
    """Does the observation fit this candidate? With the reason when it does not, and the likelihood."""
    if not isinstance(chain, Chain):  # a glycan residue (chem.residue.Residue)
        from workbench.evidence import residue_outcomes

        return residue_outcomes.fits(obs, chain)
    kind = obs.KIND
    if kind in ("specific_rotation", "anomer_ratio", "coupling_constant"):
        return _quantity_verdict(obs, chain)
    if kind == "periodate":
        return _periodate_verdict(obs, chain)
    predicted = predict(obs, chain)
    observed = _observed(obs)
    if predicted is NO_PREDICTION:
        why = record_of(chain).uncertain(kind) if kind == "aldaric_acid" else None
        return Verdict(True, f"{kind}: no prediction for {display_name(chain)} ({why or 'no model value'}); kept", True)
    if predicted is None:
        reason = {
            "aldaric_acid": "gives no aldaric acid (ketose cleaved or terminal CH3 not oxidised)",
            "alditol": "has no carbonyl to reduce",
        }.get(kind, "gives no such product")
        return Verdict(False, f"{display_name(chain)} {reason}", likelihood=0.0)
    if kind == "molecular_formula":
        ok = formula_counts(str(observed)) == formula_counts(predicted)
    else:
        ok = predicted == observed
    if ok:
        return _FITS
    return Verdict(
        False, f"predicted {outcome_label(kind, predicted)}, observed {outcome_label(kind, observed)}", likelihood=0.0
    )
