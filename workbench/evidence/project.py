"""The project: unknowns with their scopes and the evidence ledger (Contract 1).

:func:`project_from_dict` validates completely and reports every problem at
once (one message per fault, naming the observation id or field).
:func:`load_project` and :func:`save_project` are the only file I/O here;
saving writes a temporary file and then replaces the target, so a failure
never destroys what the user saved before.
"""

from __future__ import annotations

import json
import os
from collections.abc import Mapping
from dataclasses import dataclass, field, replace
from functools import cached_property
from typing import TYPE_CHECKING, Any

from workbench.chem.catalogue import DEFAULT_SCOPE, Scope, catalogue
from workbench.chem.chain import Chain
from workbench.chem.parse import resolve
from workbench.chem.residue import DEFAULT_RESIDUE_SCOPE, ResidueScope
from workbench.errors import NameNotRecognisedError, ObservationError, ProjectError, ScopeError
from workbench.escaping import line_breaker
from workbench.evidence.observations import Observation, observation_from_dict
from workbench.files import write_text_atomic
from workbench.inputs import check_tree, read_project_json, show

if TYPE_CHECKING:
    import pandas as pd

__all__ = [
    "FORMAT",
    "VERSION",
    "Unknown",
    "Project",
    "project_from_dict",
    "load_project",
    "save_project",
    "dumps_project",
]

FORMAT = "stereosieve-project"
VERSION = 1
UNKNOWN_TYPES = ("monosaccharide", "residue")
_TOP_KEYS = {"format", "version", "title", "unknowns", "observations"}


@dataclass(frozen=True)
class Unknown:
    """A compound whose structure is sought, with the scope it may come from."""

    id: str
    label: str = ""
    scope: Scope = DEFAULT_SCOPE
    scope_given: bool = field(default=False, compare=False)
    type: str = "monosaccharide"  # or "residue": one residue type of a glycan (Contract 5)

    @property
    def is_residue(self) -> bool:
        """True for a glycan residue unknown (candidates are :class:`~workbench.chem.residue.Residue`)."""
        return self.type == "residue"

    def to_dict(self) -> dict[str, Any]:
        """Project-file form."""
        out: dict[str, Any] = {"id": self.id}
        if self.label:
            out["label"] = self.label
        if self.is_residue:
            out["type"] = self.type
        if self.scope_given or self.scope != DEFAULT_SCOPE:
            out["scope"] = self.scope.to_dict()
        return out


@dataclass(frozen=True)
class Project:
    """Title, unknowns and observations (in the order they were recorded)."""

    title: str
    unknowns: tuple[Unknown, ...]
    observations: tuple[Observation, ...] = ()

    @cached_property
    def unknown_ids(self) -> tuple[str, ...]:
        """Ids of the unknowns in file order."""
        return tuple(u.id for u in self.unknowns)

    def unknown(self, uid: str) -> Unknown:
        """The unknown with id ``uid``."""
        for u in self.unknowns:
            if u.id == uid:
                return u
        raise KeyError(uid)

    def observation(self, oid: str) -> Observation:
        """The observation with id ``oid``."""
        for o in self.observations:
            if o.id == oid:
                return o
        raise KeyError(oid)

    def member(self, text: str) -> str | Chain:
        """An unknown's id as is, or the structure of a known sugar."""
        if text in self.unknown_ids:
            return text
        return resolve(text)

    def with_observation(self, obs: Observation) -> Project:
        """A new project with ``obs`` added (or replacing the one with its id)."""
        kept = tuple(o for o in self.observations if o.id != obs.id)
        if len(kept) == len(self.observations):
            return replace(self, observations=self.observations + (obs,))
        return replace(self, observations=tuple(obs if o.id == obs.id else o for o in self.observations))

    def without(self, *ids: str) -> Project:
        """A new project without the observations ``ids``."""
        return replace(self, observations=tuple(o for o in self.observations if o.id not in ids))

    def next_id(self, prefix: str = "E") -> str:
        """A fresh observation id such as ``E7``."""
        used = {o.id for o in self.observations}
        k = len(self.observations) + 1
        while f"{prefix}{k}" in used:
            k += 1
        return f"{prefix}{k}"

    def to_dict(self) -> dict[str, Any]:
        """Project-file form (Contract 1)."""
        return {
            "format": FORMAT,
            "version": VERSION,
            "title": self.title,
            "unknowns": [u.to_dict() for u in self.unknowns],
            "observations": [o.to_dict() for o in self.observations],
        }

    def to_frame(self) -> pd.DataFrame:
        """The ledger as a DataFrame, one row per observation (:func:`workbench.frames.observations_frame`)."""
        from workbench.frames import observations_frame

        return observations_frame(self)


