"""The catalogue: every candidate structure inside a scope.

A :class:`Scope` is the project file's ``scope`` object (DESIGN.md, Contract
1): chain lengths, aldose/ketose, D/L series and constitution variants
("modifications"). :func:`enumerate_scope` yields the candidates lazily and
:func:`catalogue` returns them as a cached tuple.

Modification words:

- ``none``: the parent aldoses and 2-ketoses.
- ``deoxy:N`` or ``deoxy:N,M``: H in place of OH at C-N (CH3 at a chain end).
- ``amino:N``: NH2 in place of OH at C-N (N a stereocentre).
- ``acetamido:N``: NHAc (N-acetyl amino, the form of most natural amino
  sugars: GlcNAc is ``acetamido:2``) in place of OH at C-N.
- ``omethyl:N``: OMe in place of OH at C-N.
- ``uronic``: the last carbon of an aldose is COOH.
- words joined with ``+`` combine, e.g. ``amino:2+deoxy:6``.
- ``sugars`` (a scope key, not a word): a list of sugar names; the
  candidates are then those sugars, filtered by carbons, carbonyl and series.
- ``any``: none; every single deoxy position; every deoxy pair that includes
  the terminal carbon (2,6- and 3,6-dideoxyhexoses and their kin); amino:2 and
  acetamido:2, each also with terminal deoxy (aldoses); uronic (aldoses of 4+
  carbons).
"""

from __future__ import annotations

import itertools
from collections.abc import Iterable, Iterator
from dataclasses import dataclass, field
from functools import lru_cache

from workbench.chem.chain import LEFT, RIGHT, STEREO_GROUPS, Chain
from workbench.errors import ScopeError

__all__ = [
    "Modification",
    "Scope",
    "DEFAULT_SCOPE",
    "parse_modification",
    "enumerate_scope",
    "catalogue",
    "scope_size",
]

CARBON_RANGE = range(3, 10)


@dataclass(frozen=True)
class Modification:
    """A constitution variant: positions of deoxy, amino, O-methyl; uronic."""

    deoxy: frozenset[int] = frozenset()
    amino: frozenset[int] = frozenset()
    omethyl: frozenset[int] = frozenset()
    uronic: bool = False
    acetamido: frozenset[int] = frozenset()

    @property
    def word(self) -> str:
        """The modification word this variant is written as."""
        parts = []
        if self.acetamido:
            parts.append("acetamido:" + ",".join(map(str, sorted(self.acetamido))))
        if self.amino:
            parts.append("amino:" + ",".join(map(str, sorted(self.amino))))
        if self.deoxy:
            parts.append("deoxy:" + ",".join(map(str, sorted(self.deoxy))))
        if self.omethyl:
            parts.append("omethyl:" + ",".join(map(str, sorted(self.omethyl))))
        if self.uronic:
            parts.append("uronic")
        return "+".join(parts) or "none"

    def template(self, carbons: int, carbonyl: str) -> tuple[str, ...] | None:
        """Group codes for this variant on a chain, or None where it cannot apply."""
        n = carbons
        groups = ["CHOH"] * n
        if carbonyl == "aldose":
            groups[0] = "CHO"
        else:
            if n < 3:
                return None
            groups[0], groups[1] = "CH2OH", "CO"
        groups[-1] = "CH2OH"
        if self.uronic:
            if carbonyl != "aldose" or n < 4:
                return None
            groups[-1] = "COOH"
        if carbonyl == "ketose" and n == 3 and 3 in self.deoxy and 1 not in self.deoxy:
            return None  # the same compound as 1-deoxy; lowest locant wins
        for k in self.deoxy:
            if not 1 <= k <= n or groups[k - 1] not in ("CHOH", "CH2OH"):
                return None
            groups[k - 1] = "CH3" if k in (1, n) else "CH2"
        for k in self.amino:
            if not 1 <= k <= n or groups[k - 1] != "CHOH":
                return None
            groups[k - 1] = "CHNH2"
        for k in self.omethyl:
            if not 1 <= k <= n or groups[k - 1] != "CHOH":
                return None
            groups[k - 1] = "CHOMe"
        for k in self.acetamido:
            if not 1 <= k <= n or groups[k - 1] != "CHOH":
                return None
            groups[k - 1] = "CHNHAc"
        return tuple(groups)


