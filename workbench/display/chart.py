"""The narrowing chart: candidates left after each observation, as a small SVG.

The vertical axis is logarithmic (base 2), so each halving of the candidates
is one equal step down: the height a step drops is the information, in bits,
that the observation gave. A point is filled for an applied observation,
hollow grey for one switched off (what-if) and a red cross for one that
contradicts the evidence before it.
"""

from __future__ import annotations

import math
from collections.abc import Mapping, Sequence

from workbench.display.figure import Figure
from workbench.display.palette import CONFLICT, FONT, INK, MUTED, RULE, SERIES_COLOURS, STATUS_COLOURS, esc

__all__ = ["narrowing_svg", "narrowing_chart", "narrowing_figure"]


def _y(count: int, top: float, bottom: float, log_max: float) -> float:
    """Vertical position of ``count`` on a log2 scale from 1 (bottom) to the maximum (top)."""
    if count <= 0:
        return bottom + 8
    return bottom - (math.log2(count) / log_max) * (bottom - top)


def narrowing_svg(
    labels: Sequence[str],
    series: Mapping[str, Sequence[int]],
    statuses: Sequence[str] = (),
    title: str = "",
    height: float = 130.0,
    step_width: float = 30.0,
    min_width: float = 0.0,
) -> str:
    """A step chart of candidates remaining; returns an SVG document as ``str``.

    ``labels`` name the observations in order; each ``series`` value holds the
    count before any observation (the scope) followed by one count per label.
    ``statuses`` (``applied``, ``disabled``, ``contradicts``) colour the points.
    Several series are drawn a little apart (2 px per series) so that lines
    with equal counts stay visible side by side; the legend gives the counts.
    Sizes are in px; the drawing is at least ``min_width`` wide.
    """
    n = len(labels)
    for name, counts in series.items():
        if len(counts) != n + 1:
            raise ValueError(f"series {name!r} has {len(counts)} counts; expected {n + 1} (scope, then one per label)")
    statuses = list(statuses) or ["applied"] * n
    left, right, top = 44.0, 14.0, 16.0 if not title else 30.0
    legend = len(series) > 1
    bottom = height - (34.0 if not legend else 52.0)
    width = left + right + step_width * max(n, 1) + 10
    if legend:
        width = max(width, left + 90 * len(series) + 10)
    width = max(width, min_width)
    peak = max([max(c) for c in series.values() if c] + [2])
    log_max = math.log2(peak)
    parts = [
        f'<svg xmlns="http://www.w3.org/2000/svg" class="ss-narrowing" width="{width:.0f}" height="{height:.0f}" '
        f'viewBox="0 0 {width:.0f} {height:.0f}" role="img" aria-label="candidates remaining after each observation" '
        f'font-family="{esc(FONT)}" font-size="10">',
        "<title>Candidates remaining after each observation (log scale)</title>",
    ]
    if title:
        parts.append(f'<text x="{left}" y="14" font-size="12" fill="{INK}" font-weight="bold">{esc(title)}</text>')
    # gridlines: 1, the scope size, and powers of 4 between
    top_y = _y(peak, top, bottom, log_max)
    ticks = [1, peak] + [4**k for k in range(1, 8) if 4**k < peak and _y(4**k, top, bottom, log_max) - top_y > 11]
    for t in sorted(set(ticks)):
        y = _y(t, top, bottom, log_max)
        parts.append(f'<path d="M{left:.1f} {y:.1f}H{width - right:.1f}" stroke="{RULE}" stroke-width="0.8"/>')
        parts.append(f'<text x="{left - 4:.1f}" y="{y + 3:.1f}" text-anchor="end" fill="{MUTED}">{t}</text>')
    xs = [left + 6 + i * step_width for i in range(n + 1)]
    every = max(1, math.ceil(n / 24))
    for i, label in enumerate(labels):
        if i % every == 0 or i == n - 1:
            parts.append(
                f'<text x="{xs[i + 1]:.1f}" y="{bottom + 20:.1f}" text-anchor="middle" fill="{MUTED}">{esc(label)}</text>'
            )
    parts.append(f'<text x="{xs[0]:.1f}" y="{bottom + 20:.1f}" text-anchor="middle" fill="{MUTED}">scope</text>')
    for k, (name, counts) in enumerate(series.items()):
        colour = SERIES_COLOURS[k % len(SERIES_COLOURS)]
        offset = (k - (len(series) - 1) / 2) * 2.0 if legend else 0.0
        ys = [_y(c, top, bottom, log_max) + offset for c in counts]
        d = f"M{xs[0]:.1f} {ys[0]:.1f}" + "".join(f"H{xs[i]:.1f}V{ys[i]:.1f}" for i in range(1, n + 1))
        parts.append(
            f'<path class="ss-series" data-series="{esc(name)}" d="{d}" stroke="{colour}" '
            'stroke-width="1.8" fill="none"/>'
        )
        parts.append(f'<circle cx="{xs[0]:.1f}" cy="{ys[0]:.1f}" r="3" fill="{colour}"/>')
        for i in range(1, n + 1):
            status = statuses[i - 1]
            tip = f"{labels[i - 1]} ({status}): {name} {counts[i]} left"
            x, y = xs[i], ys[i]
            if status == "contradicts":
                parts.append(
                    f'<path d="M{x - 4:.1f} {y - 4:.1f}L{x + 4:.1f} {y + 4:.1f}M{x - 4:.1f} {y + 4:.1f}L{x + 4:.1f} '
                    f'{y - 4:.1f}" stroke="{CONFLICT}" stroke-width="2"><title>{esc(tip)}</title></path>'
                )
            elif status == "disabled":
                parts.append(
                    f'<circle cx="{x:.1f}" cy="{y:.1f}" r="3.2" fill="#ffffff" stroke="{STATUS_COLOURS["disabled"]}" '
                    f'stroke-width="1.5"><title>{esc(tip)}</title></circle>'
                )
            else:
                parts.append(
                    f'<circle cx="{x:.1f}" cy="{y:.1f}" r="3.2" fill="{colour}"><title>{esc(tip)}</title></circle>'
                )
        if not legend:
            for i in range(n + 1):
                if i == 0 or counts[i] != counts[i - 1] or i == n:
                    parts.append(
                        f'<text x="{xs[i] + 3:.1f}" y="{ys[i] - 6:.1f}" fill="{INK}" class="ss-count">{counts[i]}</text>'
                    )
        else:
            lx = left + k * 90
            parts.append(f'<rect x="{lx:.1f}" y="{height - 14:.1f}" width="10" height="4" fill="{colour}"/>')
            parts.append(f'<text x="{lx + 14:.1f}" y="{height - 9:.1f}" fill="{INK}">{esc(name)}: {counts[-1]}</text>')
    parts.append("</svg>")
    return "".join(parts)


