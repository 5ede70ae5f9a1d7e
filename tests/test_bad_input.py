"""Bad catalogue input: each defect found by a fuzzing run of mutated catalogues.

One regression test per defect, named after it.  Each mutates a scratch copy of the
shipped catalogue the way the fuzzing run did and requires a located error (file,
entry, field, what was expected, what was found), no traceback and no raw numpy
message.  The limits are physical ones (common practice): e.g. an acentric factor
between -0.5 and 2, a critical pressure of at least 0.1 MPa.
"""

from __future__ import annotations

import shutil
from pathlib import Path

import pytest

from builder.catalogue.loader import DEFAULT_CATALOGUE, load_catalogue
from builder.commands.cli import main
from builder.errors import CatalogueErrors

PAIRS = ("ethanol--water", "water--pyridine")


@pytest.fixture
def scratch(tmp_path: Path) -> Path:
    root = tmp_path / "pairs"
    shutil.copytree(DEFAULT_CATALOGUE / "references", root / "references")
    (root / "components").mkdir()
    (root / "binaries").mkdir()
    for cid in ("ethanol", "water", "pyridine"):
        shutil.copy(DEFAULT_CATALOGUE / "components" / f"{cid}.yaml", root / "components")
    for pid in PAIRS:
        shutil.copy(DEFAULT_CATALOGUE / "binaries" / f"{pid}.yaml", root / "binaries")
    return root


def _edit(path: Path, old: str, new: str) -> None:
    text = path.read_text(encoding="utf-8")
    assert old in text, f"{old!r} not in {path.name}"
    path.write_text(text.replace(old, new, 1), encoding="utf-8")


def _problems(root: Path) -> list[str]:
    with pytest.raises(CatalogueErrors) as caught:
        load_catalogue(root)
    return [str(e) for e in caught.value.errors]


def _one_located(root: Path, file: str, field: str) -> str:
    """Exactly the expected kind of problem: in ``file``, at ``field``, with expected/found."""
    problems = _problems(root)
    hits = [p for p in problems if file in p and f"field '{field}" in p]
    assert hits, problems
    assert all("expected" in p and "; found" in p for p in problems), problems
    for p in problems:  # no raw numpy or Python internals in the messages
        for raw in ("argmin", "zero-size array", "Traceback", "RuntimeWarning"):
            assert raw not in p, p
    return hits[0]


def _component(root: Path, cid: str = "ethanol") -> Path:
    return root / "components" / f"{cid}.yaml"


def _pair(root: Path, pid: str = "ethanol--water") -> Path:
    return root / "binaries" / f"{pid}.yaml"


# -- accepted silently before ----------------------------------------------------------


@pytest.mark.parametrize("value", [".nan", ".inf", "-.inf", "1e308", "-5"])
def test_acentric_factor_outside_physical_range(scratch: Path, value: str) -> None:
    _edit(_component(scratch), "acentric_factor: 0.6350", f"acentric_factor: {value}")
    problem = _one_located(scratch, "components/ethanol.yaml", "constants.acentric_factor")
    assert "entry 'ethanol'" in problem


@pytest.mark.parametrize("value", ["1e308 g/mol", "1e-300 g/mol"])
def test_molar_mass_outside_physical_range(scratch: Path, value: str) -> None:
    _edit(_component(scratch), "molar_mass: 46.0684 g/mol", f"molar_mass: {value}")
    problem = _one_located(scratch, "components/ethanol.yaml", "constants.molar_mass")
    assert "between" in problem and "kg/mol" in problem


def test_critical_temperature_1e308_K(scratch: Path) -> None:
    _edit(_component(scratch), "value: 514.00 K", "value: 1e308 K")
    _one_located(scratch, "components/ethanol.yaml", "constants.critical_temperature")


def test_critical_pressure_1e_minus_300_Pa(scratch: Path) -> None:
    _edit(_component(scratch), "value: 6.1370 MPa", "value: 1e-300 Pa")
    _one_located(scratch, "components/ethanol.yaml", "constants.critical_pressure")


