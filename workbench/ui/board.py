"""The candidate board: one tab per unknown with its survivors, narrowing chart and eliminations.

Drawing is done by the pure display layer (:func:`workbench.display.board.board_html`);
this panel only decides what to redraw. "Where is ...?" looks a candidate up
by name or SMILES and says whether it survives or which observation removed it.
"""

from __future__ import annotations

import ipywidgets as w

from workbench.chem.names import display_name
from workbench.chem.order import in_configurational_order
from workbench.chem.parse import resolve
from workbench.display.board import board_html, solution_html
from workbench.display.chart import narrowing_chart
from workbench.display.palette import ACCENT, CONFLICT, FONT, INK, esc
from workbench.display.tables import conflicts_html
from workbench.errors import WorkbenchError
from workbench.ui.base import Panel, dispose, heading

__all__ = ["CandidateBoard"]


class CandidateBoard(Panel):
    """Survivors of every unknown as Fischer projections, updated on every change of evidence."""

    what = "candidate board"

    def __init__(self, session, limit: int = 24) -> None:
        super().__init__(session)
        self.limit = limit
        self.conflicts = w.HTML()
        self.overview = w.HTML()
        self.tabs = w.Tab()
        self.pages: dict[str, w.HTML] = {}
        self.query = w.Text(
            placeholder="where is ... ? (name or SMILES, Enter)",
            continuous_update=False,
            layout=w.Layout(width="320px"),
        )
        self.query_unknown = w.Dropdown(layout=w.Layout(width="120px"))
        self.answer = w.HTML()
        self.query.observe(self.notices.guard(lambda change: self.locate()), names="value")
        self.query_unknown.observe(self.notices.guard(lambda change: self.locate()), names="value")
        session.subscribe(self.notices.guard(lambda _s: self.refresh()))
        self.widget = w.VBox(
            [
                heading("Candidates"),
                self.conflicts,
                self.tabs,
                self.overview,
                w.HBox([self.query, self.query_unknown]),
                self.answer,
                self.notices.widget,
            ]
        )
        self.widget.add_class("ss-board-panel")  # a handle for styles and browser tests
        self.refresh()

    def _ensure_tabs(self) -> None:
        ids = list(self.session.project.unknown_ids)
        if list(self.pages) == ids:
            return
        for page in self.pages.values():
            dispose(page)
        self.pages = {uid: w.HTML() for uid in ids}
        self.tabs.children = list(self.pages.values())
        self.tabs.titles = tuple(ids)
        self.query_unknown.options = ids
        self.query_unknown.value = ids[0]

    def refresh(self) -> None:
        """Redraw every unknown's page from the session's current solution."""
        solution = self.session.solution
        self._ensure_tabs()
        self.conflicts.value = conflicts_html(solution)
        for uid, page in self.pages.items():
            page.value = board_html(solution, uid, self.limit)
        titles = []
        for uid in self.pages:
            titles.append(f"{uid} ({len(solution.survivors[uid])})")
        self.tabs.titles = tuple(titles)
        if len(self.pages) > 1:
            self.overview.value = narrowing_chart(solution, title="All unknowns", large=True)
        else:
            self.overview.value = ""
        if self.query.value.strip():
            self.locate()
        self.refresh_snapshot()

    def survivor_names(self, uid: str) -> list[str]:
        """Names of the survivors of ``uid`` as the board shows them."""
        return [display_name(c) for c in in_configurational_order(self.session.solution.survivors[uid])]

    def locate(self) -> str:
        """Answer "where is ...?" for the text in the query box; returns the answer HTML."""
        text = self.query.value.strip()
        uid = self.query_unknown.value
        self.answer.value = ""  # never leave the answer to an earlier question on show
        if not text or uid is None:
            return ""
        try:
            chain = resolve(text)
        except WorkbenchError as err:
            self.answer.value = (
                f'<div class="ss-answer" style="font-family:{FONT};font-size:12.5px;color:{CONFLICT}">'
                f"{esc(text)}: {esc(err)}</div>"
            )
            return self.answer.value
        name = display_name(chain) if chain.is_sugar else text
        solution = self.session.solution
        if chain in solution.survivors[uid]:
            verdict = f"<b style='color:{ACCENT}'>survives</b> for {esc(uid)}"
        else:
            reason = solution.reason(uid, chain)
            if reason:
                verdict = f"eliminated from {esc(uid)} by {esc(reason)}"
            elif solution.contradictory:
                verdict = f"not a survivor of {esc(uid)}: the evidence is contradictory"
            else:
                verdict = f"not in the scope of {esc(uid)}"
        self.answer.value = f'<div class="ss-answer" style="font-family:{FONT};font-size:12.5px;color:{INK}">{esc(name)}: {verdict}</div>'
        return self.answer.value

    def snapshot_html(self) -> str:
        return solution_html(self.session.solution, self.limit, medium="plain")
