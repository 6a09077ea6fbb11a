"""Pure display layer: SVG drawings and HTML fragments as ``str`` (no widget or IPython imports).

Two media: SVG drawings (live panels, the report) and plain markup that
every notebook sanitiser keeps (:mod:`workbench.display.plain`, for the
views saved in notebooks). Used by the notebook views (:mod:`workbench.ui`), the HTML report
(:mod:`workbench.report`) and the ``_repr_svg_`` of :class:`~workbench.chem.chain.Chain`.
"""

from workbench.display.board import board_html, solution_html, survivor_card, survivors_html
from workbench.display.chairs import chair_figure, chair_svg, ring_predictions_html
from workbench.display.chart import narrowing_chart, narrowing_figure, narrowing_svg
from workbench.display.curve import curve_svg
from workbench.display.experiments import SAFETY_DEFERRAL, cautions_html, experiment_html, plan_html
from workbench.display.figure import Figure
from workbench.display.fischer import (
    FischerRow,
    FischerStyle,
    chain_svg,
    disputed_centres,
    fischer_rows,
    fischer_svg,
)
from workbench.display.plain import fischer_pre, fischer_text, narrowing_table, plain_card
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
    "Figure",
    "FischerRow",
    "FischerStyle",
    "SAFETY_DEFERRAL",
    "board_html",
    "cautions_html",
    "chain_svg",
    "chair_figure",
    "chair_svg",
    "conflicts_html",
    "curve_svg",
    "disputed_centres",
    "eliminated_html",
    "experiment_html",
    "fischer_pre",
    "fischer_rows",
    "fischer_svg",
    "fischer_text",
    "kinds_html",
    "ledger_html",
    "narrowing_chart",
    "narrowing_figure",
    "narrowing_svg",
    "narrowing_table",
    "observation_values",
    "plain_card",
    "plan_html",
    "project_html",
    "ring_predictions_html",
    "solution_html",
    "survivor_card",
    "survivors_html",
    "trail_html",
]
