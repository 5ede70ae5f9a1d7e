"""A first look at separating a pair by plain distillation on one isobar.

For a split between a bottoms and a distillate composition, both inside one
azeotrope-free stretch of composition, on the actual equilibrium curve
``y*(x)`` at the pressure:

* **Minimum stages** (total reflux): the operating line is ``y = x``; starting
  from the bottoms liquid (the reboiler is the first stage) each stage takes
  ``y = y*(x)`` and passes it up as the next liquid, until the distillate is
  reached.  The last stage is counted fractionally by interpolating the
  log-odds ``ln(x/(1-x))``, which makes the count equal to Fenske's equation
  exactly when α is constant.  Fenske's estimate with the geometric mean of
  the top and bottom volatilities is given beside it (M. R. Fenske, Ind. Eng.
  Chem. 24 (1932) 482).
* **Minimum reflux** for a saturated-liquid feed (q = 1): the smallest
  rectifying ``L/V`` for which neither operating line crosses the equilibrium
  curve.  Usually the pinch is at the feed; for curves that bend (typical near
  an azeotrope or with strong non-ideality) it is a tangent pinch inside a
  section, which is reported as such.  For constant α the result equals
  Underwood's ``R_min = [x_D/z - α (1 - x_D)/(1 - z)] / (α - 1)`` (A. J. V.
  Underwood, Chem. Eng. Prog. 44 (1948) 603).

Compositions inside this module are of the component that goes overhead in
that stretch ("top component"); results are reported in mole fractions of
component 1.  A split that would cross an azeotrope is not computed: the
reachable limit is reported instead.
"""

from __future__ import annotations

import bisect
import itertools
import math
from collections.abc import Callable
from dataclasses import dataclass, replace

import numpy as np
from numpy.typing import NDArray
from scipy.interpolate import CubicSpline

from builder.analysis.azeotropes import Azeotrope
from builder.analysis.stability import ThreePhase
from builder.thermo import equilibrium as eq

__all__ = ["QuickLook", "Split", "fenske_stages", "quick_look", "quick_look_compositions",
           "total_reflux_stages", "underwood_minimum_reflux"]

FloatArray = NDArray[np.float64]
Equilibrium = Callable[[FloatArray], FloatArray]

#: Stage counting stops here: a split needing more stages is reported as such.
MAX_STAGES = 500


@dataclass(frozen=True)
class Split:
    """Requested compositions of component 1 in distillate, bottoms and feed."""

    distillate_x1: float
    bottoms_x1: float
    feed_x1: float


@dataclass(frozen=True)
class QuickLook:
    """Minimum stages and minimum reflux of one split on one isobar, or why not."""

    P_Pa: float
    requested: Split
    split: Split | None  # the split computed (requested, or the reachable side)
    top_component: int  # 1 or 2: which component goes overhead
    limited_by: str  # empty, or why the requested split was not computed as given
    stages_min: float | None = None  # theoretical stages incl. reboiler, total reflux
    fenske_stages: float | None = None
    alpha_top: float | None = None
    alpha_bottom: float | None = None
    reflux_min: float | None = None
    pinch: str = ""  # "feed", "tangent (rectifying section)", "tangent (stripping section)"
    pinch_x1: float | None = None
    reason: str = ""  # why a number is missing, in plain words


def fenske_stages(x_top: float, x_bottom: float, alpha: float) -> float:
    """Fenske's minimum number of stages (including the reboiler) for constant α.

    >>> round(fenske_stages(0.95, 0.05, 2.5), 4)
    6.4269
    """
    return math.log((x_top / (1 - x_top)) * ((1 - x_bottom) / x_bottom)) / math.log(alpha)


def underwood_minimum_reflux(x_top: float, feed: float, alpha: float) -> float:
    """Underwood's minimum reflux ratio for a saturated-liquid feed and constant α.

    >>> round(underwood_minimum_reflux(0.95, 0.5, 2.5), 4)
    1.1
    """
    return (x_top / feed - alpha * (1 - x_top) / (1 - feed)) / (alpha - 1)


def _log_odds(u: float) -> float:
    return math.log(u / (1.0 - u))


