"""``stereosieve schema``: the JSON Schema of the project file, checked with the jsonschema package.

The valid and invalid instances below are generated from the same FieldSpec rows the loader uses, so a
kind added later is covered without editing this file; the loader is the judge of what is valid.
"""

from __future__ import annotations

import ast
import json
from pathlib import Path

import jsonschema
import projects
import pytest

from workbench.cli import main
from workbench.data import DEMO_PROJECT, data_path
from workbench.errors import ObservationError, WorkbenchError
from workbench.evidence import dumps_project, load_project, project_from_dict
from workbench.evidence.observations import OBSERVATION_TYPES, observation_from_dict
from workbench.evidence.schema import DIALECT, KNOWN_TYPES, project_schema

ROOT = Path(__file__).resolve().parent.parent
PROJECT_FILES = sorted((ROOT / "sample_projects").glob("*.json")) + sorted((ROOT / "tests" / "data").glob("*.json"))
PROJECT_FILES.append(data_path(DEMO_PROJECT))


@pytest.fixture(scope="module")
def validator():
    schema = project_schema()
    jsonschema.Draft202012Validator.check_schema(schema)
    return jsonschema.Draft202012Validator(schema)


def _wrap(*observations, **top):
    data = {"format": "stereosieve-project", "version": 1, "title": "t", "unknowns": [{"id": "U1"}]}
    data["observations"] = list(observations)
    data.update(top)
    return data


def test_the_schema_is_draft_2020_12():
    schema = project_schema()
    assert schema["$schema"] == DIALECT == "https://json-schema.org/draft/2020-12/schema"
    assert set(schema["$defs"]) >= {f"observation_{k}" for k in OBSERVATION_TYPES}


@pytest.mark.parametrize("path", PROJECT_FILES, ids=lambda p: p.name)
def test_every_project_file_validates(validator, path):
    data = json.loads(path.read_text(encoding="utf-8"))
    load_project(path)  # the loader accepts it ...
    assert list(validator.iter_errors(data)) == []  # ... and so does the schema
    # and what stereosieve itself writes back
    assert list(validator.iter_errors(json.loads(dumps_project(load_project(path))))) == []


def _called(node: ast.Call) -> str:
    """The name a call is made by: ``f`` for ``f(...)`` and for ``module.f(...)``."""
    return getattr(node.func, "id", "") or getattr(node.func, "attr", "")


def _projects_written_in_tests() -> list[tuple[str, dict]]:
    """Project files spelt out in the test modules: literal dicts with the format key, literal
    ``project(unknowns, observations)`` and ``project_dict(...)`` calls (the helpers of tests/projects.py),
    and the project dicts that tests/projects.py shares between modules."""
    found = [
        (f"projects.py:{name}", value)
        for name, value in vars(projects).items()
        if isinstance(value, dict) and value.get("format") == "stereosieve-project"
    ]
    for path in sorted((ROOT / "tests").glob("test_*.py")):
        for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
            try:
                if isinstance(node, ast.Dict):
                    data = ast.literal_eval(node)
                    if isinstance(data, dict) and data.get("format") == "stereosieve-project":
                        found.append((f"{path.name}:{node.lineno}", data))
                elif (
                    isinstance(node, ast.Call) and _called(node) in ("project", "project_dict") and len(node.args) == 2
                ):
                    unknowns, observations = (ast.literal_eval(a) for a in node.args)
                    data = {"format": "stereosieve-project", "version": 1, "title": "test"}
                    found.append(
                        (f"{path.name}:{node.lineno}", {**data, "unknowns": unknowns, "observations": observations})
                    )
            except (ValueError, TypeError, SyntaxError):  # not a literal: built at run time
                continue
    return found


def test_every_valid_project_written_in_the_tests_validates(validator):
    checked = 0
    for where, data in _projects_written_in_tests():
        try:
            project_from_dict(data, where)
        except WorkbenchError:
            continue  # a deliberately bad file of some test
        assert list(validator.iter_errors(data)) == [], where
        checked += 1
    assert checked >= 5  # tests/test_engine.py alone spells out more than five


def _valid_value(spec):
    """A value the loader accepts for ``spec`` (references point at U1 or a known sugar)."""
    if spec.type in ("unknown", "member"):
        return "U1"
    if spec.type == "members":
        return ["U1", "D-glucose", "D-mannose", "D-galactose"][: max(spec.min_items, 1)]
    if spec.type == "choice":
        return spec.choices[0]
    if spec.type == "bool":
        return True
    if spec.type in ("int", "float"):
        low = spec.minimum if spec.minimum is not None else 0
        value = low if spec.maximum is None else (low + spec.maximum) / 2
        return int(value) if spec.type == "int" else float(value)
    if spec.type == "positions":  # a 2,3,4,6-tri-O-methyl... pattern of a terminal hexopyranosyl residue
        return {"acetyl": [1, 5], "methyl": [2, 3, 4, 6]}.get(spec.name, [1, 2, 3][: max(spec.min_items, 1)])
    if spec.type == "numbers":
        return [1.0, 2.0]
    return {"pair": "H1-H2", "product": "glycerol", "sugar": "D-glucose"}.get(spec.name, "C6H12O6")


