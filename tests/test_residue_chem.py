"""Glycan residues: structure, methylation analysis, periodate and Smith degradation.

Expected values come from REFERENCE_VALUES.md, "Glycan residues": the rules of
methylation analysis (Björndal, Hellerqvist, Lindberg and Svensson, Angew. Chem.
Int. Ed. Engl. 9, 610, 1970), of periodate uptake per residue and of the Smith
degradation (Goldstein, Hay, Lewis and Smith, Methods Carbohydr. Chem. 5, 361,
1965), recalled from memory as common practice; each check names its source.
"""

from __future__ import annotations

import pytest
from rdkit import Chem

from workbench.chem import Scope, catalogue, from_name
from workbench.chem.methylation import alditol_acetate
from workbench.chem.residue import (
    DEFAULT_RESIDUE_SCOPE,
    Residue,
    ResidueScope,
    free_positions,
    residue_catalogue,
    residue_mol,
)
from workbench.chem.residue_periodate import product_keys, residue_periodate, residue_smith
from workbench.chem.smiles import canonical, mirror_smiles
from workbench.errors import NameNotRecognisedError, ScopeError, StructureError

D_ALDOHEXOSES = catalogue(Scope(carbons=(6,), carbonyl=("aldose",), series=("D",)))
GLC = from_name("D-glucose")


def R(name: str, ring: str, anomer: str, *linked: int) -> Residue:
    return Residue(from_name(name), ring, anomer, tuple(linked))


# ------------------------------------------------------------------ structure and names
def test_terminal_residue_is_the_glucopyranoside():
    # alpha-D-glucopyranose OC[C@H]1O[C@H](O)[C@H](O)[C@@H](O)[C@@H]1O (DESIGN.md conventions, IUPAC
    # anomeric reference atom rule 2-Carb-6.2): the residue with its aglycone as H is that molecule
    mol = residue_mol(R("D-glucose", "pyranose", "alpha"))
    rw = Chem.RWMol(mol)
    for atom in rw.GetAtoms():
        if atom.GetAtomicNum() == 0:
            atom.SetAtomicNum(1)
    glycoside = Chem.RemoveHs(rw.GetMol())
    assert canonical(Chem.MolToSmiles(glycoside)) == canonical("OC[C@H]1O[C@H](O)[C@H](O)[C@@H](O)[C@@H]1O")


@pytest.mark.parametrize(
    ("residue", "name"),
    [
        # IUPAC condensed form (IUPAC-IUBMB 1996, 2-Carb-38; DESIGN.md Contract 5's example)
        (R("D-glucose", "pyranose", "alpha", 4), "->4)-alpha-D-Glcp-(1->"),
        (R("D-galactose", "pyranose", "beta"), "beta-D-Galp-(1->"),
        (R("L-rhamnose", "pyranose", "alpha", 2), "->2)-alpha-L-Rhap-(1->"),
        (R("L-arabinose", "furanose", "alpha", 5), "->5)-alpha-L-Araf-(1->"),
        (R("D-fructose", "furanose", "beta", 1), "->1)-beta-D-Fruf-(2->"),
        (R("D-galacturonic acid", "pyranose", "alpha", 4), "->4)-alpha-D-GalpA-(1->"),
        (R("D-glucose", "pyranose", "beta", 4, 6), "->4,6)-beta-D-Glcp-(1->"),
    ],
)
def test_condensed_name(residue, name):
    assert residue.name == name


def test_display_uses_arrows_and_greek_letters():
    # IUPAC condensed form written with arrows and Greek letters (2-Carb-38, from memory)
    assert R("D-glucose", "pyranose", "alpha", 4).display == "\u21924)-\u03b1-D-Glcp-(1\u2192"


def test_linked_positions_exclude_anomeric_and_ring_oxygen():
    # Contract 5: the oxygen positions other than the anomeric one; O-5 closes an aldopyranose [common practice]
    assert free_positions(GLC, "pyranose") == (2, 3, 4, 6)
    assert free_positions(GLC, "furanose") == (2, 3, 5, 6)
    # a 2-ketose: O-1 is an ordinary position; O-6 closes the pyranose, O-5 the furanose
    fru = from_name("D-fructose")
    assert free_positions(fru, "furanose") == (1, 3, 4, 6)
    assert free_positions(fru, "pyranose") == (1, 3, 4, 5)
    with pytest.raises(StructureError, match="O-5"):
        Residue(GLC, "pyranose", "alpha", (5,))
    with pytest.raises(StructureError):
        Residue(from_name("D-ribulose"), "pyranose", "alpha")


