"""Project file validation: every bad file gets one clear message per problem, exit code 2."""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from workbench.cli import main
from workbench.errors import ProjectError
from workbench.evidence import dumps_project, load_project, project_from_dict, save_project

DATA = Path(__file__).parent / "data"
GOOD = json.loads((DATA / "fischer_glucose.json").read_text())


def problems_of(data) -> list[str]:
    with pytest.raises(ProjectError) as err:
        project_from_dict(data, "p.json")
    return err.value.problems


def with_obs(*obs):
    data = json.loads(json.dumps(GOOD))
    data["observations"] = list(obs)
    return data


def test_good_file_round_trips(tmp_path):
    p = load_project(DATA / "fischer_glucose.json")
    out = tmp_path / "copy.json"
    save_project(p, out)
    assert load_project(out) == p
    assert json.loads(dumps_project(p))["format"] == "stereosieve-project"


def test_malformed_json_names_line_and_column(tmp_path):
    bad = tmp_path / "bad.json"
    bad.write_text('{"format": "stereosieve-project",\n "version": 1,,\n}')
    with pytest.raises(ProjectError) as err:
        load_project(bad)
    assert "line 2, column" in str(err.value) and "bad.json" in str(err.value)


@pytest.mark.parametrize(
    ("obs", "expected"),
    [
        ({"id": "E1", "kind": "aldaric_acid", "unknown": "G"}, "observation E1, field 'optically_active': missing"),
        ({"id": "E1", "kind": "aldaric_acid", "unknown": "G", "optically_active": "yes"}, "expected true or false"),
        ({"id": "E1", "kind": "carbon_count", "unknown": "G", "value": 6, "colour": "red"}, "field 'colour'"),
        ({"id": "E1", "kind": "melting_point", "unknown": "G"}, "unknown kind 'melting_point'"),
        ({"id": "E1", "kind": "series", "unknown": "Q", "value": "D"}, "no unknown has id 'Q'"),
        ({"id": "E1", "kind": "series", "unknown": "G", "value": "R"}, "'R' is not one of D, L"),
        (
            {
                "id": "E1",
                "kind": "periodate",
                "unknown": "G",
                "substrate": "free",
                "periodate": -1,
                "formic_acid": 5,
                "formaldehyde": 1,
            },
            "observation E1, field 'periodate': -1 is below",
        ),
        (
            {
                "id": "E1",
                "kind": "same_product",
                "reaction": "osazone",
                "members": ["G", "D-glucos"],
                "relation": "identical",
            },
            "Did you mean: D-glucose",
        ),
        (
            # a mirror-image relation pairs exactly two compounds [common practice]
            {
                "id": "E1",
                "kind": "same_product",
                "reaction": "aldaric_acid",
                "members": ["G", "M", "A"],
                "relation": "enantiomeric",
            },
            "observation E1, field 'members': an 'enantiomeric' relation needs exactly two members",
        ),
        ({"kind": "series", "unknown": "G", "value": "D"}, "field 'id'"),
        ({"id": "E1", "kind": "series", "unknown": "G", "value": "D", "recorded": "last Tuesday"}, "ISO 8601"),
    ],
)
def test_bad_observations_are_named(obs, expected):
    problems = problems_of(with_obs(obs))
    assert any(expected in p for p in problems), problems


def test_duplicate_ids_and_several_problems_at_once():
    a = {"id": "E1", "kind": "series", "unknown": "G", "value": "D"}
    b = {"id": "E1", "kind": "series", "unknown": "G", "value": "L"}
    c = {"id": "E2", "kind": "carbon_count", "unknown": "G", "value": "six"}
    problems = problems_of(with_obs(a, b, c))
    assert len(problems) == 2
    assert "E1: the id is used twice" in problems[0]
    assert "E2" in problems[1]


def test_future_version_and_wrong_format():
    data = dict(GOOD, version=7, format="other")
    problems = problems_of(data)
    assert any("newer than this stereosieve reads" in p for p in problems)
    assert any("'format'" in p for p in problems)


def test_empty_scope_is_named():
    data = json.loads(json.dumps(GOOD))
    data["unknowns"][0]["scope"] = {"carbonyl": ["ketose"], "modifications": ["uronic"]}
    assert any("unknown G" in p and "no candidate" in p for p in problems_of(data))


def test_bad_scope_is_named():
    data = json.loads(json.dumps(GOOD))
    data["unknowns"][0]["scope"] = {"carbons": [12]}
    assert any("unknown G" in p and "12" in p for p in problems_of(data))


@pytest.mark.parametrize("command", ["solve", "validate", "plan"])
def test_cli_exit_code_2_without_traceback(tmp_path, capsys, command):
    bad = tmp_path / "bad.json"
    bad.write_text(json.dumps(with_obs({"id": "E9", "kind": "series", "unknown": "G", "value": "X"})))
    assert main([command, str(bad)]) == 2
    err = capsys.readouterr().err
    assert "E9" in err and "bad.json" in err and "Traceback" not in err


def test_cli_missing_file_is_bad_input(capsys):
    assert main(["solve", "/nonexistent/project.json"]) == 2
    assert "no such file" in capsys.readouterr().err


def test_cli_contradiction_exits_3(capsys):
    assert main(["solve", str(DATA / "contradictory.json")]) == 3
    assert "E2" in capsys.readouterr().out


def test_cli_solve_json_contract(capsys):
    # Contract 2 of DESIGN.md: unknowns -> scope_count, count, survivors; trail; conflicts
    assert main(["solve", str(DATA / "fischer_glucose.json"), "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    g = out["unknowns"]["G"]
    assert g["scope_count"] == 16 and g["count"] == 1
    assert g["survivors"][0]["name"] == "D-glucose"
    assert g["survivors"][0]["systematic_name"] == "D-gluco-hexose"
    assert g["survivors"][0]["inchikey"] == "GZCGUPFRVQAUEE-SLPGGIOYSA-N"  # PubChem aldehydo-D-glucose [from memory]
    assert out["trail"][0]["observation"] == "E1" and "L-glucose" in out["trail"][0]["eliminated"]["G"]
    assert out["conflicts"] == []


def test_save_never_destroys_the_previous_file(tmp_path, monkeypatch):
    target = tmp_path / "p.json"
    p = load_project(DATA / "fischer_glucose.json")
    save_project(p, target)
    before = target.read_text()

    def boom(*args, **kwargs):
        raise OSError("disk full")

    monkeypatch.setattr("os.replace", boom)
    with pytest.raises(OSError):
        save_project(p.without("E1"), target)
    assert target.read_text() == before
    assert [f.name for f in tmp_path.iterdir()] == ["p.json"]


@pytest.mark.parametrize(("given", "stored"), [("H2-H1", "H1-H2"), ("H-3,H-4", "H3-H4"), ("H5ax-H4", "H4-H5ax")])
def test_proton_pairs_are_normalised(given, stored):
    obs = {
        "id": "E1",
        "kind": "coupling_constant",
        "unknown": "G",
        "form": "beta_pyranose",
        "pair": given,
        "value": 7.8,
    }
    assert project_from_dict(with_obs(obs)).observations[0].pair == stored


def test_bad_proton_pair_is_named():
    obs = {
        "id": "E1",
        "kind": "coupling_constant",
        "unknown": "G",
        "form": "beta_pyranose",
        "pair": "C1-H2",
        "value": 7.8,
    }
    assert any("observation E1, field 'pair'" in p for p in problems_of(with_obs(obs)))
