"""Pure display layer: SVG drawings and HTML fragments as ``str`` (no widget or IPython imports).

Used by the notebook views (:mod:`workbench.ui`), the HTML report
(:mod:`workbench.report`) and the ``_repr_svg_`` of :class:`~workbench.chem.chain.Chain`.
"""

from workbench.display.board import board_html, solution_html, survivor_card, survivors_html
from workbench.display.chairs import chair_svg, ring_predictions_html
from workbench.display.chart import narrowing_chart, narrowing_svg
from workbench.display.curve import curve_svg
from workbench.display.experiments import SAFETY_DEFERRAL, cautions_html, experiment_html, plan_html
from workbench.display.fischer import (
    FischerRow,
    FischerStyle,
    chain_svg,
    disputed_centres,
    fischer_rows,
    fischer_svg,
)
from workbench.display.tables import (
    conflicts_html,
    eliminated_html,
    kinds_html,
    ledger_html,
    observation_values,
    project_html,
    trail_html,
)

__all__ = [
    "FischerRow",
    "FischerStyle",
    "SAFETY_DEFERRAL",
    "board_html",
    "cautions_html",
    "chain_svg",
    "chair_svg",
    "conflicts_html",
    "curve_svg",
    "disputed_centres",
    "eliminated_html",
    "experiment_html",
    "fischer_rows",
    "fischer_svg",
    "kinds_html",
    "ledger_html",
    "narrowing_chart",
    "narrowing_svg",
    "observation_values",
    "plan_html",
    "project_html",
    "ring_predictions_html",
    "solution_html",
    "survivor_card",
    "survivors_html",
    "trail_html",
]
