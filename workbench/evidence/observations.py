"""Observation kinds: one validated, immutable value object per kind of evidence.

Each kind declares its fields once as :class:`FieldSpec` rows; validation,
the project-file form (:meth:`Observation.to_dict`) and the notebook's entry
forms are all generated from those rows. The table of kinds and fields is
Contract 1 of DESIGN.md; kinds added here extend it, never rename it.

Units: periodate amounts in mol per mol substrate; rotations in
deg mL g-1 dm-1 ([alpha]D, water, about 20 C); couplings in Hz.

Uncertainty (Contract 3): every quantitative kind takes ``sigma``, the
standard uncertainty of the measurement in its own unit, with a default per
kind (:data:`DEFAULT_SIGMA`); a file that gives only the older ``tolerance``
is read as ``sigma = tolerance / 2`` (the tolerance taken as a 95 %
half-width). Every kind takes ``reliability`` (0 < r <= 1, absent: 1), the
chance that the record itself is right.
"""

from __future__ import annotations

import datetime as _dt
import re
from collections.abc import Mapping
from dataclasses import dataclass, field
from typing import TYPE_CHECKING, Any, ClassVar

from workbench.errors import ObservationError
from workbench.escaping import line_breaker
from workbench.inputs import show

__all__ = [
    "DEFAULT_SIGMA",
    "FieldSpec",
    "Observation",
    "OBSERVATION_TYPES",
    "observation_from_dict",
    "unary_kinds",
    "relational_kinds",
]


@dataclass(frozen=True)
class FieldSpec:
    """One field of an observation kind.

    ``type`` is one of: ``unknown`` (an unknown's id), ``member`` (an unknown's
    id or a known sugar's name/SMILES), ``members`` (a list of those),
    ``choice``, ``bool``, ``int``, ``float``, ``text``, ``positions`` (a list
    of distinct carbon numbers from 1 to ``maximum``) and ``numbers`` (a list
    of numbers of at least ``minimum``).
    """

    name: str
    type: str
    doc: str
    choices: tuple[str, ...] = ()
    required: bool = True
    default: Any = None
    unit: str = ""
    minimum: float | None = None
    maximum: float | None = None
    min_items: int = 0
    max_items: int = 0


_COMMON = ("id", "kind", "note", "recorded", "by")


@dataclass(frozen=True)
class Observation:
    """Base of every kind: an id, optional note, date (ISO 8601) and author."""

    id: str
    note: str = field(default="", kw_only=True)
    recorded: str = field(default="", kw_only=True)
    by: str = field(default="", kw_only=True)

    KIND: ClassVar[str] = ""
    TITLE: ClassVar[str] = ""
    SPECS: ClassVar[tuple[FieldSpec, ...]] = ()
    UNARY: ClassVar[bool] = True

    if TYPE_CHECKING:
        # The kind-specific fields are made at run time from ``SPECS`` (see ``_kind``), so the
        # type checker cannot see them; to it they are ``Any``, as ``_kind`` annotates them.
        def __getattr__(self, name: str) -> Any: ...

    @property
    def kind(self) -> str:
        """The kind word used in the project file."""
        return self.KIND

    def values(self) -> dict[str, Any]:
        """The kind-specific fields as a dict (no id/note/recorded/by)."""
        return {spec.name: getattr(self, spec.name) for spec in self.SPECS}

    def to_dict(self) -> dict[str, Any]:
        """Project-file form (Contract 1)."""
        out: dict[str, Any] = {"id": self.id, "kind": self.KIND}
        for spec in self.SPECS:
            value = getattr(self, spec.name)
            if value is None and not spec.required:
                continue
            out[spec.name] = list(value) if isinstance(value, tuple) else value
        for key in ("note", "recorded", "by"):
            if getattr(self, key):
                out[key] = getattr(self, key)
        return out

    def references(self) -> tuple[str, ...]:
        """Every unknown id or sugar name this observation refers to."""
        out: list[str] = []
        for spec in self.SPECS:
            value = getattr(self, spec.name)
            if spec.type in ("unknown", "member") and value:
                out.append(value)
            elif spec.type == "members":
                out.extend(value)
        return tuple(out)

    @property
    def effective_sigma(self) -> float | None:
        """Standard uncertainty of a quantitative observation in its unit (None for the other kinds).

        ``sigma`` when given; else half the older ``tolerance`` when given; else
        the kind's default (:data:`DEFAULT_SIGMA`).
        """
        if self.KIND not in DEFAULT_SIGMA:
            return None
        sigma = getattr(self, "sigma", None)
        if sigma is not None:
            return float(sigma)
        tolerance = getattr(self, "tolerance", None)
        if tolerance is not None:
            return float(tolerance) / 2
        return DEFAULT_SIGMA[self.KIND]

    @property
    def effective_reliability(self) -> float:
        """The chance that the record itself is right (``reliability``; absent: 1)."""
        value = getattr(self, "reliability", None)
        return 1.0 if value is None else float(value)

    def describe(self) -> str:
        """One line a chemist reads, e.g. ``E3 aldaric_acid U1: optically_active=False``."""
        vals = ", ".join(f"{k}={v}" for k, v in self.values().items() if v is not None)
        return f"{self.id} {self.KIND}: {vals}"


