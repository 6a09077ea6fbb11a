"""Outcome tables: columns equal fresh predictions, survive a round trip, and are keyed by the rules.

The expected values here are computed afresh from the structures through the
one prediction layer (``outcomes.predict``/``product_key`` on each chain), never
read back from a table.
"""

from __future__ import annotations

import random
import subprocess
import sys
from pathlib import Path

import projects
import pytest

from workbench.chem import Scope
from workbench.chem.catalogue import catalogue
from workbench.evidence import outcomes, tables
from workbench.evidence.engine import solve
from workbench.evidence.observations import observation_from_dict

ROOT = Path(__file__).resolve().parent.parent
BROAD = Scope(carbons=(3, 4, 5, 6, 7, 8, 9), modifications=("any",))


def _fresh(key: str, chain):
    """The value of column ``key`` for ``chain``, computed without any table."""
    head, _, rest = key.partition("|")
    if head == "product":
        return outcomes.product_key(rest, chain)
    if head == "derived":
        return tables._DERIVED[rest](chain)
    if head == "estimate":
        return outcomes.estimate(tables._probe(rest), chain)
    return outcomes.predict(tables._probe(key), chain)


def _same(a, b) -> bool:
    if a is outcomes.NO_PREDICTION or b is outcomes.NO_PREDICTION:
        return a is b
    return a == b


def test_every_standard_column_equals_fresh_predictions_on_a_sample():
    chains = list(catalogue(BROAD))
    sample = random.Random(17).sample(chains, 40)
    for key in tables.standard_keys():
        got = tables.values(key, sample)
        for chain, value in zip(sample, got, strict=True):
            assert _same(value, _fresh(key, chain)), (key, chain.pattern)


def test_a_saved_table_is_read_back_in_a_new_process_with_the_same_values(tmp_path):
    chains = list(catalogue(Scope(carbons=(5, 6), modifications=("none", "deoxy:6"))))
    keys = [
        tables.column_key("aldaric_acid"),
        tables.column_key("periodate", substrate="methyl_pyranoside"),
        "product|osazone",
    ]
    tables.warm(chains, keys)
    path = tables.save(tmp_path / "t.pkl.gz", keys)
    code = (
        "import sys, json\n"
        "from workbench.evidence import tables\n"
        "from workbench.chem import Scope\n"
        "from workbench.chem.catalogue import catalogue\n"
        f"data = tables._read(__import__('pathlib').Path({str(path)!r}))\n"
        "tables._STORE.loaded = True\n"
        "tables._STORE._merge(data)\n"
        "chains = list(catalogue(Scope(carbons=(5, 6), modifications=('none', 'deoxy:6'))))\n"
        f"keys = {keys!r}\n"
        "rows = tables._STORE.index(chains)\n"
        "before = {k: int((tables._STORE.column(k).codes[rows] >= 0).sum()) for k in keys}\n"
        "print(json.dumps({'before': before, 'values': {k: [repr(v) for v in tables.values(k, chains)] for k in keys}}))\n"
    )
    env_out = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True, check=True)
    import json

    result = json.loads(env_out.stdout)
    for key in keys:
        assert result["before"][key] == len(chains)  # every row came from the file, none recomputed
        assert result["values"][key] == [repr(_fresh(key, c)) for c in chains]


def test_a_changed_rule_invalidates_the_tables(tmp_path, monkeypatch):
    chains = list(catalogue(Scope(carbons=(4,))))
    tables.warm(chains, [tables.column_key("alditol")])
    path = tables.save(tmp_path / "t.pkl.gz", [tables.column_key("alditol")])
    assert tables._read(path) is not None
    monkeypatch.setattr(tables, "rules_key", lambda: "0.0.0-a-changed-rule")
    assert tables._read(path) is None


def test_the_rules_key_hashes_the_chemistry_source(tmp_path, monkeypatch):
    # a copy of the package with one reaction module edited gets another key
    import shutil

    copy = tmp_path / "workbench"
    shutil.copytree(ROOT / "workbench", copy)
    code = "from workbench.evidence import tables; print(tables.rules_key())"
    here = subprocess.run([sys.executable, "-c", code], cwd=tmp_path, capture_output=True, text=True, check=True)
    reactions = copy / "chem" / "reactions.py"
    reactions.write_text(reactions.read_text() + "\n# a changed rule\n")
    there = subprocess.run([sys.executable, "-c", code], cwd=tmp_path, capture_output=True, text=True, check=True)
    assert here.stdout.strip() and here.stdout != there.stdout


QUANTITIES = [
    {"kind": "anomer_ratio", "alpha_fraction": 0.38},
    {"kind": "specific_rotation", "value": -40.0},
    {"kind": "coupling_constant", "form": "beta_pyranose", "pair": "H1-H2", "value": 7.9},
]