def test_catalogue_counts_linkage_subsets():
    # a hexopyranose has 4 free positions: 1 + 4 + 6 subsets of at most two (combinatorics)
    scope = ResidueScope(
        carbons=(6,),
        carbonyl=("aldose",),
        series=("D",),
        modifications=("none",),
        ring=("pyranose",),
        anomer=("alpha",),
    )
    assert len(residue_catalogue(scope)) == 8 * 11
    wide = ResidueScope.from_dict({"sugars": ["D-glucose"], "ring": ["pyranose"], "max_linked": 4})
    assert len(residue_catalogue(wide)) == 2 * 16  # two anomers, every subset of 4 positions


def test_default_scope_holds_pentoses_deoxyhexoses_uronic_acids_and_ketoses():
    names = {r.sugar for r in residue_catalogue(DEFAULT_RESIDUE_SCOPE)}
    assert {"L-arabinose", "D-xylose", "L-rhamnose", "L-fucose", "D-glucuronic acid", "D-fructose"} <= names


def test_scope_rejects_bad_keys_and_amino_sugars():
    with pytest.raises(ScopeError, match="ring"):
        ResidueScope.from_dict({"ring": ["septanose"]})
    with pytest.raises(ScopeError, match="max_linked"):
        ResidueScope.from_dict({"max_linked": -1})
    with pytest.raises(ScopeError, match="amino"):
        ResidueScope.from_dict({"sugars": ["D-glucosamine"]})
    with pytest.raises(ScopeError, match="sugars"):
        ResidueScope.from_dict({"sugars": ["D-glucoze"]})


# ------------------------------------------------------------------ methylation analysis
HEXOPYRANOSYL_LINKAGES = [(), (2,), (3,), (4,), (6,), (2, 3), (2, 4), (2, 6), (3, 4), (3, 6), (4, 6)]


@pytest.mark.parametrize("linked", HEXOPYRANOSYL_LINKAGES, ids=str)
@pytest.mark.parametrize("sugar", ["D-glucose", "D-galactose", "D-mannose"])
def test_alditol_acetate_of_each_hexopyranosyl_linkage(sugar, linked):
    # O-acetyl at C-1, C-5 and every linked position, O-methyl at the other free positions, D at C-1
    # (Björndal et al. 1970; REFERENCE_VALUES.md, common practice [memory])
    pmaa = alditol_acetate(R(sugar, "pyranose", "beta", *linked))
    assert pmaa.acetyl == tuple(sorted({1, 5, *linked}))
    assert pmaa.methyl == tuple(sorted({2, 3, 4, 6} - set(linked)))
    assert pmaa.deuterium == ((1, 1),)


def test_systematic_names_of_glucose_alditol_acetates():
    # names as in the methods literature (Björndal et al. 1970 [from memory]; the issue's own example)
    assert alditol_acetate(R("D-glucose", "pyranose", "alpha", 4)).name == (
        "1,4,5-tri-O-acetyl-2,3,6-tri-O-methyl-D-glucitol-1-d"
    )
    assert alditol_acetate(R("D-glucose", "pyranose", "beta")).name == (
        "1,5-di-O-acetyl-2,3,4,6-tetra-O-methyl-D-glucitol-1-d"
    )
    # branch point of a (1->4)/(1->6) glucan [from memory]
    assert alditol_acetate(R("D-glucose", "pyranose", "alpha", 4, 6)).name == (
        "1,4,5,6-tetra-O-acetyl-2,3-di-O-methyl-D-glucitol-1-d"
    )
    # 2-linked rhamnopyranose: 6-deoxy-L-mannitol derivative [from memory]
    assert alditol_acetate(R("L-rhamnose", "pyranose", "alpha", 2)).name == (
        "1,2,5-tri-O-acetyl-6-deoxy-3,4-di-O-methyl-L-mannitol-1-d"
    )


def test_ketose_gives_two_epimeric_alditol_acetates():
    # a 2-ketose gives two C-2 epimeric alditols: D-fructose -> D-glucitol + D-mannitol
    # (REFERENCE_VALUES.md: reduction of D-fructose; methylation rules, common practice)
    pmaa = alditol_acetate(R("D-fructose", "furanose", "beta", 1))
    assert len(pmaa.smiles) == 2
    assert pmaa.acetyl == (1, 2, 5) and pmaa.methyl == (3, 4, 6) and pmaa.deuterium == ((2, 1),)
    assert any("D-glucitol-2-d" in n for n in pmaa.names) and any("D-mannitol-2-d" in n for n in pmaa.names)


