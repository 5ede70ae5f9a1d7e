"""Bubble and dew points and mixture critical points of a binary by a cubic equation of state.

φ–φ: ``x_i φ_i^L(x, T, P) = y_i φ_i^V(y, T, P)``, i = 1, 2, both fugacity
coefficients from :class:`builder.thermo.cubic.CubicMixture`.  Written as
``r_i = x_i K_i - y_i = 0`` with ``K_i = φ_i^L/φ_i^V`` (finite at the pure
ends), each bubble or dew point is two equations in two unknowns (T or ln P,
and the unknown phase's composition), solved by a damped Newton method for
all points at once.  The first guess comes from Raoult's law with the
catalogue's vapour pressures; points that fail from it are retried from their
nearest converged neighbour (continuation along the composition).

The trivial solution (x = y, K = 1) satisfies the equations everywhere and is
rejected: a point converging to it is reported unconverged.  Beyond a mixture
critical point no other solution exists, so such points are never drawn.

Critical points: at fixed T the two-phase region of a binary ends where the
coexisting phases become identical, at the extreme pressure of the loop
(dP/dx = 0 where y = x, Gibbs–Konovalov); at fixed P at the extreme
temperature.  :func:`critical_point` follows the two-phase solution at fixed
(T, P) towards that extreme and brackets it by bisection until the two phases
differ by less than ``2e-4`` in mole fraction [1, ch. 7].

Speed: every Newton step evaluates the equation of state once for all its points, their
liquids and vapours and the shifted copies of the finite-difference Jacobian; a
critical-point march solves the trials it may need next in one vectorised solve
(:func:`_march`).  Neither changes a result: the rows of a solve are independent, and the
march settles its trials in the order it would try them one by one.

References
----------
[1] M. L. Michelsen, J. M. Mollerup, Thermodynamic Models: Fundamentals and
    Computational Aspects, 2nd ed., Tie-Line Publications, 2007.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from functools import lru_cache
from typing import TYPE_CHECKING

import numpy as np
from numpy.typing import ArrayLike, NDArray

from builder.thermo.activity import Ideal
from builder.thermo.cubic import CubicMixture, pr_ln_phi_phases

if TYPE_CHECKING:
    from builder.thermo.equilibrium import BinarySystem

__all__ = [
    "CriticalPoint",
    "CubicResult",
    "bubble_pressure",
    "bubble_temperature",
    "cricondenbar",
    "critical_point",
    "dew_pressure",
    "dew_temperature",
    "k_values",
    "solve_from",
]

FloatArray = NDArray[np.float64]
BoolArray = NDArray[np.bool_]
IntArray = NDArray[np.intp]
#: ``residual(u, v, points)``: the two residuals of each row, ``points`` the index of the
#: point (its condition and known composition) each row belongs to.
Residual = Callable[[FloatArray, FloatArray, IntArray], tuple[FloatArray, FloatArray]]

#: Coexisting phases closer than this in mole fraction are taken as the trivial solution.
TRIVIAL_GAP = 1e-6

#: How many grid steps the continuation walks from converged points into failed ones.
CONTINUATION_SWEEPS = 12


@dataclass(frozen=True)
class CubicResult:
    """Solved points of a φ–φ system (components in the system's order)."""

    T_K: FloatArray
    P_Pa: FloatArray
    x1: FloatArray
    y1: FloatArray
    converged: BoolArray
    ln_phi1: FloatArray
    ln_phi2: FloatArray


@dataclass(frozen=True)
class CriticalPoint:
    """A mixture critical point: composition, temperature and pressure."""

    x1: float
    T_K: float
    P_Pa: float
    #: The two-phase solutions met on the way: (T or P, liquid x1, vapour y1).
    path: tuple[tuple[float, float, float], ...] = ()


def _mixture(system: BinarySystem) -> CubicMixture:
    mixture = system.vapour
    if not isinstance(mixture, CubicMixture):
        raise TypeError("a φ–φ system needs a CubicMixture as its vapour model")
    return mixture


def _both_phases(mix: CubicMixture, x: FloatArray, y: FloatArray, T: FloatArray,
                 P: FloatArray) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray,
                                         FloatArray, FloatArray]:
    """``ln φ1, ln φ2, Z`` of the liquids ``x`` and of the vapours ``y`` at (T, P), in one
    evaluation of the equation of state (flat arrays of equal length)."""
    n = x.size
    T2, P2 = np.concatenate([T, T]), np.concatenate([P, P])
    vapour = np.zeros(2 * n, dtype=bool)
    vapour[n:] = True
    l1, l2, z = pr_ln_phi_phases(np.concatenate([x, y]), T2, P2, mix.Tc_K, mix.Pc_Pa,
                                 mix.omega, mix.kij, vapour)
    return l1[:n], l2[:n], z[:n], l1[n:], l2[n:], z[n:]


