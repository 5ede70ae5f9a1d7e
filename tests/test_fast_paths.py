"""The faster paths of the predicted-pair analysis against the slower ones they replace and
against outside references.

References: the ``thermo`` package's UNIFAC (for the layout of long arrays of points at
their own temperatures); the closed form of the symmetric Margules liquid (a split for
A > 2, the spinodal curvature ``1 - A/2`` at x1 = 0.5; common practice); the project's
own tangent-plane test and successive substitution (the former methods, kept); for the
fitted pairs' isotherms, the bracketed search of ln α12 = 0 along bubble pressures (the
former azeotrope path there).
"""

from __future__ import annotations

from dataclasses import replace

import numpy as np
import pytest

from builder.analysis import curves
from builder.analysis.azeotropes import find_azeotropes
from builder.analysis.convexity import MARGIN, convex_temperatures
from builder.analysis.phases import analyse, analyse_isobars
from builder.analysis.point import system_for
from builder.analysis.stability import binodal
from builder.catalogue.loader import Catalogue
from builder.catalogue.predictive import predicted_pair, predictive_model
from builder.thermo import equilibrium as eq
from builder.thermo.activity import Margules
from builder.thermo.bubble_vapour import _substitution, bubble_vapour
from builder.thermo.solvers import solve_bracketed
from builder.thermo.vapour import VirialComponent, VirialVapour
from tests.test_unifac import _thermo_ln_gamma  # thermo's UNIFAC for the same subgroups

thermo_unifac = pytest.importorskip("thermo.unifac")

PAIRS = [("ethanol", "water"), ("n-hexane", "water"), ("methanol", "cyclohexane"),
         ("acetone", "toluene")]


@pytest.mark.parametrize("variant", ["unifac", "dortmund"])
@pytest.mark.parametrize("pair", PAIRS, ids=["--".join(p) for p in PAIRS])
def test_long_arrays_of_points_match_thermo(catalogue: Catalogue, pair: tuple[str, str],
                                            variant: str) -> None:
    """200 points at their own temperatures take the points-last layout; a sample of them
    agrees with thermo's UNIFAC to 1e-9 in ln γ."""
    model = predictive_model(*(catalogue.components[c] for c in pair), variant)
    rng = np.random.default_rng(7)
    x1 = np.concatenate([[0.0, 1.0], rng.uniform(0.0, 1.0, 198)])
    T = rng.uniform(260.0, 450.0, x1.size)
    ln1, ln2 = model.ln_gamma(x1, T)
    for i in (0, 1, 2, 50, 120, 199):
        xi = min(max(float(x1[i]), 1e-300), 1.0 - 1e-16)
        r1, r2 = _thermo_ln_gamma(model, xi, float(T[i]))
        assert abs(float(ln1[i]) - r1) <= 1e-9 and abs(float(ln2[i]) - r2) <= 1e-9


@pytest.mark.parametrize("A", [0.5, 1.0, 1.5, 1.79, 1.81, 1.95, 2.05, 3.0])
def test_convexity_follows_the_margules_closed_form(A: float) -> None:
    """κ = 1 - 2 A x1 x2 (common practice): proven convex exactly when 1 - A/2 ≥ the margin
    (the grid holds x1 = 0.5), never for a split (A > 2)."""
    proven = bool(convex_temperatures(Margules.constant(A, A), [300.0])[0])
    assert proven == (1.0 - A / 2.0 >= MARGIN)


@pytest.mark.parametrize("pair", PAIRS, ids=["--".join(p) for p in PAIRS])
def test_convexity_is_never_claimed_where_the_liquid_splits(catalogue: Catalogue,
                                                             pair: tuple[str, str]) -> None:
    """Where the tangent-plane hull finds two liquids, the cheap test proves nothing."""
    model = predictive_model(*(catalogue.components[c] for c in pair), "dortmund")
    temperatures = np.linspace(250.0, 450.0, 21)
    proven = convex_temperatures(model, temperatures)
    for T, convex in zip(temperatures, proven, strict=True):
        if convex:
            assert binodal(model, float(T)) is None, (pair, T)