@pytest.mark.parametrize(
    ("pyranose", "furanose"),
    [
        # a 4-linked pyranose and a 5-linked furanose give the same product, also for pentoses:
        # 4-Arap = 5-Araf, 3,4-Arap = 3,5-Araf (REFERENCE_VALUES.md, common practice [memory])
        (R("D-glucose", "pyranose", "alpha", 4), R("D-glucose", "furanose", "alpha", 5)),
        (R("L-arabinose", "pyranose", "alpha", 4), R("L-arabinose", "furanose", "alpha", 5)),
        (R("L-arabinose", "pyranose", "alpha", 3, 4), R("L-arabinose", "furanose", "alpha", 3, 5)),
    ],
)
def test_pyranose_furanose_ambiguity(pyranose, furanose):
    a, b = alditol_acetate(pyranose), alditol_acetate(furanose)
    assert (a.methyl, a.acetyl, a.smiles) == (b.methyl, b.acetyl, b.smiles)


def test_deuterium_tells_the_ends_apart():
    # without deuterium 2- and 4-linked Xylp give enantiomeric products; (2->1)- and (2->6)-linked Fruf
    # the same mannitol derivative (REFERENCE_VALUES.md, common practice [memory])
    two, four = R("D-xylose", "pyranose", "beta", 2), R("D-xylose", "pyranose", "beta", 4)
    (h2,), (h4,) = alditol_acetate(two, "NaBH4").smiles, alditol_acetate(four, "NaBH4").smiles
    assert h2 != h4 and mirror_smiles(h2) == canonical(h4)
    (d2,), (d4,) = alditol_acetate(two).smiles, alditol_acetate(four).smiles
    assert mirror_smiles(d2) != canonical(d4)
    one, six = R("D-fructose", "furanose", "beta", 1), R("D-fructose", "furanose", "beta", 6)
    assert set(alditol_acetate(one, "NaBH4").smiles) & set(alditol_acetate(six, "NaBH4").smiles)
    assert not set(alditol_acetate(one).smiles) & set(alditol_acetate(six).smiles)


def test_uronic_acid_is_carboxyl_reduced_with_deuterium():
    # carboxyl reduction with NaBD4 before methylation gives C-6 as CD2 (Taylor and Conrad,
    # Biochemistry 11, 1383, 1972 [from memory])
    pmaa = alditol_acetate(R("D-glucuronic acid", "pyranose", "beta", 4))
    assert dict(pmaa.deuterium) == {1: 1, 6: 2}
    assert pmaa.acetyl == (1, 4, 5) and pmaa.methyl == (2, 3, 6)
    assert pmaa.name.endswith("D-glucitol-1,6,6-d3")


# ------------------------------------------------------------------ periodate per residue
PERIODATE = {
    # mol IO4- / mol HCOOH per hexopyranosyl residue, no HCHO (REFERENCE_VALUES.md; Goldstein et al.
    # 1965; common practice [memory])
    (): (2, 1),
    (2,): (1, 0),
    (3,): (0, 0),
    (4,): (1, 0),
    (6,): (2, 1),
    (2, 6): (1, 0),
    (4, 6): (1, 0),
    (3, 6): (0, 0),
    (2, 4): (0, 0),
    (2, 3): (0, 0),
    (3, 4): (0, 0),
}


@pytest.mark.parametrize("linked", list(PERIODATE), ids=str)
@pytest.mark.parametrize("sugar", D_ALDOHEXOSES, ids=str)
def test_periodate_of_every_hexopyranosyl_linkage(sugar, linked):
    for anomer in ("alpha", "beta"):
        result = residue_periodate(Residue(sugar, "pyranose", anomer, linked))
        assert (result.periodate, result.formic_acid) == PERIODATE[linked]
        assert result.formaldehyde == 0


def test_periodate_of_pentosyl_and_furanosyl_residues():
    # terminal pentopyranosyl 2/1; terminal Araf 1/0; terminal Glcf 2 IO4-, 0 HCOOH, 1 HCHO
    # (REFERENCE_VALUES.md, common practice [memory])
    assert residue_periodate(R("D-xylose", "pyranose", "beta")).as_tuple() == (2, 1, 0)
    assert residue_periodate(R("L-arabinose", "furanose", "alpha")).as_tuple() == (1, 0, 0)
    assert residue_periodate(R("D-glucose", "furanose", "beta")).as_tuple() == (2, 0, 1)


