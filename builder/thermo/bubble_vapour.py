"""The vapour of a bubble point with a real vapour: ``y_i ∝ p_i c_i(y)``, solved for y.

At a given liquid, T and P the partial pressures of the modified Raoult's law,
``p_i = x_i γ_i P_i^sat``, are known; the vapour correction ``c_i``
(:func:`builder.thermo.vapour.ln_correction`, ``K_i = γ_i P_i^sat c_i / P``)
depends on the vapour itself, so the bubble vapour solves

``y1 = p1 c1(y1) / (p1 c1(y1) + p2 c2(y1))``.

* Virial vapour (:class:`builder.thermo.vapour.VirialVapour`): ``ln c1 = a1 - s y2²``,
  ``ln c2 = a2 - s y1²`` (:meth:`~builder.thermo.vapour.VirialVapour.correction_terms`),
  so in log-odds ``u = ln(y1/y2)`` the equation is

  ``h(u) = u - ln(p1/p2) - (a1 - a2) - s (2 y1 - 1) = 0``,  ``h'(u) = 1 - 2 s y1 y2``,

  solved by Newton's method where ``s < 1.5`` (then ``h' ≥ 1 - s/2 > 0``: ``h`` rises
  monotonically and has one root, the fixed point that successive substitution, whose
  step shrinks the error by ``s y1 y2 ≤ s/2``, converges to).  ``|s|`` is a few hundredths
  at atmospheric pressure: three or four Newton steps reach round-off, where
  substitution needs one step per factor ``|s|/2`` of error.  A larger ``s`` (a trial
  temperature far below a component's range makes ``B`` diverge) can give several
  roots; those points keep the substitution.
* Any other vapour model: successive substitution ``y ← p1 c1(y) / Σ p_i c_i(y)``,
  accelerated by a secant step on ``F(y) - y`` once two iterates exist (a strongly
  composition-dependent vapour, such as a dimerising acid, contracts slowly: about 30
  plain substitutions, 5-6 with the secant).

In both, ``ln c_i`` is capped at ±50 (a trial temperature far outside the virial's
range makes ``B``, and with it the correction, diverge); the Newton path leaves the
rare points where the cap could bite, or ``s ≥ 1.5``, to the substitution.  A point whose partial
pressures are not finite and positive in sum has no vapour (NaN, not converged).
"""

from __future__ import annotations

import numpy as np
from numpy.typing import NDArray

from builder.thermo.vapour import VapourModel, VirialVapour, correction_at

__all__ = ["bubble_vapour"]

FloatArray = NDArray[np.float64]
BoolArray = NDArray[np.bool_]

#: Limits of the iterations and the tolerance on y1 (as the bubble-point solvers').
SUBSTITUTIONS = 200
NEWTON_STEPS = 30
Y_TOLERANCE = 1e-12
#: Cap on |ln c_i| (see the module text).
LN_C_CAP = 50.0
#: Newton only below this s (then h' ≥ 1 - s/2 > 0: one root, the one substitution finds).
S_NEWTON = 1.5


def bubble_vapour(vapour: VapourModel, p1: FloatArray, p2: FloatArray, T_K: FloatArray,
                  P_Pa: FloatArray, psat1_Pa: FloatArray, psat2_Pa: FloatArray, *,
                  terms: tuple[FloatArray, FloatArray, FloatArray] | None = None
                  ) -> tuple[FloatArray, FloatArray, FloatArray, BoolArray]:
    """Corrected partial pressures ``p_i c_i``, the vapour ``y1`` and convergence per point.

    ``p1``, ``p2`` [Pa] are ``x_i γ_i P_i^sat`` at ``T_K`` [K] and ``P_Pa`` [Pa]
    (1-D arrays of one length, as are the saturation pressures).  ``terms``: the virial
    vapour's :meth:`~builder.thermo.vapour.VirialVapour.correction_terms` at these
    points when the caller has them already.

    Propane over n-butane at 330 K and 1 MPa with equal uncorrected partial pressures
    (0.5 MPa each; saturation pressures 1.7 and 0.6 MPa); successive substitution
    (:func:`_substitution`, the former method) gives the same vapour:

    >>> from builder.thermo.vapour import VirialComponent
    >>> c3 = VirialComponent(369.83, 4.248e6, 2.0e-4, 0.152, 0.0, 0.0, 8.98e-5)
    >>> c4 = VirialComponent(425.12, 3.796e6, 2.55e-4, 0.200, 0.0, 0.0, 1.0e-4)
    >>> v, one = VirialVapour(c3, c4), np.ones(1)
    >>> args = (5e5 * one, 5e5 * one, 330 * one, 1e6 * one, 1.7e6 * one, 0.6e6 * one)
    >>> y, ok = bubble_vapour(v, *args)[2:]
    >>> round(float(y[0]), 12), bool(ok[0]), round(float(_substitution(v, *args)[2][0]), 12)
    (0.449417177976, True, 0.449417177976)
    """
    if not isinstance(vapour, VirialVapour):
        return _substitution(vapour, p1, p2, T_K, P_Pa, psat1_Pa, psat2_Pa)
    a1, a2, s = (vapour.correction_terms(T_K, P_Pa, psat1_Pa, psat2_Pa) if terms is None
                 else terms)
    a1, a2, s = (v if np.shape(v) == p1.shape else np.broadcast_to(v, p1.shape)
                 for v in (a1, a2, s))
    with np.errstate(all="ignore"):
        L = np.log(p1) - np.log(p2) + (a1 - a2)
        # The substitution's own path where the cap could bite, or where h' may vanish.
        capped = (np.maximum(np.abs(a1), np.abs(a2)) + np.abs(s) > LN_C_CAP) | ~(
            s < S_NEWTON)
        if not capped.any() and np.isfinite(L).all():
            # The usual case: every point has two positive, finite partial pressures (then
            # L is finite) and no cap: Newton on every point, no masks.
            return _newton_everywhere(p1, p2, a1, a2, s, L)
        total = p1 + p2
        has_vapour = np.isfinite(total) & (total > 0)
        inner = np.flatnonzero(has_vapour & (p1 > 0) & (p2 > 0) & ~capped)
        # A pure end (p1 or p2 zero) has the pure vapour; the other points take Newton.
        y = p1 / total
        q1 = p1 * np.exp(a1 - s * (1.0 - y) ** 2)
        q2 = p2 * np.exp(a2 - s * y * y)
        y = q1 / (q1 + q2)
        ok = has_vapour.copy()
        if inner.size:
            solved = _newton_everywhere(p1[inner], p2[inner], a1[inner], a2[inner], s[inner],
                                        L[inner])
            for out, part in zip((q1, q2, y, ok), solved, strict=True):
                out[inner] = part
    nan = ~has_vapour
    if nan.any():
        q1, q2, y = (np.where(nan, np.nan, v) for v in (q1, q2, y))
    rest = np.flatnonzero(capped & has_vapour)
    if rest.size:
        sub = _substitution(vapour, p1[rest], p2[rest], T_K[rest], P_Pa[rest],
                            psat1_Pa[rest], psat2_Pa[rest])
        for out, part in zip((q1, q2, y, ok), sub, strict=True):
            out[rest] = part
    return q1, q2, y, ok


