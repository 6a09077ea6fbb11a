"""Residue cards in the plain medium: the ring in characters, names and alditol acetate, no SVG, ids escaped.

Expected ring contents follow from the structures (common practice: a
pyranose ring holds C-1 to C-5 and O-5, a furanose C-1 to C-4 and O-4; a
2-ketose closes on C-2), not from the drawing code.
"""

from __future__ import annotations

import json
import re
from pathlib import Path

from workbench.chem import resolve
from workbench.chem.residue import Residue
from workbench.display.board import solution_html
from workbench.display.residues import residue_card, residue_pre, residue_text
from workbench.evidence import load_project, solve

SAMPLE = Path(__file__).resolve().parent.parent / "sample_projects" / "fictional_arabinogalactan_residues.json"
HOSTILE = '<img src=x onerror="alert(1)">&R'


def _carbons(text: str) -> list[int]:
    return sorted(int(n) for n in re.findall(r"C(\d+)", text))


def test_a_4_linked_glucopyranose_in_characters():
    text = residue_text(Residue(resolve("D-glucose"), "pyranose", "alpha", (4,)))
    lines = text.splitlines()
    assert len(lines) >= 7 and all(line == line.rstrip() for line in lines)  # drawn line by line
    assert _carbons(text) == [1, 2, 3, 4, 5, 6]  # every carbon numbered once (C-6 outside the ring)
    assert "O4\u2190" in text  # the position that carries the next residue out
    assert "O\u2192(1" in text  # the anomeric link towards the reducing end
    assert text.count("OH") == 3  # O-2, O-3 and O-6 stay free
    assert re.search(r"C5\u2500+O", text)  # ring oxygen bonded to the ring-closing carbon C-5
    assert "\u2190" not in text.replace("O4\u2190", "")  # no other linked position


def test_a_terminal_arabinofuranose_and_a_6_linked_fructofuranose():
    araf = residue_text(Residue(resolve("L-arabinose"), "furanose", "alpha"))
    assert _carbons(araf) == [1, 2, 3, 4, 5]
    assert araf.count("OH") == 3 and "\u2190" not in araf  # O-2, O-3, O-5 free; terminal, nothing attached
    assert "O\u2192(1" in araf
    fruf = residue_text(Residue(resolve("D-fructose"), "furanose", "beta", (6,)))
    assert _carbons(fruf) == [1, 2, 3, 4, 5, 6]
    assert "O\u2192(2" in fruf and "O6\u2190" in fruf  # a 2-ketose links through O-2
    assert fruf.count("OH") == 3  # O-1, O-3, O-4 free (O-5 closes the ring)


def test_the_plain_card_names_the_residue_and_its_alditol_acetate_without_svg():
    residue = Residue(resolve("D-glucose"), "pyranose", "alpha", (4,))
    card = residue_card(residue, ("a flag",), medium="plain")
    assert "<svg" not in card and "<script" not in card
    assert "-&gt;4)-alpha-D-Glcp-(1-&gt;" in card  # the condensed name in plain letters (IUPAC 2-Carb-37)
    assert "\u21924)-\u03b1-D-Glcp-(1\u2192" in card
    # 4-linked hexopyranose: 1,4,5-tri-O-acetyl-2,3,6-tri-O-methyl glucitol, C-1 deuterated by NaBD4
    # (the usual partially methylated alditol acetate of a 4-linked glucose, from memory)
    pmaa = re.search(r"PMAA: ([^<]*)<", card).group(1)
    assert "1,4,5-tri-O-acetyl" in pmaa and "2,3,6-tri-O-methyl" in pmaa and "glucitol" in pmaa
    assert residue_pre(residue).startswith('<pre class="ss-residue-text"') and "a flag" in card


def _sample() -> dict:
    return json.loads(SAMPLE.read_text(encoding="utf-8"))


def test_the_sample_residue_project_reads_in_the_plain_board():
    project = load_project(SAMPLE)
    solution = solve(project)
    plain = solution_html(solution, medium="plain")
    assert "<svg" not in plain and "<script" not in plain  # what sanitisers strip is not relied on
    drawn = plain.count('class="ss-residue-text"')
    assert drawn == sum(min(len(solution.survivors[u]), 24) for u in project.unknown_ids) > 0
    for uid in project.unknown_ids:
        for residue in solution.survivors[uid]:
            assert f'data-name="{residue.name.replace(">", "&gt;")}"' in plain
    assert "svg" in solution_html(solution).lower()  # the live medium still draws SVG


def test_a_hostile_unknown_id_stays_text_in_the_plain_board(tmp_path):
    def rename(node):  # every mention of R1 (the unknown, observation targets, molar-ratio members)
        if isinstance(node, dict):
            return {k: rename(v) for k, v in node.items()}
        if isinstance(node, list):
            return [rename(v) for v in node]
        return HOSTILE if node == "R1" else node

    path = tmp_path / "hostile.json"
    path.write_text(json.dumps(rename(_sample())), encoding="utf-8")
    project = load_project(path)
    assert HOSTILE in project.unknown_ids
    plain = solution_html(solve(project), medium="plain")
    assert "<img" not in plain and "&lt;img src=x onerror=&quot;alert(1)&quot;&gt;&amp;R" in plain
    assert 'data-unknown="&lt;img src=x onerror=&quot;alert(1)&quot;&gt;&amp;R"' in plain