def _kind(kind: str, title: str, specs: tuple[FieldSpec, ...], unary: bool = True) -> type[Observation]:
    """Make one frozen dataclass per kind from its field specs (every kind also takes ``reliability``)."""
    specs = (*specs, _RELIABILITY)
    annotations: dict[str, Any] = {}
    namespace: dict[str, Any] = {
        "KIND": kind,
        "TITLE": title,
        "SPECS": specs,
        "UNARY": unary,
        "__doc__": f"Observation ``{kind}``: {title}.",
        "__module__": __name__,
    }
    for spec in specs:
        annotations[spec.name] = Any
        namespace[spec.name] = field(default=spec.default, kw_only=True)
    namespace["__annotations__"] = annotations
    name = "".join(part.title() for part in kind.split("_")) + "Observation"
    cls = type(name, (Observation,), namespace)
    return dataclass(frozen=True)(cls)


_UNKNOWN = FieldSpec("unknown", "unknown", "the unknown this result belongs to")

# Default standard uncertainty of one measurement, per quantitative kind, in the kind's unit
# [common practice]: periodate uptake and formic acid by titration about 0.1 mol/mol; a
# polarimeter reading with the concentration and temperature it depends on about 2 deg; the
# alpha share from integrating the anomeric 1H signals about 0.02; a coupling read from a 1D
# 1H spectrum about 0.3 Hz (digital resolution and second-order effects).
DEFAULT_SIGMA: dict[str, float] = {
    "periodate": 0.1,
    "specific_rotation": 2.0,
    "anomer_ratio": 0.02,
    "coupling_constant": 0.3,
}


def _sigma(unit: str) -> FieldSpec:
    return FieldSpec(
        "sigma",
        "float",
        "standard uncertainty of the measurement (absent: tolerance / 2, else the kind's default)",
        required=False,
        unit=unit,
        minimum=1e-9,
    )


def _tolerance(unit: str) -> FieldSpec:
    return FieldSpec(
        "tolerance",
        "float",
        "older form of the uncertainty: a 95 % half-width, read as sigma = tolerance / 2",
        required=False,
        unit=unit,
        minimum=0,
    )


_RELIABILITY = FieldSpec(
    "reliability",
    "float",
    "chance that this record is right (a mislabelled vial, a misread scale); absent: 1",
    required=False,
    minimum=1e-6,
    maximum=1,
)

