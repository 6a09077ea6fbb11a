"""Outcome tables: every candidate's predicted outcomes as small integer codes in columns.

A *column* holds, for one experiment (a probe: the kind of observation and
the fields its prediction depends on, e.g. ``periodate|substrate=free``), the
predicted outcome of every candidate seen so far, as an ``int32`` code into
the column's list of distinct values. Candidates are rows, numbered once per
process. The values are exactly what the single prediction layer returns
(:func:`workbench.evidence.outcomes.predict` and
:func:`~workbench.evidence.outcomes.product_key`): a column is a memo of it,
never a second rule.

Because an observation's verdict depends on a candidate only through the
predicted value, the engine judges each *distinct value* once and maps the
verdict onto the rows with numpy (:func:`keep`); the planner partitions
candidates by code (:func:`values`).

Tables are computed once and kept:

- shipped with the package for the standard scopes
  (``workbench/data/outcome_tables.pkl.gz``, written by
  ``scripts/build_outcome_tables.py``), and
- cached on disk for any other candidates under the user's cache folder
  (``platformdirs.user_cache_dir("stereosieve")``, or ``STEREOSIEVE_CACHE_DIR``;
  ``STEREOSIEVE_CACHE=off`` turns the disk cache off), written when the
  process ends.

Both are keyed by :func:`rules_key`: the package version and a hash of the
source of every module and data file that a prediction depends on. A changed
chemistry rule changes the key, and tables with another key are ignored.
The files are Python pickles of plain tuples, lists and numpy arrays written
by this module; only the package's own file and the user's own cache folder
are read.
"""

from __future__ import annotations

import atexit
import gzip
import hashlib
import logging
import os
import pickle
import threading
from collections.abc import Callable, Hashable, Iterable, Sequence
from dataclasses import dataclass, field
from functools import cache
from pathlib import Path
from typing import Any

import numpy as np

from workbench.chem.chain import Chain

__all__ = [
    "ESTIMATED",
    "SHIPPED",
    "cache_path",
    "codes",
    "column_key",
    "estimate_key",
    "keep",
    "observation_key",
    "rows",
    "rules_key",
    "save",
    "standard_keys",
    "values",
    "verdicts",
    "warm",
]

log = logging.getLogger(__name__)

_PACKAGE = Path(__file__).resolve().parent.parent
SHIPPED = _PACKAGE / "data" / "outcome_tables.pkl.gz"
# Source whose change can change a prediction: the structure model and its
# chemistry, the conformer layer, the observation kinds and this module.
_RULE_SOURCES = (
    "chem/*.py",
    "conformers/*.py",
    "evidence/outcomes.py",
    "evidence/observations.py",
    "evidence/tables.py",
    "data/*.json",
    "data/*.csv",
)
# Fields of a unary observation that its prediction depends on (the rest are the observed values).
_PROBE_FIELDS: dict[str, tuple[str, ...]] = {
    "periodate": ("substrate",),
    "coupling_constant": ("form", "pair"),
    "specific_rotation": ("form",),  # left out (None): the equilibrium, the column of old files
}
_FORMAT = 2
# Kinds whose verdict reads the calibrated estimate (value, standard error, class), not only the
# predicted value: judged candidate by candidate, not through a column.
ESTIMATED = frozenset({"specific_rotation", "anomer_ratio", "coupling_constant"})


@cache
def rules_key() -> str:
    """Package version plus a SHA-256 of every source and data file predictions depend on."""
    from workbench import __version__

    digest = hashlib.sha256(f"{__version__}|{_FORMAT}".encode())
    for pattern in _RULE_SOURCES:
        for path in sorted(_PACKAGE.glob(pattern)):
            if path.name == "demo_project.json":
                continue
            digest.update(path.relative_to(_PACKAGE).as_posix().encode())
            digest.update(path.read_bytes())
    return f"{__version__}-{digest.hexdigest()[:20]}"


# ------------------------------------------------------------------ keys
def column_key(kind: str, **params: Any) -> str:
    """The key of a unary experiment's column: ``kind|field=value|...`` (sorted fields)."""
    parts = [kind] + [f"{k}={params[k]}" for k in sorted(params)]
    return "|".join(parts)


def observation_key(obs: Any) -> str | None:
    """The column of a unary observation's prediction, or None when no column applies."""
    kind = getattr(obs, "KIND", None)
    if kind is None or not getattr(obs, "UNARY", False):
        return None
    fields = {f: getattr(obs, f) for f in _PROBE_FIELDS.get(kind, ())}
    return column_key(kind, **{f: v for f, v in fields.items() if v is not None and v != "equilibrium"})


def _probe(key: str) -> Any:
    from workbench.evidence.observations import OBSERVATION_TYPES

    kind, *parts = key.split("|")
    params = dict(p.split("=", 1) for p in parts)
    cls: Any = OBSERVATION_TYPES[kind]
    return cls("?", unknown="?", **params)


