"""The project panel: open and save the project file, the title, the unknowns and their scopes.

Saving uses the core's atomic writer (temporary file, then replace), so a
failed save never damages the file saved before. Opening another file while
there are unsaved changes asks for a second click.
"""

from __future__ import annotations

import ipywidgets as w

from workbench.chem.catalogue import CARBON_RANGE, Scope, scope_size
from workbench.display.palette import FONT, MUTED, esc
from workbench.display.tables import project_html
from workbench.ui.base import Panel, dispose, heading

__all__ = ["ProjectPanel", "ScopeEditor"]


class ScopeEditor:
    """Chain lengths, aldose/ketose, D/L and modification words of one unknown."""

    def __init__(self, uid: str, label: str, scope: Scope) -> None:
        self.uid = uid
        self.label = w.Text(
            value=label, placeholder="what this sample is", layout=w.Layout(width="360px"), continuous_update=False
        )
        self.carbons = {
            n: w.ToggleButton(value=n in scope.carbons, description=f"C{n}", layout=w.Layout(width="44px"))
            for n in CARBON_RANGE
        }
        self.carbonyl = {
            c: w.Checkbox(value=c in scope.carbonyl, description=c, indent=False, layout=w.Layout(width="80px"))
            for c in ("aldose", "ketose")
        }
        self.series = {
            s: w.Checkbox(value=s in scope.series, description=s, indent=False, layout=w.Layout(width="44px"))
            for s in ("D", "L")
        }
        self.modifications = w.Text(
            value=", ".join(scope.modifications),
            layout=w.Layout(width="300px"),
            placeholder="none, deoxy:6, amino:2, uronic, any ...",
            continuous_update=False,
        )
        self.count = w.HTML(self._count_html(scope))
        self.apply_button = w.Button(description="Apply", icon="check", tooltip=f"apply this scope to {uid}")
        self.remove_button = w.Button(icon="trash", tooltip=f"remove unknown {uid}", layout=w.Layout(width="34px"))
        self.widget = w.VBox(
            [
                w.HBox(
                    [
                        w.HTML(f"<b style='font-family:{FONT}'>{esc(uid)}</b>", layout=w.Layout(width="50px")),
                        self.label,
                        self.count,
                    ]
                ),
                w.HBox([w.HTML(layout=w.Layout(width="50px")), *self.carbons.values()]),
                w.HBox(
                    [
                        w.HTML(layout=w.Layout(width="50px")),
                        *self.carbonyl.values(),
                        *self.series.values(),
                        self.modifications,
                        self.apply_button,
                        self.remove_button,
                    ]
                ),
            ],
            layout=w.Layout(border_bottom="1px solid #d9d5cb", padding="3px 0"),
        )
        self.widget.add_class("ss-project-panel")  # a handle for styles and browser tests

    @staticmethod
    def _count_html(scope: Scope) -> str:
        return f'<span style="font-family:{FONT};font-size:12px;color:{MUTED}">{scope_size(scope)} candidates</span>'

    def scope_dict(self) -> dict:
        """The scope as the project file writes it (validated when applied)."""
        return {
            "carbons": [n for n, b in self.carbons.items() if b.value],
            "carbonyl": [c for c, b in self.carbonyl.items() if b.value],
            "series": [s for s, b in self.series.items() if b.value],
            "modifications": [m.strip() for m in self.modifications.value.split(",") if m.strip()],
        }