def test_liquid_molar_volume_1e308(scratch: Path) -> None:
    _edit(_component(scratch), "value: 58.620 cm3/mol", "value: 1e308 cm3/mol")
    _one_located(scratch, "components/ethanol.yaml", "constants.liquid_molar_volume")


@pytest.mark.parametrize("old,new", [("r: 2.5755", "r: 1e308"), ("q: 2.5880", "q: 1e308")])
def test_uniquac_r_or_q_1e308(scratch: Path, old: str, new: str) -> None:
    _edit(_component(scratch), old, new)
    _one_located(scratch, "components/ethanol.yaml", f"uniquac.{new[0]}")


def test_correlation_T_max_1e308_K(scratch: Path) -> None:
    _edit(_component(scratch), "T_max: 369.54 K", "T_max: 1e308 K")
    _one_located(scratch, "components/ethanol.yaml", "vapour_pressure.T_max")


def test_correlation_T_max_above_critical_temperature(scratch: Path) -> None:
    _edit(_component(scratch), "T_max: 369.54 K", "T_max: 600 K")
    problem = _one_located(scratch, "components/ethanol.yaml", "vapour_pressure.T_max")
    assert "critical temperature" in problem


def test_isotherm_above_both_critical_temperatures(scratch: Path) -> None:
    _edit(_pair(scratch), "isotherms: [70 C]", "isotherms: [700 C]")
    problem = _one_located(scratch, "binaries/ethanol--water.yaml", "publish.isotherms")
    assert "critical temperature" in problem


@pytest.mark.parametrize("old,new", [
    ("name: Ethanol", "name: Ethanol\nname: Methanol"),
    ("formula: C2H6O", "formula: C2H6O\nhazard: {summary: none, source: {ref: poling-2001, "
     "where: x}}"),
])
def test_duplicate_yaml_keys(scratch: Path, old: str, new: str) -> None:
    _edit(_component(scratch), old, new)
    (problem,) = _problems(scratch)
    assert "components/ethanol.yaml" in problem and "a second time" in problem
    assert "line" in problem


def test_same_pair_in_two_files_the_other_way_round(scratch: Path) -> None:
    text = _pair(scratch).read_text(encoding="utf-8")
    text = text.replace("id: ethanol--water", "id: water--ethanol").replace(
        "components: [ethanol, water]", "components: [water, ethanol]")
    (scratch / "binaries" / "water--ethanol.yaml").write_text(text, encoding="utf-8")
    problem = _one_located(scratch, "binaries/water--ethanol.yaml", "components")
    assert "other way round" in problem and "ethanol--water.yaml" in problem


def test_cas_number_00_00_0(scratch: Path) -> None:
    _edit(_component(scratch), "cas: 64-17-5", "cas: 00-00-0")
    _one_located(scratch, "components/ethanol.yaml", "cas")


def test_publish_with_no_isobar_and_no_isotherm(scratch: Path) -> None:
    _edit(_pair(scratch), "isobars: [101.325 kPa, 20 kPa, 300 kPa]\n  isotherms: [70 C]",
          "isobars: []\n  isotherms: []")
    problem = _one_located(scratch, "binaries/ethanol--water.yaml", "publish")
    assert "at least one isobar or isotherm" in problem


# -- tracebacks before -----------------------------------------------------------------


def test_yaml_alias_bomb(scratch: Path) -> None:
    lines = ["a0: &a0 [x, x, x, x, x, x, x, x, x]"]
    for level in range(1, 10):
        refs = ", ".join([f"*a{level - 1}"] * 9)
        lines.append(f"a{level}: &a{level} [{refs}]")
    _component(scratch).write_text("\n".join(lines) + "\nid: ethanol\n", encoding="utf-8")
    (problem,) = _problems(scratch)
    assert "components/ethanol.yaml" in problem and "aliases" in problem