def _compute_fn(key: str) -> Callable[[Chain], Hashable]:
    """How one row of column ``key`` is computed (always through the one prediction layer)."""
    from workbench.evidence import outcomes

    head = key.split("|", 1)[0]
    if head == "product":
        reaction = key.split("|", 1)[1]
        return lambda chain: outcomes.product_key(reaction, chain)
    if head == "derived":
        return _DERIVED[key.split("|", 1)[1]]
    if head == "estimate":  # the calibrated estimate (value, standard error, class) of a measured quantity
        probe = _probe(key.split("|", 1)[1])
        return lambda chain: outcomes.estimate(probe, chain)
    probe = _probe(key)
    return lambda chain: outcomes.predict(probe, chain)


def estimate_key(kind: str, **params: Any) -> str:
    """The column of a measured quantity's calibrated estimates (:func:`workbench.evidence.outcomes.estimate`)."""
    return "estimate|" + column_key(kind, **params)


def _judged_by(obs: Any) -> str | None:
    """The column whose value decides ``obs``'s verdict on a candidate (None: no column applies)."""
    key = observation_key(obs)
    if key is None:
        return None
    return "estimate|" + key if obs.KIND in ESTIMATED else key


def _aldaric_word(chain: Chain | None) -> str:
    from workbench.chem.predictions import predict as record_of

    if chain is None:
        return "no product"
    active = record_of(chain).aldaric_acid_active
    if active is None:
        return "no prediction" if record_of(chain).uncertain("aldaric_acid") else "no aldaric acid"
    return "active" if active else "meso"


def _extension_word(chain: Chain) -> str:
    from workbench.chem.predictions import predict as record_of

    prods = record_of(chain).chain_extension
    return "+".join(sorted(_aldaric_word(p) for p in prods)) if prods else "does not apply"


def _shortening_word(chain: Chain) -> str:
    from workbench.chem.predictions import predict as record_of

    prod = record_of(chain).chain_shortening
    if prod is None and record_of(chain).uncertain("chain_shortening"):
        return "no prediction"
    return _aldaric_word(prod) if prod else "does not apply"


def _coupling_pairs(form: str) -> Callable[[Chain], Hashable]:
    def pairs(chain: Chain) -> tuple[str, ...]:
        from workbench.chem.predictions import predict as record_of

        return tuple(record_of(chain).couplings.get(form, {}))

    return pairs


def _display_name(candidate: Any) -> str:
    from workbench.chem.names import display_name

    return display_name(candidate)


_DERIVED: dict[str, Callable[[Chain], Hashable]] = {
    "display_name": _display_name,
    "extension_aldaric": _extension_word,
    "shortening_aldaric": _shortening_word,
    "coupling_pairs_alpha_pyranose": _coupling_pairs("alpha_pyranose"),
    "coupling_pairs_beta_pyranose": _coupling_pairs("beta_pyranose"),
}


def standard_keys() -> tuple[str, ...]:
    """Every column the planner reads for an unknown of the standard scopes (what is shipped)."""
    keys = [
        column_key(k)
        for k in (
            "carbon_count",
            "molecular_formula",
            "series",
            "bromine_water",
            "reducing_test",
            "ketose_test",
            "aldaric_acid",
            "alditol",
            "specific_rotation",
            "anomer_ratio",
        )
    ]
    keys += [
        column_key("periodate", substrate=s) for s in ("free", "alditol", "methyl_pyranoside", "methyl_furanoside")
    ]
    for form in ("alpha_pyranose", "beta_pyranose"):
        for pair in ("H1-H2", "H2-H3", "H3-H4", "H4-H5", "H4-H5ax", "H4-H5eq"):
            keys.append(column_key("coupling_constant", form=form, pair=pair))
    keys += ["estimate|" + k for k in keys if k.split("|", 1)[0] in ESTIMATED]
    keys += [f"product|{r}" for r in ("osazone", "alditol", "aldaric_acid", "aldonic_acid")]
    keys += [f"derived|{d}" for d in _DERIVED]
    return tuple(keys)


# ------------------------------------------------------------------ the store
@dataclass
class _Column:
    codes: np.ndarray  # int32 per row; -1 = not computed yet
    values: list[Any] = field(default_factory=list)
    lookup: dict[Any, int] = field(default_factory=dict)

    def code_of(self, value: Any) -> int:
        try:
            return self.lookup[value]
        except KeyError:
            self.values.append(value)
            self.lookup[value] = len(self.values) - 1
            return len(self.values) - 1
        except TypeError:  # an unhashable value: compare by equality
            for i, v in enumerate(self.values):
                if v == value:
                    return i
            self.values.append(value)
            return len(self.values) - 1


