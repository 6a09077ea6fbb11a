"""Chairs on paper: a pyranose chair as SVG with axial and equatorial substituents, and the predictions beside it.

The chair is the usual perspective drawing (left tip, seat, right tip; opposite
ring bonds parallel; axial bonds vertical, each equatorial bond parallel to
the ring bonds once removed) [common practice]. Which substituent stands
where comes from the conformer layer: the ring layout (which face each group
is on) and the chair (which face is axial at each ring position). Axial
groups are drawn in orange, equatorial ones in green. The predictions table
shows anomer fractions (Angyal's scheme), chair energies and the predicted
3J(H,H) in Hz (Haasnoot-de Leeuw-Altona), all from :mod:`workbench.conformers`.
"""

from __future__ import annotations

import math

from workbench.chem.chain import GROUPS, Chain
from workbench.chem.smiles import RingForm
from workbench.display.figure import Figure
from workbench.display.fischer import chem_tspans
from workbench.display.palette import ACCENT, FONT, HYDROGEN, INK, MUTED, OXYGEN, esc
from workbench.display.tables import table_html
from workbench.glossary import conformation_html, term

__all__ = [
    "AXIAL_COLOUR",
    "EQUATORIAL_COLOUR",
    "chair_positions",
    "chair_svg",
    "chair_figure",
    "ring_predictions_html",
]

AXIAL_COLOUR = "#c4622d"
EQUATORIAL_COLOUR = ACCENT

# Ring position -> drawing coordinates of chair "A" (4C1 of an aldopyranose,
# 5C2 of a 2-ketopyranose): ring O at the back right, position 1 the right tip
# (down), position 4 the left tip (up). Opposite ring bonds are parallel.
_CHAIR_A = ((105.0, 25.0), (135.0, 70.0), (90.0, 55.0), (30.0, 45.0), (0.0, 0.0), (45.0, 15.0))
_SCALE = 1.7
_MARGIN_X, _MARGIN_Y = 78.0, 50.0
_BOND = 30.0
_TERMINAL_TEXT = {"CH2OH": "CH2OH", "CH3": "CH3", "COOH": "COOH"}


def chair_positions(chair: str) -> tuple[tuple[float, float], ...]:
    """Page coordinates of ring positions 0 (ring O) to 5 for chair ``"A"`` or ``"B"`` (B is drawn flipped)."""
    height = max(y for _, y in _CHAIR_A)
    out = []
    for x, y in _CHAIR_A:
        yy = y if chair == "A" else height - y
        out.append((_MARGIN_X + _SCALE * x, _MARGIN_Y + _SCALE * yy))
    return tuple(out)


def _substituent_text(chain: Chain, sub) -> str:
    if sub.element == "H":
        return "H"
    if sub.element == "O":
        return "OCH3" if "C" in sub.beta else "OH"
    if sub.element == "N":
        return "NH2"
    carbon = int(sub.label[1:])
    code = chain.groups[carbon - 1]
    if code in _TERMINAL_TEXT:
        return _TERMINAL_TEXT[code]
    return f"C-{carbon} chain" if GROUPS[code].stereo else code


def _unit(dx: float, dy: float) -> tuple[float, float]:
    n = math.hypot(dx, dy) or 1.0
    return dx / n, dy / n


