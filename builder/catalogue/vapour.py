"""Catalogue fields of the vapour treatment: a component's virial constants, a pair's vapour.

Component (optional block, needed by the default virial vapour)::

    virial:
      class: ketone                 # a Tsonopoulos class (builder.thermo.virial)
      dipole_moment: 2.9 D          # debye; needed by the polar classes that use it
      critical_volume: 213 cm3/mol
      dimerisation: {A: -12.5454, B: 3166 K, source: {...}}   # acids: log10(K/Pa⁻¹) = A + B/T
      source: {ref: ..., where: ...}   # or {value: ..., source: ...} per value

Pair (optional block; default ``virial`` when both components have virial
constants, else ``ideal-gas``)::

    vapour:
      model: virial                 # ideal-gas, virial, associating, peng-robinson
      kij: 0.0033                   # peng-robinson: required; virial: optional cross k12
      T_range: [250 K, 420 K]       # peng-robinson: where the kij was fitted
      quality: unverified           # peng-robinson: as the activity qualities
      source: {ref: ..., where: ...}   # required with a kij

The loader calls :func:`component_virial` and :func:`pair_vapour` with its
own entry objects (typed access that records located errors) and its source
reader, and :func:`vapour_model_for` builds the thermodynamic model.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Mapping
from dataclasses import dataclass
from typing import Any

import numpy as np

from builder.catalogue.records import Component, Source
from builder.thermo.association import DimerisingVapour
from builder.thermo.cubic import CubicMixture
from builder.thermo.units import UnitError, split_quantity
from builder.thermo.vapour import IDEAL_GAS, VapourModel, VirialComponent, VirialVapour
from builder.thermo.virial import TSONOPOULOS_CLASSES, tsonopoulos_polar_parameters

__all__ = ["VAPOUR_MODELS", "PairVapour", "VirialConstants", "component_virial", "pair_vapour",
           "vapour_model_for", "vapour_text"]

#: Vapour treatments a pair may name, and when each applies.
VAPOUR_MODELS = {
    "ideal-gas": "ideal-gas vapour (modified Raoult's law); low pressure only",
    "virial": "second virial coefficients (Tsonopoulos) with Poynting factors (γ–φ); "
              "the default up to moderate pressure",
    "peng-robinson": "Peng–Robinson equation of state for both phases (φ–φ); light "
                     "hydrocarbons and gases at high pressure, up to the critical region",
    "associating": "chemical theory of vapour dimerisation (carboxylic acids: self- and "
                   "cross-dimers) with Poynting factors (γ–φ); only with activity parameters "
                   "regressed with it",
}

#: Classes whose polar parameter needs the dipole moment.
_NEEDS_DIPOLE = {c for c in TSONOPOULOS_CLASSES if c not in ("normal", "methanol", "water")}

SourceReader = Callable[..., "Source | None"]


@dataclass(frozen=True)
class VirialConstants:
    """A component's constants for its second virial coefficient (and its dimerisation)."""

    species_class: str
    dipole_debye: float
    critical_volume_m3_per_mol: float
    a: float
    b: float
    sources: dict[str, Source]
    #: ``log10(K / Pa⁻¹) = A + B/T`` of vapour dimerisation (carboxylic acids), or None.
    dimerisation_A: float | None = None
    dimerisation_B_K: float | None = None


@dataclass(frozen=True)
class PairVapour:
    """A pair's vapour treatment as the catalogue gives it."""

    model: str
    kij: float | None = None
    source: Source | None = None
    quality: str = ""
    T_min_K: float = math.nan
    T_max_K: float = math.nan
    given: bool = False  # written in the pair file (else the default)


def _dipole(entry: Any, name: str, raw: Any) -> float:
    if isinstance(raw, str):
        try:
            number, unit = split_quantity(raw)
        except UnitError:
            unit = ""
        if unit == "D" and number >= 0:
            return number
    entry.fail(name, "a dipole moment in debye, such as '2.9 D'", raw)
    return math.nan


def component_virial(entry: Any, Tc_K: float, Pc_Pa: float, read_source: SourceReader,
                     references: Mapping[str, Any]) -> VirialConstants | None:
    """Read a component's ``virial`` block (the loader passes the block's entry)."""
    species_class = entry.choice("class", tuple(TSONOPOULOS_CLASSES))
    default_source = read_source(entry, "source", references, required=False)
    values: dict[str, float] = {}
    sources: dict[str, Source] = {}
    for key in ("dipole_moment", "critical_volume"):
        if not entry.has(key):
            continue
        raw = entry.raw(key)
        own = None
        if isinstance(raw, Mapping):
            sub = entry.child(key)
            raw = sub.raw("value")
            own = read_source(sub, "source", references)
            sub.finish()
        if key == "dipole_moment":
            values[key] = _dipole(entry, key, raw)
        else:
            values[key] = entry.convert(key, raw, "molar_volume")
        chosen = own or default_source
        if chosen is None:
            entry.fail(key, "a source (a 'source' block here or {value, source})", raw)
        else:
            sources[key] = chosen
    dimer_A = dimer_B = None
    dimer = entry.child("dimerisation", None)
    if dimer is not None:
        dimer_A = dimer.number("A")
        raw_B = dimer.raw("B", expected="a temperature coefficient such as '3166 K'")
        dimer_B = _kelvin(dimer, "B", raw_B)
        if read_source(dimer, "source", references) is None:
            dimer_A = None
        dimer.finish()
    entry.used.add("critical_volume")
    if "critical_volume" not in values:
        entry.fail("critical_volume", "a critical volume with a unit, such as '213 cm3/mol'",
                   "nothing (the field is missing)")
    if species_class in _NEEDS_DIPOLE and "dipole_moment" not in values:
        entry.fail("dipole_moment", f"a dipole moment (class {species_class!r} needs it)",
                   "nothing (the field is missing)")
    entry.finish()
    if not entry.ok or not species_class:
        return None
    dipole = values.get("dipole_moment", 0.0)
    a, b = tsonopoulos_polar_parameters(species_class, dipole, Tc_K, Pc_Pa)
    return VirialConstants(species_class, dipole, values["critical_volume"], a, b, sources,
                           dimer_A, dimer_B)