class _Store:
    """Rows (candidates) and columns (experiments) of this process; see the module docstring.

    A row is known by its candidate's spec (:func:`_spec`, plain tuples), so
    rows read from a file need no structure built until a candidate asks.
    """

    def __init__(self) -> None:
        self.rows: dict[tuple, int] = {}
        self.specs: list[tuple] = []
        self.columns: dict[str, _Column] = {}
        self.dirty = False
        self.loaded = False
        self.recent: dict[int, tuple[Sequence[Any], np.ndarray]] = {}
        self.lock = threading.RLock()

    # rows
    def row_of_spec(self, spec: tuple) -> int:
        r = self.rows.get(spec)
        if r is None:
            r = self.rows[spec] = len(self.specs)
            self.specs.append(spec)
        return r

    def index(self, chains: Sequence[Any]) -> np.ndarray:
        seen = self.recent.get(id(chains))
        if seen is not None and seen[0] is chains:
            return seen[1]  # the planner and the engine ask about the same tuples several times
        # the row is kept on the candidate object too (as Chain keeps its hash): catalogue chains are
        # shared objects, so most look-ups skip building and hashing the spec
        out = np.fromiter((c.__dict__.get("_table_row", -1) for c in chains), dtype=np.int64, count=len(chains))
        if (out < 0).any():
            for i in np.flatnonzero(out < 0).tolist():
                c = chains[i]
                r = self.row_of_spec(_spec(c))
                object.__setattr__(c, "_table_row", r)
                out[i] = r
        if isinstance(chains, tuple):  # immutable: its rows cannot change (a list could be edited in place)
            if len(self.recent) >= 8:
                self.recent.pop(next(iter(self.recent)))
            self.recent[id(chains)] = (chains, out)  # the tuple is held, so its id stays its own
        return out

    def column(self, key: str) -> _Column:
        col = self.columns.get(key)
        if col is None:
            col = self.columns[key] = _Column(np.full(max(len(self.specs), 16), -1, dtype=np.int32))
        if len(col.codes) < len(self.specs):
            grown = np.full(max(len(self.specs), 2 * len(col.codes)), -1, dtype=np.int32)
            grown[: len(col.codes)] = col.codes
            col.codes = grown
        return col

    def codes(self, key: str, chains: Sequence[Chain]) -> tuple[np.ndarray, list[Any]]:
        with self.lock:
            self.load()
            rows = self.index(chains)
            col = self.column(key)
            got = col.codes[rows]
            missing = np.flatnonzero(got < 0)
            if len(missing):
                fn = _compute_fn(key)
                for i in missing.tolist():
                    r = rows[i]
                    if col.codes[r] < 0:
                        col.codes[r] = col.code_of(fn(chains[i]))
                got = col.codes[rows]
                self.dirty = True
            return got, col.values

    # persistence
    def load(self) -> None:
        if self.loaded:
            return
        self.loaded = True
        for path in (cache_path(), SHIPPED):
            if path is not None and path.is_file():
                data = _read(path)
                if data is not None:
                    self._merge(data)
                    log.debug("outcome tables from %s: %d rows, %d columns", path, len(self.specs), len(self.columns))
                    return

    def _merge(self, data: dict) -> None:
        rows = np.array([self.row_of_spec(tuple(spec)) for spec in data["chains"]], dtype=np.int64)
        for key, (codes, vals) in data["columns"].items():
            col = self.column(key)
            for v in vals:
                col.code_of(v)
            remap = np.array([col.code_of(v) for v in vals] + [-1], dtype=np.int32)
            codes = np.asarray(codes, dtype=np.int32)
            if len(codes) != len(rows):
                log.info("ignoring column %s: %d codes for %d rows", key, len(codes), len(rows))
                continue
            fill = col.codes[rows] < 0
            col.codes[rows[fill]] = remap[codes[fill]]  # -1 maps to the trailing -1

    def snapshot(self, keys: Iterable[str] | None = None) -> dict:
        with self.lock:
            wanted = list(self.columns) if keys is None else list(keys)
            n = len(self.specs)
            return {
                "format": _FORMAT,
                "key": rules_key(),
                "chains": list(self.specs),
                "columns": {
                    k: (self.column(k).codes[:n].copy(), list(self.columns[k].values))
                    for k in wanted
                    if k in self.columns
                },
            }


def _spec(candidate: Any) -> tuple:
    """A candidate as plain tuples (its row's name in memory and in files): a chain, or a glycan residue."""
    if isinstance(candidate, Chain):
        return ("chain", tuple(candidate.groups), tuple(candidate.sides))
    chain = candidate.chain
    return (
        "residue",
        tuple(chain.groups),
        tuple(chain.sides),
        candidate.ring,
        candidate.anomer,
        tuple(candidate.linked),
    )


