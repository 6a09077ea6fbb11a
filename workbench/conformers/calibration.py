"""Calibrated predictions of measured quantities: a value, its standard error and the class of sugar.

The fast models of this layer (Angyal's free-energy scheme for the pyranose
anomer ratio, the Haasnoot-de Leeuw-Altona equation on ideal chairs for
couplings) have known errors, and the published rotations have their own
spread. Each prediction therefore carries a standard error taken from the
model's residuals against published measurements of free sugars in water,
by class of sugar (:func:`sugar_class`). The measurements and their sources
ship in ``workbench/data/calibration.json``; ``tests/test_calibration.py``
recomputes every residual from that file.

Rules (the same for every class):

- residual ``r = published - model`` for every row of the class;
- ``alpha_share`` (alpha / (alpha + beta) pyranose): the class bias
  ``b = mean(r)`` is added to the model when ``n >= 2`` (the scheme misses
  whole classes one way: mobile rings hold less alpha, protonated amino
  sugars more), and ``se = s * sqrt(1 + 1/n)`` with ``s`` the sample
  standard deviation of ``r`` (the error of a new sugar of the class);
- ``coupling`` (Hz): no bias (the signs differ from pair to pair), ``se`` =
  root mean square of ``r``;
- a class with one row: no bias, ``se = 2 |r|``; every class: ``se`` at least
  the root mean square of its rows' own uncertainties, so values recalled
  from memory (wide uncertainties) never make a narrow error; a class with
  fewer than three rows: ``se`` at least ``|b|`` (the correction is as
  uncertain as it is large);
- a class with no row is *uncalibrated*: ``se`` is None, the value is shown
  and flagged, and the evidence layer lets it remove nothing.

Specific rotations are published values, not a model: the standard error is
the spread between independent published values of the same sugar
(:data:`ROTATION_SE_FLOOR_DEG` at least), 10 deg for a value recalled from
memory; a sugar known only by the sign of its rotation gets a sign-only
estimate, which the evidence layer treats as weak evidence.
"""

from __future__ import annotations

import json
import math
from dataclasses import dataclass
from functools import cache

from workbench.chem.chain import Chain
from workbench.chem.names import systematic_name
from workbench.conformers.coupling import ring_couplings
from workbench.conformers.equilibrium import anomer_fractions
from workbench.conformers.polarimetry import published_rotation, rotation_sign, rotation_table
from workbench.errors import StructureError

__all__ = [
    "CLASSES",
    "CalibrationRow",
    "ClassCalibration",
    "Estimate",
    "ROTATION_SE_FLOOR_DEG",
    "ROTATION_SE_MEMORY_DEG",
    "alpha_share_estimate",
    "calibration_rows",
    "calibration_table",
    "class_calibration",
    "coupling_class",
    "coupling_estimate",
    "model_value",
    "quantities_json",
    "rotation_estimate",
    "anomer_rotation_estimate",
    "sugar_class",
]

CALIBRATION_FILE = "calibration.json"

# Class key -> what a chemist reads. Order: the first matching rule of sugar_class wins.
CLASSES: dict[str, str] = {
    "aldohexose_rigid": "aldohexoses with a firm 4C1 chair (allo, gluco, manno, galacto, gulo)",
    "aldohexose_mobile": "conformationally mobile aldohexoses (altro, ido, talo)",
    "aldopentose": "aldopentoses",
    "deoxy_terminal": "6-deoxyhexoses (terminal CH3)",
    "deoxy_internal": "2-deoxy sugars (a CH2 in the ring)",
    "amino": "amino sugars (as hydrochlorides)",
    "uronic": "uronic acids",
    "ketose": "2-hexuloses",
    "other": "other chains (tetroses, heptoses and longer, other modifications)",
}
# D-gulose sits with the firm chairs: 81 % beta-pyranose, 3 % furanose in D2O (Angyal 1984 [memory]), and
# the additive scheme misses its alpha share by -0.04 like allo/gluco/manno/galacto, not by -0.11 to -0.23
# like altro/ido/talo (calibration.json residuals)
_MOBILE = ("altro", "ido", "talo")
_RIGID = ("allo", "gluco", "manno", "galacto", "gulo")
_RIGID_URONIC = ("allo", "gluco", "manno", "galacto")
_PLAIN = {"CHO", "CHOH", "CH2OH"}

