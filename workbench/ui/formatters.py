"""Rich notebook display of core objects without touching the core: HTML formatters registered with IPython.

``Solution``, ``Project`` and ``Plan`` render as the display layer's HTML in a
notebook once :mod:`workbench.ui` is imported. The core classes stay free of
any IPython import; the formatters are pure functions from the display layer.
"""

from __future__ import annotations

import logging

__all__ = ["register_formatters", "solution_summary"]

log = logging.getLogger(__name__)


def solution_summary(solution) -> str:
    """One line per unknown: how many candidates remain and, for a few, which (the plain-text view)."""
    from workbench.chem.names import display_name

    lines = [
        f"Solution of {solution.project.title!r}" + (" (contradictory evidence)" if solution.contradictory else "")
    ]
    for uid, chains in solution.survivors.items():
        names = ", ".join(display_name(c) for c in chains[:5]) + (", ..." if len(chains) > 5 else "")
        lines.append(f"  {uid}: {len(chains)} of {solution.scope_counts[uid]} left: {names}")
    return "\n".join(lines)


def register_formatters(shell=None) -> bool:
    """Register HTML and text formatters for Solution, Project, Plan and Chain; False when no IPython shell runs."""
    if shell is None:
        from IPython import get_ipython

        shell = get_ipython()
    if shell is None:
        return False
    from workbench.chem.chain import Chain
    from workbench.display.board import solution_html
    from workbench.display.experiments import plan_html
    from workbench.display.fischer import caption_of
    from workbench.display.plain import fischer_text
    from workbench.display.tables import project_html
    from workbench.evidence.engine import Solution
    from workbench.evidence.planner import Plan
    from workbench.evidence.project import Project

    html = shell.display_formatter.formatters["text/html"]
    # markup every notebook sanitiser keeps (Fischer projections in characters): readable untrusted too
    html.for_type(Solution, lambda solution: solution_html(solution, medium="plain"))
    html.for_type(Project, project_html)
    html.for_type(Plan, plan_html)
    plain = shell.display_formatter.formatters["text/plain"]
    plain.for_type(Solution, lambda obj, p, cycle: p.text(solution_summary(obj)))
    plain.for_type(
        Project,
        lambda obj, p, cycle: p.text(
            f"Project {obj.title!r}: {len(obj.unknowns)} unknown(s), {len(obj.observations)} observation(s)"
        ),
    )
    plain.for_type(Plan, lambda obj, p, cycle: p.text(f"Plan: {len(obj.experiments)} experiment(s) ranked"))
    # where the SVG drawing is not shown (untrusted, plain viewers) the chain reads as a Fischer projection
    plain.for_type(Chain, lambda obj, p, cycle: p.text(f"{caption_of(obj)}\n{fischer_text(obj)}"))
    log.debug("registered HTML formatters for Solution, Project and Plan")
    return True
