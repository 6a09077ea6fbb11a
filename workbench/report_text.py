"""Plain-data and plain-text renderings of structures and predictions for the CLI.

Pure functions that return dicts (for ``--json``) or strings (for the
terminal); no printing here.
"""

from __future__ import annotations

from workbench.chem.chain import Chain
from workbench.chem.names import display_name, systematic_name
from workbench.chem.smiles import to_inchikey, to_smiles
from workbench.chem.symbols import symbol
from workbench.escaping import terminal_text
from workbench.glossary import observation_text

__all__ = ["identity_json", "predict_json", "predict_text", "compound_text", "probability_bar"]


def identity_json(chain: Chain) -> dict:
    """``name``, ``systematic_name``, ``smiles`` (open chain), ``inchikey``, ``carbons``, ``series``."""
    return {
        "name": display_name(chain),
        "systematic_name": systematic_name(chain),
        "smiles": to_smiles(chain),
        "inchikey": to_inchikey(chain),
        "carbons": chain.carbons,
        "series": chain.series,
        "formula": chain.formula,
        "symbol": symbol(chain),
    }


def predict_json(chain: Chain) -> dict:
    """The ``predictions`` block of ``predict --json`` (keys in DESIGN.md)."""
    from workbench.chem.predictions import predictions_json
    from workbench.conformers.calibration import quantities_json
    from workbench.conformers.summary import physical_json

    data = predictions_json(chain)
    data.update(physical_json(chain))
    data["quantities"] = quantities_json(chain)  # Contract 3: value, standard error, class, flags
    return data


def predict_text(chain: Chain) -> str:
    """A readable summary of ``predict_json`` for the terminal."""
    ident = identity_json(chain)
    lines = [
        f"{ident['name']}  ({ident['systematic_name']})",
        f"  formula {ident['formula']}, {ident['carbons']} carbons, series {ident['series'] or '-'}"
        + (f", symbol {ident['symbol']}" if ident["symbol"] else ""),
        f"  SMILES   {ident['smiles']}",
        f"  InChIKey {ident['inchikey']}",
    ]
    data = predict_json(chain)
    for key in _TEXT_KEYS:
        if key in data:
            lines.append(f"  {key}: {_short(data[key])}")
    lines += _quantity_lines(data.get("quantities") or {})
    return "\n".join(lines)


def compound_text(data: dict) -> str:
    """A readable summary of a glycoside's or alditol's prediction (``chem.derivatives.compound_json``)."""
    kind = data["compound"] + (f" of {data['parent']}" if data.get("parent") else "")
    lines = [
        f"{data['name']}  ({kind}; {data['systematic_name']})",
        f"  formula {data['formula']}, series {data['series'] or '-'}",
        f"  SMILES   {data['smiles']}",
        f"  InChIKey {data['inchikey']}",
    ]
    predictions = data["predictions"]
    for key in _TEXT_KEYS:
        if key in predictions:
            why = predictions["not_applicable"].get(key)
            lines.append(f"  {key}: {_short(predictions[key])}" + (f" ({why})" if why else ""))
    return "\n".join(lines)


def _estimate_text(est: dict, unit: str = "") -> str:
    if est.get("sign_only"):
        return f"sign only ({est['flags'][0] if est['flags'] else ''})"
    se = "uncalibrated" if est["se"] is None else f"+/- {est['se']:g}{unit}"
    flags = f"; {'; '.join(est['flags'])}" if est["flags"] else ""
    return f"{est['value']:g}{unit} {se} (class {est['class']}{flags})"


def _quantity_lines(q: dict) -> list[str]:
    """Calibrated quantities with their standard errors (Contract 3)."""
    lines: list[str] = []
    if q.get("alpha_share"):
        lines.append(f"  alpha share of the pyranoses: {_estimate_text(q['alpha_share'])}")
    if q.get("specific_rotation"):
        lines.append(f"  equilibrium [alpha]D: {_estimate_text(q['specific_rotation'], ' deg')}")
    for form, pairs in (q.get("couplings") or {}).items():
        for pair, est in pairs.items():
            lines.append(f"  3J({pair}) {form}: {_estimate_text(est, ' Hz')}")
    return lines