def _kelvin(entry: Any, name: str, raw: Any) -> float:
    if isinstance(raw, str):
        try:
            number, unit = split_quantity(raw)
        except UnitError:
            unit = ""
        if unit == "K":
            return number
    entry.fail(name, "a coefficient in K, such as '3166 K' (log10(K/Pa⁻¹) = A + B/T)", raw)
    return math.nan


def pair_vapour(entry: Any, read_source: SourceReader, references: Mapping[str, Any],
                qualities: tuple[str, ...]) -> PairVapour:
    """Read a pair's ``vapour`` block (the loader passes the block's entry, or None)."""
    if entry is None:
        return PairVapour(model="")
    model = entry.choice("model", tuple(VAPOUR_MODELS))
    kij = None
    if entry.has("kij"):
        kij = entry.number("kij")
        if math.isfinite(kij) and not (-0.5 < kij < 0.5):
            entry.fail("kij", "a binary interaction parameter between -0.5 and 0.5", kij)
    elif model == "peng-robinson":
        entry.fail("kij", "the published binary interaction parameter k12 (a number)",
                   "nothing (the field is missing)")
    source = read_source(entry, "source", references, required=kij is not None)
    quality = entry.choice("quality", qualities, "" if model != "peng-robinson" else ...)
    T_min = T_max = math.nan
    if entry.has("T_range"):
        T_range = entry.raw("T_range")
        if isinstance(T_range, list) and len(T_range) == 2:
            T_min = entry.convert("T_range", T_range[0], "temperature")
            T_max = entry.convert("T_range", T_range[1], "temperature")
            if T_min >= T_max:
                entry.fail("T_range", "a lower then a higher temperature", T_range)
        else:
            entry.fail("T_range", "a list of two temperatures, such as ['250 K', '420 K']",
                       T_range)
    elif model == "peng-robinson":
        entry.fail("T_range", "the temperature range of the data the kij was fitted to",
                   "nothing (the field is missing)")
    entry.finish()
    return PairVapour(model=model, kij=kij, source=source, quality=quality, T_min_K=T_min,
                      T_max_K=T_max, given=True)


def vapour_text(name: str) -> str:
    """The vapour treatment in words, for pages.

    >>> vapour_text("ideal-gas")
    "ideal-gas vapour (modified Raoult's law); low pressure only"
    """
    return VAPOUR_MODELS.get(name, name)


def vapour_model_for(vapour: PairVapour, c1: Component, c2: Component) -> VapourModel:
    """The vapour model of a pair (components in the record's order)."""
    model = vapour.model or ("virial" if c1.virial and c2.virial else "ideal-gas")
    if model == "peng-robinson":
        return CubicMixture((c1.critical_temperature_K, c2.critical_temperature_K),
                            (c1.critical_pressure_Pa, c2.critical_pressure_Pa),
                            (c1.acentric_factor, c2.acentric_factor), vapour.kij or 0.0)
    if model == "associating" and c1.virial and c2.virial:
        return DimerisingVapour(
            A=(_or(c1.virial.dimerisation_A, -np.inf), _or(c2.virial.dimerisation_A, -np.inf)),
            B=(_or(c1.virial.dimerisation_B_K, 0.0), _or(c2.virial.dimerisation_B_K, 0.0)),
            liquid_volume_m3_per_mol=(c1.liquid_molar_volume_m3_per_mol,
                                      c2.liquid_molar_volume_m3_per_mol))
    if model == "virial" and c1.virial and c2.virial:
        return VirialVapour(_virial_component(c1), _virial_component(c2), vapour.kij)
    return IDEAL_GAS


def _or(value: float | None, default: float) -> float:
    return default if value is None else value


def _virial_component(c: Component) -> VirialComponent:
    v = c.virial
    assert v is not None
    return VirialComponent(c.critical_temperature_K, c.critical_pressure_Pa,
                           v.critical_volume_m3_per_mol, c.acentric_factor, v.a, v.b,
                           c.liquid_molar_volume_m3_per_mol)
