"""The Fischer projection renderer, tested as strings (parsed as SVG/XML)."""

from __future__ import annotations

import re
import xml.etree.ElementTree as ET

import pytest

from workbench.chem import Chain, resolve
from workbench.display.fischer import FischerStyle, chain_svg, disputed_centres, fischer_rows, fischer_svg

SVG = "{http://www.w3.org/2000/svg}"


def _axis(root: ET.Element) -> float:
    """x of the vertical backbone (first M command of the backbone path)."""
    path = next(p for p in root.iter(f"{SVG}path") if p.get("class") == "ss-backbone")
    return float(re.match(r"M([\d.]+)", path.get("d")).group(1))


def _carbon(root: ET.Element, k: int) -> ET.Element:
    return next(g for g in root.iter(f"{SVG}g") if g.get("data-carbon") == str(k))


def _texts(group: ET.Element) -> list[tuple[str, float, str]]:
    """(text, x, class) of every text element of a carbon's group."""
    out = []
    for t in group.iter(f"{SVG}text"):
        out.append(("".join(t.itertext()), float(t.get("x")), t.get("class")))
    return out


def _side_of(root: ET.Element, k: int, label: str) -> str:
    axis = _axis(root)
    for text, x, cls in _texts(_carbon(root, k)):
        if text == label and cls in ("ss-left", "ss-right"):
            return "right" if x > axis else "left"
    raise AssertionError(f"no {label} at C-{k}")


def test_d_glucose_has_hydroxyls_right_at_c2_c4_c5_and_left_at_c3():
    # Fischer projection of D-glucose: OH right at C-2, C-4, C-5, left at C-3
    # (IUPAC-IUBMB 1996, 2-Carb-4 and 2-Carb-8.2, D-gluco configuration).
    root = ET.fromstring(fischer_svg(resolve("D-glucose")))
    assert [_side_of(root, k, "OH") for k in (2, 3, 4, 5)] == ["right", "left", "right", "right"]
    assert [_side_of(root, k, "H") for k in (2, 3, 4, 5)] == ["left", "right", "left", "left"]
    assert [_carbon(root, k).get("data-side") for k in (2, 3, 4, 5)] == ["right", "left", "right", "right"]


def test_d_glucose_chain_ends_are_written_as_cho_and_ch2oh():
    # C-1 at the top as CHO, C-6 at the bottom as CH2OH (IUPAC-IUBMB 1996, 2-Carb-2.1.1).
    root = ET.fromstring(fischer_svg(resolve("D-glucose")))
    top = [t for t, _, cls in _texts(_carbon(root, 1)) if cls == "ss-centre"]
    bottom = [t for t, _, cls in _texts(_carbon(root, 6)) if cls == "ss-centre"]
    assert top == ["CHO"] and bottom == ["CH2OH"]
    ys = [float(next(_carbon(root, k).iter(f"{SVG}text")).get("y")) for k in range(1, 7)]
    assert ys == sorted(ys)  # C-1 at the top, carbons downwards


def test_fischer_rows_of_d_glucose_as_plain_data():
    # Same fact as above, from the layout rows (IUPAC-IUBMB 1996, 2-Carb-8.2).
    rows = fischer_rows(resolve("D-glucose"))
    assert [r.side for r in rows] == [None, "right", "left", "right", "right", None]
    assert rows[1].right == "OH" and rows[1].left == "H"


def test_d_fructose_shows_the_ketone_at_c2_and_oh_left_at_c3():
    # D-fructose = D-arabino-hex-2-ulose: C=O at C-2, OH left at C-3, right at C-4 and C-5
    # (IUPAC-IUBMB 1996, 2-Carb-8.2 / REFERENCE_VALUES [memory]).
    chain = resolve("D-fructose")
    rows = fischer_rows(chain)
    assert rows[1].centre == "C" and rows[1].right == "O" and rows[1].double
    root = ET.fromstring(fischer_svg(chain))
    assert [_side_of(root, k, "OH") for k in (3, 4, 5)] == ["left", "right", "right"]
    assert [t for t, _, c in _texts(_carbon(root, 1)) if c == "ss-centre"] == ["CH2OH"]


