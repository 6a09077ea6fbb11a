"""The state behind every panel: one project, its file, the what-if switches, the current solution.

A :class:`Session` holds no widgets and does no chemistry: each change builds
a new immutable :class:`~workbench.evidence.project.Project` (validated by the
core) and calls the core solver once; panels subscribe and redraw. Files are
written with the core's atomic :func:`~workbench.evidence.project.save_project`.
"""

from __future__ import annotations

import logging
import os
import re
from collections.abc import Callable, Iterable, Mapping
from pathlib import Path
from typing import Any

from workbench.chem.catalogue import Scope
from workbench.errors import ObservationError, ProjectError, WorkbenchError
from workbench.evidence import engine
from workbench.evidence.observations import Observation, observation_from_dict
from workbench.evidence.project import Project, load_project, project_from_dict, save_project

__all__ = ["Session", "SessionError"]

log = logging.getLogger(__name__)

Listener = Callable[["Session"], None]


class SessionError(WorkbenchError, ValueError):
    """An action on the open project that cannot be done (the message says why)."""


class Session:
    """One open project with its solution, shared by all panels of a workbench.

    ``disabled`` holds ids of observations switched off for a what-if; they
    stay in the project (and in the file) but the solver ignores them.
    """

    def __init__(self, project: Project, path: str | os.PathLike[str] | None = None) -> None:
        self.project = project
        self.path: Path | None = Path(path) if path is not None else None
        self.disabled: frozenset[str] = frozenset()
        self.dirty = False
        self.trash: list[Observation] = []
        self._listeners: list[Listener] = []
        self.solution = self._solve()

    # ------------------------------------------------------------ construction
    @classmethod
    def open(cls, path: str | os.PathLike[str]) -> Session:
        """A session on the project file at ``path`` (validated by the core)."""
        return cls(load_project(path), path)

    # ------------------------------------------------------------ observers
    def subscribe(self, listener: Listener) -> None:
        """Call ``listener(session)`` after every change."""
        self._listeners.append(listener)

    def _changed(self, dirty: bool = True) -> None:
        self.dirty = self.dirty or dirty
        self.solution = self._solve()
        for listener in list(self._listeners):
            listener(self)

    def _solve(self):
        off = tuple(sorted(self.disabled & {o.id for o in self.project.observations}))
        return engine.solve(self.project, disabled=off)

    def _replace(self, data: Mapping[str, Any]) -> None:
        """Validate a whole project dict with the core and make it current."""
        self.project = project_from_dict(data, source=str(self.path or "<workbench>"))
        self._changed()

    # ------------------------------------------------------------ evidence
    def check(self, data: Mapping[str, Any]) -> Observation:
        """The observation ``data`` describes, validated against this project.

        Raises :class:`~workbench.errors.ObservationError` naming the field at
        fault: bad values (from the observation type) and references to
        unknowns or sugars that do not exist (from the project loader).
        """
        obs = observation_from_dict(dict(data))
        try:
            project_from_dict(self.project.with_observation(obs).to_dict(), source="entry")
        except ProjectError as err:
            mine = [p for p in err.problems if p.startswith(f"observation {obs.id}")] or err.problems
            first = mine[0]
            found = re.search(r"field '(\w+)'", first)
            problem = first.split(": ", 1)[1] if ": " in first else first
            raise ObservationError(obs.id, found.group(1) if found else None, problem) from err
        return obs

    def record(self, data: Mapping[str, Any] | Observation) -> Observation:
        """Add an observation (or replace the one with the same id); returns it."""
        obs = self.check(data.to_dict() if isinstance(data, Observation) else data)
        self.project = self.project.with_observation(obs)
        self._changed()
        return obs

    def delete(self, oid: str) -> Observation:
        """Remove an observation; it goes to :attr:`trash` so :meth:`undo_delete` can bring it back."""
        obs = self._observation(oid)
        self.trash.append(obs)
        self.project = self.project.without(oid)
        self.disabled = self.disabled - {oid}
        self._changed()
        return obs

    def undo_delete(self) -> Observation:
        """Put the most recently deleted observation back (at the end of the ledger)."""
        if not self.trash:
            raise SessionError("nothing to undo: no observation was deleted in this session")
        obs = self.trash.pop()
        if obs.id in {o.id for o in self.project.observations}:
            raise SessionError(f"cannot restore {obs.id}: the id is in use again; rename the newer one first")
        self.project = self.project.with_observation(obs)
        self._changed()
        return obs

    def set_enabled(self, oid: str, enabled: bool) -> None:
        """Switch an observation on or off for a what-if (the file keeps it either way)."""
        self._observation(oid)
        new = self.disabled - {oid} if enabled else self.disabled | {oid}
        if new != self.disabled:
            self.disabled = new
            self._changed(dirty=False)

    def set_disabled(self, ids: Iterable[str]) -> None:
        """Switch exactly ``ids`` off (every other observation on)."""
        ids = frozenset(ids)
        for oid in ids:
            self._observation(oid)
        if ids != self.disabled:
            self.disabled = ids
            self._changed(dirty=False)

    def _observation(self, oid: str) -> Observation:
        try:
            return self.project.observation(oid)
        except KeyError:
            ids = ", ".join(o.id for o in self.project.observations) or "none"
            raise SessionError(f"no observation has id {oid!r} (ids: {ids})") from None

    # ------------------------------------------------------------ project
    def set_title(self, title: str) -> None:
        """Change the project title."""
        if title != self.project.title:
            data = self.project.to_dict()
            data["title"] = title
            self._replace(data)

    def set_unknown(self, uid: str, label: str = "", scope: Mapping[str, Any] | Scope | None = None) -> None:
        """Add an unknown, or change the label and scope of an existing one."""
        uid = uid.strip()
        if not uid:
            raise SessionError("an unknown needs an id such as U1")
        if isinstance(scope, Scope):
            scope = scope.to_dict()
        data = self.project.to_dict()
        entry: dict[str, Any] = {"id": uid}
        if label:
            entry["label"] = label
        if scope is not None:
            entry["scope"] = dict(scope)
        rows = data["unknowns"]
        for i, row in enumerate(rows):
            if row["id"] == uid:
                if scope is None and "scope" in row:
                    entry["scope"] = row["scope"]
                rows[i] = entry
                break
        else:
            rows.append(entry)
        self._replace(data)

    def remove_unknown(self, uid: str) -> None:
        """Remove an unknown that no observation refers to."""
        users = [o.id for o in self.project.observations if uid in o.references()]
        if users:
            raise SessionError(f"unknown {uid} is used by {', '.join(users)}; delete or edit those first")
        data = self.project.to_dict()
        data["unknowns"] = [u for u in data["unknowns"] if u["id"] != uid]
        if not data["unknowns"]:
            raise SessionError("a project needs at least one unknown")
        self._replace(data)

    # ------------------------------------------------------------ files
    def save(self, path: str | os.PathLike[str] | None = None) -> Path:
        """Write the project (atomically) to ``path`` or to the file it came from."""
        target = Path(path) if path else self.path
        if target is None:
            raise SessionError("no file name yet: type one (e.g. my_project.json) and save again")
        if not target.parent.is_dir():
            raise SessionError(f"{target}: the folder {target.parent} does not exist")
        save_project(self.project, target)
        self.path = target
        self.dirty = False
        for listener in list(self._listeners):
            listener(self)
        log.info("saved %s", target)
        return target

    def load(self, path: str | os.PathLike[str]) -> None:
        """Replace the open project with the file at ``path`` (the old one is kept if this fails)."""
        project = load_project(path)
        self.project = project
        self.path = Path(path)
        self.disabled = frozenset()
        self.trash = []
        self.dirty = False
        self._changed(dirty=False)

    # ------------------------------------------------------------ planning
    def plan(self, unknown: str | None = None, lookahead: bool = False, ranking: str = "value"):
        """The planner's ranking for the current evidence (what-if switches respected)."""
        from workbench.evidence.planner import plan

        return plan(self.project, unknown=unknown, lookahead=lookahead, ranking=ranking, solution=self.solution)
