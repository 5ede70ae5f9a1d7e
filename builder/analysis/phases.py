"""Phase behaviour of one isobar or isotherm, or of many isobars at once.

:func:`analyse` combines the liquid-stability test, the three-phase line and the
azeotrope search along one curve; :func:`analyse_isobars` does the same at many
pressures with the solver calls shared between them (the azeotrope traced
against pressure needs it where its own equations cannot settle a pressure).
Both return :class:`Phases` records.
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
from builder.analysis.phase_lines import three_phase_points
from builder.thermo import equilibrium as eq
from builder.thermo.activity import ActivityModel

__all__ = ["Phases", "analyse", "analyse_isobars"]

#: Accepted distance (K) of a three-phase point solved directly from its first guess (as
#: :func:`builder.analysis.stability.three_phase_isobar`).
_THREE_PHASE_REACH_K = 40.0


class _Unsolved:
    """Marks a three-phase point not yet looked for (None means: looked for, none found)."""


_UNSOLVED = _Unsolved()


@dataclass(frozen=True)
class Phases:
    liquid_stable: NDArray[np.bool_]
    three_phase: stability.ThreePhase | None
    inside_gap: NDArray[np.bool_]
    azeotropes: tuple[Azeotrope, ...]
    complete: bool
    warnings: tuple[str, ...]


def analyse(system: eq.BinarySystem, model: ActivityModel, isobar: bool, value: float,
            curve: curves.Curve, searched: eq.EquilibriumResult | None = None, *,
            liquid_stable: NDArray[np.bool_] | None = None,
            three_phase: stability.ThreePhase | _Unsolved | None = _UNSOLVED) -> Phases:
    """Liquid stability along a curve, the three-phase line and every azeotrope.

    ``searched``: the bubble points of :func:`.azeotropes.search_grid` at this condition,
    when already solved; ``liquid_stable`` (the stability of the curve's points) and
    ``three_phase`` (the three-phase point, or None for none), when already found.
    """
    warnings: list[str] = []
    if liquid_stable is None:
        liquid_stable = stability.stable(model, curve.x1, curve.T_K)
    found_three: stability.ThreePhase | None = None
    inside_gap = ~liquid_stable
    if not liquid_stable.all():
        if not isinstance(three_phase, _Unsolved):
            found_three = three_phase
        elif isobar:
            unstable = ~liquid_stable & curve.converged
            guess = float(np.min(curve.T_K[unstable]))
            x_unstable = curve.x1[unstable]
            found_three = stability.three_phase_isobar(
                system, value, guess, (float(x_unstable.min()), float(x_unstable.max())))
        else:
            found_three = stability.three_phase_isotherm(system, value)
        if found_three is None:
            warnings.append("the model predicts two liquids here but the three-phase point "
                            "could not be located; the curve inside that region is not drawn")
        else:
            inside_gap = (curve.x1 > found_three.x1_a) & (curve.x1 < found_three.x1_b)
            inside_gap |= ~liquid_stable
    search = find_azeotropes(system, P_Pa=value if isobar else None,
                             T_K=None if isobar else value,
                             exclude=None if liquid_stable.all() else _search_exclusion(
                                 system, model, value, isobar, found_three),
                             bubble=searched)
    found = list(search.azeotropes)
    if found_three is not None and found_three.heterogeneous_azeotrope:
        found.append(Azeotrope(
            x1=found_three.y1, T_K=found_three.T_K, P_Pa=found_three.P_Pa,
            kind=(KIND_ISOBAR if isobar else KIND_ISOTHERM)[True], heterogeneous=True,
            liquid_x1=(found_three.x1_a, found_three.x1_b)))
        found.sort(key=lambda a: a.x1)
    if not search.complete:
        warnings.append("the azeotrope search could not cover the whole composition range")
    return Phases(liquid_stable, found_three, inside_gap, tuple(found), search.complete,
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


def _row(result: eq.EquilibriumResult, i: int, part: slice) -> eq.EquilibriumResult:
    """Row ``i``, columns ``part`` of a 2-D set of bubble points."""
    def cut(v: NDArray[np.float64] | None) -> NDArray[np.float64] | None:
        return None if v is None else v[i, part]

    return eq.EquilibriumResult(
        T_K=result.T_K[i, part], P_Pa=result.P_Pa[i, part], x1=result.x1[i, part],
        y1=result.y1[i, part], ln_gamma1=result.ln_gamma1[i, part],
        ln_gamma2=result.ln_gamma2[i, part], converged=result.converged[i, part],
        ln_phi1=cut(result.ln_phi1), ln_phi2=cut(result.ln_phi2))


def analyse_isobars(system: eq.BinarySystem, model: ActivityModel,
                    pressures: NDArray[np.float64], grid: NDArray[np.float64]
                    ) -> list[tuple[curves.Curve, Phases]]:
    """:func:`analyse` of the isobar on ``grid`` at every pressure (Pa), with the curve.

    The same results as one :func:`analyse` per pressure, with the work shared: the
    curves and the azeotrope search grids at every pressure in one bubble-point call,
    the stability of every curve point in one test, and the three-phase points of every
    pressure with two liquids in one Newton solve from the unstable stretch of its curve
    (accepted within 40 K of the guess, as
    :func:`builder.analysis.stability.three_phase_isobar`; a pressure where that fails
    gets that function's full search).  γ–φ systems only (no φ–φ curve ends here).

    >>> from builder.thermo.activity import Margules
    >>> from builder.thermo.vapour_pressure import Antoine
    >>> flat = Antoine(A=11.0, B=3000.0, C=0.0, T_min_K=200.0, T_max_K=500.0)
    >>> s = eq.BinarySystem(flat, flat, Margules.constant(1.0, 1.0))
    >>> found = analyse_isobars(s, s.activity, np.array([2e6, 3e6]), curves.composition_grid(11))
    >>> [round(phases.azeotropes[0].x1, 9) for _, phases in found]
    [0.5, 0.5]
    """
    P = np.asarray(pressures, dtype=float)
    search = search_grid()
    both = eq.bubble_temperature(system, np.concatenate([grid, search])[None, :], P[:, None])
    n = grid.size
    bubbles = [_row(both, i, slice(0, n)) for i in range(P.size)]
    searched = [_row(both, i, slice(n, None)) for i in range(P.size)]
    lines = [curves.from_bubble("isobar", system, b) for b in bubbles]
    stable = stability.stable(model, both.x1[:, :n], both.T_K[:, :n]).reshape(P.size, n)
    three: list[stability.ThreePhase | _Unsolved | None] = [_UNSOLVED] * P.size
    split = [i for i in range(P.size) if not stable[i].all()]
    if split:
        unstable = [~stable[i] & lines[i].converged for i in split]
        T0 = np.array([np.min(lines[i].T_K[u]) for i, u in zip(split, unstable, strict=True)])
        xa = np.array([np.min(lines[i].x1[u]) for i, u in zip(split, unstable, strict=True)])
        xb = np.array([np.max(lines[i].x1[u]) for i, u in zip(split, unstable, strict=True)])
        points = three_phase_points(system, P[split], xa, xb, T0)
        for k, i in enumerate(split):
            if points.converged[k] and abs(points.T_K[k] - T0[k]) <= _THREE_PHASE_REACH_K:
                three[i] = stability.ThreePhase(
                    T_K=float(points.T_K[k]), P_Pa=float(P[i]), x1_a=float(points.x1_a[k]),
                    x1_b=float(points.x1_b[k]), y1=float(points.y1[k]))
    return [(lines[i], analyse(system, model, True, float(P[i]), lines[i], searched[i],
                               liquid_stable=stable[i], three_phase=three[i]))
            for i in range(P.size)]
