"""Chemical formulas: atom counts and molar mass, for the group-assignment checks.

A formula is written the usual way, element symbols with counts and optional
parenthesised parts: ``C2H6O``, ``CHCl3``, ``HCON(CH2)2``.  The molar mass uses the
IUPAC standard atomic weights (conventional values, IUPAC Commission on Isotopic
Abundances and Atomic Weights, 2021 table; common practice).
"""

from __future__ import annotations

import re
from collections import Counter
from collections.abc import Mapping

__all__ = ["ATOMIC_WEIGHTS_G_PER_MOL", "FormulaError", "atoms_of", "formula_text",
           "molar_mass_kg_per_mol"]

#: Conventional standard atomic weights [g/mol] (IUPAC 2021; common practice).
ATOMIC_WEIGHTS_G_PER_MOL: dict[str, float] = {
    "H": 1.008, "B": 10.81, "C": 12.011, "N": 14.007, "O": 15.999, "F": 18.998403162,
    "Si": 28.085, "P": 30.973761998, "S": 32.06, "Cl": 35.45, "Br": 79.904,
    "I": 126.90447,
}

_TOKEN = re.compile(r"([A-Z][a-z]?)(\d*)|(\()|(\))(\d*)")


class FormulaError(ValueError):
    """A formula that cannot be read (unknown element, unbalanced parentheses)."""


def atoms_of(formula: str) -> dict[str, int]:
    """Atom counts of a formula.

    >>> atoms_of("C2H6O")
    {'C': 2, 'H': 6, 'O': 1}
    >>> atoms_of("HCON(CH2)2")
    {'H': 5, 'C': 3, 'O': 1, 'N': 1}
    """
    stack: list[Counter[str]] = [Counter()]
    position = 0
    while position < len(formula):
        match = _TOKEN.match(formula, position)
        if match is None:
            raise FormulaError(f"cannot read {formula!r} at {formula[position:]!r}")
        element, count, opening, closing, group_count = match.groups()
        if element:
            if element not in ATOMIC_WEIGHTS_G_PER_MOL:
                raise FormulaError(f"unknown element {element!r} in {formula!r}")
            stack[-1][element] += int(count or 1)
        elif opening:
            stack.append(Counter())
        elif closing:
            if len(stack) == 1:
                raise FormulaError(f"unbalanced ')' in {formula!r}")
            inner = stack.pop()
            for key, value in inner.items():
                stack[-1][key] += value * int(group_count or 1)
        position = match.end()
    if len(stack) != 1 or not stack[0]:
        raise FormulaError(f"unbalanced or empty formula {formula!r}")
    return dict(stack[0])


def formula_text(atoms: Mapping[str, int]) -> str:
    """Hill-order formula text (C, H, then alphabetical).

    >>> formula_text({"O": 1, "H": 6, "C": 2})
    'C2H6O'
    """
    order = sorted(atoms, key=lambda e: (0 if e == "C" else 1 if e == "H" else 2, e))
    if "C" not in atoms:
        order = sorted(atoms)
    return "".join(f"{e}{atoms[e] if atoms[e] != 1 else ''}" for e in order if atoms[e])


def molar_mass_kg_per_mol(atoms: Mapping[str, int]) -> float:
    """Molar mass [kg/mol] from atom counts.

    >>> round(molar_mass_kg_per_mol(atoms_of("C2H6O")) * 1000, 3)  # ethanol, 46.069 g/mol
    46.069
    """
    return sum(ATOMIC_WEIGHTS_G_PER_MOL[e] * n for e, n in atoms.items()) / 1000.0
