"""Units at the edges: parse quantities written by people, convert to SI.

Everything inside the package is SI (K, Pa, mol/mol, kg/mol, m³/mol, J/mol).
This module is the only place that knows about °C, atm, mmHg, cal/mol and
friends.  A quantity is written as a number followed by a unit, with or
without a space: ``"101.325 kPa"``, ``"1atm"``, ``"78C"``, ``"351.4 K"``.

>>> parse_quantity("1atm", "pressure")
101325.0
>>> round(parse_quantity("78 °C", "temperature"), 2)
351.15
>>> round(parse_quantity("172F", "temperature"), 3)
350.928
"""

from __future__ import annotations

import math
import re
from collections.abc import Callable

__all__ = [
    "GAS_CONSTANT_J_PER_MOL_K",
    "UNITS",
    "UnitError",
    "format_pressure",
    "format_temperature",
    "parse_quantity",
    "split_quantity",
    "to_si",
]

#: Molar gas constant, J/(mol K) (CODATA 2018, exact since the 2019 SI redefinition).
GAS_CONSTANT_J_PER_MOL_K = 8.314462618

#: Thermochemical calorie, J (common practice in the VLE literature, e.g. DECHEMA).
CALORIE_J = 4.184

_ZERO_CELSIUS_K = 273.15


class UnitError(ValueError):
    """A quantity could not be read or has the wrong kind of unit."""


def _scale(factor: float) -> Callable[[float], float]:
    return lambda value: value * factor


# Each dimension maps unit spellings to a function converting a value to SI.
UNITS: dict[str, dict[str, Callable[[float], float]]] = {
    "temperature": {
        "K": _scale(1.0),
        "C": lambda v: v + _ZERO_CELSIUS_K,
        "°C": lambda v: v + _ZERO_CELSIUS_K,
        "degC": lambda v: v + _ZERO_CELSIUS_K,
        "F": lambda v: (v - 32.0) * 5.0 / 9.0 + _ZERO_CELSIUS_K,
        "°F": lambda v: (v - 32.0) * 5.0 / 9.0 + _ZERO_CELSIUS_K,
        "degF": lambda v: (v - 32.0) * 5.0 / 9.0 + _ZERO_CELSIUS_K,
        "R": _scale(5.0 / 9.0),
    },
    "pressure": {
        "Pa": _scale(1.0),
        "kPa": _scale(1e3),
        "MPa": _scale(1e6),
        "bar": _scale(1e5),
        "mbar": _scale(1e2),
        "atm": _scale(101325.0),
        "mmHg": _scale(101325.0 / 760.0),
        "torr": _scale(101325.0 / 760.0),
        "Torr": _scale(101325.0 / 760.0),
        "psi": _scale(6894.757293168),
        "psia": _scale(6894.757293168),
    },
    # Molar energies; "K" means the energy divided by the gas constant (E/R),
    # as many published parameter tables print it.
    "molar_energy": {
        "J/mol": _scale(1.0),
        "kJ/mol": _scale(1e3),
        "cal/mol": _scale(CALORIE_J),
        "kcal/mol": _scale(1e3 * CALORIE_J),
        "K": _scale(GAS_CONSTANT_J_PER_MOL_K),
    },
    "molar_mass": {
        "kg/mol": _scale(1.0),
        "g/mol": _scale(1e-3),
        "kg/kmol": _scale(1e-3),
    },
    "molar_volume": {
        "m3/mol": _scale(1.0),
        "cm3/mol": _scale(1e-6),
        "L/mol": _scale(1e-3),
        "m3/kmol": _scale(1e-3),
    },
}

#: SI unit of each dimension, for messages and output labels.
SI_UNIT = {
    "temperature": "K",
    "pressure": "Pa",
    "molar_energy": "J/mol",
    "molar_mass": "kg/mol",
    "molar_volume": "m3/mol",
}

_QUANTITY = re.compile(r"^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(1/\S+|[^\s\d].*?)\s*$")


def split_quantity(text: str) -> tuple[float, str]:
    """Split ``"101.325 kPa"`` into ``(101.325, "kPa")``.

    >>> split_quantity("-10.5degC")
    (-10.5, 'degC')
    """
    match = _QUANTITY.match(text)
    if not match:
        raise UnitError(f"expected a number followed by a unit, found {text!r}")
    return float(match.group(1)), match.group(2)


def to_si(value: float, unit: str, dimension: str) -> float:
    """Convert ``value`` in ``unit`` to the SI unit of ``dimension``.

    >>> to_si(1.0, "kcal/mol", "molar_energy")
    4184.0
    """
    table = UNITS[dimension]
    if unit not in table:
        known = ", ".join(table)
        kind = dimension.replace("_", " ")
        raise UnitError(f"unit {unit!r} is not a {kind} unit (use one of {known})")
    result = table[unit](value)
    if not math.isfinite(result):
        raise UnitError(f"{value} {unit} is not a finite {dimension.replace('_', ' ')}")
    return result


def parse_quantity(text: str, dimension: str) -> float:
    """Read a quantity such as ``"760mmHg"`` and return it in SI units."""
    value, unit = split_quantity(text)
    result = to_si(value, unit, dimension)
    if dimension == "temperature" and result <= 0.0:
        raise UnitError(f"{text!r} is at or below absolute zero")
    if dimension == "pressure" and result <= 0.0:
        raise UnitError(f"{text!r} is not a positive pressure")
    return result


def format_temperature(T_K: float) -> str:
    """``351.44 K (78.29 °C)``, for readable output.

    >>> format_temperature(351.44)
    '351.44 K (78.29 °C)'
    """
    return f"{T_K:.2f} K ({T_K - _ZERO_CELSIUS_K:.2f} °C)"


def format_pressure(P_Pa: float) -> str:
    """``101.325 kPa``, for readable output.

    >>> format_pressure(101325.0)
    '101.325 kPa'
    """
    return f"{P_Pa / 1e3:.6g} kPa"
