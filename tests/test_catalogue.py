"""Strict loading of the catalogue: every problem names the file, the entry and the field.

References: the catalogue format in DEVELOPERS.md (project convention); CAS check-digit rule
of the CAS Registry (common practice).
"""

from __future__ import annotations

import shutil
from pathlib import Path

import pytest

from builder.catalogue.loader import DEFAULT_CATALOGUE, load_catalogue
from builder.errors import CatalogueErrors


@pytest.fixture
def scratch(tmp_path: Path) -> Path:
    """A copy of the shipped references and two components, plus one pair."""
    root = tmp_path / "pairs"
    shutil.copytree(DEFAULT_CATALOGUE / "references", root / "references")
    (root / "components").mkdir()
    (root / "binaries").mkdir()
    for cid in ("ethanol", "water"):
        shutil.copy(DEFAULT_CATALOGUE / "components" / f"{cid}.yaml", root / "components")
    shutil.copy(DEFAULT_CATALOGUE / "binaries" / "ethanol--water.yaml", root / "binaries")
    return root


def _edit(path: Path, old: str, new: str) -> None:
    text = path.read_text(encoding="utf-8")
    assert old in text, f"{old!r} not in {path.name}"
    path.write_text(text.replace(old, new, 1), encoding="utf-8")


def _problems(root: Path) -> list[str]:
    with pytest.raises(CatalogueErrors) as caught:
        load_catalogue(root)
    return [str(e) for e in caught.value.errors]


def test_shipped_catalogue_loads(catalogue) -> None:  # type: ignore[no-untyped-def]
    assert len(catalogue.components) >= 9
    assert len(catalogue.pairs) >= 7
    kinds = {p.model_kind for p in catalogue.pairs.values()}
    assert {"ideal", "margules", "van-laar", "wilson", "nrtl", "uniquac"} <= kinds


def test_scratch_copy_loads(scratch: Path) -> None:
    catalogue = load_catalogue(scratch)
    assert set(catalogue.pairs) == {"ethanol--water"}


def test_unknown_key_names_file_entry_and_field(scratch: Path) -> None:
    _edit(scratch / "components" / "water.yaml", "formula: H2O", "formula: H2O\nfromula: H2O")
    (problem,) = _problems(scratch)
    assert "components/water.yaml" in problem
    assert "entry 'water'" in problem
    assert "field 'fromula'" in problem and "unknown field" in problem


def test_missing_unit_is_reported(scratch: Path) -> None:
    _edit(scratch / "components" / "ethanol.yaml", "value: 6.1370 MPa", "value: 6.1370")
    (problem,) = _problems(scratch)
    assert "field 'constants.critical_pressure.value'" in problem
    assert "(no unit)" in problem
    assert "pressure with a unit" in problem and "found 6.137" in problem


def test_wrong_unit_dimension_is_reported(scratch: Path) -> None:
    _edit(scratch / "binaries" / "ethanol--water.yaml", "g12: -57.9601 cal/mol",
          "g12: -57.9601 kPa")
    (problem,) = _problems(scratch)
    assert "field 'activity.parameters.g12'" in problem and "cal/mol" in problem


def test_missing_field(scratch: Path) -> None:
    _edit(scratch / "binaries" / "ethanol--water.yaml", "    alpha: 0.2937\n", "")
    (problem,) = _problems(scratch)
    assert "field 'activity.parameters.alpha'" in problem and "missing" in problem


def test_wrong_type_and_no_cascade(scratch: Path) -> None:
    """A broken component is reported once; pairs using it are not reported again."""
    _edit(scratch / "components" / "water.yaml", "acentric_factor: ", "acentric_factor: high #")
    (problem,) = _problems(scratch)
    assert "field 'constants.acentric_factor'" in problem and "plain number" in problem


def test_bad_cas_and_unknown_reference(scratch: Path) -> None:
    _edit(scratch / "components" / "water.yaml", "cas: 7732-18-5", "cas: 7732-18-4")
    _edit(scratch / "components" / "water.yaml", "ref: iapws-95", "ref: nowhere-2020")
    problems = _problems(scratch)
    assert any("field 'cas'" in p and "check digit" in p for p in problems)
    assert any("nowhere-2020" in p and "references/" in p for p in problems)


def test_pair_with_unknown_component(scratch: Path) -> None:
    (scratch / "components" / "water.yaml").unlink()
    problems = _problems(scratch)
    assert any("binaries/ethanol--water.yaml" in p and "'water'" in p for p in problems)


def test_unsafe_yaml_tags_are_refused(scratch: Path) -> None:
    _edit(scratch / "components" / "water.yaml", "name: Water",
          "name: !!python/object/apply:os.system ['echo pwned']")
    (problem,) = _problems(scratch)
    assert "valid YAML" in problem


def test_id_must_be_a_slug_matching_the_file_name(scratch: Path) -> None:
    _edit(scratch / "components" / "water.yaml", "id: water", "id: Water<script>")
    problems = _problems(scratch)
    assert any("slug" in p for p in problems)


def test_all_problems_reported_together(scratch: Path) -> None:
    _edit(scratch / "components" / "water.yaml", "formula: H2O", "formula: H2O\nextra: 1")
    _edit(scratch / "components" / "ethanol.yaml", "value: 514.00 K", "value: 514.00 furlong")
    assert len(_problems(scratch)) == 2


def test_temperature_range_must_be_ordered(scratch: Path) -> None:
    _edit(scratch / "binaries" / "ethanol--water.yaml", "T_range: [78 C, 100 C]",
          "T_range: [100 C, 78 C]")
    (problem,) = _problems(scratch)
    assert "T_range" in problem


def test_every_number_has_a_source(catalogue) -> None:  # type: ignore[no-untyped-def]
    """Project rule: each constant, correlation and parameter set names its source."""
    for component in catalogue.components.values():
        assert component.vapour_pressure_source.ref in catalogue.references
        assert set(component.constants_sources) == {
            "molar_mass", "normal_boiling_point", "critical_temperature", "critical_pressure",
            "acentric_factor", "liquid_molar_volume"}, component.id
        if component.uniquac_r is not None:
            assert component.uniquac_source is not None
    for pair in catalogue.pairs.values():
        assert pair.source.ref in catalogue.references
        if pair.quality == "unverified":
            assert pair.source.from_memory, pair.id
