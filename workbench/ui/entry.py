"""Evidence entry: a form per observation kind, generated from the kind's field specs.

Every value is checked by the core as it is typed (the observation type for
the values, the project loader for references to unknowns and sugars) and
the complaint is shown under the field at fault. Recording hands the checked
observation to the session; the board and the ledger follow.
"""

from __future__ import annotations

import datetime as _dt
from collections.abc import Mapping
from typing import Any

import ipywidgets as w

from workbench.chem.names import known_names
from workbench.display.palette import CONFLICT, FONT, esc
from workbench.display.tables import kinds_html
from workbench.errors import ObservationError
from workbench.evidence.observations import OBSERVATION_TYPES, Observation
from workbench.glossary import kind_name
from workbench.ui.base import Panel, dispose, heading
from workbench.ui.fields import FieldEditor, editor_for

__all__ = ["EvidenceForm"]


class EvidenceForm(Panel):
    """Record a result: choose the kind of experiment, fill in what was seen, record it."""

    what = "kinds of evidence"

    def __init__(self, session, kind: str = "bromine_water") -> None:
        super().__init__(session)
        self.sugars = known_names()
        self.kind = w.Dropdown(
            options=[(f"{kind_name(k)}: {cls.TITLE}", k) for k, cls in OBSERVATION_TYPES.items()],
            value=kind,
            description="experiment",
            layout=w.Layout(width="100%", max_width="560px"),
        )
        self.id_box = w.Text(description="id", layout=w.Layout(width="180px"), continuous_update=False)
        self.by = w.Text(description="by", layout=w.Layout(width="200px"), continuous_update=False)
        self.recorded = w.Text(
            description="date",
            value=_dt.date.today().isoformat(),
            layout=w.Layout(width="200px"),
            continuous_update=False,
        )
        self.note = w.Textarea(
            description="note",
            placeholder="conditions, sample, notebook page ...",
            continuous_update=False,
            layout=w.Layout(width="100%", max_width="560px", height="52px"),
        )
        self.meta_message = w.HTML("")
        self.record_button = w.Button(description="Record", button_style="success", icon="check")
        self.new_button = w.Button(description="New entry", icon="file")
        self.editing: str | None = None
        self.editors: dict[str, FieldEditor] = {}
        self.fields_box = w.VBox()
        self.kind.observe(self.notices.guard(self._kind_changed), names="value")
        for box in (self.id_box, self.by, self.recorded, self.note):
            box.observe(self.notices.guard(lambda change: self.validate(quiet=True)), names="value")
        self.record_button.on_click(self.notices.guard(self._record))
        self.new_button.on_click(self.notices.guard(lambda _b: self.reset()))
        self._unknowns = tuple(session.project.unknown_ids)
        session.subscribe(self.notices.guard(self._session_changed))
        self._build_fields()
        self.id_box.value = session.project.next_id()
        self.widget = w.VBox(
            [
                heading("Record a result"),
                self.kind,
                self.fields_box,
                w.HBox([self.id_box, self.by, self.recorded]),
                self.note,
                self.meta_message,
                w.HBox([self.record_button, self.new_button]),
                self.notices.widget,
            ]
        )
        self.widget.add_class("ss-form")  # a handle for styles and browser tests

    # ------------------------------------------------------------ building
    def _build_fields(self, keep: Mapping[str, Any] | None = None) -> None:
        cls = OBSERVATION_TYPES[self.kind.value]
        unknowns = list(self.session.project.unknown_ids)
        for editor in self.editors.values():
            dispose(editor.widget)
        self.editors = {spec.name: editor_for(spec, unknowns, self.sugars, cls.KIND) for spec in cls.SPECS}
        for name, editor in self.editors.items():
            if keep and keep.get(name) is not None:
                editor.set(keep[name])
            editor.observe(self.notices.guard(lambda change: self.validate(quiet=True)))
        self.fields_box.children = [e.widget for e in self.editors.values()]

    def _kind_changed(self, change) -> None:
        old = {name: e.get() for name, e in self.editors.items()}
        keep = {k: v for k, v in old.items() if k in ("unknown", "members", "substrate")}
        self._build_fields(keep)
        self.validate(quiet=True)

    def _session_changed(self, session) -> None:
        if tuple(session.project.unknown_ids) != self._unknowns:
            self._unknowns = tuple(session.project.unknown_ids)
            self._build_fields({name: e.get() for name, e in self.editors.items()})
        used = {o.id for o in session.project.observations}
        if self.editing is None and (not self.id_box.value or self.id_box.value in used):
            self.id_box.value = session.project.next_id()

    # ------------------------------------------------------------ values
    def values(self) -> dict[str, Any]:
        """The entry as a project-file observation dict (empty fields left out)."""
        data: dict[str, Any] = {"id": self.id_box.value.strip(), "kind": self.kind.value}
        for name, editor in self.editors.items():
            value = editor.get()
            if value is not None:
                data[name] = value
        for key, box in (("note", self.note), ("by", self.by), ("recorded", self.recorded)):
            if box.value.strip():
                data[key] = box.value.strip()
        return data

    def validate(self, quiet: bool = False) -> Observation | None:
        """Check the entry with the core; show the problem under its field. None if invalid.

        ``quiet`` (used while typing) does not complain about fields not filled in yet.
        """
        editor: FieldEditor | None
        for editor in self.editors.values():
            editor.clear_error()
        self.meta_message.value = ""
        try:
            return self.session.check(self.values())
        except ObservationError as err:
            field = err.field
            if quiet and err.problem.startswith("missing"):
                return None
            editor = self.editors.get(field or "")
            if editor is not None:
                editor.show_error(err.problem)
            else:
                where = f"{field}: " if field else ""
                self.meta_message.value = (
                    f'<div class="ss-field-error" style="font-family:{FONT};font-size:12px;color:{CONFLICT}">'
                    f"{esc(where + err.problem)}</div>"
                )
            return None

    def errors(self) -> dict[str, str]:
        """Inline messages now shown, by field name (``""`` for the id/date/note line)."""
        out = {name: e.message.value for name, e in self.editors.items() if e.message.value}
        if self.meta_message.value:
            out[""] = self.meta_message.value
        return out

    # ------------------------------------------------------------ actions
    def _record(self, _button=None) -> None:
        self.record()

    def record(self) -> Observation | None:
        """Record the entry as it stands (what the Record button does); returns it, or None if invalid."""
        obs = self.validate()
        if obs is None:
            self.notices.info("Not recorded: see the message under the field.")
            return None
        replaced = self.editing == obs.id
        self.session.record(obs)
        self.notices.info(f"{'Updated' if replaced else 'Recorded'} {obs.id} ({kind_name(obs.KIND)}).")
        self.reset(keep_message=True)
        return obs

    def reset(self, keep_message: bool = False) -> None:
        """A blank entry of the same kind with a fresh id (keeps the author)."""
        self.editing = None
        self.record_button.description = "Record"
        self._build_fields()
        self.note.value = ""
        self.id_box.value = self.session.project.next_id()
        if not keep_message:
            self.notices.clear()

    def load(self, obs: Observation) -> None:
        """Fill the form with an existing observation for editing (Record then replaces it)."""
        self.kind.value = obs.KIND
        self._build_fields(obs.values())
        self.id_box.value = obs.id
        self.note.value = obs.note
        self.by.value = obs.by
        self.recorded.value = obs.recorded
        self.editing = obs.id
        self.record_button.description = f"Save {obs.id}"
        self.notices.info(f"Editing {obs.id}: change what you need and press Save {obs.id}.")

    def prefill(self, kind: str, fields: Mapping[str, Any]) -> None:
        """Start an entry of ``kind`` with the given fields (e.g. from the planner); results left blank."""
        if kind not in OBSERVATION_TYPES:
            raise ObservationError(None, "kind", f"unknown kind {kind!r}; known kinds: {', '.join(OBSERVATION_TYPES)}")
        self.editing = None
        self.record_button.description = "Record"
        self.kind.value = kind
        names = {s.name for s in OBSERVATION_TYPES[kind].SPECS}
        self._build_fields({k: v for k, v in fields.items() if k in names})
        self.id_box.value = self.session.project.next_id()
        self.notices.info(f"Prepared a {kind_name(kind)} entry: fill in the result when you have it.")

    def snapshot_html(self) -> str:
        return kinds_html(OBSERVATION_TYPES)
