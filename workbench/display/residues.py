"""Glycan residues as static SVG/HTML: a ring drawing with its linked positions, and survivor cards.

:func:`residue_svg` draws the ring (pyranose hexagon or furanose pentagon)
with the ring oxygen, every carbon numbered, the free hydroxyls in grey and
the positions that carry another residue (and the anomeric link to the next
residue) in the accent colour. Pure functions returning strings; the board
(:mod:`workbench.display.board`) uses :func:`residue_cards_html` for residue
unknowns.

Two media, as for the monosaccharide cards: ``"svg"`` (the live panels, the
report) and ``"plain"``, which draws the same ring with characters inside a
``<pre>`` (:func:`residue_text`, :func:`residue_pre`) and keeps to markup that
every notebook sanitiser keeps (no SVG, no script): the saved views use it.
"""

from __future__ import annotations

import math

from workbench.chem.methylation import alditol_acetate
from workbench.chem.residue import Residue
from workbench.display.palette import ACCENT, FONT, INK, MUTED, PAPER, RULE, esc

__all__ = ["residue_svg", "residue_text", "residue_pre", "residue_card", "residue_cards_html"]

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


# ------------------------------------------------------------------ plain medium (characters)
_MONO = "DejaVu Sans Mono, Menlo, Consolas, monospace"
_SUB = str.maketrans("0123456789", "\u2080\u2081\u2082\u2083\u2084\u2085\u2086\u2087\u2088\u2089")
# What a ring carbon carries besides H, when it is neither linked nor the anomeric carbon.
_RING_GROUP = {"CHOH": "OH", "CHNHAc": "NHAc", "CHNH2": "NH\u2082", "CHOMe": "OMe"}
_ROLE_STYLE = {
    "link": f"color:{ACCENT};font-weight:bold",
    "free": f"color:{MUTED}",
    "ring": "",
}


def _exo(residue: Residue, k: int) -> tuple[str, str]:
    """(label, role) of what ring carbon ``k`` carries: ``O4←`` linked, ``OH`` free, ``O→(1`` anomeric."""
    a = residue.anomeric_carbon
    if k == a:
        return f"O\u2192({a}", "link"
    if k in residue.linked:
        return f"O{k}\u2190", "link"
    return _RING_GROUP.get(residue.chain.groups[k - 1], ""), "free"


def _tail(residue: Residue, carbons: list[int]) -> list[tuple[str, str]]:
    """Carbons outside the ring written in a row, e.g. ``C6─OH`` or ``C6─O6←`` (pieces with roles)."""
    out: list[tuple[str, str]] = []
    for n, j in enumerate(carbons):
        code = residue.chain.groups[j - 1]
        if n:
            out.append(("\u2500", "ring"))
        out.append((f"C{j}", "ring"))
        if j in residue.linked:
            out += [("\u2500" if code == "CH2OH" else "(", "ring"), (f"O{j}\u2190", "link")]
            out += [] if code == "CH2OH" else [(")", "ring")]
        elif code == "CH2OH":
            out += [("\u2500", "ring"), ("OH", "free")]
        elif code in _RING_GROUP:
            out += [("(", "ring"), (_RING_GROUP[code], "free"), (")", "ring")]
        elif code == "COOH":
            out.append(("OOH", "ring"))
        elif code == "CH3":
            out.append(("H\u2083", "ring"))
    return out


