"""Fischer projections as SVG text, drawn from a :class:`~workbench.chem.chain.Chain`.

The carbon chain runs down the page with C-1 at the top (IUPAC-IUBMB 1996,
2-Carb-2.1.1). Every stereocentre is an unlabelled crossing: its heteroatom
group (OH, NH2, OCH3) stands on the side the chain records, H on the other.
Chain ends and carbons that are not stereocentres are written as text (CHO,
CH2OH, CH3, COOH, CH2, C=O). :func:`fischer_rows` gives the layout as plain
data; :func:`fischer_svg` draws it. Both are pure and return values only.
"""

from __future__ import annotations

import re
from collections.abc import Iterable
from dataclasses import dataclass

from workbench.chem.chain import LEFT, RIGHT, Chain, register_svg_renderer
from workbench.display.palette import FONT, HYDROGEN, INK, MUTED, NITROGEN, OPEN_CENTRE, OXYGEN, esc

__all__ = [
    "FischerRow",
    "FischerStyle",
    "fischer_rows",
    "fischer_svg",
    "disputed_centres",
    "caption_of",
    "chem_tspans",
    "chain_svg",
]

# Text written on the backbone for a carbon that is not a stereocentre.
_TERMINAL_TEXT = {
    "CHO": "CHO",
    "CH2OH": "CH2OH",
    "CH3": "CH3",
    "COOH": "COOH",
    "CHNNPh": "CH=NNHPh",
}
# Internal carbons that are not stereocentres: (backbone text, double-bonded partner on the right).
_INTERNAL_TEXT = {"CO": ("C", "O"), "CH2": ("CH2", ""), "CNNPh": ("C", "NNHPh")}
# The heteroatom group of each kind of stereocentre.
_SUBSTITUENT = {"CHOH": "OH", "CHNH2": "NH2", "CHNHAc": "NHAc", "CHOMe": "OCH3"}


@dataclass(frozen=True)
class FischerRow:
    """One carbon of a Fischer projection, as text placed around the backbone.

    ``centre`` is written on the backbone (empty for a stereocentre, drawn as a
    crossing); ``left`` and ``right`` stand at the ends of the horizontal bond;
    ``double`` marks a C=X double bond drawn to the right.
    """

    carbon: int
    code: str
    centre: str
    left: str = ""
    right: str = ""
    stereo: bool = False
    double: bool = False

    @property
    def side(self) -> str | None:
        """Side of the heteroatom at a stereocentre (``"right"``/``"left"``), else None."""
        if not self.stereo:
            return None
        return RIGHT if self.right != "H" else LEFT


@dataclass(frozen=True)
class FischerStyle:
    """Geometry of a drawing, in SVG pixels (1 px = 1/96 inch)."""

    row: float = 30.0  # vertical distance between carbons
    arm: float = 26.0  # length of each horizontal bond at a stereocentre
    font_size: float = 13.0
    numbers: bool = True  # carbon numbers in a narrow column on the left
    min_width: float = 170.0


DEFAULT_STYLE = FischerStyle()


def fischer_rows(chain: Chain) -> tuple[FischerRow, ...]:
    """The layout of ``chain``'s Fischer projection, C-1 first."""
    rows = []
    n = chain.carbons
    for i, (code, side) in enumerate(zip(chain.groups, chain.sides, strict=True)):
        k = i + 1
        if code in _SUBSTITUENT:
            sub = _SUBSTITUENT[code]
            left, right = (sub, "H") if side == LEFT else ("H", sub)
            rows.append(FischerRow(k, code, "", left, right, stereo=True))
        elif code in _INTERNAL_TEXT and 1 < k < n:
            text, partner = _INTERNAL_TEXT[code]
            rows.append(FischerRow(k, code, text, "", partner, double=bool(partner)))
        else:
            rows.append(FischerRow(k, code, _TERMINAL_TEXT.get(code, code)))
    return tuple(rows)


def disputed_centres(chains: Iterable[Chain]) -> frozenset[int]:
    """Carbons whose configuration differs among ``chains`` of one constitution.

    Chains of another constitution (other groups) than the first are ignored,
    so the answer is always about configuration only.
    """
    chains = list(chains)
    if len(chains) < 2:
        return frozenset()
    first = chains[0]
    same = [c for c in chains if c.groups == first.groups]
    out = set()
    for k in first.stereocentres:
        if len({c.sides[k - 1] for c in same}) > 1:
            out.add(k)
    return frozenset(out)


def caption_of(chain: Chain) -> str:
    """The name under a drawing: the sugar's name, or the pattern for other chains."""
    if chain.is_sugar:
        from workbench.chem.names import display_name

        return display_name(chain)
    return chain.formula


# ------------------------------------------------------------------ drawing
def _text_width(text: str, size: float) -> float:
    """Rough advance width of ``text`` in a sans-serif font of ``size`` px."""
    return 0.62 * size * len(text)


def chem_tspans(text: str, size: float) -> str:
    """SVG text content with digits written as subscripts (CH2OH, NH2, OCH3)."""
    drop = round(size * 0.28, 1)
    small = round(size * 0.72, 1)
    out = []
    lowered = False
    for run in re.findall(r"\d+|\D+", text):
        if run.isdigit():
            out.append(f'<tspan dy="{drop}" font-size="{small}">{run}</tspan>')
            lowered = True
        elif lowered:
            out.append(f'<tspan dy="{-drop}">{esc(run)}</tspan>')
            lowered = False
        else:
            out.append(esc(run))
    return "".join(out)


def _colour_of(label: str) -> str:
    if label == "H":
        return HYDROGEN
    if label.startswith("N"):
        return NITROGEN
    if label.startswith("O"):
        return OXYGEN
    return INK


