"""The layers import downwards only (DEVELOPERS.md, Layout): checked on the source text.

Common practice (layered architecture); no chemistry is checked here.
"""

from __future__ import annotations

import ast
from pathlib import Path

PACKAGE = Path(__file__).resolve().parent.parent / "workbench"
FORBIDDEN = {
    "chem": ("workbench.display", "workbench.ui", "workbench.evidence", "workbench.report", "workbench.cli"),
    "conformers": ("workbench.display", "workbench.ui", "workbench.evidence", "workbench.report", "workbench.cli"),
    "evidence": ("workbench.display", "workbench.ui", "workbench.report", "workbench.cli"),
}


def _imports(path: Path) -> set[str]:
    out = set()
    for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
        if isinstance(node, ast.Import):
            out.update(a.name for a in node.names)
        elif isinstance(node, ast.ImportFrom) and node.module:
            out.add(node.module)
    return out


def test_lower_layers_never_import_upper_ones_even_inside_functions():
    bad = []
    for layer, forbidden in FORBIDDEN.items():
        for path in sorted((PACKAGE / layer).glob("*.py")):
            for name in _imports(path):
                if name.startswith(forbidden):
                    bad.append(f"{path.relative_to(PACKAGE)} imports {name}")
    allowed = {"evidence/engine.py imports workbench.display.board"}  # Solution._repr_html_ (not a chem cycle)
    assert set(bad) <= allowed, sorted(set(bad) - allowed)


def test_a_chain_draws_itself_once_the_display_layer_is_loaded():
    from workbench.chem import resolve
    from workbench.display import fischer  # noqa: F401 - registers the drawer

    assert resolve("D-glucose")._repr_svg_().startswith("<svg")