def chair_svg(layout, chair: str, caption: str | None = None) -> str:
    """SVG of a pyranose ``layout`` in ``chair`` (``"A"``/``"B"``) with its substituents marked.

    ``layout`` is a :class:`workbench.conformers.layout.RingLayout` (six-membered
    ring). Every substituent is a ``<text>`` with ``data-label`` (``O1``,
    ``C6``, ``H3``) and ``data-position`` (``axial``/``equatorial``).
    """
    from workbench.conformers.chair import axial_face, chair_label

    if layout.size != 6:
        raise ValueError(f"{layout.form.key}: chairs are drawn for six-membered rings only")
    pts = chair_positions(chair)
    cx = sum(x for x, _ in pts) / 6
    cy = sum(y for _, y in pts) / 6
    width = _MARGIN_X * 2 + _SCALE * 135
    height = _MARGIN_Y * 2 + _SCALE * 70 + (20 if caption else 0)
    name = chair_label(chair, layout.anomeric)
    title = caption or f"{term(layout.form.key)} in the {name} chair"
    parts = [
        f'<svg xmlns="http://www.w3.org/2000/svg" class="ss-chair" width="{width:.0f}" height="{height:.0f}" '
        f'viewBox="0 0 {width:.0f} {height:.0f}" role="img" aria-label="{esc(title)}" font-family="{esc(FONT)}">',
        f"<title>{esc(title)}</title>",
    ]
    ring = "M" + "L".join(f"{x:.1f} {y:.1f}" for x, y in pts) + "Z"
    parts.append(f'<path d="{ring}" stroke="{INK}" stroke-width="1.8" fill="none" stroke-linejoin="round"/>')
    ox, oy = pts[0]
    parts.append(f'<circle cx="{ox:.1f}" cy="{oy:.1f}" r="8" fill="#ffffff"/>')
    parts.append(
        f'<text x="{ox:.1f}" y="{oy:.1f}" font-size="13" text-anchor="middle" dominant-baseline="central" '
        f'fill="{OXYGEN}">O</text>'
    )
    for p in range(1, 6):
        pos = layout.at(p)
        x, y = pts[p]
        nx, ny = x + 0.26 * (cx - x), y + 0.26 * (cy - y)
        parts.append(
            f'<text x="{nx:.1f}" y="{ny:.1f}" font-size="9" text-anchor="middle" dominant-baseline="central" '
            f'fill="{MUTED}">{pos.carbon}</text>'
        )
        up_axial = axial_face(chair, p)
        for face in ("up", "down"):
            sub = pos.on(face)
            axial = face == up_axial
            if axial:
                dx, dy = 0.0, -1.0 if face == "up" else 1.0
            else:
                a, b = pts[(p + 1) % 6], pts[(p + 2) % 6]
                dx, dy = _unit(b[0] - a[0], b[1] - a[1])
                if dx * (x - cx) + dy * (y - cy) < 0:
                    dx, dy = -dx, -dy
            length = _BOND * (0.75 if sub.element == "H" else 1.0)
            ex, ey = x + dx * length, y + dy * length
            colour = HYDROGEN if sub.element == "H" else (AXIAL_COLOUR if axial else EQUATORIAL_COLOUR)
            width_ = 1.0 if sub.element == "H" else 1.6
            parts.append(
                f'<path d="M{x:.1f} {y:.1f}L{ex:.1f} {ey:.1f}" stroke="{colour if sub.element != "H" else MUTED}" '
                f'stroke-width="{width_}"/>'
            )
            anchor = "middle" if abs(dx) < 0.3 else ("start" if dx > 0 else "end")
            tx = ex + (3 if anchor == "start" else -3 if anchor == "end" else 0)
            ty = ey + (-7 if dy < -0.5 and anchor == "middle" else 9 if dy > 0.5 and anchor == "middle" else 0)
            size = 10 if sub.element == "H" else 12.5
            text = _substituent_text(layout.chain, sub)
            where = "axial" if axial else "equatorial"
            parts.append(
                f'<text class="ss-substituent" data-label="{esc(sub.label)}" data-position="{where}" x="{tx:.1f}" '
                f'y="{ty:.1f}" font-size="{size}" text-anchor="{anchor}" dominant-baseline="central" '
                f'fill="{colour}">{esc(text) if text.startswith("C-") else chem_tspans(text, size)}<title>{esc(sub.label)} {where}</title></text>'
            )
    if caption:
        parts.append(
            f'<text x="{width / 2:.1f}" y="{height - 8:.1f}" font-size="12" text-anchor="middle" '
            f'fill="{INK}">{esc(caption)}</text>'
        )
    parts.append("</svg>")
    return "".join(parts)


def chair_figure(layout, chair: str, caption: str | None = None) -> Figure:
    """:func:`chair_svg` with a plain-text stand-in naming the axial and equatorial groups."""
    from workbench.conformers.chair import axial_face, chair_label

    svg = chair_svg(layout, chair, caption)
    axial: list[str] = []
    equatorial: list[str] = []
    for p in range(1, 6):
        up_axial = axial_face(chair, p)
        for face in ("up", "down"):
            sub = layout.at(p).on(face)
            if sub.element == "H":
                continue
            (axial if face == up_axial else equatorial).append(sub.label)
    name = caption or f"{term(layout.form.key)} in the {chair_label(chair, layout.anomeric)} chair"
    text = f"{name}: axial {', '.join(axial) or 'none'}; equatorial {', '.join(equatorial) or 'none'}"
    return Figure(svg, text)


def _fmt(value: float | None, digits: int = 2, unit: str = "") -> str:
    if value is None:
        return "not predicted"
    return f"{value:.{digits}f}{(' ' + unit) if unit else ''}"


def ring_predictions_html(chain: Chain, form: RingForm) -> str:
    """Anomer fractions, chair energies and 3J(H,H) of ``chain``'s ring ``form``, as HTML tables.

    Fractions are of the pyranose pool at 25 C (Angyal's scheme); energies in
    kcal/mol; couplings in Hz, good to about 1 Hz (Haasnoot-de Leeuw-Altona).
    """
    from workbench.conformers import anomer_fractions, chair_preferences, ring_couplings

    fractions = anomer_fractions(chain)
    rows = [(term(k), _fmt(v, 2)) for k, v in fractions.items()]
    parts = [
        f'<div style="font-family:{FONT};font-size:12px;color:{MUTED}">Forms in water (fractions; pyranoses '
        "of the pyranose pool, Angyal's scheme, 25 C)</div>",
        table_html(["form", "fraction"], rows),
    ]
    pref = chair_preferences(chain).get(form.key)
    if pref is not None:
        energies = "; ".join(f"{conformation_html(name)} {g:.2f}" for name, g in pref.energies)
        parts.append(
            f'<div style="font-family:{FONT};font-size:12.5px;color:{INK}">Preferred chair: <b>{conformation_html(pref.preferred)}</b> '
            f"(free energies {energies} kcal/mol; gap {pref.energy_gap_kcal:.2f}; "
            f"population {pref.population:.2f})</div>"
        )
    couplings = ring_couplings(chain).get(form.key)
    if couplings:
        rows = [(pair, _fmt(j, 1, "Hz")) for pair, j in couplings.items()]
        parts.append(
            f'<div style="font-family:{FONT};font-size:12px;color:{MUTED};margin-top:4px">Predicted <sup>3</sup>J(H,H) of the '
            f"{esc(term(form.key))} (chair-weighted)</div>"
        )
        parts.append(table_html(["protons", "³J"], rows))
    elif form.ring == "furanose":
        parts.append(
            f'<div style="font-family:{FONT};font-size:12px;color:{MUTED}">Furanose couplings: see the 3D '
            "conformers (MMFF94), a rough guide only.</div>"
        )
    return "".join(parts)