# Equilibrium [alpha]D of one sugar from different handbooks differs by 1-2 deg (temperature,
# concentration) [common practice]; a value recalled from memory gets 10 deg.
ROTATION_SE_FLOOR_DEG = 1.5
ROTATION_SE_MEMORY_DEG = 10.0


def sugar_class(chain: Chain) -> str:
    """The calibration class of ``chain`` (a key of :data:`CLASSES`); enantiomers share it.

    Modified sugars never fall into their parent's class: any nitrogen makes
    ``amino``, a terminal COOH ``uronic``, a terminal CH3 ``deoxy_terminal``,
    an inner CH2 ``deoxy_internal``; other modifications and chain lengths
    without data are ``other``.
    """
    groups = chain.groups
    modified = _modified(chain)
    if chain.carbonyl == "aldose" and chain.carbons in (5, 6) and modified:
        if chain.has_nitrogen:
            return "amino" if set(groups) <= {"CHO", "CHOH", "CH2OH", "CHNH2"} else "other"
        if chain.is_uronic and set(groups[1:-1]) == {"CHOH"}:
            return "uronic"
        if groups[-1] == "CH3" and set(groups[1:-1]) == {"CHOH"}:
            return "deoxy_terminal"
        if groups[-1] == "CH2OH" and set(groups[1:-1]) <= {"CHOH", "CH2"} and groups.count("CH2") == 1:
            return "deoxy_internal"
        return "other"
    if modified:
        return "other"
    if chain.carbonyl == "ketose" and chain.carbons == 6 and groups[1] == "CO":
        return "ketose"
    if chain.carbonyl == "aldose" and chain.carbons == 5:
        return "aldopentose"
    if chain.carbonyl == "aldose" and chain.carbons == 6:
        stem = systematic_name(chain).split("-")[1]
        if stem in _MOBILE:
            return "aldohexose_mobile"
        if stem in _RIGID:
            return "aldohexose_rigid"
    return "other"


@dataclass(frozen=True)
class CalibrationRow:
    """One published measurement (``quantity`` ``alpha_share`` or ``coupling``) with its source."""

    sugar: str
    quantity: str
    value: float
    uncertainty: float
    source: str
    from_memory: bool
    form: str = ""
    pair: str = ""
    note: str = ""

    @property
    def label(self) -> str:
        """E.g. ``D-glucose alpha_share`` or ``D-glucose 3J(H1-H2) beta_pyranose``."""
        if self.quantity == "coupling":
            return f"{self.sugar} 3J({self.pair}) {self.form}"
        return f"{self.sugar} {self.quantity}"


@dataclass(frozen=True)
class ClassCalibration:
    """The residuals of one class for one quantity and the standard error taken from them.

    ``residuals`` pairs each row's label with ``published - model``;
    ``bias`` is added to the model's value; ``se`` is in the quantity's unit
    (fraction or Hz).
    """

    quantity: str
    sugar_class: str
    n: int
    bias: float
    se: float
    residuals: tuple[tuple[str, float], ...]
    sources: tuple[str, ...]
    from_memory: bool

    @property
    def rms(self) -> float:
        """Root mean square of the raw residuals."""
        return math.sqrt(sum(r * r for _, r in self.residuals) / self.n)


@dataclass(frozen=True)
class Estimate:
    """A predicted quantity with its standard error (``se`` None: uncalibrated).

    ``value`` is what the evidence layer compares with (model plus class
    bias, or the published rotation); ``model_value`` the raw model output.
    ``sign`` is +1/-1 for a sign-only rotation (then ``value`` is 0 and
    ``se`` None). ``flags`` say in words what a chemist should know.
    """

    quantity: str
    value: float
    se: float | None
    sugar_class: str
    model_value: float
    n: int = 0
    flags: tuple[str, ...] = ()
    sign: int = 0
    from_memory: bool = False

    @property
    def calibrated(self) -> bool:
        """True when a standard error backs the value (it may then remove candidates)."""
        return self.se is not None and not self.sign

    def to_dict(self, digits: int = 3) -> dict:
        """Plain data for JSON: value, se, class, calibrated, flags."""
        return {
            "value": None if self.sign else round(self.value, digits),
            "se": None if self.se is None else round(self.se, digits),
            "class": self.sugar_class,
            "calibrated": self.calibrated,
            "n": self.n,
            "sign_only": bool(self.sign),
            "from_memory": self.from_memory,
            "flags": list(self.flags),
        }


