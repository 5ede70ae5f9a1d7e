"""Vapour-liquid equilibrium of a binary: γ–φ with a vapour model, or φ–φ by a cubic.

γ–φ: ``y_i φ_i P = x_i γ_i(x, T) P_i^sat(T) φ_i^sat exp(V_i^L (P - P_i^sat)/RT)``,
i = 1, 2.  The vapour model of the system (:mod:`builder.thermo.vapour`)
supplies the fugacity coefficients; with the ideal-gas model it is the
modified Raoult's law ``y_i P = x_i γ_i P_i^sat`` and the solvers below take
exactly the explicit path they always took.  The vapour correction enters
through :func:`k_values` (``K_i = γ_i P_i^sat c_i / P``); with a real vapour
the vapour composition of a bubble point is found by successive substitution
(the correction depends on y only weakly), vectorised over the points.

φ–φ: a system whose ``vapour`` is a cubic equation of state
(:class:`builder.thermo.cubic.CubicMixture`) is solved by
:mod:`builder.thermo.cubic_equilibrium` (both phases from the equation of
state); these functions hand such systems over and wrap the result.

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

from collections.abc import Callable
from dataclasses import dataclass, fields
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from builder.thermo.activity import ActivityModel, Swapped
from builder.thermo.bubble_vapour import bubble_vapour
from builder.thermo.solvers import (
    RootResult,
    expand_bracket_values,
    solve_bracketed,
    solve_newton,
)
from builder.thermo.units import GAS_CONSTANT_J_PER_MOL_K
from builder.thermo.vapour import (
    IDEAL_GAS,
    IdealGas,
    VapourModel,
    VirialVapour,
    ln_correction,
)
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
LnC = tuple[FloatArray, FloatArray]

#: Successive-substitution limits of the real-vapour loops (tolerances in y and ln P).
_SUBSTITUTIONS = 200
_SUBSTITUTION_TOL = 1e-12
#: Bubble temperatures: plain Newton steps (in 1000 K/T) tried before a bracketed solve, and
#: their limit per step (0.3 is about 40 K at 360 K).
_NEWTON_STEPS = 8
_NEWTON_MAX_STEP = 0.3


@dataclass(frozen=True)
class BinarySystem:
    """Two components' vapour pressures, the liquid's activity model and the vapour model.

    ``vapour`` defaults to the ideal gas (modified Raoult's law).  A cubic
    equation of state there (:class:`builder.thermo.cubic.CubicMixture`) makes
    the system φ–φ: both phases from the equation of state, ``activity``
    unused and the vapour pressures only a starting guess.
    """

    psat1: VapourPressure
    psat2: VapourPressure
    activity: ActivityModel
    vapour: VapourModel = IDEAL_GAS

    @property
    def ideal_vapour(self) -> bool:
        return isinstance(self.vapour, IdealGas)

    @property
    def phi_phi(self) -> bool:
        """Both phases by an equation of state (no activity model)."""
        return bool(getattr(self.vapour, "phi_phi", False))

    def swapped(self) -> BinarySystem:
        """The same mixture with components 1 and 2 exchanged."""
        activity = self.activity
        inner = activity.inner if isinstance(activity, Swapped) else Swapped(activity)
        return BinarySystem(self.psat2, self.psat1, inner, self.vapour.swapped())


@dataclass(frozen=True)
class EquilibriumResult:
    """Coexisting liquid ``x1`` and vapour ``y1`` at ``T_K`` and ``P_Pa``, per point.

    ``ln_phi1``, ``ln_phi2`` are the vapour fugacity coefficients (zero for an
    ideal gas); for a φ–φ system ``ln_gamma*`` hold ``ln(φ_i^L / φ_i^pure)``
    is not defined and are zero.
    """

    T_K: FloatArray
    P_Pa: FloatArray
    x1: FloatArray
    y1: FloatArray
    ln_gamma1: FloatArray
    ln_gamma2: FloatArray
    converged: BoolArray
    ln_phi1: FloatArray | None = None
    ln_phi2: FloatArray | None = None

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

    @property
    def phi1(self) -> FloatArray:
        """Vapour fugacity coefficient of component 1 (1 for an ideal gas)."""
        return np.exp(self.ln_phi1) if self.ln_phi1 is not None else np.ones_like(self.T_K)

    @property
    def phi2(self) -> FloatArray:
        return np.exp(self.ln_phi2) if self.ln_phi2 is not None else np.ones_like(self.T_K)

    def k_values(self, system: BinarySystem) -> tuple[FloatArray, FloatArray]:
        """``K_i = y_i/x_i`` evaluated from the model (finite at ``x_i = 0``), with the
        ``ln γ`` this result holds (for a γ–φ system: the same numbers, not evaluated again)."""
        return k_values(system, self.x1, self.T_K, self.P_Pa, self.y1,
                        ln_gamma=(self.ln_gamma1, self.ln_gamma2))

    def relative_volatility(self, system: BinarySystem) -> FloatArray:
        """``α12 = K1/K2`` (``γ1 P1sat / (γ2 P2sat)`` for an ideal gas)."""
        K1, K2 = self.k_values(system)
        with np.errstate(divide="ignore"):  # K2 = 0: a vapour pure to round-off (α infinite)
            return K1 / K2


def k_values(
    system: BinarySystem, x1: ArrayLike, T_K: ArrayLike, P_Pa: ArrayLike,
    y1: ArrayLike | None = None, *,
    ln_gamma: tuple[FloatArray, FloatArray] | None = None,
) -> tuple[FloatArray, FloatArray]:
    """Equilibrium ratios ``K_i = γ_i P_i^sat c_i / P`` (``c_i = 1`` for an ideal gas).

    ``ln_gamma``: the activity coefficients at (x1, T) when already evaluated (γ–φ only).

    ``c_i`` is the vapour correction of :func:`builder.thermo.vapour.ln_correction`
    at the vapour ``y1``; without ``y1`` the bubble-point vapour of ``x1`` at
    (T, P) is used.  For a φ–φ system ``K_i = φ_i^L(x) / φ_i^V(y)``.

    >>> from builder.thermo.activity import Ideal
    >>> from builder.thermo.vapour_pressure import Antoine
    >>> flat = Antoine(A=11.0, B=0.0, C=0.0, T_min_K=1.0, T_max_K=1e3)  # P = e**11 Pa
    >>> system = BinarySystem(flat, flat, Ideal())
    >>> [round(float(k), 6) for k in k_values(system, 0.5, 300.0, 2 * np.exp(11.0))]
    [0.5, 0.5]
    """
    T = np.asarray(T_K, dtype=float)
    P = np.asarray(P_Pa, dtype=float)
    if system.phi_phi:
        from builder.thermo import cubic_equilibrium

        return cubic_equilibrium.k_values(system.vapour, x1, T, P, y1)  # type: ignore[arg-type]
    ln_g1, ln_g2 = system.activity.ln_gamma(x1, T) if ln_gamma is None else ln_gamma
    ps1, ps2 = system.psat1.pressure_Pa(T), system.psat2.pressure_Pa(T)
    K1, K2 = np.exp(ln_g1) * ps1 / P, np.exp(ln_g2) * ps2 / P
    if system.ideal_vapour:
        return K1, K2
    if y1 is None:  # the bubble vapour, from the γ and P_sat above
        x, Tb, shape = _as_points(x1, T)
        Pb = np.broadcast_to(P, shape).ravel().astype(float)
        ps1b, ps2b = (np.broadcast_to(ps, shape).ravel() for ps in (ps1, ps2))
        p1 = x * np.broadcast_to(np.exp(ln_g1), shape).ravel() * ps1b
        p2 = (1.0 - x) * np.broadcast_to(np.exp(ln_g2), shape).ravel() * ps2b
        if isinstance(system.vapour, VirialVapour):
            # ln c_i from the terms the bubble vapour was solved with (one evaluation of
            # B11, B22 and B12): ln c1 = a1 - s y2², ln c2 = a2 - s y1².
            terms = system.vapour.correction_terms(Tb, Pb, ps1b, ps2b)
            y = bubble_vapour(system.vapour, p1, p2, Tb, Pb, ps1b, ps2b, terms=terms)[2]
            a1, a2, s = terms
            return (K1 * np.reshape(np.exp(a1 - s * (1.0 - y) ** 2), shape),
                    K2 * np.reshape(np.exp(a2 - s * y * y), shape))
        y1 = np.reshape(bubble_vapour(system.vapour, p1, p2, Tb, Pb, ps1b, ps2b)[2], shape)
    c1, c2 = ln_correction(system.vapour, y1, T, P, ps1, ps2)
    return K1 * np.exp(c1), K2 * np.exp(c2)


def _as_points(a: ArrayLike, b: ArrayLike) -> tuple[FloatArray, FloatArray, tuple[int, ...]]:
    """Broadcast a composition and a condition to flat arrays of equal length."""
    if (isinstance(a, np.ndarray) and a.ndim == 1 and a.dtype == np.float64
            and isinstance(b, float)):
        # The common call (a curve's compositions at one condition), without the general
        # broadcast's fixed cost: the same arrays.
        return a.copy(), np.full(a.shape, b), a.shape
    a_arr, b_arr = np.broadcast_arrays(np.asarray(a, dtype=float), np.asarray(b, dtype=float))
    shape = a_arr.shape
    return a_arr.ravel().astype(float), b_arr.ravel().astype(float), shape


def _check_fractions(name: str, values: FloatArray) -> None:
    if not ((values >= 0.0).all() and (values <= 1.0).all()):  # NaN fails both
        bad = values[~((values >= 0.0) & (values <= 1.0))]
        raise ValueError(f"{name} must lie in [0, 1]; found {bad[:3].tolist()}")


def _partial_pressures(
    system: BinarySystem, x1: FloatArray, T: FloatArray, ln_c: LnC | None = None
) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray]:
    """``x_i γ_i P_i^sat c_i``: the partial pressures of a bubble point (``c_i = 1`` if none)."""
    ln_g1, ln_g2 = system.activity.ln_gamma(x1, T)
    p1 = x1 * np.exp(ln_g1) * system.psat1.pressure_Pa(T)
    p2 = (1.0 - x1) * np.exp(ln_g2) * system.psat2.pressure_Pa(T)
    if ln_c is not None:
        p1 = p1 * np.exp(ln_c[0])
        p2 = p2 * np.exp(ln_c[1])
    return p1, p2, ln_g1, ln_g2


def _correction(system: BinarySystem, y1: FloatArray, T: FloatArray, P: FloatArray) -> LnC:
    """``ln c_i``, capped where a bracket probe lands far outside the virial's range (a very
    low trial temperature makes B, and with it the correction, diverge)."""
    c1, c2 = ln_correction(system.vapour, y1, T, P, system.psat1.pressure_Pa(T),
                           system.psat2.pressure_Pa(T))
    return np.clip(c1, -50.0, 50.0), np.clip(c2, -50.0, 50.0)


def _correction_at_T(system: BinarySystem, T: FloatArray
                     ) -> Callable[[FloatArray, FloatArray], LnC]:
    """:func:`_correction` at fixed ``T`` as a function of (y1, P): for the virial vapour the
    second virial coefficients and saturation pressures, which depend on T alone, once."""
    vapour = system.vapour
    if not isinstance(vapour, VirialVapour):
        return lambda y1, P: _correction(system, y1, T, P)
    B11, B22, B12 = vapour.coefficients(T)
    ps1, ps2 = system.psat1.pressure_Pa(T), system.psat2.pressure_Pa(T)
    RT = GAS_CONSTANT_J_PER_MOL_K * T
    V1 = vapour.component1.liquid_volume_m3_per_mol
    V2 = vapour.component2.liquid_volume_m3_per_mol
    delta = 2.0 * B12 - B11 - B22

    def correction(y1: FloatArray, P: FloatArray) -> LnC:
        scale = P / RT
        # ln φ_i^sat + Poynting - ln φ_i, as ln_correction with virial.virial_ln_phi
        c1 = (B11 * ps1 + V1 * (P - ps1)) / RT - scale * (B11 + (1.0 - y1) ** 2 * delta)
        c2 = (B22 * ps2 + V2 * (P - ps2)) / RT - scale * (B22 + y1**2 * delta)
        return (np.minimum(np.maximum(c1, -50.0), 50.0),
                np.minimum(np.maximum(c2, -50.0), 50.0))

    return correction


def _bubble_vapour(
    system: BinarySystem, x1: FloatArray, T: FloatArray, P: FloatArray
) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray, FloatArray, BoolArray]:
    """Partial pressures, ``ln γ``, the bubble vapour ``y1`` and its convergence at (T, P).

    For a real vapour ``y`` is the fixed point of ``y = F(y)``, ``F1 = p1 c1(y) /
    (p1 c1(y) + p2 c2(y))`` with ``p_i = x_i γ_i P_i^sat``, solved by
    :func:`builder.thermo.bubble_vapour.bubble_vapour` (Newton for the virial
    vapour, secant-accelerated substitution for others); for an ideal gas ``y`` is
    explicit.
    """
    if system.ideal_vapour:
        p1, p2, ln_g1, ln_g2 = _partial_pressures(system, x1, T)
        return p1, p2, ln_g1, ln_g2, p1 / (p1 + p2), np.ones(p1.shape, dtype=bool)
    ln_g1, ln_g2 = system.activity.ln_gamma(x1, T)
    ps1, ps2 = system.psat1.pressure_Pa(T), system.psat2.pressure_Pa(T)
    p1, p2 = x1 * np.exp(ln_g1) * ps1, (1.0 - x1) * np.exp(ln_g2) * ps2
    q1, q2, y, ok = bubble_vapour(system.vapour, p1, p2, T, P, ps1, ps2)
    return q1, q2, ln_g1, ln_g2, y, ok


def _phi(system: BinarySystem, y1: FloatArray, T: FloatArray, P: FloatArray
         ) -> tuple[FloatArray | None, FloatArray | None]:
    if system.ideal_vapour:
        return None, None
    return system.vapour.ln_phi(y1, T, P)


def _reshape(result: EquilibriumResult, shape: tuple[int, ...]) -> EquilibriumResult:
    if result.x1.shape == shape:  # 1-D points already (the usual call)
        return result
    values = {f.name: getattr(result, f.name) for f in fields(result)}
    reshaped = {k: None if v is None else np.reshape(v, shape) for k, v in values.items()}
    return EquilibriumResult(**reshaped)  # type: ignore[arg-type]


def bubble_pressure(system: BinarySystem, x1: ArrayLike, T_K: ArrayLike) -> EquilibriumResult:
    """Bubble pressure and vapour composition of liquid ``x1`` at ``T_K``.

    Explicit for an ideal vapour: ``P = Σ x_i γ_i P_i^sat``, ``y_i = x_i γ_i P_i^sat / P``;
    with a real vapour the same sums with ``c_i(y, T, P)``, iterated on P and y.
    """
    x, T, shape = _as_points(x1, T_K)
    _check_fractions("x1", x)
    if system.phi_phi:
        return _reshape(_phi_phi("bubble_pressure", system, x, T), shape)
    p1, p2, ln_g1, ln_g2 = _partial_pressures(system, x, T)
    P = p1 + p2
    y = p1 / P
    done = np.ones_like(P, dtype=bool)
    if not system.ideal_vapour:
        base1, base2 = p1, p2
        correction = _correction_at_T(system, T)
        for _ in range(_SUBSTITUTIONS):
            c1, c2 = correction(y, P)
            p1, p2 = base1 * np.exp(c1), base2 * np.exp(c2)
            P_new = p1 + p2
            y_new = p1 / P_new
            done = (np.abs(np.log(P_new / P)) <= _SUBSTITUTION_TOL) & (
                np.abs(y_new - y) <= _SUBSTITUTION_TOL)
            P, y = P_new, y_new
            if done.all():
                break
    converged = done & np.isfinite(P) & np.isfinite(y) & (P > 0)
    phi1, phi2 = _phi(system, y, T, P)
    return _reshape(EquilibriumResult(T, P, x, y, ln_g1, ln_g2, converged, phi1, phi2), shape)


#: Liquid compositions scanned for every liquid in equilibrium with a given vapour: the
#: pure ends, a log-spaced approach to both (a nearly immiscible liquid's one-liquid
#: stretch can be narrower than 1e-4) and an even grid.
_DEW_SCAN = np.unique(np.concatenate([[0.0, 1.0], np.logspace(-9, -1, 17),
                                      1.0 - np.logspace(-9, -1, 17),
                                      np.linspace(0.0, 1.0, 41)]))


def _liquid_for_vapour(system: BinarySystem, y: FloatArray, T: FloatArray,
                       ln_c: LnC | None = None) -> tuple[FloatArray, BoolArray]:
    """Liquid ``x1`` in equilibrium with the vapour ``y`` at ``T``: the first liquid to
    condense from it.

    ``ln_c`` is the vapour correction, fixed because ``y`` (and P) are.  For a stable
    liquid at fixed T the bubble vapour ``y1`` rises monotonically with ``x1``, so there
    is one liquid; where the liquid can split (a water-rich and an organic-rich liquid),
    several liquids have bubble vapour ``y``, and the vapour condenses first, as it is
    compressed, to the one of the lowest bubble pressure (at a given pressure: of the
    highest temperature).  Every liquid is found: the residual ``y1(x1) - y`` is scanned
    on :data:`_DEW_SCAN` for each point, each sign change is solved by bracketed Newton
    (all brackets of all points at once), and each point keeps the root of the lowest
    bubble pressure.  Liquids closer together than the scan's spacing (a few 1e-10 near
    the pure ends) are not told apart.
    """
    n, m = y.size, _DEW_SCAN.size
    point = np.repeat(np.arange(n), m)
    grid = np.tile(_DEW_SCAN, n)

    def bubble(x: FloatArray, at: NDArray[np.intp]) -> tuple[FloatArray, FloatArray]:
        c = None if ln_c is None else (ln_c[0][at], ln_c[1][at])
        p1, p2, _, _ = _partial_pressures(system, x, T[at], c)
        return p1 / (p1 + p2) - y[at], p1 + p2

    with np.errstate(invalid="ignore", divide="ignore", over="ignore"):
        scan = bubble(grid, point)[0].reshape(n, m)
    sign = np.sign(scan)
    # A root inside an interval of the scan, or on one of its points (y at a pure end).
    inside = np.argwhere(sign[:, :-1] * sign[:, 1:] < 0)
    on = np.argwhere(sign == 0)
    owner = np.concatenate([inside[:, 0], on[:, 0]])
    lo = np.concatenate([_DEW_SCAN[inside[:, 1]], _DEW_SCAN[on[:, 1]]])
    hi = np.concatenate([_DEW_SCAN[inside[:, 1] + 1], _DEW_SCAN[on[:, 1]]])
    x = np.full(n, np.nan)
    converged = np.zeros(n, dtype=bool)
    if owner.size == 0:
        return x, converged

    roots = lo.copy()
    ok = lo == hi  # exact zeros on the scan
    search = np.flatnonzero(~ok)
    if search.size:
        searched_owner = owner[search]

        def residual(u: FloatArray, mask: BoolArray) -> FloatArray:
            return bubble(u, searched_owner[mask])[0]

        solved = solve_bracketed(residual, lo[search], hi[search],
                                 0.5 * (lo[search] + hi[search]), xtol=1e-14, ftol=1e-14)
        roots[search], ok[search] = solved.root, solved.converged
    with np.errstate(invalid="ignore", divide="ignore", over="ignore"):
        pressure = np.where(ok, bubble(roots, owner)[1], np.inf)
    # Per point, the converged root of the lowest bubble pressure.
    order = np.lexsort((pressure, owner))
    first = order[np.r_[True, owner[order][1:] != owner[order][:-1]]]
    x[owner[first]] = roots[first]
    converged[owner[first]] = ok[first]
    return x, converged


def dew_pressure(system: BinarySystem, y1: ArrayLike, T_K: ArrayLike) -> EquilibriumResult:
    """Dew pressure and liquid composition of vapour ``y1`` at ``T_K``.

    The liquid is the first to condense (:func:`_liquid_for_vapour`: on a pair whose
    liquid splits, a water-rich vapour condenses to the water-rich liquid even where an
    organic-rich liquid also has that vapour).  With a real vapour the correction
    ``c_i(y, T, P)`` is known once P is, so the ideal-gas solve is repeated with it
    until P settles.
    """
    y, T, shape = _as_points(y1, T_K)
    _check_fractions("y1", y)
    if system.phi_phi:
        return _reshape(_phi_phi("dew_pressure", system, y, T), shape)
    x, ok = _liquid_for_vapour(system, y, T)
    p1, p2, ln_g1, ln_g2 = _partial_pressures(system, x, T)
    P = p1 + p2
    if not system.ideal_vapour:
        settled = np.zeros_like(ok)
        for _ in range(_SUBSTITUTIONS):
            ln_c = _correction(system, y, T, P)
            x, ok = _liquid_for_vapour(system, y, T, ln_c)
            p1, p2, ln_g1, ln_g2 = _partial_pressures(system, x, T, ln_c)
            P_new = p1 + p2
            settled = np.abs(np.log(P_new / P)) <= 1e-12
            P = P_new
            if settled.all():
                break
        ok = ok & settled
    ok = ok & np.isfinite(P)
    phi1, phi2 = _phi(system, y, T, P)
    return _reshape(EquilibriumResult(T, P, x, y, ln_g1, ln_g2, ok, phi1, phi2), shape)


def _temperature_solve(system: BinarySystem, P: FloatArray, z1: FloatArray,
                       residual: Callable[[FloatArray, NDArray[Any]], FloatArray],
                       newton_first: bool = False, T_guess: FloatArray | None = None
                       ) -> RootResult:
    """Solve ``residual(T) = 0`` for a temperature at ``P``, every point at once.

    The bracket starts at the pure components' saturation temperatures and is
    widened until ``residual`` changes sign (an azeotrope may boil outside
    that span); the first guess interpolates the two by the composition ``z1``.
    With ``newton_first`` plain Newton steps from that guess (or from ``T_guess``
    where given and finite) come first (:func:`solve_newton`: no evaluations spent on
    the bracket), and only the points they do not settle are bracketed and solved as
    above.
    """
    T1 = np.asarray(system.psat1.temperature_K(P), dtype=float)
    T2 = np.asarray(system.psat2.temperature_K(P), dtype=float)
    first: RootResult | None = None
    points = np.arange(P.size)
    if newton_first:
        # In u = 1000 K / T, in which ln P_sat is nearly linear (Clausius-Clapeyron).
        def in_u(u: FloatArray, index: NDArray[np.intp]) -> FloatArray:
            return residual(1000.0 / u, index)

        start = z1 * T1 + (1.0 - z1) * T2
        if T_guess is not None:
            start = np.where(np.isfinite(T_guess), T_guess, start)
        first = solve_newton(in_u, 1000.0 / start, maxiter=_NEWTON_STEPS,
                             max_step=_NEWTON_MAX_STEP)
        first = RootResult(root=1000.0 / first.root, converged=first.converged,
                           residual=first.residual, iterations=first.iterations)
        points = np.flatnonzero(~first.converged)
        if points.size == 0:
            return first
        T1, T2, z1 = T1[points], T2[points], z1[points]
        full = residual

        def residual(T: FloatArray, mask: BoolArray) -> FloatArray:
            inside = np.zeros(P.size, dtype=bool)
            inside[points[mask]] = True
            return full(T, inside)

    lo, hi, f_lo, f_hi = expand_bracket_values(
        residual, np.fmin(T1, T2) * 0.995, np.fmax(T1, T2) * 1.005, factor=1.02)
    guess = np.clip(z1 * T1 + (1.0 - z1) * T2, lo, hi)
    solved = solve_bracketed(residual, lo, hi, guess, f_lo=f_lo, f_hi=f_hi)
    if first is None:
        return solved
    root, converged, values = first.root.copy(), first.converged.copy(), first.residual.copy()
    root[points], converged[points], values[points] = (solved.root, solved.converged,
                                                       solved.residual)
    return RootResult(root=root, converged=converged, residual=values,
                      iterations=first.iterations + solved.iterations)


def bubble_temperature(system: BinarySystem, x1: ArrayLike, P_Pa: ArrayLike, *,
                       newton_first: bool = True, T_guess_K: ArrayLike | None = None
                       ) -> EquilibriumResult:
    """Bubble temperature and vapour composition of liquid ``x1`` at ``P_Pa``.

    Solves ``ln(Σ x_i γ_i(T) P_i^sat(T) c_i) = ln P`` for T, all points at once:
    Newton steps in ``1000 K/T`` from a guess interpolated between the pure
    components' boiling points (or from ``T_guess_K``, e.g. read off a curve already
    solved: one Newton step fewer); any point they leave unsettled is bracketed
    between those boiling points, widened until it brackets (an azeotrope may
    boil outside that span), and solved by bracketed Newton.  ``newton_first=False``
    brackets every point from the start (the starting values of the φ–φ solver
    are made so: its search near a critical point is sensitive to them at round-off).
    """
    x, P, shape = _as_points(x1, P_Pa)
    _check_fractions("x1", x)
    if system.phi_phi:
        return _reshape(_phi_phi("bubble_temperature", system, x, P), shape)
    ln_P = np.log(P)

    def residual(T: FloatArray, mask: NDArray[Any]) -> FloatArray:  # a mask or indices
        p1, p2, _, _, _, _ = _bubble_vapour(system, x[mask], T, P[mask])
        return np.log(p1 + p2) - ln_P[mask]

    guess = None if T_guess_K is None else np.broadcast_to(
        np.asarray(T_guess_K, dtype=float), shape).ravel()
    solved = _temperature_solve(system, P, x, residual, newton_first=newton_first,
                                T_guess=guess)
    T = solved.root
    _, _, ln_g1, ln_g2, y, inner_ok = _bubble_vapour(system, x, T, P)
    ok = solved.converged & np.isfinite(y) & inner_ok
    phi1, phi2 = _phi(system, y, T, P)
    return _reshape(EquilibriumResult(T, P, x, y, ln_g1, ln_g2, ok, phi1, phi2), shape)


def dew_temperature(system: BinarySystem, y1: ArrayLike, P_Pa: ArrayLike) -> EquilibriumResult:
    """Dew temperature and liquid composition of vapour ``y1`` at ``P_Pa``.

    An outer bracketed solve in T of ``ln P_dew(T, y1) = ln P``, where the
    inner step finds the liquid in equilibrium with ``y1`` at each trial T
    (:func:`dew_pressure`'s solve in ``x1``, with the vapour correction at the
    known y, T and P; where several liquids are, the first to condense).
    """
    y, P, shape = _as_points(y1, P_Pa)
    _check_fractions("y1", y)
    if system.phi_phi:
        return _reshape(_phi_phi("dew_temperature", system, y, P), shape)
    ln_P = np.log(P)

    def correction(T: FloatArray, mask: BoolArray) -> LnC | None:
        return None if system.ideal_vapour else _correction(system, y[mask], T, P[mask])

    def residual(T: FloatArray, mask: BoolArray) -> FloatArray:
        ln_c = correction(T, mask)
        x, _ = _liquid_for_vapour(system, y[mask], T, ln_c)
        p1, p2, _, _ = _partial_pressures(system, x, T, ln_c)
        return np.log(p1 + p2) - ln_P[mask]

    solved = _temperature_solve(system, P, y, residual)
    T = solved.root
    everything = np.ones_like(y, dtype=bool)
    x, inner_ok = _liquid_for_vapour(system, y, T, correction(T, everything))
    _, _, ln_g1, ln_g2 = _partial_pressures(system, x, T)
    ok = solved.converged & inner_ok
    phi1, phi2 = _phi(system, y, T, P)
    return _reshape(EquilibriumResult(T, P, x, y, ln_g1, ln_g2, ok, phi1, phi2), shape)


def _phi_phi(kind: str, system: BinarySystem, z: FloatArray, condition: FloatArray
             ) -> EquilibriumResult:
    """Hand a φ–φ system to the cubic solvers (imported here: they are optional weight)."""
    from builder.thermo import cubic_equilibrium

    solved = getattr(cubic_equilibrium, kind)(system, z, condition)
    zero = np.zeros_like(solved.T_K)
    return EquilibriumResult(solved.T_K, solved.P_Pa, solved.x1, solved.y1, zero, zero.copy(),
                             solved.converged, solved.ln_phi1, solved.ln_phi2)