def test_l_rhamnose_ends_in_ch3_with_the_l_manno_pattern():
    # L-rhamnose = 6-deoxy-L-mannose: OH right at C-2, C-3, left at C-4, C-5; CH3 at C-6
    # (IUPAC-IUBMB 1996, 2-Carb-10 [common practice]).
    root = ET.fromstring(fischer_svg(resolve("L-rhamnose")))
    assert [_side_of(root, k, "OH") for k in (2, 3, 4, 5)] == ["right", "right", "left", "left"]
    assert [t for t, _, c in _texts(_carbon(root, 6)) if c == "ss-centre"] == ["CH3"]


def test_d_glucosamine_carries_nh2_on_the_right_at_c2():
    # 2-amino-2-deoxy-D-glucose: NH2 where D-glucose has its C-2 OH, on the right (IUPAC-IUBMB 1996, 2-Carb-11).
    root = ET.fromstring(fischer_svg(resolve("D-glucosamine")))
    assert _side_of(root, 2, "NH2") == "right"
    assert _side_of(root, 3, "OH") == "left"


def test_uronic_acid_ends_in_cooh_and_methyl_ether_in_och3():
    # D-glucuronic acid: C-6 is COOH (IUPAC-IUBMB 1996, 2-Carb-20).
    root = ET.fromstring(fischer_svg(resolve("D-glucuronic acid")))
    assert [t for t, _, c in _texts(_carbon(root, 6)) if c == "ss-centre"] == ["COOH"]
    methyl = Chain.from_pattern("CHO-CHOH(r)-CHOMe(l)-CHOH(r)-CHOH(r)-CH2OH")
    root = ET.fromstring(fischer_svg(methyl))
    assert _side_of(root, 3, "OCH3") == "left"


def test_mirror_image_swaps_every_side():
    d = fischer_rows(resolve("D-glucose"))
    l_ = fischer_rows(resolve("D-glucose").mirror())
    flipped = {"right": "left", "left": "right", None: None}
    assert [flipped[r.side] for r in d] == [r.side for r in l_]


def test_open_centres_are_ringed_and_marked():
    svg = fischer_svg(resolve("D-glucose"), open_centres={2})
    root = ET.fromstring(svg)
    assert _carbon(root, 2).get("data-open") == "true"
    assert _carbon(root, 3).get("data-open") is None
    assert len(list(_carbon(root, 2).iter(f"{SVG}circle"))) == 1


def test_disputed_centres_of_glucose_and_mannose_is_c2():
    # D-glucose and D-mannose are C-2 epimers (textbook fact, e.g. Carey, Organic Chemistry, ch. 25 [memory]).
    assert disputed_centres([resolve("D-glucose"), resolve("D-mannose")]) == {2}
    assert disputed_centres([resolve("D-glucose")]) == frozenset()


def test_caption_is_escaped_and_the_document_is_valid_xml():
    svg = fischer_svg(resolve("D-xylose"), caption="A <b> & 'c'")
    root = ET.fromstring(svg)
    caption = next(t for t in root.iter(f"{SVG}text") if t.get("class") == "ss-caption")
    assert caption.text == "A <b> & 'c'"
    assert root.get("role") == "img" and "CHO-CHOH(r)-CHOH(l)" in root.findtext(f"{SVG}title")


def test_style_changes_the_geometry_only():
    wide = fischer_svg(resolve("D-ribose"), style=FischerStyle(row=40.0, numbers=False))
    root = ET.fromstring(wide)
    assert not [t for t in root.iter(f"{SVG}text") if t.get("class") == "ss-number"]
    assert _side_of(root, 2, "OH") == "right"  # D-ribose: all OH right (IUPAC-IUBMB 1996, 2-Carb-8.2)


@pytest.mark.parametrize("name", ["D-glyceraldehyde", "D-sedoheptulose", "D-glycero-D-gluco-heptose", "L-fucose"])
def test_every_kind_of_chain_draws(name):
    root = ET.fromstring(chain_svg(resolve(name)))
    assert len(list(g for g in root.iter(f"{SVG}g") if g.get("data-carbon"))) == resolve(name).carbons


def test_chain_shows_itself_as_a_named_fischer_projection():
    svg = resolve("D-galactose")._repr_svg_()
    assert svg.startswith("<svg") and "D-galactose" in svg
    product = resolve("D-glucose").replace(1, "COOH").replace(6, "COOH")  # an aldaric acid
    assert "C6H10O8" in product._repr_svg_()
