"""The 3D chair panel, tested on its state: chosen survivors, ring form, chair, marks and static copy."""

from __future__ import annotations

import pytest

from workbench.chem import resolve
from workbench.ui.chairs import ChairPanel, chair_views, view_3d
from workbench.ui.session import Session


@pytest.fixture()
def two_left(demo_file):
    session = Session.open(demo_file)
    session.set_enabled("E6", False)  # D-allose and D-galactose
    return session


def test_beta_d_glucopyranose_4c1_has_every_heavy_group_equatorial():
    # beta-D-glucopyranose in 4C1: all substituents equatorial (Angyal 1969; textbook fact [memory]).
    views, notes = chair_views([resolve("D-glucose")], "beta_pyranose", "A")
    (v,) = views
    assert notes == [] and v.axial == ()
    assert sorted(lab for lab, _ in v.equatorial) == ["C6", "O1", "O2", "O3", "O4"]
    assert v.shape == "4C1"


def test_alpha_d_mannopyranose_4c1_has_axial_o1_and_o2():
    # alpha-D-mannopyranose 4C1: O-1 and O-2 axial (textbook fact [memory]; Angyal 1969).
    views, _ = chair_views([resolve("D-mannose")], "alpha_pyranose", "A")
    assert sorted(lab for lab, _ in views[0].axial) == ["O1", "O2"]


def test_the_other_chair_puts_the_groups_axial():
    views, _ = chair_views([resolve("D-glucose")], "beta_pyranose", "B")
    assert views[0].shape == "1C4" and len(views[0].axial) == 5


def test_forms_a_sugar_cannot_adopt_are_noted_not_drawn():
    views, notes = chair_views([resolve("D-erythrose"), resolve("D-glucose")], "alpha_pyranose", None)
    assert [v.name for v in views] == ["D-glucose"]
    assert notes == ["D-erythrose has no α-pyranose form"]


def test_the_3d_viewer_has_one_cell_per_survivor_with_marks():
    views, _ = chair_views([resolve("D-glucose"), resolve("D-mannose")], "alpha_pyranose", "A")
    html = view_3d(views, uid="t1")
    assert html.count('class="ss-3d-cell"') == 2 and '"O1 ax"' in html and '"C6 eq"' in html
    assert "window.$3Dmol" in html and "<script src" not in html and "cdn" not in html.lower()  # inlined, not fetched


def test_panel_defaults_to_the_first_survivors_and_shows_them(two_left):
    panel = ChairPanel(two_left)
    assert panel.unknown.value == "S1"
    assert panel.survivors.value == ("D-allose", "D-galactose")
    panel.form.value = "alpha_pyranose"
    panel.chair.value = "A"
    panel.show_button.click()
    assert [v.name for v in panel.views] == ["D-allose", "D-galactose"]
    html = panel.facts.value
    assert html.count('class="ss-chair"') == 2  # flat chairs drawn for the static copy
    assert "axial: O1" in html  # alpha anomers in 4C1: O-1 axial
    assert "Preferred chair" in html and "H1-H2" in html
    saved = panel.snapshot_html()  # the notebook's saved view: words and tables, no SVG for sanitisers to strip
    assert "<svg" not in saved and "axial: O1" in saved and "Preferred chair" in saved


def test_panel_follows_the_evidence(two_left):
    panel = ChairPanel(two_left)
    two_left.set_enabled("E6", True)
    assert list(panel.survivors.options) == ["D-galactose"] and panel.survivors.value == ("D-galactose",)


def test_panel_without_selection_says_what_to_do(two_left):
    panel = ChairPanel(two_left)
    panel.survivors.value = ()
    panel.show_button.click()
    assert "Choose one or more survivors" in panel.notices.text


def test_panel_furanose_has_no_chair_but_a_shape(two_left):
    panel = ChairPanel(two_left)
    panel.form.value = "beta_furanose"
    panel.show_button.click()
    assert all(v.chair is None for v in panel.views)
    assert 'class="ss-chair"' not in panel.facts.value and "Furanose couplings" in panel.facts.value


def test_panels_draw_without_the_library_and_share_one_loader_that_carries_it(two_left):
    from workbench.ui.chairs import viewer_loader

    first, second = ChairPanel(two_left), ChairPanel(two_left)
    loader = viewer_loader()
    assert loader in first.widget.children and loader in second.widget.children  # one widget, shown by both
    first.show_button.click()
    second.show_button.click()
    assert "var exports, module, define;" not in first.viewer  # the view waits for the page's copy
    assert "setTimeout(draw, 100)" in first.viewer and first.viewer.count('class="ss-3d-cell"') == 2
    texts = [o["data"]["text/html"] for o in loader.outputs]
    assert len(texts) == 1 and texts[0].count("var exports, module, define;") == 1  # the library, once
