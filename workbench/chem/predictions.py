"""Per-candidate predictions of every classical experiment, computed once and cached.

:func:`predict` gathers the outcome of every degradation and derivatisation
in :mod:`workbench.chem.reactions` and :mod:`workbench.chem.periodate` into
one immutable :class:`Prediction` per chain (``functools.lru_cache``), with
every product keyed by its canonical isomeric SMILES so that the constraint
engine can compare products of thousands of candidates by string equality.
:func:`predictions_json` renders the ``predictions`` block of
``stereosieve predict --json`` (DESIGN.md, Contract 2) from that record.
"""

from __future__ import annotations

import logging
from collections.abc import Iterable
from dataclasses import dataclass
from functools import cache

from workbench.chem.chain import Chain
from workbench.chem.names import display_name
from workbench.chem.periodate import PeriodateResult, SmithResult, periodate_oxidation, smith_degradation
from workbench.chem.reactions import (
    Lactone,
    NotApplicable,
    Outcome,
    aldaric_acid,
    alditols,
    aldonic_acid,
    bromine_water,
    extend,
    is_optically_active,
    ketose_test,
    lactones,
    osazone,
    reducing_test,
    relation_of_sets,
    shorten,
)
from workbench.chem.smiles import to_smiles
from workbench.errors import ObservationError

__all__ = [
    "PERIODATE_FORMS",
    "PRODUCT_REACTIONS",
    "Prediction",
    "predict",
    "predict_all",
    "predictions_json",
    "product_relation",
]

logger = logging.getLogger(__name__)

# Periodate substrates computed per candidate: the free sugar, its alditol and
# both anomers of both methyl glycosides (the dialdehydes differ by anomer).
PERIODATE_FORMS: tuple[tuple[str, str, str], ...] = (
    ("free", "free", "alpha"),
    ("alditol", "alditol", "alpha"),
    ("methyl_alpha_pyranoside", "methyl_pyranoside", "alpha"),
    ("methyl_beta_pyranoside", "methyl_pyranoside", "beta"),
    ("methyl_alpha_furanoside", "methyl_furanoside", "alpha"),
    ("methyl_beta_furanoside", "methyl_furanoside", "beta"),
)
# The observation's substrate word -> the form whose counts stand for it
# (periodate counts do not depend on the anomer).
_CONTRACT_FORMS = {
    "free": "free",
    "alditol": "alditol",
    "methyl_pyranoside": "methyl_alpha_pyranoside",
    "methyl_furanoside": "methyl_alpha_furanoside",
}
PRODUCT_REACTIONS = ("osazone", "aldaric_acid", "alditol", "aldonic_acid", "chain_extension", "chain_shortening")


