"""JSON Schema of the catalogue files, generated from the loader's field declarations.

One source of truth: :mod:`builder.catalogue.fields` declares every field, and
both the loader and this schema are derived from it.  ``atlas schema`` writes
the three schemas to ``pairs/schema/``; each catalogue file names its schema in
its first line, the ``yaml-language-server`` comment convention that common
editors (through the YAML language server) use to validate and complete while
typing::

    # yaml-language-server: $schema=../schema/pair.schema.json

What the schema cannot say (it is checked by the loader alone): the value and
range of a number written with its unit inside a string, a CAS check digit,
ids that must match file names and other files, and cross-field rules
(boiling point below the critical point, a correlation sound over its range), and UNIFAC
subgroup names and their atom balance against the group tables.
"""

from __future__ import annotations

import json
import re
from pathlib import Path
from typing import Any

from builder.catalogue.fields import BLOCKS, Block, Field
from builder.thermo.units import UNITS

__all__ = ["SCHEMA_FILES", "SCHEMA_FOLDER", "catalogue_schemas", "modeline", "write_schemas"]

#: Folder (inside the catalogue) and file name of each kind's schema.
SCHEMA_FOLDER = "schema"
SCHEMA_FILES = {"references": "reference.schema.json", "components": "component.schema.json",
                "binaries": "pair.schema.json"}
_TITLES = {"references": "VLE atlas reference file", "components": "VLE atlas component file",
           "binaries": "VLE atlas pair file"}

_NUMBER = r"[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?"


def modeline(folder: str) -> str:
    """The first line of a catalogue file in ``folder``, naming its schema."""
    return f"# yaml-language-server: $schema=../{SCHEMA_FOLDER}/{SCHEMA_FILES[folder]}"


def _quantity(dimension: str) -> dict[str, Any]:
    units = "|".join(re.escape(u) for u in sorted(UNITS[dimension], key=len, reverse=True))
    examples = {"temperature": "351.4 K", "pressure": "101.325 kPa",
                "molar_energy": "-57.96 cal/mol", "molar_mass": "46.07 g/mol",
                "molar_volume": "58.7 cm3/mol"}
    return {"type": "string", "pattern": rf"^\s*{_NUMBER}\s*({units})\s*$",
            "examples": [examples[dimension]]}


def _bounds(spec: Field) -> dict[str, Any]:
    out: dict[str, Any] = {}
    if spec.minimum is not None:
        out["exclusiveMinimum" if spec.exclusive else "minimum"] = spec.minimum
    if spec.maximum is not None:
        out["exclusiveMaximum" if spec.exclusive else "maximum"] = spec.maximum
    return out


_TEXT = {"type": "string", "pattern": r"\S"}


def _field_schema(spec: Field) -> dict[str, Any]:
    kind = spec.kind
    schema: dict[str, Any]
    if kind in ("text", "slug"):
        schema = ({"type": "string", "pattern": spec.pattern} if spec.pattern else dict(_TEXT))
        if kind == "slug" and not spec.pattern:
            schema["pattern"] = r"^[a-z0-9]+(?:-[a-z0-9]+)*$"
    elif kind in ("number", "integer"):
        schema = {"type": kind, **_bounds(spec)}
    elif kind == "quantity":
        schema = _quantity(spec.dimension)
    elif kind == "coefficient":
        schema = {"type": "string",
                  "pattern": rf"^\s*{_NUMBER}\s*{re.escape(spec.unit)}\s*$"}
    elif kind == "choice":
        schema = {"type": "string", "enum": list(spec.choices)}
    elif kind == "boolean":
        schema = {"type": "boolean"}
    elif kind == "texts":
        schema = {"type": "array", "items": dict(_TEXT)}
        if spec.min_items:
            schema["minItems"] = spec.min_items
        if spec.max_items is not None:
            schema["maxItems"] = spec.max_items
        if spec.unique:
            schema["uniqueItems"] = True
    elif kind == "label":
        schema = {"anyOf": [dict(_TEXT), {"type": "number"}]}
    elif kind == "tfunction":
        assert spec.block is not None
        inner = block_schema(spec.block)
        inner["properties"]["a"] = {**inner["properties"]["a"], **_bounds(spec)}
        schema = {"anyOf": [{"type": "number", **_bounds(spec)}, inner]}
    elif kind == "range":
        schema = {"type": "array", "items": _quantity(spec.dimension), "minItems": 2,
                  "maxItems": 2}
    elif kind == "quantities":
        schema = {"type": "array", "items": _quantity(spec.dimension)}
    elif kind == "counts":
        # The names are checked against the group tables by the loader alone.
        schema = {"type": "object", "minProperties": 1,
                  "propertyNames": {"pattern": r"^\S+$"},
                  "additionalProperties": {"type": "integer", "minimum": 1}}
    elif kind == "block":
        assert spec.block is not None
        schema = block_schema(spec.block)
    else:  # blocks
        assert spec.block is not None
        schema = {"type": "array", "items": block_schema(spec.block)}
    if spec.sourced:
        from builder.catalogue.fields import SOURCE

        schema = {"anyOf": [schema, {
            "type": "object", "additionalProperties": False, "required": ["value", "source"],
            "properties": {"value": schema, "source": block_schema(SOURCE)}}]}
    if spec.help:
        schema = {"description": spec.help, **schema}
    return schema


