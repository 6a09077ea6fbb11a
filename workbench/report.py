"""The shareable HTML report of a project: one self-contained file, no scripts, no external links.

:func:`render_report` is pure (objects in, ``str`` out) and built from the
display layer (:mod:`workbench.display`); :func:`write_report` is the file
edge: it writes a temporary file beside the target and then replaces the
target, so a failed write never leaves half a report or destroys the old one.
"""

from __future__ import annotations

import datetime as _dt
import logging
import os
from pathlib import Path

from workbench import __version__
from workbench.chem.names import display_name
from workbench.display.board import board_html
from workbench.display.chart import narrowing_chart
from workbench.display.experiments import SAFETY_DEFERRAL, plan_html
from workbench.display.palette import ACCENT, CONFLICT, FONT, INK, MUTED, esc
from workbench.display.tables import conflicts_html, ledger_html, project_html, trail_html
from workbench.errors import WorkbenchError
from workbench.files import write_text_atomic

__all__ = ["ReportError", "render_report", "write_report"]

log = logging.getLogger(__name__)

_PAGE_CSS = f"""
body {{ font-family: {FONT}; color: {INK}; max-width: 1100px; margin: 24px auto; padding: 0 18px;
       background: #ffffff; line-height: 1.35; }}
h1 {{ color: {ACCENT}; font-size: 22px; margin-bottom: 2px; }}
h2 {{ color: {ACCENT}; font-size: 17px; border-bottom: 1px solid #d9d5cb; padding-bottom: 2px; margin-top: 26px; }}
.ss-meta {{ color: {MUTED}; font-size: 12px; }}
.ss-summary li {{ margin: 2px 0; }}
@media print {{ details {{ display: block; }} .ss-card {{ break-inside: avoid; }} }}
"""


class ReportError(WorkbenchError, ValueError):
    """The report cannot be written where asked; the message names the path and the fix."""


def _summary(solution) -> str:
    items = []
    for uid in solution.project.unknown_ids:
        survivors = solution.survivors[uid]
        unknown = solution.project.unknown(uid)
        label = f" ({unknown.label})" if unknown.label else ""
        if len(survivors) == 1:
            verdict = f"assigned as <b>{esc(display_name(survivors[0]))}</b>"
        elif not survivors:
            verdict = f'<b style="color:{CONFLICT}">no candidate fits all the evidence</b>'
        else:
            names = ", ".join(display_name(c) for c in survivors[:6])
            more = f" and {len(survivors) - 6} more" if len(survivors) > 6 else ""
            verdict = f"{len(survivors)} candidates remain: {esc(names)}{esc(more)}"
        items.append(
            f"<li><b>{esc(uid)}</b>{esc(label)}: {verdict} "
            f'<span class="ss-meta">(of {solution.scope_counts[uid]} in scope)</span></li>'
        )
    return f'<ul class="ss-summary">{"".join(items)}</ul>'


def render_report(project, solution, plan=None, generated: str | None = None) -> str:
    """A complete HTML document for ``project`` solved as ``solution``, with ``plan`` if given.

    Sections: summary, conflicts, unknowns, evidence ledger, narrowing (chart
    and table), each unknown's survivors (Fischer projections) and eliminated
    candidates with reasons, next experiments with cautions. ``generated`` is
    the time stamp to print (default: now, ISO 8601, to the minute).
    """
    stamp = generated or _dt.datetime.now().astimezone().isoformat(timespec="minutes")
    title = project.title or "(untitled project)"
    parts = [
        "<!DOCTYPE html>",
        '<html lang="en"><head><meta charset="utf-8">',
        '<meta name="viewport" content="width=device-width, initial-scale=1">',
        f'<meta name="generator" content="stereosieve {esc(__version__)}">',
        f"<title>{esc(title)} - stereosieve report</title>",
        f"<style>{_PAGE_CSS}</style></head><body>",
        f"<h1>{esc(title)}</h1>",
        f'<div class="ss-meta">stereosieve {esc(__version__)} report, generated {esc(stamp)}'
        + (f"; what-if with {esc(', '.join(solution.disabled))} switched off" if solution.disabled else "")
        + "</div>",
        "<h2>Summary</h2>",
        _summary(solution),
    ]
    if solution.contradictory:
        parts += ["<h2>Contradictions</h2>", conflicts_html(solution)]
    parts += ["<h2>Unknowns</h2>", project_html(project)]
    parts += ["<h2>Evidence ledger</h2>", ledger_html(project, solution)]
    parts += ["<h2>Narrowing</h2>", narrowing_chart(solution), trail_html(solution)]
    parts.append("<h2>Candidates</h2>")
    for uid in project.unknown_ids:
        parts.append(board_html(solution, uid, limit=48, eliminated_open=True))
    if plan is not None:
        parts += ["<h2>Next experiments</h2>", plan_html(plan)]
    parts.append(
        f'<p class="ss-meta" style="margin-top:28px">Predictions are computed from the structures; eliminations '
        f"follow from the recorded evidence only. {esc(SAFETY_DEFERRAL)}</p>"
    )
    parts.append("</body></html>")
    return "\n".join(parts) + "\n"


def write_report(text: str, path: str | os.PathLike[str], protect: tuple[str | os.PathLike[str], ...] = ()) -> Path:
    """Write ``text`` to ``path`` atomically; refuse to overwrite any file in ``protect``.

    Raises :class:`ReportError` when the folder does not exist, the path is a
    folder, or the path is a protected file (such as the project itself).
    """
    target = Path(path)
    if target.is_dir():
        raise ReportError(f"{target}: is a folder; give a file name such as {target / 'report.html'}")
    folder = target.parent if str(target.parent) else Path(".")
    if not folder.is_dir():
        raise ReportError(f"{target}: the folder {folder} does not exist; create it or choose another path")
    for other in protect:
        if Path(other).exists() and target.exists() and target.resolve() == Path(other).resolve():
            raise ReportError(f"{target}: refusing to overwrite the project file with the report; choose another name")
    try:
        write_text_atomic(target, text)
    except OSError as err:
        raise ReportError(f"{target}: cannot write the report ({err.strerror})") from err
    log.info("report written to %s (%d characters)", target, len(text))
    return target
