"""HTML tables of a project and its solution: unknowns, evidence ledger, trail, eliminations, conflicts.

Pure functions from core objects to ``str``; every style is inline so the
fragments survive notebook sanitisers and e-mail. Reasons and names come from
the engine (:class:`~workbench.evidence.engine.Solution`) unchanged.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence
from typing import Any

from workbench.chem.catalogue import scope_size
from workbench.chem.names import display_name
from workbench.display.palette import (
    ACCENT,
    CONFLICT,
    CONFLICT_SOFT,
    FONT,
    INK,
    MUTED,
    RULE,
    STATUS_COLOURS,
    badge,
    esc,
)
from workbench.glossary import field_name, kind_name, observation_text

__all__ = [
    "table_html",
    "format_value",
    "observation_values",
    "scope_text",
    "project_html",
    "ledger_html",
    "trail_html",
    "eliminated_html",
    "conflicts_html",
    "kinds_html",
]

_CELL = f"padding:3px 8px;border-bottom:1px solid {RULE};text-align:left;vertical-align:top"
_HEAD = f"padding:3px 8px;border-bottom:2px solid {ACCENT};text-align:left;color:{ACCENT};font-weight:600"


def table_html(headers: Sequence[str], rows: Iterable[Sequence[str]], cls: str = "", raw: bool = False) -> str:
    """A plain HTML table; cells are escaped unless ``raw`` (then they are trusted HTML)."""
    head = "".join(f'<th style="{_HEAD}">{esc(h)}</th>' for h in headers)
    body = []
    for row in rows:
        cells = "".join(f'<td style="{_CELL}">{c if raw else esc(c)}</td>' for c in row)
        body.append(f"<tr>{cells}</tr>")
    return (
        f'<table class="{esc(cls)}" style="border-collapse:collapse;font-family:{FONT};font-size:12.5px;'
        f'color:{INK};margin:4px 0 10px 0"><thead><tr>{head}</tr></thead><tbody>{"".join(body)}</tbody></table>'
    )


def format_value(value: Any, unit: str = "") -> str:
    """A field value as a chemist writes it: yes/no, lists joined, numbers with units."""
    if value is None:
        return "-"
    if isinstance(value, bool):
        return "yes" if value else "no"
    if isinstance(value, (list, tuple)):
        return ", ".join(str(v) for v in value)
    if isinstance(value, float):
        text = f"{value:g}"
    else:
        text = str(value)
    return f"{text} {unit}".strip() if unit else text


def observation_values(obs) -> str:
    """The kind-specific fields of an observation in chemists' words, e.g. ``unknown: U1; optically active: no``."""
    return observation_text(obs).split(": ", 1)[1]


def scope_text(scope) -> str:
    """A scope in words, e.g. ``C5-C6; aldose, ketose; D, L; none``."""
    carbons = sorted(scope.carbons)
    span = f"C{carbons[0]}" if len(carbons) == 1 else f"C{carbons[0]}-C{carbons[-1]}"
    if len(carbons) > 1 and carbons != list(range(carbons[0], carbons[-1] + 1)):
        span = ", ".join(f"C{c}" for c in carbons)
    return f"{span}; {', '.join(scope.carbonyl)}; {', '.join(scope.series)}; {', '.join(scope.modifications)}"


def project_html(project) -> str:
    """Title and unknowns (id, label, scope in words, candidates in scope)."""
    rows = [(u.id, u.label or "-", scope_text(u.scope), str(scope_size(u.scope))) for u in project.unknowns]
    return (
        f'<div class="ss-project" style="font-family:{FONT};color:{INK}">'
        f'<div style="font-size:15px;font-weight:600;color:{ACCENT}">{esc(project.title or "(untitled project)")}</div>'
        + table_html(["unknown", "label", "scope (chain lengths; carbonyl; series; modifications)", "candidates"], rows)
        + "</div>"
    )


def _status_badge(status: str) -> str:
    colour = STATUS_COLOURS.get(status, MUTED)
    word = {"applied": "in use", "disabled": "switched off", "contradicts": "contradicts"}.get(status, status)
    return badge(word, colour)


def ledger_html(project, solution=None) -> str:
    """Every observation: id, kind, values, who and when, note, and (with a solution) its effect."""
    steps = {s.observation: s for s in solution.trail} if solution is not None else {}
    rows = []
    for obs in project.observations:
        who = " ".join(x for x in (obs.by, obs.recorded) if x) or "-"
        step = steps.get(obs.id)
        if step is None:
            effect = ""
        else:
            removed = ", ".join(f"{u} -{len(cs)}" for u, cs in step.eliminated.items()) or "no change"
            detail = f" {esc(removed)}" if step.status == "applied" else ""
            effect = f'<span style="white-space:nowrap">{_status_badge(step.status)}{detail}</span>'
        rows.append(
            (
                f"<b>{esc(obs.id)}</b>",
                esc(kind_name(obs.KIND)),
                esc(observation_values(obs)),
                esc(who),
                esc(obs.note or ""),
                effect,
            )
        )
    if not rows:
        return f'<p style="font-family:{FONT};color:{MUTED}">No observations recorded yet.</p>'
    headers = ["id", "kind", "values", "by / recorded", "note", "effect"]
    return table_html(headers, rows, cls="ss-ledger", raw=True)