def test_bubble_vapour_newton_matches_substitution() -> None:
    """Newton in log-odds (virial vapour) and the former successive substitution agree to
    1e-12 in y1 over random liquids, temperatures and pressures."""
    c3 = VirialComponent(369.83, 4.248e6, 2.0e-4, 0.152, 0.0, 0.0, 8.98e-5)
    c4 = VirialComponent(425.12, 3.796e6, 2.55e-4, 0.200, 0.0, 0.0, 1.0e-4)
    vapour = VirialVapour(c3, c4)
    rng = np.random.default_rng(3)
    n = 400
    T = rng.uniform(250.0, 400.0, n)
    P = rng.uniform(1e4, 2e6, n)
    ps1, ps2 = rng.uniform(1e4, 3e6, n), rng.uniform(1e3, 1e6, n)
    p1 = rng.uniform(0.0, 1.0, n) * ps1
    p2 = rng.uniform(0.0, 1.0, n) * ps2
    p1[:3], p2[3:6] = 0.0, 0.0  # pure ends
    fast = bubble_vapour(vapour, p1, p2, T, P, ps1, ps2)
    slow = _substitution(vapour, p1, p2, T, P, ps1, ps2)
    assert fast[3].all() and slow[3].all()
    assert np.max(np.abs(fast[2] - slow[2])) <= 1e-12
    assert np.allclose(fast[0], slow[0], rtol=1e-11) and np.allclose(fast[1], slow[1], rtol=1e-11)
    # Without the pure ends every point takes Newton, and the solve skips its masks: the
    # same numbers as the masked solve of the same points.
    inner = slice(6, None)
    unmasked = bubble_vapour(vapour, p1[inner], p2[inner], T[inner], P[inner], ps1[inner],
                             ps2[inner])
    for a, b in zip(unmasked, fast, strict=True):
        assert np.array_equal(a, b[inner])


@pytest.mark.parametrize("pair_id", ["acetone--methanol", "chloroform--methanol",
                                     "acetone--chloroform"])
def test_isotherm_azeotropes_from_their_own_equations(catalogue: Catalogue,
                                                      pair_id: str) -> None:
    """Azeotropes on the published isotherms by Newton on (x1, ln P)
    (:func:`azeotrope_points_isotherm`) against the former path, a bracketed search of
    ln α12 = 0 along bubble pressures: the same roots to 1e-10 in x1 and 1e-10 relative in
    P, the same kinds."""
    pair = catalogue.pairs[pair_id]
    system = system_for(pair, catalogue)
    assert pair.isotherms_K
    for T in pair.isotherms_K:
        search = find_azeotropes(system, T_K=T)
        assert search.complete and search.azeotropes
        for az in search.azeotropes:
            def ln_alpha(u: np.ndarray, mask: np.ndarray, T: float = T) -> np.ndarray:
                return np.log(eq.bubble_pressure(system, u, T).relative_volatility(system))

            root = solve_bracketed(ln_alpha, np.array([az.x1 - 0.02]),
                                   np.array([az.x1 + 0.02]), xtol=1e-13, ftol=1e-14)
            assert root.converged.all()
            at = eq.bubble_pressure(system, root.root, T)
            assert az.x1 == pytest.approx(float(root.root[0]), abs=1e-10)
            assert az.P_Pa == pytest.approx(float(at.P_Pa[0]), rel=1e-10)
            rises = float(at.P_Pa[0]) >= max(eq.bubble_pressure(system, [0.0, 1.0], T).P_Pa)
            assert az.kind == ("maximum-pressure" if rises else "minimum-pressure")


def test_isobars_analysed_together_match_one_by_one(catalogue: Catalogue) -> None:
    """analyse_isobars (shared solver calls) against one analyse per pressure (the former
    path of the azeotrope trace), where methanol--cyclohexane turns heterogeneous."""
    record = predicted_pair(catalogue.components["cyclohexane"],
                            catalogue.components["methanol"])
    system = system_for(record, replace(catalogue, pairs={record.id: record}))
    grid = curves.composition_grid(61)
    pressures = np.array([10e3, 40e3, 101325.0, 200e3])
    together = analyse_isobars(system, record.model, pressures, grid)
    for P, (_, phases) in zip(pressures, together, strict=True):
        alone = analyse(system, record.model, True, float(P), curves.isobar(system, P, grid))
        assert (phases.liquid_stable == alone.liquid_stable).all()
        assert len(phases.azeotropes) == len(alone.azeotropes) >= 1
        for a, b in zip(phases.azeotropes, alone.azeotropes, strict=True):
            assert a.kind == b.kind and a.heterogeneous == b.heterogeneous
            assert a.x1 == pytest.approx(b.x1, abs=1e-9)
            assert a.T_K == pytest.approx(b.T_K, rel=1e-10)
