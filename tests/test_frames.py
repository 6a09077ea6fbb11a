"""Results as DataFrames: columns are the documented ones, and the content is that of the result objects.

Two kinds of check: (1) the frame says the same as the result object it comes from (the solution, the
plan, the curve), row for row; (2) where a frame carries chemistry, the chemistry is checked against
sources outside the project (REFERENCE_VALUES.md), named beside each check.
"""

from __future__ import annotations

import json
import math
import re
import subprocess
import sys
from pathlib import Path

import pandas as pd
import projects
import pytest
from rdkit import Chem

from workbench.chem import Scope, resolve
from workbench.chem.names import display_name
from workbench.conformers import fit_mutarotation, read_curve
from workbench.data import DEMO_PROJECT, data_path
from workbench.errors import ObservationError
from workbench.evidence import load_project, project_from_dict, solve
from workbench.evidence.planner import plan
from workbench.frames import (
    CONFLICT_COLUMNS,
    CURVE_COLUMNS,
    IDENTITY_COLUMNS,
    OBSERVATION_COLUMNS,
    PLAN_COLUMNS,
    RESIDUE_COLUMNS,
    SURVIVOR_COLUMNS,
    SUSPECT_COLUMNS,
    TRAIL_COLUMNS,
    UNKNOWN_COLUMNS,
    conflicts_frame,
    curve_frame,
    narrowing_frame,
    observations_frame,
    plan_frame,
    predictions_frame,
    residues_frame,
    survivors_frame,
    suspects_frame,
    trail_frame,
    unknowns_frame,
)
from workbench.report_text import solution_json

ROOT = Path(__file__).resolve().parent.parent
SAMPLES = ROOT / "sample_projects"
D_ALDOHEXOSES = Scope(carbons=(6,), carbonyl=("aldose",), series=("D",))


@pytest.fixture(scope="module")
def demo():
    return load_project(data_path(DEMO_PROJECT))


@pytest.fixture(scope="module")
def two_left(demo):
    return solve(demo, disabled=["E6"])


# ------------------------------------------------------------------ survivors
def test_survivors_frame_has_the_documented_columns_and_the_solution_rows(two_left):
    frame = survivors_frame(two_left)
    assert tuple(frame.columns) == SURVIVOR_COLUMNS
    # Only allaric and galactaric acid are meso among the aldohexoses' aldaric acids (REFERENCE_VALUES:
    # products and their optical activity), so the demo without its osazone record keeps these two.
    assert sorted(frame["name"]) == ["D-allose", "D-galactose"]
    listed = solution_json(two_left)["unknowns"]["S1"]["survivors"]
    keys = ["name", "systematic_name", "smiles", "inchikey"]
    assert frame[keys].to_dict("records") == [{k: row[k] for k in keys} for row in listed]
    assert set(frame["unknown"]) == {"S1"}


def test_survivors_frame_rows_are_those_of_the_csv_export(two_left):
    from io import StringIO

    from workbench.export import CSV_COLUMNS, export_text

    frame = survivors_frame(two_left)
    exported = pd.read_csv(StringIO(export_text(two_left, "csv")))
    assert tuple(frame.columns[: len(CSV_COLUMNS)]) == CSV_COLUMNS
    assert frame[list(CSV_COLUMNS)].to_dict("records") == exported.to_dict("records")


def test_survivor_probabilities_sum_to_one_per_unknown():
    solution = solve(load_project(SAMPLES / "rare_pentose_epimerisation.json").without("E6", "E7"))
    frame = survivors_frame(solution)
    totals = frame.groupby("unknown")["probability"].sum()
    assert totals.round(9).eq(1.0).all() and set(totals.index) == {"P", "H1", "H2"}
    assert frame["probability"].between(0, 1).all()


def test_survivor_probabilities_and_entropy_are_those_of_the_posterior():
    solution = solve(load_project(SAMPLES / "rare_pentose_epimerisation.json").without("E6", "E7"))
    frame = survivors_frame(solution)
    listed = solution_json(solution)["unknowns"]
    for row in frame.itertuples():
        (entry,) = [s for s in listed[row.unknown]["survivors"] if s["name"] == row.name]
        assert row.probability == pytest.approx(entry["probability"], abs=1e-6)
    summary = unknowns_frame(solution).set_index("unknown")
    for uid, group in frame.groupby("unknown"):
        p = group["probability"]
        # Shannon entropy of the posterior, H = -sum p log2 p
        assert summary.loc[uid, "entropy_bits"] == pytest.approx(-(p * p.map(math.log2)).sum(), abs=1e-9)
    # L-ribose is settled (its osazone is L-arabinose's and it is not L-arabinose); its Kiliani-Fischer pair
    # L-allose/L-altrose is not yet told apart, and either can be H1: one bit each, zero for P.
    assert summary.loc["P", "entropy_bits"] == pytest.approx(0.0)
    assert summary.loc["H1", "entropy_bits"] == pytest.approx(1.0)


