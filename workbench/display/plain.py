"""Drawings that survive every sanitiser: Fischer projections and the narrowing as text and plain markup.

A notebook opened untrusted (JupyterLab's default for a file received from
someone else), a plain notebook viewer or an e-mail keeps ordinary HTML
(``pre``, ``span``, ``table``, ``div``, inline ``style``) but strips SVG and
scripts; JupyterLab's sanitiser also refuses ``data:`` images. So the static
copies of the workbench draw with characters: a Fischer projection in
box-drawing characters inside ``<pre>`` (bonds ``──┼──``, chain ``│``; the
same text is the plain-text view), and the narrowing as a table of bars made
of ``<span>`` widths. Pure: every function returns ``str``.
"""

from __future__ import annotations

import math
from collections.abc import Iterable, Mapping, Sequence

from workbench.chem.chain import Chain
from workbench.display.fischer import caption_of, fischer_rows
from workbench.display.palette import (
    ACCENT,
    FONT,
    HYDROGEN,
    INK,
    MUTED,
    NITROGEN,
    OPEN_CENTRE,
    OXYGEN,
    PAPER,
    RULE,
    SERIES_COLOURS,
    STATUS_COLOURS,
    esc,
)

__all__ = ["fischer_text", "fischer_pre", "plain_card", "narrowing_table"]

_SUBSCRIPT = str.maketrans("0123456789", "₀₁₂₃₄₅₆₇₈₉")
_ARM = "──"
_LEFT_WRITTEN = {"OH": "HO", "NH2": "H2N", "OCH3": "CH3O"}  # groups on the left are written atom-first
_MONO = "DejaVu Sans Mono, Menlo, Consolas, monospace"


def _chem(label: str) -> str:
    """Digits of a group written as subscripts (CH2OH -> CH₂OH)."""
    return label.translate(_SUBSCRIPT)


def _layout(chain: Chain) -> list[tuple[int, str, str, str, bool]]:
    """(carbon, left text, centre text, right text, is stereocentre) per carbon, texts with subscripts."""
    out = []
    for row in fischer_rows(chain):
        if row.stereo:
            out.append((row.carbon, _chem(_LEFT_WRITTEN.get(row.left, row.left)), "┼", _chem(row.right), True))
        elif row.double:
            out.append((row.carbon, "", _chem(row.centre), "═" + _chem(row.right), False))
        else:
            out.append((row.carbon, "", _chem(row.centre), "", False))
    return out


