"""Per-candidate predictions of every classical experiment (cached).

Placeholder-free first cut: built from :mod:`workbench.chem.reactions`;
periodate and the remaining experiments join here.
"""

from __future__ import annotations

from functools import cache

from workbench.chem.chain import Chain
from workbench.chem.names import display_name
from workbench.chem.reactions import (
    aldaric_acid,
    alditols,
    aldonic_acid,
    extend,
    is_optically_active,
    osazone,
    shorten,
)
from workbench.chem.smiles import to_smiles

__all__ = ["predictions_json"]


@cache
def predictions_json(chain: Chain) -> dict:
    """The ``predictions`` block of ``predict --json`` for one sugar."""
    out: dict = {}
    acid = aldaric_acid(chain)
    out["aldaric_acid"] = {"smiles": to_smiles(acid), "optically_active": is_optically_active(acid)} if acid else None
    aldonic = aldonic_acid(chain)
    out["aldonic_acid"] = {"smiles": to_smiles(aldonic)} if aldonic else None
    alds = alditols(chain)
    out["alditol"] = (
        {"smiles": [to_smiles(a) for a in alds], "optically_active": is_optically_active(alds)} if alds else None
    )
    osa = osazone(chain)
    out["osazone"] = {"smiles": to_smiles(osa)} if osa else None
    reducing = chain.carbonyl is not None
    out["bromine_water"] = {"result": "oxidised" if chain.carbonyl == "aldose" else "unchanged"}
    out["reducing_test"] = {"result": "positive" if reducing else "negative"}
    ext = extend(chain)
    out["chain_extension"] = {"products": [display_name(p) for p in ext]} if ext else None
    short = shorten(chain)
    out["chain_shortening"] = {"product": display_name(short)} if short else None
    return out
