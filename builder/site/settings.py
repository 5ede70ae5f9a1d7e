"""Site-level settings: title, units shown on pages, the summary pressure.

Read from a small YAML file (``site.yaml`` at the repository root by default);
every field has a sensible default, so the file and each field are optional::

    title: VLE atlas
    description: Binary vapour-liquid phase diagrams for screening
    organisation: ""            # shown in the footer, e.g. the owning department
    units:
      temperature: C            # C or K, on pages, tables and figures
      pressure: kPa             # Pa, kPa, MPa, bar, mbar, atm, mmHg, psi
    summary_pressure: 101.325 kPa   # the isobar of the summary box and the index
    second_opinion: true        # fitted pages beside the predictive model (UNIFAC)
    predicted_pairs: none       # pages of combinations without a fitted set: none, all,
                                # or a list of component ids (the combinations among them)

Downloads (CSV, ``atlas.json``) are always in SI (K, Pa), whatever is shown.
The pressures and temperatures each pair publishes come from its catalogue
entry (``publish:``, 1 atm when it names none); the summary pressure chooses
which of its isobars the summary box and the index columns report.

A bad value is reported like a catalogue error: file, field, what was
expected and what was found (:class:`SettingsError`).
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import yaml

from builder.errors import AtlasError
from builder.thermo.units import UNITS, UnitError, parse_quantity

__all__ = ["DEFAULT_SETTINGS_FILE", "SettingsError", "SiteSettings", "load_settings"]

#: The settings file of the shipped atlas.
DEFAULT_SETTINGS_FILE = Path(__file__).resolve().parent.parent.parent / "site.yaml"

TEMPERATURE_UNITS = ("C", "K")
PRESSURE_UNITS = ("Pa", "kPa", "MPa", "bar", "mbar", "atm", "mmHg", "psi")


@dataclass
class SettingsError(AtlasError, ValueError):
    """One bad value in the settings file."""

    file: str
    field: str
    expected: str
    found: str

    def __str__(self) -> str:
        return f"{self.file}: field {self.field!r}: expected {self.expected}; found {self.found}"


@dataclass(frozen=True)
class SiteSettings:
    """Validated site settings (SI inside: ``summary_pressure_Pa``)."""

    title: str = "VLE atlas"
    description: str = "Binary vapour–liquid phase diagrams for screening"
    organisation: str = ""
    temperature_unit: str = "C"
    pressure_unit: str = "kPa"
    summary_pressure_Pa: float = 101325.0
    #: Compute the predictive model beside every fitted pair (builder.analysis.second_opinion).
    second_opinion: bool = True
    #: Predicted pair pages: () none, ("all",) every combination, or component ids.
    predicted_pairs: tuple[str, ...] = ()
    file: str = "(defaults)"

    def __post_init__(self) -> None:
        def fail(field: str, expected: str, found: object) -> None:
            raise SettingsError(self.file, field, expected, repr(found))

        for name in ("title", "description", "organisation"):
            value = getattr(self, name)
            if not isinstance(value, str) or "\n" in value or len(value) > 200:
                fail(name, "one line of text (at most 200 characters)", value)
        if not self.title.strip():
            fail("title", "a non-empty text", self.title)
        if self.temperature_unit not in TEMPERATURE_UNITS:
            fail("units.temperature", f"one of {', '.join(TEMPERATURE_UNITS)}",
                 self.temperature_unit)
        if self.pressure_unit not in PRESSURE_UNITS:
            fail("units.pressure", f"one of {', '.join(PRESSURE_UNITS)}", self.pressure_unit)
        if not (math.isfinite(self.summary_pressure_Pa) and self.summary_pressure_Pa > 0):
            fail("summary_pressure", "a positive pressure", self.summary_pressure_Pa)

    @property
    def temperature_symbol(self) -> str:
        return "°C" if self.temperature_unit == "C" else "K"

    @property
    def pressure_factor(self) -> float:
        """Pascals per displayed pressure unit."""
        return UNITS["pressure"][self.pressure_unit](1.0)


_FIELDS = {"title", "description", "organisation", "units", "summary_pressure",
           "second_opinion", "predicted_pairs"}
_UNIT_FIELDS = {"temperature", "pressure"}


def load_settings(path: Path | str | None = None) -> SiteSettings:
    """Read the settings file; ``None`` means the shipped ``site.yaml`` (defaults if absent)."""
    if path is None:
        if not DEFAULT_SETTINGS_FILE.is_file():
            return SiteSettings()
        path = DEFAULT_SETTINGS_FILE
    path = Path(path)
    name = str(path)
    if not path.is_file():
        raise SettingsError(name, "", "a settings file", "no such file")
    try:
        data = yaml.safe_load(path.read_text(encoding="utf-8"))
    except yaml.YAMLError as error:
        raise SettingsError(name, "", "valid YAML", str(error).replace("\n", " ")) from None
    if data is None:
        data = {}
    if not isinstance(data, Mapping):
        raise SettingsError(name, "", "a mapping of field names to values", repr(data))
    for key in data:
        if key not in _FIELDS:
            raise SettingsError(name, str(key), f"only known fields ({', '.join(sorted(_FIELDS))})",
                                "an unknown field")
    units: Any = data.get("units") or {}
    if not isinstance(units, Mapping):
        raise SettingsError(name, "units", "a mapping with temperature and pressure", repr(units))
    for key in units:
        if key not in _UNIT_FIELDS:
            raise SettingsError(name, f"units.{key}", "only temperature and pressure",
                                "an unknown field")
    kwargs: dict[str, Any] = {"file": name}
    for key in ("title", "description", "organisation"):
        if key in data:
            kwargs[key] = data[key] if isinstance(data[key], str) else repr(data[key])
    temperature = str(units.get("temperature", "C")).replace("°", "")
    kwargs["temperature_unit"] = temperature
    kwargs["pressure_unit"] = str(units.get("pressure", "kPa"))
    if "summary_pressure" in data:
        raw = data["summary_pressure"]
        try:
            kwargs["summary_pressure_Pa"] = parse_quantity(str(raw), "pressure")
        except UnitError:
            raise SettingsError(name, "summary_pressure",
                                "a pressure with a unit, such as '101.325 kPa' or '1 atm'",
                                repr(raw)) from None
    if "second_opinion" in data:
        if not isinstance(data["second_opinion"], bool):
            raise SettingsError(name, "second_opinion", "true or false",
                                repr(data["second_opinion"]))
        kwargs["second_opinion"] = data["second_opinion"]
    if "predicted_pairs" in data:
        kwargs["predicted_pairs"] = _predicted_pairs(name, data["predicted_pairs"])
    return SiteSettings(**kwargs)


def _predicted_pairs(file: str, raw: Any) -> tuple[str, ...]:
    if raw in (None, "none", False):
        return ()
    if raw == "all":
        return ("all",)
    if isinstance(raw, list) and raw and all(isinstance(v, str) and v for v in raw):
        return tuple(raw)
    raise SettingsError(file, "predicted_pairs",
                        "'none', 'all' or a list of component ids", repr(raw))