# ------------------------------------------------------------------ Smith degradation
@pytest.mark.parametrize(
    ("sugar", "linked", "product"),
    [
        # hexopyranosyl terminal, 2-, 6- and 2,6-linked -> glycerol; 4- and 4,6-linked -> erythritol
        # (gluco, manno) or D-threitol (galacto); 3-linked -> the intact sugar (Goldstein, Hay, Lewis
        # and Smith 1965; REFERENCE_VALUES.md [memory])
        ("D-glucose", (), "glycerol"),
        ("D-glucose", (2,), "glycerol"),
        ("D-glucose", (6,), "glycerol"),
        ("D-mannose", (2, 6), "glycerol"),
        ("D-glucose", (4,), "erythritol"),
        ("D-mannose", (4,), "erythritol"),
        ("D-glucose", (4, 6), "erythritol"),
        ("D-galactose", (4,), "D-threitol"),
        ("D-galactose", (4, 6), "D-threitol"),
        ("D-glucose", (3,), "D-glucose"),
        ("D-galactose", (3,), "D-galactose"),
    ],
)
def test_smith_fragment_of_hexopyranosyl_residues(sugar, linked, product):
    for anomer in ("alpha", "beta"):
        fragment = residue_smith(R(sugar, "pyranose", anomer, *linked))
        assert fragment.word == product
        assert fragment.matches(product_keys(product))


def test_smith_fragment_of_pentosyl_and_fructosyl_residues():
    # terminal pentopyranosyl -> ethylene glycol; terminal and 5-linked Araf -> glycerol; (2->1)- and
    # (2->6)-linked Fruf -> glycerol (REFERENCE_VALUES.md, Smith fragments [memory])
    assert residue_smith(R("D-xylose", "pyranose", "beta")).word == "ethylene glycol"
    assert residue_smith(R("L-arabinose", "furanose", "alpha")).word == "glycerol"
    assert residue_smith(R("L-arabinose", "furanose", "alpha", 5)).word == "glycerol"
    assert residue_smith(R("D-fructose", "furanose", "beta", 1)).word == "glycerol"
    assert residue_smith(R("D-fructose", "furanose", "beta", 6)).word == "glycerol"


def test_threitol_without_series_matches_either_enantiomer():
    fragment = residue_smith(R("D-galactose", "pyranose", "beta", 4))
    assert fragment.matches(product_keys("threitol"))
    assert not fragment.matches(product_keys("L-threitol"))
    with pytest.raises(NameNotRecognisedError):
        product_keys("threitolx")


@pytest.mark.parametrize("linked", HEXOPYRANOSYL_LINKAGES[:5], ids=str)
def test_both_anomers_give_one_alditol_acetate(linked):
    # hydrolysis destroys the anomeric centre (definition): computed on the beta structure directly
    from workbench.chem.methylation import _alditol_acetate

    alpha = alditol_acetate(R("D-galactose", "pyranose", "alpha", *linked))
    beta = _alditol_acetate(R("D-galactose", "pyranose", "beta", *linked), "NaBD4")
    assert (alpha.methyl, alpha.acetyl, alpha.smiles) == (beta.methyl, beta.acetyl, beta.smiles)


def test_n_acetylglucosamine_residues():
    # permethylation N-methylates the acetamido group: 2-deoxy-2-(N-methylacetamido) alditol acetates
    # (Björndal et al. 1970 style names [from memory]); terminal GlcpNAc consumes 1 IO4- (C-3/C-4) and gives
    # no formic acid, a 4-linked GlcpNAc (chitin) resists periodate [common practice, from memory]
    glcnac = "N-acetyl-D-glucosamine"
    terminal = R(glcnac, "pyranose", "beta")
    assert alditol_acetate(terminal).name == (
        "1,5-di-O-acetyl-2-deoxy-3,4,6-tri-O-methyl-2-(N-methylacetamido)-D-glucitol-1-d"
    )
    assert residue_periodate(terminal).as_tuple() == (1, 0, 0)
    four = R(glcnac, "pyranose", "beta", 4)
    assert alditol_acetate(four).acetyl == (1, 4, 5) and alditol_acetate(four).methyl == (3, 6)
    assert residue_periodate(four).as_tuple() == (0, 0, 0)
    assert four.name == "->4)-beta-D-GlcpNAc-(1->"  # ring letter after the parent symbol, before NAc (2-Carb-38)