def _text(x: float, y: float, label: str, size: float, anchor: str, colour: str, cls: str, chem: bool = True) -> str:
    content = chem_tspans(label, size) if chem else esc(label)
    return (
        f'<text class="{cls}" x="{x:.1f}" y="{y:.1f}" font-size="{size:g}" text-anchor="{anchor}" '
        f'dominant-baseline="central" fill="{colour}">{content}</text>'
    )


def fischer_svg(
    chain: Chain,
    caption: str | None = None,
    open_centres: Iterable[int] = (),
    style: FischerStyle = DEFAULT_STYLE,
) -> str:
    """The Fischer projection of ``chain`` as a standalone SVG document (``str``).

    ``caption`` is written under the drawing; ``open_centres`` are carbon
    numbers to ring in amber (stereocentres on which the remaining candidates
    still disagree). Every carbon is a ``<g>`` with ``data-carbon``,
    ``data-group`` and, at a stereocentre, ``data-side`` attributes.
    """
    rows = fischer_rows(chain)
    marked = set(open_centres)
    fs = style.font_size
    number_col = 18.0 if style.numbers else 0.0
    side_room = max([_text_width(r.left, fs) for r in rows] + [_text_width("OCH3", fs)])
    right_room = max([_text_width(r.right, fs) for r in rows] + [side_room])
    half_centre = max(_text_width(r.centre, fs) for r in rows) / 2
    reach_left = max(style.arm + 4 + side_room, half_centre)
    reach_right = max(style.arm + 4 + right_room, half_centre)
    width = number_col + 10 + reach_left + reach_right + 10
    caption_w = _text_width(caption, fs - 1) + 16 if caption else 0
    width = max(width, style.min_width, caption_w)
    axis = number_col + 10 + reach_left + (width - (number_col + 20 + reach_left + reach_right)) / 2
    top = 20.0
    n = len(rows)
    ys = [top + i * style.row for i in range(n)]
    height = ys[-1] + 20 + (22 if caption else 0)
    label = caption or caption_of(chain)
    parts = [
        f'<svg xmlns="http://www.w3.org/2000/svg" class="ss-fischer" width="{width:.0f}" height="{height:.0f}" '
        f'viewBox="0 0 {width:.0f} {height:.0f}" role="img" aria-label="Fischer projection of {esc(label)}" '
        f'font-family="{esc(FONT)}">',
        f"<title>Fischer projection of {esc(label)} ({esc(chain.pattern)})</title>",
    ]
    # backbone: segments between consecutive carbons, trimmed around written text
    trim = fs * 0.75
    segs = []
    for i in range(n - 1):
        y0 = ys[i] + (trim if rows[i].centre else 0)
        y1 = ys[i + 1] - (trim if rows[i + 1].centre else 0)
        segs.append(f"M{axis:.1f} {y0:.1f}V{y1:.1f}")
    parts.append(f'<path class="ss-backbone" d="{"".join(segs)}" stroke="{INK}" stroke-width="1.6" fill="none"/>')
    for row, y in zip(rows, ys, strict=True):
        attrs = f'data-carbon="{row.carbon}" data-group="{esc(row.code)}"'
        if row.stereo:
            attrs += f' data-side="{row.side}"'
        if row.carbon in marked:
            attrs += ' data-open="true"'
        parts.append(f'<g class="ss-carbon" {attrs}>')
        if style.numbers:
            parts.append(
                _text(number_col - 2, y, str(row.carbon), round(fs * 0.72, 1), "end", MUTED, "ss-number", chem=False)
            )
        if row.stereo:
            if row.carbon in marked:
                parts.append(
                    f'<circle cx="{axis:.1f}" cy="{y:.1f}" r="6.5" fill="none" stroke="{OPEN_CENTRE}" '
                    'stroke-width="2"><title>configuration still open among the candidates</title></circle>'
                )
            x0, x1 = axis - style.arm, axis + style.arm
            parts.append(f'<path d="M{x0:.1f} {y:.1f}H{x1:.1f}" stroke="{INK}" stroke-width="1.6"/>')
            parts.append(_text(x0 - 3, y, row.left, fs, "end", _colour_of(row.left), "ss-left"))
            parts.append(_text(x1 + 3, y, row.right, fs, "start", _colour_of(row.right), "ss-right"))
        elif row.double:
            parts.append(_text(axis, y, row.centre, fs, "middle", INK, "ss-centre"))
            x0 = axis + fs * 0.5
            x1 = x0 + style.arm * 0.6
            parts.append(
                f'<path d="M{x0:.1f} {y - 2:.1f}H{x1:.1f}M{x0:.1f} {y + 2:.1f}H{x1:.1f}" stroke="{INK}" '
                'stroke-width="1.3"/>'
            )
            parts.append(_text(x1 + 3, y, row.right, fs, "start", _colour_of(row.right), "ss-right"))
        else:
            parts.append(_text(axis, y, row.centre, fs, "middle", INK, "ss-centre"))
        parts.append("</g>")
    if caption:
        parts.append(
            f'<text class="ss-caption" x="{width / 2:.1f}" y="{height - 9:.1f}" font-size="{fs - 1}" '
            f'text-anchor="middle" fill="{INK}">{esc(caption)}</text>'
        )
    parts.append("</svg>")
    return "".join(parts)


def chain_svg(chain: Chain) -> str:
    """The Fischer projection of ``chain`` captioned with its name (what ``Chain`` shows in a notebook)."""
    return fischer_svg(chain, caption=caption_of(chain))


register_svg_renderer(chain_svg)  # a Chain draws itself in a notebook once the display layer is imported