@cache
def calibration_rows() -> tuple[CalibrationRow, ...]:
    """Every published measurement of ``workbench/data/calibration.json``."""
    from workbench.data import data_path

    data = json.loads(data_path(CALIBRATION_FILE).read_text(encoding="utf-8"))
    sources = data["sources"]
    rows = []
    for raw in data["rows"]:
        if raw["source"] not in sources:
            raise StructureError(f"{CALIBRATION_FILE}: row {raw['sugar']} names unknown source {raw['source']!r}")
        rows.append(
            CalibrationRow(
                sugar=raw["sugar"],
                quantity=raw["quantity"],
                value=float(raw["value"]),
                uncertainty=float(raw["uncertainty"]),
                source=sources[raw["source"]],
                from_memory=bool(raw["from_memory"]),
                form=raw.get("form", ""),
                pair=raw.get("pair", ""),
                note=raw.get("note", ""),
            )
        )
    return tuple(rows)


@cache
def _row_chain(name: str) -> Chain:
    from workbench.chem.parse import resolve

    return resolve(name)


def _alpha_share(chain: Chain) -> float | None:
    fractions = anomer_fractions(chain)
    a, b = fractions.get("alpha_pyranose"), fractions.get("beta_pyranose")
    if a is None or b is None or a + b <= 0:
        return None
    return a / (a + b)


def model_value(chain: Chain, quantity: str, form: str = "", pair: str = "") -> float | None:
    """The raw model prediction (no calibration): alpha share of the pyranoses or a coupling in Hz."""
    if quantity == "alpha_share":
        return _alpha_share(chain)
    if quantity == "coupling":
        return ring_couplings(chain).get(form, {}).get(pair)
    raise StructureError(f"unknown calibrated quantity {quantity!r}; use alpha_share or coupling")


def _calibrate(quantity: str, cls: str, rows: list[CalibrationRow]) -> ClassCalibration:
    residuals: list[tuple[str, float]] = []
    for row in rows:
        model = model_value(_row_chain(row.sugar), quantity, row.form, row.pair)
        if model is None:
            raise StructureError(f"{CALIBRATION_FILE}: the model predicts nothing for {row.label}")
        residuals.append((row.label, row.value - model))
    n = len(residuals)
    values = [r for _, r in residuals]
    if n == 1:
        bias, stat = 0.0, 2 * abs(values[0])
    elif quantity == "alpha_share":
        bias = sum(values) / n
        s = math.sqrt(sum((r - bias) ** 2 for r in values) / (n - 1))
        stat = s * math.sqrt(1 + 1 / n)
    else:
        bias, stat = 0.0, math.sqrt(sum(r * r for r in values) / n)
    floor = math.sqrt(sum(row.uncertainty**2 for row in rows) / n)
    if n < 3:
        floor = max(floor, abs(bias))  # with one or two sugars the bias is as uncertain as it is large
    return ClassCalibration(
        quantity=quantity,
        sugar_class=cls,
        n=n,
        bias=bias,
        se=max(stat, floor),
        residuals=tuple(residuals),
        sources=tuple(dict.fromkeys(row.source for row in rows)),
        from_memory=any(row.from_memory for row in rows),
    )


@cache
def calibration_table() -> tuple[ClassCalibration, ...]:
    """Every (quantity, class) with data, with its residuals, bias and standard error."""
    groups: dict[tuple[str, str], list[CalibrationRow]] = {}
    for row in calibration_rows():
        groups.setdefault((row.quantity, sugar_class(_row_chain(row.sugar))), []).append(row)
    return tuple(_calibrate(q, cls, rows) for (q, cls), rows in groups.items())


@cache
def class_calibration(quantity: str, cls: str) -> ClassCalibration | None:
    """The calibration of ``quantity`` for class ``cls`` (None: no published data, uncalibrated)."""
    for entry in calibration_table():
        if entry.quantity == quantity and entry.sugar_class == cls:
            return entry
    return None