def test_unknowns_frame_counts(two_left):
    frame = unknowns_frame(two_left)
    assert tuple(frame.columns) == UNKNOWN_COLUMNS
    # Default scope C3-C7, both series: aldoses 2 + 4 + 8 + 16 + 32 = 62 (2^(n-2) stereoisomers), 2-ketoses
    # 1 + 2 + 4 + 8 + 16 = 31 (2^(n-3)); 93 in all. Without E6, D-allose and D-galactose are left (above).
    assert frame[["unknown", "label", "scope_count", "count"]].to_dict("records") == [
        {"unknown": "S1", "label": two_left.project.unknown("S1").label, "scope_count": 93, "count": 2}
    ]
    assert two_left.unknowns_frame().equals(frame)


def test_survivors_frame_identity_agrees_with_rdkit(two_left):
    for row in survivors_frame(two_left).itertuples():
        # InChIKey recomputed by RDKit from the frame's own SMILES (an outside cross-check of the columns)
        assert Chem.MolToInchiKey(Chem.MolFromSmiles(row.smiles)) == row.inchikey
        assert display_name(resolve(row.smiles)) == row.name


def test_survivors_frame_flags_candidates_without_a_published_rotation():
    project = projects.project(
        [{"id": "G", "scope": {"carbons": [6], "carbonyl": ["aldose"], "series": ["D"]}}],
        [{"id": "E1", "kind": "specific_rotation", "unknown": "G", "value": 80.2, "tolerance": 3}],
        title="rotation only",
    )
    frame = solve(project).to_frame().set_index("name")
    # D-galactose +80.2 is published (Bruice 8th ed., problems 20.65-66): it fits and is not flagged.
    assert not frame.loc["D-galactose", "flagged"] and frame.loc["D-galactose", "flags"] == ""
    # Only the (-) sign is published for D-idose (REFERENCE_VALUES, signs of the D-aldoses): kept and
    # flagged, never eliminated by a rotation of the other sign.
    assert frame.loc["D-idose", "flagged"] and "E1" in frame.loc["D-idose", "flags"]
    # D-glucose +52.7 and D-mannose +14.6 (Bruice; handbook table) lie far outside 80.2 +/- 3.
    assert "D-glucose" not in frame.index and "D-mannose" not in frame.index


# ------------------------------------------------------------------ glycan residues
@pytest.fixture(scope="module")
def four_linked():
    return solve(project_from_dict(projects.FOUR_LINKED_GLUCOSE_OXIDISED))


def test_residues_frame_lists_the_surviving_residue_candidates(four_linked):
    frame = residues_frame(four_linked)
    assert tuple(frame.columns) == RESIDUE_COLUMNS
    # A 4-linked pyranose and a 5-linked furanose give the same partially methylated alditol acetate, the same
    # periodate uptake (1 IO4-, no HCOOH) and the same Smith fragment, erythritol (REFERENCE_VALUES, glycan
    # residues; Bjorndal et al. 1970; Goldstein, Hay, Lewis and Smith 1965 [memory]).
    rows = frame.set_index("name")
    assert sorted(rows.index) == ["->4)-alpha-D-Glcp-(1->", "->5)-alpha-D-Glcf-(1->"]
    assert rows.loc["->4)-alpha-D-Glcp-(1->", ["ring", "linked_positions"]].tolist() == ["pyranose", "4"]
    assert rows.loc["->5)-alpha-D-Glcf-(1->", ["ring", "linked_positions"]].tolist() == ["furanose", "5"]
    assert set(frame["sugar"]) == {"D-glucose"} and set(frame["anomer"]) == {"alpha"}
    # O-acetyl at C-1, C-5 (ring oxygen) and C-4 (linked); O-methyl at 2, 3, 6 (the same rules)
    (acetate,) = set(frame["alditol_acetate"])
    assert "1,4,5-tri-O-acetyl" in acetate and "2,3,6-tri-O-methyl" in acetate and "glucitol" in acetate
    assert frame["probability"].sum() == pytest.approx(1.0)
    assert four_linked.residues_frame().equals(frame)


