"""The JSON Schema (draft 2020-12) of the project file, generated from the code that reads it.

Observation kinds come from their :class:`~workbench.evidence.observations.FieldSpec`
rows (the one description of each kind), unknowns and scopes from the
:class:`~workbench.evidence.project.Unknown` and
:class:`~workbench.chem.catalogue.Scope` dataclasses, so a kind or field
added there appears here without a second description. The schema checks
the form of a file; meaning (that a referenced unknown exists, that a sugar
name resolves, that a scope holds candidates) is checked by
``stereosieve validate``.
"""

from __future__ import annotations

import dataclasses
from typing import Any

from workbench.chem.catalogue import CARBON_RANGE, DEFAULT_SCOPE, Scope
from workbench.evidence.observations import _COMMON, OBSERVATION_TYPES, FieldSpec
from workbench.evidence.project import _TOP_KEYS, FORMAT, VERSION, Unknown

__all__ = ["SCHEMA_ID", "DIALECT", "KNOWN_TYPES", "project_schema", "field_schema"]

KNOWN_TYPES = ("unknown", "member", "members", "text", "choice", "bool", "int", "float", "positions", "numbers")
"""The FieldSpec types described exactly; any other type is accepted as any value until described here."""

DIALECT = "https://json-schema.org/draft/2020-12/schema"
SCHEMA_ID = "urn:stereosieve:project-file"

# ISO 8601 as the project file uses it: a date, optionally a time and a zone ("2025-01-20", "2025-01-20T14:05Z").
_ISO_8601 = r"^\d{4}-\d{2}-\d{2}([T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}(:?\d{2})?)?)?$"
_TEXT = {"type": "string", "pattern": r"\S"}
# An id is one line: no C0/C1 controls, DEL, bidirectional controls or line separators (escaping.line_breaker).
_ID = {
    "type": "string",
    "pattern": r"^(?=.*\S)[^\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069\u2028\u2029]+$",
}

_COMMON_FIELDS: dict[str, dict[str, Any]] = {
    "id": {**_ID, "description": "unique id of the observation, e.g. E1"},
    "kind": {"type": "string", "description": "the kind of evidence (one of the kinds below)"},
    "note": {"type": "string", "description": "free text"},
    "recorded": {"type": "string", "pattern": _ISO_8601, "description": "when it was recorded (ISO 8601)"},
    "by": {"type": "string", "description": "who recorded it"},
}


def field_schema(spec: FieldSpec) -> dict[str, Any]:
    """The schema of one observation field (optional fields may also be ``null``: the default applies)."""
    unit = f" ({spec.unit})" if spec.unit else ""
    out: dict[str, Any]
    if spec.type == "unknown":
        out = {**_TEXT, "description": f"{spec.doc}: an unknown's id"}
    elif spec.type == "member":
        out = {**_TEXT, "description": f"{spec.doc}: an unknown's id, a sugar name or a SMILES"}
    elif spec.type == "text":
        out = {**_TEXT, "description": spec.doc}
    elif spec.type == "choice":
        out = {"enum": list(spec.choices), "description": spec.doc}
    elif spec.type == "bool":
        out = {"type": "boolean", "description": spec.doc}
    elif spec.type in ("int", "float"):
        out = {"type": "integer" if spec.type == "int" else "number", "description": spec.doc + unit}
        if spec.minimum is not None:
            out["minimum"] = spec.minimum
        if spec.maximum is not None:
            out["maximum"] = spec.maximum
    elif spec.type == "members":
        out = {"type": "array", "items": _TEXT, "uniqueItems": True, "description": spec.doc}
        if spec.min_items:
            out["minItems"] = spec.min_items
        if spec.max_items:
            out["maxItems"] = spec.max_items
    elif spec.type == "positions":
        top = int(spec.maximum) if spec.maximum is not None else 9
        out = {
            "type": "array",
            "items": {"type": "integer", "minimum": 1, "maximum": top},
            "uniqueItems": True,
            "description": f"{spec.doc}: carbon numbers",
        }
        if spec.min_items:
            out["minItems"] = spec.min_items
    elif spec.type == "numbers":
        number: dict[str, Any] = {"type": "number"}
        if spec.minimum is not None:
            number["minimum"] = spec.minimum
        out = {"type": "array", "items": number, "minItems": 1, "description": spec.doc + unit}
    else:  # a FieldSpec type this generator does not know yet: accept any value rather than reject valid files
        out = {"description": f"{spec.doc} ({spec.type})"}
    if not spec.required:
        if spec.default is not None:
            out["default"] = spec.default
        out = {"anyOf": [out, {"type": "null"}], "description": out.get("description", "")}
    return out


def _observation_schema(kind: str) -> dict[str, Any]:
    cls = OBSERVATION_TYPES[kind]
    properties: dict[str, Any] = {name: _COMMON_FIELDS.get(name, {}) for name in _COMMON}
    properties["kind"] = {"const": kind}
    for spec in cls.SPECS:
        properties[spec.name] = field_schema(spec)
    required = ["id", "kind"] + [s.name for s in cls.SPECS if s.required]
    return {
        "title": kind,
        "description": cls.TITLE,
        "type": "object",
        "properties": properties,
        "required": required,
        "additionalProperties": False,
    }