def _examples() -> dict[str, dict]:
    """One observation of each kind found in the project files (the first), as a fallback base."""
    out: dict[str, dict] = {}
    for path in PROJECT_FILES:
        for obs in json.loads(path.read_text(encoding="utf-8")).get("observations", []):
            out.setdefault(obs.get("kind"), obs)
    return out


def _valid_observation(kind):
    """An observation of ``kind`` the loader accepts: generated from the specs, else one from a project file."""
    data = {"id": "E1", "kind": kind, "note": "n", "by": "A. Chemist", "recorded": "2025-03-04T10:15+01:00"}
    for spec in OBSERVATION_TYPES[kind].SPECS:
        data[spec.name] = _valid_value(spec)
    try:
        observation_from_dict(data)
    except ObservationError:  # a kind whose fields depend on each other: take a real one
        if kind not in _examples():
            pytest.skip(f"no valid {kind} observation can be generated or found in a project file")
        data = {**_examples()[kind], "id": "E1"}
    return data


def _broken(kind):
    """Observations of ``kind`` with one field wrong in form, each named."""
    base = _valid_observation(kind)
    out = {"extra field": {**base, "colour": "red"}, "bad date": {**base, "recorded": "last Tuesday"}}
    out["no id"] = {k: v for k, v in base.items() if k != "id"}
    for spec in OBSERVATION_TYPES[kind].SPECS:
        if spec.required:
            out[f"{spec.name} missing"] = {k: v for k, v in base.items() if k != spec.name}
        if spec.type not in KNOWN_TYPES:
            continue  # the schema accepts any value of a type it does not describe yet
        wrong = {"bool": "yes", "int": "six", "float": "six", "members": "U1", "positions": "2,3"}.get(spec.type, 12)
        out[f"{spec.name} wrong type"] = {**base, spec.name: wrong}
        if spec.type == "choice":
            out[f"{spec.name} not a choice"] = {**base, spec.name: "something else"}
        if spec.type in ("int", "float") and spec.maximum is not None:
            out[f"{spec.name} too large"] = {**base, spec.name: spec.maximum + 1}
        if spec.type in ("int", "float") and spec.minimum is not None:
            out[f"{spec.name} too small"] = {**base, spec.name: spec.minimum - 1}
        if spec.type == "members" and spec.min_items > 1:
            out[f"{spec.name} too few"] = {**base, spec.name: ["U1"]}
        if spec.type == "members":
            out[f"{spec.name} repeated"] = {**base, spec.name: ["U1", "U1"]}
        if spec.type == "positions":
            out[f"{spec.name} repeated"] = {**base, spec.name: [2, 2]}
            out[f"{spec.name} carbon 0"] = {**base, spec.name: [0]}
    return out


@pytest.mark.parametrize("kind", list(OBSERVATION_TYPES))
def test_schema_and_loader_agree_on_every_kind(validator, kind):
    good = _valid_observation(kind)
    observation_from_dict(good)
    assert list(validator.iter_errors(_wrap(good))) == []
    for fault, bad in _broken(kind).items():
        with pytest.raises(ObservationError):
            observation_from_dict(bad)
        assert list(validator.iter_errors(_wrap(bad))), f"{kind}: schema accepts '{fault}'"


@pytest.mark.parametrize(
    "label, data",
    [
        ("wrong format", _wrap(format="something-else")),
        ("version from the future", _wrap(version=99)),
        ("version as text", _wrap(version="1")),
        ("no unknowns", _wrap(unknowns=[])),
        ("unknown without id", _wrap(unknowns=[{"label": "x"}])),
        ("unknown with a stray field", _wrap(unknowns=[{"id": "U1", "colour": "red"}])),
        ("scope key misspelt", _wrap(unknowns=[{"id": "U1", "scope": {"carbon": [6]}}])),
        ("chain too long", _wrap(unknowns=[{"id": "U1", "scope": {"carbons": [12]}}])),
        ("series not D or L", _wrap(unknowns=[{"id": "U1", "scope": {"series": ["R"]}}])),
        ("unknown kind", _wrap({"id": "E1", "kind": "taste", "unknown": "U1"})),
        ("top-level stray field", _wrap(author="me")),
        ("observations not a list", _wrap(observations={"E1": {}})),
    ],
)
def test_invalid_files_are_rejected(validator, tmp_path, label, data):
    assert list(validator.iter_errors(data)), label
    path = tmp_path / "bad.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    assert main(["validate", str(path)]) == 2  # the loader rejects it too


def test_schema_command_prints_and_writes_the_schema(tmp_path, capsys):
    assert main(["schema"]) == 0
    printed = json.loads(capsys.readouterr().out)
    assert printed == project_schema()
    target = tmp_path / "project.schema.json"
    assert main(["schema", "-o", str(target)]) == 0
    assert json.loads(target.read_text(encoding="utf-8")) == printed
    assert main(["schema", "-o", str(tmp_path)]) == 2