def test_residue_survivors_are_named_as_solve_json_names_them(four_linked):
    frame = survivors_frame(four_linked)
    listed = solution_json(four_linked)["unknowns"]["R1"]["survivors"]
    by_name = {s["name"]: s for s in listed}
    for row in frame.itertuples():
        expected = by_name[row.name]
        assert (row.systematic_name, row.smiles, row.inchikey) == (
            expected["systematic_name"],
            expected["smiles"],
            expected["inchikey"],
        )
        assert "*" in row.smiles  # the neighbouring residues
    # The InChIKey is that of the sugar released, open-chain D-glucose (SMILES as DESIGN.md writes it; RDKit).
    glucose = Chem.MolToInchiKey(Chem.MolFromSmiles("O=C[C@H](O)[C@@H](O)[C@H](O)[C@H](O)CO"))
    assert set(frame["inchikey"]) == {glucose}


def test_predictions_of_glucopyranosyl_residues_follow_the_published_rules():
    from workbench.chem.residue import ResidueScope

    scope = ResidueScope.from_dict({"sugars": ["D-glucose"], "ring": ["pyranose"], "anomer": ["alpha"]})
    frame = predictions_frame(scope, ["periodate:residue", "smith_degradation", "methylation_analysis"])
    frame["linked"] = frame["name"].str.extract(r"^->([0-9,]+)\)", expand=False).fillna("terminal")
    rows = frame.set_index("linked")
    # Periodate per hexopyranosyl residue, IO4- / HCOOH (REFERENCE_VALUES, glycan residues [memory]):
    # terminal 2/1; 2-linked 1/0; 3-linked 0/0; 4-linked 1/0; 6-linked 2/1; 2,6- and 4,6-linked 1/0;
    # 3,6-, 2,4-, 2,3- and 3,4-linked 0/0.
    published = {
        "terminal": (2, 1), "2": (1, 0), "3": (0, 0), "4": (1, 0), "6": (2, 1), "2,6": (1, 0), "4,6": (1, 0),
        "3,6": (0, 0), "2,4": (0, 0), "2,3": (0, 0), "3,4": (0, 0),
    }  # fmt: skip
    for linked, (io4, formic) in published.items():
        got = rows.loc[linked, ["periodate:residue:periodate", "periodate:residue:formic_acid"]].tolist()
        assert got == [io4, formic], linked
    assert rows["periodate:residue:co2"].isna().all()
    # Smith fragments (same source): terminal, 2-, 6- and 2,6-linked -> glycerol; 4- and 4,6-linked ->
    # erythritol (gluco); 3-linked -> the intact sugar.
    for linked in ("terminal", "2", "6", "2,6"):
        assert rows.loc[linked, "smith_degradation"] == "glycerol", linked
    assert rows.loc["4", "smith_degradation"] == rows.loc["4,6", "smith_degradation"] == "erythritol"
    assert rows.loc["3", "smith_degradation"] == "D-glucose"
    # Alditol acetate of a 4-linked pyranose: O-acetyl at 1, 5 (ring O) and 4, O-methyl at 2, 3, 6 (same source)
    assert rows.loc["4", ["methylation_analysis:methyl", "methylation_analysis:acetyl"]].tolist() == ["2,3,6", "1,4,5"]
    words = predictions_frame(scope, ["methylation_analysis"], labels=True).set_index("name")
    assert words.loc["->4)-alpha-D-Glcp-(1->", "methylation_analysis"].startswith("OMe 2,3,6; OAc 1,4,5")


def test_residues_frame_is_empty_without_residue_unknowns(two_left):
    frame = residues_frame(two_left)
    assert frame.empty and tuple(frame.columns) == RESIDUE_COLUMNS


