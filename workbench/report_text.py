"""Plain-data and plain-text renderings of structures and predictions for the CLI.

Pure functions that return dicts (for ``--json``) or strings (for the
terminal); no printing here.
"""

from __future__ import annotations

from workbench.chem.chain import Chain
from workbench.chem.names import display_name, systematic_name
from workbench.chem.smiles import to_inchikey, to_smiles

__all__ = ["identity_json", "predict_json", "predict_text"]


def identity_json(chain: Chain) -> dict:
    """``name``, ``systematic_name``, ``smiles`` (open chain), ``inchikey``, ``carbons``, ``series``."""
    return {
        "name": display_name(chain),
        "systematic_name": systematic_name(chain),
        "smiles": to_smiles(chain),
        "inchikey": to_inchikey(chain),
        "carbons": chain.carbons,
        "series": chain.series,
        "formula": chain.formula,
    }


def predict_json(chain: Chain) -> dict:
    """The ``predictions`` block of ``predict --json`` (keys in DESIGN.md)."""
    from workbench.chem.predictions import predictions_json

    data = predictions_json(chain)
    try:
        from workbench.conformers.summary import physical_json
    except ImportError:  # the conformer layer is optional at this stage
        return data
    data.update(physical_json(chain))
    return data


def predict_text(chain: Chain) -> str:
    """A readable summary of ``predict_json`` for the terminal."""
    ident = identity_json(chain)
    lines = [
        f"{ident['name']}  ({ident['systematic_name']})",
        f"  formula {ident['formula']}, {ident['carbons']} carbons, series {ident['series'] or '-'}",
        f"  SMILES   {ident['smiles']}",
        f"  InChIKey {ident['inchikey']}",
    ]
    for key, value in predict_json(chain).items():
        lines.append(f"  {key}: {_short(value)}")
    return "\n".join(lines)


def _short(value: object) -> str:
    if value is None:
        return "does not apply"
    if isinstance(value, dict):
        return ", ".join(f"{k}={_short(v) if isinstance(v, dict) else v}" for k, v in value.items())
    return str(value)
