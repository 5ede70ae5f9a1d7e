"""Liquid-phase stability of a binary, liquid-liquid splits and the three-phase line.

A binary liquid at (x1, T) is stable when its Gibbs energy of mixing
``Δg/RT = x1 ln x1 + x2 ln x2 + gE/RT`` lies on its own convex hull: the
tangent-plane criterion (no other composition lies below the tangent at x1).
The local form, ``d²(Δg/RT)/dx1² > 0``, separates unstable from metastable
liquids; the convex hull catches both.  Where the model predicts two liquids,
the binodal (coexisting) compositions satisfy equal activities,
``x1a γ1(x1a) = x1b γ1(x1b)`` and ``x2a γ2(x2a) = x2b γ2(x2b)``, solved by
Newton's method from the hull's estimate.

On an isobar the two liquids boil together at the three-phase temperature,
where the bubble pressure of the binodal liquids (the same for both, since
their activities are equal) equals P; the vapour there is in equilibrium with
both liquids.  When that vapour lies between the two liquids it is a
heterogeneous azeotrope.

References: M. L. Michelsen, Fluid Phase Equilib. 9 (1982) 1-19 (tangent-plane
stability); J. M. Prausnitz, R. N. Lichtenthaler, E. G. de Azevedo, Molecular
Thermodynamics of Fluid-Phase Equilibria, 3rd ed., 1999, chapter 6.
"""

from __future__ import annotations

import itertools
from collections.abc import Callable
from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray
from scipy.optimize import brentq, fsolve

from builder.analysis.convexity import convex_temperatures
from builder.analysis.phase_lines import three_phase_points
from builder.thermo import equilibrium as eq
from builder.thermo.activity import ActivityModel, Ideal, Swapped, Wilson

__all__ = ["LiquidSplit", "ThreePhase", "binodal", "mixing_gibbs_RT", "one_liquid_only", "stable",
           "three_phase_isobar", "three_phase_isotherm"]


@dataclass(frozen=True)
class LiquidSplit:
    """Two coexisting liquids (the binodal) at one temperature."""

    T_K: float
    x1_a: float  # the liquid poorer in component 1
    x1_b: float  # the liquid richer in component 1


@dataclass(frozen=True)
class ThreePhase:
    """Vapour-liquid-liquid equilibrium at one temperature and pressure."""

    T_K: float
    P_Pa: float
    x1_a: float
    x1_b: float
    y1: float

    @property
    def heterogeneous_azeotrope(self) -> bool:
        """The vapour lies between the two liquids (a decanter can break it)."""
        return self.x1_a < self.y1 < self.x1_b


# ---------------------------------------------------------------------------
# Computation
# ---------------------------------------------------------------------------


FloatArray = NDArray[np.float64]

#: Trial compositions of the tangent-plane test and the hull: even plus log-spaced ends.
_TRIAL = np.unique(np.concatenate([np.linspace(0.0, 1.0, 801), np.logspace(-8, -2, 13),
                                   1.0 - np.logspace(-8, -2, 13)]))[1:-1]

#: A liquid is called unstable when another composition lies this far below its tangent
#: (in units of RT): well above round-off, well below any real split.
TANGENT_TOLERANCE = 1e-9


def mixing_gibbs_RT(model: ActivityModel, x1: ArrayLike, T_K: ArrayLike) -> FloatArray:
    """``Δg_mix/RT = x1 ln x1 + x2 ln x2 + x1 ln γ1 + x2 ln γ2`` (zero at the pure ends).

    >>> from builder.thermo.activity import Ideal
    >>> round(float(mixing_gibbs_RT(Ideal(), 0.5, 300.0)), 6)
    -0.693147
    """
    x1 = np.asarray(x1, dtype=float)
    x2 = 1.0 - x1
    ln_g1, ln_g2 = model.ln_gamma(x1, T_K)
    with np.errstate(divide="ignore", invalid="ignore"):
        ideal = np.where(x1 > 0, x1 * np.log(np.where(x1 > 0, x1, 1.0)), 0.0) + np.where(
            x2 > 0, x2 * np.log(np.where(x2 > 0, x2, 1.0)), 0.0)
    return np.asarray(ideal + x1 * ln_g1 + x2 * ln_g2, dtype=float)


def one_liquid_only(model: ActivityModel) -> bool:
    """Whether the model cannot predict two liquids at all: the ideal solution, and
    Wilson's equation, whose ``Δg_mix`` is convex for every positive ``Λ12``, ``Λ21``
    (Prausnitz, Lichtenthaler and de Azevedo, 3rd ed., 1999, section 6.11).

    >>> from builder.thermo.activity import Margules
    >>> one_liquid_only(Ideal()), one_liquid_only(Margules.constant(3.0, 3.0))
    (True, False)
    """
    while isinstance(model, Swapped):
        model = model.inner
    return isinstance(model, (Ideal, Wilson))


