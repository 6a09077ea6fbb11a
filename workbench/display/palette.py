"""Colours, fonts and tiny HTML helpers shared by every pure renderer.

All styling is written inline (``style=`` and SVG presentation attributes), so
a drawing keeps its look wherever it is pasted: a notebook output read without
a kernel, a self-contained report, an e-mail. Element colours follow the usual
CPK habit of chemists (oxygen red, nitrogen blue) [common practice]; the rest
of the palette is stereosieve's own.
"""

from __future__ import annotations

from workbench.escaping import html_text

__all__ = [
    "FONT",
    "INK",
    "MUTED",
    "PAPER",
    "RULE",
    "ACCENT",
    "ACCENT_SOFT",
    "OPEN_CENTRE",
    "OXYGEN",
    "NITROGEN",
    "HYDROGEN",
    "CONFLICT",
    "CONFLICT_SOFT",
    "CAUTION",
    "CAUTION_SOFT",
    "SERIES_COLOURS",
    "STATUS_COLOURS",
    "esc",
    "badge",
    "live_css",
]

FONT = "DejaVu Sans, Segoe UI, Helvetica, Arial, sans-serif"

INK = "#22272b"  # text and chain bonds
MUTED = "#6b7680"  # carbon numbers, secondary text
PAPER = "#fbfaf6"  # card background
RULE = "#d9d5cb"  # table rules, card borders
ACCENT = "#2f6f62"  # headings, survivors (a sea-green)
ACCENT_SOFT = "#e3efe9"
OPEN_CENTRE = "#d98e04"  # a stereocentre on which the survivors still disagree
OXYGEN = "#b3261e"
NITROGEN = "#2557a7"
HYDROGEN = "#5f6b73"
CONFLICT = "#a4262c"
CONFLICT_SOFT = "#fbe9ea"
CAUTION = "#9a5b00"
CAUTION_SOFT = "#fff4df"

# One colour per unknown in multi-series charts (distinct in print and for
# the common colour-vision deficiencies: blue, orange, green, purple, ...).
SERIES_COLOURS = ("#2f6f62", "#c4622d", "#3b5ba5", "#8a4f9e", "#8c7a12", "#b0305c", "#3d8aa8", "#5b5b5b")

STATUS_COLOURS = {"applied": ACCENT, "disabled": "#9aa3ab", "contradicts": CONFLICT}


def esc(value: object) -> str:
    """HTML-escaped text of ``value`` (quotes included; see :func:`workbench.escaping.html_text`)."""
    return html_text(value)


def badge(text: str, colour: str, background: str = "#ffffff") -> str:
    """A small rounded label, e.g. an observation's status."""
    return (
        f'<span style="display:inline-block;padding:0 6px;border-radius:8px;border:1px solid {colour};'
        f'color:{colour};background:{background};font-size:11px;line-height:16px;white-space:nowrap">'
        f"{esc(text)}</span>"
    )


def live_css() -> str:
    """Style rules for the live panels (a ``<style>`` element, shown only where the widgets run).

    - A chosen toggle button is filled with the accent colour, the others white:
      the choice reads at a glance.
    - The static copy kept beside a live workbench is hidden while the widgets
      run (in the same notebook cell only), so the page is not shown twice; where
      the widgets do not run (untrusted notebook, no kernel, a plain viewer) this
      rule is not there and the static copy is what the reader sees.
    """
    return (
        "<style>"
        f".ss-live .widget-toggle-button.mod-active{{background:{ACCENT};color:#ffffff;font-weight:600;"
        f"box-shadow:inset 0 0 0 2px #1d4a41}}"
        f".ss-live .widget-toggle-button:not(.mod-active){{background:#ffffff;color:{INK};"
        f"box-shadow:inset 0 0 0 1px {RULE}}}"
        ".jp-Cell:has(.ss-live) .ss-snapshot, .jp-OutputArea:has(.ss-live) .ss-snapshot{display:none}"
        "</style>"
    )
