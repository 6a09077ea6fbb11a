"""Chemists' words for the identifiers of the project file, and conformation labels with proper indices.

The project file, the JSON output and the code use identifiers such as
``alpha_pyranose``, ``methyl_pyranoside``, ``aldaric_acid``, ``co2`` or
``same_product``; a chemist reads "alpha-pyranose", "methyl pyranoside",
"aldaric acid", "CO2" and "product comparison". This module is the one place
that turns the first into the second, for the notebook panels, the HTML report
and the command line's text output (JSON keeps the identifiers). Pure: it
imports nothing from the rest of the package.

Conformation descriptors follow IUPAC (Nomenclature of carbohydrates, 2-Carb-7.2):
the ring atoms above and below the reference plane as superscript and
subscript around the letter (``4C1`` is written 4 up, C, 1 down).
"""

from __future__ import annotations

import html
import re
from collections.abc import Mapping
from typing import Any

__all__ = [
    "TERMS",
    "KIND_NAMES",
    "FIELD_NAMES",
    "UNITS",
    "term",
    "kind_name",
    "field_name",
    "value_text",
    "quantity_text",
    "observation_text",
    "conformation_html",
    "conformation_text",
    "conformations_html",
]

# Identifier -> the words a chemist uses (ring forms, substrates, products, methods, relations).
TERMS: dict[str, str] = {
    "alpha_pyranose": "α-pyranose",
    "beta_pyranose": "β-pyranose",
    "alpha_furanose": "α-furanose",
    "beta_furanose": "β-furanose",
    "open_chain": "open chain",
    "free": "free sugar",
    "alditol": "alditol",
    "methyl_pyranoside": "methyl pyranoside",
    "methyl_furanoside": "methyl furanoside",
    "residue": "residue in the polymer",
    "aldaric_acid": "aldaric acid",
    "aldonic_acid": "aldonic acid",
    "osazone": "osazone",
    "kiliani_fischer": "Kiliani-Fischer synthesis",
    "nitromethane": "nitromethane route",
    "ruff": "Ruff degradation",
    "wohl": "Wohl degradation",
    "co2": "CO₂",
    "formic_acid": "formic acid",
    "formaldehyde": "formaldehyde",
    "optically_active": "optically active",
    "alpha_fraction": "α fraction",
    "same_product": "product comparison",
    "different": "different compounds",
    "oxidised": "oxidised",
    "unchanged": "unchanged",
    "aldose": "aldose",
    "ketose": "ketose",
}

# Observation kind -> its name in a ledger or a menu.
KIND_NAMES: dict[str, str] = {
    "carbon_count": "carbon count",
    "series": "D/L series",
    "bromine_water": "bromine water",
    "reducing_test": "reducing-sugar test",
    "ketose_test": "ketose test (resorcinol/HCl)",
    "aldaric_acid": "aldaric acid (nitric acid)",
    "alditol": "alditol (borohydride)",
    "molecular_formula": "molecular formula",
    "periodate": "periodate oxidation",
    "specific_rotation": "specific rotation",
    "anomer_ratio": "anomer ratio",
    "coupling_constant": "coupling constant",
    "same_product": "product comparison",
    "different": "different compounds",
    "chain_extension": "chain extension",
    "chain_shortening": "chain shortening",
    "methylation_analysis": "methylation analysis",
    "smith_degradation": "Smith degradation",
    "anomer": "anomeric configuration",
}

# (kind, field) or field -> label; the kind-specific entry wins.
FIELD_NAMES: dict[tuple[str, str] | str, str] = {
    ("carbon_count", "value"): "carbons",
    ("series", "value"): "series",
    ("molecular_formula", "value"): "formula",
    ("specific_rotation", "value"): "[α]D",
    ("specific_rotation", "form"): "rotation of",
    ("coupling_constant", "value"): "³J(H,H)",
    ("periodate", "periodate"): "IO₄⁻ consumed",
    "formic_acid": "HCOOH formed",
    "formaldehyde": "HCHO formed",
    "co2": "CO₂ formed",
    "optically_active": "optically active",
    "alpha_fraction": "α fraction (of the pyranoses)",
    "form": "ring form",
    "pair": "proton pair",
    "members": "compounds",
    "linked_positions": "linked positions",
}