# ------------------------------------------------------------------ trail, narrowing, conflicts, ledger
def test_trail_frame_lists_every_elimination_with_its_reason(demo):
    solution = solve(demo)
    frame = trail_frame(solution)
    assert tuple(frame.columns) == TRAIL_COLUMNS
    removed = frame.dropna(subset=["eliminated"])
    assert len(removed) == sum(len(c) for s in solution.trail for c in s.eliminated.values())
    for row in removed.itertuples():
        assert solution.reason(row.unknown, resolve(row.eliminated)) == f"{row.observation}: {row.reason}"
    # Every aldose and 2-ketose of the default scope reduces Fehling's/Benedict's reagent (common
    # practice), so E1 removes nothing and keeps one row with no candidate.
    e1 = frame[frame["observation"] == "E1"]
    assert len(e1) == 1 and pd.isna(e1["eliminated"].iloc[0]) and e1["status"].iloc[0] == "applied"
    # E4 (meso aldaric acid) removes the twelve aldohexoses other than D/L-allose and D/L-galactose
    # (REFERENCE_VALUES: allaric and galactaric acids are the meso ones).
    e4 = frame[frame["observation"] == "E4"]
    assert len(e4) == 12 and set(e4["kind"]) == {"aldaric_acid"}
    assert not {"D-allose", "L-allose", "D-galactose", "L-galactose"} & set(e4["eliminated"])
    assert frame["step"].is_monotonic_increasing


def test_trail_frame_shows_disabled_steps(two_left):
    frame = trail_frame(two_left)
    assert frame.loc[frame["observation"] == "E6", "status"].tolist() == ["disabled"]


def test_narrowing_frame_matches_the_trail_counts(demo):
    solution = solve(demo)
    frame = narrowing_frame(solution)
    assert list(frame.columns) == ["step", "observation", "status", "S1"]
    assert frame["S1"].tolist() == [solution.scope_counts["S1"]] + [s.counts["S1"] for s in solution.trail]
    assert frame["observation"].tolist() == ["scope"] + [s.observation for s in solution.trail]
    assert frame["S1"].is_monotonic_decreasing  # evidence only ever removes candidates


def test_conflicts_frame_names_the_clashing_records():
    solution = solve(load_project(SAMPLES / "contradictory_hexose_records.json"))
    frame = conflicts_frame(solution)
    assert tuple(frame.columns) == CONFLICT_COLUMNS
    # For an aldohexose the alditol and the aldaric acid are both meso or both chiral (REFERENCE_VALUES),
    # so the meso alditol (E3) and the active aldaric acid (E4) clash.
    assert frame[frame["conflict"] == 1]["observation"].tolist() == ["E3", "E4"]
    assert frame["kind"].tolist()[:2] == ["alditol", "aldaric_acid"]
    assert conflicts_frame(solve(load_project(data_path(DEMO_PROJECT)))).empty
    # the suspects of Contract 3, as solve --json lists them
    suspects = suspects_frame(solution)
    assert tuple(suspects.columns) == SUSPECT_COLUMNS
    listed = solution_json(solution)["suspects"]
    assert suspects["observation"].tolist() == [s["observation"] for s in listed]
    assert suspects["probability_wrong"].round(4).tolist() == [s["probability_wrong"] for s in listed]
    assert set(suspects["observation"]) == {"E3", "E4"} and suspects["probability_wrong"].between(0, 1).all()
    wrong = dict(zip(suspects["observation"], suspects["probability_wrong"], strict=True))
    assert frame["probability_wrong"].tolist() == [wrong["E3"], wrong["E4"]]
    assert solution.suspects_frame().equals(suspects)
    assert suspects_frame(solve(load_project(data_path(DEMO_PROJECT)))).empty


def test_observations_frame_is_the_ledger(demo):
    frame = observations_frame(demo)
    assert tuple(frame.columns) == OBSERVATION_COLUMNS
    assert frame["observation"].tolist() == [o.id for o in demo.observations]
    assert frame.set_index("observation").loc["E6", "references"] == "S1; D-tagatose"
    assert frame["note"].str.contains("Invented").all()
    assert demo.to_frame().equals(frame)


