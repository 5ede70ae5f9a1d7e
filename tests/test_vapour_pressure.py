"""Vapour-pressure correlations of the catalogue against independent references.

References: CoolProp 8.0 reference equations of state (HEOS) where CoolProp has the fluid;
otherwise Perry's Chemical Engineers' Handbook, 8th ed., Table 2-8 (DIPPR 101), as
transcribed in the ``chemicals`` package.  Tolerance 2 % over the correlation's validity
range (the catalogue's acceptance criterion).
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from builder.catalogue import Catalogue
from builder.vapour_pressure import Antoine, ExtendedAntoine

from .references import COOLPROP_HEOS, coolprop_psat_Pa


def _perry_2_8_Pa(cas: str, T_K: np.ndarray) -> np.ndarray:
    from chemicals.dippr import EQ101
    from chemicals.vapor_pressure import Psat_data_Perrys2_8

    row = Psat_data_Perrys2_8.loc[cas]
    return np.array([EQ101(float(t), *(float(row[k]) for k in ("C1", "C2", "C3", "C4", "C5")))
                     for t in T_K])


def test_every_component_against_an_independent_reference(catalogue: Catalogue) -> None:
    from chemicals.vapor_pressure import Psat_data_Perrys2_8

    worst = {}
    unchecked = []
    for cid, component in catalogue.components.items():
        vp = component.vapour_pressure
        T = np.linspace(vp.T_min_K, vp.T_max_K, 40)
        if cid in COOLPROP_HEOS:
            reference = coolprop_psat_Pa(cid, T)
        elif component.cas in Psat_data_Perrys2_8.index:
            reference = _perry_2_8_Pa(component.cas, T)
        else:
            unchecked.append(cid)
            continue
        worst[cid] = float(np.max(np.abs(vp.pressure_Pa(T) / reference - 1.0)))
    failing = {k: f"{v:.2%}" for k, v in worst.items() if v > 0.02}
    assert not failing, f"vapour pressure off by more than 2 %: {failing}"
    # Nearly every component must have an independent reference.
    assert len(unchecked) <= max(2, len(catalogue.components) // 10), unchecked


def test_boiling_point_of_each_correlation(catalogue: Catalogue) -> None:
    """Correlation inverse at 101.325 kPa against the catalogue's normal boiling point
    (CRC Handbook / IAPWS-95), within 0.5 K (the catalogue's acceptance criterion)."""
    off = {}
    for cid, component in catalogue.components.items():
        Tb = float(component.vapour_pressure.temperature_K(101325.0))
        if abs(Tb - component.normal_boiling_point_K) > 0.5:
            off[cid] = (round(Tb, 2), component.normal_boiling_point_K)
    assert not off


def test_published_forms_are_the_same_equation() -> None:
    """Water, Poling et al. (2001) Appendix A, written three ways a handbook might print it:
    log10 bar with °C, log10 Pa with K (the chemicals package's storage), and ln mmHg."""
    bar_C = Antoine.from_published(5.11564, 1687.537, 230.17, log_base="10", P_unit="bar",
                                   T_unit="C", T_min_K=273.2, T_max_K=473.2)
    pa_K = Antoine.from_published(10.11564, 1687.537, -42.98, log_base="10", P_unit="Pa",
                                  T_unit="K", T_min_K=273.2, T_max_K=473.2)
    to_mmHg = math.log(1e5 / (101325.0 / 760.0))
    ln_mmHg = Antoine.from_published(
        5.11564 * math.log(10) + to_mmHg, 1687.537 * math.log(10), 230.17, log_base="e",
        P_unit="mmHg", T_unit="C", T_min_K=273.2, T_max_K=473.2)
    T = np.linspace(280.0, 470.0, 20)
    np.testing.assert_allclose(pa_K.pressure_Pa(T), bar_C.pressure_Pa(T), rtol=1e-12)
    np.testing.assert_allclose(ln_mmHg.pressure_Pa(T), bar_C.pressure_Pa(T), rtol=1e-12)


def test_dippr101_against_chemicals_implementation() -> None:
    """DIPPR 101 evaluated by the ``chemicals`` package's EQ101 (Perry's Table 2-8, water)."""
    from chemicals.dippr import EQ101

    water = ExtendedAntoine(73.649, -7258.2, -7.3037, 4.1653e-06, 2.0, 273.16, 647.096)
    for T in (280.0, 373.15, 500.0, 640.0):
        assert float(water.pressure_Pa(T)) == pytest.approx(
            EQ101(T, 73.649, -7258.2, -7.3037, 4.1653e-06, 2.0), rel=1e-12)
        dlnP = float(water.dlnP_dT(T))
        h = 1e-4
        numeric = (math.log(EQ101(T + h, 73.649, -7258.2, -7.3037, 4.1653e-06, 2.0))
                   - math.log(EQ101(T - h, 73.649, -7258.2, -7.3037, 4.1653e-06, 2.0))) / (2 * h)
        assert dlnP == pytest.approx(numeric, rel=1e-6)


@given(st.floats(min_value=300.0, max_value=600.0))
def test_inverse_round_trips(T: float) -> None:
    """Saturation temperature at the saturation pressure returns the temperature."""
    antoine = Antoine.from_published(5.11564, 1687.537, 230.17, log_base="10", P_unit="bar",
                                     T_unit="C", T_min_K=273.2, T_max_K=473.2)
    dippr = ExtendedAntoine(73.649, -7258.2, -7.3037, 4.1653e-06, 2.0, 273.16, 647.096)
    for vp in (antoine, dippr):
        assert float(vp.temperature_K(vp.pressure_Pa(T))) == pytest.approx(T, abs=1e-8)


def test_inverse_is_vectorised() -> None:
    dippr = ExtendedAntoine(73.649, -7258.2, -7.3037, 4.1653e-06, 2.0, 273.16, 647.096)
    T = np.array([300.0, 350.0, 400.0, 450.0])
    np.testing.assert_allclose(dippr.temperature_K(dippr.pressure_Pa(T)), T, atol=1e-8)
