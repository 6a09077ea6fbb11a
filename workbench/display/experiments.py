"""The planner's ranking as static HTML: information, effort, predicted outcomes and cautions.

Renders a :class:`~workbench.evidence.planner.Plan` (or anything with the same
attributes). Every experiment that uses a hazardous reagent shows the
planner's cautions and a line deferring to the safety data sheet, local rules
and the institution's safety officer; the cautions are reminders, not a risk
assessment.
"""

from __future__ import annotations

from workbench.display.palette import ACCENT, ACCENT_SOFT, CAUTION, CAUTION_SOFT, FONT, INK, MUTED, RULE, esc
from workbench.display.tables import format_value

__all__ = ["SAFETY_DEFERRAL", "HAZARD_WORDS", "cautions_html", "experiment_html", "plan_html"]

SAFETY_DEFERRAL = (
    "Reminders only: before any work, read the safety data sheet of every reagent and follow your local rules "
    "and your institution's safety officer."
)
HAZARD_WORDS = {0: "no special hazard", 1: "low hazard", 2: "serious hazard", 3: "acutely lethal reagent"}


def _with_deferral(cautions) -> list[str]:
    lines = [str(c) for c in cautions]
    if lines and not any("safety data sheet" in line for line in lines):
        lines.append(SAFETY_DEFERRAL)
    return lines


def cautions_html(cautions) -> str:
    """A caution box; empty string when there is nothing to caution about."""
    lines = _with_deferral(cautions)
    if not lines:
        return ""
    items = "".join(f"<li>{esc(line)}</li>" for line in lines)
    return (
        f'<div class="ss-cautions" style="background:{CAUTION_SOFT};border-left:4px solid {CAUTION};'
        f'padding:3px 8px;margin:4px 0;font-size:12px;color:{INK}">'
        f'<b style="color:{CAUTION}">&#9888; Cautions</b><ul style="margin:2px 0 2px 0;padding-left:18px">'
        f"{items}</ul></div>"
    )


def _cost_text(cost) -> str:
    if cost is None:
        return ""
    if isinstance(cost, (int, float)):
        return f"effort {cost:g}"
    parts = []
    hours = getattr(cost, "hours", None)
    mg = getattr(cost, "material_mg", None)
    hazard = getattr(cost, "hazard", None)
    if hours is not None:
        parts.append(f"about {hours:g} h")
    if mg is not None:
        parts.append(f"{mg:g} mg of sample")
    if hazard is not None:
        parts.append(HAZARD_WORDS.get(hazard, f"hazard {hazard}"))
    return ", ".join(parts)


def _bits_bar(bits: float, scale: float = 40.0) -> str:
    w = max(1.0, min(bits, 6.0) * scale / 2)
    return (
        f'<span style="display:inline-block;width:{w:.0f}px;height:8px;background:{ACCENT};'
        f'border-radius:2px;margin-right:4px;vertical-align:middle"></span>'
    )


def experiment_html(rank: int, exp, outcome_limit: int = 6) -> str:
    """One ranked experiment: title, figures, predicted outcomes, cautions."""
    title = getattr(exp, "title", "") or f"{exp.kind} " + "; ".join(
        f"{k}: {format_value(v)}" for k, v in exp.fields.items()
    )
    figures = (
        f"{_bits_bar(exp.information_bits)}{exp.information_bits:.2f} bit · "
        f"about {exp.expected_remaining:.1f} candidates expected to remain · {esc(_cost_text(exp.cost))}"
    )
    outcome_rows = []
    for k, (label, names) in enumerate(exp.outcomes.items()):
        if k >= outcome_limit:
            outcome_rows.append(f"<li>... {len(exp.outcomes) - outcome_limit} more outcomes</li>")
            break
        shown = ", ".join(names[:8]) + (f" (+{len(names) - 8} more)" if len(names) > 8 else "")
        outcome_rows.append(f"<li><b>{esc(label)}</b> &rarr; {esc(shown)}</li>")
    unknown = getattr(exp, "unknown", "")
    return (
        f'<div class="ss-experiment" data-kind="{esc(exp.kind)}" style="border:1px solid {RULE};border-radius:6px;'
        f'padding:5px 9px;margin:5px 0;background:#ffffff">'
        f'<div><span style="color:{MUTED}">{rank}.</span> <b>{esc(title)}</b>'
        + (f' <span style="color:{MUTED};font-size:11px">[{esc(unknown)}]</span>' if unknown else "")
        + f'</div><div style="font-size:12px;color:{MUTED};margin:2px 0">{figures}</div>'
        f'<div style="font-size:12px">If the result is:<ul style="margin:1px 0;padding-left:18px">'
        f"{''.join(outcome_rows)}</ul></div>{cautions_html(exp.cautions)}</div>"
    )


def plan_html(plan, limit: int = 8) -> str:
    """The ranking best first (at most ``limit``), look-ahead pairs and the planner's advice."""
    parts = [f'<div class="ss-plan" style="font-family:{FONT};color:{INK};font-size:13px">']
    for line in getattr(plan, "advice", ()):
        parts.append(
            f'<div style="background:{ACCENT_SOFT};padding:4px 8px;margin:3px 0;border-radius:4px">{esc(line)}</div>'
        )
    experiments = list(plan.experiments)
    if not experiments and not getattr(plan, "advice", ()):
        parts.append(f'<p style="color:{MUTED}">No experiment left to suggest.</p>')
    ranking = getattr(plan, "ranking", "value")
    if experiments:
        how = "information per unit of effort" if ranking == "value" else "information alone"
        parts.append(f'<div style="color:{MUTED};font-size:12px">Ranked by {esc(how)}.</div>')
    for i, exp in enumerate(experiments[:limit], 1):
        parts.append(experiment_html(i, exp))
    if len(experiments) > limit:
        parts.append(f'<div style="color:{MUTED};font-size:12px">{len(experiments) - limit} more not shown.</div>')
    pairs = list(getattr(plan, "pairs", ()))
    if pairs:
        rows = "".join(
            f"<li>{esc(p.first.title)} <i>then</i> {esc(p.second.title)}: {p.information_bits:.2f} bit, "
            f"about {p.expected_remaining:.1f} left</li>"
            for p in pairs[:5]
        )
        parts.append(f'<div style="margin-top:6px"><b>Two steps ahead</b><ul>{rows}</ul></div>')
    parts.append("</div>")
    return "".join(parts)