OBSERVATION_TYPES: dict[str, type[Observation]] = {
    cls.KIND: cls
    for cls in (
        _kind(
            "carbon_count",
            "number of carbons in the chain",
            (_UNKNOWN, FieldSpec("value", "int", "carbons", minimum=3, maximum=9)),
        ),
        _kind(
            "series",
            "configuration at the highest-numbered stereocentre",
            (
                _UNKNOWN,
                FieldSpec(
                    "value",
                    "choice",
                    "D or L: the side of the OH on the highest-numbered stereocentre (IUPAC-IUBMB 2-Carb-4.2), "
                    "so L-glycero-D-manno-heptose is L",
                    choices=("D", "L"),
                ),
            ),
        ),
        _kind(
            "bromine_water",
            "bromine water oxidises aldoses to aldonic acids, not ketoses",
            (_UNKNOWN, FieldSpec("result", "choice", "what happened", choices=("oxidised", "unchanged"))),
        ),
        _kind(
            "reducing_test",
            "Fehling, Benedict or Tollens test",
            (_UNKNOWN, FieldSpec("result", "choice", "colour or mirror", choices=("positive", "negative"))),
        ),
        _kind(
            "ketose_test",
            "resorcinol/HCl (Seliwanoff-type) test: fast red colour for ketoses",
            (_UNKNOWN, FieldSpec("result", "choice", "fast colour or not", choices=("positive", "negative"))),
        ),
        _kind(
            "aldaric_acid",
            "nitric-acid oxidation product: optically active or not",
            (_UNKNOWN, FieldSpec("optically_active", "bool", "does the diacid rotate plane-polarised light")),
        ),
        _kind(
            "alditol",
            "borohydride reduction product: optically active or not (a ketose: active if either alditol is)",
            (_UNKNOWN, FieldSpec("optically_active", "bool", "does the alditol rotate plane-polarised light")),
        ),
        _kind(
            "molecular_formula",
            "molecular formula of the free sugar (e.g. from HRMS)",
            (
                _UNKNOWN,
                FieldSpec(
                    "value",
                    "text",
                    "Hill formula such as C6H12O6 (a hydrate or salt, C6H12O5.H2O, reads as the free sugar)",
                ),
            ),
        ),
        _kind(
            "periodate",
            "periodate uptake and products per mol substrate",
            (
                _UNKNOWN,
                FieldSpec(
                    "substrate",
                    "choice",
                    "what was oxidised",
                    choices=("free", "alditol", "methyl_pyranoside", "methyl_furanoside", "residue"),
                ),
                FieldSpec("periodate", "float", "IO4- consumed", unit="mol/mol", minimum=0),
                # the products are often not measured (uptake alone is a titration): leave them out then
                FieldSpec("formic_acid", "float", "HCOOH formed", required=False, unit="mol/mol", minimum=0),
                FieldSpec("formaldehyde", "float", "HCHO formed", required=False, unit="mol/mol", minimum=0),
                FieldSpec("co2", "float", "CO2 formed", required=False, unit="mol/mol", minimum=0),
                _sigma("mol/mol"),
                _tolerance("mol/mol"),
            ),
        ),
        _kind(
            "specific_rotation",
            "[alpha]D in water against published values: the equilibrium, or the initial rotation of an anomer",
            (
                _UNKNOWN,
                FieldSpec("value", "float", "specific rotation", unit="deg mL g-1 dm-1"),
                FieldSpec(
                    "form",
                    "choice",
                    "which rotation (left out: the mutarotated equilibrium); alpha or beta: the initial "
                    "rotation of the freshly dissolved pure anomer, extrapolated to time zero",
                    required=False,
                    choices=("equilibrium", "alpha", "beta"),
                ),
                _sigma("deg"),
                _tolerance("deg"),
            ),
        ),
        _kind(
            "anomer_ratio",
            "alpha fraction of the pyranose anomers at equilibrium (NMR integration or polarimetry)",
            (
                _UNKNOWN,
                FieldSpec("alpha_fraction", "float", "alpha / (alpha + beta) pyranose", minimum=0, maximum=1),
                _sigma(""),
                _tolerance(""),
            ),
        ),
        _kind(
            "coupling_constant",
            "vicinal 3J(H,H) of one ring form",
            (
                _UNKNOWN,
                FieldSpec(
                    "form",
                    "choice",
                    "ring form measured",
                    choices=("alpha_pyranose", "beta_pyranose", "alpha_furanose", "beta_furanose"),
                ),
                FieldSpec("pair", "text", "proton pair such as H1-H2"),
                FieldSpec("value", "float", "coupling constant", unit="Hz", minimum=0, maximum=20),
                _sigma("Hz"),
                _tolerance("Hz"),
            ),
        ),
        _kind(
            "methylation_analysis",
            "partially methylated alditol acetate of a residue (permethylation, hydrolysis, NaBD4, acetylation)",
            (
                _UNKNOWN,
                FieldSpec("methyl", "positions", "carbons with O-methyl, numbered from the deuterated C", maximum=9),
                FieldSpec("acetyl", "positions", "carbons with O-acetyl", maximum=9, min_items=1),
                FieldSpec(
                    "sugar",
                    "text",
                    "the sugar whose alditol acetate it is (GC retention time, mass spectrum), if known",
                    required=False,
                ),
            ),
        ),
        _kind(
            "smith_degradation",
            "fragment of a residue after periodate, borohydride and mild acid",
            (
                _UNKNOWN,
                FieldSpec("product", "text", "a polyol or sugar name (glycerol, erythritol, D-threitol ...) or none"),
            ),
        ),
        _kind(
            "anomer",
            "anomeric configuration of a residue (NMR, a specific glycosidase)",
            (_UNKNOWN, FieldSpec("value", "choice", "alpha or beta", choices=("alpha", "beta"))),
        ),
        _kind(
            "ring_form",
            "ring size of a residue (13C NMR: furanosyl C-1 near 105-110 ppm; acid lability of furanosides)",
            (_UNKNOWN, FieldSpec("value", "choice", "pyranose or furanose", choices=("pyranose", "furanose"))),
        ),
        _kind(
            "same_product",
            "relation between the products of several compounds",
            (
                FieldSpec(
                    "reaction",
                    "choice",
                    "which product",
                    choices=("osazone", "aldaric_acid", "alditol", "aldonic_acid"),
                ),
                FieldSpec("members", "members", "unknown ids or known sugars", min_items=2, max_items=8),
                FieldSpec(
                    "relation", "choice", "how the products relate", choices=("identical", "enantiomeric", "different")
                ),
            ),
            unary=False,
        ),
        _kind(
            "different",
            "the compounds are not the same compound",
            (FieldSpec("members", "members", "unknown ids or known sugars", min_items=2, max_items=8),),
            unary=False,
        ),
        _kind(
            "chain_extension",
            "products are the C-2 epimers of the substrate extended by one carbon",
            (
                FieldSpec("method", "choice", "route", choices=("kiliani_fischer", "nitromethane")),
                FieldSpec("substrate", "member", "the aldose extended"),
                FieldSpec("products", "members", "one or both products", min_items=1, max_items=2),
            ),
            unary=False,
        ),
        _kind(
            "molar_ratio",
            "molar amounts of the residue types of one polymer (GC-MS of the alditol acetates)",
            (
                FieldSpec("members", "members", "residue unknowns", min_items=2, max_items=12),
                FieldSpec("amounts", "numbers", "relative molar amounts, in the order of members", minimum=0),
                FieldSpec(
                    "balance",
                    "bool",
                    "the members are every residue type of the polymer, so terminal residues balance branch points",
                    required=False,
                    default=True,
                ),
                FieldSpec(
                    "tolerance",
                    "float",
                    "allowed imbalance as a fraction of all residues",
                    required=False,
                    default=0.1,
                    minimum=0,
                    maximum=1,
                ),
            ),
            unary=False,
        ),
        _kind(
            "chain_shortening",
            "product is the aldose one carbon shorter",
            (
                FieldSpec("method", "choice", "route", choices=("ruff", "wohl")),
                FieldSpec("substrate", "member", "the aldose degraded"),
                FieldSpec("product", "member", "the shorter aldose"),
            ),
            unary=False,
        ),
    )
}


