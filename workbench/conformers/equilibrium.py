"""Chair preference and alpha/beta pyranose equilibrium from Angyal's scheme.

Each pyranose anomer is a Boltzmann mixture of its two chairs; its free
energy is G = -RT ln(sum_chairs exp(-G_chair/RT)), and the alpha/beta
fractions follow from the two anomers' G at 25 C (298.15 K). Angyal's worked
result: beta-D-glucopyranose 2.05 vs alpha 2.40 kcal/mol gives 64 % beta.

What is predicted: the alpha/beta ratio *within the pyranose pool*, so the
two pyranose fractions sum to 1. Furanose and open-chain fractions are not
predicted (returned as None): Angyal's additive scheme is defined for chairs
only, and we know of no published additive scheme for the flexible
furanose ring that we could implement and check here. Where no pyranose ring
can form (trioses, tetroses, pent-2-uloses, sugars deoxygenated at the
ring-closing carbon) the pyranose fractions are 0.0 exactly.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from functools import cache

from workbench.chem.chain import Chain
from workbench.chem.smiles import RingForm, ring_forms
from workbench.conformers.chair import CHAIRS, chair_label
from workbench.conformers.energy import ChairEnergy, chair_energies, chair_energy
from workbench.conformers.layout import RingLayout, ring_layout

__all__ = [
    "GAS_CONSTANT_KCAL",
    "ROOM_TEMPERATURE_K",
    "FRACTION_KEYS",
    "ChairPreference",
    "anomer_fractions",
    "chair_preferences",
    "chair_preference",
    "chair_weights",
    "pyranose_layouts",
]

GAS_CONSTANT_KCAL = 1.987204e-3  # kcal mol-1 K-1 (CODATA R = 8.314462618 J mol-1 K-1)
ROOM_TEMPERATURE_K = 298.15  # 25 C
FRACTION_KEYS = ("alpha_pyranose", "beta_pyranose", "alpha_furanose", "beta_furanose", "open_chain")


@dataclass(frozen=True)
class ChairPreference:
    """Which chair a pyranose anomer prefers, by Angyal's scheme.

    ``energy_gap_kcal`` is G(other chair) - G(preferred) >= 0 (kcal/mol);
    ``energies`` pairs each chair's IUPAC name with its free energy
    (kcal/mol), chair A (4C1 type) first; ``population`` is the Boltzmann
    fraction of the preferred chair at 25 C.
    """

    form: str
    preferred: str
    energy_gap_kcal: float
    energies: tuple[tuple[str, float], ...]
    population: float

    def to_dict(self) -> dict:
        """The ``chairs`` entry of ``predict --json``: preferred chair and gap."""
        return {"preferred": self.preferred, "energy_gap_kcal": round(self.energy_gap_kcal, 3)}


def _rt(temperature_k: float) -> float:
    return GAS_CONSTANT_KCAL * temperature_k


@cache
def pyranose_layouts(chain: Chain) -> tuple[RingLayout, ...]:
    """Layouts of the alpha and beta pyranose forms ``chain`` can adopt (possibly none)."""
    return tuple(ring_layout(chain, f) for f in ring_forms(chain) if f.ring == "pyranose")


def chair_weights(layout: RingLayout, temperature_k: float = ROOM_TEMPERATURE_K) -> tuple[float, float]:
    """Boltzmann fractions of chairs A and B of one pyranose anomer."""
    a, b = chair_energies(layout)
    rt = _rt(temperature_k)
    low = min(a, b)
    wa, wb = math.exp(-(a - low) / rt), math.exp(-(b - low) / rt)
    return wa / (wa + wb), wb / (wa + wb)


def _anomer_free_energy(layout: RingLayout, temperature_k: float) -> float:
    a, b = chair_energies(layout)
    rt = _rt(temperature_k)
    low = min(a, b)
    return low - rt * math.log(math.exp(-(a - low) / rt) + math.exp(-(b - low) / rt))


@cache
def _pyranose_fractions(chain: Chain, temperature_k: float) -> tuple[float, float]:
    layouts = pyranose_layouts(chain)
    if not layouts:
        return 0.0, 0.0
    rt = _rt(temperature_k)
    energies = {lay.form.anomer: _anomer_free_energy(lay, temperature_k) for lay in layouts}
    low = min(energies.values())
    weights = {k: math.exp(-(g - low) / rt) for k, g in energies.items()}
    total = sum(weights.values())
    return weights.get("alpha", 0.0) / total, weights.get("beta", 0.0) / total


def anomer_fractions(chain: Chain, temperature_k: float = ROOM_TEMPERATURE_K) -> dict[str, float | None]:
    """Predicted fractions in water of the forms of ``chain`` (keys :data:`FRACTION_KEYS`).

    Pyranose fractions are those of the pyranose pool (they sum to 1, or are
    both 0.0 where no pyranose can form); furanose and open-chain fractions
    are None (not predicted). ``temperature_k`` in kelvin (default 25 C).
    See the module docstring for the method and its limits. Cached per
    chain; returns a new dict on every call.
    """
    out: dict[str, float | None] = dict.fromkeys(FRACTION_KEYS)
    out["alpha_pyranose"], out["beta_pyranose"] = _pyranose_fractions(chain, temperature_k)
    return out


def chair_preference(layout: RingLayout) -> ChairPreference:
    """The preferred chair of one pyranose anomer and the gap to the other (kcal/mol)."""
    a, b = chair_energies(layout)
    wa, wb = chair_weights(layout)
    names = {c: chair_label(c, layout.anomeric) for c in CHAIRS}
    preferred = "A" if a <= b else "B"
    return ChairPreference(
        form=layout.form.key,
        preferred=names[preferred],
        energy_gap_kcal=abs(a - b),
        energies=((names["A"], a), (names["B"], b)),
        population=wa if preferred == "A" else wb,
    )


@cache
def _chair_preferences(chain: Chain) -> tuple[tuple[str, ChairPreference], ...]:
    return tuple((lay.form.key, chair_preference(lay)) for lay in pyranose_layouts(chain))


def chair_preferences(chain: Chain) -> dict[str, ChairPreference]:
    """Chair preference of every pyranose form of ``chain``, keyed like ``alpha_pyranose``.

    Empty where no pyranose can form. Cached per chain; a new dict each call.
    """
    return dict(_chair_preferences(chain))


def chair_energy_terms(chain: Chain, form: RingForm) -> tuple[ChairEnergy, ChairEnergy]:
    """Both chairs of one pyranose form with the interaction terms that explain them."""
    layout = ring_layout(chain, form)
    return chair_energy(layout, "A"), chair_energy(layout, "B")
