"""The JSON Schema of catalogue files and the strict loader agree; scaffolds fail until filled.

References: JSON Schema draft 2020-12 as implemented by the ``jsonschema`` package
(an independent validator); the catalogue format in DEVELOPERS.md (project convention).
"""

from __future__ import annotations

import copy
import shutil
from pathlib import Path
from typing import Any

import jsonschema
import pytest
import yaml
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from builder.catalogue.loader import DEFAULT_CATALOGUE, load_catalogue
from builder.catalogue.scaffold import FILL, component_scaffold, pair_scaffold
from builder.catalogue.schema import SCHEMA_FILES, catalogue_schemas, modeline, write_schemas
from builder.commands.cli import main
from builder.errors import CatalogueError

SCHEMAS = catalogue_schemas()


def _validator(folder: str) -> jsonschema.Draft202012Validator:
    return jsonschema.Draft202012Validator(SCHEMAS[SCHEMA_FILES[folder]])


def test_committed_schemas_are_up_to_date() -> None:
    assert write_schemas(DEFAULT_CATALOGUE, check=True) == [], "run 'atlas schema'"


def test_schemas_are_valid_json_schema() -> None:
    for schema in SCHEMAS.values():
        jsonschema.Draft202012Validator.check_schema(schema)


@pytest.mark.parametrize("folder", list(SCHEMA_FILES))
def test_every_catalogue_file_names_and_passes_its_schema(folder: str) -> None:
    validator = _validator(folder)
    files = sorted((DEFAULT_CATALOGUE / folder).glob("*.yaml"))
    assert files
    for path in files:
        text = path.read_text(encoding="utf-8")
        assert text.splitlines()[0] == modeline(folder), path.name
        errors = [e.message for e in validator.iter_errors(yaml.safe_load(text))]
        assert not errors, (path.name, errors[:3])


# -- property: schema and loader accept and reject the same documents ------------------

BASES = {
    "components": ["ethanol", "water"],
    "binaries": ["ethanol--water", "water--pyridine"],
    "references": ["poling-2001"],
}
WRONG_TYPES = [True, "some text", [1, 2], {"k": 1}, None, 12345]


@pytest.fixture(scope="module")
def scratch_root(tmp_path_factory: pytest.TempPathFactory) -> Path:
    root = tmp_path_factory.mktemp("agree") / "pairs"
    shutil.copytree(DEFAULT_CATALOGUE / "references", root / "references")
    (root / "components").mkdir()
    (root / "binaries").mkdir()
    for cid in ("ethanol", "water", "pyridine"):
        shutil.copy(DEFAULT_CATALOGUE / "components" / f"{cid}.yaml", root / "components")
    for pid in BASES["binaries"]:
        shutil.copy(DEFAULT_CATALOGUE / "binaries" / f"{pid}.yaml", root / "binaries")
    return root


def _paths(doc: Any, prefix: tuple[Any, ...] = ()) -> list[tuple[Any, ...]]:
    out = [prefix] if prefix else []
    if isinstance(doc, dict):
        for key, value in doc.items():
            out += _paths(value, (*prefix, key))
    elif isinstance(doc, list):
        for index, value in enumerate(doc):
            out += _paths(value, (*prefix, index))
    return out


def _get(doc: Any, path: tuple[Any, ...]) -> Any:
    for key in path:
        doc = doc[key]
    return doc


@st.composite
def mutated(draw: st.DrawFn) -> tuple[str, str, Any]:
    folder = draw(st.sampled_from(sorted(BASES)))
    name = draw(st.sampled_from(BASES[folder]))
    doc = yaml.safe_load((DEFAULT_CATALOGUE / folder / f"{name}.yaml").read_text("utf-8"))
    for _ in range(draw(st.integers(1, 3))):
        # UNIFAC subgroups are checked against the group tables and the formula (atom
        # balance): cross-file rules of the loader alone, left out here.
        path = draw(st.sampled_from([p for p in _paths(doc) if p[0] != "groups"]))
        parent, key = _get(doc, path[:-1]), path[-1]
        op = draw(st.sampled_from(["delete", "unknown", "retype"]))
        if op == "delete" and isinstance(parent, dict):
            del parent[key]
        elif op == "unknown" and isinstance(_get(doc, path), dict):
            _get(doc, path)["zz_unknown"] = 1
        else:
            old = parent[key]
            # Numbers keep their type: a different number can break a cross-field rule
            # (loader only), which is not what this property is about.
            options = [v for v in WRONG_TYPES if type(v) is not type(old)
                       and not (isinstance(old, (int, float)) and isinstance(v, (int, float)))]
            parent[key] = copy.deepcopy(draw(st.sampled_from(options)))
    return folder, name, doc


