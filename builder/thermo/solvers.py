"""Vectorised scalar root finding: one call solves every point of a curve.

The thermodynamic solvers reduce each problem to ``f(u) = 0`` for one unknown
per point (a temperature, a pressure or a liquid mole fraction).  They hand
this module a function that evaluates ``f`` for a whole array of unknowns at
once and a bracket ``[lo, hi]`` per point in which ``f`` changes sign.

The method is safeguarded Newton (``rtsafe`` in the numerical-methods
literature): a Newton step when it stays inside the current bracket and
shrinks it fast enough, otherwise a bisection step.  The bracket is updated
from the sign of ``f`` at every iterate, so the method cannot diverge and
converges at least linearly; near the root it converges quadratically.  The
derivative is taken by a forward difference unless the caller supplies it.

Every point reports whether it converged: a point that ran out of iterations
or whose bracket did not bracket a root is marked ``False``; its value is the
best estimate, never to be used as if it were right.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

__all__ = ["Function", "IndexFunction", "RootResult", "expand_bracket", "expand_bracket_values",
           "solve_bracketed", "solve_newton"]

FloatArray = NDArray[np.float64]
Function = Callable[[FloatArray, NDArray[np.bool_]], FloatArray]
#: ``f(u, index)`` of :func:`solve_newton`: the points' integer indices, each possibly twice.
IndexFunction = Callable[[FloatArray, NDArray[np.intp]], FloatArray]


@dataclass(frozen=True)
class RootResult:
    """Roots of a vector of scalar problems, with a convergence flag per point."""

    root: FloatArray
    converged: NDArray[np.bool_]
    residual: FloatArray
    iterations: int


def _evaluate(f: Function, u: FloatArray, active: NDArray[np.bool_]) -> FloatArray:
    out = np.full_like(u, np.nan)
    if np.any(active):
        out[active] = f(u[active], active)
    return out


def solve_bracketed(
    f: Function,
    lo: FloatArray,
    hi: FloatArray,
    u0: FloatArray | None = None,
    *,
    xtol: float = 1e-12,
    ftol: float = 1e-13,
    maxiter: int = 100,
    relative_step: float = 1e-7,
    f_lo: FloatArray | None = None,
    f_hi: FloatArray | None = None,
) -> RootResult:
    """Solve ``f(u) = 0`` for every point, each inside its own bracket.

    Parameters
    ----------
    f : callable
        ``f(u, mask)`` returns the residual for the points ``mask`` selects
        (``u`` holds only those points).  The mask lets a caller index its
        own per-point data (a composition, a pressure) alongside ``u``.
    lo, hi : ndarray
        Brackets; ``f(lo)`` and ``f(hi)`` must differ in sign for a point to
        be solvable.  Points whose bracket does not bracket are returned
        unconverged (after one bisection pass to report a best estimate).
    u0 : ndarray, optional
        Starting values (clipped into the bracket); default mid-bracket.
    xtol : float
        Relative tolerance on ``u`` (scaled by ``max(|u|, 1)``).
    ftol : float
        Absolute tolerance on ``f``; the residual should be dimensionless.
    f_lo, f_hi : ndarray, optional
        ``f`` at the bracket ends when the caller already has it (as
        :func:`expand_bracket_values` returns it), saving two evaluations.

    Examples
    --------
    Cube roots of 1, 8 and 27 in one call:

    >>> r = solve_bracketed(lambda u, m: u**3 - np.array([1.0, 8.0, 27.0])[m],
    ...                     np.zeros(3), np.full(3, 5.0))
    >>> np.round(r.root, 12).tolist(), bool(r.converged.all())
    ([1.0, 2.0, 3.0], True)
    """
    lo = np.array(lo, dtype=float, copy=True)
    hi = np.array(hi, dtype=float, copy=True)
    n = lo.size
    all_points = np.ones(n, dtype=bool)
    f_lo = _evaluate(f, lo, all_points) if f_lo is None else np.array(f_lo, dtype=float)
    f_hi = _evaluate(f, hi, all_points) if f_hi is None else np.array(f_hi, dtype=float)
    # Orient so that f(lo) < 0 < f(hi).
    swap = f_lo > 0
    lo[swap], hi[swap] = hi[swap], lo[swap].copy()
    f_lo[swap], f_hi[swap] = f_hi[swap], f_lo[swap].copy()

    u = 0.5 * (lo + hi) if u0 is None else np.array(u0, dtype=float, copy=True)
    low_edge, high_edge = np.minimum(lo, hi), np.maximum(lo, hi)
    u = np.clip(u, low_edge, high_edge)

    exact_lo = f_lo == 0
    exact_hi = f_hi == 0
    u[exact_lo] = lo[exact_lo]
    u[exact_hi] = hi[exact_hi]
    bracketed = (f_lo <= 0) & (f_hi >= 0) & np.isfinite(f_lo) & np.isfinite(f_hi)
    converged = exact_lo | exact_hi
    active = bracketed & ~converged
    residual = np.where(converged, 0.0, np.nan)
    previous_step = np.abs(hi - lo)
    iteration = 0

    for iteration in range(1, maxiter + 1):  # noqa: B007 - reported in the result
        if not np.any(active):
            break
        idx = np.flatnonzero(active)
        ua = u[idx]
        mask = np.zeros(n, dtype=bool)
        mask[idx] = True
        fa = f(ua, mask)
        width = np.abs(hi[idx] - lo[idx])
        h = np.minimum(relative_step * np.maximum(np.abs(ua), 1.0), 0.5 * width)
        h = np.where(h > 0, h, relative_step)
        # Probe towards the middle of the bracket, so the difference never leaves it.
        direction = np.where(0.5 * (lo[idx] + hi[idx]) >= ua, 1.0, -1.0)
        dfa = (f(ua + direction * h, mask) - fa) / (direction * h)
        residual[idx] = fa

        # Update the brackets from the sign of f.
        neg = fa < 0
        lo[idx[neg]] = ua[neg]
        hi[idx[~neg]] = ua[~neg]

        with np.errstate(divide="ignore", invalid="ignore"):
            newton = ua - fa / dfa
        a, b = lo[idx], hi[idx]
        inside = (newton - a) * (newton - b) <= 0
        fast = np.abs(newton - ua) < 0.5 * previous_step[idx]
        use_newton = inside & fast & np.isfinite(newton)
        bisect = 0.5 * (a + b)
        new_u = np.where(use_newton, newton, bisect)
        previous_step[idx] = np.abs(new_u - ua)
        u[idx] = new_u

        scale = np.maximum(np.abs(new_u), 1.0)
        done = (np.abs(fa) <= ftol) | (np.abs(b - a) <= xtol * scale) | (
            previous_step[idx] <= xtol * scale
        )
        done &= np.isfinite(fa)
        # A point whose bisection has stalled with a large residual is not a
        # root (it may be a pole); leave it unconverged.
        converged[idx[done]] = True
        active[idx[done]] = False

    if np.any(converged & ~(residual == 0)):
        # Report the residual at the returned value.
        idx = np.flatnonzero(converged)
        mask = np.zeros(n, dtype=bool)
        mask[idx] = True
        residual[idx] = f(u[idx], mask)
        # Accept only points whose final residual is small in a scale-aware way.
        bad = ~np.isfinite(residual[idx]) | (np.abs(residual[idx]) > 1e-6)
        converged[idx[bad]] = False

    return RootResult(root=u, converged=converged & bracketed | (exact_lo | exact_hi),
                      residual=residual, iterations=iteration)


def solve_newton(
    f: IndexFunction,
    u0: FloatArray,
    *,
    xtol: float = 1e-12,
    ftol: float = 1e-13,
    maxiter: int = 8,
    max_step: float = np.inf,
    relative_step: float = 1e-7,
) -> RootResult:
    """Solve ``f(u) = 0`` for every point by plain Newton steps from ``u0``, no bracket.

    ``u ← u - f(u)/f'(u)`` with the derivative by a forward difference (step
    ``relative_step · max(|u|, 1)``), each step limited to ``max_step``.  Unlike
    :func:`solve_bracketed`, ``f(u, index)`` receives the integer indices of the points
    (not a mask), and each point twice per call: ``u`` and ``u + h`` are evaluated
    in one call, which halves the calls (each has a fixed cost whatever its size).  A point
    converges when ``|f| ≤ ftol`` or a full (unlimited) step is at most
    ``xtol · max(|u|, 1)``, the tests of :func:`solve_bracketed`, or when the
    convergence is visibly quadratic and the error left after the step is far below
    that: a step ``s_k`` of at most ``1e-6 · max(|u|, 1)`` and a tenth of the one
    before, whose estimated remaining error ``K s_k²`` (``K = |s_k| / s_(k-1)²``, the
    ratio of Newton's error law ``e_(k+1) = K e_k²``) is below ``xtol/100`` of the
    scale; this saves the last step, which would only confirm.  The root is the
    point after the converging step.  Meant as a fast first pass from good starting values
    where ``f`` is smooth and monotonic: a point that does not converge within
    ``maxiter`` steps, or meets a non-finite value, is returned unconverged for the
    caller to hand to :func:`solve_bracketed`.

    >>> r = solve_newton(lambda u, m: u**3 - np.array([1.0, 8.0, 27.0])[m],
    ...                  np.array([1.2, 2.5, 2.8]))
    >>> np.round(r.root, 12).tolist(), r.converged.tolist()
    ([1.0, 2.0, 3.0], [True, True, True])
    """
    u = np.array(u0, dtype=float, copy=True)
    n = u.size
    converged = np.zeros(n, dtype=bool)
    active = np.isfinite(u)
    residual = np.full(n, np.nan)
    previous = np.full(n, np.inf)
    iteration = 0
    for iteration in range(1, maxiter + 1):  # noqa: B007 - reported in the result
        idx = np.flatnonzero(active)
        if idx.size == 0:
            break
        ua = u[idx]
        h = relative_step * np.maximum(np.abs(ua), 1.0)
        both = f(np.concatenate([ua, ua + h]), np.concatenate([idx, idx]))
        fa = both[:idx.size]
        with np.errstate(divide="ignore", invalid="ignore"):
            step = fa * h / (both[idx.size:] - fa)
        residual[idx] = fa
        finite = np.isfinite(step) & np.isfinite(fa)
        scale = np.maximum(np.abs(ua), 1.0)
        size, before = np.abs(step), previous[idx]
        with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
            quadratic = ((size <= 1e-6 * scale) & (size <= 0.1 * before)
                         & (size**3 <= 0.01 * xtol * scale * before**2))
        done = finite & ((np.abs(fa) <= ftol) | (size <= xtol * scale) | quadratic)
        previous[idx] = size
        u[idx] = ua - np.where(finite, np.clip(step, -max_step, max_step), 0.0)
        converged[idx[done]] = True
        active[idx[done | ~finite]] = False
    return RootResult(root=u, converged=converged, residual=residual, iterations=iteration)


def expand_bracket(
    f: Function,
    lo: FloatArray,
    hi: FloatArray,
    *,
    factor: float = 1.1,
    lower_limit: float = 1e-300,
    max_expansions: int = 60,
) -> tuple[FloatArray, FloatArray]:
    """Widen ``[lo, hi]`` geometrically until ``f`` has opposite signs at the ends.

    For positive unknowns (temperatures, pressures) with ``f`` increasing in
    ``u``: ``lo`` is divided by ``factor`` while ``f(lo) > 0`` and ``hi``
    multiplied while ``f(hi) < 0``.  Points that cannot be bracketed keep
    their last bracket; :func:`solve_bracketed` then reports them unconverged.

    >>> lo, hi = expand_bracket(lambda u, m: u - 10.0, np.array([1.0]), np.array([2.0]),
    ...                         factor=2.0)
    >>> lo.tolist(), hi.tolist()
    ([1.0], [16.0])
    """
    lo, hi, _, _ = expand_bracket_values(f, lo, hi, factor=factor, lower_limit=lower_limit,
                                         max_expansions=max_expansions)
    return lo, hi


def expand_bracket_values(
    f: Function,
    lo: FloatArray,
    hi: FloatArray,
    *,
    factor: float = 1.1,
    lower_limit: float = 1e-300,
    max_expansions: int = 60,
) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray]:
    """:func:`expand_bracket`, also returning ``f(lo)`` and ``f(hi)`` of the final bracket.

    Only the ends that moved are evaluated again, and the values can be handed to
    :func:`solve_bracketed` so that it does not evaluate the ends once more.
    """
    lo = np.array(lo, dtype=float, copy=True)
    hi = np.array(hi, dtype=float, copy=True)
    everything = np.ones(lo.size, dtype=bool)
    f_lo = _evaluate(f, lo, everything)
    f_hi = _evaluate(f, hi, everything)
    for _ in range(max_expansions):
        low_bad = ~(f_lo <= 0)
        high_bad = ~(f_hi >= 0)
        if not (np.any(low_bad) or np.any(high_bad)):
            break
        if np.any(low_bad):
            lo[low_bad] = np.maximum(lo[low_bad] / factor, lower_limit)
            f_lo[low_bad] = f(lo[low_bad], low_bad)
        if np.any(high_bad):
            hi[high_bad] = hi[high_bad] * factor
            f_hi[high_bad] = f(hi[high_bad], high_bad)
    return lo, hi, f_lo, f_hi
