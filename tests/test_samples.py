"""Every sample project (and the packaged demo) solves as intended; all of them say they are invented.

The data are invented, but each expected answer follows from published facts named beside its check
(REFERENCE_VALUES.md; values marked [memory] there are from memory).
"""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from workbench.chem.names import display_name
from workbench.cli import main
from workbench.data import DEMO_PROJECT, data_path
from workbench.evidence import load_project, solve

SAMPLES = Path(__file__).resolve().parent.parent / "sample_projects"


def _names(solution, uid):
    return [display_name(c) for c in solution.survivors[uid]]


def test_red_seaweed_deoxyhexose_is_l_fucose():
    solution = solve(load_project(SAMPLES / "red_seaweed_deoxyhexose.json"))
    # Methyl 6-deoxyhexopyranoside: 2 IO4-, 1 HCOOH (methyl hexopyranoside, REFERENCE_VALUES: Jackson and
    # Hudson 1937 [memory]); alpha-L-fucopyranose J2,3 about 10 Hz and J3,4 about 3.4 Hz, the galacto pattern
    # of alpha-galactopyranoses (REFERENCE_VALUES couplings [memory, textbook ranges]).
    assert _names(solution, "U1") == ["L-fucose"]
    assert not solution.contradictory


def test_rare_pentose_is_l_ribose_and_its_kiliani_pair_l_allose_and_l_altrose():
    solution = solve(load_project(SAMPLES / "rare_pentose_epimerisation.json"))
    # C-2 epimers share the osazone, so a pentose with L-arabinose's osazone that is not L-arabinose is
    # L-ribose; Kiliani-Fischer of D-ribose gives D-allose + D-altrose, allaric acid is meso
    # (REFERENCE_VALUES: Carey ch. 25; Collins and Ferrier 1995 [memory]); here the L series.
    assert _names(solution, "P") == ["L-ribose"]
    assert _names(solution, "H1") == ["L-allose"]
    assert _names(solution, "H2") == ["L-altrose"]


def test_gum_exudate_gives_arabinose_galactose_rhamnose_glucuronic_acid():
    solution = solve(load_project(SAMPLES / "gum_exudate_four_sugars.json"))
    # Mucic (galactaric) acid is meso and comes from D- and L-galactose; D-glucaric = L-gularic acid
    # (REFERENCE_VALUES: Carey ch. 25 [memory]); arabinaric acid is optically active, ribaric meso.
    assert _names(solution, "A") == ["L-arabinose"]
    assert _names(solution, "B") == ["D-galactose"]
    assert _names(solution, "C") == ["L-rhamnose"]
    assert _names(solution, "D") == ["D-glucuronic acid"]


def test_contradictory_project_names_the_two_records_that_clash():
    solution = solve(load_project(SAMPLES / "contradictory_hexose_records.json"))
    # For an aldohexose the alditol and the aldaric acid are both meso or both chiral (allitol/allaric,
    # galactitol/galactaric; REFERENCE_VALUES [memory]), so E3 and E4 cannot both hold.
    assert solution.contradictory
    assert [tuple(c) for c in solution.conflicts] == [("E3", "E4")]
    assert sorted(display_name(c) for c in solution.relief["E4"]["X"]) == ["D-allose", "D-galactose"]
    assert len(solution.relief["E3"]["X"]) == 6


def test_demo_project_is_d_galactose():
    project = load_project(data_path(DEMO_PROJECT))
    solution = solve(project)
    # D-galactose: meso galactaric acid, D series, same osazone as D-tagatose (REFERENCE_VALUES: osazones).
    assert _names(solution, "S1") == ["D-galactose"]
    # The narrowing, counted by hand: the default scope (3-7 carbons, unmodified) holds 2**(n-2)
    # aldoses and 2**(n-3) 2-ketoses of n carbons (dihydroxyacetone is one achiral ketose) [common
    # practice]. A positive reducing test keeps all of them (every aldose, and every unmodified
    # 2-ketose has OH at C-1 and C-3 next to the ketone); bromine water keeps the aldoses; C6H12O6
    # the aldohexoses; a meso aldaric acid D/L-allose and D/L-galactose (allaric and galactaric acid,
    # REFERENCE_VALUES); the D series two; the osazone of D-tagatose one (D-galactose).
    aldoses = sum(2 ** (n - 2) for n in range(3, 8))
    ketoses = sum(2 ** (n - 3) for n in range(3, 8))
    expected = [aldoses + ketoses, aldoses, 2 ** (6 - 2), 4, 2, 1]
    assert [s.counts["S1"] for s in solution.trail] == expected


