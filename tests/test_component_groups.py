"""Every component's UNIFAC groups: present, atom-balanced, and as published.

References: the atom balance against each component's formula and molar mass (IUPAC
standard atomic weights; common practice); the DDBST group assignments as tabulated in
the ``thermo`` package (UNIFAC_group_assignment_DDBST), an independent assignment; and
group assignments of the published worked examples (from memory; verify).
"""

from __future__ import annotations

from collections import Counter

import pytest

from builder.catalogue.formula import atoms_of, molar_mass_kg_per_mol
from builder.catalogue.group_tables import group_tables
from builder.catalogue.loader import Catalogue

thermo_unifac = pytest.importorskip("thermo.unifac")

#: Assignments printed in worked examples of the published UNIFAC papers and textbooks
#: (from memory; verify): Fredenslund, Jones and Prausnitz 1975 and Poling, Prausnitz and
#: O'Connell 2001, chapter 8 (acetone, n-pentane, ethanol, benzene, water); Weidlich and
#: Gmehling 1987 (cyclic CH2 for cyclohexane; primary, secondary and tertiary OH).
WORKED_EXAMPLES = {
    ("acetone", "unifac"): {"CH3": 1, "CH3CO": 1},
    ("n-pentane", "unifac"): {"CH3": 2, "CH2": 3},
    ("ethanol", "unifac"): {"CH3": 1, "CH2": 1, "OH": 1},
    ("benzene", "unifac"): {"ACH": 6},
    ("water", "unifac"): {"H2O": 1},
    ("toluene", "unifac"): {"ACH": 5, "ACCH3": 1},
    ("cyclohexane", "dortmund"): {"CY-CH2": 6},
    ("2-propanol", "dortmund"): {"CH3": 2, "CH": 1, "OH(S)": 1},
    ("tert-butanol", "dortmund"): {"CH3": 3, "C": 1, "OH(T)": 1},
    ("methanol", "dortmund"): {"CH3OH": 1},
}


@pytest.mark.parametrize("variant", ["unifac", "dortmund"])
def test_every_component_has_groups_that_add_up(catalogue: Catalogue, variant: str) -> None:
    table = group_tables(variant)
    for component in catalogue.components.values():
        assert component.groups is not None, component.id
        groups = component.groups.of(variant)
        assert groups, f"{component.id}: no {variant} groups"
        total: Counter[str] = Counter()
        for name, count in groups.items():
            for element, n in table.subgroups[name].atoms.items():
                total[element] += n * count
        assert dict(total) == atoms_of(component.formula), component.id
        # 0.02 g/mol: older and newer published atomic weights (Cl 35.453 / 35.45).
        assert molar_mass_kg_per_mol(total) == pytest.approx(
            component.molar_mass_kg_per_mol, abs=2e-5), component.id


@pytest.mark.parametrize("variant", ["unifac", "dortmund"])
def test_assignments_agree_with_the_ddbst_assignments(catalogue: Catalogue,
                                                      variant: str) -> None:
    table = group_tables(variant)
    by_number = {s.number: s.name for s in table.subgroups.values()}
    kind = "UNIFAC" if variant == "unifac" else "MODIFIED_UNIFAC"
    compared = 0
    for component in catalogue.components.values():
        reference = thermo_unifac.UNIFAC_group_assignment_DDBST(component.cas, kind)
        if not reference:
            continue
        compared += 1
        assert component.groups is not None
        assert component.groups.of(variant) == {by_number[k]: v for k, v in reference.items()}, \
            component.id
    assert compared >= 40


def test_worked_example_assignments(catalogue: Catalogue) -> None:
    for (cid, variant), expected in WORKED_EXAMPLES.items():
        groups = catalogue.components[cid].groups
        assert groups is not None and groups.of(variant) == expected, (cid, variant)
