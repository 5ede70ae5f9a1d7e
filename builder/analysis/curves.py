"""Whole phase-diagram curves: an isobar (Txy, xy) or an isotherm (Pxy, xy) in one call.

Both are computed from bubble points on a grid of liquid compositions: at each
liquid ``x1`` the bubble point gives the coexisting vapour ``y1``, so the
bubble line is ``(x1, T)`` or ``(x1, P)`` and the dew line is ``(y1, T)`` or
``(y1, P)``; the xy curve is ``(x1, y1)``.  One vectorised solver call per
curve.
"""

from __future__ import annotations

from dataclasses import dataclass, replace

import numpy as np
from numpy.typing import NDArray

from builder.thermo import cubic_equilibrium as ce
from builder.thermo import equilibrium as eq

__all__ = ["Curve", "beyond_critical", "composition_grid", "from_bubble", "isobar", "isotherm",
           "unconverged"]

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
    #: φ–φ systems: the mixture critical point where the curve ends (one of its points).
    critical: ce.CriticalPoint | None = None
    #: Non-empty when the condition has no two-phase region at all (the reason, in words).
    no_two_phase: str = ""
    vapour_model: str = "ideal-gas"

    @property
    def condition(self) -> float:
        """The fixed pressure (Pa) of an isobar or temperature (K) of an isotherm."""
        return float(self.P_Pa[0] if self.kind == "isobar" else self.T_K[0])


def from_bubble(kind: str, system: eq.BinarySystem, result: eq.EquilibriumResult) -> Curve:
    """The curve of bubble points already solved (``kind`` "isobar" or "isotherm")."""
    with np.errstate(invalid="ignore", divide="ignore", over="ignore"):
        alpha = result.relative_volatility(system)
    return Curve(kind=kind, x1=result.x1, y1=result.y1, T_K=result.T_K, P_Pa=result.P_Pa,
                 gamma1=result.gamma1, gamma2=result.gamma2,
                 alpha12=alpha, converged=result.converged,
                 vapour_model=system.vapour.name)


def isobar(system: eq.BinarySystem, P_Pa: float, x1: FloatArray | None = None) -> Curve:
    """Txy and xy data at ``P_Pa`` (default grid :func:`composition_grid`).

    For a φ–φ system above a component's critical pressure the curve ends at
    the mixture critical point (located and included as a point); above the
    cricondenbar the curve is empty and says so (``no_two_phase``).
    """
    grid = composition_grid() if x1 is None else np.asarray(x1, dtype=float)
    if system.phi_phi:
        return _cubic_curve("isobar", system, P_Pa, grid)
    return from_bubble("isobar", system, eq.bubble_temperature(system, grid, P_Pa))


def isotherm(system: eq.BinarySystem, T_K: float, x1: FloatArray | None = None) -> Curve:
    """Pxy and xy data at ``T_K`` (default grid :func:`composition_grid`).

    For a φ–φ system above a component's critical temperature the curve ends
    at the mixture critical point (located and included as a point).
    """
    grid = composition_grid() if x1 is None else np.asarray(x1, dtype=float)
    if system.phi_phi:
        return _cubic_curve("isotherm", system, T_K, grid)
    return from_bubble("isotherm", system, eq.bubble_pressure(system, grid, T_K))


def _cubic_curve(kind: str, system: eq.BinarySystem, value: float, grid: FloatArray) -> Curve:
    """An isobar or isotherm of a φ–φ system, ended at its critical point where it has one."""
    mix = system.vapour
    assert isinstance(mix, ce.CubicMixture)
    isobar = kind == "isobar"
    limits = mix.Pc_Pa if isobar else mix.Tc_K
    unit = f"{value / 1e6:.4g} MPa" if isobar else f"{value:.2f} K"
    if value >= max(limits):
        if not isobar:
            return _empty(kind, system, value, grid, f"no two-phase region at this temperature "
                          f"({unit} is above both critical temperatures)")
        top = ce.cricondenbar(system)
        if value >= top:
            return _empty(kind, system, value, grid, "no two-phase region at this pressure "
                          f"({unit} is above the cricondenbar, {top / 1e6:.4g} MPa)")
        return _empty(kind, system, value, grid, "the two-phase region at this pressure is "
                      "an island above both critical pressures (below the cricondenbar, "
                      f"{top / 1e6:.4g} MPa); not computed")
    solve = eq.bubble_temperature if isobar else eq.bubble_pressure
    curve = from_bubble(kind, system, solve(system, grid, value))
    if value <= min(limits):
        return curve
    # Anchored at the component whose critical value lies above the condition.
    anchor_x = 1.0 if limits[0] > value else 0.0
    ok = np.flatnonzero(curve.converged)
    if ok.size < 2:
        return curve
    free = curve.T_K if isobar else curve.P_Pa
    anchor = ok[np.argmin(np.abs(curve.x1[ok] - anchor_x))]
    # Start from the end of the unbroken run of converged points from the anchor.
    order = np.argsort(curve.x1) if anchor_x == 0.0 else np.argsort(curve.x1)[::-1]
    run = np.cumprod(curve.converged[order]).astype(bool)
    far = int(order[run][-1]) if run.any() else ok[np.argmax(np.abs(curve.x1[ok] - anchor_x))]
    direction = 1.0 if free[far] >= free[anchor] else -1.0
    critical = ce.critical_point(system, "P" if isobar else "T", value, float(curve.x1[far]),
                                 float(curve.y1[far]), float(free[far]), direction)
    if critical is None:
        return curve
    curve = _fill_towards(kind, system, value, curve, critical, anchor_x)
    # Never past the critical point: drop converged points beyond it, then include it.
    beyond = (curve.x1 - critical.x1) * (anchor_x - critical.x1) < 0
    converged = curve.converged & ~beyond
    where = int(np.searchsorted(curve.x1, critical.x1))

    def put(values: FloatArray, item: float) -> FloatArray:
        return np.insert(np.asarray(values, dtype=float), where, item)

    return replace(curve, x1=put(curve.x1, critical.x1), y1=put(curve.y1, critical.x1),
                   T_K=put(curve.T_K, critical.T_K), P_Pa=put(curve.P_Pa, critical.P_Pa),
                   gamma1=put(curve.gamma1, 1.0), gamma2=put(curve.gamma2, 1.0),
                   alpha12=put(curve.alpha12, 1.0),
                   converged=np.insert(converged, where, True), critical=critical)


