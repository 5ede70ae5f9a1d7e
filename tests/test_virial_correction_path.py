"""The virial vapour correction from one evaluation of B11, B22 and B12.

``ln_correction`` of a :class:`~builder.thermo.vapour.VirialVapour` evaluates the second
virial coefficients once for the pure liquids' terms and for ln φ; it must give exactly
what the general path (``ln_liquid_reference`` less ``ln_phi``, three evaluations) gives,
and the correction of a pure vapour must be the textbook one with B from the chemicals
package.  The K-values at a bubble vapour take ln c from the terms that vapour was solved
with, which must agree with the general path to round-off; a bubble temperature started
from a guess must land where the default start does.
"""

from __future__ import annotations

import numpy as np
import pytest

from builder.thermo import equilibrium as eq
from builder.thermo.bubble_vapour import bubble_vapour
from builder.thermo.units import GAS_CONSTANT_J_PER_MOL_K
from builder.thermo.vapour import VirialVapour, ln_correction


def _virial(systems: dict[str, eq.BinarySystem], pid: str) -> VirialVapour:
    vapour = systems[pid].vapour
    assert isinstance(vapour, VirialVapour)
    return vapour


@pytest.mark.parametrize("pid", ["ethanol--water", "acetone--chloroform", "benzene--toluene"])
def test_one_evaluation_equals_the_general_path(systems: dict[str, eq.BinarySystem],
                                                pid: str) -> None:
    """Bit for bit (the same arithmetic per element)."""
    vapour = _virial(systems, pid)
    rng = np.random.default_rng(5)
    y, T, P = rng.uniform(0, 1, 60), rng.uniform(250, 450, 60), rng.uniform(1e4, 1e6, 60)
    ps1, ps2 = rng.uniform(1e3, 1e6, 60), rng.uniform(1e3, 1e6, 60)
    c1, c2 = ln_correction(vapour, y, T, P, ps1, ps2)
    r1, r2 = vapour.ln_liquid_reference(T, P, ps1, ps2)
    f1, f2 = vapour.ln_phi(y, T, P)
    np.testing.assert_array_equal(c1, r1 - f1)
    np.testing.assert_array_equal(c2, r2 - f2)


def test_pure_vapour_correction_against_chemicals(systems: dict[str, eq.BinarySystem]
                                                  ) -> None:
    """Reference: chemicals.virial.BVirial_Tsonopoulos_extended for B11; the pure vapour's
    correction is ``ln c1 = B11 (P1sat - P)/RT + V1 (P - P1sat)/RT`` (common practice: the
    fugacity coefficient at saturation, the Poynting factor, and ln φ1 = B11 P/RT)."""
    from chemicals.virial import BVirial_Tsonopoulos_extended

    vapour = _virial(systems, "benzene--toluene")
    c = vapour.component1
    T, P, ps = 360.0, 101325.0, 1.2e5
    B11 = BVirial_Tsonopoulos_extended(T, c.Tc_K, c.Pc_Pa, c.omega, a=c.a, b=c.b)
    expected = (B11 * (ps - P) + c.liquid_volume_m3_per_mol * (P - ps)) / (
        GAS_CONSTANT_J_PER_MOL_K * T)
    c1, _ = ln_correction(vapour, 1.0, T, P, ps, 5e4)
    assert float(c1) == pytest.approx(expected, rel=1e-9)


@pytest.mark.parametrize("pid", ["ethanol--water", "acetone--chloroform", "water--1-butanol"])
def test_bubble_k_values_from_the_solved_terms(systems: dict[str, eq.BinarySystem],
                                               pid: str) -> None:
    """K-values at the bubble vapour (no ``y1`` given) take ln c from the terms the vapour
    was solved with; the general path (the bubble vapour, then ``ln_correction`` at it)
    gives the same to round-off, 1e-13 relative, over liquids, temperatures and
    pressures, pure ends included."""
    system = systems[pid]
    rng = np.random.default_rng(11)
    x = np.concatenate([[0.0, 1.0], rng.uniform(0, 1, 80)])
    T, P = rng.uniform(300, 400, 82), rng.uniform(2e4, 5e5, 82)
    K1, K2 = eq.k_values(system, x, T, P)
    ln_g1, ln_g2 = system.activity.ln_gamma(x, T)
    ps1, ps2 = system.psat1.pressure_Pa(T), system.psat2.pressure_Pa(T)
    y = bubble_vapour(system.vapour, x * np.exp(ln_g1) * ps1, (1 - x) * np.exp(ln_g2) * ps2,
                      T, P, ps1, ps2)[2]
    c1, c2 = ln_correction(system.vapour, y, T, P, ps1, ps2)
    np.testing.assert_allclose(K1, np.exp(ln_g1) * ps1 / P * np.exp(c1), rtol=1e-13)
    np.testing.assert_allclose(K2, np.exp(ln_g2) * ps2 / P * np.exp(c2), rtol=1e-13)


def test_bubble_temperature_from_a_guess(systems: dict[str, eq.BinarySystem]) -> None:
    """A starting temperature read off a solved curve (``T_guess_K``) saves Newton steps but
    not accuracy: the same bubble points to 1e-9 K as from the default start, and a
    useless guess (NaN, or 60 K off) still converges to them."""
    system = systems["ethanol--water"]
    x = np.linspace(0.0, 1.0, 41)
    plain = eq.bubble_temperature(system, x, 101325.0)
    curve = eq.bubble_temperature(system, np.linspace(0.0, 1.0, 11), 101325.0)
    guess = np.interp(x, curve.x1, curve.T_K)
    for start in (guess, np.full(x.size, np.nan), guess + 60.0):
        found = eq.bubble_temperature(system, x, 101325.0, T_guess_K=start)
        assert found.converged.all()
        np.testing.assert_allclose(found.T_K, plain.T_K, rtol=0, atol=1e-9)
        np.testing.assert_allclose(found.y1, plain.y1, rtol=0, atol=1e-11)
