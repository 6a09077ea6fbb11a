"""The candidate board as static HTML: survivors drawn as Fischer projections, the narrowing, the eliminated.

:func:`board_html` renders one unknown; :func:`solution_html` renders a whole
solution (what ``Solution`` shows in a notebook and what the report embeds).
Stereocentres on which the survivors still disagree are ringed in amber.

Two media: ``"svg"`` draws with inline SVG (the live panels, the report);
``"plain"`` draws with characters and plain markup only
(:mod:`workbench.display.plain`), which every notebook sanitiser keeps: the
static copies saved in notebooks use it.
"""

from __future__ import annotations

from workbench.chem.chain import Chain
from workbench.chem.names import display_name, systematic_name
from workbench.chem.order import in_configurational_order
from workbench.display.chart import narrowing_chart
from workbench.display.fischer import disputed_centres, fischer_svg
from workbench.display.palette import ACCENT, CAUTION, FONT, INK, MUTED, PAPER, RULE, esc
from workbench.display.plain import narrowing_table, plain_card
from workbench.display.residues import residue_cards_html
from workbench.display.tables import conflicts_html, eliminated_html, ledger_html, scope_text, trail_html
from workbench.glossary import observation_text

__all__ = ["survivor_card", "survivors_html", "board_html", "solution_html", "probability_bar_html", "suspects_html"]


def probability_bar_html(p: float, width: int = 120) -> str:
    """A horizontal bar of probability ``p`` (0-1) with its value, ``width`` pixels at 1."""
    p = max(0.0, min(1.0, p))
    return (
        f'<div class="ss-prob" data-probability="{p:.4f}" style="display:flex;align-items:center;gap:4px;'
        f'justify-content:center;font-size:11px;color:{MUTED}">'
        f'<span style="display:inline-block;width:{width}px;height:7px;background:{RULE};border-radius:3px">'
        f'<span style="display:block;width:{p * width:.1f}px;height:7px;background:{ACCENT};border-radius:3px">'
        f"</span></span>{p:.3f}</div>"
    )


def suspects_html(solution) -> str:
    """When the evidence conflicts: the observations most likely wrong, each with a bar."""
    if not solution.suspects:
        return ""
    rows = "".join(
        f"<li>{esc(observation_text(solution.project.observation(oid)))}{probability_bar_html(p)}</li>"
        for oid, p in solution.suspects
    )
    return (
        f'<div class="ss-suspects" style="font-size:12.5px;margin:4px 0">Most likely wrong (chance that the '
        f'record is wrong, given the reliabilities and how well the rest agrees):<ul style="margin:2px 0">{rows}</ul></div>'
    )


def survivor_card(chain, open_centres=(), flags=(), probability: float | None = None, medium: str = "svg") -> str:
    """One candidate as a card: Fischer projection, name, systematic name, probability bar, flags."""
    name = display_name(chain)
    systematic = systematic_name(chain)
    if medium == "plain":
        extra = probability_bar_html(probability) if probability is not None else ""
        return plain_card(chain, name, systematic, open_centres, flags, extra)
    sub = "" if systematic == name else f'<div style="color:{MUTED};font-size:11px">{esc(systematic)}</div>'
    flag_html = "".join(f'<div style="color:{CAUTION};font-size:11px">&#9873; {esc(f)}</div>' for f in flags)
    if probability is not None:
        sub += probability_bar_html(probability)
    return (
        f'<div class="ss-card" data-name="{esc(name)}" style="display:inline-block;vertical-align:top;margin:4px;'
        f"padding:4px 6px 6px 6px;border:1px solid {RULE};border-radius:6px;background:{PAPER};"
        f'text-align:center;max-width:230px">'
        f"{fischer_svg(chain, open_centres=open_centres)}"
        f'<div style="font-weight:600;font-size:13px;color:{INK}">{esc(name)}</div>{sub}{flag_html}</div>'
    )


