"""Published specific rotations and Hudson's isorotation rules.

Specific rotations [alpha]D in water at about 20 C, in deg mL g-1 dm-1, of the
pure alpha and beta anomers (initial rotations) and of the mutarotated
equilibrium. Every value carries its source, as collected in
REFERENCE_VALUES.md:

- Bruice, *Organic Chemistry*, 8th ed., Pearson 2017, problems 20.65-66
  (D-glucose and D-galactose, all three values);
- one handbook table of equilibrium rotations (D-ribose, L-arabinose,
  D-xylose, D-glucose, D-galactose, D-fructose, D-mannose, L-rhamnose,
  L-sorbose);
- D-mannose alpha and beta from memory ([memory]: give them a wide tolerance);
- the natural deoxy, amino, acetamido and acidic sugars, D-lyxose, D-allose,
  D-altrose, D-talose, D-gulose, D-tagatose and D-manno-hept-2-ulose, and the
  anomers of L-rhamnose, from memory (Merck Index and supplier figures as
  recalled; amino sugars as hydrochlorides): the calibration layer gives every
  recalled value a wide standard error. D-idose and the tetroses keep only
  their signs.

A value published for one enantiomer applies to the other with its sign
inverted (enantiomers rotate plane-polarised light equally and oppositely);
such records say so. The signs alone of the equilibrium rotations of all
D-aldoses up to the hexoses are listed too (REFERENCE_VALUES.md).
"""

from __future__ import annotations

from dataclasses import dataclass, replace
from functools import cache

from workbench.chem.chain import Chain
from workbench.chem.names import from_name
from workbench.errors import StructureError

__all__ = [
    "RotationRecord",
    "HudsonTerms",
    "published_rotation",
    "rotation_sign",
    "rotation_table",
    "two_state_beta_fraction",
    "hudson_terms",
    "hudson_anomer",
]

_BRUICE = "Bruice, Organic Chemistry, 8th ed., Pearson 2017, problems 20.65-66"
_HANDBOOK = "handbook table of equilibrium specific rotations (REFERENCE_VALUES.md)"
_MEMORY = "from memory (REFERENCE_VALUES.md [memory])"
_RECALLED = "from memory (Merck Index and supplier figures as recalled, not re-read)"
_VALUE_FIELDS = ("alpha", "beta", "equilibrium")


@dataclass(frozen=True)
class RotationRecord:
    """Published [alpha]D in water (deg mL g-1 dm-1) of one sugar, with sources.

    ``alpha``/``beta`` are the initial rotations of the pure anomers (None
    where not published), ``equilibrium`` the mutarotated value. ``source``
    names the source of each value; ``from_memory`` lists the fields that
    were recalled rather than re-read; ``alternatives`` holds other published
    values as ``(field, value, source)``; ``inverted`` is True when the
    values were published for the enantiomer and their signs inverted here.
    """

    name: str
    alpha: float | None
    beta: float | None
    equilibrium: float | None
    source: str
    from_memory: tuple[str, ...] = ()
    alternatives: tuple[tuple[str, float, str], ...] = ()
    inverted: bool = False

    def __post_init__(self) -> None:
        if self.alpha is None and self.beta is None and self.equilibrium is None:
            raise StructureError(f"rotation record {self.name!r} holds no value")
        for f in self.from_memory:
            if f not in _VALUE_FIELDS:
                raise StructureError(f"rotation record {self.name!r}: unknown field {f!r} in from_memory")

    @property
    def beta_fraction(self) -> float | None:
        """Equilibrium beta fraction by the two-state model, or None if a value is missing."""
        if self.alpha is None or self.beta is None or self.equilibrium is None:
            return None
        return two_state_beta_fraction(self.alpha, self.beta, self.equilibrium)

    def mirrored(self, name: str) -> RotationRecord:
        """The record of the enantiomer ``name``: every sign inverted."""

        def neg(v: float | None) -> float | None:
            return None if v is None else -v

        return replace(
            self,
            name=name,
            alpha=neg(self.alpha),
            beta=neg(self.beta),
            equilibrium=neg(self.equilibrium),
            alternatives=tuple((f, -v, s) for f, v, s in self.alternatives),
            source=self.source + f"; signs inverted from {self.name}",
            inverted=not self.inverted,
        )

    def to_dict(self) -> dict:
        """Plain data for JSON."""
        return {
            "name": self.name,
            "alpha": self.alpha,
            "beta": self.beta,
            "equilibrium": self.equilibrium,
            "source": self.source,
            "from_memory": list(self.from_memory),
            "inverted": self.inverted,
        }


