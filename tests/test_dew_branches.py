"""The dew branch of each one-liquid stretch beside a three-phase line is drawn whole.

Strongly immiscible pairs with water have a water-rich one-liquid stretch narrower than
the composition grid's finest step (benzene in water: x1 below 0.001); the analysis adds
bubble points there (:mod:`builder.analysis.dew_branches`).  These tests check, on the
predicted benzene--water page and on the fitted water--n-butyl-acetate pair at
101.325 kPa, that the branch has many points, runs from pure water's boiling point to the
three-phase line and no further, and that every point is a dew point.

References (named again beside each check):

* water's saturation temperature and pressure: CoolProp 8.0.0, IAPWS-95 equation of state;
  benzene's: CoolProp's reference equation of state for benzene;
* activity coefficients: the ``thermo`` package's own UNIFAC (Dortmund variant, subgroups
  ACH x 6 and H2O) and NRTL classes, evaluated independently of the builder's formulas;
* an ideal vapour stands in for the builder's virial vapour in the independent checks:
  at 101.325 kPa the second virial correction and the catalogue's vapour-pressure
  correlations move a bubble pressure by about 1 % (common practice), so 2.5 % in
  pressure (0.7 K in temperature at these conditions) is the tolerance; a point on the
  wrong root or off the dew line misses by 5 K or more.
"""

from __future__ import annotations

import csv
import io
from types import SimpleNamespace

import numpy as np
import pytest

from builder.analysis import dew_branches, results
from builder.analysis.curves import composition_grid
from builder.analysis.point import system_for
from builder.analysis.record import ConditionResult, PairResults
from builder.catalogue.loader import Catalogue
from builder.catalogue.predictive import predicted_pair
from builder.site import figures, predicted_figures
from builder.site.data import condition_csvs
from builder.site.figures import DEW_COLOUR, pair_figures
from builder.site.predicted_figures import predicted_figure
from builder.site.settings import SiteSettings
from builder.thermo import equilibrium as eq
from tests.conftest import ShippedResults
from tests.references import coolprop_psat_Pa, thermo_gammas

P_PA = 101325.0
#: CoolProp 8.0.0, IAPWS-95: water boils at 373.124 K at 101.325 kPa; the catalogue's
#: water correlation gives 373.227 K (its own check is in the catalogue report), so the
#: branch's pure end is compared to 0.15 K.
WATER_BOILING_TOLERANCE_K = 0.15


@pytest.fixture(scope="module")
def benzene_water(catalogue: Catalogue) -> PairResults:
    pair = predicted_pair(catalogue.components["benzene"], catalogue.components["water"])
    return results.compute_pair(catalogue, pair)


def _atmospheric(found: PairResults) -> ConditionResult:
    condition = found.at_atmospheric()
    assert condition is not None and condition.three_phase is not None
    return condition


def _branch(condition: ConditionResult, water_side: str) -> np.ndarray:
    """Indices of the drawn points of the stretch between pure water and the three-phase
    liquid (``water_side`` "low": water is component 2, x1 = 0; "high": x1 = 1)."""
    three = condition.three_phase
    assert three is not None
    x = condition.curve.x1
    inside = x <= three.x1_a if water_side == "low" else x >= three.x1_b
    return np.flatnonzero(condition.drawable & inside)


def _water_boiling_K() -> float:
    from CoolProp.CoolProp import PropsSI

    return float(PropsSI("T", "P", P_PA, "Q", 0, "HEOS::Water"))


def test_benzene_water_dew_branch_runs_from_water_boiling_to_the_three_phase_line(
        benzene_water: PairResults) -> None:
    condition = _atmospheric(benzene_water)
    three = condition.three_phase
    assert three is not None and three.x1_a < 1e-3  # narrower than the grid's 0.001 step
    i = _branch(condition, "low")
    curve = condition.curve
    x, y, T = curve.x1[i], curve.y1[i], curve.T_K[i]
    assert i.size >= 25  # the grid alone gives the pure end only
    # Pure water's end: CoolProp (IAPWS-95) boiling point at 101.325 kPa.
    assert x[0] == 0.0 and y[0] == 0.0
    assert abs(T[0] - _water_boiling_K()) < WATER_BOILING_TOLERANCE_K
    # Down to the three-phase line and not past it: the last point within 0.01 K and 0.001
    # in y of the three-phase point, every point above its temperature.
    assert 0.0 <= T[-1] - three.T_K < 0.01
    assert abs(y[-1] - three.y1) < 1e-3
    assert np.all(T >= three.T_K)
    # Along the branch the vapour gets richer in benzene and the dew temperature falls,
    # monotonically, towards the three-phase vapour.
    assert np.all(np.diff(y) > 0) and np.all(np.diff(T) < 0)
    # Evenly enough spread for a drawn line: no step in y larger than a tenth of the branch.
    assert np.max(np.diff(y)) < 0.1 * (y[-1] - y[0])