def fischer_text(chain: Chain, open_centres: Iterable[int] = ()) -> str:
    """The Fischer projection of ``chain`` in box-drawing characters, C-1 at the top; open centres marked ``*``.

    Example (D-glyceraldehyde)::

        1      CHO
               │
        2  H ──┼── OH
               │
        3     CH₂OH
    """
    marked = set(open_centres)
    rows = _layout(chain)
    side = max([len(left) for _, left, _, _, _ in rows] + [2])
    axis = 3 + side + 1 + len(_ARM)  # column of the chain
    lines = []
    for i, (carbon, left, centre, right, stereo) in enumerate(rows):
        number = f"{carbon:>2} "
        if stereo:
            mark = " *" if carbon in marked else ""
            lines.append(f"{number}{left:>{side}} {_ARM}{centre}{_ARM} {right}{mark}")
        else:
            start = max(axis - len(centre) // 2, len(number))
            lines.append(f"{number}{' ' * (start - len(number))}{centre}{right}")
        if i < len(rows) - 1:
            lines.append(" " * axis + "│")
    return "\n".join(line.rstrip() for line in lines)


def _colour(text: str) -> str:
    stripped = text.strip()
    if stripped == "H":
        return HYDROGEN
    if "N" in stripped:
        return NITROGEN
    if "O" in stripped:
        return OXYGEN
    return INK


def fischer_pre(chain: Chain, open_centres: Iterable[int] = ()) -> str:
    """:func:`fischer_text` as a coloured ``<pre>`` (heteroatom groups coloured, open centres in amber)."""
    marked = set(open_centres)
    rows = _layout(chain)
    side = max([len(left) for _, left, _, _, _ in rows] + [2])
    axis = 3 + side + 1 + len(_ARM)
    out = []
    for i, (carbon, left, centre, right, stereo) in enumerate(rows):
        number = f'<span style="color:{MUTED}">{carbon:>2}</span> '
        if stereo:
            cross = (
                f'<span style="color:{OPEN_CENTRE};font-weight:bold" title="configuration still open">┼</span>'
                if carbon in marked
                else "┼"
            )
            pad = " " * (side - len(left))
            out.append(
                f'{number}{pad}<span style="color:{_colour(left)}">{esc(left)}</span> {_ARM}{cross}{_ARM} '
                f'<span style="color:{_colour(right)}">{esc(right)}</span>'
            )
        else:
            start = max(axis - len(centre) // 2, 3)
            tail = f'<span style="color:{OXYGEN}">{esc(right)}</span>' if right else ""
            out.append(f"{number}{' ' * (start - 3)}{esc(centre)}{tail}")
        if i < len(rows) - 1:
            out.append(" " * axis + "│")
    text = "\n".join(out)
    return (
        f'<pre class="ss-fischer-text" data-name="{esc(caption_of(chain))}" style="font-family:{_MONO};'
        f"font-size:13px;line-height:1.15;margin:2px 0;padding:0;background:transparent;color:{INK};"
        f'text-align:left">{text}</pre>'
    )


def plain_card(
    chain: Chain, name: str, systematic: str = "", open_centres: Iterable[int] = (), flags=(), extra_html: str = ""
) -> str:
    """A survivor card in plain markup: the Fischer projection in characters, the name, the systematic name.

    ``extra_html`` (plain markup, e.g. a probability bar) goes under the names.
    """
    sub = (
        f'<div style="color:{MUTED};font-size:11px">{esc(systematic)}</div>'
        if systematic and systematic != name
        else ""
    )
    flag_html = "".join(f'<div style="color:{MUTED};font-size:11px">&#9873; {esc(f)}</div>' for f in flags)
    return (
        f'<div class="ss-card ss-card-plain" data-name="{esc(name)}" style="display:inline-block;vertical-align:top;'
        f"margin:4px;padding:4px 8px 6px 8px;border:1px solid {RULE};border-radius:6px;background:{PAPER};"
        f'font-family:{FONT}">{fischer_pre(chain, open_centres)}'
        f'<div style="font-weight:bold;font-size:13px;color:{INK}">{esc(name)}</div>{sub}{extra_html}{flag_html}</div>'
    )


def narrowing_table(
    labels: Sequence[str], series: Mapping[str, Sequence[int]], statuses: Sequence[str] = (), bar_px: int = 160
) -> str:
    """Candidates left after each observation as a table of bars (log scale: one halving, one equal step).

    Same inputs as :func:`workbench.display.chart.narrowing_svg`: each series
    holds the scope count followed by one count per label.
    """
    statuses = list(statuses) or ["applied"] * len(labels)
    peak = max([max(c) for c in series.values() if c] + [2])
    scale = math.log2(peak) + 1

    def bar(count: int, colour: str) -> str:
        width = 2 if count <= 0 else max(3, round(bar_px * (math.log2(count) + 1) / scale))
        fill = colour if count > 0 else RULE
        return (
            f'<span style="display:inline-block;width:{width}px;height:9px;background:{fill};'
            f'vertical-align:middle;margin-right:5px"></span>{count}'
        )

    names = list(series)
    head = "".join(
        f'<th style="padding:2px 8px;text-align:left;color:{SERIES_COLOURS[k % len(SERIES_COLOURS)]}">{esc(u)}</th>'
        for k, u in enumerate(names)
    )
    rows = []
    for i, label in enumerate(["scope", *labels]):
        status = "applied" if i == 0 else statuses[i - 1]
        colour_word = STATUS_COLOURS.get(status, MUTED)
        word = "" if i == 0 or status == "applied" else f' <span style="color:{colour_word}">({esc(status)})</span>'
        cells = "".join(
            f'<td style="padding:1px 8px;text-align:left;white-space:nowrap">'
            f"{bar(series[u][i], SERIES_COLOURS[k % len(SERIES_COLOURS)])}</td>"
            for k, u in enumerate(names)
        )
        rows.append(
            f'<tr><td style="padding:1px 8px;text-align:left;color:{MUTED};white-space:nowrap">{esc(label)}{word}</td>'
            f"{cells}</tr>"
        )
    return (
        f'<table class="ss-narrowing-table" style="border-collapse:collapse;font-family:{FONT};font-size:12px;'
        f'color:{INK};margin:4px 0"><thead><tr><th style="padding:2px 8px;text-align:left;color:{ACCENT}">'
        f"candidates left after</th>{head}</tr></thead><tbody>{''.join(rows)}</tbody></table>"
    )