def total_reflux_stages(y_star: Equilibrium, x_bottom: float, x_top: float
                        ) -> float | None:
    """Stages (reboiler included) from ``x_bottom`` to ``x_top`` at total reflux.

    ``y_star`` maps liquid to vapour compositions of the top component.  Returns
    None when the count exceeds :data:`MAX_STAGES` or a stage makes no progress.

    The stage compositions ``x_(n+1) = y*(x_n)`` are found all at once: a first
    sequence from the equilibrium curve tabulated on a grid (interpolated in
    log-odds), then Newton sweeps on the whole sequence (each one vectorised call
    of ``y_star`` and a forward substitution) until it satisfies every stage's
    equation to round-off.  The count is then read off exactly as stage-by-stage
    stepping would; where the sequence cannot be settled that way, it is stepped.

    Constant α = 2.5, 95 % from 5 %: Fenske's 6.4269 (see :func:`fenske_stages`).

    >>> y = lambda x: 2.5 * x / (1.0 + 1.5 * x)
    >>> round(total_reflux_stages(y, 0.05, 0.95), 4)
    6.4269
    """
    settled = _stage_sequence(y_star, x_bottom, x_top)
    x = x_bottom
    start = 0
    if settled is not None:
        sequence, ys = settled
        for stage in range(sequence.size):
            x, y = float(sequence[stage]), float(ys[stage])
            verdict = _stage_verdict(x, y, x_top, stage)
            if verdict is not _NEXT:
                return verdict  # type: ignore[return-value]
        x, start = float(ys[-1]), sequence.size
    for stage in range(start, MAX_STAGES):
        y = float(y_star(np.array([x]))[0])
        verdict = _stage_verdict(x, y, x_top, stage)
        if verdict is not _NEXT:
            return verdict  # type: ignore[return-value]
        x = y
    return None


_NEXT = object()


def _stage_verdict(x: float, y: float, x_top: float, stage: int) -> object:
    """None (no progress), the fractional count (distillate reached) or :data:`_NEXT`."""
    if not (0.0 < y < 1.0) or y <= x:
        return None
    if y >= x_top:
        # fraction of this stage needed, in log-odds (exact for constant α)
        return stage + (_log_odds(x_top) - _log_odds(x)) / (_log_odds(y) - _log_odds(x))
    return _NEXT


def _stage_sequence(y_star: Equilibrium, x_bottom: float, x_top: float,
                    grid_points: int = 201, sweeps: int = 8
                    ) -> tuple[FloatArray, FloatArray] | None:
    """Liquid compositions ``x_0 = x_bottom, x_1, ...`` of the stages at total reflux,
    each ``y*`` of the one before, up to the first vapour at or above ``x_top``, and
    their vapours; None when a guide or a sweep fails (the caller then steps stage by
    stage)."""
    if not (0.0 < x_bottom < x_top < 1.0):
        return None
    x_grid = _guide_grid(x_bottom, x_top, grid_points)
    L_grid = np.log(x_grid / (1.0 - x_grid))
    with np.errstate(all="ignore"):
        y_grid = y_star(x_grid)
        gain = np.log(y_grid / (1.0 - y_grid)) - L_grid
    if not (np.all(np.isfinite(gain)) and np.all(gain > 0)):
        return None
    # First sequence from the tabulated curve: stepping in log-odds on a cubic spline of the
    # gain, close enough (about 1e-9) that one Newton sweep usually settles it.
    L = [float(L_grid[0])]
    gain_at = _spline(L_grid, gain)
    while L[-1] < L_grid[-1] and len(L) <= MAX_STAGES:
        L.append(L[-1] + gain_at(L[-1]))
    guess = 1.0 / (1.0 + np.exp(-np.array(L[:-1])))
    guess[0] = x_bottom
    previous = np.inf
    for _ in range(sweeps):
        h = 1e-7 * np.maximum(guess, 1e-12)
        both = y_star(np.concatenate([guess, guess + h]))
        Y, slope = both[:guess.size], (both[guess.size:] - both[:guess.size]) / h
        if not (np.all(np.isfinite(Y)) and np.all(np.isfinite(slope))):
            return None
        new = np.empty_like(guess)
        new[0] = x_bottom
        for n in range(guess.size - 1):
            new[n + 1] = Y[n] + slope[n] * (new[n] - guess[n])
        if not np.all((new > 0.0) & (new < 1.0)):
            return None
        change = float(np.max(np.abs(new - guess)))
        if change <= 1e-8 and change < previous:
            # Newton converges quadratically: a step of at most 1e-8, smaller than the one
            # before, leaves an error of the order of its square (1e-16).  Each stage's
            # vapour is the next liquid; the last one's is Newton-updated alike.
            vapours = np.append(new[1:], Y[-1] + slope[-1] * (new[-1] - guess[-1]))
            return np.asarray(new, dtype=float), np.asarray(vapours, dtype=float)
        guess, previous = new, change
    return None


