"""Project files built by the tests and the benchmarks: the file's frame, and records several modules share.

The benchmarks import this module by path, the way benchmarks/bench_fuzz.py imports tests/fuzzing.py.
Every module-level project dict here (a ``format`` key) is also checked against the JSON schema by
tests/test_schema.py. The chemistry behind a shared record is stated beside it with its source; the
checks themselves stay in the test modules.
"""

from __future__ import annotations

from collections.abc import Sequence
from typing import Any

from workbench.evidence import Project, project_from_dict

Record = dict[str, Any]


def project_dict(unknowns: Sequence[Record], observations: Sequence[Record] = (), title: str = "test") -> Record:
    """A project file (format ``stereosieve-project``, version 1) holding ``unknowns`` and ``observations``."""
    return {
        "format": "stereosieve-project",
        "version": 1,
        "title": title,
        "unknowns": list(unknowns),
        "observations": list(observations),
    }


def project(unknowns: Sequence[Record], observations: Sequence[Record] = (), title: str = "test") -> Project:
    """:func:`project_dict` read by the project loader."""
    return project_from_dict(project_dict(unknowns, observations, title))


def over_scope(
    scope: Record, observations: Sequence[Record] = (), ids: Sequence[str] = ("U",), title: str = "test"
) -> Project:
    """A project whose unknowns ``ids`` all range over ``scope``."""
    return project([{"id": uid, "scope": scope} for uid in ids], observations, title)


def linked_project(unknowns: int, cycle: bool = True, scope: Record | None = None) -> Record:
    """An invented project: ``unknowns`` unknowns over ``scope`` (default: six carbons) in a chain of
    same-osazone relations (eight members each, overlapping by one); a 'different' over the first three
    closes a cycle."""
    obs: list[Record] = [{"id": "E0", "kind": "series", "unknown": "U0", "value": "D"}]
    for k, start in enumerate(range(0, unknowns - 1, 7)):
        members = [f"U{i}" for i in range(start, min(start + 8, unknowns))]
        obs.append(
            {"id": f"R{k}", "kind": "same_product", "reaction": "osazone", "members": members, "relation": "identical"}
        )
    if cycle:
        obs.append({"id": "X", "kind": "different", "members": ["U0", "U1", "U2"]})
    return project_dict(
        [{"id": f"U{i}", "scope": scope or {"carbons": [6]}} for i in range(unknowns)],
        obs,
        f"invented: {unknowns} linked unknowns",
    )


def residue_periodate(oid: str, periodate: float, formic_acid: float, formaldehyde: float = 0.0) -> Record:
    """A periodate record on residue R1: IO4- consumed, HCOOH and HCHO formed (mol/mol)."""
    return {
        "id": oid,
        "kind": "periodate",
        "unknown": "R1",
        "substrate": "residue",
        "periodate": periodate,
        "formic_acid": formic_acid,
        "formaldehyde": formaldehyde,
    }


# ------------------------------------------------------------------ a 4-linked glucose residue
# A D-glucose residue whose methylation analysis gives 1,4,5-tri-O-acetyl-2,3,6-tri-O-methyl-glucitol and
# whose anomer is alpha: a 4-linked pyranose or a 5-linked furanose (methylation analysis, Bjoerndal et al.
# 1970 [memory]; REFERENCE_VALUES.md "Glycan residues").
GLUCOSE_RESIDUE: Record = {"id": "R1", "type": "residue", "scope": {"sugars": ["D-glucose"]}}
METHYLATION_2_3_6: Record = {
    "id": "E1",
    "kind": "methylation_analysis",
    "unknown": "R1",
    "methyl": [2, 3, 6],
    "acetyl": [1, 4, 5],
}
ALPHA: Record = {"id": "E2", "kind": "anomer", "unknown": "R1", "value": "alpha"}
FOUR_LINKED_GLUCOSE = project_dict([GLUCOSE_RESIDUE], [METHYLATION_2_3_6, ALPHA], "a 4-linked glucose residue")
# Both ring forms consume 1 IO4- with no HCOOH and give erythritol on Smith degradation (Goldstein, Hay,
# Lewis and Smith 1965 [memory]; REFERENCE_VALUES.md "Glycan residues"), so these do not separate them.
FOUR_LINKED_GLUCOSE_OXIDISED = project_dict(
    [GLUCOSE_RESIDUE],
    [
        METHYLATION_2_3_6,
        ALPHA,
        residue_periodate("E3", periodate=1.0, formic_acid=0.0),
        {"id": "E4", "kind": "smith_degradation", "unknown": "R1", "product": "erythritol"},
    ],
    "a 4-linked glucose residue, periodate and Smith degradation",
)

# ------------------------------------------------------------------ benchmark workloads (invented)
LARGEST: Record = {"carbons": [3, 4, 5, 6, 7, 8, 9], "modifications": ["any"]}
# One unknown over the largest scope (C3-C9, every modification) with five invented readings.
FIVE_READINGS = project_dict(
    [{"id": "U1", "scope": LARGEST}],
    [
        {"id": "E1", "kind": "reducing_test", "unknown": "U1", "result": "positive"},
        {"id": "E2", "kind": "bromine_water", "unknown": "U1", "result": "oxidised"},
        {"id": "E3", "kind": "series", "unknown": "U1", "value": "L"},
        {"id": "E4", "kind": "alditol", "unknown": "U1", "optically_active": True},
        {"id": "E5", "kind": "molecular_formula", "unknown": "U1", "value": "C6H12O5"},
    ],
    "Benchmark (invented): one unknown over the largest scope",
)