class ProjectPanel(Panel):
    """File, title and unknowns of the open project."""

    what = "project"

    def __init__(self, session) -> None:
        super().__init__(session)
        self.path = w.Text(
            value=str(session.path or ""),
            placeholder="project file, e.g. my_sugar.json",
            description="file",
            layout=w.Layout(width="420px"),
        )
        self.open_button = w.Button(description="Open", icon="folder-open")
        self.save_button = w.Button(description="Save", icon="save", button_style="primary")
        self.state = w.HTML()
        self.title = w.Text(
            value=session.project.title, description="title", layout=w.Layout(width="640px"), continuous_update=False
        )
        self.unknowns_box = w.VBox()
        self.new_id = w.Text(placeholder="new unknown id, e.g. U2", layout=w.Layout(width="200px"))
        self.add_button = w.Button(description="Add unknown", icon="plus")
        self.editors: dict[str, ScopeEditor] = {}
        self._armed_open = False
        self._shown_unknowns: tuple | None = None
        self.open_button.on_click(self.notices.guard(lambda _b: self.open()))
        self.save_button.on_click(self.notices.guard(lambda _b: self.save()))
        self.title.observe(self.notices.guard(lambda change: self.session.set_title(change["new"])), names="value")
        self.add_button.on_click(self.notices.guard(lambda _b: self.add_unknown()))
        session.subscribe(self.notices.guard(lambda _s: self.refresh()))
        self.widget = w.VBox(
            [
                heading("Project"),
                w.HBox([self.path, self.open_button, self.save_button]),
                self.state,
                self.title,
                self.unknowns_box,
                w.HBox([self.new_id, self.add_button]),
                self.notices.widget,
            ]
        )
        self.refresh()

    def refresh(self) -> None:
        """Show the session's file state, title and unknowns (rebuilt only when they changed)."""
        s = self.session
        where = str(s.path) if s.path else "not saved to a file yet"
        mark = " - unsaved changes" if s.dirty else " - saved"
        self.state.value = f'<span style="font-family:{FONT};font-size:12px;color:{MUTED}">{esc(where + mark)}</span>'
        if self.title.value != s.project.title:
            self.title.value = s.project.title
        shown = tuple(s.project.unknowns)
        if shown != self._shown_unknowns:
            self._shown_unknowns = shown
            for editor in self.editors.values():
                dispose(editor.widget)
            self.editors = {}
            for u in s.project.unknowns:
                editor = ScopeEditor(u.id, u.label, u.scope)
                editor.apply_button.on_click(self.notices.guard(lambda _b, uid=u.id: self.apply(uid)))
                editor.remove_button.on_click(self.notices.guard(lambda _b, uid=u.id: self.remove(uid)))
                editor.label.observe(self.notices.guard(lambda change, uid=u.id: self.apply(uid)), names="value")
                self.editors[u.id] = editor
            self.unknowns_box.children = [e.widget for e in self.editors.values()]
        self.refresh_snapshot()

    # ------------------------------------------------------------ actions
    def apply(self, uid: str) -> None:
        """Apply the label and scope typed for ``uid`` (the core validates the scope)."""
        editor = self.editors[uid]
        self.session.set_unknown(uid, editor.label.value.strip(), editor.scope_dict())
        self.notices.info(f"{uid}: scope applied.")

    def remove(self, uid: str) -> None:
        """Remove an unknown (refused while observations refer to it)."""
        self.session.remove_unknown(uid)
        self.notices.info(f"Removed unknown {uid}.")

    def add_unknown(self) -> None:
        """Add an unknown with the default scope under the id typed."""
        uid = self.new_id.value.strip()
        if uid in self.session.project.unknown_ids:
            self.notices.info(f"{uid} exists already: edit its row instead.")
            return
        self.session.set_unknown(uid)
        self.new_id.value = ""
        self.notices.info(f"Added unknown {uid} with the default scope.")

    def save(self) -> None:
        """Save to the file named in the box (atomic write)."""
        target = self.session.save(self.path.value.strip() or None)
        self.path.value = str(target)
        self.notices.info(f"Saved {target}.")

    def open(self) -> None:
        """Open the file named in the box; with unsaved changes, only on a second click."""
        if self.session.dirty and not self._armed_open:
            self._armed_open = True
            self.notices.info("There are unsaved changes: press Save first, or press Open again to discard them.")
            return
        self._armed_open = False
        self.session.load(self.path.value.strip())
        self.notices.info(f"Opened {self.session.path}.")

    def snapshot_html(self) -> str:
        return project_html(self.session.project)
