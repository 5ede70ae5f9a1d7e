"""The ``atlas calc`` command: the README example, JSON contract and user errors.

References: the bubble point of 30 mol % ethanol in water at 1 atm is compared with the
library call it wraps (the library itself is checked against thermo in test_equilibrium);
mass/mole conversion by hand (common practice).
"""

from __future__ import annotations

import json
import subprocess
import sys

import pytest

from builder.commands.cli import main


def _run(capsys: pytest.CaptureFixture[str], *args: str) -> tuple[int, str, str]:
    """Exit status, stdout and stderr of one command (argparse usage errors exit 2)."""
    try:
        code = main(list(args))
    except SystemExit as stop:
        code = int(stop.code or 0)
    out, err = capsys.readouterr()
    return code, out, err


def test_readme_example_table(capsys: pytest.CaptureFixture[str]) -> None:
    code, out, _ = _run(capsys, "calc", "bubble-t", "ethanol", "water", "--x", "0.30",
                        "--P", "1atm")
    assert code == 0
    assert "Bubble temperature of Ethanol (1) + Water (2) at 101.325 kPa" in out
    assert "354.43 K (81.28 °C)" in out  # virial vapour (the default); Raoult: 354.45 K
    assert "relative volatility" in out and "Screening estimate" in out


def test_json_contract(capsys: pytest.CaptureFixture[str]) -> None:
    code, out, _ = _run(capsys, "calc", "bubble-t", "ethanol", "water", "--x", "0.30",
                        "--P", "101.325kPa", "--json")
    data = json.loads(out)
    assert code == 0
    for key in ("T_K", "P_Pa", "x", "y", "gamma", "K", "alpha12", "converged", "warnings",
                "vapour_model", "phi"):
        assert key in data
    assert data["x"] == pytest.approx([0.3, 0.7])
    assert data["T_K"] == pytest.approx(354.42937, abs=1e-4)  # virial vapour
    assert data["y"][0] + data["y"][1] == pytest.approx(1.0)
    assert data["alpha12"] == pytest.approx(data["K"][0] / data["K"][1])
    assert data["converged"] is True and data["warnings"] == []


def test_either_order_and_any_name(capsys: pytest.CaptureFixture[str]) -> None:
    _, a, _ = _run(capsys, "calc", "bubble-t", "ethanol", "water", "--x", "0.3", "--P",
                   "760mmHg", "--json")
    _, b, _ = _run(capsys, "calc", "bubble-t", "7732-18-5", "Ethyl Alcohol", "--x", "0.7",
                   "--P", "1.01325bar", "--json")
    first, second = json.loads(a), json.loads(b)
    assert first["T_K"] == pytest.approx(second["T_K"], abs=1e-9)
    assert second["components"] == ["water", "ethanol"]
    assert second["y"][::-1] == pytest.approx(first["y"])


def test_mass_fraction_input(capsys: pytest.CaptureFixture[str]) -> None:
    # 50 mass % ethanol: x1 = (0.5/46.0684)/((0.5/46.0684) + (0.5/18.0153)) = 0.28112
    _, out, _ = _run(capsys, "calc", "dew-t", "ethanol", "water", "--y", "0.5", "--mass",
                     "--P", "1atm", "--json")
    data = json.loads(out)
    assert data["y"][0] == pytest.approx(0.28112, abs=2e-5)
    assert data["y_mass"][0] == pytest.approx(0.5, abs=1e-12)


def test_bubble_and_dew_pressure_at_temperature(capsys: pytest.CaptureFixture[str]) -> None:
    _, out, _ = _run(capsys, "calc", "bubble-p", "acetone", "chloroform", "--x", "0.4",
                     "--T", "50C", "--json")
    bubble = json.loads(out)
    _, out, _ = _run(capsys, "calc", "dew-p", "acetone", "chloroform", "--y",
                     repr(bubble["y"][0]), "--T", "323.15K", "--json")
    dew = json.loads(out)
    assert dew["P_Pa"] == pytest.approx(bubble["P_Pa"], rel=1e-9)
    assert dew["x"][0] == pytest.approx(0.4, abs=1e-9)


def test_unknown_component_suggests_names(capsys: pytest.CaptureFixture[str]) -> None:
    code, _, err = _run(capsys, "calc", "bubble-t", "ethanl", "water", "--x", "0.3", "--P",
                        "1atm")
    assert code == 2
    assert "no component matches 'ethanl'" in err and "'ethanol'" in err
    assert "Traceback" not in err


