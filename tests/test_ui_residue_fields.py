"""Entry fields of the residue kinds: lists of carbon numbers and of amounts typed as text.

No chemistry is checked here: only that what is typed reaches the observation model unchanged.
"""

from __future__ import annotations

from workbench.evidence.observations import OBSERVATION_TYPES, observation_from_dict
from workbench.ui.fields import FieldEditor


def _spec(kind, name):
    return next(s for s in OBSERVATION_TYPES[kind].SPECS if s.name == name)


def test_positions_typed_as_text_reach_the_core_as_a_list():
    methyl = FieldEditor(_spec("methylation_analysis", "methyl"), unknowns=["R1"])
    acetyl = FieldEditor(_spec("methylation_analysis", "acetyl"), unknowns=["R1"])
    methyl.control.value, acetyl.control.value = "2, 3, 6", "1;4;5"
    obs = observation_from_dict(
        {"id": "E1", "kind": "methylation_analysis", "unknown": "R1", "methyl": methyl.get(), "acetyl": acetyl.get()}
    )
    assert (obs.methyl, obs.acetyl) == ((2, 3, 6), (1, 4, 5))
    methyl.set(obs.methyl)  # an existing record shown again
    assert methyl.control.value == "2, 3, 6"


def test_text_that_is_not_a_list_is_left_for_the_core_to_name():
    amounts = FieldEditor(_spec("molar_ratio", "amounts"))
    amounts.control.value = "3, two"
    assert amounts.get() == "3, two"
    amounts.control.value = "3, 2.5"
    assert amounts.get() == [3.0, 2.5]
