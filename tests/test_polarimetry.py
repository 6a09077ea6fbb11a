"""Published rotations, Hudson's rules, the mutarotation fit and its command."""

from __future__ import annotations

import json

import numpy as np
import pytest

from workbench.chem import resolve
from workbench.cli import main
from workbench.conformers import (
    fit_mutarotation,
    hudson_anomer,
    hudson_terms,
    parse_curve,
    published_rotation,
    rotation_sign,
    two_state_beta_fraction,
)
from workbench.conformers.mutarotation import first_order_curve
from workbench.errors import CurveFileError, FitError, WorkbenchError

# Bruice, Organic Chemistry, 8th ed. (2017), problems 20.65-66: D-glucose [alpha]D in water.
GLC_ALPHA, GLC_BETA, GLC_EQ = 112.2, 18.7, 52.7


def _glucose_curve(k: float = 0.015, noise: float = 0.0) -> tuple[np.ndarray, np.ndarray]:
    """Synthetic first-order curve from the published alpha and equilibrium rotations."""
    t = np.linspace(0.0, 240.0, 30)
    r = first_order_curve(t, GLC_ALPHA, GLC_EQ, k)
    if noise:
        r = r + noise * np.sin(1.7 * np.arange(len(t)))  # deterministic "noise" for the demo
    return t, r


def test_glucose_record_holds_bruice_values():
    # Bruice 8th ed., problems 20.65-66.
    rec = published_rotation(resolve("D-glucose"))
    assert (rec.alpha, rec.beta, rec.equilibrium) == (112.2, 18.7, 52.7)
    assert "Bruice" in rec.source
    assert ("equilibrium", 52.2) in [(f, v) for f, v, _ in rec.alternatives]  # handbook table


def test_l_enantiomer_rotations_are_sign_inverted():
    # Bruice 8th ed. values for D-glucose, inverted for the enantiomer.
    rec = published_rotation(resolve("L-glucose"))
    assert (rec.alpha, rec.beta, rec.equilibrium) == (-112.2, -18.7, -52.7)
    assert rec.inverted


def test_d_arabinose_from_the_published_l_value():
    # Handbook equilibrium table: L-arabinose +104.5.
    assert published_rotation(resolve("D-arabinose")).equilibrium == -104.5
    assert published_rotation(resolve("L-arabinose")).equilibrium == 104.5


def test_mannose_anomer_rotations_are_flagged_from_memory():
    # D-mannose alpha +29.3, beta -17.0 [memory]; equilibrium +14.6 (handbook table).
    rec = published_rotation(resolve("D-mannose"))
    assert set(rec.from_memory) == {"alpha", "beta"}
    # Two-state from these rotations against Angyal's 65.5 % alpha (1984, [memory] +/- 0.05).
    assert 1.0 - rec.beta_fraction == pytest.approx(0.655, abs=0.05)


def test_unknown_sugar_has_no_record():
    assert published_rotation(resolve("D-idose")) is None


@pytest.mark.parametrize(
    ("name", "sign"),
    [("D-glyceraldehyde", 1), ("D-erythrose", -1), ("D-gulose", -1), ("D-talose", 1), ("L-idose", 1)],
)
def test_signs_of_the_aldoses(name, sign):
    # REFERENCE_VALUES.md: signs of the D-aldoses; L by inversion.
    assert rotation_sign(resolve(name)) == sign


def test_two_state_fractions_of_glucose_and_galactose():
    # Bruice 8th ed.: two-state model gives 36 % alpha / 64 % beta (glucose), 28 / 72 (galactose).
    assert two_state_beta_fraction(GLC_ALPHA, GLC_BETA, GLC_EQ) == pytest.approx(0.64, abs=0.005)
    assert published_rotation(resolve("D-galactose")).beta_fraction == pytest.approx(0.72, abs=0.005)


def test_fit_recovers_glucose_anomer_fractions():
    # Curve synthesised from Bruice's alpha and equilibrium rotations; 64 % beta expected.
    t, r = _glucose_curve()
    fit = fit_mutarotation(t, r, alpha=GLC_ALPHA, beta=GLC_BETA)
    assert fit.rate_constant_per_min == pytest.approx(0.015, rel=1e-4)
    assert fit.half_life_min == pytest.approx(np.log(2) / 0.015, rel=1e-4)
    assert fit.initial_rotation == pytest.approx(GLC_ALPHA, abs=1e-3)
    assert fit.equilibrium_rotation == pytest.approx(GLC_EQ, abs=1e-3)
    assert fit.beta_fraction == pytest.approx(0.64, abs=0.005)
    assert fit.initial_beta_fraction == pytest.approx(0.0, abs=1e-4)
    assert fit.rmse < 1e-3


