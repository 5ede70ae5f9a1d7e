"""Starting files for a new component or pair, generated from the field declarations.

``atlas new component NAME`` and ``atlas new pair A B`` write a file with every
required field, its unit and its source block in place.  Every value still to be
found in the literature reads ``<fill in ...>``, which the loader refuses with a
located message (file, entry, field, what is expected), so the file fails
``atlas check`` until each value is filled in from its source.
"""

from __future__ import annotations

import json
from collections.abc import Mapping
from typing import Any

from builder.catalogue.fields import COMPONENT, PAIR, Block, Field
from builder.catalogue.schema import modeline

__all__ = ["FILL", "component_scaffold", "pair_scaffold"]

FILL = "<fill in"

_UNIT_EXAMPLE = {"temperature": "K", "pressure": "kPa", "molar_energy": "J/mol",
                 "molar_mass": "g/mol", "molar_volume": "cm3/mol"}


def _q(text: str) -> str:
    return json.dumps(text, ensure_ascii=False)  # a double-quoted YAML scalar


def _value(spec: Field) -> str:
    what = f"{FILL}: {spec.help}>" if spec.help else f"{FILL}>"
    if spec.kind == "quantity":
        return _q(f"{FILL}> {_UNIT_EXAMPLE[spec.dimension]}")
    if spec.kind == "range":
        unit = _UNIT_EXAMPLE[spec.dimension]
        return f"[{_q(f'{FILL}> {unit}')}, {_q(f'{FILL}> {unit}')}]"
    if spec.kind == "choice":
        return _q(f"{FILL}: one of {', '.join(spec.choices)}>")
    if spec.kind in ("texts", "blocks", "quantities"):
        return "[]"
    return _q(what)


def _lines(block: Block, preset: Mapping[str, Any], variant: str, indent: int) -> list[str]:
    pad = " " * indent
    out: list[str] = []
    fields = list(block.fields) + list(block.variants.get(variant, ()))
    chosen_group = block.one_of[0] if block.one_of else ()
    for spec in fields:
        wanted = spec.required or spec.name in preset or spec.name in chosen_group
        if not wanted:
            continue
        given = preset.get(spec.name)
        if spec.kind == "block":
            assert spec.block is not None
            sub = given if isinstance(given, Mapping) else {}
            sub_variant = (str(sub.get(spec.block.selector, "")).split("#")[0].strip()
                           if spec.block.selector else "")
            out.append(f"{pad}{spec.name}:")
            out += _lines(spec.block, sub, sub_variant, indent + 2)
        elif given is not None:
            out.append(f"{pad}{spec.name}: {given}")
        else:
            out.append(f"{pad}{spec.name}: {_value(spec)}")
    return out


def _source_note(kind: str) -> str:
    return (f"# New {kind}: replace every '{FILL} ...>' with the published value and its "
            "unit,\n# and name the publication each number comes from in the source blocks "
            "(ref: the id of a\n# file in references/; where: table and page).  Then run "
            "'atlas check'.")


def component_scaffold(cid: str, name: str) -> str:
    """The text of ``components/<cid>.yaml`` for a new component."""
    preset = {"id": cid, "name": _q(name),
              "vapour_pressure": {"equation": "antoine  # or dippr101"}}
    lines = [modeline("components"), _source_note("component"),
             *_lines(COMPONENT, preset, "", 0)]
    return "\n".join(lines) + "\n"


def pair_scaffold(first: str, second: str) -> str:
    """The text of ``binaries/<first>--<second>.yaml`` for a new pair."""
    preset = {
        "id": f"{first}--{second}", "components": f"[{first}, {second}]",
        "activity": {"model": "nrtl  # or ideal, margules, van-laar, wilson, uniquac"},
        "publish": {"isobars": "[101.325 kPa]"},
        "recorded": {"azeotropes": "[]  # published azeotropes, each with P, T, x1, kind, "
                                   "source", "zeotropic_at": "[]"},
    }
    lines = [modeline("binaries"), _source_note("pair"), *_lines(PAIR, preset, "", 0)]
    return "\n".join(lines) + "\n"
