"""Write the outcome tables shipped with the package (``workbench/data/outcome_tables.pkl.gz``).

Run from the repository root after any change to the chemistry, the conformer
layer or the observation kinds (``tests/test_tables.py`` fails until the
shipped tables carry the current rules key):

    python scripts/build_outcome_tables.py

Every column the planner reads (:func:`workbench.evidence.tables.standard_keys`)
is computed from the structures, through the one prediction layer, for every
candidate of the broadest standard scope (C3-C9, modifications ``any``), which
holds the default scope (C3-C7, no modification) too.
"""

from __future__ import annotations

import os
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))
os.environ["STEREOSIEVE_CACHE"] = "off"  # start from the structures, not from any cached table

from workbench.chem import Scope  # noqa: E402
from workbench.chem.catalogue import catalogue  # noqa: E402
from workbench.evidence import tables  # noqa: E402

STANDARD_SCOPES = (Scope(), Scope(carbons=(3, 4, 5, 6, 7, 8, 9), modifications=("any",)))


def main() -> None:
    t = time.perf_counter()
    tables._STORE.loaded = True  # do not read the file being replaced
    chains: dict = {}
    for scope in STANDARD_SCOPES:
        chains.update(dict.fromkeys(catalogue(scope)))
    tables.warm(list(chains))
    # and every further column the planner reads for one unknown over each standard scope (e.g. the
    # couplings of deoxy positions, H1-H2ax ...), by ranking the experiments once
    from workbench.evidence import project_from_dict
    from workbench.evidence.planner import plan

    for scope in STANDARD_SCOPES:
        project = {"format": "stereosieve-project", "version": 1, "unknowns": [{"id": "U", "scope": scope.to_dict()}]}
        plan(project_from_dict(project))
    path = tables.save(tables.SHIPPED)
    size = path.stat().st_size if path else 0
    print(
        f"{len(chains)} candidates x {len(tables._STORE.columns)} columns -> {path} ({size / 1024:.0f} KiB, "
        f"key {tables.rules_key()}, {time.perf_counter() - t:.0f} s)"
    )


if __name__ == "__main__":
    main()
