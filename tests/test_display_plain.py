"""Saved views that survive sanitisers: Fischer projections in characters, bars in plain markup, 3D page."""

from __future__ import annotations

import re

from workbench.chem import resolve
from workbench.display.board import solution_html
from workbench.display.molview import Mark, Scene, viewer_html
from workbench.display.plain import fischer_pre, fischer_text, narrowing_table
from workbench.evidence import load_project, solve
from workbench.ui.base import snapshot_bundle

# Tags and attributes JupyterLab 4's HTML sanitiser keeps (its allowed lists, read from the installed
# JupyterLab bundle): no svg, script, style; no data: URLs.
_STRIPPED = ("<svg", "<script", "<style", "<img", "data:", "<foreignObject")


def test_d_glucose_in_characters_has_oh_right_left_right_right():
    # D-glucose in the Fischer projection: OH right at C-2, left at C-3, right at C-4 and C-5 [common practice].
    text = fischer_text(resolve("D-glucose"))
    rows = [line for line in text.splitlines() if "┼" in line]
    assert rows == [" 2  H ──┼── OH", " 3 HO ──┼── H", " 4  H ──┼── OH", " 5  H ──┼── OH"]
    assert text.splitlines()[0].strip() == "1     CHO" and text.splitlines()[-1].endswith("CH₂OH")


def test_amino_sugar_and_ketose_in_characters():
    # D-glucosamine: NH2 on the right at C-2; D-fructose: C=O at C-2 [common practice].
    assert " 2  H ──┼── NH₂" in fischer_text(resolve("D-glucosamine"))
    assert "C═O" in fischer_text(resolve("D-fructose"))


def test_open_centres_are_marked():
    assert "*" in fischer_text(resolve("D-allose"), open_centres=[3]).splitlines()[4]
    assert "#d98e04" in fischer_pre(resolve("D-allose"), open_centres=[3])


def test_saved_solution_view_uses_only_what_sanitisers_keep():
    gum = solve(load_project("sample_projects/gum_exudate_four_sugars.json"))
    html = solution_html(gum, medium="plain")
    for tag in _STRIPPED:
        assert tag not in html
    assert html.count('class="ss-fischer-text"') == 4 and "L-rhamnose" in html and "ss-narrowing-table" in html
    # the text that survives is the drawing, not run-on digits: every Fischer block keeps its lines
    block = re.search(r'<pre class="ss-fischer-text"[^>]*>(.*?)</pre>', html, re.S).group(1)
    assert block.count("\n") >= 6


def test_narrowing_bars_are_log_scaled():
    html = narrowing_table(["E1", "E2"], {"U1": [16, 4, 1]}, bar_px=100)
    widths = [int(w) for w in re.findall(r"width:(\d+)px", html)]
    # log2 scale over 1..16 (5 steps): 16 -> 100 px, 4 -> 60 px, 1 -> 20 px
    assert widths == [100, 60, 20]


def test_snapshot_bundle_has_text_not_an_object_repr():
    bundle = snapshot_bundle("<p>x</p>", "board")
    assert "IPython" not in bundle["text/plain"] and "saved view of the board" in bundle["text/plain"]


def test_3d_page_inlines_the_library_and_says_when_it_cannot_start():
    scene = Scene("D-glucose", "mol\n", (Mark("O1 ax", 0.0, 1.0, 2.0, "#c4622d"),))
    html = viewer_html([scene], "window.$3Dmol = {};", uid="x1")
    assert "window.$3Dmol = {};" in html and "<script src" not in html
    assert 'data-state="waiting"' in html and "could not start" in html and "needs the notebook" in html
    assert '"O1 ax"' in html and 'id="ss3d-x1-0"' in html