def test_20000_deep_nested_list(scratch: Path) -> None:
    _component(scratch).write_text("id: " + "[" * 20000 + "]" * 20000 + "\n", encoding="utf-8")
    (problem,) = _problems(scratch)
    assert "components/ethanol.yaml" in problem and "nesting" in problem


def test_401_digit_integer(scratch: Path) -> None:
    _edit(_component(scratch), "acentric_factor: 0.6350", "acentric_factor: " + "9" * 401)
    (problem,) = _problems(scratch)
    assert "components/ethanol.yaml" in problem and "401 digits" in problem


def test_antoine_pole_inside_validity_range(scratch: Path) -> None:
    # C = -10 °C puts T + C = 0 at 10 °C, inside 276.5 K to 369.54 K.
    _edit(_component(scratch), "C: 230.918", "C: -10.0")
    problem = _one_located(scratch, "components/ethanol.yaml", "vapour_pressure")
    assert "pole" in problem


def test_temperature_unit_K_with_constants_in_celsius(scratch: Path) -> None:
    _edit(_component(scratch), "temperature_unit: C", "temperature_unit: K")
    _one_located(scratch, "components/ethanol.yaml", "vapour_pressure")


# -- no location before ----------------------------------------------------------------


def test_file_not_utf8_names_the_file(scratch: Path) -> None:
    path = _component(scratch)
    path.write_bytes(path.read_bytes().replace(b"Ethanol", b"\xc9thanol", 1))
    (problem,) = _problems(scratch)
    assert "components/ethanol.yaml" in problem and "UTF-8" in problem and "line 3" in problem


@pytest.mark.parametrize("old,new,field", [
    ("B: 1648.220", "B: 0", "vapour_pressure"),
    ("B: 1648.220", "B: -1648.220", "vapour_pressure"),
    ("A: 5.33675", "A: 300", "vapour_pressure"),
    ("A: 5.33675", "A: .nan", "vapour_pressure.A"),
])
def test_absurd_antoine_constants(scratch: Path, old: str, new: str, field: str) -> None:
    _edit(_component(scratch), old, new)
    _one_located(scratch, "components/ethanol.yaml", field)


@pytest.mark.parametrize("D,E", [("1e10", "6"), ("-1e10", "6")])
def test_dippr_terms_that_overflow_or_underflow(scratch: Path, D: str, E: str) -> None:
    _edit(_component(scratch), "equation: antoine\n  log: \"10\"\n  pressure_unit: bar\n"
          "  temperature_unit: C\n  A: 5.33675\n  B: 1648.220\n  C: 230.918",
          f"equation: dippr101\n  pressure_unit: Pa\n  A: 74.475\n  B: -7164.3\n"
          f"  C: -7.327\n  D: {D}\n  E: {E}")
    _one_located(scratch, "components/ethanol.yaml", "vapour_pressure")


@pytest.mark.parametrize("old,new,field", [
    ("g12: -57.9601 cal/mol", "g12: -1e4 K", "activity.parameters"),  # τ12 = -1e4 / T
    ("g12: -57.9601 cal/mol\n    g21: 1241.7396 cal/mol",
     "tau12: -1e4\n    tau21: 1.0", "activity.parameters.tau12"),
    ("alpha: 0.2937", "alpha: .nan", "activity.parameters.alpha"),
])
def test_absurd_nrtl_parameters(scratch: Path, old: str, new: str, field: str) -> None:
    _edit(_pair(scratch), old, new)
    _one_located(scratch, "binaries/ethanol--water.yaml", field)


def test_margules_A_1e4(scratch: Path) -> None:
    _edit(_pair(scratch), "model: nrtl", "model: margules")
    _edit(_pair(scratch), "g12: -57.9601 cal/mol\n    g21: 1241.7396 cal/mol\n    alpha: 0.2937",
          "A12: 1e4\n    A21: 1.0")
    _one_located(scratch, "binaries/ethanol--water.yaml", "activity.parameters.A12")


