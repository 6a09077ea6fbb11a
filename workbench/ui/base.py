"""What every panel shares: a message line that shows errors, and a static copy kept in the output.

:class:`Notices` turns any exception raised in a callback into a visible
message (a stereosieve error as its own words; anything else with its type,
and logged with the traceback): nothing is swallowed. :class:`Panel`
displays its widget together with a static HTML rendition that is refreshed
on every change, so a notebook saved and opened without a kernel still shows
the evidence, the survivors and the drawings.
"""

from __future__ import annotations

import functools
import logging
from collections.abc import Callable
from typing import Any

import ipywidgets as w
from IPython.display import display

from workbench.display.palette import ACCENT, CONFLICT, CONFLICT_SOFT, FONT, MUTED, RULE, esc, live_css
from workbench.errors import WorkbenchError

__all__ = ["Notices", "Panel", "snapshot_frame", "heading", "dispose", "live", "show_live", "snapshot_bundle"]

log = logging.getLogger(__name__)


def heading(text: str, level: int = 3) -> w.HTML:
    """A panel heading in the workbench's accent colour."""
    size = {2: 17, 3: 15, 4: 13}.get(level, 13)
    return w.HTML(
        f'<div style="font-family:{FONT};font-size:{size}px;font-weight:600;color:{ACCENT}">{esc(text)}</div>'
    )


def dispose(widget: w.Widget) -> None:
    """Close a widget, its children and its own layout/style models (so replaced views do not pile up)."""
    for child in getattr(widget, "children", ()):
        dispose(child)
    for name in ("layout", "style"):
        part = getattr(widget, name, None)
        if isinstance(part, w.Widget):
            part.close()
    widget.close()


class Notices:
    """One line of feedback under a panel: errors in red, confirmations in grey."""

    def __init__(self) -> None:
        self.widget = w.HTML("")
        self.last_error: BaseException | None = None

    @property
    def text(self) -> str:
        """The HTML shown now (empty when there is nothing to say)."""
        return self.widget.value

    def error(self, err: BaseException) -> None:
        """Show ``err``: a stereosieve error in its own words, anything else with its type."""
        self.last_error = err
        if isinstance(err, WorkbenchError):
            message = str(err)
        else:
            message = f"{type(err).__name__}: {err} (this is a bug in stereosieve; the log has the traceback)"
        lines = "<br>".join(esc(line) for line in message.splitlines())
        self.widget.value = (
            f'<div class="ss-error" style="font-family:{FONT};font-size:12.5px;color:{CONFLICT};'
            f'background:{CONFLICT_SOFT};padding:3px 8px;border-radius:4px">{lines}</div>'
        )

    def info(self, message: str) -> None:
        """Show a short confirmation."""
        self.last_error = None
        self.widget.value = f'<div style="font-family:{FONT};font-size:12px;color:{MUTED}">{esc(message)}</div>'

    def clear(self) -> None:
        """Remove the message."""
        self.last_error = None
        self.widget.value = ""

    def guard(self, callback: Callable[..., Any]) -> Callable[..., Any]:
        """Wrap a widget callback so that any exception it raises is shown here."""

        @functools.wraps(callback)
        def wrapper(*args: Any, **kwargs: Any) -> Any:
            try:
                return callback(*args, **kwargs)
            except WorkbenchError as err:
                self.error(err)
            except Exception as err:  # shown to the user and logged; never swallowed silently
                log.exception("error in a workbench callback")
                self.error(err)
            return None

        return wrapper


def snapshot_frame(inner_html: str, what: str) -> str:
    """Wrap a static rendition with a line that says what it is (hidden while the live panels run)."""
    return (
        f'<details open class="ss-snapshot" style="font-family:{FONT};border-top:1px dashed {RULE};'
        f'margin-top:6px;padding-top:2px"><summary style="font-size:11px;color:{MUTED};cursor:pointer">'
        f"Saved view of the {esc(what)} (for readers without a running kernel; the interactive panels "
        f"need one)</summary>{inner_html}</details>"
    )


def snapshot_bundle(inner_html: str, what: str) -> dict[str, str]:
    """The static copy as a display bundle: sanitiser-safe HTML and a plain-text line (never an object repr)."""
    return {
        "text/html": snapshot_frame(inner_html, what),
        "text/plain": f"[saved view of the {what}: open the notebook in JupyterLab or a notebook viewer to read it]",
    }


def live(widget: w.Widget) -> w.Widget:
    """``widget`` marked as the live panels, with the style rules that go with them (see ``live_css``)."""
    box = w.VBox([w.HTML(live_css()), widget])
    box.add_class("ss-live")
    return box


def show_live(widget: w.Widget, what: str) -> None:
    """Display ``widget`` with a plain-text stand-in that says what it is (no ``VBox(children=...)`` repr).

    Where widgets cannot be drawn (an untrusted notebook, no kernel) the reader sees the stand-in and,
    below it, the static copy.
    """
    bundle = dict(widget._repr_mimebundle_() or {})
    bundle["text/plain"] = (
        f"[interactive {what}: needs a running kernel (and a trusted notebook); the saved view below shows the state]"
    )
    display(bundle, raw=True)


class Panel:
    """Base of the workbench panels: ``widget`` to interact with, ``snapshot_html()`` to keep."""

    what = "panel"

    def __init__(self, session) -> None:
        self.session = session
        self.notices = Notices()
        self._handles: list[Any] = []
        self.widget: w.Widget = w.VBox()

    def snapshot_html(self) -> str:
        """Static HTML of what the panel shows now (pure display-layer calls; markup every sanitiser keeps)."""
        return ""

    def refresh_snapshot(self) -> None:
        """Update every static copy already displayed."""
        if not self._handles:
            return
        bundle = snapshot_bundle(self.snapshot_html(), self.what)
        for handle in self._handles:
            handle.update(bundle, raw=True)

    def _ipython_display_(self) -> None:
        show_live(live(self.widget), self.what)
        handle = display(snapshot_bundle(self.snapshot_html(), self.what), raw=True, display_id=True)
        if handle is not None:
            self._handles.append(handle)