def _positions(text: str, word: str) -> frozenset[int]:
    try:
        values = frozenset(int(x) for x in text.split(",") if x.strip())
    except ValueError as err:
        raise ScopeError(f"modification {word!r}: positions must be integers, e.g. 'deoxy:2,6'") from err
    if not values or min(values) < 1:
        raise ScopeError(f"modification {word!r}: give carbon numbers from 1, e.g. 'deoxy:6'")
    return values


def parse_modification(word: str) -> Modification:
    """A :class:`Modification` from one word such as ``amino:2+deoxy:6``."""
    deoxy: frozenset[int] = frozenset()
    amino: frozenset[int] = frozenset()
    omethyl: frozenset[int] = frozenset()
    acetamido: frozenset[int] = frozenset()
    uronic = False
    text = word.strip()
    if text == "none":
        return Modification()
    for part in text.split("+"):
        part = part.strip()
        name, _, where = part.partition(":")
        if name == "deoxy":
            deoxy |= _positions(where, word)
        elif name == "amino":
            amino |= _positions(where, word)
        elif name in ("omethyl", "O-methyl"):
            omethyl |= _positions(where, word)
        elif name == "acetamido":
            acetamido |= _positions(where, word)
        elif name == "uronic" and not where:
            uronic = True
        else:
            raise ScopeError(
                f"unknown modification {word!r}; use none, any, uronic, deoxy:N[,M], amino:N, "
                "acetamido:N, omethyl:N, or several joined with '+'"
            )
    sets = (deoxy, amino, omethyl, acetamido)
    if any(a & b for i, a in enumerate(sets) for b in sets[i + 1 :]):
        raise ScopeError(f"modification {word!r} puts two changes on one carbon")
    return Modification(deoxy, amino, omethyl, uronic, acetamido)


def _any_variants(carbons: int, carbonyl: str) -> list[Modification]:
    n = carbons
    out = [Modification()]
    singles = [k for k in range(1, n + 1) if Modification(frozenset({k})).template(n, carbonyl)]
    out += [Modification(frozenset({k})) for k in singles]
    out += [Modification(frozenset({k, n})) for k in singles if k not in (1, n)]
    if carbonyl == "aldose":
        out += [Modification(amino=frozenset({2})), Modification(frozenset({n}), frozenset({2}))]
        # N-acetyl: the form in which amino sugars occur in nature (GlcNAc, GalNAc, ManNAc; FucNAc, QuiNAc)
        out += [Modification(acetamido=frozenset({2})), Modification(frozenset({n}), acetamido=frozenset({2}))]
        out.append(Modification(uronic=True))
    return [m for m in out if m.template(n, carbonyl) is not None]


@dataclass(frozen=True)
class Scope:
    """What an unknown may be. Defaults: 3-7 carbons, both carbonyls and series, no modification."""

    carbons: tuple[int, ...] = (3, 4, 5, 6, 7)
    carbonyl: tuple[str, ...] = ("aldose", "ketose")
    series: tuple[str, ...] = ("D", "L")
    modifications: tuple[str, ...] = ("none",)
    sugars: tuple[str, ...] = ()  # names; when given, the candidates are these sugars (other keys filter)
    _parsed: tuple[Modification | None, ...] = field(default=(), init=False, repr=False, compare=False)

    def __post_init__(self) -> None:
        if not self.carbons:
            raise ScopeError("scope 'carbons' is empty; give chain lengths such as [5, 6]")
        for n in self.carbons:
            if not isinstance(n, int) or isinstance(n, bool) or n not in CARBON_RANGE:
                raise ScopeError(f"scope 'carbons': {n!r} is not a chain length from 3 to 9")
        for c in self.carbonyl:
            if c not in ("aldose", "ketose"):
                raise ScopeError(f"scope 'carbonyl': {c!r} is not 'aldose' or 'ketose'")
        for s in self.series:
            if s not in ("D", "L"):
                raise ScopeError(f"scope 'series': {s!r} is not 'D' or 'L'")
        if not self.carbonyl or not self.series or not self.modifications:
            raise ScopeError("scope 'carbonyl', 'series' and 'modifications' may not be empty lists")
        parsed = tuple(None if w == "any" else parse_modification(w) for w in self.modifications)
        object.__setattr__(self, "_parsed", parsed)
        for name in self.sugars:
            if not isinstance(name, str) or not name.strip():
                raise ScopeError(f"scope 'sugars': {name!r} is not a sugar name")
        if self.sugars:
            _named(self.sugars)  # every name must resolve

    @classmethod
    def from_dict(cls, data: dict) -> Scope:
        """The scope of a project file's ``scope`` object (missing keys take defaults)."""
        unknown = set(data) - {"carbons", "carbonyl", "series", "modifications", "sugars"}
        if unknown:
            raise ScopeError(
                f"unknown scope key(s) {sorted(unknown)}; use carbons, carbonyl, series, modifications, sugars"
            )
        kwargs = {}
        for key in ("carbons", "carbonyl", "series", "modifications", "sugars"):
            if key in data:
                value = data[key]
                if not isinstance(value, list):
                    raise ScopeError(f"scope '{key}' must be a list, got {type(value).__name__}")
                kwargs[key] = tuple(value)
        return cls(**kwargs)

    def to_dict(self) -> dict:
        """The project-file form of this scope."""
        out: dict = {
            "carbons": list(self.carbons),
            "carbonyl": list(self.carbonyl),
            "series": list(self.series),
            "modifications": list(self.modifications),
        }
        if self.sugars:
            out["sugars"] = list(self.sugars)
        return out

    def candidates(self) -> tuple[Chain, ...]:
        """Every candidate of this scope (:func:`catalogue`); subclasses list other kinds of candidate."""
        return catalogue(self)

    def variants(self, carbons: int, carbonyl: str) -> list[Modification]:
        """Distinct modifications of this scope that apply to one chain type."""
        seen: dict[Modification, None] = {}
        for mod in self._parsed:
            mods = _any_variants(carbons, carbonyl) if mod is None else [mod]
            for m in mods:
                if m.template(carbons, carbonyl) is not None:
                    seen.setdefault(m, None)
        return list(seen)


