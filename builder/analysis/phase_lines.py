"""Azeotropes and three-phase points solved from their own equations, many at once.

Instead of searching along a bubble curve for each pressure, these functions
solve the defining equations of the point directly, one small Newton system per
pressure, all pressures in one array computation:

* **Homogeneous azeotrope** at ``P``: unknowns ``(x1, T)`` with
  ``ln α12 = ln K1 - ln K2 = 0`` (vapour and liquid of equal composition) and the
  bubble condition ``ln(x1 K1 + x2 K2) = 0``.
* **Three-phase point** (vapour with two liquids) at ``P``: unknowns
  ``(x1a, x1b, T)`` with equal activities of both components in both liquids,
  ``ln(x1a γ1a) = ln(x1b γ1b)``, ``ln(x2a γ2a) = ln(x2b γ2b)``, and the bubble
  condition of liquid a, ``ln(x1a K1a + x2a K2a) = 0``; the vapour is
  ``y1 = x1a K1a``.

``K_i`` are :func:`builder.thermo.equilibrium.k_values`, so the vapour model
enters here exactly as in the bubble-point solvers.  Compositions are solved in
log-odds ``s = ln(x/(1-x))``, which keeps them inside (0, 1); the Jacobian is a
forward difference (the point and its displaced copies evaluated in one call);
steps are limited (1 in log-odds, 20 K) so that a poor start does not jump to
another branch.  Each point reports whether it converged; a
point that did not is never to be used (the caller falls back to a search).

Reference for the equations: J. M. Prausnitz, R. N. Lichtenthaler, E. G. de
Azevedo, Molecular Thermodynamics of Fluid-Phase Equilibria, 3rd ed., 1999,
chapters 6 and 10.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from builder.thermo import equilibrium as eq

__all__ = ["AzeotropePoints", "ThreePhasePoints", "azeotrope_points",
           "azeotrope_points_isotherm", "three_phase_points"]

FloatArray = NDArray[np.float64]
BoolArray = NDArray[np.bool_]

#: Convergence: step in log-odds and relative step in T (both well inside the bracketed
#: solvers' 1e-12), or residuals at round-off.
_STEP_TOL = 1e-13
_RESIDUAL_TOL = 1e-14
_MAX_STEP = np.array([1.0, 1.0, 20.0])
#: On an isotherm: 1 in log-odds and 0.5 in ln P.
_MAX_STEP_ISOTHERM = np.array([1.0, 0.5])


def _x(s: FloatArray) -> FloatArray:
    return np.asarray(1.0 / (1.0 + np.exp(-s)), dtype=float)


def _s(x: FloatArray) -> FloatArray:
    x = np.clip(np.asarray(x, dtype=float), 1e-15, 1.0 - 1e-15)
    return np.asarray(np.log(x / (1.0 - x)), dtype=float)


def _newton(equations: Callable[[FloatArray, FloatArray], FloatArray], u0: FloatArray,
            P: FloatArray, maxiter: int, towards_end: int | None = None,
            limit: FloatArray | None = None) -> tuple[FloatArray, BoolArray, FloatArray]:
    """Damped Newton on ``equations(u, P) = 0`` for every row of ``u`` (n, m) at once.

    ``P``: the fixed condition of each row (a pressure, or a temperature on an isotherm);
    ``limit``: the largest step of each unknown (default 1 in log-odds, 20 K).

    Returns the solution, a convergence flag per row and the Jacobian at the solution.
    ``towards_end``: the column of a log-odds unknown ``s`` whose equation 0 tends to a
    limit at a pure end, ``F0(s) ≈ F0(∞) + c e^(-|s|)``.  A row that has moved a full
    step further out beyond ``|s| > 12`` while ``F0`` changed by less than 1 % of itself
    stops, unconverged: under that law a root further out needs
    ``|ΔF0| = (e - 1) |c| e^(-|s|) > |F0|/50`` at each step, so there is none (the row
    would march on to the end at one unit of ``s`` per step until ``maxiter``).
    """
    u = np.array(u0, dtype=float, copy=True)
    n, m = u.shape
    converged = np.zeros(n, dtype=bool)
    active = np.ones(n, dtype=bool)
    step_before = np.full(n, np.inf)  # the last full step, relative to the unknowns' scale
    f_before = np.full(n, np.nan)
    s_before = np.full(n, np.nan)
    jac = np.full((n, m, m), np.nan)
    limit = _MAX_STEP[-m:] if limit is None else limit
    for _ in range(maxiter):
        idx = np.flatnonzero(active)
        if idx.size == 0:
            break
        ua, Pa = u[idx], P[idx]
        h = 1e-7 * np.maximum(np.abs(ua), 1.0)
        # The point and its m displaced copies (the Jacobian's columns) in one call.
        trial = np.repeat(ua[None], m + 1, axis=0)                      # (m + 1, k, m)
        for j in range(m):
            trial[j + 1, :, j] += h[:, j]
        values = equations(trial.reshape(-1, m), np.tile(Pa, m + 1)).reshape(m + 1, -1, m)
        f = values[0]
        J = np.empty((idx.size, m, m))
        for j in range(m):
            J[:, :, j] = (values[j + 1] - f) / h[:, j, None]
        jac[idx] = J
        finite = np.asarray(np.isfinite(f).all(axis=1) & np.isfinite(J).all(axis=(1, 2)),
                            dtype=bool)
        small = finite & (np.abs(f).max(axis=1) <= _RESIDUAL_TOL)
        delta = np.zeros_like(ua)
        determinant = np.asarray(np.linalg.det(np.where(finite[:, None, None], J, 1.0)))
        solvable = finite & ~small & (np.abs(determinant) > 0)
        if solvable.any():
            delta[solvable] = -np.linalg.solve(J[solvable], f[solvable][..., None])[..., 0]
        scale = np.max(np.abs(delta) / limit, axis=1)
        delta /= np.maximum(scale, 1.0)[:, None]
        u[idx] = ua + delta
        relative = np.max(np.abs(delta) / np.maximum(np.abs(ua), 1.0), axis=1)
        tiny = relative <= _STEP_TOL
        # Visibly quadratic convergence (as in builder.thermo.solvers.solve_newton): a step
        # of at most 1e-6 and a tenth of the one before leaves an error of about
        # step³/before² (Newton's e_(k+1) = K e_k², K from the two steps), far below the
        # tolerance: the step that would only confirm it is saved.
        with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
            before = step_before[idx]
            quadratic = ((relative <= 1e-6) & (relative <= 0.1 * before)
                         & (relative**3 <= 0.01 * _STEP_TOL * before**2))
        step_before[idx] = np.where(solvable & (scale <= 1.0), relative, np.inf)
        done = small | (solvable & (tiny | quadratic) & (scale <= 1.0))
        if towards_end is not None:
            s_now, f_now = np.abs(ua[:, towards_end]), f[:, 0]
            with np.errstate(invalid="ignore"):
                outward = (s_now > 12.0) & (s_now >= np.abs(s_before[idx]) + 0.999)
                flat = np.abs(f_now - f_before[idx]) < 0.01 * np.abs(f_now)
            active[idx[outward & flat & ~done]] = False
            f_before[idx], s_before[idx] = f_now, ua[:, towards_end]
        converged[idx[done]] = True
        active[idx[done | ~(finite & (solvable | small))]] = False
    return u, converged, jac


@dataclass(frozen=True)
class AzeotropePoints:
    """Homogeneous azeotropes, one per pressure (valid where ``converged``)."""

    P_Pa: FloatArray
    x1: FloatArray
    T_K: FloatArray
    falling: BoolArray  # ln α12 falls with x1 along the bubble curve (T minimum on an isobar)
    converged: BoolArray


def azeotrope_points(system: eq.BinarySystem, P_Pa: ArrayLike, x1_guess: ArrayLike,
                     T_guess_K: ArrayLike, *, maxiter: int = 20) -> AzeotropePoints:
    """Solve ``α12 = 1`` on the bubble curve at each pressure, from the given guesses.

    Symmetric Margules (A = 1) with equal vapour pressures has its azeotrope at
    x1 = 0.5, where ``P = e^11 exp(A/4) Pa`` fixes T:

    >>> from builder.thermo.activity import Margules
    >>> from builder.thermo.vapour_pressure import Antoine
    >>> vp = Antoine(A=11.0, B=3000.0, C=0.0, T_min_K=200.0, T_max_K=500.0)
    >>> s = eq.BinarySystem(vp, vp, Margules.constant(1.0, 1.0))
    >>> P = float(np.exp(11.0 - 3000.0 / 300.0 + 0.25))
    >>> r = azeotrope_points(s, [P], [0.3], [290.0])
    >>> round(float(r.x1[0]), 12), round(float(r.T_K[0]), 9), bool(r.falling[0])
    (0.5, 300.0, True)
    """
    P, x0, T0 = np.broadcast_arrays(np.asarray(P_Pa, dtype=float),
                                    np.asarray(x1_guess, dtype=float),
                                    np.asarray(T_guess_K, dtype=float))
    P, x0, T0 = P.ravel(), x0.ravel(), T0.ravel()

    def equations(u: FloatArray, Pu: FloatArray) -> FloatArray:
        x = _x(u[:, 0])
        with np.errstate(all="ignore"):
            K1, K2 = eq.k_values(system, x, u[:, 1], Pu)
            return np.stack([np.log(K1) - np.log(K2), np.log(x * K1 + (1.0 - x) * K2)],
                            axis=1)

    u, ok, J = _newton(equations, np.stack([_s(x0), T0], axis=1), P, maxiter, towards_end=0)
    # Slope of ln α along the bubble curve: dF1/ds - dF1/dT (dF2/ds / dF2/dT).
    with np.errstate(all="ignore"):
        slope = J[:, 0, 0] - J[:, 0, 1] * J[:, 1, 0] / J[:, 1, 1]
    x = _x(u[:, 0])
    ok &= np.isfinite(slope) & (x > 0.0) & (x < 1.0)
    return AzeotropePoints(P_Pa=P, x1=x, T_K=u[:, 1], falling=slope < 0, converged=ok)


def azeotrope_points_isotherm(system: eq.BinarySystem, T_K: float, x1_guess: ArrayLike,
                              P_guess_Pa: ArrayLike, *, maxiter: int = 20) -> AzeotropePoints:
    """Solve ``α12 = 1`` on the bubble curve of the isotherm ``T_K``, one root per guess.

    Unknowns ``(s, ln P)`` (``s`` the log-odds of x1) with the equations of
    :func:`azeotrope_points`, ``ln K1 - ln K2 = 0`` and ``ln(x1 K1 + x2 K2) = 0``, at
    the fixed temperature; ``falling``: ``ln α12`` falls with x1 along the bubble curve
    (a pressure maximum).

    Symmetric Margules (A = 1) with equal vapour pressures: the azeotrope at x1 = 0.5,
    where ``P = P_sat exp(A/4)``:

    >>> from builder.thermo.activity import Margules
    >>> from builder.thermo.vapour_pressure import Antoine
    >>> vp = Antoine(A=11.0, B=3000.0, C=0.0, T_min_K=200.0, T_max_K=500.0)
    >>> s = eq.BinarySystem(vp, vp, Margules.constant(1.0, 1.0))
    >>> r = azeotrope_points_isotherm(s, 300.0, [0.3], [2.0e4])
    >>> P = float(np.exp(11.0 - 3000.0 / 300.0 + 0.25))
    >>> round(float(r.x1[0]), 12), round(float(r.P_Pa[0]) / P, 12), bool(r.falling[0])
    (0.5, 1.0, True)
    """
    x0, P0 = np.broadcast_arrays(np.asarray(x1_guess, dtype=float),
                                 np.asarray(P_guess_Pa, dtype=float))
    x0, P0 = x0.ravel(), P0.ravel()
    T = np.full(x0.size, float(T_K))

    def equations(u: FloatArray, Tu: FloatArray) -> FloatArray:
        x = _x(u[:, 0])
        with np.errstate(all="ignore"):
            K1, K2 = eq.k_values(system, x, Tu, np.exp(u[:, 1]))
            return np.stack([np.log(K1) - np.log(K2), np.log(x * K1 + (1.0 - x) * K2)],
                            axis=1)

    u, ok, J = _newton(equations, np.stack([_s(x0), np.log(P0)], axis=1), T, maxiter,
                       towards_end=0, limit=_MAX_STEP_ISOTHERM)
    with np.errstate(all="ignore"):
        slope = J[:, 0, 0] - J[:, 0, 1] * J[:, 1, 0] / J[:, 1, 1]
    x = _x(u[:, 0])
    ok &= np.isfinite(slope) & (x > 0.0) & (x < 1.0)
    return AzeotropePoints(P_Pa=np.exp(u[:, 1]), x1=x, T_K=T, falling=slope < 0,
                           converged=ok)


@dataclass(frozen=True)
class ThreePhasePoints:
    """Vapour-liquid-liquid points, one per pressure (valid where ``converged``)."""

    P_Pa: FloatArray
    T_K: FloatArray
    x1_a: FloatArray
    x1_b: FloatArray
    y1: FloatArray
    converged: BoolArray


def three_phase_points(system: eq.BinarySystem, P_Pa: ArrayLike, x1_a_guess: ArrayLike,
                       x1_b_guess: ArrayLike, T_guess_K: ArrayLike, *,
                       maxiter: int = 20) -> ThreePhasePoints:
    """Solve for two liquids boiling together at each pressure, from the given guesses.

    A point converged to a single liquid (``x1_b - x1_a < 1e-6``) is not converged.
    Symmetric Margules (A = 3) with equal vapour pressures: the liquids of
    :func:`builder.analysis.stability.binodal` (0.070720, 0.929280), the vapour
    at x1 = 0.5 and 300 K where ``P = 2 x1a γ1a P_sat(300 K)``:

    >>> from builder.thermo.activity import Margules
    >>> from builder.thermo.vapour_pressure import Antoine
    >>> vp = Antoine(A=11.0, B=3000.0, C=0.0, T_min_K=200.0, T_max_K=500.0)
    >>> s = eq.BinarySystem(vp, vp, Margules.constant(3.0, 3.0))
    >>> P = 2 * 0.0707202 * np.exp(3 * 0.9292798**2) * float(np.exp(1.0))
    >>> r = three_phase_points(s, [P], [0.1], [0.9], [290.0])
    >>> round(float(r.x1_a[0]), 6), round(float(r.x1_b[0]), 6), round(float(r.y1[0]), 9)
    (0.07072, 0.92928, 0.5)
    >>> round(float(r.T_K[0]), 4)
    300.0
    """
    P, xa0, xb0, T0 = np.broadcast_arrays(
        np.asarray(P_Pa, dtype=float), np.asarray(x1_a_guess, dtype=float),
        np.asarray(x1_b_guess, dtype=float), np.asarray(T_guess_K, dtype=float))
    P, xa0, xb0, T0 = P.ravel(), xa0.ravel(), xb0.ravel(), T0.ravel()
    model = system.activity

    def equations(u: FloatArray, Pu: FloatArray) -> FloatArray:
        xa, xb, T = _x(u[:, 0]), _x(u[:, 1]), u[:, 2]
        with np.errstate(all="ignore"):
            ga1, ga2 = model.ln_gamma(xa, T)
            gb1, gb2 = model.ln_gamma(xb, T)
            K1, K2 = eq.k_values(system, xa, T, Pu)
            # ln x - ln(1 - x) is s itself; ln x = -ln(1 + e^-s) keeps precision.
            ln_xa, ln_xb = -np.log1p(np.exp(-u[:, 0])), -np.log1p(np.exp(-u[:, 1]))
            ln_1xa, ln_1xb = -np.log1p(np.exp(u[:, 0])), -np.log1p(np.exp(u[:, 1]))
            return np.stack([ln_xa + ga1 - ln_xb - gb1, ln_1xa + ga2 - ln_1xb - gb2,
                             np.log(xa * K1 + (1.0 - xa) * K2)], axis=1)

    u, ok, _ = _newton(equations, np.stack([_s(xa0), _s(xb0), T0], axis=1), P, maxiter)
    xa, xb, T = _x(u[:, 0]), _x(u[:, 1]), u[:, 2]
    low, high = np.minimum(xa, xb), np.maximum(xa, xb)
    with np.errstate(all="ignore"):
        K1, _ = eq.k_values(system, xa, T, P)
    y1 = xa * K1
    ok &= (high - low >= 1e-6) & np.isfinite(y1)
    return ThreePhasePoints(P_Pa=P, T_K=T, x1_a=low, x1_b=high, y1=y1, converged=ok)