def survivors_html(solution, uid: str, limit: int = 24, medium: str = "svg") -> str:
    """The survivors of ``uid`` as cards, most probable first, ties in the conventional order (all, alt, glc ...)."""
    survivors = list(solution.survivors[uid])
    if not survivors:
        why = "the evidence is contradictory" if solution.contradictory else "no candidate fits"
        return f'<p style="font-family:{FONT};color:{MUTED}">No candidate survives: {esc(why)}.</p>'
    if not isinstance(survivors[0], Chain):  # glycan residues: ring drawings with linked positions
        return residue_cards_html(solution, uid, limit, medium)
    probability = solution.probability if solution.probabilities else None
    survivors = in_configurational_order(survivors)
    if probability is not None:  # most probable first; equal probabilities stay in the conventional order
        survivors = sorted(survivors, key=lambda c: -round(probability(uid, c), 9))
    open_centres = disputed_centres(survivors)
    flags = solution.flags.get(uid, {})
    cards = "".join(
        survivor_card(c, open_centres, flags.get(c, ()), probability(uid, c) if probability else None, medium)
        for c in survivors[:limit]
    )
    rest = survivors[limit:]
    more = ""
    if rest:
        names = ", ".join(display_name(c) for c in rest[:60])
        tail = f" ... (+{len(rest) - 60} more)" if len(rest) > 60 else ""
        more = f'<p style="font-size:12px;color:{MUTED}">Also remaining ({len(rest)}): {esc(names)}{esc(tail)}</p>'
    legend = ""
    if open_centres:
        where = ", ".join(f"C-{k}" for k in sorted(open_centres))
        how = "Ringed in amber" if medium == "svg" else "Crossing in amber"
        legend = (
            f'<p style="font-size:12px;color:{MUTED};margin:2px 0">{how}: configuration still open ({esc(where)}).</p>'
        )
    return f'<div class="ss-survivors" style="font-family:{FONT}">{legend}{cards}{more}</div>'


def board_html(solution, uid: str, limit: int = 24, eliminated_open: bool = False, medium: str = "svg") -> str:
    """One unknown's board: heading with counts, narrowing chart, survivors, eliminated list.

    ``eliminated_open`` unfolds the eliminated list (for print); in notebooks it starts folded.
    """
    unknown = solution.project.unknown(uid)
    n_left = len(solution.survivors[uid])
    total = solution.scope_counts[uid]
    label = f" ({unknown.label})" if unknown.label else ""
    gone = total - n_left
    heading = (
        f'<div style="font-size:15px;font-weight:600;color:{ACCENT}">{esc(uid)}{esc(label)}: '
        f"{n_left} of {total} candidates remain</div>"
        f'<div style="font-size:11.5px;color:{MUTED}">scope: {esc(scope_text(unknown.scope))}</div>'
    )
    eliminated = (
        f'<details{" open" if eliminated_open else ""} style="margin:4px 0"><summary style="cursor:pointer;color:{ACCENT}">Eliminated candidates '
        f"({gone}) with the observation that removed each</summary>{eliminated_html(solution, uid)}</details>"
        if gone
        else ""
    )
    return (
        f'<div class="ss-board" data-unknown="{esc(uid)}" style="font-family:{FONT};color:{INK};margin:6px 0 14px 0">'
        f"{heading}{_narrowing(solution, [uid], medium)}{survivors_html(solution, uid, limit, medium)}{eliminated}</div>"
    )


def _narrowing(solution, ids, medium: str, title: str = "") -> str:
    if medium == "plain":
        series = {u: [solution.scope_counts[u]] + [s.counts[u] for s in solution.trail] for u in ids}
        table = narrowing_table([s.observation for s in solution.trail], series, [s.status for s in solution.trail])
        head = f'<div style="font-weight:600;color:{ACCENT};margin-top:6px">{esc(title)}</div>' if title else ""
        return head + table
    return narrowing_chart(solution, ids, title=title, large=len(ids) > 1)


def solution_html(solution, limit: int = 24, medium: str = "svg") -> str:
    """A whole solution: conflicts first, then every unknown's board, the trail and the ledger."""
    project = solution.project
    title = esc(project.title or "(untitled project)")
    parts = [
        f'<div class="ss-solution" style="font-family:{FONT};color:{INK}">',
        f'<div style="font-size:17px;font-weight:600;color:{ACCENT};margin-bottom:4px">{title}</div>',
    ]
    if solution.disabled:
        parts.append(
            f'<div style="color:{MUTED};font-size:12px">What-if: switched off {esc(", ".join(solution.disabled))}</div>'
        )
    parts.append(conflicts_html(solution))
    parts.append(suspects_html(solution))
    for uid in project.unknown_ids:
        parts.append(board_html(solution, uid, limit, medium=medium))
    if len(project.unknown_ids) > 1:
        parts.append(_narrowing(solution, list(project.unknown_ids), medium, title="All unknowns"))
    parts.append(f'<div style="font-weight:600;color:{ACCENT};margin-top:8px">Narrowing step by step</div>')
    parts.append(trail_html(solution))
    parts.append(f'<div style="font-weight:600;color:{ACCENT};margin-top:8px">Evidence ledger</div>')
    parts.append(ledger_html(project, solution))
    parts.append("</div>")
    return "".join(parts)
