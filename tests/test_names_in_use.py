"""Names chemists use: deoxy/amino names on trivial parents, alditols, anomers, glycosides, series.

Names follow IUPAC-IUBMB, Nomenclature of Carbohydrates (Recommendations 1996),
Pure Appl. Chem. 68, 1919 (2-Carb-6 anomers, -10 deoxy sugars, -11 amino
sugars, -19 alditols, -33 glycosides). Structures are checked against OPSIN
(py2opsin), which parses the names independently of this code.
"""

from __future__ import annotations

import json
import subprocess
import sys

import pytest

from workbench.chem import from_name, from_smiles, resolve, systematic_name, to_smiles
from workbench.chem.derivatives import compound_json
from workbench.chem.names import display_name
from workbench.chem.parse import read_compound
from workbench.errors import NameNotRecognisedError

# The names of the issue, each with the name OPSIN reads for the same compound.
IN_USE = {
    "6-deoxy-L-mannose": "6-deoxy-L-mannose",  # L-rhamnose (2-Carb-10)
    "6-deoxy-L-galactose": "6-deoxy-L-galactose",  # L-fucose (2-Carb-10)
    "6-deoxy-D-glucose": "6-deoxy-D-glucose",  # D-quinovose (2-Carb-10)
    "3-deoxy-D-glucose": "3-deoxy-D-glucose",  # 3-deoxy-D-ribo-hexose (2-Carb-10)
    "2-amino-2-deoxy-D-glucose": "2-amino-2-deoxy-D-glucose",  # D-glucosamine (2-Carb-11)
    "2-acetamido-2-deoxy-D-galactose": "2-acetamido-2-deoxy-D-galactose",  # GalNAc (2-Carb-11)
    "N-acetyl-D-glucosamine": "N-acetyl-D-glucosamine",
    "beta-D-glucose": "beta-D-glucose",  # an anomer, ring unstated (2-Carb-6)
    "D-fructofuranose": "D-fructofuranose",  # ring stated, anomer not (2-Carb-6)
    "2-deoxyribose": "2-deoxy-D-ribose",  # natural series by convention (DNA)
    "D-(+)-glucose": "D-glucose",  # the sign of rotation is not structure
    "abequose": "3,6-dideoxy-D-xylo-hexose",  # configuration part of the name (2-Carb-10 list)
    "tyvelose": "3,6-dideoxy-D-arabino-hexose",
    "L-colitose": "3,6-dideoxy-L-xylo-hexose",
    "digitoxose": "2,6-dideoxy-D-ribo-hexose",  # natural series by convention
}
ALDITOLS = {
    "D-glucitol": "D-glucitol",  # 2-Carb-19
    "sorbitol": "D-glucitol",  # synonym in use (Merck Index [from memory])
    "L-gulitol": "D-glucitol",  # the same compound (REFERENCE_VALUES.md: D-glucitol = L-gulitol)
    "galactitol": "galactitol",  # meso (REFERENCE_VALUES.md)
    "D-lyxitol": "D-arabinitol",  # D-arabinitol = D-lyxitol (REFERENCE_VALUES.md)
}
OPSIN_NAMES = sorted(set(IN_USE.values()) | set(ALDITOLS.values()) | {"methyl alpha-D-glucopyranoside"})


@pytest.mark.parametrize("name", sorted(IN_USE))
def test_names_in_use_resolve_to_the_structure_opsin_reads(opsin, name):
    # IUPAC-IUBMB 1996 (Pure Appl. Chem. 68, 1919) names; OPSIN as the outside parser.
    assert resolve(name) == from_smiles(opsin(IN_USE[name]))


@pytest.mark.parametrize("name", sorted(ALDITOLS))
def test_alditol_names_resolve_to_the_alditol(opsin, name):
    # 2-Carb-19: the alditol, named by the alphabetically first parent (D-glucitol, not L-gulitol)
    chain = resolve(name)
    assert to_smiles(chain) == opsin(ALDITOLS[name])
    assert display_name(chain) == ALDITOLS[name]


def test_alditol_systematic_names_round_trip():
    # 2-Carb-19: D-gluco-hexitol; galactitol is meso, so its name has no D/L
    assert systematic_name(resolve("D-glucitol")) == "D-gluco-hexitol"
    assert resolve("galacto-hexitol") == resolve("dulcitol") == resolve("galactitol")


def test_chiral_alditol_without_series_is_refused_with_both_series():
    with pytest.raises(NameNotRecognisedError) as err:
        from_name("glucitol")
    assert err.value.suggestions == ("D-glucitol", "L-glucitol")


def test_enantiomer_of_a_one_series_name_is_refused_with_its_own_name():
    # abequose is 3,6-dideoxy-D-xylo-hexose and colitose its L enantiomer (2-Carb-10 list [from memory])
    with pytest.raises(NameNotRecognisedError) as err:
        from_name("L-abequose")
    assert err.value.suggestions == ("colitose",)


