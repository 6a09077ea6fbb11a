"""``stereosieve export``: survivors as SDF (read back with RDKit) and CSV, checked against names resolved elsewhere.

Independent name resolution: OPSIN (through py2opsin) turns each exported name into a structure with no
help from stereosieve; a published InChIKey anchors D-glucose even where Java is missing.
"""

from __future__ import annotations

import csv
import io
import math
import shutil
from pathlib import Path

import projects
import pytest
from rdkit import Chem

from workbench.cli import main
from workbench.evidence import load_project, project_from_dict, solve
from workbench.export import CSV_COLUMNS, SDF_PROPERTIES, csv_text, sdf_text, survivor_rows

DATA = Path(__file__).parent / "data"
SAMPLES = Path(__file__).resolve().parent.parent / "sample_projects"

# Standard InChIKey of aldehydo-D-glucose, PubChem [from memory; also in tests/test_smiles.py]
ALDEHYDO_D_GLUCOSE = "GZCGUPFRVQAUEE-SLPGGIOYSA-N"


def _read_sdf(text: str) -> list[Chem.Mol]:
    supplier = Chem.SDMolSupplier()
    supplier.SetData(text)
    mols = list(supplier)
    assert all(m is not None for m in mols)
    return mols


def _opsin_inchikeys(*names: str) -> list[str]:
    """InChIKeys of the structures OPSIN gives for ``names`` (open chain for an aldehydo- name), one Java run."""
    py2opsin = pytest.importorskip("py2opsin")
    if shutil.which("java") is None:
        pytest.skip("OPSIN needs Java")
    smiles = py2opsin.py2opsin(list(names))
    assert all(smiles), f"OPSIN does not parse one of {names}: {smiles}"
    return [Chem.MolToInchiKey(Chem.MolFromSmiles(s)) for s in smiles]


@pytest.fixture(scope="module")
def fischer():
    # Fischer's proof (Carey, Organic Chemistry, ch. 25 [from memory]): G D-glucose, M D-mannose,
    # A D-arabinose, X L-gulose (the other aldohexose giving glucaric acid).
    return solve(load_project(DATA / "fischer_glucose.json"))


def test_sdf_reads_back_with_every_property(fischer):
    mols = _read_sdf(sdf_text(survivor_rows(fischer)))
    assert [m.GetProp("unknown") for m in mols] == ["G", "M", "A", "X"]
    for mol in mols:
        for key in SDF_PROPERTIES:
            assert mol.HasProp(key), key
        assert mol.GetProp("_Name") == mol.GetProp("name")
        # the structure written is the one the identifiers name
        assert Chem.MolToInchiKey(mol) == mol.GetProp("inchikey")
        assert Chem.MolToInchi(mol) == mol.GetProp("inchi")
        assert math.isclose(float(mol.GetProp("probability")), 1.0)
    assert Chem.MolToInchiKey(mols[0]) == ALDEHYDO_D_GLUCOSE


def test_sdf_structures_match_opsin_for_their_names(fischer):
    mols = _read_sdf(sdf_text(survivor_rows(fischer)))
    expected = {"G": "D-glucose", "M": "D-mannose", "A": "D-arabinose", "X": "L-gulose"}  # Carey ch. 25 [memory]
    assert [m.GetProp("name") for m in mols] == [expected[m.GetProp("unknown")] for m in mols]
    opsin = _opsin_inchikeys(*(f"aldehydo-{m.GetProp('name')}" for m in mols))
    assert [Chem.MolToInchiKey(m) for m in mols] == opsin


def test_deoxyhexose_sample_exports_l_fucose_as_opsin_draws_it(tmp_path, capsys):
    out = tmp_path / "survivors.sdf"
    assert main(["export", str(SAMPLES / "red_seaweed_deoxyhexose.json"), "--format", "sdf", "-o", str(out)]) == 0
    (mol,) = _read_sdf(out.read_text(encoding="utf-8"))
    assert mol.GetProp("name") == "L-fucose" and mol.GetProp("systematic_name") == "6-deoxy-L-galacto-hexose"
    # L-fucose is 6-deoxy-L-galactose (IUPAC-IUBMB 2-Carb-8; common practice)
    assert [Chem.MolToInchiKey(mol)] == _opsin_inchikeys("aldehydo-6-deoxy-L-galactose")


