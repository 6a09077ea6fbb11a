"""Glycan residues as static SVG/HTML: a ring drawing with its linked positions, and survivor cards.

:func:`residue_svg` draws the ring (pyranose hexagon or furanose pentagon)
with the ring oxygen, every carbon numbered, the free hydroxyls in grey and
the positions that carry another residue (and the anomeric link to the next
residue) in the accent colour. Pure functions returning strings; the board
(:mod:`workbench.display.board`) uses :func:`residue_cards_html` for residue
unknowns.
"""

from __future__ import annotations

import math

from workbench.chem.methylation import alditol_acetate
from workbench.chem.residue import Residue
from workbench.display.palette import ACCENT, FONT, INK, MUTED, PAPER, RULE, esc

__all__ = ["residue_svg", "residue_card", "residue_cards_html"]

_W, _H, _R = 190, 150, 38


def _point(i: int, n: int) -> tuple[float, float]:
    angle = math.pi / 2 + 2 * math.pi * i / n + (math.pi / n if n == 6 else 0)
    return _W / 2 + _R * math.cos(angle), _H / 2 - _R * math.sin(angle)


def residue_svg(residue: Residue) -> str:
    """SVG of the residue's ring with numbered carbons, free OH (grey) and linked positions (accent)."""
    a, closing = residue.anomeric_carbon, residue.ring_carbon
    ring = [*range(a, closing + 1), 0]  # ring carbons in order, then the ring oxygen (0)
    n = len(ring)
    pts = [_point(i, n) for i in range(n)]
    parts = [f'<svg xmlns="http://www.w3.org/2000/svg" width="{_W}" height="{_H}" viewBox="0 0 {_W} {_H}">']
    poly = " ".join(f"{x:.1f},{y:.1f}" for x, y in pts)
    parts.append(f'<polygon points="{poly}" fill="none" stroke="{INK}" stroke-width="1.6"/>')
    cx, cy = _W / 2, _H / 2
    linked = set(residue.linked)
    free = set(residue.unsubstituted)
    for (x, y), k in zip(pts, ring, strict=True):
        if k == 0:
            parts.append(f'<circle cx="{x:.1f}" cy="{y:.1f}" r="7" fill="{PAPER}"/>')
            parts.append(_text(x, y + 4, "O", INK, 12, bold=True))
            continue
        parts.append(_text(x + (x - cx) * 0.28, y + (y - cy) * 0.28 + 4, str(k), MUTED, 9))
        exo = [k] if k != closing else []
        if k == closing:  # carbons beyond the ring hang from the ring-closing carbon
            exo = [j for j in range(closing + 1, residue.chain.carbons + 1)]
        if k == a and a == 2:  # C-1 of a 2-ketose hangs from the anomeric carbon
            exo = [1, 2]
        for j, pos in enumerate(exo):
            ox = x + (x - cx) * (0.75 + 0.45 * j)
            oy = y + (y - cy) * (0.75 + 0.45 * j)
            if pos == a:
                parts.append(_line(x, y, ox, oy, ACCENT))
                parts.append(_text(ox, oy + 4, f"O\u2192({a}", ACCENT, 10, bold=True))
            elif pos in linked:
                parts.append(_line(x, y, ox, oy, ACCENT))
                parts.append(_text(ox, oy + 4, f"O{pos}\u2190", ACCENT, 10, bold=True))
            elif pos in free:
                parts.append(_line(x, y, ox, oy, RULE))
                parts.append(_text(ox, oy + 4, f"OH{pos}" if pos not in (k,) else "OH", MUTED, 9))
    parts.append("</svg>")
    return "".join(parts)


def _line(x1: float, y1: float, x2: float, y2: float, colour: str) -> str:
    return f'<line x1="{x1:.1f}" y1="{y1:.1f}" x2="{x2:.1f}" y2="{y2:.1f}" stroke="{colour}" stroke-width="1.2"/>'


def _text(x: float, y: float, text: str, colour: str, size: int, bold: bool = False) -> str:
    weight = ' font-weight="600"' if bold else ""
    return (
        f'<text x="{x:.1f}" y="{y:.1f}" text-anchor="middle" font-family="{FONT}" font-size="{size}" '
        f'fill="{colour}"{weight}>{esc(text)}</text>'
    )


def residue_card(residue: Residue, flags: tuple[str, ...] = ()) -> str:
    """One residue as a card: ring drawing, condensed name, sugar and predicted alditol acetate."""
    pmaa = " + ".join(alditol_acetate(residue).names)
    flag_html = "".join(f'<div style="color:{MUTED};font-size:11px">&#9873; {esc(f)}</div>' for f in flags)
    return (
        f'<div class="ss-card ss-residue" data-name="{esc(residue.name)}" style="display:inline-block;'
        f"vertical-align:top;margin:4px;padding:4px 6px 6px 6px;border:1px solid {RULE};border-radius:6px;"
        f'background:{PAPER};text-align:center;max-width:240px">{residue_svg(residue)}'
        f'<div style="font-weight:600;font-size:13px;color:{INK}">{esc(residue.display)}</div>'
        f'<div style="color:{MUTED};font-size:11px">{esc(residue.sugar)}, {esc(residue.ring)}</div>'
        f'<div style="color:{MUTED};font-size:10px">PMAA: {esc(pmaa)}</div>{flag_html}</div>'
    )


def residue_cards_html(solution, uid: str, limit: int = 24) -> str:
    """The residue survivors of ``uid`` as cards (at most ``limit`` drawn; the rest named)."""
    survivors = solution.survivors[uid]
    flags = solution.flags.get(uid, {})
    cards = "".join(residue_card(r, tuple(flags.get(r, ()))) for r in survivors[:limit])
    rest = survivors[limit:]
    more = ""
    if rest:
        names = ", ".join(r.display for r in rest[:60])
        tail = f" ... (+{len(rest) - 60} more)" if len(rest) > 60 else ""
        more = f'<p style="font-size:12px;color:{MUTED}">Also remaining ({len(rest)}): {esc(names)}{esc(tail)}</p>'
    return f'<div class="ss-survivors" style="font-family:{FONT}">{cards}{more}</div>'