def _spline(knots: FloatArray, values: FloatArray) -> Callable[[float], float]:
    """The not-a-knot cubic spline through (knots, values) as a fast function of one float
    (the stage stepping calls it once per stage)."""
    pieces = CubicSpline(knots, values).c.T.tolist()  # per interval: cubic ... constant
    edges = knots.tolist()
    last = len(pieces) - 1

    def at(u: float) -> float:
        i = min(max(bisect.bisect_right(edges, u) - 1, 0), last)
        a, b, c, d = pieces[i]
        t = u - edges[i]
        return ((a * t + b) * t + c) * t + d

    return at


def _guide_grid(x_bottom: float, x_top: float, points: int = 201) -> FloatArray:
    """Compositions evenly spaced in log-odds from ``x_bottom`` to ``x_top``."""
    L = np.linspace(_log_odds(x_bottom), _log_odds(x_top), points)
    return np.asarray(1.0 / (1.0 + np.exp(-L)), dtype=float)


def _reflux_grids(x_bottom: float, feed: float, x_top: float) -> tuple[FloatArray, FloatArray]:
    """Liquid compositions searched for the rectifying and the stripping pinch."""
    return np.linspace(feed, x_top, 201)[:-1], np.linspace(x_bottom, feed, 201)[1:]


class _Known:
    """Values of a function at the points where it was evaluated, looked up by the exact
    float of the point (a table kept sorted, so that a lookup of many points is one
    vectorised search)."""

    def __init__(self, x: FloatArray, y: FloatArray) -> None:
        self.x, self.y = self._sorted(x, y)

    @staticmethod
    def _sorted(x: FloatArray, y: FloatArray) -> tuple[FloatArray, FloatArray]:
        x, first = np.unique(np.asarray(x, dtype=float), return_index=True)
        return x, np.asarray(y, dtype=float)[first]

    def find(self, u: FloatArray) -> tuple[FloatArray, NDArray[np.bool_]]:
        """The values at ``u`` (NaN where unknown) and where they are known."""
        if self.x.size == 0:
            return np.full(u.shape, np.nan), np.zeros(u.shape, dtype=bool)
        i = np.minimum(np.searchsorted(self.x, u), self.x.size - 1)
        hit = self.x[i] == u
        return np.where(hit, self.y[i], np.nan), hit

    def add(self, u: FloatArray, values: FloatArray) -> None:
        """Keep ``values`` at ``u`` (points already known keep their value)."""
        self.x, self.y = self._sorted(np.concatenate([self.x, u]),
                                      np.concatenate([self.y, values]))


def _prefetched(y_star: Equilibrium, *grids: FloatArray) -> Equilibrium:
    """``y_star`` with its values on ``grids`` solved in one call beforehand."""
    xs = np.concatenate(grids)
    known = _Known(xs, y_star(xs))

    def lookup(u: FloatArray) -> FloatArray:
        u = np.asarray(u, dtype=float)
        values, hit = known.find(u)
        return values if hit.all() else y_star(u)

    return lookup