def test_csv_has_the_contract_columns_and_uniform_shares_without_weights():
    project = projects.project(
        [{"id": "U", "scope": {"carbons": [6], "carbonyl": ["aldose"], "series": ["D"]}}],
        [{"id": "E1", "kind": "aldaric_acid", "unknown": "U", "optically_active": False}],
    )
    rows = list(csv.DictReader(io.StringIO(csv_text(survivor_rows(solve(project))))))
    # meso aldaric acids among the D-aldohexoses: allaric and galactaric (mucic) acid (Carey ch. 25 [memory])
    assert sorted(r["name"] for r in rows) == ["D-allose", "D-galactose"]
    assert tuple(rows[0]) == CSV_COLUMNS
    # no quantitative evidence weighs them: each holds an equal share
    assert [float(r["probability"]) for r in rows] == [0.5, 0.5]
    for row in rows:
        assert Chem.MolToInchiKey(Chem.MolFromSmiles(row["smiles"])) == row["inchikey"]


def test_export_command_csv_to_stdout_and_file(tmp_path, capsys):
    project = SAMPLES / "gum_exudate_four_sugars.json"
    assert main(["export", str(project), "--format", "csv"]) == 0
    printed = list(csv.DictReader(io.StringIO(capsys.readouterr().out)))
    assert {r["unknown"] for r in printed} == {"A", "B", "C", "D"}
    target = tmp_path / "s.csv"
    assert main(["export", str(project), "--format", "csv", "-o", str(target)]) == 0
    assert list(csv.DictReader(io.StringIO(target.read_text(encoding="utf-8")))) == printed


def test_export_command_refuses_bad_outputs_and_contradictions(tmp_path, capsys):
    project = tmp_path / "p.json"
    shutil.copyfile(SAMPLES / "red_seaweed_deoxyhexose.json", project)
    before = project.read_text(encoding="utf-8")
    assert main(["export", str(project), "--format", "sdf", "-o", str(project)]) == 2
    assert "is the input file" in capsys.readouterr().err and project.read_text(encoding="utf-8") == before
    assert main(["export", str(project), "--format", "sdf", "-o", str(tmp_path)]) == 2
    assert main(["export", str(project), "--format", "pdb"]) == 2
    assert main(["export", str(SAMPLES / "contradictory_hexose_records.json"), "--format", "csv"]) == 3
    assert "contradictory" in capsys.readouterr().err


def test_csv_cells_that_look_like_formulas_stay_text():
    project = projects.project([{"id": "=1+1", "scope": {"carbons": [3], "carbonyl": ["aldose"], "series": ["D"]}}], [])
    (row,) = csv.DictReader(io.StringIO(csv_text(survivor_rows(solve(project)))))
    # the one D-aldotriose is D-glyceraldehyde (common practice); the id is kept as text, not a formula
    assert row["unknown"] == "'=1+1" and row["name"] == "D-glyceraldehyde"


def test_residue_survivors_carry_their_condensed_name_and_the_released_sugar():
    project = project_from_dict(projects.FOUR_LINKED_GLUCOSE)
    rows = survivor_rows(solve(project))
    # 1,4,5-tri-O-acetyl-2,3,6-tri-O-methyl-glucitol: a 4-linked glucopyranose or a 5-linked glucofuranose
    # (methylation analysis, Bjoerndal et al. 1970 [memory]; REFERENCE_VALUES.md "Glycan residues")
    table = list(csv.DictReader(io.StringIO(csv_text(rows))))
    assert sorted(r["name"] for r in table) == ["->4)-alpha-D-Glcp-(1->", "->5)-alpha-D-Glcf-(1->"]
    assert {r["inchikey"] for r in table} == {ALDEHYDO_D_GLUCOSE}  # the sugar released on hydrolysis
    mols = _read_sdf(sdf_text(rows))
    assert {m.GetProp("ring") for m in mols} == {"pyranose", "furanose"}
    assert {m.GetProp("linked_positions") for m in mols} == {"4", "5"}
    # each structure is the residue: C6 with two attachment points (dummy atoms)
    for mol in mols:
        atoms = [a.GetAtomicNum() for a in mol.GetAtoms()]
        assert atoms.count(6) == 6 and atoms.count(0) == 2
