"""The input guard: hostile project files are refused with a message (exit 2), never a traceback or a hang.

No chemistry is checked here; the limits are stereosieve's own (DEVELOPERS.md).
"""

from __future__ import annotations

import json
import os
import sys
from pathlib import Path

import pytest

from workbench.cli import main
from workbench.errors import ProjectError
from workbench.evidence.project import load_project
from workbench.inputs import MAX_DEPTH, parse_project_json

ROOT = Path(__file__).resolve().parent.parent
SAMPLE = ROOT / "sample_projects" / "gum_exudate_four_sugars.json"


def _head(obs: str = "", title: str = '"t"', unknowns: str = '[{"id": "U"}]') -> str:
    return f'{{"format": "stereosieve-project", "version": 1, "title": {title}, "unknowns": {unknowns}, "observations": [{obs}]}}'


def _refused(tmp_path: Path, text: str, *words: str, capsys) -> str:
    path = tmp_path / "p.json"
    path.write_text(text, encoding="utf-8", errors="surrogatepass")
    assert main(["validate", str(path)]) == 2
    err = capsys.readouterr().err
    assert "Traceback" not in err and str(path) in err
    for word in words:
        assert word in err, err
    return err


@pytest.mark.parametrize(
    ("text", "words"),
    [
        ("[" * 100_000 + "]" * 100_000, ("nested",)),
        (_head(title="[" * 40 + "]" * 40), ("nested more than",)),
        (_head('{"id": "E1", "kind": "carbon_count", "unknown": "U", "value": ' + "9" * 5000 + "}"), ("5000 digits",)),
        (
            _head('{"id": "E1", "kind": "specific_rotation", "unknown": "U", "value": ' + "9" * 401 + "}"),
            ("401 digits",),
        ),
        (_head('{"id": "E1", "kind": "specific_rotation", "unknown": "U", "value": 1e999}'), ("too large",)),
        (_head('{"id": "E1", "kind": "specific_rotation", "unknown": "U", "value": NaN}'), ("NaN",)),
        (_head('{"id": "E1", "kind": ["series"], "unknown": "U", "value": "D"}'), ("E1", "kind")),
        (_head(unknowns='[{"id": "U", "scope": {"modifications": [6]}}]'), ("unknown U", "modifications")),
        (_head(unknowns='[{"id": "U", "scope": {"carbons": ["6"]}}]'), ("unknown U", "carbons")),
        (_head(title='"a\\ud800b"'), ("title", "Unicode")),
        (
            _head('{"id": "E1", "kind": "different", "members": ["U", "D-glucose\\udfff"]}'),
            ("E1", "members", "Unicode"),
        ),
        (
            _head('{"id": "E1", "kind": "molecular_formula", "unknown": "U", "value": "H12C6O6"}'),
            ("Hill order", "C6H12O6"),
        ),
        (_head('{"id": "E1", "kind": "molecular_formula", "unknown": "U", "value": "rm -rf"}'), ("E1", "formula")),
        (_head('{"id": "E1", "kind": "molecular_formula", "unknown": "U", "value": "C6Xx12"}'), ("E1", "Xx")),
        (_head('{"id": "E1", "kind": "carbon_count", "unknown": "U", "value": 6, "value": 5}'), ("twice",)),
        (_head('{"id": "E1", "kind": "carbon_count", "unknown": "U", "value": true}'), ("E1", "value")),
        (
            _head('{"id": "E1", "kind": "series", "unknown": "U", "value": "D", "note": "' + "x" * 20_000 + '"}'),
            ("E1", "note"),
        ),
    ],
)
def test_hostile_content_is_refused_with_a_message(tmp_path, capsys, text, words):
    _refused(tmp_path, text, *words, capsys=capsys)


def test_devices_pipes_and_folders_are_refused_without_reading(tmp_path, capsys):
    fifo = tmp_path / "pipe.json"
    os.mkfifo(fifo)  # no writer: opening it for reading would block forever
    for target in ("/dev/zero", str(fifo), str(tmp_path)):
        assert main(["validate", target]) == 2
        assert "Traceback" not in capsys.readouterr().err


