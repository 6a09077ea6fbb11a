"""Results as pandas DataFrames: one table model for sorting, filtering, plotting and handing on.

Pure functions from the core result objects to :class:`pandas.DataFrame`
(pandas only; no widget or plotting library). Column names are listed in the
``*_COLUMNS`` constants and in DEVELOPERS.md ("Tables"); they are a contract:
columns may be added, never renamed or removed.

- :func:`survivors_frame`: the survivors of every unknown of a solution;
- :func:`unknowns_frame`: one summary row per unknown;
- :func:`residues_frame`: the surviving candidates of glycan residue unknowns;
- :func:`trail_frame`: every elimination, with the observation and the reason;
- :func:`narrowing_frame`: candidates left per unknown after each step;
- :func:`conflicts_frame`: the minimal conflicting sets of observations;
- :func:`suspects_frame`: the observations most likely wrong, best first;
- :func:`observations_frame`: the ledger of a project;
- :func:`predictions_frame`: what chosen experiments predict, one row per candidate;
- :func:`plan_frame`: the planner's ranking;
- :func:`curve_frame`: a polarimetry time course, with the fitted curve if given.

Units follow the core: rotations in deg mL g-1 dm-1, couplings in Hz,
periodate amounts in mol per mol substrate, times in minutes.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence
from functools import cache
from typing import TYPE_CHECKING, Any

import pandas as pd

from workbench.chem.catalogue import Scope, catalogue
from workbench.chem.chain import Chain
from workbench.chem.names import display_name, systematic_name
from workbench.chem.smiles import to_inchikey, to_smiles
from workbench.errors import ObservationError

if TYPE_CHECKING:
    from workbench.conformers.curve_file import Curve
    from workbench.conformers.mutarotation import MutarotationFit
    from workbench.evidence.engine import Solution
    from workbench.evidence.planner import Plan
    from workbench.evidence.project import Project

__all__ = [
    "IDENTITY_COLUMNS",
    "SURVIVOR_COLUMNS",
    "UNKNOWN_COLUMNS",
    "RESIDUE_COLUMNS",
    "TRAIL_COLUMNS",
    "CONFLICT_COLUMNS",
    "SUSPECT_COLUMNS",
    "OBSERVATION_COLUMNS",
    "PLAN_COLUMNS",
    "CURVE_COLUMNS",
    "EXPERIMENT_KINDS",
    "survivors_frame",
    "unknowns_frame",
    "residues_frame",
    "trail_frame",
    "narrowing_frame",
    "conflicts_frame",
    "suspects_frame",
    "observations_frame",
    "predictions_frame",
    "plan_frame",
    "curve_frame",
]

IDENTITY_COLUMNS = ("name", "systematic_name", "smiles", "inchikey")
SURVIVOR_COLUMNS = ("unknown", *IDENTITY_COLUMNS, "probability", "flagged", "flags")
UNKNOWN_COLUMNS = ("unknown", "label", "scope_count", "count", "entropy_bits", "posterior")
RESIDUE_COLUMNS = (
    "unknown",
    "name",
    "display",
    "sugar",
    "ring",
    "anomer",
    "linked_positions",
    "alditol_acetate",
    "probability",
    "flagged",
    "flags",
)
TRAIL_COLUMNS = ("step", "observation", "kind", "status", "unknown", "eliminated", "reason")
CONFLICT_COLUMNS = ("conflict", "observation", "kind", "description", "probability_wrong")
SUSPECT_COLUMNS = ("observation", "kind", "description", "probability_wrong")
OBSERVATION_COLUMNS = ("observation", "kind", "references", "description", "recorded", "by", "note")
PLAN_COLUMNS = (
    "rank",
    "unknown",
    "kind",
    "experiment",
    "information_bits",
    "expected_remaining",
    "outcome_groups",
    "bits_per_effort",
    "effort",
    "material_mg",
    "hours",
    "hazard",
    "reagents",
    "cautions",
)
CURVE_COLUMNS = ("time_min", "specific_rotation")

# Experiments predictions_frame knows, with the parameters each takes after its kind (``kind:param:...``).
EXPERIMENT_KINDS: dict[str, tuple[str, ...]] = {
    "carbon_count": (),
    "molecular_formula": (),
    "series": (),
    "bromine_water": (),
    "reducing_test": (),
    "ketose_test": (),
    "aldaric_acid": (),
    "alditol": (),
    "periodate": ("substrate",),
    "specific_rotation": (),
    "anomer_ratio": (),
    "coupling_constant": ("form", "pair"),
    "product": ("reaction",),
    "chain_extension": (),
    "chain_shortening": (),
    # glycan residue candidates (Contract 5); periodate on them is written periodate:residue
    "methylation_analysis": (),
    "smith_degradation": (),
    "anomer": (),
    "ring_form": (),
}
_RESIDUE_KINDS = ("methylation_analysis", "smith_degradation", "anomer", "ring_form")
_PERIODATE_FIELDS = ("periodate", "formic_acid", "formaldehyde", "co2")
_PRODUCT_REACTIONS = ("osazone", "aldaric_acid", "alditol", "aldonic_acid")


@cache
def _identity(candidate: Any) -> tuple[str, str, str, str]:
    """Name, systematic name, SMILES and InChIKey, as ``solve --json`` gives them.

    A glycan residue (:class:`workbench.chem.residue.Residue`) gives its condensed
    name, the systematic name and InChIKey of its sugar, and its own SMILES
    (``*`` for the neighbouring residues), as in Contract 5.
    """
    if not isinstance(candidate, Chain):
        sugar = candidate.chain
        return candidate.name, systematic_name(sugar), candidate.smiles, to_inchikey(sugar)
    return display_name(candidate), systematic_name(candidate), to_smiles(candidate), to_inchikey(candidate)


def _frame(rows: list[dict[str, Any]], columns: Sequence[str]) -> pd.DataFrame:
    return pd.DataFrame(rows, columns=list(columns))


# ------------------------------------------------------------------ solutions
def survivors_frame(solution: Solution) -> pd.DataFrame:
    """One row per survivor of every unknown (columns :data:`SURVIVOR_COLUMNS`).

    Unknowns in project order, the most probable survivor first within each,
    as ``stereosieve export --format csv`` lists them (its columns are the
    first six here). ``probability`` is the survivor's share of belief
    (:func:`workbench.evidence.rivals.survivor_probabilities`: the posterior
    where the solution carries one, else a uniform share); ``flags`` joins the
    survivor's flags with ``"; "`` (empty when none); ``flagged`` is True
    when there is any.
    """
    from workbench.evidence.rivals import survivor_probabilities

    rows = []
    for uid in solution.project.unknown_ids:
        flags = solution.flags.get(uid, {})
        shares = survivor_probabilities(solution, uid)
        for chain in sorted(solution.survivors[uid], key=lambda c: -shares[c]):
            notes = flags.get(chain, ())
            rows.append(
                {
                    "unknown": uid,
                    **dict(zip(IDENTITY_COLUMNS, _identity(chain), strict=True)),
                    "probability": shares[chain],
                    "flagged": bool(notes),
                    "flags": "; ".join(notes),
                }
            )
    return _frame(rows, SURVIVOR_COLUMNS)


def residues_frame(solution: Solution) -> pd.DataFrame:
    """One row per surviving candidate of every residue unknown (columns :data:`RESIDUE_COLUMNS`).

    A residue unknown (Contract 5) has candidates (sugar, ring, anomer, linked
    positions). ``name`` is the IUPAC condensed form (``->4)-alpha-D-Glcp-(1->``),
    ``display`` the same with arrows and Greek letters, ``linked_positions``
    the linked oxygen positions joined with ``","`` (empty for a terminal
    residue), ``alditol_acetate`` the predicted partially methylated alditol
    acetate(s) joined with ``"; "``. Other unknowns are left out; the frame is
    empty (with its columns) when there is no residue unknown.
    """
    from workbench.chem.methylation import alditol_acetate
    from workbench.evidence.rivals import survivor_probabilities

    rows: list[dict[str, Any]] = []
    for uid in solution.project.unknown_ids:
        survivors = solution.survivors[uid]
        if not survivors or isinstance(survivors[0], Chain):
            continue
        flags = solution.flags.get(uid, {})
        shares = survivor_probabilities(solution, uid)
        for residue in sorted(survivors, key=lambda r: -shares[r]):
            notes = flags.get(residue, ())
            rows.append(
                {
                    "unknown": uid,
                    "name": residue.name,
                    "display": residue.display,
                    "sugar": residue.sugar,
                    "ring": residue.ring,
                    "anomer": residue.anomer,
                    "linked_positions": ",".join(map(str, residue.linked)),
                    "alditol_acetate": "; ".join(alditol_acetate(residue).names),
                    "probability": shares[residue],
                    "flagged": bool(notes),
                    "flags": "; ".join(notes),
                }
            )
    return _frame(rows, RESIDUE_COLUMNS)


def unknowns_frame(solution: Solution) -> pd.DataFrame:
    """One row per unknown in project order (columns :data:`UNKNOWN_COLUMNS`).

    Its label, scope size, number of survivors, the entropy of its posterior
    in bits (0 when one survivor is left; Contract 3) and how the posterior
    was summed (``posterior``, as ``solve --json`` reports it).
    """
    rows = [
        {
            "unknown": uid,
            "label": solution.project.unknown(uid).label,
            "scope_count": solution.scope_counts[uid],
            "count": len(solution.survivors[uid]),
            "entropy_bits": solution.entropy.get(uid, 0.0) + 0.0,  # + 0.0 turns a -0.0 into 0.0
            "posterior": solution.posterior_methods.get(uid, ""),
        }
        for uid in solution.project.unknown_ids
    ]
    return _frame(rows, UNKNOWN_COLUMNS)


def trail_frame(solution: Solution) -> pd.DataFrame:
    """Every elimination of the trail, in order (columns :data:`TRAIL_COLUMNS`).

    One row per (observation, unknown, eliminated candidate); a step that
    eliminated nothing (or was disabled, or contradicts) still has one row,
    with ``unknown``, ``eliminated`` and ``reason`` empty, so its status shows.
    ``step`` counts the observations from 1.
    """
    project = solution.project
    rows = []
    for number, step in enumerate(solution.trail, start=1):
        kind = project.observation(step.observation).KIND
        base = {"step": number, "observation": step.observation, "kind": kind, "status": step.status}
        if not any(step.eliminated.values()):
            rows.append({**base, "unknown": None, "eliminated": None, "reason": None})
            continue
        for uid in project.unknown_ids:
            reasons = step.reasons.get(uid, {})
            for chain in step.eliminated.get(uid, ()):
                rows.append(
                    {**base, "unknown": uid, "eliminated": display_name(chain), "reason": reasons.get(chain, "")}
                )
    return _frame(rows, TRAIL_COLUMNS)


def narrowing_frame(solution: Solution) -> pd.DataFrame:
    """Candidates left per unknown: the scope, then after each step (what the narrowing chart draws).

    Columns ``step`` (0 for the scope), ``observation`` (``"scope"`` first),
    ``status``, then one integer column per unknown id, in project order.
    """
    ids = list(solution.project.unknown_ids)
    rows: list[dict[str, Any]] = [{"step": 0, "observation": "scope", "status": "", **solution.scope_counts}]
    for number, step in enumerate(solution.trail, start=1):
        rows.append({"step": number, "observation": step.observation, "status": step.status, **step.counts})
    return _frame(rows, ["step", "observation", "status", *ids])


def conflicts_frame(solution: Solution) -> pd.DataFrame:
    """One row per member of each minimal conflicting set (``conflict`` numbers the sets from 1).

    ``probability_wrong`` is the chance that the record itself is wrong, from
    the solution's suspects (Contract 3; ``<NA>`` for a member not ranked).
    Empty (with the columns of :data:`CONFLICT_COLUMNS`) when the evidence is consistent.
    """
    project = solution.project
    wrong = dict(solution.suspects)
    rows = []
    for number, members in enumerate(solution.conflicts, start=1):
        for oid in members:
            obs = project.observation(oid)
            rows.append(
                {
                    "conflict": number,
                    "observation": oid,
                    "kind": obs.KIND,
                    "description": obs.describe(),
                    "probability_wrong": wrong.get(oid, pd.NA),
                }
            )
    frame = _frame(rows, CONFLICT_COLUMNS)
    frame["probability_wrong"] = frame["probability_wrong"].astype("Float64")
    return frame


def suspects_frame(solution: Solution) -> pd.DataFrame:
    """The observations most likely wrong when the evidence conflicts, best first (columns :data:`SUSPECT_COLUMNS`).

    ``probability_wrong`` as ``solve --json`` lists it under ``suspects``
    (Contract 3). Empty (with its columns) when nothing conflicts.
    """
    project = solution.project
    rows = [
        {
            "observation": oid,
            "kind": project.observation(oid).KIND,
            "description": project.observation(oid).describe(),
            "probability_wrong": p,
        }
        for oid, p in solution.suspects
    ]
    return _frame(rows, SUSPECT_COLUMNS)


def observations_frame(project: Project) -> pd.DataFrame:
    """The ledger: one row per observation in recorded order (columns :data:`OBSERVATION_COLUMNS`).

    ``references`` joins the unknowns and sugars the observation names with ``"; "``.
    """
    rows = [
        {
            "observation": obs.id,
            "kind": obs.KIND,
            "references": "; ".join(obs.references()),
            "description": obs.describe(),
            "recorded": obs.recorded,
            "by": obs.by,
            "note": obs.note,
        }
        for obs in project.observations
    ]
    return _frame(rows, OBSERVATION_COLUMNS)


# ------------------------------------------------------------------ predictions
def _parse_experiment(spec: str) -> tuple[str, tuple[str, ...]]:
    """``kind`` or ``kind:param[:param]`` -> (kind, params), checked against :data:`EXPERIMENT_KINDS`."""
    from workbench.evidence.observations import OBSERVATION_TYPES

    kind, *params = spec.split(":")
    if kind not in EXPERIMENT_KINDS:
        raise ObservationError(None, "kind", f"{spec!r}: no experiment {kind!r}; known: {', '.join(EXPERIMENT_KINDS)}")
    wanted = EXPERIMENT_KINDS[kind]
    if len(params) != len(wanted):
        form = ":".join([kind, *wanted])
        raise ObservationError(None, "kind", f"{spec!r}: write it as {form!r}")
    if kind == "product" and params[0] not in _PRODUCT_REACTIONS:
        raise ObservationError(None, "reaction", f"{spec!r}: reaction must be one of {', '.join(_PRODUCT_REACTIONS)}")
    if kind in OBSERVATION_TYPES:
        specs = {s.name: s for s in OBSERVATION_TYPES[kind].SPECS}
        for name, value in zip(wanted, params, strict=True):
            if specs[name].choices and value not in specs[name].choices:
                raise ObservationError(
                    None, name, f"{spec!r}: {value!r} is not one of {', '.join(specs[name].choices)}"
                )
    if kind == "coupling_constant":
        from workbench.evidence.observations import observation_from_dict

        probe = observation_from_dict(
            {"id": "?", "kind": kind, "unknown": "?", "form": params[0], "pair": params[1], "value": 0.0}
        )
        params = [params[0], probe.pair]
    return kind, tuple(params)


def _predicted(kind: str, params: tuple[str, ...], chain: Chain) -> Any:
    """The raw predicted value (or None / NO_PREDICTION) of one experiment for one chain."""
    from workbench.chem import reactions
    from workbench.evidence.observations import OBSERVATION_TYPES
    from workbench.evidence.outcomes import predict, product_key

    if kind == "product":
        key = product_key(params[0], chain)
        return None if key is None else ".".join(sorted(key))
    if kind == "chain_extension":
        products = reactions.extend(chain)
        return "; ".join(display_name(p) for p in products) if products else None
    if kind == "chain_shortening":
        product = reactions.shorten(chain)
        return display_name(product) if product else None
    fields = dict(zip(EXPERIMENT_KINDS[kind], params, strict=True))
    probe: Any = OBSERVATION_TYPES[kind]  # the kind-specific fields are made at run time
    return predict(probe("?", unknown="?", **fields), chain)


def _cells(spec: str, kind: str, raw: Any, labels: bool) -> dict[str, Any]:
    """The cells of one experiment for one candidate: column name -> value."""
    from workbench.evidence.outcomes import NO_PREDICTION, outcome_label

    residue = kind in _RESIDUE_KINDS or spec == "periodate:residue"
    if labels:
        if kind in ("product", "chain_extension", "chain_shortening"):
            return {spec: "does not apply" if raw is None else raw}
        if residue and raw is not None and raw is not NO_PREDICTION:
            from workbench.evidence.residue_outcomes import outcome_label as residue_label

            return {spec: residue_label(kind, raw)}
        return {spec: outcome_label(kind, raw)}
    missing = raw is None or raw is NO_PREDICTION
    if kind == "methylation_analysis":
        methyl, acetyl = ((), ()) if missing else raw[:2]  # (methyl, acetyl, sugar ...)
        return {f"{spec}:methyl": ",".join(map(str, methyl)), f"{spec}:acetyl": ",".join(map(str, acetyl))}
    if kind == "smith_degradation":
        return {spec: pd.NA if missing else getattr(raw, "word", str(raw))}
    if kind == "periodate":
        values = (None,) * 4 if missing else tuple(raw) + (None,) * (4 - len(raw))
        return {
            f"{spec}:{name}": (pd.NA if v is None else float(v))
            for name, v in zip(_PERIODATE_FIELDS, values, strict=True)
        }
    if missing or (kind == "specific_rotation" and isinstance(raw, tuple)):
        return {spec: pd.NA}
    if kind in ("specific_rotation", "anomer_ratio", "coupling_constant"):
        return {spec: float(raw)}
    return {spec: raw}


_DTYPES = {
    "carbon_count": "Int64",
    "aldaric_acid": "boolean",
    "alditol": "boolean",
    "specific_rotation": "Float64",
    "anomer_ratio": "Float64",
    "coupling_constant": "Float64",
    "periodate": "Float64",
}


def predictions_frame(
    candidates: Scope | Iterable[Chain], experiments: Sequence[str], labels: bool = False
) -> pd.DataFrame:
    """What each experiment predicts for each candidate: one row per candidate.

    ``candidates`` is a :class:`~workbench.chem.catalogue.Scope` (its
    catalogue) or any chains (e.g. ``solution.survivors["U1"]``).
    ``experiments`` are written ``kind`` or ``kind:param...`` (see
    :data:`EXPERIMENT_KINDS`): ``"aldaric_acid"``, ``"periodate:alditol"``,
    ``"coupling_constant:alpha_pyranose:H1-H2"``, ``"product:osazone"``.

    Columns: :data:`IDENTITY_COLUMNS`, then one per experiment named as
    written (a proton pair normalised, ``H-2,H-1`` -> ``H1-H2``), holding the prediction in the observation's own terms: words
    (``oxidised``), booleans (optically active), numbers (rotation in
    deg mL g-1 dm-1, alpha share of the pyranoses, coupling in Hz), product
    SMILES joined with ``"."`` for ``product:``, names for the chain
    extension and shortening. ``periodate:<substrate>`` gives four columns
    ``periodate:<substrate>:periodate|formic_acid|formaldehyde|co2`` (mol/mol).
    Glycan residue candidates (a :class:`~workbench.chem.residue.ResidueScope`
    or residues) also take ``periodate:residue`` (mol per mol of residue; no
    CO2), ``methylation_analysis`` (two columns ``:methyl`` and ``:acetyl``,
    positions joined with ``","``), ``smith_degradation`` (the fragment's
    word), ``anomer`` and ``ring_form``.
    Missing values (no such product, no published or predicted value, a
    rotation of which only the sign is published) are ``<NA>``.

    With ``labels=True`` every experiment is one text column holding the
    planner's outcome words instead (``optically inactive (meso)``,
    ``dextrorotatory (sign only)``, ``no prediction``).
    """
    chains = catalogue(candidates) if isinstance(candidates, Scope) else tuple(candidates)
    parsed = []
    for written in experiments:
        kind, params = _parse_experiment(written)
        parsed.append((":".join((kind, *params)), kind, params))
    rows = []
    for chain in chains:
        row: dict[str, Any] = dict(zip(IDENTITY_COLUMNS, _identity(chain), strict=True))
        for spec, kind, params in parsed:
            row.update(_cells(spec, kind, _predicted(kind, params, chain), labels))
        rows.append(row)
    columns = list(IDENTITY_COLUMNS)
    for spec, kind, _ in parsed:
        if labels:
            columns.append(spec)
        elif kind == "periodate":
            columns += [f"{spec}:{f}" for f in _PERIODATE_FIELDS]
        elif kind == "methylation_analysis":
            columns += [f"{spec}:methyl", f"{spec}:acetyl"]
        else:
            columns.append(spec)
    frame = _frame(rows, columns)
    if not labels:
        for spec, kind, _ in parsed:
            dtype = _DTYPES.get(kind)
            if dtype is None:
                continue
            for col in [c for c in columns if c == spec or c.startswith(spec + ":")]:
                frame[col] = frame[col].astype(dtype)
    return frame


# ------------------------------------------------------------------ plans
def plan_frame(plan: Plan) -> pd.DataFrame:
    """The planner's ranking, best first (columns :data:`PLAN_COLUMNS`).

    ``experiment`` is the title a chemist reads; ``outcome_groups`` the number
    of distinguishable outcomes; ``effort``, ``material_mg`` (mg of unknown),
    ``hours`` and ``hazard`` (0-3) come from the cost table; ``reagents`` are
    joined with ``"; "``, ``cautions`` (sentences) with a space. The cautions
    are reminders only: the safety data sheet, local rules and the
    institution's safety officer decide.
    """
    rows = [
        {
            "rank": rank,
            "unknown": exp.unknown,
            "kind": exp.kind,
            "experiment": exp.title,
            "information_bits": exp.information_bits,
            "expected_remaining": exp.expected_remaining,
            "outcome_groups": len(exp.outcomes),
            "bits_per_effort": exp.value,
            "effort": exp.cost.effort,
            "material_mg": exp.cost.material_mg,
            "hours": exp.cost.hours,
            "hazard": exp.cost.hazard,
            "reagents": "; ".join(exp.cost.reagents),
            "cautions": " ".join(exp.cautions),
        }
        for rank, exp in enumerate(plan.experiments, start=1)
    ]
    return _frame(rows, PLAN_COLUMNS)


# ------------------------------------------------------------------ polarimetry
def curve_frame(curve: Curve, fit: MutarotationFit | None = None) -> pd.DataFrame:
    """A time course (columns :data:`CURVE_COLUMNS`); with a fit, also ``fitted`` and ``residual``.

    Times in minutes, rotations in deg mL g-1 dm-1; ``residual`` is reading minus fitted value.
    """
    frame = pd.DataFrame({"time_min": list(curve.times_min), "specific_rotation": list(curve.rotations)})
    if fit is not None:
        from workbench.conformers.mutarotation import first_order_curve

        fitted = first_order_curve(
            frame["time_min"].to_numpy(), fit.initial_rotation, fit.equilibrium_rotation, fit.rate_constant_per_min
        )
        frame["fitted"] = fitted
        frame["residual"] = frame["specific_rotation"] - frame["fitted"]
    return frame