def test_fit_tolerates_noise():
    # Bruice's glucose rotations with +/- 0.5 deg of added (demo) noise: still 64 % beta.
    t, r = _glucose_curve(noise=0.5)
    fit = fit_mutarotation(t, r, alpha=GLC_ALPHA, beta=GLC_BETA)
    assert fit.beta_fraction == pytest.approx(0.64, abs=0.02)
    assert 0.2 < fit.rmse < 0.6


def test_fit_without_anomer_rotations_has_no_fraction():
    t, r = _glucose_curve()
    fit = fit_mutarotation(t, r)
    assert fit.beta_fraction is None and fit.to_dict()["beta_fraction"] is None


@pytest.mark.parametrize(
    ("times", "rots"),
    [([0, 1, 2], [1, 2, 3]), ([0, 1, 2, 3], [5, 5, 5, 5]), ([0, 1, 2, float("nan")], [1, 2, 3, 4])],
)
def test_fit_refuses_bad_data(times, rots):
    with pytest.raises(FitError):
        fit_mutarotation(times, rots)


def test_fit_refuses_only_one_anomer_rotation():
    t, r = _glucose_curve()
    with pytest.raises(FitError):
        fit_mutarotation(t, r, alpha=GLC_ALPHA)


def test_hudson_rule_alpha_more_dextrorotatory_in_d_series():
    # Bruice 8th ed. (glucose, galactose); mannose [memory]: alpha above beta for D-sugars.
    for name in ("D-glucose", "D-galactose", "D-mannose"):
        rec = published_rotation(resolve(name))
        assert rec.alpha > rec.beta
    assert hudson_anomer("D", 112.0, 52.7) == "alpha"
    assert hudson_anomer("L", -112.0, -52.7) == "alpha"
    terms = hudson_terms(GLC_ALPHA, GLC_BETA, 180.156)
    assert terms.rest + terms.anomeric == pytest.approx(GLC_ALPHA * 1.80156)


# ---------------------------------------------------------------- CSV and command line
def _write_curve(path, t, r):
    path.write_text("time_min,specific_rotation\n" + "".join(f"{a},{b}\n" for a, b in zip(t, r, strict=True)))


def test_csv_error_names_file_and_line():
    with pytest.raises(CurveFileError) as err:
        parse_curve("time_min,specific_rotation\n0,112\n5,abc\n", "curve.csv")
    assert "curve.csv, line 3" in str(err.value) and "abc" in str(err.value)
    assert isinstance(err.value, WorkbenchError)


def test_csv_needs_both_columns():
    with pytest.raises(CurveFileError, match="specific_rotation"):
        parse_curve("time_min,rotation\n0,1\n", "c.csv")