# name as published, alpha, beta, equilibrium, source, from_memory, alternatives
_TABLE: tuple[RotationRecord, ...] = (
    RotationRecord(
        "D-glucose", 112.2, 18.7, 52.7, f"alpha, beta, equilibrium: {_BRUICE}", (), (("equilibrium", 52.2, _HANDBOOK),)
    ),
    RotationRecord(
        "D-galactose",
        150.7,
        52.8,
        80.2,
        f"alpha, beta, equilibrium: {_BRUICE}",
        (),
        (("equilibrium", 80.5, _HANDBOOK),),
    ),
    RotationRecord(
        "D-mannose", 29.3, -17.0, 14.6, f"equilibrium: {_HANDBOOK}; alpha, beta: {_MEMORY}", ("alpha", "beta")
    ),
    RotationRecord("D-ribose", None, None, -23.7, f"equilibrium: {_HANDBOOK}"),
    RotationRecord("L-arabinose", None, None, 104.5, f"equilibrium: {_HANDBOOK}"),
    RotationRecord("D-xylose", None, None, 19.0, f"equilibrium: {_HANDBOOK}"),
    RotationRecord("D-fructose", None, None, -92.0, f"equilibrium: {_HANDBOOK}"),
    RotationRecord(
        "L-rhamnose", -7.7, 38.4, 8.9, f"equilibrium: {_HANDBOOK}; alpha, beta: {_RECALLED}", ("alpha", "beta")
    ),
    RotationRecord("L-sorbose", None, None, -43.4, f"equilibrium: {_HANDBOOK}"),
    # Natural deoxy, amino and acidic sugars and a ketose or two, every value recalled (wide error)
    RotationRecord("D-lyxose", 5.5, None, -14.0, f"alpha, equilibrium: {_RECALLED}", ("alpha", "equilibrium")),
    RotationRecord("D-tagatose", None, None, -5.0, f"equilibrium: {_RECALLED}", ("equilibrium",)),
    RotationRecord("D-allose", None, None, 14.4, f"equilibrium: {_RECALLED}", ("equilibrium",)),
    RotationRecord("D-altrose", None, None, 32.6, f"equilibrium: {_RECALLED}", ("equilibrium",)),
    RotationRecord("D-talose", None, None, 20.8, f"equilibrium: {_RECALLED}", ("equilibrium",)),
    RotationRecord("D-gulose", None, None, -26.4, f"equilibrium: {_RECALLED}", ("equilibrium",)),
    RotationRecord("L-fucose", None, None, -75.9, f"equilibrium: {_RECALLED}", ("equilibrium",)),
    RotationRecord("6-deoxy-D-glucose", None, None, 29.7, f"equilibrium: {_RECALLED}", ("equilibrium",)),
    RotationRecord("2-deoxy-D-glucose", None, None, 46.0, f"equilibrium: {_RECALLED}", ("equilibrium",)),
    RotationRecord("2-deoxy-D-ribose", None, None, -58.0, f"equilibrium: {_RECALLED}", ("equilibrium",)),
    RotationRecord(
        "D-glucosamine",
        100.0,
        28.0,
        72.5,
        f"hydrochloride; alpha, beta, equilibrium: {_RECALLED}",
        ("alpha", "beta", "equilibrium"),
    ),
    RotationRecord("D-galactosamine", None, None, 93.0, f"hydrochloride; equilibrium: {_RECALLED}", ("equilibrium",)),
    RotationRecord(
        "2-acetamido-2-deoxy-D-glucose", 64.0, None, 41.0, f"alpha, equilibrium: {_RECALLED}", ("alpha", "equilibrium")
    ),
    RotationRecord("2-acetamido-2-deoxy-D-galactose", None, None, 86.0, f"equilibrium: {_RECALLED}", ("equilibrium",)),
    RotationRecord("D-glucuronic acid", None, None, 36.0, f"equilibrium: {_RECALLED}", ("equilibrium",)),
    RotationRecord(
        "D-galacturonic acid", 98.0, None, 51.0, f"alpha, equilibrium: {_RECALLED}", ("alpha", "equilibrium")
    ),
    RotationRecord("D-manno-hept-2-ulose", None, None, 29.4, f"equilibrium: {_RECALLED}", ("equilibrium",)),
)

