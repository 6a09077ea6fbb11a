"""Catalogue counts and scope handling."""

from __future__ import annotations

import pytest

from workbench.chem import DEFAULT_SCOPE, catalogue, scope_size
from workbench.chem.catalogue import Scope, parse_modification
from workbench.errors import ScopeError


@pytest.mark.parametrize(
    ("carbons", "carbonyl", "count"),
    [
        # 2^(n-2) aldoses and 2^(n-3) 2-ketoses per chain length, both series
        # (textbook counting, e.g. Carey ch. 25) [common practice]
        (3, "aldose", 2),
        (4, "aldose", 4),
        (5, "aldose", 8),
        (6, "aldose", 16),
        (7, "aldose", 32),
        (9, "aldose", 128),
        (3, "ketose", 1),  # dihydroxyacetone, achiral
        (4, "ketose", 2),
        (5, "ketose", 4),
        (6, "ketose", 8),
        (7, "ketose", 16),
    ],
)
def test_counts_per_chain_length(carbons, carbonyl, count):
    assert scope_size(Scope(carbons=(carbons,), carbonyl=(carbonyl,))) == count


def test_default_scope_is_3_to_7_carbons_unmodified():
    # DESIGN.md: default scope carbons 3-7, both carbonyls, both series, no modification
    assert scope_size(DEFAULT_SCOPE) == 62 + 31


def test_series_filter_halves_chiral_scopes():
    d = catalogue(Scope(carbons=(6,), series=("D",)))
    assert len(d) == 12 and all(c.series == "D" for c in d)


def test_enantiomers_pair_up():
    members = set(catalogue(Scope(carbons=(5, 6))))
    assert all(c.mirror() in members for c in members)


def test_modifications():
    deoxy6 = catalogue(Scope(carbons=(6,), carbonyl=("aldose",), modifications=("deoxy:6",)))
    assert len(deoxy6) == 16 and all(c.groups[-1] == "CH3" for c in deoxy6)
    deoxy2 = catalogue(Scope(carbons=(6,), carbonyl=("aldose",), modifications=("deoxy:2",)))
    assert len(deoxy2) == 8  # one stereocentre fewer
    amino = catalogue(Scope(carbons=(6,), carbonyl=("aldose",), modifications=("amino:2",)))
    assert len(amino) == 16 and all(c.groups[1] == "CHNH2" for c in amino)
    combo = catalogue(Scope(carbons=(6,), carbonyl=("aldose",), modifications=("amino:2+deoxy:6",)))
    assert len(combo) == 16
    assert parse_modification("deoxy:2,6").deoxy == frozenset({2, 6})


@pytest.mark.parametrize(
    "kwargs",
    [
        {"carbons": (10,)},
        {"carbons": ()},
        {"carbonyl": ("alcohol",)},
        {"series": ("R",)},
        {"modifications": ("deoxy:x",)},
        {"modifications": ("methylated",)},
    ],
)
def test_bad_scopes_raise_scope_error(kwargs):
    with pytest.raises(ScopeError):
        Scope(**kwargs)


def test_largest_scope_is_finite_and_unique():
    big = catalogue(Scope(carbons=tuple(range(3, 10)), modifications=("any",)))
    assert len(big) == len(set(big)) > 3000