# The keys of DESIGN.md's predict table, in the order a chemist reads them.
_TEXT_KEYS = (
    "reducing_test",
    "bromine_water",
    "ketose_test",
    "aldonic_acid",
    "aldaric_acid",
    "alditol",
    "osazone",
    "periodate",
    "chain_extension",
    "chain_shortening",
    "anomers",
    "chairs",
    "couplings",
)


def _short(value: object) -> str:
    if value is None:
        return "does not apply"
    if isinstance(value, dict):
        return ", ".join(f"{k}={_short(v) if isinstance(v, dict) else v}" for k, v in value.items())
    return str(value)


# ------------------------------------------------------------------ solutions
def residue_json(residue) -> dict:
    """A residue survivor (Contract 5): sugar, ring, anomer, linked_positions, name (condensed).

    Also ``display`` (arrows and Greek letters), ``systematic_name`` and
    ``inchikey`` of the sugar released on hydrolysis, ``smiles`` of the
    residue with ``*`` for the neighbouring residues, and ``alditol_acetate``
    (the predicted partially methylated alditol acetate, one or two names).
    """
    from workbench.chem.methylation import alditol_acetate

    sugar = identity_json(residue.chain)
    return {
        **residue.to_dict(),
        "display": residue.display,
        "systematic_name": sugar["systematic_name"],
        "smiles": residue.smiles,
        "inchikey": sugar["inchikey"],
        "alditol_acetate": list(alditol_acetate(residue).names),
    }


def survivor_json(chain: Chain) -> dict:
    """One survivor as Contract 2 lists it (the naming part of :func:`identity_json`; residues: Contract 5)."""
    if not isinstance(chain, Chain):  # a glycan residue
        return residue_json(chain)
    ident = identity_json(chain)
    return {key: ident[key] for key in ("name", "systematic_name", "smiles", "inchikey")}


def solution_json(solution) -> dict:
    """``solve --json`` (Contracts 2 and 3): unknowns, trail, conflicts, plus relief, flags and probabilities.

    Each survivor carries ``probability`` (posterior, joint over linked
    unknowns; sums to 1 per unknown) and ``flags``; each unknown
    ``entropy_bits`` and ``posterior`` (how the sum was taken); ``suspects``
    lists ``{"observation", "probability_wrong"}`` best first when the
    evidence conflicts.
    """
    unknowns = {}
    for uid in solution.project.unknown_ids:
        survivors = solution.survivors[uid]
        flags = solution.flags.get(uid, {})
        unknowns[uid] = {
            "label": solution.project.unknown(uid).label,
            "scope_count": solution.scope_counts[uid],
            "count": len(survivors),
            "survivors": [
                {
                    **survivor_json(c),
                    "probability": round(solution.probability(uid, c), 6),
                    "flags": list(flags.get(c, ())),
                }
                for c in survivors
            ],
            "entropy_bits": round(solution.entropy.get(uid, 0.0), 4),
            "posterior": solution.posterior_methods.get(uid, ""),
            "flags": {display_name(c): list(v) for c, v in flags.items()},
        }
    trail = []
    for step in solution.trail:
        trail.append(
            {
                "observation": step.observation,
                "status": step.status,
                "eliminated": {u: [display_name(c) for c in cs] for u, cs in step.eliminated.items()},
                "reasons": {u: {display_name(c): r for c, r in rs.items()} for u, rs in step.reasons.items()},
                "counts": step.counts,
            }
        )
    relief = {
        oid: {u: [display_name(c) for c in cs] for u, cs in by_u.items()} for oid, by_u in solution.relief.items()
    }
    return {
        "title": solution.project.title,
        "unknowns": unknowns,
        "trail": trail,
        "conflicts": [list(c) for c in solution.conflicts],
        "suspects": [{"observation": oid, "probability_wrong": round(p, 4)} for oid, p in solution.suspects],
        "without": relief,
        "disabled": list(solution.disabled),
    }


def _names(chains, limit: int = 12) -> str:
    names = [display_name(c) for c in chains]
    if len(names) > limit:
        return ", ".join(names[:limit]) + f", ... (+{len(names) - limit} more)"
    return ", ".join(names)