def test_pair_not_catalogued(capsys: pytest.CaptureFixture[str]) -> None:
    code, _, err = _run(capsys, "calc", "bubble-t", "water", "water", "--x", "0.3", "--P", "1atm")
    assert code == 2 and "error" in err


@pytest.mark.parametrize(
    ("args", "message"),
    [
        (["--x", "1.3", "--P", "1atm"], "must lie in [0, 1]"),
        (["--x", "0.3", "--P", "1"], "number followed by a unit"),
        (["--x", "0.3"], "needs a pressure"),
        (["--y", "0.3", "--P", "1atm"], "needs the liquid composition"),
    ],
)
def test_usage_errors(capsys: pytest.CaptureFixture[str], args: list[str], message: str) -> None:
    code, _, err = _run(capsys, "calc", "bubble-t", "ethanol", "water", *args)
    assert code == 2
    assert message in err
    assert "Traceback" not in err


def test_extrapolation_warning(capsys: pytest.CaptureFixture[str]) -> None:
    _, out, _ = _run(capsys, "calc", "bubble-p", "ethanol", "water", "--x", "0.3", "--T",
                     "20C", "--json")
    warnings = json.loads(out)["warnings"]
    assert any("outside the temperature range of the NRTL parameters" in w for w in warnings)


def test_module_entry_point() -> None:
    done = subprocess.run([sys.executable, "-m", "builder", "list"], capture_output=True,
                          text=True, check=True)
    assert "ethanol--water" in done.stdout


def test_azeotrope_json_contract(capsys: pytest.CaptureFixture[str]) -> None:
    """Reference: handbook azeotrope of ethanol-water at 760 mmHg, 78.1 °C and 95.5 weight %
    ethanol, x = 0.893 (Lange's Handbook, 10th ed., table of azeotropes of water, as in
    pairs/binaries/ethanol--water.yaml), to screening tolerance."""
    code, out, _ = _run(capsys, "calc", "azeotrope", "ethanol", "water", "--P", "1atm",
                        "--json")
    data = json.loads(out)
    assert code == 0 and data["search_complete"] is True
    (az,) = data["azeotropes"]
    assert set(az) >= {"x1", "T_K", "P_Pa", "kind", "heterogeneous"}
    assert az["kind"] == "minimum-boiling" and az["heterogeneous"] is False
    assert az["T_K"] == pytest.approx(351.25, abs=1.0)
    assert az["x1"] == pytest.approx(0.893, abs=0.03)
    # in the other order the composition is mirrored
    _, out, _ = _run(capsys, "calc", "azeotrope", "water", "ethanol", "--P", "1atm", "--json")
    assert json.loads(out)["azeotropes"][0]["x1"] == pytest.approx(1 - az["x1"], abs=1e-9)


def test_empty_azeotrope_list_means_searched(capsys: pytest.CaptureFixture[str]) -> None:
    _, out, _ = _run(capsys, "calc", "azeotrope", "benzene", "toluene", "--P", "1atm", "--json")
    data = json.loads(out)
    assert data["azeotropes"] == [] and data["search_complete"] is True


def test_volatility_and_quicklook_commands(capsys: pytest.CaptureFixture[str]) -> None:
    _, out, _ = _run(capsys, "calc", "volatility", "benzene", "toluene", "--P", "1atm",
                     "--json")
    data = json.loads(out)
    assert len(data["table"]) == 21 and data["grade"] == "easy"
    assert data["table"][0]["alpha12"] == pytest.approx(data["alpha12_infinite_dilution"][0])
    code, out, _ = _run(capsys, "calc", "quicklook", "benzene", "toluene", "--P", "1atm")
    assert code == 0 and "minimum theoretical stages" in out and "Fenske" in out
    code, _, err = _run(capsys, "calc", "quicklook", "benzene", "toluene", "--T", "90C")
    assert code == 2 and "isobar" in err


def test_azeotrope_trace_against_pressure(capsys: pytest.CaptureFixture[str]) -> None:
    """Acetone-methanol: the azeotrope moves towards acetone as pressure falls (a known
    pressure-swing candidate; common practice) and the trace says so."""
    code, out, _ = _run(capsys, "calc", "azeotrope", "acetone", "methanol", "--P", "1atm",
                        "--trace", "--json")
    trace = json.loads(out)["trace"]
    assert code == 0 and trace["pressure_sensitive"] is True
    xs = [x for x in trace["x1"] if x is not None]
    assert xs == sorted(xs, reverse=True)  # richer in acetone at lower pressure
    assert trace["shift_x1"] >= 0.05
    assert 101325.0 in trace["P_Pa"]
