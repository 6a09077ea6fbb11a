"""3D molecule views as HTML fragments: the viewer library inlined once per page, never fetched.

:func:`viewer_html` writes a row of 3D cells (one per :class:`Scene`) and the
script that draws them with 3Dmol.js (BSD-3-Clause, shipped in
``workbench/data/js``). The library's text is passed in by the caller and
inlined, so a view works with no network (instrument rooms, trains) and the
page never asks a CDN for anything. Either each fragment carries the library
(``library`` given: a stand-alone page), or the page carries it once in a
:func:`loader_html` output and every view waits for it (up to
:data:`WAIT_MS`), so a notebook holds the 540 KB text once, not once per view.
If the script cannot run (an untrusted notebook, a static copy), the library
never arrives or the viewer cannot start (no WebGL), the fragment says so in
words; the flat chair drawings shown beside it stay the record. Pure:
returns ``str``.
"""

from __future__ import annotations

import json
from collections.abc import Sequence
from dataclasses import dataclass

from workbench.display.palette import CAUTION, CAUTION_SOFT, FONT, MUTED, RULE, esc

__all__ = ["Mark", "Scene", "viewer_html", "NOT_STARTED", "WAIT_MS", "library_script", "loader_html", "LOADER_CLASS"]

NOT_STARTED = (
    "The 3D view needs the notebook's JavaScript (a trusted notebook with a running kernel); "
    "the flat chairs and the tables show the same conformers."
)

WAIT_MS = 15_000
"""How long (milliseconds) a view waits for the page's library before it says it could not start."""

LOADER_CLASS = "ss-3d-loader"
"""Class of the element a :func:`loader_html` output leaves on the page (a handle for tests and tools)."""


@dataclass(frozen=True)
class Mark:
    """A labelled sphere at a position (Angstrom), e.g. an axial group."""

    label: str
    x: float
    y: float
    z: float
    colour: str


@dataclass(frozen=True)
class Scene:
    """One cell of the viewer: a caption, a molecule as an MDL molfile, and its marks."""

    caption: str
    molblock: str
    marks: tuple[Mark, ...] = ()


def library_script(library: str) -> str:
    """A ``<script>`` that defines the viewer library once per page (the text is inlined, not linked).

    The library's own module loaders (``exports``, ``module``, ``define``) are
    hidden from it, so it always attaches itself to the page, whatever else
    the page has loaded.
    """
    safe = library.replace("</", "<\\/")
    return (
        "<script>if (typeof window.$3Dmol === 'undefined') { (function () { "
        "var exports, module, define; "
        f"{safe}\n"
        "}).call(window); if (typeof window.$3Dmol === 'undefined' && window['3Dmol']) "
        "{ window.$3Dmol = window['3Dmol']; } }</script>"
    )


def loader_html(library: str) -> str:
    """The page's one copy of the viewer library: a hidden marker and :func:`library_script`.

    Shown once per notebook session (the chairs panel does so); views made
    with ``library=None`` wait for it.
    """
    return f'<div class="{LOADER_CLASS}" style="display:none"></div>{library_script(library)}'


def viewer_html(scenes: Sequence[Scene], library: str | None, uid: str, width: int = 300, height: int = 300) -> str:
    """HTML of a row of 3D cells drawing ``scenes`` with 3Dmol.js.

    ``library`` is the library's text, inlined in the fragment; ``None``
    leaves it out: the script then waits up to :data:`WAIT_MS` for the page's
    copy (:func:`loader_html`). ``uid`` makes the element ids unique on the
    page. The outer element's ``data-state`` becomes ``ready`` when every cell
    is drawn and ``failed`` (with the reason shown) when the viewer cannot start.
    """
    root = f"ss3d-{esc(uid)}"
    cells = "".join(
        f'<div style="display:inline-block;vertical-align:top;margin:0 4px 4px 0">'
        f'<div id="{root}-{i}" class="ss-3d-cell" style="position:relative;width:{width}px;height:{height}px;'
        f'border:1px solid {RULE}"></div>'
        f'<div style="font-family:{FONT};font-size:12px;color:{MUTED};text-align:center">{esc(s.caption)}</div></div>'
        for i, s in enumerate(scenes)
    )
    data = [
        {
            "molblock": s.molblock,
            "marks": [{"label": m.label, "x": m.x, "y": m.y, "z": m.z, "colour": m.colour} for m in s.marks],
        }
        for s in scenes
    ]
    payload = json.dumps(data).replace("</", "<\\/")
    script = (
        "<script>(function () {"
        f"var root = document.getElementById({json.dumps(root)});"
        "if (!root) { return; }"
        "var note = root.querySelector('.ss-3d-note');"
        "function fail(why) { root.setAttribute('data-state', 'failed');"
        "note.textContent = 'The 3D viewer could not start (' + why + '). The flat chairs and the tables "
        "show the same conformers.'; note.style.display = 'block'; }"
        f"var waited = 0; function draw() {{"
        "try {"
        "var lib = window.$3Dmol || window['3Dmol'];"
        f"if (!lib && waited < {WAIT_MS}) {{ waited += 100; setTimeout(draw, 100); return; }}"
        "if (!lib) { fail('the 3Dmol.js library did not load'); return; }"
        f"var scenes = {payload};"
        "scenes.forEach(function (s, i) {"
        f"var cell = document.getElementById({json.dumps(root)} + '-' + i);"
        "var v = lib.createViewer(cell, {backgroundColor: 'white'});"
        "if (!v) { throw new Error('this browser offers no WebGL'); }"
        "v.addModel(s.molblock, 'mol');"
        "v.setStyle({}, {stick: {radius: 0.14}, sphere: {scale: 0.18}});"
        "s.marks.forEach(function (m) { var c = {x: m.x, y: m.y, z: m.z};"
        "v.addSphere({center: c, radius: 0.42, color: m.colour, opacity: 0.55});"
        "v.addLabel(m.label, {position: c, fontSize: 11, fontColor: 'white', backgroundColor: m.colour,"
        " backgroundOpacity: 0.85}); });"
        "v.zoomTo(); v.render(); });"
        "note.style.display = 'none'; root.setAttribute('data-state', 'ready');"
        "} catch (err) { fail(err && err.message ? err.message : String(err)); }"
        "} draw(); })();</script>"
    )
    note = (
        f'<div class="ss-3d-note" style="font-family:{FONT};font-size:12.5px;background:{CAUTION_SOFT};'
        f'border-left:4px solid {CAUTION};padding:4px 8px;margin:4px 0">{esc(NOT_STARTED)}</div>'
    )
    return (
        f'<div id="{root}" class="ss-3d" data-state="waiting">{note}<div class="ss-3d-cells">{cells}</div></div>'
        f"{library_script(library) if library is not None else ''}{script}"
    )