def test_uniquac_tau_overflowing(scratch: Path) -> None:
    _edit(_pair(scratch, "water--pyridine"), "ln_tau12: {b: 28.45218 K}",
          "ln_tau12: {b: 99999 K}")
    problem = _one_located(scratch, "binaries/water--pyridine.yaml", "activity.parameters")
    assert "ln γ" in problem or "finite" in problem


def test_isobar_of_1e_minus_300_Pa(scratch: Path) -> None:
    _edit(_pair(scratch), "isobars: [101.325 kPa, 20 kPa, 300 kPa]", "isobars: [1e-300 Pa]")
    _one_located(scratch, "binaries/ethanol--water.yaml", "publish.isobars")


def test_wilson_b_1e5_K(scratch: Path) -> None:
    _edit(_pair(scratch), "model: nrtl", "model: wilson")
    _edit(_pair(scratch), "g12: -57.9601 cal/mol\n    g21: 1241.7396 cal/mol\n    alpha: 0.2937",
          "ln_Lambda12: {b: 1e5 K}\n    ln_Lambda21: {b: -100 K}")
    _one_located(scratch, "binaries/ethanol--water.yaml", "activity.parameters")


def test_one_bad_pair_does_not_abort_atlas_check(scratch: Path,
                                                 capsys: pytest.CaptureFixture[str]) -> None:
    _edit(_pair(scratch), "alpha: 0.2937", "alpha: .nan")
    status = main(["--catalogue", str(scratch), "check"])
    out = capsys.readouterr()
    assert status == 1
    assert "FAIL pairs/binaries/ethanol--water.yaml: entry 'ethanol--water'" in out.out
    assert "1 pairs: loaded" in out.out  # water--pyridine still checked
    assert "Traceback" not in out.err and "RuntimeWarning" not in out.err


# -- smaller messages --------------------------------------------------------------------


def test_number_with_no_unit_says_no_unit(scratch: Path) -> None:
    _edit(_component(scratch), "molar_mass: 46.0684 g/mol", "molar_mass: \"46.0684\"")
    problem = _one_located(scratch, "components/ethanol.yaml", "constants.molar_mass")
    assert "(no unit)" in problem and ".0684" in problem and "unit '.0684'" not in problem


def test_pair_that_fails_to_load_is_not_also_missing(scratch: Path) -> None:
    _edit(_pair(scratch), "alpha: 0.2937", "alpha: 7")
    with pytest.raises(CatalogueErrors) as caught:
        load_catalogue(scratch, only=["ethanol--water"])
    messages = [str(e) for e in caught.value.errors]
    assert len(messages) == 1 and "no such pair file" not in messages[0]


def test_component_missing_uniquac_reported_once_at_the_component(scratch: Path) -> None:
    text = _component(scratch, "water").read_text(encoding="utf-8")
    start, end = text.index("uniquac:"), text.index("vapour_pressure:")
    _component(scratch, "water").write_text(text[:start] + text[end:], encoding="utf-8")
    second = _pair(scratch, "water--pyridine").read_text(encoding="utf-8").replace(
        "pyridine", "ethanol").replace("water--ethanol", "ethanol--water-x")
    (scratch / "binaries" / "water--ethanol.yaml").write_text(
        second.replace("id: ethanol--water-x", "id: water--ethanol"), encoding="utf-8")
    problems = _problems(scratch)
    at_water = [p for p in problems if "uniquac" in p]
    assert len(at_water) == 1 and "components/water.yaml" in at_water[0]
    assert "water--pyridine" in at_water[0] and "water--ethanol" in at_water[0]


def test_command_line_prints_no_traceback_for_bad_yaml(scratch: Path,
                                                       capsys: pytest.CaptureFixture[str]
                                                       ) -> None:
    _component(scratch).write_text("id: " + "[" * 5000 + "\n", encoding="utf-8")
    status = main(["--catalogue", str(scratch), "list"])
    err = capsys.readouterr().err
    assert status == 2 and "components/ethanol.yaml" in err and "Traceback" not in err