def coupling_class(chain: Chain) -> tuple[str, str]:
    """The class whose coupling calibration applies to ``chain``, and a note when it is borrowed by ring.

    3J(H,H) depends on the H-C-C-H torsion and the substituents on those two
    carbons (Haasnoot, de Leeuw and Altona, Tetrahedron 36, 2783, 1980), so an
    unmodified aldoheptose (or longer) uses the class of the aldohexose with
    the same pyranose ring (the configurational prefix of C-2 to C-5, the one
    next to the stem, 2-Carb-8.3); its anomer ratio stays uncalibrated. A
    2-acetamido sugar (N-acetyl, otherwise unmodified) uses the amino class:
    the equation sees the same nitrogen on the ring carbon, so NH3+ and NHAc
    have the same electronegativity term; its anomer ratio stays uncalibrated
    (the amino class's bias is that of the protonated amines). A gluco-,
    manno-, galacto- or allo-hexuronic acid uses the class of the aldohexose
    with the same ring (the other hexuronic acids stay uncalibrated: their
    chairs are not known to be firm as acids): the carboxyl carbon
    enters the equation as the CH2OH carbon does, with its two oxygens as
    beta substituents, so only J(4,5) moves, and the model computes that.
    """
    cls = sugar_class(chain)
    groups = chain.groups
    acetamido = chain.carbonyl == "aldose" and chain.carbons in (5, 6) and set(groups) - {"CHNHAc"} <= _PLAIN
    if cls == "other" and acetamido and groups.count("CHNHAc") == 1:
        return "amino", "coupling calibrated on the amino sugars (the same nitrogen on the ring carbon)"
    if cls == "uronic" and chain.carbons == 6:
        ring_prefix = systematic_name(chain).split("-")[1]
        if ring_prefix in _RIGID_URONIC:
            return "aldohexose_rigid", f"coupling calibrated on the aldohexoses with the same ring ({ring_prefix})"
    if cls == "other" and chain.carbonyl == "aldose" and chain.carbons >= 7 and set(groups[1:-1]) == {"CHOH"}:
        ring_prefix = systematic_name(chain).rsplit("-", 2)[-2]
        if ring_prefix in _RIGID:
            return "aldohexose_rigid", f"coupling calibrated on the aldohexoses with the same ring ({ring_prefix})"
        if ring_prefix in _MOBILE:
            return "aldohexose_mobile", f"coupling calibrated on the aldohexoses with the same ring ({ring_prefix})"
    return cls, ""


def _estimate(chain: Chain, quantity: str, model: float, clip: bool) -> Estimate:
    cls, borrowed = coupling_class(chain) if quantity == "coupling" else (sugar_class(chain), "")
    entry = class_calibration(quantity, cls)
    what = "alpha share of the pyranoses" if quantity == "alpha_share" else "coupling"
    if entry is None:
        flag = f"uncalibrated: no published {what} of {CLASSES[cls]} to calibrate on; shown, removes nothing"
        return Estimate(quantity, model, None, cls, model, 0, (flag,))
    value = model + entry.bias
    if clip:
        value = min(1.0, max(0.0, value))
    flags: list[str] = []
    if cls == "ketose":
        flags.append(f"ketose: calibrated on {entry.n} ketose value(s) only, with a wide error")
    if entry.n < 3:
        flags.append(f"calibrated on {entry.n} published value(s) only")
    if borrowed:
        flags.append(borrowed)
    return Estimate(quantity, value, entry.se, cls, model, entry.n, tuple(flags), from_memory=entry.from_memory)


def _modified(chain: Chain) -> bool:
    return any(g not in ("CHO", "CO", "CHOH", "CH2OH") for g in chain.groups)


@cache
def alpha_share_estimate(chain: Chain) -> Estimate | None:
    """Alpha share of the pyranoses at equilibrium in water, calibrated.

    None when no pyranose can form, and for a modified sugar whose class has
    no published data: Angyal's scheme has no terms for NH2, NHAc, OMe or a
    carboxyl, so its value would be the parent sugar's, which a modified
    sugar never borrows.
    """
    model = _alpha_share(chain)
    if model is None:
        return None
    if _modified(chain) and class_calibration("alpha_share", sugar_class(chain)) is None:
        return None
    return _estimate(chain, "alpha_share", model, clip=True)


