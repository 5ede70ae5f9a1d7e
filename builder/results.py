"""Everything the atlas publishes about one pair, computed before anything is written.

:func:`compute_pair` turns a catalogue pair into a :class:`PairResults`: for
each published isobar and isotherm the curve, which points are extrapolated,
the azeotropes, the relative-volatility summary and table, and the warnings a
reader must see.  Figures and pages read these records; they never compute
thermodynamics themselves.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np
from numpy.typing import NDArray

from . import curves, stability
from . import equilibrium as eq
from .azeotropes import KIND_ISOBAR, KIND_ISOTHERM, Azeotrope, find_azeotropes, search_grid
from .catalogue import Catalogue
from .point import system_for
from .records import Component, PairRecord
from .volatility import Volatility, volatility

__all__ = ["ConditionResult", "PairResults", "compute_atlas", "compute_pair"]

ATMOSPHERIC_PA = 101325.0


@dataclass(frozen=True)
class ConditionResult:
    """One isobar (``kind == "isobar"``, fixed ``P_Pa``) or isotherm (fixed ``T_K``)."""

    kind: str
    condition: float  # P in Pa for an isobar, T in K for an isotherm
    curve: curves.Curve
    drawable: NDArray[np.bool_]  # converged points of a stable one-liquid region
    extrapolated: NDArray[np.bool_]  # per point: outside a correlation's validity range
    azeotropes: tuple[Azeotrope, ...]
    azeotrope_search_complete: bool
    volatility: Volatility
    warnings: tuple[str, ...] = ()
    liquid_stable: NDArray[np.bool_] | None = None  # per point, tangent-plane test
    three_phase: stability.ThreePhase | None = None

    @property
    def label(self) -> str:
        if self.kind == "isobar":
            return f"{self.condition / 1e3:.6g} kPa"
        return f"{self.condition - 273.15:.6g} °C"

    @property
    def slug(self) -> str:
        """A file-name-safe id: ``isobar-101.325kPa`` or ``isotherm-70C``."""
        if self.kind == "isobar":
            return f"isobar-{self.condition / 1e3:.6g}kPa"
        return f"isotherm-{self.condition - 273.15:.6g}C"


@dataclass(frozen=True)
class PairResults:
    """All computed results of one pair, components in the record's order."""

    pair: PairRecord
    component1: Component
    component2: Component
    isobars: tuple[ConditionResult, ...]
    isotherms: tuple[ConditionResult, ...]
    warnings: tuple[str, ...] = field(default=())

    @property
    def conditions(self) -> tuple[ConditionResult, ...]:
        return self.isobars + self.isotherms

    def at_atmospheric(self) -> ConditionResult | None:
        """The 101.325 kPa isobar, if published."""
        for result in self.isobars:
            if abs(result.condition - ATMOSPHERIC_PA) < 1.0:
                return result
        return None


def _extrapolated(pair: PairRecord, c1: Component, c2: Component,
                  T_K: NDArray[np.float64]) -> NDArray[np.bool_]:
    outside = (T_K < pair.T_min_K) | (T_K > pair.T_max_K)
    for component in (c1, c2):
        vp = component.vapour_pressure
        outside |= (T_K < vp.T_min_K) | (T_K > vp.T_max_K)
    return np.asarray(outside, dtype=bool)