# Units of measured quantities, by kind (for reasons such as "predicted 3.19 Hz, observed 10.20 Hz").
UNITS: dict[str, str] = {
    "coupling_constant": "Hz",
    "specific_rotation": "°",
    "periodate": "mol/mol",
    "anomer_ratio": "",
}


def _looked_up(text: str, *tables: Mapping[Any, str]) -> str:
    """``text`` as the first of ``tables`` that lists it names it, else with underscores as spaces."""
    for table in tables:
        if text in table:
            return table[text]
    return text.replace("_", " ")


def term(word: object) -> str:
    """The chemist's words for an identifier (``"methyl_pyranoside"`` -> ``"methyl pyranoside"``).

    Identifiers not listed come back with underscores as spaces; anything else unchanged.
    """
    text = str(word)
    return _looked_up(text, TERMS, KIND_NAMES)


def kind_name(kind: str) -> str:
    """The name of an observation kind (``"same_product"`` -> ``"product comparison"``)."""
    return _looked_up(kind, KIND_NAMES)


def field_name(kind: str, field: str) -> str:
    """The label of a field of ``kind`` (``("periodate", "co2")`` -> ``"CO₂ formed"``)."""
    if (kind, field) in FIELD_NAMES:
        return FIELD_NAMES[(kind, field)]
    return _looked_up(field, FIELD_NAMES, TERMS)


def value_text(value: object) -> str:
    """A field value in words: yes/no, identifiers as terms, lists joined, numbers as written."""
    if value is None:
        return "-"
    if isinstance(value, bool):
        return "yes" if value else "no"
    if isinstance(value, (list, tuple)):
        return ", ".join(value_text(v) for v in value)
    if isinstance(value, float):
        return f"{value:g}"
    if isinstance(value, str) and re.fullmatch(r"[a-z]+(_[a-z0-9]+)+|co2", value):
        return term(value)
    return str(value)


def quantity_text(kind: str, value: float, digits: int = 2) -> str:
    """A measured or predicted quantity of ``kind`` with its unit (``3.19`` -> ``"3.19 Hz"``)."""
    unit = UNITS.get(kind, "")
    number = f"{value:.{digits}f}"
    if not unit:
        return number
    return f"{number}{unit}" if unit == "°" else f"{number} {unit}"


def observation_text(obs) -> str:
    """One observation in words: ``E3 aldaric acid (nitric acid): unknown: U1; optically active: no``.

    ``obs`` is any object with ``id``, ``KIND`` and ``SPECS`` (field specs with ``name``,
    ``unit`` and ``required``), as the observation types of the evidence layer have.
    """
    parts = []
    for spec in obs.SPECS:
        value = getattr(obs, spec.name)
        if value is None and not spec.required:
            continue
        unit = f" {spec.unit}" if spec.unit and value is not None else ""
        parts.append(f"{field_name(obs.KIND, spec.name)}: {value_text(value)}{unit}")
    return f"{obs.id} {kind_name(obs.KIND)}: {'; '.join(parts)}"


def conformation_html(label: str) -> str:
    """A conformation descriptor as HTML with its indices raised and lowered (``4C1`` -> 4 up, C, 1 down)."""
    match = re.fullmatch(r"([0-9O](?:,[0-9])?)([CBSEH])([0-9O](?:,[0-9])?)", label.strip())
    if match is None:
        return html.escape(label)
    up, letter, down = match.groups()
    return f"<sup>{html.escape(up)}</sup>{letter}<sub>{html.escape(down)}</sub>"


_SUPER = str.maketrans("0123456789", "⁰¹²³⁴⁵⁶⁷⁸⁹")
_SUB = str.maketrans("0123456789", "₀₁₂₃₄₅₆₇₈₉")


def conformation_text(text: str) -> str:
    """Plain text with every chair descriptor written with Unicode indices (``4C1`` -> ``⁴C₁``), for button labels."""
    return re.sub(
        r"\b([0-9])C([0-9])\b", lambda m: m.group(1).translate(_SUPER) + "C" + m.group(2).translate(_SUB), text
    )


def conformations_html(text: str) -> str:
    """Escape ``text`` for HTML and write every chair descriptor in it (``4C1``, ``1C4``, ``2C5``) with indices."""
    escaped = html.escape(text)
    return re.sub(r"\b([0-9])C([0-9])\b", r"<sup>\1</sup>C<sub>\2</sub>", escaped)