def _ring_grid(residue: Residue) -> list[list[tuple[str, str]]]:
    """The ring drawn on a grid of characters: each cell (character, role)."""
    a, closing = residue.anomeric_carbon, residue.ring_carbon
    last = residue.chain.carbons
    six = closing - a == 4
    ring = list(range(a, closing + 1))
    # vertices (row, column) in Haworth order: anomeric carbon right, ring O at the back
    if six:  # right, lower right, lower left, left, upper left (ring-closing carbon), O upper right
        where = [(4, 13), (6, 10), (6, 3), (4, 0), (2, 3)]
        oxygen = (2, 10)
        bonds = [(2, 5, "\u2500" * 5), (3, 12, "\u2572"), (5, 12, "\u2571"), (6, 5, "\u2500" * 5)]
        bonds += [(5, 2, "\u2572"), (3, 2, "\u2571")]
        below, left_side = ring[1:3], ring[3]
    else:  # right, lower right, lower left, left (ring-closing carbon), O at the top
        where = [(4, 10), (6, 9), (6, 4), (4, 2)]
        oxygen = (2, 7)
        bonds = [(3, 5, "\u2571"), (3, 9, "\u2572"), (5, 10, "\u2571"), (6, 6, "\u2500" * 3), (5, 3, "\u2572")]
        below, left_side = ring[1:3], None
    pieces: list[tuple[int, int, str, str]] = [(r, c, f"C{k}", "ring") for (r, c), k in zip(where, ring, strict=True)]
    pieces.append((*oxygen, "O", "ring"))
    pieces += [(r, c, text, "ring") for r, c, text in bonds]
    for k, (r, c) in zip(below, where[1:3], strict=True):
        label, role = _exo(residue, k)
        if label:
            pieces += [(r + 1, c, "\u2502", "ring"), (r + 2, c, label, role)]
    margin = 0
    if left_side is not None:
        label, role = _exo(residue, left_side)
        if label:
            margin = len(label) + 1
            pieces += [(4, -margin, label, role), (4, -1, "\u2500", "ring")]
    label, role = _exo(residue, a)
    right = where[0][1]
    pieces += [(4, right + 2, "\u2500", "ring"), (4, right + 3, label, role)]
    if a == 2:  # C-1 of a 2-ketose hangs from the anomeric carbon
        pieces += [(3, right + 1, "\u2502", "ring")]
        col = right + 1
        for text, role in _tail(residue, [1]):
            pieces.append((2, col, text, role))
            col += len(text)
    tail = list(range(closing + 1, last + 1))
    if tail:  # carbons beyond the ring hang from the ring-closing carbon
        r, c = where[len(ring) - 1]
        stem = [(r - 1, c, "\u2502", "ring")] if six else [(r - 1, c, "\u2502", "ring"), (r - 2, c, "\u2502", "ring")]
        pieces += stem
        row = r - 2 if six else r - 3
        col = c
        for text, role in _tail(residue, tail):
            pieces.append((row, col, text, role))
            col += len(text)
    top = min(r for r, _, _, _ in pieces)
    rows = max(r for r, _, _, _ in pieces) - top + 1
    width = max(c + len(t) for _, c, t, _ in pieces) + margin
    grid = [[(" ", "ring") for _ in range(width)] for _ in range(rows)]
    for r, c, text, role in pieces:
        for i, ch in enumerate(text):
            grid[r - top][c + margin + i] = (ch, role)
    return grid


def residue_text(residue: Residue) -> str:
    """The residue's ring in characters: carbons numbered, ring O, free OH, linked positions marked.

    ``O4←`` marks a position carrying another residue, ``O→(1`` the anomeric
    link to the next residue; carbons beyond the ring hang from the
    ring-closing carbon. Example (→4)-α-D-Glcp-(1→)::

               C6─OH
               │
               C5─────O
              ╱         ╲
        O4←─C4           C1─O→(1
              ╲         ╱
               C3─────C2
               │      │
               OH     OH
    """
    return "\n".join("".join(ch for ch, _ in row).rstrip() for row in _ring_grid(residue))


