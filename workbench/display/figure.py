"""A drawing with words: an SVG and the sentence that stands in for it where SVG is not shown.

A notebook shows ``image/svg+xml`` only when it trusts the output; elsewhere it
falls back to the plain-text view, which for a bare SVG object is a useless
``<IPython.core.display.SVG object>``. A :class:`Figure` carries its own
plain text (what the drawing shows, in words or characters), so the reader
gets that instead. Pure: no IPython import; notebooks pick up ``_repr_svg_``
and ``__repr__`` by themselves.
"""

from __future__ import annotations

from dataclasses import dataclass

__all__ = ["Figure"]


@dataclass(frozen=True)
class Figure:
    """An SVG document (``svg``) and its stand-in text (``text``)."""

    svg: str
    text: str

    def _repr_svg_(self) -> str:
        return self.svg

    def __repr__(self) -> str:
        return self.text

    def __str__(self) -> str:
        return self.text