def trail_html(solution) -> str:
    """Candidates left per unknown after each observation, as a table."""
    ids = list(solution.project.unknown_ids)
    rows = [["scope", ""] + [str(solution.scope_counts[u]) for u in ids]]  # cells are trusted HTML: escape text
    for step in solution.trail:
        rows.append([esc(step.observation), _status_badge(step.status)] + [str(step.counts[u]) for u in ids])
    return table_html(["after", "status"] + ids, rows, cls="ss-trail", raw=True)


def eliminated_html(solution, uid: str, limit: int = 250) -> str:
    """Each eliminated candidate of ``uid`` with the observation that removed it and why.

    Rows follow the trail backwards (latest removed first), so the closest rivals,
    removed by the last observations, always head the table; beyond ``limit``
    rows the rest are counted per observation.
    """
    rows: list[tuple[str, str, str]] = []
    overflow: dict[str, int] = {}
    for step in reversed(solution.trail):
        reasons = step.reasons.get(uid, {})
        for chain in step.eliminated.get(uid, ()):
            if len(rows) >= limit:
                overflow[step.observation] = overflow.get(step.observation, 0) + 1
                continue
            rows.append((display_name(chain), step.observation, reasons.get(chain, "")))
    if not rows:
        return f'<p style="font-family:{FONT};color:{MUTED};font-size:12.5px">Nothing eliminated yet.</p>'
    html = table_html(["candidate", "removed by", "reason"], rows, cls="ss-eliminated")
    if overflow:
        more = ", ".join(f"{n} more by {oid}" for oid, n in overflow.items())
        html += f'<p style="font-family:{FONT};color:{MUTED};font-size:12px">... and {esc(more)}.</p>'
    return html


def conflicts_html(solution) -> str:
    """The minimal sets of observations that cannot all hold, and what dropping each one would leave."""
    if not solution.conflicts:
        return ""
    project = solution.project
    items = []
    for group in solution.conflicts:
        lines = "".join(f"<li>{esc(observation_text(project.observation(oid)))}</li>" for oid in group)
        items.append(
            f"<li><b>{esc(', '.join(group))}</b> cannot all hold:<ul style='margin:2px 0 6px 0'>{lines}</ul></li>"
        )
    relief = []
    for oid, by_unknown in solution.relief.items():
        parts = []
        for u, chains in by_unknown.items():
            names = [display_name(c) for c in chains[:4]]
            more = f" (+{len(chains) - 4} more)" if len(chains) > 4 else ""
            parts.append(f"{u}: {len(chains)} ({', '.join(names)}{more})")
        relief.append(f"<li>without <b>{esc(oid)}</b>: {esc('; '.join(parts))}</li>")
    relief_html = (
        f"<div style='margin-top:4px'>If one observation is set aside:</div><ul>{''.join(relief)}</ul>"
        if relief
        else ""
    )
    return (
        f'<div class="ss-conflicts" style="font-family:{FONT};font-size:13px;color:{INK};background:{CONFLICT_SOFT};'
        f'border-left:4px solid {CONFLICT};padding:6px 10px;margin:6px 0">'
        f'<div style="font-weight:600;color:{CONFLICT}">The evidence is contradictory</div>'
        f"<ul style='margin:4px 0'>{''.join(items)}</ul>{relief_html}"
        "<div>Check these records for a mislabelled sample or a misread result; switch one off to see "
        "what the rest allow.</div></div>"
    )


def _field_words(kind: str, name: str) -> str:
    """A field as written in the file and, where it differs, as a chemist says it: ``co2 (CO₂ formed)``."""
    words = field_name(kind, name)
    return name if words == name.replace("_", " ") else f"{name} ({words})"


def kinds_html(types) -> str:
    """The observation kinds and their fields (with units), as a reference table."""
    rows = []
    for kind, cls in types.items():
        fields = "; ".join(
            f"{_field_words(kind, s.name)}{' [' + s.unit + ']' if s.unit else ''}{'' if s.required else ' (optional)'}"
            for s in cls.SPECS
        )
        rows.append((kind_name(kind), kind, cls.TITLE, fields))
    return table_html(["experiment", "kind (in the file)", "what it records", "fields"], rows, cls="ss-kinds")