def narrowing_chart(solution, unknowns: Sequence[str] | None = None, title: str = "", large: bool = False) -> str:
    """:func:`narrowing_svg` of a :class:`~workbench.evidence.engine.Solution` (one line per unknown).

    ``large`` draws the overview of several unknowns: taller, wider steps, at least 480 px wide.
    """
    ids = list(unknowns) if unknowns is not None else list(solution.project.unknown_ids)
    labels = [step.observation for step in solution.trail]
    statuses = [step.status for step in solution.trail]
    series = {uid: [solution.scope_counts[uid]] + [step.counts[uid] for step in solution.trail] for uid in ids}
    if large:
        return narrowing_svg(labels, series, statuses, title=title, height=240.0, step_width=48.0, min_width=480.0)
    return narrowing_svg(labels, series, statuses, title=title)


def narrowing_figure(solution, unknowns: Sequence[str] | None = None, title: str = "") -> Figure:
    """The narrowing chart with a plain-text stand-in (counts per unknown after each observation)."""
    ids = list(unknowns) if unknowns is not None else list(solution.project.unknown_ids)
    lines = [title or "Candidates left after each observation"]
    for uid in ids:
        counts = [str(solution.scope_counts[uid])] + [f"{s.observation} {s.counts[uid]}" for s in solution.trail]
        lines.append(f"  {uid}: scope " + ", ".join(counts))
    return Figure(narrowing_chart(solution, ids, title=title, large=len(ids) > 1), "\n".join(lines))
