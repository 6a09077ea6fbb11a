"""The evidence ledger: every observation with its effect, a what-if switch, edit and delete.

Switching an observation off keeps it in the project file and re-solves
without it; deleting moves it to the session's trash, from which the last
deletion can be undone.
"""

from __future__ import annotations

from collections.abc import Callable

import ipywidgets as w

from workbench.display.palette import FONT, INK, MUTED, RULE, STATUS_COLOURS, badge, esc
from workbench.display.tables import ledger_html, observation_values
from workbench.glossary import kind_name
from workbench.ui.base import Panel, dispose, heading

__all__ = ["LedgerPanel"]

_STATUS_WORDS = {"applied": "in use", "disabled": "switched off", "contradicts": "contradicts"}


class LedgerPanel(Panel):
    """All recorded observations, in order, with what each did to the candidates."""

    what = "evidence ledger"

    def __init__(self, session, on_edit: Callable | None = None) -> None:
        super().__init__(session)
        self.on_edit = on_edit
        self.rows = w.VBox()
        self.switches: dict[str, w.Checkbox] = {}
        self.undo_button = w.Button(description="Undo delete", icon="undo", disabled=True)
        self.undo_button.on_click(self.notices.guard(self._undo))
        self.all_on = w.Button(description="All on", tooltip="switch every observation back on")
        self.all_on.on_click(self.notices.guard(lambda _b: self.session.set_disabled(())))
        session.subscribe(self.notices.guard(lambda _s: self.refresh()))
        self.widget = w.VBox(
            [heading("Evidence ledger"), self.rows, w.HBox([self.undo_button, self.all_on]), self.notices.widget]
        )
        self.widget.add_class("ss-ledger-panel")  # a handle for styles and browser tests
        self.refresh()

    def _row(self, obs, step) -> w.Widget:
        switch = w.Checkbox(
            value=obs.id not in self.session.disabled,
            indent=False,
            layout=w.Layout(width="24px"),
            tooltip="use this observation (untick for a what-if)",
        )
        switch.observe(
            self.notices.guard(lambda change, oid=obs.id: self.session.set_enabled(oid, change["new"])), names="value"
        )
        self.switches[obs.id] = switch
        status = step.status if step else "applied"
        effect = ", ".join(f"{u} -{len(cs)}" for u, cs in step.eliminated.items()) if step else ""
        effect = effect or ("no change" if status == "applied" else "")
        who = " ".join(x for x in (obs.by, obs.recorded) if x)
        note = f'<div style="color:{MUTED};font-size:11.5px">{esc(obs.note)}</div>' if obs.note else ""
        text = w.HTML(
            f'<div style="font-family:{FONT};font-size:12.5px;color:{INK};line-height:1.3">'
            f"<b>{esc(obs.id)}</b> {esc(kind_name(obs.KIND))} "
            f"{badge(_STATUS_WORDS.get(status, status), STATUS_COLOURS.get(status, MUTED))} "
            f'<span style="color:{MUTED}">{esc(effect)}</span><br>{esc(observation_values(obs))}'
            f"{'<br><span style=color:' + MUTED + '>' + esc(who) + '</span>' if who else ''}{note}</div>",
            layout=w.Layout(width="100%"),
        )
        edit = w.Button(icon="pencil", tooltip=f"edit {obs.id}", layout=w.Layout(width="40px", padding="0"))
        edit.on_click(self.notices.guard(lambda _b, o=obs: self._edit(o)))
        delete = w.Button(
            icon="trash", tooltip=f"delete {obs.id} (can be undone)", layout=w.Layout(width="40px", padding="0")
        )
        delete.on_click(self.notices.guard(lambda _b, oid=obs.id: self.delete(oid)))
        return w.HBox(
            [switch, text, edit, delete],
            layout=w.Layout(border_bottom=f"1px solid {RULE}", padding="2px 0", align_items="flex-start"),
        )

    def refresh(self) -> None:
        """Rebuild the rows from the session's project and solution."""
        steps = {s.observation: s for s in self.session.solution.trail}
        for row in self.rows.children:
            dispose(row)
        self.switches = {}
        rows = [self._row(obs, steps.get(obs.id)) for obs in self.session.project.observations]
        if not rows:
            rows = [w.HTML(f'<div style="font-family:{FONT};color:{MUTED}">No observations yet.</div>')]
        self.rows.children = rows
        self.undo_button.disabled = not self.session.trash
        if self.session.trash:
            self.undo_button.description = f"Undo delete {self.session.trash[-1].id}"
        else:
            self.undo_button.description = "Undo delete"
        self.refresh_snapshot()

    def _edit(self, obs) -> None:
        if self.on_edit is None:
            self.notices.info("Editing needs the evidence form (use the full workbench).")
            return
        self.on_edit(obs)

    def delete(self, oid: str) -> None:
        """Delete an observation (what the bin button does)."""
        obs = self.session.delete(oid)
        self.notices.info(f"Deleted {obs.id}; 'Undo delete' brings it back.")

    def _undo(self, _button) -> None:
        obs = self.session.undo_delete()
        self.notices.info(f"Restored {obs.id}.")

    def snapshot_html(self) -> str:
        return ledger_html(self.session.project, self.session.solution)
