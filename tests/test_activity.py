"""Activity-coefficient models against independent implementations.

References: the ``thermo`` package (0.6.1) classes NRTL, Wilson and UNIQUAC for identical
parameters (relative 1e-9); two-suffix Margules through thermo's NRTL with α = 0; van Laar
against its excess-Gibbs-energy closed form (thermo has no van Laar class); the
Gibbs-Duhem equation x1 dlnγ1 + x2 dlnγ2 = 0 at constant T (common practice).
"""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from builder.catalogue.loader import Catalogue
from builder.thermo import activity as act
from tests.references import thermo_gammas, van_laar_closed_form

# thermo's UNIQUAC divides by x_i, so the pure ends are approached, not hit; the ends
# themselves are checked for continuity below.
COMPOSITIONS = [1e-12, 1e-6, 0.05, 0.3, 0.5, 0.77, 0.999999, 1.0 - 1e-12]


def _models() -> dict[str, act.ActivityModel]:
    tf = act.TemperatureFunction
    return {
        "nrtl": act.NRTL(tf(a=0.3, b=150.0, c=0.01, d=-1e-4), tf(a=-0.2, b=420.0),
                         tf(a=0.3)),
        "wilson": act.Wilson(tf(a=-0.81, b=-103.3), tf(a=0.81, b=-242.6)),
        "uniquac": act.UNIQUAC(tf(b=-203.2), tf(b=42.4), 2.5735, 1.4311, 2.336, 1.432),
        "margules-one-parameter": act.Margules(tf(a=2.771, d=-0.00523),
                                               tf(a=2.771, d=-0.00523)),
    }


@pytest.mark.parametrize("name", list(_models()))
@pytest.mark.parametrize("T", [300.0, 350.0, 410.0])
def test_against_thermo(name: str, T: float) -> None:
    model = _models()[name]
    x = np.array(COMPOSITIONS)
    ln_g1, ln_g2 = model.ln_gamma(x, T)
    for i, x1 in enumerate(COMPOSITIONS):
        g1, g2 = thermo_gammas(model, x1, T)
        assert np.exp(ln_g1[i]) == pytest.approx(g1, rel=1e-9)
        assert np.exp(ln_g2[i]) == pytest.approx(g2, rel=1e-9)


def test_catalogue_models_against_thermo(catalogue: Catalogue) -> None:
    """Every catalogued pair whose model thermo implements, at three temperatures."""
    checked = 0
    for pair in catalogue.pairs.values():
        for T in (pair.T_min_K, 0.5 * (pair.T_min_K + pair.T_max_K), pair.T_max_K):
            for x1 in (0.1, 0.5, 0.9):
                try:
                    g1, g2 = thermo_gammas(pair.model, x1, T)
                except LookupError:
                    continue
                ln_g1, ln_g2 = pair.model.ln_gamma(x1, T)
                assert np.exp(ln_g1) == pytest.approx(g1, rel=1e-9), pair.id
                assert np.exp(ln_g2) == pytest.approx(g2, rel=1e-9), pair.id
                checked += 1
    assert checked >= 27


@pytest.mark.parametrize("x1", [0.01, 0.2, 0.5, 0.8, 0.99])
@pytest.mark.parametrize(("A12", "A21"), [(1.6798, 0.9227), (-0.8643, -0.5899), (2.0, 0.5)])
def test_van_laar_against_closed_form(x1: float, A12: float, A21: float) -> None:
    ln_g1, ln_g2 = act.van_laar_ln_gamma(x1, A12, A21)
    ref1, ref2 = van_laar_closed_form(x1, A12, A21)
    assert float(ln_g1) == pytest.approx(ref1, rel=1e-7, abs=1e-10)
    assert float(ln_g2) == pytest.approx(ref2, rel=1e-7, abs=1e-10)


@pytest.mark.parametrize("name", list(_models()))
def test_pure_ends_are_finite_and_continuous(name: str) -> None:
    model = _models()[name]
    at_ends = model.ln_gamma(np.array([0.0, 1.0]), 340.0)
    near_ends = model.ln_gamma(np.array([1e-12, 1.0 - 1e-12]), 340.0)
    np.testing.assert_allclose(at_ends, near_ends, atol=1e-9)
    assert np.all(np.isfinite(at_ends))


def test_margules_two_parameter_infinite_dilution() -> None:
    """ln γ1∞ = A12 and ln γ2∞ = A21 by definition of the Margules constants."""
    ln_g1, ln_g2 = act.margules_ln_gamma(np.array([0.0, 1.0]), 0.7, 1.3)
    assert float(ln_g1[0]) == pytest.approx(0.7)
    assert float(ln_g2[1]) == pytest.approx(1.3)


def test_nrtl_with_zero_alpha_is_margules() -> None:
    x = np.linspace(0, 1, 11)
    nrtl = act.nrtl_ln_gamma(x, 0.4, 0.9, 0.0)
    margules = act.margules_ln_gamma(x, 1.3, 1.3)
    np.testing.assert_allclose(nrtl, margules, atol=1e-14)


def test_swapped_reverses_components() -> None:
    model = _models()["nrtl"]
    swapped = act.Swapped(model)
    x = np.linspace(0, 1, 7)
    a1, a2 = model.ln_gamma(x, 330.0)
    b1, b2 = swapped.ln_gamma(1 - x, 330.0)
    np.testing.assert_allclose(a1, b2, atol=1e-15)
    np.testing.assert_allclose(a2, b1, atol=1e-15)


def test_ideal_is_zero_and_broadcasts() -> None:
    ln_g1, ln_g2 = act.Ideal().ln_gamma(np.linspace(0, 1, 5), np.full(5, 300.0))
    assert ln_g1.shape == (5,) and not ln_g1.any() and not ln_g2.any()


@settings(max_examples=60, deadline=None)
@given(x1=st.floats(0.02, 0.98), T=st.floats(280.0, 420.0),
       name=st.sampled_from(["nrtl", "wilson", "uniquac", "margules-one-parameter"]))
def test_gibbs_duhem(x1: float, T: float, name: str) -> None:
    """x1 d(ln γ1)/dx1 + x2 d(ln γ2)/dx1 = 0 at constant T and P for any consistent model."""
    model = _models()[name]
    h = 1e-6
    up = model.ln_gamma(x1 + h, T)
    down = model.ln_gamma(x1 - h, T)
    d1 = (float(up[0]) - float(down[0])) / (2 * h)
    d2 = (float(up[1]) - float(down[1])) / (2 * h)
    assert x1 * d1 + (1 - x1) * d2 == pytest.approx(0.0, abs=1e-6)


def test_temperature_function_broadcasts_over_curves() -> None:
    f = act.TemperatureFunction(a=1.0, b=100.0, c=0.5, d=1e-3)
    T = np.array([300.0, 350.0])
    np.testing.assert_allclose(f(T), 1.0 + 100.0 / T + 0.5 * np.log(T) + 1e-3 * T)