def test_benzene_water_branch_points_are_dew_points_by_thermo_and_coolprop(
        benzene_water: PairResults) -> None:
    """Every point of both branches against thermo's UNIFAC (Dortmund) activity
    coefficients and CoolProp's saturation pressures (benzene and IAPWS-95 water) with an
    ideal vapour: the liquid x1 at T boils at 101.325 kPa within 2.5 % and gives the
    point's vapour within 0.01."""
    from thermo.unifac import DOUFSG, UNIFAC

    condition = _atmospheric(benzene_water)
    ids = {group.group: number for number, group in DOUFSG.items()}
    ge = UNIFAC.from_subgroups(T=350.0, xs=[0.5, 0.5], version=1,
                               chemgroups=[{ids["ACH"]: 6}, {ids["H2O"]: 1}])
    for side in ("low", "high"):
        i = _branch(condition, side)
        assert i.size >= 25
        x, y, T = (condition.curve.x1[i], condition.curve.y1[i], condition.curve.T_K[i])
        gammas = np.array([ge.to_T_xs(float(t), [float(v), 1.0 - float(v)]).gammas()
                           for v, t in zip(x, T, strict=True)])
        p1 = x * gammas[:, 0] * coolprop_psat_Pa("benzene", T)
        p2 = (1.0 - x) * gammas[:, 1] * coolprop_psat_Pa("water", T)
        assert np.max(np.abs((p1 + p2) / P_PA - 1.0)) < 0.025, side
        assert np.max(np.abs(p1 / (p1 + p2) - y)) < 0.01, side
    # Nearly pure water condensing: the water in the vapour is its saturation pressure over
    # P (the steam-distillation law of immiscible liquids, common practice), CoolProp.
    i = _branch(condition, "low")
    T = condition.curve.T_K[i]
    water_in_vapour = 1.0 - condition.curve.y1[i]
    assert np.max(np.abs(water_in_vapour - coolprop_psat_Pa("water", T) / P_PA)) < 0.015


def test_each_added_point_keeps_its_own_liquid_vapour_and_temperature(
        catalogue: Catalogue, benzene_water: PairResults) -> None:
    """After sorting, each row is still one equilibrium: ``y_i = x_i K_i`` at its own
    (x1, T, P) (the builder's K-values; a row mixed up with another misses by far)."""
    condition = _atmospheric(benzene_water)
    curve = condition.curve
    assert np.all(np.diff(curve.x1) >= 0)
    ok = curve.converged
    K1, K2 = eq.k_values(system_for(benzene_water.pair, catalogue), curve.x1[ok],
                         curve.T_K[ok], curve.P_Pa[ok])
    np.testing.assert_allclose(curve.x1[ok] * K1, curve.y1[ok], rtol=1e-9, atol=1e-12)
    np.testing.assert_allclose((1 - curve.x1[ok]) * K2, 1 - curve.y1[ok], rtol=1e-9,
                               atol=1e-12)


@pytest.mark.parametrize("side", ["high", "low"])
def test_the_builder_dew_temperature_agrees_on_both_branches(
        catalogue: Catalogue, benzene_water: PairResults, side: str) -> None:
    """The builder's own dew-temperature solver at each vapour of the benzene-rich
    ("high") and the water-rich ("low") branch returns the point's temperature and liquid
    (an independent solve in T of the dew condition, which must pick, among the liquids
    in equilibrium with the vapour, the one that condenses first)."""
    condition = _atmospheric(benzene_water)
    i = _branch(condition, side)
    curve = condition.curve
    dew = eq.dew_temperature(system_for(benzene_water.pair, catalogue), curve.y1[i], P_PA)
    assert dew.converged.all()
    np.testing.assert_allclose(dew.T_K, curve.T_K[i], rtol=0, atol=1e-6)
    np.testing.assert_allclose(dew.x1, curve.x1[i], rtol=0, atol=1e-8)