def _nullable(schema: dict[str, Any]) -> dict[str, Any]:
    """An optional field may be left empty in YAML (``notes:``), which reads as null."""
    return {**{k: v for k, v in schema.items() if k == "description"},
            "anyOf": [{k: v for k, v in schema.items() if k != "description"},
                      {"type": "null"}]}


def _properties(fields: tuple[Field, ...], block: Block) -> dict[str, Any]:
    grouped = {name for group in block.one_of for name in group}
    out: dict[str, Any] = {}
    for spec in fields:
        schema = _field_schema(spec)
        out[spec.name] = schema if spec.required or spec.name in grouped else _nullable(schema)
    return out


def block_schema(block: Block) -> dict[str, Any]:
    """The JSON Schema of one mapping of a catalogue file."""
    properties = _properties(block.fields, block)
    schema: dict[str, Any] = {"type": "object", "additionalProperties": False}
    if block.help:
        schema["description"] = block.help
    required = [f.name for f in block.fields if f.required]
    variant_names = sorted({f.name for fs in block.variants.values() for f in fs})
    for name in variant_names:
        properties.setdefault(name, {})
    schema["properties"] = properties
    if required:
        schema["required"] = required
    rules: list[dict[str, Any]] = []
    for value, fields in block.variants.items():
        own = {f.name for f in fields}
        then: dict[str, Any] = {"properties": _properties(fields, block)}
        needed = [f.name for f in fields if f.required]
        if needed:
            then["required"] = needed
        others = [n for n in variant_names if n not in own]
        if others:
            then["not"] = {"anyOf": [{"required": [n]} for n in others]}
        rules.append({"if": {"properties": {block.selector: {"const": value}},
                             "required": [block.selector]}, "then": then})
    if block.one_of:
        every = [n for group in block.one_of for n in group]
        schema["oneOf"] = [
            {"required": list(group),
             "not": {"anyOf": [{"required": [n]} for n in every if n not in group]}}
            for group in block.one_of]
    if rules:
        schema["allOf"] = rules
    return schema


def catalogue_schemas() -> dict[str, dict[str, Any]]:
    """The schema of each kind of file, keyed by its file name in ``pairs/schema/``."""
    out = {}
    for folder, block in BLOCKS.items():
        schema = block_schema(block)
        out[SCHEMA_FILES[folder]] = {
            "$schema": "https://json-schema.org/draft/2020-12/schema",
            "title": _TITLES[folder],
            "$comment": "Generated by 'atlas schema' from builder/catalogue/fields.py; "
                        "do not edit by hand.",
            **schema,
        }
    return out


def render(schema: dict[str, Any]) -> str:
    return json.dumps(schema, indent=2, ensure_ascii=False) + "\n"


def write_schemas(catalogue: Path, check: bool = False) -> list[Path]:
    """Write the schemas into ``catalogue/schema/``; with ``check``, write nothing and
    return the files that are missing or differ."""
    folder = catalogue / SCHEMA_FOLDER
    stale: list[Path] = []
    for name, schema in catalogue_schemas().items():
        path = folder / name
        text = render(schema)
        current = path.read_text(encoding="utf-8") if path.is_file() else None
        if current != text:
            stale.append(path)
            if not check:
                folder.mkdir(parents=True, exist_ok=True)
                path.write_text(text, encoding="utf-8")
    return stale
