"""Enough bubble points on each one-liquid stretch beside a three-phase line.

The dew line of a curve is drawn from its bubble points (liquid ``x1`` -> vapour ``y1``,
:mod:`.curves`), so the one-liquid stretches outside a three-phase point's liquids,
``[0, x1_a]`` and ``[x1_b, 1]``, carry as many dew points as the composition grid puts
liquids in them.  On a strongly immiscible pair (a hydrocarbon with water) the
water-rich stretch is narrower than the grid's finest end step (``x1_a`` about 1e-4
against 0.001) and holds only the pure end: the dew branch from that component's
boiling point down to the three-phase vapour would be a single point.

:func:`refine` adds bubble points to every stretch of a condition with fewer than
:data:`MIN_STRETCH_POINTS` drawable grid points, spread over the stretch and crowded
geometrically towards the three-phase liquid (where the dew branch meets the
three-phase vapour), all of them in one vectorised solver call; a condition without a
three-phase point, or whose stretches are well covered, costs nothing.  The added points
are ordinary curve points (sorted by ``x1`` with the rest, tested for liquid stability
like the rest), so the figures, the downloads and the volatility summary read them
without knowing where they came from.
"""

from __future__ import annotations

from dataclasses import replace
from typing import Any

import numpy as np
from numpy.typing import NDArray

from builder.analysis import curves, stability
from builder.analysis.phases import Phases
from builder.thermo import equilibrium as eq
from builder.thermo.activity import ActivityModel

__all__ = ["MIN_STRETCH_POINTS", "added_points", "refine", "stretch_compositions"]

FloatArray = NDArray[np.float64]

#: A one-liquid stretch with fewer drawable grid points than this gets its own points.
MIN_STRETCH_POINTS = 12

#: Fractions of the way from the pure end to the three-phase liquid: evenly spread (the
#: dew branch's vapour moves about evenly with the liquid there), then geometrically closer
#: to the liquid, to within 1e-6 of the stretch's width (the branch ends at the
#: three-phase vapour without a visible gap).
_FRACTIONS = np.unique(np.concatenate([np.linspace(0.0, 1.0, 21)[1:-1],
                                       1.0 - np.logspace(-1.5, -6.0, 8)]))

#: A stretch narrower than this (in mole fraction) is left as it is: no double can
#: place points inside it usefully.
_NARROWEST = 1e-12


def stretch_compositions(x1: FloatArray, drawable: NDArray[np.bool_],
                         three_phase: stability.ThreePhase | None) -> FloatArray:
    """The liquid compositions to add to a curve with grid ``x1`` (drawable where
    ``drawable``) beside ``three_phase``: for each stretch ``[0, x1_a]`` and ``[x1_b, 1]``
    with fewer than :data:`MIN_STRETCH_POINTS` drawable points, 27 compositions strictly
    inside it; empty when nothing is needed.

    >>> from builder.analysis.stability import ThreePhase
    >>> grid = curves.composition_grid()
    >>> three = ThreePhase(T_K=342.4, P_Pa=101325.0, x1_a=4e-4, x1_b=0.6, y1=0.7)
    >>> added = stretch_compositions(grid, np.ones(grid.size, bool), three)
    >>> added.size, bool(added.min() > 0), bool(added.max() < 4e-4)
    (27, True, True)
    >>> float(4e-4 - added.max()) < 1e-9
    True
    >>> stretch_compositions(grid, np.ones(grid.size, bool), None).size
    0
    """
    if three_phase is None:
        return np.empty(0)
    parts = []
    for end, liquid in ((0.0, three_phase.x1_a), (1.0, three_phase.x1_b)):
        low, high = min(end, liquid), max(end, liquid)
        if high - low < _NARROWEST:
            continue
        inside = (x1 >= low) & (x1 <= high) & drawable
        if int(inside.sum()) >= MIN_STRETCH_POINTS:
            continue
        added = end + _FRACTIONS * (liquid - end)
        parts.append(added[(added > low) & (added < high)])
    return np.concatenate(parts) if parts else np.empty(0)


def refine(system: eq.BinarySystem, model: ActivityModel, isobar: bool, value: float,
           curve: curves.Curve, phases: Phases
           ) -> tuple[curves.Curve, Phases, NDArray[np.bool_]]:
    """``curve`` and ``phases`` with the points of :func:`stretch_compositions` added
    (bubble points at ``value``, Pa on an isobar, K on an isotherm: one solver call),
    sorted by ``x1``, and which points of the result were added; unchanged, and no solver
    call, when none are needed.

    The added liquids are tested for stability (:func:`.stability.stable`) like the grid's,
    so a point of a stretch that the model calls unstable is not drawn.
    """
    drawable = curve.converged & ~phases.inside_gap
    added = stretch_compositions(curve.x1, drawable, phases.three_phase)
    if added.size == 0:
        return curve, phases, np.zeros(curve.x1.shape, dtype=bool)
    solved = (eq.bubble_temperature if isobar else eq.bubble_pressure)(system, added, value)
    extra = curves.from_bubble(curve.kind, system, solved)
    extra_stable = stability.stable(model, extra.x1, extra.T_K)
    order = np.argsort(np.concatenate([curve.x1, extra.x1]), kind="stable")

    def both(a: NDArray[Any], b: NDArray[Any]) -> NDArray[Any]:
        return np.concatenate([a, b])[order]

    merged = replace(curve, x1=both(curve.x1, extra.x1), y1=both(curve.y1, extra.y1),
                     T_K=both(curve.T_K, extra.T_K), P_Pa=both(curve.P_Pa, extra.P_Pa),
                     gamma1=both(curve.gamma1, extra.gamma1),
                     gamma2=both(curve.gamma2, extra.gamma2),
                     alpha12=both(curve.alpha12, extra.alpha12),
                     converged=both(curve.converged, extra.converged))
    three = phases.three_phase
    assert three is not None  # stretch_compositions adds nothing without one
    extra_gap = ((extra.x1 > three.x1_a) & (extra.x1 < three.x1_b)) | ~extra_stable
    was_added = both(np.zeros(curve.x1.shape, dtype=bool), np.ones(extra.x1.shape, dtype=bool))
    return merged, replace(phases, liquid_stable=both(phases.liquid_stable, extra_stable),
                           inside_gap=both(phases.inside_gap, extra_gap)), was_added


def added_points(x1: FloatArray, three_phase: stability.ThreePhase | None) -> NDArray[np.bool_]:
    """Which points of a curve computed on :func:`.curves.composition_grid` (liquid
    compositions ``x1``) :func:`refine` added: those off the grid in a one-liquid stretch
    beside ``three_phase`` (none without one).  Comparisons of two curves point by point
    keep to the grid they share.

    >>> from builder.analysis.stability import ThreePhase
    >>> three = ThreePhase(T_K=342.4, P_Pa=101325.0, x1_a=4e-4, x1_b=0.6, y1=0.7)
    >>> added_points(np.array([0.0, 2e-4, 0.001, 0.5, 0.55, 1.0]), three).tolist()
    [False, True, False, False, False, False]
    """
    x = np.asarray(x1, dtype=float)
    if three_phase is None:
        return np.zeros(x.shape, dtype=bool)
    outside = (x < three_phase.x1_a) | (x > three_phase.x1_b)
    return np.asarray(outside & ~np.isin(x, curves.composition_grid()), dtype=bool)