def test_fitted_water_butyl_acetate_water_rich_branch(shipped_results: ShippedResults) -> None:
    """The fitted NRTL pair: the water-rich stretch (x1 above 0.998) had 2-3 grid points.
    Its branch runs from water's CoolProp (IAPWS-95) boiling point to the three-phase line,
    and water's partial pressure at each point matches thermo's NRTL activity coefficient
    times CoolProp's saturation pressure (ideal vapour, 2.5 %)."""
    found = shipped_results["water--n-butyl-acetate"]
    condition = _atmospheric(found)
    three = condition.three_phase
    assert three is not None
    i = _branch(condition, "high")[::-1]  # from pure water towards the three-phase liquid
    curve = condition.curve
    x, y, T = curve.x1[i], curve.y1[i], curve.T_K[i]
    assert i.size >= 25
    assert x[0] == 1.0 and abs(T[0] - _water_boiling_K()) < WATER_BOILING_TOLERANCE_K
    assert 0.0 <= T[-1] - three.T_K < 0.01 and abs(y[-1] - three.y1) < 1e-3
    assert np.all(T >= three.T_K)
    assert np.all(np.diff(y) < 0) and np.all(np.diff(T) < 0)
    gamma_water = np.array([thermo_gammas(found.pair.model, float(v), float(t))[0]
                            for v, t in zip(x, T, strict=True)])
    water_pressure = x * gamma_water * coolprop_psat_Pa("water", T)
    assert np.max(np.abs(water_pressure / (y * P_PA) - 1.0)) < 0.025


def test_conditions_without_a_sparse_stretch_cost_no_solver_call(
        catalogue: Catalogue, monkeypatch: pytest.MonkeyPatch) -> None:
    """No three-phase point (ethanol--water) or stretches the grid covers well
    (ethyl-acetate--water, 22 or more grid points each): no extra bubble point is solved,
    and the curve is the composition grid alone."""
    def refuse(*_: object, **__: object) -> None:
        raise AssertionError("an extra solver call")

    # The solver as :mod:`builder.analysis.dew_branches` sees it (the rest of the analysis
    # keeps the real one).
    monkeypatch.setattr(dew_branches, "eq", SimpleNamespace(bubble_temperature=refuse,
                                                            bubble_pressure=refuse))
    grid = composition_grid().size
    for pid in ("ethanol--water", "ethyl-acetate--water"):
        computed = results.compute_pair(catalogue, catalogue.pairs[pid])
        assert all(c.curve.x1.size == grid for c in computed.conditions), pid
    assert any(c.three_phase is not None for c in computed.conditions)


def test_the_added_points_are_in_the_downloaded_curve(benzene_water: PairResults) -> None:
    """The whole-curve CSV lists the added points in x1 order, flagged as drawn."""
    condition = _atmospheric(benzene_water)
    three = condition.three_phase
    assert three is not None
    text = condition_csvs(benzene_water, condition)[0].decode("utf-8")
    rows = list(csv.reader(io.StringIO(text)))[1:]
    x1 = np.array([float(r[0]) for r in rows])
    drawn = np.array([r[8] == "1" for r in rows])
    assert np.all(np.diff(x1) >= 0)
    assert int((drawn & (x1 <= three.x1_a)).sum()) >= 25


class _Recorder:
    """Wraps ``plot_line`` of a figure module and keeps what each call drew."""

    def __init__(self, draw: object) -> None:
        self.draw = draw
        self.lines: list[tuple[str, np.ndarray, np.ndarray]] = []

    def __call__(self, ax: object, x: object, y: object, **style: object) -> object:
        self.lines.append((str(style.get("color")), np.asarray(x, dtype=float),
                           np.asarray(y, dtype=float)))
        return self.draw(ax, x, y, **style)  # type: ignore[operator]


def test_the_predicted_figure_draws_the_water_side_dew_branch(
        benzene_water: PairResults, monkeypatch: pytest.MonkeyPatch) -> None:
    condition = _atmospheric(benzene_water)
    three = condition.three_phase
    assert three is not None
    recorder = _Recorder(predicted_figures.plot_line)
    monkeypatch.setattr(predicted_figures, "plot_line", recorder)
    predicted_figure(benzene_water, SiteSettings())
    dew = [(y1, T) for colour, y1, T in recorder.lines if colour == DEW_COLOUR]
    assert len(dew) == 1  # the Txy dew line (the xy panel draws x1 against y1)
    y1, T = dew[0]
    drawn = np.isfinite(y1) & np.isfinite(T)
    on_branch = drawn & (y1 > 0.0) & (y1 < three.y1)
    assert on_branch.sum() >= 25  # before: none between pure water and the three-phase line
    # Nothing drawn below the three-phase line (display units: °C by default).
    assert np.min(T[drawn]) >= three.T_K - 273.15 - 1e-9