DEFAULT_SCOPE = Scope()


@lru_cache(maxsize=256)
def _named(names: tuple[str, ...]) -> tuple[Chain, ...]:
    """The chains of the sugar names of a scope's ``sugars`` key (ScopeError for an unknown name)."""
    from workbench.chem.parse import resolve  # parse imports names, which need no catalogue
    from workbench.errors import NameNotRecognisedError

    out = []
    for name in names:
        try:
            out.append(resolve(name))
        except NameNotRecognisedError as err:
            raise ScopeError(f"scope 'sugars': {err}") from err
    return tuple(out)


def _chains(template: tuple[str, ...]) -> Iterator[Chain]:
    stereo = [i for i, g in enumerate(template) if g in STEREO_GROUPS]
    for combo in itertools.product((RIGHT, LEFT), repeat=len(stereo)):
        sides: list[str | None] = [None] * len(template)
        for i, s in zip(stereo, combo, strict=True):
            sides[i] = s
        yield Chain(template, tuple(sides))


def enumerate_scope(scope: Scope = DEFAULT_SCOPE) -> Iterator[Chain]:
    """Yield every candidate of ``scope`` once, in a fixed order.

    Chains without a stereocentre (dihydroxyacetone) have no series; they are
    kept only when the scope admits both D and L.
    """
    seen: set[Chain] = set()
    both = set(scope.series) == {"D", "L"}
    if scope.sugars:
        for chain in _named(scope.sugars):
            fits_scope = chain.carbons in scope.carbons and chain.carbonyl in scope.carbonyl
            if fits_scope and (chain.series in scope.series or (chain.series is None and both)) and chain not in seen:
                seen.add(chain)
                yield chain
        return
    for n in sorted(set(scope.carbons)):
        for carbonyl in ("aldose", "ketose"):
            if carbonyl not in scope.carbonyl:
                continue
            for mod in scope.variants(n, carbonyl):
                template = mod.template(n, carbonyl)
                assert template is not None
                for chain in _chains(template):
                    series = chain.series
                    if (series is None and not both) or (series is not None and series not in scope.series):
                        continue
                    if chain not in seen:
                        seen.add(chain)
                        yield chain


@lru_cache(maxsize=64)
def catalogue(scope: Scope = DEFAULT_SCOPE) -> tuple[Chain, ...]:
    """All candidates of ``scope`` as a tuple (cached per scope)."""
    if type(scope) is not Scope:  # a residue scope (chem.residue.ResidueScope) lists its own candidates
        return scope.candidates()
    return tuple(enumerate_scope(scope))


def scope_size(scope: Scope = DEFAULT_SCOPE) -> int:
    """Number of candidates in ``scope``."""
    return len(catalogue(scope))


def union(scopes: Iterable[Scope]) -> tuple[Chain, ...]:
    """Candidates of several scopes, each once, in first-seen order."""
    seen: dict[Chain, None] = {}
    for s in scopes:
        for c in catalogue(s):
            seen.setdefault(c, None)
    return tuple(seen)