def stable(model: ActivityModel, x1: ArrayLike, T_K: ArrayLike) -> NDArray[np.bool_]:
    """Tangent-plane test: is the liquid ``x1`` at ``T_K`` stable (one phase)?

    ``x1`` and ``T_K`` broadcast (an isobar has one temperature per point).  The
    tangent at ``x1`` has slope ``ln a1 - ln a2``; the liquid is stable when no
    trial composition lies below it.  Pure components are stable, and so is every
    liquid at a temperature where ``Δg_mix`` is proven convex in x1
    (:func:`builder.analysis.convexity.convex_temperatures`, a cheaper sufficient
    test tried first).

    >>> from builder.thermo.activity import Margules
    >>> stable(Margules.constant(3.0, 3.0), [0.02, 0.5, 0.98], 300.0).tolist()
    [True, False, True]
    """
    x = np.atleast_1d(np.asarray(x1, dtype=float))
    T = np.broadcast_to(np.asarray(T_K, dtype=float), x.shape)
    inner = (x > 0.0) & (x < 1.0)
    result = np.ones(x.shape, dtype=bool)
    if not inner.any() or one_liquid_only(model):
        return result
    # Where Δg_mix is proven convex at the point's temperature every composition is stable
    # (:mod:`.convexity`, a cheap sufficient test); the tangent plane tests the rest.
    temperatures, at = np.unique(T[inner], return_inverse=True)
    inner[inner] = ~convex_temperatures(model, temperatures)[at.ravel()]
    if not inner.any():
        return result
    xi, Ti = x[inner], T[inner]
    ln_g1, ln_g2 = model.ln_gamma(xi, Ti)
    slope = np.log(xi) + ln_g1 - np.log(1.0 - xi) - ln_g2
    g_x = mixing_gibbs_RT(model, xi, Ti)
    w = _TRIAL[None, :]
    g_w = mixing_gibbs_RT(model, w, Ti[:, None])
    tangent = g_x[:, None] + slope[:, None] * (w - xi[:, None])
    below = np.nanmin(g_w - tangent, axis=1)
    result[inner] = below > -TANGENT_TOLERANCE
    return result


def _hull_gap(x: FloatArray, g: FloatArray) -> tuple[float, float] | None:
    """The widest edge of the lower convex hull of (x, g) that skips grid points."""
    hull: list[int] = []
    xs, gs = x.tolist(), g.tolist()  # plain floats: the loop runs in the interpreter
    for i in range(len(xs)):
        while len(hull) >= 2:
            a, b = hull[-2], hull[-1]
            cross = (xs[b] - xs[a]) * (gs[i] - gs[a]) - (gs[b] - gs[a]) * (xs[i] - xs[a])
            if cross <= 0:
                hull.pop()
            else:
                break
        hull.append(i)
    best: tuple[float, float] | None = None
    width = 0.0
    for a, b in itertools.pairwise(hull):
        if b - a > 1 and xs[b] - xs[a] > width:
            width = xs[b] - xs[a]
            best = (xs[a], xs[b])
    return best


def binodal(model: ActivityModel, T_K: float) -> LiquidSplit | None:
    """The two coexisting liquids at ``T_K``, or None if the liquid is stable everywhere.

    Symmetric Margules with A = 3: the closed form ``ln(x/(1-x)) = A (2x - 1)``
    gives 0.070720 and 0.929280.

    >>> from builder.thermo.activity import Margules
    >>> split = binodal(Margules.constant(3.0, 3.0), 300.0)
    >>> round(split.x1_a, 6), round(split.x1_b, 6)
    (0.07072, 0.92928)
    """
    x = np.concatenate([[0.0], _TRIAL, [1.0]])
    g = mixing_gibbs_RT(model, x, T_K)
    gap = _hull_gap(x, g)
    if gap is None or gap[1] - gap[0] < 1e-6:
        return None

    def ln_activities(u: FloatArray) -> tuple[FloatArray, FloatArray]:
        xs = 1.0 / (1.0 + np.exp(-u))  # logit keeps both liquids inside (0, 1)
        ln_g1, ln_g2 = model.ln_gamma(xs, T_K)
        with np.errstate(divide="ignore"):  # a liquid at a pure end to round-off
            return np.log(xs) + ln_g1, np.log(1.0 - xs) + ln_g2

    def equations(u: FloatArray) -> FloatArray:
        a1, a2 = ln_activities(u)
        return np.array([a1[0] - a1[1], a2[0] - a2[1]])

    if not 0.0 < gap[0] < gap[1] < 1.0:
        # A hull corner at a pure end (a liquid nearly pure to round-off): no logit start.
        return LiquidSplit(T_K=float(T_K), x1_a=float(gap[0]), x1_b=float(gap[1]))
    guess = np.log(np.array(gap) / (1.0 - np.array(gap)))
    u, info, ok, _ = fsolve(equations, guess, full_output=True, xtol=1e-13)
    xa, xb = sorted(1.0 / (1.0 + np.exp(-u)))
    if ok != 1 or np.max(np.abs(info["fvec"])) > 1e-9 or xb - xa < 1e-6:
        # Newton did not converge to two distinct liquids: report the hull estimate,
        # which is accurate to the trial grid (about 1e-3 in x1).
        xa, xb = gap
    return LiquidSplit(T_K=float(T_K), x1_a=float(xa), x1_b=float(xb))