# Signs of the equilibrium rotations of the D-aldoses (REFERENCE_VALUES.md).
_D_ALDOSE_SIGNS: dict[str, int] = {
    "D-glyceraldehyde": 1,
    "D-xylose": 1,
    "D-allose": 1,
    "D-altrose": 1,
    "D-glucose": 1,
    "D-mannose": 1,
    "D-galactose": 1,
    "D-talose": 1,
    "D-erythrose": -1,
    "D-threose": -1,
    "D-ribose": -1,
    "D-arabinose": -1,
    "D-lyxose": -1,
    "D-gulose": -1,
    "D-idose": -1,
}


@cache
def _records() -> dict[Chain, RotationRecord]:
    return {from_name(r.name): r for r in _TABLE}


@cache
def _signs() -> dict[Chain, int]:
    return {from_name(name): sign for name, sign in _D_ALDOSE_SIGNS.items()}


def rotation_table() -> tuple[RotationRecord, ...]:
    """Every published record, as published (one enantiomer each)."""
    return _TABLE


def _display(chain: Chain) -> str:
    from workbench.chem.names import display_name

    return display_name(chain)


def published_rotation(chain: Chain) -> RotationRecord | None:
    """The published rotations of ``chain`` (or of its enantiomer, sign-inverted); None if unknown."""
    records = _records()
    if chain in records:
        return records[chain]
    mirror = chain.mirror()
    if mirror in records:
        return records[mirror].mirrored(_display(chain))
    return None


def rotation_sign(chain: Chain) -> int | None:
    """Published sign (+1/-1) of the equilibrium rotation, or None if unknown."""
    record = published_rotation(chain)
    if record is not None and record.equilibrium:
        return 1 if record.equilibrium > 0 else -1
    signs = _signs()
    if chain in signs:
        return signs[chain]
    mirror = chain.mirror()
    if mirror in signs:
        return -signs[mirror]
    return None


def two_state_beta_fraction(alpha: float, beta: float, equilibrium: float) -> float:
    """Beta fraction at equilibrium if only the two pyranoses are present.

    [alpha]eq = x_alpha [alpha]alpha + x_beta [alpha]beta with x_alpha + x_beta = 1,
    so x_beta = (alpha - eq) / (alpha - beta). Glucose: (112.2 - 52.7) / (112.2 - 18.7)
    = 0.636 (Bruice's rotations).
    """
    if alpha == beta:
        raise StructureError("the alpha and beta rotations are equal; the two-state model cannot apportion them")
    return (alpha - equilibrium) / (alpha - beta)


@dataclass(frozen=True)
class HudsonTerms:
    """Hudson's split of molecular rotations: [M]alpha = B + A, [M]beta = B - A.

    ``anomeric`` (A) is the contribution of the anomeric centre, ``rest`` (B)
    that of the rest of the molecule, both as molecular rotations
    [M] = [alpha] M / 100 with M in g/mol (Hudson, J. Am. Chem. Soc. 31, 66,
    1909 [memory]).
    """

    anomeric: float
    rest: float


def hudson_terms(alpha: float, beta: float, molar_mass: float) -> HudsonTerms:
    """Hudson's isorotation terms from the anomers' specific rotations and molar mass (g/mol)."""
    if molar_mass <= 0:
        raise StructureError(f"molar mass must be positive, got {molar_mass}")
    m_alpha, m_beta = alpha * molar_mass / 100.0, beta * molar_mass / 100.0
    return HudsonTerms(anomeric=(m_alpha - m_beta) / 2.0, rest=(m_alpha + m_beta) / 2.0)


def hudson_anomer(series: str, initial: float, equilibrium: float) -> str:
    """Which anomer a freshly dissolved sample mostly was, by Hudson's rule.

    In the D series the alpha anomer is the more dextrorotatory (Hudson
    1909 [memory]; true of D-glucose, D-galactose and D-mannose in the table
    here), so a rotation that falls towards equilibrium started from alpha;
    in the L series the signs reverse.
    """
    if series not in ("D", "L"):
        raise StructureError(f"series must be 'D' or 'L', got {series!r}")
    if initial == equilibrium:
        raise StructureError("the initial rotation equals the equilibrium rotation; no anomer can be inferred")
    falls = initial > equilibrium
    return "alpha" if falls == (series == "D") else "beta"