def unary_kinds() -> tuple[str, ...]:
    """Kinds that concern one unknown."""
    return tuple(k for k, c in OBSERVATION_TYPES.items() if c.UNARY)


def relational_kinds() -> tuple[str, ...]:
    """Kinds that relate several compounds."""
    return tuple(k for k, c in OBSERVATION_TYPES.items() if not c.UNARY)


def _check(spec: FieldSpec, value: Any, oid: str | None) -> Any:
    """Validated, normalised value of one field, or raise ObservationError."""

    def fail(problem: str) -> ObservationError:
        return ObservationError(oid, spec.name, problem)

    if spec.type in ("unknown", "member", "text"):
        if not isinstance(value, str) or not value.strip():
            raise fail(f"expected a non-empty text, got {show(value)}")
        return value.strip()
    if spec.type == "choice":
        if value not in spec.choices:
            raise fail(f"{show(value)} is not one of {', '.join(spec.choices)}")
        return value
    if spec.type == "bool":
        if not isinstance(value, bool):
            raise fail(f"expected true or false, got {show(value)}")
        return value
    if spec.type in ("int", "float"):
        if isinstance(value, bool) or not isinstance(value, (int, float)):
            raise fail(f"expected a number, got {show(value)}")
        if spec.type == "int" and (isinstance(value, float) and not value.is_integer()):
            raise fail(f"expected a whole number, got {show(value)}")
        if abs(value) > _LARGEST:
            raise fail(f"{show(value)} is out of range")
        number = int(value) if spec.type == "int" else float(value)
        if number != number or number in (float("inf"), float("-inf")):
            raise fail("expected a finite number")
        if spec.minimum is not None and number < spec.minimum:
            raise fail(
                f"{number:g} is below the smallest allowed value {spec.minimum:g}{' ' + spec.unit if spec.unit else ''}"
            )
        if spec.maximum is not None and number > spec.maximum:
            raise fail(
                f"{number:g} is above the largest allowed value {spec.maximum:g}{' ' + spec.unit if spec.unit else ''}"
            )
        return number
    if spec.type == "members":
        if not isinstance(value, list) or not all(isinstance(v, str) and v.strip() for v in value):
            raise fail(f"expected a list of unknown ids or sugar names, got {show(value)}")
        items = tuple(v.strip() for v in value)
        if spec.min_items and len(items) < spec.min_items:
            raise fail(f"needs at least {spec.min_items} member(s), got {len(items)}")
        if spec.max_items and len(items) > spec.max_items:
            raise fail(f"takes at most {spec.max_items} member(s), got {len(items)}")
        if len(set(items)) != len(items):
            raise fail("lists the same member twice")
        return items
    if spec.type == "positions":
        if not isinstance(value, list) or not all(isinstance(v, int) and not isinstance(v, bool) for v in value):
            raise fail(f"expected a list of carbon numbers such as [2, 3, 6], got {show(value)}")
        top = int(spec.maximum) if spec.maximum is not None else 9
        bad = [v for v in value if not 1 <= v <= top]
        if bad:
            raise fail(f"carbon number {bad[0]} is outside 1-{top}")
        if len(set(value)) != len(value):
            raise fail("lists the same carbon twice")
        if spec.min_items and len(value) < spec.min_items:
            raise fail(f"needs at least {spec.min_items} carbon number(s)")
        return tuple(sorted(value))
    if spec.type == "numbers":
        if not isinstance(value, list) or not value:
            raise fail(f"expected a non-empty list of numbers, got {show(value)}")
        out = []
        for v in value:
            if isinstance(v, bool) or not isinstance(v, (int, float)) or v != v or v in (float("inf"), float("-inf")):
                raise fail(f"expected finite numbers, got {show(v)}")
            if spec.minimum is not None and v < spec.minimum:
                raise fail(f"{v:g} is below the smallest allowed value {spec.minimum:g}")
            out.append(float(v))
        return tuple(out)
    raise AssertionError(spec.type)


