"""The workbench: every panel on one open project, laid out for a day at the bench.

Left, what was done (record a result, the ledger); right, what it means
(candidates, what to try next, chairs, project). Below, one static copy of
the whole state, refreshed on every change, so the saved notebook reads
without a kernel.
"""

from __future__ import annotations

import os

import ipywidgets as w
from IPython.display import display

from workbench.display.board import solution_html
from workbench.display.experiments import plan_html
from workbench.display.palette import ACCENT, CONFLICT, FONT, MUTED, esc
from workbench.display.tables import project_html
from workbench.evidence.project import Project
from workbench.ui.base import Notices, live, show_live, snapshot_bundle
from workbench.ui.board import CandidateBoard
from workbench.ui.chairs import ChairPanel
from workbench.ui.entry import EvidenceForm
from workbench.ui.ledger import LedgerPanel
from workbench.ui.planning import NextExperimentPanel
from workbench.ui.project_panel import ProjectPanel
from workbench.ui.session import Session

__all__ = ["Workbench"]


class Workbench:
    """All panels of one session. ``Workbench.open("file.json")`` in a notebook cell, then display it."""

    def __init__(self, session: Session | Project, follow_plan: bool = True) -> None:
        self.session = session if isinstance(session, Session) else Session(session)
        self.notices = Notices()
        self.form = EvidenceForm(self.session)
        self.ledger = LedgerPanel(self.session, on_edit=self._edit)
        self.board = CandidateBoard(self.session)
        self.planner = NextExperimentPanel(self.session, on_prepare=self._prepare, follow=follow_plan)
        self.chairs = ChairPanel(self.session)
        self.project = ProjectPanel(self.session)
        self.header = w.HTML()
        self.tabs = w.Tab(children=[self.board.widget, self.planner.widget, self.chairs.widget, self.project.widget])
        self.tabs.titles = ("Candidates", "What to try next", "Chairs in 3D", "Project")
        # Side by side where the notebook is wide enough (about 900 px of cell width: JupyterLab at
        # 1,400 px with the file browser open); the candidates wrap below the evidence only when narrower.
        left = w.VBox(
            [self.form.widget, self.ledger.widget],
            layout=w.Layout(flex="1 1 400px", min_width="0", padding="0 10px 0 0", overflow="hidden"),
        )
        right = w.VBox([self.tabs], layout=w.Layout(flex="1.4 1 480px", min_width="0", overflow="hidden"))
        body = w.HBox([left, right], layout=w.Layout(flex_flow="row wrap", align_items="flex-start", width="100%"))
        self.widget = live(w.VBox([self.header, body, self.notices.widget]))
        self._handle = None
        self.session.subscribe(self.notices.guard(lambda _s: self._refresh()))
        self._refresh()

    @classmethod
    def open(cls, path: str | os.PathLike[str], follow_plan: bool = True) -> Workbench:
        """A workbench on the project file at ``path``."""
        return cls(Session.open(path), follow_plan=follow_plan)

    # ------------------------------------------------------------ wiring
    def _edit(self, obs) -> None:
        self.form.load(obs)

    def _prepare(self, kind: str, fields: dict) -> None:
        self.form.prefill(kind, fields)

    def _header_html(self) -> str:
        s = self.session
        counts = " · ".join(f"{uid}: {len(s.solution.survivors[uid])} left" for uid in s.project.unknown_ids)
        state = "unsaved changes" if s.dirty else "saved"
        where = str(s.path) if s.path else "no file yet"
        whatif = f" · what-if: {', '.join(sorted(s.disabled))} off" if s.disabled else ""
        warn = f" · <b style='color:{CONFLICT}'>contradictory evidence</b>" if s.solution.contradictory else ""
        return (
            f'<div style="font-family:{FONT}"><span style="font-size:18px;font-weight:600;color:{ACCENT}">'
            f"{esc(s.project.title or '(untitled project)')}</span><br>"
            f'<span style="font-size:12px;color:{MUTED}">{esc(where)} ({state}) · {esc(counts)}{esc(whatif)}</span>'
            f"{warn}</div>"
        )

    def _refresh(self) -> None:
        self.header.value = self._header_html()
        if self._handle is not None:
            self._handle.update(snapshot_bundle(self.snapshot_html(), "workbench"), raw=True)

    # ------------------------------------------------------------ static copy
    def snapshot_html(self) -> str:
        """The whole state as static HTML every sanitiser keeps: solution (boards, trail, ledger), project, plan."""
        parts = [solution_html(self.session.solution, medium="plain"), project_html(self.session.project)]
        if self.planner.plan is not None:
            parts.append(
                f'<div style="font-family:{FONT};font-weight:600;color:{ACCENT};margin-top:8px">What to try next</div>'
            )
            parts.append(plan_html(self.planner.plan))
        parts.append(self.chairs.snapshot_html())
        return "".join(parts)

    def _ipython_display_(self) -> None:
        show_live(self.widget, "workbench")
        self._handle = display(snapshot_bundle(self.snapshot_html(), "workbench"), raw=True, display_id=True)
