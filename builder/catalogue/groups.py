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

import math
from collections import Counter
from collections.abc import Callable, Mapping
from typing import TYPE_CHECKING, Any

from builder.catalogue.formula import FormulaError, atoms_of, formula_text, molar_mass_kg_per_mol
from builder.catalogue.group_tables import GroupTable
from builder.catalogue.records import ComponentGroups, Source

if TYPE_CHECKING:  # the loader imports this module; the entry type is only annotated
    from builder.catalogue.loader import _Entry

__all__ = ["VARIANTS", "parse_groups"]

#: The model variants a component may give subgroups for, and what they are.
VARIANTS = {
    "unifac": "original UNIFAC (Fredenslund, Jones and Prausnitz 1975)",
    "dortmund": "modified UNIFAC (Dortmund) (Weidlich and Gmehling 1987)",
}

#: The group table of a variant (:func:`builder.catalogue.group_tables.group_tables`),
#: or None to skip the checks against the tables.
Tables = Callable[[str], GroupTable] | None

#: Largest difference allowed between the molar mass from the formula and the one
#: catalogued [kg/mol]: 0.02 g/mol covers the older and newer published atomic weights
#: (chlorine 35.453 before, 35.45 since the IUPAC 2011 table: 0.012 g/mol for CCl4).
MOLAR_MASS_TOLERANCE_KG_PER_MOL = 2e-5


def parse_groups(block: _Entry, load_source: Callable[[_Entry], Source | None],
                 tables: Tables = None, formula: str = "",
                 molar_mass_kg_per_mol_: float = math.nan) -> ComponentGroups | None:
    """Read one ``groups:`` block; record problems in the block's error list.

    ``load_source`` reads the block's ``source`` field (the loader's source reader).
    With ``tables``, every subgroup name must be in the variant's group table and the
    groups' atoms must add up to the component's ``formula``, whose molar mass (IUPAC
    atomic weights) must match the catalogued ``molar_mass_kg_per_mol_``.  Returns
    ``None`` when the block has problems.
    """
    variants: dict[str, dict[str, int] | None] = {}
    for variant in VARIANTS:
        raw = block.get(variant)
        table = tables(variant) if tables is not None else None
        counts = None if raw is None else _counts(block, variant, raw, table)
        if counts and table is not None and formula:
            _check_atoms(block, variant, counts, table, formula)
        variants[variant] = counts
    if tables is not None and formula and block.ok:
        _check_molar_mass(block, formula, molar_mass_kg_per_mol_)
    if block.ok and all(block.data.get(v) is None for v in VARIANTS):
        block.fail("", "subgroups for at least one of " + ", ".join(VARIANTS),
                   sorted(str(k) for k in block.data))
    source = load_source(block)
    block.finish()
    if not block.ok or source is None:
        return None
    return ComponentGroups(unifac=variants["unifac"], dortmund=variants["dortmund"],
                           source=source)


def _check_atoms(block: _Entry, variant: str, counts: Mapping[str, int], table: GroupTable,
                 formula: str) -> None:
    """The subgroups' atoms must add up to the component's formula."""
    total: Counter[str] = Counter()
    for name, count in counts.items():
        for element, n in table.subgroups[name].atoms.items():
            total[element] += n * count
    try:
        wanted = atoms_of(formula)
    except FormulaError as error:
        block.fail(variant, f"a readable component formula ({error})", formula)
        return
    if dict(total) != wanted:
        block.fail(variant, f"subgroups whose atoms add up to the formula {formula}",
                   f"{formula_text(total)} from {dict(counts)}")


def _check_molar_mass(block: _Entry, formula: str, catalogued_kg_per_mol: float) -> None:
    try:
        from_formula = molar_mass_kg_per_mol(atoms_of(formula))
    except FormulaError:
        return
    if math.isfinite(catalogued_kg_per_mol) and \
            abs(from_formula - catalogued_kg_per_mol) > MOLAR_MASS_TOLERANCE_KG_PER_MOL:
        block.fail("", f"a component whose molar mass matches its formula {formula} "
                   f"({from_formula * 1000:.3f} g/mol, IUPAC atomic weights)",
                   f"constants.molar_mass {catalogued_kg_per_mol * 1000:.3f} g/mol")


def _counts(block: _Entry, variant: str, raw: Any,
            table: GroupTable | None) -> dict[str, int] | None:
    expected = "a mapping of subgroup names to counts, such as {CH3: 1, CH2: 1, OH: 1}"
    if not isinstance(raw, Mapping) or not raw:
        block.fail(variant, expected, raw)
        return None
    names = frozenset(table.subgroups) if table is not None else None
    folded = {n.casefold(): n for n in names} if names else {}
    counts: dict[str, int] = {}
    problems = 0
    for key, value in raw.items():
        field = f"{variant}.{key}"
        if not isinstance(key, str) or not key.strip() or any(ch.isspace() for ch in key):
            block.fail(field, "a subgroup name without spaces, such as 'CH3' or 'OH(P)'", key)
            problems += 1
            continue
        if names is not None and key not in names:
            hint = folded.get(key.casefold())
            expected_name = (f"the subgroup name as spelled in the group tables ({hint!r})"
                             if hint else f"a subgroup of the {variant} group tables "
                             "(pairs/groups/)")
            block.fail(field, expected_name, key)
            problems += 1
            continue
        if isinstance(value, bool) or not isinstance(value, int) or value <= 0:
            block.fail(field, "a positive whole number of groups", value)
            problems += 1
            continue
        counts[key] = value
    return None if problems else counts
