"""The shareable HTML report of a project: one self-contained file, no scripts, no external links.

:func:`render_report` is pure (objects in, ``str`` out) and built from the
display layer (:mod:`workbench.display`); it defends each answer by naming the
closest rivals (:mod:`workbench.evidence.rivals`) with what removed them, and
who recorded each observation and when. :func:`write_report` is the file
edge: it refuses a folder, a device or the input project, then writes a
temporary file beside the target and replaces the target
(:func:`workbench.files.write_text_atomic`), so a failed write never leaves
half a report or destroys the old one.
"""

from __future__ import annotations

import datetime as _dt
import logging
import os
from pathlib import Path

from workbench import __version__
from workbench.chem.chain import Chain
from workbench.chem.names import display_name
from workbench.display.board import board_html
from workbench.display.chart import narrowing_chart
from workbench.display.experiments import SAFETY_DEFERRAL, plan_html
from workbench.display.palette import ACCENT, CONFLICT, FONT, INK, MUTED, esc
from workbench.display.tables import (
    conflicts_html,
    ledger_html,
    observation_values,
    project_html,
    table_html,
    trail_html,
)
from workbench.evidence.rivals import closest_rivals
from workbench.files import OutputError, check_output, write_text_atomic
from workbench.glossary import kind_name

__all__ = ["RIVALS_SHOWN", "ReportError", "check_report_path", "render_report", "rivals_html", "write_report"]

log = logging.getLogger(__name__)

_PAGE_CSS = f"""
body {{ font-family: {FONT}; color: {INK}; max-width: 1100px; margin: 24px auto; padding: 0 18px;
       background: #ffffff; line-height: 1.35; }}
h1 {{ color: {ACCENT}; font-size: 22px; margin-bottom: 2px; }}
h2 {{ color: {ACCENT}; font-size: 17px; border-bottom: 1px solid #d9d5cb; padding-bottom: 2px; margin-top: 26px; }}
h3 {{ color: {INK}; font-size: 14px; margin: 12px 0 2px 0; }}
.ss-meta {{ color: {MUTED}; font-size: 12px; }}
.ss-summary li {{ margin: 2px 0; }}
@media print {{ details {{ display: block; }} .ss-card {{ break-inside: avoid; }} }}
"""


class ReportError(OutputError):
    """The report cannot be written where asked; the message names the path and the fix."""


RIVALS_SHOWN = 6
"""How many rivals the report names per unknown."""


def _recorded(obs) -> str:
    """``by`` and ``recorded`` of an observation, or a dash."""
    return " ".join(x for x in (obs.by, obs.recorded) if x) or "-"


def candidate_name(candidate) -> str:
    """A candidate's name: the trivial or systematic name of a sugar, the condensed name of a residue."""
    if isinstance(candidate, Chain):
        return display_name(candidate)
    return str(getattr(candidate, "display", candidate))


def _relation(rival, survivors) -> str:
    """How a rival differs from the answer, e.g. "C-4 epimer", as a small second line."""
    if rival.inverted is None or not survivors:
        return ""
    if len(rival.inverted) == 1:
        text = f"C-{rival.inverted[0]} epimer"
    elif rival.inverted:
        text = "inverted at " + ", ".join(f"C-{k}" for k in rival.inverted)
    else:
        return ""
    return f'<br><span class="ss-meta">{esc(text)}</span>'


def rivals_html(solution, uid: str, limit: int = RIVALS_SHOWN) -> str:
    """The closest rivals of ``uid``'s answer: each with what removed it, why, and who recorded that.

    Survivors that rank below the leading one show their probability instead
    (a uniform share until the evidence weighs them).
    """
    rivals = closest_rivals(solution, uid, limit)
    if not rivals:
        return f'<p class="ss-meta">{esc(uid)}: no rival; the scope holds one candidate.</p>'
    project = solution.project
    survivors = solution.survivors[uid]
    rows = []
    for rival in rivals:
        name = f"<b>{esc(candidate_name(rival.chain))}</b>" + _relation(rival, survivors)
        if rival.survives:
            share = f"{rival.probability:.0%}" if rival.probability is not None else "-"
            rows.append((name, f"still possible ({esc(share)})", "-", "-", "-"))
            continue
        obs = project.observation(rival.removed_by)
        evidence = f"<b>{esc(obs.id)}</b> {esc(kind_name(obs.KIND))}: {esc(observation_values(obs))}"
        rows.append((name, "eliminated", evidence, esc(rival.reason or "-"), esc(_recorded(obs))))
    headers = ["rival", "status", "removed by", "why", "recorded by / when"]
    return table_html(headers, rows, cls="ss-rivals", raw=True)


def _summary(solution) -> str:
    items = []
    for uid in solution.project.unknown_ids:
        survivors = solution.survivors[uid]
        unknown = solution.project.unknown(uid)
        label = f" ({unknown.label})" if unknown.label else ""
        if len(survivors) == 1:
            verdict = f"assigned as <b>{esc(candidate_name(survivors[0]))}</b>"
        elif not survivors:
            verdict = f'<b style="color:{CONFLICT}">no candidate fits all the evidence</b>'
        else:
            names = ", ".join(candidate_name(c) for c in survivors[:6])
            more = f" and {len(survivors) - 6} more" if len(survivors) > 6 else ""
            verdict = f"{len(survivors)} candidates remain: {esc(names)}{esc(more)}"
        items.append(
            f"<li><b>{esc(uid)}</b>{esc(label)}: {verdict} "
            f'<span class="ss-meta">(of {solution.scope_counts[uid]} in scope)</span></li>'
        )
    return f'<ul class="ss-summary">{"".join(items)}</ul>'


def render_report(project, solution, plan=None, generated: str | None = None) -> str:
    """A complete HTML document for ``project`` solved as ``solution``, with ``plan`` if given.

    Sections: summary, conflicts, unknowns, closest rivals, evidence ledger
    (with who recorded each observation and when), narrowing (chart and
    table), each unknown's survivors (Fischer projections) and eliminated
    candidates with reasons (latest removed first), next experiments with
    cautions. ``generated`` is
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
    parts.append("<h2>Closest rivals</h2>")
    parts.append(
        '<p class="ss-meta">The candidates that lasted longest or rank next, with the observation that removed '
        "each, the reason, and who recorded it when.</p>"
    )
    for uid in project.unknown_ids:
        unknown = project.unknown(uid)
        label = f" ({unknown.label})" if unknown.label else ""
        parts += [f"<h3>{esc(uid)}{esc(label)}</h3>", rivals_html(solution, uid)]
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
    """Write ``text`` to ``path`` atomically; refuse a folder, a device, a missing folder or a ``protect`` file.

    Raises :class:`ReportError` naming the path and what to do instead. The
    file follows the user's umask; a symlink at ``path`` has its target
    written. Returns ``path``.
    """
    target = check_report_path(path, protect)
    try:
        write_text_atomic(target, text)
    except OSError as err:
        raise ReportError(f"{target}: cannot write the report ({err.strerror})") from err
    log.info("report written to %s (%d characters)", target, len(text))
    return target


def check_report_path(path: str | os.PathLike[str], protect: tuple[str | os.PathLike[str], ...] = ()) -> Path:
    """``path`` if a report may be written there, else :class:`ReportError` (see :func:`write_report`)."""
    try:
        return check_output(path, protect, what="report", example="report.html")
    except OutputError as err:
        raise ReportError(str(err)) from err