# ------------------------------------------------------------------ predictions
def test_predictions_of_the_d_aldohexoses_match_published_facts():
    frame = predictions_frame(
        D_ALDOHEXOSES, ["aldaric_acid", "periodate:free", "periodate:methyl_pyranoside", "specific_rotation"]
    ).set_index("name")
    assert len(frame) == 8 and list(frame.columns[:3]) == list(IDENTITY_COLUMNS[1:])
    # Meso aldaric acids: allaric and galactaric only (REFERENCE_VALUES, products and optical activity).
    assert sorted(frame.index[frame["aldaric_acid"] == False]) == ["D-allose", "D-galactose"]  # noqa: E712
    # Open-chain aldohexose: 5 IO4-, 5 HCOOH, 1 HCHO [common practice]; methyl hexopyranoside 2 IO4-, 1 HCOOH
    # (Jackson and Hudson 1937 [memory]).
    assert (frame["periodate:free:periodate"] == 5).all() and (frame["periodate:free:formic_acid"] == 5).all()
    assert (frame["periodate:free:formaldehyde"] == 1).all()
    assert (frame["periodate:methyl_pyranoside:periodate"] == 2).all()
    assert (frame["periodate:methyl_pyranoside:formic_acid"] == 1).all()
    # Equilibrium [alpha]D: D-glucose +52.7, D-galactose +80.2 (Bruice 8th ed.); D-mannose +14.6 (handbook).
    assert frame.loc["D-glucose", "specific_rotation"] == pytest.approx(52.7)
    assert frame.loc["D-galactose", "specific_rotation"] == pytest.approx(80.2)
    assert frame.loc["D-mannose", "specific_rotation"] == pytest.approx(14.6)
    assert pd.isna(frame.loc["D-idose", "specific_rotation"])  # only the sign is published
    assert str(frame["aldaric_acid"].dtype) == "boolean" and str(frame["specific_rotation"].dtype) == "Float64"


def test_predictions_group_the_c2_epimers_by_their_osazone():
    frame = predictions_frame(D_ALDOHEXOSES, ["product:osazone"])
    groups = sorted(sorted(g["name"]) for _, g in frame.groupby("product:osazone"))
    # Sugars differing only at C-1/C-2 share the osazone (REFERENCE_VALUES: osazones).
    assert groups == [
        ["D-allose", "D-altrose"],
        ["D-galactose", "D-talose"],
        ["D-glucose", "D-mannose"],
        ["D-gulose", "D-idose"],
    ]
    for smiles in frame["product:osazone"]:
        assert Chem.MolFromSmiles(smiles) is not None


def test_predictions_of_a_ketose_and_of_chain_length_changes():
    chains = [resolve(n) for n in ("D-fructose", "D-glucose", "D-arabinose")]
    frame = predictions_frame(
        chains, ["bromine_water", "periodate:free", "chain_extension", "chain_shortening", "aldaric_acid"]
    )
    frame = frame.set_index("name")
    # 2-ketohexose: 5 IO4-, 3 HCOOH, 2 HCHO, 1 CO2 [common practice]; bromine water leaves ketoses unchanged.
    fru = frame.loc["D-fructose"]
    assert (fru["periodate:free:periodate"], fru["periodate:free:formic_acid"]) == (5, 3)
    assert (fru["periodate:free:formaldehyde"], fru["periodate:free:co2"]) == (2, 1)
    assert fru["bromine_water"] == "unchanged" and frame.loc["D-glucose", "bromine_water"] == "oxidised"
    assert pd.isna(fru["aldaric_acid"]) and pd.isna(fru["chain_extension"])  # a ketose gives neither
    # Kiliani-Fischer: D-arabinose -> D-glucose + D-mannose; Wohl/Ruff: D-glucose -> D-arabinose (REFERENCE_VALUES).
    assert sorted(frame.loc["D-arabinose", "chain_extension"].split("; ")) == ["D-glucose", "D-mannose"]
    assert frame.loc["D-glucose", "chain_shortening"] == "D-arabinose"


def test_prediction_labels_are_the_planner_words():
    sugars = Scope(carbons=(3, 6), carbonyl=("aldose",), series=("D",))
    frame = predictions_frame(sugars, ["aldaric_acid", "specific_rotation"], labels=True).set_index("name")
    assert frame.loc["D-galactose", "aldaric_acid"] == "optically inactive (meso)"
    # D-glyceraldehyde: (+) sign only; D-idose: (-) sign only (REFERENCE_VALUES, signs of the D-aldoses).
    assert frame.loc["D-glyceraldehyde", "specific_rotation"] == "dextrorotatory (sign only)"
    assert frame.loc["D-idose", "specific_rotation"] == "laevorotatory (sign only)"


def test_prediction_coupling_column_uses_the_normalised_pair():
    frame = predictions_frame([resolve("D-glucose")], ["coupling_constant:beta_pyranose:H-2,H-1"])
    column = "coupling_constant:beta_pyranose:H1-H2"
    assert column in frame.columns
    # beta-D-glucopyranose J1,2 7.9-8.0 Hz in D2O (REFERENCE_VALUES couplings [memory, textbook ranges]).
    assert 7.0 <= frame[column].iloc[0] <= 9.0