def _value_schema(default: Any, annotation: object = "") -> dict[str, Any]:
    """A schema from a dataclass field's default and annotation (for scope and unknown fields added later)."""
    text = str(annotation).replace(" ", "")
    for python, json_type in (("str", "string"), ("int", "integer"), ("float", "number")):
        if text.startswith(f"tuple[{python},"):
            return {"type": "array", "items": {"type": json_type}}
    if isinstance(default, bool):
        return {"type": "boolean"}
    if isinstance(default, int):
        return {"type": "integer"}
    if isinstance(default, float):
        return {"type": "number"}
    if isinstance(default, str):
        return {"type": "string"}
    if isinstance(default, tuple):
        return {"type": "array"}
    return {}


def _scope_schema() -> dict[str, Any]:
    known: dict[str, Any] = {
        "carbons": {
            "type": "array",
            "minItems": 1,
            "items": {"type": "integer", "minimum": CARBON_RANGE.start, "maximum": CARBON_RANGE.stop - 1},
            "description": "chain lengths",
        },
        "carbonyl": {"type": "array", "minItems": 1, "items": {"enum": ["aldose", "ketose"]}},
        "series": {
            "type": "array",
            "minItems": 1,
            "items": {"enum": ["D", "L"]},
            "description": "D/L from the highest-numbered stereocentre (L-glycero-D-manno-heptose is L)",
        },
        "modifications": {
            "type": "array",
            "minItems": 1,
            "items": _TEXT,
            "description": "none, any, uronic, deoxy:N[,M], amino:N, acetamido:N, omethyl:N, or several joined with '+'",
        },
        "sugars": {"type": "array", "items": _TEXT, "description": "sugar names; the candidates are these sugars"},
    }
    residue_keys: dict[str, Any] = {  # residue unknowns (Contract 5)
        "ring": {"type": "array", "minItems": 1, "items": {"enum": ["pyranose", "furanose"]}},
        "anomer": {"type": "array", "minItems": 1, "items": {"enum": ["alpha", "beta"]}},
        "max_linked": {"type": "integer", "minimum": 0, "maximum": 4, "description": "residue unknowns only"},
    }
    properties = {}
    for f in dataclasses.fields(Scope):
        if f.name.startswith("_") or not f.init:
            continue
        properties[f.name] = known.get(f.name) or _value_schema(getattr(DEFAULT_SCOPE, f.name), f.type)
    properties.update(residue_keys)
    return {
        "type": "object",
        "properties": properties,
        "additionalProperties": False,
        "description": "what the unknown may be; every key optional",
    }


def _unknown_schema() -> dict[str, Any]:
    properties: dict[str, Any] = {}
    for f in dataclasses.fields(Unknown):
        if not f.init or not f.compare:
            continue
        if f.name == "id":
            properties["id"] = {**_ID, "description": "unique id of the unknown, e.g. U1"}
        elif f.name == "label":
            properties["label"] = {"type": "string", "description": "free text"}
        elif f.name == "scope":
            properties["scope"] = {"$ref": "#/$defs/scope"}
        elif f.name == "type":
            properties["type"] = {"enum": ["monosaccharide", "residue"], "description": "residue: a glycan residue"}
        else:
            default = f.default if f.default is not dataclasses.MISSING else None
            properties[f.name] = _value_schema(default, f.type)
    return {"type": "object", "properties": properties, "required": ["id"], "additionalProperties": False}


def project_schema() -> dict[str, Any]:
    """The JSON Schema of a stereosieve project file (Contract 1 of DESIGN.md and the kinds added since)."""
    kinds = list(OBSERVATION_TYPES)
    defs: dict[str, Any] = {"scope": _scope_schema(), "unknown": _unknown_schema()}
    for kind in kinds:
        defs[f"observation_{kind}"] = _observation_schema(kind)
    observation = {
        "type": "object",
        "required": ["id", "kind"],
        "properties": {"kind": {"enum": kinds}},
        "allOf": [
            {
                "if": {"properties": {"kind": {"const": kind}}, "required": ["kind"]},
                "then": {"$ref": f"#/$defs/observation_{kind}"},
            }
            for kind in kinds
        ],
    }
    defs["observation"] = observation
    properties: dict[str, Any] = {
        "format": {"const": FORMAT},
        "version": {"type": "integer", "minimum": 1, "maximum": VERSION},
        "title": {"type": "string"},
        "unknowns": {"type": "array", "minItems": 1, "items": {"$ref": "#/$defs/unknown"}},
        "observations": {"type": "array", "items": {"$ref": "#/$defs/observation"}},
    }
    for key in sorted(_TOP_KEYS - set(properties)):
        properties[key] = {}
    return {
        "$schema": DIALECT,
        "$id": SCHEMA_ID,
        "title": "stereosieve project file",
        "description": (
            "Unknown sugars with their scopes and the evidence recorded about them. The schema checks the form; "
            "'stereosieve validate' also checks that references resolve and scopes hold candidates."
        ),
        "type": "object",
        "required": ["format", "version", "unknowns"],
        "properties": properties,
        "additionalProperties": False,
        "$defs": defs,
    }