def _ln_k(mix: CubicMixture, x: FloatArray, y: FloatArray, T: FloatArray, P: FloatArray
          ) -> tuple[FloatArray, FloatArray]:
    x, y = np.asarray(x, dtype=float), np.asarray(y, dtype=float)
    T, P = np.asarray(T, dtype=float), np.asarray(P, dtype=float)
    if x.ndim != 1 or not (x.shape == y.shape == T.shape == P.shape):
        shape = np.broadcast_shapes(x.shape, y.shape, T.shape, P.shape)
        x, y, T, P = (np.broadcast_to(v, shape).ravel() for v in (x, y, T, P))
        k1, k2 = _ln_k(mix, x, y, T, P)
        return k1.reshape(shape), k2.reshape(shape)
    l1, l2, _, v1, v2, _ = _both_phases(mix, x, y, T, P)
    return l1 - v1, l2 - v2


def k_values(mix: CubicMixture, x1: ArrayLike, T_K: ArrayLike, P_Pa: ArrayLike,
             y1: ArrayLike | None = None) -> tuple[FloatArray, FloatArray]:
    """``K_i = φ_i^L(x) / φ_i^V(y)``; without ``y1`` the vapour is found by substitution."""
    x = np.asarray(x1, dtype=float)
    T = np.asarray(T_K, dtype=float)
    P = np.asarray(P_Pa, dtype=float)
    if y1 is None:
        y = x.copy()
        k1, k2 = _ln_k(mix, x, y, T, P)
        for _ in range(100):
            s1, s2 = x * np.exp(k1), (1.0 - x) * np.exp(k2)
            y = s1 / (s1 + s2)
            k1, k2 = _ln_k(mix, x, y, T, P)
    else:
        k1, k2 = _ln_k(mix, x, np.asarray(y1, dtype=float), T, P)
    return np.exp(k1), np.exp(k2)