@pytest.mark.parametrize(
    ("spec", "words"),
    [
        ("nmr", "no experiment 'nmr'"),
        ("periodate", "periodate:substrate"),
        ("periodate:soup", "'soup' is not one of"),
        ("product:osazon", "reaction must be one of"),
        ("coupling_constant:alpha_pyranose:H1", "proton pair"),
    ],
)
def test_prediction_experiment_errors_say_what_to_write(spec, words):
    with pytest.raises(ObservationError, match=re.escape(words)):
        predictions_frame(D_ALDOHEXOSES, [spec])


# ------------------------------------------------------------------ plan
def test_plan_frame_is_the_ranking_row_for_row(demo, two_left):
    result = plan(demo, solution=two_left, limit=40)
    frame = plan_frame(result)
    assert tuple(frame.columns) == PLAN_COLUMNS
    assert frame["rank"].tolist() == list(range(1, len(result.experiments) + 1))
    assert frame["experiment"].tolist() == [e.title for e in result.experiments]
    assert frame["information_bits"].tolist() == [e.information_bits for e in result.experiments]
    assert frame["effort"].tolist() == [e.cost.effort for e in result.experiments]
    # Two equally likely survivors: no experiment can tell more than log2(2) = 1 bit.
    assert frame["information_bits"].max() <= 1.0 + 1e-9
    assert frame["hazard"].between(0, 3).all()
    osazone = frame[frame["reagents"].str.contains("phenylhydrazine")]
    assert not osazone.empty
    for text in osazone["cautions"]:
        assert "Phenylhydrazine" in text and "safety data sheet" in text
    assert result.to_frame().equals(frame)


def test_plan_frame_of_a_contradictory_project_is_empty_with_columns():
    result = plan(load_project(SAMPLES / "contradictory_hexose_records.json"))
    frame = plan_frame(result)
    assert frame.empty and tuple(frame.columns) == PLAN_COLUMNS


# ------------------------------------------------------------------ curves
def test_curve_frame_with_fit_residuals():
    curve = read_curve(SAMPLES / "galactose_lot_mutarotation.csv")
    fit = fit_mutarotation(curve.times_min, curve.rotations)
    frame = curve.to_frame(fit)
    assert list(frame.columns) == [*CURVE_COLUMNS, "fitted", "residual"]
    assert frame["time_min"].tolist() == list(curve.times_min)
    # The sample's invented scatter is at most 0.4 deg (its comment lines), so residuals stay small.
    assert frame["residual"].abs().max() < 0.6
    assert math.isclose(frame["residual"].pow(2).mean() ** 0.5, fit.rmse, rel_tol=1e-9)
    assert list(curve_frame(curve).columns) == list(CURVE_COLUMNS)


# ------------------------------------------------------------------ contract and purity
def test_methods_on_the_result_objects_give_the_same_frames(two_left):
    assert two_left.to_frame().equals(survivors_frame(two_left))
    assert two_left.trail_frame().equals(trail_frame(two_left))
    assert two_left.narrowing_frame().equals(narrowing_frame(two_left))
    assert two_left.conflicts_frame().equals(conflicts_frame(two_left))


def test_every_column_is_documented_in_the_contributor_guide():
    guide = (ROOT / "DEVELOPERS.md").read_text(encoding="utf-8")
    section = guide[guide.index("### Tables") :]
    for columns in (
        SURVIVOR_COLUMNS,
        UNKNOWN_COLUMNS,
        RESIDUE_COLUMNS,
        TRAIL_COLUMNS,
        CONFLICT_COLUMNS,
        SUSPECT_COLUMNS,
        OBSERVATION_COLUMNS,
        PLAN_COLUMNS,
        CURVE_COLUMNS,
    ):
        for column in columns:
            assert f"`{column}`" in section, column


def test_frames_import_no_ui_library():
    code = (
        "import json, sys; import workbench.frames; "
        "print(json.dumps([m for m in ('ipywidgets', 'IPython', 'py3Dmol', 'matplotlib') if m in sys.modules]))"
    )
    out = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True, check=True).stdout
    assert json.loads(out.strip().splitlines()[-1]) == []