@pytest.mark.parametrize("fields", QUANTITIES, ids=lambda f: f["kind"])
def test_measured_quantities_are_judged_once_per_calibrated_estimate_with_the_same_result(fields):
    chains = list(catalogue(Scope(carbons=(5, 6), modifications=("any",))))
    obs = observation_from_dict({"id": "E1", "unknown": "U1", **fields})
    assert tables.keep(obs, chains, outcomes.fits) == [c for c in chains if outcomes.fits(obs, c).fits]
    judged = tables.verdicts(obs, chains, outcomes.fits)
    fresh = [outcomes.fits(obs, c) for c in chains]
    assert [(v.fits, v.flagged, v.likelihood) for v in judged] == [(v.fits, v.flagged, v.likelihood) for v in fresh]


LOGIC = [
    {"kind": "bromine_water", "result": "oxidised"},
    {"kind": "bromine_water", "result": "unchanged"},
    {"kind": "reducing_test", "result": "negative"},
    {"kind": "ketose_test", "result": "positive"},
    {"kind": "aldaric_acid", "optically_active": False},
    {"kind": "alditol", "optically_active": True},
    {"kind": "carbon_count", "value": 6},
    {"kind": "series", "value": "L"},
    {"kind": "molecular_formula", "value": "C6H12O5"},
    {"kind": "periodate", "substrate": "methyl_pyranoside", "periodate": 2, "formic_acid": 1, "formaldehyde": 0},
]


@pytest.mark.parametrize("fields", LOGIC, ids=lambda f: f["kind"])
def test_judging_each_distinct_value_once_keeps_exactly_what_fits_keeps(fields):
    chains = list(catalogue(Scope(carbons=(4, 5, 6), modifications=("any",))))
    obs = observation_from_dict({"id": "E1", "unknown": "U1", **fields})
    kept = tables.keep(obs, chains, outcomes.fits)
    assert kept == [c for c in chains if outcomes.fits(obs, c).fits]


def test_a_solve_through_the_tables_matches_judging_every_candidate():
    # the engine's survivors equal a plain filter by fits, observation by observation
    project = projects.project(
        [{"id": "U1", "scope": {"carbons": [5, 6], "modifications": ["any"]}}],
        [{"id": f"E{i}", "unknown": "U1", **f} for i, f in enumerate(LOGIC[:2] + LOGIC[4:5])],
    )
    expected = list(catalogue(project.unknown("U1").scope))
    for obs in project.observations:
        expected = [c for c in expected if outcomes.fits(obs, c).fits]
    assert list(solve(project).survivors["U1"]) == expected


RESIDUE_EVIDENCE = [
    {"kind": "methylation_analysis", "methyl": [2, 3, 6], "acetyl": [1, 4, 5]},
    {"kind": "smith_degradation", "product": "glycerol"},
    {"kind": "anomer", "value": "beta"},
    {"kind": "periodate", "substrate": "residue", "periodate": 1, "formic_acid": 0, "formaldehyde": 0},
]


@pytest.mark.parametrize("fields", RESIDUE_EVIDENCE, ids=lambda f: f["kind"])
def test_glycan_residues_use_the_same_tables_and_keep_what_fits_keeps(fields):
    from workbench.chem.residue import ResidueScope, residue_catalogue

    residues = list(residue_catalogue(ResidueScope(carbons=(6,), series=("D",), modifications=("none",))))
    obs = observation_from_dict({"id": "E1", "unknown": "R1", **fields})
    kept = tables.keep(obs, residues, outcomes.fits)
    assert kept == [r for r in residues if outcomes.fits(obs, r).fits]


def test_residue_rows_survive_a_table_file(tmp_path):
    from workbench.chem.residue import ResidueScope, residue_catalogue

    residues = list(residue_catalogue(ResidueScope(carbons=(5,), series=("L",), modifications=("none",))))
    key = tables.column_key("methylation_analysis")
    tables.warm(residues, [key])
    data = tables._read(tables.save(tmp_path / "r.pkl.gz", [key]))
    back = [tables._unspec(spec) for spec in data["chains"]]
    codes, vals = data["columns"][key]
    by_residue = {r: vals[c] for r, c in zip(back, codes, strict=True) if c >= 0}
    for r in residues:
        assert by_residue[r] == outcomes.predict(tables._probe(key), r)


def test_the_shipped_tables_carry_the_current_rules_and_equal_fresh_predictions():
    # A changed rule changes the key; then this fails until scripts/build_outcome_tables.py is run again.
    data = tables._read(tables.SHIPPED)
    assert data is not None, f"{tables.SHIPPED} is missing or stale: run python scripts/build_outcome_tables.py"
    shipped = [tables._unspec(spec) for spec in data["chains"]]
    assert set(catalogue(Scope())) <= set(shipped) and set(catalogue(BROAD)) <= set(shipped)
    assert set(tables.standard_keys()) <= set(data["columns"])
    rng = random.Random(5)
    rows = rng.sample(range(len(shipped)), 25)
    for key in data["columns"]:
        codes, vals = data["columns"][key]
        for r in rows:
            if codes[r] < 0:
                assert key not in tables.standard_keys(), (key, shipped[r].pattern)  # standard columns are full
                continue  # a column the planner filled for some candidates only
            assert _same(vals[codes[r]], _fresh(key, shipped[r])), (key, shipped[r].pattern)