def observation_from_dict(data: Mapping[str, Any]) -> Observation:
    """Build and validate one observation; raises :class:`ObservationError`.

    References to unknowns and sugar names are checked by the project loader,
    which knows the project's unknowns.
    """
    if not isinstance(data, Mapping):
        raise ObservationError(None, None, f"an observation must be a JSON object, got {type(data).__name__}")
    oid = data.get("id")
    if not isinstance(oid, str) or not oid.strip():
        raise ObservationError(None, "id", f"every observation needs a text id, got {show(oid)}")
    oid = oid.strip()
    bad = line_breaker(oid)
    if bad is not None:
        raise ObservationError(
            None, "id", f"an id is one line of text without control characters; {show(oid)} holds {bad}"
        )
    kind = data.get("kind")
    if not isinstance(kind, str):
        raise ObservationError(oid, "kind", f"expected a kind word such as 'series', got {show(kind)}")
    if kind not in OBSERVATION_TYPES:
        raise ObservationError(oid, "kind", f"unknown kind {show(kind)}; known kinds: {', '.join(OBSERVATION_TYPES)}")
    cls = OBSERVATION_TYPES[kind]
    allowed = set(_COMMON) | {s.name for s in cls.SPECS}
    extra = sorted(set(data) - allowed)
    if extra:
        raise ObservationError(
            oid, extra[0], f"not a field of kind {kind}; its fields are {', '.join(s.name for s in cls.SPECS)}"
        )
    kwargs: dict[str, Any] = {}
    for spec in cls.SPECS:
        if spec.name not in data or data[spec.name] is None:
            if spec.required:
                raise ObservationError(oid, spec.name, f"missing; kind {kind} needs it ({spec.doc})")
            kwargs[spec.name] = spec.default
            continue
        kwargs[spec.name] = _check(spec, data[spec.name], oid)
    for key in ("note", "by", "recorded"):
        value = data.get(key, "")
        if not isinstance(value, str):
            raise ObservationError(oid, key, f"expected text, got {show(value)}")
        kwargs[key] = value
    if kwargs["recorded"]:
        try:
            _dt.datetime.fromisoformat(kwargs["recorded"].replace("Z", "+00:00"))
        except ValueError as err:
            raise ObservationError(oid, "recorded", f"{show(kwargs['recorded'])} is not an ISO 8601 date") from err
    if kind == "same_product" and kwargs["relation"] == "enantiomeric" and len(kwargs["members"]) != 2:
        raise ObservationError(oid, "members", "an 'enantiomeric' relation needs exactly two members")
    if kind == "coupling_constant":
        kwargs["pair"] = _proton_pair(kwargs["pair"], oid)
    _check_residue_kind(kind, kwargs, oid)
    if kind == "molecular_formula":
        kwargs["value"] = _hill_formula(kwargs["value"], oid)
    return cls(oid, **kwargs)


