"""Shared fixtures for the test suite."""

from __future__ import annotations

import os
import tempfile

import pytest

# Outcome tables computed by the tests go to a throw-away cache, not the user's cache folder.
os.environ.setdefault("STEREOSIEVE_CACHE_DIR", tempfile.mkdtemp(prefix="stereosieve-cache-"))

from workbench.chem import Scope, resolve


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
    import shutil

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
