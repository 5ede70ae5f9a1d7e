"""Predicted pairs: every combination without a fitted set, computed like fitted pairs.

References: the heterogeneous azeotrope of n-heptane–water at 101.325 kPa, 79.2 °C with
about 55 mol % heptane in the vapour (CRC Handbook azeotrope table; from memory), with
the screening tolerance of the deviation table (3 K, 0.08); the property-based invariants
of the core (bubble below dew, round trips, pure limits, x = y at an azeotrope: common
practice) on predicted pairs; atlas calc's JSON contract (project convention).
"""

from __future__ import annotations

import dataclasses
import json
from math import comb

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from builder.analysis.azeotropes import find_azeotropes
from builder.analysis.point import system_for
from builder.analysis.predicted import (
    combinations_without_fitted_set,
    predicted_pairs,
    unpredictable_pairs,
)
from builder.analysis.results import compute_condition, compute_pair
from builder.catalogue.loader import Catalogue
from builder.catalogue.predictive import predicted_pair
from builder.commands.cli import main
from builder.thermo import equilibrium as eq

ATM = 101325.0

#: Predicted pairs with one liquid phase over the whole range (UNIFAC), for the invariants.
HOMOGENEOUS = [("acetone", "toluene"), ("ethanol", "ethyl-acetate"), ("benzene", "n-heptane"),
               ("methanol", "2-butanone"), ("1-propanol", "toluene"), ("acetic-acid", "toluene")]


@pytest.fixture(scope="module")
def predicted(catalogue: Catalogue) -> dict[str, eq.BinarySystem]:
    return {f"{a}--{b}": system_for(predicted_pair(catalogue.components[a],
                                                   catalogue.components[b]), catalogue)
            for a, b in HOMOGENEOUS}


def test_every_combination_is_fitted_predicted_or_listed(catalogue: Catalogue) -> None:
    n = len(catalogue.components)
    missing = combinations_without_fitted_set(catalogue)
    assert len(missing) + len(catalogue.pairs) == comb(n, 2)
    found, failed = predicted_pairs(catalogue), unpredictable_pairs(catalogue)
    assert len(found) + len(failed) == len(missing)
    for record in found.values():
        assert record.quality == "predicted" and record.isobars_Pa == (ATM,)
        assert record.model_kind in ("dortmund", "unifac") and record.recorded is None
    for item in failed:
        assert item.reasons and all("cannot predict" in r for r in item.reasons)


def test_dortmund_is_the_default(catalogue: Catalogue) -> None:
    record = predicted_pair(catalogue.components["methanol"], catalogue.components["cyclohexane"])
    assert record.model.name == "modified UNIFAC (Dortmund)"
    assert record.source.ref == "weidlich-gmehling-1987"


def test_heterogeneous_azeotrope_of_heptane_and_water(catalogue: Catalogue) -> None:
    record = predicted_pair(catalogue.components["n-heptane"], catalogue.components["water"])
    result = compute_condition(catalogue, record, "isobar", ATM)
    (az,) = result.azeotropes
    assert az.heterogeneous and az.kind == "minimum-boiling"
    assert az.T_K - 273.15 == pytest.approx(79.2, abs=3.0)
    assert az.x1 == pytest.approx(0.55, abs=0.08)


def test_compute_pair_runs_all_analyses(catalogue: Catalogue) -> None:
    record = predicted_pair(catalogue.components["acetone"], catalogue.components["toluene"])
    results = compute_pair(catalogue, record)
    (isobar,) = results.isobars
    assert isobar.curve.converged.all() and isobar.azeotropes == ()
    assert isobar.quicklook is not None and isobar.volatility is not None
    assert all(check.passed for check in results.checks)


def test_compute_pair_with_an_ideal_vapour(catalogue: Catalogue) -> None:
    # A component without virial constants (phenol with its virial block taken away, since
    # every catalogue component now has one) makes the pair's vapour ideal, and its bubble
    # points carry no fugacity coefficients (phi is None, not an array).
    phenol = dataclasses.replace(catalogue.components["phenol"], virial=None)
    without_virial = dataclasses.replace(
        catalogue, components={**catalogue.components, "phenol": phenol})
    record = predicted_pair(catalogue.components["n-pentane"], phenol)
    assert record.vapour is None
    results = compute_pair(without_virial, record)
    (isobar,) = results.isobars
    assert isobar.curve.vapour_model == "ideal-gas"
    assert isobar.curve.converged.all() and isobar.quicklook is not None


def test_quick_look_of_a_pair_too_volatile_to_evaluate(catalogue: Catalogue) -> None:
    # Ethane over benzyl alcohol (normal boiling points -89 °C and 205 °C): the bubble vapour
    # of the requested split is ethane to 1 - 1e-17, so 1 - y is zero in double precision.
    # The quick look says so instead of failing the whole build with a division by zero.
    record = predicted_pair(catalogue.components["benzyl-alcohol"],
                            catalogue.components["ethane"])
    (isobar,) = compute_pair(catalogue, record).isobars
    assert isobar.quicklook is not None and isobar.quicklook.stages_min is None
    assert "too large to evaluate" in isobar.quicklook.reason


