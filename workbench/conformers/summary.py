"""The physical predictions of ``stereosieve predict --json``: anomers, chairs, couplings.

Fast (no 3D embedding): Angyal's scheme on the ideal chair and the
Haasnoot-de Leeuw-Altona equation on idealised chair torsions. Works for
every chain of the catalogue; forms that cannot exist or are not predicted
give empty dicts or None, and :func:`physical_notes` says why.
"""

from __future__ import annotations

from workbench.chem.chain import Chain
from workbench.chem.smiles import ring_forms
from workbench.conformers import coupling, energy, equilibrium, layout
from workbench.conformers.coupling import ring_couplings
from workbench.conformers.equilibrium import anomer_fractions, chair_preferences

__all__ = ["physical_json", "physical_notes", "clear_fast_caches"]


def clear_fast_caches() -> None:
    """Empty every cache of the fast path (for cold timings in benchmarks and tests)."""
    for cached in (
        layout.ring_layout,
        energy.chair_energies,
        equilibrium.pyranose_layouts,
        equilibrium._pyranose_fractions,
        equilibrium._chair_preferences,
        coupling._form_couplings,
    ):
        cached.cache_clear()


_FRACTION_DIGITS = 3
_COUPLING_DIGITS = 1  # Hz; the equation is good to about 1 Hz
_GAP_DIGITS = 2  # kcal/mol


def _round(value: float | None, digits: int) -> float | None:
    return None if value is None else round(value, digits)


# A 2-ketopyranose chair named as the aldopyranose chair with the same ring
# atoms in the same places (C-5 up/C-2 down is the 4C1 type).
_ALDOSE_TYPE = {"5C2": "4C1", "2C5": "1C4"}


def physical_json(chain: Chain) -> dict:
    """``{"anomers": ..., "chairs": ..., "couplings": ...}`` for one sugar (keys in DESIGN.md).

    - ``anomers``: fractions in water of ``alpha_pyranose``, ``beta_pyranose``
      (of the pyranose pool, Angyal's scheme, 25 C), ``alpha_furanose``,
      ``beta_furanose``, ``open_chain`` (None: not predicted).
    - ``chairs``: per pyranose form, ``{"preferred": "4C1"/"1C4" (aldoses) or
      "2C5"/"5C2" (2-ketoses, IUPAC ring numbering), "energy_gap_kcal": kcal/mol,
      "aldose_type": the same chair named as for an aldopyranose (5C2 -> 4C1, 2C5 -> 1C4)}``.
    - ``couplings``: per pyranose form, ``{"H1-H2": Hz, ...}`` (ketoses from H3-H4).

    About 0.3 ms per new chain, microseconds when its parts are cached.
    """
    fractions = anomer_fractions(chain)
    if chain.has_nitrogen:  # Angyal's scheme has no amino or acetamido terms: not borrowed from the parent
        fractions = dict.fromkeys(fractions)
    return {
        "anomers": {k: _round(v, _FRACTION_DIGITS) for k, v in fractions.items()},
        "chairs": {
            key: {
                "preferred": pref.preferred,
                "energy_gap_kcal": round(pref.energy_gap_kcal, _GAP_DIGITS),
                "aldose_type": _ALDOSE_TYPE.get(pref.preferred, pref.preferred),
            }
            for key, pref in chair_preferences(chain).items()
        },
        "couplings": {
            key: {pair: round(j, _COUPLING_DIGITS) for pair, j in pairs.items()}
            for key, pairs in ring_couplings(chain).items()
        },
    }


def physical_notes(chain: Chain) -> tuple[str, ...]:
    """Why parts of :func:`physical_json` are empty or None, in plain words."""
    notes: list[str] = []
    forms = ring_forms(chain)
    if not forms:
        if chain.carbons < 4 or chain.carbonyl is None:
            notes.append("no ring form: the chain is too short or has no carbonyl to close a ring")
        else:
            notes.append("no ring form: no hydroxyl stands where a five- or six-membered ring would close")
    elif not any(f.ring == "pyranose" for f in forms):
        notes.append("no pyranose ring can form, so the pyranose fractions are 0 and there are no chairs")
    if forms:
        notes.append(
            "furanose and open-chain fractions are not predicted (Angyal's scheme covers chairs only); "
            "pyranose fractions are those of the pyranose pool"
        )
    if forms and chain.has_nitrogen:
        notes.append(
            "anomer fractions of amino and N-acetyl amino sugars are not predicted: Angyal's scheme has no "
            "terms for NH2 or NHAc (N-acetyl-D-glucosamine is mostly alpha in water, glucose mostly beta [from memory])"
        )
    if any(f.ring == "furanose" for f in forms):
        notes.append("furanose couplings are not in the fast path; see ring_couplings_3d (MMFF94 conformers)")
    return tuple(notes)