def _maximum(f: Equilibrium, a: float, b: float, points: int = 129, rounds: int = 1
             ) -> tuple[float, float]:
    """Where the smooth ``f`` has its maximum in ``[a, b]``, and the value there.

    Vectorised grid refinement (each round one call of ``f`` on ``points`` points,
    narrowing to the best point's neighbours) and a parabola through the last three
    points; the location of a smooth maximum is fixed only to about 1e-8 by round-off,
    its value to round-off.
    """
    for _ in range(rounds):
        xs = np.linspace(a, b, points)
        values = f(xs)
        i = int(np.nanargmax(values))
        a, b = float(xs[max(i - 1, 0)]), float(xs[min(i + 1, points - 1)])
    best_x, best = float(xs[i]), float(values[i])
    if 0 < i < points - 1:
        f0, f1, f2 = values[i - 1], values[i], values[i + 1]
        curvature = f0 - 2.0 * f1 + f2
        if curvature < 0:
            vertex = best_x + 0.5 * (xs[1] - xs[0]) * (f0 - f2) / curvature
            at = float(f(np.array([vertex]))[0])
            if a <= vertex <= b and at >= best:
                return float(vertex), at
    return best_x, best


def _minimum_reflux(y_star: Equilibrium, x_bottom: float, feed: float, x_top: float
                    ) -> tuple[float, str, float]:
    """(R_min, pinch kind, pinch liquid composition) for a saturated-liquid feed."""
    grid_r, grid_s = _reflux_grids(x_bottom, feed, x_top)

    def rect_slope(x: FloatArray) -> FloatArray:  # L/V the rectifying line needs at liquid x
        return np.asarray((x_top - y_star(x)) / (x_top - x), dtype=float)

    def strip_limit(x: FloatArray) -> FloatArray:  # highest y at the feed allowed by liquid x
        return np.asarray(x_bottom + (y_star(x) - x_bottom) * (feed - x_bottom)
                          / (x - x_bottom), dtype=float)

    both = y_star(np.concatenate([grid_r, grid_s]))
    slopes = (x_top - both[:grid_r.size]) / (x_top - grid_r)
    k = int(np.argmax(slopes))
    LV_rect, x_rect = float(slopes[k]), float(grid_r[k])
    if 0 < k < grid_r.size - 1:
        x_rect, LV_rect = _maximum(rect_slope, float(grid_r[k - 1]), float(grid_r[k + 1]))
    limits = x_bottom + (both[grid_r.size:] - x_bottom) * (feed - x_bottom) / (grid_s - x_bottom)
    j = int(np.argmin(limits))
    y_q, x_strip = float(limits[j]), float(grid_s[j])
    if 0 < j < grid_s.size - 1:
        x_strip, y_q = _maximum(lambda x: -strip_limit(x), float(grid_s[j - 1]),
                                float(grid_s[j + 1]))
        y_q = -y_q
    LV_strip = (x_top - y_q) / (x_top - feed)
    if LV_strip > LV_rect + 1e-12:
        LV, pinch, x_pinch = LV_strip, "tangent (stripping section)", x_strip
    else:
        LV, x_pinch = LV_rect, x_rect
        pinch = "feed" if abs(x_rect - feed) < 1e-6 else "tangent (rectifying section)"
    if abs(x_pinch - feed) < 1e-6:
        pinch = "feed"
    if LV <= 0.0:
        # The feed's equilibrium vapour is already at least as rich as the distillate.
        return 0.0, "none (the feed vapour already meets the distillate)", x_pinch
    return LV / (1.0 - LV), pinch, x_pinch


def _likely_top_is_1(azeotropes: tuple[Azeotrope, ...], a: float, b: float) -> bool:
    """Whether component 1 likely goes overhead in the stretch (a, b) between azeotropes:
    ``α12 > 1`` below a minimum-boiling azeotrope and above a maximum-boiling one (its
    sign changes there; the Gibbs-Konovalov rule of :mod:`.azeotropes`)."""
    right = next((z for z in azeotropes if z.x1 == b), None)
    if right is not None:
        return right.kind == "minimum-boiling"
    left = next((z for z in azeotropes if z.x1 == a), None)
    return left is not None and left.kind != "minimum-boiling"


def _stretches(azeotropes: tuple[Azeotrope, ...]) -> list[tuple[float, float]]:
    edges = [0.0, *sorted(a.x1 for a in azeotropes), 1.0]
    return list(itertools.pairwise(edges))


