"""The one error tree of stereosieve.

Every failure the user can cause raises a subclass of :class:`WorkbenchError`.
Subclasses also inherit the matching built-in (``ValueError``) so that callers
who know nothing of stereosieve can still catch them.
"""

from __future__ import annotations

__all__ = [
    "WorkbenchError",
    "StructureError",
    "NameNotRecognisedError",
    "ScopeError",
    "ProjectError",
    "ObservationError",
    "ContradictionError",
    "CurveFileError",
    "FitError",
]


class WorkbenchError(Exception):
    """Root of every error stereosieve raises on purpose."""


class StructureError(WorkbenchError, ValueError):
    """A structure that is not a monosaccharide chain stereosieve can model."""


class NameNotRecognisedError(WorkbenchError, ValueError):
    """A sugar name or SMILES that resolves to no structure.

    ``suggestions`` holds close names the user may have meant.
    """

    def __init__(self, text: str, reason: str, suggestions: tuple[str, ...] = ()) -> None:
        self.text = text
        self.reason = reason
        self.suggestions = tuple(suggestions)
        hint = f" Did you mean: {', '.join(self.suggestions)}?" if self.suggestions else ""
        super().__init__(f"{text!r} is not a sugar stereosieve knows: {reason}.{hint}")


class ScopeError(WorkbenchError, ValueError):
    """A scope (chain lengths, carbonyl, series, modifications) that makes no sense."""


class ObservationError(WorkbenchError, ValueError):
    """One observation with a bad field; names the observation id and the field."""

    def __init__(self, observation_id: str | None, field: str | None, problem: str) -> None:
        self.observation_id = observation_id
        self.field = field
        self.problem = problem
        where = []
        if observation_id:
            where.append(f"observation {observation_id}")
        if field:
            where.append(f"field '{field}'")
        prefix = (", ".join(where) + ": ") if where else ""
        super().__init__(prefix + problem)


class ProjectError(WorkbenchError, ValueError):
    """A project file that cannot be used; ``problems`` lists one message per fault."""

    def __init__(self, source: str, problems: list[str]) -> None:
        self.source = source
        self.problems = list(problems)
        lines = "\n".join(f"  - {p}" for p in self.problems)
        super().__init__(f"{source}: {len(self.problems)} problem(s)\n{lines}")


class ContradictionError(WorkbenchError):
    """The evidence admits no assignment; ``conflicts`` lists minimal sets of ids."""

    def __init__(self, conflicts: list[list[str]]) -> None:
        self.conflicts = conflicts
        sets = "; ".join("{" + ", ".join(c) + "}" for c in conflicts)
        super().__init__(f"the evidence is contradictory: {sets}")


class CurveFileError(WorkbenchError, ValueError):
    """A measurement file (e.g. a polarimetry CSV) that cannot be read; names the file and line."""

    def __init__(self, source: str, line: int | None, problem: str) -> None:
        self.source = source
        self.line = line
        self.problem = problem
        where = f"{source}, line {line}" if line is not None else source
        super().__init__(f"{where}: {problem}")


class FitError(WorkbenchError, ValueError):
    """Data that cannot be fitted by the model asked for (too few points, no change, no convergence)."""