_LARGEST = 1e15  # no field of any kind is meaningful beyond this magnitude

# Elements a sugar or a derivative stereosieve models can contain, as written in a formula.
_ELEMENTS = frozenset({"C", "H", "N", "O", "S", "P", "F", "Cl", "Br", "I", "Na", "K"})
_ELEMENT = re.compile(r"([A-Z][a-z]?)(\d*)")


# What a handbook writes after a centred dot: water of crystallisation and the acid of a salt
# (L-rhamnose C6H12O5.H2O, D-glucosamine C6H13NO5.HCl [common practice]); dropped, the free sugar remains.
_ADDUCT = re.compile(r"(\d*|[xn])(H2O|HCl|HBr|HI)")
_ADDUCT_DOTS = ("\u00b7", "\u2022", "\u2219", "*", ".")


def _hill_formula(text: str, oid: str) -> str:
    """A molecular formula in Hill order (C, then H, then the rest alphabetically; without carbon all
    alphabetically: Hill, J. Am. Chem. Soc. 22, 478, 1900), spaces removed; else ObservationError.

    A hydrate or salt written with a dot (``C6H12O5.H2O``, ``C6H13NO5.HCl``) gives the free sugar's formula.
    """
    clean = text.replace(" ", "")
    for dot in _ADDUCT_DOTS:
        clean = clean.replace(dot, "\u00b7")
    if "\u00b7" in clean:
        clean, *adducts = clean.split("\u00b7")
        if not all(_ADDUCT.fullmatch(a) for a in adducts):
            raise ObservationError(
                oid, "value", f"{show(text)}: only water or HCl, HBr, HI may follow the dot (a hydrate or a salt)"
            )
    parts = _ELEMENT.findall(clean)
    if not clean or "".join(e + n for e, n in parts) != clean or len(clean) > 60:
        raise ObservationError(oid, "value", f"{show(text)} is not a molecular formula such as C6H12O6")
    symbols = [e for e, _ in parts]
    unknown = [e for e in symbols if e not in _ELEMENTS]
    if unknown:
        raise ObservationError(oid, "value", f"element {unknown[0]!r} is not one stereosieve models in a formula")
    if len(set(symbols)) != len(symbols):
        raise ObservationError(oid, "value", f"{show(text)} names an element twice; write each once (Hill formula)")
    if any(n and (n.startswith("0") or int(n) > 999) for _, n in parts):
        raise ObservationError(oid, "value", f"{show(text)} has a count of zero, a leading zero or over 999")
    rest = sorted(e for e in symbols if e not in ("C", "H"))
    hill = (["C"] + (["H"] if "H" in symbols else []) + rest) if "C" in symbols else sorted(symbols)
    if symbols != hill:
        counts = dict(parts)
        suggestion = "".join(e + counts[e] for e in hill)
        raise ObservationError(oid, "value", f"{show(text)} is not in Hill order; write {suggestion}")
    return clean