def quick_look_compositions(requested: Split) -> FloatArray:
    """The liquid compositions (x1) whose bubble points :func:`quick_look` asks for first
    when ``requested`` crosses no azeotrope: the split's ends and the grids of the stage
    count and of both pinch searches.  Solved beforehand with the curve (one call), they
    are handed to :func:`quick_look` as ``presolved``.

    >>> x = quick_look_compositions(Split(0.95, 0.05, 0.5))
    >>> x.size, float(x[0]), float(x.min()), float(x.max())
    (606, 0.5, 0.05, 0.95)
    """
    d, b, f = requested.distillate_x1, requested.bottoms_x1, requested.feed_x1
    low, high = sorted((b, d))
    asked = _asked(0.5 * (low + high), (d, b))
    top_is_1 = d > b  # the only orientation in which the split can be made

    def to_u(x1: float) -> float:
        return x1 if top_is_1 else 1.0 - x1

    u_top, u_bottom, u_feed = to_u(d), to_u(b), to_u(f)
    if not (u_bottom < u_feed < u_top):
        return asked
    u = np.concatenate([_guide_grid(u_bottom, u_top), *_reflux_grids(u_bottom, u_feed, u_top)])
    return np.concatenate([asked, u if top_is_1 else 1.0 - u])


def _asked(mid: float, ends: tuple[float, float]) -> FloatArray:
    """The middle of the split and its ends, in either orientation (``1 - (1 - e)`` is the
    float the other orientation computes for ``e``)."""
    return np.array([mid, *ends, *(1.0 - (1.0 - e) for e in ends)])


