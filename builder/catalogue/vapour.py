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
from collections.abc import Callable
from dataclasses import dataclass
from typing import Any

import numpy as np

from builder.catalogue.records import Component, Source
from builder.thermo.association import DimerisingVapour
from builder.thermo.cubic import CubicMixture
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
                   "cross-dimers) with Poynting factors (γ–φ); with fitted sets regressed "
                   "with it, and with the group-contribution prediction of a pair with an "
                   "acid",
}

#: Classes whose polar parameter needs the dipole moment.
_NEEDS_DIPOLE = {c for c in TSONOPOULOS_CLASSES if c not in ("normal", "methanol", "water")}



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


def component_virial(entry: Any, Tc_K: float, Pc_Pa: float,
                     sourced: Callable[[Any, str], tuple[Any, Source | None]],
                     source: Callable[[Any], Source | None]) -> VirialConstants | None:
    """Read a component's ``virial`` block (the loader passes the block's entry and its
    readers of ``{value, source}`` values and of ``source`` blocks)."""
    species_class = entry.get("class") or ""
    default_source = source(entry)
    values: dict[str, float] = {}
    sources: dict[str, Source] = {}
    for key in ("dipole_moment", "critical_volume"):
        value, own = sourced(entry, key)
        if value is None:
            continue
        values[key] = float(value)
        chosen = own or default_source
        if chosen is None:
            entry.fail(key, "a source (a 'source' block here or {value, source})", value)
        else:
            sources[key] = chosen
    if species_class in _NEEDS_DIPOLE and "dipole_moment" not in values:
        entry.fail("dipole_moment", f"a dipole moment (class {species_class!r} needs it)",
                   "nothing (the field is missing)")
    dimer_A = dimer_B = None
    dimer = entry.child("dimerisation")
    if dimer is not None:
        dimer_A, dimer_B = dimer.get("A"), dimer.get("B")
        source(dimer)
        dimer.finish()
    entry.finish()
    if not entry.ok or not species_class or "critical_volume" not in values:
        return None
    dipole = values.get("dipole_moment", 0.0)
    a, b = tsonopoulos_polar_parameters(species_class, dipole, Tc_K, Pc_Pa)
    return VirialConstants(species_class, dipole, values["critical_volume"], a, b, sources,
                           dimer_A, dimer_B)


def pair_vapour(entry: Any, source: Callable[[Any], Source | None]) -> PairVapour:
    """Read a pair's ``vapour`` block (the loader passes the block's entry, or None)."""
    if entry is None:
        return PairVapour(model="")
    model = entry.get("model") or ""
    kij = entry.get("kij")
    T_range = entry.get("T_range")
    quality = entry.get("quality") or ""
    found_source = source(entry)
    if model == "peng-robinson":
        for name, value, expected in (
                ("kij", kij, "the published binary interaction parameter k12 (a number)"),
                ("T_range", T_range, "the temperatures the kij applies to"),
                ("quality", quality or None, "the quality of the kij"),
                ("source", found_source, "the source of the kij")):
            if value is None:
                entry.fail(name, expected, "nothing (the field is missing)")
    elif kij is not None and found_source is None:
        entry.fail("source", "the source of the kij", "nothing (the field is missing)")
    entry.finish()
    T_min, T_max = T_range if T_range is not None else (math.nan, math.nan)
    return PairVapour(model=model, kij=kij, source=found_source, quality=quality,
                      T_min_K=T_min, T_max_K=T_max, given=True)


def vapour_text(name: str) -> str:
    """The vapour treatment in words, for pages.

    >>> vapour_text("ideal-gas")
    "ideal-gas vapour (modified Raoult's law); low pressure only"
    """
    return VAPOUR_MODELS.get(name, name)


def vapour_model_for(vapour: PairVapour, c1: Component, c2: Component) -> VapourModel:
    """The vapour model of a pair (components in the record's order).

    Without a ``vapour`` block (a predicted pair, or a fitted one that names
    none): the dimerising vapour when a component is a carboxylic acid with
    dimerisation constants (an acid's vapour is mostly dimers near its boiling
    point, and the published modified UNIFAC (Dortmund) parameters of the acid
    group were fitted with the vapour's association accounted for: Gmehling,
    Li and Schiller 1993, from memory; verify), else virial when both
    components have virial constants, else an ideal gas.  Against the fitted
    acid sets of the catalogue (regressed with a dimerising vapour) the
    prediction agrees within 0.7-1.6 K in bubble temperature at 101.325 kPa
    with this vapour, 1.7-3.3 K with the ideal gas.
    """
    model = vapour.model or _default_vapour(c1, c2)
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


def _default_vapour(c1: Component, c2: Component) -> str:
    if not (c1.virial and c2.virial):
        return "ideal-gas"
    dimerises = any(c.virial is not None and c.virial.dimerisation_A is not None
                    for c in (c1, c2))
    return "associating" if dimerises else "virial"


def _or(value: float | None, default: float) -> float:
    return default if value is None else value


def _virial_component(c: Component) -> VirialComponent:
    v = c.virial
    assert v is not None
    return VirialComponent(c.critical_temperature_K, c.critical_pressure_Pa,
                           v.critical_volume_m3_per_mol, c.acentric_factor, v.a, v.b,
                           c.liquid_molar_volume_m3_per_mol)