class _NewtonRun:
    """A damped Newton solve for two unknowns per point (finite-difference Jacobian), run a
    step at a time, so that a caller can stop rows whose answer it no longer needs.

    Each step evaluates the active points and their two shifted copies (the Jacobian's
    columns) in one call of ``residual`` on three stacked copies.  Rows are independent:
    a row's path depends only on its own start, whatever else runs beside it.
    """

    def __init__(self, residual: Residual, u: FloatArray, v: FloatArray,
                 u_bounds: tuple[float, float], v_bounds: tuple[float, float],
                 max_du: float, maxiter: int = 50) -> None:
        self.residual, self.u_bounds, self.v_bounds = residual, u_bounds, v_bounds
        self.max_du, self.maxiter = max_du, maxiter
        self.u, self.v = u.astype(float).copy(), v.astype(float).copy()
        self.active = np.isfinite(self.u) & np.isfinite(self.v)
        self.converged = np.zeros(self.u.size, dtype=bool)
        self.iteration = 0

    @property
    def running(self) -> bool:
        return self.iteration < self.maxiter and bool(self.active.any())

    @property
    def finished(self) -> BoolArray:
        """Rows whose answer is final (converged, abandoned or out of iterations)."""
        if self.iteration >= self.maxiter:
            return np.ones(self.u.size, dtype=bool)
        return ~self.active

    def step(self) -> None:
        u, v, active = self.u, self.v, self.active
        iteration = self.iteration
        self.iteration += 1
        idx = np.flatnonzero(active)
        m = idx.size
        ua, va = u[idx], v[idx]
        hu = 1e-7 * np.maximum(np.abs(ua), 1.0)
        hv = np.where(va > 0.5, -1e-7, 1e-7)
        q1, q2 = self.residual(np.concatenate([ua, ua + hu, ua]),
                               np.concatenate([va, va, va + hv]),
                               np.concatenate([idx, idx, idx]))
        r1, s1, t1 = q1[:m], q1[m:2 * m], q1[2 * m:]
        r2, s2, t2 = q2[:m], q2[m:2 * m], q2[2 * m:]
        j11, j21 = (s1 - r1) / hu, (s2 - r2) / hu
        j12, j22 = (t1 - r1) / hv, (t2 - r2) / hv
        det = j11 * j22 - j12 * j21
        with np.errstate(divide="ignore", invalid="ignore"):
            du = -(r1 * j22 - r2 * j12) / det
            dv = -(j11 * r2 - j21 * r1) / det
        bad = ~(np.isfinite(du) & np.isfinite(dv) & np.isfinite(r1) & np.isfinite(r2))
        max_du, u_bounds, v_bounds = self.max_du, self.u_bounds, self.v_bounds
        du = np.minimum(np.maximum(np.where(bad, 0.0, du), -max_du), max_du)
        dv = np.minimum(np.maximum(np.where(bad, 0.0, dv), -0.2), 0.2)
        u_new = np.minimum(np.maximum(ua + du, u_bounds[0]), u_bounds[1])
        v_new = np.minimum(np.maximum(va + dv, v_bounds[0]), v_bounds[1])
        size = np.maximum(np.abs(r1), np.abs(r2))
        small = (size < 1e-11) & (
            np.abs(u_new - ua) <= 1e-9 * np.maximum(np.abs(ua), 1.0)) & (
            np.abs(v_new - va) <= 1e-9)
        # Give up on points that make no headway (far from any root, or at the trivial one).
        stuck = (iteration >= 12) & (size > 1e-6)
        u[idx], v[idx] = u_new, v_new
        self.converged[idx[small]] = True
        active[idx[small | bad | stuck]] = False


def _newton(residual: Residual, u: FloatArray, v: FloatArray,
            u_bounds: tuple[float, float], v_bounds: tuple[float, float],
            max_du: float, maxiter: int = 50) -> tuple[FloatArray, FloatArray, BoolArray]:
    """:class:`_NewtonRun` to the end: ``u``, ``v`` and which rows converged."""
    run = _NewtonRun(residual, u, v, u_bounds, v_bounds, max_du, maxiter)
    while run.running:
        run.step()
    return run.u, run.v, run.converged


def _k_residual(mix: CubicMixture, x: FloatArray, y: FloatArray, T: FloatArray, P: FloatArray
                ) -> tuple[FloatArray, FloatArray]:
    k1, k2 = _ln_k(mix, x, y, T, P)
    return x * np.exp(k1) - y, (1.0 - x) * np.exp(k2) - (1.0 - y)


def _trivial(mix: CubicMixture, x: FloatArray, y: FloatArray, T: FloatArray, P: FloatArray
             ) -> BoolArray:
    """Points where the two "phases" are one: same composition and same density root."""
    x, y = np.asarray(x, dtype=float), np.asarray(y, dtype=float)
    T, P = np.broadcast_to(T, x.shape).astype(float), np.broadcast_to(P, x.shape).astype(float)
    *_, z_liquid, _, _, z_vapour = _both_phases(mix, x, y, T, P)
    same_root = np.abs(z_liquid - z_vapour) <= 1e-7 * np.abs(z_vapour)
    # A liquid no denser than its vapour is a spurious root pairing, not two phases.
    inverted = z_liquid > z_vapour * (1.0 + 1e-12)
    return np.asarray(((np.abs(x - y) < TRIVIAL_GAP) & same_root) | inverted, dtype=bool)