@dataclass(frozen=True)
class Prediction:
    """Everything the classical experiments would show for one candidate.

    Product fields hold canonical isomeric SMILES (``None`` or empty where the
    experiment gives no such product; ``not_applicable`` then says why).
    ``*_active`` is True when the product (any of the products) is not
    superimposable on its mirror image. Test outcomes use the observation
    words (``oxidised``/``unchanged``, ``positive``/``negative``).
    ``periodate`` pairs each key of :data:`PERIODATE_FORMS` with its result
    (mol per mol substrate); ``smith`` pairs ``methyl_pyranoside`` and
    ``methyl_furanoside`` with the Smith products. ``not_applicable`` pairs
    an experiment key (``aldaric_acid``, ``lactone``, ``periodate.<form>``,
    ``smith_degradation.<glycoside>``...) with the reason it gives nothing.
    """

    chain: Chain
    smiles: str
    aldaric_acid: str | None
    aldaric_acid_active: bool | None
    aldonic_acid: str | None
    lactones: tuple[Lactone, ...]
    alditols: tuple[str, ...]
    alditol_active: bool | None
    osazone: str | None
    bromine_water: Outcome
    reducing_test: Outcome
    ketose_test: Outcome
    periodate: tuple[tuple[str, PeriodateResult | None], ...]
    smith: tuple[tuple[str, SmithResult | None], ...]
    chain_extension: tuple[Chain, ...]
    chain_shortening: Chain | None
    not_applicable: tuple[tuple[str, str], ...]

    # ------------------------------------------------------------ look-ups
    def products(self, reaction: str) -> frozenset[str]:
        """Canonical SMILES of the product(s) of ``reaction`` (empty if none).

        ``reaction`` is one of :data:`PRODUCT_REACTIONS`; a 2-ketose has two
        alditols, Kiliani-Fischer gives two epimers.
        """
        if reaction == "osazone":
            return frozenset({self.osazone} if self.osazone else ())
        if reaction == "aldaric_acid":
            return frozenset({self.aldaric_acid} if self.aldaric_acid else ())
        if reaction == "aldonic_acid":
            return frozenset({self.aldonic_acid} if self.aldonic_acid else ())
        if reaction == "alditol":
            return frozenset(self.alditols)
        if reaction == "chain_extension":
            return frozenset(to_smiles(c) for c in self.chain_extension)
        if reaction == "chain_shortening":
            return frozenset({to_smiles(self.chain_shortening)} if self.chain_shortening else ())
        raise ObservationError(None, "reaction", f"unknown reaction {reaction!r}; use {', '.join(PRODUCT_REACTIONS)}")

    def periodate_for(self, substrate: str, anomer: str = "alpha") -> PeriodateResult | None:
        """Periodate result for an observation's ``substrate`` word (None if it cannot exist)."""
        key = substrate if substrate in ("free", "alditol") else f"methyl_{anomer}_{substrate.split('_', 1)[-1]}"
        for name, result in self.periodate:
            if name == key:
                return result
        raise ObservationError(
            None,
            "substrate",
            f"unknown substrate {substrate!r}; use free, alditol, methyl_pyranoside, methyl_furanoside",
        )

    def smith_for(self, ring: str) -> SmithResult | None:
        """Smith degradation of the methyl ``pyranoside`` or ``furanoside`` (None if impossible)."""
        for name, result in self.smith:
            if name == f"methyl_{ring}":
                return result
        raise ObservationError(None, "ring", f"unknown ring {ring!r}; use pyranoside or furanoside")

    def reason(self, key: str) -> str | None:
        """Why experiment ``key`` gives no product, or None when it does."""
        return dict(self.not_applicable).get(key)


def _keep(value, key: str, reasons: list[tuple[str, str]]):
    """``value`` unless it is NotApplicable (then record the reason, give None)."""
    if isinstance(value, NotApplicable):
        reasons.append((key, value.reason))
        return None
    return value


@cache
def predict(chain: Chain) -> Prediction:
    """The cached, immutable prediction record of ``chain`` (computed once per chain)."""
    reasons: list[tuple[str, str]] = []
    acid = _keep(aldaric_acid(chain), "aldaric_acid", reasons)
    aldonic = _keep(aldonic_acid(chain), "aldonic_acid", reasons)
    rings = _keep(lactones(chain), "lactone", reasons) if aldonic else None
    alds = _keep(alditols(chain), "alditol", reasons)
    osa = _keep(osazone(chain), "osazone", reasons)
    ext = _keep(extend(chain), "chain_extension", reasons)
    short = _keep(shorten(chain), "chain_shortening", reasons)
    periodate = []
    for key, substrate, anomer in PERIODATE_FORMS:
        periodate.append((key, _keep(periodate_oxidation(chain, substrate, anomer), f"periodate.{key}", reasons)))
    smith = []
    for ring, ring_word in (("pyranoside", "pyranose"), ("furanoside", "furanose")):
        result = smith_degradation(chain, ring_word)
        smith.append((f"methyl_{ring}", _keep(result, f"smith_degradation.methyl_{ring}", reasons)))
    record = Prediction(
        chain=chain,
        smiles=to_smiles(chain),
        aldaric_acid=to_smiles(acid) if acid else None,
        aldaric_acid_active=is_optically_active(acid) if acid else None,
        aldonic_acid=to_smiles(aldonic) if aldonic else None,
        lactones=tuple(rings or ()),
        alditols=tuple(to_smiles(a) for a in alds) if alds else (),
        alditol_active=is_optically_active(alds) if alds else None,
        osazone=to_smiles(osa) if osa else None,
        bromine_water=bromine_water(chain),
        reducing_test=reducing_test(chain),
        ketose_test=ketose_test(chain),
        periodate=tuple(periodate),
        smith=tuple(smith),
        chain_extension=tuple(ext or ()),
        chain_shortening=short,
        not_applicable=tuple(reasons),
    )
    logger.debug("predicted %s", chain.pattern)
    return record


