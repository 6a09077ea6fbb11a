"""Per-candidate predictions of every experiment: one lazily filled, cached record per chain.

:func:`predict` returns the one :class:`Prediction` record of a chain
(``functools.cache``). Each field is computed on first access and kept
(``functools.cached_property``), so the engine asking about one experiment
over thousands of candidates computes only that experiment. Every caller
reads the same record: the engine and the planner (through
:mod:`workbench.evidence.outcomes`), ``stereosieve predict`` (through
:func:`predictions_json`) and the workbench panels. Products are keyed by
their canonical isomeric SMILES, so products of thousands of candidates are
compared by string equality.

Measured quantities (pyranose anomer ratio, couplings, specific rotation)
are read from the conformer layer with their calibrated standard errors
(:mod:`workbench.conformers.calibration`); that import is deferred to the
first access, because the conformer layer sits above this one.
"""

from __future__ import annotations

import logging
from collections.abc import Iterable
from dataclasses import dataclass
from functools import cache, cached_property
from typing import TYPE_CHECKING, Any

from workbench.chem import reactions
from workbench.chem.chain import Chain
from workbench.chem.names import display_name
from workbench.chem.periodate import PeriodateResult, SmithResult, periodate_oxidation, smith_degradation
from workbench.chem.reactions import Lactone, NotApplicable, Outcome, Uncertain, relation_of_sets
from workbench.chem.smiles import to_smiles
from workbench.errors import ObservationError

if TYPE_CHECKING:
    from workbench.conformers.calibration import Estimate
    from workbench.conformers.polarimetry import RotationRecord

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
_FORMS = {key: (substrate, anomer) for key, substrate, anomer in PERIODATE_FORMS}
# The observation's substrate word -> the form whose counts stand for it
# (periodate counts do not depend on the anomer).
_CONTRACT_FORMS = {
    "free": "free",
    "alditol": "alditol",
    "methyl_pyranoside": "methyl_alpha_pyranoside",
    "methyl_furanoside": "methyl_alpha_furanoside",
}
_SMITH_FORMS = (("methyl_pyranoside", "pyranose"), ("methyl_furanoside", "furanose"))
PRODUCT_REACTIONS = ("osazone", "aldaric_acid", "alditol", "aldonic_acid", "chain_extension", "chain_shortening")


def _value(result: Any) -> Any:
    """``result`` unless it is :class:`NotApplicable` or :class:`Uncertain` (then None)."""
    return None if isinstance(result, (NotApplicable, Uncertain)) else result