def test_bare_name_without_conventional_series_still_needs_it():
    # both D- and L-fucose occur in nature: no series is assumed (common practice)
    with pytest.raises(NameNotRecognisedError) as err:
        from_name("fucose")
    assert err.value.suggestions == ("D-fucose", "L-fucose")


@pytest.mark.parametrize(
    ("misspelt", "keeps"),
    [
        ("6-deoxy-L-galactosee", "6-deoxy-"),
        ("6-deoxy-L-glucosse", "6-deoxy-"),
        ("2-amino-2-deoxy-D-glucos", "2-amino-"),
    ],
)
def test_suggestions_never_change_the_substituents(misspelt, keeps):
    # a suggestion may correct the parent's spelling or series, never the constitution
    with pytest.raises(NameNotRecognisedError) as err:
        from_name(misspelt)
    assert err.value.suggestions
    for suggestion in err.value.suggestions:
        assert suggestion.startswith(keeps)
        assert from_name(suggestion).groups == from_name(err.value.suggestions[0]).groups


def test_misspelt_trivial_name_suggests_the_same_constitution():
    with pytest.raises(NameNotRecognisedError) as err:
        from_name("D-glucos")
    groups = {from_name(s).groups for s in err.value.suggestions}
    assert groups == {from_name("D-glucose").groups}


def test_methyl_glycoside_is_not_resolved_as_the_free_sugar():
    # 2-Carb-33: a glycoside has no free carbonyl; as a relation member it must not stand for the sugar
    with pytest.raises(NameNotRecognisedError) as err:
        resolve("methyl alpha-D-glucopyranoside")
    assert "glycoside" in str(err.value)


def test_methyl_glucopyranoside_is_predicted_as_the_glycoside(opsin):
    # Glycosides are non-reducing, form no osazone and are not oxidised by bromine water
    # (common practice); methyl hexopyranoside: 2 IO4-, 1 HCOOH (REFERENCE_VALUES.md, Jackson and Hudson 1937)
    data = compound_json(read_compound("methyl alpha-D-glucopyranoside"))
    assert data["smiles"] == opsin("methyl alpha-D-glucopyranoside")
    p = data["predictions"]
    assert p["reducing_test"]["result"] == "negative"
    assert p["bromine_water"]["result"] == "unchanged"
    assert p["osazone"] is None and p["alditol"] is None and p["chain_shortening"] is None
    assert p["periodate"]["methyl_pyranoside"]["periodate"] == 2
    assert p["periodate"]["methyl_pyranoside"]["formic_acid"] == 1


def test_alditol_is_predicted_as_itself():
    # hexitol: 5 IO4-, 4 HCOOH, 2 HCHO (REFERENCE_VALUES.md, common practice); no carbonyl, non-reducing
    p = compound_json(read_compound("sorbitol"))["predictions"]
    assert p["reducing_test"]["result"] == "negative"
    assert p["osazone"] is None
    assert p["periodate"]["alditol"] == {"periodate": 5, "formic_acid": 4, "formaldehyde": 2, "co2": 0}


def test_predict_command_answers_for_the_glycoside():
    proc = subprocess.run(
        [sys.executable, "-m", "workbench.cli", "predict", "methyl alpha-D-glucopyranoside", "--json"],
        capture_output=True,
        text=True,
        check=False,
    )
    assert proc.returncode == 0, proc.stderr
    data = json.loads(proc.stdout)
    assert data["compound"] == "glycoside"
    assert data["predictions"]["reducing_test"]["result"] == "negative"  # common practice


def test_alditol_member_stands_for_itself_in_alditol_relations():
    # D-glucose and L-gulose share their alditol (REFERENCE_VALUES.md): a project may name it directly
    from workbench.evidence import project_from_dict, solve

    project = project_from_dict(
        {
            "format": "stereosieve-project",
            "version": 1,
            "title": "alditol member",
            "unknowns": [{"id": "U", "scope": {"carbons": [6], "carbonyl": ["aldose"]}}],
            "observations": [
                {
                    "id": "E1",
                    "kind": "same_product",
                    "reaction": "alditol",
                    "members": ["U", "D-glucitol"],
                    "relation": "identical",
                },
            ],
        }
    )
    survivors = sorted(display_name(c) for c in solve(project).survivors["U"])
    assert survivors == ["D-glucose", "L-gulose"]


@pytest.mark.parametrize(("carbons", "count"), [(4, 3), (5, 4), (6, 10), (7, 16)])
def test_alditol_names_count_the_distinct_alditols(carbons, count):
    # Kirk-Othmer, "Sugar Alcohols" (REFERENCE_VALUES.md): 3 tetritols, 4 pentitols, 10 hexitols,
    # 16 heptitols counting meso and active forms; each name must read back as the same compound
    from workbench.chem import catalogue
    from workbench.chem.catalogue import Scope

    alditols = {c.replace(1, "CH2OH") for c in catalogue(Scope(carbons=(carbons,), carbonyl=("aldose",)))}
    names = {display_name(c) for c in alditols}
    assert len(names) == count
    for chain in alditols:
        assert to_smiles(resolve(display_name(chain))) == to_smiles(chain)
