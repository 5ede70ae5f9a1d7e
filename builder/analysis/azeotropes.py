"""Homogeneous azeotropes of a binary on an isobar or an isotherm.

An azeotrope is where the vapour has the liquid's composition, ``y1 = x1``,
i.e. where the relative volatility ``α12 = K1/K2`` passes through 1.  Along
the bubble curve (at fixed P, or fixed T) the function
``f(x1) = ln α12(x1)`` is evaluated on the whole composition range,
including the pure ends themselves (the infinite-dilution values), every sign
change is bracketed, and each root is solved to solver precision with the
bracketed Newton method of :mod:`builder.solvers` (each evaluation is itself
a converged bubble point).  Several azeotropes, and azeotropes very close to
a pure end, are found as long as the grid separates them; the result says
whether the whole range was searched (every grid point converged).

Kind: on an isobar ``α12`` falling through 1 with increasing ``x1`` is a
minimum-boiling azeotrope (a temperature minimum), rising through 1 a
maximum-boiling one; on an isotherm, falling is a pressure maximum and rising a
pressure minimum.  These follow from ``y1 - x1`` changing sign with the slope
of the bubble line (the Gibbs-Konovalov theorem).
"""

from __future__ import annotations

import functools
from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from builder.analysis.phase_lines import azeotrope_points, azeotrope_points_isotherm
from builder.thermo import equilibrium as eq
from builder.thermo.solvers import Function, solve_bracketed

__all__ = ["Azeotrope", "AzeotropeSearch", "find_azeotropes", "search_grid"]

FloatArray = NDArray[np.float64]

KIND_ISOBAR = {True: "minimum-boiling", False: "maximum-boiling"}
KIND_ISOTHERM = {True: "maximum-pressure", False: "minimum-pressure"}


@dataclass(frozen=True)
class Azeotrope:
    """One azeotrope: composition, temperature, pressure and kind.

    ``heterogeneous`` azeotropes (vapour in equilibrium with two liquids)
    carry the two liquids' compositions in ``liquid_x1``.
    """

    x1: float
    T_K: float
    P_Pa: float
    kind: str
    heterogeneous: bool = False
    liquid_x1: tuple[float, float] | None = None

    def to_json(self) -> dict[str, object]:
        data: dict[str, object] = {"x1": self.x1, "T_K": self.T_K, "P_Pa": self.P_Pa,
                                   "kind": self.kind, "heterogeneous": self.heterogeneous}
        if self.heterogeneous and self.liquid_x1 is not None:
            data["liquid_x1"] = list(self.liquid_x1)
        return data


@dataclass(frozen=True)
class AzeotropeSearch:
    """Every homogeneous azeotrope found, and whether the whole range was searched."""

    azeotropes: tuple[Azeotrope, ...]
    complete: bool
    unresolved: int = 0  # brackets whose root did not converge


def search_grid(points: int = 401) -> FloatArray:
    """Compositions for the sign search: the pure ends, a log-spaced approach to both
    ends (1e-6 ... 1e-2) and an even grid.

    >>> g = search_grid(11)
    >>> float(g[0]), float(g[1]), float(g[-1])
    (0.0, 1e-06, 1.0)
    """
    return _search_grid(points)


@functools.lru_cache(maxsize=4)
def _search_grid(points: int) -> FloatArray:
    """:func:`search_grid`, made once per size (read-only: every condition shares it)."""
    near = np.logspace(-6, -2, 9)
    grid = np.unique(np.concatenate([[0.0, 1.0], near, 1.0 - near,
                                     np.linspace(0.0, 1.0, points)]))
    grid.flags.writeable = False
    return grid


def _ln_alpha(system: eq.BinarySystem, result: eq.EquilibriumResult) -> FloatArray:
    return np.asarray(np.log(result.relative_volatility(system)), dtype=float)


def _roots(system: eq.BinarySystem, lo: FloatArray, hi: FloatArray, f_lo: FloatArray,
           f_hi: FloatArray, at_lo: FloatArray, at_hi: FloatArray, P_Pa: float | None,
           T_K: float | None, residual: Function
           ) -> tuple[FloatArray, NDArray[np.bool_], FloatArray, FloatArray]:
    """The root of ``ln α12`` in each bracket ``[lo, hi]``, and its temperature and
    pressure where the solve gave them (NaN elsewhere).

    The azeotrope's own equations (:func:`.phase_lines.azeotrope_points` on an isobar,
    :func:`.phase_lines.azeotrope_points_isotherm` on an isotherm) are solved from the
    secant estimate, all brackets at once (``at_lo``, ``at_hi``: the bubble temperatures,
    or on an isotherm the bubble pressures, at the brackets' ends); a root that does not
    converge inside its bracket is found by the bracketed search along bubble points.
    """
    weight = f_lo / (f_lo - f_hi)
    guess = lo + weight * (hi - lo)
    if P_Pa is not None:
        points = azeotrope_points(system, P_Pa, guess, at_lo + weight * (at_hi - at_lo))
    else:
        assert T_K is not None
        points = azeotrope_points_isotherm(system, T_K, guess, np.exp(
            np.log(at_lo) + weight * (np.log(at_hi) - np.log(at_lo))))
    converged = points.converged & (points.x1 >= lo) & (points.x1 <= hi)
    root = np.where(converged, points.x1, np.nan)
    T = np.where(converged, points.T_K, np.nan)
    P = np.where(converged, points.P_Pa, np.nan)
    rest = np.flatnonzero(~converged)
    if rest.size:
        search = solve_bracketed(residual, lo[rest], hi[rest], xtol=1e-13, ftol=1e-14)
        root[rest] = search.root
        converged[rest] = search.converged
    return root, converged, T, P


