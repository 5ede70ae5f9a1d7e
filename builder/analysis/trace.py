"""The azeotrope traced against pressure.

:func:`trace_azeotrope` follows one azeotrope over a range of pressures by solving
its own equations at every pressure at once (:mod:`.phase_lines`), analysing the
pressures that cannot be settled so in full (:func:`.phases.analyse_isobars`,
all of them together).  :func:`analyse` (one condition's phase behaviour) lives in
:mod:`.phases` and is re-exported here.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from builder.analysis import curves, stability
from builder.analysis.azeotropes import KIND_ISOBAR, Azeotrope
from builder.analysis.phase_lines import azeotrope_points, three_phase_points
from builder.analysis.phases import Phases, analyse, analyse_isobars
from builder.thermo import equilibrium as eq
from builder.thermo.activity import ActivityModel

__all__ = ["AzeotropeTrace", "Phases", "analyse", "trace_azeotrope"]

#: Liquid compositions of the curve analysed at one pressure of the trace.
_TRACE_GRID = curves.composition_grid(61)

#: Common practice: a shift of 5 mol % or more across the pressure range is a first hint
#: that pressure-swing distillation deserves a look.
PRESSURE_SWING_SHIFT = 0.05


def _continue(solve: Callable[[int, int], bool], ok: NDArray[np.bool_], start: int) -> None:
    """Retry failed points from their converged neighbour, outwards from ``start``."""
    for order in (range(start + 1, ok.size), range(start - 1, -1, -1)):
        for i in order:
            j = i - 1 if i > start else i + 1
            if not ok[i] and ok[j]:
                ok[i] = solve(i, j)


def _follow(system: eq.BinarySystem, model: ActivityModel, reference: Azeotrope,
            pressures: NDArray[np.float64]) -> list[Azeotrope | None]:
    """The azeotrope of ``reference``'s kind at each pressure, or None."""
    n = pressures.size
    start = int(np.argmin(np.abs(pressures - reference.P_Pa)))
    found: list[Azeotrope | None] = [None] * n
    settled = np.zeros(n, dtype=bool)
    if reference.heterogeneous and reference.liquid_x1 is not None:
        xa, xb = reference.liquid_x1
        T0 = eq.bubble_temperature(system, np.full(n, xa), pressures).T_K
        line = three_phase_points(system, pressures, xa, xb, T0)
        T3, xa3, xb3, y3 = line.T_K.copy(), line.x1_a.copy(), line.x1_b.copy(), line.y1.copy()
        ok = line.converged & (xa3 < y3) & (y3 < xb3)

        def retry3(i: int, j: int) -> bool:
            again = three_phase_points(system, pressures[i], xa3[j], xb3[j], T3[j])
            T3[i], xa3[i], xb3[i], y3[i] = (again.T_K[0], again.x1_a[0], again.x1_b[0],
                                           again.y1[0])
            return bool(again.converged[0] and xa3[i] < y3[i] < xb3[i])

        _continue(retry3, ok, start)
        for i in np.flatnonzero(ok):
            found[i] = Azeotrope(x1=float(y3[i]), T_K=float(T3[i]), P_Pa=float(pressures[i]),
                                 kind=reference.kind, heterogeneous=True,
                                 liquid_x1=(float(xa3[i]), float(xb3[i])))
        settled |= ok
    else:
        falling = reference.kind == KIND_ISOBAR[True]
        T0 = eq.bubble_temperature(system, np.full(n, reference.x1), pressures).T_K
        az = azeotrope_points(system, pressures, reference.x1, T0)
        x, T, fall = az.x1.copy(), az.T_K.copy(), az.falling.copy()
        ok = az.converged & (fall == falling)

        def retry(i: int, j: int) -> bool:
            again = azeotrope_points(system, pressures[i], x[j], T[j])
            x[i], T[i], fall[i] = again.x1[0], again.T_K[0], again.falling[0]
            return bool(again.converged[0] and fall[i] == falling)

        _continue(retry, ok, start)
        ok &= stability.stable(model, x, T)
        for i in np.flatnonzero(ok):
            found[i] = Azeotrope(x1=float(x[i]), T_K=float(T[i]), P_Pa=float(pressures[i]),
                                 kind=reference.kind)
        settled |= ok
    rest = np.flatnonzero(~settled)
    if rest.size:
        settled[rest] = _none_of_kind(system, model, reference.kind, pressures[rest])
    rest = np.flatnonzero(~settled)
    if rest.size:
        analysed = analyse_isobars(system, model, pressures[rest], _TRACE_GRID)
        for i, (_, phases) in zip(rest, analysed, strict=True):
            same = [a for a in phases.azeotropes if a.kind == reference.kind]
            found[i] = min(same, key=lambda a: abs(a.x1 - reference.x1)) if same else None
    return found


def _none_of_kind(system: eq.BinarySystem, model: ActivityModel, kind: str,
                  pressures: NDArray[np.float64]) -> NDArray[np.bool_]:
    """Per pressure: certainly no azeotrope of ``kind`` (no sign change of ``ln α12``
    between the pure ends in that kind's direction, and one stable liquid along the
    bubble curve)."""
    ends = eq.bubble_temperature(system, np.array([[0.0], [1.0]]), pressures[None, :])
    ln_alpha = np.log(ends.relative_volatility(system))
    falling = kind == KIND_ISOBAR[True]
    crossing = (ln_alpha[0] > 0) & (ln_alpha[1] < 0) if falling else (
        (ln_alpha[0] < 0) & (ln_alpha[1] > 0))
    none = ends.converged.all(axis=0) & ~crossing
    if none.any():
        grid = _TRACE_GRID[None, :]
        curve = eq.bubble_temperature(system, grid, pressures[none][:, None])
        flat = stability.stable(model, curve.x1.ravel(), curve.T_K.ravel())
        none[none] = (flat.reshape(curve.x1.shape) | ~curve.converged).all(axis=1)
    return none


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
    inside their vapour-pressure correlations' ranges.  The azeotrope's own
    equations are solved at every pressure at once (:mod:`.phase_lines`: a
    homogeneous azeotrope's ``α12 = 1`` on the bubble curve, a heterogeneous one's
    three-phase point), retried from the neighbouring pressure's solution where
    the first solve fails.  A homogeneous solution counts only where its liquid
    is stable and its kind is the reference's.  Where no solution counts, a
    pressure with no sign change of ``ln α12`` between the pure ends and one stable
    liquid along its bubble curve has no azeotrope of that kind; any other
    pressure is analysed in full (:func:`analyse`) and the azeotrope of the same
    kind nearest in composition to the reference is taken.  The trace records
    where the azeotrope leaves (towards which pure end).
    """
    pressures = _clipped_pressures(system, P_min_Pa, P_max_Pa, points)
    if pressures.size < 2:
        return None
    pressures = np.unique(np.append(pressures, reference.P_Pa))
    found = _follow(system, model, reference, pressures)
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