def _fill_towards(kind: str, system: eq.BinarySystem, value: float, curve: Curve,
                  critical: ce.CriticalPoint, anchor_x: float) -> Curve:
    """Solve the grid points between the converged curve and the critical point afresh,
    from guesses interpolated along the path the critical-point search followed."""
    path = sorted(critical.path, key=lambda item: item[1])
    if len(path) < 2:
        return curve
    free_path = np.array([p[0] for p in path])
    x_path = np.array([p[1] for p in path])
    y_path = np.array([p[2] for p in path])
    between = ~curve.converged & ((curve.x1 - critical.x1) * (anchor_x - critical.x1) > 0)
    between &= (curve.x1 >= x_path.min()) & (curve.x1 <= x_path.max())
    if not between.any():
        return curve
    z = curve.x1[between]
    free = np.interp(z, x_path, free_path)
    other = np.interp(z, x_path, y_path)
    isobar = kind == "isobar"
    solved = ce.solve_from("bubble_temperature" if isobar else "bubble_pressure", system, z,
                           np.full(z.size, value), free, other)
    ok = solved.converged
    idx = np.flatnonzero(between)[ok]
    y1, T, P, conv = curve.y1.copy(), curve.T_K.copy(), curve.P_Pa.copy(), curve.converged.copy()
    y1[idx], T[idx], P[idx], conv[idx] = solved.y1[ok], solved.T_K[ok], solved.P_Pa[ok], True
    alpha = curve.alpha12.copy()
    with np.errstate(invalid="ignore", divide="ignore"):
        K1, K2 = ce.k_values(system.vapour, solved.x1[ok], solved.T_K[ok], solved.P_Pa[ok],  # type: ignore[arg-type]
                             solved.y1[ok])
    alpha[idx] = K1 / K2
    gamma1, gamma2 = curve.gamma1.copy(), curve.gamma2.copy()
    gamma1[idx], gamma2[idx] = 1.0, 1.0
    return replace(curve, y1=y1, T_K=T, P_Pa=P, converged=conv, alpha12=alpha, gamma1=gamma1,
                   gamma2=gamma2)


def beyond_critical(curve: Curve) -> NDArray[np.bool_]:
    """Grid points past the critical point (on the side away from the converged curve)."""
    c = curve.critical
    if c is None:
        return np.zeros(curve.x1.shape, dtype=bool)
    ok = curve.converged & (curve.x1 != c.x1)
    side = np.sign(np.nanmedian(curve.x1[ok] - c.x1)) if ok.any() else 0.0
    return np.asarray((curve.x1 - c.x1) * side < 0, dtype=bool)


def unconverged(curve: Curve) -> int:
    """Points that should have converged and did not (none past a critical point, none
    where the condition has no two-phase region)."""
    if curve.no_two_phase:
        return 0
    return int((~curve.converged & ~beyond_critical(curve)).sum())


def _empty(kind: str, system: eq.BinarySystem, value: float, grid: FloatArray,
           reason: str) -> Curve:
    nan = np.full(grid.shape, np.nan)
    T = np.full(grid.shape, value) if kind == "isotherm" else nan
    P = np.full(grid.shape, value) if kind == "isobar" else nan
    return Curve(kind=kind, x1=grid, y1=nan.copy(), T_K=T, P_Pa=P, gamma1=nan.copy(),
                 gamma2=nan.copy(), alpha12=nan.copy(), converged=np.zeros(grid.shape, bool),
                 no_two_phase=reason, vapour_model=system.vapour.name)