def _solve(kind: str, system: BinarySystem, z: FloatArray, condition: FloatArray,
           start: tuple[FloatArray, FloatArray] | None = None) -> CubicResult:
    """One kind of point for every (z, condition); kinds as the public functions.

    ``start``: first guesses of the free variable (T or P) and of the unknown
    composition; default Raoult's law with the catalogue's vapour pressures.
    """
    mix = _mixture(system)
    by_T = kind.endswith("temperature")
    bubble = kind.startswith("bubble")
    from builder.thermo import equilibrium as eq

    if start is None:
        raoult = eq.BinarySystem(system.psat1, system.psat2, Ideal())
        guess = (eq.bubble_temperature(raoult, z, condition, newton_first=False)
                 if kind == "bubble_temperature" else getattr(eq, kind)(raoult, z, condition))
        free0, v0 = guess.T_K if by_T else guess.P_Pa, guess.y1 if bubble else guess.x1
    else:
        free0, v0 = start
    u0 = np.array(free0, dtype=float) if by_T else np.log(np.asarray(free0, dtype=float))
    v0 = np.array(v0, dtype=float)
    fallback = ~(np.isfinite(u0) & np.isfinite(v0))
    v0[fallback] = z[fallback]
    if by_T:
        u0[fallback] = 0.5 * (mix.Tc_K[0] + mix.Tc_K[1])
    else:
        u0[fallback] = np.log(0.5 * (mix.Pc_Pa[0] + mix.Pc_Pa[1]))

    def residual(u: FloatArray, v: FloatArray, points: IntArray
                 ) -> tuple[FloatArray, FloatArray]:
        T = u if by_T else condition[points]
        P = condition[points] if by_T else np.exp(u)
        x, y = (z[points], v) if bubble else (v, z[points])
        return _k_residual(mix, x, y, T, P)

    u_bounds = (1.0, 5.0 * max(mix.Tc_K)) if by_T else (np.log(1.0), np.log(1e9))
    max_du = 10.0 if by_T else 0.3

    def accept(u: FloatArray, v: FloatArray, ok: BoolArray, points: NDArray[np.intp]
               ) -> BoolArray:
        T = u if by_T else condition[points]
        P = condition[points] if by_T else np.exp(u)
        x, y = (z[points], v) if bubble else (v, z[points])
        return ok & ~_trivial(mix, x, y, T, P)

    u, v, ok = _newton(residual, u0, v0, u_bounds, (0.0, 1.0), max_du)
    ok = accept(u, v, ok, np.arange(z.size))
    # Continuation: retry failed points from their nearest converged neighbour, a grid
    # step at a time (enough sweeps to walk into a critical region from the Raoult guesses).
    dead_ends: set[tuple[int, int]] = set()
    for _ in range(CONTINUATION_SWEEPS):
        failed = np.flatnonzero(~ok)
        good = np.flatnonzero(ok)
        if failed.size == 0 or good.size == 0:
            break
        same = np.isclose(condition[failed][:, None], condition[good][None, :], rtol=1e-12)
        distance = np.where(same, np.abs(z[failed][:, None] - z[good][None, :]), np.inf)
        nearest = good[np.argmin(distance, axis=1)]
        reachable = np.isfinite(distance.min(axis=1))
        # Only the failed points next to a converged one along z, a step at a time.
        step_ok = reachable & (np.abs(z[failed] - z[nearest]) <= _grid_step(z, condition))
        if not step_ok.any():
            break
        retry, origin = failed[step_ok], nearest[step_ok]
        # A point that failed from the same converged neighbour fails again (the same
        # start, the same arithmetic): leave it out, as if retried.
        new = np.array([(int(i), int(j)) not in dead_ends for i, j in zip(retry, origin,
                                                                          strict=True)])
        if not new.any():
            break
        retry, origin = retry[new], origin[new]
        ur, vr = u[origin].copy(), v[origin] + (z[retry] - z[origin])

        def sub_residual(uu: FloatArray, vv: FloatArray, rows: IntArray,
                         _retry: IntArray = retry) -> tuple[FloatArray, FloatArray]:
            return residual(uu, vv, _retry[rows])

        un, vn, okn = _newton(sub_residual, ur, np.clip(vr, 0.0, 1.0), u_bounds, (0.0, 1.0),
                              max_du)
        okn = accept(un, vn, okn, retry)
        dead_ends.update(zip(retry[~okn].tolist(), origin[~okn].tolist(), strict=True))
        if not okn.any():
            break
        u[retry[okn]], v[retry[okn]] = un[okn], vn[okn]
        ok[retry[okn]] = True
    T = u if by_T else condition
    P = condition if by_T else np.exp(u)
    x, y = (z, v) if bubble else (v, z)
    phi1, phi2 = mix.ln_phi_phase(y, T, P, "vapour")
    return CubicResult(np.asarray(T, dtype=float), np.asarray(P, dtype=float), x, y, ok,
                       phi1, phi2)