@dataclass(frozen=True)
class Prediction:
    """Everything the experiments would show for one candidate, filled on first access.

    Product fields hold canonical isomeric SMILES (``None`` or empty where the
    experiment gives no such product; :meth:`reason` then says why).
    ``*_active`` is True when the product (any of the products) is not
    superimposable on its mirror image. Test outcomes use the observation
    words (``oxidised``/``unchanged``, ``positive``/``negative``).
    ``periodate`` pairs each key of :data:`PERIODATE_FORMS` with its result
    (mol per mol substrate); ``smith`` pairs ``methyl_pyranoside`` and
    ``methyl_furanoside`` with the Smith products. ``not_applicable`` pairs
    an experiment key (``aldaric_acid``, ``lactone``, ``periodate.<form>``,
    ``smith_degradation.<glycoside>``...) with the reason it gives nothing.

    The record is immutable: its only field is the chain, and every other
    attribute is derived from it once (a ``cached_property``).
    """

    chain: Chain

    # ------------------------------------------------------------ raw results
    @cached_property
    def _aldaric(self) -> Chain | NotApplicable | Uncertain:
        return reactions.aldaric_acid(self.chain)

    @cached_property
    def _aldonic(self) -> Chain | NotApplicable:
        return reactions.aldonic_acid(self.chain)

    @cached_property
    def _lactones(self) -> tuple[Lactone, ...] | NotApplicable:
        return reactions.lactones(self.chain)

    @cached_property
    def _alditols(self) -> tuple[Chain, ...] | NotApplicable:
        return reactions.alditols(self.chain)

    @cached_property
    def _osazone(self) -> Chain | NotApplicable | Uncertain:
        return reactions.osazone(self.chain)

    @cached_property
    def _extension(self) -> tuple[Chain, Chain] | NotApplicable:
        return reactions.extend(self.chain)

    @cached_property
    def _shortening(self) -> Chain | NotApplicable | Uncertain:
        return reactions.shorten(self.chain)

    @cached_property
    def _periodate_forms(self) -> dict[str, PeriodateResult | NotApplicable]:
        return {}

    @cached_property
    def _smith_forms(self) -> dict[str, SmithResult | NotApplicable]:
        return {}

    @cached_property
    def _product_sets(self) -> dict[str, frozenset[str]]:
        return {}

    def _periodate_raw(self, key: str) -> PeriodateResult | NotApplicable:
        forms = self._periodate_forms
        if key not in forms:
            substrate, anomer = _FORMS[key]
            forms[key] = periodate_oxidation(self.chain, substrate, anomer)
        return forms[key]

    def _smith_raw(self, key: str, ring: str) -> SmithResult | NotApplicable:
        forms = self._smith_forms
        if key not in forms:
            forms[key] = smith_degradation(self.chain, ring)
        return forms[key]

    # ------------------------------------------------------------ fields
    @cached_property
    def smiles(self) -> str:
        """Canonical isomeric SMILES of the open chain."""
        return to_smiles(self.chain)

    @cached_property
    def aldaric_acid(self) -> str | None:
        """SMILES of the nitric-acid product (None: a ketose, or a terminal group that is not oxidised)."""
        acid = _value(self._aldaric)
        return to_smiles(acid) if acid else None

    @cached_property
    def aldaric_acid_active(self) -> bool | None:
        """Is the aldaric acid optically active (None: no aldaric acid)."""
        acid = _value(self._aldaric)
        return reactions.is_optically_active(acid) if acid else None

    @cached_property
    def aldonic_acid(self) -> str | None:
        """SMILES of the bromine-water product (None for a ketose)."""
        acid = _value(self._aldonic)
        return to_smiles(acid) if acid else None

    @cached_property
    def lactones(self) -> tuple[Lactone, ...]:
        """The aldonic acid's lactones (empty without an aldonic acid)."""
        if not self.aldonic_acid:
            return ()
        return tuple(_value(self._lactones) or ())

    @cached_property
    def alditols(self) -> tuple[str, ...]:
        """SMILES of the borohydride product(s): one for an aldose, the two C-2 epimers of a ketose."""
        products = _value(self._alditols)
        return tuple(to_smiles(a) for a in products) if products else ()

    @cached_property
    def alditol_active(self) -> bool | None:
        """Is the alditol (either alditol of a ketose) optically active (None: no alditol)."""
        products = _value(self._alditols)
        return reactions.is_optically_active(products) if products else None

    @cached_property
    def osazone(self) -> str | None:
        """SMILES of the phenylosazone (None where none forms)."""
        product = _value(self._osazone)
        return to_smiles(product) if product else None

    @cached_property
    def bromine_water(self) -> Outcome:
        """Bromine-water outcome (:func:`workbench.chem.reactions.bromine_water`)."""
        return reactions.bromine_water(self.chain)

    @cached_property
    def reducing_test(self) -> Outcome:
        """Fehling/Benedict/Tollens outcome (:func:`workbench.chem.reactions.reducing_test`)."""
        return reactions.reducing_test(self.chain)

    @cached_property
    def ketose_test(self) -> Outcome:
        """Resorcinol/HCl outcome (:func:`workbench.chem.reactions.ketose_test`)."""
        return reactions.ketose_test(self.chain)

    @cached_property
    def periodate(self) -> tuple[tuple[str, PeriodateResult | None], ...]:
        """Every form of :data:`PERIODATE_FORMS` with its result (None where the substrate cannot exist)."""
        return tuple((key, _value(self._periodate_raw(key))) for key in _FORMS)

    @cached_property
    def smith(self) -> tuple[tuple[str, SmithResult | None], ...]:
        """Smith degradation of both methyl glycosides (None where the glycoside cannot exist)."""
        return tuple((key, _value(self._smith_raw(key, ring))) for key, ring in _SMITH_FORMS)

    @cached_property
    def chain_extension(self) -> tuple[Chain, ...]:
        """The two C-2 epimers of Kiliani-Fischer extension (empty where it does not apply)."""
        return tuple(_value(self._extension) or ())

    @cached_property
    def chain_shortening(self) -> Chain | None:
        """The Ruff/Wohl product (None where it does not apply)."""
        return _value(self._shortening)

    @cached_property
    def not_applicable(self) -> tuple[tuple[str, str], ...]:
        """Experiment key -> why it gives no product (computes every experiment)."""
        raw: list[tuple[str, Any]] = [("aldaric_acid", self._aldaric), ("aldonic_acid", self._aldonic)]
        if self.aldonic_acid:
            raw.append(("lactone", self._lactones))
        raw += [
            ("alditol", self._alditols),
            ("osazone", self._osazone),
            ("chain_extension", self._extension),
            ("chain_shortening", self._shortening),
        ]
        raw += [(f"periodate.{key}", self._periodate_raw(key)) for key in _FORMS]
        raw += [(f"smith_degradation.{key}", self._smith_raw(key, ring)) for key, ring in _SMITH_FORMS]
        return tuple((key, value.reason) for key, value in raw if isinstance(value, NotApplicable))

    def uncertain(self, reaction: str) -> str | None:
        """ "uncertain, because ..." where the chemistry of ``reaction`` is doubtful (no prediction), else None.

        ``reaction`` is ``aldaric_acid``, ``osazone`` or ``chain_shortening``
        (the reactions with doubtful cases, :class:`workbench.chem.reactions.Uncertain`).
        """
        raw = {"aldaric_acid": self._aldaric, "osazone": self._osazone, "chain_shortening": self._shortening}.get(
            reaction
        )
        return raw.reason if isinstance(raw, Uncertain) else None

    # ------------------------------------------------------------ look-ups
    def products(self, reaction: str) -> frozenset[str]:
        """Canonical SMILES of the product(s) of ``reaction`` (empty if none).

        ``reaction`` is one of :data:`PRODUCT_REACTIONS`; a 2-ketose has two
        alditols, Kiliani-Fischer gives two epimers. Computed once per reaction.
        """
        sets = self._product_sets
        if reaction not in sets:
            sets[reaction] = self._product_set(reaction)
        return sets[reaction]

    def _product_set(self, reaction: str) -> frozenset[str]:
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
        if key not in _FORMS:
            raise ObservationError(
                None,
                "substrate",
                f"unknown substrate {substrate!r}; use free, alditol, methyl_pyranoside, methyl_furanoside",
            )
        return _value(self._periodate_raw(key))

    def smith_for(self, ring: str) -> SmithResult | None:
        """Smith degradation of the methyl ``pyranoside`` or ``furanoside`` (None if impossible)."""
        for key, ring_word in _SMITH_FORMS:
            if key == f"methyl_{ring}":
                return _value(self._smith_raw(key, ring_word))
        raise ObservationError(None, "ring", f"unknown ring {ring!r}; use pyranoside or furanoside")

    def reason(self, key: str) -> str | None:
        """Why experiment ``key`` gives no product, or None when it does (computes only that one)."""
        raw: Any
        if key.startswith("periodate."):
            raw = self._periodate_raw(key.split(".", 1)[1]) if key.split(".", 1)[1] in _FORMS else None
        elif key.startswith("smith_degradation."):
            rings = dict(_SMITH_FORMS)
            name = key.split(".", 1)[1]
            raw = self._smith_raw(name, rings[name]) if name in rings else None
        else:
            raw = {
                "aldaric_acid": lambda: self._aldaric,
                "aldonic_acid": lambda: self._aldonic,
                "lactone": lambda: self._lactones if self.aldonic_acid else None,
                "alditol": lambda: self._alditols,
                "osazone": lambda: self._osazone,
                "chain_extension": lambda: self._extension,
                "chain_shortening": lambda: self._shortening,
            }.get(key, lambda: None)()
        return raw.reason if isinstance(raw, NotApplicable) else None

    # ------------------------------------------------------------ measured quantities (conformer layer)
    @cached_property
    def pyranose_alpha(self) -> float | None:
        """Model alpha share of the pyranoses, alpha / (alpha + beta), in water (None: no pyranose).

        Angyal's free-energy scheme (:func:`workbench.conformers.anomer_fractions`).
        """
        from workbench.conformers.equilibrium import anomer_fractions

        fractions = anomer_fractions(self.chain)
        a, b = fractions.get("alpha_pyranose"), fractions.get("beta_pyranose")
        if a is None or b is None or a + b <= 0:
            return None
        return a / (a + b)

    @cached_property
    def couplings(self) -> dict[str, dict[str, float]]:
        """Predicted 3J(H,H) in Hz per pyranose form and proton pair (ideal chairs, Haasnoot-de Leeuw-Altona)."""
        from workbench.conformers.coupling import ring_couplings

        return ring_couplings(self.chain)

    @cached_property
    def ring_form_keys(self) -> frozenset[str]:
        """The ring forms this chain can close (``alpha_pyranose`` ...)."""
        from workbench.chem.smiles import ring_forms

        return frozenset(f.key for f in ring_forms(self.chain))

    @cached_property
    def rotation(self) -> RotationRecord | None:
        """The published [alpha]D record of this sugar (deg mL g-1 dm-1, water), or None."""
        from workbench.conformers.polarimetry import published_rotation

        return published_rotation(self.chain)

    @cached_property
    def alpha_share(self) -> Estimate | None:
        """Calibrated alpha share of the pyranoses with its standard error (None: no pyranose).

        See :mod:`workbench.conformers.calibration` for the classes and rules.
        """
        from workbench.conformers.calibration import alpha_share_estimate

        return alpha_share_estimate(self.chain)

    @cached_property
    def rotation_estimate(self) -> Estimate | None:
        """Calibrated equilibrium [alpha]D (deg mL g-1 dm-1) or a sign-only estimate (None: nothing published)."""
        from workbench.conformers.calibration import rotation_estimate

        return rotation_estimate(self.chain)

    def anomer_rotation(self, anomer: str) -> Estimate | None:
        """Published initial [alpha]D (deg mL g-1 dm-1) of the pure ``alpha`` or ``beta`` anomer (None: unpublished)."""
        from workbench.conformers.calibration import anomer_rotation_estimate

        return anomer_rotation_estimate(self.chain, anomer)

    def coupling(self, form: str, pair: str) -> Estimate | None:
        """Calibrated 3J(H,H) in Hz of ``pair`` in pyranose ``form`` (None: not predicted)."""
        from workbench.conformers.calibration import coupling_estimate

        return coupling_estimate(self.chain, form, pair)

    @cached_property
    def rotation_sign(self) -> int | None:
        """+1/-1 where only the sign of the equilibrium rotation is published, else None."""
        from workbench.conformers.polarimetry import rotation_sign

        return rotation_sign(self.chain)


@cache
def predict(chain: Chain) -> Prediction:
    """The one cached, lazily filled prediction record of ``chain``."""
    logger.debug("prediction record for %s", chain.pattern)
    return Prediction(chain)


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
    out["uncertain"] = {r: why for r in ("aldaric_acid", "osazone", "chain_shortening") if (why := p.uncertain(r))}
    return out
