"""Catalogue size and enumeration time for the default and the largest scope.

Run: ``python benchmarks/bench_catalogue.py``. Prints counts and seconds
(enumeration alone; then names and canonical SMILES for every member).
"""

from __future__ import annotations

import time

from workbench.chem.catalogue import DEFAULT_SCOPE, Scope, enumerate_scope
from workbench.chem.names import systematic_name
from workbench.chem.smiles import to_smiles


def main() -> None:
    largest = Scope(carbons=tuple(range(3, 10)), modifications=("any",))
    for label, scope in (("default (3-7 C, no modification)", DEFAULT_SCOPE), ("3-9 C, modifications any", largest)):
        t = time.perf_counter()
        members = list(enumerate_scope(scope))
        enum = time.perf_counter() - t
        t = time.perf_counter()
        for c in members:
            systematic_name(c)
        names = time.perf_counter() - t
        t = time.perf_counter()
        for c in members:
            to_smiles(c)
        smiles = time.perf_counter() - t
        print(
            f"{label:<36} {len(members):>5} candidates: enumerate {enum * 1000:.1f} ms, "
            f"names {names * 1000:.1f} ms, canonical SMILES {smiles * 1000:.0f} ms (cold)"
        )


if __name__ == "__main__":
    main()