def _grid_step(z: FloatArray, condition: FloatArray) -> float:
    """The largest gap between neighbouring compositions (how far one continuation step goes)."""
    values = np.unique(z)
    return float(np.max(np.diff(values))) + 1e-12 if values.size > 1 else 1.0


def solve_from(kind: str, system: BinarySystem, z: FloatArray, condition: FloatArray,
               free: FloatArray, other: FloatArray) -> CubicResult:
    """A bubble or dew solve (``kind`` as the function names) from given first guesses:
    ``free`` the temperature or pressure, ``other`` the unknown phase's composition."""
    return _solve(kind, system, z, condition, (free, other))


def bubble_temperature(system: BinarySystem, x1: FloatArray, P_Pa: FloatArray) -> CubicResult:
    """Bubble temperatures of liquids ``x1`` at ``P_Pa`` (flat arrays of equal length)."""
    return _solve("bubble_temperature", system, x1, P_Pa)


def bubble_pressure(system: BinarySystem, x1: FloatArray, T_K: FloatArray) -> CubicResult:
    """Bubble pressures of liquids ``x1`` at ``T_K``."""
    return _solve("bubble_pressure", system, x1, T_K)


def dew_temperature(system: BinarySystem, y1: FloatArray, P_Pa: FloatArray) -> CubicResult:
    """Dew temperatures of vapours ``y1`` at ``P_Pa``."""
    return _solve("dew_temperature", system, y1, P_Pa)


def dew_pressure(system: BinarySystem, y1: FloatArray, T_K: FloatArray) -> CubicResult:
    """Dew pressures of vapours ``y1`` at ``T_K``."""
    return _solve("dew_pressure", system, y1, T_K)


#: Trials one round of a critical-point march prepares at once: the step and, should it
#: fail, the next shorter ones (each a quarter of the one before).
SPECULATIVE_TRIALS = 3

#: The most trials one march makes.
MAX_TRIALS = 400


def _good_flash(mix: CubicMixture, x: FloatArray, y: FloatArray, T: FloatArray,
                P: FloatArray, converged: BoolArray) -> BoolArray:
    """Which converged flashes (coexisting ``x1, y1`` at fixed T and P) found two phases, not
    the trivial solution."""
    return np.asarray(converged & ~_trivial(mix, x, y, T, P) & (
        ((0.0 < x) & (x < 1.0)) | (np.abs(x - y) > TRIVIAL_GAP)), dtype=bool)


