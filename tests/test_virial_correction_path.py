"""The virial vapour correction from one evaluation of B11, B22 and B12.

``ln_correction`` of a :class:`~builder.thermo.vapour.VirialVapour` evaluates the second
virial coefficients once for the pure liquids' terms and for ln φ; it must give exactly
what the general path (``ln_liquid_reference`` less ``ln_phi``, three evaluations) gives,
and the correction of a pure vapour must be the textbook one with B from the chemicals
package.
"""

from __future__ import annotations

import numpy as np
import pytest

from builder.thermo import equilibrium as eq
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
