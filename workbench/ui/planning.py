"""What to try next: the planner's ranking with information, effort, outcomes and cautions.

The ranking comes from :func:`workbench.evidence.planner.plan`; this panel
chooses the unknown, the ranking rule and the look-ahead, and can hand a
suggested experiment to the evidence form. Cautions are shown as the planner
gives them, with the line that defers to the safety data sheet, local rules
and the institution's safety officer.
"""

from __future__ import annotations

from collections.abc import Callable

import ipywidgets as w

from workbench.display.experiments import plan_html
from workbench.glossary import kind_name
from workbench.ui.base import Panel, heading

__all__ = ["NextExperimentPanel"]

_ALL = "all unknowns"


class NextExperimentPanel(Panel):
    """Ranks the next experiments for the current evidence (on demand, or after every change)."""

    what = "next-experiment ranking"

    def __init__(self, session, on_prepare: Callable | None = None, follow: bool = True, limit: int = 8) -> None:
        super().__init__(session)
        self.on_prepare = on_prepare
        self.limit = limit
        self.plan = None
        self.unknown = w.Dropdown(
            options=[_ALL, *session.project.unknown_ids], value=_ALL, description="for", layout=w.Layout(width="220px")
        )
        self.ranking = w.ToggleButtons(
            options=[("bits per effort", "value"), ("bits only", "information")],
            value="value",
            style={"button_width": "auto"},
        )
        self.lookahead = w.Checkbox(value=False, description="two steps ahead", indent=False)
        self.follow = w.Checkbox(value=follow, description="re-rank after every change", indent=False)
        self.rank_button = w.Button(description="Rank", icon="sort-amount-desc", button_style="info")
        self.choice = w.Dropdown(description="suggestion", layout=w.Layout(width="460px"))
        self.prepare_button = w.Button(
            description="Prepare entry", icon="edit", tooltip="start an entry of this experiment in the evidence form"
        )
        self.output = w.HTML()
        self.rank_button.on_click(self.notices.guard(lambda _b: self.rank()))
        self.prepare_button.on_click(self.notices.guard(lambda _b: self.prepare()))
        for control in (self.unknown, self.ranking, self.lookahead):
            control.observe(self.notices.guard(lambda change: self.rank()), names="value")
        session.subscribe(self.notices.guard(self._session_changed))
        self.widget = w.VBox(
            [
                heading("What to try next"),
                w.HBox([self.unknown, self.ranking]),
                w.HBox([self.lookahead, self.follow, self.rank_button]),
                self.output,
                w.HBox([self.choice, self.prepare_button]),
                self.notices.widget,
            ]
        )
        self.widget.add_class("ss-plan-panel")  # a handle for styles and browser tests
        if follow:
            self.rank()

    def _session_changed(self, session) -> None:
        options = [_ALL, *session.project.unknown_ids]
        if list(self.unknown.options) != options:
            current = self.unknown.value
            self.unknown.options = options
            self.unknown.value = current if current in options else _ALL
        if self.follow.value:
            self.rank()

    def rank(self):
        """Ask the planner (through the session) and show the ranking; returns the plan."""
        unknown = None if self.unknown.value in (None, _ALL) else self.unknown.value
        self.plan = self.session.plan(unknown=unknown, lookahead=self.lookahead.value, ranking=self.ranking.value)
        self.output.value = plan_html(self.plan, self.limit)
        options = [
            (f"{i}. {exp.title or kind_name(exp.kind)}", i - 1)
            for i, exp in enumerate(self.plan.experiments[: self.limit], 1)
        ]
        previous = self.choice.value
        with self.choice.hold_sync():
            self.choice.options = options
            # the best suggestion is chosen unless the chemist had chosen another that is still offered
            self.choice.value = (
                previous if previous is not None and previous < len(options) else (0 if options else None)
            )
        self.prepare_button.disabled = not self.plan.experiments
        self.refresh_snapshot()
        return self.plan

    def prepare(self) -> None:
        """Hand the chosen suggestion to the evidence form (kind and defining fields; result left blank)."""
        if self.plan is None:
            self.rank()
        assert self.plan is not None
        if not self.plan.experiments:
            self.notices.info("No experiment left to suggest.")
            return
        index = self.choice.value if self.choice.value is not None else 0
        exp = self.plan.experiments[index]
        if self.on_prepare is None:
            self.notices.info("Preparing an entry needs the evidence form (use the full workbench).")
            return
        self.on_prepare(exp.kind, dict(exp.fields))
        self.notices.info(f"Prepared: {exp.title or kind_name(exp.kind)}. Fill in the result under 'Record a result'.")

    def snapshot_html(self) -> str:
        if self.plan is None:
            return ""
        return plan_html(self.plan, self.limit)