_PROTON = re.compile(r"^H-?(\d+)(ax|eq)?$", re.IGNORECASE)


def _proton_pair(text: str, oid: str) -> str:
    """``H1-H2``, ``H4-H5ax`` (pentopyranose C-5 protons) in a fixed form, lower carbon first."""
    parts = text.replace(" ", "").replace(",", "-").split("-")
    # "H-1-H-2" style: join a bare "H" with the number after it
    merged: list[str] = []
    for part in parts:
        if merged and merged[-1].upper() == "H":
            merged[-1] += part
        else:
            merged.append(part)
    matches = [_PROTON.match(p) for p in merged]
    if len(merged) != 2 or not all(matches):
        raise ObservationError(oid, "pair", f"{show(text)} is not a proton pair such as H1-H2 or H4-H5ax")
    protons = sorted(((int(m[1]), (m[2] or "").lower()) for m in matches if m), key=lambda x: x[0])
    return "-".join(f"H{n}{suffix}" for n, suffix in protons)


def _check_residue_kind(kind: str, kwargs: dict[str, Any], oid: str) -> None:
    """Cross-field checks of the residue kinds (methylation_analysis, smith_degradation, molar_ratio)."""
    if kind == "methylation_analysis":
        both = set(kwargs["methyl"]) & set(kwargs["acetyl"])
        if both:
            raise ObservationError(oid, "acetyl", f"C-{min(both)} cannot carry both O-methyl and O-acetyl")
        if kwargs.get("sugar"):
            from workbench.chem.parse import resolve
            from workbench.errors import NameNotRecognisedError

            try:
                resolve(kwargs["sugar"])
            except NameNotRecognisedError as err:
                raise ObservationError(oid, "sugar", str(err)) from err
    elif kind == "smith_degradation":
        product = kwargs["product"]
        if product.lower() == "none":
            kwargs["product"] = "none"
            return
        from workbench.chem.residue_periodate import product_keys
        from workbench.errors import NameNotRecognisedError

        try:
            product_keys(product)
        except NameNotRecognisedError as err:
            raise ObservationError(oid, "product", f"{err} Use a polyol or sugar name, or none.") from err
    elif kind == "molar_ratio":
        if len(kwargs["amounts"]) != len(kwargs["members"]):
            raise ObservationError(
                oid, "amounts", f"gives {len(kwargs['amounts'])} amount(s) for {len(kwargs['members'])} member(s)"
            )
        if sum(kwargs["amounts"]) <= 0:
            raise ObservationError(oid, "amounts", "at least one amount must be above zero")
