"""Time the per-candidate predictions: default scope and largest scope, cold and cached.

Run as ``PYTHONPATH=. python benchmarks/bench_predictions.py``. "Cold" clears
every cache of the chemistry layer first (SMILES, molecules, periodate
results, records). The record is filled lazily: "one field" is what the
engine pays for one observation kind, "every other field" what ``predict``
pays for the rest; "cached" repeats the same requests.
"""

from __future__ import annotations

import time

from workbench.chem import smiles as smiles_module
from workbench.chem.catalogue import DEFAULT_SCOPE, Scope, catalogue
from workbench.chem.periodate import _fragment_info, _oxidise_smiles, _smith_smiles
from workbench.chem.predictions import predict, predictions_json

LARGEST = Scope(carbons=tuple(range(3, 10)), modifications=("any",))


def clear_caches() -> None:
    """Forget everything the chemistry layer has memoised."""
    predict.cache_clear()
    for fn in (_oxidise_smiles, _smith_smiles, _fragment_info):
        fn.cache_clear()
    for fn in (
        smiles_module.to_smiles,
        smiles_module.canonical,
        smiles_module.mirror_smiles,
        smiles_module._mol_from,
        smiles_module.to_inchi,
        smiles_module.to_inchikey,
    ):
        fn.cache_clear()


def timed(label: str, chains, render: bool = False) -> float:
    start = time.perf_counter()
    for chain in chains:
        predictions_json(chain) if render else predict(chain).aldaric_acid_active
    seconds = time.perf_counter() - start
    per = 1000 * seconds / max(len(chains), 1)
    print(f"{label:<44} {len(chains):>5} candidates  {seconds:8.3f} s  {per:7.3f} ms each")
    return seconds


def main() -> None:
    for name, scope in (("default scope", DEFAULT_SCOPE), ("3-9 carbons, modifications any", LARGEST)):
        chains = catalogue(scope)
        clear_caches()
        timed(f"{name}: cold, one field (aldaric acid)", chains)
        timed(f"{name}: cold, every other field (JSON)", chains, render=True)
        timed(f"{name}: cached, one field", chains)
        timed(f"{name}: cached + JSON rendering", chains, render=True)


if __name__ == "__main__":
    main()
