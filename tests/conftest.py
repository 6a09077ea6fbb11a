"""Shared fixtures for the test suite (the throw-away outcome-table cache is set up by ../conftest.py)."""

from __future__ import annotations

import shutil
from pathlib import Path

import pytest

from workbench.chem import Scope, resolve
from workbench.data import DEMO_PROJECT, data_path


@pytest.fixture()
def demo_file(tmp_path) -> Path:
    """A copy of the demo project in the test's own folder (sessions and panels may save to it)."""
    target = tmp_path / "demo.json"
    shutil.copyfile(data_path(DEMO_PROJECT), target)
    return target


@pytest.fixture(scope="session")
def d_aldohexoses():
    return Scope(carbons=(6,), carbonyl=("aldose",), series=("D",))


@pytest.fixture()
def sugar():
    return resolve


@pytest.fixture(scope="module")
def opsin(request, tmp_path_factory):
    """IUPAC name -> canonical SMILES by OPSIN (py2opsin), an outside parser of the names.

    The names listed in the test module's ``OPSIN_NAMES`` are parsed in one
    Java run; a test that needs OPSIN is skipped where Java or py2opsin is
    missing.
    """
    from workbench.chem.smiles import canonical

    if shutil.which("java") is None:
        pytest.skip("OPSIN needs Java")
    py2opsin = pytest.importorskip("py2opsin").py2opsin
    scratch = tmp_path_factory.mktemp("opsin") / "names.txt"
    found: dict[str, str] = {}

    def run(names: list[str]) -> None:
        out = py2opsin(names, tmp_fpath=str(scratch))
        for name, smiles in zip(names, out if isinstance(out, list) else [out], strict=True):
            found[name] = canonical(smiles) if smiles else ""

    run(sorted(set(getattr(request.module, "OPSIN_NAMES", ()))))

    def lookup(name: str) -> str:
        if name not in found:
            run([name])
        if not found[name]:
            pytest.skip(f"OPSIN gave no structure for {name!r}")
        return found[name]

    return lookup
