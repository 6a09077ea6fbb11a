"""The survivors of every unknown for other chemistry software: SDF (written by RDKit) and CSV.

Pure: :func:`survivor_rows` takes a solution, :func:`sdf_text` and
:func:`csv_text` return ``str``; the CLI writes the file. Each survivor is the
open-chain structure (as ``solve --json`` gives it) with its probability
(:func:`workbench.evidence.rivals.survivor_probabilities`: the posterior where
the solution carries one, else a uniform share over the survivors).
"""

from __future__ import annotations

import csv
import io
from dataclasses import dataclass
from typing import Any

from rdkit import Chem
from rdkit.Chem import rdDepictor

from workbench.chem.chain import Chain
from workbench.chem.names import display_name, systematic_name
from workbench.chem.smiles import quiet_rdkit, to_inchi, to_inchikey, to_mol, to_smiles
from workbench.evidence.rivals import survivor_probabilities

__all__ = [
    "CSV_COLUMNS",
    "FORMATS",
    "SDF_PROPERTIES",
    "ExportRow",
    "survivor_rows",
    "sdf_text",
    "csv_text",
    "export_text",
]

CSV_COLUMNS = ("unknown", "name", "systematic_name", "smiles", "inchikey", "probability")
SDF_PROPERTIES = ("unknown", "name", "systematic_name", "smiles", "inchi", "inchikey", "probability")
FORMATS = ("sdf", "csv")


@dataclass(frozen=True)
class ExportRow:
    """One survivor of one unknown, with its names, identifiers and probability (0-1).

    ``candidate`` is a :class:`Chain`, or a glycan residue (Contract 5): then
    ``name`` is its condensed name, ``smiles`` the residue with ``*`` at each
    attachment, and ``systematic_name``, ``inchi`` and ``inchikey`` are those
    of the sugar it releases on hydrolysis (a fragment with open attachment
    points has no InChI), as ``solve --json`` gives them.
    """

    unknown: str
    candidate: Any
    probability: float

    @property
    def is_residue(self) -> bool:
        """True for a glycan residue."""
        return not isinstance(self.candidate, Chain)

    @property
    def sugar(self) -> Chain:
        """The free sugar: the candidate itself, or the sugar a residue releases."""
        return self.candidate.chain if self.is_residue else self.candidate

    @property
    def name(self) -> str:
        """The trivial name where there is one, else the systematic name; a residue's condensed name."""
        return str(self.candidate.name) if self.is_residue else display_name(self.candidate)

    @property
    def systematic_name(self) -> str:
        """The IUPAC configurational-prefix name (of the released sugar for a residue)."""
        return systematic_name(self.sugar)

    @property
    def smiles(self) -> str:
        """Open-chain isomeric SMILES; for a residue its SMILES with ``*`` attachment points."""
        return str(self.candidate.smiles) if self.is_residue else to_smiles(self.candidate)

    @property
    def inchi(self) -> str:
        """Standard InChI of the open chain (of the released sugar for a residue)."""
        return to_inchi(self.sugar)

    @property
    def inchikey(self) -> str:
        """Standard InChIKey of the open chain (of the released sugar for a residue)."""
        return to_inchikey(self.sugar)

    def mol(self) -> Chem.Mol:
        """The structure written to the SD file (a residue with dummy atoms at its attachments)."""
        if self.is_residue:
            return Chem.MolFromSmiles(self.smiles)
        return Chem.Mol(to_mol(self.candidate))

    def residue_fields(self) -> dict[str, str]:
        """``sugar``, ``ring``, ``anomer``, ``linked_positions`` of a residue (empty for a sugar)."""
        if not self.is_residue:
            return {}
        c = self.candidate
        return {
            "sugar": display_name(c.chain),
            "ring": c.ring,
            "anomer": c.anomer,
            "linked_positions": ",".join(map(str, c.linked)),
        }

    def value(self, key: str) -> str:
        """The text of one column or property; probabilities with 6 decimals."""
        if key == "probability":
            return f"{self.probability:.6f}"
        return str(getattr(self, key))


def survivor_rows(solution) -> tuple[ExportRow, ...]:
    """Every survivor of every unknown, unknowns in file order, most probable first within each."""
    rows: list[ExportRow] = []
    for uid in solution.project.unknown_ids:
        shares = survivor_probabilities(solution, uid)
        for chain in sorted(solution.survivors[uid], key=lambda c: -shares[c]):
            rows.append(ExportRow(uid, chain, shares[chain]))
    return tuple(rows)


def sdf_text(rows: tuple[ExportRow, ...]) -> str:
    """An SD file (V2000 with 2D coordinates, written by RDKit); the title line is the name."""
    buffer = io.StringIO()
    with quiet_rdkit():
        writer = Chem.SDWriter(buffer)
        for row in rows:
            mol = row.mol()
            rdDepictor.Compute2DCoords(mol)
            mol.SetProp("_Name", row.name)
            for key in SDF_PROPERTIES:
                mol.SetProp(key, row.value(key))
            for key, text in row.residue_fields().items():
                mol.SetProp(key, text)
            writer.write(mol)
        writer.close()
    return buffer.getvalue()


_FORMULA_START = ("=", "+", "-", "@", "\t", "\r")


def _cell(text: str) -> str:
    """A CSV cell a spreadsheet shows as text: one starting like a formula gets a leading apostrophe.

    Applied to user-given text (an unknown's id) only: a residue's condensed
    name starts with ``->`` by rule and stays as it is. (OWASP's advice on CSV
    injection; common practice.)
    """
    return f"'{text}" if text.startswith(_FORMULA_START) else text


def csv_text(rows: tuple[ExportRow, ...]) -> str:
    """CSV with the header :data:`CSV_COLUMNS`, one line per survivor."""
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    writer.writerow(CSV_COLUMNS)
    for row in rows:
        writer.writerow([_cell(row.value(key)) if key == "unknown" else row.value(key) for key in CSV_COLUMNS])
    return buffer.getvalue()


def export_text(solution, fmt: str) -> str:
    """The survivors of ``solution`` as ``sdf`` or ``csv`` text."""
    rows = survivor_rows(solution)
    if fmt == "sdf":
        return sdf_text(rows)
    if fmt == "csv":
        return csv_text(rows)
    raise ValueError(f"export format {fmt!r} is not one of {', '.join(FORMATS)}")
