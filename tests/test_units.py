"""Unit parsing at the edges. Reference: the SI Brochure (BIPM, 9th ed., 2019) definitions
of the atmosphere (101 325 Pa), the mmHg/torr (101 325/760 Pa), the bar (1e5 Pa), the
thermochemical calorie (4.184 J) and the Celsius/Fahrenheit scales (common practice)."""

import math

import pytest

from builder.thermo.units import UnitError, parse_quantity, to_si


@pytest.mark.parametrize(
    ("text", "expected"),
    [
        ("101.325kPa", 101325.0),
        ("1atm", 101325.0),
        ("760mmHg", 101325.0),
        ("760 torr", 101325.0),
        ("1.2bar", 120000.0),
        ("0.1 MPa", 100000.0),
        ("14.695948775 psi", 101325.0),
    ],
)
def test_pressures(text: str, expected: float) -> None:
    assert parse_quantity(text, "pressure") == pytest.approx(expected, rel=1e-9)


@pytest.mark.parametrize(
    ("text", "expected"),
    [("78C", 351.15), ("351.4K", 351.4), ("172F", 350.9277777777778), ("-40 °F", 233.15),
     ("25 degC", 298.15), ("671.67 R", 373.15)],
)
def test_temperatures(text: str, expected: float) -> None:
    assert parse_quantity(text, "temperature") == pytest.approx(expected, abs=1e-9)


def test_energies_and_gas_constant() -> None:
    assert to_si(1.0, "cal/mol", "molar_energy") == 4.184
    # "K" as an energy unit means E/R.
    assert to_si(100.0, "K", "molar_energy") == pytest.approx(831.4462618)


@pytest.mark.parametrize("text", ["5", "kPa", "1 furlong", "-300 C", "0 Pa", "nan K"])
def test_bad_quantities_are_rejected(text: str) -> None:
    dimension = "temperature" if text.endswith(("C", "K")) else "pressure"
    with pytest.raises(UnitError):
        value = parse_quantity(text, dimension)
        assert math.isfinite(value)


def test_wrong_dimension_names_the_alternatives() -> None:
    with pytest.raises(UnitError, match=r"not a pressure unit.*kPa"):
        parse_quantity("20 C", "pressure")