def test_command_fits_with_published_rotations(tmp_path, capsys):
    # Bruice 8th ed. glucose rotations: 64 % beta.
    path = tmp_path / "glc.csv"
    _write_curve(path, *_glucose_curve())
    assert main(["mutarotation", str(path), "--sugar", "D-glucose", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    for key in ("rate_constant_per_min", "half_life_min", "initial_rotation", "equilibrium_rotation", "rmse"):
        assert key in data
    assert data["beta_fraction"] == pytest.approx(0.64, abs=0.005)


def test_command_with_explicit_rotations_prints_text(tmp_path, capsys):
    path = tmp_path / "glc.csv"
    _write_curve(path, *_glucose_curve())
    assert main(["mutarotation", str(path), "--alpha", "112.2", "--beta", "18.7"]) == 0
    out = capsys.readouterr().out
    assert "beta_fraction" in out and "0.636" in out


def test_command_bad_csv_exits_2(tmp_path, capsys):
    path = tmp_path / "bad.csv"
    path.write_text("time_min,specific_rotation\n0,1\n1,x\n")
    assert main(["mutarotation", str(path)]) == 2
    assert f"{path}, line 3" in capsys.readouterr().err


def test_pure_noise_is_not_reported_as_a_fit():
    # Gaussian noise (sd 49 deg, invented) around a constant: no first-order relaxation to find.
    rng = np.random.default_rng(3)
    t = np.arange(0.0, 300.0, 10.0)
    with pytest.raises(FitError, match="no first-order relaxation"):
        fit_mutarotation(t, 50.0 + rng.normal(0.0, 49.0, len(t)))


@pytest.mark.parametrize(
    "text",
    [
        "time_min,specific_rotation\n0," + "1" * 140_000 + "\n",  # a field over the csv module's 128 KB limit
        "time_min,specific_rotation\n" + "".join(f"{k * 1e-320},{100 - k}\n" for k in range(6)),
        "time_min,specific_rotation\n0,1\x00\n",
    ],
)
def test_hostile_curve_files_exit_2(tmp_path, capsys, text):
    path = tmp_path / "curve.csv"
    path.write_text(text, encoding="utf-8")
    assert main(["mutarotation", str(path)]) == 2
    assert "Traceback" not in capsys.readouterr().err


def test_non_finite_anomer_rotation_is_refused_not_printed_as_nan(tmp_path, capsys):
    t, r = _glucose_curve()
    path = tmp_path / "curve.csv"
    path.write_text("time_min,specific_rotation\n" + "".join(f"{a},{b}\n" for a, b in zip(t, r, strict=True)))
    assert main(["mutarotation", str(path), "--alpha", "nan", "--beta", "18.7", "--json"]) == 2
    out, err = capsys.readouterr()
    assert "NaN" not in out and "finite" in err


def test_fraction_a_hair_below_zero_is_read_as_zero_and_a_far_one_is_kept():
    # A curve that starts at a rotation a little above Bruice's pure alpha value (noise on the first
    # points): the two-state model gives x_beta = (112.2 - 112.4) / (112.2 - 18.7) = -0.002, which is 0.
    t = np.linspace(0.0, 240.0, 30)
    fit = fit_mutarotation(t, first_order_curve(t, 112.4, GLC_EQ, 0.015), alpha=GLC_ALPHA, beta=GLC_BETA)
    assert fit.initial_beta_fraction == 0.0
    assert fit.to_dict()["initial_beta_fraction"] == 0.0
    # Far outside (a start at 140, arithmetic: (112.2 - 140) / 93.5 = -0.30): the data and the
    # anomer rotations disagree, and the value is kept to show it.
    far = fit_mutarotation(t, first_order_curve(t, 140.0, GLC_EQ, 0.015), alpha=GLC_ALPHA, beta=GLC_BETA)
    assert far.initial_beta_fraction == pytest.approx((112.2 - 140.0) / (112.2 - 18.7), abs=1e-3)


# ------------------------------------------------------------------ initial rotation of an anomer as evidence
def _initial(value: float, form: str | None):
    from projects import over_scope

    obs = {"id": "R0", "kind": "specific_rotation", "unknown": "U", "value": value}
    if form:
        obs["form"] = form
    return over_scope({"carbons": [6], "carbonyl": ["aldose"]}, [obs])


def test_initial_rotation_of_the_alpha_anomer_picks_glucose_out():
    from workbench.evidence import solve

    # freshly dissolved alpha-D-glucose +112.2, alpha-D-galactose +150.7 (Bruice, Organic Chemistry, 8th ed.,
    # problems 20.65-66): the initial reading keeps D-glucose, removes D-galactose and every L-sugar published
    left = solve(_initial(112.2, "alpha")).survivors["U"]
    assert resolve("D-glucose") in left
    assert resolve("D-galactose") not in left and resolve("L-glucose") not in left


def test_initial_rotation_of_the_beta_anomer_is_read_as_beta():
    from workbench.evidence import solve

    # beta-D-galactose +52.8, beta-D-glucose +18.7 (Bruice, as above)
    left = solve(_initial(52.8, "beta")).survivors["U"]
    assert resolve("D-galactose") in left and resolve("D-glucose") not in left
    # the same number read as an equilibrium value is D-glucose's (+52.7), not D-galactose's (+80.2)
    eq = solve(_initial(52.8, None)).survivors["U"]
    assert resolve("D-glucose") in eq and resolve("D-galactose") not in eq


def test_an_anomer_without_a_published_rotation_is_kept_and_flagged():
    from workbench.evidence import solve

    solution = solve(_initial(-40.0, "alpha"))
    talose = resolve("D-talose")  # no initial rotation of alpha-D-talose in the workbench's table
    assert talose in solution.survivors["U"]
    assert any("no prediction" in note for note in solution.flags["U"][talose])


def test_the_equilibrium_column_keeps_its_name():
    from workbench.evidence.observations import observation_from_dict
    from workbench.evidence.tables import observation_key

    base = {"id": "R", "kind": "specific_rotation", "unknown": "U", "value": 10.0}
    assert observation_key(observation_from_dict(base)) == "specific_rotation"
    assert observation_key(observation_from_dict({**base, "form": "equilibrium"})) == "specific_rotation"
    assert observation_key(observation_from_dict({**base, "form": "alpha"})) == "specific_rotation|form=alpha"
