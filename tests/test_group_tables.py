"""The UNIFAC group tables in pairs/groups/: complete, strictly read, atoms right.

References: the thermo package (UFSG, UFIP, DOUFSG, DOUFIP2006 of thermo.unifac), an
independent electronic copy of the published tables (Hansen et al. 1991; Wittig et al.
2003; Weidlich and Gmehling 1987; Gmehling et al. 1993, 1998, 2002; Jakob et al. 2006);
subgroup atoms from the subgroup names and the published group definitions (common
practice, tests/group_names.py).
"""

from __future__ import annotations

import shutil
from pathlib import Path

import pytest

from builder.catalogue.group_tables import DEFAULT_GROUPS, group_tables, load_group_table
from builder.catalogue.loader import DEFAULT_CATALOGUE
from builder.errors import CatalogueErrors
from tests.group_names import group_atoms

thermo_unifac = pytest.importorskip("thermo.unifac")

#: Where the thermo package's atom counts disagree with the group's structure: the
#: Dortmund amide group CONHCH3 (-CO-NH-CH3) has four hydrogens, thermo 0.6.1 lists 3;
#: the Dortmund THF group is the ring CH2-O-CH2 (C2H4O: tetrahydrofuran = 2 CY-CH2 +
#: 1 THF in the DDBST assignments), thermo lists the CH2O of original UNIFAC.
THERMO_ATOM_SLIPS = {("dortmund", "CONHCH3"), ("dortmund", "THF")}


@pytest.mark.parametrize("variant", ["unifac", "dortmund"])
def test_tables_match_the_thermo_package(variant: str) -> None:
    table = group_tables(variant)
    subgroups = thermo_unifac.UFSG if variant == "unifac" else thermo_unifac.DOUFSG
    params = thermo_unifac.UFIP if variant == "unifac" else thermo_unifac.DOUFIP2006
    assert len(table.subgroups) > 100 and len(table.interactions) > 1200
    for sub in table.subgroups.values():
        ref = subgroups[sub.number]
        assert (sub.R, sub.Q, sub.main_group) == (ref.R, ref.Q, ref.main_group_id), sub.name
    for (m, n), values in table.interactions.items():
        expected = params[m][n]
        assert values == (tuple(expected) if variant == "dortmund" else (expected,)), (m, n)
    # Every published pair among the kept main groups is in the file.
    kept = set(table.main_groups)
    count = sum(1 for m in params for n in params[m] if m in kept and n in kept and m != n)
    assert count == len(table.interactions)


@pytest.mark.parametrize("variant", ["unifac", "dortmund"])
def test_subgroup_atoms_follow_from_the_names(variant: str) -> None:
    table = group_tables(variant)
    subgroups = thermo_unifac.UFSG if variant == "unifac" else thermo_unifac.DOUFSG
    for sub in table.subgroups.values():
        assert sub.atoms == group_atoms(sub.name, variant), sub.name
        thermo_atoms = {k: v for k, v in subgroups[sub.number].atoms.items() if v}
        if (variant, sub.name) in THERMO_ATOM_SLIPS:
            assert thermo_atoms != sub.atoms
        else:
            assert thermo_atoms == sub.atoms, sub.name


def test_every_table_names_its_sources() -> None:
    references = {p.stem for p in (DEFAULT_CATALOGUE / "references").glob("*.yaml")}
    for variant in ("unifac", "dortmund"):
        table = group_tables(variant)
        assert len(table.sources) >= 3
        assert {s.ref for s in table.sources} <= references
        assert "thermo" in table.transcription  # the transcription route is a note


def test_missing_interactions_are_reported_not_zero() -> None:
    table = group_tables("unifac")
    # Main groups 7 (H2O) and 45 (CCLF, the chlorofluorocarbons) have no published
    # parameter in original UNIFAC (the thermo package's table has none either).
    assert (7, 45) not in table.interactions and 45 not in thermo_unifac.UFIP.get(7, {})
    assert table.missing_interactions({1, 7, 45}) == [(7, 45)]


@pytest.fixture
def scratch(tmp_path: Path) -> Path:
    folder = tmp_path / "groups"
    shutil.copytree(DEFAULT_GROUPS, folder)
    return folder


def _edit(path: Path, old: str, new: str) -> None:
    text = path.read_text(encoding="utf-8")
    assert old in text
    path.write_text(text.replace(old, new, 1), encoding="utf-8")


def test_bad_subgroup_row_is_located(scratch: Path) -> None:
    _edit(scratch / "unifac-subgroups.yaml", "0.9011    0.848  CH3", "0.9011    0.848  CX3")
    with pytest.raises(CatalogueErrors) as caught:
        load_group_table(scratch, "unifac")
    (problem,) = caught.value.errors
    assert problem.file.endswith("unifac-subgroups.yaml")
    assert problem.entry == "CH3" and problem.field == "atoms" and "CX3" in problem.found


def test_bad_interaction_row_is_located(scratch: Path) -> None:
    path = scratch / "dortmund-interactions.yaml"
    lines = path.read_text(encoding="utf-8").splitlines()
    index = next(i for i, line in enumerate(lines) if line.split()[:2] == ["1", "7"])
    lines[index] = lines[index] + " 9.9"
    path.write_text("\n".join(lines) + "\n", encoding="utf-8")
    with pytest.raises(CatalogueErrors) as caught:
        load_group_table(scratch, "dortmund")
    (problem,) = caught.value.errors
    assert problem.entry.startswith("parameters line") and "5 numbers" in problem.expected


def test_unknown_main_group_in_a_row_is_located(scratch: Path) -> None:
    with (scratch / "unifac-interactions.yaml").open("a", encoding="utf-8") as handle:
        handle.write("  1 99 12.5\n")
    with pytest.raises(CatalogueErrors) as caught:
        load_group_table(scratch, "unifac")
    (problem,) = caught.value.errors
    assert problem.field == "m, n" and "1 99" in problem.found
