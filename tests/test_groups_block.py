"""The ``groups:`` block of component files: UNIFAC subgroups per variant, strictly read.

Reference: the block format in DEVELOPERS.md (project convention); subgroup names as
printed in the published UNIFAC tables (Hansen et al. 1991; Gmehling et al. 1993).
"""

from __future__ import annotations

import shutil
from pathlib import Path

import pytest

from builder.catalogue.loader import DEFAULT_CATALOGUE, load_catalogue
from builder.errors import CatalogueErrors

ETHANOL_GROUPS = """groups:
  unifac: {CH3: 1, CH2: 1, OH: 1}
  dortmund: {CH3: 1, CH2: 1, "OH(P)": 1}
  source: {ref: hansen-1991, where: "Table 1", note: "assigned by structure"}
"""


@pytest.fixture
def scratch(tmp_path: Path) -> Path:
    root = tmp_path / "pairs"
    shutil.copytree(DEFAULT_CATALOGUE / "references", root / "references")
    (root / "components").mkdir()
    (root / "binaries").mkdir()
    shutil.copy(DEFAULT_CATALOGUE / "components" / "ethanol.yaml", root / "components")
    return root


def _set_groups(root: Path, block: str) -> None:
    path = root / "components" / "ethanol.yaml"
    lines = [line for line in path.read_text(encoding="utf-8").splitlines(keepends=True)]
    start = next((i for i, line in enumerate(lines) if line.startswith("groups:")), None)
    if start is not None:  # drop an existing block (the shipped file may carry one)
        end = start + 1
        while end < len(lines) and lines[end].startswith(" "):
            end += 1
        del lines[start:end]
    path.write_text("".join(lines) + block, encoding="utf-8")


def _problems(root: Path) -> list[str]:
    with pytest.raises(CatalogueErrors) as caught:
        load_catalogue(root)
    return [str(e) for e in caught.value.errors]


def test_groups_block_is_read(scratch: Path) -> None:
    _set_groups(scratch, ETHANOL_GROUPS)
    groups = load_catalogue(scratch).components["ethanol"].groups
    assert groups is not None
    assert groups.unifac == {"CH3": 1, "CH2": 1, "OH": 1}
    assert groups.of("dortmund") == {"CH3": 1, "CH2": 1, "OH(P)": 1}
    assert groups.source.ref == "hansen-1991"


def test_one_variant_may_be_left_out(scratch: Path) -> None:
    _set_groups(scratch, ETHANOL_GROUPS.replace('  dortmund: {CH3: 1, CH2: 1, "OH(P)": 1}\n', ""))
    groups = load_catalogue(scratch).components["ethanol"].groups
    assert groups is not None and groups.dortmund is None and groups.unifac


def test_bad_count_names_the_subgroup_field(scratch: Path) -> None:
    _set_groups(scratch, ETHANOL_GROUPS.replace("OH: 1}", "OH: 1.5}"))
    (problem,) = _problems(scratch)
    assert "components/ethanol.yaml" in problem and "entry 'ethanol'" in problem
    assert "field 'groups.unifac.OH'" in problem
    assert "positive whole number" in problem and "1.5" in problem


def test_no_variant_and_unknown_field(scratch: Path) -> None:
    _set_groups(scratch, "groups:\n  unifak: {CH3: 2}\n  source: {ref: hansen-1991, where: x}\n")
    problems = _problems(scratch)
    assert any("field 'groups.unifak'" in p and "unknown field" in p for p in problems)
    assert any("field 'groups'" in p and "at least one of unifac, dortmund" in p
               for p in problems)


def test_source_is_required_and_checked(scratch: Path) -> None:
    _set_groups(scratch, ETHANOL_GROUPS.replace("hansen-1991", "nowhere-2000"))
    (problem,) = _problems(scratch)
    assert "field 'groups.source.ref'" in problem and "nowhere-2000" in problem


def test_unknown_subgroup_name_suggests_the_spelling(scratch: Path) -> None:
    _set_groups(scratch, ETHANOL_GROUPS.replace('"OH(P)"', '"oh(p)"'))
    (problem,) = _problems(scratch)
    assert "field 'groups.dortmund.oh(p)'" in problem and "'OH(P)'" in problem


def test_groups_must_add_up_to_the_formula(scratch: Path) -> None:
    # Ethanol C2H6O written with two CH3 groups and no CH2: C2H7O does not balance.
    _set_groups(scratch, ETHANOL_GROUPS.replace("{CH3: 1, CH2: 1, OH: 1}", "{CH3: 2, OH: 1}"))
    (problem,) = _problems(scratch)
    assert "field 'groups.unifac'" in problem and "add up to the formula C2H6O" in problem
    assert "C2H7O" in problem


def test_molar_mass_must_match_the_formula(scratch: Path) -> None:
    _set_groups(scratch, ETHANOL_GROUPS)
    path = scratch / "components" / "ethanol.yaml"
    path.write_text(path.read_text(encoding="utf-8").replace("46.0684 g/mol", "46.2 g/mol"),
                    encoding="utf-8")
    (problem,) = _problems(scratch)
    assert "field 'groups'" in problem and "46.069 g/mol" in problem and "46.200" in problem
