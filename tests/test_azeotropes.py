"""Azeotropes and liquid-liquid splits.

References named beside each test: the azeotrope table of the CRC Handbook of Chemistry and
Physics and Horsley's Azeotropic Data as recorded in each pair file (values from memory,
marked there; the water pairs read in Lange's Handbook, 10th ed., say so there); closed
forms for model liquids (symmetric Margules: ln(x/(1-x)) = A(2x-1)
for the binodal, ln α = c + A(1 - 2x) for the azeotrope); a brute-force dense scan as an
independent count of the roots; invariants by property-based tests.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

from builder.analysis import stability
from builder.analysis.azeotropes import find_azeotropes
from builder.analysis.results import PairResults
from builder.catalogue.loader import Catalogue
from builder.thermo import equilibrium as eq
from builder.thermo.activity import Margules
from builder.thermo.vapour_pressure import Antoine
from tests.conftest import ShippedResults

ATM = 101325.0


def _flat_pair(c: float, margules: Margules) -> eq.BinarySystem:
    """Vapour pressures with a constant ratio P1/P2 = exp(c) at every temperature."""
    p2 = Antoine(A=21.0, B=3000.0, C=0.0, T_min_K=200.0, T_max_K=500.0)
    p1 = Antoine(A=21.0 + c, B=3000.0, C=0.0, T_min_K=200.0, T_max_K=500.0)
    return eq.BinarySystem(p1, p2, margules)


def test_recorded_azeotropes_at_one_atmosphere(catalogue: Catalogue,
                                               atlas_results: dict[str, PairResults]) -> None:
    """Every azeotrope a pair file records at 101.325 kPa (handbook tables) is found within
    1 K and 0.03 in mole fraction; the deviations are listed in the docs."""
    checked = 0
    for pair in catalogue.pairs.values():
        if not pair.recorded:
            continue
        if not (any(abs(r.P_Pa - ATM) <= 1.0 for r in pair.recorded.azeotropes)
                or any(abs(P - ATM) < 1.0 for P in pair.recorded.zeotropic_at_Pa)):
            continue  # nothing recorded at 101.325 kPa (e.g. a high-pressure pair)
        at_atm = atlas_results[pair.id].at_atmospheric()
        assert at_atm is not None, pair.id
        for recorded in pair.recorded.azeotropes:
            if abs(recorded.P_Pa - ATM) > 1.0:
                continue
            assert at_atm.azeotropes, f"{pair.id}: no azeotrope, handbook records one"
            model = min(at_atm.azeotropes, key=lambda a: abs(a.x1 - (recorded.x1 or a.x1)))
            assert model.kind == recorded.kind, pair.id
            if recorded.T_K is not None:
                assert model.T_K == pytest.approx(recorded.T_K, abs=1.0), pair.id
            if recorded.x1 is not None:
                assert model.x1 == pytest.approx(recorded.x1, abs=0.03), pair.id
            checked += 1
        if any(abs(P - ATM) < 1.0 for P in pair.recorded.zeotropic_at_Pa):
            assert not at_atm.azeotropes, f"{pair.id}: recorded zeotropic"
            assert at_atm.azeotrope_search_complete
    assert checked >= 5


def test_azeotrope_near_a_pure_end() -> None:
    """ln α = c + A(1 - 2x1) for symmetric Margules with a constant P1/P2: root at
    x* = (c + A)/(2A) = 0.002 for A = 1, c = -0.996."""
    system = _flat_pair(-0.996, Margules.constant(1.0, 1.0))
    found = find_azeotropes(system, T_K=350.0)
    assert found.complete and len(found.azeotropes) == 1
    assert found.azeotropes[0].x1 == pytest.approx(0.002, abs=1e-12)
    assert found.azeotropes[0].kind == "maximum-pressure"


def test_two_azeotropes_against_a_dense_scan() -> None:
    """A liquid with two azeotropes: the count and positions against an independent
    brute-force scan of ln α on a million points."""
    system = _flat_pair(0.02, Margules.constant(-0.6, 0.5))
    found = find_azeotropes(system, T_K=330.0)
    x = np.linspace(0, 1, 1_000_001)
    ln_alpha = np.log(eq.bubble_pressure(system, x, 330.0).relative_volatility(system))
    crossings = x[np.flatnonzero(np.diff(np.sign(ln_alpha)) != 0)]
    assert len(found.azeotropes) == len(crossings) == 2
    for az, scan in zip(found.azeotropes, crossings, strict=True):
        assert az.x1 == pytest.approx(scan, abs=2e-6)
    assert {a.kind for a in found.azeotropes} == {"maximum-pressure", "minimum-pressure"}


def test_none_only_when_searched() -> None:
    system = _flat_pair(0.5, Margules.constant(0.1, 0.1))
    found = find_azeotropes(system, P_Pa=ATM)
    assert found.azeotropes == () and found.complete


@settings(max_examples=40, deadline=None)
@given(A12=st.floats(-1.5, 2.0), A21=st.floats(-1.5, 2.0), c=st.floats(-1.0, 1.0),
       isobar=st.booleans())
def test_azeotrope_invariants(A12: float, A21: float, c: float, isobar: bool) -> None:
    """At an azeotrope x = y and bubble = dew; α - 1 changes sign across it.  (A liquid
    with α = 1 to within round-off everywhere has no resolvable azeotrope: not drawn.)"""
    assume(max(abs(A12), abs(A21), abs(c)) > 1e-6)
    system = _flat_pair(c, Margules.constant(A12, A21))
    # Two liquids are covered by the three-phase tests.  Near the consolute point (e.g. the
    # symmetric A = 2 exactly) one vapour has several liquids in equilibrium with it, so the
    # dew point is not unique: keep a 10 % margin from splitting.
    near = Margules.constant(1.1 * A12, 1.1 * A21)
    if not stability.stable(near, np.linspace(0.01, 0.99, 99), 340.0).all():
        return
    found = (find_azeotropes(system, P_Pa=ATM) if isobar
             else find_azeotropes(system, T_K=340.0))
    for az in found.azeotropes:
        if isobar:
            bubble = eq.bubble_temperature(system, az.x1, ATM)
            dew = eq.dew_temperature(system, az.x1, ATM)
            assert float(dew.T_K) == pytest.approx(float(bubble.T_K), abs=1e-6)
        else:
            bubble = eq.bubble_pressure(system, az.x1, 340.0)
            dew = eq.dew_pressure(system, az.x1, 340.0)
            assert float(dew.P_Pa) == pytest.approx(float(bubble.P_Pa), rel=1e-8)
        assert float(bubble.y1) == pytest.approx(az.x1, abs=1e-9)
        h = 1e-4
        if h < az.x1 < 1 - h:
            side = (eq.bubble_temperature(system, [az.x1 - h, az.x1 + h], ATM) if isobar
                    else eq.bubble_pressure(system, [az.x1 - h, az.x1 + h], 340.0))
            a = side.relative_volatility(system)
            assert (a[0] - 1) * (a[1] - 1) < 0


def test_binodal_symmetric_margules_closed_form() -> None:
    """ln(x/(1-x)) = A(2x - 1) (symmetric Margules; common practice)."""
    for A in (2.2, 3.0, 4.5):
        split = stability.binodal(Margules.constant(A, A), 300.0)
        assert split is not None
        x = split.x1_a
        assert math.log(x / (1 - x)) == pytest.approx(A * (2 * x - 1), abs=1e-9)
        assert split.x1_b == pytest.approx(1 - x, abs=1e-9)
    assert stability.binodal(Margules.constant(1.9, 1.9), 300.0) is None  # A < 2: one liquid


def test_three_phase_point_is_consistent() -> None:
    """At the three-phase temperature both liquids have the same bubble pressure (P) and
    the same vapour, which lies between them for a heterogeneous azeotrope."""
    system = _flat_pair(0.1, Margules.constant(3.0, 2.6))
    grid = np.linspace(0, 1, 201)
    curve = eq.bubble_temperature(system, grid, ATM)
    unstable = ~stability.stable(system.activity, grid, curve.T_K)
    assert unstable.any()
    tp = stability.three_phase_isobar(system, ATM, float(curve.T_K[unstable].min()))
    assert tp is not None and tp.heterogeneous_azeotrope
    both = eq.bubble_pressure(system, np.array([tp.x1_a, tp.x1_b]), tp.T_K)
    np.testing.assert_allclose(both.P_Pa, ATM, rtol=1e-8)
    np.testing.assert_allclose(both.y1, tp.y1, atol=1e-8)


def test_water_butanol_three_phase_against_published_values(
        shipped_results: ShippedResults) -> None:
    """Heterogeneous azeotrope of water-1-butanol at 760 mmHg: 92.4 °C, 55.5 weight %
    1-butanol, i.e. x_water = 0.767 (Lange's Handbook, 10th ed., table of azeotropes of
    water, as in pairs/binaries/water--1-butanol.yaml).  Coexisting liquids
    near 90 °C: about 26 mass % water in the butanol-rich phase (x_water ≈ 0.59) and about
    7 mass % butanol in the aqueous phase (x_water ≈ 0.982) (mutual-solubility data as
    compiled in the LLE literature; from memory, hence the wide tolerances)."""
    result = shipped_results["water--1-butanol"].at_atmospheric()
    assert result is not None and result.three_phase is not None
    tp = result.three_phase
    assert tp.heterogeneous_azeotrope
    assert tp.T_K - 273.15 == pytest.approx(92.4, abs=1.0)
    assert tp.y1 == pytest.approx(0.767, abs=0.03)
    assert tp.x1_a == pytest.approx(0.59, abs=0.05)
    assert tp.x1_b == pytest.approx(0.982, abs=0.01)
    (az,) = result.azeotropes
    assert az.heterogeneous and az.liquid_x1 == (tp.x1_a, tp.x1_b)
    # The curve is broken at the three-phase line: no bubble point is drawn inside the gap.
    inside = (result.curve.x1 > tp.x1_a) & (result.curve.x1 < tp.x1_b)
    assert inside.any() and not result.drawable[inside].any()
    # Dew line never below the bubble line where both are drawn.
    drawn = result.drawable
    assert np.all(result.curve.T_K[drawn] >= tp.T_K - 1e-6)


def test_regression_no_homogeneous_azeotrope_across_the_two_liquid_gap(
        shipped_results: ShippedResults) -> None:
    """Bug: the sign change of ln α across the excluded two-liquid stretch was bracketed
    and reported as a second, homogeneous azeotrope inside the gap."""
    for pid in ("water--1-butanol", "isobutanol--water"):
        result = shipped_results[pid].at_atmospheric()
        assert result is not None
        assert [a.heterogeneous for a in result.azeotropes] == [True], pid
