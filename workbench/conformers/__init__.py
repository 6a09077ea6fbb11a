"""Chairs in 3D, anomer equilibria, coupling constants and polarimetry (pure; no UI imports).

Fast functions for the engine (Angyal's scheme and the Haasnoot-de
Leeuw-Altona equation on ideal chairs, cached per chain): ``anomer_fractions``,
``chair_preferences``, ``ring_couplings``, ``physical_json``. 3D functions
(RDKit ETKDG + MMFF94, cached): ``ring_conformers``, ``conformer_mol``,
``conformer_molblock``, ``conformer_library``, ``chair_comparison``,
``anomer_comparison``, ``ring_couplings_3d``. Polarimetry: ``published_rotation``, ``rotation_sign``,
``fit_mutarotation``, ``read_curve``.
"""

from workbench.conformers.chair import chair_label
from workbench.conformers.conformer import (
    AnomerComparison,
    ChairComparison,
    Conformer,
    ConformerSettings,
    RingConformers,
    anomer_comparison,
    chair_comparison,
    conformer_library,
    conformer_mol,
    conformer_molblock,
    ring_conformers,
    ring_couplings_3d,
)
from workbench.conformers.coupling import hla_coupling, ring_couplings
from workbench.conformers.curve_file import Curve, parse_curve, read_curve
from workbench.conformers.energy import ChairEnergy, chair_energy
from workbench.conformers.equilibrium import (
    ChairPreference,
    anomer_fractions,
    chair_energy_terms,
    chair_preferences,
)
from workbench.conformers.layout import RingLayout, ring_layout
from workbench.conformers.mutarotation import MutarotationFit, fit_mutarotation
from workbench.conformers.polarimetry import (
    HudsonTerms,
    RotationRecord,
    hudson_anomer,
    hudson_terms,
    published_rotation,
    rotation_sign,
    rotation_table,
    two_state_beta_fraction,
)
from workbench.conformers.puckering import Puckering, puckering
from workbench.conformers.summary import physical_json, physical_notes

__all__ = [
    "AnomerComparison",
    "ChairComparison",
    "ChairEnergy",
    "ChairPreference",
    "Conformer",
    "ConformerSettings",
    "Curve",
    "HudsonTerms",
    "MutarotationFit",
    "Puckering",
    "RingConformers",
    "RingLayout",
    "RotationRecord",
    "anomer_comparison",
    "anomer_fractions",
    "chair_comparison",
    "chair_energy",
    "chair_energy_terms",
    "chair_label",
    "chair_preferences",
    "conformer_library",
    "conformer_mol",
    "conformer_molblock",
    "fit_mutarotation",
    "hla_coupling",
    "hudson_anomer",
    "hudson_terms",
    "parse_curve",
    "physical_json",
    "physical_notes",
    "puckering",
    "published_rotation",
    "read_curve",
    "ring_conformers",
    "ring_couplings",
    "ring_couplings_3d",
    "ring_layout",
    "rotation_sign",
    "rotation_table",
    "two_state_beta_fraction",
]
