"""Vapour-liquid equilibrium of a binary by the modified Raoult's law.

``y_i P = x_i γ_i(x, T) P_i^sat(T)``, i = 1, 2 (ideal vapour, liquid
fugacity at the pure liquid's vapour pressure, no Poynting factor).  It holds
at low to moderate pressure; near a component's critical point or at high
pressure a vapour fugacity correction is needed.  That correction belongs in
:func:`k_values` (``K_i = γ_i P_i^sat / (φ_i P)``), the one place where the
vapour model enters; the bubble-pressure solve below uses the explicit
ideal-vapour sum and would become an iteration on ``y``.

Each solver takes a whole vector of compositions (and a scalar or vector of
temperatures or pressures) and solves every point in one vectorised call
(:func:`builder.solvers.solve_bracketed`).  The result records per point
whether it converged; an unconverged point keeps ``converged = False`` and
must not be used as if it were right.

The liquid is assumed to be one phase.  Where the activity model predicts
two liquids, these functions return the homogeneous (metastable or unstable)
solution; the liquid-stability analysis is a separate step.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from builder.thermo.activity import ActivityModel, Swapped
from builder.thermo.solvers import Function, expand_bracket, solve_bracketed
from builder.thermo.vapour_pressure import VapourPressure

__all__ = [
    "BinarySystem",
    "EquilibriumResult",
    "bubble_pressure",
    "bubble_temperature",
    "dew_pressure",
    "dew_temperature",
    "k_values",
]

FloatArray = NDArray[np.float64]
BoolArray = NDArray[np.bool_]


@dataclass(frozen=True)
class BinarySystem:
    """Two components' vapour pressures and the liquid's activity model."""

    psat1: VapourPressure
    psat2: VapourPressure
    activity: ActivityModel

    def swapped(self) -> BinarySystem:
        """The same mixture with components 1 and 2 exchanged."""
        activity = self.activity
        inner = activity.inner if isinstance(activity, Swapped) else Swapped(activity)
        return BinarySystem(self.psat2, self.psat1, inner)


@dataclass(frozen=True)
class EquilibriumResult:
    """Coexisting liquid ``x1`` and vapour ``y1`` at ``T_K`` and ``P_Pa``, per point."""

    T_K: FloatArray
    P_Pa: FloatArray
    x1: FloatArray
    y1: FloatArray
    ln_gamma1: FloatArray
    ln_gamma2: FloatArray
    converged: BoolArray

    @property
    def x2(self) -> FloatArray:
        return 1.0 - self.x1

    @property
    def y2(self) -> FloatArray:
        return 1.0 - self.y1

    @property
    def gamma1(self) -> FloatArray:
        return np.exp(self.ln_gamma1)

    @property
    def gamma2(self) -> FloatArray:
        return np.exp(self.ln_gamma2)

    def k_values(self, system: BinarySystem) -> tuple[FloatArray, FloatArray]:
        """``K_i = y_i/x_i`` evaluated from the model (finite at ``x_i = 0``)."""
        return k_values(system, self.x1, self.T_K, self.P_Pa)

    def relative_volatility(self, system: BinarySystem) -> FloatArray:
        """``α12 = K1/K2 = γ1 P1sat / (γ2 P2sat)``."""
        K1, K2 = self.k_values(system)
        return K1 / K2


def k_values(
    system: BinarySystem, x1: ArrayLike, T_K: ArrayLike, P_Pa: ArrayLike
) -> tuple[FloatArray, FloatArray]:
    """Equilibrium ratios ``K_i = γ_i P_i^sat / P`` (ideal vapour).

    >>> from builder.thermo.activity import Ideal
    >>> from builder.thermo.vapour_pressure import Antoine
    >>> flat = Antoine(A=11.0, B=0.0, C=0.0, T_min_K=1.0, T_max_K=1e3)  # P = e**11 Pa
    >>> system = BinarySystem(flat, flat, Ideal())
    >>> [round(float(k), 6) for k in k_values(system, 0.5, 300.0, 2 * np.exp(11.0))]
    [0.5, 0.5]
    """
    T = np.asarray(T_K, dtype=float)
    P = np.asarray(P_Pa, dtype=float)
    ln_g1, ln_g2 = system.activity.ln_gamma(x1, T)
    return (np.exp(ln_g1) * system.psat1.pressure_Pa(T) / P,
            np.exp(ln_g2) * system.psat2.pressure_Pa(T) / P)


def _as_points(a: ArrayLike, b: ArrayLike) -> tuple[FloatArray, FloatArray, tuple[int, ...]]:
    """Broadcast a composition and a condition to flat arrays of equal length."""
    a_arr, b_arr = np.broadcast_arrays(np.asarray(a, dtype=float), np.asarray(b, dtype=float))
    shape = a_arr.shape
    return a_arr.ravel().astype(float), b_arr.ravel().astype(float), shape


def _check_fractions(name: str, values: FloatArray) -> None:
    if np.any(~np.isfinite(values)) or np.any((values < 0.0) | (values > 1.0)):
        bad = values[~((values >= 0.0) & (values <= 1.0))]
        raise ValueError(f"{name} must lie in [0, 1]; found {bad[:3].tolist()}")


def _partial_pressures(
    system: BinarySystem, x1: FloatArray, T: FloatArray
) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray]:
    ln_g1, ln_g2 = system.activity.ln_gamma(x1, T)
    p1 = x1 * np.exp(ln_g1) * system.psat1.pressure_Pa(T)
    p2 = (1.0 - x1) * np.exp(ln_g2) * system.psat2.pressure_Pa(T)
    return p1, p2, ln_g1, ln_g2


def _reshape(result: EquilibriumResult, shape: tuple[int, ...]) -> EquilibriumResult:
    return EquilibriumResult(*(np.reshape(getattr(result, f), shape) for f in (
        "T_K", "P_Pa", "x1", "y1", "ln_gamma1", "ln_gamma2", "converged")))


def bubble_pressure(system: BinarySystem, x1: ArrayLike, T_K: ArrayLike) -> EquilibriumResult:
    """Bubble pressure and vapour composition of liquid ``x1`` at ``T_K``.

    Explicit for an ideal vapour: ``P = Σ x_i γ_i P_i^sat``, ``y_i = x_i γ_i P_i^sat / P``.
    """
    x, T, shape = _as_points(x1, T_K)
    _check_fractions("x1", x)
    p1, p2, ln_g1, ln_g2 = _partial_pressures(system, x, T)
    P = p1 + p2
    y = p1 / P
    converged = np.isfinite(P) & np.isfinite(y) & (P > 0)
    return _reshape(EquilibriumResult(T, P, x, y, ln_g1, ln_g2, converged), shape)


def _liquid_for_vapour(system: BinarySystem, y: FloatArray, T: FloatArray) -> tuple[FloatArray,
                                                                                     BoolArray]:
    """Liquid ``x1`` whose bubble-point vapour at ``T`` is ``y`` (bracketed on [0, 1]).

    For a stable liquid at fixed T the bubble vapour ``y1`` rises monotonically
    with ``x1``, so the root in [0, 1] is unique.
    """

    def residual(x: FloatArray, mask: BoolArray) -> FloatArray:
        p1, p2, _, _ = _partial_pressures(system, x, T[mask])
        return p1 / (p1 + p2) - y[mask]

    # Ideal-solution estimate as the starting point: x1 = y1/P1 / (y1/P1 + y2/P2).
    r1 = y / system.psat1.pressure_Pa(T)
    r2 = (1.0 - y) / system.psat2.pressure_Pa(T)
    guess = r1 / (r1 + r2)
    result = solve_bracketed(residual, np.zeros_like(y), np.ones_like(y), guess, xtol=1e-14,
                             ftol=1e-14)
    return result.root, result.converged


def dew_pressure(system: BinarySystem, y1: ArrayLike, T_K: ArrayLike) -> EquilibriumResult:
    """Dew pressure and liquid composition of vapour ``y1`` at ``T_K``."""
    y, T, shape = _as_points(y1, T_K)
    _check_fractions("y1", y)
    x, ok = _liquid_for_vapour(system, y, T)
    p1, p2, ln_g1, ln_g2 = _partial_pressures(system, x, T)
    P = p1 + p2
    ok = ok & np.isfinite(P)
    return _reshape(EquilibriumResult(T, P, x, y, ln_g1, ln_g2, ok), shape)


def _temperature_start(system: BinarySystem, P: FloatArray, z1: FloatArray,
                       residual: Function) -> tuple[FloatArray, FloatArray, FloatArray]:
    """Bracket and first guess for a temperature solve at ``P``.

    The bracket starts at the pure components' saturation temperatures and is
    widened until ``residual`` changes sign (an azeotrope may boil outside
    that span); the guess interpolates the two by the composition ``z1``.
    """
    T1 = np.asarray(system.psat1.temperature_K(P), dtype=float)
    T2 = np.asarray(system.psat2.temperature_K(P), dtype=float)
    lo, hi = expand_bracket(residual, np.fmin(T1, T2) * 0.995, np.fmax(T1, T2) * 1.005,
                            factor=1.02)
    return lo, hi, np.clip(z1 * T1 + (1.0 - z1) * T2, lo, hi)


def bubble_temperature(system: BinarySystem, x1: ArrayLike, P_Pa: ArrayLike) -> EquilibriumResult:
    """Bubble temperature and vapour composition of liquid ``x1`` at ``P_Pa``.

    Solves ``ln(Σ x_i γ_i(T) P_i^sat(T)) = ln P`` for T, all points at once,
    bracketed between the pure components' saturation temperatures and
    widened until it brackets (an azeotrope may boil outside that span).
    """
    x, P, shape = _as_points(x1, P_Pa)
    _check_fractions("x1", x)
    ln_P = np.log(P)

    def residual(T: FloatArray, mask: BoolArray) -> FloatArray:
        p1, p2, _, _ = _partial_pressures(system, x[mask], T)
        return np.log(p1 + p2) - ln_P[mask]

    lo, hi, guess = _temperature_start(system, P, x, residual)
    solved = solve_bracketed(residual, lo, hi, guess)
    T = solved.root
    p1, p2, ln_g1, ln_g2 = _partial_pressures(system, x, T)
    y = p1 / (p1 + p2)
    ok = solved.converged & np.isfinite(y)
    return _reshape(EquilibriumResult(T, P, x, y, ln_g1, ln_g2, ok), shape)


def dew_temperature(system: BinarySystem, y1: ArrayLike, P_Pa: ArrayLike) -> EquilibriumResult:
    """Dew temperature and liquid composition of vapour ``y1`` at ``P_Pa``.

    An outer bracketed solve in T of ``ln P_dew(T, y1) = ln P``, where the
    inner step finds the liquid in equilibrium with ``y1`` at each trial T
    (:func:`dew_pressure`'s bracketed solve in ``x1``).
    """
    y, P, shape = _as_points(y1, P_Pa)
    _check_fractions("y1", y)
    ln_P = np.log(P)

    def residual(T: FloatArray, mask: BoolArray) -> FloatArray:
        x, _ = _liquid_for_vapour(system, y[mask], T)
        p1, p2, _, _ = _partial_pressures(system, x, T)
        return np.log(p1 + p2) - ln_P[mask]

    lo, hi, guess = _temperature_start(system, P, y, residual)
    solved = solve_bracketed(residual, lo, hi, guess)
    T = solved.root
    x, inner_ok = _liquid_for_vapour(system, y, T)
    _, _, ln_g1, ln_g2 = _partial_pressures(system, x, T)
    ok = solved.converged & inner_ok
    return _reshape(EquilibriumResult(T, P, x, y, ln_g1, ln_g2, ok), shape)