def _condition(catalogue: Catalogue, pair: PairRecord, kind: str, value: float
               ) -> ConditionResult:
    system = system_for(pair, catalogue)
    c1 = catalogue.components[pair.component1]
    c2 = catalogue.components[pair.component2]
    isobar = kind == "isobar"
    curve = curves.isobar(system, value) if isobar else curves.isotherm(system, value)
    warnings: list[str] = []
    liquid_stable = stability.stable(pair.model, curve.x1, curve.T_K)
    three_phase = None
    inside_gap = ~liquid_stable
    if not liquid_stable.all():
        if isobar:
            guess = float(np.min(curve.T_K[~liquid_stable & curve.converged]))
            three_phase = stability.three_phase_isobar(system, value, guess)
        else:
            three_phase = stability.three_phase_isotherm(system, value)
        if three_phase is None:
            warnings.append("the model predicts two liquids here but the three-phase point "
                            "could not be located; the curve inside that region is not drawn")
        else:
            inside_gap = (curve.x1 > three_phase.x1_a) & (curve.x1 < three_phase.x1_b)
            inside_gap |= ~liquid_stable
    search = find_azeotropes(system, P_Pa=value if isobar else None,
                             T_K=None if isobar else value,
                             exclude=None if liquid_stable.all() else _search_exclusion(
                                 system, pair, value, isobar, three_phase))
    found = list(search.azeotropes)
    if three_phase is not None and three_phase.heterogeneous_azeotrope:
        found.append(Azeotrope(
            x1=three_phase.y1, T_K=three_phase.T_K, P_Pa=three_phase.P_Pa,
            kind=(KIND_ISOBAR if isobar else KIND_ISOTHERM)[True], heterogeneous=True,
            liquid_x1=(three_phase.x1_a, three_phase.x1_b)))
        found.sort(key=lambda a: a.x1)
    drawable = curve.converged & ~inside_gap
    extrapolated = _extrapolated(pair, c1, c2, curve.T_K)
    failed = int((~curve.converged).sum())
    if failed:
        warnings.append(f"{failed} of {curve.x1.size} points did not converge and are not drawn")
    if extrapolated.any():
        share = extrapolated.mean()
        warnings.append(f"{share:.0%} of the curve lies outside the validity range of a "
                        "correlation (drawn dashed)")
    for component in (c1, c2):
        T_max = float(np.nanmax(curve.T_K))
        if T_max >= component.critical_temperature_K:
            warnings.append(f"{component.name} is above its critical temperature "
                            f"({component.critical_temperature_K:.1f} K) on part of this "
                            "curve: the modified Raoult's law does not apply there")
    if not search.complete:
        warnings.append("the azeotrope search could not cover the whole composition range")
    vol = volatility(system, curve.x1, curve.alpha12, drawable,
                     P_Pa=value if isobar else None, T_K=None if isobar else value,
                     has_azeotrope=bool(found))
    return ConditionResult(kind=kind, condition=value, curve=curve, drawable=drawable,
                           extrapolated=extrapolated, azeotropes=tuple(found),
                           azeotrope_search_complete=search.complete, volatility=vol,
                           warnings=tuple(warnings), liquid_stable=liquid_stable,
                           three_phase=three_phase)


def _search_exclusion(system: eq.BinarySystem, pair: PairRecord, value: float, isobar: bool,
                      three_phase: stability.ThreePhase | None) -> NDArray[np.bool_]:
    """Grid points of the azeotrope search that lie in the two-liquid region."""
    grid = search_grid()
    if three_phase is not None:
        return np.asarray((grid > three_phase.x1_a) & (grid < three_phase.x1_b))
    result = (eq.bubble_temperature(system, grid, value) if isobar
              else eq.bubble_pressure(system, grid, value))
    return ~stability.stable(pair.model, grid, result.T_K)


def compute_pair(catalogue: Catalogue, pair: PairRecord) -> PairResults:
    """Compute every published condition of ``pair``."""
    return PairResults(
        pair=pair,
        component1=catalogue.components[pair.component1],
        component2=catalogue.components[pair.component2],
        isobars=tuple(_condition(catalogue, pair, "isobar", P) for P in pair.isobars_Pa),
        isotherms=tuple(_condition(catalogue, pair, "isotherm", T) for T in pair.isotherms_K),
    )


def compute_atlas(catalogue: Catalogue) -> dict[str, PairResults]:
    """Compute every pair of the catalogue (the whole atlas), in id order."""
    return {pid: compute_pair(catalogue, catalogue.pairs[pid]) for pid in sorted(catalogue.pairs)}