def quick_look(system: eq.BinarySystem, P_Pa: float, azeotropes: tuple[Azeotrope, ...],
               three_phase: ThreePhase | None, requested: Split,
               light_component: int, presolved: eq.EquilibriumResult | None = None
               ) -> QuickLook:
    """Minimum stages and minimum reflux on the isobar ``P_Pa`` for ``requested``.

    ``light_component`` (1 or 2) is the lower-boiling pure component; the
    default split is stated for it.  When the requested split crosses an
    azeotrope, the split is moved to the reachable side: the azeotrope-free
    stretch holding the feed, 5 % of its width in from either end.
    ``presolved``: bubble points at ``P_Pa`` already solved (e.g. the curve and
    :func:`quick_look_compositions`); a liquid found there is not solved again, and the
    others start from the temperature interpolated between them.
    """
    solved_points = _Known(np.empty(0), np.empty(0))
    guide_x1 = guide_T = np.empty(0)
    if presolved is not None:
        solved_points = _Known(presolved.x1, np.where(presolved.converged, presolved.y1, np.nan))
        order = np.argsort(presolved.x1[presolved.converged], kind="stable")
        guide_x1 = presolved.x1[presolved.converged][order]
        guide_T = presolved.T_K[presolved.converged][order]

    def y1_of_x1(x1: FloatArray) -> FloatArray:
        x1 = np.asarray(x1, dtype=float)
        y, hit = solved_points.find(x1)
        missing = np.flatnonzero(~hit)
        if missing.size:
            guess = np.interp(x1[missing], guide_x1, guide_T) if guide_x1.size > 1 else None
            result = eq.bubble_temperature(system, x1[missing], P_Pa, T_guess_K=guess)
            y[missing] = np.where(result.converged, result.y1, np.nan)
            solved_points.add(x1[missing], y[missing])
        if three_phase is not None:
            inside = (x1 > three_phase.x1_a) & (x1 < three_phase.x1_b)
            y = np.where(inside, three_phase.y1, y)
        return np.asarray(y, dtype=float)

    low, high = sorted((requested.bottoms_x1, requested.distillate_x1))
    crossing = [a for a in azeotropes if low < a.x1 < high]
    limited_by = ""
    split = requested
    if crossing:
        stretch = next(((a, b) for a, b in _stretches(azeotropes) if a <= requested.feed_x1 <= b),
                       _stretches(azeotropes)[0])
        a, b = stretch
        width = b - a
        names = ", ".join(f"x1 = {az.x1:.3f}" for az in crossing)
        limited_by = (f"the requested split crosses the azeotrope at {names}: plain "
                      f"distillation of a feed at x1 = {requested.feed_x1:.2f} is confined "
                      f"to {a:.3f} < x1 < {b:.3f}")
        feed = min(max(requested.feed_x1, a + 0.1 * width), b - 0.1 * width)
        split = Split(distillate_x1=float("nan"), bottoms_x1=float("nan"), feed_x1=feed)
        low, high = a + 0.05 * width, b - 0.05 * width
        # The liquids asked for below, and the column's grids for the likely orientation
        # (component 1 overhead below a minimum-boiling azeotrope, above a maximum-boiling
        # one; checked below), in one call.
        up = _likely_top_is_1(azeotropes, a, b)
        likely = quick_look_compositions(Split(high if up else low, low if up else high, feed))
        y1_of_x1(likely)
    # Which end of the stretch goes overhead: where the vapour is richer in it.  The vapours
    # at the split's ends, in either orientation, are solved in the same call.
    mid = 0.5 * (low + high)
    ends = ((low, high) if crossing else (requested.distillate_x1, requested.bottoms_x1))
    asked = _asked(mid, ends)
    known = dict(zip(asked.tolist(), y1_of_x1(asked).tolist(), strict=True))
    top_is_1 = bool(known[mid] > mid)
    if crossing:
        split = Split(distillate_x1=high if top_is_1 else low,
                      bottoms_x1=low if top_is_1 else high, feed_x1=split.feed_x1)
    top = 1 if top_is_1 else 2

    def to_u(x1: float) -> float:
        return x1 if top_is_1 else 1.0 - x1

    def y_star(u: FloatArray) -> FloatArray:
        x1 = u if top_is_1 else 1.0 - u
        y1 = y1_of_x1(np.asarray(x1, dtype=float))
        return y1 if top_is_1 else 1.0 - y1

    u_top, u_bottom, u_feed = to_u(split.distillate_x1), to_u(split.bottoms_x1), to_u(
        split.feed_x1)
    base = QuickLook(P_Pa=P_Pa, requested=requested, split=split, top_component=top,
                     limited_by=limited_by)
    if not (u_bottom < u_feed < u_top):
        return _replace(base, reason="the feed must lie between bottoms and distillate, and "
                        "the distillate must be richer in the component that goes overhead "
                        f"(component {top} here)")
    def y_star_at(u: float) -> float:
        x1 = u if top_is_1 else 1.0 - u
        y1 = known[x1] if x1 in known else float(y1_of_x1(np.array([x1]))[0])
        return y1 if top_is_1 else 1.0 - y1

    y_top, y_bottom = y_star_at(u_top), y_star_at(u_bottom)
    if min(y_top, y_bottom) <= 0.0 or max(y_top, y_bottom) >= 1.0:  # (NaN goes on)
        # The vapour is pure to round-off (e.g. ethane over benzyl alcohol, α near 1e15):
        # α cannot be evaluated, and there is nothing for a column to do.
        return _replace(base, reason="the relative volatility is too large to evaluate (the "
                        "equilibrium vapour is pure to within round-off): a single "
                        "equilibrium stage already makes this split")
    alpha_top = (y_top / (1 - y_top)) / (u_top / (1 - u_top))
    alpha_bottom = (y_bottom / (1 - y_bottom)) / (u_bottom / (1 - u_bottom))
    fenske = fenske_stages(u_top, u_bottom, math.sqrt(alpha_top * alpha_bottom))
    # The stage guide and both pinch searches' grids: one solve.
    solved = _prefetched(y_star, _guide_grid(u_bottom, u_top),
                         *_reflux_grids(u_bottom, u_feed, u_top))
    stages = total_reflux_stages(solved, u_bottom, u_top)
    R_min, pinch, u_pinch = _minimum_reflux(solved, u_bottom, u_feed, u_top)
    reason = "" if stages is not None else (
        f"more than {MAX_STAGES} stages at total reflux: not practical")
    return _replace(base, stages_min=stages, fenske_stages=fenske, alpha_top=alpha_top,
                    alpha_bottom=alpha_bottom, reflux_min=R_min, pinch=pinch,
                    pinch_x1=u_pinch if top_is_1 else 1.0 - u_pinch, reason=reason)


def _replace(base: QuickLook, **changes: object) -> QuickLook:
    return replace(base, **changes)  # type: ignore[arg-type]
