"""Slimmer saved notebooks and HTML pages: the inlined 3D viewer library left out of what is stored.

A notebook saved with its widget state keeps every output the kernel sent,
including the 540 KB of 3Dmol.js that a chairs view needs while a kernel
runs. A saved view cannot run without a kernel (an untrusted notebook or an
HTML export runs no script), so the stored copy never uses that text; it
only makes the file large. :func:`slim_text` replaces each inlined copy
(written by :func:`workbench.display.molview.library_script`) with a short
HTML comment; the views keep their note in words (``NOT_STARTED``) and the
flat chair drawings stay the record. :func:`slim_notebook` also drops, from
the saved widget state, the models no saved view shows (widgets a panel
replaced without closing: unreachable from every widget view in the
notebook's outputs) and the unset (``null``) attributes of layout models
(the widget library's layout defaults are all unset, so the state reads
back the same).

Applying any function twice changes nothing more (idempotent). Pure apart
from :func:`slim_file`, which reads and rewrites one file (only if it
changes). :func:`pre_save_hook` lets a Jupyter server slim every notebook as
it is saved.
"""

from __future__ import annotations

import json
import os
import re
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from workbench.files import write_text_atomic

__all__ = ["LEFT_OUT", "Slimmed", "slim_text", "slim_notebook", "slim_file", "pre_save_hook"]

LEFT_OUT = "<!-- 3D viewer library left out of the saved copy: a saved view cannot run without a kernel -->"

# The start and end that library_script() writes around the library's text (the text itself never holds
# "</script>": library_script escapes "</"). The end may carry a JSON escape ("<\/script>") in HTML exports.
_LIBRARY = re.compile(
    r"<script>if \(typeof window\.\$3Dmol === 'undefined'\) \{ \(function \(\) \{ var exports, module, define; "
    r".*?window\.\$3Dmol = window\['3Dmol'\]; \} \}<\\?/script>",
    re.DOTALL,
)
_WIDGET_STATE = "application/vnd.jupyter.widget-state+json"
_WIDGET_VIEW = "application/vnd.jupyter.widget-view+json"
_REFERENCE = re.compile(r"IPY_MODEL_([\w-]+)")


@dataclass(frozen=True)
class Slimmed:
    """What :func:`slim_file` did: sizes in bytes before and after, library copies and layout values removed."""

    path: Path
    before: int
    after: int
    copies: int
    nulls: int
    orphans: int = 0


def slim_text(text: str) -> tuple[str, int]:
    """``text`` with every inlined viewer library replaced by :data:`LEFT_OUT`; and how many were replaced."""
    return _LIBRARY.subn(LEFT_OUT, text)


def _slim_outputs(outputs: list[dict[str, Any]]) -> int:
    count = 0
    for output in outputs:
        data = output.get("data") or {}
        html = data.get("text/html")
        if isinstance(html, list):  # notebook format: a string may be stored as a list of lines
            html = "".join(html)
        if isinstance(html, str):
            slim, n = slim_text(html)
            if n:
                data["text/html"] = slim
                count += n
    return count


def _views(outputs: list[dict[str, Any]]) -> list[str]:
    """Model ids of the widget views among ``outputs``."""
    found = []
    for output in outputs:
        view = (output.get("data") or {}).get(_WIDGET_VIEW)
        if isinstance(view, dict) and isinstance(view.get("model_id"), str):
            found.append(view["model_id"])
    return found


def _reachable(state: dict[str, Any], roots: list[str]) -> set[str]:
    """Models reachable from ``roots`` through references (children, layout, style, views in outputs)."""
    seen: set[str] = set()
    stack = list(roots)
    while stack:
        key = stack.pop()
        if key in seen or key not in state:
            continue
        seen.add(key)
        attributes = state[key].get("state") or {}
        stack += _REFERENCE.findall(json.dumps(attributes))
        stack += _views(attributes.get("outputs") or []) if isinstance(attributes.get("outputs"), list) else []
    return seen


def slim_notebook(notebook: dict[str, Any]) -> tuple[int, int, int]:
    """Slim a notebook (its JSON as a dict) in place.

    Returns (library copies removed, unset layout values removed, unshown widget models removed).
    """
    copies = 0
    roots: list[str] = []
    for cell in notebook.get("cells", ()):
        copies += _slim_outputs(cell.get("outputs") or [])
        roots += _views(cell.get("outputs") or [])
    state = ((notebook.get("metadata") or {}).get("widgets") or {}).get(_WIDGET_STATE, {}).get("state") or {}
    roots += [k for k, m in state.items() if "Link" in str(m.get("model_name"))]  # links act on their own
    shown = _reachable(state, roots)
    orphans = [k for k in state if k not in shown]
    for key in orphans:
        del state[key]
    nulls = 0
    for model in state.values():
        attributes = model.get("state") or {}
        if model.get("model_name") == "OutputModel":
            copies += _slim_outputs(attributes.get("outputs") or [])
        elif model.get("model_name") == "LayoutModel" and model.get("model_module") == "@jupyter-widgets/base":
            unset = [k for k, v in attributes.items() if v is None]
            for key in unset:
                del attributes[key]
            nulls += len(unset)
    return copies, nulls, len(orphans)


def _dump(notebook: dict[str, Any]) -> str:
    """The notebook as JupyterLab writes it (one-space indent, keys sorted, UTF-8 kept, final newline)."""
    return json.dumps(notebook, indent=1, sort_keys=True, ensure_ascii=False) + "\n"


def slim_file(path: str | os.PathLike[str]) -> Slimmed:
    """Slim one ``.ipynb`` or ``.html`` file in place (rewritten only if something was removed).

    Raises ``ValueError`` naming the file if a notebook is not JSON, ``OSError`` if it cannot be read.
    """
    target = Path(path)
    text = target.read_text(encoding="utf-8")
    before = len(text.encode("utf-8"))
    nulls = orphans = 0
    if target.suffix == ".ipynb":
        try:
            notebook = json.loads(text)
        except json.JSONDecodeError as err:
            raise ValueError(f"{target}: not a notebook (JSON error at line {err.lineno}: {err.msg})") from None
        if not isinstance(notebook, dict):
            raise ValueError(f"{target}: not a notebook (the JSON is not an object)")
        copies, nulls, orphans = slim_notebook(notebook)
        slim = _dump(notebook) if copies or nulls or orphans else text
    else:
        slim, copies = slim_text(text)
    if slim != text:
        write_text_atomic(target, slim)
    return Slimmed(target, before, len(slim.encode("utf-8")), copies, nulls, orphans)


def pre_save_hook(model: dict[str, Any], **_kwargs: Any) -> None:
    """A Jupyter server ``ContentsManager.pre_save_hook``: slim a notebook just before it is written."""
    if model.get("type") == "notebook" and isinstance(model.get("content"), dict):
        slim_notebook(model["content"])