def _unknown_from(data: Any, index: int, problems: list[str]) -> Unknown | None:
    where = f"unknowns[{index}]"
    if not isinstance(data, Mapping):
        problems.append(f"{where}: expected an object with 'id', got {type(data).__name__}")
        return None
    uid = data.get("id")
    if not isinstance(uid, str) or not uid.strip():
        problems.append(f"{where}: field 'id' must be a non-empty text, got {show(uid)}")
        return None
    bad = line_breaker(uid)
    if bad is not None:
        problems.append(f"{where}: field 'id' must be one line without control characters; {show(uid)} holds {bad}")
        return None
    extra = sorted(set(data) - {"id", "label", "scope", "type"})
    if extra:
        problems.append(f"unknown {uid}: field {show(extra[0])} is not known; use id, label, type, scope")
    kind = data.get("type", "monosaccharide")
    if not isinstance(kind, str) or kind not in UNKNOWN_TYPES:
        problems.append(f"unknown {uid}: field 'type' must be one of {', '.join(UNKNOWN_TYPES)}, got {show(kind)}")
        kind = "monosaccharide"
    label = data.get("label", "")
    if not isinstance(label, str):
        problems.append(f"unknown {uid}: field 'label' must be text")
        label = ""
    scope: Scope = DEFAULT_RESIDUE_SCOPE if kind == "residue" else DEFAULT_SCOPE
    if "scope" in data:
        if not isinstance(data["scope"], Mapping):
            problems.append(f"unknown {uid}: field 'scope' must be an object")
        elif _scope_problems(data["scope"]):
            problems.extend(f"unknown {uid}: {p}" for p in _scope_problems(data["scope"]))
        else:
            try:
                reader = ResidueScope if kind == "residue" else Scope
                scope = reader.from_dict(dict(data["scope"]))
            except ScopeError as err:
                problems.append(f"unknown {uid}: {err}")
    if not catalogue(scope):
        problems.append(f"unknown {uid}: the scope {scope.to_dict()} holds no candidate; widen it")
    return Unknown(uid.strip(), label, scope, scope_given="scope" in data, type=kind)


_SCOPE_TYPES = {"carbons": int, "carbonyl": str, "series": str, "modifications": str}


def _scope_problems(scope: Mapping) -> list[str]:
    """Type faults in a scope object (lists of whole numbers or texts), before the catalogue reads it."""
    out = []
    for key, kind in _SCOPE_TYPES.items():
        value = scope.get(key)
        if not isinstance(value, list):
            continue
        for item in value:
            if isinstance(item, bool) or not isinstance(item, kind):
                wanted = "whole numbers" if kind is int else "texts"
                out.append(f"scope '{key}' must list {wanted}, got {show(item)}")
                break
    return out


def project_from_dict(data: Any, source: str = "<project>") -> Project:
    """Validate a parsed project file; raise :class:`ProjectError` listing every problem."""
    problems: list[str] = []
    if not isinstance(data, Mapping):
        raise ProjectError(source, [f"the file must hold one JSON object, not {type(data).__name__}"])
    tree_problems = check_tree(data)
    if tree_problems:
        raise ProjectError(source, tree_problems)
    fmt = data.get("format")
    if fmt != FORMAT:
        problems.append(f"field 'format' must be {FORMAT!r}, got {show(fmt)}")
    version = data.get("version")
    if isinstance(version, bool) or not isinstance(version, int):
        problems.append(f"field 'version' must be a whole number, got {show(version)}")
    elif version > VERSION:
        problems.append(f"version {version} is newer than this stereosieve reads (up to {VERSION}); please upgrade")
    elif version < 1:
        problems.append(f"field 'version' must be 1 or more, got {version}")
    for key in sorted(set(data) - _TOP_KEYS):
        problems.append(f"top-level field {show(key)} is not known; use {', '.join(sorted(_TOP_KEYS))}")
    title = data.get("title", "")
    if not isinstance(title, str):
        problems.append("field 'title' must be text")
        title = ""
    raw_unknowns = data.get("unknowns")
    unknowns: list[Unknown] = []
    if not isinstance(raw_unknowns, list) or not raw_unknowns:
        problems.append("field 'unknowns' must be a non-empty list of objects with an 'id'")
    else:
        for i, item in enumerate(raw_unknowns):
            u = _unknown_from(item, i, problems)
            if u is None:
                continue
            if any(v.id == u.id for v in unknowns):
                problems.append(f"unknown id {u.id!r} is used twice")
                continue
            unknowns.append(u)
    ids = {u.id for u in unknowns}
    raw_obs = data.get("observations", [])
    observations: list[Observation] = []
    if not isinstance(raw_obs, list):
        problems.append("field 'observations' must be a list")
        raw_obs = []
    seen: set[str] = set()
    resolved: dict[str, str | None] = {}
    for i, item in enumerate(raw_obs):
        try:
            obs = observation_from_dict(item)
        except ObservationError as err:
            problems.append(f"observations[{i}]: {err}" if err.observation_id is None else str(err))
            continue
        if obs.id in seen:
            problems.append(f"observation {obs.id}: the id is used twice")
            continue
        seen.add(obs.id)
        problems.extend(_reference_problems(obs, ids, resolved))
        problems.extend(_residue_problems(obs, {u.id for u in unknowns if u.is_residue}))
        observations.append(obs)
    if problems:
        raise ProjectError(source, problems)
    return Project(title, tuple(unknowns), tuple(observations))