@settings(max_examples=40, deadline=None)
@given(data=st.data(), z=st.floats(0.0, 1.0), P_kPa=st.floats(20.0, 300.0))
def test_bubble_below_dew_and_round_trip(data: st.DataObject, z: float, P_kPa: float,
                                         predicted: dict[str, eq.BinarySystem]) -> None:
    system = predicted[data.draw(st.sampled_from(sorted(predicted)))]
    P = P_kPa * 1e3
    bubble = eq.bubble_temperature(system, z, P)
    dew = eq.dew_temperature(system, z, P)
    assert bool(bubble.converged) and bool(dew.converged)
    assert float(bubble.T_K) <= float(dew.T_K) + 1e-9
    back = eq.dew_temperature(system, bubble.y1, P)
    assert float(back.x1) == pytest.approx(z, abs=1e-8)
    assert float(back.T_K) == pytest.approx(float(bubble.T_K), abs=1e-7)


@settings(max_examples=20, deadline=None)
@given(data=st.data(), T_C=st.floats(20.0, 120.0))
def test_pure_limits_are_the_pure_saturation_points(data: st.DataObject, T_C: float,
                                                    predicted: dict[str, eq.BinarySystem]
                                                    ) -> None:
    system = predicted[data.draw(st.sampled_from(sorted(predicted)))]
    T = T_C + 273.15
    ends = eq.bubble_pressure(system, np.array([0.0, 1.0]), T)
    np.testing.assert_allclose(ends.P_Pa, [system.psat2.pressure_Pa(T),
                                           system.psat1.pressure_Pa(T)], rtol=1e-13)


@pytest.mark.parametrize("pair", [("ethanol", "ethyl-acetate"), ("methanol", "2-butanone")])
def test_azeotrope_invariants(predicted: dict[str, eq.BinarySystem],
                              pair: tuple[str, str]) -> None:
    system = predicted["--".join(pair)]
    found = find_azeotropes(system, P_Pa=ATM)
    assert found.complete and found.azeotropes  # both are minimum-boiling (handbook)
    for az in found.azeotropes:
        bubble = eq.bubble_temperature(system, az.x1, ATM)
        dew = eq.dew_temperature(system, az.x1, ATM)
        assert float(dew.T_K) == pytest.approx(float(bubble.T_K), abs=1e-6)
        assert float(bubble.y1) == pytest.approx(az.x1, abs=1e-9)
        side = eq.bubble_temperature(system, [az.x1 - 1e-4, az.x1 + 1e-4], ATM)
        a = side.relative_volatility(system)
        assert (a[0] - 1) * (a[1] - 1) < 0


def _run(capsys: pytest.CaptureFixture[str], *args: str) -> tuple[int, str, str]:
    try:
        code = main(list(args))
    except SystemExit as stop:
        code = int(stop.code or 0)
    out, err = capsys.readouterr()
    return code, out, err


def test_calc_answers_for_a_pair_without_a_fitted_set(capsys: pytest.CaptureFixture[str]) -> None:
    code, out, _ = _run(capsys, "calc", "bubble-t", "n-heptane", "toluene", "--x", "0.5",
                        "--P", "1atm", "--json")
    data = json.loads(out)
    assert code == 0 and data["quality"] == "predicted"
    assert data["model"] == "modified UNIFAC (Dortmund)" and data["converged"]
    code, out, _ = _run(capsys, "calc", "bubble-t", "n-heptane", "toluene", "--x", "0.5",
                        "--P", "1atm")
    assert code == 0 and "predicted" in out


def test_calc_model_choice(capsys: pytest.CaptureFixture[str]) -> None:
    code, out, _ = _run(capsys, "calc", "bubble-t", "ethanol", "water", "--x", "0.3", "--P",
                        "1atm", "--json", "--model", "unifac")
    data = json.loads(out)
    assert code == 0 and data["model"] == "UNIFAC" and data["quality"] == "predicted"
    code, out, _ = _run(capsys, "calc", "bubble-t", "ethanol", "water", "--x", "0.3", "--P",
                        "1atm", "--json", "--model", "fitted")
    assert code == 0 and json.loads(out)["quality"] == "regressed"
    code, _, err = _run(capsys, "calc", "bubble-t", "n-heptane", "toluene", "--x", "0.5",
                        "--P", "1atm", "--model", "fitted")
    assert code == 2 and "no fitted parameter set" in err and "--model dortmund" in err
    code, out, _ = _run(capsys, "calc", "azeotrope", "methanol", "cyclohexane", "--P", "1atm",
                        "--json")
    data = json.loads(out)
    assert code == 0 and data["quality"] == "predicted" and len(data["azeotropes"]) == 1