def predict_all(chains: Iterable[Chain]) -> tuple[Prediction, ...]:
    """Prediction records of many chains, in order (each computed at most once)."""
    return tuple(predict(c) for c in chains)


def product_relation(a: Chain, b: Chain, reaction: str) -> str | NotApplicable:
    """``identical``, ``enantiomeric`` or ``different`` for the products of two chains.

    Sets of products (two alditols of a ketose) are identical when they share
    a product (:func:`workbench.chem.reactions.relation_of_sets`). When either
    chain gives no product the relation does not apply, and the reason says so.
    """
    pa, pb = predict(a).products(reaction), predict(b).products(reaction)
    for chain, products in ((a, pa), (b, pb)):
        if not products:
            why = predict(chain).reason(reaction) or "no product"
            return NotApplicable(f"{chain.pattern} gives no {reaction.replace('_', ' ')}: {why}")
    return relation_of_sets(pa, pb)


# ------------------------------------------------------------------- JSON
def _periodate_json(result: PeriodateResult | None) -> dict | None:
    return result.counts() if result else None


def _fragment_json(fragments) -> list[dict]:
    return [{"name": f.name, "smiles": f.smiles, "count": f.count} for f in fragments]


def predictions_json(chain: Chain) -> dict:
    """The ``predictions`` block of ``predict --json`` for one sugar (a fresh dict).

    Contract keys (DESIGN.md): ``aldaric_acid``, ``aldonic_acid``,
    ``alditol``, ``osazone``, ``bromine_water``, ``reducing_test``,
    ``periodate``, ``chain_extension``, ``chain_shortening``. Extra keys:
    ``ketose_test``, ``lactones``, ``periodate_products`` (every fragment and
    the carbon balance per form and anomer), ``smith_degradation`` and
    ``not_applicable`` (experiment -> why it gives no product).
    """
    p = predict(chain)
    forms = dict(p.periodate)
    out: dict = {
        "aldaric_acid": (
            {"smiles": p.aldaric_acid, "optically_active": p.aldaric_acid_active} if p.aldaric_acid else None
        ),
        "aldonic_acid": (
            {"smiles": p.aldonic_acid, "lactone": [lac.label for lac in p.lactones]} if p.aldonic_acid else None
        ),
        "alditol": {"smiles": list(p.alditols), "optically_active": p.alditol_active} if p.alditols else None,
        "osazone": {"smiles": p.osazone} if p.osazone else None,
        "bromine_water": {"result": p.bromine_water.result},
        "reducing_test": {"result": p.reducing_test.result},
        "periodate": {word: _periodate_json(forms[key]) for word, key in _CONTRACT_FORMS.items()},
        "chain_extension": ({"products": [display_name(c) for c in p.chain_extension]} if p.chain_extension else None),
        "chain_shortening": {"product": display_name(p.chain_shortening)} if p.chain_shortening else None,
    }
    out["ketose_test"] = {"result": p.ketose_test.result}
    out["lactones"] = [{"ring": lac.label, "smiles": lac.smiles} for lac in p.lactones]
    out["periodate_products"] = {
        key: (
            {
                "counts": result.counts(),
                "other": _fragment_json(result.other),
                "carbons": {"substrate": result.carbons_in, "products": result.carbons_out},
            }
            if result
            else None
        )
        for key, result in p.periodate
    }
    out["smith_degradation"] = {
        key: ({"periodate": result.periodate, "products": _fragment_json(result.products)} if result else None)
        for key, result in p.smith
    }
    out["test_reasons"] = {
        "bromine_water": p.bromine_water.reason,
        "reducing_test": p.reducing_test.reason,
        "ketose_test": p.ketose_test.reason,
    }
    out["not_applicable"] = dict(p.not_applicable)
    return out