def _march(mix: CubicMixture, fixed: str, value: FloatArray, start_x1: FloatArray,
           start_y1: FloatArray, start_free: FloatArray, direction: float, gap: float
           ) -> list[CriticalPoint | None]:
    """:func:`critical_point` for several starts at once (one fixed value each).

    Every march takes its own steps: a trial from the path's linear extrapolation and,
    if that fails, again from the last solution; a trial that succeeds lengthens the next
    step by half, one that fails shortens it to a quarter.  A round solves, for every
    march, its next trial and the shorter trials that would follow its failure
    (:data:`SPECULATIVE_TRIALS`) in one vectorised Newton solve, run a step at a time
    and stopped for a march as soon as its outcome is known (its first trial that
    succeeds, all earlier ones having failed); the outcome is the same as trying them
    one after another.
    """
    n = value.size
    lo, x_lo, y_lo = start_free.astype(float).copy(), start_x1.copy(), start_y1.copy()
    paths: list[list[tuple[float, float, float]]] = [
        [(float(lo[i]), float(x_lo[i]), float(y_lo[i]))] for i in range(n)]
    step = 0.002 * np.abs(start_free)
    smallest = 1e-10 * np.abs(start_free)
    going = np.ones(n, dtype=bool)
    failed = np.zeros(n, dtype=bool)
    trials = np.zeros(n, dtype=int)
    while True:
        going &= (np.abs(x_lo - y_lo) >= gap) & (step >= smallest) & (trials < MAX_TRIALS)
        idx = np.flatnonzero(going)
        if idx.size == 0:
            break
        # Rows of the round: (march, free value, x guess, y guess); per march its chain of
        # trials, each (free value, row from the extrapolation, row from the last solution
        # or -1).
        spec: list[tuple[int, float, float, float]] = []
        chains: dict[int, list[tuple[float, int, int]]] = {}
        for i in idx.tolist():
            s = step[i]
            chain = chains[i] = []
            for j in range(SPECULATIVE_TRIALS):
                if j:
                    s = s / 4.0
                    if not (s >= smallest[i]) or trials[i] + j >= MAX_TRIALS:
                        break
                trial = lo[i] + direction * s
                x0, y0 = x_lo[i], y_lo[i]
                if len(paths[i]) >= 2:  # linear extrapolation along the path as the guess
                    f_prev, x_prev, y_prev = paths[i][-2]
                    slope = (trial - lo[i]) / (lo[i] - f_prev)
                    x0 = min(max(x_lo[i] + (x_lo[i] - x_prev) * slope, 0.0), 1.0)
                    y0 = min(max(y_lo[i] + (y_lo[i] - y_prev) * slope, 0.0), 1.0)
                spec.append((i, trial, x0, y0))
                first, again = len(spec) - 1, -1
                if (x0 != x_lo[i]) or (y0 != y_lo[i]):
                    spec.append((i, trial, x_lo[i], y_lo[i]))
                    again = len(spec) - 1
                chain.append((trial, first, again))
        row_march = [row[0] for row in spec]
        free = np.array([row[1] for row in spec])
        T = value[row_march] if fixed == "T" else free
        P = free if fixed == "T" else value[row_march]

        def residual(u: FloatArray, v: FloatArray, points: IntArray,
                     _T: FloatArray = T, _P: FloatArray = P) -> tuple[FloatArray, FloatArray]:
            return _k_residual(mix, u, v, _T[points], _P[points])

        run = _NewtonRun(residual, np.array([row[2] for row in spec]),
                         np.array([row[3] for row in spec]), (0.0, 1.0), (0.0, 1.0), 0.05)
        rows = len(spec)
        done = np.zeros(rows, dtype=bool)
        good = np.zeros(rows, dtype=bool)
        owner = np.array(row_march)
        outcome: dict[int, tuple[int, int]] = {}
        while True:
            new = run.finished & ~done & ~np.isin(owner, list(outcome))
            if new.any():
                where = np.flatnonzero(new)
                good[where] = _good_flash(mix, run.u[where], run.v[where], T[where],
                                          P[where], run.converged[where])
                done[where] = True
            for i, chain in chains.items():
                if i in outcome:
                    continue
                for j, (_, first, again) in enumerate(chain):
                    if not done[first]:
                        break
                    if good[first]:
                        outcome[i] = (j, first)
                        break
                    if again >= 0:
                        if not done[again]:
                            break
                        if good[again]:
                            outcome[i] = (j, again)
                            break
                else:
                    outcome[i] = (len(chain), -1)
                if i in outcome:
                    run.active[owner == i] = False
            if len(outcome) == len(chains) or not run.running:
                break
            run.step()
        for i, (j, row) in outcome.items():
            # Each failed trial shortens the step to a quarter (past the critical point,
            # or too far for the guess).
            for _ in range(j):
                step[i] /= 4.0
            trials[i] += j
            if row < 0:
                continue
            trials[i] += 1
            lo[i], x_lo[i], y_lo[i] = chains[i][j][0], run.u[row], run.v[row]
            paths[i].append((float(lo[i]), float(x_lo[i]), float(y_lo[i])))
            step[i] *= 1.5
            if abs(lo[i] - start_free[i]) > abs(start_free[i]):
                failed[i] = True
                going[i] = False
    out: list[CriticalPoint | None] = []
    for j in range(n):
        if failed[j]:
            out.append(None)
            continue
        free_c = float(lo[j] + 0.5 * direction * step[j])
        T_c, P_c = (float(value[j]), free_c) if fixed == "T" else (free_c, float(value[j]))
        out.append(CriticalPoint(x1=float(0.5 * (x_lo[j] + y_lo[j])), T_K=T_c, P_Pa=P_c,
                                 path=tuple(paths[j])))
    return out