def residue_pre(residue: Residue) -> str:
    """:func:`residue_text` as a ``<pre>``: linked positions and the anomeric link in the accent colour."""
    lines = []
    for row in _ring_grid(residue):
        while row and row[-1][0] == " ":
            row = row[:-1]
        spans, run, role = [], "", "ring"
        for ch, r in [*row, ("", "end")]:
            if r != role and run:
                style = _ROLE_STYLE.get(role, "")
                spans.append(f'<span style="{style}">{esc(run)}</span>' if style else esc(run))
                run = ""
            run, role = run + ch, r
        lines.append("".join(spans))
    return (
        f'<pre class="ss-residue-text" data-name="{esc(residue.name)}" style="font-family:{_MONO};font-size:13px;'
        f'line-height:1.15;margin:2px 0;padding:0;background:transparent;color:{INK};text-align:left">'
        f"{chr(10).join(lines)}</pre>"
    )


def residue_card(residue: Residue, flags: tuple[str, ...] = (), medium: str = "svg") -> str:
    """One residue as a card: ring drawing, condensed name, sugar and predicted alditol acetate.

    ``medium="plain"`` draws the ring with characters (:func:`residue_pre`) and
    adds the condensed name in plain letters (``->4)-alpha-D-Glcp-(1->``), so
    the card reads where SVG is stripped.
    """
    pmaa = " + ".join(alditol_acetate(residue).names)
    flag_html = "".join(f'<div style="color:{MUTED};font-size:11px">&#9873; {esc(f)}</div>' for f in flags)
    if medium == "plain":
        return (
            f'<div class="ss-card ss-residue ss-card-plain" data-name="{esc(residue.name)}" style="display:inline-block;'
            f"vertical-align:top;margin:4px;padding:4px 8px 6px 8px;border:1px solid {RULE};border-radius:6px;"
            f'background:{PAPER};font-family:{FONT};max-width:300px">{residue_pre(residue)}'
            f'<div style="font-weight:bold;font-size:13px;color:{INK}">{esc(residue.display)}</div>'
            f'<div style="color:{MUTED};font-size:11px">{esc(residue.name)}</div>'
            f'<div style="color:{MUTED};font-size:11px">{esc(residue.sugar)}, {esc(residue.ring)}</div>'
            f'<div style="color:{MUTED};font-size:10px">PMAA: {esc(pmaa)}</div>{flag_html}</div>'
        )
    return (
        f'<div class="ss-card ss-residue" data-name="{esc(residue.name)}" style="display:inline-block;'
        f"vertical-align:top;margin:4px;padding:4px 6px 6px 6px;border:1px solid {RULE};border-radius:6px;"
        f'background:{PAPER};text-align:center;max-width:240px">{residue_svg(residue)}'
        f'<div style="font-weight:600;font-size:13px;color:{INK}">{esc(residue.display)}</div>'
        f'<div style="color:{MUTED};font-size:11px">{esc(residue.sugar)}, {esc(residue.ring)}</div>'
        f'<div style="color:{MUTED};font-size:10px">PMAA: {esc(pmaa)}</div>{flag_html}</div>'
    )


def residue_cards_html(solution, uid: str, limit: int = 24, medium: str = "svg") -> str:
    """The residue survivors of ``uid`` as cards (at most ``limit`` drawn; the rest named), in ``medium``."""
    survivors = solution.survivors[uid]
    flags = solution.flags.get(uid, {})
    cards = "".join(residue_card(r, tuple(flags.get(r, ())), medium) for r in survivors[:limit])
    rest = survivors[limit:]
    more = ""
    if rest:
        names = ", ".join(r.display for r in rest[:60])
        tail = f" ... (+{len(rest) - 60} more)" if len(rest) > 60 else ""
        more = f'<p style="font-size:12px;color:{MUTED}">Also remaining ({len(rest)}): {esc(names)}{esc(tail)}</p>'
    legend = ""
    if medium == "plain" and survivors:
        legend = (
            f'<p style="font-size:12px;color:{MUTED};margin:2px 0">Rings drawn in characters: O4← another residue '
            f"attached at O-4; O→(1 the link to the next residue; OH a free hydroxyl.</p>"
        )
    return f'<div class="ss-survivors" data-unknown="{esc(uid)}" style="font-family:{FONT}">{legend}{cards}{more}</div>'