def _newton_everywhere(p1: FloatArray, p2: FloatArray, a1: FloatArray, a2: FloatArray,
                       s: FloatArray, L: FloatArray
                       ) -> tuple[FloatArray, FloatArray, FloatArray, BoolArray]:
    """:func:`bubble_vapour`'s Newton solve of the points that take it, all of them given
    (no masks: a bubble-point solver calls this a few times per trial temperature, and on
    small arrays masks cost as much as the steps)."""
    u = L
    step = np.zeros_like(u)
    for _ in range(NEWTON_STEPS):
        y = 1.0 / (1.0 + np.exp(-u))
        yy = y * (1.0 - y)
        step = (u - L - s * (2.0 * y - 1.0)) / (1.0 - 2.0 * s * yy)
        u = u - step
        if not (np.abs(step) * yy > 0.25 * Y_TOLERANCE).any():
            break
    y = 1.0 / (1.0 + np.exp(-u))
    ok = np.abs(step) * y * (1.0 - y) <= Y_TOLERANCE
    q1 = p1 * np.exp(a1 - s * (1.0 - y) ** 2)
    q2 = p2 * np.exp(a2 - s * y * y)
    return q1, q2, q1 / (q1 + q2), ok


def _substitution(vapour: VapourModel, p1: FloatArray, p2: FloatArray, T_K: FloatArray,
                  P_Pa: FloatArray, psat1_Pa: FloatArray, psat2_Pa: FloatArray
                  ) -> tuple[FloatArray, FloatArray, FloatArray, BoolArray]:
    """:func:`bubble_vapour` by successive substitution with secant steps (any vapour
    model)."""
    with np.errstate(invalid="ignore", divide="ignore"):
        y = p1 / (p1 + p2)
    q1, q2 = p1, p2
    ok = np.zeros_like(y, dtype=bool)
    correction = correction_at(vapour, T_K, P_Pa, psat1_Pa, psat2_Pa)
    y_prev: FloatArray | None = None
    g_prev: FloatArray | None = None
    for _ in range(SUBSTITUTIONS):
        c1, c2 = correction(y)
        c1 = np.minimum(np.maximum(c1, -LN_C_CAP), LN_C_CAP)
        c2 = np.minimum(np.maximum(c2, -LN_C_CAP), LN_C_CAP)
        q1, q2 = p1 * np.exp(c1), p2 * np.exp(c2)
        with np.errstate(invalid="ignore", divide="ignore"):
            y_new = q1 / (q1 + q2)
        g = y_new - y
        ok = np.abs(g) <= Y_TOLERANCE
        if (ok | ~np.isfinite(y_new)).all():  # a NaN vapour stays NaN
            y = y_new
            break
        step = y_new
        if y_prev is not None and g_prev is not None:
            with np.errstate(divide="ignore", invalid="ignore"):
                secant = y - g * (y - y_prev) / (g - g_prev)
            # The secant where it is defined and stays in (0, 1); plain substitution else.
            usable = np.isfinite(secant) & (secant > 0.0) & (secant < 1.0) & ~ok
            step = np.where(usable, secant, y_new)
        y_prev, g_prev = y, g
        y = np.where(ok, y_new, step)
    return np.asarray(q1), np.asarray(q2), np.asarray(y), np.asarray(ok)