def _split_bubble(system: eq.BinarySystem, split: LiquidSplit) -> eq.EquilibriumResult:
    return eq.bubble_pressure(system, np.array([split.x1_a, split.x1_b]), split.T_K)


def three_phase_isotherm(system: eq.BinarySystem, T_K: float) -> ThreePhase | None:
    """VLLE on an isotherm: the binodal at T and its common bubble pressure."""
    split = binodal(system.activity, T_K)
    if split is None:
        return None
    bubble = _split_bubble(system, split)
    return ThreePhase(T_K=T_K, P_Pa=float(bubble.P_Pa[0]), x1_a=split.x1_a,
                      x1_b=split.x1_b, y1=float(bubble.y1[0]))


def three_phase_isobar(system: eq.BinarySystem, P_Pa: float, T_guess_K: float,
                       x1_guess: tuple[float, float] | None = None) -> ThreePhase | None:
    """VLLE on an isobar: the temperature at which the binodal liquids boil at ``P_Pa``.

    ``T_guess_K`` is a temperature near the expected three-phase line (the
    homogeneous bubble temperature of an unstable liquid).  With ``x1_guess``
    (the ends of the unstable stretch of the bubble curve) the three equations
    of the point are solved directly by Newton's method
    (:func:`builder.analysis.phase_lines.three_phase_points`), accepted within
    ±40 K of the guess.  Otherwise, or when that fails, the search scans ±40 K
    around the guess for a sign change of ``ln P_bubble(binodal(T)) - ln P``
    (10 K steps, then 2.5 K), then up to 200 K above it (nearly immiscible
    liquids), and refines it with Brent's method.
    """
    if x1_guess is not None:
        point = three_phase_points(system, P_Pa, x1_guess[0], x1_guess[1], T_guess_K)
        if point.converged[0] and abs(point.T_K[0] - T_guess_K) <= 40.0:
            return ThreePhase(T_K=float(point.T_K[0]), P_Pa=P_Pa, x1_a=float(point.x1_a[0]),
                              x1_b=float(point.x1_b[0]), y1=float(point.y1[0]))

    def mismatch(T: float) -> float:
        split = binodal(system.activity, T)
        if split is None:
            return float("nan")
        return float(np.log(_split_bubble(system, split).P_Pa[0]) - np.log(P_Pa))

    known: dict[float, float] = {}

    def cached(T: float) -> float:
        if T not in known:
            known[T] = mismatch(T)
        return known[T]

    # A coarse pass (10 K) first: each point is a binodal, the costly part.  The fine pass
    # (2.5 K) catches a split that exists over a narrow range of temperatures only.
    for points in (9, 33):
        temperatures = T_guess_K + np.linspace(-40.0, 40.0, points)
        values = np.array([cached(float(T)) for T in temperatures])
        for i in range(values.size - 1):
            a, b = values[i], values[i + 1]
            if np.isfinite(a) and np.isfinite(b) and a * b <= 0:
                return _three_phase_at(system, P_Pa, mismatch, temperatures[i],
                                       temperatures[i + 1])
        if np.isfinite(values).all() and (values < 0).all():
            break  # two liquids throughout, all boiling above P: the line lies higher up
    # Nearly immiscible liquids (hydrocarbons or chlorinated solvents with water) have
    # metastable one-liquid bubble temperatures far below the three-phase line: go on
    # upwards until the binodal liquids boil at P.
    previous_T, previous = float(temperatures[-1]), float(values[-1])
    for T in T_guess_K + np.arange(45.0, 205.0, 5.0):
        value = cached(float(T))
        if np.isfinite(previous) and np.isfinite(value) and previous * value <= 0:
            return _three_phase_at(system, P_Pa, mismatch, previous_T, float(T))
        previous_T, previous = float(T), value
    return None


def _three_phase_at(system: eq.BinarySystem, P_Pa: float, mismatch: Callable[[float], float],
                    T_low: float, T_high: float) -> ThreePhase | None:
    """Refine a bracketed three-phase temperature with Brent's method."""
    T3 = brentq(mismatch, T_low, T_high, xtol=1e-10)
    split = binodal(system.activity, T3)
    if split is None:
        return None
    bubble = _split_bubble(system, split)
    return ThreePhase(T_K=float(T3), P_Pa=P_Pa, x1_a=split.x1_a, x1_b=split.x1_b,
                      y1=float(bubble.y1[0]))
