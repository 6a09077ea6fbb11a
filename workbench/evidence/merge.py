"""The union of two collaborators' project files (``stereosieve merge``).

Both files are validated first. Unknowns and observations equal in content
are kept once; an id that holds different content in the two files is a
clash, and every clash is named at once (:class:`MergeError`). The merged
project keeps the first file's order, then the second file's new entries in
their order; the title is the first file's (or the second's if the first has
none).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from typing import Any

from workbench.errors import WorkbenchError
from workbench.evidence.project import Project, project_from_dict

__all__ = ["Clash", "MergeError", "Merged", "merge_projects"]


@dataclass(frozen=True)
class Clash:
    """One id that holds different content in the two files; ``fields`` lists what differs."""

    what: str  # "unknown" or "observation"
    id: str
    fields: tuple[str, ...]

    def describe(self) -> str:
        """E.g. ``observation E3: value: 3.4 in a.json, 3.5 in b.json``."""
        return f"{self.what} {self.id}: {'; '.join(self.fields)}"


class MergeError(WorkbenchError, ValueError):
    """The two files disagree on the content of one or more ids (named in the message)."""

    def __init__(self, first: str, second: str, clashes: Sequence[Clash]) -> None:
        self.clashes = tuple(clashes)
        listed = ", ".join(f"{c.what} {c.id}" for c in self.clashes)
        detail = "\n".join(f"  {c.describe()}" for c in self.clashes)
        super().__init__(
            f"cannot merge {first} and {second}: {len(self.clashes)} id(s) hold different content in each: {listed}\n"
            f"{detail}\nGive one of each pair a new id (or make them equal) and merge again."
        )


@dataclass(frozen=True)
class Merged:
    """The merged project and what the merge did: entries kept once, entries added from the second file."""

    project: Project
    shared: tuple[str, ...]
    added: tuple[str, ...]
    notes: tuple[str, ...]


def _fields(a: dict[str, Any], b: dict[str, Any], first: str, second: str) -> tuple[str, ...]:
    """The keys whose values differ between two project-file entries, with both values."""
    out = []
    for key in sorted(set(a) | set(b)):
        if a.get(key) != b.get(key):
            shown_a = repr(a[key]) if key in a else "absent"
            shown_b = repr(b[key]) if key in b else "absent"
            out.append(f"{key}: {shown_a} in {first}, {shown_b} in {second}")
    return tuple(out)


def merge_projects(first: Any, second: Any, names: tuple[str, str] = ("the first file", "the second file")) -> Merged:
    """Merge two parsed project files; :class:`~workbench.errors.ProjectError` or :class:`MergeError` on bad input."""
    a = project_from_dict(first, names[0])
    b = project_from_dict(second, names[1])
    clashes: list[Clash] = []
    shared: list[str] = []
    added: list[str] = []

    def union(what: str, mine: tuple, theirs: tuple) -> list:
        """Entries of ``mine``, then those of ``theirs`` with a new id; equal ids must hold equal content."""
        out = list(mine)
        by_id = {e.id: e for e in mine}
        for entry in theirs:
            known = by_id.get(entry.id)
            if known is None:
                out.append(entry)
                added.append(entry.id)
            elif known == entry:
                shared.append(entry.id)
            else:
                clashes.append(Clash(what, entry.id, _fields(known.to_dict(), entry.to_dict(), *names)))
        return out

    unknowns = union("unknown", a.unknowns, b.unknowns)
    observations = union("observation", a.observations, b.observations)
    if clashes:
        raise MergeError(names[0], names[1], clashes)
    notes = []
    title = a.title or b.title
    if a.title and b.title and a.title != b.title:
        notes.append(f"the titles differ; kept {a.title!r} from {names[0]} (not {b.title!r})")
    merged = Project(title, tuple(unknowns), tuple(observations))
    # Validate the union as a whole (every reference resolves) through the same loader as any file.
    project = project_from_dict(merged.to_dict(), "the merged project")
    return Merged(project, tuple(shared), tuple(added), tuple(notes))