def test_the_fitted_figures_draw_the_water_rich_dew_branch(
        shipped_results: ShippedResults, monkeypatch: pytest.MonkeyPatch) -> None:
    found = shipped_results["water--n-butyl-acetate"]
    three = _atmospheric(found).three_phase
    assert three is not None
    recorder = _Recorder(figures.plot_line)
    monkeypatch.setattr(figures, "plot_line", recorder)
    pair_figures(found, SiteSettings())
    # The Txy dew line of 101.325 kPa: solid runs in the dew colour whose temperatures
    # reach the three-phase temperature (°C by default).
    level = three.T_K - 273.15
    runs = [(y1, T) for colour, y1, T in recorder.lines
            if colour == DEW_COLOUR and y1.size > 1 and abs(np.min(T) - level) < 0.01]
    assert runs
    on_branch = max(int(((y1 > three.y1) & (y1 < 1.0)).sum()) for y1, _ in runs)
    assert on_branch >= 25  # before: two grid points between the line and pure water
    assert all(np.min(T) >= level - 1e-9 for _, T in runs)


def test_the_second_opinion_draws_its_branch_and_compares_on_the_shared_grid(
        catalogue: Catalogue, shipped_results: ShippedResults) -> None:
    """The predicted overlay of a fitted page (water--n-butyl-acetate by modified UNIFAC
    (Dortmund)) gets the same added points, and every added point is a bubble point of
    the overlay's own model (thermo's UNIFAC with CoolProp's IAPWS-95 water: water's
    partial pressure within 2.5 %, ideal vapour, as above).  The largest bubble-temperature
    difference of two curves is taken where both have a point: water--1-butanol's stays at
    a composition of the grid (an added point of one curve has no partner on the other)."""
    from thermo.unifac import DOUFSG, UNIFAC

    from builder.analysis.second_opinion import second_opinion

    found = shipped_results["water--n-butyl-acetate"]
    predicted = second_opinion(catalogue, found).predicted
    assert predicted is not None and predicted.three_phase is not None
    i = _branch(predicted, "high")
    assert i.size >= 25  # the grid alone: 2 points above x1 = 0.998
    added = dew_branches.added_points(predicted.curve.x1, predicted.three_phase)
    assert added[i].sum() == 27
    x, y, T = predicted.curve.x1[i], predicted.curve.y1[i], predicted.curve.T_K[i]
    groups = {g: n for g, n in (catalogue.components["n-butyl-acetate"].groups.of("dortmund")
                                or {}).items()}
    ids = {group.group: number for number, group in DOUFSG.items()}
    ge = UNIFAC.from_subgroups(T=350.0, xs=[0.5, 0.5], version=1,
                               chemgroups=[{ids["H2O"]: 1}, {ids[g]: n for g, n in groups.items()}])
    gamma_water = np.array([ge.to_T_xs(float(t), [float(v), 1.0 - float(v)]).gammas()[0]
                            for v, t in zip(x, T, strict=True)])
    water_pressure = x * gamma_water * coolprop_psat_Pa("water", T)
    assert np.max(np.abs(water_pressure / (y * P_PA) - 1.0)) < 0.025
    opinion = second_opinion(catalogue, shipped_results["water--1-butanol"])
    assert opinion.x1_at_max in composition_grid()


@pytest.mark.parametrize("y1", [0.05, 0.65, 0.68])
def test_dew_point_of_a_water_rich_vapour_over_benzene(catalogue: Catalogue,
                                                       benzene_water: PairResults,
                                                       y1: float) -> None:
    """A vapour of benzene (1) and water (2) richer in water than the heterogeneous
    azeotrope condenses water first: its dew temperature at 101.325 kPa is where water's
    saturation pressure equals water's partial pressure, ``P_sat,water(T) = (1 - y1) P``
    (common practice: the liquid is nearly pure water, x1 below 0.01), here with CoolProp's
    IAPWS-95 saturation temperature; 0.25 K covers the catalogue's water correlation
    (0.1 K off IAPWS-95 at 1 atm) and the virial vapour.  The dew pressure at 350 K
    likewise: ``P = P_sat,water(350 K) / (1 - y1)`` within 1 %.  The liquid on the other
    side of the split (x1 near 0.99, about 4.6 K colder at 1 atm) must not be taken."""
    from CoolProp.CoolProp import PropsSI

    system = system_for(benzene_water.pair, catalogue)
    three = _atmospheric(benzene_water).three_phase
    assert three is not None and y1 < three.y1
    dew = eq.dew_temperature(system, y1, P_PA)
    assert bool(dew.converged) and float(dew.x1) < 0.01
    expected = PropsSI("T", "P", (1.0 - y1) * P_PA, "Q", 1, "HEOS::Water")
    assert float(dew.T_K) == pytest.approx(expected, abs=0.25)
    at_350 = eq.dew_pressure(system, y1, 350.0)
    assert bool(at_350.converged) and float(at_350.x1) < 0.01
    water_350 = PropsSI("P", "T", 350.0, "Q", 1, "HEOS::Water")
    assert float(at_350.P_Pa) == pytest.approx(water_350 / (1.0 - y1), rel=0.01)
