"""Predicted azeotropes at 101.325 kPa against a published azeotrope table.

Reference: pairs/recorded-azeotropes.yaml: the azeotrope table of the CRC Handbook of
Chemistry and Physics (the same systems in Horsley, Azeotropic Data III), values recalled
from memory, except the water entries read in the 760 mmHg table of azeotropes of water of
Lange's Handbook, 10th ed. (or CRC 44th ed.; each entry names its source); screening
tolerance 3 K and 0.08 in mole fraction with the behaviour class right (common practice).
The committed deviation table docs/unifac-deviations.md must be the one the code computes
now.
"""

from __future__ import annotations

import shutil
from pathlib import Path

import pytest

from builder.analysis.deviations import Deviation, deviations, markdown
from builder.catalogue.loader import DEFAULT_CATALOGUE, Catalogue
from builder.catalogue.recorded_table import RECORDED_FILE, load_recorded_azeotropes
from builder.errors import CatalogueErrors

DOC = DEFAULT_CATALOGUE.parent / "docs" / "unifac-deviations.md"


@pytest.fixture(scope="module")
def rows(catalogue: Catalogue) -> list[Deviation]:
    return deviations(catalogue, load_recorded_azeotropes(catalogue))


def test_recorded_table_covers_what_the_checks_need(catalogue: Catalogue) -> None:
    recorded = load_recorded_azeotropes(catalogue)
    assert len(recorded) >= 40
    pairs = {frozenset((r.component1, r.component2)) for r in recorded}
    assert len(pairs) == len(recorded)
    assert all(catalogue.pair_of(r.component1, r.component2) is None for r in recorded)
    water = [r for r in recorded if "water" in (r.component1, r.component2)]
    assert sum(r.heterogeneous is True for r in water) >= 10
    assert any(r.component1 in ("chloroform", "dichloromethane") for r in water)
    assert sum(r.behaviour == "zeotropic" for r in recorded) >= 5
    # every entry says where it comes from: recalled, or read in a named table
    read = [r for r in recorded if not r.source.from_memory]
    assert {r.source.ref for r in read} <= {"lange-10"}
    assert all("water" in (r.component1, r.component2) for r in read)
    assert all("transcription" in r.source.note for r in read)


def test_entries_read_in_a_table_carry_its_values(catalogue: Catalogue) -> None:
    """Lange's Handbook, 10th ed., 760 mmHg table of azeotropes of water (read in a web
    transcription): sec-butanol 88.5 C, 67.9 %; methyl acetate 56.1 C, 95.0 %; carbon
    tetrachloride 66.8 C, 95.9 % (weight % of the non-aqueous component)."""
    recorded = {(r.component1, r.component2): r for r in load_recorded_azeotropes(catalogue)}
    for pair, T_C, w1 in [(("2-butanol", "water"), 88.5, 0.679),
                          (("methyl-acetate", "water"), 56.1, 0.950),
                          (("carbon-tetrachloride", "water"), 66.8, 0.959)]:
        row = recorded[pair]
        assert row.source.ref == "lange-10" and not row.source.from_memory, pair
        assert row.T_K == pytest.approx(T_C + 273.15, abs=1e-9), pair
        assert row.w1 == pytest.approx(w1, abs=1e-12), pair


def test_committed_deviation_table_is_current(catalogue: Catalogue,
                                              rows: list[Deviation]) -> None:
    assert DOC.read_text(encoding="utf-8") == markdown(catalogue, rows), (
        "docs/unifac-deviations.md is out of date: run "
        "'python -m builder.commands.deviations docs/unifac-deviations.md'")


def test_heterogeneous_water_azeotropes_within_screening_tolerance(
        rows: list[Deviation]) -> None:
    """Water with hydrocarbons and chlorinated solvents: modified UNIFAC (Dortmund) finds
    each heterogeneous azeotrope within 3 K and 0.08 (a regression guard on the
    three-phase search for nearly immiscible liquids)."""
    checked = [r for r in rows if r.recorded.heterogeneous and r.recorded.component2 == "water"
               and r.recorded.component1 not in ("diethyl-ether", "methyl-tert-butyl-ether")]
    assert len(checked) >= 12
    for row in checked:
        assert row.within_tolerance, (row.recorded.component1, row.verdict())


def test_a_bad_recorded_entry_is_located(catalogue: Catalogue, tmp_path: Path) -> None:
    path = tmp_path / "recorded.yaml"
    shutil.copy(RECORDED_FILE, path)
    text = path.read_text(encoding="utf-8")
    path.write_text(text.replace("T: 84.1 C, w1: 0.804", "T: 84.1, w1: 80.4"),
                    encoding="utf-8")
    with pytest.raises(CatalogueErrors) as caught:
        load_recorded_azeotropes(catalogue, path)
    (problem,) = caught.value.errors
    assert problem.entry == "toluene--water" and problem.field == "T"
    assert "temperature with a unit" in problem.expected


def test_a_bad_entry_source_is_located(catalogue: Catalogue, tmp_path: Path) -> None:
    """A per-entry source is validated like the file's: an unknown reference names the
    entry and the field."""
    path = tmp_path / "recorded.yaml"
    shutil.copy(RECORDED_FILE, path)
    text = path.read_text(encoding="utf-8")
    assert "ref: lange-10\n" in text
    path.write_text(text.replace("ref: lange-10\n", "ref: lange-99\n", 1), encoding="utf-8")
    with pytest.raises(CatalogueErrors) as caught:
        load_recorded_azeotropes(catalogue, path)
    entries = {(e.entry, e.field) for e in caught.value.errors}
    assert ("carbon-tetrachloride--water", "source.ref") in entries
