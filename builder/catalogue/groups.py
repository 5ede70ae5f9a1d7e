"""The ``groups:`` block of a component file: its UNIFAC subgroups, per model variant.

Format (see ``DEVELOPERS.md``)::

    groups:
      unifac: {CH3: 1, CH2: 1, OH: 1}
      dortmund: {CH3: 1, CH2: 1, "OH(P)": 1}
      source: {ref: hansen-1991, where: "Table 1 (subgroup definitions)",
               note: "assigned by structure from the published group definitions
                      (common practice)"}

Either variant may be left out where the published tables have no groups for the
substance, but not both.  Counts are positive whole numbers; subgroup names are
spelled as in the group tables (``pairs/groups/``), e.g. ``CH3``, ``ACH``,
``CH3COO``, ``"OH(P)"``.  Every problem is recorded in the loader's error list
with the file, the entry and the field (``groups.dortmund.OH``).
"""

from __future__ import annotations

from collections.abc import Callable, Mapping
from typing import TYPE_CHECKING, Any

from builder.catalogue.records import ComponentGroups, Source

if TYPE_CHECKING:  # the loader imports this module; the entry type is only annotated
    from builder.catalogue.loader import _Entry

__all__ = ["VARIANTS", "parse_groups"]

#: The model variants a component may give subgroups for, and what they are.
VARIANTS = {
    "unifac": "original UNIFAC (Fredenslund, Jones and Prausnitz 1975)",
    "dortmund": "modified UNIFAC (Dortmund) (Weidlich and Gmehling 1987)",
}

#: Known subgroup names per variant, or None to skip the name check (set by the
#: group tables once they are loaded: :func:`builder.thermo.group_tables.subgroup_names`).
KnownNames = Callable[[str], frozenset[str]] | None


def parse_groups(block: _Entry, load_source: Callable[[_Entry], Source | None],
                 known: KnownNames = None) -> ComponentGroups | None:
    """Read one ``groups:`` block; record problems in the block's error list.

    ``load_source`` reads the block's ``source`` field (the loader's source reader);
    ``known(variant)`` gives the subgroup names of the group tables, for the check that
    every name exists.  Returns ``None`` when the block has problems.
    """
    variants: dict[str, dict[str, int] | None] = {}
    for variant in VARIANTS:
        raw = block.raw(variant, None)
        variants[variant] = None if raw is None else _counts(block, variant, raw, known)
    if block.ok and all(block.data.get(v) is None for v in VARIANTS):
        block.fail("", "subgroups for at least one of " + ", ".join(VARIANTS),
                   sorted(str(k) for k in block.data))
    source = load_source(block)
    block.finish()
    if not block.ok or source is None:
        return None
    return ComponentGroups(unifac=variants["unifac"], dortmund=variants["dortmund"],
                           source=source)


def _counts(block: _Entry, variant: str, raw: Any, known: KnownNames) -> dict[str, int] | None:
    expected = "a mapping of subgroup names to counts, such as {CH3: 1, CH2: 1, OH: 1}"
    if not isinstance(raw, Mapping) or not raw:
        block.fail(variant, expected, raw)
        return None
    names = known(variant) if known is not None else None
    folded = {n.casefold(): n for n in names} if names else {}
    counts: dict[str, int] = {}
    for key, value in raw.items():
        field = f"{variant}.{key}"
        if not isinstance(key, str) or not key.strip() or any(ch.isspace() for ch in key):
            block.fail(field, "a subgroup name without spaces, such as 'CH3' or 'OH(P)'", key)
            continue
        if names is not None and key not in names:
            hint = folded.get(key.casefold())
            expected_name = (f"the subgroup name as spelled in the group tables ({hint!r})"
                             if hint else f"a subgroup of the {variant} group tables "
                             "(pairs/groups/)")
            block.fail(field, expected_name, key)
            continue
        if isinstance(value, bool) or not isinstance(value, int) or value <= 0:
            block.fail(field, "a positive whole number of groups", value)
            continue
        counts[key] = value
    return counts