def find_azeotropes(system: eq.BinarySystem, *, P_Pa: float | None = None,
                    T_K: float | None = None, grid: FloatArray | None = None,
                    exclude: NDArray[np.bool_] | None = None,
                    bubble: eq.EquilibriumResult | None = None) -> AzeotropeSearch:
    """Azeotropes on the isobar ``P_Pa`` or on the isotherm ``T_K`` (give one).

    ``exclude`` marks grid points to leave out of the search (for example
    where the homogeneous liquid is unstable); a root between excluded points
    is not reported.  ``bubble``, when given, holds the bubble points of the grid
    already solved at this condition (they are then not solved again).

    Examples
    --------
    An ideal liquid with equal vapour pressures everywhere has none; a
    symmetric Margules liquid (A = 1) with equal vapour pressures has one at
    x1 = 0.5, a pressure maximum:

    >>> from builder.thermo.activity import Margules
    >>> from builder.thermo.vapour_pressure import Antoine
    >>> flat = Antoine(A=11.0, B=3000.0, C=0.0, T_min_K=200.0, T_max_K=500.0)
    >>> steeper = Antoine(A=12.0, B=3300.0, C=0.0, T_min_K=200.0, T_max_K=500.0)
    >>> s = eq.BinarySystem(flat, flat, Margules.constant(1.0, 1.0))
    >>> [(round(a.x1, 9), a.kind) for a in find_azeotropes(s, T_K=300.0).azeotropes]
    [(0.5, 'maximum-pressure')]
    """
    if (P_Pa is None) == (T_K is None):
        raise ValueError("give exactly one of P_Pa (isobar) or T_K (isotherm)")
    x = search_grid() if grid is None else np.asarray(grid, dtype=float)
    isobar = P_Pa is not None

    def solve(x1: FloatArray) -> eq.EquilibriumResult:
        if isobar:
            assert P_Pa is not None
            return eq.bubble_temperature(system, x1, P_Pa)
        assert T_K is not None
        return eq.bubble_pressure(system, x1, T_K)

    result = solve(x) if bubble is None else bubble
    f = _ln_alpha(system, result)
    usable = result.converged & np.isfinite(f)
    if exclude is not None:
        usable &= ~exclude
    complete = bool(usable.all()) if exclude is None else bool(
        (result.converged | exclude).all())
    idx = np.flatnonzero(usable)
    # Sign changes between consecutive usable points; exact zeros at interior points.
    fa, fb = f[idx[:-1]], f[idx[1:]]
    # Only neighbours on the grid bracket a root: a sign change across an excluded stretch
    # (a two-liquid region) is not a homogeneous azeotrope.
    adjacent = idx[1:] == idx[:-1] + 1
    # A change of sign within round-off of ln α = 0 (α = 1 to 1e-9 on both sides, a
    # degenerate liquid) is not an azeotrope.
    resolvable = np.maximum(np.abs(fa), np.abs(fb)) > 1e-9
    change = np.flatnonzero((np.sign(fa) * np.sign(fb) < 0) & adjacent & resolvable)
    lo, hi = x[idx[change]], x[idx[change + 1]]
    falling = fa[change] > 0  # α from above 1 to below 1 with increasing x1
    exact = idx[(f[idx] == 0.0) & (x[idx] > 0.0) & (x[idx] < 1.0)].tolist()

    azeotropes: list[Azeotrope] = []
    unresolved = 0
    if lo.size:
        def residual(u: FloatArray, mask: NDArray[np.bool_]) -> FloatArray:
            return _ln_alpha(system, solve(u))

        ends, condition = idx[change], result.T_K if isobar else result.P_Pa
        root, converged, T_at, P_at = _roots(system, lo, hi, fa[change], fb[change],
                                             condition[ends], condition[ends + 1], P_Pa, T_K,
                                             residual)
        # The azeotrope's own solve gave T and P; the other roots' bubble points are solved.
        ok_at = converged.copy()
        other = np.flatnonzero(~np.isfinite(T_at))
        if other.size:
            at = solve(root[other])
            T_at[other], P_at[other], ok_at[other] = at.T_K, at.P_Pa, at.converged
        for k in range(lo.size):
            if not (converged[k] and ok_at[k]):
                unresolved += 1
                continue
            kind = (KIND_ISOBAR if isobar else KIND_ISOTHERM)[bool(falling[k])]
            azeotropes.append(Azeotrope(x1=float(root[k]), T_K=float(T_at[k]),
                                        P_Pa=float(P_at[k]), kind=kind))
    for i in exact:
        before, after = f[max(i - 1, 0)], f[min(i + 1, len(f) - 1)]
        if before * after < 0:
            kind = (KIND_ISOBAR if isobar else KIND_ISOTHERM)[bool(before > 0)]
            azeotropes.append(Azeotrope(x1=float(x[i]), T_K=float(result.T_K[i]),
                                        P_Pa=float(result.P_Pa[i]), kind=kind))
    azeotropes.sort(key=lambda a: a.x1)
    return AzeotropeSearch(tuple(azeotropes), complete=complete and unresolved == 0,
                           unresolved=unresolved)
