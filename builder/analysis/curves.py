"""Whole phase-diagram curves: an isobar (Txy, xy) or an isotherm (Pxy, xy) in one call.

Both are computed from bubble points on a grid of liquid compositions: at each
liquid ``x1`` the bubble point gives the coexisting vapour ``y1``, so the
bubble line is ``(x1, T)`` or ``(x1, P)`` and the dew line is ``(y1, T)`` or
``(y1, P)``; the xy curve is ``(x1, y1)``.  One vectorised solver call per
curve.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from builder.thermo import equilibrium as eq

__all__ = ["Curve", "composition_grid", "from_bubble", "isobar", "isotherm"]

FloatArray = NDArray[np.float64]


def composition_grid(points: int = 101) -> FloatArray:
    """Evenly spaced liquid compositions in [0, 1], refined near both pure ends.

    The ends are where the curves bend fastest (infinite dilution), so the
    even grid is joined with 0.1 %, 0.2 %, 0.5 %, 1 % and 2 % from each end.

    >>> g = composition_grid(11)
    >>> len(g), float(g[0]), float(g[-1]), 0.001 in g, 0.999 in g
    (21, 0.0, 1.0, True, True)
    """
    even = np.linspace(0.0, 1.0, points)
    near = np.array([0.001, 0.002, 0.005, 0.01, 0.02])
    return np.unique(np.round(np.concatenate([even, near, 1.0 - near]), 12))


@dataclass(frozen=True)
class Curve:
    """One isobar or isotherm: bubble line (x1 vs T or P) and dew line (y1 vs T or P)."""

    kind: str  # "isobar" or "isotherm"
    x1: FloatArray
    y1: FloatArray
    T_K: FloatArray
    P_Pa: FloatArray
    gamma1: FloatArray
    gamma2: FloatArray
    alpha12: FloatArray
    converged: NDArray[np.bool_]

    @property
    def condition(self) -> float:
        """The fixed pressure (Pa) of an isobar or temperature (K) of an isotherm."""
        return float(self.P_Pa[0] if self.kind == "isobar" else self.T_K[0])


def from_bubble(kind: str, system: eq.BinarySystem, result: eq.EquilibriumResult) -> Curve:
    """The curve of bubble points already solved (``kind`` "isobar" or "isotherm")."""
    return Curve(kind=kind, x1=result.x1, y1=result.y1, T_K=result.T_K, P_Pa=result.P_Pa,
                 gamma1=result.gamma1, gamma2=result.gamma2,
                 alpha12=result.relative_volatility(system), converged=result.converged)


def isobar(system: eq.BinarySystem, P_Pa: float, x1: FloatArray | None = None) -> Curve:
    """Txy and xy data at ``P_Pa`` (default grid :func:`composition_grid`)."""
    grid = composition_grid() if x1 is None else np.asarray(x1, dtype=float)
    return from_bubble("isobar", system, eq.bubble_temperature(system, grid, P_Pa))


def isotherm(system: eq.BinarySystem, T_K: float, x1: FloatArray | None = None) -> Curve:
    """Pxy and xy data at ``T_K`` (default grid :func:`composition_grid`)."""
    grid = composition_grid() if x1 is None else np.asarray(x1, dtype=float)
    return from_bubble("isotherm", system, eq.bubble_pressure(system, grid, T_K))