@pytest.mark.parametrize("path", sorted(SAMPLES.glob("*.json")) + [data_path(DEMO_PROJECT)], ids=lambda p: p.name)
def test_every_project_is_marked_invented(path):
    data = json.loads(path.read_text(encoding="utf-8"))
    assert "invented" in data["title"].lower()
    for obs in data["observations"]:
        assert "invented" in obs.get("note", "").lower(), obs["id"]


@pytest.mark.parametrize("path", sorted(SAMPLES.glob("*.json")), ids=lambda p: p.name)
def test_every_sample_solves_from_the_command_line(path, capsys):
    code = main(["solve", str(path)])
    out = capsys.readouterr().out
    assert code == (3 if "contradictory" in path.name else 0)
    assert "candidates remain" in out


def test_at_least_three_solvable_samples_and_one_contradictory():
    solvable, contradictory = 0, 0
    for path in SAMPLES.glob("*.json"):
        solution = solve(load_project(path))
        if solution.contradictory:
            contradictory += 1
        elif all(len(v) == 1 for v in solution.survivors.values()):
            solvable += 1
    assert solvable >= 3 and contradictory >= 1


def test_demo_command_prints_the_narrowing_and_exits_zero(capsys):
    assert main(["demo"]) == 0
    out = capsys.readouterr().out
    assert "Narrowing" in out and "D-galactose" in out and "invented" in out.lower()


def test_demo_command_json(capsys):
    assert main(["demo", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert [s["name"] for s in data["unknowns"]["S1"]["survivors"]] == ["D-galactose"]


CURVE = SAMPLES / "galactose_lot_mutarotation.csv"


def test_sample_curve_says_it_is_invented():
    comments = [line for line in CURVE.read_text(encoding="utf-8").splitlines() if line.startswith("#")]
    assert comments and "invented" in comments[0].lower()


def test_sample_curve_fit_recovers_the_parameters_it_was_made_from():
    from workbench.conformers import fit_mutarotation, read_curve

    curve = read_curve(CURVE)
    # The file was generated (its comment lines say how) from an invented k = 0.020/min and an invented start
    # of 83 % alpha, towards D-galactose's published equilibrium; the anomers' rotations are published:
    # alpha +150.7, beta +52.8, equilibrium +80.2 (Bruice, Organic Chemistry, 8th ed., problems 20.65-66).
    # So [alpha]0 = 0.83 * 150.7 + 0.17 * 52.8 = 134.06 and the equilibrium beta fraction is
    # (150.7 - 80.2) / (150.7 - 52.8) = 0.720 (two-state model). The scatter added is at most 0.4 deg.
    fit = fit_mutarotation(curve.times_min, curve.rotations, alpha=150.7, beta=52.8)
    assert abs(fit.rate_constant_per_min - 0.020) < 0.001
    assert abs(fit.initial_rotation - 134.06) < 1.0
    assert abs(fit.equilibrium_rotation - 80.2) < 0.5
    assert abs(fit.initial_beta_fraction - 0.17) < 0.02
    assert abs(fit.beta_fraction - 0.720) < 0.01
    assert fit.rmse < 0.4


def test_sample_curve_from_the_command_line(capsys):
    assert main(["mutarotation", str(CURVE), "--sugar", "D-galactose", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    # ln 2 / 0.020 per min = 34.7 min (the invented rate constant the file was made with)
    assert abs(data["half_life_min"] - 34.7) < 2.0
