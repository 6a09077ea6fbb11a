"""Minimal conflicting sets of observations (minimal unsatisfiable subsets).

When the evidence admits no assignment, the user wants to know which
observations cannot all hold. :func:`minimal_conflict` finds one minimal set
by divide and conquer (QuickXplain: U. Junker, AAAI 2004, 167-172): it needs
about ``k log2(n / k)`` consistency checks for a conflict of ``k`` among
``n`` observations instead of the ``n`` checks of deletion one by one.
:func:`conflict_sets` finds several, each time blocking members of the sets
found so far, within a budget of consistency checks so that a large ledger
never stalls the engine.

The functions are generic: they take the observations and a ``consistent``
predicate (in practice :func:`workbench.evidence.engine.is_consistent` bound
to a project), so they know nothing of chemistry.
"""

from __future__ import annotations

from collections.abc import Callable, Sequence
from typing import TypeVar

__all__ = ["Progress", "MAX_SETS", "MAX_CHECKS", "minimal_conflict", "conflict_sets"]

T = TypeVar("T")

#: ``progress(sets_found, checks_made)`` after every consistency check.
Progress = Callable[[int, int], None]

MAX_SETS = 6  # conflicting sets reported at most
MAX_CHECKS = 400  # consistency checks spent looking for further sets after the first


class _Counter:
    """Counts the consistency checks made and reports them to ``progress``."""

    def __init__(self, consistent: Callable[[list[T]], bool], progress: Progress | None) -> None:
        self.consistent = consistent
        self.progress = progress
        self.checks = 0
        self.found = 0

    def __call__(self, items: list) -> bool:
        self.checks += 1
        ok = self.consistent(items)
        if self.progress is not None:
            self.progress(self.found, self.checks)
        return ok


def _quickxplain(check: Callable[[list[T]], bool], background: list[T], candidates: list[T]) -> list[T]:
    """A minimal subset of ``candidates`` inconsistent together with ``background``.

    Requires ``background + candidates`` inconsistent and ``background``
    consistent. Recursion depth is at most about log2(len(candidates)).
    """

    def split(base: list[T], delta_nonempty: bool, items: list[T]) -> list[T]:
        if delta_nonempty and not check(base):
            return []
        if len(items) == 1:
            return list(items)
        half = len(items) // 2
        first, second = items[:half], items[half:]
        d2 = split(base + first, bool(first), second)
        d1 = split(base + d2, bool(d2), first)
        return d1 + d2

    return split(list(background), False, list(candidates))


def minimal_conflict(
    items: Sequence[T],
    consistent: Callable[[list[T]], bool],
    progress: Progress | None = None,
) -> list[T]:
    """One minimal inconsistent subset of ``items`` (which must be inconsistent), in their order.

    Minimal: dropping any one member leaves a consistent set.
    """
    order = {id(x): i for i, x in enumerate(items)}
    core = _quickxplain(_Counter(consistent, progress), [], list(items))
    return sorted(core, key=lambda x: order[id(x)])


def conflict_sets(
    items: Sequence[T],
    consistent: Callable[[list[T]], bool],
    key: Callable[[T], str],
    limit: int = MAX_SETS,
    budget: int = MAX_CHECKS,
    progress: Progress | None = None,
) -> list[tuple[str, ...]]:
    """Up to ``limit`` distinct minimal conflicting sets of ``items``, as tuples of ``key`` values.

    The first set is always found; further ones come from blocking (leaving
    out) one, two or three members of the sets found, breadth first, until
    ``limit`` sets are found or ``budget`` consistency checks are spent.
    """
    counter = _Counter(consistent, progress)
    order = {id(x): i for i, x in enumerate(items)}

    def core_of(pool: list[T]) -> tuple[str, ...]:
        found = _quickxplain(counter, [], pool)
        return tuple(key(x) for x in sorted(found, key=lambda x: order[id(x)]))

    first = core_of(list(items))
    found = [first]
    counter.found = 1
    spent = counter.checks
    frontier = [[k] for k in first]
    seen: set[frozenset[str]] = set()
    while frontier and len(found) < limit and counter.checks - spent < budget:
        block = frozenset(frontier.pop(0))
        if block in seen or len(block) > 3:
            continue
        seen.add(block)
        rest = [x for x in items if key(x) not in block]
        if counter(rest):
            continue
        core = core_of(rest)
        if core not in found:
            found.append(core)
            counter.found = len(found)
        frontier += [sorted(block | {k}) for k in core]
    return found
