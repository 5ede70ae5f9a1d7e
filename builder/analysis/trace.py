"""Phase behaviour of one condition, and the azeotrope traced against pressure.

:func:`analyse` combines the liquid-stability test, the three-phase line and
the azeotrope search for one isobar or isotherm; :func:`trace_azeotrope`
repeats it over a range of pressures and follows the azeotrope.  Both return
plain records for :mod:`builder.results`.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from builder.analysis import curves, stability
from builder.analysis.azeotropes import (
    KIND_ISOBAR,
    KIND_ISOTHERM,
    Azeotrope,
    find_azeotropes,
    search_grid,
)
from builder.thermo import equilibrium as eq
from builder.thermo.activity import ActivityModel

__all__ = ["AzeotropeTrace", "Phases", "analyse", "trace_azeotrope"]

#: Common practice: a shift of 5 mol % or more across the pressure range is a first hint
#: that pressure-swing distillation deserves a look.
PRESSURE_SWING_SHIFT = 0.05


@dataclass(frozen=True)
class Phases:
    liquid_stable: NDArray[np.bool_]
    three_phase: stability.ThreePhase | None
    inside_gap: NDArray[np.bool_]
    azeotropes: tuple[Azeotrope, ...]
    complete: bool
    warnings: tuple[str, ...]


def analyse(system: eq.BinarySystem, model: ActivityModel, isobar: bool, value: float,
            curve: curves.Curve) -> Phases:
    """Liquid stability along a curve, the three-phase line and every azeotrope."""
    warnings: list[str] = []
    liquid_stable = stability.stable(model, curve.x1, curve.T_K)
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
                                 system, model, value, isobar, three_phase))
    found = list(search.azeotropes)
    if three_phase is not None and three_phase.heterogeneous_azeotrope:
        found.append(Azeotrope(
            x1=three_phase.y1, T_K=three_phase.T_K, P_Pa=three_phase.P_Pa,
            kind=(KIND_ISOBAR if isobar else KIND_ISOTHERM)[True], heterogeneous=True,
            liquid_x1=(three_phase.x1_a, three_phase.x1_b)))
        found.sort(key=lambda a: a.x1)
    if not search.complete:
        warnings.append("the azeotrope search could not cover the whole composition range")
    return Phases(liquid_stable, three_phase, inside_gap, tuple(found), search.complete,
                   tuple(warnings))


def _search_exclusion(system: eq.BinarySystem, model: ActivityModel, value: float,
                      isobar: bool, three_phase: stability.ThreePhase | None) -> NDArray[np.bool_]:
    """Grid points of the azeotrope search that lie in the two-liquid region."""
    grid = search_grid()
    if three_phase is not None:
        return np.asarray((grid > three_phase.x1_a) & (grid < three_phase.x1_b))
    result = (eq.bubble_temperature(system, grid, value) if isobar
              else eq.bubble_pressure(system, grid, value))
    return ~stability.stable(model, grid, result.T_K)




@dataclass(frozen=True)
class AzeotropeTrace:
    """An azeotrope followed over a range of pressures (NaN where there is none)."""

    P_Pa: NDArray[np.float64]
    x1: NDArray[np.float64]
    T_K: NDArray[np.float64]
    heterogeneous: NDArray[np.bool_]
    extrapolated: NDArray[np.bool_]  # outside the activity parameters' temperature range
    kind: str
    shift_x1: float  # largest minus smallest composition over the traced range
    pressure_sensitive: bool
    events: tuple[str, ...]  # where it appears or vanishes, in plain words


def _clipped_pressures(system: eq.BinarySystem, P_min: float, P_max: float,
                       points: int) -> NDArray[np.float64]:
    """Pressures between P_min and P_max at which both pure components boil inside their
    vapour-pressure correlations' validity ranges."""
    lows = [float(vp.pressure_Pa(vp.T_min_K)) for vp in (system.psat1, system.psat2)]
    highs = [float(vp.pressure_Pa(vp.T_max_K)) for vp in (system.psat1, system.psat2)]
    lo, hi = max(P_min, *lows), min(P_max, *highs)
    if lo >= hi:
        return np.array([], dtype=float)
    return np.geomspace(lo, hi, points)


def trace_azeotrope(system: eq.BinarySystem, model: ActivityModel, reference: Azeotrope,
                    T_range_K: tuple[float, float], *, P_min_Pa: float = 10e3,
                    P_max_Pa: float = 1e6, points: int = 17) -> AzeotropeTrace | None:
    """Follow ``reference`` (an azeotrope on one isobar) from ``P_min_Pa`` to ``P_max_Pa``.

    The range is clipped to the pressures at which both pure components boil
    inside their vapour-pressure correlations' ranges.  At each pressure the
    azeotrope of the same kind nearest in composition to its neighbour is
    followed; where none is found, the trace records where it left (towards
    which pure end).
    """
    pressures = _clipped_pressures(system, P_min_Pa, P_max_Pa, points)
    if pressures.size < 2:
        return None
    pressures = np.unique(np.append(pressures, reference.P_Pa))
    grid = curves.composition_grid(61)
    found: list[Azeotrope | None] = []
    for P in pressures:
        curve = curves.isobar(system, float(P), grid)
        phases = analyse(system, model, True, float(P), curve)
        same = [a for a in phases.azeotropes if a.kind == reference.kind]
        found.append(min(same, key=lambda a: abs(a.x1 - reference.x1)) if same else None)
    x1 = np.array([a.x1 if a else np.nan for a in found])
    T = np.array([a.T_K if a else np.nan for a in found])
    het = np.array([bool(a and a.heterogeneous) for a in found])
    extrapolated = (T < T_range_K[0]) | (T > T_range_K[1])
    events = []
    for i in range(pressures.size - 1):
        before, after = np.isfinite(x1[i]), np.isfinite(x1[i + 1])
        if before and not after:
            end = "component 2" if x1[i] < 0.5 else "component 1"
            events.append(f"vanishes at the {end} end between {pressures[i] / 1e3:.4g} and "
                          f"{pressures[i + 1] / 1e3:.4g} kPa")
        if after and not before:
            end = "component 2" if x1[i + 1] < 0.5 else "component 1"
            events.append(f"appears at the {end} end between {pressures[i] / 1e3:.4g} and "
                          f"{pressures[i + 1] / 1e3:.4g} kPa")
    finite = x1[np.isfinite(x1)]
    shift = float(finite.max() - finite.min()) if finite.size else 0.0
    return AzeotropeTrace(P_Pa=pressures, x1=x1, T_K=T, heterogeneous=het,
                          extrapolated=extrapolated, kind=reference.kind, shift_x1=shift,
                          pressure_sensitive=shift >= PRESSURE_SWING_SHIFT,
                          events=tuple(events))
