"""One escaping helper per output medium, for every string a user or a project file supplied.

- :func:`html_text`: text for HTML and SVG (markup characters and quotes
  escaped; control characters, lone surrogates and bidirectional overrides
  replaced), so an id such as ``<img src=x onerror=...>`` shows as text;
- :func:`terminal_text`: text for a terminal (ESC, CSI, OSC and every other C0
  and C1 control, DEL, lone surrogates and bidirectional overrides shown as
  visible ``\\x1b``-style escapes), so a project file cannot clear, retitle or
  reorder the user's terminal; newlines and tabs are kept unless ``one_line``;
- :func:`json_text`: JSON text made safe for a terminal while staying valid
  JSON (the same characters written as ``\\uXXXX`` escapes).

Character classes: C0 controls U+0000-U+001F, DEL U+007F, C1 controls
U+0080-U+009F (ECMA-48); bidirectional embedding, override and isolate
controls U+202A-U+202E and U+2066-U+2069, marks U+200E/U+200F and U+061C
(Unicode UAX #9); surrogates U+D800-U+DFFF cannot be encoded as UTF-8.
"""

from __future__ import annotations

import html
import re

__all__ = ["html_text", "terminal_text", "json_text", "line_breaker"]

_BIDI = "\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069"
_UNSAFE_TERMINAL = re.compile(f"[\x00-\x08\x0b-\x1f\x7f-\x9f{_BIDI}\ud800-\udfff]")
_UNSAFE_ONE_LINE = re.compile(f"[\x00-\x1f\x7f-\x9f{_BIDI}\ud800-\udfff]")
_UNSAFE_HTML = re.compile(f"[\x00-\x08\x0b\x0c\x0e-\x1f\x7f-\x9f{_BIDI}\ud800-\udfff]")
_SEPARATORS = re.compile("[\u2028\u2029]")
_UNSAFE_JSON = re.compile(f"[\x7f-\x9f{_BIDI}\ud800-\udfff]")


def _visible(match: re.Match[str]) -> str:
    code = ord(match.group())
    return f"\\x{code:02x}" if code < 0x100 else f"\\u{code:04x}"


def terminal_text(value: object, one_line: bool = False) -> str:
    """``str(value)`` with every control, escape and bidi character shown as a visible escape."""
    return (_UNSAFE_ONE_LINE if one_line else _UNSAFE_TERMINAL).sub(_visible, str(value))


def line_breaker(text: str) -> str | None:
    """The first character of ``text`` that a one-line field (an id) may not hold, shown as an escape.

    Control characters (newline and tab too), DEL, C1 controls, bidirectional
    controls, lone surrogates and the line and paragraph separators
    U+2028/U+2029; None when there is none.
    """
    found = _UNSAFE_ONE_LINE.search(text) or _SEPARATORS.search(text)
    return None if found is None else _visible(found)


def html_text(value: object) -> str:
    """``str(value)`` escaped for HTML text and attribute values (quotes too); unsafe characters replaced."""
    return html.escape(_UNSAFE_HTML.sub("\ufffd", str(value)), quote=True)


def json_text(text: str) -> str:
    """JSON text (from ``json.dumps(..., ensure_ascii=False)``) with DEL, C1, bidi and surrogate characters
    written as ``\\uXXXX``; C0 controls are escaped by ``json.dumps`` already. Still valid JSON: these
    characters can only occur inside strings."""
    return _UNSAFE_JSON.sub(lambda m: f"\\u{ord(m.group()):04x}", text)
