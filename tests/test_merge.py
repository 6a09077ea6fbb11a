"""``stereosieve merge``: the union of two collaborators' project files, clashes named."""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from workbench.cli import main
from workbench.errors import ProjectError
from workbench.evidence import load_project, solve
from workbench.evidence.merge import MergeError, merge_projects

SAMPLES = Path(__file__).resolve().parent.parent / "sample_projects"
SEAWEED = json.loads((SAMPLES / "red_seaweed_deoxyhexose.json").read_text(encoding="utf-8"))


def _split():
    """Two collaborators' files: the first four and the last four observations (two shared)."""
    first = json.loads(json.dumps(SEAWEED))
    second = json.loads(json.dumps(SEAWEED))
    first["observations"] = first["observations"][:4]
    second["observations"] = second["observations"][2:]
    return first, second


def test_union_keeps_shared_entries_once_and_adds_the_rest():
    first, second = _split()
    merged = merge_projects(first, second, ("a.json", "b.json"))
    ids = [o.id for o in merged.project.observations]
    assert ids == [o["id"] for o in SEAWEED["observations"]]
    assert merged.shared == ("U1", "E3", "E4") and merged.added == ("E5", "E6")
    # the union holds all six records, so it solves as the whole sample does (L-fucose, tests/test_samples.py)
    assert [c for c in solve(merged.project).survivors["U1"]] == list(
        solve(load_project(SAMPLES / "red_seaweed_deoxyhexose.json")).survivors["U1"]
    )


def test_equal_content_written_differently_is_not_a_clash():
    first, second = _split()
    second["observations"][0]["periodate"] = 2  # 2 and 2.0 are the same amount
    second["observations"][1]["id"] = " E4 "  # ids are read stripped
    assert len(merge_projects(first, second).project.observations) == 6


def test_every_clashing_id_is_named_unknowns_too():
    first, second = _split()
    second["observations"][0]["formic_acid"] = 2.0
    second["observations"][1]["by"] = "someone else"
    second["unknowns"][0]["label"] = "another label"
    with pytest.raises(MergeError) as caught:
        merge_projects(first, second, ("a.json", "b.json"))
    text = str(caught.value)
    assert "unknown U1" in text and "observation E3" in text and "observation E4" in text
    assert "formic_acid: 1.0 in a.json, 2.0 in b.json" in text
    assert [(c.what, c.id) for c in caught.value.clashes] == [
        ("unknown", "U1"),
        ("observation", "E3"),
        ("observation", "E4"),
    ]


def test_differing_titles_keep_the_first_and_say_so():
    first, second = _split()
    second["title"] = "the other lab's title"
    merged = merge_projects(first, second, ("a.json", "b.json"))
    assert merged.project.title == SEAWEED["title"] and "titles differ" in merged.notes[0]


def test_an_invalid_file_is_named():
    first, _ = _split()
    with pytest.raises(ProjectError, match="b.json"):
        merge_projects(first, {"format": "stereosieve-project", "version": 1, "unknowns": []}, ("a.json", "b.json"))


def test_merge_command(tmp_path, capsys):
    first, second = _split()
    a, b, out = tmp_path / "a.json", tmp_path / "b.json", tmp_path / "out.json"
    a.write_text(json.dumps(first), encoding="utf-8")
    b.write_text(json.dumps(second), encoding="utf-8")
    assert main(["merge", str(a), str(b), "-o", str(out)]) == 0
    assert "2 added" in capsys.readouterr().out
    assert [o.id for o in load_project(out).observations] == ["E1", "E2", "E3", "E4", "E5", "E6"]
    second["observations"][0]["note"] = "edited"
    b.write_text(json.dumps(second), encoding="utf-8")
    out.unlink()
    assert main(["merge", str(a), str(b), "-o", str(out)]) == 2
    err = capsys.readouterr().err
    assert "observation E3" in err and "Traceback" not in err and not out.exists()
    assert main(["merge", str(a), str(tmp_path / "missing.json"), "-o", str(out)]) == 2
    assert main(["merge", str(a), str(b), "-o", str(tmp_path)]) == 2