# Kinds that only make sense for a residue in a polymer, and kinds that compare free sugars' products.
RESIDUE_KINDS = ("methylation_analysis", "smith_degradation", "anomer", "ring_form", "molar_ratio")
_SUGAR_RELATIONS = ("same_product", "chain_extension", "chain_shortening")


def _residue_problems(obs: Observation, residues: set[str]) -> list[str]:
    """Messages for residue kinds on monosaccharide unknowns and sugar relations on residues."""
    refs = [r for r in obs.references()]
    if obs.KIND in RESIDUE_KINDS or (obs.KIND == "periodate" and obs.substrate == "residue"):
        wrong = [r for r in refs if r not in residues]
        if wrong:
            what = f"{obs.KIND} with substrate residue" if obs.KIND == "periodate" else obs.KIND
            return [f"observation {obs.id}: {what} needs residue unknowns ('type': 'residue'); {wrong[0]!r} is not one"]
    elif obs.KIND == "different" and 0 < sum(r in residues for r in refs) < len(refs):
        return [f"observation {obs.id}: different mixes residue unknowns with sugars; compare like with like"]
    elif obs.KIND in _SUGAR_RELATIONS:
        wrong = [r for r in refs if r in residues]
        if wrong:
            return [
                f"observation {obs.id}: {obs.KIND} compares free sugars; {wrong[0]!r} is a residue unknown "
                "(record the sugar released by hydrolysis as a monosaccharide unknown instead)"
            ]
    return []


def _reference_problems(obs: Observation, ids: set[str], cache: dict[str, str | None]) -> list[str]:
    """Messages for references to missing unknowns or unknown sugar names."""
    out = []
    for spec in obs.SPECS:
        value = getattr(obs, spec.name)
        if spec.type == "unknown" and value not in ids:
            out.append(
                f"observation {obs.id}, field '{spec.name}': no unknown has id {value!r} (ids: {', '.join(sorted(ids))})"
            )
        elif spec.type in ("member", "members"):
            for member in value if spec.type == "members" else (value,):
                if member in ids:
                    continue
                if member not in cache:
                    try:
                        resolve(member)
                        cache[member] = None
                    except NameNotRecognisedError as err:
                        cache[member] = str(err)
                if cache[member]:
                    out.append(
                        f"observation {obs.id}, field '{spec.name}': {member!r} is neither an unknown id "
                        f"({', '.join(sorted(ids))}) nor a known sugar: {cache[member]}"
                    )
    return out


def load_project(path: str | os.PathLike[str]) -> Project:
    """Read and validate a project file; :class:`ProjectError` names the file and each problem.

    The file passes :mod:`workbench.inputs` first (file type, size,
    depth, number and text limits).
    """
    return project_from_dict(read_project_json(path), str(path))


def dumps_project(project: Project) -> str:
    """The project file text (UTF-8 JSON, two-space indent)."""
    return json.dumps(project.to_dict(), indent=2, ensure_ascii=False) + "\n"


def save_project(project: Project, path: str | os.PathLike[str]) -> None:
    """Write ``project`` to ``path`` atomically (temporary file, then replace)."""
    write_text_atomic(path, dumps_project(project))