@cache
def coupling_estimate(chain: Chain, form: str, pair: str) -> Estimate | None:
    """3J(H,H) in Hz of ``pair`` in pyranose ``form``, calibrated (None: not predicted)."""
    model = ring_couplings(chain).get(form, {}).get(pair)
    if model is None:
        return None
    return _estimate(chain, "coupling", model, clip=False)


@cache
def _rotation_spread() -> float:
    """Root mean square of (value - alternative) / sqrt(2) over sugars with two published values (deg)."""
    halves = [
        (record.equilibrium - alt) / math.sqrt(2)
        for record in rotation_table()
        for field_name, alt, _ in record.alternatives
        if field_name == "equilibrium" and record.equilibrium is not None
    ]
    return math.sqrt(sum(h * h for h in halves) / len(halves)) if halves else 0.0


@cache
def anomer_rotation_estimate(chain: Chain, anomer: str) -> Estimate | None:
    """Initial [alpha]D in water (deg mL g-1 dm-1) of the pure ``alpha`` or ``beta`` anomer (None: unpublished).

    Read from the same published records as the equilibrium value (Bruice for
    D-glucose and D-galactose; the rest recalled), with the same standard
    errors: the record's spread between sources, at least
    :data:`ROTATION_SE_FLOOR_DEG`, and :data:`ROTATION_SE_MEMORY_DEG` for a
    recalled value. No sign-only fallback: the signs listed are of the
    equilibrium values.
    """
    if anomer not in ("alpha", "beta"):
        raise ValueError(f"anomer must be 'alpha' or 'beta', got {anomer!r}")
    record = published_rotation(chain)
    value = None if record is None else getattr(record, anomer)
    if record is None or value is None:
        return None
    memory = anomer in record.from_memory
    se = ROTATION_SE_MEMORY_DEG if memory else max(_rotation_spread(), ROTATION_SE_FLOOR_DEG)
    n = 1 + sum(1 for f, _, _ in record.alternatives if f == anomer)
    flags = ("published value recalled from memory",) if memory else ()
    return Estimate("rotation", float(value), se, "published", float(value), n, flags, from_memory=memory)


@cache
def rotation_estimate(chain: Chain) -> Estimate | None:
    """Equilibrium [alpha]D in water (deg mL g-1 dm-1) with its standard error (None: nothing published).

    A sugar known only by the sign of its rotation gets a sign-only estimate
    (``sign`` +1/-1, ``se`` None): weak evidence, never a removal.
    """
    record = published_rotation(chain)
    if record is not None and record.equilibrium is not None:
        memory = "equilibrium" in record.from_memory
        se = ROTATION_SE_MEMORY_DEG if memory else max(_rotation_spread(), ROTATION_SE_FLOOR_DEG)
        n = 1 + sum(1 for f, _, _ in record.alternatives if f == "equilibrium")
        flags = ("published value recalled from memory",) if memory else ()
        value = float(record.equilibrium)
        return Estimate("rotation", value, se, "published", value, n, flags, from_memory=memory)
    sign = rotation_sign(chain)
    if sign is None:
        return None
    flag = "only the sign of [alpha]D is published (some signs are disputed): weak evidence, removes nothing"
    return Estimate("rotation", 0.0, None, "sign_only", 0.0, 0, (flag,), sign=sign)


def quantities_json(chain: Chain) -> dict:
    """Every calibrated quantity of ``chain`` for ``predict --json``: value, se, class, flags.

    ``alpha_share`` (alpha / (alpha + beta) pyranose, None where no value is
    given), ``specific_rotation`` (deg mL g-1 dm-1; sign-only or None where
    nothing is published) and ``couplings`` per pyranose form and proton pair
    (Hz). Periodate counts are stoichiometric and carry no model error.
    """
    alpha = alpha_share_estimate(chain)
    rotation = rotation_estimate(chain)
    return {
        "alpha_share": alpha.to_dict() if alpha else None,
        "specific_rotation": rotation.to_dict(1) if rotation else None,
        "couplings": {
            form: {pair: est.to_dict(1) for pair in pairs if (est := coupling_estimate(chain, form, pair))}
            for form, pairs in ring_couplings(chain).items()
        },
        "periodate": {"se": 0.0, "note": "stoichiometric counts: only the measurement's own sigma applies"},
    }