@settings(max_examples=100, deadline=None,
          suppress_health_check=[HealthCheck.function_scoped_fixture, HealthCheck.too_slow])
@given(case=mutated())
def test_schema_and_loader_agree(scratch_root: Path, case: tuple[str, str, Any]) -> None:
    folder, name, doc = case
    path = scratch_root / folder / f"{name}.yaml"
    original = path.read_text(encoding="utf-8")
    try:
        path.write_text(yaml.safe_dump(doc, allow_unicode=True), encoding="utf-8")
        problems: list[CatalogueError] = []
        load_catalogue(scratch_root, problems=problems)
        loader_ok = not [p for p in problems if p.file.endswith(f"{folder}/{name}.yaml")]
    finally:
        path.write_text(original, encoding="utf-8")
    schema_errors = [e.message for e in _validator(folder).iter_errors(doc)]
    assert loader_ok == (not schema_errors), (doc, schema_errors[:3],
                                              [str(p) for p in problems][:3])


# -- scaffolds ---------------------------------------------------------------------------


@pytest.fixture
def scratch(tmp_path: Path) -> Path:
    root = tmp_path / "pairs"
    shutil.copytree(DEFAULT_CATALOGUE / "references", root / "references")
    (root / "components").mkdir()
    (root / "binaries").mkdir()
    for cid in ("ethanol", "water"):
        shutil.copy(DEFAULT_CATALOGUE / "components" / f"{cid}.yaml", root / "components")
    return root


def test_component_scaffold_fails_check_with_located_messages(
        scratch: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["--catalogue", str(scratch), "new", "component", "Larchmoor resin A"]) == 0
    path = scratch / "components" / "larchmoor-resin-a.yaml"
    assert path.read_text(encoding="utf-8").startswith(modeline("components"))
    capsys.readouterr()
    assert main(["--catalogue", str(scratch), "check"]) == 1
    out = capsys.readouterr().out
    failed = [line for line in out.splitlines() if line.startswith("FAIL")]
    fields = {line.split("field '")[1].split("'")[0] for line in failed}
    assert {"cas", "constants.molar_mass", "constants.critical_pressure",
            "vapour_pressure.A", "vapour_pressure.T_max", "hazard.source.ref"} <= fields
    assert all("components/larchmoor-resin-a.yaml: entry 'larchmoor-resin-a'" in line
               and "expected" in line for line in failed)


def test_component_scaffold_passes_once_filled(scratch: Path) -> None:
    """Filled with the published values of ethanol (the shipped file), the scaffold loads."""
    text = component_scaffold("ethanol", "Ethanol")
    real = yaml.safe_load((DEFAULT_CATALOGUE / "components" / "ethanol.yaml").read_text("utf-8"))
    doc = yaml.safe_load(text)

    def fill(target: dict[str, Any], source: dict[str, Any]) -> None:
        for key, value in target.items():
            if isinstance(value, dict):
                fill(value, source[key])
            elif isinstance(value, list) or (isinstance(value, str) and FILL in value):
                target[key] = source[key]

    fill(doc, real)
    (scratch / "components" / "ethanol.yaml").write_text(yaml.safe_dump(doc, allow_unicode=True),
                                                         encoding="utf-8")
    assert "ethanol" in load_catalogue(scratch).components


def test_pair_scaffold_fails_until_filled(scratch: Path) -> None:
    path = scratch / "binaries" / "ethanol--water.yaml"
    path.write_text(pair_scaffold("ethanol", "water"), encoding="utf-8")
    problems: list[CatalogueError] = []
    load_catalogue(scratch, problems=problems)
    located = {p.field for p in problems if p.file.endswith("binaries/ethanol--water.yaml")}
    assert {"activity.T_range", "activity.quality", "activity.parameters.g12",
            "activity.parameters.alpha", "activity.source.ref"} <= located
    real = yaml.safe_load((DEFAULT_CATALOGUE / "binaries" / "ethanol--water.yaml")
                          .read_text("utf-8"))
    doc = yaml.safe_load(path.read_text(encoding="utf-8"))
    doc["activity"] = real["activity"]
    path.write_text(yaml.safe_dump(doc, allow_unicode=True), encoding="utf-8")
    assert "ethanol--water" in load_catalogue(scratch).pairs


def test_new_pair_refuses_the_reverse_of_an_existing_pair(
        scratch: Path, capsys: pytest.CaptureFixture[str]) -> None:
    shutil.copy(DEFAULT_CATALOGUE / "binaries" / "ethanol--water.yaml", scratch / "binaries")
    assert main(["--catalogue", str(scratch), "new", "pair", "water", "ethanol"]) == 2
    assert "already in the catalogue" in capsys.readouterr().err
