"""One input control per :class:`~workbench.evidence.observations.FieldSpec`, chosen by the field's type.

The controls are generated, never written per observation kind: a new kind in
the core gets its form for free. Each editor reports the raw value the user
typed (numbers parsed where they parse, the text kept where they do not, so
that the core's validator words the complaint) and shows a message inline.
"""

from __future__ import annotations

from collections.abc import Sequence
from typing import Any

import ipywidgets as w

from workbench.display.palette import CONFLICT, FONT, MUTED, esc
from workbench.glossary import field_name, term

__all__ = ["FieldEditor", "editor_for"]


def _label_layout() -> w.Layout:
    return w.Layout(width="150px")


def _wide_layout() -> w.Layout:
    return w.Layout(width="300px")


def _parse_number(text: str, integer: bool) -> Any:
    """A number from text, or the text itself when it does not parse (the core then says why)."""
    t = text.strip().replace(",", ".")
    if not t:
        return None
    try:
        number = float(t)
    except ValueError:
        return text
    if integer and number.is_integer():
        return int(number)
    return number


def _parse_list(text: str, integer: bool) -> Any:
    """A list of numbers from ``2, 3, 6`` (or ``2;3;6``), or the text itself when it does not parse."""
    t = text.strip().strip("[]")
    if not t:
        return None
    out = []
    for part in t.replace(";", ",").split(","):
        if not part.strip():
            continue
        value = _parse_number(part, integer)
        if isinstance(value, str):
            return text
        out.append(value)
    return out


class FieldEditor:
    """Label, control and inline message for one field of an observation kind."""

    def __init__(self, spec, unknowns: Sequence[str] = (), sugars: Sequence[str] = (), kind: str = "") -> None:
        self.spec = spec
        self.unknowns = list(unknowns)
        self.sugars = list(sugars)
        self.control = self._make_control()
        self.message = w.HTML("")
        unit = f" ({spec.unit})" if spec.unit else ""
        optional = "" if spec.required else " (optional)"
        self.label = w.HTML(
            f'<div style="font-family:{FONT};font-size:12.5px" title="{esc(spec.doc)}">'
            f"{esc(field_name(kind, spec.name))}{esc(unit)}{esc(optional)}</div>",
            layout=_label_layout(),
        )
        hint = w.HTML(f'<div style="font-family:{FONT};font-size:11px;color:{MUTED}">{esc(spec.doc)}</div>')
        self.widget = w.VBox(
            [
                w.HBox([self.label, self._container()]),
                w.HBox([w.HTML(layout=_label_layout()), hint]),
                w.HBox([w.HTML(layout=_label_layout()), self.message]),
            ]
        )
        if not spec.required and spec.default is not None:
            self.set(spec.default)

    # ------------------------------------------------------------ controls
    def _make_control(self) -> w.Widget:
        spec = self.spec
        if spec.type == "unknown":
            return w.Dropdown(
                options=self.unknowns,
                value=self.unknowns[0] if len(self.unknowns) == 1 else None,
                layout=_wide_layout(),
            )
        if spec.type == "member":
            return w.Combobox(
                options=self.unknowns + self.sugars,
                ensure_option=False,
                continuous_update=False,
                placeholder="unknown id, sugar name or SMILES",
                layout=_wide_layout(),
            )
        if spec.type == "members":
            self._picker = w.Combobox(
                options=self.unknowns + self.sugars,
                ensure_option=False,
                continuous_update=False,
                placeholder="add: unknown id, sugar name or SMILES",
                layout=_wide_layout(),
            )
            self._add = w.Button(description="add", layout=w.Layout(width="60px"))
            self._add.on_click(self._add_member)
            self._picker.observe(lambda change: self._add_member(None), names="value")
            return w.TagsInput(value=[], allow_duplicates=False, layout=w.Layout(width="420px"))
        if spec.type == "choice":
            labelled = [(term(c), c) for c in spec.choices]
            if len(spec.choices) <= 4:
                return w.ToggleButtons(options=labelled, value=None, style={"button_width": "auto"})
            return w.Dropdown(options=labelled, value=None, layout=_wide_layout())
        if spec.type == "bool":
            return w.ToggleButtons(options=[("yes", True), ("no", False)], value=None, style={"button_width": "60px"})
        if spec.type in ("int", "float"):
            placeholder = "whole number" if spec.type == "int" else "number"
            if spec.unit:
                placeholder += f" in {spec.unit}"
            return w.Text(placeholder=placeholder, continuous_update=False, layout=_wide_layout())
        if spec.type in ("positions", "numbers"):
            placeholder = "carbon numbers, e.g. 2, 3, 6" if spec.type == "positions" else "numbers, e.g. 3, 2, 1"
            return w.Text(placeholder=placeholder, continuous_update=False, layout=_wide_layout())
        return w.Text(continuous_update=False, layout=_wide_layout())

    def _container(self) -> w.Widget:
        if self.spec.type == "members":
            return w.VBox([self.control, w.HBox([self._picker, self._add])])
        return self.control

    def _add_member(self, _button) -> None:
        text = (self._picker.value or "").strip()
        if text and text not in self.control.value:
            self.control.value = list(self.control.value) + [text]
        if text:
            self._picker.value = ""

    # ------------------------------------------------------------ values
    def get(self) -> Any:
        """The value as the user gave it (None when left empty)."""
        spec = self.spec
        value = self.control.value
        if spec.type in ("int", "float"):
            return _parse_number(value or "", spec.type == "int")
        if spec.type == "members":
            return list(value) or None
        if spec.type in ("positions", "numbers"):
            return _parse_list(value or "", spec.type == "positions")
        if spec.type in ("member", "text"):
            return (value.strip() or None) if isinstance(value, str) else value
        return value

    def set(self, value: Any) -> None:
        """Show ``value`` in the control (None clears it)."""
        spec = self.spec
        if spec.type in ("int", "float"):
            self.control.value = "" if value is None else f"{value:g}" if isinstance(value, float) else str(value)
        elif spec.type == "members":
            self.control.value = list(value or [])
        elif spec.type in ("positions", "numbers"):
            self.control.value = "" if value is None else ", ".join(f"{v:g}" for v in value)
        elif spec.type in ("member", "text"):
            self.control.value = "" if value is None else str(value)
        elif spec.type == "unknown":
            if value is not None and value not in self.control.options:
                self.control.options = list(self.control.options) + [value]
            self.control.value = value
        else:
            self.control.value = value

    def show_error(self, problem: str) -> None:
        """Show the validator's message under the control."""
        self.message.value = f'<div class="ss-field-error" style="font-family:{FONT};font-size:12px;color:{CONFLICT}">{esc(problem)}</div>'

    def clear_error(self) -> None:
        """Remove the message."""
        self.message.value = ""

    def observe(self, callback) -> None:
        """Call ``callback(change)`` when the value changes."""
        self.control.observe(callback, names="value")


def editor_for(spec, unknowns: Sequence[str] = (), sugars: Sequence[str] = (), kind: str = "") -> FieldEditor:
    """The editor for one field spec (``kind`` chooses the field's label, e.g. "[α]D" for a rotation's value)."""
    return FieldEditor(spec, unknowns, sugars, kind)