def test_a_file_over_the_size_limit_is_refused(tmp_path, monkeypatch):
    from workbench import inputs as guard

    monkeypatch.setattr(guard, "MAX_BYTES", 1000)
    path = tmp_path / "big.json"
    path.write_text(json.dumps({"padding": "x" * 2000}), encoding="utf-8")
    with pytest.raises(ProjectError, match="bytes"):
        load_project(path)


def test_a_byte_order_mark_is_accepted(tmp_path):
    path = tmp_path / "bom.json"
    path.write_bytes(b"\xef\xbb\xbf" + SAMPLE.read_bytes())
    assert load_project(path) == load_project(SAMPLE)


def test_depth_at_the_limit_parses_and_beyond_it_is_refused():
    ok = json.loads(_head())
    assert parse_project_json(_head()) == ok
    with pytest.raises(ProjectError, match="nested"):
        parse_project_json(_head(title="[" * (MAX_DEPTH + 1) + "]" * (MAX_DEPTH + 1)))


def test_a_hill_formula_is_accepted_and_spaces_dropped(tmp_path):
    path = tmp_path / "f.json"
    path.write_text(
        _head('{"id": "E1", "kind": "molecular_formula", "unknown": "U", "value": "C6 H12 O6"}'), encoding="utf-8"
    )
    # C6H12O6 is the formula of a hexose (common practice); Hill order C, H, then alphabetical.
    assert load_project(path).observation("E1").value == "C6H12O6"


def test_nothing_saved_is_touched_by_a_refused_file(tmp_path, capsys):
    path = tmp_path / "p.json"
    text = _head(title='"a\\ud800b"')
    path.write_text(text, encoding="utf-8")
    main(["solve", str(path)])
    assert path.read_text(encoding="utf-8") == text
    assert sys.getrecursionlimit() >= 1000


@pytest.mark.parametrize(
    "argv",
    [
        ["predict", "6-de\udcffoxy-L-galactose"],
        ["predict", "--json", "OC[C@H]1OC(O)[C@H](O)[C@@H](\udc80)[C@@H]1O"],
        ["catalogue", "--modifications", "deoxy:\udc80"],
    ],
)
def test_text_arguments_that_are_not_utf8_are_refused(argv, capsys):
    """A terminal passing bytes that are not UTF-8 (kept by Python as lone surrogates) gets exit 2 and words."""
    assert main(argv) == 2
    err = capsys.readouterr().err
    assert "not valid UTF-8" in err and "Traceback" not in err


def test_an_id_shaped_like_a_formula_or_a_known_sugar_stays_an_unknown(tmp_path, capsys):
    """Ids starting with '=' once collided with the solver's names for known sugars (a KeyError)."""
    from projects import project_dict

    # D-glucose and D-mannose share their osazone (common practice: C-2 epimers)
    data = project_dict(
        [{"id": "=D-mannose", "scope": {"carbons": [6], "carbonyl": ["aldose"], "series": ["D"]}}],
        [
            {
                "id": "E1",
                "kind": "same_product",
                "reaction": "osazone",
                "members": ["=D-mannose", "D-glucose"],
                "relation": "identical",
            },
            {"id": "E2", "kind": "different", "members": ["=D-mannose", "D-glucose"]},
        ],
    )
    path = tmp_path / "p.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    assert main(["solve", "--json", str(path)]) == 0
    out = json.loads(capsys.readouterr().out)
    survivors = out["unknowns"]["=D-mannose"]["survivors"]
    assert [s["name"] for s in survivors] == ["D-mannose"]


def test_messages_show_letters_of_any_script_and_escape_controls():
    from workbench.inputs import show

    assert show("β-D-Glcp·H2O") == "'β-D-Glcp·H2O'"  # read as written, not as UTF-8 bytes
    for hostile in ("a\x1b[2J", "x\u202e", "a\nb", "\x9b31m", "a\u2028b", "\ud800"):
        shown = show(hostile)
        assert shown.isprintable() and "\\" in shown