def _unspec(spec: tuple) -> Any:
    if spec[0] == "chain":
        return Chain(tuple(spec[1]), tuple(spec[2]))
    from workbench.chem.residue import Residue

    return Residue(Chain(tuple(spec[1]), tuple(spec[2])), spec[3], spec[4], tuple(spec[5]))


def _read(path: Path) -> dict | None:
    """A table file's content, or None when it is unreadable or was made under other rules."""
    try:
        with gzip.open(path, "rb") as fh:
            data = pickle.load(fh)
    except (OSError, EOFError, pickle.UnpicklingError, AttributeError, ImportError, ValueError) as exc:
        log.info("ignoring outcome table %s: %s", path, exc)
        return None
    if not isinstance(data, dict) or data.get("format") != _FORMAT or data.get("key") != rules_key():
        log.info("ignoring outcome table %s: made under other rules", path)
        return None
    return data


def _write(data: dict, path: Path) -> None:
    path.parent.mkdir(parents=True, exist_ok=True)
    tmp = path.with_name(f".{path.name}.{os.getpid()}.tmp")
    try:
        with gzip.open(tmp, "wb", compresslevel=6) as fh:
            pickle.dump(data, fh, protocol=pickle.HIGHEST_PROTOCOL)
        os.replace(tmp, path)
    finally:
        if tmp.exists():
            tmp.unlink()


_STORE = _Store()


def cache_path() -> Path | None:
    """The disk cache file for this version of the rules (None when the cache is off)."""
    if os.environ.get("STEREOSIEVE_CACHE", "").lower() in ("off", "0", "no", "false"):
        return None
    root = os.environ.get("STEREOSIEVE_CACHE_DIR")
    if not root:
        import platformdirs

        root = platformdirs.user_cache_dir("stereosieve", appauthor=False)
    return Path(root) / f"outcomes-{rules_key()}.pkl.gz"


def save(path: Path | None = None, keys: Iterable[str] | None = None) -> Path | None:
    """Write the tables (all columns, or ``keys``) to ``path`` or the disk cache; returns the path."""
    target = path or cache_path()
    if target is None:
        return None
    _write(_STORE.snapshot(keys), target)
    _STORE.dirty = False
    return target


@atexit.register
def _save_at_exit() -> None:
    if not _STORE.dirty:
        return
    try:
        save()
    except OSError as exc:  # a read-only home or a full disk costs only the next start's speed
        log.info("outcome tables not cached: %s", exc)


# ------------------------------------------------------------------ queries
def codes(key: str, chains: Sequence[Chain]) -> tuple[np.ndarray, list[Any]]:
    """Codes of ``chains`` in column ``key`` and the column's values (``values[code]``)."""
    return _STORE.codes(key, chains)


def rows(chains: Sequence[Chain]) -> np.ndarray:
    """The row number of every chain (numbered once per process): compare sets of chains as arrays."""
    with _STORE.lock:
        return _STORE.index(chains)


def values(key: str, chains: Sequence[Chain]) -> list[Any]:
    """The predicted outcome of every chain in column ``key``, in order."""
    got, vals = _STORE.codes(key, chains)
    return [vals[c] for c in got]


def keep(obs: Any, chains: Sequence[Chain], verdict: Callable[[Any, Chain], Any]) -> list[Chain] | None:
    """The chains that ``obs`` keeps, judging each distinct predicted value once.

    ``verdict(obs, chain)`` must depend on the chain only through its
    predicted value (true of :func:`workbench.evidence.outcomes.fits`); it is
    called on one representative chain per value (measured quantities: per
    distinct calibrated estimate). Returns None when the observation has no
    column (the caller then judges every chain).
    """
    judged = verdicts(obs, chains, verdict)
    if judged is None:
        return None
    return [c for c, v in zip(chains, judged, strict=True) if v.fits]


def verdicts(obs: Any, chains: Sequence[Chain], verdict: Callable[[Any, Chain], Any]) -> list[Any] | None:
    """``verdict(obs, chain)`` for every chain, judging each distinct predicted value once.

    Candidates with the same value share one verdict object (its reason may
    name the representative: use it for the outcome, not for wording). None
    when the observation has no column (the caller judges every chain).
    """
    key = _judged_by(obs)
    if key is None or not chains:
        return None
    got, _ = _STORE.codes(key, chains)
    uniq, first = np.unique(got, return_index=True)
    judged = {code: verdict(obs, chains[i]) for code, i in zip(uniq.tolist(), first.tolist(), strict=True)}
    return [judged[code] for code in got.tolist()]


def warm(chains: Sequence[Chain], keys: Iterable[str] | None = None) -> None:
    """Compute the columns ``keys`` (default: :func:`standard_keys`) for ``chains``."""
    for key in keys or standard_keys():
        _STORE.codes(key, chains)