def solution_text(solution) -> str:
    """A readable table per unknown with the trail, for the terminal."""
    project = solution.project
    ids = project.unknown_ids
    lines = [f"Project: {terminal_text(project.title or '(untitled)', one_line=True)}", ""]
    header = f"{'step':<8}{'status':<13}" + "".join(f"{u:>8}" for u in ids)
    lines.append("Narrowing (candidates left per unknown)")
    lines.append(header)
    lines.append(f"{'scope':<8}{'':<13}" + "".join(f"{solution.scope_counts[u]:>8}" for u in ids))
    for step in solution.trail:
        lines.append(f"{step.observation:<8}{step.status:<13}" + "".join(f"{step.counts[u]:>8}" for u in ids))
    lines.append("")
    for step in solution.trail:
        for uid, gone in step.eliminated.items():
            lines.append(f"{step.observation} removed from {uid}: {_names(gone)}")
            reasons = step.reasons.get(uid, {})
            for chain in gone[:4]:
                if reasons.get(chain):
                    lines.append(f"    {display_name(chain)}: {reasons[chain]}")
            if len(gone) > 4:
                lines.append(f"    ... and {len(gone) - 4} more (solve --json lists every reason)")
    lines.append("")
    for uid in ids:
        u = project.unknown(uid)
        surv = solution.survivors[uid]
        label = f" ({terminal_text(u.label, one_line=True)})" if u.label else ""
        entropy = solution.entropy.get(uid)
        spread = f", entropy {entropy:.2f} bits" if entropy is not None and surv else ""
        lines.append(f"{uid}{label}: {len(surv)} of {solution.scope_counts[uid]} candidates remain{spread}")
        for chain in solution.ranked(uid)[:20]:
            p = solution.probability(uid, chain)
            lines.append(f"    {display_name(chain):<36} {p:6.3f} {probability_bar(p):<20} {systematic_name(chain)}")
        if len(surv) > 20:
            lines.append(f"    ... (+{len(surv) - 20} more)")
        for chain, notes in solution.flags.get(uid, {}).items():
            for note in notes:
                lines.append(f"    flag {display_name(chain)}: {note}")
    if solution.conflicts:
        lines.append("")
        lines.append("The evidence is contradictory. Minimal sets of observations that cannot all hold:")
        for c in solution.conflicts:
            described = " | ".join(observation_text(project.observation(o)) for o in c)
            lines.append(f"  {{{', '.join(c)}}}  {described}")
        for oid, by_u in solution.relief.items():
            summary = ", ".join(f"{u}: {len(cs)} ({_names(cs, 3)})" for u, cs in by_u.items())
            lines.append(f"  without {oid}: {summary}")
        if solution.suspects:
            lines.append("Most likely wrong (from each record's reliability and how well the rest agrees):")
            for oid, p in solution.suspects:
                lines.append(f"  {oid:<8} {p:6.3f} {probability_bar(p)}")
    return "\n".join(lines)


def probability_bar(p: float, width: int = 20) -> str:
    """A text bar of ``p`` (0-1) in ``width`` characters, e.g. ``#####``."""
    return "#" * int(round(max(0.0, min(1.0, p)) * width))


# ------------------------------------------------------------------ plans
def plan_text(plan) -> str:
    """The planner's ranking as a readable list with outcomes and cautions."""
    lines: list[str] = []
    for line in plan.advice:
        lines.append(line)
    if plan.experiments:
        lines.append(f"Next experiments, ranked by {'bits per effort' if plan.ranking == 'value' else 'information'}:")
    for i, e in enumerate(plan.experiments, 1):
        lines.append(
            f"{i:>2}. {e.title}  [{e.information_bits:.2f} bits, about {e.expected_remaining:.1f} left, "
            f"effort {e.cost.effort:.1f}: {e.cost.hours:g} h, {e.cost.material_mg:g} mg, hazard {e.cost.hazard}]"
        )
        for outcome, names in e.outcomes.items():
            shown = ", ".join(names[:6]) + (f", ... (+{len(names) - 6})" if len(names) > 6 else "")
            lines.append(f"      if {outcome}: {shown}")
        for c in e.cautions:
            lines.append(f"      ! {c}")
    if plan.pairs:
        lines.append("")
        lines.append("Best pairs (two steps):")
        for p in plan.pairs:
            lines.append(
                f"  {p.first.title} + {p.second.title}: {p.information_bits:.2f} bits, about {p.expected_remaining:.1f} left"
            )
    return "\n".join(lines)
