"""Shared fixtures for the test suite."""

from __future__ import annotations

import pytest

from workbench.chem import Scope, resolve


@pytest.fixture(scope="session")
def d_aldohexoses():
    return Scope(carbons=(6,), carbonyl=("aldose",), series=("D",))


@pytest.fixture()
def sugar():
    return resolve