def critical_point(system: BinarySystem, fixed: str, value: float, start_x1: float,
                   start_y1: float, start_free: float, direction: float,
                   gap: float = 2e-4) -> CriticalPoint | None:
    """Locate the mixture critical point at fixed ``T`` (``fixed="T"``) or ``P``.

    Starts from a converged two-phase point (liquid ``start_x1``, vapour
    ``start_y1`` at the free variable ``start_free``: P for an isotherm, T for
    an isobar) and moves the free variable in ``direction`` (+1 or -1) while a
    non-trivial two-phase solution exists, shortening the step by four
    whenever a trial finds none (past the end, or too far for the guess),
    until the phases differ by less than ``gap``.  None if no end is found
    within a factor of two.
    """
    return _march(_mixture(system), fixed, np.array([value], dtype=float),
                  np.array([start_x1], dtype=float), np.array([start_y1], dtype=float),
                  np.array([start_free], dtype=float), direction, gap)[0]


@lru_cache(maxsize=32)
def cricondenbar(system: BinarySystem, points: int = 8) -> float:
    """The highest pressure at which the binary has two phases (the critical locus maximum).

    The critical point of isotherms between the two critical temperatures,
    each located by :func:`critical_point`; the two pure critical pressures
    bound it from below.
    """
    mix = _mixture(system)
    best = max(mix.Pc_Pa)
    T_low, T_high = sorted(mix.Tc_K)
    light = 0 if mix.Tc_K[0] < mix.Tc_K[1] else 1
    grid = np.linspace(0.0, 1.0, 21)
    starts = []
    for T in np.linspace(T_low, T_high, points + 2)[1:-1]:
        z = grid if light == 0 else 1.0 - grid
        result = bubble_pressure(system, z, np.full(z.size, T))
        ok = np.flatnonzero(result.converged)
        if ok.size == 0:
            continue
        top = ok[np.argmax(result.P_Pa[ok])]
        starts.append((float(T), float(result.x1[top]), float(result.y1[top]),
                       float(result.P_Pa[top])))
    if starts:
        T_s, x_s, y_s, P_s = (np.array(column) for column in zip(*starts, strict=True))
        for point in _march(mix, "T", T_s, x_s, y_s, P_s, +1.0, 2e-4):
            if point is not None:
                best = max(best, point.P_Pa)
    return best
