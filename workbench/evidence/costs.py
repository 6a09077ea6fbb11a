"""Cost and hazard of each experiment, and the cautions shown with it.

A small documented table, not a safety assessment: the cautions are the usual
reminders (sources in REFERENCE_VALUES.md: C&EN 74(2), 2 (1996) on Tollens
reagent; ICSC 0183 nitric acid; ICSC 1670 sodium borohydride; ECHA dossier on
sodium periodate; NIOSH emergency response card for cyanide; EU CLP
classifications marked [memory] there). Every list of cautions ends by
deferring to the safety data sheet, local rules and the safety officer.

Cost units: ``material_mg`` of the unknown consumed, ``hours`` of bench time,
``hazard`` on a 0 (benign) to 3 (acutely lethal reagent) scale. The single
``effort`` figure used for ranking is hours + material_mg / 10 + 2 * hazard.
"""

from __future__ import annotations

from dataclasses import dataclass

__all__ = ["Cost", "COSTS", "CAUTIONS", "DEFER", "cost_of", "cautions_of"]

DEFER = (
    "These are reminders only: follow the safety data sheet of every reagent, your local rules "
    "and your institution's safety officer."
)

CAUTIONS: dict[str, str] = {
    "tollens": "Tollens reagent deposits explosive silver nitride on standing: prepare just before use, never "
    "store it, destroy residues with dilute HCl or NaCl solution (C&EN 74(2), 2, 1996).",
    "fehling": "Fehling's and Benedict's reagents contain copper salts and strong alkali: eye and skin irritant, "
    "toxic to aquatic life; collect copper waste.",
    "bromine": "Bromine is fatal if inhaled and causes severe burns (EU CLP H330, H314): fume hood, "
    "resistant gloves, thiosulfate at hand for spills.",
    "nitric": "Concentrated nitric acid is a strong oxidiser and corrosive and releases NO2 fumes (ICSC 0183): "
    "fume hood, face shield, keep away from organic solvents.",
    "borohydride": "Sodium borohydride is water-reactive and releases hydrogen; toxic and corrosive (ICSC 1670): "
    "add slowly, no flames, vent the hydrogen, quench carefully with dilute acid.",
    "phenylhydrazine": "Phenylhydrazine is toxic by all routes, a skin sensitiser and a suspected carcinogen "
    "(EU CLP Carc. 1B, Muta. 2, Acute Tox. 3): fume hood, double gloves, no skin contact.",
    "cyanide": "Sodium cyanide / HCN (Kiliani-Fischer) is rapidly fatal; acid liberates HCN gas. Keep solutions "
    "alkaline, work in a fume hood, never alone, with the antidote and a written procedure at hand "
    "(NIOSH emergency response card).",
    "periodate": "Sodium periodate is a strong oxidiser (H271, ECHA dossier): keep from organic material, "
    "quench excess with ethylene glycol.",
    "resorcinol": "The resorcinol/HCl reagent is corrosive and resorcinol is harmful: gloves and goggles, "
    "heat in a water bath, not a flame.",
    "hydroxylamine": "Hydroxylamine (Wohl degradation) is toxic and can decompose violently when heated "
    "concentrated; acetic anhydride is corrosive.",
    "hydrogen_peroxide": "Hydrogen peroxide with iron salts (Ruff degradation) is a strong oxidiser; "
    "add slowly with cooling.",
    "methyl_iodide": "Methyl iodide is a toxic alkylating agent and a suspected carcinogen (H351): fume hood, "
    "double gloves, no skin contact; destroy excess with aqueous ammonia or thiosulfate.",
    "sodium_hydride_dmso": "Sodium hydride with DMSO (Hakomori) releases flammable hydrogen and the dimsyl "
    "anion can decompose violently on heating: small scale, no heating, inert gas, no flames.",
    "naoh_dmso": "Powdered NaOH in DMSO (Ciucanu-Kerek) is corrosive and DMSO carries solutes through skin: "
    "gloves and goggles.",
    "tfa": "Trifluoroacetic acid (hydrolysis) is corrosive and volatile: fume hood, acid-resistant gloves.",
    "acetic_anhydride": "Acetic anhydride (acetylation, with pyridine or 1-methylimidazole) is corrosive and a "
    "lachrymator: fume hood; pyridine is harmful.",
}


@dataclass(frozen=True)
class Cost:
    """Material (mg of unknown), bench time (h) and hazard class (0-3) of one experiment."""

    material_mg: float
    hours: float
    hazard: int
    reagents: tuple[str, ...] = ()

    @property
    def effort(self) -> float:
        """One number for ranking: hours + material_mg/10 + 2 * hazard."""
        return self.hours + self.material_mg / 10.0 + 2.0 * self.hazard

    def to_dict(self) -> dict:
        """JSON form."""
        return {
            "material_mg": self.material_mg,
            "hours": self.hours,
            "hazard": self.hazard,
            "effort": round(self.effort, 2),
        }


# Typical bench figures for milligram-scale work [common practice; rough by design].
COSTS: dict[str, Cost] = {
    "carbon_count": Cost(1, 2, 0),
    "molecular_formula": Cost(0.1, 1, 0),
    "series": Cost(20, 24, 1, ("periodate", "borohydride")),
    "bromine_water": Cost(10, 2, 2, ("bromine",)),
    "reducing_test": Cost(5, 0.5, 1, ("fehling", "tollens")),
    "ketose_test": Cost(2, 0.5, 1, ("resorcinol",)),
    "aldaric_acid": Cost(50, 8, 2, ("nitric",)),
    "alditol": Cost(20, 4, 1, ("borohydride",)),
    "periodate": Cost(20, 6, 1, ("periodate",)),
    "specific_rotation": Cost(20, 1, 0),
    "anomer_ratio": Cost(5, 1, 0),
    "coupling_constant": Cost(5, 1, 0),
    "same_product:osazone": Cost(50, 4, 2, ("phenylhydrazine",)),
    "same_product:aldaric_acid": Cost(100, 12, 2, ("nitric",)),
    "same_product:alditol": Cost(40, 6, 1, ("borohydride",)),
    "same_product:aldonic_acid": Cost(40, 6, 2, ("bromine",)),
    "chain_extension": Cost(200, 48, 3, ("cyanide", "nitric")),
    # residue kinds: milligrams of the polysaccharide, one run for all its residue types [common practice]
    "methylation_analysis": Cost(
        5, 24, 2, ("methyl_iodide", "sodium_hydride_dmso", "naoh_dmso", "tfa", "borohydride", "acetic_anhydride")
    ),
    "smith_degradation": Cost(50, 72, 1, ("periodate", "borohydride", "tfa")),
    "anomer": Cost(10, 2, 0),
    "ring_form": Cost(10, 2, 0),
    "molar_ratio": Cost(5, 24, 2, ("methyl_iodide", "sodium_hydride_dmso", "tfa", "acetic_anhydride")),
    "chain_shortening": Cost(150, 36, 2, ("bromine", "hydrogen_peroxide", "nitric")),
}


def cost_of(kind: str, reaction: str | None = None) -> Cost:
    """The cost row of an experiment kind (relations by their reaction)."""
    if kind == "same_product" and reaction:
        return COSTS[f"same_product:{reaction}"]
    return COSTS[kind]


def cautions_of(cost: Cost) -> list[str]:
    """The caution lines for an experiment's reagents, ending with the deferral line."""
    lines = [CAUTIONS[r] for r in cost.reagents]
    return lines + [DEFER] if lines else []
